import type { Metadata } from "next";
import Link from "next/link";
import { Fragment } from "react";
import { notFound } from "next/navigation";
import { requireActor } from "@/lib/auth/actor";
import { getSample } from "@/lib/queries/samples";
import { HazardNotice } from "@/components/ui/HazardNotice";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";

export const metadata: Metadata = { title: "Sample" };

export default async function SamplePage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requireActor(`/samples/${id}`);
  const sample = /^[0-9a-f-]{36}$/i.test(id) ? await getSample(actor, id) : null;
  if (!sample) notFound();
  const facts: [string, string][] = [
    ["Material", sample.material],
    ["Core/shell", sample.coreShell || "—"],
    ["Ligand", sample.ligand || "—"],
    ["Solvent", sample.solvent || "—"],
    ["Group", sample.groupName],
    ["Project", sample.projectName ?? "—"],
  ];
  return (
    <>
      <PageHeader title={sample.name} subtitle={`Registered ${new Date(sample.createdAt).toLocaleDateString("en-GB")}`} />
      <div className="mb-6"><HazardNotice flags={sample.hazards} /></div>
      <div className="grid gap-6 lg:grid-cols-3">
        <section className="rounded-lg border border-stone-200 bg-white p-4">
          <h2 className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Batch</h2>
          <dl className="grid grid-cols-[8rem_1fr] gap-y-1 text-sm">
            {facts.map(([k, v]) => (<Fragment key={k}><dt className="text-ink-soft">{k}</dt><dd>{v}</dd></Fragment>))}
          </dl>
          {sample.notes && <p className="mt-3 whitespace-pre-wrap text-sm">{sample.notes}</p>}
        </section>
        <section className="rounded-lg border border-stone-200 bg-white p-4">
          <h2 className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Lineage</h2>
          <p className="text-sm text-ink-soft">Made from</p>
          <ul className="mb-3 text-sm">{sample.parents.length ? sample.parents.map((p) => <li key={p.id}><Link className="text-glow-deep hover:underline" href={`/samples/${p.id}`}>{p.name}</Link></li>) : <li>— (an as-made batch)</li>}</ul>
          <p className="text-sm text-ink-soft">Used in</p>
          <ul className="text-sm">{sample.children.length ? sample.children.map((c) => <li key={c.id}><Link className="text-glow-deep hover:underline" href={`/samples/${c.id}`}>{c.name}</Link></li>) : <li>—</li>}</ul>
        </section>
        <section className="rounded-lg border border-stone-200 bg-white p-4">
          <h2 className="mb-2 text-sm font-semibold uppercase tracking-wide text-ink-soft">Spectra</h2>
          {sample.spectra.length === 0 ? (
            <p className="text-sm text-ink-soft">No spectra yet. <Link className="text-glow-deep hover:underline" href="/upload">Upload exports</Link> and choose this sample.</p>
          ) : (
            <ul className="space-y-1 text-sm">
              {sample.spectra.map((s) => (
                <li key={s.id} className="flex items-center justify-between gap-2">
                  <Link className="truncate text-glow-deep hover:underline" href={`/spectra/${s.id}`}>{s.fileName}</Link>
                  <span className="flex items-center gap-2 text-xs text-ink-soft">{s.technique}<StatusBadge status={s.status} /></span>
                </li>
              ))}
            </ul>
          )}
        </section>
      </div>
    </>
  );
}
