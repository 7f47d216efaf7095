// A corpus of bad files and bad metadata sent through the running app: each ends with a
// clear error (4xx naming the file or field, or the spectrum failed with the engine's
// message), never a 500; accepted raw files stay in storage; the worker keeps going.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { AnalysisRun, Spectrum } from "@/models";
import { closeDb } from "@/lib/db";
import { config } from "@/lib/config";
import { getObjectBytes } from "@/lib/storage";
import { appUrl, createLab, type Lab } from "../helpers/fixtures";
import { settled, upload } from "../helpers/api";
import { badCorpus } from "../helpers/badFiles";
import { enc, syntheticAbsorptionCsv } from "../helpers/spectra";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

let lab: Lab;

beforeAll(async () => {
  lab = await createLab();
});
afterAll(async () => {
  await closeDb();
});

describe("bad files and bad metadata", () => {
  const corpus = badCorpus(config().UPLOAD_MAX_BYTES);

  it("has at least 30 cases", () => {
    expect(corpus.length).toBeGreaterThanOrEqual(30);
  });

  it.each(corpus.map((c) => [c.name, c] as const))("%s ends with a clear error", async (_name, c) => {
    const fields = { projectId: lab.project.id, technique: "absorption", ...(c.fields ?? {}) };
    const { status, body } = await upload(lab.token, [{ fileName: c.fileName, bytes: c.bytes, type: "text/csv" }], fields);
    expect(status, JSON.stringify(body)).toBeLessThan(500);

    if (status >= 400) {
      expect(body.error?.message).toBeTruthy();
      const message = body.error!.message;
      const namesFileOrField =
        message.includes(c.fileName) ||
        (body.error!.field !== undefined && message.includes(body.error!.field)) ||
        /project/.test(message) ||
        /unknown form field/.test(message);
      expect(namesFileOrField, message).toBe(true);
      if (c.expect) expect(message).toMatch(c.expect);
      expect(message).not.toMatch(/Sequelize|stack|at .*\.ts:\d+|ECONN|SQL/i);
      return;
    }

    // Accepted: the raw file is stored as it arrived, and analysis fails with a message naming the file.
    const out = body.files![0];
    if (!out.ok) throw new Error("accepted upload without a stored file");
    const spectrum = (await Spectrum.findByPk(out.spectrumId))!;
    expect(Buffer.from(await getObjectBytes(spectrum.objectKey)).equals(Buffer.from(c.bytes))).toBe(true);
    const final = await settled(lab.token, out.spectrumId);
    expect(final.spectrum.status).toBe("failed");
    expect(final.spectrum.error).toContain(c.fileName);
    expect(final.spectrum.error).not.toMatch(/\n|at .*\.ts:\d+|Sequelize/);
    expect((await AnalysisRun.findByPk(out.runId))!.status).toBe("failed");
  });

  it("a bad request body is refused with 415 or 400, not 500", async () => {
    const headers = { Authorization: `Bearer ${lab.token}` };
    const json = await fetch(appUrl("/api/v1/spectra"), {
      method: "POST",
      headers: { ...headers, "Content-Type": "application/json" },
      body: "{}",
    });
    expect(json.status).toBe(415);
    const broken = await fetch(appUrl("/api/v1/spectra"), {
      method: "POST",
      headers: { ...headers, "Content-Type": "multipart/form-data; boundary=xyz" },
      body: "--xyz\r\nnot a part",
    });
    expect(broken.status).toBe(400);
    expect(((await broken.json()) as { error: { message: string } }).error.message).toMatch(/multipart/);
    const textFile = new FormData();
    textFile.append("projectId", lab.project.id);
    textFile.append("technique", "absorption");
    textFile.append("file", "just text");
    const asText = await fetch(appUrl("/api/v1/spectra"), { method: "POST", headers, body: textFile });
    expect(asText.status).toBe(400);
    const noFile = new FormData();
    noFile.append("projectId", lab.project.id);
    noFile.append("technique", "absorption");
    const none = await fetch(appUrl("/api/v1/spectra"), { method: "POST", headers, body: noFile });
    expect(none.status).toBe(400);
    expect(((await none.json()) as { error: { field: string } }).error.field).toBe("file");
  });

  it("the worker still analyses good files afterwards", async () => {
    const { status, body } = await upload(
      lab.token,
      [{ fileName: "after-the-storm.csv", bytes: enc(syntheticAbsorptionCsv({ seed: 333 })) }],
      {
        projectId: lab.project.id,
        technique: "absorption",
      },
    );
    expect(status).toBe(201);
    const out = body.files![0];
    if (!out.ok) throw new Error(out.error.message);
    expect((await settled(lab.token, out.spectrumId)).spectrum.status).toBe("analysed");
  });
});
