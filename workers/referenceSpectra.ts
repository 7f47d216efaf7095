import { SizedLru } from "@/lib/spectrum-view/lruCache";
import type { ParsedSpectrum } from "@/lib/engine";

/**
 * Parsed reference spectra kept between jobs, keyed by raw object key and column choice. Raw
 * objects are never altered after upload, so an entry cannot go stale; and because the engine
 * memoises the processing of a reference by object identity, every sample of a titration
 * against the same parent reuses one gridded, smoothed reference instead of fetching, parsing
 * and processing it again.
 */
const parsedReferences = new SizedLru<ParsedSpectrum>(32 * 1024 * 1024, (s) => 16 * (s.x.length + s.y.length) + 1024);

export async function parsedReference(
  objectKey: string,
  columnChoice: string | null,
  load: () => Promise<ParsedSpectrum>,
): Promise<ParsedSpectrum> {
  const key = `${objectKey}|${columnChoice ?? ""}`;
  const hit = parsedReferences.get(key);
  if (hit) return hit;
  const parsed = await load();
  parsedReferences.set(key, parsed);
  return parsed;
}
