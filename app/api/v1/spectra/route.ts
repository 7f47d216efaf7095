import { NextResponse } from "next/server";
import { mediaTypeOf } from "@/lib/http/mediaType";
import { readBoundedForm } from "@/lib/http/readBoundedForm";
import { ApiError, withActor } from "@/lib/http/respond";
import { INGEST_FIELDS, ingestFiles, ingestLimits, type IncomingFile } from "@/lib/ingest";
import { toApiError } from "@/lib/ingest/apiErrors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const KNOWN_FIELDS = new Set<string>(["file", ...INGEST_FIELDS]);

/**
 * POST /api/v1/spectra — multipart/form-data with one or more `file` parts (exports or
 * zips of exports) and the metadata fields applied to all of them.
 */
export const POST = withActor(async (request, { actor }) => {
  if (mediaTypeOf(request) !== "multipart/form-data") {
    throw new ApiError(415, "unsupported-media-type", "send the files as multipart/form-data (field \"file\")");
  }
  const limits = ingestLimits();
  const requestLimit = Number(process.env.UPLOAD_REQUEST_MAX_BYTES ?? limits.maxFileBytes * 5);
  const form = await readBoundedForm(request, requestLimit);
  const metadata: Record<string, string> = {};
  const files: IncomingFile[] = [];
  for (const [name, value] of form.entries()) {
    if (!KNOWN_FIELDS.has(name)) throw new ApiError(400, "unknown-field", `unknown form field "${name.slice(0, 60)}"`, name.slice(0, 60));
    if (name === "file") {
      if (typeof value === "string") throw new ApiError(400, "invalid", "file: must be a file upload, not text", "file");
      files.push({ fileName: value.name || "unnamed", bytes: new Uint8Array(await value.arrayBuffer()), contentType: value.type });
    } else if (typeof value === "string") {
      if (!(name in metadata)) metadata[name] = value;
    } else {
      throw new ApiError(400, "invalid", `${name}: must be text, not a file`, name);
    }
  }
  let outcomes;
  try {
    outcomes = await ingestFiles(actor, metadata, files, limits);
  } catch (error) {
    throw toApiError(error);
  }
  const body = {
    files: outcomes.map((o) => (o.ok ? { ...o, url: `/api/v1/spectra/${o.spectrumId}` } : o)),
  };
  const stored = outcomes.filter((o) => o.ok);
  if (stored.length === 0) {
    const first = outcomes.find((o) => !o.ok);
    const error = first && !first.ok ? first.error : { status: 400, code: "no-file", message: "no file was stored" };
    const { status, ...shape } = error;
    return NextResponse.json({ error: shape, ...body }, { status });
  }
  return NextResponse.json(body, { status: stored.some((o) => o.ok && !o.duplicate) ? 201 : 200 });
});
