import { convert } from "jcampconverter";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadActor } from "@/lib/auth/actor";
import { closeDb, selectRows } from "@/lib/db";
import { decodeColumns } from "@/lib/spectrum-view/columnsFormat";
import { payloadFromColumns } from "@/lib/spectrum-view/payload";
import { createShareLink, revokeShareLink } from "@/lib/stewardship/shareLinks";
import { User } from "@/models";
import { DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { demoIds } from "../helpers/demo-ids";
import { sessionCookie } from "../helpers/session";

// What a signed-out visitor reaches through a series share link, on the demo scenario (the
// worker has analysed it): the page's plot, peaks and flags without review state, and the
// processed downloads (the same writer as the signed-in export, so the bytes must be identical),
// for the series' points and their supernatants, and nothing else.
// Sources: HTTP status codes as RFC 9110 defines them (200, 400, 404); JCAMP-DX read back with
// jcampconverter, an independent reader.

type Ids = Awaited<ReturnType<typeof demoIds>>;
let ids: Ids;
let token = "";
let shareId = "";
let leadCookie = "";
let points: { id: string; file_name: string }[] = [];

const get = (path: string, headers: Record<string, string> = {}) => fetch(url(path), { redirect: "manual", headers });

beforeAll(async () => {
  ids = await demoIds();
  const steward = await User.findOne({ where: { email: DEMO.steward } });
  const created = await createShareLink((await loadActor(steward!.id, "session"))!, {
    targetType: "series",
    targetId: ids.sharedSeries.id,
    expiresAt: null,
  });
  token = created.token;
  shareId = created.shareId;
  leadCookie = await sessionCookie(DEMO.lead, DEMO_PASSWORD);
  points = await selectRows("SELECT id, file_name FROM spectra WHERE series_id = :id AND status = 'analysed' ORDER BY series_value", {
    id: ids.sharedSeries.id,
  });
}, 60_000);
afterAll(closeDb);

describe("a series share link, signed out", () => {
  it("shows a plot of a point with its peaks and flags, the supernatants, and no review state", async () => {
    const res = await get(`/shared/${token}?spectrum=${ids.sharedSpectrum.id}`);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain('data-testid="shared-spectrum"');
    expect(html).toContain('data-testid="shared-peaks"');
    expect(html).toContain('data-testid="shared-supernatants"');
    expect(html).toContain(`/shared/${token}/curves/${ids.sharedSpectrum.id}?format=csv`);
    // review state never reaches a guest: the series' flags have review states in the database, none is on the page
    const states = await selectRows<{ review_state: string }>(
      "SELECT DISTINCT g.review_state FROM signatures g JOIN spectra s ON s.id = g.spectrum_id WHERE s.series_id = :id",
      { id: ids.sharedSeries.id },
    );
    expect(states.length).toBeGreaterThan(0);
    for (const { review_state } of states)
      expect(html.toLowerCase()).not.toContain(review_state === "awaiting" ? "awaiting review" : `>${review_state}<`);
    expect(html).not.toContain("reviewState");
  });

  it("serves the processed CSV of a point, byte for byte what a member downloads", async () => {
    const shared = await get(`/shared/${token}/curves/${ids.sharedSpectrum.id}?format=csv&axis=nm`);
    expect(shared.status).toBe(200);
    expect(shared.headers.get("cache-control")).toBe("private, no-store");
    const member = await get(`/api/v1/spectra/${ids.sharedSpectrum.id}/export?format=csv&axis=nm`, { cookie: leadCookie });
    expect(member.status).toBe(200);
    const body = await shared.text();
    expect(body).toBe(await member.text());
    expect(body.split("\n").length).toBeGreaterThan(50);
  });

  it("serves JCAMP-DX that an independent reader decodes to the chart's smoothed curve", async () => {
    const jdx = await (await get(`/shared/${token}/curves/${points[0]!.id}?format=jcamp&axis=ev&series=smoothed`)).text();
    const curves = payloadFromColumns(
      decodeColumns(await (await get(`/shared/${token}/curves/${points[0]!.id}?format=binary&axis=ev`)).arrayBuffer()),
    );
    const decoded = convert(jdx).flatten[0]!.spectra[0]!.data as unknown as { x: number[]; y: number[] };
    expect(decoded.x.length).toBe(curves.points);
    for (let i = 0; i < curves.points; i += 50) {
      expect(decoded.x[i]).toBeCloseTo(curves.x[i]!, 4);
      expect(decoded.y[i]).toBeCloseTo(curves.series.smoothed![i]!, 5);
    }
  });

  it("reaches every point and every supernatant of the shared series, and the raw files too", async () => {
    const supernatants = await selectRows<{ id: string }>(
      "SELECT s.id FROM spectra s JOIN spectra p ON p.id = s.supernatant_of_spectrum_id WHERE p.series_id = :id AND s.status = 'analysed'",
      { id: ids.sharedSeries.id },
    );
    expect(supernatants.length).toBeGreaterThan(0);
    for (const { id } of [...points, ...supernatants]) {
      expect((await get(`/shared/${token}/curves/${id}?format=binary`)).status, id).toBe(200);
    }
    expect((await get(`/shared/${token}/raw/${ids.sharedSupernatant.id}`)).status).toBe(200);
    const page = await get(`/shared/${token}?spectrum=${ids.sharedSupernatant.id}`);
    expect(await page.text()).toContain('data-testid="shared-spectrum"');
  });

  it("reaches nothing else: the group's other spectra, another group's, made-up ids", async () => {
    for (const id of [ids.privateSpectrum.id, ids.otherGroupSpectrum.id, "00000000-0000-4000-8000-000000000000"]) {
      for (const path of [
        `/shared/${token}/curves/${id}?format=csv`,
        `/shared/${token}/curves/${id}?format=binary`,
        `/shared/${token}/raw/${id}`,
      ]) {
        const res = await get(path);
        expect(res.status, path).toBe(404);
      }
      const page = await (await get(`/shared/${token}?spectrum=${id}`)).text();
      expect(page).toContain("not part of what this link shares");
      expect(page).not.toContain('data-testid="shared-spectrum"');
    }
    const bad = await get(`/shared/${token}/curves/${points[0]!.id}?format=pdf`);
    expect(bad.status).toBe(400);
  });

  it("is refused at the next request once revoked", async () => {
    const steward = await User.findOne({ where: { email: DEMO.steward } });
    await revokeShareLink((await loadActor(steward!.id, "session"))!, shareId);
    expect((await get(`/shared/${token}/curves/${points[0]!.id}?format=csv`)).status).toBe(404);
    expect((await get(`/shared/${token}`)).status).toBe(404);
  });
});
