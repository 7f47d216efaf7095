import { execFileSync } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";

// Runs every migration down to nothing and up again on a scratch database of the
// test PostgreSQL server, and checks that the constraints live in the database. It needs the
// owner role's powers (create a database, run migrations), so it uses MIGRATION_DATABASE_URL.
const base = new URL(process.env.MIGRATION_DATABASE_URL ?? "postgres://bandkeep_owner@127.0.0.1:54339/bandkeep");
const scratchName = `bandkeep_migrations_${process.pid}`;
const scratchUrl = new URL(base);
scratchUrl.pathname = `/${scratchName}`;
const scratchAppUrl = new URL(process.env.DATABASE_URL ?? "postgres://bandkeep_app@127.0.0.1:54339/bandkeep");
scratchAppUrl.pathname = `/${scratchName}`;

async function admin(sql: string) {
  const client = new pg.Client({ connectionString: base.toString() });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

function migrate(...args: string[]): string {
  return execFileSync(process.execPath, ["--import", "tsx", "scripts/migrate.ts", ...args], {
    env: { ...process.env, MIGRATION_DATABASE_URL: scratchUrl.toString(), DATABASE_URL: scratchAppUrl.toString() },
    encoding: "utf8",
  });
}

let client: pg.Client;
const tables = async () =>
  (await client.query<{ tablename: string }>("SELECT tablename FROM pg_tables WHERE schemaname = 'public' ORDER BY 1")).rows.map(
    (r) => r.tablename,
  );

beforeAll(async () => {
  await admin(`DROP DATABASE IF EXISTS ${scratchName}`);
  await admin(`CREATE DATABASE ${scratchName}`);
  client = new pg.Client({ connectionString: scratchUrl.toString() });
  await client.connect();
});
afterAll(async () => {
  await client?.end();
  await admin(`DROP DATABASE IF EXISTS ${scratchName}`);
});

describe("migrations", () => {
  it("run up, down to nothing, and up again", async () => {
    expect(migrate("up")).toMatch(/migrated: 0001-initial-schema/);
    const up = await tables();
    for (const t of [
      "users",
      "groups",
      "memberships",
      "projects",
      "samples",
      "sample_parents",
      "series",
      "spectra",
      "analysis_runs",
      "peaks",
      "signatures",
      "reviews",
      "retention_policies",
      "legal_holds",
      "shares",
      "audit_events",
      "api_tokens",
      "tombstones",
      "retention_flags",
      "invitations",
    ]) {
      expect(up).toContain(t);
    }
    expect(migrate("down", "--to", "0")).toMatch(/reverted: .*0001-initial-schema/);
    expect(await tables()).toEqual(["schema_migrations"]);
    expect(migrate("up")).toMatch(/migrated: 0001-initial-schema/);
    expect(migrate("up")).toMatch(/schema is up to date/);
  });

  it("enforces constraints in the database itself", async () => {
    const group = (await client.query("INSERT INTO groups (name, slug) VALUES ('G', 'g') RETURNING id")).rows[0].id;
    const project = (await client.query("INSERT INTO projects (group_id, name) VALUES ($1, 'P') RETURNING id", [group])).rows[0].id;
    const spectrum = (sha: string, key: string) =>
      client.query(
        "INSERT INTO spectra (project_id, technique, file_name, object_key, sha256, size_bytes) VALUES ($1, 'absorption', 'f.csv', $2, $3, 10)",
        [project, key, sha],
      );
    await spectrum("a".repeat(64), "k1");
    await expect(spectrum("a".repeat(64), "k2")).rejects.toThrow(/duplicate key/); // one stored copy per file per project
    await expect(spectrum("not-a-hash", "k3")).rejects.toThrow(/check constraint/);
    await expect(client.query("INSERT INTO users (email, name, password_hash) VALUES ('Upper@Case.test', 'x', 'h')")).rejects.toThrow(
      /users_email_lowercase/,
    );
    await expect(
      client.query("INSERT INTO memberships (group_id, user_id, role) VALUES ($1, gen_random_uuid(), 'owner')", [group]),
    ).rejects.toThrow(/invalid input value for enum/);
  });

  it("lets a supernatant name only a series point of its own project, one per point (0004)", async () => {
    const group = (await client.query("INSERT INTO groups (name, slug) VALUES ('S', 's') RETURNING id")).rows[0].id;
    const [p1, p2] = await Promise.all(
      ["P1", "P2"].map(
        async (n) => (await client.query("INSERT INTO projects (group_id, name) VALUES ($1, $2) RETURNING id", [group, n])).rows[0].id,
      ),
    );
    const series = (await client.query("INSERT INTO series (project_id, name, kind) VALUES ($1, 'T', 'titration') RETURNING id", [p1]))
      .rows[0].id;
    let n = 0;
    const spectrum = async (project: string, extra: { technique?: string; seriesId?: string | null; of?: string | null } = {}) => {
      n += 1;
      const sha = n.toString(16).padStart(64, "0");
      return (
        await client.query(
          `INSERT INTO spectra (project_id, technique, file_name, object_key, sha256, size_bytes, series_id, supernatant_of_spectrum_id)
         VALUES ($1, $2, 'f.csv', $3, $4, 10, $5, $6) RETURNING id`,
          [project, extra.technique ?? "absorption", `sup-${n}`, sha, extra.seriesId ?? null, extra.of ?? null],
        )
      ).rows[0].id as string;
    };
    const point = await spectrum(p1, { seriesId: series });
    const loose = await spectrum(p1);
    const supernatant = await spectrum(p1, { of: point });
    await expect(spectrum(p1, { of: point })).rejects.toThrow(/spectra_one_supernatant_per_point/); // one per point
    await expect(spectrum(p1, { of: loose })).rejects.toThrow(/must name a series point/); // not a point
    await expect(spectrum(p2, { of: point })).rejects.toThrow(/must name a series point of its own project/);
    await expect(spectrum(p1, { technique: "pl", of: point })).rejects.toThrow(/spectra_supernatant_shape/); // absorption only
    await expect(client.query("UPDATE spectra SET series_id = $1 WHERE id = $2", [series, supernatant])).rejects.toThrow(
      /spectra_supernatant_shape/,
    );
    await expect(client.query("UPDATE spectra SET series_id = NULL WHERE id = $1", [point])).rejects.toThrow(/unlink it before/);
    await client.query("DELETE FROM spectra WHERE id = $1", [point]); // deleting the point unlinks its supernatant
    expect(
      (await client.query("SELECT supernatant_of_spectrum_id FROM spectra WHERE id = $1", [supernatant])).rows[0]
        .supernatant_of_spectrum_id,
    ).toBeNull();
  });

  it("keeps the audit trail append-only", async () => {
    const row = (await client.query("INSERT INTO audit_events (action) VALUES ('probe') RETURNING id")).rows[0];
    await expect(client.query("UPDATE audit_events SET action = 'edited' WHERE id = $1", [row.id])).rejects.toThrow(/append-only/);
    await expect(client.query("DELETE FROM audit_events WHERE id = $1", [row.id])).rejects.toThrow(/append-only/);
    // 0006: even the owner's "clear the actor, keep id, action and details" update is refused, and so is TRUNCATE.
    await expect(
      client.query("UPDATE audit_events SET actor_id = NULL, actor_label = 'someone else', at = now() - interval '1 year' WHERE id = $1", [
        row.id,
      ]),
    ).rejects.toThrow(/append-only/);
    await expect(client.query("TRUNCATE audit_events")).rejects.toThrow(/append-only/);
    expect((await client.query("SELECT action FROM audit_events WHERE id = $1", [row.id])).rows[0].action).toBe("probe");
  });
});
