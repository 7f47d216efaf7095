import { SpectrumFileError, type Technique } from "@/lib/engine";
import { parseForTraces } from "../traceKey";

/** Numbers in names vary from file to file of one habit ("0.5 eq", "Run 12"); they are written as #. */
const normalise = (text: string) =>
  text
    .toLowerCase()
    .replace(/[+-]?\d+(?:[.,]\d+)?(?:e[+-]?\d+)?/g, "#")
    .replace(/\s+/g, " ")
    .trim();

/**
 * The header signature of a file, which import profiles are matched on (docs/ingest.md): the
 * file name's extension, the format and layout the reader finds, the sheet name of a spreadsheet,
 * and the names of its Y columns in order, with numbers written as # so "0.5 eq" and "2 eq"
 * match. Two exports of one instrument and habit give the same signature; a headerless file's is
 * its extension, layout and count of columns. Null when the file cannot be read at all.
 */
export async function headerSignature(fileName: string, bytes: Uint8Array, technique: Technique, maxBytes: number): Promise<string | null> {
  try {
    const s = await parseForTraces(fileName, bytes, technique, {}, maxBytes);
    const ext = /\.([a-z0-9]{1,8})$/i.exec(fileName)?.[1]?.toLowerCase() ?? "";
    const traces = (s.traces ?? []).map((t) => normalise(t.label));
    return [
      `ext=${ext}`,
      `format=${s.format}`,
      `layout=${s.layout ?? "x-then-y"}`,
      `sheet=${s.sheet ? normalise(s.sheet) : ""}`,
      `columns=${traces.join(" | ")}`,
    ]
      .join("\n")
      .slice(0, 2000);
  } catch (error) {
    if (error instanceof SpectrumFileError || error instanceof RangeError) return null;
    throw error;
  }
}
