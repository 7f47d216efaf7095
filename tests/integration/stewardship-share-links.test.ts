import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { hashToken } from "@/lib/auth/actor";
import { closeDb, selectRows } from "@/lib/db";
import { getObjectBytes, sha256Hex } from "@/lib/storage";
import { createShareLink, listShareLinks, resolveShareLink, revokeShareLink } from "@/lib/stewardship/shareLinks";
import { Project, Share, type Series, type Spectrum } from "@/models";
import { url } from "../helpers/app";
import { addMember, createLab, createSample, createSeries, type Lab } from "../helpers/fixtures";
import { storedSpectrum } from "./stewardship-fixtures";
import { Refusal } from "@/lib/errors";

// Sources: HTTP status codes as RFC 9110 defines them (200, 404); every other number is a count or
// value this test itself created (known truth of its fixtures).
// Read-only share links against the running app, PostgreSQL and the storage fake: the
// page and raw downloads work while the link is in force and only for what it names;
// expiry, revocation and unknown tokens are refused at the next request.

let lab: Lab;
let seriesA: Series;
let seriesB: Series;
let a1: Spectrum;
let a2: Spectrum;
let b1: Spectrum;
let elsewhere: Spectrum; // same group, another project
let foreign: Spectrum; // another group

beforeAll(async () => {
  lab = await createLab("steward");
  const sample = await createSample(lab, "CdSe/ZnS");
  seriesA = await createSeries(lab);
  seriesB = await createSeries(lab);
  a1 = await storedSpectrum(lab, { seriesId: seriesA.id, seriesValue: 0, sampleId: sample.id });
  a2 = await storedSpectrum(lab, { seriesId: seriesA.id, seriesValue: 0.5, sampleId: sample.id });
  b1 = await storedSpectrum(lab, { seriesId: seriesB.id, seriesValue: 1 });
  const otherProject = await Project.create({ groupId: lab.group.id, name: `Other study ${seriesA.name}` });
  elsewhere = await storedSpectrum({ ...lab, project: otherProject });
  const other = await createLab("steward");
  foreign = await storedSpectrum(other);
});
afterAll(closeDb);

const get = (path: string) => fetch(url(path), { redirect: "manual" });

async function expectInvalidPage(token: string) {
  const page = await get(`/shared/${token}`);
  expect(page.status).toBe(404);
  const html = await page.text();
  expect(html).toContain("This link is not valid");
  expect(html).toContain("revoked, it expired, or it never existed");
  expect(html).not.toMatch(/at .*\.(ts|js):\d+|Error:|stack/i);
}

async function expectRawRefused(token: string, spectrumId: string) {
  const raw = await get(`/shared/${token}/raw/${spectrumId}`);
  expect(raw.status).toBe(404);
  expect(raw.headers.get("cache-control")).toBe("private, no-store");
  const body = (await raw.json()) as { error: { code: string; message: string } };
  expect(body.error.code).toBe("not_found");
}

describe("share link for a series", () => {
  let token: string;

  it("is created by the group's steward; only the sha256 is stored; the creation is audited", async () => {
    const link = await createShareLink(lab.actor, {
      targetType: "series",
      targetId: seriesA.id,
      expiresAt: new Date(Date.now() + 86_400_000),
    });
    token = link.token;
    expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
    const row = await Share.findByPk(link.shareId);
    expect(row!.linkTokenHash).toBe(hashToken(token));
    expect(row!.granteeUserId).toBeNull();
    const [stored] = await selectRows<{ everything: string }>("SELECT row_to_json(s)::text AS everything FROM shares s WHERE id = :id", {
      id: link.shareId,
    });
    expect(stored!.everything).not.toContain(token);
    const [event] = await selectRows<{ details: { prefix: string; shareId: string } }>(
      "SELECT details FROM audit_events WHERE action = 'share-link-created' AND details->>'shareId' = :id",
      { id: link.shareId },
    );
    expect(event!.details.prefix).toBe(token.slice(0, 6));
    const listed = (await listShareLinks(lab.actor)).find((l) => l.id === link.shareId);
    expect(listed).toMatchObject({ prefix: token.slice(0, 6), state: "in force", targetType: "series" });
    expect(await resolveShareLink(token)).toMatchObject({ targetType: "series", targetId: seriesA.id, groupName: lab.group.name });
  });

  it("shows the series, with the group, the expiry and the hazard cautions, to anyone with the link", async () => {
    const page = await get(`/shared/${token}`);
    expect(page.status).toBe(200);
    expect(page.headers.get("cache-control")).toContain("no-store");
    const html = (await page.text()).replace(/<!-- -->/g, ""); // React's text separators
    expect(html).toContain(seriesA.name);
    expect(html).toContain(a1.fileName);
    expect(html).toContain(a2.fileName);
    expect(html).not.toContain(b1.fileName);
    expect(html).toContain(`Read-only link shared by <strong>${lab.group.name}</strong>`);
    expect(html).toMatch(/expires \d{1,2} [A-Z][a-z]{2} \d{4}, \d{2}:\d{2} UTC/);
    expect(html).toContain("Safety cautions");
    expect(html).toMatch(/cadmium/i);
    expect(html).toMatch(/<meta name="robots" content="noindex, nofollow/);
    expect(html).toMatch(/<meta name="referrer" content="no-referrer"/);
    expect(html).not.toContain("/signin");
  });

  it("downloads a spectrum of the series with the exact bytes", async () => {
    const raw = await get(`/shared/${token}/raw/${a1.id}`);
    expect(raw.status).toBe(200);
    const bytes = new Uint8Array(await raw.arrayBuffer());
    expect(Buffer.from(bytes).equals(Buffer.from(await getObjectBytes(a1.objectKey)))).toBe(true);
    expect(sha256Hex(bytes)).toBe(a1.sha256);
    expect(raw.headers.get("cache-control")).toBe("private, no-store");
    expect(raw.headers.get("x-robots-tag")).toContain("noindex");
    expect(raw.headers.get("referrer-policy")).toBe("no-referrer");
    expect(raw.headers.get("content-disposition")).toContain(a1.fileName);
  });

  it("refuses a spectrum of another series of the same project, of another project, of another group, and a bad id", async () => {
    for (const s of [b1, elsewhere, foreign]) await expectRawRefused(token, s.id);
    await expectRawRefused(token, "not-a-uuid");
  });

  it("is refused at once when revoked; the revocation is audited and not repeated", async () => {
    const shareId = (await resolveShareLink(token))!.shareId;
    await revokeShareLink(lab.actor, shareId);
    expect(await resolveShareLink(token)).toBeNull();
    await expectInvalidPage(token);
    await expectRawRefused(token, a1.id);
    const events = await selectRows("SELECT 1 FROM audit_events WHERE action = 'share-link-revoked' AND details->>'shareId' = :shareId", {
      shareId,
    });
    expect(events).toHaveLength(1);
    await expect(revokeShareLink(lab.actor, shareId)).rejects.toThrow(/already revoked/);
    expect((await listShareLinks(lab.actor)).find((l) => l.id === shareId)?.state).toBe("revoked");
  });
});

it("refuses an expired link at once (expires_at in the past)", async () => {
  const link = await createShareLink(lab.actor, {
    targetType: "series",
    targetId: seriesA.id,
    expiresAt: new Date(Date.now() + 3_600_000),
  });
  expect((await get(`/shared/${link.token}/raw/${a2.id}`)).status).toBe(200);
  await Share.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { id: link.shareId } });
  expect(await resolveShareLink(link.token)).toBeNull();
  await expectInvalidPage(link.token);
  await expectRawRefused(link.token, a2.id);
  expect((await listShareLinks(lab.actor)).find((l) => l.id === link.shareId)?.state).toBe("expired");
});

