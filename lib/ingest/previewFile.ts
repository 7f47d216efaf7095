import { Refusal } from "@/lib/errors";
import {
  analyzeSpectrum,
  parseSpectrumBytes,
  readChoiceOptions,
  SpectrumFileError,
  X_UNITS,
  Y_KINDS,
  yKindOf,
  type ParsedSpectrum,
  type ReadChoice,
  type TraceInfo,
} from "@/lib/engine";
import { Project } from "@/models";
import type { Actor } from "@/lib/auth/actor";
import { canReadProject, canWrite } from "@/lib/auth/access";
import { looksLikeZip } from "./expandZip";
import { previewFieldsSchema } from "./metadata";
import type { SampleBands } from "@/lib/parents/sampleBands";
import { applyProfile } from "./profiles/applyProfile";

/** At most this many points are drawn in a preview (every k-th point, the ends kept). */
const PLOT_POINTS = 300;

export type FilePreviewOk = {
  ok: true;
  fileName: string;
  format: ParsedSpectrum["format"];
  encoding: string;
  layout: NonNullable<ParsedSpectrum["layout"]>;
  sheet: string | null;
  sheets: string[];
  xUnit: ParsedSpectrum["xUnit"];
  xUnitLabel: string;
  xUnitSource: NonNullable<ParsedSpectrum["xUnitSource"]>;
  yKind: string;
  yKindLabel: string;
  technique: ParsedSpectrum["technique"];
  column: string;
  columnIndex: number;
  block: number;
  pair: number | null;
  traces: TraceInfo[];
  points: number;
  xMin: number;
  xMax: number;
  plot: { x: number[]; y: number[] };
  warnings: string[];
  /** The engine's own reading of the file's bands (null when it finds none to report), for the parent check before upload. */
  bands: SampleBands | null;
  /** What storing the file with these choices creates, in words. */
  creates: string;
  /** With split=all: the spectra it will create, one per trace, with the series value read from each header. */
  split: Array<{ label: string; seriesValue: { value: number; unit: string } | null }> | null;
  /** The import profile applied (named, or matched by the file's header signature), and the choices it filled in. */
  profile: { name: string; how: "named" | "matched"; fields: Record<string, string> } | null;
  /** The file's header signature, which a profile saved from this preview will match (docs/ingest.md). */
  signature: string | null;
};
export type FilePreview = FilePreviewOk | { ok: false; fileName: string; error: string };

function thin(x: Float64Array, y: Float64Array): { x: number[]; y: number[] } {
  const step = Math.max(1, Math.ceil(x.length / PLOT_POINTS));
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < x.length; i += step) {
    xs.push(x[i]!);
    ys.push(y[i]!);
  }
  if (xs[xs.length - 1] !== x[x.length - 1]) {
    xs.push(x[x.length - 1]!);
    ys.push(y[y.length - 1]!);
  }
  return { x: xs, y: ys };
}

/**
 * The bands the analysis will find in this file on its own (analyzeSpectrum without a reference:
 * the engine's peak finding and first-exciton choice), with its range on the energy axis.
 */
function bandsOf(s: ParsedSpectrum, technique: ParsedSpectrum["technique"], excitationNm: number | undefined): SampleBands | null {
  try {
    const report = analyzeSpectrum(s, { technique, ...(excitationNm !== undefined ? { excitationNm } : {}) });
    const { minEv, maxEv } = report.parameters.grid;
    const at = (p: { energyEv: number; fwhmMeV: number | null }) => ({ energyEv: p.energyEv, fwhmMeV: p.fwhmMeV });
    return {
      technique,
      rangeEv: [minEv, maxEv],
      firstExciton: report.firstExciton ? at(report.firstExciton) : null,
      peaks: report.peaks.map(at),
    };
  } catch (error) {
    if (error instanceof RangeError || error instanceof SpectrumFileError) return null;
    throw error;
  }
}

/**
 * Reads a file the way storing it would (same engine, same choices) without storing anything,
 * and describes what was found: encoding, layout, units and where they came from, the columns
 * on offer, a thinned curve for a small plot, and what would be created. An unreadable file is
 * an answer too (`ok: false` with the engine's one-line message), not an error.
 */
