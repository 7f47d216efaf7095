import { ApiError } from "@/lib/http/respond";
import { IngestError } from "./errors";
import { unavailable } from "./ingestFile";

/** Turns an ingest refusal or a service fault into the API's one error shape; other errors pass through. */
export function toApiError(error: unknown): unknown {
  const known = error instanceof IngestError ? error : unavailable(error);
  return known ? new ApiError(known.status, known.code, known.message, known.field) : error;
}
