import { Redis } from "ioredis";
import { config } from "./config";

const globalForRedis = globalThis as unknown as { bandkeepRedis?: Redis };

/** Shared connection for short commands in requests. Fails fast when Redis is down. */
export function redis(): Redis {
  if (!globalForRedis.bandkeepRedis) {
    globalForRedis.bandkeepRedis = new Redis(config().REDIS_URL, {
      maxRetriesPerRequest: 1,
      enableOfflineQueue: false,
      connectTimeout: 2000,
      lazyConnect: false,
    });
    globalForRedis.bandkeepRedis.on("error", () => {
      // Reported through health checks and the failing call; avoid an unhandled event.
    });
  }
  return globalForRedis.bandkeepRedis;
}
