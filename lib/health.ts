import { sequelize } from "./db";
import { mailer } from "./mail";
import { redis } from "./redis";
import { storageReachable } from "./storage";

export type ServiceName = "database" | "redis" | "storage" | "mail";
export type ServiceHealth = { status: "up" | "down"; latencyMs: number; error?: string };

function withTimeout<T>(promise: Promise<T>, ms: number): Promise<T> {
  return Promise.race([promise, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms))]);
}

async function probe(check: () => Promise<unknown>): Promise<ServiceHealth> {
  const started = performance.now();
  try {
    await withTimeout(check(), 2000);
    return { status: "up", latencyMs: Math.round(performance.now() - started) };
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    return { status: "down", latencyMs: Math.round(performance.now() - started), error: message.split("\n")[0].slice(0, 200) };
  }
}

// Probes run at most once per HEALTH_CACHE_MS (default 2 s) per process. Callers in that
// window share the answer and its checkedAt time; once it is older, the next caller
// starts a fresh probe and, while it runs, callers get the previous answer if it is
// younger than five windows. A burst of checks thus never opens a mail session each.
const HEALTH_CACHE_MS = Number.isFinite(Number(process.env.HEALTH_CACHE_MS)) ? Number(process.env.HEALTH_CACHE_MS) : 2000;

export type ServiceReport = { services: Record<ServiceName, ServiceHealth>; checkedAt: string };

let settled: { at: number; report: ServiceReport } | null = null;
let running: Promise<ServiceReport> | null = null;

export function checkServicesCached(): Promise<ServiceReport> {
  const now = Date.now();
  if (settled && now - settled.at < HEALTH_CACHE_MS) return Promise.resolve(settled.report);
  if (!running) {
    running = checkServices()
      .then((services) => {
        const report = { services, checkedAt: new Date(now).toISOString() };
        settled = { at: now, report };
        return report;
      })
      .finally(() => {
        running = null;
      });
  }
  if (settled && now - settled.at < 5 * HEALTH_CACHE_MS) return Promise.resolve(settled.report);
  return running;
}

export async function checkServices(): Promise<Record<ServiceName, ServiceHealth>> {
  const [database, redisHealth, storage, mail] = await Promise.all([
    probe(() => sequelize().query("SELECT 1")),
    probe(() => redis().ping()),
    probe(() => storageReachable()),
    probe(() => mailer().verify()),
  ]);
  return { database, redis: redisHealth, storage, mail };
}
