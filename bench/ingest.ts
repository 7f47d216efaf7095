/**
 * Ingest benchmark. Pushes N exports of 2,000 points through the HTTP API (upload → queue →
 * worker → analysis written) until every one is analysed, then pushes the same files through
 * the bare storage path (object put + row insert; no queue, no analysis). Prints files/second
 * for both, their ratio, and the worker's peak resident memory (VmHWM).
 *
 * It starts what it needs on the test profile: the loopback services (scripts/services.sh,
 * idempotent), migrations, its own app (scripts/serve.mjs) on BENCH_PORT (default 3099; builds first when
 * there is no build) and its own worker, both on a queue of their own, so a running `npm start`
 * or `npm test` stack is not disturbed.
 *
 * Usage: npm run bench:ingest [-- --files 1000 --parallel 8 --workers 1 --concurrency 2 --files-per-request 1 --profile DIR]
 */
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { existsSync, readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { randomBytes } from "node:crypto";
import http from "node:http";

const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const args = process.argv.slice(2);
const arg = (name: string, fallback: number) => {
  const i = args.indexOf(`--${name}`);
  return i >= 0 ? Number(args[i + 1]) : fallback;
};
const FILES = arg("files", 1000);
const PARALLEL = arg("parallel", 8);
const WORKERS = arg("workers", 1);
const CONCURRENCY = arg("concurrency", 2);
// Files per upload request: 1 is the upload page (one request per file, for its progress bars);
// a lab script sending a folder puts several in one request.
const PER_REQUEST = arg("files-per-request", 1);
const BENCH_PORT = arg("port", 3099);
// --profile DIR: write V8 CPU profiles of the app and the worker there (open them in a browser's devtools).
const PROFILE_DIR = args.includes("--profile") ? path.resolve(args[args.indexOf("--profile") + 1] ?? "bench-profiles") : null;
const profileFlags = PROFILE_DIR ? ["--cpu-prof", `--cpu-prof-dir=${PROFILE_DIR}`] : [];

// The test profile's environment, read from scripts/env.sh so addresses stay in one place.
const envText = execFileSync(
  "bash",
  ["-c", "export BANDKEEP_PROFILE=test; source scripts/env.sh; source scripts/services.sh; start_services >&2; env -0"],
  {
    cwd: ROOT,
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
  },
);
for (const pair of envText.split("\0")) {
  const i = pair.indexOf("=");
  if (i > 0) process.env[pair.slice(0, i)] = pair.slice(i + 1);
}
const QUEUE = `bench-ingest-${randomBytes(3).toString("hex")}`;
process.env.BANDKEEP_QUEUE = QUEUE;
process.env.PORT = String(BENCH_PORT);
process.env.NEXTAUTH_URL = `http://127.0.0.1:${BENCH_PORT}`;
process.env.APP_URL = process.env.NEXTAUTH_URL;
execFileSync(process.execPath, ["--import", "tsx", "scripts/migrate.ts", "up"], { cwd: ROOT, stdio: "inherit" });

const { Project, Spectrum } = await import("@/models");
const { closeDb } = await import("@/lib/db");
const { newRawObjectKey, putObject, sha256Hex } = await import("@/lib/storage");
const { analysisQueue } = await import("@/lib/queue");
const { createLab } = await import("@/tests/helpers/fixtures");
const { syntheticAbsorptionCsv, enc } = await import("@/tests/helpers/spectra");
const { Op } = await import("sequelize");
const { cpuMsOfTrees, cpuMsPer, descendantPids, formatCpuPer, pidFromFile } = await import("./processCpu");

const children: ChildProcess[] = [];
function start(name: string, argv: string[], extraEnv: Record<string, string> = {}): ChildProcess {
  const child = spawn(process.execPath, argv, { cwd: ROOT, env: { ...process.env, ...extraEnv }, stdio: ["ignore", "pipe", "pipe"] });
  let tail = "";
  child.stdout?.on("data", (d: Buffer) => (tail = (tail + d).slice(-4000)));
  child.stderr?.on("data", (d: Buffer) => (tail = (tail + d).slice(-4000)));
  child.on("exit", (code) => {
    if (!stopping) console.error(`${name} exited (${code}):\n${tail}`);
  });
  children.push(child);
  return child;
}
let stopping = false;
async function stopAll() {
  stopping = true;
  await Promise.all(
    children.map(
      (c) =>
        new Promise<void>((resolve) => {
          if (c.exitCode !== null) return resolve();
          c.once("exit", () => resolve());
          c.kill("SIGTERM");
          setTimeout(() => c.kill("SIGKILL"), 15_000).unref();
        }),
    ),
  );
}
process.on("SIGINT", () => void stopAll().then(() => process.exit(130)));

/** A multipart/form-data body (RFC 7578) with text fields and one part per file. */
function multipartBody(
  fields: Record<string, string>,
  files: { fileName: string; bytes: Uint8Array }[],
): { body: Buffer; type: string; count: number } {
  const boundary = `----bench${randomBytes(12).toString("hex")}`;
  const parts: Buffer[] = [];
  for (const [name, value] of Object.entries(fields)) {
    parts.push(Buffer.from(`--${boundary}\r\nContent-Disposition: form-data; name="${name}"\r\n\r\n${value}\r\n`));
  }
  for (const f of files) {
    parts.push(
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="${f.fileName}"\r\nContent-Type: text/csv\r\n\r\n`,
      ),
    );
    parts.push(Buffer.from(f.bytes), Buffer.from("\r\n"));
  }
  parts.push(Buffer.from(`--${boundary}--\r\n`));
  return { body: Buffer.concat(parts), type: `multipart/form-data; boundary=${boundary}`, count: files.length };
}

function postBody(
  url: string,
  b: { body: Buffer; type: string },
  headers: Record<string, string>,
  agent: http.Agent,
): Promise<{ status: number; text: string }> {
  return new Promise((resolve, reject) => {
    const req = http.request(
      url,
      { method: "POST", agent, headers: { ...headers, "Content-Type": b.type, "Content-Length": String(b.body.length) } },
      (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString("utf8") }));
        res.on("error", reject);
      },
    );
    req.on("error", reject);
    req.end(b.body);
  });
}

function peakRssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, "utf8");
  const kb = Number(/VmHWM:\s+(\d+)/.exec(status)?.[1] ?? 0);
  return kb / 1024;
}

async function waitHttp(url: string, timeoutMs: number) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    try {
      await fetch(url);
      return;
    } catch {
      await new Promise((r) => setTimeout(r, 300));
    }
  }
  throw new Error(`nothing answered at ${url}`);
}

async function pool<T>(items: T[], parallel: number, fn: (item: T, i: number) => Promise<void>) {
  let next = 0;
  await Promise.all(
    Array.from({ length: parallel }, async () => {
      while (next < items.length) {
        const i = next++;
        await fn(items[i], i);
      }
    }),
  );
}

try {
  if (!existsSync(path.join(ROOT, ".next", "BUILD_ID"))) {
    console.log("no build found: running next build (once)");
    execFileSync(process.execPath, ["node_modules/next/dist/bin/next", "build"], { cwd: ROOT, stdio: "inherit" });
  }
  const app = start("app", [...profileFlags, "scripts/serve.mjs", "-H", "127.0.0.1", "-p", String(BENCH_PORT)]);
  const workers = Array.from({ length: WORKERS }, () =>
    start("worker", [...profileFlags, "--import", "tsx", "workers/index.ts"], { WORKER_CONCURRENCY: String(CONCURRENCY) }),
  );
  await waitHttp(`http://127.0.0.1:${BENCH_PORT}/api/v1/projects`, 60_000);

  const lab = await createLab("spectroscopist");
  const bareProject = await Project.create({ groupId: lab.group.id, name: `Bare storage path ${randomBytes(3).toString("hex")}` });
  const files = Array.from({ length: FILES }, (_, i) => ({
    fileName: `bench-${i}.csv`,
    bytes: enc(syntheticAbsorptionCsv({ seed: 900_000 + i, points: 2000 })),
  }));
  const mb = files.reduce((s, f) => s + f.bytes.length, 0) / 1024 / 1024;
  console.log(
    `\n${FILES} exports of 2,000 points (${mb.toFixed(1)} MiB), ${PER_REQUEST} file(s) per request, ${PARALLEL} requests in flight, ${WORKERS} worker(s) × concurrency ${CONCURRENCY}, queue ${QUEUE}`,
  );

  // Warm the app's routes so the first requests do not carry start-up cost.
  const warm = new FormData();
  warm.append("projectId", lab.project.id);
  warm.append("technique", "absorption");
  warm.append("file", new Blob([enc(syntheticAbsorptionCsv({ seed: 1, points: 2000 })) as Uint8Array<ArrayBuffer>]), "warm.csv");
  await fetch(`http://127.0.0.1:${BENCH_PORT}/api/v1/spectra`, {
    method: "POST",
    headers: { Authorization: `Bearer ${lab.token}` },
    body: warm,
  });

  // Where the CPU goes: every process tree of the stack, read from /proc before and after each phase.
  const runDir = path.join(process.env.BANDKEEP_DATA_DIR!, "run");
  const trees = () =>
    cpuMsOfTrees({
      app: app.pid,
      ...Object.fromEntries(workers.map((w, i) => [workers.length > 1 ? `worker${i + 1}` : "worker", w.pid])),
      postgres: pidFromFile(path.join(process.env.BANDKEEP_DATA_DIR!, "pg", "postmaster.pid")),
      redis: pidFromFile(path.join(runDir, "redis.pid")),
      storage: pidFromFile(path.join(runDir, "storage.pid")),
    });
  const clientCpuMs = () => {
    const u = process.cpuUsage();
    return (u.user + u.system) / 1000;
  };

  // 1. Through the HTTP API until analysed. The multipart bodies are encoded before the clock
  // starts and sent over kept-alive node:http sockets, so the load generator takes as little of
  // the two cores as it can (fetch + FormData cost the client about 8 ms of CPU per upload).
  const bodies = Array.from({ length: Math.ceil(files.length / PER_REQUEST) }, (_, i) =>
    multipartBody({ projectId: lab.project.id, technique: "absorption" }, files.slice(i * PER_REQUEST, (i + 1) * PER_REQUEST)),
  );
  const agent = new http.Agent({ keepAlive: true, maxSockets: PARALLEL });
  const ids: string[] = [];
  const cpu0 = { ...trees(), "bench client": clientCpuMs() };
  const t0 = performance.now();
  let refused = 0;
  await pool(bodies, PARALLEL, async (b) => {
    const res = await postBody(`http://127.0.0.1:${BENCH_PORT}/api/v1/spectra`, b, { Authorization: `Bearer ${lab.token}` }, agent);
    const body = JSON.parse(res.text) as { files?: { ok: boolean; spectrumId?: string }[] };
    const stored = (body.files ?? []).filter((f) => f.ok && f.spectrumId);
    refused += b.count - stored.length;
    for (const f of stored) ids.push(f.spectrumId!);
  });
  const tUploaded = performance.now();
  for (;;) {
    const done = await Spectrum.count({ where: { id: { [Op.in]: ids }, status: { [Op.in]: ["analysed", "failed"] } } });
    if (done === ids.length) break;
    await new Promise((r) => setTimeout(r, 200));
  }
  const tAnalysed = performance.now();
  const cpu1 = { ...trees(), "bench client": clientCpuMs() };
  const failed = await Spectrum.count({ where: { id: { [Op.in]: ids }, status: "failed" } });
  const peakRss = workers.map((w) => peakRssMb(w.pid!));
  const appProcesses = [app.pid!, ...descendantPids(app.pid!)];
  const appRss = Math.max(...appProcesses.map(peakRssMb));

  // 2. The bare storage path: object put + row insert, same files, same parallelism.
  const cpu2 = { ...trees(), "bench client": clientCpuMs() };
  const t1 = performance.now();
  await pool(files, PARALLEL, async (f) => {
    const key = newRawObjectKey();
    const sha256 = sha256Hex(f.bytes);
    await putObject(key, f.bytes, "text/csv", sha256);
    await Spectrum.create({
      projectId: bareProject.id,
      sampleId: null,
      seriesId: null,
      seriesValue: null,
      referenceSpectrumId: null,
      technique: "absorption",
      fileName: f.fileName,
      objectKey: key,
      sha256,
      sizeBytes: f.bytes.length,
      contentType: "text/csv",
      columnChoice: null,
      axisUnit: null,
      valueUnit: null,
      pathLengthCm: null,
      excitationNm: null,
      slitNm: null,
      integrationMs: null,
      material: null,
      status: "received",
      errorMessage: null,
      uploadedBy: lab.user.id,
    });
  });
  const tBare = performance.now();
  const cpu3 = { ...trees(), "bench client": clientCpuMs() };

  const s = (ms: number) => ms / 1000;
  const pipelineRate = ids.length / s(tAnalysed - t0);
  const uploadRate = ids.length / s(tUploaded - t0);
  const bareRate = FILES / s(tBare - t1);
  console.log("");
  console.log(
    `HTTP API, upload → analysed : ${ids.length} files in ${s(tAnalysed - t0).toFixed(1)} s = ${pipelineRate.toFixed(1)} files/s (${failed} failed, ${refused} refused)`,
  );
  console.log(`  of which uploads accepted : ${s(tUploaded - t0).toFixed(1)} s = ${uploadRate.toFixed(1)} files/s`);
  console.log(`bare storage path (put+row) : ${FILES} files in ${s(tBare - t1).toFixed(1)} s = ${bareRate.toFixed(1)} files/s`);
  console.log(
    `ratio pipeline / bare       : ${(pipelineRate / bareRate).toFixed(3)}   (upload acceptance / bare: ${(uploadRate / bareRate).toFixed(3)})`,
  );
  console.log(`CPU per file, pipeline      : ${formatCpuPer(cpuMsPer(cpu0, cpu1, ids.length))}`);
  console.log(`CPU per file, bare path     : ${formatCpuPer(cpuMsPer(cpu2, cpu3, FILES))}`);
  console.log(
    `worker peak RSS (VmHWM)     : ${peakRss.map((m) => `${m.toFixed(0)} MB`).join(", ")}   (app: ${appRss.toFixed(0)} MB, largest of ${appProcesses.length} processes)`,
  );

  await analysisQueue()
    .obliterate({ force: true })
    .catch(() => {});
  await analysisQueue().close();
  await closeDb();
} finally {
  await stopAll();
}
process.exit(0);
