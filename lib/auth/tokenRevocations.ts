import type { Redis } from "ioredis";
import { redis } from "@/lib/redis";
import { processSlot } from "@/lib/processSingleton";

/**
 * Tells every app process at once that an API token was revoked, over Redis pub/sub, so the
 * per-process token cache (lib/auth/actor.ts) never lets a revoked token through. Each process
 * caches tokens only while its subscription is live; when the subscription drops, listeners are
 * told to forget everything ("*"), and caching stops until it is back.
 */
const CHANNEL = "bandkeep:api-token-revoked";
export const FORGET_ALL = "*";

type Feed = { subscriber: Redis; live: boolean; epoch: number; listeners: Set<(tokenHash: string) => void> };
const feedSlot = processSlot<Feed>("bandkeepRevocationFeed");

function feed(): Feed {
  const existing = feedSlot.get();
  if (existing) return existing;
  const subscriber = redis().duplicate({ maxRetriesPerRequest: null, commandTimeout: undefined });
  const state: Feed = { subscriber, live: false, epoch: 0, listeners: new Set() };
  const tell = (tokenHash: string) => {
    state.epoch += 1;
    for (const listener of state.listeners) listener(tokenHash);
  };
  const subscribe = () =>
    subscriber.subscribe(CHANNEL).then(
      () => {
        state.live = true;
      },
      () => {
        state.live = false;
      },
    );
  subscriber.on("ready", () => void subscribe());
  subscriber.on("close", () => {
    if (state.live) tell(FORGET_ALL);
    state.live = false;
  });
  subscriber.on("error", () => {
    // A Redis that is down shows in the health checks; tokens are simply not cached meanwhile.
  });
  subscriber.on("message", (_channel: string, tokenHash: string) => tell(tokenHash));
  feedSlot.set(state);
  return state;
}

/** Registers a listener for revoked token hashes (or FORGET_ALL). */
export function onTokenRevoked(listener: (tokenHash: string) => void): void {
  feed().listeners.add(listener);
}

/**
 * A counter that moves with every revocation heard, or null while the subscription is not
 * live. Cache a lookup only when it is not null and did not move while the lookup ran.
 */
export function revocationEpoch(): number | null {
  const state = feed();
  return state.live ? state.epoch : null;
}

/** Announces a revoked token to every app process (this one included). */
export async function announceTokenRevoked(tokenHash: string): Promise<void> {
  await redis().publish(CHANNEL, tokenHash);
}
