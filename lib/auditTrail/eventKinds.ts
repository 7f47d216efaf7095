import { FLAG_KIND_SPECS, type FlagKind } from "@/lib/registry/flagKinds";
import { formatWhen } from "@/lib/format/dates";
import { sentence, sentenceTools, type AuditEventInput, type RecordLookup, type SentencePart, type SentenceTools } from "./sentenceParts";

// Every audit event code the app writes, written once: its category (the audit trail's filter)
// and the sentence a person reads. recordAudit() takes only these codes, so a new code without
// a category and a sentence does not compile; tests/unit/audit-sentences.test.ts reads every
// code written in SQL too. The codes themselves stay as stored (the trail is append-only), and
// the CSV export keeps them raw.

export const AUDIT_CATEGORIES = ["sign-in", "upload", "analysis", "decision", "sharing", "retention", "holds"] as const;
export type AuditCategory = (typeof AUDIT_CATEGORIES)[number];

export const AUDIT_CATEGORY_LABELS: Record<AuditCategory, string> = {
  "sign-in": "Sign-ins and tokens",
  upload: "Uploads and records",
  analysis: "Analyses",
  decision: "Review decisions",
  sharing: "Sharing and members",
  retention: "Keep rules and deletions",
  holds: "Legal holds",
};

type KindSpec = { category: AuditCategory; sentence: (t: SentenceTools, e: AuditEventInput) => SentencePart[] };