export async function previewFile(
  actor: Actor,
  fileName: string,
  bytes: Uint8Array,
  fields: Record<string, string>,
  maxBytes: number,
): Promise<FilePreview> {
  const parsedFields = previewFieldsSchema.safeParse(fields);
  if (!parsedFields.success) {
    const issue = parsedFields.error.issues[0]!;
    throw new Refusal(400, "invalid", issue.message, String(issue.path[0] ?? "file"));
  }
  // The same access as an upload into the project: previews are for people who may store files there.
  const project = await Project.findByPk(parsedFields.data.projectId);
  if (!project || !(await canReadProject(actor, project))) {
    throw new Refusal(404, "not-found", `project ${parsedFields.data.projectId} was not found`, "projectId");
  }
  if (!canWrite(actor, project.groupId))
    throw new Refusal(403, "forbidden", `you may not add spectra to project "${project.name}"`, "projectId");
  if (bytes.length > 0 && bytes.length <= maxBytes && !looksLikeZip(fileName, bytes)) {
    const applied = await applyProfile(project.id, fields, { fileName, bytes }, maxBytes, { wantSignature: true });
    const merged = previewFieldsSchema.safeParse(applied.fields);
    if (!merged.success) throw new Refusal(400, "invalid", merged.error.issues[0]!.message, "profile");
    const filled = applied.profile
      ? Object.fromEntries(
          Object.entries(applied.fields)
            .filter(([k]) => (fields[k] ?? "") === "")
            .map(([k, v]) => [k, String(v)]),
        )
      : {};
    return readForPreview(
      fileName,
      bytes,
      merged.data,
      maxBytes,
      applied.profile ? { ...applied.profile, fields: filled } : null,
      applied.signature,
    );
  }
  if (bytes.length === 0) return { ok: false, fileName, error: `${fileName}: the file is empty (0 bytes)` };
  if (bytes.length > maxBytes)
    return { ok: false, fileName, error: `${fileName}: ${bytes.length} bytes is over the upload limit of ${maxBytes} bytes` };
  return { ok: false, fileName, error: `${fileName}: a zip is expanded when uploaded; each of its files is read then` };
}

async function readForPreview(
  fileName: string,
  bytes: Uint8Array,
  fields: ReturnType<typeof previewFieldsSchema.parse>,
  maxBytes: number,
  profile: FilePreviewOk["profile"],
  signature: string | null,
): Promise<FilePreview> {
  const { technique, excitationNm, projectId: _projectId, split, profile: _profile, ...rest } = fields;
  const choice: ReadChoice = {};
  if (rest.column !== undefined) choice.column = /^\d+$/.test(rest.column) ? Number(rest.column) : rest.column;
  for (const key of ["block", "pair", "sheet", "xUnit", "yKind"] as const) {
    if (rest[key] !== undefined) (choice as Record<string, unknown>)[key] = rest[key];
  }
  let s: ParsedSpectrum;
  try {
    s = await parseSpectrumBytes(fileName, bytes, { ...readChoiceOptions(choice), maxBytes, ...(technique ? { technique } : {}) });
  } catch (error) {
    if (error instanceof SpectrumFileError || error instanceof RangeError)
      return { ok: false, fileName, error: error.message.startsWith(fileName) ? error.message : `${fileName}: ${error.message}` };
    throw error;
  }
  const yKind = yKindOf(s.yUnit);
  const xLabel = X_UNITS[s.xUnit].label;
  const kind = technique ?? s.technique;
  const xMin = s.x[0]!;
  const xMax = s.x[s.x.length - 1]!;
  const word = kind === "pl" ? "photoluminescence" : kind === "ir" ? "mid-IR" : "absorption";
  // A split reads every trace of the sheet (the column, block and pair choices only pick what the plot shows).
  const traces = s.traces ?? [];
  const splitParts =
    split === "all" && traces.length > 1 && s.format !== "jcamp-dx"
      ? traces.map((t) => ({ label: t.label, seriesValue: t.seriesValue ?? null }))
      : null;
  return {
    ok: true,
    fileName,
    format: s.format,
    encoding: s.encoding ?? "utf-8",
    layout: s.layout ?? "x-then-y",
    sheet: s.sheet ?? null,
    sheets: s.sheets ?? [],
    xUnit: s.xUnit,
    xUnitLabel: xLabel,
    xUnitSource: s.xUnitSource ?? "file",
    yKind,
    yKindLabel: Y_KINDS[yKind].label,
    technique: kind,
    column: s.columnName,
    columnIndex: s.columnIndex,
    block: s.block ?? 1,
    pair: s.pair ?? null,
    traces: s.traces ?? [],
    points: s.x.length,
    xMin,
    xMax,
    plot: thin(s.x, s.y),
    bands: bandsOf(s, kind, excitationNm),
    warnings: s.warnings,
    creates: splitParts
      ? `${splitParts.length} ${word} spectra, one per column: ${splitParts.map((p) => `"${p.label}"${p.seriesValue ? ` (${p.seriesValue.value} ${p.seriesValue.unit})` : ""}`).join(", ")}`
      : `one ${word} spectrum from column "${s.columnName}" (${s.x.length} points, ${Number(xMin.toPrecision(5))}–${Number(xMax.toPrecision(5))} ${s.xUnit})`,
    split: splitParts,
    profile,
    signature,
  };
}
