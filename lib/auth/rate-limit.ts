import { redis } from "@/lib/redis";

const WINDOW_SECONDS = 15 * 60;
const limitFromEnv = (name: string, fallback: number) => {
  const n = Number(process.env[name]);
  return Number.isInteger(n) && n > 0 ? n : fallback;
};
const MAX_FAILURES_PER_ACCOUNT = limitFromEnv("SIGNIN_MAX_PER_ACCOUNT", 10);
const MAX_FAILURES_PER_ADDRESS = limitFromEnv("SIGNIN_MAX_PER_ADDRESS", 100);

const accountKey = (email: string) => `signin:fail:acct:${email}`;
const addressKey = (ip: string) => `signin:fail:ip:${ip}`;

/**
 * Failed sign-ins are counted per account and per client address in a fixed
 * 15-minute window. Once either budget is spent, even the right password is refused
 * until the window ends, so guessing cannot go on at speed.
 */
export async function signInAllowed(email: string, ip: string): Promise<boolean> {
  const [perAccount, perAddress] = await redis().mget(accountKey(email), addressKey(ip));
  return Number(perAccount ?? 0) < MAX_FAILURES_PER_ACCOUNT && Number(perAddress ?? 0) < MAX_FAILURES_PER_ADDRESS;
}

export async function recordFailedSignIn(email: string, ip: string): Promise<void> {
  await redis()
    .multi()
    .incr(accountKey(email)).expire(accountKey(email), WINDOW_SECONDS, "NX")
    .incr(addressKey(ip)).expire(addressKey(ip), WINDOW_SECONDS, "NX")
    .exec();
}

export async function clearSignInFailures(email: string): Promise<void> {
  await redis().del(accountKey(email));
}
