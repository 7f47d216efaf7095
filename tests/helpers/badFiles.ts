// A corpus of files and requests that must be refused with a clear message, generated here.
import ExcelJS from "exceljs";
import { gzipSync, strToU8, zipSync } from "fflate";
import { enc, syntheticAbsorptionCsv } from "./spectra";

export type BadCase = {
  name: string;
  fileName: string;
  bytes: Uint8Array;
  /** Extra form fields, replacing the defaults. */
  fields?: Record<string, string>;
  /** Text the error must contain (besides naming the file or field). */
  expect?: RegExp;
};

const good = () => syntheticAbsorptionCsv({ seed: Math.floor(Math.random() * 1e9), points: 200 });

/** A real .xlsx (written by exceljs when this module loads) whose only sheet holds words. */
const wordsOnlyWorkbook = await (async () => {
  const wb = new ExcelJS.Workbook();
  wb.addWorksheet("Results").addRow(["sample", "comment"]);
  return new Uint8Array(await wb.xlsx.writeBuffer());
})();

export function badCorpus(maxBytes: number): BadCase[] {
  const u = () => Math.random().toString(36).slice(2, 8);
  const lines = (body: string[]) => enc(`wavelength (nm),absorbance\n${body.join("\n")}\n`);
  const ramp = (n: number, f: (i: number) => string) => Array.from({ length: n }, (_, i) => f(i));
  const binary = new Uint8Array(4096);
  for (let i = 0; i < binary.length; i++) binary[i] = (i * 7919) % 256;
  const bigLine = `# ${"x".repeat(1024 * 1024 + 10)}\n`;
  const zeros = new Uint8Array(Math.min(maxBytes - 1, 15 * 1024 * 1024));
  const bomb = zipSync({ "spectra/huge.csv": zeros }, { level: 9 });
  const manyEntries: Record<string, Uint8Array> = {};
  for (let i = 0; i < 600; i++) manyEntries[`e${i}.csv`] = strToU8(`${i}`);
  const fullText = good();
  // Two blocks one after another; the second's first column is a Y column (docs/ingest.md, "block without X").
  const xs = ramp(120, (i) => String(400 + 2 * i));
  const blockWithoutX = enc(
    [
      "Wavelength (nm),30 s",
      ...xs.map((x, i) => `${x},${(0.3 + 0.001 * i).toFixed(4)}`),
      "",
      "Absorbance A,Absorbance B",
      ...xs.map((_, i) => `${(0.2 + 0.001 * i).toFixed(4)},${(0.1 + 0.001 * i).toFixed(4)}`),
    ].join("\n"),
  );
  const mixedUnits = enc(fullText.replace("wavelength (nm)", "Wavelength (nm) / Energy (eV)"));
  const threeColumns = enc(`Wavelength (nm),0.5 eq,1 eq,2 eq\n${ramp(120, (i) => `${400 + 2 * i},0.3,0.2,0.1`).join("\n")}\n# ${u()}\n`);

  return [
    { name: "binary bytes", fileName: `blob-${u()}.csv`, bytes: binary },
    { name: "empty file", fileName: `empty-${u()}.csv`, bytes: new Uint8Array(0), expect: /empty/ },
    { name: "header only", fileName: `header-${u()}.csv`, bytes: enc("wavelength (nm),absorbance\n") },
    { name: "truncated after a few lines", fileName: `trunc-${u()}.csv`, bytes: enc(fullText.slice(0, 120)) },
    { name: "truncated gzip", fileName: `cut-${u()}.csv.gz`, bytes: gzipSync(strToU8(fullText)).slice(0, 300) },
    { name: "NaN values", fileName: `nan-${u()}.csv`, bytes: lines(ramp(100, (i) => `${400 + i},${i % 3 === 0 ? "NaN" : "0.1"}`)) },
    { name: "all NaN", fileName: `allnan-${u()}.csv`, bytes: lines(ramp(100, (i) => `${400 + i},NaN`)) },
    { name: "Infinity values", fileName: `inf-${u()}.csv`, bytes: lines(ramp(100, (i) => `${400 + i},${i === 50 ? "Infinity" : "0.2"}`)) },
    { name: "one column", fileName: `onecol-${u()}.csv`, bytes: enc(ramp(200, (i) => `${400 + i}`).join("\n")) },
    { name: "a 1 MB line", fileName: `longline-${u()}.csv`, bytes: enc(bigLine + fullText) },
    {
      name: "wrong units (seconds)",
      fileName: `time-${u()}.csv`,
      bytes: enc(`time (s),absorbance\n${ramp(200, (i) => `${i},${(i % 5) / 10}`).join("\n")}`),
    },
    { name: "negative wavelengths", fileName: `neg-${u()}.csv`, bytes: lines(ramp(100, (i) => `${-400 - i},0.1`)) },
    {
      name: "non-monotonic axis",
      fileName: `zigzag-${u()}.csv`,
      bytes: lines(ramp(200, (i) => `${400 + ((i * 37) % 200)},${(i % 7) / 10}`)),
    },
    { name: "all x the same", fileName: `samex-${u()}.csv`, bytes: lines(ramp(100, () => `500,0.1`)) },
    { name: "text in numbers", fileName: `words-${u()}.csv`, bytes: lines(ramp(100, (i) => `${400 + i},${i === 40 ? "abc" : "0.1"}`)) },
    { name: "too few points", fileName: `few-${u()}.csv`, bytes: lines(["400,0.1", "401,0.2", "402,0.3"]) },
    { name: "HTML page", fileName: `page-${u()}.csv`, bytes: enc("<!doctype html><html><body><script>alert(1)</script></body></html>") },
    { name: "JSON document", fileName: `doc-${u()}.json`, bytes: enc(JSON.stringify({ x: [1, 2, 3], y: [4, 5, 6] })) },
    {
      name: "UTF-16 byte-order mark on binary bytes",
      fileName: `utf16-${u()}.csv`,
      bytes: Uint8Array.from([0xff, 0xfe, ...binary]),
      expect: /UTF-16.*binary/,
    },
    {
      name: "spreadsheet with no numbers",
      fileName: `words-${u()}.xlsx`,
      bytes: wordsOnlyWorkbook,
      expect: /no numeric table found on sheet 'Results'/,
    },
    {
      name: "block without X",
      fileName: `nox-${u()}.csv`,
      bytes: blockWithoutX,
      fields: { block: "2" },
      expect: /block 2 has no X column.*put the X values .* first in each block/,
    },
    {
      name: "mixed units in one column",
      fileName: `mixed-${u()}.csv`,
      bytes: mixedUnits,
      expect: /mixed units in one column.*nm and eV; choose the X unit/,
    },
    {
      name: "split assignment naming no trace",
      fileName: `split-${u()}.csv`,
      bytes: threeColumns,
      fields: { split: "all", assignments: JSON.stringify([{ trace: "5 eq", skip: true }]) },
      expect: /no trace "5 eq" in the file \(traces: 0\.5 eq, 1 eq, 2 eq\)/,
    },
    {
      name: "assignments not JSON",
      fileName: `assign-${u()}.csv`,
      bytes: threeColumns,
      fields: { split: "all", assignments: "{trace" },
      expect: /assignments must be a JSON array/,
    },
    {
      name: "split value other than all",
      fileName: `split2-${u()}.csv`,
      bytes: threeColumns,
      fields: { split: "yes" },
      expect: /split must be "all"/,
    },
    {
      name: "unknown import profile",
      fileName: `prof-${u()}.csv`,
      bytes: threeColumns,
      fields: { profile: "No such habit" },
      expect: /no import profile named "No such habit"/,
    },
    {
      name: "onDuplicate not keep or update",
      fileName: `dup-${u()}.csv`,
      bytes: threeColumns,
      fields: { onDuplicate: "merge" },
      expect: /onDuplicate must be "keep" or "update"/,
    },
    {
      name: "broken JCAMP-DX",
      fileName: `broken-${u()}.jdx`,
      bytes: enc("##TITLE=broken\n##JCAMP-DX=4.24\n##XYDATA=(X++(Y..Y))\n1 2 3\n##END=\n"),
    },
    {
      name: "ragged rows",
      fileName: `ragged-${u()}.csv`,
      bytes: lines(ramp(100, (i) => (i % 2 ? `${400 + i},0.1,0.2,0.3` : `${400 + i}`))),
    },
    { name: "column that does not exist", fileName: `col-${u()}.csv`, bytes: enc(good()), fields: { column: "transmittance-B" } },
    { name: "over the size limit", fileName: `huge-${u()}.csv`, bytes: new Uint8Array(maxBytes + 1).fill(0x31), expect: /limit/ },
    { name: "zip bomb (ratio)", fileName: `bomb-${u()}.zip`, bytes: bomb, expect: /ratio|limit/ },
    { name: "zip with too many entries", fileName: `many-${u()}.zip`, bytes: zipSync(manyEntries, { level: 0 }), expect: /more than/ },
    { name: "damaged zip", fileName: `damaged-${u()}.zip`, bytes: zipSync({ "a.csv": strToU8(good()) }).slice(0, 200), expect: /zip/ },
    {
      name: "zip inside zip",
      fileName: `nested-${u()}.zip`,
      bytes: zipSync({ "inner.zip": zipSync({ "a.csv": strToU8(good()) }) }),
      expect: /zip/,
    },
    {
      name: "script in solvent",
      fileName: `meta1-${u()}.csv`,
      bytes: enc(good()),
      fields: { solvent: "<script>alert(1)</script>" },
      expect: /solvent/,
    },
    {
      name: "HTML in column",
      fileName: `meta2-${u()}.csv`,
      bytes: enc(good()),
      fields: { column: "<img src=x onerror=alert(1)>" },
      expect: /column/,
    },
    {
      name: "path length not a number",
      fileName: `meta3-${u()}.csv`,
      bytes: enc(good()),
      fields: { pathLengthCm: "one cm" },
      expect: /pathLengthCm/,
    },
    {
      name: "negative path length",
      fileName: `meta4-${u()}.csv`,
      bytes: enc(good()),
      fields: { pathLengthCm: "-1" },
      expect: /pathLengthCm/,
    },
    { name: "unknown technique", fileName: `meta5-${u()}.csv`, bytes: enc(good()), fields: { technique: "raman" }, expect: /technique/ },
    {
      name: "project id not a UUID",
      fileName: `meta6-${u()}.csv`,
      bytes: enc(good()),
      fields: { projectId: "'; drop table spectra; --" },
      expect: /projectId/,
    },
    {
      name: "unknown project",
      fileName: `meta7-${u()}.csv`,
      bytes: enc(good()),
      fields: { projectId: "00000000-0000-4000-8000-000000000000" },
      expect: /project/,
    },
    {
      name: "unknown reference",
      fileName: `meta8-${u()}.csv`,
      bytes: enc(good()),
      fields: { referenceSpectrumId: "00000000-0000-4000-8000-000000000001" },
      expect: /referenceSpectrumId/,
    },
    {
      name: "series value without series",
      fileName: `meta9-${u()}.csv`,
      bytes: enc(good()),
      fields: { seriesValue: "2" },
      expect: /seriesValue/,
    },
    {
      name: "unknown form field",
      fileName: `meta10-${u()}.csv`,
      bytes: enc(good()),
      fields: { "path length": "1" },
      expect: /unknown form field/,
    },
    {
      name: "control characters in solvent",
      fileName: `meta11-${u()}.csv`,
      bytes: enc(good()),
      fields: { solvent: "tol\u0007uene" },
      expect: /solvent/,
    },
  ];
}
