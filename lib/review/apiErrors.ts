import { ApiError } from "@/lib/http/respond";
import { ReviewRefused } from "./errors";

/** Maps a review refusal to the API's error shape; anything else passes through to withActor. */
export function reviewApiError(error: unknown): unknown {
  if (error instanceof ReviewRefused) {
    const code = error.status === 404 ? "not-found" : error.status === 403 ? "forbidden" : error.status === 409 ? "conflict" : "invalid";
    return new ApiError(error.status, code, error.message, error.field);
  }
  return error;
}
