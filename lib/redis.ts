import { Redis } from "ioredis";
import { config } from "./config";
import { processSingleton } from "@/lib/processSingleton";

/** Shared connection for short commands in requests (sign-in limits, caches). */
export function redis(): Redis {
  return processSingleton("bandkeepRedis", () => {
    const client = new Redis(config().REDIS_URL, {
      // Commands sent while the first connection is still opening wait for it; a Redis
      // that is down fails each command within two seconds instead of hanging a request.
      maxRetriesPerRequest: 1,
      enableOfflineQueue: true,
      connectTimeout: 2000,
      commandTimeout: 2000,
    });
    client.on("error", () => {
      // Reported through health checks and the failing call; avoid an unhandled event.
    });
    return client;
  });
}
