import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { APP_ORIGIN, APP_URL, DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { demoIds } from "../helpers/demo-ids";
import { createLab } from "../helpers/fixtures";
import { sessionCookie, signInOverHttp } from "../helpers/session";

// Sources: HTTP status codes as RFC 9110 defines them; Origin and media-type rules from RFC 6454 and
// RFC 9110 §8.3; row counts are of rows this test wrote itself.

// Issue #11, items 2, 3 and the revoked session of item 8, reproduced against the test stack.
// The new actors of the authorization matrix: a page of another origin on the same host (a
// same-site attacker page: RFC 6454 makes another port another origin), and a session cookie
// copied before its owner signed out.
const ATTACKER_ORIGIN = (() => {
  const u = new URL(APP_URL);
  u.port = String(Number(u.port || 80) + 1);
  return u.origin;
})();

let leadCookie: string;
let signatureId: string;
let projectId: string;
const reviewCount = async () =>
  Number((await selectRows<{ n: string }>("SELECT count(*) AS n FROM reviews WHERE signature_id = :id", { id: signatureId }))[0]!.n);
const spectraCount = async () =>
  Number((await selectRows<{ n: string }>("SELECT count(*) AS n FROM spectra WHERE project_id = :id", { id: projectId }))[0]!.n);

beforeAll(async () => {
  const ids = await demoIds();
  projectId = ids.project.id;
  const [sig] = await selectRows<{ id: string }>(
    "SELECT g.id FROM signatures g JOIN spectra s ON s.id = g.spectrum_id WHERE s.file_name = 'titration-1.00eq.csv' ORDER BY g.created_at LIMIT 1",
  );
  signatureId = sig!.id;
  leadCookie = await sessionCookie(DEMO.lead, DEMO_PASSWORD);
});
afterAll(closeDb);

describe("a page of another origin, with the signed-in lead's cookie", () => {
  const decide = (headers: Record<string, string>) =>
    fetch(url(`/api/v1/signatures/${signatureId}/decisions`), {
      method: "POST",
      headers: { cookie: leadCookie, ...headers },
      body: JSON.stringify({ decision: "confirmed", comment: "cross-site" }),
    });

  it("cannot record a decision (foreign Origin, no preflight content type)", async () => {
    const before = await reviewCount();
    const res = await decide({ origin: ATTACKER_ORIGIN, "content-type": "text/plain; application/json" });
    expect(res.status).toBe(403);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe("cross-site");
    expect(await reviewCount()).toBe(before);
  });

  it("cannot record a decision with no Origin at all, nor with Origin null (sandboxed frame)", async () => {
    const before = await reviewCount();
    expect((await decide({ "content-type": "application/json" })).status).toBe(403);
    expect((await decide({ origin: "null", "content-type": "application/json" })).status).toBe(403);
    expect(await reviewCount()).toBe(before);
  });

  it("a same-origin request still needs exactly application/json (RFC 9110 media type, not a substring)", async () => {
    const before = await reviewCount();
    const res = await decide({ origin: APP_ORIGIN, "content-type": "text/plain; application/json" });
    expect(res.status).toBe(415);
    expect(await reviewCount()).toBe(before);
  });

  it("cannot upload a file", async () => {
    const before = await spectraCount();
    const form = new FormData();
    form.set("projectId", projectId);
    form.set("technique", "absorption");
    form.set("file", new Blob(["nm,A\n400,0.1\n401,0.2\n"], { type: "text/csv" }), "cross-site.csv");
    const res = await fetch(url("/api/v1/spectra"), {
      method: "POST",
      headers: { cookie: leadCookie, origin: ATTACKER_ORIGIN },
      body: form,
    });
    expect(res.status).toBe(403);
    expect(await spectraCount()).toBe(before);
  });

  it("still reads nothing it could not read anyway: GETs are not writes and stay as they were", async () => {
    const res = await fetch(url("/api/v1/projects"), { headers: { cookie: leadCookie, origin: ATTACKER_ORIGIN } });
    expect(res.status).toBe(200);
    expect(res.headers.get("access-control-allow-origin")).toBeNull(); // no CORS grant: the page cannot read it
  });

  it("Bearer-token writes need no Origin", async () => {
    const lab = await createLab("spectroscopist");
    const form = new FormData();
    form.set("projectId", lab.project.id);
    form.set("technique", "absorption");
    form.set("file", new Blob(["nm,A\n400,0.1\n401,0.2\n402,0.3\n"], { type: "text/csv" }), "token.csv");
    const res = await fetch(url("/api/v1/spectra"), { method: "POST", headers: { Authorization: `Bearer ${lab.token}` }, body: form });
    expect([200, 201]).toContain(res.status);
  });
});

describe("return paths after sign-in", () => {
  const shapes = [
    "/\\evil.example/",
    "/%09/evil.example",
    "/%2F%2Fevil.example",
    "//evil.example",
    "/\t/evil.example",
    "https://evil.example/",
    "javascript:alert(1)",
  ];

  it.each(shapes)("the sign-in page sends a signed-in visitor to this origin for %j", async (shape) => {
    const res = await fetch(url(`/signin?callbackUrl=${encodeURIComponent(shape)}`), {
      redirect: "manual",
      headers: { cookie: leadCookie },
    });
    expect([303, 307, 308]).toContain(res.status);
    const target = new URL(res.headers.get("location")!, APP_URL);
    expect(target.origin).toBe(APP_ORIGIN);
    expect(target.pathname).toBe("/");
  });

  it("keeps a same-origin return path", async () => {
    const res = await fetch(url(`/signin?callbackUrl=${encodeURIComponent("/review?state=pending")}`), {
      redirect: "manual",
      headers: { cookie: leadCookie },
    });
    expect(res.headers.get("location")).toMatch(/\/review\?state=pending$/);
  });
});

describe("a session cookie copied before sign-out", () => {
  it("stops working when its owner signs out", async () => {
    const lab = await createLab("spectroscopist");
    const signedIn = await signInOverHttp(lab.user.email, "test-password");
    expect(signedIn.ok).toBe(true);
    const copied = signedIn.cookie;
    expect((await fetch(url("/api/v1/projects"), { headers: { cookie: copied } })).status).toBe(200);
    const { csrfToken } = (await (await fetch(url("/api/auth/csrf"), { headers: { cookie: copied } })).json()) as { csrfToken: string };
    const out = await fetch(url("/api/auth/signout"), {
      method: "POST",
      redirect: "manual",
      headers: { cookie: copied, "content-type": "application/x-www-form-urlencoded", origin: APP_ORIGIN },
      body: new URLSearchParams({ csrfToken, json: "true" }),
    });
    expect(out.status).toBeLessThan(400);
    const after = await fetch(url("/api/v1/projects"), { headers: { cookie: copied } });
    expect(after.status).toBe(401);
    const page = await fetch(url("/spectra"), { redirect: "manual", headers: { cookie: copied } });
    expect(page.headers.get("location") ?? "").toMatch(/\/signin/);
  });
});

describe("security headers", () => {
  it.each(["/signin", "/api/health", "/api/v1/openapi.json"])("are sent with %s", async (path) => {
    const res = await fetch(url(path));
    const csp = res.headers.get("content-security-policy") ?? "";
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("object-src 'none'");
    expect(res.headers.get("x-content-type-options")).toBe("nosniff");
    expect(res.headers.get("referrer-policy")).toBe("strict-origin-when-cross-origin");
  });
});
