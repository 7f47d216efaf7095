"use client";

import { useRouter } from "next/navigation";
import { useEffect, useRef } from "react";
import useSWR from "swr";
import { StatusBadge } from "@/components/ui/StatusBadge";

type Status = { spectrum: { id: string; status: string; error: string | null }; analysis: { status: string; error: string | null } | null };
const FINAL = new Set(["analysed", "failed"]);

async function fetchStatus(url: string): Promise<Status> {
  const res = await fetch(url, { headers: { Accept: "application/json" } });
  const body = await res.json().catch(() => null);
  if (!res.ok) throw new Error(body?.error?.message ?? `status check answered ${res.status}`);
  return body as Status;
}

/** Progress of a waiting or running analysis, polled until it settles; then the page reloads its data. */
export function RunProgress({ spectrumId, runId }: { spectrumId: string; runId?: string }) {
  const router = useRouter();
  const refreshed = useRef(false);
  const url = `/api/v1/spectra/${spectrumId}`;
  // One cache entry per run: a second re-run must not start from the first one's settled answer.
  const { data, error } = useSWR(runId ? [url, runId] : url, (key: string | string[]) => fetchStatus(Array.isArray(key) ? key[0]! : key), {
    refreshInterval: (latest) => (latest && FINAL.has(latest.spectrum.status) ? 0 : 1000),
    revalidateOnFocus: false,
  });
  const status = data?.spectrum.status;
  useEffect(() => {
    if (status && FINAL.has(status) && !refreshed.current) {
      refreshed.current = true;
      router.refresh();
    }
  }, [status, router]);
  // A failed re-run leaves the spectrum analysed (its earlier run still stands): the latest run says why.
  const runFailed = data?.analysis?.status === "failed";
  return (
    <div role="status" className="flex items-center gap-2 rounded-md bg-sky-50 px-3 py-2 text-sm text-sky-900" data-testid="run-progress">
      {!data ? (
        error ? (
          "Status unavailable, retrying…"
        ) : (
          "Checking the analysis…"
        )
      ) : FINAL.has(data.spectrum.status) ? (
        runFailed && data.spectrum.status === "analysed" ? (
          <span className="text-red-800">
            The new run failed: {data.analysis?.error ?? ""} The chart still shows the last finished run.
          </span>
        ) : (
          <>
            The new run has finished: <StatusBadge status={data.spectrum.status} />{" "}
            {data.spectrum.status === "failed" ? (data.spectrum.error ?? data.analysis?.error ?? "") : "showing it now."}
          </>
        )
      ) : (
        <>
          <span className="inline-block h-3 w-3 animate-spin rounded-full border-2 border-sky-700 border-t-transparent" aria-hidden /> New
          analysis run: <StatusBadge status={data.spectrum.status} />
          <span className="text-xs text-sky-800">the chart shows the last finished run until it is done</span>
        </>
      )}
    </div>
  );
}
