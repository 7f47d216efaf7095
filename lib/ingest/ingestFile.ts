import { Refusal } from "@/lib/errors";
import type { Actor } from "@/lib/auth/actor";
import { expandZip, looksLikeZip } from "./expandZip";
import { ingestLimits, type IngestLimits } from "./limits";
import type { IngestMetadataInput } from "./metadata";
import { prepareIngest, type IngestContext } from "./prepareIngest";
import { storeFile, type StoredFile } from "./storeFile";
import { storeSplit } from "./storeSplit";
import { applyProfile } from "./profiles/applyProfile";
import { isTransientFault } from "@/lib/transientFault";

export type IncomingFile = { fileName: string; bytes: Uint8Array; contentType?: string };

/** The outcome for one file of a batch: stored (or linked as a duplicate), or refused with a reason. */
export type FileOutcome =
  | ({ ok: true; zip?: string } & StoredFile)
  | { ok: false; zip?: string; fileName: string; error: { status: number; code: string; message: string; field?: string } };

/** An Refusal for faults of a service, so callers answer 503 instead of 500. */
export function unavailable(error: unknown): Refusal | null {
  if (error instanceof Refusal) return error;
  if (isTransientFault(error)) {
    return new Refusal(503, "unavailable", "Storage or database is not reachable right now; this file was not stored. Try again shortly.");
  }
  return null;
}

function outcomeOfError(fileName: string, error: unknown, zip?: string): FileOutcome {
  const known = unavailable(error);
  if (!known) {
    console.error("ingest failed", error);
    return {
      ok: false,
      zip,
      fileName,
      error: { status: 500, code: "internal", message: `${fileName}: could not be stored because of an error on our side` },
    };
  }
  return {
    ok: false,
    zip,
    fileName,
    error: { status: known.status, code: known.code, message: known.message, ...(known.field ? { field: known.field } : {}) },
  };
}

/**
 * Stores every file of a batch under one set of metadata. Zips are expanded (within the
 * limits) and each entry becomes a file. One refused file does not stop the others: the
 * result lists an outcome per file. Errors of the batch as a whole (metadata, access)
 * throw an Refusal.
 */
export async function ingestFiles(
  actor: Actor,
  metadata: IngestMetadataInput | Record<string, unknown>,
  files: IncomingFile[],
  limits: IngestLimits = ingestLimits(),
): Promise<FileOutcome[]> {
  if (files.length === 0) throw new Refusal(400, "no-file", 'no file was sent (use the form field "file")', "file");
  const context = await prepareIngest(actor, metadata);
  return ingestPrepared(context, files, limits, metadata);
}

/**
 * Stores one file with the batch's details and the import profile that applies to it (named, or
 * matched by the file's header): one spectrum, or one per trace when split.
 */
async function storeWithProfile(
  context: IngestContext,
  input: Record<string, unknown>,
  file: IncomingFile,
  maxBytes: number,
): Promise<StoredFile[]> {
  const applied = await applyProfile(context.project.id, input, file, maxBytes);
  const fileContext = applied.profile ? await prepareIngest(context.actor, applied.fields) : context;
  const stored =
    fileContext.metadata.split === "all" ? await storeSplit(fileContext, file, maxBytes) : [await storeFile(fileContext, file, maxBytes)];
  return applied.profile ? stored.map((s) => ({ ...s, profile: applied.profile! })) : stored;
}

export async function ingestPrepared(
  context: IngestContext,
  files: IncomingFile[],
  limits: IngestLimits,
  input: Record<string, unknown> = { ...context.metadata },
): Promise<FileOutcome[]> {
  const outcomes: FileOutcome[] = [];
  let budget = limits.maxFilesPerRequest;
  for (const file of files) {
    if (file.bytes.length > 0 && looksLikeZip(file.fileName, file.bytes)) {
      if (file.bytes.length > limits.maxFileBytes) {
        outcomes.push(
          outcomeOfError(
            file.fileName,
            new Refusal(
              413,
              "too-large",
              `${file.fileName}: ${file.bytes.length} bytes is over the upload limit of ${limits.maxFileBytes} bytes`,
              "file",
            ),
          ),
        );
        continue;
      }
      let entries;
      try {
        entries = expandZip(file.fileName, file.bytes, limits);
      } catch (error) {
        outcomes.push(outcomeOfError(file.fileName, error));
        continue;
      }
      for (const entry of entries) {
        if (budget-- <= 0) {
          outcomes.push(
            outcomeOfError(
              entry.fileName,
              new Refusal(413, "too-many-files", `${entry.fileName}: more than ${limits.maxFilesPerRequest} files in one request`, "file"),
              file.fileName,
            ),
          );
          continue;
        }
        if (looksLikeZip(entry.fileName, entry.bytes)) {
          outcomes.push(
            outcomeOfError(
              entry.fileName,
              new Refusal(
                400,
                "nested-zip",
                `${file.fileName}: entry ${entry.fileName} is itself a zip; zips inside zips are not expanded`,
                "file",
              ),
              file.fileName,
            ),
          );
          continue;
        }
        try {
          for (const stored of await storeWithProfile(
            context,
            input,
            { ...entry, contentType: "application/octet-stream" },
            limits.maxFileBytes,
          )) {
            outcomes.push({ ok: true, zip: file.fileName, ...stored });
          }
        } catch (error) {
          outcomes.push(outcomeOfError(entry.fileName, error, file.fileName));
        }
      }
      continue;
    }
    if (budget-- <= 0) {
      outcomes.push(
        outcomeOfError(
          file.fileName,
          new Refusal(413, "too-many-files", `${file.fileName}: more than ${limits.maxFilesPerRequest} files in one request`, "file"),
        ),
      );
      continue;
    }
    try {
      for (const stored of await storeWithProfile(context, input, file, limits.maxFileBytes)) outcomes.push({ ok: true, ...stored });
    } catch (error) {
      outcomes.push(outcomeOfError(file.fileName, error));
    }
  }
  return outcomes;
}
