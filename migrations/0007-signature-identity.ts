import type { Migration } from "../lib/migrator";

// Signatures keep their identity across analyses of one spectrum, and decisions their history:
// - signatures.matched_signature_id names the same band in the run before (lib/review/matchSignatures.ts);
// - signatures.superseded_by_run_id / superseded_at mark a signature of a run that a newer finished
//   run replaced: it leaves the queue and every count, its page and history stay readable;
// - reviews.origin says how a history row came about: a lead's decision, a decision carried from
//   the matched signature of the run before, one held back (the band changed too much), or an undo;
//   reviews.previous_state is the state the row replaced, so an undo restores it exactly;
// - decision_notices: decisions waiting to be mailed to an uploader, coalesced per person.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    CREATE TYPE review_origin AS ENUM ('decision', 'carried', 'not-carried', 'undo');

    ALTER TABLE signatures
      ADD COLUMN matched_signature_id uuid REFERENCES signatures(id) ON DELETE SET NULL,
      ADD COLUMN superseded_by_run_id uuid REFERENCES analysis_runs(id) ON DELETE SET NULL,
      ADD COLUMN superseded_at timestamptz;
    CREATE INDEX signatures_current_idx ON signatures (spectrum_id) WHERE superseded_at IS NULL;
    CREATE INDEX signatures_current_queue_idx ON signatures (review_state, created_at DESC) WHERE superseded_at IS NULL;
    CREATE INDEX signatures_matched_idx ON signatures (matched_signature_id) WHERE matched_signature_id IS NOT NULL;

    -- Signatures of every run but each spectrum's newest finished one were replaced by it.
    UPDATE signatures g SET superseded_by_run_id = latest.id, superseded_at = now()
      FROM (SELECT DISTINCT ON (spectrum_id) id, spectrum_id FROM analysis_runs WHERE status = 'done'
            ORDER BY spectrum_id, created_at DESC) latest
     WHERE latest.spectrum_id = g.spectrum_id AND g.run_id <> latest.id;

    ALTER TABLE reviews
      ADD COLUMN origin review_origin NOT NULL DEFAULT 'decision',
      ADD COLUMN previous_state review_state,
      ADD COLUMN carried_from_signature_id uuid REFERENCES signatures(id) ON DELETE SET NULL,
      ADD COLUMN carried_from_run_id uuid REFERENCES analysis_runs(id) ON DELETE SET NULL,
      ADD COLUMN undoes_review_id uuid REFERENCES reviews(id) ON DELETE SET NULL;
    ALTER TABLE reviews DROP CONSTRAINT reviews_decision_check;
    -- Only an undo (back to awaiting) or a decision held back leaves a row that decides nothing.
    ALTER TABLE reviews ADD CONSTRAINT reviews_decision_by_origin
      CHECK (decision <> 'awaiting' OR origin IN ('undo', 'not-carried'));
    ALTER TABLE reviews ADD CONSTRAINT reviews_undo_names_review
      CHECK (origin <> 'undo' OR undoes_review_id IS NOT NULL);

    CREATE TABLE decision_notices (
      id bigserial PRIMARY KEY,
      recipient_id uuid NOT NULL REFERENCES users(id) ON DELETE CASCADE,
      signature_id uuid NOT NULL REFERENCES signatures(id) ON DELETE CASCADE,
      review_id uuid NOT NULL REFERENCES reviews(id) ON DELETE CASCADE,
      reviewer_name text NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      sent_at timestamptz
    );
    CREATE INDEX decision_notices_pending_idx ON decision_notices (recipient_id, id) WHERE sent_at IS NULL;
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TABLE IF EXISTS decision_notices;
    DELETE FROM reviews WHERE decision = 'awaiting';
    ALTER TABLE reviews DROP CONSTRAINT IF EXISTS reviews_undo_names_review;
    ALTER TABLE reviews DROP CONSTRAINT IF EXISTS reviews_decision_by_origin;
    ALTER TABLE reviews ADD CONSTRAINT reviews_decision_check CHECK (decision <> 'awaiting');
    ALTER TABLE reviews
      DROP COLUMN IF EXISTS undoes_review_id,
      DROP COLUMN IF EXISTS carried_from_run_id,
      DROP COLUMN IF EXISTS carried_from_signature_id,
      DROP COLUMN IF EXISTS previous_state,
      DROP COLUMN IF EXISTS origin;
    DROP INDEX IF EXISTS signatures_matched_idx;
    DROP INDEX IF EXISTS signatures_current_queue_idx;
    DROP INDEX IF EXISTS signatures_current_idx;
    ALTER TABLE signatures
      DROP COLUMN IF EXISTS superseded_at,
      DROP COLUMN IF EXISTS superseded_by_run_id,
      DROP COLUMN IF EXISTS matched_signature_id;
    DROP TYPE IF EXISTS review_origin;
  `);
};
