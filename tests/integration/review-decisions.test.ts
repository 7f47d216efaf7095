import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { runReviewDigest } from "@/lib/review/digest";
import { APP_ORIGIN, DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { sessionCookie } from "../helpers/session";
import { waitFor } from "../helpers/waitFor";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

// Real app, PostgreSQL and SMTP fake (no mocks): a lead's decision writes a Review row and the
// signature's state, a revision keeps the history, non-leads and other groups are refused, and
// the uploader's mail arrives in the SMTP fake.

type Mail = { to: string[]; subject: string; raw: string; receivedAt: string };
const MAIL_VIEW = process.env.MAIL_VIEW_URL ?? "http://127.0.0.1:25350";

async function mailTo(address: string): Promise<Mail[]> {
  const response = await fetch(`${MAIL_VIEW}/messages?to=${encodeURIComponent(address)}`);
  return (await response.json()) as Mail[];
}
/** Mail bodies are quoted-printable: undo soft line breaks and =XX escapes before searching. */
const body = (m: Mail) => m.raw.replace(/=\r?\n/g, "").replace(/=([0-9A-F]{2})/g, (_, h: string) => String.fromCharCode(parseInt(h, 16)));

const cookies: Record<string, string> = {};
let awaiting: { id: string; file_name: string }[] = [];

beforeAll(async () => {
  for (const [who, email] of Object.entries(DEMO)) cookies[who] = await sessionCookie(email, DEMO_PASSWORD);
  awaiting = await selectRows<{ id: string; file_name: string }>(
    `SELECT g.id, s.file_name FROM signatures g JOIN spectra s ON s.id = g.spectrum_id JOIN projects p ON p.id = s.project_id
     JOIN groups gr ON gr.id = p.group_id JOIN users u ON u.id = s.uploaded_by
     WHERE gr.slug = 'aurora' AND g.review_state = 'awaiting' AND g.superseded_at IS NULL AND u.email = :uploader ORDER BY g.created_at, g.id LIMIT 4`,
    { uploader: DEMO.spectroscopist },
  );
  if (awaiting.length < 3) throw new Error("the demo scenario needs at least 3 awaiting signatures of Aurora for this test");
});
afterAll(closeDb);

function decide(id: string, who: string, payload: unknown) {
  return fetch(url(`/api/v1/signatures/${id}/decisions`), {
    method: "POST",
    headers: { cookie: cookies[who]!, origin: APP_ORIGIN, "content-type": "application/json" },
    body: JSON.stringify(payload),
  });
}
const reviewsOf = (id: string) =>
  selectRows<{ decision: string; comment: string; email: string }>(
    `SELECT v.decision, v.comment, u.email FROM reviews v JOIN users u ON u.id = v.reviewer_id WHERE v.signature_id = :id ORDER BY v.created_at, v.id`,
    { id },
  );
const stateOf = async (id: string) =>
  (await selectRows<{ review_state: string }>(`SELECT review_state FROM signatures WHERE id = :id`, { id }))[0]!.review_state;

describe("signature decisions", () => {
  it("records a lead's decision as a Review row, updates the state and mails the uploader", async () => {
    const sig = awaiting[0]!;
    const startedAt = new Date().toISOString();
    const response = await decide(sig.id, "lead", { decision: "confirmed", comment: "Bleach and new band agree." });
    expect(response.status).toBe(201);
    expect(await reviewsOf(sig.id)).toEqual([{ decision: "confirmed", comment: "Bleach and new band agree.", email: DEMO.lead }]);
    expect(await stateOf(sig.id)).toBe("confirmed");
    const audit = await selectRows<{ action: string }>(`SELECT action FROM audit_events WHERE target_id = :id ORDER BY id`, { id: sig.id });
    expect(audit.map((a) => a.action)).toContain("signature-decided");
    const mail = await waitFor(
      "the uploader's decision mail in the SMTP fake",
      async () => (await mailTo(DEMO.spectroscopist)).find((m) => m.receivedAt >= startedAt && body(m).includes(`/review/${sig.id}`)),
      20_000,
    );
    expect(mail.subject).toContain(sig.file_name);
    expect(body(mail)).toContain("Bleach and new band agree.");
  });

  it("keeps the history when a decision is revised", async () => {
    const sig = awaiting[0]!;
    const response = await decide(sig.id, "lead", { decision: "dismissed", comment: "Second look: a baseline step." });
    expect(response.status).toBe(201);
    expect((await response.json()) as { previousState: string }).toMatchObject({ previousState: "confirmed", reviewState: "dismissed" });
    expect((await reviewsOf(sig.id)).map((r) => r.decision)).toEqual(["confirmed", "dismissed"]);
    expect(await stateOf(sig.id)).toBe("dismissed");
    const history = (await (await fetch(url(`/api/v1/signatures/${sig.id}/decisions`), { headers: { cookie: cookies.lead! } })).json()) as {
      reviewState: string;
      history: { decision: string; comment: string }[];
    };
    expect(history.reviewState).toBe("dismissed");
    expect(history.history.map((h) => h.decision)).toEqual(["dismissed", "confirmed"]);
  });

  it("refuses a spectroscopist of the group (403) and leaves no trace", async () => {
    const sig = awaiting[1]!;
    const response = await decide(sig.id, "spectroscopist", { decision: "confirmed", comment: "" });
    expect(response.status).toBe(403);
    expect(((await response.json()) as { error: { code: string } }).error.code).toBe("forbidden");
    expect(await reviewsOf(sig.id)).toEqual([]);
    expect(await stateOf(sig.id)).toBe("awaiting");
  });

  it("answers another group's member and a collaborator with not-found", async () => {
    const sig = awaiting[1]!;
    for (const who of ["otherGroup", "collaborator"]) {
      const response = await decide(sig.id, who, { decision: "dismissed" });
      expect(response.status, who).toBe(404);
    }
    expect(await reviewsOf(sig.id)).toEqual([]);
  });

  it("names the field of a bad decision", async () => {
    const response = await decide(awaiting[1]!.id, "lead", { decision: "maybe" });
    expect(response.status).toBe(400);
    const error = ((await response.json()) as { error: { field: string; message: string } }).error;
    expect(error.field).toBe("decision");
    expect(error.message).toContain("confirmed or dismissed");
    expect(await stateOf(awaiting[1]!.id)).toBe("awaiting");
  });
});

describe("review queue API", () => {
  it("filters by kind and sorts by significance as asked", async () => {
    const response = await fetch(url("/api/v1/review/queue?kind=bleach&state=all&sort=significance&dir=asc&pageSize=50"), {
      headers: { cookie: cookies.lead! },
    });
    expect(response.status).toBe(200);
    const queue = (await response.json()) as { items: { kind: string; significance: number }[]; total: number };
    expect(queue.items.length).toBeGreaterThan(0);
    expect(queue.items.every((i) => i.kind === "bleach")).toBe(true);
    const sig = queue.items.map((i) => i.significance);
    expect(sig).toEqual([...sig].sort((a, b) => a - b));
  });

  it("refuses non-leads and names a bad parameter", async () => {
    expect((await fetch(url("/api/v1/review/queue"), { headers: { cookie: cookies.spectroscopist! } })).status).toBe(403);
    const bad = await fetch(url("/api/v1/review/queue?sort=colour"), { headers: { cookie: cookies.lead! } });
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: { field: string } }).error.field).toBe("sort");
  });
});

describe("review digest", () => {
  it("mails the lead each new signature once, however often it runs", async () => {
    const sig = awaiting[2]!;
    await selectRows(`UPDATE signatures SET digested_at = NULL WHERE id = :id RETURNING id`, { id: sig.id });
    const mentions = async () => (await mailTo(DEMO.lead)).filter((m) => body(m).includes(`/review/${sig.id}`)).length;
    const before = await mentions();
    await runReviewDigest();
    // The shared worker may have sent it first; either way it is sent exactly once.
    await waitFor("the digest mail in the SMTP fake", async () => ((await mentions()) === before + 1 ? true : undefined), 20_000);
    const marked = await selectRows<{ digested_at: Date | null }>(`SELECT digested_at FROM signatures WHERE id = :id`, { id: sig.id });
    expect(marked[0]!.digested_at).not.toBeNull();
    await runReviewDigest();
    expect(await mentions()).toBe(before + 1);
  });
});
