import type { AnalysisReport } from "@/lib/engine";

export type PointMetrics = {
  bleachFraction: number | null;
  quenchFraction: number | null;
  /** First-exciton energy of the sample minus the reference's, meV. */
  shiftMeV: number | null;
  /** Summed Gaussian-equivalent area of the new bands (signal·eV), when the engine measured them. */
  newBandArea: number | null;
  newBandCount: number;
};

type ReportPart = Pick<AnalysisReport, "flags" | "peaks" | "firstExciton" | "referenceFirstExciton">;

/**
 * The numbers a series plots, from one spectrum's latest analysis report. A spectrum that is
 * itself the series' reference (nothing to compare with) counts as no bleach and no quench.
 * Bleach belongs to absorption, quench to PL. Below-threshold changes are not flagged by the engine, so they are unknown (null) here.
 */
export function pointMetrics(report: ReportPart | null, isReference: boolean, technique: string): PointMetrics {
  if (!report) return { bleachFraction: null, quenchFraction: null, shiftMeV: null, newBandArea: null, newBandCount: 0 };
  const flags = report.flags ?? [];
  const bleach = flags.find((f) => f.kind === "bleach");
  const quench = flags.find((f) => f.kind === "pl-quench");
  const bands = flags.filter((f) => f.kind === "new-band");
  let area: number | null = null;
  for (const band of bands) {
    if (band.energyEv === null) continue;
    const peak = (report.peaks ?? [])
      .filter((p) => p.area !== null && Math.abs(p.energyEv - band.energyEv!) <= 0.03)
      .sort((a, b) => Math.abs(a.energyEv - band.energyEv!) - Math.abs(b.energyEv - band.energyEv!))[0];
    if (peak?.area != null) area = (area ?? 0) + peak.area;
  }
  const fx = report.firstExciton;
  const ref = report.referenceFirstExciton;
  return {
    bleachFraction: bleach?.fraction ?? (isReference && technique === "absorption" ? 0 : null),
    quenchFraction: quench?.fraction ?? (isReference && technique === "pl" ? 0 : null),
    shiftMeV: fx && ref ? (fx.energyEv - ref.energyEv) * 1000 : isReference ? 0 : null,
    newBandArea: area ?? (isReference ? 0 : null),
    newBandCount: bands.length,
  };
}
