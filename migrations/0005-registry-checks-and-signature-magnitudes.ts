import type { Migration } from "../lib/migrator";
import { REGISTRY_COLUMNS, inCheck } from "../lib/registry/sqlChecks";

// Flag kinds and techniques are listed in lib/registry; the database keeps them in text columns
// with CHECK constraints instead of ENUM types, so a new kind is one small migration
// (lib/registry/checkMigration.ts) and tests/integration/registry-database.test.ts fails when the
// registries and the database disagree. The lists below are this migration's snapshot and never
// change: later kinds are added by later migrations.
//
// Signatures get generic magnitude, unit and uncertainty columns, backfilled from the report copy in
// `details` (or from fraction / shift_mev for rows written before details held it). fraction and
// shift_mev stay readable.

const KINDS_0005 = ["bleach", "new-band", "pl-quench", "shift", "broadening", "concentration", "band-change"];
const TECHNIQUES_0005 = ["absorption", "pl", "ir"];
const UNITS_0005 = ["fraction", "meV", "signal", "ratio"];

export const up: Migration = async ({ context: qi }) => {
  const { signatureKind, signatureUnit, spectrumTechnique } = REGISTRY_COLUMNS;
  await qi.sequelize.query(`
    -- 0004's check compares technique with an ENUM literal: rebuilt around the type change.
    ALTER TABLE spectra DROP CONSTRAINT spectra_supernatant_shape;
    ALTER TABLE spectra ALTER COLUMN technique TYPE text USING technique::text;
    ALTER TABLE spectra ADD CONSTRAINT spectra_supernatant_shape CHECK (
      supernatant_of_spectrum_id IS NULL
      OR (technique = 'absorption' AND series_id IS NULL AND supernatant_of_spectrum_id <> id)
    );
    ALTER TABLE spectra ADD CONSTRAINT ${spectrumTechnique.constraint} ${inCheck(spectrumTechnique, TECHNIQUES_0005)};
    ALTER TABLE signatures ALTER COLUMN kind TYPE text USING kind::text;
    ALTER TABLE signatures ADD CONSTRAINT ${signatureKind.constraint} ${inCheck(signatureKind, KINDS_0005)};
    DROP TYPE technique;
    DROP TYPE signature_kind;

    ALTER TABLE signatures
      ADD COLUMN magnitude double precision,
      ADD COLUMN unit text CONSTRAINT ${signatureUnit.constraint} ${inCheck(signatureUnit, UNITS_0005)},
      ADD COLUMN uncertainty double precision;
    UPDATE signatures SET
      magnitude = COALESCE(
        CASE WHEN jsonb_typeof(details->'magnitude') = 'number' THEN (details->>'magnitude')::float8 END,
        CASE WHEN kind = 'shift' THEN shift_mev ELSE fraction END),
      unit = CASE
        WHEN jsonb_typeof(details->'magnitude') = 'number' AND details->>'unit' IN (${UNITS_0005.map((u) => `'${u}'`).join(", ")}) THEN details->>'unit'
        WHEN kind = 'shift' AND shift_mev IS NOT NULL THEN 'meV'
        WHEN kind <> 'shift' AND fraction IS NOT NULL THEN 'fraction'
      END,
      uncertainty = CASE WHEN jsonb_typeof(details->'uncertainty') = 'number' THEN (details->>'uncertainty')::float8 END;
  `);
};

export const down: Migration = async ({ context: qi }) => {
  // Rows of kinds the old ENUM did not know make the cast fail (nothing is deleted on the way down).
  await qi.sequelize.query(`
    ALTER TABLE signatures DROP COLUMN uncertainty, DROP COLUMN unit, DROP COLUMN magnitude;
    CREATE TYPE technique AS ENUM ('absorption', 'pl', 'ir');
    CREATE TYPE signature_kind AS ENUM ('bleach', 'new-band', 'pl-quench', 'shift', 'broadening');
    ALTER TABLE signatures DROP CONSTRAINT ${REGISTRY_COLUMNS.signatureKind.constraint};
    ALTER TABLE signatures ALTER COLUMN kind TYPE signature_kind USING kind::signature_kind;
    ALTER TABLE spectra DROP CONSTRAINT ${REGISTRY_COLUMNS.spectrumTechnique.constraint};
    ALTER TABLE spectra DROP CONSTRAINT spectra_supernatant_shape;
    ALTER TABLE spectra ALTER COLUMN technique TYPE technique USING technique::technique;
    ALTER TABLE spectra ADD CONSTRAINT spectra_supernatant_shape CHECK (
      supernatant_of_spectrum_id IS NULL
      OR (technique = 'absorption' AND series_id IS NULL AND supernatant_of_spectrum_id <> id)
    );
  `);
};
