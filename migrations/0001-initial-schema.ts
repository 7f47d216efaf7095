import type { Migration } from "../lib/migrator";

// The first schema: people and groups, the lab's records, analyses and reviews,
// and the stewardship tables. Constraints live here, not only in model code.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TYPE member_role AS ENUM ('spectroscopist', 'lead', 'steward', 'collaborator');
    CREATE TYPE technique AS ENUM ('absorption', 'pl', 'ir');
    CREATE TYPE spectrum_status AS ENUM ('received', 'queued', 'analysing', 'analysed', 'failed');
    CREATE TYPE run_status AS ENUM ('queued', 'running', 'done', 'failed');
    CREATE TYPE signature_kind AS ENUM ('bleach', 'new-band', 'pl-quench', 'shift', 'broadening');
    CREATE TYPE review_state AS ENUM ('awaiting', 'confirmed', 'dismissed');
    CREATE TYPE series_kind AS ENUM ('titration', 'shell-thickness', 'time', 'other');
    CREATE TYPE data_class AS ENUM ('raw', 'processed', 'drafts');
    CREATE TYPE expiry_action AS ENUM ('delete', 'flag');
    CREATE TYPE hold_target AS ENUM ('project', 'series', 'sample', 'spectrum');
    CREATE TYPE share_target AS ENUM ('project', 'series');

    CREATE TABLE users (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      email text NOT NULL,
      name text NOT NULL,
      password_hash text NOT NULL,
      is_site_admin boolean NOT NULL DEFAULT false,
      notify_digest boolean NOT NULL DEFAULT true,
      notify_decisions boolean NOT NULL DEFAULT true,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT users_email_lowercase CHECK (email = lower(email) AND position('@' in email) > 1)
    );
    CREATE UNIQUE INDEX users_email_key ON users (email);

    CREATE TABLE groups (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      name text NOT NULL UNIQUE,
      slug text NOT NULL UNIQUE CHECK (slug ~ '^[a-z0-9-]+$'),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );

    CREATE TABLE memberships (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      group_id uuid NOT NULL REFERENCES groups(id) ON DELETE CASCADE,
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      role member_role NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (group_id, user_id)
    );
    CREATE INDEX memberships_user_idx ON memberships (user_id);

    CREATE TABLE projects (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      group_id uuid NOT NULL REFERENCES groups(id) ON DELETE RESTRICT,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 200),
      description text NOT NULL DEFAULT '',
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (group_id, name)
    );

    CREATE TABLE samples (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      group_id uuid NOT NULL REFERENCES groups(id) ON DELETE RESTRICT,
      project_id uuid REFERENCES projects(id) ON DELETE SET NULL,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 200),
      material text NOT NULL,
      core_shell text NOT NULL DEFAULT '',
      ligand text NOT NULL DEFAULT '',
      solvent text NOT NULL DEFAULT '',
      hazard_class text NOT NULL DEFAULT 'none',
      notes text NOT NULL DEFAULT '',
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (group_id, name)
    );

    CREATE TABLE sample_parents (
      sample_id uuid NOT NULL REFERENCES samples(id) ON DELETE CASCADE,
      parent_id uuid NOT NULL REFERENCES samples(id) ON DELETE RESTRICT,
      PRIMARY KEY (sample_id, parent_id),
      CHECK (sample_id <> parent_id)
    );
    CREATE INDEX sample_parents_parent_idx ON sample_parents (parent_id);

    CREATE TABLE series (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      project_id uuid NOT NULL REFERENCES projects(id) ON DELETE RESTRICT,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 200),
      kind series_kind NOT NULL DEFAULT 'other',
      variable_name text NOT NULL DEFAULT '',
      variable_unit text NOT NULL DEFAULT '',
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (project_id, name)
    );

    CREATE TABLE spectra (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      project_id uuid NOT NULL REFERENCES projects(id) ON DELETE RESTRICT,
      sample_id uuid REFERENCES samples(id) ON DELETE SET NULL,
      series_id uuid REFERENCES series(id) ON DELETE SET NULL,
      series_value double precision,
      reference_spectrum_id uuid REFERENCES spectra(id) ON DELETE RESTRICT,
      technique technique NOT NULL,
      file_name text NOT NULL,
      object_key text NOT NULL UNIQUE,
      sha256 char(64) NOT NULL CHECK (sha256 ~ '^[0-9a-f]{64}$'),
      size_bytes bigint NOT NULL CHECK (size_bytes >= 0),
      content_type text NOT NULL DEFAULT 'application/octet-stream',
      column_choice text,
      axis_unit text,
      value_unit text,
      path_length_cm double precision CHECK (path_length_cm IS NULL OR path_length_cm > 0),
      excitation_nm double precision CHECK (excitation_nm IS NULL OR excitation_nm > 0),
      slit_nm double precision CHECK (slit_nm IS NULL OR slit_nm > 0),
      integration_ms double precision CHECK (integration_ms IS NULL OR integration_ms > 0),
      solvent text NOT NULL DEFAULT '',
      material text,
      metadata jsonb NOT NULL DEFAULT '{}',
      status spectrum_status NOT NULL DEFAULT 'received',
      error_message text,
      uploaded_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CHECK (reference_spectrum_id IS NULL OR reference_spectrum_id <> id),
      UNIQUE (project_id, sha256)
    );
    CREATE INDEX spectra_sample_idx ON spectra (sample_id);
    CREATE INDEX spectra_series_idx ON spectra (series_id, series_value);
    CREATE INDEX spectra_reference_idx ON spectra (reference_spectrum_id);
    CREATE INDEX spectra_status_idx ON spectra (status);

    CREATE TABLE analysis_runs (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      spectrum_id uuid NOT NULL REFERENCES spectra(id) ON DELETE CASCADE,
      reference_spectrum_id uuid REFERENCES spectra(id) ON DELETE SET NULL,
      engine_version text NOT NULL,
      parameter_hash char(64) NOT NULL,
      parameters jsonb NOT NULL DEFAULT '{}',
      status run_status NOT NULL DEFAULT 'queued',
      error_message text,
      noise double precision,
      report jsonb,
      requested_by uuid REFERENCES users(id) ON DELETE SET NULL,
      started_at timestamptz,
      finished_at timestamptz,
      duration_ms integer CHECK (duration_ms IS NULL OR duration_ms >= 0),
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (spectrum_id, engine_version, parameter_hash)
    );

    CREATE TABLE peaks (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      run_id uuid NOT NULL REFERENCES analysis_runs(id) ON DELETE CASCADE,
      energy_ev double precision NOT NULL,
      wavelength_nm double precision NOT NULL,
      height double precision NOT NULL,
      fwhm_mev double precision,
      area double precision,
      is_first_exciton boolean NOT NULL DEFAULT false
    );
    CREATE INDEX peaks_run_idx ON peaks (run_id);

    CREATE TABLE signatures (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      run_id uuid NOT NULL REFERENCES analysis_runs(id) ON DELETE CASCADE,
      spectrum_id uuid NOT NULL REFERENCES spectra(id) ON DELETE CASCADE,
      kind signature_kind NOT NULL,
      energy_ev double precision,
      fraction double precision,
      shift_mev double precision,
      significance double precision NOT NULL,
      details jsonb NOT NULL DEFAULT '{}',
      review_state review_state NOT NULL DEFAULT 'awaiting',
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX signatures_run_idx ON signatures (run_id);
    CREATE INDEX signatures_queue_idx ON signatures (review_state, created_at DESC);
    CREATE INDEX signatures_spectrum_idx ON signatures (spectrum_id);

    CREATE TABLE reviews (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      signature_id uuid NOT NULL REFERENCES signatures(id) ON DELETE CASCADE,
      reviewer_id uuid REFERENCES users(id) ON DELETE SET NULL,
      decision review_state NOT NULL CHECK (decision <> 'awaiting'),
      comment text NOT NULL DEFAULT '',
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX reviews_signature_idx ON reviews (signature_id, created_at);

    CREATE TABLE retention_policies (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
      data_class data_class NOT NULL,
      keep_days integer NOT NULL CHECK (keep_days > 0),
      on_expiry expiry_action NOT NULL,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (project_id, data_class)
    );

    CREATE TABLE legal_holds (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      group_id uuid NOT NULL REFERENCES groups(id) ON DELETE RESTRICT,
      target_type hold_target NOT NULL,
      target_id uuid NOT NULL,
      reason text NOT NULL CHECK (length(reason) > 0),
      placed_by uuid REFERENCES users(id) ON DELETE SET NULL,
      placed_at timestamptz NOT NULL DEFAULT now(),
      lifted_by uuid REFERENCES users(id) ON DELETE SET NULL,
      lifted_at timestamptz
    );
    CREATE INDEX legal_holds_active_idx ON legal_holds (target_type, target_id) WHERE lifted_at IS NULL;

    CREATE TABLE shares (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      group_id uuid NOT NULL REFERENCES groups(id) ON DELETE CASCADE,
      target_type share_target NOT NULL,
      target_id uuid NOT NULL,
      grantee_user_id uuid REFERENCES users(id) ON DELETE CASCADE,
      link_token_hash char(64) UNIQUE,
      expires_at timestamptz,
      revoked_at timestamptz,
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      CHECK (grantee_user_id IS NOT NULL OR link_token_hash IS NOT NULL)
    );
    CREATE INDEX shares_grantee_idx ON shares (grantee_user_id) WHERE revoked_at IS NULL;

    CREATE TABLE audit_events (
      id bigserial PRIMARY KEY,
      at timestamptz NOT NULL DEFAULT now(),
      actor_id uuid REFERENCES users(id) ON DELETE SET NULL,
      actor_label text NOT NULL DEFAULT '',
      group_id uuid REFERENCES groups(id) ON DELETE SET NULL,
      action text NOT NULL,
      target_type text,
      target_id text,
      details jsonb NOT NULL DEFAULT '{}'
    );
    CREATE INDEX audit_events_group_at_idx ON audit_events (group_id, at DESC);

    -- The audit trail is append-only: the database itself refuses edits and deletes.
    CREATE FUNCTION audit_events_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF TG_OP = 'UPDATE' AND NEW.actor_id IS NULL AND OLD.actor_id IS NOT NULL
         AND NEW.id = OLD.id AND NEW.action = OLD.action AND NEW.details = OLD.details THEN
        RETURN NEW; -- a deleted user's foreign key being cleared
      END IF;
      RAISE EXCEPTION 'audit events are append-only';
    END $$;
    CREATE TRIGGER audit_events_no_edit BEFORE UPDATE OR DELETE ON audit_events
      FOR EACH ROW EXECUTE FUNCTION audit_events_append_only();

    CREATE TABLE api_tokens (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 100),
      token_hash char(64) NOT NULL UNIQUE,
      prefix text NOT NULL,
      last_used_at timestamptz,
      revoked_at timestamptz,
      created_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE INDEX api_tokens_user_idx ON api_tokens (user_id);
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE IF EXISTS api_tokens, audit_events, shares, legal_holds, retention_policies,
      reviews, signatures, peaks, analysis_runs, spectra, series, sample_parents, samples,
      projects, memberships, groups, users CASCADE;
    DROP FUNCTION IF EXISTS audit_events_append_only();
    DROP TYPE IF EXISTS member_role, technique, spectrum_status, run_status, signature_kind,
      review_state, series_kind, data_class, expiry_action, hold_target, share_target;
  `);
};
