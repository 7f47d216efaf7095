import { sha256Hex } from "@/lib/hash";
import { HeadObjectCommand } from "@aws-sdk/client-s3";
import { QueryTypes, type Transaction } from "sequelize";
import { config } from "@/lib/config";
import { recordAudit } from "@/lib/audit";
import { deleteObject, s3 } from "@/lib/storage";
import { Tombstone } from "@/models";
import type { DeletionCause } from "@/models/Tombstone";
import type { DataClass } from "./types";
import { Refusal } from "@/lib/errors";
import { sequelize } from "@/lib/db";

// Deleting a stored spectrum or an analysis run, safely against crashes:
//   1. one transaction re-checks holds and dependents and writes a *pending* tombstone;
//   2. a second transaction locks and deletes the row, deletes the object (idempotent),
//      marks the tombstone done and records the audit event, then commits.
// A process killed anywhere leaves a pending tombstone; finishPending() completes it on
// the next run. See docs/stewardship.md, "Interrupted sweeps".

/** Why a deletion was refused: a Refusal whose code is one of these (404 for "gone", else 409). */
export type DeletionRefusalCode = "held" | "referenced" | "busy" | "gone";
const deletionRefused = (message: string, code: DeletionRefusalCode) => new Refusal(code === "gone" ? 404 : 409, code, message);

/** True when a deletion was refused because the record is already gone. */
export const isGone = (error: unknown) => error instanceof Refusal && error.code === "gone";

export type DeleteRequest = {
  cause: DeletionCause;
  actorId: string | null;
  actorLabel: string;
  policyId?: string | null;
  /** Test hook: pause this long after the object is deleted, before the commit. */
  pauseMs?: number;
};

type SpectrumRow = {
  id: string;
  project_id: string;
  group_id: string;
  series_id: string | null;
  sample_id: string | null;
  file_name: string;
  object_key: string;
  sha256: string;
  size_bytes: string;
  status: string;
};

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/**
 * The first active legal hold covering a spectrum (through project, series, sample or itself;
 * a supernatant through its point's series).
 */
export async function holdCoveringSpectrum(
  spectrumId: string,
  transaction?: Transaction,
): Promise<{ reason: string; targetType: string } | null> {
  const db = sequelize();
  const rows = await db.query<{ reason: string; target_type: string }>(
    `SELECT h.reason, h.target_type FROM spectra s JOIN legal_holds h ON h.lifted_at IS NULL AND (
        (h.target_type = 'project' AND h.target_id = s.project_id)
     OR (h.target_type = 'series' AND h.target_id = COALESCE(s.series_id, (SELECT p.series_id FROM spectra p WHERE p.id = s.supernatant_of_spectrum_id)))
     OR (h.target_type = 'sample' AND h.target_id = s.sample_id) OR (h.target_type = 'spectrum' AND h.target_id = s.id))
      WHERE s.id = :id ORDER BY h.placed_at LIMIT 1`,
    { replacements: { id: spectrumId }, type: QueryTypes.SELECT, transaction },
  );
  return rows[0] ? { reason: rows[0].reason, targetType: rows[0].target_type } : null;
}

export function holdMessage(hold: { reason: string; targetType: string }): string {
  return `This is under a legal hold (on its ${hold.targetType}): ${hold.reason}. Nothing under a hold can be deleted until a data steward lifts it.`;
}

async function dependentOf(spectrumId: string, transaction: Transaction): Promise<string | null> {
  const rows = await sequelize().query<{ file_name: string }>("SELECT file_name FROM spectra WHERE reference_spectrum_id = :id LIMIT 1", {
    replacements: { id: spectrumId },
    type: QueryTypes.SELECT,
    transaction,
  });
  return rows[0]?.file_name ?? null;
}

export async function objectExists(key: string): Promise<boolean> {
  try {
    await s3().send(new HeadObjectCommand({ Bucket: config().S3_BUCKET, Key: key }));
    return true;
  } catch (error) {
    const status = (error as { $metadata?: { httpStatusCode?: number } }).$metadata?.httpStatusCode;
    if (status === 404 || (error as { name?: string }).name === "NotFound") return false;
    throw error;
  }
}

