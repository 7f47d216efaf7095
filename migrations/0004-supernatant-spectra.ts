import type { Migration } from "../lib/migrator";

// Supernatant spectra: an absorption spectrum of the supernatant left after the product of one
// titration point settled names that point's spectrum. The supernatant is not itself a point of a
// series (it would enter the series' plots and fits), each point has at most one supernatant, and
// both belong to the same project; the database refuses anything else.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE spectra ADD COLUMN supernatant_of_spectrum_id uuid REFERENCES spectra(id) ON DELETE SET NULL;
    ALTER TABLE spectra ADD CONSTRAINT spectra_supernatant_shape CHECK (
      supernatant_of_spectrum_id IS NULL
      OR (technique = 'absorption' AND series_id IS NULL AND supernatant_of_spectrum_id <> id)
    );
    CREATE UNIQUE INDEX spectra_one_supernatant_per_point ON spectra (supernatant_of_spectrum_id)
      WHERE supernatant_of_spectrum_id IS NOT NULL;

    CREATE FUNCTION spectra_supernatant_names_a_point() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF NEW.supernatant_of_spectrum_id IS NOT NULL AND NOT EXISTS (
        SELECT 1 FROM spectra p
        WHERE p.id = NEW.supernatant_of_spectrum_id AND p.series_id IS NOT NULL AND p.project_id = NEW.project_id
      ) THEN
        RAISE EXCEPTION 'a supernatant spectrum must name a series point of its own project'
          USING ERRCODE = 'check_violation', CONSTRAINT = 'spectra_supernatant_of_point';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER spectra_supernatant_names_a_point
      BEFORE INSERT OR UPDATE OF supernatant_of_spectrum_id, project_id ON spectra
      FOR EACH ROW EXECUTE FUNCTION spectra_supernatant_names_a_point();

    -- The other side: a point with a supernatant stays a point of its project.
    CREATE FUNCTION spectra_point_keeps_its_supernatant() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      IF (NEW.series_id IS NULL OR NEW.project_id <> OLD.project_id)
         AND EXISTS (SELECT 1 FROM spectra s WHERE s.supernatant_of_spectrum_id = NEW.id) THEN
        RAISE EXCEPTION 'this spectrum has a supernatant spectrum: unlink it before taking the spectrum out of its series or project'
          USING ERRCODE = 'check_violation', CONSTRAINT = 'spectra_supernatant_of_point';
      END IF;
      RETURN NEW;
    END $$;
    CREATE TRIGGER spectra_point_keeps_its_supernatant
      BEFORE UPDATE OF series_id, project_id ON spectra
      FOR EACH ROW EXECUTE FUNCTION spectra_point_keeps_its_supernatant();
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    DROP TRIGGER IF EXISTS spectra_point_keeps_its_supernatant ON spectra;
    DROP FUNCTION IF EXISTS spectra_point_keeps_its_supernatant();
    DROP TRIGGER IF EXISTS spectra_supernatant_names_a_point ON spectra;
    DROP FUNCTION IF EXISTS spectra_supernatant_names_a_point();
    DROP INDEX IF EXISTS spectra_one_supernatant_per_point;
    ALTER TABLE spectra DROP CONSTRAINT IF EXISTS spectra_supernatant_shape;
    ALTER TABLE spectra DROP COLUMN IF EXISTS supernatant_of_spectrum_id;
  `);
};
