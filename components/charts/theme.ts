// The one look of every chart in Bandkeep: axis colours, grid, curve styles, and how a reading is
// written. The spectrum viewer, the review evidence and the series panels all draw with these.
import type uPlot from "uplot";

export const CHART_INK = { axis: "#4b5566", grid: "#eceae7", tick: "#d6d3d1", emphasis: "#1d2430" } as const;

/** A curve or point set's style: our own palette (ink, glow orange, dusk blue, fit green). */
export type CurveStyle = { stroke: string; width: number; dash?: readonly number[]; points?: boolean };

export const CURVE_STYLES = {
  measured: { stroke: "#b8b2ac", width: 1 },
  smoothed: { stroke: "#1d2430", width: 1.6 },
  sample: { stroke: "#d9622b", width: 1.8 },
  reference: { stroke: "#3b6ea8", width: 1.6, dash: [7, 4] },
  difference: { stroke: "#d9622b", width: 1.4 },
  points: { stroke: "#a8431a", width: 0, points: true },
  fit: { stroke: "#2f8a5b", width: 2 },
} as const satisfies Record<string, CurveStyle>;

/** An axis in the house style; `scale` names a second y scale. */
export function axisOf(
  label: string,
  o: { size?: number; scale?: string; side?: 0 | 1 | 2 | 3; stroke?: string; grid?: boolean } = {},
): uPlot.Axis {
  return {
    label,
    labelSize: 24,
    stroke: o.stroke ?? CHART_INK.axis,
    grid: o.grid === false ? { show: false } : { stroke: CHART_INK.grid },
    ticks: { stroke: CHART_INK.tick },
    ...(o.size ? { size: o.size } : {}),
    ...(o.scale ? { scale: o.scale } : {}),
    ...(o.side !== undefined ? { side: o.side } : {}),
  };
}

/** A uPlot series in a curve style. */
export function seriesOf(label: string, style: CurveStyle, extra: Partial<uPlot.Series> = {}): uPlot.Series {
  return {
    label,
    stroke: style.stroke,
    width: style.width,
    ...(style.dash ? { dash: [...style.dash] } : {}),
    points: style.points ? { show: true, size: 8, fill: style.stroke, stroke: CHART_INK.emphasis, width: 1 } : { show: false },
    ...extra,
  };
}

/** A reading at the cursor: 4 significant digits, exponent form for very large or small values. */
export function readingText(v: number | null | undefined, digits = 4): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return "—";
  const a = Math.abs(v);
  const text = a >= 1e5 || (a < 1e-3 && v !== 0) ? v.toExponential(digits - 1) : v.toPrecision(digits);
  return text.replace(/^-/, "\u2212");
}
