import { Unzip, UnzipInflate, unzipSync } from "fflate";
import { looksLikeSpreadsheet } from "@/lib/engine/parse/looksLikeSpreadsheet";
import type { IngestLimits } from "./limits";
import { Refusal } from "@/lib/errors";

export type ZipEntry = { fileName: string; bytes: Uint8Array };

const ZIP_MAGIC = [0x50, 0x4b, 0x03, 0x04];
const EMPTY_ZIP_MAGIC = [0x50, 0x4b, 0x05, 0x06];

/**
 * True when the bytes start like a zip archive (or the name says so). A spreadsheet (.xlsx) is a
 * zip too, but it is one file to read as a table, never unpacked.
 */
export function looksLikeZip(fileName: string, bytes: Uint8Array): boolean {
  const starts = (m: number[]) => m.every((b, i) => bytes[i] === b);
  if (!/\.zip$/i.test(fileName) && looksLikeSpreadsheet(fileName, bytes)) return false;
  return starts(ZIP_MAGIC) || starts(EMPTY_ZIP_MAGIC) || /\.zip$/i.test(fileName);
}

function skipped(name: string): boolean {
  const base = name.split("/").pop() ?? "";
  return name.endsWith("/") || name.startsWith("__MACOSX/") || base.startsWith(".") || base === "";
}

const mib = (n: number) => `${Math.round((n / 1024 / 1024) * 10) / 10} MiB`;

/**
 * Expands a zip of exports into files, refusing archives that break a limit. Checks the
 * central directory first (entry count, declared sizes and ratios), then counts the bytes
 * actually inflated, so a header that lies about sizes cannot get past the limits.
 * Directory entries, hidden files and __MACOSX folders are skipped.
 */
export function expandZip(zipName: string, bytes: Uint8Array, limits: IngestLimits): ZipEntry[] {
  const refuse = (what: string) => new Refusal(413, "zip-limit", `${zipName}: ${what}`, "file");
  const unreadable = () => new Refusal(400, "zip-unreadable", `${zipName}: not a readable zip archive`, "file");

  let count = 0;
  let declaredTotal = 0;
  try {
    unzipSync(bytes, {
      filter(f) {
        if (skipped(f.name)) return false;
        count += 1;
        declaredTotal += f.originalSize;
        if (count > limits.maxZipEntries) throw refuse(`holds more than ${limits.maxZipEntries} files (the limit per zip)`);
        if (f.originalSize > limits.maxFileBytes) {
          throw refuse(`entry ${f.name} expands to ${mib(f.originalSize)}, over the ${mib(limits.maxFileBytes)} limit per file`);
        }
        if (f.size > 0 && f.originalSize / f.size > limits.maxZipRatio) {
          throw refuse(`entry ${f.name} has a compression ratio over ${limits.maxZipRatio}:1 (refused as a possible zip bomb)`);
        }
        if (declaredTotal > limits.maxZipTotalBytes)
          throw refuse(`expands to more than ${mib(limits.maxZipTotalBytes)} in total (the limit per zip)`);
        return false;
      },
    });
  } catch (e) {
    if (e instanceof Refusal) throw e;
    throw unreadable();
  }
  if (count === 0) throw new Refusal(400, "zip-empty", `${zipName}: the zip holds no files`, "file");

  const entries: ZipEntry[] = [];
  let total = 0;
  let failure: Refusal | null = null;
  const unzip = new Unzip((file) => {
    if (failure || skipped(file.name)) return;
    if (file.compression !== 0 && file.compression !== 8) {
      failure = new Refusal(400, "zip-unreadable", `${zipName}: entry ${file.name} uses an unsupported compression method`, "file");
      return;
    }
    const chunks: Uint8Array[] = [];
    let size = 0;
    file.ondata = (err, chunk, final) => {
      if (failure) return;
      if (err) {
        failure = new Refusal(400, "zip-unreadable", `${zipName}: entry ${file.name} is damaged`, "file");
        file.terminate();
        return;
      }
      size += chunk.length;
      total += chunk.length;
      if (size > limits.maxFileBytes) failure = refuse(`entry ${file.name} expands past the ${mib(limits.maxFileBytes)} limit per file`);
      else if (total > limits.maxZipTotalBytes)
        failure = refuse(`expands to more than ${mib(limits.maxZipTotalBytes)} in total (the limit per zip)`);
      else if (total > limits.maxZipRatio * bytes.length + 1024 * 1024) {
        failure = refuse(`has a compression ratio over ${limits.maxZipRatio}:1 (refused as a possible zip bomb)`);
      }
      if (failure) {
        file.terminate();
        return;
      }
      chunks.push(chunk);
      if (final) {
        const out = new Uint8Array(size);
        let o = 0;
        for (const c of chunks) {
          out.set(c, o);
          o += c.length;
        }
        entries.push({ fileName: file.name, bytes: out });
      }
    };
    file.start();
  });
  unzip.register(UnzipInflate);
  try {
    unzip.push(bytes, true);
  } catch {
    if (!failure) failure = unreadable();
  }
  if (failure) throw failure;
  if (entries.length > limits.maxZipEntries) throw refuse(`holds more than ${limits.maxZipEntries} files (the limit per zip)`);
  return entries;
}