/** Step 1: re-check and journal the deletion of a spectrum. Throws a Refusal (see DeletionRefusalCode). */
export async function beginSpectrumDeletion(spectrumId: string, request: DeleteRequest): Promise<Tombstone> {
  const db = sequelize();
  return db.transaction(async (transaction) => {
    const [row] = await db.query<SpectrumRow>(
      `SELECT s.id, s.project_id, p.group_id, s.series_id, s.sample_id, s.file_name, s.object_key, s.sha256, s.size_bytes, s.status
         FROM spectra s JOIN projects p ON p.id = s.project_id WHERE s.id = :id FOR UPDATE OF s`,
      { replacements: { id: spectrumId }, type: QueryTypes.SELECT, transaction },
    );
    if (!row) throw deletionRefused("This spectrum no longer exists.", "gone");
    const hold = await holdCoveringSpectrum(spectrumId, transaction);
    if (hold) throw deletionRefused(holdMessage(hold), "held");
    const dependent = await dependentOf(spectrumId, transaction);
    if (dependent)
      throw deletionRefused(
        `This spectrum is the reference of "${dependent}", which is kept; delete or re-reference that one first.`,
        "referenced",
      );
    if (row.status === "queued" || row.status === "analysing")
      throw deletionRefused("An analysis of this spectrum is queued or running; try again when it has finished.", "busy");
    const pending = await Tombstone.findOne({ where: { targetType: "spectrum", targetId: spectrumId, state: "pending" }, transaction });
    if (pending) return pending;
    return Tombstone.create(
      {
        groupId: row.group_id,
        projectId: row.project_id,
        policyId: request.policyId ?? null,
        dataClass: row.status === "failed" ? "drafts" : "raw",
        targetType: "spectrum",
        targetId: row.id,
        label: row.file_name,
        objectKey: row.object_key,
        sha256: row.sha256,
        sizeBytes: Number(row.size_bytes),
        cause: request.cause,
        actorId: request.actorId,
        completedAt: null,
        details: { actorLabel: request.actorLabel, seriesId: row.series_id, sampleId: row.sample_id },
      },
      { transaction },
    );
  });
}

/**
 * Step 2 (also the recovery step): deletes the row and its object and closes the
 * tombstone. Returns the final state. Safe to call again after any interruption.
 */
export async function completeTombstone(
  tombstoneId: string,
  request: Pick<DeleteRequest, "pauseMs"> = {},
): Promise<"done" | "cancelled" | "skipped"> {
  const db = sequelize();
  return db.transaction(async (transaction) => {
    const t = await Tombstone.findOne({
      where: { id: tombstoneId, state: "pending" },
      transaction,
      lock: transaction.LOCK.UPDATE,
      skipLocked: true,
    });
    if (!t) return "skipped";
    const actorLabel = String((t.details as { actorLabel?: string }).actorLabel ?? "retention sweep");
    const [exists] = await db.query<{ id: string }>("SELECT id FROM spectra WHERE id = :id FOR UPDATE", {
      replacements: { id: t.targetId },
      type: QueryTypes.SELECT,
      transaction,
    });
    if (exists) {
      const hold = await holdCoveringSpectrum(t.targetId, transaction);
      const dependent = hold ? null : await dependentOf(t.targetId, transaction);
      if (hold || dependent) {
        // Placed between the two steps. If the object is still there nothing was lost: cancel.
        const stillStored = t.objectKey ? await objectExists(t.objectKey) : true;
        await t.update(
          {
            state: "cancelled",
            completedAt: new Date(),
            details: { ...t.details, cancelledBecause: hold ? "hold" : "referenced", objectLost: !stillStored },
          },
          { transaction },
        );
        return "cancelled";
      }
      await db.query("DELETE FROM spectra WHERE id = :id", { replacements: { id: t.targetId }, transaction });
    }
    // The traces of one file share its object (migrations/0010): it goes with the last spectrum that reads it.
    const [shared] = t.objectKey
      ? await db.query<{ id: string }>("SELECT id FROM spectra WHERE object_key = :key LIMIT 1", {
          replacements: { key: t.objectKey },
          type: QueryTypes.SELECT,
          transaction,
        })
      : [];
    if (t.objectKey && !shared) await deleteObject(t.objectKey); // idempotent: deleting a missing key succeeds
    if (request.pauseMs) await sleep(request.pauseMs);
    await t.update({ state: "done", completedAt: new Date() }, { transaction });
    await recordAudit(
      {
        actorId: t.actorId,
        actorLabel,
        groupId: t.groupId,
        action: "deleted",
        targetType: "spectrum",
        targetId: t.targetId,
        details: {
          fileName: t.label,
          sha256: t.sha256,
          sizeBytes: t.sizeBytes,
          cause: t.cause,
          policyId: t.policyId,
          dataClass: t.dataClass,
          tombstoneId: t.id,
        },
      },
      transaction,
    );
    return "done";
  });
}

