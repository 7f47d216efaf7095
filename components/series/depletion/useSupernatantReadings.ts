"use client";

import { useEffect, useState } from "react";
import useSWR from "swr";
import type { SupernatantReadings } from "@/lib/series/supernatantSchemas";

async function fetchReadings(url: string): Promise<SupernatantReadings> {
  const res = await fetch(url, { headers: { Accept: "application/json" } });
  const body = await res.json().catch(() => null);
  if (!res.ok) throw new Error(body?.error?.message ?? `the supernatant spectra could not be read (${res.status})`);
  return body as SupernatantReadings;
}

/** A value that follows `value` once it has stopped changing for `ms` (typing a wavelength asks once). */
function useSettled<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return settled;
}

/**
 * Readings of the linked supernatants (and the chosen pure spectra) at the two wavelengths; null
 * wavelengths ask nothing. `links` names the current links, so linking or unlinking asks again.
 */
export function useSupernatantReadings(
  seriesId: string,
  nmA: number | null,
  nmX: number | null,
  pureA: string,
  pureX: string,
  links: string,
) {
  const params =
    nmA !== null && nmX !== null
      ? new URLSearchParams({ nmA: String(nmA), nmX: String(nmX), ...(pureA ? { pureA } : {}), ...(pureX ? { pureX } : {}) }).toString()
      : null;
  const key = useSettled(params, 300);
  const { data, error, isLoading, isValidating, mutate } = useSWR(
    key ? [`/api/v1/series/${seriesId}/supernatants?${key}`, links] : null,
    ([url]) => fetchReadings(url),
    {
      revalidateOnFocus: false,
      shouldRetryOnError: false,
      keepPreviousData: true,
    },
  );
  // keepPreviousData shows the last answer while the next loads: only an answer to the current question counts.
  const current =
    data &&
    key === params &&
    data.wavelengthsNm.a === nmA &&
    data.wavelengthsNm.x === nmX &&
    (data.pureA?.spectrumId ?? "") === pureA &&
    (data.pureX?.spectrumId ?? "") === pureX;
  return {
    data,
    error: error as Error | undefined,
    loading: isLoading || isValidating || params !== key,
    current: Boolean(current),
    retry: () => mutate(),
  };
}
