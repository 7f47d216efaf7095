// 50 uploads at once through the running app: nothing is lost, nothing stored twice.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Op } from "sequelize";
import { AnalysisRun, Spectrum } from "@/models";
import { closeDb } from "@/lib/db";
import { createLab, type Lab } from "../helpers/fixtures";
import { upload } from "../helpers/api";
import { enc, syntheticAbsorptionCsv } from "../helpers/spectra";
import { waitFor } from "../helpers/waitFor";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

let lab: Lab;

beforeAll(async () => {
  lab = await createLab();
});
afterAll(async () => {
  await closeDb();
});

describe("concurrent uploads", () => {
  it("50 concurrent uploads are all stored and analysed", async () => {
    const fields = { projectId: lab.project.id, technique: "absorption" };
    const results = await Promise.all(
      Array.from({ length: 50 }, (_, i) =>
        upload(lab.token, [{ fileName: `parallel-${i}.csv`, bytes: enc(syntheticAbsorptionCsv({ seed: 7000 + i, points: 800 })) }], fields),
      ),
    );
    expect(results.map((r) => r.status)).toEqual(Array(50).fill(201));
    const ids = results.map((r) => (r.body.files![0].ok ? r.body.files![0].spectrumId : ""));
    expect(new Set(ids).size).toBe(50);
    await waitFor(
      "all 50 analysed",
      async () => ((await Spectrum.count({ where: { id: { [Op.in]: ids }, status: "analysed" } })) === 50 ? true : undefined),
      120_000,
      500,
    );
    expect(await AnalysisRun.count({ where: { spectrumId: { [Op.in]: ids }, status: "done" } })).toBe(50);
  });

  it("the same file sent 10 times at once is stored once and linked 9 times", async () => {
    const bytes = enc(syntheticAbsorptionCsv({ seed: 7999 }));
    const results = await Promise.all(
      Array.from({ length: 10 }, (_, i) =>
        upload(lab.token, [{ fileName: `copy-${i}.csv`, bytes }], { projectId: lab.project.id, technique: "absorption" }),
      ),
    );
    const outs = results.map((r) => r.body.files![0]);
    expect(outs.every((o) => o.ok)).toBe(true);
    expect(outs.filter((o) => o.ok && !o.duplicate)).toHaveLength(1);
    expect(new Set(outs.map((o) => (o.ok ? o.spectrumId : ""))).size).toBe(1);
    expect(results.filter((r) => r.status === 201)).toHaveLength(1);
  });
});
