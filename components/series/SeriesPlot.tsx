"use client";

import { useMemo } from "react";
import { LinePlot, type PlotCurve } from "@/components/charts/LinePlot";
import { CURVE_STYLES } from "@/components/charts/theme";

/** One series quantity against the series variable, in the house chart look: measured points, and the fitted curve when there is one. */
export function SeriesPlot({
  title,
  xLabel,
  xUnit,
  yLabel,
  x,
  y,
  fit,
  testId,
  note,
}: {
  title: string;
  xLabel: string;
  xUnit: string;
  yLabel: string;
  x: number[];
  y: (number | null)[];
  fit?: { x: number[]; y: number[]; label: string } | null;
  testId?: string;
  note?: React.ReactNode;
}) {
  // uPlot wants one ascending x array: merge the measured and fitted abscissae.
  const { xs, curves } = useMemo(() => {
    const xs = [...new Set([...x, ...(fit?.x ?? [])])].sort((a, b) => a - b);
    const measured = xs.map((v) => {
      const i = x.indexOf(v);
      return i >= 0 ? (y[i] ?? null) : null;
    });
    const curves: PlotCurve[] = [{ key: "measured", label: "measured", style: CURVE_STYLES.points, y: measured }];
    if (fit)
      curves.push({
        key: "fit",
        label: fit.label,
        style: CURVE_STYLES.fit,
        y: xs.map((v) => {
          const i = fit.x.indexOf(v);
          return i >= 0 ? fit.y[i]! : null;
        }),
      });
    return { xs, curves };
  }, [x, y, fit]);
  return (
    <figure className="min-w-0 rounded-lg border border-stone-200 bg-white p-3" data-testid={testId}>
      <figcaption className="mb-1 text-sm font-semibold">{title}</figcaption>
      {note && <div className="mb-1 text-sm">{note}</div>}
      <LinePlot
        x={xs}
        curves={curves}
        xLabel={xLabel}
        xUnit={xUnit}
        yLabel={yLabel}
        height={220}
        ariaLabel={`${title} against ${xLabel}`}
      />
    </figure>
  );
}
