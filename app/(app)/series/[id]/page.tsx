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
import { countOf, formatQuantity } from "@/lib/format/quantity";
import { isUuid } from "@/lib/ids";
import { TECHNIQUE_SPECS } from "@/lib/registry/techniques";
import { seriesTechnique, sternVolmerRatios } from "@/lib/series/seriesPanels";
import type { SeriesPanel, TechniqueSpec } from "@/lib/registry/techniques";

export const metadata: Metadata = { title: "Series" };

const pct = (v: number | null) => (v === null ? "—" : formatQuantity(v, "fraction"));
const ratio = (q: number | null) => {
  const r = sternVolmerRatios([q])[0];
  return r === null || r === undefined ? "—" : r.toFixed(3);
};

export default async function SeriesDetailPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const actor = await requireActor(`/series/${id}`);
  const series = isUuid(id) ? await getSeriesDetail(actor, id) : null;
  if (!series) notFound();
  const variable = `${series.variableName || "Variable"}${series.variableUnit ? ` (${series.variableUnit})` : ""}`;
  const missingValues = series.points.filter((p) => p.value === null).length;
  const spec: TechniqueSpec = TECHNIQUE_SPECS[seriesTechnique(series.points)];
  const shows = (panel: SeriesPanel) => spec.seriesPlot.includes(panel);
  const depletion =
    series.kind === "titration" && series.points.length > 0 ? await getDepletionSetup(actor, series, series.projectId) : null;
  return (
    <>
      <PageHeader
        title={series.name}
        subtitle={`${series.projectName} · ${series.kind} series · ${countOf(series.points.length, "spectrum")} · variable: ${variable}`}
        actions={
          series.points.length > 0 && (
            <a
              href={`/api/v1/series/${series.id}/export`}
              className="rounded-md border border-stone-300 bg-white px-3 py-1.5 text-sm hover:bg-stone-50"
              download
            >
              Export CSV
            </a>
          )
        }
      />
      {series.points.length === 0 ? (
        <p className="text-sm text-ink-soft">
          No spectra in this series yet: choose it
          {series.mayWrite ? (
            <>
              {" "}
              when you{" "}
              <Link className="text-glow-deep hover:underline" href="/upload">
                upload
              </Link>
            </>
          ) : (
            " when uploading"
          )}
          , with the value of {series.variableName || "the variable"} for each file.
        </p>
      ) : (
        <div className="space-y-6">
          {missingValues > 0 && (
            <p className="rounded-md border border-caution/40 bg-caution-soft px-3 py-2 text-sm">
              {missingValues} spectr{missingValues === 1 ? "um has" : "a have"} no value of {series.variableName || "the variable"}: they
              are listed below but left out of the plots and fits.
            </p>
          )}
          <FitSummary fits={series.fits} unit={series.variableUnit} />
          <SeriesCharts series={series} />
          <div className="overflow-x-auto rounded-lg border border-stone-200 bg-white">
            <table className="w-full text-sm" data-testid="series-table">
              <thead className="bg-stone-100 text-left text-xs text-ink-soft">
                <tr>
                  <th className="px-3 py-2">{variable}</th>
                  <th className="px-3 py-2">Spectrum</th>
                  {shows("bleach") && <th className="px-3 py-2">Bleach</th>}
                  {shows("stern-volmer") && (
                    <>
                      <th className="px-3 py-2">PL quench</th>
                      <th className="px-3 py-2">F₀/F</th>
                    </>
                  )}
                  {shows("shift") && <th className="px-3 py-2">Shift of the {spec.firstBandLabel} (meV)</th>}
                  {shows("new-band") && <th className="px-3 py-2">New-band area</th>}
                  <th className="px-3 py-2">State</th>
                </tr>
              </thead>
              <tbody className="tabular">
                {series.points.map((p) => (
                  <tr key={p.spectrumId} className="border-t border-stone-100">
                    <td className="px-3 py-1.5">{p.value ?? "—"}</td>
                    <td className="px-3 py-1.5">
                      <Link className="text-glow-deep hover:underline" href={`/spectra/${p.spectrumId}`}>
                        {p.fileName}
                      </Link>
                      {p.awaitingReview !== null && p.awaitingReview > 0 && (
                        <span className="ml-2 text-xs text-ink-soft">
                          {p.awaitingReview} flag{p.awaitingReview === 1 ? "" : "s"} awaiting review
                        </span>
                      )}
                    </td>
                    {shows("bleach") && <td className="px-3 py-1.5">{pct(p.bleachFraction)}</td>}
                    {shows("stern-volmer") && (
                      <>
                        <td className="px-3 py-1.5">{pct(p.quenchFraction)}</td>
                        <td className="px-3 py-1.5">{ratio(p.quenchFraction)}</td>
                      </>
                    )}
                    {shows("shift") && (
                      <td className="px-3 py-1.5">
                        {p.shiftMeV === null ? "—" : formatQuantity(p.shiftMeV, "meV", { signed: true }).replace(" meV", "")}
                      </td>
                    )}
                    {shows("new-band") && (
                      <td className="px-3 py-1.5">
                        {p.newBandArea === null ? (p.newBandCount ? countOf(p.newBandCount, "band") : "—") : p.newBandArea.toPrecision(3)}
                      </td>
                    )}
                    <td className="px-3 py-1.5">
                      <StatusBadge status={p.status} />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {depletion && (
            <DepletionPanel
              seriesId={series.id}
              projectName={series.projectName}
              variableName={series.variableName}
              variableUnit={series.variableUnit}
              mayWrite={series.mayWrite}
              setup={depletion}
            />
          )}
        </div>
      )}
    </>
  );
}
