import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { FLAG_KINDS, FLAG_UNITS } from "@/lib/registry/flagKinds";
import { TECHNIQUES } from "@/lib/registry/techniques";
import { REGISTRY_COLUMNS, addCheckValues, liveCheckValues, removeCheckValues } from "@/lib/registry/sqlChecks";
import { waitFor } from "../helpers/waitFor";

// Sources: the registries (lib/registry) against PostgreSQL's own catalogue (pg_constraint); magnitudes
// compared with the analysis report the worker stored (known truth of the run).

// The database and the registries agree: the CHECK constraints PostgreSQL holds (read back with
// pg_get_constraintdef) allow exactly the registries' keys. A kind added to lib/registry without
// its migration fails here, in `npm test`, instead of every run that raises it failing in
// production as "storage or database unreachable".

let client: pg.Client;
const query = async (sql: string) => (await client.query<{ def: string }>(sql)).rows;
const exec = (sql: string) => client.query(sql);

beforeAll(async () => {
  // the schema owner: the test alters a CHECK the way a migration would
  client = new pg.Client({ connectionString: process.env.MIGRATION_DATABASE_URL ?? process.env.DATABASE_URL });
  await client.connect();
});
afterAll(async () => {
  await client?.end();
});

describe("registries and database", () => {
  it("allow the same flag kinds, magnitude units and techniques", async () => {
    expect(await liveCheckValues(query, REGISTRY_COLUMNS.signatureKind)).toEqual([...FLAG_KINDS]);
    expect(await liveCheckValues(query, REGISTRY_COLUMNS.signatureUnit)).toEqual([...FLAG_UNITS]);
    expect(await liveCheckValues(query, REGISTRY_COLUMNS.spectrumTechnique)).toEqual([...TECHNIQUES]);
    // The ENUM types that held a second copy of the lists are gone (migrations/0005).
    const types = await client.query("SELECT typname FROM pg_type WHERE typname IN ('signature_kind', 'technique')");
    expect(types.rows).toEqual([]);
  });

  it("refuses a kind the database was not migrated for, and takes it once the migration helper ran", async () => {
    const [row] = (await client.query<{ id: string }>("SELECT id FROM signatures LIMIT 1")).rows;
    expect(row, "the demo seed has signatures").toBeDefined();
    await client.query("BEGIN");
    try {
      await client.query("SAVEPOINT before_fake");
      await expect(client.query("UPDATE signatures SET kind = 'fake-kind' WHERE id = $1", [row!.id])).rejects.toThrow(
        /signatures_kind_known/,
      );
      await client.query("ROLLBACK TO SAVEPOINT before_fake");
      await addCheckValues(query, exec, REGISTRY_COLUMNS.signatureKind, ["fake-kind"]);
      expect(await liveCheckValues(query, REGISTRY_COLUMNS.signatureKind)).toEqual([...FLAG_KINDS, "fake-kind"]);
      const updated = await client.query("UPDATE signatures SET kind = 'fake-kind' WHERE id = $1", [row!.id]);
      expect(updated.rowCount).toBe(1);
      await client.query("UPDATE signatures SET kind = 'bleach' WHERE id = $1", [row!.id]);
      await removeCheckValues(query, exec, REGISTRY_COLUMNS.signatureKind, ["fake-kind"]);
      expect(await liveCheckValues(query, REGISTRY_COLUMNS.signatureKind)).toEqual([...FLAG_KINDS]);
    } finally {
      await client.query("ROLLBACK");
    }
    expect(await liveCheckValues(query, REGISTRY_COLUMNS.signatureKind)).toEqual([...FLAG_KINDS]);
  });

  it("keeps the technique check beside 0004's supernatant rule", async () => {
    const defs = (
      await client.query<{ conname: string }>("SELECT conname FROM pg_constraint WHERE conrelid = 'spectra'::regclass AND contype = 'c'")
    ).rows.map((r) => r.conname);
    expect(defs).toEqual(expect.arrayContaining(["spectra_technique_known", "spectra_supernatant_shape"]));
  });

  it("stores each flag's magnitude, unit and uncertainty in their own columns, equal to the engine's report", async () => {
    type Row = {
      kind: string;
      magnitude: number | null;
      unit: string | null;
      uncertainty: number | null;
      energy_ev: number | null;
      flags: { kind: string; magnitude: number; unit: string; uncertainty: number; energyEv: number | null }[];
    };
    const rows = await waitFor(
      "analysed demo spectra with flags",
      async () => {
        const r = (
          await client.query<Row>(
            `SELECT g.kind, g.magnitude, g.unit, g.uncertainty, g.energy_ev, r.report->'flags' AS flags
         FROM signatures g JOIN analysis_runs r ON r.id = g.run_id WHERE r.status = 'done'`,
          )
        ).rows;
        return r.length >= 3 ? r : undefined;
      },
      240_000,
      1000,
    );
    for (const r of rows) {
      const flag = r.flags.find(
        (f) =>
          f.kind === r.kind && (f.energyEv === null ? r.energy_ev === null : Math.abs(f.energyEv - (r.energy_ev ?? Number.NaN)) < 1e-9),
      );
      expect(flag, `${r.kind} at ${r.energy_ev} eV in its run's report`).toBeDefined();
      expect(r.magnitude).toBeCloseTo(flag!.magnitude, 9);
      expect(r.unit).toBe(flag!.unit);
      expect(r.uncertainty).toBeCloseTo(flag!.uncertainty, 9);
    }
  });
});
