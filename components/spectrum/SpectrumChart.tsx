"use client";

import { useEffect, useMemo, useRef, useState } from "react";
import { createPortal } from "react-dom";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import { energyToAxis, type DisplayAxis } from "@/lib/spectrum-view/axis";
import type { SeriesKey, SpectrumDataPayload } from "@/lib/spectrum-view/payload";
import { FLAG_COLOURS, PEAK_COLOUR, SERIES_STYLE } from "./markerStyle";
import type { Marker } from "./types";

const HEIGHT = 380;
const ORDER: SeriesKey[] = ["raw", "smoothed", "reference", "difference"];

type Readout = { x: number; values: { key: SeriesKey; value: number | null }[] } | null;

const fmt = (v: number | null | undefined, digits = 4) => (v === null || v === undefined || !Number.isFinite(v) ? "—" : Math.abs(v) >= 1e5 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(digits - 1) : v.toPrecision(digits));

/**
 * The interactive chart: uPlot, created in an effect (it needs the DOM), with drag-to-zoom, wheel
 * zoom, Shift+drag pan, a crosshair readout of every series, and HTML markers for peaks and flags
 * placed over the plot so they can be hovered, clicked and found by tests and screen readers.
 */
export function SpectrumChart({
  data, axis, markers, active, onHover, onPick,
}: {
  data: SpectrumDataPayload;
  axis: DisplayAxis;
  markers: Marker[];
  active: string | null;
  onHover: (id: string | null) => void;
  onPick: (id: string) => void;
}) {
  const box = useRef<HTMLDivElement>(null);
  const [plot, setPlot] = useState<uPlot | null>(null);
  const [, setTick] = useState(0);
  const [readout, setReadout] = useState<Readout>(null);
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
      scales: { x: { time: false }, y: { auto: true }, ...(hasDiff ? { d: { auto: true } } : {}) },
      axes: [
        { label: data.xLabel, labelSize: 24, stroke: "#4b5566", grid: { stroke: "#eceae7" }, ticks: { stroke: "#d6d3d1" } },
        { label: data.yLabel, labelSize: 24, stroke: "#4b5566", grid: { stroke: "#eceae7" }, ticks: { stroke: "#d6d3d1" }, size: 64 },
        ...(hasDiff ? [{ scale: "d", side: 1 as const, label: "difference", labelSize: 24, stroke: "#a8431a", grid: { show: false }, size: 64 }] : []),
      ],
      series: [
        { label: data.xLabel },
        ...keys.map((k) => ({
          label: SERIES_STYLE[k].label,
          stroke: SERIES_STYLE[k].stroke,
          width: SERIES_STYLE[k].width,
          ...("dash" in SERIES_STYLE[k] ? { dash: [...(SERIES_STYLE[k] as { dash: readonly number[] }).dash] } : {}),
          scale: k === "difference" ? "d" : "y",
          points: { show: false },
          show: !hidden.has(k),
        })),
      ],
      hooks: {
        setScale: [() => setTick((t) => t + 1)],
        setSize: [() => setTick((t) => t + 1)],
        setCursor: [
          (u) => {
            const i = u.cursor.idx;
            if (i === null || i === undefined) return setReadout(null);
            setReadout({ x: u.data[0][i]!, values: keys.map((k, j) => ({ key: k, value: (u.data[j + 1]![i] ?? null) as number | null })) });
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
                const perPx = (max - min) / over.clientWidth;
                const move = (m: MouseEvent) => u.setScale("x", clamp(min - (m.clientX - start) * perPx, max - (m.clientX - start) * perPx));
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
  }, [data, keys]);

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

  return (
    <div>
      <div className="mb-2 flex flex-wrap items-center gap-x-4 gap-y-1 text-xs" data-testid="series-toggles">
        {keys.map((k) => (
          <label key={k} className="inline-flex cursor-pointer items-center gap-1.5">
            <input
              type="checkbox"
              className="accent-glow"
              checked={!hidden.has(k)}
              onChange={() => setHidden((h) => { const n = new Set(h); if (n.has(k)) n.delete(k); else n.add(k); return n; })}
            />
            <span className="inline-block h-0.5 w-5" style={{ background: SERIES_STYLE[k].stroke }} aria-hidden />
            {SERIES_STYLE[k].label}
          </label>
        ))}
        <span className="ml-auto flex gap-1">
          <button type="button" onClick={() => zoomBy(0.5)} className="rounded border border-stone-300 px-2 py-0.5 hover:bg-stone-50" aria-label="Zoom in">+</button>
          <button type="button" onClick={() => zoomBy(2)} className="rounded border border-stone-300 px-2 py-0.5 hover:bg-stone-50" aria-label="Zoom out">−</button>
          <button type="button" onClick={resetZoom} className="rounded border border-stone-300 px-2 py-0.5 hover:bg-stone-50">Whole range</button>
        </span>
      </div>
      <div className="tabular mb-1 h-5 overflow-hidden text-ellipsis whitespace-nowrap text-xs text-ink-soft" data-testid="readout" aria-live="off">
        {readout ? (
          <>
            <span className="font-medium text-ink">{fmt(readout.x, 6)} {axis === "ev" ? "eV" : axis === "nm" ? "nm" : "cm⁻¹"}</span>
            {readout.values.map((v) => (
              <span key={v.key} className="ml-3"><span style={{ color: SERIES_STYLE[v.key].stroke }}>■</span> {SERIES_STYLE[v.key].label.replace(" (right axis)", "")} {fmt(v.value)}</span>
            ))}
          </>
        ) : (
          <span className="text-ink-faint">Point at the chart to read every curve · drag to zoom · wheel to zoom · Shift+drag to pan · double-click for the whole range</span>
        )}
      </div>
      <div ref={box} className="relative w-full select-none" data-testid="spectrum-chart" style={{ minHeight: HEIGHT }} />
      <p className="sr-only" data-testid="axis-caption">Horizontal axis: {data.xLabel}. Vertical axis: {data.yLabel}.</p>
      {plot &&
        createPortal(
          <div className="pointer-events-none absolute inset-0">
            {/* peaks first, flags after: a flag paints over a peak at nearly the same place and gets the pointer */}
            {[...placed.filter((q) => q.group === "peak"), ...placed.filter((q) => q.group === "flag")].map((m) => {
              const colour = m.kind !== "peak" && m.kind !== "first-exciton" ? FLAG_COLOURS[m.kind] : PEAK_COLOUR;
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
                  onClick={() => onPick(m.id)}
                  className={`pointer-events-auto absolute top-0 h-full -translate-x-1/2 cursor-pointer ${m.group === "flag" ? "w-3" : "w-2"}`}
                  style={{ left: m.left }}
                >
                  <span
                    className="absolute left-1/2 top-0 h-full -translate-x-1/2"
                    style={{
                      width: on ? 3 : 1,
                      background: m.group === "flag" ? colour : "transparent",
                      borderLeft: m.group === "peak" ? `1px dashed ${colour}` : undefined,
                      opacity: on ? 1 : m.group === "flag" ? 0.75 : 0.9,
                    }}
                  />
                  <span
                    className="absolute left-1/2 -translate-x-1/2 whitespace-nowrap rounded px-1 text-[10px] font-semibold leading-4 text-white shadow-sm"
                    style={{ top: m.group === "flag" ? 2 + m.row * 18 : peakTop, background: colour, outline: on ? "2px solid #1d2430" : undefined }}
                  >
                    {m.group === "flag" ? m.label.split(" at ")[0] : "▼"}
                  </span>
                </button>
              );
            })}
          </div>,
          plot.over,
        )}
    </div>
  );
}
