// CHECK constraints that keep registry-listed columns (flag kinds, techniques, magnitude units)
// to the registries' keys. Migrations build and change them here; the integration test
// tests/integration/registry-database.test.ts reads them back from PostgreSQL and compares them
// with the registries, so a kind added without its migration fails `npm test`, not production.
// Pure: the migrations pass in their own query function.

import { FLAG_KINDS, FLAG_UNITS } from "./flagKinds";
import { TECHNIQUES } from "./techniques";

export type RegistryColumn = { table: string; column: string; constraint: string; nullable: boolean; values: readonly string[] };

export const REGISTRY_COLUMNS = {
  signatureKind: { table: "signatures", column: "kind", constraint: "signatures_kind_known", nullable: false, values: FLAG_KINDS },
  signatureUnit: { table: "signatures", column: "unit", constraint: "signatures_unit_known", nullable: true, values: FLAG_UNITS },
  spectrumTechnique: { table: "spectra", column: "technique", constraint: "spectra_technique_known", nullable: false, values: TECHNIQUES },
} as const satisfies Record<string, RegistryColumn>;

export type RegistryColumnName = keyof typeof REGISTRY_COLUMNS;

const literal = (v: string) => {
  if (!/^[A-Za-z0-9][A-Za-z0-9-]*$/.test(v)) throw new RangeError(`registry key "${v}" must be letters, digits and hyphens`);
  return `'${v}'`;
};

/** `CHECK (column IN ('a', 'b'))` (or NULL) for the given values. */
export function inCheck(c: Pick<RegistryColumn, "column" | "nullable">, values: readonly string[]): string {
  if (values.length === 0) throw new RangeError(`no values for the check on ${c.column}`);
  const list = `${c.column} IN (${values.map(literal).join(", ")})`;
  return `CHECK (${c.nullable ? `${c.column} IS NULL OR ${list}` : list})`;
}

/** SQL that replaces a column's check with one for exactly the given values. */
export function replaceCheckSql(c: RegistryColumn, values: readonly string[]): string {
  return `ALTER TABLE ${c.table} DROP CONSTRAINT IF EXISTS ${c.constraint};
    ALTER TABLE ${c.table} ADD CONSTRAINT ${c.constraint} ${inCheck(c, values)};`;
}

/** SQL that reads a constraint's definition as PostgreSQL stores it. */
export function constraintDefinitionSql(c: RegistryColumn): string {
  return `SELECT pg_get_constraintdef(oid) AS def FROM pg_constraint WHERE conname = '${c.constraint}' AND conrelid = '${c.table}'::regclass`;
}

/**
 * The values a stored check allows, from pg_get_constraintdef's text, e.g.
 * `CHECK ((kind = ANY (ARRAY['bleach'::text, 'shift'::text])))`. Keys never hold quotes (see literal()).
 */
export function valuesOfCheck(definition: string): string[] {
  return [...definition.matchAll(/'([^']*)'::text/g)].map((m) => m[1]!);
}

type Query = (sql: string) => Promise<{ def: string }[]>;

/** The values a live check allows (empty when the constraint is missing). */
export async function liveCheckValues(query: Query, c: RegistryColumn): Promise<string[]> {
  const rows = await query(constraintDefinitionSql(c));
  return rows[0] ? valuesOfCheck(rows[0].def) : [];
}

/**
 * Adds values to (or removes them from) a registry column's live check: a new kind's migration is
 * `up: addCheckValues(..., ["my-kind"])`, `down: removeCheckValues(..., ["my-kind"])`.
 */
export async function addCheckValues(
  query: Query,
  exec: (sql: string) => Promise<unknown>,
  c: RegistryColumn,
  added: readonly string[],
): Promise<void> {
  const current = await liveCheckValues(query, c);
  await exec(replaceCheckSql(c, [...current, ...added.filter((v) => !current.includes(v))]));
}

export async function removeCheckValues(
  query: Query,
  exec: (sql: string) => Promise<unknown>,
  c: RegistryColumn,
  removed: readonly string[],
): Promise<void> {
  const current = await liveCheckValues(query, c);
  await exec(
    replaceCheckSql(
      c,
      current.filter((v) => !removed.includes(v)),
    ),
  );
}
