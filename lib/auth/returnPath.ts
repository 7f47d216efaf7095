/**
 * The one check for a path we send a person back to after signing in (server and client).
 * Only a same-origin path survives: it must start with exactly one "/", contain no
 * backslash, control or whitespace character, and no percent-encoded slash, backslash or
 * control byte (browsers decode or strip those and may then read "//host" or "/\host" as
 * another origin). Anything else answers "/".
 */
export function safeReturnPath(value: unknown): string {
  const candidate = Array.isArray(value) ? value[0] : value;
  if (typeof candidate !== "string" || candidate.length === 0 || candidate.length > 2048) return "/";
  if (!candidate.startsWith("/") || candidate.startsWith("//")) return "/";
  // Backslashes, ASCII controls (tab, CR, LF …), spaces and Unicode line/format separators.
  if (/[\\\s\u0000-\u001f\u007f\u200b-\u200f\u2028-\u202e\u2066-\u2069\ufeff]/.test(candidate)) return "/";
  // Encoded slash, backslash or control byte: "/%2F/evil", "/%5Cevil", "/%09/evil".
  if (/%(2f|5c|[01][0-9a-f]|7f)/i.test(candidate)) return "/";
  // Parse against a sentinel origin: a same-origin path keeps it.
  let parsed: URL;
  try {
    parsed = new URL(candidate, "http://return-path.invalid");
  } catch {
    return "/";
  }
  if (parsed.origin !== "http://return-path.invalid") return "/";
  return `${parsed.pathname}${parsed.search}${parsed.hash}`;
}
