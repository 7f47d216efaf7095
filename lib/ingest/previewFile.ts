import { parseSpectrumBytes, readChoiceOptions, SpectrumFileError, X_UNITS, Y_KINDS, yKindOf, type ParsedSpectrum, type ReadChoice, type TraceInfo } from "@/lib/engine";
import { Project, models } from "@/models";
import type { Actor } from "@/lib/auth/actor";
import { canReadProject, canWrite } from "@/lib/auth/access";
import { looksLikeZip } from "./expandZip";
import { previewFieldsSchema } from "./metadata";
import { Refusal } from "@/lib/errors";

/** At most this many points are drawn in a preview (every k-th point, the ends kept). */
const PLOT_POINTS = 300;

export type FilePreview =
  | {
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
      /** What storing the file with these choices creates, in words. */
      creates: string;
    }
  | { ok: false; fileName: string; error: string };

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
 * Reads a file the way storing it would (same engine, same choices) without storing anything,
 * and describes what was found: encoding, layout, units and where they came from, the columns
 * on offer, a thinned curve for a small plot, and what would be created. An unreadable file is
 * an answer too (`ok: false` with the engine's one-line message), not an error.
 */
export async function previewFile(actor: Actor, fileName: string, bytes: Uint8Array, fields: Record<string, string>, maxBytes: number): Promise<FilePreview> {
  const parsedFields = previewFieldsSchema.safeParse(fields);
  if (!parsedFields.success) {
    const issue = parsedFields.error.issues[0]!;
    throw new Refusal(400, "invalid", issue.message, String(issue.path[0] ?? "file"));
  }
  // The same access as an upload into the project: previews are for people who may store files there.
  models();
  const project = await Project.findByPk(parsedFields.data.projectId);
  if (!project || !(await canReadProject(actor, project))) {
    throw new Refusal(404, "not-found", `project ${parsedFields.data.projectId} was not found`, "projectId");
  }
  if (!canWrite(actor, project.groupId)) throw new Refusal(403, "forbidden", `you may not add spectra to project "${project.name}"`, "projectId");
  if (bytes.length === 0) return { ok: false, fileName, error: `${fileName}: the file is empty (0 bytes)` };
  if (bytes.length > maxBytes) return { ok: false, fileName, error: `${fileName}: ${bytes.length} bytes is over the upload limit of ${maxBytes} bytes` };
  if (looksLikeZip(fileName, bytes)) return { ok: false, fileName, error: `${fileName}: a zip is expanded when uploaded; each of its files is read then` };
  const { technique, projectId: _projectId, ...rest } = parsedFields.data;
  const choice: ReadChoice = {};
  if (rest.column !== undefined) choice.column = /^\d+$/.test(rest.column) ? Number(rest.column) : rest.column;
  for (const key of ["block", "pair", "sheet", "xUnit", "yKind"] as const) {
    if (rest[key] !== undefined) (choice as Record<string, unknown>)[key] = rest[key];
  }
  let s: ParsedSpectrum;
  try {
    s = await parseSpectrumBytes(fileName, bytes, { ...readChoiceOptions(choice), maxBytes, ...(technique ? { technique } : {}) });
  } catch (error) {
    if (error instanceof SpectrumFileError || error instanceof RangeError) return { ok: false, fileName, error: error.message.startsWith(fileName) ? error.message : `${fileName}: ${error.message}` };
    throw error;
  }
  const yKind = yKindOf(s.yUnit);
  const xLabel = X_UNITS[s.xUnit].label;
  const kind = technique ?? s.technique;
  const xMin = s.x[0]!;
  const xMax = s.x[s.x.length - 1]!;
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
    warnings: s.warnings,
    creates: `one ${kind === "pl" ? "photoluminescence" : kind === "ir" ? "mid-IR" : "absorption"} spectrum from column "${s.columnName}" (${s.x.length} points, ${Number(xMin.toPrecision(5))}–${Number(xMax.toPrecision(5))} ${s.xUnit})`,
  };
}
