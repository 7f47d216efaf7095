import { convert } from "jcampconverter";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { parseSpectrumFile } from "@/lib/engine";
import { COLUMNS_MEDIA_TYPE, decodeColumns } from "@/lib/spectrum-view/columnsFormat";
import { payloadFromColumns } from "@/lib/spectrum-view/payload";
import { AnalysisRun, Spectrum } from "@/models";
import { upload, settled } from "../helpers/api";
import { DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { createLab, type Lab } from "../helpers/fixtures";
import { sessionCookie } from "../helpers/session";

// The viewer's data endpoint and downloads against the running app, with the demo scenario's
// spectra (real PostgreSQL, Redis, storage; no mocks).
const HC = 1239.841984; // eV·nm, CODATA 2018

type Payload = {
  spectrumId: string;
  runId: string;
  axis: string;
  xLabel: string;
  yLabel: string;
  emission: boolean;
  points: number;
  x: number[];
  series: Record<"raw" | "smoothed" | "reference" | "difference", (number | null)[] | null>;
};

let cookie: string;
const other: Record<string, string> = {};
let flagged: Spectrum;
let parent: Spectrum;
let pl: Spectrum;
let lab: Lab;

const get = (path: string, headers: Record<string, string> = {}) => fetch(url(path), { headers, redirect: "manual" });

beforeAll(async () => {
  cookie = await sessionCookie(DEMO.spectroscopist, DEMO_PASSWORD);
  other.collaborator = await sessionCookie(DEMO.collaborator, DEMO_PASSWORD);
  other.otherGroup = await sessionCookie(DEMO.otherGroup, DEMO_PASSWORD);
  flagged = (await Spectrum.findOne({ where: { fileName: "cdse-0412-n-abs.csv" } }))!;
  parent = (await Spectrum.findOne({ where: { fileName: "cdse-0412-abs.csv" } }))!;
  pl = (await Spectrum.findOne({ where: { fileName: "pl-quench-10uM.csv" } }))!;
  expect(flagged && parent && pl, "demo scenario loaded").toBeTruthy();
  lab = await createLab("spectroscopist");
});
afterAll(closeDb);

describe("who may read the curves and downloads", () => {
  const paths = (id: string) => [
    `/api/v1/spectra/${id}/data?axis=nm`,
    `/api/v1/spectra/${id}/export?format=csv`,
    `/api/v1/spectra/${id}/export?format=jcamp`,
    `/api/v1/spectra/${id}/export?format=json`,
  ];

  it("refuses anonymous callers with 401 and the JSON error shape", async () => {
    for (const p of paths(flagged.id)) {
      const res = await get(p);
      expect(res.status, p).toBe(401);
      expect(((await res.json()) as { error: { code: string } }).error.code).toBe("unauthenticated");
    }
  });

  it("answers another group's member and an outside collaborator (nothing shared) with 404, as if the spectrum did not exist", async () => {
    for (const who of ["collaborator", "otherGroup"]) {
      for (const p of paths(flagged.id)) expect((await get(p, { cookie: other[who]! })).status, `${who} ${p}`).toBe(404);
    }
    // and a Bearer token of a brand-new lab
    expect((await get(`/api/v1/spectra/${flagged.id}/data`, { Authorization: `Bearer ${lab.token}` })).status).toBe(404);
  });

  it("names the bad field in a 400", async () => {
    const bad = await get(`/api/v1/spectra/${flagged.id}/data?axis=furlong`, { cookie });
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: { field: string; message: string } }).error).toMatchObject({
      field: "axis",
      message: expect.stringMatching(/axis must be nm, ev or cm-1/),
    });
    const run = await get(`/api/v1/spectra/${flagged.id}/export?format=csv&run=nope`, { cookie });
    expect(((await run.json()) as { error: { field: string } }).error.field).toBe("run");
    const fmt = await get(`/api/v1/spectra/${flagged.id}/export?format=xlsx`, { cookie });
    expect(fmt.status).toBe(400);
    expect(((await fmt.json()) as { error: { field: string } }).error.field).toBe("format");
  });
});

