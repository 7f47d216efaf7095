import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { Membership } from "@/models";
import { APP_ORIGIN, DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { demoIds } from "../helpers/demo-ids";
import { createLab, createUser } from "../helpers/fixtures";
import { sessionCookie, signInOverHttp } from "../helpers/session";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

// Every stewardship page, route handler and download, called over HTTP by each kind of
// caller, compared with the expected answer kept in the table below.
//
// Server actions: they are reached through the pages' forms. The pages that hold them
// are in this table (a caller who is refused the page is refused its forms' data), each
// action re-checks the role itself in app/(app)/stewardship/actions.ts, and the browser
// test (tests/browser/stewardship-steward.test.ts) drives the steward's forms end to end.
// tests/integration/server-actions-anonymous.test.ts calls every action over raw HTTP
// without a session; tests/integration/cross-site.test.ts plays the page of another origin.
//
// revokedSession: the steward's session cookie, copied before the steward signed out. It
// must get exactly what an anonymous caller gets.

type Persona =
  "anonymous" | "revokedSession" | "collaboratorShared" | "collaboratorUnshared" | "spectroscopist" | "lead" | "steward" | "otherGroup";
const PERSONAS: Persona[] = [
  "anonymous",
  "revokedSession",
  "collaboratorShared",
  "collaboratorUnshared",
  "spectroscopist",
  "lead",
  "steward",
  "otherGroup",
];

/** ok: 200 with content; steward-only: 200 with the "for data stewards" notice; signin: redirect; or an HTTP status. */
type Outcome = "ok" | "steward-only" | "signin" | 401 | 403 | 404;
type Ids = Awaited<ReturnType<typeof demoIds>>;
type Row = { what: string; path: (ids: Ids) => string; expect: Record<Exclude<Persona, "revokedSession">, Outcome> };

const stewardPage = (path: string): Row => ({
  what: `page ${path}`,
  path: () => path,
  expect: {
    anonymous: "signin",
    collaboratorShared: "steward-only",
    collaboratorUnshared: "steward-only",
    spectroscopist: "steward-only",
    lead: "steward-only",
    steward: "ok",
    otherGroup: "steward-only",
  },
});

const MATRIX: Row[] = [
  stewardPage("/stewardship"),
  stewardPage("/stewardship/policies"),
  stewardPage("/stewardship/policies?preview=1&projectId=00000000-0000-0000-0000-000000000000&dataClass=raw&keepDays=30&onExpiry=delete"),
  stewardPage("/stewardship/holds"),
  stewardPage("/stewardship/audit"),
  stewardPage("/stewardship/storage"),
  stewardPage("/stewardship/exports"),
  {
    what: "page /stewardship/sharing",
    path: () => "/stewardship/sharing",
    expect: {
      anonymous: "signin",
      collaboratorShared: "steward-only",
      collaboratorUnshared: "steward-only",
      spectroscopist: "steward-only",
      lead: "ok",
      steward: "ok",
      otherGroup: "steward-only",
    },
  },
  {
    what: "public invitation page with a bad token",
    path: () => "/invite/not-a-real-token-0123456789",
    expect: {
      anonymous: "ok",
      collaboratorShared: "ok",
      collaboratorUnshared: "ok",
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: "ok",
    },
  },
  {
    what: "audit CSV",
    path: () => "/api/v1/audit?format=csv",
    expect: {
      anonymous: 401,
      collaboratorShared: 403,
      collaboratorUnshared: 403,
      spectroscopist: 403,
      lead: 403,
      steward: "ok",
      otherGroup: 403,
    },
  },
  {
    what: "export of the shared series",
    path: (ids) => `/api/v1/exports/series/${ids.sharedSeries.id}`,
    expect: {
      anonymous: 401,
      collaboratorShared: "ok",
      collaboratorUnshared: 404,
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: 404,
    },
  },
  {
    what: "export of an unshared series",
    path: (ids) => `/api/v1/exports/series/${ids.privateSeries.id}`,
    expect: {
      anonymous: 401,
      collaboratorShared: 404,
      collaboratorUnshared: 404,
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: 404,
    },
  },
  {
    what: "export of the whole project",
    path: (ids) => `/api/v1/exports/project/${ids.project.id}`,
    expect: {
      anonymous: 401,
      collaboratorShared: 404,
      collaboratorUnshared: 404,
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: 404,
    },
  },
  {
    what: "raw download of a shared spectrum",
    path: (ids) => `/api/v1/spectra/${ids.sharedSpectrum.id}/raw`,
    expect: {
      anonymous: 401,
      collaboratorShared: "ok",
      collaboratorUnshared: 404,
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: 404,
    },
  },
  {
    what: "raw download of an unshared spectrum",
    path: (ids) => `/api/v1/spectra/${ids.privateSpectrum.id}/raw`,
    expect: {
      anonymous: 401,
      collaboratorShared: 404,
      collaboratorUnshared: 404,
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: 404,
    },
  },
  // Guests: no review state anywhere, and only what their share covers, supernatants included.
  {
    what: "page of a flag on a shared spectrum",
    path: (ids) => `/review/${ids.sharedSignature.id}`,
    expect: {
      anonymous: "signin",
      collaboratorShared: 404,
      collaboratorUnshared: 404,
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: 404,
    },
  },
  {
    what: "decision history of a flag on a shared spectrum",
    path: (ids) => `/api/v1/signatures/${ids.sharedSignature.id}/decisions`,
    expect: {
      anonymous: 401,
      collaboratorShared: 404,
      collaboratorUnshared: 404,
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: 404,
    },
  },
  {
    what: "review queue API",
    path: () => "/api/v1/review/queue",
    expect: {
      anonymous: 401,
      collaboratorShared: 403,
      collaboratorUnshared: 403,
      spectroscopist: 403,
      lead: "ok",
      steward: 403,
      otherGroup: 403,
    },
  },
  {
    what: "page of a supernatant of the shared series",
    path: (ids) => `/spectra/${ids.sharedSupernatant.id}`,
    expect: {
      anonymous: "signin",
      collaboratorShared: "ok",
      collaboratorUnshared: 404,
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: 404,
    },
  },
  {
    what: "raw download of a supernatant of the shared series",
    path: (ids) => `/api/v1/spectra/${ids.sharedSupernatant.id}/raw`,
    expect: {
      anonymous: 401,
      collaboratorShared: "ok",
      collaboratorUnshared: 404,
      spectroscopist: "ok",
      lead: "ok",
      steward: "ok",
      otherGroup: 404,
    },
  },
  {
    what: "another group's raw download",
    path: (ids) => `/api/v1/spectra/${ids.otherGroupSpectrum.id}/raw`,
    expect: {
      anonymous: 401,
      collaboratorShared: 404,
      collaboratorUnshared: 404,
      spectroscopist: 404,
      lead: 404,
      steward: 404,
      otherGroup: "ok",
    },
  },
];

let ids: Ids;
const cookies: Partial<Record<Persona, string>> = {};

beforeAll(async () => {
  ids = await demoIds();
  cookies.collaboratorShared = await sessionCookie(DEMO.collaborator, DEMO_PASSWORD);
  cookies.spectroscopist = await sessionCookie(DEMO.spectroscopist, DEMO_PASSWORD);
  cookies.lead = await sessionCookie(DEMO.lead, DEMO_PASSWORD);
  cookies.steward = await sessionCookie(DEMO.steward, DEMO_PASSWORD);
  cookies.otherGroup = await sessionCookie(DEMO.otherGroup, DEMO_PASSWORD);
  // A collaborator of the same group with no share at all (made here, not part of the demo).
  const { user } = await createUser("collab-unshared");
  await Membership.create({ groupId: ids.project.groupId, userId: user.id, role: "collaborator" });
  cookies.collaboratorUnshared = await sessionCookie(user.email, "test-password");
  // Another steward of the group signs in, keeps a copy of the cookie, and signs out.
  const revoked = await createUser("steward-signed-out");
  await Membership.create({ groupId: ids.project.groupId, userId: revoked.user.id, role: "steward" });
  const signedIn = await signInOverHttp(revoked.user.email, "test-password");
  const { csrfToken } = (await (await fetch(url("/api/auth/csrf"), { headers: { cookie: signedIn.cookie } })).json()) as {
    csrfToken: string;
  };
  await fetch(url("/api/auth/signout"), {
    method: "POST",
    redirect: "manual",
    headers: { cookie: signedIn.cookie, origin: APP_ORIGIN, "content-type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ csrfToken, json: "true" }),
  });
  cookies.revokedSession = signedIn.cookie;
});
afterAll(closeDb);

async function outcomeOf(path: string, persona: Persona): Promise<Outcome> {
  const cookie = cookies[persona];
  const response = await fetch(url(path), { redirect: "manual", headers: cookie ? { cookie } : {} });
  if ([302, 303, 307].includes(response.status)) {
    return (response.headers.get("location") ?? "").includes("/signin") ? "signin" : (response.status as Outcome);
  }
  if (response.status !== 200) return response.status as Outcome;
  if ((response.headers.get("content-type") ?? "").includes("text/html")) {
    const html = await response.text();
    return html.includes('data-testid="steward-only"') ? "steward-only" : "ok";
  }
  await response.arrayBuffer();
  return "ok";
}

describe("authorization matrix", () => {
  for (const row of MATRIX) {
    it(
      row.what,
      async () => {
        const got: Partial<Record<Persona, Outcome>> = {};
        for (const p of PERSONAS) got[p] = await outcomeOf(row.path(ids), p);
        expect(got).toEqual({ ...row.expect, revokedSession: row.expect.anonymous });
      },
      120_000,
    );
  }

  it("shows a guest no review state, and lists the supernatants their series share lets them open", async () => {
    const cookie = cookies.collaboratorShared!;
    const page = async (path: string) => (await fetch(url(path), { headers: { cookie } })).text();
    const series = await page(`/series/${ids.sharedSeries.id}`);
    expect(series).toContain(ids.sharedSeries.name);
    expect(series).not.toMatch(/awaiting review/);
    const spectrum = await page(`/spectra/${ids.sharedSpectrum.id}`);
    expect(spectrum).toContain(ids.sharedSpectrum.fileName);
    expect(spectrum).not.toMatch(/awaiting review|>confirmed<|>dismissed<|>Review</);
    expect(await page("/")).not.toContain("nav-awaiting-review");
    const api = (await (await fetch(url(`/api/v1/spectra/${ids.sharedSpectrum.id}`), { headers: { cookie } })).json()) as {
      analysis: { flags: { reviewState: string | null }[] };
    };
    expect(api.analysis.flags.length).toBeGreaterThan(0);
    expect(api.analysis.flags.every((f) => f.reviewState === null)).toBe(true);
    // A member still sees the state on the same spectrum.
    const member = (await (
      await fetch(url(`/api/v1/spectra/${ids.sharedSpectrum.id}`), { headers: { cookie: cookies.spectroscopist! } })
    ).json()) as typeof api;
    expect(member.analysis.flags.every((f) => typeof f.reviewState === "string")).toBe(true);
    // The list shows what the share lets the guest open: the supernatant of a shared point.
    const list = await page(`/spectra?q=${encodeURIComponent(ids.sharedSupernatant.fileName)}`);
    expect(list).toContain(`/spectra/${ids.sharedSupernatant.id}`);
  });

  it("shows a steward of another group none of this group's stewardship data", async () => {
    // A data steward of a group made here (the demo's other group has none).
    const lab = await createLab("steward");
    const user = lab.user;
    const cookie = await sessionCookie(user.email, "test-password");
    for (const page of [
      "/stewardship/policies",
      "/stewardship/holds",
      "/stewardship/storage",
      "/stewardship/exports",
      "/stewardship/audit",
      "/stewardship/sharing",
    ]) {
      const html = await (await fetch(url(page), { headers: { cookie } })).text();
      expect(html, page).not.toContain(ids.project.name);
      expect(html, page).not.toContain(DEMO.spectroscopist);
    }
    const csv = await (await fetch(url("/api/v1/audit?format=csv"), { headers: { cookie } })).text();
    expect(csv).not.toContain(DEMO.spectroscopist);
    expect((await fetch(url(`/api/v1/exports/project/${ids.project.id}`), { headers: { cookie } })).status).toBe(404);
  });

  it("shows a person's own events (sign-ins with their address) to nobody else, not even their group's steward", async () => {
    // The collaborator signed in above; the group's steward reads the audit trail.
    const csv = await (await fetch(url("/api/v1/audit?format=csv"), { headers: { cookie: cookies.steward! } })).text();
    const personal = csv.split("\r\n").filter((line) => line.includes(DEMO.collaborator) && /,sign-in(-refused)?,/.test(line));
    expect(personal).toEqual([]);
    expect(csv).toMatch(new RegExp(`${DEMO.steward.replace(/[.@]/g, "\\$&")},sign-in,`)); // the steward's own sign-in is there
  });
});
