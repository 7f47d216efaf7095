import { Refusal } from "@/lib/errors";
import { UniqueConstraintError } from "sequelize";
import { fileNameProblem } from "@/lib/text/plainText";
import { AnalysisRun, Spectrum } from "@/models";
import { recordAudit } from "@/lib/audit";
import { deleteObject, newRawObjectKey, putObject, sha256Hex } from "@/lib/storage";
import { enqueueRun } from "./enqueueRun";
import { insertUpload } from "./insertUpload";
import { detailDifferences, type DetailDifference } from "./detailDifferences";
import type { IngestContext } from "./prepareIngest";
import { parameterHash, readChoiceOf } from "./parameters";
import { resolveTraceKey } from "./traceKey";
import { isTransientFault } from "@/lib/transientFault";
import { updateStoredDetails, type DetailsUpdate } from "./updateStoredDetails";

export type StoredFile = {
  fileName: string;
  spectrumId: string;
  runId: string | null;
  status: Spectrum["status"];
  duplicate: boolean;
  /** False when the queue could not be reached: the file is stored and will be queued by the worker's sweep. */
  queued: boolean;
  sha256: string;
  sizeBytes: number;
  /** For a duplicate: the details sent that differ from the stored ones. */
  differences?: DetailDifference[];
  /** For a duplicate sent with onDuplicate=update: what was updated, and the new run when analysis inputs changed. */
  updated?: DetailsUpdate;
  /** For one spectrum of a split file: the trace it reads (its label), and the series value read from its header. */
  trace?: string;
  seriesValue?: number | null;
  seriesUnit?: string;
  /** The import profile the file was read with (named in the request, or matched by its header). */
  profile?: { name: string; how: "named" | "matched" };
};

/** File names as stored: no control characters, no leading slashes, at most 255 characters. */
export function cleanFileName(name: string): string {
  const cleaned = name
    .replace(/\\/g, "/")
    .replace(/[\u0000-\u001f\u007f]/g, "")
    .replace(/^\/+/, "")
    .trim();
  return (cleaned || "unnamed").slice(-255);
}

function cleanContentType(type: string | undefined): string {
  const t = (type ?? "").split(";")[0].trim().toLowerCase();
  return /^[a-z0-9][\w.+-]*\/[\w.+-]+$/.test(t) ? t : "application/octet-stream";
}

/** The checks every file passes before anything is written; returns its stored name. */
export function checkedFile(file: { fileName: string; bytes: Uint8Array }, maxBytes: number): string {
  const fileName = cleanFileName(file.fileName);
  const nameProblem = fileNameProblem(file.fileName);
  if (nameProblem)
    throw new Refusal(
      400,
      "invalid-file-name",
      `${fileName.replace(/[\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/g, "?")}: ${nameProblem}`,
      "file",
    );
  if (file.bytes.length === 0) throw new Refusal(400, "empty-file", `${fileName}: the file is empty (0 bytes)`, "file");
  if (file.bytes.length > maxBytes) {
    throw new Refusal(413, "too-large", `${fileName}: ${file.bytes.length} bytes is over the upload limit of ${maxBytes} bytes`, "file");
  }
  return fileName;
}

async function duplicateOf(context: IngestContext, existing: Spectrum, fileName: string): Promise<StoredFile> {
  // Nothing is changed silently: differing details are reported (and audited); they replace the
  // stored ones only when the upload asked for it (onDuplicate=update).
  const differences = detailDifferences(context, existing);
  await recordAudit({
    actorId: context.actor.id,
    actorLabel: context.actor.email,
    groupId: context.project.groupId,
    action: "spectrum.upload-duplicate",
    targetType: "spectrum",
    targetId: existing.id,
    details: { fileName, sha256: existing.sha256, ...(differences.length ? { differences } : {}) },
  });
  const updated =
    differences.length && context.metadata.onDuplicate === "update"
      ? await updateStoredDetails(context, existing, differences, fileName)
      : undefined;
  const latest = await AnalysisRun.findOne({ where: { spectrumId: existing.id }, order: [["createdAt", "DESC"]], attributes: ["id"] });
  if (updated) await existing.reload();
  return {
    fileName,
    spectrumId: existing.id,
    runId: latest?.id ?? null,
    status: existing.status,
    duplicate: true,
    queued: false,
    sha256: existing.sha256,
    sizeBytes: existing.sizeBytes,
    ...(differences.length ? { differences } : {}),
    ...(updated ? { updated } : {}),
  };
}

