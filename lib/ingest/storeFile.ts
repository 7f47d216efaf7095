import { UniqueConstraintError } from "sequelize";
import { AnalysisRun, Spectrum, models } from "@/models";
import { recordAudit } from "@/lib/audit";
import { deleteObject, newRawObjectKey, putObject, sha256Hex } from "@/lib/storage";
import { ENGINE_VERSION } from "@/lib/engine/version";
import { enqueueRun } from "./enqueueRun";
import { IngestError } from "./errors";
import type { IngestContext } from "./prepareIngest";
import { parameterHash } from "./parameters";
import { isTransientFault } from "./transient";

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
  const latest = await AnalysisRun.findOne({ where: { spectrumId: existing.id }, order: [["createdAt", "DESC"]], attributes: ["id"] });
  await recordAudit({
    actorId: context.actor.id,
    actorLabel: context.actor.email,
    groupId: context.project.groupId,
    action: "spectrum.upload-duplicate",
    targetType: "spectrum",
    targetId: existing.id,
    details: { fileName, sha256: existing.sha256 },
  });
  return {
    fileName, spectrumId: existing.id, runId: latest?.id ?? null, status: existing.status, duplicate: true, queued: false,
    sha256: existing.sha256, sizeBytes: existing.sizeBytes,
  };
}

/**
 * Stores one file of a prepared batch: a file already in the project (same sha256) is
 * linked instead of stored twice; otherwise the raw bytes go to object storage first, then
 * the spectrum, its first analysis run and an audit event are written in one transaction,
 * then the run is queued. The raw object is never altered afterwards.
 */
export async function storeFile(
  context: IngestContext,
  file: { fileName: string; bytes: Uint8Array; contentType?: string },
  maxBytes: number,
): Promise<StoredFile> {
  const fileName = cleanFileName(file.fileName);
  if (file.bytes.length === 0) throw new IngestError(400, "empty-file", `${fileName}: the file is empty (0 bytes)`, "file");
  if (file.bytes.length > maxBytes) {
    throw new IngestError(413, "too-large", `${fileName}: ${file.bytes.length} bytes is over the upload limit of ${maxBytes} bytes`, "file");
  }
  const db = models();
  const sha256 = sha256Hex(file.bytes);
  const existing = await Spectrum.findOne({ where: { projectId: context.project.id, sha256 } });
  if (existing) return duplicateOf(context, existing, fileName);

  const objectKey = newRawObjectKey();
  const contentType = cleanContentType(file.contentType);
  await putObject(objectKey, file.bytes, contentType, sha256);

  const { metadata, parameters, reference } = context;
  const referenceSpectrumId = reference?.id ?? null;
  let spectrum: Spectrum;
  let run: AnalysisRun;
  try {
    [spectrum, run] = await db.transaction(async (transaction) => {
      const s = await Spectrum.create(
        {
          projectId: context.project.id,
          sampleId: context.sample?.id ?? null,
          seriesId: context.series?.id ?? null,
          seriesValue: metadata.seriesValue ?? null,
          referenceSpectrumId,
          technique: metadata.technique,
          fileName,
          objectKey,
          sha256,
          sizeBytes: file.bytes.length,
          contentType,
          columnChoice: metadata.column ?? null,
          axisUnit: null,
          valueUnit: null,
          pathLengthCm: metadata.pathLengthCm ?? null,
          excitationNm: metadata.excitationNm ?? null,
          slitNm: null,
          integrationMs: null,
          solvent: context.solvent,
          material: parameters.material ?? context.sample?.material ?? null,
          status: "queued",
          errorMessage: null,
          uploadedBy: context.actor.id,
        },
        { transaction },
      );
      const r = await AnalysisRun.create(
        {
          spectrumId: s.id,
          referenceSpectrumId,
          engineVersion: ENGINE_VERSION,
          parameterHash: parameterHash(parameters, referenceSpectrumId),
          parameters,
          status: "queued",
          errorMessage: null,
          noise: null,
          report: null,
          requestedBy: context.actor.id,
          startedAt: null,
          finishedAt: null,
          durationMs: null,
        },
        { transaction },
      );
      await recordAudit(
        {
          actorId: context.actor.id,
          actorLabel: context.actor.email,
          groupId: context.project.groupId,
          action: "spectrum.upload",
          targetType: "spectrum",
          targetId: s.id,
          details: { fileName, sha256, sizeBytes: file.bytes.length, contentType, runId: r.id },
        },
        transaction,
      );
      return [s, r] as const;
    });
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
    await enqueueRun(spectrum.id, run.id);
  } catch (error) {
    if (!isTransientFault(error)) console.error("enqueue failed", error);
    queued = false;
    // Stored and safe; the worker's sweep queues runs left waiting.
    await Spectrum.update({ status: "received" }, { where: { id: spectrum.id, status: "queued" } }).catch(() => {});
  }
  return {
    fileName, spectrumId: spectrum.id, runId: run.id, status: queued ? "queued" : "received", duplicate: false, queued,
    sha256, sizeBytes: file.bytes.length,
  };
}
