/** The shape of a record id (a UUID, any version), without anchors, for patterns that embed one. */
export const UUID_PATTERN = "[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}";

const UUID = new RegExp(`^${UUID_PATTERN}$`, "i");

/**
 * Whether a string from a URL or form is shaped like a record id. Checked before a query,
 * so a malformed id is answered as not found instead of reaching PostgreSQL's uuid parser.
 */
export function isUuid(text: string): boolean {
  return UUID.test(text);
}
