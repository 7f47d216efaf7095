import { execFileSync } from "node:child_process";
import bcrypt from "bcryptjs";
import pg from "pg";
import { SCALE_PASSWORD, scaleSeedSql } from "./scale/scaleSeedSql";

// npm run seed:scale -- --spectra N [--database NAME]
// Makes (or remakes) a separate database on the configured PostgreSQL server, migrates it and
// fills it with N spectra (scripts/scale/scaleSeedSql.ts). The app's own database is untouched.

function arg(name: string, fallback: string): string {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 && process.argv[i + 1] ? process.argv[i + 1]! : fallback;
}

export function scaleDatabaseUrl(name: string): string {
  const url = new URL(process.env.ADMIN_DATABASE_URL ?? "postgres://postgres@127.0.0.1:54329/bandkeep");
  url.pathname = `/${name}`;
  return url.toString();
}

export async function seedScaleDatabase(n: number, name: string, log: (line: string) => void = console.log): Promise<string> {
  if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`--database must be lower-case letters, digits and _: ${name}`);
  const admin = new pg.Client({ connectionString: process.env.ADMIN_DATABASE_URL ?? "postgres://postgres@127.0.0.1:54329/bandkeep" });
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    await admin.query(`CREATE DATABASE ${name}`);
  } finally {
    await admin.end();
  }
  const url = scaleDatabaseUrl(name);
  execFileSync(process.execPath, ["--import", "tsx", "scripts/migrate.ts", "up"], {
    env: { ...process.env, DATABASE_URL: url, MIGRATION_DATABASE_URL: url },
    stdio: "ignore",
  });
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query("SET maintenance_work_mem = '256MB'");
    // the rows are consistent by construction: skip the per-row foreign-key triggers while loading (needs a superuser, as the test server's is)
    await client.query("SET session_replication_role = replica");
    // Secondary indexes are built once over the loaded rows (much faster than row by row), then
    // the same definitions the migrations wrote are restored.
    const { rows: indexes } = await client.query<{ name: string; def: string; table: string }>(
      `SELECT i.indexname AS name, i.indexdef AS def, i.tablename AS table FROM pg_indexes i
       WHERE i.schemaname = 'public' AND i.tablename IN ('spectra', 'analysis_runs', 'peaks', 'signatures', 'reviews', 'audit_events', 'samples')
         AND NOT EXISTS (SELECT 1 FROM pg_constraint c WHERE c.conname = i.indexname)`,
    );
    for (const index of indexes) await client.query(`DROP INDEX ${index.name}`);
    const timed = async (label: string, sql: string) => {
      const started = performance.now();
      await client.query(sql);
      log(`  ${label} … ${((performance.now() - started) / 1000).toFixed(1)} s`);
    };
    const statements = scaleSeedSql(n, bcrypt.hashSync(SCALE_PASSWORD, 10));
    for (const sql of statements.slice(0, -1)) await timed(sql.trim().split(/\s+/).slice(0, 3).join(" "), sql);
    // The latest-analysis summary on each spectrum (migrations/0012) is written by the same
    // function the triggers call (they do not fire in replica mode): after the runs' and peaks'
    // indexes are back, before the spectra's, so the update does not maintain them row by row.
    const spectraIndexes = indexes.filter((i) => i.table === "spectra");
    const otherIndexes = indexes.filter((i) => i.table !== "spectra");
    await timed(`${otherIndexes.length} secondary indexes`, otherIndexes.map((i) => `${i.def};`).join("\n"));
    await timed("latest-analysis summaries", "SELECT refresh_spectrum_summaries(ARRAY(SELECT id FROM spectra))");
    await timed(`${spectraIndexes.length} spectra indexes`, spectraIndexes.map((i) => `${i.def};`).join("\n"));
    await timed("VACUUM ANALYZE", statements[statements.length - 1]!);
  } finally {
    await client.end();
  }
  return url;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const n = Number(arg("spectra", "10000"));
  const name = arg("database", `bandkeep_scale_${n}`);
  const started = performance.now();
  console.log(`seed:scale: ${n} spectra into ${name}`);
  const url = await seedScaleDatabase(n, name);
  console.log(`seed:scale: done in ${((performance.now() - started) / 1000).toFixed(1)} s — ${url.replace(/:[^:@/]*@/, ":***@")}`);
  console.log(`sign in as lead@scale-g1.test with the password ${SCALE_PASSWORD}`);
}
