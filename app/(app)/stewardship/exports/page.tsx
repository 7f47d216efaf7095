import type { Metadata } from "next";
import { requireActor } from "@/lib/auth/actor";
import { stewardGroupIds } from "@/lib/auth/access";
import { shareTargetOptions } from "@/lib/stewardship/queries";
import { StewardOnly } from "@/components/stewardship/StewardOnly";
import { PageHeader } from "@/components/ui/PageHeader";

export const metadata: Metadata = { title: "Bundles · Data care" };

export default async function ExportsPage() {
  const actor = await requireActor("/stewardship/exports");
  if (stewardGroupIds(actor).length === 0) return <StewardOnly what="Exports" />;
  const targets = await shareTargetOptions(actor);
  return (
    <>
      <PageHeader
        title="Bundles"
        subtitle="One zip per project or series: raw files as they arrived, processed data as CSV and JCAMP-DX, analyses as JSON, a manifest with the sha256 of every file, and a README."
      />
      <ul className="divide-y divide-stone-100 rounded-lg border border-stone-200 bg-white text-sm" data-testid="exports">
        {targets.map((t) => (
          <li key={t.id} className="flex items-center justify-between px-3 py-2">
            <span>
              <span className="text-xs text-ink-soft">{t.type}</span> <span className="font-medium">{t.label}</span>
            </span>
            <a
              href={`/api/v1/exports/${t.type}/${t.id}`}
              className="rounded-md border border-stone-300 bg-white px-3 py-1 text-sm hover:bg-stone-50"
              download
            >
              Download zip
            </a>
          </li>
        ))}
      </ul>
      <p className="mt-2 text-xs text-ink-faint">
        Anyone who may read the series or project may export it; lab scripts can fetch the same bundles through the HTTP API (see the API
        guide).
      </p>
    </>
  );
}