describe("GET /api/v1/spectra/{id}/data", () => {
  let nm: Payload;
  it("sends columnar arrays (x and one array per series), not one object per point", async () => {
    const res = await get(`/api/v1/spectra/${flagged.id}/data?axis=nm`, { cookie });
    expect(res.status).toBe(200);
    nm = (await res.json()) as Payload;
    expect(Object.keys(nm.series).sort()).toEqual(["difference", "raw", "reference", "smoothed"]);
    expect(nm.x.length).toBe(nm.points);
    expect(nm.points).toBeGreaterThan(500);
    for (const k of ["raw", "smoothed", "reference", "difference"] as const) {
      expect(nm.series[k]!.length, k).toBe(nm.points);
      expect(typeof nm.series[k]![10], k).toBe("number");
    }
    for (let i = 1; i < nm.x.length; i++) expect(nm.x[i]!).toBeGreaterThan(nm.x[i - 1]!);
    // difference = smoothed − reference, each rounded to 7 significant digits in transit
    for (let i = 0; i < nm.points; i += 25)
      expect(nm.series.difference![i]!).toBeCloseTo(nm.series.smoothed![i]! - nm.series.reference![i]!, 5);
    // the bleach the demo put into this file shows in the difference at the parent's first exciton
    const run = await AnalysisRun.findByPk(nm.runId);
    const bleach = (run!.report as { flags: { kind: string; energyEv: number }[] }).flags.find((f) => f.kind === "bleach")!;
    const k = nm.x.findIndex((x) => x >= HC / bleach.energyEv);
    expect(nm.series.difference![k]!).toBeLessThan(0);
  });

  it("on the energy axis, x = hc/λ (CODATA 2018) and absorbance values are the same numbers in reverse order", async () => {
    const ev = (await (await get(`/api/v1/spectra/${flagged.id}/data?axis=ev`, { cookie })).json()) as Payload;
    expect(ev.points).toBe(nm.points);
    const n = ev.points;
    for (let i = 0; i < n; i += 50) {
      expect(ev.x[i]! * nm.x[n - 1 - i]!).toBeCloseTo(HC, 3);
      expect(ev.series.smoothed![i]).toBe(nm.series.smoothed![n - 1 - i]);
    }
    expect(ev.emission).toBe(false);
  });

  it("converts emission with the Jacobian: I(λ) = I(E)·E²/hc (DOMAIN.md §4, Mooney & Kambhampati 2013)", async () => {
    const [a, b] = await Promise.all(
      ["nm", "ev"].map(async (axis) => (await (await get(`/api/v1/spectra/${pl.id}/data?axis=${axis}`, { cookie })).json()) as Payload),
    );
    expect(a!.emission && b!.emission).toBe(true);
    expect(a!.yLabel).toMatch(/per nm/);
    const n = a!.points;
    for (let i = 5; i < n; i += 20) {
      const e = b!.x[n - 1 - i]!;
      const expected = (b!.series.smoothed![n - 1 - i]! * e * e) / HC;
      expect(a!.series.smoothed![i]! / expected).toBeCloseTo(1, 5);
    }
  });

  it("serves a spectrum without a parent with null reference and difference", async () => {
    const body = (await (await get(`/api/v1/spectra/${parent.id}/data?axis=nm`, { cookie })).json()) as Payload;
    expect(body.series.reference).toBeNull();
    expect(body.series.difference).toBeNull();
    expect(body.series.smoothed!.length).toBe(body.points);
  });

  it("sends the same curves in the binary columns format: X as float64, curves within float32 rounding of the JSON", async () => {
    const res = await get(`/api/v1/spectra/${flagged.id}/data?axis=nm&format=binary`, { cookie });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe(COLUMNS_MEDIA_TYPE);
    const bytes = new Uint8Array(await res.arrayBuffer());
    const json = new TextEncoder().encode(JSON.stringify(nm)).length;
    expect(bytes.length, "smaller than the JSON body").toBeLessThan(0.6 * json);
    const body = payloadFromColumns(decodeColumns(bytes));
    expect(body.points).toBe(nm.points);
    expect(body.runId).toBe(nm.runId);
    for (let i = 0; i < nm.points; i += 37) {
      // JSON rounds X to 9 significant digits (relative error ≤ 5e-9) and curves to 7 (≤ 5e-7);
      // float32 rounds to 24 bits (≤ 2^-24 ≈ 6e-8, IEEE 754): the two may differ by their sum.
      expect(Math.abs(body.x[i]! - nm.x[i]!) / nm.x[i]!).toBeLessThan(1e-8);
      for (const k of ["raw", "smoothed", "reference", "difference"] as const) {
        const a = body.series[k]![i]!,
          b = nm.series[k]![i]!;
        expect(Math.abs(a - b), `${k}[${i}]`).toBeLessThanOrEqual((5e-7 + 6e-8) * Math.max(Math.abs(a), Math.abs(b)) + 1e-15);
      }
    }
    const bad = await get(`/api/v1/spectra/${flagged.id}/data?format=xml`, { cookie });
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: { field: string } }).error.field).toBe("format");
  });

  it("answers repeats from the cache and honours the ETag", async () => {
    const res = await get(`/api/v1/spectra/${flagged.id}/data?axis=nm`, { cookie });
    expect(res.headers.get("x-bandkeep-cache")).toMatch(/memory|redis/);
    const etag = res.headers.get("etag")!;
    expect((await get(`/api/v1/spectra/${flagged.id}/data?axis=nm`, { cookie, "If-None-Match": etag })).status).toBe(304);
  });

  it("for a file that could not be read, answers 422 with the engine's message", async () => {
    const up = await upload(
      lab.token,
      [{ fileName: "broken-export.csv", bytes: new TextEncoder().encode("wavelength (nm),absorbance\nfour hundred,zero\n") }],
      { projectId: lab.project.id, technique: "absorption" },
    );
    const file = up.body.files?.[0];
    expect(file && file.ok).toBe(true);
    const id = (file as { spectrumId: string }).spectrumId;
    const state = await settled(lab.token, id);
    expect(state.spectrum.status).toBe("failed");
    const res = await get(`/api/v1/spectra/${id}/data`, { Authorization: `Bearer ${lab.token}` });
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe("analysis-failed");
    expect(body.error.message).toContain(state.spectrum.error!.slice(0, 20));
  });
});

