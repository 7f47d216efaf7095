import type { Migration } from "../lib/migrator";

// The audit trail pages by keyset within each range it reads (lib/queries/audit.ts):
// - a category is one range per (group, event code), newest first;
// - a person is their own range, newest first (also their personal events, which have no group).
// The (group_id, at, id) range of the unfiltered trail came with 0009.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE INDEX audit_events_group_action_keyset_idx ON audit_events (group_id, action, at DESC, id DESC);
    CREATE INDEX audit_events_actor_keyset_idx ON audit_events (actor_id, at DESC, id DESC);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`DROP INDEX IF EXISTS audit_events_actor_keyset_idx, audit_events_group_action_keyset_idx;`);
};
