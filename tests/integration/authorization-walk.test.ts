import { randomBytes } from "node:crypto";
import { readdirSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, selectRows } from "@/lib/db";
import { APP_ORIGIN, DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { demoIds } from "../helpers/demo-ids";
import { sessionCookie } from "../helpers/session";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

// Every route handler in app/, called as an anonymous visitor, as a collaborator on
// something NOT shared with them, and as a member of another group. Each must refuse.
// A new route.ts that is missing from this table fails the first test, so the table
// grows with the app.

type Ids = Awaited<ReturnType<typeof demoIds>>;
type Call = { method: string; path: (ids: Ids) => string; body?: () => BodyInit; contentType?: string };

const PUBLIC_ROUTES: Record<string, string> = {
  "api/auth/[...nextauth]": "next-auth's own sign-in endpoints",
  "api/health": "service status for the start script and load balancers; names no lab data",
  "shared/[token]/curves/[spectrumId]":
    "read-only share link: the processed curves (chart data, CSV, JCAMP-DX) of a spectrum within the share, token-guarded like the raw route (see below and share-link-curves.test.ts)",
  "shared/[token]/raw/[spectrumId]":
    "read-only share link: public by design but token-guarded (a wrong, revoked or expired token, or a spectrum outside the share, is 404; see below and stewardship-share-links.test.ts)",
};

function uploadForm(ids: Ids): FormData {
  const form = new FormData();
  form.set("projectId", ids.project.id);
  form.set("technique", "absorption");
  form.set("file", new Blob(["nm,A\n400,0.1\n"], { type: "text/csv" }), "probe.csv");
  return form;
}

// A real flagged signature of the shared titration spectrum, for the review routes below.
const [demoSignature] = await selectRows<{ id: string }>(
  `SELECT g.id FROM signatures g JOIN spectra s ON s.id = g.spectrum_id WHERE s.file_name = 'titration-1.00eq.csv' ORDER BY g.created_at LIMIT 1`,
);
const signatureId = demoSignature?.id ?? "00000000-0000-4000-8000-000000000000";

const ROUTES: Record<string, Call[]> = {
  "api/v1/projects": [{ method: "GET", path: () => "/api/v1/projects" }],
  "api/v1/projects/[id]/import-profiles": [
    { method: "GET", path: (ids) => `/api/v1/projects/${ids.project.id}/import-profiles` },
    {
      method: "POST",
      path: (ids) => `/api/v1/projects/${ids.project.id}/import-profiles`,
      contentType: "application/json",
      body: () => JSON.stringify({ name: "walk", choice: { xUnit: "nm" }, signature: "ext=csv" }),
    },
  ],
  "api/v1/projects/[id]/import-profiles/[profileId]": [
    { method: "DELETE", path: (ids) => `/api/v1/projects/${ids.project.id}/import-profiles/00000000-0000-4000-8000-000000000000` },
  ],
  "api/v1/openapi.json": [{ method: "GET", path: () => "/api/v1/openapi.json" }],
  "api/v1/spectra": [
    { method: "POST", path: () => "/api/v1/spectra" },
    // a search naming a project the caller reads nothing of is answered as not found
    { method: "GET", path: (ids) => `/api/v1/spectra?project=${ids.project.id}` },
  ],
  "api/v1/spectra/preview": [{ method: "POST", path: () => "/api/v1/spectra/preview" }],
  "api/v1/spectra/[id]": [{ method: "GET", path: (ids) => `/api/v1/spectra/${ids.privateSpectrum.id}` }],
  "api/v1/spectra/[id]/raw": [{ method: "GET", path: (ids) => `/api/v1/spectra/${ids.privateSpectrum.id}/raw` }],
  "api/v1/spectra/[id]/analyses": [
    {
      method: "POST",
      path: (ids) => `/api/v1/spectra/${ids.privateSpectrum.id}/analyses`,
      body: () => "{}",
      contentType: "application/json",
    },
  ],
  "api/v1/spectra/[id]/data": [{ method: "GET", path: (ids) => `/api/v1/spectra/${ids.privateSpectrum.id}/data?axis=nm` }],
  "api/v1/spectra/[id]/export": [
    { method: "GET", path: (ids) => `/api/v1/spectra/${ids.privateSpectrum.id}/export?format=csv` },
    { method: "GET", path: (ids) => `/api/v1/spectra/${ids.privateSpectrum.id}/export?format=jcamp` },
    { method: "GET", path: (ids) => `/api/v1/spectra/${ids.privateSpectrum.id}/export?format=json` },
  ],
  "api/v1/series/[id]": [{ method: "GET", path: (ids) => `/api/v1/series/${ids.privateSeries.id}` }],
  "api/v1/series/[id]/export": [{ method: "GET", path: (ids) => `/api/v1/series/${ids.privateSeries.id}/export` }],
  "api/v1/series/[id]/supernatants": [
    { method: "GET", path: (ids) => `/api/v1/series/${ids.privateSeries.id}/supernatants?nmA=577&nmX=400` },
    // The shared series: its collaborator may read it but not link (403); another group does not see it (404).
    {
      method: "POST",
      path: (ids) => `/api/v1/series/${ids.sharedSeries.id}/supernatants`,
      contentType: "application/json",
      body: () => JSON.stringify({ supernatantSpectrumId: "00000000-0000-4000-8000-000000000000", pointSpectrumId: null }),
    },
  ],
  "api/v1/audit": [{ method: "GET", path: () => "/api/v1/audit?format=csv" }],
  "api/v1/exports/[type]/[id]": [
    { method: "GET", path: (ids) => `/api/v1/exports/project/${ids.project.id}` },
    { method: "GET", path: (ids) => `/api/v1/exports/series/${ids.privateSeries.id}` },
  ],
  "api/v1/review/queue": [{ method: "GET", path: () => "/api/v1/review/queue" }],
  "api/v1/signatures/[id]/decisions": [
    { method: "GET", path: () => `/api/v1/signatures/${signatureId}/decisions` },
    {
      method: "POST",
      path: () => `/api/v1/signatures/${signatureId}/decisions`,
      body: () => JSON.stringify({ decision: "dismissed", comment: "walk" }),
      contentType: "application/json",
    },
  ],
};

function routeFiles(dir: string, root = dir): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name);
    if (statSync(full).isDirectory()) return routeFiles(full, root);
    return name === "route.ts" ? [relative(root, dir).replace(/\\/g, "/")] : [];
  });
}

