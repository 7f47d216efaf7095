"use client";

import { useEffect, useMemo, useRef, useState } from "react";
import { createPortal } from "react-dom";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import { ChartLegend } from "@/components/charts/ChartLegend";
import { ChartReadout, type Reading } from "@/components/charts/ChartReadout";
import { axisOf, seriesOf } from "@/components/charts/theme";
import { AXIS_LABELS, energyToAxis, type DisplayAxis } from "@/lib/spectrum-view/axis";
import type { SeriesKey, SpectrumDataPayload } from "@/lib/spectrum-view/payload";
import { FLAG_COLOURS, PEAK_COLOUR, SERIES_STYLE } from "./markerStyle";
import type { Marker } from "./types";

const HEIGHT = 380;
const ORDER: SeriesKey[] = ["raw", "smoothed", "reference", "difference"];

/** Markers closer than this (px) share one strip, whose click offers a choice between them. */
const CLUSTER_PX = 8;
const readingLabel = (k: SeriesKey) => SERIES_STYLE[k].label.replace(" (right axis)", "");

/**
 * The interactive chart: uPlot, created in an effect (it needs the DOM), with drag-to-zoom, wheel
 * zoom, Shift+drag pan, a crosshair readout of every series, and HTML markers for peaks and flags
 * placed over the plot so they can be hovered, clicked and found by tests and screen readers.
 * Every marker has its own label button; markers at one place also share a strip that opens a
 * small chooser, so each of them can be picked. `descending` draws the x axis high to low.
 */
