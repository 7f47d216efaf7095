import { UniqueConstraintError } from "sequelize";
import { fileNameProblem } from "@/lib/text/plainText";
import { AnalysisRun, Spectrum, models } from "@/models";
import { recordAudit } from "@/lib/audit";
import { deleteObject, newRawObjectKey, putObject, sha256Hex } from "@/lib/storage";
import { enqueueRun } from "./enqueueRun";
import { insertUpload } from "./insertUpload";
import { detailDifferences, type DetailDifference } from "./detailDifferences";
import type { IngestContext } from "./prepareIngest";
import { parameterHash } from "./parameters";
import { isTransientFault } from "@/lib/transientFault";
import { Refusal } from "@/lib/errors";

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
  /** For a duplicate: the details sent that differ from the stored ones (the stored ones were kept). */
  differences?: DetailDifference[];
};

/** File names as stored: no control characters, no leading slashes, at most 255 characters. */
export function cleanFileName(name: string): string {
  const cleaned = name.replace(/\\/g, "/").replace(/[\u0000-\u001f\u007f]/g, "").replace(/^\/+/, "").trim();
  return (cleaned || "unnamed").slice(-255);
}

function cleanContentType(type: string | undefined): string {
  const t = (type ?? "").split(";")[0].trim().toLowerCase();
  return /^[a-z0-9][\w.+-]*\/[\w.+-]+$/.test(t) ? t : "application/octet-stream";
}

async function duplicateOf(context: IngestContext, existing: Spectrum, fileName: string): Promise<StoredFile> {
  // Nothing is changed silently: differing details are reported (and audited), the stored ones kept.
  const differences = detailDifferences(context, existing);
  const latest = await AnalysisRun.findOne({ where: { spectrumId: existing.id }, order: [["createdAt", "DESC"]], attributes: ["id"] });
  await recordAudit({
    actorId: context.actor.id,
    actorLabel: context.actor.email,
    groupId: context.project.groupId,
    action: "spectrum.upload-duplicate",
    targetType: "spectrum",
    targetId: existing.id,
    details: { fileName, sha256: existing.sha256, ...(differences.length ? { differences } : {}) },
  });
  return {
    fileName, spectrumId: existing.id, runId: latest?.id ?? null, status: existing.status, duplicate: true, queued: false,
    sha256: existing.sha256, sizeBytes: existing.sizeBytes, ...(differences.length ? { differences } : {}),
  };
}

/**
 * Stores one file of a prepared batch: a file already in the project (same sha256) is
 * linked instead of stored twice; otherwise the raw bytes go to object storage first, then
 * the spectrum, its first analysis run and an audit event are written in one statement,
 * then the run is queued. The raw object is never altered afterwards.
 */
export async function storeFile(
  context: IngestContext,
  file: { fileName: string; bytes: Uint8Array; contentType?: string },
  maxBytes: number,
): Promise<StoredFile> {
  const fileName = cleanFileName(file.fileName);
  const nameProblem = fileNameProblem(file.fileName);
  if (nameProblem) throw new Refusal(400, "invalid-file-name", `${fileName.replace(/[\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/g, "?")}: ${nameProblem}`, "file");
  if (file.bytes.length === 0) throw new Refusal(400, "empty-file", `${fileName}: the file is empty (0 bytes)`, "file");
  if (file.bytes.length > maxBytes) {
    throw new Refusal(413, "too-large", `${fileName}: ${file.bytes.length} bytes is over the upload limit of ${maxBytes} bytes`, "file");
  }
  models();
  const sha256 = sha256Hex(file.bytes);
  const existing = await Spectrum.findOne({ where: { projectId: context.project.id, sha256 } });
  if (existing) return duplicateOf(context, existing, fileName);

  const objectKey = newRawObjectKey();
  const contentType = cleanContentType(file.contentType);
  await putObject(objectKey, file.bytes, contentType, sha256);

  const { parameters, reference } = context;
  const referenceSpectrumId = reference?.id ?? null;
  let spectrumId: string;
  let runId: string;
  try {
    ({ spectrumId, runId } = await insertUpload({
      context, fileName, objectKey, sha256, sizeBytes: file.bytes.length, contentType,
      parameterHash: parameterHash(parameters, referenceSpectrumId),
    }));
  } catch (error) {
    // The object we just wrote is not referenced by any row: remove it (best effort).
    await deleteObject(objectKey).catch(() => {});
    if (error instanceof UniqueConstraintError) {
      const winner = await Spectrum.findOne({ where: { projectId: context.project.id, sha256 } });
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
    fileName, spectrumId, runId, status: queued ? "queued" : "received", duplicate: false, queued,
    sha256, sizeBytes: file.bytes.length,
  };
}
