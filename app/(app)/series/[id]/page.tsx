import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requireActor } from "@/lib/auth/actor";
import { getDepletionSetup } from "@/lib/queries/series-depletion";
import { getSeriesDetail } from "@/lib/queries/series-detail";
import { DepletionPanel } from "@/components/series/DepletionPanel";
import { FitSummary } from "@/components/series/FitSummary";
import { SeriesCharts } from "@/components/series/SeriesCharts";
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
  const missingValues = series.points.filter((p) => p.value === null).length;
  const depletion = series.kind === "titration" && series.points.length > 0 ? await getDepletionSetup(actor, series, series.projectId) : null;
  return (
    <>
      <PageHeader
        title={series.name}
        subtitle={`${series.projectName} · ${series.kind} series · ${series.points.length} spectra · variable: ${variable}`}
        actions={series.points.length > 0 && (
          <a href={`/api/v1/series/${series.id}/export`} className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-50" download>Export CSV</a>
        )}
      />
      {series.points.length === 0 ? (
        <p className="text-sm text-ink-soft">No spectra in this series yet: choose it{series.mayWrite ? <> when you <Link className="text-glow-deep hover:underline" href="/upload">upload</Link></> : " when uploading"}, with the value of {series.variableName || "the variable"} for each file.</p>
      ) : (
        <div className="space-y-6">
          {missingValues > 0 && (
            <p className="rounded-md border border-caution/40 bg-caution-soft px-3 py-2 text-sm">
              {missingValues} spectr{missingValues === 1 ? "um has" : "a have"} no value of {series.variableName || "the variable"}: they are listed below but left out of the plots and fits.
            </p>
          )}
          <FitSummary fits={series.fits} unit={series.variableUnit} />
          <SeriesCharts series={series} />
          <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
            <table className="w-full text-sm" data-testid="series-table">
              <thead className="bg-stone-100 text-left text-xs text-ink-soft"><tr><th className="px-3 py-2">{variable}</th><th className="px-3 py-2">Spectrum</th><th className="px-3 py-2">Bleach</th><th className="px-3 py-2">PL quench</th><th className="px-3 py-2">Shift (meV)</th><th className="px-3 py-2">New-band area</th><th className="px-3 py-2">State</th></tr></thead>
              <tbody className="tabular">
                {series.points.map((p) => (
                  <tr key={p.spectrumId} className="border-t border-stone-100">
                    <td className="px-3 py-1.5">{p.value ?? "—"}</td>
                    <td className="px-3 py-1.5"><Link className="text-glow-deep hover:underline" href={`/spectra/${p.spectrumId}`}>{p.fileName}</Link>
                      {p.awaitingReview !== null && p.awaitingReview > 0 && <span className="ml-2 text-xs text-ink-soft">{p.awaitingReview} flag{p.awaitingReview === 1 ? "" : "s"} awaiting review</span>}</td>
                    <td className="px-3 py-1.5">{pct(p.bleachFraction)}</td><td className="px-3 py-1.5">{pct(p.quenchFraction)}</td>
                    <td className="px-3 py-1.5">{p.shiftMeV === null ? "—" : p.shiftMeV.toFixed(1)}</td>
                    <td className="px-3 py-1.5">{p.newBandArea === null ? (p.newBandCount ? `${p.newBandCount} band${p.newBandCount === 1 ? "" : "s"}` : "—") : p.newBandArea.toPrecision(3)}</td>
                    <td className="px-3 py-1.5"><StatusBadge status={p.status} /></td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {depletion && (
            <DepletionPanel seriesId={series.id} projectName={series.projectName} variableName={series.variableName} variableUnit={series.variableUnit}
              mayWrite={series.mayWrite} setup={depletion} />
          )}
        </div>
      )}
    </>
  );
}
