import { NextResponse } from "next/server";
import { mediaTypeOf } from "@/lib/http/mediaType";
import { readBoundedForm } from "@/lib/http/readBoundedForm";
import { withActor } from "@/lib/http/respond";
import { INGEST_FIELDS, ingestFiles, ingestLimits, type IncomingFile } from "@/lib/ingest";
import { listSpectra } from "@/lib/queries/spectra";
import { queryObject } from "@/lib/review/schemas";
import { SEARCH_PAGE_SIZE, searchQueryString, spectrumSearchSchema } from "@/lib/search/spectrumSearchQuery";
import { Refusal } from "@/lib/errors";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const KNOWN_FIELDS = new Set<string>(["file", ...INGEST_FIELDS]);

/**
 * GET /api/v1/spectra — the spectra the caller reads, newest first, narrowed by the same filters
 * as the spectra page (docs/search.md); keyset pages: pass `next` back as `after`.
 */
export const GET = withActor(async (request, { actor }) => {
  const search = spectrumSearchSchema.parse(queryObject(new URL(request.url).searchParams));
  const page = await listSpectra(actor, search);
  if (!page) throw new Refusal(404, "not-found", "project was not found.", "project");
  const nextQuery = page.next ? searchQueryString(search, { after: page.next }) : null;
  return NextResponse.json(
    {
      items: page.rows.map((r) => ({ ...r, url: `/api/v1/spectra/${r.id}` })),
      count: page.count,
      next: page.next,
      nextUrl:
        nextQuery === null ? null : `/api/v1/spectra?${nextQuery}${search.limit === SEARCH_PAGE_SIZE ? "" : `&limit=${search.limit}`}`,
    },
    { headers: { "Cache-Control": "no-store" } },
  );
});

/**
 * POST /api/v1/spectra — multipart/form-data with one or more `file` parts (exports or
 * zips of exports) and the metadata fields applied to all of them.
 */
export const POST = withActor(async (request, { actor }) => {
  if (mediaTypeOf(request) !== "multipart/form-data") {
    throw new Refusal(415, "unsupported-media-type", 'send the files as multipart/form-data (field "file")');
  }
  const limits = ingestLimits();
  const requestLimit = Number(process.env.UPLOAD_REQUEST_MAX_BYTES ?? limits.maxFileBytes * 5);
  const form = await readBoundedForm(request, requestLimit);
  const metadata: Record<string, string> = {};
  const files: IncomingFile[] = [];
  for (const [name, value] of form.entries()) {
    if (!KNOWN_FIELDS.has(name)) throw new Refusal(400, "unknown-field", `unknown form field "${name.slice(0, 60)}"`, name.slice(0, 60));
    if (name === "file") {
      if (typeof value === "string") throw new Refusal(400, "invalid", "file: must be a file upload, not text", "file");
      files.push({ fileName: value.name || "unnamed", bytes: new Uint8Array(await value.arrayBuffer()), contentType: value.type });
    } else if (typeof value === "string") {
      if (!(name in metadata)) metadata[name] = value;
    } else {
      throw new Refusal(400, "invalid", `${name}: must be text, not a file`, name);
    }
  }
  const outcomes = await ingestFiles(actor, metadata, files, limits);
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
