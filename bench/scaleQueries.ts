/**
 * One size of `npm run bench:scale`: runs each main query against the database in DATABASE_URL
 * (filled by seed:scale) and prints one JSON line of p50/p95 per query. Spawned by bench/scale.ts
 * once per size, so each size has its own connection pool and process.
 */
import { loadActor } from "@/lib/auth/actor";
import { closeDb, selectRows } from "@/lib/db";
import { listReviewQueue } from "@/lib/queries/review";
import { getSample, listSamples } from "@/lib/queries/samples";
import { listSpectra } from "@/lib/queries/spectra";
import { listAuditPage } from "@/lib/queries/audit";
import { queueQuerySchema } from "@/lib/review/schemas";
import { encodeCursor } from "@/lib/search/keysetCursor";
import { spectrumSearchSchema } from "@/lib/search/spectrumSearchQuery";
import { previewPolicy, storageOverview } from "@/lib/stewardship/queries";

const RUNS = Number(process.env.BENCH_RUNS ?? 20);
const SLOW_RUNS = Number(process.env.BENCH_SLOW_RUNS ?? 3);

const quantile = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)]!;

async function time(runs: number, fn: () => Promise<unknown>): Promise<{ p50: number; p95: number; runs: number } | { error: string }> {
  try {
    await fn(); // warm the pool, the plan cache and the buffers once
    const ms: number[] = [];
    for (let i = 0; i < runs; i++) {
      const started = performance.now();
      await fn();
      ms.push(performance.now() - started);
    }
    ms.sort((a, b) => a - b);
    return { p50: quantile(ms, 0.5), p95: quantile(ms, 0.95), runs };
  } catch (error) {
    return { error: error instanceof Error ? error.message.slice(0, 120) : String(error) };
  }
}

const who = async (email: string) => {
  const [u] = await selectRows<{ id: string }>("SELECT id FROM users WHERE email = :email", { email });
  if (!u) throw new Error(`${email} is missing: fill this database with npm run seed:scale`);
  return (await loadActor(u.id, "session"))!;
};

const lead = await who("lead@scale-g1.test");
const steward = await who("steward@scale-g1.test");
const [sample] = await selectRows<{ id: string }>(
  "SELECT s.id FROM samples s JOIN groups g ON g.id = s.group_id WHERE g.slug = 'scale-g1' ORDER BY s.created_at LIMIT 1 OFFSET 10",
);
const [project] = await selectRows<{ id: string }>(
  "SELECT p.id FROM projects p JOIN groups g ON g.id = p.group_id WHERE g.slug = 'scale-g1' ORDER BY p.name LIMIT 1",
);
const search = (q: Record<string, string>) => spectrumSearchSchema.parse(q);
const deep = encodeCursor({ at: "2018-01-01T00:00:00.000000Z", id: "ffffffff-ffff-ffff-ffff-ffffffffffff" });

const queueSecondPage = (await listReviewQueue(lead, queueQuerySchema.parse({}))).next ?? undefined;
const samplesSecondPage = (await listSamples(lead)).next ?? undefined;

const cases: [string, number, () => Promise<unknown>][] = [
  ["spectra list, first page", RUNS, () => listSpectra(lead, search({}))],
  ["spectra list, deep page (2018)", RUNS, () => listSpectra(lead, search({ after: deep }))],
  ["text search, rare (sample name)", RUNS, () => listSpectra(lead, search({ q: "QD-CdSe-1005" }))],
  ["text search, common (metadata)", RUNS, () => listSpectra(lead, search({ q: "fibre spectrometer" }))],
  [
    "band search, first exciton 570–590 nm",
    RUNS,
    () => listSpectra(lead, search({ band: "first-exciton", bandMin: "570", bandMax: "590" })),
  ],
  [
    "band + flag: bleach ≥ 20 %, ≥ 5σ, awaiting",
    RUNS,
    () =>
      listSpectra(
        lead,
        search({ band: "first-exciton", bandMin: "570", bandMax: "590", flag: "bleach", flagMin: "0.2", flagSig: "5", review: "awaiting" }),
      ),
  ],
  ["size range 3.0–3.2 nm", RUNS, () => listSpectra(lead, search({ sizeMin: "3.0", sizeMax: "3.2" }))],
  ["review queue, bleach ≥ 5σ", RUNS, () => listReviewQueue(lead, queueQuerySchema.parse({ kind: "bleach", minSignificance: "5" }))],
  ["review queue, awaiting, second page", RUNS, () => listReviewQueue(lead, queueQuerySchema.parse({ after: queueSecondPage }))],
  ["samples list, first page", RUNS, () => listSamples(lead)],
  ["samples list, second page", RUNS, () => listSamples(lead, { after: samplesSecondPage })],
  ["sample detail", RUNS, () => getSample(lead, sample!.id)],
  ["audit trail, first 200", RUNS, () => listAuditPage(steward, {}, 200)],
  ["storage overview", SLOW_RUNS, () => storageOverview(steward)],
  [
    "retention dry-run (one project, raw, 365 d)",
    SLOW_RUNS,
    () => previewPolicy({ projectId: project!.id, dataClass: "raw", keepDays: 365, onExpiry: "delete" }),
  ],
];

const out: Record<string, unknown> = {};
for (const [name, runs, fn] of cases) out[name] = await time(runs, fn);
console.log(JSON.stringify(out));
await closeDb();
