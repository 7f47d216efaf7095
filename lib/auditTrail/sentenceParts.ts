// The pieces an audit sentence is made of: plain text, and names of records that may link to
// the record's page when the reader may open it. Pure: the names and links are looked up by the
// caller (lib/queries/audit.ts) and handed in, so tests give known inputs and read exact text.

/** Records a sentence can name and link to. */
export const AUDIT_REF_TYPES = ["spectrum", "sample", "series", "project", "signature", "user"] as const;
export type AuditRefType = (typeof AUDIT_REF_TYPES)[number];
export type AuditRef = { type: AuditRefType; id: string };

/** What the reader may know of a named record: its current name, and its page if they may open it. */
export type KnownRecord = { name: string; href: string | null };
export type RecordLookup = (ref: AuditRef) => KnownRecord | undefined;

export type SentencePart = { text: string; href?: string };

/** One audit event as the sentence builders read it. */
export type AuditEventInput = {
  action: string;
  actorId: string | null;
  actorLabel: string;
  targetType: string | null;
  targetId: string | null;
  details: Record<string, unknown>;
};

/** Helpers handed to each sentence builder. */
export type SentenceTools = {
  /** The person who acted, by name when known, else the label recorded with the event. */
  who: SentencePart;
  /** A record by id: its current name (else the fallback) and, when the reader may open it, its link. */
  ref: (type: AuditRefType, id: unknown, fallback: string) => SentencePart;
  /** A detail as text ("" when missing or not a string/number). */
  text: (key: string) => string;
  /** A detail as a number (null when missing). */
  num: (key: string) => number | null;
  /** A fixed link to a page every reader of the audit trail may open (the stewardship pages). */
  page: (text: string, href: string) => SentencePart;
};

export function sentenceTools(event: AuditEventInput, lookup: RecordLookup): SentenceTools {
  const detail = (key: string) => event.details[key];
  const ref = (type: AuditRefType, id: unknown, fallback: string): SentencePart => {
    if (typeof id !== "string" || id === "") return { text: fallback };
    const known = lookup({ type, id });
    if (!known) return { text: fallback };
    return known.href ? { text: known.name || fallback, href: known.href } : { text: known.name || fallback };
  };
  const label = event.actorLabel || "someone";
  return {
    who: event.actorId ? { text: lookup({ type: "user", id: event.actorId })?.name || label } : { text: label },
    ref,
    text: (key) => {
      const v = detail(key);
      return typeof v === "string" ? v : typeof v === "number" ? String(v) : "";
    },
    num: (key) => {
      const v = detail(key);
      return typeof v === "number" && Number.isFinite(v) ? v : null;
    },
    page: (text, href) => ({ text, href }),
  };
}

/** Joins text and parts; strings become plain parts, adjacent plain parts merge. */
export function sentence(...pieces: (string | SentencePart | SentencePart[] | null | false | undefined)[]): SentencePart[] {
  const out: SentencePart[] = [];
  for (const piece of pieces.flat()) {
    if (piece === null || piece === false || piece === undefined || piece === "") continue;
    const part = typeof piece === "string" ? { text: piece } : piece;
    const last = out[out.length - 1];
    if (last && !last.href && !part.href) out[out.length - 1] = { text: last.text + part.text };
    else out.push(part);
  }
  return out;
}

export const plainText = (parts: SentencePart[]) => parts.map((p) => p.text).join("");

/** Collects the records a set of sentences names, so the caller can look them up in one pass. */
export function recordingLookup(): { lookup: RecordLookup; refs: Map<AuditRefType, Set<string>> } {
  const refs = new Map<AuditRefType, Set<string>>();
  return {
    refs,
    lookup: (ref) => {
      if (!refs.has(ref.type)) refs.set(ref.type, new Set());
      refs.get(ref.type)!.add(ref.id);
      return undefined;
    },
  };
}
