import { readFileSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import {
  AUDIT_ACTIONS,
  AUDIT_CATEGORIES,
  AUDIT_EVENT_KINDS,
  actionsOf,
  describeEvent,
  type AuditAction,
} from "@/lib/auditTrail/eventKinds";
import { foldSignIns, foldedSentence } from "@/lib/auditTrail/foldSignIns";
import { plainText, type AuditEventInput, type KnownRecord, type RecordLookup } from "@/lib/auditTrail/sentenceParts";

// Every audit event code, with known inputs (the details the app writes, as in the recordAudit
// calls) and the exact sentence a person reads. The table is typed by the codes, so a code added
// to lib/auditTrail/eventKinds.ts without a case here does not compile; the source scan below
// finds codes written by SQL, which the type checker cannot see.

const LEAD = "00000000-0000-4000-8000-000000000001";
const MEMBER = "00000000-0000-4000-8000-000000000002";
const SPECTRUM = "00000000-0000-4000-8000-00000000000a";
const POINT = "00000000-0000-4000-8000-00000000000b";
const SIGNATURE = "00000000-0000-4000-8000-00000000000c";
const SERIES = "00000000-0000-4000-8000-00000000000d";
const SAMPLE = "00000000-0000-4000-8000-00000000000e";
const PROJECT = "00000000-0000-4000-8000-00000000000f";
const GONE = "00000000-0000-4000-8000-0000000000ff";

const KNOWN: Record<string, KnownRecord> = {
  [`user:${LEAD}`]: { name: "Imre Vasko", href: null },
  [`user:${MEMBER}`]: { name: "Odile Brant", href: null },
  [`spectrum:${SPECTRUM}`]: { name: "titration-1.00eq.csv", href: `/spectra/${SPECTRUM}` },
  [`spectrum:${POINT}`]: { name: "titration-0.50eq.csv", href: `/spectra/${POINT}` },
  [`signature:${SIGNATURE}`]: { name: "exciton bleach", href: `/review/${SIGNATURE}` },
  [`series:${SERIES}`]: { name: "Thiol titration", href: `/series/${SERIES}` },
  [`sample:${SAMPLE}`]: { name: "QD-CdSe-07", href: `/samples/${SAMPLE}` },
  [`project:${PROJECT}`]: { name: "Ligand exchange", href: null }, // known but not openable: named, not linked
};
const lookup: RecordLookup = (ref) => KNOWN[`${ref.type}:${ref.id}`];

const ev = (action: AuditAction, over: Partial<AuditEventInput> = {}): AuditEventInput => ({
  action,
  actorId: LEAD,
  actorLabel: "lead@example.test",
  targetType: null,
  targetId: null,
  details: {},
  ...over,
});

const CASES: Record<AuditAction, { event: AuditEventInput; sentence: string }> = {
  "sign-in": { event: ev("sign-in", { details: { address: "10.0.0.7" } }), sentence: "Imre Vasko signed in from 10.0.0.7" },
  "sign-in-refused": {
    event: ev("sign-in-refused", {
      actorId: null,
      actorLabel: "nobody@example.test",
      details: { address: "10.0.0.9", failuresFromAddress: 1, failuresOfAccount: 0 },
    }),
    sentence: "A sign-in as nobody@example.test was refused (from 10.0.0.9, 1 failure from that address so far)",
  },
  "sign-in-locked": {
    event: ev("sign-in-locked", {
      actorLabel: "lead@example.test",
      details: { address: "10.0.0.9", failuresFromAddress: 50, failuresOfAccount: 50 },
    }),
    sentence: "Sign-ins as lead@example.test were paused after 50 failed attempts; an unlock link was mailed",
  },
  "sign-in-unlocked": {
    event: ev("sign-in-unlocked", { actorId: null }),
    sentence: "lead@example.test lifted the sign-in pause with the mailed link",
  },
  "api-token-created": {
    event: ev("api-token-created", { details: { name: "plate reader", lifetime: "90d" } }),
    sentence: "Imre Vasko created the API token “plate reader” (lifetime: 90d)",
  },
  "api-token-revoked": {
    event: ev("api-token-revoked", { targetType: "api-token", targetId: "x" }),
    sentence: "Imre Vasko revoked an API token",
  },
  "spectrum.upload": {
    event: ev("spectrum.upload", {
      targetType: "spectrum",
      targetId: SPECTRUM,
      details: { fileName: "old-name.csv", sha256: "ab", sizeBytes: 10 },
    }),
    sentence: "Imre Vasko uploaded titration-1.00eq.csv",
  },
  "spectrum.upload-duplicate": {
    event: ev("spectrum.upload-duplicate", {
      targetType: "spectrum",
      targetId: SPECTRUM,
      details: { fileName: "copy.csv", differences: [{ field: "solvent" }] },
    }),
    sentence:
      "Imre Vasko uploaded copy.csv again; it is the same file as titration-1.00eq.csv, which was kept (1 detail given differently, the stored ones kept)",
  },
  "spectrum.details-update": {
    event: ev("spectrum.details-update", {
      targetType: "spectrum",
      targetId: SPECTRUM,
      details: { fileName: "copy.csv", differences: [{ field: "solvent" }, { field: "pathLengthCm" }] },
    }),
    sentence: "Imre Vasko updated the stored details of titration-1.00eq.csv (2 details) from a new upload of the same file",
  },
  "import-profile.create": {
    event: ev("import-profile.create", { targetType: "import-profile", targetId: "p", details: { name: "bench photometer" } }),
    sentence: "Imre Vasko saved the import profile “bench photometer”",
  },
  "import-profile.replace": {
    event: ev("import-profile.replace", { targetType: "import-profile", targetId: "p", details: { name: "bench photometer" } }),
    sentence: "Imre Vasko replaced the import profile “bench photometer”",
  },
  "import-profile.delete": {
    event: ev("import-profile.delete", { targetType: "import-profile", targetId: "p", details: { name: "bench photometer" } }),
    sentence: "Imre Vasko deleted the import profile “bench photometer”",
  },
  "sample-registered": {
    event: ev("sample-registered", { targetType: "sample", targetId: SAMPLE, details: { name: "QD-CdSe-07", material: "CdSe" } }),
    sentence: "Imre Vasko registered the sample QD-CdSe-07 (CdSe)",
  },
  "series-created": {
    event: ev("series-created", { targetType: "series", targetId: SERIES, details: { name: "Thiol titration", kind: "titration" } }),
    sentence: "Imre Vasko created the titration series Thiol titration",
  },
  "supernatant-linked": {
    event: ev("supernatant-linked", {
      targetType: "spectrum",
      targetId: SPECTRUM,
      details: { seriesId: SERIES, pointSpectrumId: POINT, previousPointSpectrumId: null, fileName: "sup.csv" },
    }),
    sentence: "Imre Vasko linked the supernatant titration-1.00eq.csv to the point titration-0.50eq.csv of the series Thiol titration",
  },
  "supernatant-unlinked": {
    event: ev("supernatant-unlinked", {
      targetType: "spectrum",
      targetId: GONE,
      details: { seriesId: SERIES, pointSpectrumId: null, previousPointSpectrumId: POINT, fileName: "sup-7.csv" },
    }),
    sentence: "Imre Vasko unlinked the supernatant sup-7.csv from the point titration-0.50eq.csv of the series Thiol titration",
  },
  "analysis.request": {
    event: ev("analysis.request", {
      targetType: "spectrum",
      targetId: SPECTRUM,
      details: { runId: "r", parameters: {}, referenceSpectrumId: POINT },
    }),
    sentence: "Imre Vasko asked for a new analysis of titration-1.00eq.csv against titration-0.50eq.csv",
  },
  "signatures-superseded": {
    event: ev("signatures-superseded", {
      actorId: null,
      actorLabel: "analysis",
      targetType: "spectrum",
      targetId: SPECTRUM,
      details: { runId: "r", superseded: 3, matched: 2, carried: 2, notCarried: 1 },
    }),
    sentence:
      "A new analysis of titration-1.00eq.csv replaced 3 flagged changes; 2 decisions carried over, 1 not carried (the band moved or changed too much)",
  },
  "signature-decided": {
    event: ev("signature-decided", {
      targetType: "signature",
      targetId: SIGNATURE,
      details: { decision: "confirmed", previousState: "awaiting", comment: "", kind: "bleach", spectrumId: SPECTRUM },
    }),
    sentence: "Imre Vasko confirmed the exciton bleach on titration-1.00eq.csv",
  },
  "signature-decision-revised": {
    event: ev("signature-decision-revised", {
      targetType: "signature",
      targetId: GONE,
      details: { decision: "dismissed", previousState: "confirmed", kind: "pl-quench", spectrumId: SPECTRUM },
    }),
    sentence: "Imre Vasko changed the decision on the PL quench on titration-1.00eq.csv from confirmed to dismissed",
  },
  "signature-decision-undone": {
    event: ev("signature-decision-undone", {
      targetType: "signature",
      targetId: SIGNATURE,
      details: { restoredState: "awaiting", previousState: "confirmed", spectrumId: SPECTRUM },
    }),
    sentence: "Imre Vasko undid the decision on the exciton bleach on titration-1.00eq.csv; it is awaiting review again",
  },
  "share-created": {
    event: ev("share-created", {
      targetType: "series",
      targetId: SERIES,
      details: { shareId: "s", grantee: "guest@example.test", expiresAt: "2027-01-31T00:00:00.000Z" },
    }),
    sentence: "Imre Vasko shared the series Thiol titration with guest@example.test until 31 Jan 2027, 00:00 UTC (sharing)",
  },
  "share-revoked": {
    event: ev("share-revoked", { targetType: "project", targetId: PROJECT, details: { shareId: "s" } }),
    sentence: "Imre Vasko revoked a collaborator's share of the project Ligand exchange (sharing)",
  },
  "share-link-created": {
    event: ev("share-link-created", {
      targetType: "series",
      targetId: SERIES,
      details: { shareId: "s", prefix: "Qx9_aB", target: "Thiol titration", expiresAt: null },
    }),
    sentence: "Imre Vasko created a read-only link (Qx9_aB…) to the series Thiol titration, with no expiry (sharing)",
  },
  "share-link-revoked": {
    event: ev("share-link-revoked", { targetType: "series", targetId: SERIES, details: { shareId: "s" } }),
    sentence: "Imre Vasko revoked a read-only link to the series Thiol titration (sharing)",
  },
  "invitation-sent": {
    event: ev("invitation-sent", {
      targetType: "invitation",
      targetId: "i",
      details: { email: "new@example.test", role: "collaborator", share: `series:${SERIES}` },
    }),
    sentence: "Imre Vasko invited new@example.test as collaborator, with a share (sharing)",
  },
  "invitation-revoked": {
    event: ev("invitation-revoked", { targetType: "invitation", targetId: "i", details: { email: "new@example.test" } }),
    sentence: "Imre Vasko withdrew the invitation to new@example.test",
  },
  "invitation-accepted": {
    event: ev("invitation-accepted", {
      actorId: MEMBER,
      targetType: "invitation",
      targetId: "i",
      details: { role: "spectroscopist", accountCreated: true, share: null },
    }),
    sentence: "Odile Brant accepted the invitation as spectroscopist and created an account",
  },
  "member-role-changed": {
    event: ev("member-role-changed", { targetType: "user", targetId: MEMBER, details: { from: "spectroscopist", to: "lead" } }),
    sentence: "Imre Vasko changed Odile Brant's role from spectroscopist to group lead",
  },
  "member-removed": {
    event: ev("member-removed", { targetType: "user", targetId: GONE, details: { role: "steward" } }),
    sentence: "Imre Vasko removed a member (data steward) from the group",
  },
  exported: {
    event: ev("exported", { targetType: "project", targetId: PROJECT, details: { files: 41, bytes: 9000 } }),
    sentence: "Imre Vasko downloaded an export bundle of the project Ligand exchange (41 files)",
  },
  "retention-policy-created": {
    event: ev("retention-policy-created", {
      targetType: "retention-policy",
      targetId: "p",
      details: { project: "Ligand exchange", dataClass: "raw", keepDays: 3650, onExpiry: "flag", before: null },
    }),
    sentence: "Imre Vasko set a keep rule for Ligand exchange: raw files kept 3,650 days, then flagged for clean-up",
  },
  "retention-policy-changed": {
    event: ev("retention-policy-changed", {
      targetType: "retention-policy",
      targetId: "p",
      details: {
        project: "Ligand exchange",
        dataClass: "drafts",
        keepDays: 30,
        onExpiry: "delete",
        before: { keepDays: 90, onExpiry: "flag" },
      },
    }),
    sentence:
      "Imre Vasko changed the keep rule for Ligand exchange's failed uploads: kept 30 days, then deleted (was 90 days, then flagged for clean-up)",
  },
  "retention-policy-removed": {
    event: ev("retention-policy-removed", {
      targetType: "retention-policy",
      targetId: "p",
      details: { project: "Ligand exchange", dataClass: "processed" },
    }),
    sentence: "Imre Vasko removed the keep rule for Ligand exchange's processed data",
  },
  "retention-flagged": {
    event: ev("retention-flagged", {
      actorId: null,
      actorLabel: "retention sweep",
      targetType: "spectrum",
      targetId: SPECTRUM,
      details: { label: "old.csv", policyId: "p", dataClass: "raw" },
    }),
    sentence: "Its keep rule ended for the spectrum titration-1.00eq.csv; it waits on Clean-up due for a decision",
  },
  "retention-flag-kept": {
    event: ev("retention-flag-kept", { targetType: "spectrum", targetId: GONE, details: { label: "old.csv" } }),
    sentence: "Imre Vasko kept the spectrum old.csv for good (its keep rule had ended)",
  },
  "retention-flag-deleted": {
    event: ev("retention-flag-deleted", { targetType: "spectrum", targetId: SPECTRUM, details: { label: "old.csv" } }),
    sentence: "Imre Vasko chose to delete old.csv (its keep rule had ended)",
  },
  deleted: {
    event: ev("deleted", {
      actorId: null,
      actorLabel: "retention sweep",
      targetType: "spectrum",
      targetId: GONE,
      details: { fileName: "old.csv", sha256: "ab", sizeBytes: 8, cause: "policy", tombstoneId: "t" },
    }),
    sentence: "The clean-up sweep deleted the spectrum old.csv (its keep rule ended)",
  },
  "hold-placed": {
    event: ev("hold-placed", { targetType: "sample", targetId: SAMPLE, details: { holdId: "h", reason: "Patent filing 2026-14" } }),
    sentence: "Imre Vasko placed a legal hold on the sample QD-CdSe-07: “Patent filing 2026-14”",
  },
  "hold-lifted": {
    event: ev("hold-lifted", { targetType: "project", targetId: PROJECT, details: { holdId: "h", reason: "Patent filing 2026-14" } }),
    sentence: "Imre Vasko lifted the legal hold on the project Ligand exchange (“Patent filing 2026-14”)",
  },
};

describe("the sentence of every audit event kind (known inputs, exact text)", () => {
  for (const action of AUDIT_ACTIONS) {
    it(action, () => {
      const c = CASES[action];
      expect(c, `no case for ${action}`).toBeDefined();
      expect(plainText(describeEvent(c.event, lookup))).toBe(c.sentence);
    });
  }

  it("links a named record only when the reader may open it", () => {
    const parts = describeEvent(CASES["signature-decided"].event, lookup);
    expect(parts.filter((p) => p.href).map((p) => [p.text, p.href])).toEqual([
      ["exciton bleach", `/review/${SIGNATURE}`],
      ["titration-1.00eq.csv", `/spectra/${SPECTRUM}`],
    ]);
    // the project is known by name but not openable: text, no link
    expect(describeEvent(CASES.exported.event, lookup).some((p) => p.text === "Ligand exchange" && p.href)).toBe(false);
    // a deleted record (not found) keeps the name the event recorded, without a link
    const gone = describeEvent(
      ev("spectrum.upload", { targetType: "spectrum", targetId: GONE, details: { fileName: "gone.csv" } }),
      lookup,
    );
    expect(gone).toEqual([{ text: "Imre Vasko uploaded gone.csv" }]);
  });

  it("a code no build of this app wrote still reads as a sentence, with no category", () => {
    expect(plainText(describeEvent({ ...ev("sign-in"), action: "probe" }, lookup))).toBe("Imre Vasko recorded “probe”");
  });

  it("every category has codes, and each code is in exactly one", () => {
    const all = AUDIT_CATEGORIES.flatMap((c) => actionsOf(c));
    expect(all.sort()).toEqual([...AUDIT_ACTIONS].sort());
    for (const c of AUDIT_CATEGORIES) expect(actionsOf(c).length, c).toBeGreaterThan(0);
  });
});

describe("codes written in SQL are in the table", () => {
  const ROOT = path.resolve(__dirname, "../..");
  const walk = (dir: string): string[] =>
    readdirSync(dir).flatMap((f) => {
      const p = path.join(dir, f);
      return statSync(p).isDirectory() ? walk(p) : /\.(ts|tsx|mjs)$/.test(f) ? [p] : [];
    });
  const TARGET_TYPES = new Set(["spectrum", "sample", "series", "project", "signature", "analysis-run", "scale"]);
  /** Quoted lower-case words in each INSERT INTO audit_events statement (up to the end of its template string). */
  const sqlCodes = (text: string) =>
    [...text.matchAll(/INSERT INTO audit_events[^`]*/g)]
      .flatMap((m) => [...m[0].matchAll(/'([a-z][a-z.-]*)'/g)].map((q) => q[1]!))
      .filter((w) => !TARGET_TYPES.has(w));

  it("finds the codes of the upload statement and the scale seed, and each has a category and a sentence", () => {
    const found = new Map<string, string[]>();
    for (const file of ["lib", "app", "workers", "scripts"].flatMap((d) => walk(path.join(ROOT, d)))) {
      for (const code of sqlCodes(readFileSync(file, "utf8"))) found.set(code, [...(found.get(code) ?? []), path.relative(ROOT, file)]);
    }
    expect(found.get("spectrum.upload")).toContain("lib/ingest/insertUpload.ts");
    for (const [code, files] of found) expect(Object.hasOwn(AUDIT_EVENT_KINDS, code), `${code} (${files.join(", ")})`).toBe(true);
  });

  it("the scan can fail: a made-up code in an INSERT is caught", () => {
    expect(
      sqlCodes("INSERT INTO audit_events (action) VALUES ('spectrum.viewed')").filter((c) => !Object.hasOwn(AUDIT_EVENT_KINDS, c)),
    ).toEqual(["spectrum.viewed"]);
  });
});

describe("consecutive sign-ins fold per person", () => {
  const e = (id: number, action: string, actorKey: string, minute: number) => ({
    id: String(id),
    action,
    actorKey,
    at: new Date(Date.UTC(2026, 11, 2, 9, minute)).toISOString(),
  });

  it("folds a run into one line per person, keeps single ones and everything else as they are", () => {
    // newest first: A, B, A, A, upload, A, refused, B
    const events = [
      e(8, "sign-in", "A", 50),
      e(7, "sign-in", "B", 40),
      e(6, "sign-in", "A", 30),
      e(5, "sign-in", "A", 20),
      e(4, "spectrum.upload", "A", 15),
      e(3, "sign-in", "A", 10),
      e(2, "sign-in-refused", "B", 5),
      e(1, "sign-in", "B", 1),
    ];
    const lines = foldSignIns(events);
    expect(lines.map((l) => (l.kind === "event" ? l.event.id : `${l.actorKey}×${l.count}`))).toEqual(["A×3", "7", "4", "3", "2", "1"]);
    const folded = lines[0]!;
    expect(folded.kind === "sign-ins" && [folded.first, folded.last]).toEqual([events[3]!.at, events[0]!.at]);
  });

  it("writes the folded line as a sentence", () => {
    expect(foldedSentence("Imre Vasko", 14, "2026-12-01T08:00:00Z", "2026-12-02T15:12:00Z")).toBe(
      "Imre Vasko signed in 14 times between 1 Dec 2026, 08:00 UTC and 2 Dec 2026, 15:12 UTC",
    );
    expect(foldedSentence("Imre Vasko", 2, "2026-12-02T15:12:05Z", "2026-12-02T15:12:40Z")).toBe(
      "Imre Vasko signed in 2 times at 2 Dec 2026, 15:12 UTC",
    );
  });

  it("does not fold what is not a run: sign-ins separated by other events stay apart", () => {
    const lines = foldSignIns([e(3, "sign-in", "A", 3), e(2, "hold-placed", "A", 2), e(1, "sign-in", "A", 1)]);
    expect(lines.every((l) => l.kind === "event")).toBe(true);
  });
});
