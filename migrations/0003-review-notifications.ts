import type { Migration } from "../lib/migrator";

// Review notifications: which signatures the group leads' digest has already covered, so a
// digest job that runs twice (or on two workers) never mails the same signature twice.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE signatures ADD COLUMN digested_at timestamptz;
    CREATE INDEX signatures_undigested_idx ON signatures (created_at) WHERE digested_at IS NULL;
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP INDEX IF EXISTS signatures_undigested_idx;
    ALTER TABLE signatures DROP COLUMN IF EXISTS digested_at;
  `);
};