export function SpectrumChart({
  data,
  axis,
  descending,
  markers,
  active,
  onHover,
  onPick,
}: {
  data: SpectrumDataPayload;
  axis: DisplayAxis;
  descending: boolean;
  markers: Marker[];
  active: string | null;
  onHover: (id: string | null) => void;
  onPick: (id: string) => void;
}) {
  const box = useRef<HTMLDivElement>(null);
  const [plot, setPlot] = useState<uPlot | null>(null);
  const [, setTick] = useState(0);
  const [reading, setReading] = useState<Reading>(null);
  const [chooser, setChooser] = useState<{ left: number; ids: string[] } | null>(null);
  const keys = useMemo(() => ORDER.filter((k) => data.series[k]), [data]);
  const [hidden, setHidden] = useState<Set<SeriesKey>>(new Set());

  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const xs = data.x;
    const dataMin = xs[0]!;
    const dataMax = xs[xs.length - 1]!;
    const hasDiff = keys.includes("difference");
    const opts: uPlot.Options = {
      width: Math.max(320, el.clientWidth),
      height: HEIGHT,
      legend: { show: false },
      cursor: { drag: { x: true, y: false, setScale: true }, points: { size: 6 } },
      scales: { x: { time: false, dir: descending ? -1 : 1 }, y: { auto: true }, ...(hasDiff ? { d: { auto: true } } : {}) },
      axes: [
        axisOf(data.xLabel),
        axisOf(data.yLabel, { size: 64 }),
        ...(hasDiff ? [axisOf("difference", { scale: "d", side: 1, stroke: "#a8431a", grid: false, size: 64 })] : []),
      ],
      series: [
        { label: data.xLabel },
        ...keys.map((k) =>
          seriesOf(SERIES_STYLE[k].label, SERIES_STYLE[k], { scale: k === "difference" ? "d" : "y", show: !hidden.has(k) }),
        ),
      ],
      hooks: {
        setScale: [() => setTick((t) => t + 1)],
        setSize: [() => setTick((t) => t + 1)],
        setCursor: [
          (u) => {
            const i = u.cursor.idx;
            if (i === null || i === undefined) return setReading(null);
            setReading({
              x: u.data[0][i]!,
              values: keys.map((k, j) => ({
                key: k,
                label: readingLabel(k),
                style: SERIES_STYLE[k],
                value: (u.data[j + 1]![i] ?? null) as number | null,
              })),
            });
          },
        ],
        ready: [
          (u) => {
            const over = u.over;
            const clamp = (min: number, max: number) => {
              const span = Math.min(max - min, dataMax - dataMin);
              if (min < dataMin) [min, max] = [dataMin, dataMin + span];
              if (max > dataMax) [min, max] = [dataMax - span, dataMax];
              return { min, max };
            };
            over.addEventListener(
              "wheel",
              (e) => {
                e.preventDefault();
                const { min, max } = u.scales.x as { min: number; max: number };
                const at = u.posToVal(e.offsetX, "x");
                const f = e.deltaY < 0 ? 0.8 : 1.25;
                if (f < 1 && (max - min) / (dataMax - dataMin) < 1e-4) return;
                u.setScale("x", clamp(at - (at - min) * f, at + (max - at) * f));
              },
              { passive: false },
            );
            over.addEventListener(
              "mousedown",
              (e) => {
                if (!e.shiftKey) return;
                e.stopPropagation();
                e.preventDefault();
                const start = e.clientX;
                const { min, max } = u.scales.x as { min: number; max: number };
                // on a high-to-low axis a drag to the right moves to higher values
                const perPx = ((max - min) / over.clientWidth) * (descending ? -1 : 1);
                const move = (m: MouseEvent) =>
                  u.setScale("x", clamp(min - (m.clientX - start) * perPx, max - (m.clientX - start) * perPx));
                const up = () => {
                  window.removeEventListener("mousemove", move);
                  window.removeEventListener("mouseup", up);
                };
                window.addEventListener("mousemove", move);
                window.addEventListener("mouseup", up);
              },
              true,
            );
          },
        ],
      },
    };
    const columns: uPlot.AlignedData = [xs, ...keys.map((k) => data.series[k]!)] as unknown as uPlot.AlignedData;
    const u = new uPlot(opts, columns, el);
    setPlot(u);
    const ro = new ResizeObserver(() => u.setSize({ width: Math.max(320, el.clientWidth), height: HEIGHT }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      u.destroy();
      setPlot(null);
    };
    // hidden is applied by the effect below, without recreating the chart
  }, [data, keys, descending]);

  useEffect(() => {
    if (!plot) return;
    keys.forEach((k, j) => plot.setSeries(j + 1, { show: !hidden.has(k) }));
  }, [plot, hidden, keys]);

  const resetZoom = () => {
    if (plot) plot.setScale("x", { min: data.x[0]!, max: data.x[data.x.length - 1]! });
  };
  const zoomBy = (f: number) => {
    if (!plot) return;
    const { min, max } = plot.scales.x as { min: number; max: number };
    const mid = (min + max) / 2;
    const half = ((max - min) / 2) * f;
    const lo = Math.max(data.x[0]!, mid - half);
    const hi = Math.min(data.x[data.x.length - 1]!, mid + half);
    plot.setScale("x", { min: lo, max: hi });
  };

  const placed = plot
    ? markers.flatMap((m) => {
        const xv = energyToAxis(m.energyEv, axis);
        const { min, max } = plot.scales.x as { min: number; max: number };
        if (!(xv >= min && xv <= max)) return [];
        return [{ ...m, left: plot.valToPos(xv, "x"), row: 0 }];
      })
    : [];
  // flag labels that would overlap (two flags at one energy, e.g. a bleach with a broadening) go on rows below each other
  const rowEnds: number[] = [];
  for (const m of placed.filter((q) => q.group === "flag").sort((a, b) => a.left - b.left)) {
    const half = (m.label.split(" at ")[0]!.length * 6 + 10) / 2;
    let row = rowEnds.findIndex((end) => m.left - half > end + 2);
    if (row < 0) row = rowEnds.length;
    rowEnds[row] = m.left + half;
    m.row = row;
  }
  const peakTop = 2 + Math.max(1, rowEnds.length) * 18;
  // markers within CLUSTER_PX of each other share one strip
  const clusters: (typeof placed)[] = [];
  for (const m of [...placed].sort((a, b) => a.left - b.left)) {
    const last = clusters.at(-1);
    if (last && m.left - last[0]!.left <= CLUSTER_PX) last.push(m);
    else clusters.push([m]);
  }
  const colourOf = (m: Marker) => (m.kind !== "peak" && m.kind !== "first-exciton" ? FLAG_COLOURS[m.kind] : PEAK_COLOUR);
  const byId = new Map(placed.map((m) => [m.id, m]));
  const xUnit = AXIS_LABELS[axis].unit;

  return (
    <div>
      <ChartLegend
        testId="series-toggles"
        entries={keys.map((k) => ({ key: k, label: SERIES_STYLE[k].label, style: SERIES_STYLE[k] }))}
        hidden={hidden}
        onToggle={(k) =>
          setHidden((h) => {
            const n = new Set(h);
            if (n.has(k as SeriesKey)) n.delete(k as SeriesKey);
            else n.add(k as SeriesKey);
            return n;
          })
        }
        extra={
          <>
            <button
              type="button"
              onClick={() => zoomBy(0.5)}
              className="rounded border border-stone-300 px-2 py-0.5 hover:bg-stone-50"
              aria-label="Zoom in"
            >
              +
            </button>
            <button
              type="button"
              onClick={() => zoomBy(2)}
              className="rounded border border-stone-300 px-2 py-0.5 hover:bg-stone-50"
              aria-label="Zoom out"
            >
              −
            </button>
            <button type="button" onClick={resetZoom} className="rounded border border-stone-300 px-2 py-0.5 hover:bg-stone-50">
              Whole range
            </button>
          </>
        }
      />
      <ChartReadout
        reading={reading}
        xUnit={xUnit}
        hint="Point at the chart to read every curve · drag to zoom · wheel to zoom · Shift+drag to pan · double-click for the whole range"
      />
      <div ref={box} className="relative w-full select-none" data-testid="spectrum-chart" style={{ minHeight: HEIGHT }} />
      <p className="sr-only" data-testid="axis-caption">
        Horizontal axis: {data.xLabel}
        {descending ? ", high to low" : ""}. Vertical axis: {data.yLabel}.
      </p>
      {plot &&
        createPortal(
          <div className="pointer-events-none absolute inset-0">
            {/* the lines, then one strip per place (a chooser where markers share it), then the labels on top */}
            {placed.map((m) => {
              const on = active === m.id;
              const colour = colourOf(m);
              return (
                <span
                  key={`line-${m.id}`}
                  className="absolute top-0 h-full -translate-x-1/2"
                  style={{
                    left: m.left,
                    width: on ? 3 : 1,
                    background: m.group === "flag" ? colour : "transparent",
                    borderLeft: m.group === "peak" ? `1px dashed ${colour}` : undefined,
                    opacity: on ? 1 : m.group === "flag" ? 0.75 : 0.9,
                  }}
                  aria-hidden
                />
              );
            })}
            {clusters.map((c) => {
              const single = c.length === 1 ? c[0]! : null;
              const left = c.reduce((a, m) => a + m.left, 0) / c.length;
              return (
                <button
                  key={`strip-${c.map((m) => m.id).join("-")}`}
                  type="button"
                  data-testid="marker-strip"
                  tabIndex={-1}
                  aria-hidden
                  title={c.map((m) => m.label).join("\n")}
                  onMouseEnter={() => single && onHover(single.id)}
                  onMouseLeave={() => single && onHover(null)}
                  onClick={() =>
                    single ? onPick(single.id) : setChooser((o) => (o && o.ids[0] === c[0]!.id ? null : { left, ids: c.map((m) => m.id) }))
                  }
                  className="pointer-events-auto absolute top-0 z-10 h-full w-3 -translate-x-1/2 cursor-pointer"
                  style={{ left }}
                />
              );
            })}
            {placed.map((m) => {
              const on = active === m.id;
              return (
                <button
                  key={m.id}
                  type="button"
                  data-testid={`marker-${m.group}`}
                  data-marker-id={m.id}
                  aria-label={m.label}
                  title={m.label}
                  aria-pressed={on}
                  onMouseEnter={() => onHover(m.id)}
                  onMouseLeave={() => onHover(null)}
                  onClick={() => {
                    setChooser(null);
                    onPick(m.id);
                  }}
                  className="pointer-events-auto absolute z-20 -translate-x-1/2 cursor-pointer whitespace-nowrap rounded px-1 text-[10px] font-semibold leading-4 text-white shadow-sm"
                  style={{
                    left: m.left,
                    top: m.group === "flag" ? 2 + m.row * 18 : peakTop,
                    background: colourOf(m),
                    outline: on ? "2px solid #1d2430" : undefined,
                  }}
                >
                  {m.group === "flag" ? m.label.split(" at ")[0] : "▼"}
                </button>
              );
            })}
            {chooser && (
              <div
                role="menu"
                aria-label="Markers at this place"
                data-testid="marker-chooser"
                className="pointer-events-auto absolute z-30 min-w-40 -translate-x-1/2 rounded-md border border-stone-200 bg-white py-1 text-xs shadow-lg"
                style={{ left: chooser.left, top: peakTop + 20 }}
                onKeyDown={(e) => e.key === "Escape" && setChooser(null)}
              >
                <p className="px-2 pb-1 text-ink-faint">{chooser.ids.length} markers here: pick one</p>
                {chooser.ids.map((id) => {
                  const m = byId.get(id);
                  if (!m) return null;
                  return (
                    <button
                      key={id}
                      type="button"
                      role="menuitem"
                      className="flex w-full items-center gap-1.5 px-2 py-1 text-left hover:bg-stone-50"
                      onMouseEnter={() => onHover(id)}
                      onMouseLeave={() => onHover(null)}
                      onClick={() => {
                        setChooser(null);
                        onPick(id);
                      }}
                    >
                      <span className="inline-block h-2.5 w-2.5 rounded-sm" style={{ background: colourOf(m) }} aria-hidden />
                      {m.label}
                    </button>
                  );
                })}
              </div>
            )}
          </div>,
          plot.over,
        )}
    </div>
  );
}
