import { resolveShareLink, spectrumThroughLink } from "@/lib/stewardship/shareLinks";
import { getObjectBytes } from "@/lib/storage";

export const runtime = "nodejs";
export const dynamic = "force-dynamic";

// GET /shared/{token}/raw/{spectrumId} — a raw upload, exactly as it arrived, through a
// read-only share link. Public by design but token-guarded: the link must be in force at
// this moment and the spectrum must belong to the shared series or project. Anything
// else is the same 404, so nothing says whether a token or a spectrum exists.

const SAFE_TYPES = new Set(["text/plain", "text/csv", "text/tab-separated-values", "chemical/x-jcamp-dx", "application/zip"]);
const PRIVATE = {
  "Cache-Control": "private, no-store",
  "X-Robots-Tag": "noindex, nofollow",
  "Referrer-Policy": "no-referrer",
  "X-Content-Type-Options": "nosniff",
};

function contentDisposition(fileName: string): string {
  const base = fileName.split("/").pop() || "spectrum";
  const ascii = base.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(base)}`;
}

function refused(status: number, code: string, message: string): Response {
  return Response.json({ error: { code, message } }, { status, headers: PRIVATE });
}

export async function GET(_request: Request, { params }: { params: Promise<{ token: string; spectrumId: string }> }): Promise<Response> {
  const { token, spectrumId } = await params;
  try {
    const link = await resolveShareLink(token);
    const spectrum = link ? await spectrumThroughLink(link, spectrumId) : null;
    if (!spectrum)
      return refused(
        404,
        "not_found",
        "This link is not valid for that file: it was revoked, it expired, it never existed, or the file is not part of what it shares.",
      );
    const bytes = await getObjectBytes(spectrum.objectKey);
    return new Response(new Blob([bytes as Uint8Array<ArrayBuffer>]), {
      status: 200,
      headers: {
        ...PRIVATE,
        "Content-Type": SAFE_TYPES.has(spectrum.contentType) ? spectrum.contentType : "application/octet-stream",
        "Content-Length": String(bytes.length),
        "Content-Disposition": contentDisposition(spectrum.fileName),
        "Content-Security-Policy": "sandbox; default-src 'none'",
        "X-Bandkeep-Sha256": spectrum.sha256,
      },
    });
  } catch (error) {
    console.error("shared raw download failed:", error instanceof Error ? error.message : error);
    return refused(503, "unavailable", "The file could not be read just now; try again in a minute.");
  }
}
