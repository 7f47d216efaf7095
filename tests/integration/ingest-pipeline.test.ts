// Upload through the running app, analysis by the running worker, read back through the API.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { AnalysisRun, AuditEvent, Peak, Signature, Spectrum } from "@/models";
import { closeDb } from "@/lib/db";
import { getObjectBytes } from "@/lib/storage";
import { addMember, appUrl, createLab, createSample, createSeries, createUser, type Lab } from "../helpers/fixtures";
import { getJson, settled, upload } from "../helpers/api";
import { enc, syntheticAbsorptionCsv } from "../helpers/spectra";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

let lab: Lab;
let fields: Record<string, string>;

beforeAll(async () => {
  lab = await createLab("spectroscopist");
  fields = { projectId: lab.project.id, technique: "absorption" };
});
afterAll(async () => {
  await closeDb();
});

async function countsFor(runId: string) {
  return { peaks: await Peak.count({ where: { runId } }), signatures: await Signature.count({ where: { runId } }) };
}

describe("ingest pipeline end to end", () => {
  let referenceId: string;

  it("stores a file, analyses it once and serves peaks and the raw bytes", async () => {
    const bytes = enc(syntheticAbsorptionCsv({ seed: 101 }));
    const { status, body } = await upload(lab.token, [{ fileName: "parent batch.csv", bytes }], { ...fields, solvent: "toluene" });
    expect(status).toBe(201);
    const out = body.files![0];
    if (!out.ok) throw new Error(out.error.message);
    expect(out.duplicate).toBe(false);
    referenceId = out.spectrumId;

    const final = await settled(lab.token, out.spectrumId);
    expect(final.spectrum.status).toBe("analysed");
    expect(final.analysis?.status).toBe("done");

    const run = (await AnalysisRun.findByPk(out.runId))!;
    const report = run.report as { peaks: unknown[]; flags: unknown[]; engineVersion: string };
    expect(run.status).toBe("done");
    expect(run.engineVersion).toBe(report.engineVersion);
    expect(run.durationMs).toBeGreaterThanOrEqual(0);
    expect(run.noise).toBeGreaterThan(0);
    expect(await countsFor(run.id)).toEqual({ peaks: report.peaks.length, signatures: report.flags.length });
    expect(final.analysis!.peaks.length).toBe(report.peaks.length);
    expect(await AnalysisRun.count({ where: { spectrumId: out.spectrumId } })).toBe(1);

    const spectrum = (await Spectrum.findByPk(out.spectrumId))!;
    expect(spectrum.objectKey).toMatch(/^raw\/[0-9a-f]{2}\/[0-9a-f-]{36}$/);
    expect(spectrum.objectKey).not.toContain("parent");
    expect(Buffer.from(await getObjectBytes(spectrum.objectKey)).equals(Buffer.from(bytes))).toBe(true);
    expect(await AuditEvent.count({ where: { action: "spectrum.upload", targetId: out.spectrumId } })).toBe(1);

    const raw = await fetch(appUrl(`/api/v1/spectra/${out.spectrumId}/raw`), { headers: { Authorization: `Bearer ${lab.token}` } });
    expect(raw.status).toBe(200);
    expect(raw.headers.get("content-disposition")).toBe(`attachment; filename="parent batch.csv"; filename*=UTF-8''parent%20batch.csv`);
    expect(Buffer.from(await raw.arrayBuffer()).equals(Buffer.from(bytes))).toBe(true);
  });

  it("compares against the parent reference and writes the flagged signatures once", async () => {
    const sample = await createSample(lab, "CdSe/ZnS");
    const bytes = enc(syntheticAbsorptionCsv({ seed: 102, excitonHeight: 0.25, excitonNm: 566 }));
    const { status, body } = await upload(lab.token, [{ fileName: "charged.csv", bytes }], {
      ...fields,
      referenceSpectrumId: referenceId,
      sampleId: sample.id,
    });
    expect(status).toBe(201);
    const out = body.files![0];
    if (!out.ok) throw new Error(out.error.message);
    const final = await settled(lab.token, out.spectrumId);
    expect(final.spectrum.status).toBe("analysed");
    const run = (await AnalysisRun.findByPk(out.runId))!;
    expect(run.referenceSpectrumId).toBe(referenceId);
    expect(run.parameters).toMatchObject({ technique: "absorption", material: "CdSe" });
    const kinds = (await Signature.findAll({ where: { runId: run.id } })).map((s) => s.kind);
    expect(kinds).toContain("bleach");
    expect(kinds.length).toBe((run.report as { flags: unknown[] }).flags.length);
  });

  it("links a duplicate instead of storing it twice", async () => {
    const bytes = enc(syntheticAbsorptionCsv({ seed: 101 }));
    const { status, body } = await upload(lab.token, [{ fileName: "same bytes, other name.csv", bytes }], fields);
    expect(status).toBe(200);
    const out = body.files![0];
    expect(out).toMatchObject({ ok: true, duplicate: true, spectrumId: referenceId });
    expect(await Spectrum.count({ where: { projectId: lab.project.id, sha256: (await Spectrum.findByPk(referenceId))!.sha256 } })).toBe(1);
  });

  it("keeps earlier runs when an analysis is requested again", async () => {
    const res = await fetch(appUrl(`/api/v1/spectra/${referenceId}/analyses`), {
      method: "POST",
      headers: { Authorization: `Bearer ${lab.token}`, "Content-Type": "application/json" },
      body: JSON.stringify({ smoothingWindow: 15 }),
    });
    expect(res.status).toBe(201);
    const { runId } = (await res.json()) as { runId: string };
    await settled(lab.token, referenceId);
    const runs = await AnalysisRun.findAll({ where: { spectrumId: referenceId }, order: [["createdAt", "ASC"]] });
    expect(runs).toHaveLength(2);
    expect(runs[1].id).toBe(runId);
    expect(runs.map((r) => r.status)).toEqual(["done", "done"]);
    expect(runs[0].parameterHash).not.toBe(runs[1].parameterHash);
    const again = await fetch(appUrl(`/api/v1/spectra/${referenceId}/analyses`), {
      method: "POST",
      headers: { Authorization: `Bearer ${lab.token}`, "Content-Type": "application/json" },
      body: JSON.stringify({ smoothingWindow: 15 }),
    });
    expect(again.status).toBe(200);
    expect(await AnalysisRun.count({ where: { spectrumId: referenceId } })).toBe(2);
  });

  it("records the series, its value and the acquisition numbers", async () => {
    const series = await createSeries(lab);
    const bytes = enc(syntheticAbsorptionCsv({ seed: 103 }));
    const { body } = await upload(lab.token, [{ fileName: "titration-2.csv", bytes }], {
      ...fields,
      seriesId: series.id,
      seriesValue: "2",
      pathLengthCm: "0.2",
    });
    const out = body.files![0];
    if (!out.ok) throw new Error(out.error.message);
    await settled(lab.token, out.spectrumId);
    const { status, body: view } = await getJson<{ spectra: { id: string; seriesValue: number; status: string; firstExciton: unknown }[] }>(
      lab.token,
      `/api/v1/series/${series.id}`,
    );
    expect(status).toBe(200);
    expect(view.spectra).toHaveLength(1);
    expect(view.spectra[0]).toMatchObject({ id: out.spectrumId, seriesValue: 2, status: "analysed" });
    expect(view.spectra[0].firstExciton).not.toBeNull();
    expect((await Spectrum.findByPk(out.spectrumId))!.pathLengthCm).toBe(0.2);
  });

  it("checks the caller on every route", async () => {
    const bytes = enc(syntheticAbsorptionCsv({ seed: 104 }));
    const anonymous = await fetch(appUrl(`/api/v1/spectra/${referenceId}`));
    expect(anonymous.status).toBe(401);
    expect(await anonymous.json()).toEqual({ error: { code: "unauthenticated", message: "Sign in or send a Bearer API token." } });

    const outsider = await createUser("outsider");
    expect((await getJson(outsider.token, `/api/v1/spectra/${referenceId}`)).status).toBe(404);
    expect(
      (await fetch(appUrl(`/api/v1/spectra/${referenceId}/raw`), { headers: { Authorization: `Bearer ${outsider.token}` } })).status,
    ).toBe(404);
    const refused = await upload(outsider.token, [{ fileName: "x.csv", bytes }], fields);
    expect(refused.status).toBe(404);
    expect(refused.body.error?.field).toBe("projectId");

    const steward = await addMember(lab, "steward");
    expect((await getJson(steward.token, `/api/v1/spectra/${referenceId}`)).status).toBe(200);
    const stewardUpload = await upload(steward.token, [{ fileName: "x.csv", bytes }], fields);
    expect(stewardUpload.status).toBe(403);
    expect(stewardUpload.body.error?.message).toMatch(/may not add spectra/);

    const projects = await getJson<{ projects: { id: string }[] }>(lab.token, "/api/v1/projects");
    expect(projects.body.projects.map((p) => p.id)).toEqual([lab.project.id]);
    expect((await getJson<{ projects: unknown[] }>(steward.token, "/api/v1/projects")).body.projects).toEqual([]);
  });

  it("describes itself in OpenAPI 3.1", async () => {
    const { status, body } = await getJson<{ openapi: string; paths: Record<string, unknown> }>(lab.token, "/api/v1/openapi.json");
    expect(status).toBe(200);
    expect(body.openapi).toBe("3.1.0");
    expect(Object.keys(body.paths)).toEqual(
      expect.arrayContaining([
        "/api/v1/spectra",
        "/api/v1/spectra/{id}",
        "/api/v1/spectra/{id}/raw",
        "/api/v1/series/{id}",
        "/api/v1/projects",
      ]),
    );
  });
});
