import { config } from "@/lib/config";
import { parseSpectrumFile, type ParsedSpectrum, type Technique } from "@/lib/engine";
import { SizedLru } from "@/lib/spectrum-view/lruCache";
import { getObjectBytes } from "@/lib/storage";

/** What it takes to read a stored raw file back: its name (for messages), technique and object key. */
export type StoredRawFile = { fileName: string; technique: Technique; objectKey: string };

/**
 * Parses a stored raw file's bytes with the engine, under the upload size limit. Throws the
 * engine's SpectrumFileError (or a RangeError) for a file it cannot read.
 */
export function parseRawBytes(file: StoredRawFile, bytes: Uint8Array, column?: string | number): ParsedSpectrum {
  return parseSpectrumFile(file.fileName, bytes, {
    technique: file.technique,
    maxBytes: config().UPLOAD_MAX_BYTES,
    ...(column !== undefined ? { column } : {}),
  });
}

const globalForCache = globalThis as unknown as { bandkeepParsedRaw?: SizedLru<ParsedSpectrum> };
const parsedCache = (globalForCache.bandkeepParsedRaw ??= new SizedLru<ParsedSpectrum>(48 * 1024 * 1024, (s) => 16 * (s.x.length + s.y.length) + 1024));

/**
 * A stored raw file, fetched and parsed, kept per process by object key, technique and column.
 * Raw objects never change after upload, so an entry cannot go stale; and because the engine
 * memoises a reference's processing by object identity, every sample compared with the same
 * parent reuses one processed reference. Results are shared: treat them as read-only.
 * `guardParse` wraps the parse step only (a storage fault from the fetch is thrown as it is),
 * for callers that turn unreadable files into their own errors.
 */
export async function parsedRawFile(
  file: StoredRawFile,
  column?: string | number,
  guardParse: (parse: () => ParsedSpectrum) => ParsedSpectrum = (parse) => parse(),
): Promise<ParsedSpectrum> {
  const key = `${file.objectKey}|${file.technique}|${column ?? ""}`;
  const hit = parsedCache.get(key);
  if (hit) return hit;
  const bytes = await getObjectBytes(file.objectKey);
  const parsed = guardParse(() => parseRawBytes(file, bytes, column));
  parsedCache.set(key, parsed);
  return parsed;
}
