"use client";

import { useEffect, useRef } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";

/** One series quantity against the series variable: measured points, and a fitted curve when there is one. */
export function SeriesPlot({ title, xLabel, yLabel, x, y, fit, testId }: {
  title: string; xLabel: string; yLabel: string; x: number[]; y: (number | null)[];
  fit?: { x: number[]; y: number[]; label: string } | null; testId?: string;
}) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = box.current;
    if (!el || x.length === 0) return;
    // uPlot wants one ascending x array: merge the measured and fitted abscissae.
    const xs = [...new Set([...x, ...(fit?.x ?? [])])].sort((a, b) => a - b);
    const measured = xs.map((v) => { const i = x.indexOf(v); return i >= 0 ? y[i] ?? null : null; });
    const series: uPlot.Series[] = [
      { label: xLabel },
      { label: yLabel, stroke: "#d9622b", width: 0, points: { show: true, size: 8, fill: "#d9622b", stroke: "#a8431a" } },
    ];
    const data: (number | null)[][] = [xs, measured];
    if (fit) {
      const fitted = xs.map((v) => { const i = fit.x.indexOf(v); return i >= 0 ? fit.y[i]! : null; });
      series.push({ label: fit.label, stroke: "#2f8a5b", width: 2, spanGaps: true, points: { show: false } });
      data.push(fitted);
    }
    const plot = new uPlot(
      {
        width: Math.max(280, el.clientWidth),
        height: 220,
        scales: { x: { time: false } },
        axes: [{ label: xLabel, size: 40 }, { label: yLabel, size: 60 }],
        series,
        legend: { show: true },
      },
      data as uPlot.AlignedData,
      el,
    );
    const resize = () => plot.setSize({ width: Math.max(280, el.clientWidth), height: 220 });
    window.addEventListener("resize", resize);
    return () => { window.removeEventListener("resize", resize); plot.destroy(); };
  }, [x, y, fit, xLabel, yLabel]);
  return (
    <figure className="rounded-lg border border-stone-200 bg-white p-3" data-testid={testId}>
      <figcaption className="mb-1 text-sm font-semibold">{title}</figcaption>
      <div ref={box} className="w-full" role="img" aria-label={`${title} against ${xLabel}`} />
    </figure>
  );
}
