import { config } from "@/lib/config";

/** Limits applied to one upload. Zip limits guard against archives that expand without bound. */
export type IngestLimits = {
  /** Largest single file (or zip, or zip entry), bytes. */
  maxFileBytes: number;
  /** Most entries one zip may hold (directories not counted). */
  maxZipEntries: number;
  /** Largest total uncompressed size of one zip, bytes. */
  maxZipTotalBytes: number;
  /** Largest ratio of uncompressed to compressed size, per entry and for the whole zip. */
  maxZipRatio: number;
  /** Most files in one request (after zips are expanded). */
  maxFilesPerRequest: number;
};

export function ingestLimits(): IngestLimits {
  const max = config().UPLOAD_MAX_BYTES;
  return {
    maxFileBytes: max,
    maxZipEntries: Number(process.env.ZIP_MAX_ENTRIES ?? 500),
    maxZipTotalBytes: Number(process.env.ZIP_MAX_TOTAL_BYTES ?? 10 * max),
    maxZipRatio: Number(process.env.ZIP_MAX_RATIO ?? 100),
    maxFilesPerRequest: Number(process.env.UPLOAD_MAX_FILES ?? 500),
  };
}