/**
 * The raw object of one upload, stored once per project: the object of a spectrum already made
 * from the same bytes is reused (the traces of one file share it); otherwise the bytes are put.
 */
export class RawObject {
  private key: string | null = null;
  private fresh = false;
  constructor(
    private readonly projectId: string,
    private readonly sha256: string,
    private readonly bytes: Uint8Array,
    private readonly contentType: string,
  ) {}

  async objectKey(): Promise<string> {
    if (this.key) return this.key;
    const same = await Spectrum.findOne({
      where: { projectId: this.projectId, sha256: this.sha256 },
      attributes: ["objectKey"],
      order: [["createdAt", "ASC"]],
    });
    if (same) {
      this.key = same.objectKey;
      return this.key;
    }
    const key = newRawObjectKey();
    await putObject(key, this.bytes, this.contentType, this.sha256);
    this.key = key;
    this.fresh = true;
    return key;
  }

  /** After a failed insert: removes the object if this upload put it and no row refers to it (best effort). */
  async discardIfUnused(): Promise<void> {
    if (!this.fresh || !this.key) return;
    const used = await Spectrum.count({ where: { objectKey: this.key } }).catch(() => 1);
    if (used === 0) await deleteObject(this.key).catch(() => {});
  }
}

/**
 * Stores one trace of a file (the whole file, unless split): the same bytes and trace already
 * in the project are a duplicate (linked, never stored twice); otherwise the spectrum, its first
 * analysis run and an audit event are written in one statement, then the run is queued. The raw
 * object is shared by every trace of the file and never altered afterwards.
 */
export async function storeTrace(
  context: IngestContext,
  file: { fileName: string; sizeBytes: number; contentType: string; sha256: string },
  raw: RawObject,
  traceKey: string,
): Promise<StoredFile> {
  const { fileName, sha256 } = file;
  const existing = await Spectrum.findOne({ where: { projectId: context.project.id, sha256, traceKey } });
  if (existing) return duplicateOf(context, existing, fileName);

  const objectKey = await raw.objectKey();
  const { parameters, reference } = context;
  const referenceSpectrumId = reference?.id ?? null;
  let spectrumId: string;
  let runId: string;
  try {
    ({ spectrumId, runId } = await insertUpload({
      context,
      fileName,
      objectKey,
      sha256,
      sizeBytes: file.sizeBytes,
      contentType: file.contentType,
      traceKey,
      parameterHash: parameterHash(parameters, referenceSpectrumId),
    }));
  } catch (error) {
    await raw.discardIfUnused();
    if (error instanceof UniqueConstraintError) {
      const winner = await Spectrum.findOne({ where: { projectId: context.project.id, sha256, traceKey } });
      if (winner) return duplicateOf(context, winner, fileName);
    }
    throw error;
  }

  let queued = true;
  try {
    await enqueueRun(spectrumId, runId);
  } catch (error) {
    if (!isTransientFault(error)) console.error("enqueue failed", error);
    queued = false;
    // Stored and safe; the worker's sweep queues runs left waiting.
    await Spectrum.update({ status: "received" }, { where: { id: spectrumId, status: "queued" } }).catch(() => {});
  }
  return {
    fileName,
    spectrumId,
    runId,
    status: queued ? "queued" : "received",
    duplicate: false,
    queued,
    sha256,
    sizeBytes: file.sizeBytes,
  };
}

/** Stores one file as one spectrum (the trace its read choice names). */
export async function storeFile(
  context: IngestContext,
  file: { fileName: string; bytes: Uint8Array; contentType?: string },
  maxBytes: number,
): Promise<StoredFile> {
  const fileName = checkedFile(file, maxBytes);
  const sha256 = sha256Hex(file.bytes);
  const contentType = cleanContentType(file.contentType);
  const traceKey = await resolveTraceKey(fileName, file.bytes, context.parameters.technique, readChoiceOf(context.parameters), maxBytes);
  const raw = new RawObject(context.project.id, sha256, file.bytes, contentType);
  return storeTrace(context, { fileName, sizeBytes: file.bytes.length, contentType, sha256 }, raw, traceKey);
}

export { cleanContentType };
