import type { Migration } from "../lib/migrator";

// Search over the spectra and pages that do not slow down with size (docs/search.md):
// - keyset indexes (scope column, created_at DESC, id DESC) so a page is an index range, not a
//   sort of everything the person reads;
// - trigram indexes for free text over file names + metadata and sample names + notes
//   (pg_trgm ships with PostgreSQL and is a trusted extension, so the owner role may create it);
// - band search indexes: peaks by energy (all, and first excitons only), the sizing curve's
//   diameter of each finished run, the latest finished run of a spectrum;
// - saved searches: a person's named search, kept as its canonical query string.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE EXTENSION IF NOT EXISTS pg_trgm;

    CREATE INDEX spectra_project_keyset_idx ON spectra (project_id, created_at DESC, id DESC);
    CREATE INDEX spectra_series_keyset_idx ON spectra (series_id, created_at DESC, id DESC) WHERE series_id IS NOT NULL;
    CREATE INDEX spectra_sample_keyset_idx ON spectra (sample_id, created_at DESC, id DESC) WHERE sample_id IS NOT NULL;
    CREATE INDEX spectra_uploader_keyset_idx ON spectra (uploaded_by, created_at DESC, id DESC) WHERE uploaded_by IS NOT NULL;
    CREATE INDEX spectra_text_trgm_idx ON spectra USING gin ((file_name || ' ' || metadata::text) gin_trgm_ops);

    CREATE INDEX samples_text_trgm_idx ON samples USING gin ((name || ' ' || notes) gin_trgm_ops);
    CREATE INDEX samples_group_keyset_idx ON samples (group_id, created_at DESC, id DESC);

    CREATE INDEX analysis_runs_done_idx ON analysis_runs (spectrum_id, created_at DESC) WHERE status = 'done';
    CREATE INDEX analysis_runs_diameter_idx ON analysis_runs (((report->'derived'->>'diameterNm')::float8))
      WHERE status = 'done' AND report->'derived'->>'diameterNm' IS NOT NULL;

    CREATE INDEX peaks_energy_idx ON peaks (energy_ev);
    CREATE INDEX peaks_first_exciton_energy_idx ON peaks (energy_ev) WHERE is_first_exciton;

    CREATE INDEX signatures_spectrum_kind_idx ON signatures (spectrum_id, kind, significance);
    CREATE INDEX signatures_queue_significance_idx ON signatures (review_state, significance DESC, created_at DESC);
    CREATE INDEX audit_events_group_keyset_idx ON audit_events (group_id, at DESC, id DESC);

    CREATE TABLE saved_searches (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      user_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      name text NOT NULL CHECK (length(name) BETWEEN 1 AND 120),
      query text NOT NULL CHECK (length(query) <= 2000),
      created_at timestamptz NOT NULL DEFAULT now(),
      UNIQUE (user_id, name)
    );
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE IF EXISTS saved_searches;
    DROP INDEX IF EXISTS audit_events_group_keyset_idx, signatures_queue_significance_idx, signatures_spectrum_kind_idx, peaks_first_exciton_energy_idx,
      peaks_energy_idx, analysis_runs_diameter_idx, analysis_runs_done_idx, samples_group_keyset_idx, samples_text_trgm_idx,
      spectra_text_trgm_idx, spectra_uploader_keyset_idx, spectra_sample_keyset_idx, spectra_series_keyset_idx,
      spectra_project_keyset_idx;
    DROP EXTENSION IF EXISTS pg_trgm;
  `);
};
