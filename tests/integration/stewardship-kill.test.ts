import { spawn } from "node:child_process";
import { afterAll, expect, it } from "vitest";
import { closeDb } from "@/lib/db";
import { runSweep } from "@/lib/stewardship/sweep";
import { RetentionPolicy, Spectrum, Tombstone } from "@/models";
import { createLab } from "../helpers/fixtures";
import { consistency, storedSpectrum } from "./stewardship-fixtures";

// Sources: every count checked here is of spectra this test itself stored (known truth of its fixtures).
// SIGKILL a sweep process half way — inside the deletion of its third spectrum, after
// the object is deleted and before the row's transaction commits — then sweep again
// and check that no row lacks its object and no deleted row's object remains.

afterAll(closeDb);

it("a sweep killed half way leaves rows and objects consistent after the next run", async () => {
  const lab = await createLab("steward");
  const spectra = [];
  for (let i = 0; i < 6; i++) spectra.push(await storedSpectrum(lab, { ageDays: 50 }));
  await RetentionPolicy.create({ projectId: lab.project.id, dataClass: "raw", keepDays: 10, onExpiry: "delete", createdBy: null });

  const child = spawn(process.execPath, ["--import", "tsx", "tests/integration/stewardship-sweep-child.ts", lab.project.id, "1500"], {
    env: process.env,
    stdio: ["ignore", "pipe", "pipe"],
    detached: true,
  });
  let out = "";
  child.stdout.on("data", (d) => (out += String(d)));
  child.stderr.on("data", (d) => (out += String(d)));
  const exited = new Promise<NodeJS.Signals | null>((resolve) => child.on("exit", (_code, signal) => resolve(signal)));
  const deadline = Date.now() + 60_000;
  while ((out.match(/^item /gm) ?? []).length < 3) {
    if (Date.now() > deadline) throw new Error(`the sweep did not reach its third item:\n${out}`);
    await new Promise((r) => setTimeout(r, 50));
  }
  await new Promise((r) => setTimeout(r, 800)); // inside the third item's pause
  process.kill(-child.pid!, "SIGKILL");
  expect(await exited).toBe("SIGKILL");
  expect(out).not.toContain("sweep finished");

  const afterKill = await Tombstone.findAll({ where: { projectId: lab.project.id } });
  expect(afterKill.filter((t) => t.state === "done")).toHaveLength(2);
  expect(afterKill.filter((t) => t.state === "pending")).toHaveLength(1); // the interrupted one
  expect(await Spectrum.count({ where: { projectId: lab.project.id } })).toBe(4); // its row's delete was rolled back

  const summary = await runSweep({ projectIds: [lab.project.id] });
  expect(summary.recovered).toBe(1);
  expect(await Spectrum.count({ where: { projectId: lab.project.id } })).toBe(0);
  expect(await consistency([lab.project.id])).toEqual({ rowsWithoutObject: [], objectsWithoutRow: [], pending: 0 });
  const tombs = await Tombstone.findAll({ where: { projectId: lab.project.id } });
  expect(tombs.map((t) => t.targetId).sort()).toEqual(spectra.map((s) => s.id).sort());
  expect(tombs.every((t) => t.state === "done")).toBe(true);
});
