// One file, many spectra; import profiles; duplicates with new details; and the parent check
// before upload — through the running app and worker on the real PostgreSQL, Redis and storage fake.
// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 204, 400, 404). Band positions of
// the generated files are their own truth (tests/helpers/spectra.ts writes a Gaussian first
// exciton at the given wavelength); E = hc/λ with hc = 1239.841984 eV·nm (CODATA 2018).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { AnalysisRun, AuditEvent, Series, Spectrum } from "@/models";
import { closeDb } from "@/lib/db";
import { analyzeSpectrum, parseSpectrumFile } from "@/lib/engine";
import { getUploadChoices } from "@/lib/queries/spectrum-status";
import { deleteSpectrum, objectExists } from "@/lib/stewardship/deletion";
import { parentVerdict } from "@/lib/parents/orderParentChoices";
import type { FilePreview, FilePreviewOk } from "@/lib/ingest/previewFile";
import { addMember, appUrl, createLab, createSample, createSeries, type Lab } from "../helpers/fixtures";
import { enc, syntheticAbsorptionCsv } from "../helpers/spectra";
import { getJson, settled, upload } from "../helpers/api";

const HC_EV_NM = 1239.841984;

let lab: Lab;
beforeAll(async () => {
  lab = await createLab("spectroscopist");
});
afterAll(async () => {
  await closeDb();
});

type Outcome = {
  ok: true;
  fileName: string;
  spectrumId: string;
  runId: string;
  duplicate: boolean;
  status: string;
  trace?: string;
  seriesValue?: number | null;
  seriesUnit?: string;
  profile?: { name: string; how: string };
  differences?: Array<{ field: string; stored: string | null; sent: string }>;
  updated?: { fields: string[]; reanalysis: { runId: string; created: boolean } | null };
};
const okOutcomes = (body: { files?: unknown[] }) => (body.files ?? []) as Outcome[];

async function preview(
  token: string,
  fileName: string,
  bytes: Uint8Array,
  fields: Record<string, string>,
): Promise<{ status: number; body: FilePreview }> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  form.append("file", new Blob([bytes as Uint8Array<ArrayBuffer>], { type: "text/csv" }), fileName);
  const res = await fetch(appUrl("/api/v1/spectra/preview"), { method: "POST", headers: { Authorization: `Bearer ${token}` }, body: form });
  return { status: res.status, body: (await res.json()) as FilePreview };
}

function okPreview(p: FilePreview): FilePreviewOk {
  if (!p.ok) throw new Error(p.error);
  return p;
}

/** Columns of several generated spectra on one wavelength grid: "nm,<h1>,<h2>,…". */
function columns(headers: string[], excitonNm: number[], seed: number, header = true): { text: string; plain: (i: number) => string } {
  const files = excitonNm.map((x, i) =>
    syntheticAbsorptionCsv({ excitonNm: x, seed: seed + i, points: 400 })
      .trim()
      .split("\n")
      .slice(1)
      .map((l) => l.split(",")),
  );
  const rows = files[0]!.map((_, r) => [files[0]![r]![0], ...files.map((f) => f[r]![1])].join(","));
  const text = `${header ? `Wavelength (nm),${headers.join(",")}\n` : ""}${rows.join("\n")}\n`;
  const plain = (i: number) => `Wavelength (nm),A\n${files[i]!.map((c) => c.join(",")).join("\n")}\n`;
  return { text, plain };
}

/** The peaks the engine finds in the plain two-column layout of the same data (eV). */
function plainPeaks(text: string): number[] {
  const s = parseSpectrumFile("plain.csv", enc(text), { technique: "absorption" });
  return analyzeSpectrum(s, { technique: "absorption", pathLengthCm: 1 }).peaks.map((p) => p.energyEv);
}

async function storedPeaks(runId: string): Promise<number[]> {
  const run = (await AnalysisRun.findByPk(runId))!;
  return (run.report as { peaks: Array<{ energyEv: number }> }).peaks.map((p) => p.energyEv);
}

