import type { SeriesDetail } from "@/lib/queries/series-detail";
import { SeriesPlot } from "./SeriesPlot";

/** The four summary plots of a series, each against the series variable, with the fits drawn in. */
export function SeriesCharts({ series }: { series: SeriesDetail }) {
  const variable = `${series.variableName || "variable"}${series.variableUnit ? ` (${series.variableUnit})` : ""}`;
  const pts = series.points.filter((p) => p.value !== null) as (SeriesDetail["points"][number] & { value: number })[];
  if (pts.length === 0) return <p className="text-sm text-ink-soft">No spectrum of this series has a value of the variable yet, so there is nothing to plot against it.</p>;
  const xs = pts.map((p) => p.value);
  const lo = Math.min(...xs), hi = Math.max(...xs);
  const sat = series.fits.saturation.fit;
  const sv = series.fits.sternVolmer.fit;
  const satCurve = sat
    ? { x: [lo, sat.breakpoint, hi].filter((v, i, a) => a.indexOf(v) === i), y: [] as number[], label: "two-line fit" }
    : null;
  if (sat && satCurve) satCurve.y = satCurve.x.map((x) => (sat.intercept + sat.slope * Math.min(x, sat.breakpoint)) * 100);
  const svCurve = sv
    ? (() => {
        const x = Array.from({ length: 31 }, (_, i) => lo + ((hi - lo) * i) / 30);
        return { x, y: x.map((c) => (1 - 1 / (sv.intercept + sv.ksv * c)) * 100), label: "Stern–Volmer fit" };
      })()
    : null;
  const plots = [
    { key: "bleach", title: "Bleach of the first exciton", y: pts.map((p) => (p.bleachFraction === null ? null : p.bleachFraction * 100)), yLabel: "bleach (%)", fit: satCurve },
    { key: "quench", title: "PL quench", y: pts.map((p) => (p.quenchFraction === null ? null : p.quenchFraction * 100)), yLabel: "quench (%)", fit: svCurve },
    { key: "new-band", title: "New-band area", y: pts.map((p) => p.newBandArea), yLabel: "area (signal·eV)", fit: null },
    { key: "shift", title: "First-exciton shift", y: pts.map((p) => p.shiftMeV), yLabel: "shift (meV)", fit: null },
  ].filter((p) => p.y.some((v) => v !== null && v !== 0) || (p.fit !== null));
  if (plots.length === 0) return <p className="text-sm text-ink-soft">The analyses of this series found no bleach, quench, shift or new band to plot.</p>;
  return (
    <div className="grid gap-4 md:grid-cols-2">
      {plots.map((p) => (
        <SeriesPlot key={p.key} testId={`series-plot-${p.key}`} title={p.title} xLabel={variable} yLabel={p.yLabel} x={xs} y={p.y} fit={p.fit} />
      ))}
    </div>
  );
}