describe("GET /api/v1/spectra/{id}/export", () => {
  it("format=json is exactly the report the worker stored", async () => {
    const res = await get(`/api/v1/spectra/${flagged.id}/export?format=json`, { cookie });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="cdse-0412-n-abs\.analysis-[0-9a-f]{8}\.json"/);
    const run = await AnalysisRun.findOne({ where: { spectrumId: flagged.id, status: "done" }, order: [["createdAt", "DESC"]] });
    expect(await res.json()).toEqual(run!.report);
  });

  it("format=csv reads back through the project's parser and matches the data endpoint", async () => {
    const res = await get(`/api/v1/spectra/${flagged.id}/export?format=csv&axis=nm`, { cookie });
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    const text = await res.text();
    const parsed = parseSpectrumFile("export.csv", new TextEncoder().encode(text), { column: "absorbance difference" });
    const data = (await (await get(`/api/v1/spectra/${flagged.id}/data?axis=nm`, { cookie })).json()) as Payload;
    expect(parsed.xUnit).toBe("nm");
    expect(parsed.x.length).toBe(data.points);
    for (let i = 0; i < data.points; i += 40) {
      expect(parsed.x[i]).toBeCloseTo(data.x[i]!, 4);
      expect(parsed.y[i]).toBeCloseTo(data.series.difference![i]!, 6);
    }
  });

  it("format=jcamp is JCAMP-DX 4.24 that jcampconverter (independent reader) decodes to the smoothed curve", async () => {
    const res = await get(`/api/v1/spectra/${flagged.id}/export?format=jcamp&axis=cm-1&series=smoothed`, { cookie });
    const text = await res.text();
    expect(text.split("\r\n").slice(0, 2)).toEqual(["##TITLE=cdse-0412-n-abs.csv (smoothed)", "##JCAMP-DX=4.24"]);
    const data = (await (await get(`/api/v1/spectra/${flagged.id}/data?axis=cm-1`, { cookie })).json()) as Payload;
    const decoded = convert(text).flatten[0]!.spectra[0]!.data as unknown as { x: number[]; y: number[] };
    expect(decoded.x.length).toBe(data.points);
    for (let i = 0; i < data.points; i += 40) {
      expect(decoded.x[i]).toBeCloseTo(data.x[i]!, 1);
      expect(decoded.y[i]).toBeCloseTo(data.series.smoothed![i]!, 5);
    }
  });

  it("refuses the difference curve of a spectrum without a parent, naming series", async () => {
    const res = await get(`/api/v1/spectra/${parent.id}/export?format=jcamp&series=difference`, { cookie });
    expect(res.status).toBe(400);
    expect(((await res.json()) as { error: { field: string } }).error.field).toBe("series");
  });
});