describe("the parent check before upload agrees with the analysis", () => {
  it("refuses a parent whose first exciton is far from the file's own, with the worker's reason; accepts a near one", async () => {
    const seed = Date.now() % 1e6;
    const parentUp = await upload(
      lab.token,
      [{ fileName: "parent-560.csv", bytes: enc(syntheticAbsorptionCsv({ excitonNm: 560, seed })) }],
      {
        projectId: lab.project.id,
        technique: "absorption",
        pathLengthCm: "1",
      },
    );
    const parent = okOutcomes(parentUp.body)[0]!;
    expect((await settled(lab.token, parent.spectrumId)).spectrum.status).toBe("analysed");
    const candidate = (await getUploadChoices(lab.actor)).projects
      .find((p) => p.id === lab.project.id)!
      .references.find((r) => r.id === parent.spectrumId)!;
    expect(candidate.firstExcitonEv).not.toBeNull();

    for (const [excitonNm, shouldMatch] of [
      [500, false],
      [565, true],
    ] as const) {
      const fileName = `sample-${excitonNm}.csv`;
      const bytes = enc(syntheticAbsorptionCsv({ excitonNm, seed: seed + excitonNm }));
      const p = okPreview((await preview(lab.token, fileName, bytes, { projectId: lab.project.id, technique: "absorption" })).body);
      // the preview's first exciton is the generated band (fixture truth), within 15 meV (the second band and the background pull it a little)
      expect(Math.abs(p.bands!.firstExciton!.energyEv - HC_EV_NM / excitonNm)).toBeLessThan(0.015);
      const verdict = parentVerdict({ technique: "absorption", sample: null, side: null, bands: p.bands }, candidate);
      expect(verdict.ok).toBe(shouldMatch);

      const stored = await upload(lab.token, [{ fileName, bytes }], {
        projectId: lab.project.id,
        technique: "absorption",
        pathLengthCm: "1",
        referenceSpectrumId: parent.spectrumId,
      });
      const out = okOutcomes(stored.body)[0]!;
      expect((await settled(lab.token, out.spectrumId)).spectrum.status).toBe("analysed");
      const report = (await AnalysisRun.findByPk(out.runId))!.report as { referenceMatch: { ok: boolean; reason: string | null } };
      expect(report.referenceMatch.ok).toBe(shouldMatch);
      if (!verdict.ok) expect(report.referenceMatch.reason).toBe(verdict.reason);
    }
  });
});

