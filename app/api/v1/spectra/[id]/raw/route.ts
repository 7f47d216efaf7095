import { notFound, withActor } from "@/lib/http/respond";
import { getReadableSpectrum } from "@/lib/queries/spectrum-status";
import { getObjectBytes } from "@/lib/storage";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

const SAFE_TYPES = new Set(["text/plain", "text/csv", "text/tab-separated-values", "chemical/x-jcamp-dx", "application/zip"]);

function contentDisposition(fileName: string): string {
  const base = fileName.split("/").pop() || "spectrum";
  const ascii = base.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(base)}`;
}

/** GET /api/v1/spectra/{id}/raw — the file exactly as uploaded, after the access check. */
export const GET = withActor<{ params: Promise<{ id: string }> }>(async (_request, { actor, params }) => {
  const { id } = await params;
  const spectrum = await getReadableSpectrum(actor, id);
  if (!spectrum) throw notFound(`spectrum ${id.slice(0, 80)}`);
  const bytes = await getObjectBytes(spectrum.objectKey);
  return new Response(new Blob([bytes as Uint8Array<ArrayBuffer>]), {
    status: 200,
    headers: {
      "Content-Type": SAFE_TYPES.has(spectrum.contentType) ? spectrum.contentType : "application/octet-stream",
      "Content-Length": String(bytes.length),
      "Content-Disposition": contentDisposition(spectrum.fileName),
      "X-Content-Type-Options": "nosniff",
      "Content-Security-Policy": "sandbox; default-src 'none'",
      "Cache-Control": "private, no-store",
      "X-Bandkeep-Sha256": spectrum.sha256,
    },
  });
});
