import { csvCell as field } from "@/lib/csv/csvCell";
import type { SeriesDetail } from "@/lib/queries/series-detail";

/** The series table (one row per spectrum) followed by its fits, as CSV lines with a header row each. */
export function seriesCsv(series: SeriesDetail): string {
  const variable = `${series.variableName || "variable"}${series.variableUnit ? ` (${series.variableUnit})` : ""}`;
  const lines = [
    [variable, "spectrum", "spectrum_id", "bleach_fraction", "quench_fraction", "shift_meV", "new_band_area", "status"].map(field).join(","),
    ...series.points.map((p) => [p.value, p.fileName, p.spectrumId, p.bleachFraction, p.quenchFraction, p.shiftMeV, p.newBandArea, p.status].map(field).join(",")),
    "",
    ["fit", "parameter", "value", "standard_error", "r2", "points", "method"].map(field).join(","),
  ];
  const s = series.fits.saturation;
  if (s.fit) {
    const m = "two-line least squares over the breakpoint (Hudson 1966); covariance s^2(J^T J)^-1";
    lines.push(["saturation", `breakpoint (${series.variableUnit || "variable"})`, s.fit.breakpoint, s.fit.breakpointSe, s.fit.r2, s.points, m].map(field).join(","));
    lines.push(["saturation", "plateau bleach fraction", s.fit.plateau, s.fit.plateauSe, s.fit.r2, s.points, m].map(field).join(","));
    lines.push(["saturation", "slope", s.fit.slope, s.fit.slopeSe, s.fit.r2, s.points, m].map(field).join(","));
  } else lines.push(["saturation", s.reason, null, null, null, null, null].map(field).join(","));
  const sv = series.fits.sternVolmer;
  if (sv.fit) {
    const m = "Stern-Volmer F0/F = 1 + K_SV[Q], ordinary least squares (IUPAC Gold Book)";
    lines.push(["stern-volmer", `K_SV (1/${series.variableUnit || "variable unit"})`, sv.fit.ksv, sv.fit.ksvSe, sv.fit.r2, sv.points, m].map(field).join(","));
    lines.push(["stern-volmer", "intercept", sv.fit.intercept, sv.fit.interceptSe, sv.fit.r2, sv.points, m].map(field).join(","));
  } else lines.push(["stern-volmer", sv.reason, null, null, null, null, null].map(field).join(","));
  return lines.join("\r\n") + "\r\n";
}
