import { config } from "@/lib/config";
import { parseSpectrumBytes, readChoiceOptions, type ParsedSpectrum, type ReadChoice, type Technique } from "@/lib/engine";
import { SizedLru } from "@/lib/lruCache";
import { getObjectBytes } from "@/lib/storage";
import { processSingleton } from "@/lib/processSingleton";

/** What it takes to read a stored raw file back: its name (for messages), technique and object key. */
export type StoredRawFile = { fileName: string; technique: Technique; objectKey: string };

/** A stored spectrum's read choice: its column_choice (digits are a column index) and its read_options. */
export function storedReadChoice(spectrum: { columnChoice: string | null; readOptions?: ReadChoice | null }): ReadChoice {
  const choice: ReadChoice = { ...(spectrum.readOptions ?? {}) };
  delete choice.column;
  const raw = spectrum.columnChoice;
  if (raw !== null && raw !== undefined) choice.column = /^\d+$/.test(raw) ? Number(raw) : raw;
  return choice;
}

/** A stored raw file's bytes exactly as they were uploaded. */
export function storedRawBytes(file: Pick<StoredRawFile, "objectKey">): Promise<Uint8Array> {
  return getObjectBytes(file.objectKey);
}

/**
 * Parses a stored raw file's bytes with the engine (spreadsheets included), under the upload
 * size limit. Throws the engine's SpectrumFileError (or a RangeError) for a file it cannot read.
 */
export function parseRawBytes(file: StoredRawFile, bytes: Uint8Array, choice: ReadChoice = {}): Promise<ParsedSpectrum> {
  return parseSpectrumBytes(file.fileName, bytes, {
    technique: file.technique,
    maxBytes: config().UPLOAD_MAX_BYTES,
    ...readChoiceOptions(choice),
  });
}

const parsedCache = processSingleton(
  "bandkeepParsedRaw",
  () => new SizedLru<ParsedSpectrum>(48 * 1024 * 1024, (s) => 16 * (s.x.length + s.y.length) + 1024),
);

const choiceKey = (choice: ReadChoice) =>
  (["column", "block", "pair", "sheet", "xUnit", "yKind"] as const).map((k) => String(choice[k] ?? "")).join("|");

/**
 * A stored raw file, fetched and parsed, kept per process by object key, technique and read
 * choice. Raw objects never change after upload, so an entry cannot go stale; and because the
 * engine memoises a reference's processing by object identity, every sample compared with the same
 * parent reuses one processed reference. Results are shared: treat them as read-only.
 * `guardParse` wraps the parse step only (a storage fault from the fetch is thrown as it is),
 * for callers that turn unreadable files into their own errors.
 */
export async function parsedRawFile(
  file: StoredRawFile,
  choice: ReadChoice = {},
  guardParse: (parse: () => Promise<ParsedSpectrum>) => Promise<ParsedSpectrum> = (parse) => parse(),
): Promise<ParsedSpectrum> {
  const key = `${file.objectKey}|${file.technique}|${choiceKey(choice)}`;
  const hit = parsedCache.get(key);
  if (hit) return hit;
  const bytes = await storedRawBytes(file);
  const parsed = await guardParse(() => parseRawBytes(file, bytes, choice));
  parsedCache.set(key, parsed);
  return parsed;
}
