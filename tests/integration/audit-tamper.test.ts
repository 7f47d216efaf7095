import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";

// Issue #11, item 4: the tampering attempts against the audit trail, made as the role the app
// connects as (DATABASE_URL). Each must fail and leave the trail as it was. The refusals are
// PostgreSQL's own privilege rules (PostgreSQL 15 docs: "ALTER TABLE" needs ownership,
// "session_replication_role" is a superuser setting, "TRUNCATE" needs the TRUNCATE privilege).
const appUrl = process.env.DATABASE_URL ?? "postgres://bandkeep_app@127.0.0.1:54339/bandkeep";

let client: pg.Client;
type Snapshot = { count: string; digest: string };
const snapshot = async (): Promise<Snapshot> =>
  (
    await client.query<Snapshot>(
      "SELECT count(*)::text AS count, md5(coalesce(string_agg(a::text, '|' ORDER BY id), '')) AS digest FROM audit_events a",
    )
  ).rows[0]!;

beforeAll(async () => {
  client = new pg.Client({ connectionString: appUrl });
  await client.connect();
});
afterAll(async () => client?.end());

describe("the audit trail as the app role", () => {
  it("connects as a role that is neither superuser nor owner", async () => {
    const { rows } = await client.query<{ rolsuper: boolean; owner: string; me: string; createrole: boolean }>(
      "SELECT r.rolsuper, r.rolcreaterole AS createrole, current_user AS me, pg_get_userbyid(c.relowner) AS owner FROM pg_roles r, pg_class c WHERE r.rolname = current_user AND c.relname = 'audit_events'",
    );
    expect(rows[0]!.rolsuper).toBe(false);
    expect(rows[0]!.createrole).toBe(false);
    expect(rows[0]!.owner).not.toBe(rows[0]!.me);
  });

  it("may append and read", async () => {
    const { rows } = await client.query(
      "INSERT INTO audit_events (action, actor_label) VALUES ('tamper-probe', 'audit-tamper test') RETURNING id",
    );
    expect(rows[0].id).toBeDefined();
  });

  it.each([
    ["disable the append-only trigger", "ALTER TABLE audit_events DISABLE TRIGGER audit_events_no_edit", /must be owner|permission denied/],
    ["disable every trigger", "ALTER TABLE audit_events DISABLE TRIGGER ALL", /must be owner|permission denied/],
    ["drop the trigger", "DROP TRIGGER audit_events_no_edit ON audit_events", /must be owner|permission denied/],
    [
      "replace the trigger function",
      "CREATE OR REPLACE FUNCTION audit_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RETURN NEW; END $$",
      /must be owner|permission denied/,
    ],
    ["switch to replica mode", "SET session_replication_role = replica", /permission denied/],
    [
      "clear the actor and rewrite the rest",
      "UPDATE audit_events SET actor_id = NULL, actor_label = 'nobody', at = now() - interval '1 year', group_id = NULL, target_id = 'x' WHERE id = (SELECT max(id) FROM audit_events)",
      /permission denied/,
    ],
    ["edit an event", "UPDATE audit_events SET action = 'edited'", /permission denied/],
    ["delete events", "DELETE FROM audit_events", /permission denied/],
    ["truncate", "TRUNCATE audit_events", /permission denied/],
    ["make itself superuser", "ALTER ROLE CURRENT_USER SUPERUSER", /permission denied|must be superuser/],
    ["create a role", "CREATE ROLE bandkeep_intruder SUPERUSER", /permission denied|must be superuser/],
    ["grant itself the owner role", "GRANT bandkeep_owner TO CURRENT_USER", /permission denied|must have admin option|does not exist/],
    ["rename the table", "ALTER TABLE audit_events RENAME TO audit_events_old", /must be owner|permission denied/],
    ["create a table", "CREATE TABLE audit_events_copy (id int)", /permission denied/],
    ["truncate another table", "TRUNCATE spectra CASCADE", /permission denied/],
  ])("cannot %s", async (_what, sql, refusal) => {
    const before = await snapshot();
    await expect(client.query(sql)).rejects.toThrow(refusal);
    expect(await snapshot()).toEqual(before);
  });
});
