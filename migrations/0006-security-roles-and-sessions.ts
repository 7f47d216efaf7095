import type { Migration } from "../lib/migrator";
import { appRoleFor } from "../lib/dbRoles";

// Least privilege for the app, a tamper-proof audit trail, and what server-side session
// revocation and expiring API tokens need.
//
// Migrations run as the owner role (MIGRATION_DATABASE_URL); the app and worker connect as
// the app role named by DATABASE_URL's user. The app role gets row access only: it cannot
// alter or truncate tables, disable triggers, or change roles (it is neither owner nor
// superuser), and on the audit trail it may only read and append. Tables created by later
// migrations get the same row access through default privileges.
//
// The trigger now refuses every UPDATE and DELETE of an audit event, and TRUNCATE too, so the
// foreign keys that cleared a deleted person's or group's id (an UPDATE) are dropped: the
// ids stay as recorded and actor_label keeps the name.
export const up: Migration = async ({ context: qi }) => {
  const app = await appRoleFor(qi.sequelize);
  await qi.sequelize.query(`
    ALTER TABLE users ADD COLUMN session_version integer NOT NULL DEFAULT 0;
    ALTER TABLE api_tokens ADD COLUMN expires_at timestamptz;

    ALTER TABLE audit_events DROP CONSTRAINT IF EXISTS audit_events_actor_id_fkey;
    ALTER TABLE audit_events DROP CONSTRAINT IF EXISTS audit_events_group_id_fkey;
    CREATE OR REPLACE FUNCTION audit_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION 'audit events are append-only (% refused)', TG_OP;
    END $$;
    CREATE TRIGGER audit_events_no_truncate BEFORE TRUNCATE ON audit_events
      FOR EACH STATEMENT EXECUTE FUNCTION audit_events_append_only();
  `);
  if (!app) return;
  await qi.sequelize.query(`
    GRANT USAGE ON SCHEMA public TO "${app}";
    GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO "${app}";
    GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO "${app}";
    ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT SELECT, INSERT, UPDATE, DELETE ON TABLES TO "${app}";
    ALTER DEFAULT PRIVILEGES IN SCHEMA public GRANT USAGE, SELECT ON SEQUENCES TO "${app}";
    REVOKE UPDATE, DELETE, TRUNCATE, REFERENCES, TRIGGER ON audit_events FROM "${app}";
    REVOKE INSERT, UPDATE, DELETE, TRUNCATE ON schema_migrations FROM "${app}";
  `);
};

export const down: Migration = async ({ context: qi }) => {
  const app = await appRoleFor(qi.sequelize);
  if (app) {
    await qi.sequelize.query(`
      ALTER DEFAULT PRIVILEGES IN SCHEMA public REVOKE SELECT, INSERT, UPDATE, DELETE ON TABLES FROM "${app}";
      ALTER DEFAULT PRIVILEGES IN SCHEMA public REVOKE USAGE, SELECT ON SEQUENCES FROM "${app}";
      REVOKE ALL ON ALL TABLES IN SCHEMA public FROM "${app}";
      REVOKE ALL ON ALL SEQUENCES IN SCHEMA public FROM "${app}";
      REVOKE USAGE ON SCHEMA public FROM "${app}";
    `);
  }
  await qi.sequelize.query(`
    DROP TRIGGER IF EXISTS audit_events_no_truncate ON audit_events;
    CREATE OR REPLACE FUNCTION audit_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'UPDATE' AND NEW.actor_id IS NULL AND OLD.actor_id IS NOT NULL
         AND NEW.id = OLD.id AND NEW.action = OLD.action AND NEW.details = OLD.details THEN
        RETURN NEW; -- a deleted user's foreign key being cleared
      END IF;
      RAISE EXCEPTION 'audit events are append-only';
    END $$;
    ALTER TABLE audit_events ADD CONSTRAINT audit_events_actor_id_fkey FOREIGN KEY (actor_id) REFERENCES users(id) ON DELETE SET NULL NOT VALID;
    ALTER TABLE audit_events ADD CONSTRAINT audit_events_group_id_fkey FOREIGN KEY (group_id) REFERENCES groups(id) ON DELETE SET NULL NOT VALID;
    ALTER TABLE api_tokens DROP COLUMN expires_at;
    ALTER TABLE users DROP COLUMN session_version;
  `);
};
