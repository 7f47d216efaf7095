import type { Metadata } from "next";
import Link from "next/link";
import { requireActor } from "@/lib/auth/actor";
import { leadGroupIds, writesSomewhere } from "@/lib/auth/access";
import { getOverview } from "@/lib/queries/overview";
import { listSeries } from "@/lib/queries/series";
import { EmptyState } from "@/components/ui/EmptyState";
import { PageHeader } from "@/components/ui/PageHeader";
import { kindLabel } from "@/lib/registry/flagKinds";
import { listSavedSearches } from "@/lib/queries/savedSearches";
import { SavedSearchList } from "@/components/spectra/SavedSearchList";
import { countOf } from "@/lib/format/quantity";

export const metadata: Metadata = { title: "Overview" };

function Stat({ label, value, href }: { label: string; value: number; href?: string }) {
  const body = (
    <div className="rounded-lg border border-stone-200 bg-white px-4 py-3">
      <p className="tabular text-2xl font-semibold">{value}</p>
      <p className="text-xs text-ink-soft">{label}</p>
    </div>
  );
  return href ? (
    <Link href={href} className="hover:opacity-80">
      {body}
    </Link>
  ) : (
    body
  );
}

export default async function OverviewPage() {
  const actor = await requireActor("/");
  // one round of queries, not two: the saved searches' counts do not wait for the overview's
  const [overview, saved] = await Promise.all([getOverview(actor), listSavedSearches(actor)]);
  if (!overview) {
    const shared = await listSeries(actor);
    return (
      <>
        <PageHeader title={`Welcome, ${actor.name}`} subtitle="You have read-only access to what a group shared with you." />
        {shared.length === 0 ? (
          <EmptyState title="Nothing has been shared with you yet">
            When a group shares a series or project with you, it appears here.
          </EmptyState>
        ) : (
          <ul className="space-y-2">
            {shared.map((s) => (
              <li key={s.id} className="rounded-lg border border-stone-200 bg-white px-4 py-3">
                <Link prefetch={false} href={`/series/${s.id}`} className="font-medium text-glow-deep hover:underline">
                  {s.name}
                </Link>
                <span className="ml-2 text-sm text-ink-soft">
                  {s.projectName} · {countOf(s.spectrumCount, "spectrum")}
                </span>
              </li>
            ))}
          </ul>
        )}
      </>
    );
  }
  const total = Object.values(overview.spectraByStatus).reduce((a, b) => a + b, 0);
  const writer = writesSomewhere(actor);
  return (
    <>
      <PageHeader title={`Welcome, ${actor.name}`} subtitle="What arrived, what the analysis flagged, and what waits for a decision." />
      <div className="mb-8 grid grid-cols-2 gap-3 md:grid-cols-5">
        <Stat label="Spectra" value={total} href="/spectra" />
        <Stat label="Being analysed" value={(overview.spectraByStatus.queued ?? 0) + (overview.spectraByStatus.analysing ?? 0)} />
        <Stat label="Could not read" value={overview.spectraByStatus.failed ?? 0} href="/spectra?status=failed" />
        <Stat
          label="Signatures to review"
          value={overview.awaitingSignatures}
          href={leadGroupIds(actor).length > 0 ? "/review" : undefined}
        />
        <Stat label="Samples" value={overview.samples} href="/samples" />
      </div>
      {saved.length > 0 && <SavedSearchList searches={saved} />}
      {total === 0 ? (
        <EmptyState title="No spectra yet" action={writer ? { href: "/upload", label: "Upload instrument exports" } : undefined}>
          Register a sample, then drop its absorption, PL or mid-IR exports. Each spectrum is compared with its parent reference and changes
          are flagged here.
        </EmptyState>
      ) : (
        <section>
          <h2 className="mb-2 text-sm font-semibold text-ink-soft">Latest flagged changes</h2>
          {overview.recentSignatures.length === 0 ? (
            <p className="text-sm text-ink-soft">No band changes flagged yet.</p>
          ) : (
            <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white">
              {overview.recentSignatures.map((s) => (
                <li key={s.id} className="flex items-center justify-between px-4 py-2 text-sm">
                  <span>
                    <span className="font-medium">{kindLabel(s.kind, s.technique)}</span> in{" "}
                    <Link prefetch={false} className="text-glow-deep hover:underline" href={`/spectra/${s.spectrumId}`}>
                      {s.fileName}
                    </Link>
                  </span>
                  <span className="tabular text-ink-soft">{s.significance.toFixed(1)}σ</span>
                </li>
              ))}
            </ul>
          )}
        </section>
      )}
    </>
  );
}
