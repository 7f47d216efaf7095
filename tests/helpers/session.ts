import { url } from "./app";

function cookiesOf(response: Response): string[] {
  return response.headers.getSetCookie().map((c) => c.split(";")[0]);
}

export type SignInResult = { ok: boolean; cookie: string; error?: string };

/**
 * Signs in through next-auth's credentials flow over HTTP, as a browser would:
 * CSRF token first, then the credentials callback; returns the session cookie.
 */
export async function signInOverHttp(email: string, password: string, extraHeaders: Record<string, string> = {}): Promise<SignInResult> {
  const csrfResponse = await fetch(url("/api/auth/csrf"));
  const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string };
  const jar = cookiesOf(csrfResponse);
  const response = await fetch(url("/api/auth/callback/credentials"), {
    method: "POST",
    redirect: "manual",
    headers: { ...extraHeaders, "content-type": "application/x-www-form-urlencoded", cookie: jar.join("; ") },
    body: new URLSearchParams({ csrfToken, email, password, json: "true" }),
  });
  const all = [...jar, ...cookiesOf(response)];
  const session = all.find((c) => c.startsWith("next-auth.session-token="));
  // With json=true next-auth answers with {url} in the body instead of a redirect.
  const body = response.headers.get("content-type")?.includes("json") ? ((await response.json()) as { url?: string }) : {};
  const location = response.headers.get("location") ?? body.url ?? "";
  const error = new URL(location, url("/")).searchParams.get("error") ?? undefined;
  return { ok: Boolean(session), cookie: all.join("; "), error };
}

const cache = new Map<string, string>();

/** Session cookie for an account, signed in once per test file. */
export async function sessionCookie(email: string, password: string): Promise<string> {
  const key = `${email}\n${password}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const result = await signInOverHttp(email, password);
  if (!result.ok) throw new Error(`could not sign in as ${email}: ${result.error ?? "no session cookie"}`);
  cache.set(key, result.cookie);
  return result.cookie;
}
