import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { QueryTypes, Sequelize } from "sequelize";
import { reviewQueueSql } from "@/lib/queries/review";
import { samplePageSql } from "@/lib/queries/samples";
import { spectrumListSql } from "@/lib/queries/spectra";
import { queueQuerySchema } from "@/lib/review/schemas";
import { cappedCountSql, countParams } from "@/lib/search/fastCount";
import { encodeCursor, encodeSortedCursor } from "@/lib/search/keysetCursor";
import { spectrumSearchSchema } from "@/lib/search/spectrumSearchQuery";
import { seedScaleDatabase } from "../../scripts/seed-scale";

// Each list query the app runs, EXPLAINed on a scratch database of 10⁵ spectra (seed:scale's rows,
// built with generate_series and ANALYZEd): the plan must reach the big tables through their
// indexes, never by reading a whole table (no Seq Scan node on them). Times are not checked here;
// the bench (npm run bench:scale) measures them.

const N = 100_000;
const BIG_TABLES = new Set(["spectra", "analysis_runs", "peaks", "signatures", "reviews", "audit_events", "samples"]);
const scratch = `bandkeep_plans_${process.pid}`;
let db: Sequelize;
let projectIds: string[] = [];
let groupId = "";

type PlanNode = { "Node Type": string; "Relation Name"?: string; Plans?: PlanNode[] };
function seqScans(node: PlanNode, out: string[] = []): string[] {
  if (node["Node Type"] === "Seq Scan" && node["Relation Name"] && BIG_TABLES.has(node["Relation Name"])) out.push(node["Relation Name"]);
  for (const child of node.Plans ?? []) seqScans(child, out);
  return out;
}
async function plan(sql: string, replacements: Record<string, unknown>): Promise<PlanNode> {
  const rows = await db.query<{ "QUERY PLAN": [{ Plan: PlanNode }] }>(`EXPLAIN (FORMAT JSON) ${sql}`, {
    replacements,
    type: QueryTypes.SELECT,
  });
  return rows[0]!["QUERY PLAN"][0].Plan;
}

async function admin(sql: string) {
  const client = new pg.Client({ connectionString: process.env.ADMIN_DATABASE_URL });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

beforeAll(async () => {
  const url = await seedScaleDatabase(N, scratch, () => {});
  db = new Sequelize(url, { dialect: "postgres", dialectModule: pg, logging: false });
  projectIds = (
    await db.query<{ id: string }>("SELECT p.id FROM projects p JOIN groups g ON g.id = p.group_id WHERE g.slug = 'scale-g1'", {
      type: QueryTypes.SELECT,
    })
  ).map((r) => r.id);
  groupId = (await db.query<{ id: string }>("SELECT id FROM groups WHERE slug = 'scale-g1'", { type: QueryTypes.SELECT }))[0]!.id;
}, 900_000);
afterAll(async () => {
  await db?.close();
  await admin(`DROP DATABASE IF EXISTS ${scratch} WITH (FORCE)`);
});

// a cursor deep in the list: a spectrum stored about eight years ago
const deep = () => encodeCursor({ at: "2018-01-01T00:00:00.000000Z", id: "ffffffff-ffff-ffff-ffff-ffffffffffff" });

const SEARCHES: Record<string, () => Record<string, string>> = {
  "first page": () => ({}),
  "deep page": () => ({ after: deep() }),
  "text search (sample name)": () => ({ q: "QD-CdSe-1005" }),
  "text search (metadata)": () => ({ q: "fibre spectrometer" }),
  "band search, first exciton 570–590 nm": () => ({ band: "first-exciton", bandMin: "570", bandMax: "590" }),
  "band search, IR band in cm⁻¹": () => ({ band: "band", bandMin: "2900", bandMax: "2910", bandUnit: "cm-1" }),
  "emission maximum": () => ({ band: "emission", bandMin: "600", bandMax: "610" }),
  "flag with size and significance, awaiting": () => ({ flag: "bleach", flagMin: "0.2", flagSig: "5", review: "awaiting" }),
  "size range": () => ({ sizeMin: "3.0", sizeMax: "3.2" }),
  "technique, material, uploader and dates": () => ({ technique: "pl", material: "CdSe", from: "2020-01-01", to: "2021-01-01" }),
  "status failed": () => ({ status: "failed" }),
  "one project, deep": () => ({ project: projectIds[3]!, after: deep() }),
};

// deep in the queue: a bleach flag of about 5σ flagged eight years ago
const deepQueue = (value: string) =>
  encodeSortedCursor({ value, at: "2018-01-01T00:00:00.000000Z", id: "ffffffff-ffff-ffff-ffff-ffffffffffff" });
const QUEUES: Record<string, () => Record<string, string>> = {
  "awaiting, by significance (the default)": () => ({}),
  "awaiting, by significance, deep page": () => ({ after: deepQueue("5.5") }),
  "bleach ≥ 5σ": () => ({ kind: "bleach", minSignificance: "5" }),
  "all states by date, oldest first, deep page": () => ({
    state: "all",
    sort: "date",
    dir: "asc",
    after: deepQueue("2018-01-01T00:00:00.000000Z"),
  }),
  "by kind": () => ({ sort: "kind", state: "all" }),
  "one sample": () => ({ sample: "00000000-0000-4000-8000-000000000000", state: "all" }),
};

const SAMPLE_PAGES: Record<string, () => { q?: string; after?: string }> = {
  "first page": () => ({}),
  "deep page": () => ({ after: deep() }),
  "name or material filter": () => ({ q: "PbSe" }),
};

describe(`list query plans at ${N} spectra`, () => {
  for (const [name, query] of Object.entries(SEARCHES)) {
    it(`spectra list: ${name} reads the big tables through indexes`, async () => {
      const search = spectrumSearchSchema.parse(query());
      const { listSql, count, params } = spectrumListSql({ projectIds, seriesIds: [] }, search);
      expect(seqScans(await plan(listSql, params))).toEqual([]);
      expect(seqScans(await plan(cappedCountSql(count.rowsSql), { ...countParams, ...params }))).toEqual([]);
    });
  }

  for (const [name, query] of Object.entries(QUEUES)) {
    it(`review queue: ${name} reads the big tables through indexes`, async () => {
      const { listSql, count, params } = reviewQueueSql([groupId], queueQuerySchema.parse(query()));
      expect(seqScans(await plan(listSql, params))).toEqual([]);
      expect(seqScans(await plan(cappedCountSql(count.rowsSql), { ...countParams, ...params }))).toEqual([]);
    });
  }

  for (const [name, options] of Object.entries(SAMPLE_PAGES)) {
    it(`samples list: ${name} reads samples through their keyset index`, async () => {
      const { listSql, count, params } = samplePageSql([groupId], options());
      expect(seqScans(await plan(listSql, params))).toEqual([]);
      expect(seqScans(await plan(cappedCountSql(count.rowsSql), { ...countParams, ...params }))).toEqual([]);
    });
  }

  it("the check can fail: a filter with no index is caught", async () => {
    const p = await plan("SELECT id FROM spectra WHERE size_bytes = 20001 ORDER BY created_at LIMIT 5", {});
    expect(seqScans(p)).toContain("spectra");
  });
});
