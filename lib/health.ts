import { sequelize } from "./db";
import { mailer } from "./mail";
import { redis } from "./redis";
import { storageReachable } from "./storage";

export type ServiceName = "database" | "redis" | "storage" | "mail";
export type ServiceHealth = { status: "up" | "down"; latencyMs: number; error?: string };

function withTimeout<T>(promise: Promise<T>, ms: number): Promise<T> {
  return Promise.race([
    promise,
    new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms)),
  ]);
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

// Probes run at most once per HEALTH_CACHE_MS (default 2 s) per process; callers in that
// window share the answer (and its checkedAt time), so a busy load balancer or a burst
// of checks does not open a mail session each time.
const HEALTH_CACHE_MS = Number.isFinite(Number(process.env.HEALTH_CACHE_MS)) ? Number(process.env.HEALTH_CACHE_MS) : 2000;
let lastCheck: { at: number; result: Promise<ServiceReport> } | null = null;

export type ServiceReport = { services: Record<ServiceName, ServiceHealth>; checkedAt: string };

export function checkServicesCached(): Promise<ServiceReport> {
  const now = Date.now();
  if (!lastCheck || now - lastCheck.at >= HEALTH_CACHE_MS) {
    lastCheck = { at: now, result: checkServices().then((services) => ({ services, checkedAt: new Date(now).toISOString() })) };
  }
  return lastCheck.result;
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