describe("one file, many spectra", () => {
  it("splits a three-column file into three spectra of a series, one raw object, series values from the headers, peaks as in the plain layout", async () => {
    const series = await createSeries(lab); // variable unit "equiv": the headers' "eq" is the same unit
    const { text, plain } = columns(["0.5 eq", "1 eq", "2 eq"], [555, 560, 570], Date.now() % 1e6);
    const fileName = "titration-three.csv";
    const p = okPreview(
      (await preview(lab.token, fileName, enc(text), { projectId: lab.project.id, technique: "absorption", split: "all" })).body,
    );
    expect(p.split).toEqual([
      { label: "0.5 eq", seriesValue: { value: 0.5, unit: "eq" } },
      { label: "1 eq", seriesValue: { value: 1, unit: "eq" } },
      { label: "2 eq", seriesValue: { value: 2, unit: "eq" } },
    ]);
    expect(p.creates).toBe('3 absorption spectra, one per column: "0.5 eq" (0.5 eq), "1 eq" (1 eq), "2 eq" (2 eq)');

    const fields = { projectId: lab.project.id, technique: "absorption", pathLengthCm: "1", seriesId: series.id, split: "all" };
    const { status, body } = await upload(lab.token, [{ fileName, bytes: enc(text) }], fields);
    expect(status).toBe(201);
    const outs = okOutcomes(body);
    expect(outs.map((o) => [o.trace, o.seriesValue, o.seriesUnit, o.duplicate])).toEqual([
      ["0.5 eq", 0.5, "eq", false],
      ["1 eq", 1, "eq", false],
      ["2 eq", 2, "eq", false],
    ]);
    const rows = await Spectrum.findAll({ where: { id: outs.map((o) => o.spectrumId) }, order: [["seriesValue", "ASC"]] });
    expect(rows.map((r) => r.seriesId)).toEqual([series.id, series.id, series.id]);
    expect(rows.map((r) => r.seriesValue)).toEqual([0.5, 1, 2]);
    expect(new Set(rows.map((r) => r.objectKey)).size).toBe(1);
    expect(new Set(rows.map((r) => r.traceKey)).size).toBe(3);
    for (const [i, o] of outs.entries()) {
      expect((await settled(lab.token, o.spectrumId)).spectrum.status).toBe("analysed");
      expect(await storedPeaks(o.runId)).toEqual(plainPeaks(plain(i)));
    }

    // the same bytes and the same choice again: every trace is a duplicate, nothing stored twice
    const again = await upload(lab.token, [{ fileName, bytes: enc(text) }], fields);
    expect(again.status).toBe(200);
    expect(okOutcomes(again.body).map((o) => [o.spectrumId, o.duplicate])).toEqual(outs.map((o) => [o.spectrumId, true]));
    // one trace named by its header, without split, is the same spectrum as that trace of the split
    const one = await upload(lab.token, [{ fileName, bytes: enc(text) }], { ...fields, split: "", column: "1 eq", seriesValue: "1" });
    expect(okOutcomes(one.body)[0]).toMatchObject({ spectrumId: outs[1]!.spectrumId, duplicate: true });
    // and the file's default reading is its first column
    const plainUpload = await upload(lab.token, [{ fileName, bytes: enc(text) }], { ...fields, split: "", seriesValue: "0.5" });
    expect(okOutcomes(plainUpload.body)[0]).toMatchObject({ spectrumId: outs[0]!.spectrumId, duplicate: true });
    expect(await Spectrum.count({ where: { projectId: lab.project.id, sha256: rows[0]!.sha256 } })).toBe(3);

    // the shared raw object goes with the last spectrum that reads it, not before
    const request = { cause: "owner" as const, actorId: lab.user.id, actorLabel: lab.user.email };
    await deleteSpectrum(rows[0]!.id, request);
    await deleteSpectrum(rows[1]!.id, request);
    expect(await objectExists(rows[2]!.objectKey)).toBe(true);
    await deleteSpectrum(rows[2]!.id, request);
    expect(await objectExists(rows[2]!.objectKey)).toBe(false);
  });

  it("gives each trace its own sample or value when asked, leaves one out, and refuses a header unit that is not the series'", async () => {
    const series = await Series.create({
      projectId: lab.project.id,
      name: "Dilution",
      kind: "other",
      variableName: "concentration",
      variableUnit: "µM",
      createdBy: lab.user.id,
    });
    const sample = await createSample(lab);
    const { text } = columns(["10 µM", "20 µM", "40 µM"], [560, 560, 560], (Date.now() % 1e6) + 7);
    const fields = {
      projectId: lab.project.id,
      technique: "absorption",
      seriesId: series.id,
      split: "all",
      assignments: JSON.stringify([
        { trace: "20 µM", sampleId: sample.id, seriesValue: 21.5 },
        { trace: "40 µM", skip: true },
      ]),
    };
    const { status, body } = await upload(lab.token, [{ fileName: "dilution.csv", bytes: enc(text) }], fields);
    expect(status).toBe(201);
    const outs = okOutcomes(body);
    expect(outs.map((o) => [o.trace, o.seriesValue, o.seriesUnit])).toEqual([
      ["10 µM", 10, "µM"],
      ["20 µM", 21.5, "µM"],
    ]);
    const second = (await Spectrum.findByPk(outs[1]!.spectrumId))!;
    expect(second.sampleId).toBe(sample.id);
    expect((await Spectrum.findByPk(outs[0]!.spectrumId))!.sampleId).toBeNull();

    const { text: eqText } = columns(["0.5 eq", "1 eq"], [560, 560], (Date.now() % 1e6) + 11);
    const refused = await upload(lab.token, [{ fileName: "wrong-unit.csv", bytes: enc(eqText) }], {
      projectId: lab.project.id,
      technique: "absorption",
      seriesId: series.id,
      split: "all",
    });
    expect(refused.status).toBe(400);
    expect(refused.body.error!.message).toBe(
      'wrong-unit.csv: column "0.5 eq" states 0.5 eq, but series "Dilution" is in µM; give the value in assignments or choose another series',
    );
  });
});

