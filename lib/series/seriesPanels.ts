// The panels of a series page, chosen by the series' technique (TECHNIQUE_SPECS[t].seriesPlot),
// each with its points against the series variable and, where the series has one, its fitted curve.
// Pure: the page passes the rows and fits it already has.

import type { BreakpointFit } from "@/lib/fits/fitBreakpoint";
import type { SternVolmerFit } from "@/lib/fits/fitSternVolmer";
import { TECHNIQUE_SPECS, isTechnique, type SeriesPanel, type Technique, type TechniqueSpec } from "@/lib/registry/techniques";
import type { SeriesFits } from "./analyseSeries";

export type PanelPoint = {
  value: number | null;
  technique: string;
  bleachFraction: number | null;
  quenchFraction: number | null;
  shiftMeV: number | null;
  newBandArea: number | null;
};

export type PanelData = {
  key: SeriesPanel;
  title: string;
  yLabel: string;
  /** Variable values (ascending, as the rows come) and one y per point (null where not measured). */
  x: number[];
  y: (number | null)[];
  fit: { x: number[]; y: number[]; label: string } | null;
};

/** The technique most of the series' spectra have (a series holds one technique in practice); absorption when none is known. */
export function seriesTechnique(points: { technique: string }[]): Technique {
  const counts = new Map<Technique, number>();
  for (const p of points) if (isTechnique(p.technique)) counts.set(p.technique, (counts.get(p.technique) ?? 0) + 1);
  let best: Technique = "absorption";
  let most = 0;
  for (const [t, n] of counts) if (n > most) [best, most] = [t, n];
  return best;
}

/**
 * F₀/F of each point from its quench fraction q = 1 − F/F₀ (so F₀/F = 1/(1 − q)), null where no
 * quench was measured; the Stern–Volmer relation F₀/F = 1 + K_SV[Q] (Lakowicz, Principles of
 * Fluorescence Spectroscopy, 3rd ed., 2006, ch. 8, eq. 8.1).
 */
export function sternVolmerRatios(quenchFractions: (number | null)[]): (number | null)[] {
  return quenchFractions.map((q) => (q === null || !Number.isFinite(q) || q >= 1 ? null : 1 / (1 - q)));
}

/** The fitted Stern–Volmer line, intercept + K_SV·[Q], drawn over [lo, hi]. */
export function sternVolmerLine(fit: Pick<SternVolmerFit, "ksv" | "intercept">, lo: number, hi: number): { x: number[]; y: number[] } {
  const x = lo === hi ? [lo] : [lo, hi];
  return { x, y: x.map((c) => fit.intercept + fit.ksv * c) };
}

function saturationLine(fit: BreakpointFit, lo: number, hi: number): { x: number[]; y: number[] } {
  const x = [lo, fit.breakpoint, hi].filter((v, i, a) => a.indexOf(v) === i && v >= lo && v <= hi).sort((a, b) => a - b);
  return { x, y: x.map((v) => (fit.intercept + fit.slope * Math.min(v, fit.breakpoint)) * 100) };
}

const capitalised = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * The panels to draw for a series of `technique`, in the registry's order, leaving out a panel with
 * nothing measured and no fit. A PL series never gets a bleach or a first-exciton panel.
 */
export function seriesPanels(technique: Technique, rows: PanelPoint[], fits: SeriesFits): PanelData[] {
  const pts = rows.filter((p): p is PanelPoint & { value: number } => p.value !== null);
  if (pts.length === 0) return [];
  const x = pts.map((p) => p.value);
  const lo = Math.min(...x),
    hi = Math.max(...x);
  const spec: TechniqueSpec = TECHNIQUE_SPECS[technique];
  const build: Record<SeriesPanel, () => PanelData> = {
    bleach: () => ({
      key: "bleach",
      title: `Bleach of the ${spec.firstBandLabel}`,
      yLabel: "bleach (%)",
      x,
      y: pts.map((p) => (p.bleachFraction === null ? null : p.bleachFraction * 100)),
      fit: fits.saturation.fit ? { ...saturationLine(fits.saturation.fit, lo, hi), label: "two-line fit" } : null,
    }),
    "stern-volmer": () => ({
      key: "stern-volmer",
      title: "Stern–Volmer: F₀/F against [Q]",
      yLabel: "F₀/F",
      x,
      y: sternVolmerRatios(pts.map((p) => p.quenchFraction)),
      fit: fits.sternVolmer.fit ? { ...sternVolmerLine(fits.sternVolmer.fit, lo, hi), label: "fitted line" } : null,
    }),
    "new-band": () => ({
      key: "new-band",
      title: "New-band area",
      yLabel: "area (signal · eV)",
      x,
      y: pts.map((p) => p.newBandArea),
      fit: null,
    }),
    shift: () => ({
      key: "shift",
      title: `Shift of the ${spec.firstBandLabel}`,
      yLabel: "shift (meV)",
      x,
      y: pts.map((p) => p.shiftMeV),
      fit: null,
    }),
  };
  return spec.seriesPlot
    .map((k) => build[k]())
    .filter((p) => p.fit !== null || p.y.some((v) => v !== null && v !== 0))
    .map((p) => ({ ...p, title: capitalised(p.title) }));
}
