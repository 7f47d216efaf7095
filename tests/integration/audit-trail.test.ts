import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { recordAudit } from "@/lib/audit";
import { AUDIT_EVENT_KINDS } from "@/lib/auditTrail/eventKinds";
import { plainText } from "@/lib/auditTrail/sentenceParts";
import { closeDb, selectRows } from "@/lib/db";
import { listAuditJson, listAuditPage, type AuditFilter, type AuditLine } from "@/lib/queries/audit";
import { Membership } from "@/models";
import { url } from "../helpers/app";
import { createLab, createUser, type Lab } from "../helpers/fixtures";
import { sessionCookie } from "../helpers/session";
import { storedSpectrum } from "./stewardship-fixtures";

// The audit trail on the real database: a fresh group whose events the test writes through
// recordAudit (the app's one writer), another group whose events must never show, and the
// steward's and a member's personal sign-ins. Truth is what the test wrote (its own source of
// the expected counts; no outside reference applies to bookkeeping of this kind).

let lab: Lab; // the steward's group
let other: Lab; // another group
let member: { id: string; name: string; email: string };
const written: string[] = []; // actions in the steward's view, oldest first
let spectrumId = "";
let foreignSpectrumId = "";

const text = (line: AuditLine) => (line.kind === "event" ? plainText(line.parts) : line.text);
const filter = (f: Partial<AuditFilter> = {}): AuditFilter => ({ ...f }) as AuditFilter;

async function allPages(f: Partial<AuditFilter>, limit: number): Promise<AuditLine[][]> {
  const pages: AuditLine[][] = [];
  let after: string | undefined;
  for (let i = 0; i < 100; i++) {
    const page = (await listAuditPage(lab.actor, filter({ ...f, after }), limit))!;
    pages.push(page.lines);
    if (!page.next) break;
    after = page.next;
  }
  return pages;
}

beforeAll(async () => {
  lab = await createLab("steward");
  other = await createLab("steward");
  const { user } = await createUser("member");
  await Membership.create({ groupId: lab.group.id, userId: user.id, role: "spectroscopist" });
  member = { id: user.id, name: user.name, email: user.email };
  const spectrum = await storedSpectrum(lab);
  spectrumId = spectrum.id;
  foreignSpectrumId = (await storedSpectrum(other)).id;
  const g = lab.group.id;
  const steward = { actorId: lab.user.id, actorLabel: lab.user.email };
  const byMember = { actorId: member.id, actorLabel: member.email };

  await recordAudit({
    ...byMember,
    groupId: g,
    action: "spectrum.upload",
    targetType: "spectrum",
    targetId: spectrumId,
    details: { fileName: spectrum.fileName },
  });
  written.push("spectrum.upload");
  for (let i = 0; i < 3; i++) {
    await recordAudit({ ...steward, action: "sign-in", details: { address: "10.1.1.1" } }); // personal: no group
    written.push("sign-in");
  }
  await recordAudit({ ...byMember, action: "sign-in", details: { address: "10.1.1.2" } }); // the member's personal event: not the steward's to see
  await recordAudit({
    ...steward,
    groupId: g,
    action: "hold-placed",
    targetType: "spectrum",
    targetId: spectrumId,
    details: { holdId: "h", reason: "audit test hold" },
  });
  written.push("hold-placed");
  // names a spectrum of another group: named, never linked
  await recordAudit({
    ...byMember,
    groupId: g,
    action: "signature-decided",
    targetType: "signature",
    targetId: "00000000-0000-4000-8000-000000000000",
    details: { decision: "dismissed", previousState: "awaiting", kind: "bleach", spectrumId: foreignSpectrumId },
  });
  written.push("signature-decided");
  for (let i = 0; i < 57; i++) {
    await recordAudit({
      ...byMember,
      groupId: g,
      action: "analysis.request",
      targetType: "spectrum",
      targetId: spectrumId,
      details: { runId: `r${i}` },
    });
    written.push("analysis.request");
  }
  await recordAudit({
    actorId: other.user.id,
    actorLabel: other.user.email,
    groupId: other.group.id,
    action: "hold-placed",
    targetType: "spectrum",
    targetId: foreignSpectrumId,
    details: { reason: "other group's hold" },
  });
}, 120_000);

afterAll(() => closeDb());

