import type { SeriesDetail } from "@/lib/queries/series-detail";
import { formatWithUncertainty, reciprocalUnit } from "@/lib/format/quantity";
import { seriesPanels, seriesTechnique } from "@/lib/series/seriesPanels";
import { SeriesPlot } from "./SeriesPlot";

/** The summary plots of a series, chosen by its technique, each against the series variable, with the fits drawn in. */
export function SeriesCharts({ series }: { series: SeriesDetail }) {
  const variable = `${series.variableName || "variable"}${series.variableUnit ? ` (${series.variableUnit})` : ""}`;
  if (!series.points.some((p) => p.value !== null))
    return (
      <p className="text-sm text-ink-soft">
        No spectrum of this series has a value of the variable yet, so there is nothing to plot against it.
      </p>
    );
  const technique = seriesTechnique(series.points);
  const panels = seriesPanels(technique, series.points, series.fits);
  if (panels.length === 0)
    return <p className="text-sm text-ink-soft">The analyses of this series found nothing to plot against the variable yet.</p>;
  const sv = series.fits.sternVolmer.fit;
  return (
    <div className="grid gap-4 md:grid-cols-2">
      {panels.map((p) => (
        <SeriesPlot
          key={p.key}
          testId={`series-plot-${p.key}`}
          title={p.title}
          xLabel={p.key === "stern-volmer" ? `[Q] = ${variable}` : variable}
          xUnit={series.variableUnit}
          yLabel={p.yLabel}
          x={p.x}
          y={p.y}
          fit={p.fit}
          note={
            p.key === "stern-volmer" && sv ? (
              <span data-testid="ksv">
                K<sub>SV</sub> ={" "}
                <span className="tabular font-semibold">
                  {formatWithUncertainty(sv.ksv, sv.ksvSe, reciprocalUnit(series.variableUnit))}
                </span>
                , intercept {formatWithUncertainty(sv.intercept, sv.interceptSe)}
              </span>
            ) : undefined
          }
        />
      ))}
    </div>
  );
}
