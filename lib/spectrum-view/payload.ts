import { AXIS_LABELS, toDisplayAxis, type DisplayAxis } from "./axis";
import { TECHNIQUE_SPECS, type Technique } from "@/lib/registry/techniques";
import type { ViewArrays } from "./deriveViewArrays";
import { encodeColumns, type Column, type DecodedColumns } from "./columnsFormat";
import { formatNumber } from "./formatNumber";

export const SERIES_KEYS = ["raw", "smoothed", "reference", "difference"] as const;
export type SeriesKey = (typeof SERIES_KEYS)[number];

/** Body of GET /api/v1/spectra/{id}/data: columnar arrays, never one object per point. */
export interface SpectrumDataPayload {
  spectrumId: string;
  runId: string;
  axis: DisplayAxis;
  xLabel: string;
  yLabel: string;
  emission: boolean;
  points: number;
  x: number[];
  series: Record<SeriesKey, (number | null)[] | null>;
}

function jsonArray(a: Float64Array, digits: number): string {
  let s = "[";
  for (let i = 0; i < a.length; i++) {
    if (i) s += ",";
    const t = formatNumber(a[i]!, digits);
    s += t === "" ? "null" : t;
  }
  return `${s}]`;
}

export function yLabelFor(technique: Technique, yUnit: string, emission: boolean, axis: DisplayAxis): string {
  if (emission) return `Emission (counts per ${AXIS_LABELS[axis].unit})`;
  if (TECHNIQUE_SPECS[technique].valueWord === "counts") return "Emission (as recorded)";
  if (yUnit === "percent-transmittance") return "Absorbance (from %T)";
  return "Absorbance";
}

type PayloadMeta = { spectrumId: string; runId: string; technique: Technique; yUnit: string };

/** The head and curves of the data endpoint on one display axis, before encoding. */
function displayColumns(arrays: ViewArrays, axis: DisplayAxis, meta: PayloadMeta) {
  const d = toDisplayAxis(
    arrays.energyEv,
    { raw: arrays.raw, smoothed: arrays.smoothed, reference: arrays.reference, difference: arrays.difference },
    axis,
    {
      emission: arrays.emission,
    },
  );
  const head = {
    spectrumId: meta.spectrumId,
    runId: meta.runId,
    axis,
    xLabel: AXIS_LABELS[axis].title,
    yLabel: yLabelFor(meta.technique, meta.yUnit, arrays.emission, axis),
    emission: arrays.emission,
    points: d.x.length,
  };
  return { head, x: d.x, series: d.series };
}

/**
 * The data endpoint's JSON text for one axis, written by hand so a 100,000-point spectrum costs
 * one string build: X with 9 significant digits (enough to tell neighbouring points of any grid we
 * make apart), values with 7 (float32 precision, beyond any instrument's).
 */
export function buildDataPayload(arrays: ViewArrays, axis: DisplayAxis, meta: PayloadMeta): string {
  const { head, x, series: curves } = displayColumns(arrays, axis, meta);
  const series = SERIES_KEYS.map((k) => `${JSON.stringify(k)}:${curves[k] ? jsonArray(curves[k]!, 7) : "null"}`).join(",");
  return `${JSON.stringify(head).slice(0, -1)},"x":${jsonArray(x, 9)},"series":{${series}}}`;
}

/** The same curves in the binary columns format (columnsFormat.ts): X as float64, curves as float32. */
export function buildBinaryPayload(arrays: ViewArrays, axis: DisplayAxis, meta: PayloadMeta): Uint8Array {
  const { head, x, series } = displayColumns(arrays, axis, meta);
  const columns: Column[] = [{ name: "x", type: "f64", values: x }];
  for (const k of SERIES_KEYS) if (series[k]) columns.push({ name: k, type: "f32", values: series[k]! });
  return encodeColumns(head, columns);
}

/** Turns a decoded binary body back into the JSON body's shape (NaN → null), for the viewer. */
export function payloadFromColumns(decoded: DecodedColumns): SpectrumDataPayload {
  const { head, columns } = decoded;
  const list = (a: Float64Array | Float32Array) => Array.from(a, (v) => (Number.isNaN(v) ? null : v));
  const series = Object.fromEntries(SERIES_KEYS.map((k) => [k, columns[k] ? list(columns[k]) : null])) as SpectrumDataPayload["series"];
  const { columns: _names, ...rest } = head;
  return { ...(rest as Omit<SpectrumDataPayload, "x" | "series">), x: Array.from(columns.x ?? []), series };
}
