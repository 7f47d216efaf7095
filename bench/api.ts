/**
 * API latency bench. Loads, one after another in the same run, with 32 concurrent connections on
 * loopback:
 *   - GET /api/v1/spectra/{id}/data?axis=nm for a 4,096-point spectrum with a parent reference,
 *     in the binary columns format the viewer asks for and in JSON (its cache is warmed first),
 *   - GET /api/v1/review/queue (printed as "not available" when the route does not exist),
 *   - GET /api/health (the app's cheapest route, as the floor),
 * and prints p50/p95/p99 latency and requests/s side by side. Target: p95 < 50 ms for the
 * 4,096-point spectrum.
 *
 * It runs against an app that is already up (APP_URL, else http://127.0.0.1:$PORT from the profile
 * in scripts/env.sh; BANDKEEP_PROFILE picks dev or test). It authenticates with a Bearer API token
 * it issues (lib/api-tokens.ts) for a bench account (a group lead) in a group of its own ("API bench lab",
 * made once), uploads its own 4,096-point parent and sample through the API when they are not there
 * yet, and revokes the token at the end.
 *
 * Usage: npm run bench:api [-- --duration 10 --connections 32]
 */
import { createRequire } from "node:module";
import { loadProfileEnv } from "./profileEnv";

type AutocannonInstance = { on(event: "response", fn: (client: unknown, status: number, bytes: number, ms: number) => void): void };
type AutocannonResult = {
  requests: { average: number; total: number };
  non2xx: number;
  errors: number;
  timeouts: number;
  duration: number;
  throughput: { average: number };
};
type Autocannon = (opts: Record<string, unknown>, cb: (err: Error | null, result: AutocannonResult) => void) => AutocannonInstance;

const args = process.argv.slice(2);
const arg = (name: string, fallback: number) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? Number(args[i + 1]) : fallback;
};
const DURATION = arg("duration", 10);
const CONNECTIONS = arg("connections", 32);
const POINTS = 4096;

const APP = loadProfileEnv();

const require = createRequire(import.meta.url);
const autocannon = require("autocannon") as Autocannon;
const { randomBytes } = await import("node:crypto");
const bcrypt = (await import("bcryptjs")).default;
const { ApiToken, Group, Membership, Project, Spectrum, User } = await import("@/models");
const { closeDb } = await import("@/lib/db");
const { issueApiToken } = await import("@/lib/api-tokens");
const { syntheticAbsorptionCsv } = await import("@/tests/helpers/spectra");

async function benchAccount() {
  const [group] = await Group.findOrCreate({
    where: { slug: "api-bench-lab" },
    defaults: { name: "API bench lab", slug: "api-bench-lab" },
  });
  const [project] = await Project.findOrCreate({
    where: { groupId: group.id, name: "API bench" },
    defaults: { groupId: group.id, name: "API bench" },
  });
  const email = "api-bench@bandkeep.invalid";
  let user = await User.findOne({ where: { email } });
  user ??= await User.create({ email, name: "API bench", passwordHash: await bcrypt.hash(randomBytes(18).toString("base64url"), 10) });
  // a group lead: uploads, and may read the review queue
  const [membership] = await Membership.findOrCreate({
    where: { groupId: group.id, userId: user.id },
    defaults: { groupId: group.id, userId: user.id, role: "lead" },
  });
  if (membership.role !== "lead") await membership.update({ role: "lead" });
  return { project, user };
}

async function upload(token: string, fields: Record<string, string>, fileName: string, text: string): Promise<string> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  form.append("file", new Blob([text], { type: "text/csv" }), fileName);
  const res = await fetch(`${APP}/api/v1/spectra`, { method: "POST", headers: { Authorization: `Bearer ${token}` }, body: form });
  const body = (await res.json()) as {
    files?: { ok: boolean; spectrumId?: string; error?: { message: string } }[];
    error?: { message: string };
  };
  const f = body.files?.[0];
  if (!f?.ok || !f.spectrumId)
    throw new Error(`upload of ${fileName} answered ${res.status}: ${f?.error?.message ?? body.error?.message ?? "no file result"}`);
  return f.spectrumId;
}

async function settled(token: string, id: string): Promise<void> {
  const until = Date.now() + 120_000;
  while (Date.now() < until) {
    const res = await fetch(`${APP}/api/v1/spectra/${id}`, { headers: { Authorization: `Bearer ${token}` } });
    const body = (await res.json()) as { spectrum?: { status: string; error: string | null } };
    if (body.spectrum?.status === "analysed") return;
    if (body.spectrum?.status === "failed") throw new Error(`spectrum ${id} failed: ${body.spectrum.error}`);
    await new Promise((r) => setTimeout(r, 500));
  }
  throw new Error(`spectrum ${id} was not analysed within 120 s: is a worker running on this profile?`);
}

type Row = { name: string; rps: number; p50: number; p95: number; p99: number; total: number; bad: number; note?: string };

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

function load(name: string, url: string, headers: Record<string, string>, duration = DURATION): Promise<Row> {
  return new Promise((resolve, reject) => {
    const times: number[] = [];
    const instance = autocannon({ url, connections: CONNECTIONS, duration, headers, pipelining: 1 }, (err, result) => {
      if (err) return reject(err);
      times.sort((a, b) => a - b);
      resolve({
        name,
        rps: result.requests.total / result.duration,
        p50: percentile(times, 50),
        p95: percentile(times, 95),
        p99: percentile(times, 99),
        total: result.requests.total,
        bad: result.non2xx + result.errors + result.timeouts,
      });
    });
    instance.on("response", (_client, _status, _bytes, ms) => times.push(ms));
  });
}

