import { z } from "zod";

/**
 * A keyset position: the sort timestamp as PostgreSQL wrote it (microseconds, UTC) and the
 * row's id, so the next page starts strictly after the last row shown whatever was added since.
 */
export type KeysetPosition = { at: string; id: string };

const positionSchema = z.object({
  at: z.string().regex(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(\.\d{1,6})?Z$/),
  id: z.string().regex(/^[0-9a-f-]{1,40}$/i),
});

export function encodeCursor(position: KeysetPosition): string {
  return Buffer.from(`${position.at}|${position.id}`, "utf8").toString("base64url");
}

/** The position in a cursor, or null when the text is not a cursor this app wrote. */
export function decodeCursor(cursor: string): KeysetPosition | null {
  const text = Buffer.from(cursor, "base64url").toString("utf8");
  const [at, id, ...rest] = text.split("|");
  if (rest.length) return null;
  const parsed = positionSchema.safeParse({ at, id });
  return parsed.success ? parsed.data : null;
}

/** SQL that renders a timestamptz column as the cursor's `at` (UTC, microseconds). */
export const cursorAtSql = (column: string) => `to_char(${column} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`;

/**
 * A keyset position in a list sorted by some value first (the review queue's significance, kind,
 * project or sample name), then by time and id: the value as text, as PostgreSQL wrote it.
 */
export type SortedPosition = KeysetPosition & { value: string };

const sortedSchema = z.tuple([z.string().max(400), positionSchema.shape.at, positionSchema.shape.id]);

export function encodeSortedCursor(position: SortedPosition): string {
  return Buffer.from(JSON.stringify([position.value, position.at, position.id]), "utf8").toString("base64url");
}

/** The position in a sorted cursor, or null when the text is not one this app wrote. */
export function decodeSortedCursor(cursor: string): SortedPosition | null {
  let json: unknown;
  try {
    json = JSON.parse(Buffer.from(cursor, "base64url").toString("utf8"));
  } catch {
    return null;
  }
  const parsed = sortedSchema.safeParse(json);
  return parsed.success ? { value: parsed.data[0], at: parsed.data[1], id: parsed.data[2] } : null;
}
