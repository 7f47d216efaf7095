import { csvDocument, csvLine } from "@/lib/formats/csv";
import type { SeriesDetail } from "@/lib/queries/series-detail";

/** The series table (one row per spectrum) followed by its fits, as CSV lines with a header row each. */
export function seriesCsv(series: SeriesDetail): string {
  const variable = `${series.variableName || "variable"}${series.variableUnit ? ` (${series.variableUnit})` : ""}`;
  const lines = [
    csvLine([variable, "spectrum", "spectrum_id", "bleach_fraction", "quench_fraction", "shift_meV", "new_band_area", "status"]),
    ...series.points.map((p) =>
      csvLine([p.value, p.fileName, p.spectrumId, p.bleachFraction, p.quenchFraction, p.shiftMeV, p.newBandArea, p.status]),
    ),
    "",
    csvLine(["fit", "parameter", "value", "standard_error", "r2", "points", "method"]),
  ];
  const s = series.fits.saturation;
  if (s.fit) {
    const m = "two-line least squares over the breakpoint (Hudson 1966); covariance s^2(J^T J)^-1";
    lines.push(
      csvLine([
        "saturation",
        `breakpoint (${series.variableUnit || "variable"})`,
        s.fit.breakpoint,
        s.fit.breakpointSe,
        s.fit.r2,
        s.points,
        m,
      ]),
    );
    lines.push(csvLine(["saturation", "plateau bleach fraction", s.fit.plateau, s.fit.plateauSe, s.fit.r2, s.points, m]));
    lines.push(csvLine(["saturation", "slope", s.fit.slope, s.fit.slopeSe, s.fit.r2, s.points, m]));
  } else lines.push(csvLine(["saturation", s.reason, null, null, null, null, null]));
  const sv = series.fits.sternVolmer;
  if (sv.fit) {
    const m = "Stern-Volmer F0/F = 1 + K_SV[Q], ordinary least squares (IUPAC Gold Book)";
    lines.push(
      csvLine(["stern-volmer", `K_SV (1/${series.variableUnit || "variable unit"})`, sv.fit.ksv, sv.fit.ksvSe, sv.fit.r2, sv.points, m]),
    );
    lines.push(csvLine(["stern-volmer", "intercept", sv.fit.intercept, sv.fit.interceptSe, sv.fit.r2, sv.points, m]));
  } else lines.push(csvLine(["stern-volmer", sv.reason, null, null, null, null, null]));
  return csvDocument(lines);
}