const ROLE_WORDS: Record<string, string> = {
  spectroscopist: "spectroscopist",
  lead: "group lead",
  steward: "data steward",
  collaborator: "collaborator",
};
const role = (r: string) => ROLE_WORDS[r] ?? (r || "member");
const CLASS_WORDS: Record<string, string> = { raw: "raw files", processed: "processed data", drafts: "failed uploads" };
const dataClass = (c: string) => CLASS_WORDS[c] ?? (c || "data");
const DECISION_WORDS: Record<string, string> = { confirmed: "confirmed", dismissed: "dismissed", awaiting: "awaiting review" };
const decisionWord = (d: string) => DECISION_WORDS[d] ?? d;
/** A flag kind's label inside a sentence: "exciton bleach", "PL quench" (acronyms keep their capitals). */
export function flagKindWord(kind: string): string {
  if (!Object.hasOwn(FLAG_KIND_SPECS, kind)) return "flagged change";
  const label = FLAG_KIND_SPECS[kind as FlagKind].label;
  return /^[A-Z][A-Z]/.test(label) ? label : label.charAt(0).toLowerCase() + label.slice(1);
}
const kindWord = flagKindWord;
const afterExpiry = (onExpiry: string) => (onExpiry === "flag" ? "then flagged for clean-up" : "then deleted");
const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString("en-GB")} ${n === 1 ? one : many}`;
const quoted = (s: string) => (s ? `“${s}”` : "");

/** The record a project/series/sample/spectrum target names, by its type. */
function target(t: SentenceTools, e: AuditEventInput, fallbackName = ""): SentencePart[] {
  const type = e.targetType ?? "";
  if (type === "project" || type === "series" || type === "sample" || type === "spectrum") {
    const fallback = fallbackName || (type === "spectrum" ? "a spectrum" : `a ${type}`);
    return sentence(`the ${type} `, t.ref(type, e.targetId, fallback));
  }
  return sentence(fallbackName || "a record");
}

/** The signature of a decision event: "the exciton bleach on file.csv". */
function signatureOn(t: SentenceTools, e: AuditEventInput): SentencePart[] {
  const kind = t.text("kind");
  return sentence(
    "the ",
    t.ref("signature", e.targetId, kind ? kindWord(kind) : "flagged change"),
    " on ",
    t.ref("spectrum", e.details.spectrumId, "a spectrum"),
  );
}

const sharing = (t: SentenceTools) => t.page("sharing", "/stewardship/sharing");

export const AUDIT_EVENT_KINDS = {
  // --- sign-ins and tokens ---
  "sign-in": { category: "sign-in", sentence: (t) => sentence(t.who, " signed in", t.text("address") && ` from ${t.text("address")}`) },
  "sign-in-refused": {
    category: "sign-in",
    sentence: (t, e) =>
      sentence(
        "A sign-in as ",
        e.actorLabel || "an unknown address",
        " was refused",
        t.text("address") && ` (from ${t.text("address")}`,
        t.num("failuresFromAddress") !== null && `, ${plural(t.num("failuresFromAddress")!, "failure")} from that address so far`,
        t.text("address") && ")",
      ),
  },
  "sign-in-locked": {
    category: "sign-in",
    sentence: (t, e) =>
      sentence(
        "Sign-ins as ",
        e.actorLabel || "an account",
        " were paused after ",
        plural(t.num("failuresOfAccount") ?? 0, "failed attempt"),
        "; an unlock link was mailed",
      ),
  },
  "sign-in-unlocked": {
    category: "sign-in",
    sentence: (_t, e) => sentence(e.actorLabel || "Someone", " lifted the sign-in pause with the mailed link"),
  },
  "api-token-created": {
    category: "sign-in",
    sentence: (t) =>
      sentence(
        t.who,
        " created the API token ",
        quoted(t.text("name")) || "(unnamed)",
        t.text("lifetime") && ` (lifetime: ${t.text("lifetime")})`,
      ),
  },
  "api-token-revoked": { category: "sign-in", sentence: (t) => sentence(t.who, " revoked an API token") },

  // --- uploads and records ---
  "spectrum.upload": {
    category: "upload",
    sentence: (t, e) => sentence(t.who, " uploaded ", t.ref("spectrum", e.targetId, t.text("fileName") || "a spectrum")),
  },
  "spectrum.upload-duplicate": {
    category: "upload",
    sentence: (t, e) => {
      const differences = Array.isArray(e.details.differences) ? e.details.differences.length : 0;
      return sentence(
        t.who,
        " uploaded ",
        t.text("fileName") || "a file",
        " again; it is the same file as ",
        t.ref("spectrum", e.targetId, "a stored spectrum"),
        ", which was kept",
        differences > 0 && ` (${plural(differences, "detail")} given differently, the stored ones kept)`,
      );
    },
  },
  "spectrum.details-update": {
    category: "upload",
    sentence: (t, e) => {
      const differences = Array.isArray(e.details.differences) ? e.details.differences.length : 0;
      return sentence(
        t.who,
        " updated the stored details of ",
        t.ref("spectrum", e.targetId, t.text("fileName") || "a spectrum"),
        differences > 0 && ` (${plural(differences, "detail")})`,
        " from a new upload of the same file",
      );
    },
  },
  "import-profile.create": {
    category: "upload",
    sentence: (t) => sentence(t.who, " saved the import profile ", quoted(t.text("name")) || "(unnamed)"),
  },
  "import-profile.replace": {
    category: "upload",
    sentence: (t) => sentence(t.who, " replaced the import profile ", quoted(t.text("name")) || "(unnamed)"),
  },
  "import-profile.delete": {
    category: "upload",
    sentence: (t) => sentence(t.who, " deleted the import profile ", quoted(t.text("name")) || "(unnamed)"),
  },
  "sample-registered": {
    category: "upload",
    sentence: (t, e) =>
      sentence(
        t.who,
        " registered the sample ",
        t.ref("sample", e.targetId, t.text("name") || "a sample"),
        t.text("material") && ` (${t.text("material")})`,
      ),
  },
  "series-created": {
    category: "upload",
    sentence: (t, e) =>
      sentence(
        t.who,
        " created the ",
        t.text("kind") && `${t.text("kind")} `,
        "series ",
        t.ref("series", e.targetId, t.text("name") || "a series"),
      ),
  },
  "supernatant-linked": {
    category: "upload",
    sentence: (t, e) =>
      sentence(
        t.who,
        " linked the supernatant ",
        t.ref("spectrum", e.targetId, t.text("fileName") || "a spectrum"),
        " to the point ",
        t.ref("spectrum", e.details.pointSpectrumId, "a point"),
        " of the series ",
        t.ref("series", e.details.seriesId, "a series"),
      ),
  },
  "supernatant-unlinked": {
    category: "upload",
    sentence: (t, e) =>
      sentence(
        t.who,
        " unlinked the supernatant ",
        t.ref("spectrum", e.targetId, t.text("fileName") || "a spectrum"),
        " from the point ",
        t.ref("spectrum", e.details.previousPointSpectrumId, "a point"),
        " of the series ",
        t.ref("series", e.details.seriesId, "a series"),
      ),
  },

  // --- analyses ---
  "analysis.request": {
    category: "analysis",
    sentence: (t, e) =>
      sentence(
        t.who,
        " asked for a new analysis of ",
        t.ref("spectrum", e.targetId, "a spectrum"),
        typeof e.details.referenceSpectrumId === "string" &&
          sentence(" against ", t.ref("spectrum", e.details.referenceSpectrumId, "a reference")),
      ),
  },
  "signatures-superseded": {
    category: "analysis",
    sentence: (t, e) => {
      const carried = t.num("carried") ?? 0;
      const notCarried = t.num("notCarried") ?? 0;
      return sentence(
        "A new analysis of ",
        t.ref("spectrum", e.targetId, "a spectrum"),
        " replaced ",
        plural(t.num("superseded") ?? 0, "flagged change"),
        carried + notCarried > 0 &&
          `; ${plural(carried, "decision")} carried over, ${notCarried.toLocaleString("en-GB")} not carried (the band moved or changed too much)`,
      );
    },
  },

  // --- review decisions ---
  "signature-decided": {
    category: "decision",
    sentence: (t, e) => sentence(t.who, ` ${decisionWord(t.text("decision"))} `, signatureOn(t, e)),
  },
  "signature-decision-revised": {
    category: "decision",
    sentence: (t, e) =>
      sentence(
        t.who,
        " changed the decision on ",
        signatureOn(t, e),
        ` from ${decisionWord(t.text("previousState"))} to ${decisionWord(t.text("decision"))}`,
      ),
  },
  "signature-decision-undone": {
    category: "decision",
    sentence: (t, e) =>
      sentence(t.who, " undid the decision on ", signatureOn(t, e), `; it is ${decisionWord(t.text("restoredState"))} again`),
  },

  // --- sharing and members ---
  "share-created": {
    category: "sharing",
    sentence: (t, e) =>
      sentence(
        t.who,
        " shared ",
        target(t, e),
        " with ",
        t.text("grantee") || "a collaborator",
        t.text("expiresAt") ? ` until ${formatWhen(t.text("expiresAt"))}` : "",
        " (",
        sharing(t),
        ")",
      ),
  },
  "share-revoked": {
    category: "sharing",
    sentence: (t, e) => sentence(t.who, " revoked a collaborator's share of ", target(t, e), " (", sharing(t), ")"),
  },
  "share-link-created": {
    category: "sharing",
    sentence: (t, e) =>
      sentence(
        t.who,
        " created a read-only link",
        t.text("prefix") && ` (${t.text("prefix")}…)`,
        " to ",
        target(t, e, t.text("target")),
        t.text("expiresAt") ? `, expiring ${formatWhen(t.text("expiresAt"))}` : ", with no expiry",
        " (",
        sharing(t),
        ")",
      ),
  },
  "share-link-revoked": {
    category: "sharing",
    sentence: (t, e) => sentence(t.who, " revoked a read-only link to ", target(t, e), " (", sharing(t), ")"),
  },
  "invitation-sent": {
    category: "sharing",
    sentence: (t) =>
      sentence(
        t.who,
        " invited ",
        t.text("email") || "someone",
        ` as ${role(t.text("role"))}`,
        t.text("share") && ", with a share",
        " (",
        sharing(t),
        ")",
      ),
  },
  "invitation-revoked": {
    category: "sharing",
    sentence: (t) => sentence(t.who, " withdrew the invitation to ", t.text("email") || "someone"),
  },
  "invitation-accepted": {
    category: "sharing",
    sentence: (t, e) =>
      sentence(
        t.who,
        ` accepted the invitation as ${role(t.text("role"))}`,
        e.details.accountCreated === true && " and created an account",
      ),
  },
  "member-role-changed": {
    category: "sharing",
    sentence: (t, e) =>
      sentence(t.who, " changed ", t.ref("user", e.targetId, "a member"), `'s role from ${role(t.text("from"))} to ${role(t.text("to"))}`),
  },
  "member-removed": {
    category: "sharing",
    sentence: (t, e) => sentence(t.who, " removed ", t.ref("user", e.targetId, "a member"), ` (${role(t.text("role"))}) from the group`),
  },
  exported: {
    category: "sharing",
    sentence: (t, e) =>
      sentence(t.who, " downloaded an export bundle of ", target(t, e), t.num("files") !== null && ` (${plural(t.num("files")!, "file")})`),
  },

  // --- keep rules and deletions ---
  "retention-policy-created": {
    category: "retention",
    sentence: (t) =>
      sentence(
        t.who,
        " set a ",
        t.page("keep rule", "/stewardship/policies"),
        ` for ${t.text("project") || "a project"}: ${dataClass(t.text("dataClass"))} kept `,
        plural(t.num("keepDays") ?? 0, "day"),
        `, ${afterExpiry(t.text("onExpiry"))}`,
      ),
  },
  "retention-policy-changed": {
    category: "retention",
    sentence: (t, e) => {
      const before = e.details.before as { keepDays?: unknown; onExpiry?: unknown } | null | undefined;
      const was =
        before && typeof before.keepDays === "number"
          ? ` (was ${plural(before.keepDays, "day")}, ${afterExpiry(String(before.onExpiry ?? ""))})`
          : "";
      return sentence(
        t.who,
        " changed the ",
        t.page("keep rule", "/stewardship/policies"),
        ` for ${t.text("project") || "a project"}'s ${dataClass(t.text("dataClass"))}: kept `,
        plural(t.num("keepDays") ?? 0, "day"),
        `, ${afterExpiry(t.text("onExpiry"))}`,
        was,
      );
    },
  },
  "retention-policy-removed": {
    category: "retention",
    sentence: (t) =>
      sentence(
        t.who,
        " removed the ",
        t.page("keep rule", "/stewardship/policies"),
        ` for ${t.text("project") || "a project"}'s ${dataClass(t.text("dataClass"))}`,
      ),
  },
  "retention-flagged": {
    category: "retention",
    sentence: (t, e) =>
      sentence(
        "Its keep rule ended for ",
        target(t, e, t.text("label")),
        "; it waits on ",
        t.page("Clean-up due", "/stewardship"),
        " for a decision",
      ),
  },
  "retention-flag-kept": {
    category: "retention",
    sentence: (t, e) => sentence(t.who, " kept ", target(t, e, t.text("label")), " for good (its keep rule had ended)"),
  },
  "retention-flag-deleted": {
    category: "retention",
    sentence: (t) => sentence(t.who, " chose to delete ", t.text("label") || "an item", " (its keep rule had ended)"),
  },
  deleted: {
    category: "retention",
    sentence: (t, e) => {
      const by = t.text("cause") === "policy" ? "The clean-up sweep" : null;
      const what =
        e.targetType === "analysis-run"
          ? sentence("an analysis of ", t.ref("spectrum", e.details.spectrumId, "a spectrum"))
          : sentence("the spectrum ", t.text("fileName") || "(no name recorded)");
      const why =
        t.text("cause") === "policy" ? " (its keep rule ended)" : t.text("cause") === "steward" ? " (a steward's clean-up decision)" : "";
      return sentence(by ?? t.who, " deleted ", what, why);
    },
  },

  // --- legal holds ---
  "hold-placed": {
    category: "holds",
    sentence: (t, e) =>
      sentence(
        t.who,
        " placed a ",
        t.page("legal hold", "/stewardship/holds"),
        " on ",
        target(t, e),
        t.text("reason") && `: ${quoted(t.text("reason"))}`,
      ),
  },
  "hold-lifted": {
    category: "holds",
    sentence: (t, e) =>
      sentence(
        t.who,
        " lifted the ",
        t.page("legal hold", "/stewardship/holds"),
        " on ",
        target(t, e),
        t.text("reason") && ` (${quoted(t.text("reason"))})`,
      ),
  },
} as const satisfies Record<string, KindSpec>;

export type AuditAction = keyof typeof AUDIT_EVENT_KINDS;
export const AUDIT_ACTIONS = Object.keys(AUDIT_EVENT_KINDS) as AuditAction[];

export const isAuditAction = (code: string): code is AuditAction => Object.hasOwn(AUDIT_EVENT_KINDS, code);

/** The codes of one category, for the filter's SQL. */
export const actionsOf = (category: AuditCategory): AuditAction[] =>
  AUDIT_ACTIONS.filter((a) => AUDIT_EVENT_KINDS[a].category === category);

export const categoryOf = (code: string): AuditCategory | null => (isAuditAction(code) ? AUDIT_EVENT_KINDS[code].category : null);

/** The sentence of one event; a code this app never wrote (an older build's) still reads as a sentence. */
export function describeEvent(event: AuditEventInput, lookup: RecordLookup): SentencePart[] {
  const tools = sentenceTools(event, lookup);
  if (!isAuditAction(event.action)) return sentence(tools.who, ` recorded “${event.action}”`);
  return AUDIT_EVENT_KINDS[event.action].sentence(tools, event);
}