const { project, user } = await benchAccount();
const { id: tokenId, secret } = await issueApiToken(user.id, "bench:api");
const auth = { Authorization: `Bearer ${secret}` };
try {
  const health = await fetch(`${APP}/api/health`).catch(() => null);
  if (!health) throw new Error(`no app answers at ${APP}: start one (see README) or set APP_URL`);

  // parent and sample, 4,096 points each, uploaded once (the API links a second upload of the same bytes)
  const parentText = syntheticAbsorptionCsv({ points: POINTS, seed: 4096, excitonHeight: 0.4 });
  const sampleText = syntheticAbsorptionCsv({ points: POINTS, seed: 4097, excitonHeight: 0.26 });
  const existing = await Spectrum.findOne({
    where: { projectId: project.id, fileName: "bench-4096-sample.csv" },
    order: [["createdAt", "DESC"]],
  });
  let sampleId = existing?.id;
  if (!sampleId) {
    const parentId = await upload(secret, { projectId: project.id, technique: "absorption" }, "bench-4096-parent.csv", parentText);
    await settled(secret, parentId);
    sampleId = await upload(
      secret,
      { projectId: project.id, technique: "absorption", referenceSpectrumId: parentId },
      "bench-4096-sample.csv",
      sampleText,
    );
  }
  await settled(secret, sampleId);

  const dataUrl = `${APP}/api/v1/spectra/${sampleId}/data?axis=nm`;
  const t0 = performance.now();
  const warm = await fetch(dataUrl, { headers: auth });
  const firstMs = performance.now() - t0;
  if (!warm.ok) throw new Error(`data endpoint answered ${warm.status}: ${await warm.text()}`);
  const payload = (await warm.json()) as { points: number; series: Record<string, unknown[] | null> };
  const bytes = JSON.stringify(payload).length;
  console.log(
    `spectrum ${sampleId}: ${payload.points} grid points, series ${Object.keys(payload.series)
      .filter((k) => payload.series[k])
      .join(
        ", ",
      )}, ${(bytes / 1024).toFixed(0)} KiB JSON; first request ${firstMs.toFixed(0)} ms (${warm.headers.get("x-bandkeep-cache")})`,
  );
  console.log(`${CONNECTIONS} connections, ${DURATION} s each, against ${APP}\n`);

  const binaryUrl = `${dataUrl}&format=binary`;
  const binary = await fetch(binaryUrl, { headers: auth });
  if (!binary.ok) throw new Error(`data endpoint (binary) answered ${binary.status}: ${await binary.text()}`);
  console.log(`the viewer's binary columns body: ${((await binary.arrayBuffer()).byteLength / 1024).toFixed(0)} KiB`);

  const rows: Row[] = [];
  // The viewer asks for the binary columns body; lab scripts usually take the JSON one. Both are measured.
  // A short untimed round first, so neither body's row carries the app processes' warm-up.
  await load("warm-up", dataUrl, auth, 3);
  await load("warm-up", binaryUrl, auth, 3);
  rows.push(await load(`spectrum data, binary`, binaryUrl, auth));
  rows.push(await load(`spectrum data, JSON`, dataUrl, auth));
  const probe = await fetch(`${APP}/api/v1/review/queue`, { headers: auth });
  const isJson = (probe.headers.get("content-type") ?? "").includes("json");
  if (probe.status === 404 && !isJson)
    rows.push({
      name: "review queue",
      rps: NaN,
      p50: NaN,
      p95: NaN,
      p99: NaN,
      total: 0,
      bad: 0,
      note: "not available (GET /api/v1/review/queue does not exist in this build)",
    });
  else if (!probe.ok)
    rows.push({
      name: "review queue",
      rps: NaN,
      p50: NaN,
      p95: NaN,
      p99: NaN,
      total: 0,
      bad: 0,
      note: `not available (answered ${probe.status})`,
    });
  else rows.push(await load("review queue", `${APP}/api/v1/review/queue`, auth));
  rows.push(await load("health", `${APP}/api/health`, {}));

  const pad = (s: string, n: number) => s.padStart(n);
  const ms = (v: number) => (Number.isFinite(v) ? `${v.toFixed(1)} ms` : "—");
  console.log(
    `${"endpoint".padEnd(28)}${pad("req/s", 10)}${pad("p50", 11)}${pad("p95", 11)}${pad("p99", 11)}${pad("requests", 10)}${pad("non-2xx", 9)}`,
  );
  for (const r of rows) {
    if (r.note) {
      console.log(`${r.name.padEnd(28)}${r.note}`);
      continue;
    }
    console.log(
      `${r.name.padEnd(28)}${pad(r.rps.toFixed(0), 10)}${pad(ms(r.p50), 11)}${pad(ms(r.p95), 11)}${pad(ms(r.p99), 11)}${pad(String(r.total), 10)}${pad(String(r.bad), 9)}`,
    );
  }
  const [viewer, json] = rows;
  console.log("");
  for (const r of [viewer!, json!]) {
    console.log(
      `target p95 < 50 ms, ${r.name}: ${r.p95 < 50 ? "met" : "NOT met"} (p95 ${ms(r.p95)})${r.bad ? `; ${r.bad} requests were not 2xx` : ""}`,
    );
  }
} finally {
  await ApiToken.update({ revokedAt: new Date() }, { where: { id: tokenId } });
  await closeDb();
}
