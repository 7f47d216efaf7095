import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { QueryTypes, Sequelize } from "sequelize";
import { auditPageSql, type AuditFilter } from "@/lib/queries/audit";
import { cappedCountSql, countParams } from "@/lib/search/fastCount";
import { encodeCursor } from "@/lib/search/keysetCursor";
import { seedScaleDatabase } from "../../scripts/seed-scale";

// The audit trail's page and count queries (lib/queries/audit.ts, exactly the SQL the app runs),
// EXPLAINed on a scratch database of seed:scale's rows (five audit events per spectrum, ANALYZEd):
// each must reach audit_events through an index, never by reading the whole table. Same method
// as search-plans.test.ts; times are for the bench (npm run bench:scale).

const N = 50_000; // 250,000 audit events
const scratch = `bandkeep_audit_plans_${process.pid}`;
let db: Sequelize;
let groupIds: string[] = [];
let person = "";

type PlanNode = { "Node Type": string; "Relation Name"?: string; "Index Name"?: string; Plans?: PlanNode[] };
function nodes(node: PlanNode, out: PlanNode[] = []): PlanNode[] {
  out.push(node);
  for (const child of node.Plans ?? []) nodes(child, out);
  return out;
}
async function plan(sql: string, replacements: Record<string, unknown>): Promise<PlanNode[]> {
  const rows = await db.query<{ "QUERY PLAN": [{ Plan: PlanNode }] }>(`EXPLAIN (FORMAT JSON) ${sql}`, {
    replacements,
    type: QueryTypes.SELECT,
  });
  return nodes(rows[0]!["QUERY PLAN"][0].Plan);
}
const seqScansOfAudit = (p: PlanNode[]) => p.filter((n) => n["Node Type"] === "Seq Scan" && n["Relation Name"] === "audit_events");
const auditIndexes = (p: PlanNode[]) => [
  ...new Set(p.filter((n) => n["Relation Name"] === "audit_events" && n["Index Name"]).map((n) => n["Index Name"]!)),
];

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
  groupIds = (await db.query<{ id: string }>("SELECT id FROM groups WHERE slug = 'scale-g1'", { type: QueryTypes.SELECT })).map(
    (r) => r.id,
  );
  person = (
    await db.query<{ actor_id: string }>("SELECT actor_id FROM audit_events WHERE group_id = :g AND actor_id IS NOT NULL LIMIT 1", {
      replacements: { g: groupIds[0] },
      type: QueryTypes.SELECT,
    })
  )[0]!.actor_id;
}, 900_000);
afterAll(async () => {
  await db?.close();
  await admin(`DROP DATABASE IF EXISTS ${scratch} WITH (FORCE)`);
});

const deep = () => encodeCursor({ at: "2018-01-01T00:00:00.000000Z", id: "1" });

const FILTERS: Record<string, () => Partial<AuditFilter>> = {
  "first page": () => ({}),
  "deep page": () => ({ after: deep() }),
  "one category (decisions)": () => ({ category: "decision" }),
  "a rare category (holds), deep": () => ({ category: "holds", after: deep() }),
  "one person": () => ({ person }),
  "one person and a category, with dates": () => ({ person, category: "upload", from: "2020-01-01", to: "2022-12-31" }),
  "an exact code": () => ({ action: "exported" }),
};

describe(`audit trail query plans at ${N * 5} events`, () => {
  for (const [name, filter] of Object.entries(FILTERS)) {
    it(`${name}: page and count read audit_events through an index`, async () => {
      const { listSql, count, params } = auditPageSql({ groupIds, personalOf: person }, filter() as AuditFilter, 50);
      const page = await plan(listSql, params);
      expect(seqScansOfAudit(page)).toEqual([]);
      expect(auditIndexes(page).length).toBeGreaterThan(0);
      expect(seqScansOfAudit(await plan(cappedCountSql(count.rowsSql), { ...countParams, ...params }))).toEqual([]);
    });
  }

  it("a category walks the (group, code) ranges of migration 0011", async () => {
    const { listSql, params } = auditPageSql({ groupIds, personalOf: person }, { category: "decision" } as AuditFilter, 50);
    expect(auditIndexes(await plan(listSql, params))).toContain("audit_events_group_action_keyset_idx");
  });

  it("the check can fail: a filter on the details, which no index covers, is caught", async () => {
    expect(
      seqScansOfAudit(await plan("SELECT id FROM audit_events WHERE details->>'reason' = 'x' ORDER BY at DESC LIMIT 5", {})),
    ).toHaveLength(1);
  });
});
