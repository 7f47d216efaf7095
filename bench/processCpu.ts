/**
 * CPU time of process trees, read from /proc (Linux), so a benchmark can say where the
 * machine's cores went: the app, the worker, PostgreSQL, Redis, the storage fake, the client.
 */
import { readdirSync, readFileSync } from "node:fs";

const TICKS_PER_SECOND = 100; // USER_HZ on Linux (sysconf(_SC_CLK_TCK)), the unit of /proc/<pid>/stat

type ProcStat = { pid: number; ppid: number; ticks: number };

function readStat(pid: number): ProcStat | null {
  try {
    const text = readFileSync(`/proc/${pid}/stat`, "utf8");
    // The command name (field 2) is in parentheses and may hold spaces: split after its closing one.
    const fields = text.slice(text.lastIndexOf(")") + 2).split(" ");
    // After the name: state(3) ppid(4) … utime(14) stime(15) cutime(16) cstime(17)
    const ticks = Number(fields[11]) + Number(fields[12]) + Number(fields[13]) + Number(fields[14]);
    return { pid, ppid: Number(fields[1]), ticks };
  } catch {
    return null;
  }
}

function allStats(): ProcStat[] {
  return readdirSync("/proc")
    .filter((name) => /^\d+$/.test(name))
    .map((name) => readStat(Number(name)))
    .filter((s): s is ProcStat => s !== null);
}

/** The living descendants of a process (children, grandchildren, …). */
export function descendantPids(pid: number): number[] {
  const stats = allStats();
  const out: number[] = [];
  const stack = [pid];
  while (stack.length) {
    const parent = stack.pop()!;
    for (const s of stats)
      if (s.ppid === parent) {
        out.push(s.pid);
        stack.push(s.pid);
      }
  }
  return out;
}

/** CPU milliseconds used so far by each named process and all its living descendants. */
export function cpuMsOfTrees(roots: Record<string, number | undefined>): Record<string, number> {
  const stats = allStats();
  const children = new Map<number, ProcStat[]>();
  for (const s of stats) children.set(s.ppid, [...(children.get(s.ppid) ?? []), s]);
  const byPid = new Map(stats.map((s) => [s.pid, s]));
  const out: Record<string, number> = {};
  for (const [name, pid] of Object.entries(roots)) {
    if (!pid || !byPid.has(pid)) continue;
    let ticks = 0;
    const stack = [byPid.get(pid)!];
    while (stack.length) {
      const s = stack.pop()!;
      ticks += s.ticks;
      stack.push(...(children.get(s.pid) ?? []));
    }
    out[name] = (ticks * 1000) / TICKS_PER_SECOND;
  }
  return out;
}

/** Per-tree CPU milliseconds between two readings, divided by a count (per file, per request). */
export function cpuMsPer(before: Record<string, number>, after: Record<string, number>, count: number): Record<string, number> {
  const out: Record<string, number> = {};
  for (const name of Object.keys(after)) out[name] = ((after[name] ?? 0) - (before[name] ?? 0)) / count;
  return out;
}

export function formatCpuPer(per: Record<string, number>): string {
  const total = Object.values(per).reduce((s, v) => s + v, 0);
  return `${Object.entries(per)
    .map(([name, ms]) => `${name} ${ms.toFixed(1)}`)
    .join(", ")} = ${total.toFixed(1)} ms`;
}

export function pidFromFile(file: string): number | undefined {
  try {
    const pid = Number(readFileSync(file, "utf8").split("\n")[0]);
    return Number.isInteger(pid) && pid > 0 ? pid : undefined;
  } catch {
    return undefined;
  }
}
