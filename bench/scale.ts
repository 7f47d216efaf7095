/**
 * Scale bench: p50/p95 of the main list and search queries at several table sizes, and the
 * growth from one size to the next.
 *
 * Usage: npm run bench:scale -- [sizes…] [--reseed] (default sizes 10000 100000 1000000)
 * Each size uses the database bandkeep_scale_<n> on the profile's PostgreSQL server, filled by
 * seed:scale when it is missing (or with --reseed). BENCH_RUNS (20) and BENCH_SLOW_RUNS (3, for
 * the storage overview and the retention dry-run) set the repetitions.
 * Targets (docs/benchmarks.md): every list and search p95 < 100 ms at 10⁶ spectra, growth from
 * 10⁵ to 10⁶ < 2×, retention dry-run over 10⁶ < 30 s. The queries run in-process through lib/
 * (no HTTP, no page render).
 */
import { execFileSync } from "node:child_process";
import pg from "pg";
import { scaleDatabaseUrl, seedScaleDatabase } from "../scripts/seed-scale";

const args = process.argv.slice(2);
const sizes = args.filter((a) => /^\d+$/.test(a)).map(Number);
if (sizes.length === 0) sizes.push(10_000, 100_000, 1_000_000);
const reseed = args.includes("--reseed");

async function spectraIn(url: string): Promise<number | null> {
  const client = new pg.Client({ connectionString: url });
  try {
    await client.connect();
    const { rows } = await client.query<{ n: string }>("SELECT count(*) AS n FROM spectra");
    return Number(rows[0]?.n);
  } catch {
    return null;
  } finally {
    await client.end().catch(() => {});
  }
}

type Timing = { p50: number; p95: number; runs: number } | { error: string };
const results = new Map<number, Record<string, Timing>>();
for (const n of sizes) {
  const name = `bandkeep_scale_${n}`;
  const url = scaleDatabaseUrl(name);
  if (reseed || (await spectraIn(url)) !== n) {
    console.error(`seeding ${n} spectra into ${name} …`);
    const started = performance.now();
    await seedScaleDatabase(n, name, (line) => console.error(line));
    console.error(`seeded in ${((performance.now() - started) / 1000).toFixed(0)} s`);
  }
  console.error(`measuring at ${n} spectra …`);
  const out = execFileSync(process.execPath, ["--import", "tsx", "bench/scaleQueries.ts"], {
    env: { ...process.env, DATABASE_URL: url, MIGRATION_DATABASE_URL: url },
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
    maxBuffer: 1 << 20,
  });
  results.set(n, JSON.parse(out.trim().split("\n").pop()!));
}

const names = [...new Set([...results.values()].flatMap((r) => Object.keys(r)))];
const cell = (t: Timing | undefined) => (!t ? "—" : "error" in t ? `error: ${t.error}` : `${t.p50.toFixed(1)} / ${t.p95.toFixed(1)}`);
const header = [
  "query (p50 / p95 ms)",
  ...sizes.map((n) => n.toLocaleString("en-GB")),
  ...(sizes.length > 1 ? [`p95 growth ${sizes.at(-2)!.toLocaleString("en-GB")} → ${sizes.at(-1)!.toLocaleString("en-GB")}`] : []),
];
console.log(`| ${header.join(" | ")} |`);
console.log(`|${header.map(() => "---").join("|")}|`);
for (const name of names) {
  const row = sizes.map((n) => cell(results.get(n)?.[name]));
  if (sizes.length > 1) {
    const a = results.get(sizes.at(-2)!)?.[name];
    const b = results.get(sizes.at(-1)!)?.[name];
    row.push(a && b && !("error" in a) && !("error" in b) ? `${(b.p95 / a.p95).toFixed(2)}×` : "—");
  }
  console.log(`| ${name} | ${row.join(" | ")} |`);
}
