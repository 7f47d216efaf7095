import { NextResponse } from "next/server";
import { withActor } from "@/lib/http/respond";
import { Refusal } from "@/lib/errors";
import { ingestLimits } from "@/lib/ingest";
import { PREVIEW_FIELDS } from "@/lib/ingest/metadata";
import { previewFile } from "@/lib/ingest/previewFile";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const KNOWN_FIELDS = new Set<string>(["file", ...PREVIEW_FIELDS]);

/**
 * POST /api/v1/spectra/preview — multipart/form-data with one `file` and the reading fields
 * (projectId, technique, column, xUnit, yKind, block, pair, sheet). Reads the file as an upload would and
 * answers what it found; stores nothing.
 */
export const POST = withActor(async (request, { actor }) => {
  if (!(request.headers.get("content-type") ?? "").toLowerCase().startsWith("multipart/form-data")) {
    throw new Refusal(415, "unsupported-media-type", 'send the file as multipart/form-data (field "file")');
  }
  const { maxFileBytes } = ingestLimits();
  const length = Number(request.headers.get("content-length") ?? "0");
  if (length > maxFileBytes + 64 * 1024)
    throw new Refusal(413, "too-large", `the request is ${length} bytes, over the ${maxFileBytes}-byte limit for one file`);
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    throw new Refusal(400, "invalid-body", "the request body is not readable multipart/form-data");
  }
  const fields: Record<string, string> = {};
  let file: File | null = null;
  for (const [name, value] of form.entries()) {
    if (!KNOWN_FIELDS.has(name)) throw new Refusal(400, "unknown-field", `unknown form field "${name.slice(0, 60)}"`, name.slice(0, 60));
    if (name === "file") {
      if (typeof value === "string" || file) throw new Refusal(400, "invalid", "file: send exactly one file upload", "file");
      file = value;
    } else if (typeof value === "string") fields[name] = value;
    else throw new Refusal(400, "invalid", `${name}: must be text, not a file`, name);
  }
  if (!file) throw new Refusal(400, "no-file", 'no file was sent (use the form field "file")', "file");
  const preview = await previewFile(actor, file.name || "unnamed", new Uint8Array(await file.arrayBuffer()), fields, maxFileBytes);
  return NextResponse.json(preview);
});
