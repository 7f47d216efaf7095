import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireActor } from "@/lib/auth/actor";
import { getSeriesDetail } from "@/lib/queries/series-detail";
import { PageHeader } from "@/components/ui/PageHeader";
import { StatusBadge } from "@/components/ui/StatusBadge";

export const metadata: Metadata = { title: "Series" };

const pct = (v: number | null) => (v === null ? "—" : `${(v * 100).toFixed(1)} %`);

export default async function SeriesDetailPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requireActor(`/series/${id}`);
  const series = /^[0-9a-f-]{36}$/i.test(id) ? await getSeriesDetail(actor, id) : null;
  if (!series) notFound();
  const variable = `${series.variableName || "Variable"}${series.variableUnit ? ` (${series.variableUnit})` : ""}`;
  return (
    <>
      <PageHeader title={series.name} subtitle={`${series.projectName} · ${series.kind} series · ${series.points.length} spectra`} />
      {series.points.length === 0 ? (
        <p className="text-sm text-ink-soft">No spectra in this series yet: choose it when you upload.</p>
      ) : (
        <div className="overflow-hidden rounded-lg border border-stone-200 bg-white">
          <table className="w-full text-sm" data-testid="series-table">
            <thead className="bg-stone-100 text-left text-xs uppercase tracking-wide text-ink-soft"><tr><th className="px-3 py-2">{variable}</th><th className="px-3 py-2">Spectrum</th><th className="px-3 py-2">Bleach</th><th className="px-3 py-2">PL quench</th><th className="px-3 py-2">Shift (meV)</th><th className="px-3 py-2">New bands</th><th className="px-3 py-2">State</th></tr></thead>
            <tbody className="tabular">
              {series.points.map((p) => (
                <tr key={p.spectrumId} className="border-t border-stone-100">
                  <td className="px-3 py-1.5">{p.value ?? "—"}</td>
                  <td className="px-3 py-1.5"><Link className="text-glow-deep hover:underline" href={`/spectra/${p.spectrumId}`}>{p.fileName}</Link></td>
                  <td className="px-3 py-1.5">{pct(p.bleachFraction)}</td><td className="px-3 py-1.5">{pct(p.quenchFraction)}</td>
                  <td className="px-3 py-1.5">{p.shiftMeV === null ? "—" : p.shiftMeV.toFixed(1)}</td><td className="px-3 py-1.5">{p.newBandCount}</td>
                  <td className="px-3 py-1.5"><StatusBadge status={p.status} /></td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
