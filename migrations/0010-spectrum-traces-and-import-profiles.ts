import type { Migration } from "../lib/migrator";

// One stored raw file may back several spectra (one per trace: column, pair or block, on a
// sheet), so the per-project uniqueness of the bytes becomes uniqueness of bytes and trace:
// trace_key is '' for the file's default reading and names the trace otherwise
// (lib/ingest/traceKey.ts). The object key is no longer unique: the spectra of one file share
// its object, stored once. Import profiles are a project's saved ways of reading files.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE spectra ADD COLUMN trace_key text NOT NULL DEFAULT ''
      CONSTRAINT spectra_trace_key_length CHECK (length(trace_key) <= 300);
    ALTER TABLE spectra DROP CONSTRAINT spectra_project_id_sha256_key;
    ALTER TABLE spectra ADD CONSTRAINT spectra_project_sha256_trace_key UNIQUE (project_id, sha256, trace_key);
    ALTER TABLE spectra DROP CONSTRAINT spectra_object_key_key;
    CREATE INDEX spectra_object_key_idx ON spectra (object_key);

    CREATE TABLE import_profiles (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 80),
      choice jsonb NOT NULL CHECK (jsonb_typeof(choice) = 'object'),
      signature text NOT NULL CHECK (length(signature) BETWEEN 1 AND 2000),
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (project_id, name)
    );
    CREATE INDEX import_profiles_signature_idx ON import_profiles (project_id, signature);
  `);
};

// Undoes up exactly on a database where no file backs two spectra (the uniqueness of the
// bytes cannot come back otherwise: split spectra must be deleted first).
export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE IF EXISTS import_profiles;
    DROP INDEX IF EXISTS spectra_object_key_idx;
    ALTER TABLE spectra ADD CONSTRAINT spectra_object_key_key UNIQUE (object_key);
    ALTER TABLE spectra DROP CONSTRAINT spectra_project_sha256_trace_key;
    ALTER TABLE spectra ADD CONSTRAINT spectra_project_id_sha256_key UNIQUE (project_id, sha256);
    ALTER TABLE spectra DROP COLUMN trace_key;
  `);
};
