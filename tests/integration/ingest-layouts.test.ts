// Real exports in through the running app and worker: a headerless file with a chosen unit, an
// .xlsx stored as one spectrum (never unpacked), a side-by-side pair, and a re-upload of the same
// bytes with other details. The numbers are the real CdSe export (real-spectra/PROVENANCE.md);
// the peaks the worker stores are compared with the engine's own reading of the plain file
// (same data, plain layout) — the invariant the layouts must keep.
// HTTP status codes as RFC 9110 defines them (200, 201).
import { readFileSync } from "node:fs";
import path from "node:path";
import ExcelJS from "exceljs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { AnalysisRun, AuditEvent, Spectrum } from "@/models";
import { closeDb } from "@/lib/db";
import { analyzeSpectrum, parseSpectrumFile } from "@/lib/engine";
import { createLab, type Lab } from "../helpers/fixtures";
import { settled, upload } from "../helpers/api";

const realDir = path.resolve(process.cwd(), "..", "shared", "real-spectra");
const source = readFileSync(path.join(realDir, "cdse-absorbance-growth-series.csv"), "utf8")
  .split(/\r?\n/)
  .filter((l) => l.trim());
const head = source[0]!.split(",");
const rows = source.slice(1).map((l) => l.split(","));
const k240 = head.indexOf("240 s");
const k30 = head.indexOf("30 s");
const enc = (s: string) => new Uint8Array(Buffer.from(s, "utf8"));
/** The peaks of the 240 s column read from the plain file (energies, eV). */
const plainPeaks = () => {
  const s = parseSpectrumFile("plain.csv", enc(["Wavelength (nm),240 s", ...rows.map((r) => `${r[0]},${r[k240]}`)].join("\n")), {
    technique: "absorption",
  });
  return analyzeSpectrum(s, { technique: "absorption", pathLengthCm: 1 }).peaks.map((p) => p.energyEv);
};

let lab: Lab;
beforeAll(async () => {
  lab = await createLab("spectroscopist");
});
afterAll(async () => {
  await closeDb();
});

async function storedPeaks(runId: string): Promise<number[]> {
  const run = (await AnalysisRun.findByPk(runId))!;
  return (run.report as { peaks: Array<{ energyEv: number }> }).peaks.map((p) => p.energyEv);
}

describe("real exports through the app", () => {
  it("a headerless file (unique bytes) with the X unit chosen in the API is analysed like the plain file", async () => {
    const text = rows.map((r) => `${r[0]}\t${r[k240]}`).join("\n") + `\n`;
    const { status, body } = await upload(lab.token, [{ fileName: `bare-${Date.now()}.txt`, bytes: enc(text) }], {
      projectId: lab.project.id,
      technique: "absorption",
      xUnit: "nm",
      yKind: "absorbance",
      pathLengthCm: "1",
    });
    expect(status).toBe(201);
    const out = body.files![0]!;
    if (!out.ok) throw new Error(out.error.message);
    const final = await settled(lab.token, out.spectrumId);
    expect(final.spectrum.status).toBe("analysed");
    expect(await storedPeaks(out.runId)).toEqual(plainPeaks());
    const spectrum = (await Spectrum.findByPk(out.spectrumId))!;
    expect(spectrum.readOptions).toEqual({ xUnit: "nm", yKind: "absorbance" });
  });

  it("an .xlsx is stored as one spectrum and read as a table, never as a zip of parts", async () => {
    const wb = new ExcelJS.Workbook();
    wb.addWorksheet("Notes").addRow([`made ${Date.now()}`]);
    const ws = wb.addWorksheet("Results");
    ws.addRow(["Wavelength (nm)", "240 s"]);
    for (const r of rows) ws.addRow([Number(r[0]), Number(r[k240])]);
    const bytes = new Uint8Array(await wb.xlsx.writeBuffer());
    const { status, body } = await upload(
      lab.token,
      [{ fileName: "book.xlsx", bytes, type: "application/vnd.openxmlformats-officedocument.spreadsheetml.sheet" }],
      {
        projectId: lab.project.id,
        technique: "absorption",
        pathLengthCm: "1",
      },
    );
    expect(status).toBe(201);
    expect(body.files).toHaveLength(1);
    const out = body.files![0]!;
    if (!out.ok) throw new Error(out.error.message);
    expect(out.fileName).toBe("book.xlsx");
    const final = await settled(lab.token, out.spectrumId);
    expect(final.spectrum.status).toBe("analysed");
    expect(await storedPeaks(out.runId)).toEqual(plainPeaks());
  });

  it("X,Y pairs side by side: the pair chosen is analysed; the same bytes with another path length report the difference", async () => {
    const text = [
      "Серия А,,Серия Б,",
      "λ (nm),A,λ (nm),A",
      ...rows.map((r) => `${r[0]},${r[k30]},${r[0]},${r[k240]}`),
      `# ${Date.now()}`,
    ].join("\n");
    const fields = { projectId: lab.project.id, technique: "absorption", pair: "2", pathLengthCm: "1" };
    const first = await upload(lab.token, [{ fileName: "pairs.csv", bytes: enc(text) }], fields);
    const out = first.body.files![0]!;
    if (!out.ok) throw new Error(out.error.message);
    const final = await settled(lab.token, out.spectrumId);
    expect(final.spectrum.status).toBe("analysed");
    expect(await storedPeaks(out.runId)).toEqual(plainPeaks());

    const again = await upload(lab.token, [{ fileName: "pairs.csv", bytes: enc(text) }], { ...fields, pathLengthCm: "0.5" });
    expect(again.status).toBe(200);
    const dup = again.body.files![0]! as {
      ok: true;
      duplicate: boolean;
      spectrumId: string;
      differences?: Array<{ field: string; stored: string | null; sent: string }>;
    };
    expect(dup.duplicate).toBe(true);
    expect(dup.spectrumId).toBe(out.spectrumId);
    expect(dup.differences).toEqual([{ field: "pathLengthCm", label: "path length (cm)", stored: "1", sent: "0.5" }]);
    expect((await Spectrum.findByPk(out.spectrumId))!.pathLengthCm).toBe(1);
    const audit = await AuditEvent.findOne({ where: { action: "spectrum.upload-duplicate", targetId: out.spectrumId } });
    expect((audit!.details as { differences?: unknown[] }).differences).toHaveLength(1);
    // the same bytes with the same details: a plain duplicate, no differences
    const same = await upload(lab.token, [{ fileName: "pairs.csv", bytes: enc(text) }], fields);
    expect((same.body.files![0] as { differences?: unknown }).differences).toBeUndefined();
  });
});