describe("the audit trail, read as sentences", () => {
  it("pages by keyset through every event exactly once, newest first, with the exact count", async () => {
    const pages = await allPages({}, 25);
    expect(pages.length).toBeGreaterThan(1);
    const events = pages.flat().flatMap((l) => (l.kind === "event" ? [l.action] : Array<string>(l.count).fill("sign-in")));
    expect(events).toEqual([...written].reverse());
    const first = (await listAuditPage(lab.actor, filter(), 25))!;
    expect(first.count).toEqual({ value: written.length, exact: true });
  });

  it("does not repeat or skip when events arrive while someone pages", async () => {
    const first = (await listAuditPage(lab.actor, filter({ category: "analysis" }), 10))!;
    await recordAudit({
      actorId: member.id,
      actorLabel: member.email,
      groupId: lab.group.id,
      action: "analysis.request",
      targetType: "spectrum",
      targetId: spectrumId,
      details: { runId: "late" },
    });
    written.push("analysis.request");
    const second = (await listAuditPage(lab.actor, filter({ category: "analysis", after: first.next! }), 10))!;
    const ids = [...first.lines, ...second.lines].map((l) => l.id);
    expect(new Set(ids).size).toBe(20);
    const truth = await selectRows<{ id: string }>(
      "SELECT id::text AS id FROM audit_events WHERE group_id = :g AND action = 'analysis.request' ORDER BY at DESC, id DESC",
      { g: lab.group.id },
    );
    // the new event is on no page already read; the second page continues where the first stopped
    expect(ids).toEqual(truth.slice(1, 21).map((r) => r.id));
  });

  it("filters by category: holds, sign-ins (folded), decisions", async () => {
    const holds = (await listAuditPage(lab.actor, filter({ category: "holds" })))!;
    expect(holds.lines.map(text)).toEqual([
      `${lab.user.name} placed a legal hold on the spectrum ${(await selectRows<{ file_name: string }>("SELECT file_name FROM spectra WHERE id = :id", { id: spectrumId }))[0]!.file_name}: “audit test hold”`,
    ]);
    const signIns = (await listAuditPage(lab.actor, filter({ category: "sign-in" })))!;
    expect(signIns.lines).toHaveLength(1);
    expect(text(signIns.lines[0]!)).toMatch(
      new RegExp(`^${lab.user.name} signed in 3 times (between|at) \\d+ \\w{3} \\d{4}, \\d\\d:\\d\\d UTC`),
    );
    const decisions = (await listAuditPage(lab.actor, filter({ category: "decision" })))!;
    expect(decisions.lines.map((l) => l.kind === "event" && l.action)).toEqual(["signature-decided"]);
  });

  it("filters by person: only that person's events in the steward's groups, never their personal ones", async () => {
    const page = (await listAuditPage(lab.actor, filter({ person: member.id }), 200))!;
    const actions = page.lines.map((l) => (l.kind === "event" ? l.action : "folded"));
    expect(actions).not.toContain("sign-in");
    expect(actions.filter((a) => a === "analysis.request")).toHaveLength(written.filter((a) => a === "analysis.request").length);
    expect(new Set(actions)).toEqual(new Set(["analysis.request", "signature-decided", "spectrum.upload"]));
    const both = (await listAuditPage(lab.actor, filter({ person: member.id, category: "upload" })))!;
    expect(both.lines.map((l) => l.kind === "event" && l.action)).toEqual(["spectrum.upload"]);
  });

  it("links a record only when the steward may open it; another group's events never show", async () => {
    const page = (await listAuditPage(lab.actor, filter({ category: "upload" })))!;
    const upload = page.lines[0]!;
    expect(upload.kind === "event" && upload.parts.find((p) => p.href)?.href).toBe(`/spectra/${spectrumId}`);
    const decision = (await listAuditPage(lab.actor, filter({ category: "decision" })))!.lines[0]!;
    expect(decision.kind === "event" && decision.parts.filter((p) => p.href)).toEqual([]);
    expect(text(decision)).toContain(" dismissed the exciton bleach on "); // named (from the event), not linked
    const everything = (await listAuditJson(lab.actor, filter(), 1000))!;
    expect(everything.events.some((e) => e.details.reason === "other group's hold")).toBe(false);
    expect((await listAuditJson(other.actor, filter({ category: "holds" }), 1000))!.events.map((e) => e.details.reason)).toEqual([
      "other group's hold",
    ]);
  });

  it("exports CSV with the raw codes and full details, streamed over HTTP, filtered like the page", async () => {
    const cookie = await sessionCookie(lab.user.email, "test-password");
    const response = await fetch(url("/api/v1/audit?format=csv&category=holds"), { headers: { cookie } });
    expect(response.status).toBe(200);
    const lines = (await response.text()).trim().split("\r\n");
    expect(lines[0]).toBe("id,at,actor,action,target,details,category,sentence");
    expect(lines).toHaveLength(2);
    expect(lines[1]).toContain(`,hold-placed,spectrum ${spectrumId},"{""holdId"":""h"",""reason"":""audit test hold""}",holds,`);
    const json = (await (await fetch(url("/api/v1/audit?format=json&limit=5"), { headers: { cookie } })).json()) as {
      events: { action: string }[];
      next: string | null;
    };
    expect(json.events).toHaveLength(5);
    expect(json.next).toEqual(expect.any(String));
    const bad = await fetch(url("/api/v1/audit?category=gossip"), { headers: { cookie } });
    expect(bad.status).toBe(400);
    expect(JSON.stringify(await bad.json())).toContain("category");
  });

  it("every code in the database has a category and a sentence (all that the seed and the tests so far wrote)", async () => {
    const codes = await selectRows<{ action: string }>("SELECT DISTINCT action FROM audit_events");
    // the probes are rows the tamper and migration tests insert by hand to show they cannot be changed
    const unknown = codes
      .map((c) => c.action)
      .filter((a) => !Object.hasOwn(AUDIT_EVENT_KINDS, a) && !["probe", "tamper-probe"].includes(a));
    expect(unknown).toEqual([]);
    expect(codes.length).toBeGreaterThan(3);
  });
});
