import {
  parseSpectrumBytes,
  readChoiceOptions,
  SpectrumFileError,
  type ParsedSpectrum,
  type ReadChoice,
  type Technique,
  type TraceInfo,
} from "@/lib/engine";
import { canonicalJson } from "./canonicalJson";

/** Which trace of a file a spectrum reads: the sheet (spreadsheets), the block and the Y column in it. */
export type TraceId = { sheet: string | null; block: number; column: number };

/** The members of a read choice that pick a trace (the others only say how to read it). */
const SELECTORS = ["column", "block", "pair", "sheet"] as const;

export function selectsTrace(choice: ReadChoice): boolean {
  return SELECTORS.some((k) => choice[k] !== undefined);
}

const sameTrace = (a: TraceId, b: TraceId) => a.sheet === b.sheet && a.block === b.block && a.column === b.column;

/**
 * spectra.trace_key for a trace: '' for the trace the file is read as when nothing is chosen
 * (so a plain upload and one that names that same column are one spectrum), otherwise the sheet,
 * block and column of the trace.
 */
export function traceKeyOf(trace: TraceId, defaultTrace: TraceId): string {
  if (sameTrace(trace, defaultTrace)) return "";
  return `${trace.sheet === null ? "" : `sheet=${trace.sheet.slice(0, 200)};`}block=${trace.block};column=${trace.column}`;
}

export const traceIdOf = (s: Pick<ParsedSpectrum, "sheet" | "block" | "columnIndex">): TraceId => ({
  sheet: s.sheet ?? null,
  block: s.block ?? 1,
  column: s.columnIndex,
});
export const traceIdOfInfo = (t: TraceInfo, sheet: string | null): TraceId => ({ sheet, block: t.block, column: t.column });

/**
 * Parses only to find the traces: the X unit is forced when none is chosen (which trace a
 * column is does not depend on it, and a headerless file would be refused without one).
 */
export function parseForTraces(
  fileName: string,
  bytes: Uint8Array,
  technique: Technique,
  choice: ReadChoice,
  maxBytes: number,
): Promise<ParsedSpectrum> {
  return parseSpectrumBytes(fileName, bytes, { technique, maxBytes, ...readChoiceOptions({ ...choice, xUnit: choice.xUnit ?? "nm" }) });
}

/**
 * The trace key of an upload's read choice. A choice that names no column, block, pair or sheet
 * is the default reading (''); otherwise the file is read to find which trace it names, so
 * "column 1", "Absorbance" and nothing at all are the same spectrum when they pick the same
 * column. A file that cannot be read keys on the choice as stated (its analysis will fail with
 * the reader's message; the raw file is kept).
 */
export async function resolveTraceKey(
  fileName: string,
  bytes: Uint8Array,
  technique: Technique,
  choice: ReadChoice,
  maxBytes: number,
): Promise<string> {
  if (!selectsTrace(choice)) return "";
  try {
    const chosen = await parseForTraces(fileName, bytes, technique, choice, maxBytes);
    const plain = await parseForTraces(fileName, bytes, technique, { xUnit: choice.xUnit }, maxBytes);
    return traceKeyOf(traceIdOf(chosen), traceIdOf(plain));
  } catch (error) {
    if (!(error instanceof SpectrumFileError || error instanceof RangeError)) throw error;
    const stated = Object.fromEntries(SELECTORS.filter((k) => choice[k] !== undefined).map((k) => [k, choice[k]]));
    return `stated=${canonicalJson(stated)}`.slice(0, 300);
  }
}
