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

export async function checkServices(): Promise<Record<ServiceName, ServiceHealth>> {
  const [database, redisHealth, storage, mail] = await Promise.all([
    probe(() => sequelize().query("SELECT 1")),
    probe(() => redis().ping()),
    probe(() => storageReachable()),
    probe(() => mailer().verify()),
  ]);
  return { database, redis: redisHealth, storage, mail };
}
