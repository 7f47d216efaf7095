import { randomBytes } from "node:crypto";
import { sha256Hex } from "@/lib/hash";
import { redis } from "@/lib/redis";

// Sign-in limits, keyed on what the deployment can trust: the client address that
// scripts/serve.mjs computed from the socket (X-Forwarded-For only from TRUSTED_PROXIES).
//
// - per address: SIGNIN_MAX_PER_ADDRESS failures in a 15-minute window, then that address
//   is refused until the window ends (one guesser cannot try many accounts);
// - per account + address: after SIGNIN_FREE_ATTEMPTS failures each further attempt must
//   wait 1 s, 2 s, 4 s … (at most 15 minutes); other addresses are not slowed;
// - per account: SIGNIN_MAX_PER_ACCOUNT failures from all addresses together lock the account
//   for sign-ins from addresses it has never signed in from; its owner is mailed a link that
//   lifts the lock. The owner's known addresses keep working (with their own delay only).
export const WINDOW_SECONDS = 15 * 60;
const KNOWN_ADDRESS_SECONDS = 90 * 24 * 60 * 60;
export const UNLOCK_LINK_SECONDS = 60 * 60;

const limitFromEnv = (name: string, fallback: number) => {
  const n = Number(process.env[name]);
  return Number.isInteger(n) && n > 0 ? n : fallback;
};
export const signInLimits = () => ({
  perAddress: limitFromEnv("SIGNIN_MAX_PER_ADDRESS", 100),
  perAccount: limitFromEnv("SIGNIN_MAX_PER_ACCOUNT", 50),
  freeAttempts: limitFromEnv("SIGNIN_FREE_ATTEMPTS", 3),
});

const key = {
  address: (address: string) => `signin:fail:addr:${address}`,
  pair: (email: string, address: string) => `signin:fail:pair:${email}|${address}`,
  pairNext: (email: string, address: string) => `signin:next:pair:${email}|${address}`,
  account: (email: string) => `signin:fail:acct:${email}`,
  lock: (email: string) => `signin:lock:${email}`,
  known: (email: string, address: string) => `signin:known:${email}|${address}`,
  unlock: (tokenHash: string) => `signin:unlock:${tokenHash}`,
};

/** Seconds to wait after the n-th failure of one account from one address. */
export function delayAfterFailures(failures: number, freeAttempts: number): number {
  if (failures < freeAttempts) return 0;
  return Math.min(2 ** (failures - freeAttempts), WINDOW_SECONDS);
}

export type SignInGate = { allowed: true } | { allowed: false; code: "slowed" | "locked"; retryAfterSeconds: number };

/** Asked before the password is checked; a refused attempt costs nothing and counts nothing. */
export async function signInGate(email: string, address: string): Promise<SignInGate> {
  const limits = signInLimits();
  const [perAddress, nextAt, locked, known] = await redis().mget(
    key.address(address),
    key.pairNext(email, address),
    key.lock(email),
    key.known(email, address),
  );
  if (Number(perAddress ?? 0) >= limits.perAddress) {
    const ttl = await redis().ttl(key.address(address));
    return { allowed: false, code: "slowed", retryAfterSeconds: Math.max(ttl, 1) };
  }
  const waitMs = Number(nextAt ?? 0) - Date.now();
  if (waitMs > 0) return { allowed: false, code: "slowed", retryAfterSeconds: Math.ceil(waitMs / 1000) };
  if (locked && !known) {
    const ttl = await redis().ttl(key.lock(email));
    return { allowed: false, code: "locked", retryAfterSeconds: Math.max(ttl, 1) };
  }
  return { allowed: true };
}

export type FailureCount = {
  /** failures from this address in the window, this one included */
  address: number;
  /** failures of this account from this address */
  pair: number;
  /** failures of this account from every address */
  account: number;
  /** this failure locked the account (the caller mails the owner) */
  lockedNow: boolean;
};

export async function recordFailedSignIn(email: string, address: string): Promise<FailureCount> {
  const limits = signInLimits();
  const result = await redis()
    .multi()
    .incr(key.address(address))
    .expire(key.address(address), WINDOW_SECONDS, "NX")
    .incr(key.pair(email, address))
    .expire(key.pair(email, address), WINDOW_SECONDS, "NX")
    .incr(key.account(email))
    .expire(key.account(email), WINDOW_SECONDS, "NX")
    .exec();
  const count = (i: number) => Number(result?.[i]?.[1] ?? 0);
  const failures = { address: count(0), pair: count(2), account: count(4) };
  const delay = delayAfterFailures(failures.pair, limits.freeAttempts);
  if (delay > 0) await redis().set(key.pairNext(email, address), String(Date.now() + delay * 1000), "EX", WINDOW_SECONDS);
  let lockedNow = false;
  if (failures.account >= limits.perAccount) {
    lockedNow = (await redis().set(key.lock(email), "1", "EX", WINDOW_SECONDS, "NX")) === "OK";
  }
  return { ...failures, lockedNow };
}

/** After a right password: this address is known for the account and its delay is gone. */
export async function recordSuccessfulSignIn(email: string, address: string): Promise<void> {
  await redis()
    .multi()
    .del(key.pair(email, address), key.pairNext(email, address))
    .set(key.known(email, address), "1", "EX", KNOWN_ADDRESS_SECONDS)
    .exec();
}

/** A one-time token that lifts the account's lock; only its hash is kept. */
export async function issueUnlockToken(email: string): Promise<string> {
  const token = randomBytes(24).toString("base64url");
  await redis().set(key.unlock(sha256Hex(token)), email, "EX", UNLOCK_LINK_SECONDS);
  return token;
}

/** Lifts the lock and the account's failure count; answers the account's e-mail, or null for an unknown or used token. */
export async function redeemUnlockToken(token: string): Promise<string | null> {
  const email = await redis().getdel(key.unlock(sha256Hex(token)));
  if (!email) return null;
  await redis().del(key.lock(email), key.account(email));
  return email;
}
