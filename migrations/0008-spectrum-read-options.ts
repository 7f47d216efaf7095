import type { Migration } from "../lib/migrator";

// How a spectrum is read out of its raw file besides the column (block, pair, sheet, a chosen X
// unit or Y kind), so every later reading (re-runs, references, viewer, evidence, exports) reads
// it the same way. The column stays in column_choice.
export const up: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`
    ALTER TABLE spectra ADD COLUMN read_options jsonb NOT NULL DEFAULT '{}'::jsonb
      CONSTRAINT spectra_read_options_object CHECK (jsonb_typeof(read_options) = 'object');
  `);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.sequelize.query(`ALTER TABLE spectra DROP COLUMN IF EXISTS read_options;`);
};
