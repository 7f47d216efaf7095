import { Refusal } from "@/lib/errors";

const tooLarge = (limit: number, seen: string) =>
  new Refusal(413, "too-large", `the request is ${seen} bytes, over the limit of ${limit} bytes per request; send fewer files at a time`);

/**
 * Reads a multipart body while counting its bytes as they arrive, and stops reading (413)
 * as soon as it passes maxBytes, whatever Content-Length said or whether it was sent at
 * all (chunked). Only then is the body parsed, so an app process never holds more than
 * maxBytes of one request. request.formData() alone would buffer the whole body first.
 */
export async function readBoundedForm(request: Request, maxBytes: number): Promise<FormData> {
  const declared = Number(request.headers.get("content-length") ?? Number.NaN);
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge(maxBytes, String(declared));
  const reader = request.body?.getReader();
  if (!reader) throw new Refusal(400, "invalid-body", "the request has no body");
  const chunks: Uint8Array[] = [];
  let received = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    received += value.byteLength;
    if (received > maxBytes) {
      chunks.length = 0;
      await reader.cancel().catch(() => undefined);
      throw tooLarge(maxBytes, `more than ${maxBytes}`);
    }
    chunks.push(value);
  }
  const body = new Blob(chunks as BlobPart[]);
  chunks.length = 0;
  try {
    return await new Response(body, { headers: { "content-type": request.headers.get("content-type") ?? "" } }).formData();
  } catch {
    throw new Refusal(400, "invalid-body", "the request body is not readable multipart/form-data");
  }
}
