import { readFileSync } from "node:fs";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { APP_ORIGIN, url } from "../helpers/app";

// Issue #11, item 7: every server action the build exposes, called over HTTP without a
// session, the way any client can (the "Next-Action" header names the action; the body is
// React's reply encoding: field "0" holds the arguments, "$K1" a form whose fields are
// prefixed "1_"). The build's own list of actions is .next/server/server-reference-manifest.json.
// Each must refuse, and no table may change.
type ManifestEntry = { filename: string; exportedName: string; workers: Record<string, unknown> };
const distDir = process.env.NEXT_DIST_DIR || ".next";
const manifest = JSON.parse(readFileSync(path.join(distDir, "server", "server-reference-manifest.json"), "utf8")) as {
  node: Record<string, ManifestEntry>;
};
const actions = Object.entries(manifest.node).map(([id, entry]) => ({ id, ...entry }));

const TOKEN_GUARDED = new Set(["acceptInvitationAction", "unlockAccountAction"]);
const TABLES = [
  "users",
  "memberships",
  "samples",
  "series",
  "spectra",
  "analysis_runs",
  "reviews",
  "retention_policies",
  "legal_holds",
  "shares",
  "invitations",
  "api_tokens",
  "audit_events",
];
const FAKE_ID = "00000000-0000-4000-8000-000000000000";

/** "app/(app)/review/[id]/page" → "/review/<uuid>": a page that imports the action. */
function pagePath(worker: string): string {
  const segments = worker
    .replace(/^app\//, "")
    .replace(/\/page$/, "")
    .split("/")
    .filter((s) => !/^\(.*\)$/.test(s));
  return `/${segments.map((s) => (s.startsWith("[") ? FAKE_ID : s)).join("/")}`;
}

async function snapshot(): Promise<Record<string, number>> {
  const out: Record<string, number> = {};
  for (const t of TABLES) out[t] = Number((await selectRows<{ n: string }>(`SELECT count(*) AS n FROM ${t}`))[0]!.n);
  return out;
}

afterAll(closeDb);

describe("server actions without a session", () => {
  it("the build exposes the actions of every feature (the list is not empty)", () => {
    expect(actions.length).toBeGreaterThanOrEqual(20);
    expect(actions.map((a) => a.exportedName)).toContain("saveNotifications");
  });

  it("each refuses and changes nothing", async () => {
    const before = await snapshot();
    const answers: string[] = [];
    for (const action of actions) {
      const form = new FormData();
      form.set("0", JSON.stringify([{ ok: false }, "$K1"]));
      // Plausible fields for the forms, so a missing session is the only reason to refuse.
      for (const [k, v] of Object.entries({
        id: FAKE_ID,
        token: "abcdefghijklmnopqrstuvwxyz0123",
        name: "probe",
        intent: "create",
        notifyDigest: "on",
        decision: "confirmed",
      }))
        form.set(`1_${k}`, v);
      const res = await fetch(url(pagePath(Object.keys(action.workers)[0]!)), {
        method: "POST",
        headers: { "Next-Action": action.id, origin: APP_ORIGIN, accept: "text/x-component" },
        body: form,
      });
      const text = await res.text();
      const result = text.split("\n").find((line) => line.startsWith("1:"));
      const state = result ? (JSON.parse(result.slice(2)) as { ok: boolean; message?: string }) : null;
      answers.push(`${action.exportedName}: ${res.status} ${state?.message ?? text.slice(0, 80)}`);
      expect(state, `${action.filename}#${action.exportedName} answered ${res.status}: ${text.slice(0, 200)}`).not.toBeNull();
      expect(state!.ok, action.exportedName).toBe(false);
      if (!TOKEN_GUARDED.has(action.exportedName))
        expect(state!.message, action.exportedName).toBe("Your session has ended. Sign in again.");
    }
    expect(answers).toHaveLength(actions.length);
    expect(await snapshot()).toEqual(before);
  }, 120_000);
});
