import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { absorptionCsv, emissionCsv, leadChalcogenideCsv, supernatantCsv } from "@/lib/demo/synthetic";
import { depletionComposition } from "@/lib/fits/depletionComposition";
import { overlapFromPure, rowsFromReadings } from "@/lib/series/depletionRows";
import type { SupernatantReadings } from "@/lib/series/supernatantSchemas";
import { getJson, upload } from "../helpers/api";
import { APP_ORIGIN, DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { demoIds } from "../helpers/demo-ids";
import { addMember, appUrl, createLab, createSeries, type Lab } from "../helpers/fixtures";
import { sessionCookie } from "../helpers/session";
import { enc } from "../helpers/spectra";

// Supernatant depletion end to end on the real stack: supernatant absorption spectra with known
// absorbances are uploaded through the API, linked to the points of a titration, read back by
// GET /api/v1/series/{id}/supernatants, and turned into bound ratios that must match the
// composition the files were made from. HTTP status codes as RFC 9110 defines them.

const HC = 1239.841984; // eV·nm, CODATA 2018
// Extinction coefficients written out from the papers' formulas (DOMAIN.md §3 check values):
const EPS_CDSE_550 = 1.115e5; // Yu 2003: CdSe first exciton at 550 nm → D 3.040 nm, ε = 5857·D^2.65
const PBS_EXCITON_EV = 1.3395; // Moreels 2009: E₀ of d = 3 nm PbS
const EPS_PBS_400 = 0.0233 * 3 ** 3 * 1e6; // Moreels 2009: ε₄₀₀ = 0.0233·d³ µM⁻¹cm⁻¹ at d = 3 nm, in M⁻¹cm⁻¹

// An invented 2:1 product (two X per A), 0.5 µM of A in every mixture, feed X:A from 0.5 to 4:
// below 2 equivalents all X binds with half as much A, above it all A binds with twice as much X.
const ADDED_A = 0.5;
const design = [0.5, 1, 3, 4].map((feed) => {
  const addedX = feed * ADDED_A;
  const boundA = Math.min(ADDED_A, addedX / 2);
  const leftA = ADDED_A - boundA,
    leftX = addedX - 2 * boundA;
  // Beer–Lambert, l = 1 cm: A's absorbance at its 550 nm exciton, X's at 400 nm.
  return { feed, leftA, leftX, a: leftA * 1e-6 * EPS_CDSE_550, x: leftX * 1e-6 * EPS_PBS_400 };
});

/** The absorbance a CSV states on its line for one wavelength (the file's own number). */
function lineValue(text: string, nm: number): number {
  const line = text.split("\r\n").find((l) => l.startsWith(`${nm.toFixed(1)},`) || l.startsWith(`${nm},`));
  if (!line) throw new Error(`no line for ${nm} nm`);
  return Number(line.split(",")[1]);
}

let lab: Lab;
let steward: Awaited<ReturnType<typeof addMember>>;
let stranger: Lab;
let seriesId: string;
const points: string[] = [];
const supernatants: { id: string; text: string }[] = [];
const pure = { a: { id: "", text: "" }, x: { id: "", text: "" } };

async function uploadOne(token: string, fileName: string, text: string, fields: Record<string, string>): Promise<string> {
  const { status, body } = await upload(token, [{ fileName, bytes: enc(text) }], fields);
  const file = body.files?.[0];
  if (status !== 201 || !file?.ok) throw new Error(`upload of ${fileName} answered ${status}: ${JSON.stringify(body)}`);
  return file.spectrumId;
}

async function link(token: string, supernatantSpectrumId: string, pointSpectrumId: string | null, series = seriesId) {
  const res = await fetch(appUrl(`/api/v1/series/${series}/supernatants`), {
    method: "POST",
    headers: { Authorization: `Bearer ${token}`, "content-type": "application/json" },
    body: JSON.stringify({ supernatantSpectrumId, pointSpectrumId }),
  });
  return {
    status: res.status,
    body: (await res.json()) as { changed?: boolean; error?: { code: string; message: string; field?: string } },
  };
}

const readingsPath = (extra = "") => `/api/v1/series/${seriesId}/supernatants?nmA=550&nmX=400${extra}`;

beforeAll(async () => {
  lab = await createLab("spectroscopist");
  steward = await addMember(lab, "steward");
  stranger = await createLab("spectroscopist");
  seriesId = (await createSeries(lab)).id;
  const base = { projectId: lab.project.id, technique: "absorption", pathLengthCm: "1" };
  for (const d of design) {
    // The mixture itself: any absorption spectrum, here the A-like dots with a bleach.
    points.push(
      await uploadOne(
        lab.token,
        `mixture-${d.feed}.csv`,
        absorptionCsv({ firstExcitonEv: HC / 550, bleach: 0.1 * d.feed, seed: 700 + d.feed * 10 }, `mixture ${d.feed}`),
        { ...base, seriesId, seriesValue: String(d.feed) },
      ),
    );
    const text = supernatantCsv(
      {
        cdse: { firstExcitonEv: HC / 550, atNm: 550, absorbance: d.a },
        pbs: { firstExcitonEv: PBS_EXCITON_EV, atNm: 400, absorbance: d.x },
        noise: 0,
      },
      `supernatant ${d.feed}`,
    );
    supernatants.push({ id: await uploadOne(lab.token, `supernatant-${d.feed}.csv`, text, base), text });
  }
  pure.a.text = absorptionCsv({ firstExcitonEv: HC / 550, noise: 0 }, "pure A");
  pure.a.id = await uploadOne(lab.token, "pure-a.csv", pure.a.text, base);
  pure.x.text = leadChalcogenideCsv({ firstExcitonEv: PBS_EXCITON_EV, noise: 0 }, "pure X");
  pure.x.id = await uploadOne(lab.token, "pure-x.csv", pure.x.text, base);
});
afterAll(closeDb);

describe("supernatant spectra of a titration", () => {
  it("lists the points with no supernatant before anything is linked", async () => {
    const { status, body } = await getJson<SupernatantReadings>(lab.token, readingsPath());
    expect(status).toBe(200);
    expect(body.points.map((p) => p.spectrumId)).toEqual(points); // in order of the series value
    expect(body.points.every((p) => p.supernatant === null)).toBe(true);
  });

  it("links each supernatant to its point, once", async () => {
    for (const [i, s] of supernatants.entries()) {
      const r = await link(lab.token, s.id, points[i]!);
      expect(r.status, `link ${i}`).toBe(200);
      expect(r.body.changed).toBe(true);
    }
    const again = await link(lab.token, supernatants[0]!.id, points[0]!);
    expect(again.status).toBe(200);
    expect(again.body.changed).toBe(false);
    const audit = await selectRows<{ action: string }>(
      `SELECT action FROM audit_events WHERE target_id = :id AND action LIKE 'supernatant-%'`,
      { id: supernatants[0]!.id },
    );
    expect(audit.map((a) => a.action)).toEqual(["supernatant-linked"]); // linking again changed nothing and recorded nothing
  });

  it("reads every linked supernatant and the pure spectra at both wavelengths, exactly as the files state", async () => {
    const { status, body } = await getJson<SupernatantReadings>(lab.token, readingsPath(`&pureA=${pure.a.id}&pureX=${pure.x.id}`));
    expect(status).toBe(200);
    expect(body.wavelengthsNm).toEqual({ a: 550, x: 400 });
    body.points.forEach((p, i) => {
      expect(p.supernatant?.spectrumId).toBe(supernatants[i]!.id);
      expect(p.supernatant?.error).toBeNull();
      expect(p.supernatant?.atA).toBe(lineValue(supernatants[i]!.text, 550)); // the file's own number at a recorded wavelength
      expect(p.supernatant?.atX).toBe(lineValue(supernatants[i]!.text, 400));
      expect(p.supernatant?.pathLengthCm).toBe(1);
    });
    expect(body.pureA?.atA).toBe(lineValue(pure.a.text, 550));
    expect(body.pureA?.atX).toBe(lineValue(pure.a.text, 400));
    expect(body.pureX?.atA).toBe(lineValue(pure.x.text, 550));
    expect(body.pureX?.atX).toBe(lineValue(pure.x.text, 400));
  });

  it("gives back the 2:1 composition the supernatants were made from (Beer–Lambert with Yu 2003 and Moreels 2009 ε)", async () => {
    const { body } = await getJson<SupernatantReadings>(lab.token, readingsPath(`&pureA=${pure.a.id}&pureX=${pure.x.id}`));
    const rows = rowsFromReadings(body, "feed-ratio", ADDED_A, "added acceptor");
    expect(rows.errors).toEqual([]);
    const overlap = overlapFromPure(body.pureA, body.pureX);
    expect(overlap.errors).toEqual([]);
    const out = depletionComposition(rows.rows, {
      dotA: { material: "CdSe", firstExcitonNm: 550 },
      dotX: { material: "PbS", firstExcitonNm: HC / PBS_EXCITON_EV },
      pathLengthCm: 1,
      overlap: overlap.ratios,
    });
    design.forEach((d, i) => {
      // Each dot's share of the mixed absorbance is the one the file was made with (files keep 5 decimals).
      expect(Math.abs(out.separated[i]!.a - d.a), `A's share at feed ${d.feed}`).toBeLessThan(2e-4);
      expect(Math.abs(out.separated[i]!.x - d.x), `X's share at feed ${d.feed}`).toBeLessThan(2e-4);
      // Left in solution, µM: Beer–Lambert c = A/(ε·l); the app's ε agrees with the papers' to 5e-4.
      expect(Math.abs(out.result.rows[i]!.leftA - d.leftA), `left A at feed ${d.feed}`).toBeLessThan(3e-3);
      expect(Math.abs(out.result.rows[i]!.leftX - d.leftX), `left X at feed ${d.feed}`).toBeLessThan(3e-3);
      expect(Math.abs(out.result.rows[i]!.boundRatio! - 2), `bound X:A at feed ${d.feed}`).toBeLessThan(0.02); // made as a 2:1 product
    });
    expect(out.result.feedFoldChange).toBeCloseTo(8, 12); // 4 / 0.5
    expect(out.result.constant).toBe(true);
    // Without the overlap correction X's share at 400 nm includes A's: the composition comes out wrong.
    const naive = depletionComposition(rows.rows, {
      dotA: { material: "CdSe", firstExcitonNm: 550 },
      dotX: { material: "PbS", firstExcitonNm: HC / PBS_EXCITON_EV },
      pathLengthCm: 1,
    });
    expect(naive.result.constant).toBe(false);
  });

  it("names the file of a supernatant that does not reach a wavelength, and the field of a bad query", async () => {
    const far = await getJson<SupernatantReadings>(lab.token, `/api/v1/series/${seriesId}/supernatants?nmA=800&nmX=400`);
    expect(far.status).toBe(200);
    expect(far.body.points[0]!.supernatant!.error).toBe("supernatant-0.5.csv: 800 nm is outside the recorded range 400–750 nm");
    expect(far.body.points[0]!.supernatant!.atA).toBeNull();
    const bad = await getJson<{ error: { field: string; message: string } }>(
      lab.token,
      `/api/v1/series/${seriesId}/supernatants?nmA=blue&nmX=400`,
    );
    expect(bad.status).toBe(400);
    expect(bad.body.error).toMatchObject({ field: "nmA", message: "nmA: give a wavelength in nm" });
    const missing = await getJson<{ error: { field: string } }>(lab.token, `/api/v1/series/${seriesId}/supernatants?nmA=550`);
    expect(missing.status).toBe(400);
    expect(missing.body.error.field).toBe("nmX");
    const foreign = await getJson<{ error: { field: string } }>(lab.token, readingsPath(`&pureX=${await strangerSpectrum()}`));
    expect(foreign.status).toBe(404);
    expect(foreign.body.error.field).toBe("pureX");
  });

  it("refuses links that break the rules, naming the field", async () => {
    const pl = await uploadOne(lab.token, "pl.csv", emissionCsv({ peakEv: 2.2, intensity: 1000, seed: 9 }, "pl"), {
      projectId: lab.project.id,
      technique: "pl",
    });
    const extra = await uploadOne(
      lab.token,
      "extra-supernatant.csv",
      supernatantCsv(
        {
          cdse: { firstExcitonEv: HC / 550, atNm: 550, absorbance: 0.01 },
          pbs: { firstExcitonEv: PBS_EXCITON_EV, atNm: 400, absorbance: 0.02 },
          noise: 0,
        },
        "extra",
      ),
      { projectId: lab.project.id, technique: "absorption" },
    );
    const cases: [string, string, number, string, RegExp][] = [
      ["an emission spectrum", pl, 400, "supernatantSpectrumId", /is a pl spectrum; a supernatant must be an absorption spectrum/],
      ["a point of the series", points[1]!, 400, "supernatantSpectrumId", /is itself a point of a series/],
      ["a point that has one", extra, 409, "pointSpectrumId", /already has supernatant-0\.5\.csv as its supernatant/],
    ];
    for (const [what, id, status, field, message] of cases) {
      const r = await link(lab.token, id, points[0]!);
      expect(r.status, what).toBe(status);
      expect(r.body.error?.field, what).toBe(field);
      expect(r.body.error?.message, what).toMatch(message);
    }
    const notAPoint = await link(lab.token, extra, pure.a.id);
    expect(notAPoint.status).toBe(404);
    expect(notAPoint.body.error?.field).toBe("pointSpectrumId");
    const badId = await link(lab.token, "not-an-id", points[0]!);
    expect(badId.status).toBe(400);
    expect(badId.body.error?.field).toBe("supernatantSpectrumId");
    const form = await fetch(appUrl(`/api/v1/series/${seriesId}/supernatants`), {
      method: "POST",
      headers: { Authorization: `Bearer ${lab.token}` },
      body: new FormData(),
    });
    expect(form.status).toBe(415);
  });

  it("lets a steward of the group read but not link, and answers another group with 404", async () => {
    expect((await getJson(steward.token, readingsPath())).status).toBe(200);
    const r = await link(steward.token, supernatants[0]!.id, null);
    expect(r.status).toBe(403);
    expect((await getJson(stranger.token, readingsPath())).status).toBe(404);
    expect((await link(stranger.token, supernatants[0]!.id, null)).status).toBe(404);
  });

  it("unlinks a supernatant with an audit event, leaving the spectrum stored", async () => {
    const r = await link(lab.token, supernatants[3]!.id, null);
    expect(r.status).toBe(200);
    expect(r.body.changed).toBe(true);
    const { body } = await getJson<SupernatantReadings>(lab.token, readingsPath());
    expect(body.points[3]!.supernatant).toBeNull();
    expect(body.points.filter((p) => p.supernatant).length).toBe(3);
    expect((await getJson(lab.token, `/api/v1/spectra/${supernatants[3]!.id}`)).status).toBe(200);
    const audit = await selectRows<{ action: string; details: { pointSpectrumId: string | null; previousPointSpectrumId: string | null } }>(
      `SELECT action, details FROM audit_events WHERE target_id = :id AND action LIKE 'supernatant-%' ORDER BY id`,
      { id: supernatants[3]!.id },
    );
    expect(audit.map((a) => a.action)).toEqual(["supernatant-linked", "supernatant-unlinked"]);
    expect(audit[1]!.details).toMatchObject({ pointSpectrumId: null, previousPointSpectrumId: points[3] });
  });
});

describe("the demo titration's supernatants and the collaborator it is shared with", () => {
  let ids: Awaited<ReturnType<typeof demoIds>>;
  const cookies: Record<string, string> = {};
  beforeAll(async () => {
    ids = await demoIds();
    cookies.collaborator = await sessionCookie(DEMO.collaborator, DEMO_PASSWORD);
    cookies.otherGroup = await sessionCookie(DEMO.otherGroup, DEMO_PASSWORD);
  });

  it("shows the collaborator every point's supernatant and lets them open it, but nobody outside the group", async () => {
    const res = await fetch(url(`/api/v1/series/${ids.sharedSeries.id}/supernatants?nmA=577.2&nmX=400`), {
      headers: { cookie: cookies.collaborator! },
    });
    expect(res.status).toBe(200);
    const body = (await res.json()) as SupernatantReadings;
    const linked = body.points.filter((p) => p.supernatant);
    expect(linked.length).toBe(6); // scripts/seed.ts links one to each of the six points
    const one = linked[0]!.supernatant!.spectrumId;
    expect((await fetch(url(`/api/v1/spectra/${one}`), { headers: { cookie: cookies.collaborator! } })).status).toBe(200);
    expect((await fetch(url(`/api/v1/spectra/${one}/raw`), { headers: { cookie: cookies.collaborator! } })).status).toBe(200);
    expect((await fetch(url(`/api/v1/spectra/${one}`), { headers: { cookie: cookies.otherGroup! } })).status).toBe(404);
    const link = await fetch(url(`/api/v1/series/${ids.sharedSeries.id}/supernatants`), {
      method: "POST",
      headers: { cookie: cookies.collaborator!, origin: APP_ORIGIN, "content-type": "application/json" },
      body: JSON.stringify({ supernatantSpectrumId: one, pointSpectrumId: null }),
    });
    expect(link.status).toBe(403); // read-only collaborator
  });
});

async function strangerSpectrum(): Promise<string> {
  return uploadOne(stranger.token, "stranger.csv", absorptionCsv({ firstExcitonEv: 2.2, seed: 5 }, "stranger"), {
    projectId: stranger.project.id,
    technique: "absorption",
  });
}