describe("import profiles", () => {
  it("a profile saved from one headerless file reads the next one by itself; named, none, listed, deleted", async () => {
    // 1500 → 1150 written high to low: nm or cm⁻¹, asked (docs/ingest.md rule 5) — a file that needs a choice
    const headerless = (shift: number) =>
      enc(
        Array.from({ length: 176 }, (_, i) => {
          const nm = 1500 - 2 * i;
          return `${nm}\t${(0.2 * Math.exp(-(((nm - 1300 - shift) / 40) ** 2)) + (0.01 * i) / 176).toFixed(5)}\t${(0.1 + 0.0001 * i + shift * 1e-6).toFixed(5)}\t${(0.05 + 0.0002 * i).toFixed(5)}`;
        }).join("\n") + "\n",
      );
    const first = headerless(0);
    const before = (await preview(lab.token, "plate-1.txt", first, { projectId: lab.project.id, technique: "absorption" })).body;
    expect(before.ok).toBe(false);
    if (!before.ok) expect(before.error).toMatch(/^plate-1\.txt, column "column 1": X unit unknown.*could be nm or cm⁻¹/);
    const chosen = okPreview(
      (await preview(lab.token, "plate-1.txt", first, { projectId: lab.project.id, technique: "absorption", xUnit: "nm", split: "all" }))
        .body,
    );
    expect(chosen.split).toHaveLength(3);
    expect(chosen.signature).toBe("ext=txt\nformat=delimited\nlayout=x-then-y\nsheet=\ncolumns=column # | column # | column #");

    const save = await fetch(appUrl(`/api/v1/projects/${lab.project.id}/import-profiles`), {
      method: "POST",
      headers: { Authorization: `Bearer ${lab.token}`, "content-type": "application/json" },
      body: JSON.stringify({ name: "Plate reader, three wells", choice: { xUnit: "nm", split: true }, signature: chosen.signature }),
    });
    expect(save.status).toBe(201);
    const saved = (await save.json()) as { profile: { id: string; name: string } };
    expect(await AuditEvent.findOne({ where: { action: "import-profile.create", targetId: saved.profile.id } })).not.toBeNull();

    // another file of the same habit (other numbers): matched by its header signature
    const second = headerless(20);
    const matched = okPreview(
      (await preview(lab.token, "plate-2.txt", second, { projectId: lab.project.id, technique: "absorption" })).body,
    );
    expect(matched.profile).toEqual({ name: "Plate reader, three wells", how: "matched", fields: { xUnit: "nm", split: "all" } });
    expect(matched.xUnitSource).toBe("chosen");
    expect(matched.split).toHaveLength(3);
    const up = await upload(lab.token, [{ fileName: "plate-2.txt", bytes: second }], {
      projectId: lab.project.id,
      technique: "absorption",
    });
    expect(up.status).toBe(201);
    const outs = okOutcomes(up.body);
    expect(outs).toHaveLength(3);
    expect(outs.every((o) => o.profile?.name === "Plate reader, three wells" && o.profile.how === "matched")).toBe(true);
    for (const o of outs) {
      expect((await settled(lab.token, o.spectrumId)).spectrum.status).toBe("analysed");
      expect((await Spectrum.findByPk(o.spectrumId))!.readOptions).toMatchObject({ xUnit: "nm" });
    }

    // "none" switches matching off: the file is read as sent (and its analysis says what is missing)
    const none = await upload(lab.token, [{ fileName: "plate-3.txt", bytes: headerless(40) }], {
      projectId: lab.project.id,
      technique: "absorption",
      profile: "none",
    });
    const plainOut = okOutcomes(none.body);
    expect(plainOut).toHaveLength(1);
    expect(plainOut[0]!.profile).toBeUndefined();
    expect((await settled(lab.token, plainOut[0]!.spectrumId)).spectrum.error).toMatch(/^plate-3\.txt, column "column 1": X unit unknown/);

    // named explicitly, for a file whose header would not match
    const withHeader = enc(
      `Wavelength,Well A\n${Array.from({ length: 100 }, (_, i) => `${1500 - 3 * i},${(0.1 + 0.001 * i).toFixed(4)}`).join("\n")}\n`,
    );
    const named = await upload(lab.token, [{ fileName: "named.csv", bytes: withHeader }], {
      projectId: lab.project.id,
      technique: "absorption",
      profile: "Plate reader, three wells",
    });
    expect(okOutcomes(named.body)[0]!.profile).toEqual({ name: "Plate reader, three wells", how: "named" });

    // listed and deleted by a member who may upload; a guest of another group is told nothing
    const list = await getJson<{ profiles: Array<{ id: string; name: string }> }>(
      lab.token,
      `/api/v1/projects/${lab.project.id}/import-profiles`,
    );
    expect(list.body.profiles.map((p) => p.name)).toEqual(["Plate reader, three wells"]);
    const stranger = await createLab();
    expect((await getJson(stranger.token, `/api/v1/projects/${lab.project.id}/import-profiles`)).status).toBe(404);
    const del = await fetch(appUrl(`/api/v1/projects/${lab.project.id}/import-profiles/${saved.profile.id}`), {
      method: "DELETE",
      headers: { Authorization: `Bearer ${lab.token}` },
    });
    expect(del.status).toBe(204);
    expect((await getJson<{ profiles: unknown[] }>(lab.token, `/api/v1/projects/${lab.project.id}/import-profiles`)).body.profiles).toEqual(
      [],
    );
    expect(await AuditEvent.count({ where: { action: "import-profile.delete", targetId: saved.profile.id } })).toBe(1);
  });

  it("refuses a badly made profile on the field that is wrong", async () => {
    const bad = await fetch(appUrl(`/api/v1/projects/${lab.project.id}/import-profiles`), {
      method: "POST",
      headers: { Authorization: `Bearer ${lab.token}`, "content-type": "application/json" },
      body: JSON.stringify({ name: "x", choice: { xUnit: "furlong" }, signature: "ext=csv" }),
    });
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: { field: string } }).error.field).toBe("choice.xUnit");
  });
});

