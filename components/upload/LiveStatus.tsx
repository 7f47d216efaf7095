"use client";

import Link from "next/link";
import useSWR from "swr";
import { StatusBadge } from "@/components/ui/StatusBadge";
import { countOf } from "@/lib/format/quantity";

type SpectrumStatus = {
  spectrum: { id: string; status: string; error: string | null };
  analysis: {
    status: string;
    error: string | null;
    peaks: unknown[];
    flags: { kind: string }[];
    firstExciton: { wavelengthNm: number } | null;
  } | null;
};

const FINAL = new Set(["analysed", "failed"]);

async function fetchStatus(url: string): Promise<SpectrumStatus> {
  const res = await fetch(url, { headers: { Accept: "application/json" } });
  const body = await res.json().catch(() => null);
  if (!res.ok) throw new Error(body?.error?.message ?? `status check answered ${res.status}`);
  return body as SpectrumStatus;
}

/** The processing state of one stored spectrum, polled until it is analysed or failed. */
export function LiveStatus({ spectrumId, duplicate }: { spectrumId: string; duplicate: boolean }) {
  const { data, error } = useSWR(`/api/v1/spectra/${spectrumId}`, fetchStatus, {
    refreshInterval: (latest) => (latest && FINAL.has(latest.spectrum.status) ? 0 : 1500),
    revalidateOnFocus: false,
  });
  if (error && !data) return <span className="text-xs text-ink-faint">status unavailable, retrying…</span>;
  if (!data) return <span className="text-xs text-ink-faint">checking…</span>;
  const { spectrum, analysis } = data;
  return (
    <span className="flex min-w-0 flex-wrap items-center gap-2">
      {duplicate && (
        <span
          className="rounded-full bg-stone-200 px-2 py-0.5 text-xs font-medium text-ink-soft"
          title="The same bytes are already in this project; no second copy was stored."
        >
          already stored — linked
        </span>
      )}
      <StatusBadge status={spectrum.status} />
      {spectrum.status === "analysed" && analysis && (
        <span className="tabular text-xs text-ink-soft">
          {analysis.firstExciton ? `1st exciton ${analysis.firstExciton.wavelengthNm.toFixed(1)} nm · ` : ""}
          {countOf(analysis.peaks.length, "peak")} · {countOf(analysis.flags.length, "flag")}
        </span>
      )}
      {spectrum.status === "failed" && (
        <span role="alert" className="text-xs text-red-800">
          {spectrum.error ?? analysis?.error ?? "could not be analysed"}
        </span>
      )}
      <Link href={`/spectra/${spectrum.id}`} className="text-xs text-glow-deep hover:underline">
        open
      </Link>
    </span>
  );
}
