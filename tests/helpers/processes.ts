// Child processes a test owns: its own worker on its own queue, its own redis-server.
import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { Redis } from "ioredis";

const ROOT = path.resolve(import.meta.dirname, "../..");

export type Owned = { child: ChildProcess; output: () => string; stop: (signal?: NodeJS.Signals) => Promise<number | null> };

function own(child: ChildProcess): Owned {
  let out = "";
  child.stdout?.on("data", (d: Buffer) => {
    out = (out + d.toString()).slice(-20_000);
  });
  child.stderr?.on("data", (d: Buffer) => {
    out = (out + d.toString()).slice(-20_000);
  });
  const exited = new Promise<number | null>((resolve) => child.once("exit", (code) => resolve(code)));
  return {
    child,
    output: () => out,
    async stop(signal = "SIGTERM") {
      if (child.exitCode !== null || child.signalCode !== null) return child.exitCode;
      child.kill(signal);
      return exited;
    },
  };
}

/** Starts `node --import tsx workers/index.ts` with the test environment plus `env` (e.g. its own BANDKEEP_QUEUE). */
export function startWorker(env: Record<string, string>): Owned {
  const child = spawn(process.execPath, ["--import", "tsx", "workers/index.ts"], {
    cwd: ROOT,
    env: { ...process.env, ...env },
    stdio: ["ignore", "pipe", "pipe"],
  });
  return own(child);
}

/** Waits until the worker printed its ready line. */
export async function workerReady(w: Owned, timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!w.output().includes("worker ready")) {
    if (w.child.exitCode !== null) throw new Error(`worker exited early: ${w.output()}`);
    if (Date.now() > deadline) throw new Error(`worker not ready: ${w.output()}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** A redis-server of the test's own, append-only, on `port`, with its data in a temporary directory. */
export function ownRedis(port: number) {
  const dir = mkdtempSync(path.join(tmpdir(), "bandkeep-redis-"));
  let server: Owned | null = null;
  const start = async () => {
    const child = spawn(
      "redis-server",
      ["--bind", "127.0.0.1", "--port", String(port), "--dir", dir, "--appendonly", "yes", "--save", ""],
      {
        stdio: ["ignore", "pipe", "pipe"],
      },
    );
    server = own(child);
    const deadline = Date.now() + 10_000;
    for (;;) {
      const probe = new Redis({ host: "127.0.0.1", port, lazyConnect: true, maxRetriesPerRequest: 0, retryStrategy: () => null });
      probe.on("error", () => {});
      try {
        await probe.connect();
        await probe.ping();
        probe.disconnect();
        return;
      } catch {
        probe.disconnect();
        if (Date.now() > deadline) throw new Error(`redis on ${port} did not start: ${server.output()}`);
        await new Promise((r) => setTimeout(r, 100));
      }
    }
  };
  return {
    url: `redis://127.0.0.1:${port}`,
    start,
    /** Stops the server the way an operator restart does (SIGTERM: the append-only file is flushed). */
    async stop() {
      await server?.stop("SIGTERM");
      server = null;
    },
    async destroy() {
      await server?.stop("SIGKILL");
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
