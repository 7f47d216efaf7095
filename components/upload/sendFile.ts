// Sends one file to POST /api/v1/spectra with XMLHttpRequest, which (unlike fetch) reports
// upload progress. Resolves with the API's JSON body and status; never rejects on HTTP errors.

export type UploadOutcome =
  | {
      ok: true;
      fileName: string;
      zip?: string;
      spectrumId: string;
      runId: string | null;
      status: string;
      duplicate: boolean;
      queued: boolean;
      differences?: Array<{ field: string; label: string; stored: string | null; sent: string }>;
      updated?: { fields: string[]; reanalysis: { runId: string; created: boolean } | null };
      trace?: string;
      seriesValue?: number | null;
      seriesUnit?: string;
      profile?: { name: string; how: "named" | "matched" };
    }
  | { ok: false; fileName: string; zip?: string; error: { status: number; code: string; message: string; field?: string } };

export type SendResult = { status: number; files: UploadOutcome[]; error?: { code: string; message: string; field?: string } };

export function sendFile(
  file: File,
  relativeName: string,
  fields: Record<string, string>,
  onProgress: (fraction: number) => void,
  signal?: AbortSignal,
): Promise<SendResult> {
  return new Promise((resolve) => {
    const form = new FormData();
    for (const [k, v] of Object.entries(fields)) if (v !== "") form.append(k, v);
    form.append("file", file, relativeName);
    const xhr = new XMLHttpRequest();
    xhr.open("POST", "/api/v1/spectra");
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    const failed = (message: string): SendResult => ({
      status: 0,
      files: [{ ok: false, fileName: relativeName, error: { status: 0, code: "network", message } }],
    });
    xhr.onload = () => {
      const body = xhr.response as Partial<SendResult> | null;
      if (body && Array.isArray(body.files)) {
        resolve({ status: xhr.status, files: body.files, error: body.error });
      } else if (body?.error) {
        resolve({
          status: xhr.status,
          files: [{ ok: false, fileName: relativeName, error: { status: xhr.status, ...body.error } }],
          error: body.error,
        });
      } else {
        resolve(failed(`${relativeName}: the server answered ${xhr.status} without a readable result`));
      }
    };
    xhr.onerror = () => resolve(failed(`${relativeName}: the connection failed during the upload; try again`));
    xhr.onabort = () => resolve(failed(`${relativeName}: upload cancelled`));
    signal?.addEventListener("abort", () => xhr.abort());
    xhr.send(form);
  });
}
