/** Polls `check` until it returns a value other than undefined, or throws after `timeoutMs` with `what` in the message. */
export async function waitFor<T>(what: string, check: () => Promise<T | undefined>, timeoutMs = 60_000, everyMs = 250): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  let last: unknown;
  for (;;) {
    try {
      const v = await check();
      if (v !== undefined) return v;
    } catch (error) {
      last = error;
    }
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}${last ? ` (last error: ${String(last)})` : ""}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}
