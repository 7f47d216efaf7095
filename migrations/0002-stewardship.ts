import type { Migration } from "../lib/migrator";

// Stewardship: tombstones of deleted records (also the journal that makes a retention
// sweep safe to interrupt), items flagged for the steward's decision, and e-mail
// invitations with one-time, hashed tokens. See docs/stewardship.md.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TYPE tombstone_state AS ENUM ('pending', 'done', 'cancelled');
    CREATE TYPE tombstone_target AS ENUM ('spectrum', 'analysis-run');

    CREATE TABLE tombstones (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      group_id uuid NOT NULL REFERENCES groups(id) ON DELETE RESTRICT,
      project_id uuid NOT NULL,
      policy_id uuid REFERENCES retention_policies(id) ON DELETE SET NULL,
      data_class data_class NOT NULL,
      target_type tombstone_target NOT NULL,
      target_id uuid NOT NULL,
      label text NOT NULL DEFAULT '',
      object_key text,
      sha256 char(64) CHECK (sha256 IS NULL OR sha256 ~ '^[0-9a-f]{64}$'),
      size_bytes bigint NOT NULL DEFAULT 0 CHECK (size_bytes >= 0),
      cause text NOT NULL CHECK (cause IN ('policy', 'steward', 'owner')),
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      state tombstone_state NOT NULL DEFAULT 'pending',
      details jsonb NOT NULL DEFAULT '{}',
      created_at timestamptz NOT NULL DEFAULT now(),
      completed_at timestamptz,
      CHECK ((state = 'pending') = (completed_at IS NULL))
    );
    CREATE INDEX tombstones_pending_idx ON tombstones (created_at) WHERE state = 'pending';
    CREATE INDEX tombstones_project_idx ON tombstones (project_id, created_at DESC);
    CREATE UNIQUE INDEX tombstones_one_pending_key ON tombstones (target_type, target_id) WHERE state = 'pending';

    CREATE TABLE retention_flags (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      group_id uuid NOT NULL REFERENCES groups(id) ON DELETE CASCADE,
      project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
      policy_id uuid REFERENCES retention_policies(id) ON DELETE SET NULL,
      data_class data_class NOT NULL,
      target_type tombstone_target NOT NULL,
      target_id uuid NOT NULL,
      label text NOT NULL DEFAULT '',
      flagged_at timestamptz NOT NULL DEFAULT now(),
      decision text CHECK (decision IS NULL OR decision IN ('keep', 'delete')),
      decided_by uuid REFERENCES users(id) ON DELETE SET NULL,
      decided_at timestamptz,
      CHECK ((decision IS NULL) = (decided_at IS NULL)),
      UNIQUE (target_type, target_id)
    );
    CREATE INDEX retention_flags_open_idx ON retention_flags (group_id, flagged_at) WHERE decision IS NULL;

    CREATE TABLE invitations (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      group_id uuid NOT NULL REFERENCES groups(id) ON DELETE CASCADE,
      email text NOT NULL CHECK (email = lower(email) AND position('@' in email) > 1),
      role member_role NOT NULL,
      share_target_type share_target,
      share_target_id uuid,
      token_hash char(64) NOT NULL UNIQUE,
      invited_by uuid REFERENCES users(id) ON DELETE SET NULL,
      expires_at timestamptz NOT NULL,
      accepted_at timestamptz,
      accepted_by uuid REFERENCES users(id) ON DELETE SET NULL,
      revoked_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now(),
      CHECK ((share_target_type IS NULL) = (share_target_id IS NULL)),
      CHECK (role <> 'collaborator' OR share_target_id IS NOT NULL)
    );
    CREATE INDEX invitations_group_idx ON invitations (group_id, created_at DESC);
    CREATE INDEX audit_events_action_idx ON audit_events (action, at DESC);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP INDEX IF EXISTS audit_events_action_idx;
    DROP TABLE IF EXISTS invitations, retention_flags, tombstones;
    DROP TYPE IF EXISTS tombstone_state, tombstone_target;
  `);
};