/** Deletes one spectrum now (owner or steward action, or a policy): both steps. */
export async function deleteSpectrum(spectrumId: string, request: DeleteRequest): Promise<Tombstone> {
  const t = await beginSpectrumDeletion(spectrumId, request);
  const state = await completeTombstone(t.id, request);
  if (state === "cancelled")
    throw deletionRefused("A legal hold or a dependent spectrum appeared while deleting; nothing was deleted.", "held");
  await t.reload();
  return t;
}

/** Deletes one analysis run (no object in storage) in one transaction, with its tombstone. */
export async function deleteAnalysisRun(runId: string, request: DeleteRequest & { dataClass?: DataClass }): Promise<void> {
  const db = sequelize();
  await db.transaction(async (transaction) => {
    const [run] = await db.query<{
      id: string;
      spectrum_id: string;
      project_id: string;
      group_id: string;
      file_name: string;
      report: string | null;
      status: string;
    }>(
      `SELECT r.id, r.spectrum_id, s.project_id, p.group_id, s.file_name, r.report::text AS report, r.status
         FROM analysis_runs r JOIN spectra s ON s.id = r.spectrum_id JOIN projects p ON p.id = s.project_id WHERE r.id = :id FOR UPDATE OF r`,
      { replacements: { id: runId }, type: QueryTypes.SELECT, transaction },
    );
    if (!run) throw deletionRefused("This analysis no longer exists.", "gone");
    const hold = await holdCoveringSpectrum(run.spectrum_id, transaction);
    if (hold) throw deletionRefused(holdMessage(hold), "held");
    if (run.status === "queued" || run.status === "running") throw deletionRefused("This analysis is queued or running.", "busy");
    const sha256 = run.report ? sha256Hex(run.report) : null;
    const t = await Tombstone.create(
      {
        groupId: run.group_id,
        projectId: run.project_id,
        policyId: request.policyId ?? null,
        dataClass: "processed",
        targetType: "analysis-run",
        targetId: run.id,
        label: `analysis of ${run.file_name}`,
        objectKey: null,
        sha256,
        sizeBytes: run.report ? Buffer.byteLength(run.report) : 0,
        cause: request.cause,
        actorId: request.actorId,
        state: "done",
        completedAt: new Date(),
        details: { actorLabel: request.actorLabel, spectrumId: run.spectrum_id },
      },
      { transaction },
    );
    await db.query("DELETE FROM analysis_runs WHERE id = :id", { replacements: { id: runId }, transaction });
    // When the deleted run was the newest finished one, the run before it becomes current again.
    await db.query(
      `UPDATE signatures SET superseded_at = NULL, superseded_by_run_id = NULL, updated_at = now()
        WHERE superseded_at IS NOT NULL
          AND run_id = (SELECT id FROM analysis_runs WHERE spectrum_id = :spectrumId AND status = 'done' ORDER BY created_at DESC LIMIT 1)`,
      { replacements: { spectrumId: run.spectrum_id }, transaction },
    );
    await recordAudit(
      {
        actorId: request.actorId,
        actorLabel: request.actorLabel,
        groupId: run.group_id,
        action: "deleted",
        targetType: "analysis-run",
        targetId: run.id,
        details: {
          spectrumId: run.spectrum_id,
          sha256,
          cause: request.cause,
          policyId: request.policyId ?? null,
          dataClass: "processed",
          tombstoneId: t.id,
        },
      },
      transaction,
    );
  });
}

/** Completes every deletion an earlier, interrupted run left pending. */
export async function finishPending(): Promise<number> {
  const pending = await Tombstone.findAll({ where: { state: "pending" }, order: [["createdAt", "ASC"]], attributes: ["id"] });
  let n = 0;
  for (const t of pending) if ((await completeTombstone(t.id)) === "done") n++;
  return n;
}
