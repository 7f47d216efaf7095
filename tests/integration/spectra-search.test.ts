import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadActor, type Actor } from "@/lib/auth/actor";
import { closeDb, selectRows } from "@/lib/db";
import { listSpectra } from "@/lib/queries/spectra";
import { decodeCursor } from "@/lib/search/keysetCursor";
import { spectrumSearchSchema } from "@/lib/search/spectrumSearchQuery";
import { DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { sessionCookie } from "../helpers/session";
import { createSearchFixture, dropSearchFixture, type SearchFixture } from "./search-fixtures";

// Every filter and band search against rows whose truth this test wrote (search-fixtures.ts):
// the expected sets below follow from those rows, E = hc/λ (CODATA 2018) and the rule that only
// a spectrum's newest finished analysis counts. Real PostgreSQL, no mocks. The HTTP part asks
// the running app's GET /api/v1/spectra (status codes as RFC 9110 defines them).

let fixture: SearchFixture;
let lead: Actor;
let otherGroup: Actor;
const keyOf = (id: string) => Object.entries(fixture.ids).find(([, v]) => v === id)?.[0] ?? `other:${id}`;

async function found(query: Record<string, string>, actor: Actor = lead): Promise<string[]> {
  const search = spectrumSearchSchema.parse({ project: fixture.projectId, limit: "200", ...query });
  const page = await listSpectra(actor, search);
  return (page?.rows ?? []).map((r) => keyOf(r.id)).sort();
}

beforeAll(async () => {
  fixture = await createSearchFixture(String(process.pid));
  lead = (await loadActor(fixture.leadId, "session"))!;
  const [other] = await selectRows<{ id: string }>("SELECT id FROM users WHERE email = :e", { e: DEMO.otherGroup });
  otherGroup = (await loadActor(other!.id, "session"))!;
});
afterAll(async () => {
  if (fixture) await dropSearchFixture(fixture);
  await closeDb();
});

describe("spectra search filters (known rows)", () => {
  it("project alone lists every fixture spectrum, newest first with the id breaking ties", async () => {
    const page = (await listSpectra(lead, spectrumSearchSchema.parse({ project: fixture.projectId })))!;
    expect(page.rows.map((r) => keyOf(r.id))).toHaveLength(7);
    expect(page.count).toEqual({ value: 7, exact: true });
    const times = page.rows.map((r) => r.createdAt);
    expect([...times].sort().reverse()).toEqual(times);
    // i1 and a4 share a timestamp: the larger id comes first
    const tied = page.rows.filter((r) => r.createdAt === "2026-03-09T10:00:00.000Z").map((r) => r.id);
    expect(tied).toEqual([...tied].sort().reverse());
  });

  it("technique, sample, material, uploader, status and date range", async () => {
    expect(await found({ technique: "pl" })).toEqual(["p1"]);
    expect(await found({ technique: "ir" })).toEqual(["i1"]);
    expect(await found({ sample: fixture.sampleIds.pbs })).toEqual(["a3", "i1"]);
    expect(await found({ material: "cdse" })).toEqual(["a1", "a2", "a4", "p1"]);
    // i1 has no material of its own: its sample's (PbS) applies
    expect(await found({ material: "PbS" })).toEqual(["a3", "i1"]);
    expect(await found({ uploader: fixture.spectroscopistId })).toEqual(["f1"]);
    expect(await found({ status: "failed" })).toEqual(["a4", "f1"]);
    expect(await found({ from: "2026-03-06", to: "2026-03-07" })).toEqual(["a2", "a3"]);
    expect(await found({ to: "2025-12-31" })).toEqual(["f1"]);
  });

  it("free text over file names, metadata, sample names and sample notes", async () => {
    expect(await found({ q: "glovebox" })).toEqual(["a1"]); // metadata value
    expect(await found({ q: "oleic" })).toEqual(["a1", "a2", "a4", "p1"]); // sample notes
    expect(await found({ q: "broken-EXPORT" })).toEqual(["f1"]); // file name, any case
    expect(await found({ q: `PbS-7-${process.pid}` })).toEqual(["a3", "i1"]); // sample name
    expect(await found({ q: "100%" })).toEqual([]); // % is a character, not a wildcard
    expect(await found({ q: "cdse_a" })).toEqual([]); // _ is a character too (the names have cdse-a)
  });

  it("first exciton in a range, the same in nm, eV and cm⁻¹; a superseded analysis does not count", async () => {
    // a1 580 nm; a2 600 nm now (575 nm before); a4's 585 nm is from a failed analysis
    expect(await found({ band: "first-exciton", bandMin: "570", bandMax: "590" })).toEqual(["a1"]);
    // 570–590 nm is 2.1014–2.1752 eV and 16 949–17 544 cm⁻¹ (hc = 1239.841984 eV·nm)
    expect(await found({ band: "first-exciton", bandMin: "2.1014", bandMax: "2.1752", bandUnit: "eV" })).toEqual(["a1"]);
    expect(await found({ band: "first-exciton", bandMin: "16949", bandMax: "17544", bandUnit: "cm-1" })).toEqual(["a1"]);
    expect(await found({ band: "first-exciton", bandMin: "590", bandMax: "610" })).toEqual(["a2"]);
    expect(await found({ band: "first-exciton", bandMin: "1250", bandMax: "1350" })).toEqual(["a3"]);
  });

  it("emission maximum versus any band; IR bands in cm⁻¹", async () => {
    expect(await found({ band: "emission", bandMin: "590", bandMax: "600" })).toEqual(["p1"]);
    expect(await found({ band: "emission", bandMin: "555", bandMax: "565" })).toEqual([]); // 560 nm is not the maximum
    expect(await found({ band: "band", bandMin: "555", bandMax: "565" })).toEqual(["p1"]);
    expect(await found({ band: "band", bandMin: "2900", bandMax: "2950", bandUnit: "cm-1" })).toEqual(["i1"]);
    expect(await found({ band: "band", bandMin: "1650", bandMax: "1690", bandUnit: "cm-1" })).toEqual([]); // the C=O band is at 1710
  });

  it("flags by kind, size, significance and review state, on the newest analysis only", async () => {
    expect(await found({ flag: "bleach" })).toEqual(["a1", "a2", "a3"]);
    // bleached more than 20 %: a1 (25 %) and a3 (30 %); a2's 40 % belongs to a superseded analysis
    expect(await found({ flag: "bleach", flagMin: "0.2" })).toEqual(["a1", "a3"]);
    expect(await found({ flag: "bleach", flagMin: "0.2", flagSig: "5" })).toEqual(["a1"]); // a3 is only 2σ
    expect(await found({ flag: "bleach", review: "confirmed" })).toEqual(["a2"]);
    expect(await found({ review: "awaiting" })).toEqual(["a1", "a3", "p1"]);
    expect(await found({ flag: "shift" })).toEqual([]);
  });

  it("size range from the sizing curves, and filters combined", async () => {
    expect(await found({ sizeMin: "3.8", sizeMax: "4.5" })).toEqual(["a2", "a3"]); // a2 is 4.2 now (3.5 before)
    expect(await found({ sizeMax: "3.55" })).toEqual([]);
    expect(
      await found({ material: "CdSe", band: "first-exciton", bandMin: "570", bandMax: "590", flag: "bleach", flagMin: "0.2" }),
    ).toEqual(["a1"]);
  });

  it("the latest-analysis summary follows the runs: a deleted newest run brings the earlier one back, a new one replaces it", async () => {
    // migrations/0012's triggers: deleting a2's 600 nm run (as the retention sweep of processed data does) leaves the 575 nm run newest
    await selectRows("DELETE FROM analysis_runs WHERE spectrum_id = :s AND created_at = '2026-03-06T11:00:00Z' RETURNING id", {
      s: fixture.ids.a2,
    });
    expect(await found({ band: "first-exciton", bandMin: "570", bandMax: "590" })).toEqual(["a1", "a2"]);
    expect(await found({ sizeMin: "3.4", sizeMax: "3.55" })).toEqual(["a2"]); // 3.5 nm came back with it
    expect(await found({ flag: "bleach", flagMin: "0.2", flagSig: "5" })).toEqual(["a1", "a2"]); // its 40 %, 20σ flag counts again
    // a newer analysis that is still running changes nothing; once it is done its 610 nm counts
    const [run] = await selectRows<{ id: string }>(
      `INSERT INTO analysis_runs (spectrum_id, engine_version, parameter_hash, status, report, created_at)
       VALUES (:s, 'fixture', md5(random()::text) || md5(random()::text), 'running', '{"derived":{"diameterNm":4.6}}', '2026-03-06T12:00:00Z') RETURNING id`,
      { s: fixture.ids.a2 },
    );
    await selectRows(
      "INSERT INTO peaks (run_id, energy_ev, wavelength_nm, height, is_first_exciton) VALUES (:r, :ev, 610, 0.5, true) RETURNING id",
      { r: run!.id, ev: 1239.841984 / 610 },
    );
    expect(await found({ band: "first-exciton", bandMin: "570", bandMax: "590" })).toEqual(["a1", "a2"]);
    await selectRows("UPDATE analysis_runs SET status = 'done' WHERE id = :r RETURNING id", { r: run!.id });
    expect(await found({ band: "first-exciton", bandMin: "570", bandMax: "590" })).toEqual(["a1"]);
    expect(await found({ band: "first-exciton", bandMin: "605", bandMax: "615" })).toEqual(["a2"]);
    expect(await found({ sizeMin: "4.5", sizeMax: "4.7" })).toEqual(["a2"]);
    expect(await found({ flag: "bleach", flagMin: "0.2", flagSig: "5" })).toEqual(["a1"]); // the new run raised no flag
  });

  it("every analysed spectrum's summary agrees with its newest finished run, worker-written ones included", async () => {
    // computed here from analysis_runs and peaks directly, independently of refresh_spectrum_summaries
    const disagree = await selectRows<{ id: string }>(
      `SELECT s.id FROM spectra s
         LEFT JOIN LATERAL (SELECT r.id, r.report FROM analysis_runs r WHERE r.spectrum_id = s.id AND r.status = 'done'
                             ORDER BY r.created_at DESC, r.id DESC LIMIT 1) lr ON TRUE
        WHERE s.latest_run_id IS DISTINCT FROM lr.id
           OR s.first_exciton_ev IS DISTINCT FROM (SELECT max(k.energy_ev) FROM peaks k WHERE k.run_id = lr.id AND k.is_first_exciton)
           OR s.diameter_nm IS DISTINCT FROM (lr.report->'derived'->>'diameterNm')::float8
           OR (s.technique = 'pl' AND s.emission_ev IS DISTINCT FROM
                (SELECT k.energy_ev FROM peaks k WHERE k.run_id = lr.id ORDER BY k.height DESC LIMIT 1))
           OR (s.technique <> 'pl' AND s.emission_ev IS NOT NULL)`,
      {},
    );
    expect(disagree).toEqual([]);
    // the demo's spectra were analysed by the running worker: at least one of them has a first exciton on its row
    const [analysed] = await selectRows<{ n: string }>(
      "SELECT count(*) AS n FROM spectra s JOIN projects p ON p.id = s.project_id WHERE s.first_exciton_ev IS NOT NULL AND p.id <> :p",
      { p: fixture.projectId },
    );
    expect(Number(analysed!.n)).toBeGreaterThan(0);
  });

  it("keyset pages cover every row once, in order", async () => {
    const seen: string[] = [];
    let after: string | undefined;
    for (let i = 0; i < 5; i++) {
      const page = (await listSpectra(
        lead,
        spectrumSearchSchema.parse({ project: fixture.projectId, limit: "3", ...(after ? { after } : {}) }),
      ))!;
      seen.push(...page.rows.map((r) => r.id));
      if (!page.next) break;
      expect(decodeCursor(page.next)).not.toBeNull();
      after = page.next;
    }
    expect(seen).toHaveLength(7);
    expect(new Set(seen).size).toBe(7);
    const all = (await listSpectra(lead, spectrumSearchSchema.parse({ project: fixture.projectId })))!;
    expect(seen).toEqual(all.rows.map((r) => r.id));
  });

  it("another group's person finds none of these rows", async () => {
    const page = await listSpectra(otherGroup, spectrumSearchSchema.parse({ q: `PbS-7-${process.pid}` }));
    expect(page?.rows).toEqual([]);
    // naming the project is answered as not found, not as an empty list
    expect(await listSpectra(otherGroup, spectrumSearchSchema.parse({ project: fixture.projectId }))).toBeNull();
  });

  it("bad input is refused naming the field", () => {
    const issue = (q: Record<string, string>) => spectrumSearchSchema.safeParse(q).error?.issues[0];
    expect(issue({ bandMin: "570", bandMax: "590" })?.path).toEqual(["band"]);
    expect(issue({ band: "first-exciton", bandMin: "570" })?.path).toEqual(["bandMin"]);
    expect(issue({ band: "first-exciton", bandMin: "-1", bandMax: "5" })?.path).toEqual(["bandMin"]);
    expect(issue({ technique: "raman" })?.message).toMatch(/technique must be one of/);
    expect(issue({ after: "not-a-cursor" })?.path).toEqual(["after"]);
    expect(issue({ from: "2026-13-01" })?.path).toEqual(["from"]);
  });
});

describe("GET /api/v1/spectra", () => {
  let cookie = "";
  beforeAll(async () => {
    cookie = await sessionCookie(DEMO.lead, DEMO_PASSWORD);
  });
  const get = (query: string, who = cookie) => fetch(url(`/api/v1/spectra?${query}`), { headers: { cookie: who } });

  it("answers the band search with the same rows and a next link that pages on", async () => {
    const res = await get(`project=${fixture.projectId}&band=first-exciton&bandMin=570&bandMax=590`);
    expect(res.status).toBe(200);
    const body = (await res.json()) as {
      items: { id: string; firstExcitonNm: number; url: string }[];
      count: { value: number; exact: boolean };
      next: string | null;
    };
    expect(body.items.map((i) => i.id)).toEqual([fixture.ids.a1]);
    expect(body.items[0]!.firstExcitonNm).toBeCloseTo(580, 6);
    expect(body.count).toEqual({ value: 1, exact: true });
    expect(body.next).toBeNull();

    const first = (await (await get(`project=${fixture.projectId}&limit=4`)).json()) as { items: { id: string }[]; nextUrl: string };
    expect(first.items).toHaveLength(4);
    const second = (await (await fetch(url(first.nextUrl), { headers: { cookie } })).json()) as {
      items: { id: string }[];
      nextUrl: string | null;
    };
    expect(second.items).toHaveLength(3);
    expect(second.nextUrl).toBeNull();
    expect(new Set([...first.items, ...second.items].map((i) => i.id)).size).toBe(7);
  });

  it("refuses a bad filter with 400 naming it, and an anonymous caller with 401", async () => {
    const res = await get("band=first-exciton&bandMin=570&bandMax=abc");
    expect(res.status).toBe(400);
    const body = (await res.json()) as { error: { code: string; field: string; message: string } };
    expect(body.error.field).toBe("bandMax");
    expect((await fetch(url("/api/v1/spectra"))).status).toBe(401);
  });
});