let ids: Ids;
const cookies: Record<string, string> = {};

beforeAll(async () => {
  ids = await demoIds();
  cookies.collaborator = await sessionCookie(DEMO.collaborator, DEMO_PASSWORD);
  cookies.otherGroup = await sessionCookie(DEMO.otherGroup, DEMO_PASSWORD);
});
afterAll(closeDb);

async function call(c: Call, cookie?: string): Promise<Response> {
  const path = c.path(ids);
  const body = c.method === "POST" ? (c.body ? c.body() : uploadForm(ids)) : undefined;
  return fetch(url(path), {
    method: c.method,
    redirect: "manual",
    headers: { ...(cookie ? { cookie, origin: APP_ORIGIN } : {}), ...(c.contentType ? { "content-type": c.contentType } : {}) },
    body,
  });
}

describe("authorization walk over every route handler", () => {
  it("has an entry for every route.ts in app/", () => {
    const found = routeFiles(join(process.cwd(), "app"))
      .map((r) => r.replace(/^\(app\)\//, ""))
      .sort();
    const listed = [...Object.keys(ROUTES), ...Object.keys(PUBLIC_ROUTES)].sort();
    expect(found).toEqual(listed);
  });

  it("refuses a share-link download with a wrong token, whoever asks", async () => {
    const wrong = randomBytes(32).toString("base64url");
    for (const cookie of [undefined, cookies.collaborator, cookies.otherGroup]) {
      for (const path of [
        `/shared/${wrong}/raw/${ids.privateSpectrum.id}`,
        `/shared/${wrong}/curves/${ids.sharedSpectrum.id}?format=csv`,
      ]) {
        const response = await fetch(url(path), { redirect: "manual", headers: cookie ? { cookie } : {} });
        expect(response.status, path).toBe(404);
        expect(response.headers.get("cache-control")).toBe("private, no-store");
        expect(((await response.json()) as { error: { code: string } }).error.code).toBe("not_found");
      }
    }
    const malformed = await fetch(url(`/shared/not-a-token/raw/${ids.privateSpectrum.id}`), { redirect: "manual" });
    expect(malformed.status).toBe(404);
  });

  it("refuses anonymous callers with 401 and the JSON error shape", async () => {
    for (const [route, calls] of Object.entries(ROUTES)) {
      for (const c of calls) {
        const response = await call(c);
        expect(response.status, `${c.method} ${route}`).toBe(401);
        const body = (await response.json()) as { error: { code: string; message: string } };
        expect(body.error.code, route).toBe("unauthenticated");
      }
    }
  });

  it("refuses a collaborator everything outside what was shared with them", async () => {
    for (const [route, calls] of Object.entries(ROUTES)) {
      if (route === "api/v1/openapi.json" || route === "api/v1/projects") continue; // readable by any account; checked below
      for (const c of calls) {
        const response = await call(c, cookies.collaborator);
        expect([403, 404], `${c.method} ${route} as collaborator`).toContain(response.status);
      }
    }
  });

  it("refuses a member of another group every record of this group", async () => {
    for (const [route, calls] of Object.entries(ROUTES)) {
      if (route === "api/v1/openapi.json" || route === "api/v1/projects") continue;
      for (const c of calls) {
        const response = await call(c, cookies.otherGroup);
        expect([403, 404], `${c.method} ${route} as another group`).toContain(response.status);
      }
    }
  });

  it("lists no project of another group, and none to a read-only collaborator", async () => {
    const other = (await (await fetch(url("/api/v1/projects"), { headers: { cookie: cookies.otherGroup } })).json()) as {
      projects: { id: string }[];
    };
    expect(other.projects.map((p) => p.id)).not.toContain(ids.project.id);
    const guest = (await (await fetch(url("/api/v1/projects"), { headers: { cookie: cookies.collaborator } })).json()) as {
      projects: { id: string }[];
    };
    expect(guest.projects.map((p) => p.id)).not.toContain(ids.project.id);
  });

  it("lets the collaborator read the series shared with them, and its spectra", async () => {
    const series = await fetch(url(`/api/v1/series/${ids.sharedSeries.id}`), { headers: { cookie: cookies.collaborator } });
    expect(series.status).toBe(200);
    const spectrum = await fetch(url(`/api/v1/spectra/${ids.sharedSpectrum.id}`), { headers: { cookie: cookies.collaborator } });
    expect(spectrum.status).toBe(200);
  });

  it("sends signed-out visitors of every page to sign-in", async () => {
    for (const page of [
      "/",
      "/upload",
      "/samples",
      "/samples/new",
      `/samples/${ids.privateSpectrum.sampleId}`,
      "/spectra",
      `/spectra/${ids.privateSpectrum.id}`,
      "/series",
      `/series/${ids.sharedSeries.id}`,
      "/review",
      "/stewardship",
      "/settings",
      "/series/new",
      `/review/${signatureId}`,
    ]) {
      const response = await fetch(url(page), { redirect: "manual" });
      expect([302, 303, 307], page).toContain(response.status);
      expect(response.headers.get("location") ?? "", page).toContain("/signin");
    }
  });

  it("shows a member of another group no page of this group's records", async () => {
    for (const page of [
      `/spectra/${ids.privateSpectrum.id}`,
      `/samples/${ids.privateSpectrum.sampleId}`,
      `/series/${ids.privateSeries.id}`,
      `/review/${signatureId}`,
    ]) {
      const response = await fetch(url(page), { headers: { cookie: cookies.otherGroup } });
      expect(response.status, page).toBe(404);
    }
  });
});
