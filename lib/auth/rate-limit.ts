import { redis } from "@/lib/redis";

const WINDOW_SECONDS = 15 * 60;
const limitFromEnv = (name: string, fallback: number) => {
  const n = Number(process.env[name]);
  return Number.isInteger(n) && n > 0 ? n : fallback;
};
const MAX_PER_ACCOUNT = limitFromEnv("SIGNIN_MAX_PER_ACCOUNT", 10);
const MAX_PER_ADDRESS = limitFromEnv("SIGNIN_MAX_PER_ADDRESS", 100);

/**
 * Counts a sign-in attempt against both the account and the client address in a
 * fixed 15-minute window. Returns false once either budget is spent.
 */
export async function consumeSignInAttempt(email: string, ip: string): Promise<boolean> {
  const keys = [`signin:acct:${email}`, `signin:ip:${ip}`];
  const counts = await redis()
    .multi()
    .incr(keys[0]).expire(keys[0], WINDOW_SECONDS, "NX")
    .incr(keys[1]).expire(keys[1], WINDOW_SECONDS, "NX")
    .exec();
  const perAccount = Number(counts?.[0]?.[1] ?? 0);
  const perAddress = Number(counts?.[2]?.[1] ?? 0);
  return perAccount <= MAX_PER_ACCOUNT && perAddress <= MAX_PER_ADDRESS;
}

export async function clearSignInAttempts(email: string): Promise<void> {
  await redis().del(`signin:acct:${email}`);
}
