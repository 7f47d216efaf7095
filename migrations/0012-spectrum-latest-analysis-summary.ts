import type { Migration } from "../lib/migrator";

// The latest finished analysis of each spectrum, summarised on the spectrum row, so a band or
// size search is an index range instead of a probe of runs and peaks per spectrum (docs/search.md):
// - latest_run_id: the newest finished run (created_at, then id, as the review queue and the list);
// - first_exciton_ev: that run's peak marked as the first exciton;
// - emission_ev: the highest peak of that run, for PL spectra only (the emission maximum);
// - diameter_nm: the sizing curve's diameter in that run's report.
// One SQL function computes the summary; triggers call it whenever a run is added, finished,
// changed or deleted, or its peaks change, so the worker, the retention sweep (which deletes runs)
// and any direct insert keep it true without code of their own. The backfill uses the same function.
// Indexes (project_id, value) INCLUDE (created_at, id) answer a band or size range per project
// with an index-only range, for the page (top 51 by date) and for the bounded count alike.
// The review queue pages by keyset over the current signatures (superseded_at IS NULL) in each
// sort order it offers by index: significance, date and kind, with and without a review state.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE spectra
      ADD COLUMN latest_run_id uuid,
      ADD COLUMN first_exciton_ev double precision,
      ADD COLUMN emission_ev double precision,
      ADD COLUMN diameter_nm double precision;

    CREATE FUNCTION refresh_spectrum_summaries(ids uuid[]) RETURNS void LANGUAGE sql AS $$
      UPDATE spectra s
         SET latest_run_id = v.run_id, first_exciton_ev = v.first_ev, emission_ev = v.emission_ev, diameter_nm = v.diameter_nm
        FROM (
          SELECT t.id,
                 lr.id AS run_id,
                 (SELECT k.energy_ev FROM peaks k WHERE k.run_id = lr.id AND k.is_first_exciton ORDER BY k.height DESC LIMIT 1) AS first_ev,
                 CASE WHEN sp.technique = 'pl' THEN
                   (SELECT k.energy_ev FROM peaks k WHERE k.run_id = lr.id ORDER BY k.height DESC, k.energy_ev LIMIT 1) END AS emission_ev,
                 CASE WHEN jsonb_typeof(lr.report->'derived'->'diameterNm') = 'number'
                      THEN (lr.report->'derived'->>'diameterNm')::float8 END AS diameter_nm
            FROM unnest(ids) AS t(id)
            JOIN spectra sp ON sp.id = t.id
            LEFT JOIN LATERAL (
              SELECT r.id, r.report FROM analysis_runs r WHERE r.spectrum_id = t.id AND r.status = 'done'
               ORDER BY r.created_at DESC, r.id DESC LIMIT 1
            ) lr ON TRUE
        ) v
       WHERE s.id = v.id
         AND (s.latest_run_id, s.first_exciton_ev, s.emission_ev, s.diameter_nm)
             IS DISTINCT FROM (v.run_id, v.first_ev, v.emission_ev, v.diameter_nm)
    $$;

    CREATE FUNCTION spectrum_summary_after_run() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM refresh_spectrum_summaries(ARRAY(SELECT DISTINCT spectrum_id FROM run_rows));
      RETURN NULL;
    END $$;

    CREATE FUNCTION spectrum_summary_after_peaks() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      PERFORM refresh_spectrum_summaries(ARRAY(
        SELECT DISTINCT r.spectrum_id FROM peak_rows k JOIN analysis_runs r ON r.id = k.run_id WHERE r.status = 'done'));
      RETURN NULL;
    END $$;

    CREATE TRIGGER spectrum_summary_run_insert AFTER INSERT ON analysis_runs
      REFERENCING NEW TABLE AS run_rows FOR EACH STATEMENT EXECUTE FUNCTION spectrum_summary_after_run();
    CREATE TRIGGER spectrum_summary_run_update AFTER UPDATE ON analysis_runs
      REFERENCING NEW TABLE AS run_rows FOR EACH STATEMENT EXECUTE FUNCTION spectrum_summary_after_run();
    CREATE TRIGGER spectrum_summary_run_delete AFTER DELETE ON analysis_runs
      REFERENCING OLD TABLE AS run_rows FOR EACH STATEMENT EXECUTE FUNCTION spectrum_summary_after_run();
    CREATE TRIGGER spectrum_summary_peaks_insert AFTER INSERT ON peaks
      REFERENCING NEW TABLE AS peak_rows FOR EACH STATEMENT EXECUTE FUNCTION spectrum_summary_after_peaks();
    CREATE TRIGGER spectrum_summary_peaks_delete AFTER DELETE ON peaks
      REFERENCING OLD TABLE AS peak_rows FOR EACH STATEMENT EXECUTE FUNCTION spectrum_summary_after_peaks();

    SELECT refresh_spectrum_summaries(ARRAY(SELECT DISTINCT spectrum_id FROM analysis_runs WHERE status = 'done'));

    CREATE INDEX spectra_first_exciton_idx ON spectra (project_id, first_exciton_ev) INCLUDE (created_at, id) WHERE first_exciton_ev IS NOT NULL;
    CREATE INDEX spectra_emission_idx ON spectra (project_id, emission_ev) INCLUDE (created_at, id) WHERE emission_ev IS NOT NULL;
    CREATE INDEX spectra_diameter_idx ON spectra (project_id, diameter_nm) INCLUDE (created_at, id) WHERE diameter_nm IS NOT NULL;

    CREATE INDEX signatures_current_significance_keyset_idx ON signatures (significance DESC, created_at DESC, id DESC) WHERE superseded_at IS NULL;
    CREATE INDEX signatures_current_state_significance_keyset_idx ON signatures (review_state, significance DESC, created_at DESC, id DESC) WHERE superseded_at IS NULL;
    CREATE INDEX signatures_current_date_keyset_idx ON signatures (created_at DESC, id DESC) WHERE superseded_at IS NULL;
    CREATE INDEX signatures_current_state_date_keyset_idx ON signatures (review_state, created_at DESC, id DESC) WHERE superseded_at IS NULL;
    CREATE INDEX signatures_current_kind_keyset_idx ON signatures (kind, created_at DESC, id DESC) WHERE superseded_at IS NULL;
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TRIGGER IF EXISTS spectrum_summary_peaks_delete ON peaks;
    DROP TRIGGER IF EXISTS spectrum_summary_peaks_insert ON peaks;
    DROP TRIGGER IF EXISTS spectrum_summary_run_delete ON analysis_runs;
    DROP TRIGGER IF EXISTS spectrum_summary_run_update ON analysis_runs;
    DROP TRIGGER IF EXISTS spectrum_summary_run_insert ON analysis_runs;
    DROP FUNCTION IF EXISTS spectrum_summary_after_peaks(), spectrum_summary_after_run(), refresh_spectrum_summaries(uuid[]);
    DROP INDEX IF EXISTS signatures_current_kind_keyset_idx, signatures_current_state_date_keyset_idx, signatures_current_date_keyset_idx,
      signatures_current_state_significance_keyset_idx, signatures_current_significance_keyset_idx;
    DROP INDEX IF EXISTS spectra_diameter_idx, spectra_emission_idx, spectra_first_exciton_idx;
    ALTER TABLE spectra DROP COLUMN IF EXISTS diameter_nm, DROP COLUMN IF EXISTS emission_ev,
      DROP COLUMN IF EXISTS first_exciton_ev, DROP COLUMN IF EXISTS latest_run_id;
  `);
};