describe("the same bytes with new details", () => {
  it("keeps the stored details unless asked; an update is audited and re-analysed when an analysis input changed", async () => {
    const bytes = enc(syntheticAbsorptionCsv({ excitonNm: 580, seed: Date.now() % 1e6 }));
    const fields = { projectId: lab.project.id, technique: "absorption", pathLengthCm: "1", solvent: "toluene" };
    const first = okOutcomes((await upload(lab.token, [{ fileName: "dup.csv", bytes }], fields)).body)[0]!;
    expect((await settled(lab.token, first.spectrumId)).spectrum.status).toBe("analysed");

    const kept = okOutcomes((await upload(lab.token, [{ fileName: "dup.csv", bytes }], { ...fields, pathLengthCm: "0.5" })).body)[0]!;
    expect(kept).toMatchObject({
      spectrumId: first.spectrumId,
      duplicate: true,
      differences: [{ field: "pathLengthCm", stored: "1", sent: "0.5" }],
    });
    expect(kept.updated).toBeUndefined();
    expect((await Spectrum.findByPk(first.spectrumId))!.pathLengthCm).toBe(1);

    const updated = okOutcomes(
      (await upload(lab.token, [{ fileName: "dup.csv", bytes }], { ...fields, pathLengthCm: "0.5", onDuplicate: "update" })).body,
    )[0]!;
    expect(updated.updated!.fields).toEqual(["pathLengthCm"]);
    expect(updated.updated!.reanalysis!.created).toBe(true);
    expect((await Spectrum.findByPk(first.spectrumId))!.pathLengthCm).toBe(0.5);
    const run = (await AnalysisRun.findByPk(updated.updated!.reanalysis!.runId))!;
    expect((run.parameters as { pathLengthCm: number }).pathLengthCm).toBe(0.5);
    expect(await AnalysisRun.count({ where: { spectrumId: first.spectrumId } })).toBe(2);
    const audit = await AuditEvent.findOne({ where: { action: "spectrum.details-update", targetId: first.spectrumId } });
    expect((audit!.details as { differences: unknown[] }).differences).toEqual([
      { field: "pathLengthCm", label: "path length (cm)", stored: "1", sent: "0.5" },
    ]);
    expect((await settled(lab.token, first.spectrumId)).spectrum.status).toBe("analysed");

    // a detail that does not enter the analysis: updated, no new run
    const reviewer = await addMember(lab, "spectroscopist");
    const solvent = okOutcomes(
      (
        await upload(reviewer.token, [{ fileName: "dup.csv", bytes }], {
          ...fields,
          pathLengthCm: "0.5",
          solvent: "hexane",
          onDuplicate: "update",
        })
      ).body,
    )[0]!;
    expect(solvent.updated).toEqual({ fields: ["solvent"], reanalysis: null });
    expect((await Spectrum.findByPk(first.spectrumId))!.solvent).toBe("hexane");
    expect(await AnalysisRun.count({ where: { spectrumId: first.spectrumId } })).toBe(2);
  });
});
