// Asks POST /api/v1/spectra/preview how a file would be read with the given fields.
import type { FilePreview } from "@/lib/ingest/previewFile";

export type PreviewAnswer = FilePreview | { ok: false; fileName: string; error: string };

export async function requestPreview(
  file: File,
  name: string,
  fields: Record<string, string>,
  signal?: AbortSignal,
): Promise<PreviewAnswer> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) if (v !== "") form.append(k, v);
  form.append("file", file, name);
  try {
    const response = await fetch("/api/v1/spectra/preview", { method: "POST", body: form, signal });
    const body = (await response.json()) as FilePreview | { error?: { message?: string } };
    if ("ok" in body) return body;
    return { ok: false, fileName: name, error: body.error?.message ?? `${name}: the preview failed (${response.status})` };
  } catch {
    return { ok: false, fileName: name, error: `${name}: the preview could not be fetched` };
  }
}