it("refuses an unknown or malformed token", async () => {
  const unknown = Buffer.from(crypto.getRandomValues(new Uint8Array(32))).toString("base64url");
  expect(await resolveShareLink(unknown)).toBeNull();
  await expectInvalidPage(unknown);
  await expectRawRefused(unknown, a1.id);
  await expectInvalidPage("..%2F..%2Fetc");
});

it("a project link shows its series and spectra (names and states) and serves only that project's files", async () => {
  const link = await createShareLink(lab.actor, { targetType: "project", targetId: lab.project.id, expiresAt: null });
  const page = await get(`/shared/${link.token}`);
  expect(page.status).toBe(200);
  const html = await page.text();
  for (const text of [lab.project.name, seriesA.name, seriesB.name, a1.fileName, b1.fileName, "no expiry date"])
    expect(html).toContain(text);
  expect(html).not.toContain(elsewhere.fileName);
  const raw = await get(`/shared/${link.token}/raw/${b1.id}`);
  expect(raw.status).toBe(200);
  expect(sha256Hex(new Uint8Array(await raw.arrayBuffer()))).toBe(b1.sha256);
  await expectRawRefused(link.token, elsewhere.id);
  await expectRawRefused(link.token, foreign.id);
  await revokeShareLink(lab.actor, link.shareId);
  expect((await get(`/shared/${link.token}/raw/${b1.id}`)).status).toBe(404);
});

it("only a data steward of the owning group creates or revokes links; bad input names the field", async () => {
  const spectroscopist = await addMember(lab, "spectroscopist");
  const lead = await addMember(lab, "lead");
  const outsider = await createLab("steward");
  for (const actor of [spectroscopist.actor, lead.actor, outsider.actor]) {
    const refusal = await createShareLink(actor, { targetType: "series", targetId: seriesA.id, expiresAt: null }).catch((e: unknown) => e);
    expect(refusal).toBeInstanceOf(Refusal);
    expect((refusal as Refusal).field).toBe("shareTarget");
  }
  const before = await Share.count({ where: { targetId: seriesA.id } });
  const link = await createShareLink(lab.actor, { targetType: "series", targetId: seriesA.id, expiresAt: null });
  for (const actor of [spectroscopist.actor, outsider.actor])
    await expect(revokeShareLink(actor, link.shareId)).rejects.toThrow(/Not found/);
  expect(await resolveShareLink(link.token)).not.toBeNull();
  expect(await Share.count({ where: { targetId: seriesA.id } })).toBe(before + 1);
  await expect(
    createShareLink(lab.actor, { targetType: "series", targetId: seriesA.id, expiresAt: new Date(Date.now() - 60_000) }),
  ).rejects.toThrow(/^expiresAt: /);
  await expect(createShareLink(lab.actor, { targetType: "series", targetId: "nope", expiresAt: null })).rejects.toThrow(/^shareTarget: /);
  await expect(revokeShareLink(lab.actor, "nope")).rejects.toThrow(/^id: /);
  await revokeShareLink(lab.actor, link.shareId);
});
