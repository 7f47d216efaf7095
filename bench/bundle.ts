/**
 * Export bundle bench: writes the bundle of a project of N spectra (default 10 000) to /dev/null
 * through streamBundle, and prints the time, the zip's size and the process's peak RSS (VmHWM).
 *
 * Usage: npm run bench:bundle -- [N] (BANDKEEP_PROFILE picks the services; they must be running)
 * The spectra are rows of a scratch project in the profile's database, each with its own stored
 * copy of one real raw file (/work/shared/real-spectra), so each is fetched, parsed and written as
 * raw, CSV and JCAMP-DX like any upload (a project keeps one spectrum per sha256, so the rows carry
 * distinct made-up digests). The project and the objects are deleted afterwards.
 * Target (docs/benchmarks.md): peak RSS under 300 MB for 10 000 spectra.
 */
import { createHash, randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import path from "node:path";
import { loadProfileEnv, ROOT } from "./profileEnv";

loadProfileEnv();
const { closeDb, selectRows } = await import("@/lib/db");
const { putObject, deleteObject } = await import("@/lib/storage");
const { streamBundle } = await import("@/lib/stewardship/exportBundle");

const n = Number(process.argv.slice(2).find((a) => /^\d+$/.test(a)) ?? 10_000);
const RAW = path.join(ROOT, "..", "shared", "real-spectra", "carbon-dots-absorbance-decimal-comma.txt");
const peakRssMb = () => Number(/VmHWM:\s+(\d+) kB/.exec(readFileSync("/proc/self/status", "utf8"))?.[1] ?? 0) / 1024;

const raw = new Uint8Array(readFileSync(RAW));
const sha = createHash("sha256").update(raw).digest("hex");
const prefix = `bench-bundle/${randomUUID()}`;
const keys = Array.from({ length: n }, (_, i) => `${prefix}/${i + 1}`);
const inParallel = async (fn: (key: string) => Promise<void>) => {
  for (let i = 0; i < keys.length; i += 16) await Promise.all(keys.slice(i, i + 16).map(fn));
};
await inParallel((key) => putObject(key, raw, "text/plain", sha));
const [group] = await selectRows<{ id: string }>("SELECT id FROM groups ORDER BY name LIMIT 1");
if (!group) throw new Error("no group in this database: run npm run seed first");
const [project] = await selectRows<{ id: string }>("INSERT INTO projects (group_id, name) VALUES (:g, :n) RETURNING id", {
  g: group.id,
  n: `Bundle bench ${prefix}`,
});
try {
  await selectRows(
    `INSERT INTO spectra (project_id, technique, file_name, object_key, sha256, size_bytes, metadata, status, created_at)
     SELECT :p, 'absorption', 'carbon-dots-' || i || '.txt', :prefix || '/' || i, encode(sha256(convert_to(:sha || i, 'UTF8')), 'hex'), :size, '{}', 'analysed', now() - i * interval '1 second'
     FROM generate_series(1, :n) i RETURNING id`,
    { p: project!.id, prefix, sha, size: raw.length, n },
  );
  const rssBefore = peakRssMb();
  const started = performance.now();
  const bundle = await streamBundle({ type: "project", id: project!.id }, "bench@bundle.test");
  let bytes = 0;
  for await (const chunk of bundle.chunks) bytes += chunk.length; // written nowhere: the zip is not kept
  const { manifest } = await bundle.done;
  const seconds = (performance.now() - started) / 1000;
  console.log(
    `bundle of ${n} spectra (${(raw.length / 1024).toFixed(0)} KiB raw file each): ${(bytes / 2 ** 20).toFixed(1)} MiB zip, ${manifest.files.length} files, ${seconds.toFixed(1)} s`,
  );
  console.log(`peak RSS (VmHWM): ${peakRssMb().toFixed(0)} MB (before the bundle: ${rssBefore.toFixed(0)} MB)`);
} finally {
  await selectRows("DELETE FROM spectra WHERE project_id = :p RETURNING id", { p: project!.id });
  await selectRows("DELETE FROM projects WHERE id = :p RETURNING id", { p: project!.id });
  await inParallel((key) => deleteObject(key));
  await closeDb();
}
