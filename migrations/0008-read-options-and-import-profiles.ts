import type { Migration } from "../lib/migrator";

// How a spectrum is read out of its raw file besides the column (block, pair, sheet, a chosen X
// unit or Y kind), so every later reading (re-runs, references, viewer, exports) reads it the same
// way; and import profiles: a project's named reading choices, applied to files whose name
// matches the profile's pattern.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE spectra ADD COLUMN read_options jsonb NOT NULL DEFAULT '{}'::jsonb
      CONSTRAINT spectra_read_options_object CHECK (jsonb_typeof(read_options) = 'object');

    CREATE TABLE import_profiles (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      project_id uuid NOT NULL REFERENCES projects(id) ON DELETE CASCADE,
      name text NOT NULL CHECK (length(btrim(name)) BETWEEN 1 AND 80),
      file_pattern text NOT NULL DEFAULT '' CHECK (length(file_pattern) <= 200),
      options jsonb NOT NULL CHECK (jsonb_typeof(options) = 'object'),
      created_by uuid REFERENCES users(id) ON DELETE SET NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      updated_at timestamptz NOT NULL DEFAULT now()
    );
    CREATE UNIQUE INDEX import_profiles_name_per_project ON import_profiles (project_id, lower(name));
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE IF EXISTS import_profiles;
    ALTER TABLE spectra DROP COLUMN IF EXISTS read_options;
  `);
};
