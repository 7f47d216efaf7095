import { createHash } from "node:crypto";
import { strFromU8, unzipSync } from "fflate";
import { convert } from "jcampconverter";
import { afterAll, beforeAll, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { parseSpectrumFile } from "@/lib/engine";
import type { Manifest } from "@/lib/stewardship/exportBundle";
import { DEMO, DEMO_PASSWORD, url } from "../helpers/app";
import { demoIds } from "../helpers/demo-ids";
import { sessionCookie } from "../helpers/session";

// Sources: HTTP status codes as RFC 9110 defines them (200, 404); checksums are sha256 (FIPS 180-4) as
// recorded at upload; JCAMP-DX 4.24 (McDonald & Wilks, Appl. Spectrosc. 1988) read by jcampconverter.
// Downloads the export bundle of the demo's shared titration series over HTTP (read
// only), re-reads it: every sha256 against the manifest, every raw file against the
// sha256 recorded at upload, every JCAMP-DX with the engine's parser and jcampconverter.

let ids: Awaited<ReturnType<typeof demoIds>>;
beforeAll(async () => {
  ids = await demoIds();
});
afterAll(closeDb);

it("exports a series as a zip whose manifest, checksums and JCAMP-DX files check out", async () => {
  const cookie = await sessionCookie(DEMO.collaborator, DEMO_PASSWORD); // read-only collaborator with the share
  const response = await fetch(url(`/api/v1/exports/series/${ids.sharedSeries.id}`), { headers: { cookie } });
  expect(response.status).toBe(200);
  expect(response.headers.get("content-type")).toBe("application/zip");
  const files = unzipSync(new Uint8Array(await response.arrayBuffer()));
  const manifest = JSON.parse(strFromU8(files["manifest.json"]!)) as Manifest;
  expect(manifest.format).toBe("bandkeep-bundle/1");
  expect(manifest.target).toMatchObject({ type: "series", id: ids.sharedSeries.id });
  expect(manifest.spectra.length).toBeGreaterThan(2);
  // Every file but the manifest is listed, and every listed file is there with its sha256.
  expect(
    Object.keys(files)
      .filter((p) => p !== "manifest.json")
      .sort(),
  ).toEqual(manifest.files.map((f) => f.path).sort());
  for (const f of manifest.files) {
    const bytes = files[f.path]!;
    expect(createHash("sha256").update(bytes).digest("hex"), f.path).toBe(f.sha256);
    expect(bytes.length).toBe(f.bytes);
  }
  expect(strFromU8(files["README.txt"]!)).toContain("manifest.json");
  for (const s of manifest.spectra) {
    const raw = s.files.find((p) => p.startsWith("raw/"))!;
    expect(createHash("sha256").update(files[raw]!).digest("hex"), "raw file as it arrived").toBe(s.sha256);
    const jdx = s.files.find((p) => p.endsWith(".jdx"));
    const csv = s.files.find((p) => p.endsWith(".csv") && p.startsWith("processed/"));
    if (!jdx || !csv) {
      expect(s.note).toMatch(/not processed/);
      continue;
    }
    const fromRaw = parseSpectrumFile(s.fileName, files[raw]!);
    const fromJdx = parseSpectrumFile("x.jdx", files[jdx]!);
    expect(fromJdx.x.length).toBe(fromRaw.x.length);
    const maxY = Math.max(...fromRaw.y.map(Math.abs));
    fromJdx.x.forEach((v, i) => expect(Math.abs(v - fromRaw.x[i]!)).toBeLessThan(1e-9 * Math.abs(fromRaw.x[i]!) + 1e-12));
    fromJdx.y.forEach((v, i) => expect(Math.abs(v - fromRaw.y[i]!)).toBeLessThan(maxY * 1e-9)); // YFACTOR = max/2^30
    const jc = convert(strFromU8(files[jdx]!)).flatten[0]!.spectra[0]!.data as unknown as { x: number[]; y: number[] };
    expect(jc.x.length).toBe(fromRaw.x.length);
    const csvRows = strFromU8(files[csv]!).trim().split("\n");
    expect(csvRows.length - 1).toBe(fromRaw.x.length);
  }
});

it("refuses the export of a series not shared with the collaborator, as not found", async () => {
  const cookie = await sessionCookie(DEMO.collaborator, DEMO_PASSWORD);
  const response = await fetch(url(`/api/v1/exports/series/${ids.privateSeries.id}`), { headers: { cookie } });
  expect(response.status).toBe(404);
});
