import { describe, expect, it } from "vitest";
import { ingestMetadataSchema } from "@/lib/ingest/metadata";
import { reanalysisSchema } from "@/lib/ingest/parameters";
import { rerunFormSchema } from "@/lib/spectrum-view/rerunSchema";
import { parseDecimal } from "@/lib/text/parseDecimal";
import { columnNameSchema, fileNameProblem, isPlainText } from "@/lib/text/plainText";

const projectId = "3f0c2a4e-5b6d-4c7e-8f90-a1b2c3d4e5f6";
const spectrumId = projectId;

// ECMAScript's Number() reads hexadecimal, binary, octal and "Infinity" (ECMA-262,
// StringToNumber); a form field holds a decimal measurement or nothing.
describe("parseDecimal", () => {
  it.each([
    ["1", 1],
    ["0.5", 0.5],
    [" 2,5 ", 2.5],
    [".25", 0.25],
    ["-3e2", -300],
    ["1E-3", 0.001],
  ])("reads %j", (text, value) => {
    expect(parseDecimal(text)).toBe(value);
  });
  it.each(["0x10", "0b11", "0o7", "Infinity", "", "1.2.3", "1,2,3", "12abc", "NaN"])("refuses %j", (text) => {
    expect(parseDecimal(text)).toBeNaN();
  });
  it("is used by the upload metadata and the re-run form alike", () => {
    expect(ingestMetadataSchema.safeParse({ projectId, technique: "absorption", pathLengthCm: "0x10" }).success).toBe(false);
    expect(ingestMetadataSchema.parse({ projectId, technique: "absorption", pathLengthCm: "1" }).pathLengthCm).toBe(1);
    expect(rerunFormSchema.safeParse({ spectrumId, smoothingWindow: "0x11" }).success).toBe(false);
    expect(rerunFormSchema.safeParse({ spectrumId, smoothingWindow: "17" }).success).toBe(true);
  });
});

// Unicode Standard Annex #9 lists the explicit directional formatting characters.
describe("names", () => {
  it("refuse text-direction characters beside markup and controls", () => {
    expect(isPlainText("toluene")).toBe(true);
    expect(isPlainText("Ölsäure (oleic acid)")).toBe(true);
    for (const c of ["\u202e", "\u202d", "\u2066", "\u2067", "\u2068", "\u2069", "\u200f", "\u061c"])
      expect(isPlainText(`a${c}b`)).toBe(false);
    expect(fileNameProblem("invoice\u202Efdp.csv")).toMatch(/text-direction/);
    expect(fileNameProblem("run 3/sample-a.csv")).toBeNull();
  });

  it("one column rule for upload and re-run: <script> is refused by both", () => {
    expect(columnNameSchema.safeParse("<script>").success).toBe(false);
    expect(ingestMetadataSchema.safeParse({ projectId, technique: "absorption", column: "<script>" }).success).toBe(false);
    expect(reanalysisSchema.safeParse({ column: "<script>" }).success).toBe(false);
    expect(reanalysisSchema.safeParse({ column: "A (sample 2)" }).success).toBe(true);
    expect(ingestMetadataSchema.parse({ projectId, technique: "absorption", column: "A (sample 2)" }).column).toBe("A (sample 2)");
  });
});
