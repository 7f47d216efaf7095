// Calls to the running app's scripts API, the way a lab script makes them.
import { appUrl } from "./fixtures";
import { waitFor } from "./waitFor";

export type UploadFile = { fileName: string; bytes: Uint8Array; type?: string };

export async function upload(token: string, files: UploadFile[], fields: Record<string, string>) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  for (const f of files) form.append("file", new Blob([f.bytes as Uint8Array<ArrayBuffer>], { type: f.type ?? "text/csv" }), f.fileName);
  const res = await fetch(appUrl("/api/v1/spectra"), { method: "POST", headers: { Authorization: `Bearer ${token}` }, body: form });
  const body = (await res.json()) as {
    files?: (
      | { ok: true; fileName: string; spectrumId: string; runId: string; duplicate: boolean; status: string }
      | { ok: false; fileName: string; error: { status: number; code: string; message: string; field?: string } }
    )[];
    error?: { code: string; message: string; field?: string };
  };
  return { status: res.status, body };
}

export async function getJson<T = Record<string, unknown>>(token: string, path: string): Promise<{ status: number; body: T }> {
  const res = await fetch(appUrl(path), { headers: { Authorization: `Bearer ${token}` } });
  return { status: res.status, body: (await res.json()) as T };
}

type SpectrumStatus = {
  spectrum: { id: string; status: string; error: string | null };
  analysis: { status: string; peaks: unknown[]; flags: unknown[]; error: string | null } | null;
};

/** Polls GET /api/v1/spectra/{id} until the spectrum is analysed or failed. */
export async function settled(token: string, id: string, timeoutMs = 60_000): Promise<SpectrumStatus> {
  return waitFor(
    `spectrum ${id} to settle`,
    async () => {
      const { status, body } = await getJson<SpectrumStatus>(token, `/api/v1/spectra/${id}`);
      if (status !== 200) throw new Error(`GET answered ${status}`);
      return body.spectrum.status === "analysed" || body.spectrum.status === "failed" ? body : undefined;
    },
    timeoutMs,
  );
}
