"use client";

import { useEffect, useRef, useState } from "react";
import { createPortal } from "react-dom";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import { ChartLegend } from "./ChartLegend";
import { ChartReadout, type Reading } from "./ChartReadout";
import { axisOf, seriesOf, type CurveStyle } from "./theme";

export type PlotCurve = { key: string; label: string; style: CurveStyle; y: (number | null)[] };
/** A vertical line at one x with its label on top (a flag on the evidence chart). */
export type PlotMarker = { id: string; at: number; label: string; colour: string };

/**
 * A chart in the house look for the smaller plots (review evidence, series panels): our legend and
 * readout instead of the library's, labelled markers, an x axis that may run high to low.
 * `x` is ascending; every curve has one value (or null) per x.
 */
export function LinePlot({
  x,
  curves,
  xLabel,
  xUnit,
  yLabel,
  height = 260,
  markers = [],
  descending = false,
  testId,
  ariaLabel,
}: {
  x: number[];
  curves: PlotCurve[];
  xLabel: string;
  xUnit: string;
  yLabel: string;
  height?: number;
  markers?: PlotMarker[];
  descending?: boolean;
  testId?: string;
  ariaLabel: string;
}) {
  const box = useRef<HTMLDivElement>(null);
  const [plot, setPlot] = useState<uPlot | null>(null);
  const [reading, setReading] = useState<Reading>(null);
  const [, setTick] = useState(0);

  useEffect(() => {
    const el = box.current;
    if (!el || x.length === 0) return;
    const width = () => Math.max(260, el.clientWidth);
    const u = new uPlot(
      {
        width: width(),
        height,
        legend: { show: false },
        cursor: { drag: { x: false, y: false }, points: { size: 6 } },
        scales: { x: { time: false, dir: descending ? -1 : 1 } },
        axes: [axisOf(xLabel, { size: 44 }), axisOf(yLabel, { size: 64 })],
        series: [{ label: xLabel }, ...curves.map((c) => seriesOf(c.label, c.style, { spanGaps: !c.style.points }))],
        hooks: {
          setSize: [() => setTick((t) => t + 1)],
          setCursor: [
            (p) => {
              const i = p.cursor.idx;
              if (i === null || i === undefined) return setReading(null);
              setReading({
                x: p.data[0][i]!,
                values: curves.map((c, j) => ({
                  key: c.key,
                  label: c.label,
                  style: c.style,
                  value: (p.data[j + 1]![i] ?? null) as number | null,
                })),
              });
            },
          ],
        },
      },
      [x, ...curves.map((c) => c.y)] as unknown as uPlot.AlignedData,
      el,
    );
    setPlot(u);
    const ro = new ResizeObserver(() => u.setSize({ width: width(), height }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      u.destroy();
      setPlot(null);
    };
  }, [x, curves, xLabel, yLabel, height, descending]);

  return (
    <div data-testid={testId}>
      <ChartLegend entries={curves.map((c) => ({ key: c.key, label: c.label, style: c.style }))} />
      <ChartReadout reading={reading} xUnit={xUnit} xDigits={5} hint="Point at the chart to read every curve" />
      <div ref={box} className="relative w-full" role="img" aria-label={ariaLabel} style={{ minHeight: height }} />
      {plot &&
        createPortal(
          <div className="pointer-events-none absolute inset-0">
            {markers.map((m) => {
              const left = plot.valToPos(m.at, "x");
              if (!(left >= 0 && left <= plot.over.clientWidth)) return null;
              return (
                <div key={m.id} className="absolute top-0 h-full" style={{ left }} data-testid="plot-marker">
                  <span className="absolute top-0 h-full -translate-x-1/2" style={{ width: 1, background: m.colour, opacity: 0.8 }} />
                  <span
                    className="absolute top-0.5 -translate-x-1/2 whitespace-nowrap rounded px-1 text-[10px] font-semibold leading-4 text-white shadow-sm"
                    style={{ background: m.colour }}
                  >
                    {m.label}
                  </span>
                </div>
              );
            })}
          </div>,
          plot.over,
        )}
    </div>
  );
}
