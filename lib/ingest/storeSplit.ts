import { SpectrumFileError, type TraceInfo } from "@/lib/engine";
import { normaliseSeriesUnit } from "@/lib/engine/parse/readSeriesValue";
import { Sample, Series } from "@/models";
import { sha256Hex } from "@/lib/storage";
import { Refusal } from "@/lib/errors";
import type { TraceAssignment } from "./metadata";
import type { IngestContext } from "./prepareIngest";
import { readChoiceOf, type AnalysisParameters } from "./parameters";
import { checkedFile, cleanContentType, RawObject, storeFile, storeTrace, type StoredFile } from "./storeFile";
import { parseForTraces, traceIdOf, traceIdOfInfo, traceKeyOf } from "./traceKey";

/** One spectrum a split will create: the trace, and its own sample and series value. */
export type SplitPart = { trace: TraceInfo; sampleId: string | null; seriesValue: number | null; seriesUnit: string | null };

/** Series units as a header writes them and as a series names its variable's unit are compared in one spelling ("equiv" = "eq", "uM" = "µM"). */
const unitWord = (u: string) => normaliseSeriesUnit(u);

/**
 * The parts of a split: every trace of the file (or of the chosen sheet), each with the sample
 * and series value an assignment gives it, else the batch's sample and the series value written
 * in its header ("0.5 eq", "10 µM", "t = 30 s"). Refuses (naming the trace) an assignment that
 * names no trace, and a header unit that is not the series' unit.
 */
export function splitParts(
  fileName: string,
  traces: readonly TraceInfo[],
  context: IngestContext,
  assignments: readonly TraceAssignment[] = [],
): SplitPart[] {
  for (const a of assignments) {
    if (!traces.some((t) => t.label === a.trace)) {
      throw new Refusal(
        400,
        "invalid",
        `${fileName}: assignments: no trace "${a.trace}" in the file (traces: ${traces.map((t) => t.label).join(", ")})`,
        "assignments",
      );
    }
  }
  const seriesUnit = context.series?.variableUnit?.trim() ?? "";
  const parts: SplitPart[] = [];
  for (const trace of traces) {
    const a = assignments.find((x) => x.trace === trace.label);
    if (a?.skip) continue;
    let seriesValue: number | null = null;
    let unit: string | null = null;
    if (context.series) {
      if (a?.seriesValue !== undefined) {
        seriesValue = a.seriesValue;
        unit = seriesUnit || null;
      } else if (trace.seriesValue) {
        if (seriesUnit && unitWord(seriesUnit) !== unitWord(trace.seriesValue.unit)) {
          throw new Refusal(
            400,
            "invalid",
            `${fileName}: column "${trace.label}" states ${trace.seriesValue.value} ${trace.seriesValue.unit}, but series "${context.series.name}" is in ${seriesUnit}; give the value in assignments or choose another series`,
            "assignments",
          );
        }
        seriesValue = trace.seriesValue.value;
        unit = trace.seriesValue.unit;
      } else if (context.metadata.seriesValue !== undefined && traces.length === 1) seriesValue = context.metadata.seriesValue;
    }
    parts.push({ trace, sampleId: a?.sampleId ?? context.sample?.id ?? null, seriesValue, seriesUnit: unit });
  }
  if (parts.length === 0)
    throw new Refusal(400, "invalid", `${fileName}: every trace was left out (skip); nothing to store`, "assignments");
  return parts;
}

/** The context of one part: the batch's, reading the part's trace, with its sample and series value. */
async function partContext(context: IngestContext, part: SplitPart, samples: Map<string, Sample>): Promise<IngestContext> {
  const parameters: AnalysisParameters = { ...context.parameters, block: part.trace.block, column: part.trace.column };
  delete parameters.pair;
  const sample = part.sampleId ? (samples.get(part.sampleId) ?? null) : null;
  return {
    ...context,
    sample,
    parameters,
    metadata: {
      ...context.metadata,
      seriesValue: part.seriesValue ?? undefined,
      sampleId: sample?.id,
      column: String(part.trace.column),
      block: part.trace.block,
      pair: undefined,
    },
  };
}

/**
 * Stores one file as one spectrum per trace, in one step: the raw bytes once, then each trace as
 * its own spectrum (own read choice, sample and series value, own analysis run). A trace stored
 * before (same bytes and trace) is linked as a duplicate, like a whole file. A file the reader
 * cannot split is stored as one spectrum, as without split (its analysis then fails with the
 * reader's message, and the raw file is kept).
 */
export async function storeSplit(
  context: IngestContext,
  file: { fileName: string; bytes: Uint8Array; contentType?: string },
  maxBytes: number,
): Promise<StoredFile[]> {
  const fileName = checkedFile(file, maxBytes);
  const choice = readChoiceOf(context.parameters);
  let traces: TraceInfo[];
  let sheet: string | null;
  let defaultId;
  let format: string;
  try {
    const { column: _c, block: _b, pair: _p, ...sheetChoice } = choice;
    const parsed = await parseForTraces(fileName, file.bytes, context.parameters.technique, sheetChoice, maxBytes);
    const plain = await parseForTraces(fileName, file.bytes, context.parameters.technique, { xUnit: choice.xUnit }, maxBytes);
    traces = parsed.traces ?? [];
    sheet = parsed.sheet ?? null;
    defaultId = traceIdOf(plain);
    format = parsed.format;
  } catch (error) {
    if (!(error instanceof SpectrumFileError || error instanceof RangeError)) throw error;
    return [await storeFile(context, file, maxBytes)];
  }
  if (traces.length <= 1 || format === "jcamp-dx") return [await storeFile(context, file, maxBytes)];
  const parts = splitParts(fileName, traces, context, context.metadata.assignments);

  const sampleIds = [...new Set(parts.map((p) => p.sampleId).filter((id): id is string => id !== null))];
  const samples = new Map<string, Sample>();
  for (const id of sampleIds) {
    const s = id === context.sample?.id ? context.sample : await Sample.findByPk(id);
    if (!s || s.groupId !== context.project.groupId)
      throw new Refusal(400, "invalid", `assignments: sample ${id} was not found in this project's group`, "assignments");
    samples.set(id, s);
  }
  const unitToFill = context.series && !context.series.variableUnit?.trim() ? parts.find((p) => p.seriesUnit)?.seriesUnit : undefined;
  if (context.series && unitToFill) {
    // The series had no unit yet: the headers' unit becomes its unit (every part was checked to agree with it below).
    const differing = parts.find((p) => p.seriesUnit && unitWord(p.seriesUnit) !== unitWord(unitToFill));
    if (differing)
      throw new Refusal(
        400,
        "invalid",
        `${fileName}: the column headers state different units (${unitToFill}, ${differing.seriesUnit}); give the values in assignments`,
        "assignments",
      );
    await Series.update({ variableUnit: unitToFill }, { where: { id: context.series.id, variableUnit: "" } });
  }

  const sha256 = sha256Hex(file.bytes);
  const contentType = cleanContentType(file.contentType);
  const raw = new RawObject(context.project.id, sha256, file.bytes, contentType);
  const out: StoredFile[] = [];
  for (const part of parts) {
    const traceKey = traceKeyOf(traceIdOfInfo(part.trace, sheet), defaultId);
    const stored = await storeTrace(
      await partContext(context, part, samples),
      { fileName, sizeBytes: file.bytes.length, contentType, sha256 },
      raw,
      traceKey,
    );
    out.push({
      ...stored,
      trace: part.trace.label,
      seriesValue: part.seriesValue,
      ...(part.seriesUnit ? { seriesUnit: part.seriesUnit } : {}),
    });
  }
  return out;
}
