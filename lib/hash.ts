import { createHash } from "node:crypto";

/** Lower-case hex sha256 of bytes or of a string's UTF-8 encoding. */
export function sha256Hex(data: string | Uint8Array): string {
  return createHash("sha256").update(data).digest("hex");
}
