import { strToU8, zipSync } from "fflate";
import { describe, expect, it } from "vitest";
import { expandZip, looksLikeZip } from "@/lib/ingest/expandZip";
import type { IngestLimits } from "@/lib/ingest/limits";
import { Refusal } from "@/lib/errors";

const limits: IngestLimits = {
  maxFileBytes: 1024 * 1024,
  maxZipEntries: 10,
  maxZipTotalBytes: 2 * 1024 * 1024,
  maxZipRatio: 50,
  maxFilesPerRequest: 100,
};

function refusal(fn: () => unknown): Refusal {
  try {
    fn();
  } catch (e) {
    if (e instanceof Refusal) return e;
    throw e;
  }
  throw new Error("expected a refusal");
}

describe("expandZip", () => {
  it("expands entries with their folder paths, skipping folders and hidden files", () => {
    const zip = zipSync({
      "run1/a.csv": strToU8("1,2\n"),
      "run1/b.csv": strToU8("3,4\n"),
      ".DS_Store": strToU8("x"),
      "__MACOSX/run1/._a.csv": strToU8("x"),
    });
    const entries = expandZip("exports.zip", zip, limits);
    expect(entries.map((e) => e.fileName).sort()).toEqual(["run1/a.csv", "run1/b.csv"]);
    expect(new TextDecoder().decode(entries.find((e) => e.fileName === "run1/b.csv")!.bytes)).toBe("3,4\n");
  });

  it("refuses more entries than the limit, naming the zip and the limit", () => {
    const files: Record<string, Uint8Array> = {};
    for (let i = 0; i < 11; i++) files[`f${i}.csv`] = strToU8(String(i));
    const e = refusal(() => expandZip("lots.zip", zipSync(files), limits));
    expect(e.status).toBe(413);
    expect(e.message).toBe("lots.zip: holds more than 10 files (the limit per zip)");
  });

  it("refuses a high compression ratio as a possible zip bomb", () => {
    const e = refusal(() => expandZip("bomb.zip", zipSync({ "z.csv": new Uint8Array(900_000) }, { level: 9 }), limits));
    expect(e.status).toBe(413);
    expect(e.message).toMatch(/^bomb\.zip: entry z\.csv has a compression ratio over 50:1/);
  });

  it("refuses an entry larger than the per-file limit and a zip over the total", () => {
    const big = new Uint8Array(limits.maxFileBytes + 10).map((_, i) => (i * 2654435761) >>> 24);
    expect(refusal(() => expandZip("big.zip", zipSync({ "big.csv": big }, { level: 0 }), limits)).message).toMatch(
      /^big\.zip: entry big\.csv expands to/,
    );
    const part = new Uint8Array(900_000).map((_, i) => (i * 2654435761) >>> 24);
    const total = zipSync({ "a.csv": part, "b.csv": part, "c.csv": part }, { level: 0 });
    expect(refusal(() => expandZip("total.zip", total, limits)).message).toMatch(/^total\.zip: expands to more than 2 MiB in total/);
  });

  it("counts inflated bytes, so a header that understates sizes does not pass", () => {
    const zip = zipSync({ "liar.csv": new Uint8Array(1_500_000) }, { level: 9 });
    // Rewrite the declared uncompressed size (local header offset 22, central directory +24) to 100 bytes.
    const view = new DataView(zip.buffer, zip.byteOffset, zip.byteLength);
    view.setUint32(22, 100, true);
    let cd = zip.length - 22;
    while (view.getUint32(cd, true) !== 0x02014b50) cd--;
    view.setUint32(cd + 24, 100, true);
    const e = refusal(() => expandZip("liar.zip", zip, { ...limits, maxZipRatio: 10_000 }));
    expect(e.status).toBe(413);
    expect(e.message).toMatch(/^liar\.zip: /);
  });

  it("names the zip when it is damaged or empty", () => {
    const zip = zipSync({ "a.csv": strToU8("1,2\n".repeat(100)) });
    expect(refusal(() => expandZip("cut.zip", zip.slice(0, 40), limits)).message).toBe("cut.zip: not a readable zip archive");
    expect(refusal(() => expandZip("none.zip", zipSync({}), limits)).message).toBe("none.zip: the zip holds no files");
  });

  it("recognises zips by signature or name", () => {
    expect(looksLikeZip("x.bin", zipSync({ a: strToU8("1") }))).toBe(true);
    expect(looksLikeZip("x.ZIP", strToU8("no"))).toBe(true);
    expect(looksLikeZip("x.csv", strToU8("1,2"))).toBe(false);
  });
});

describe("spreadsheets are files, not zips", () => {
  it("a real .xlsx (written by exceljs) is not expanded, whatever its name; a zip of CSVs still is", async () => {
    const ExcelJS = (await import("exceljs")).default;
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet("Results").addRow(["Wavelength (nm)", "Absorbance"]);
    const book = new Uint8Array(await wb.xlsx.writeBuffer());
    expect(book[0]).toBe(0x50); // "PK": the workbook is a zip container (ECMA-376 Part 2, Open Packaging Conventions)
    expect(looksLikeZip("run.xlsx", book)).toBe(false);
    expect(looksLikeZip("upload.bin", book)).toBe(false);
    expect(looksLikeZip("csvs.zip", zipSync({ "a.csv": strToU8("1,2\n") }))).toBe(true);
    expect(looksLikeZip("a.bin", zipSync({ "a.csv": strToU8("1,2\n") }))).toBe(true);
  });
});
