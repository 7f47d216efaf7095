import { config } from "@/lib/config";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/** The origins a browser page of this app is served from: APP_URL's (and NEXTAUTH_URL's, when set). */
function appOrigins(): Set<string> {
  const origins = new Set<string>([new URL(config().APP_URL).origin]);
  if (process.env.NEXTAUTH_URL) origins.add(new URL(process.env.NEXTAUTH_URL).origin);
  return origins;
}

/**
 * A write authenticated by the session cookie must come from one of the app's own pages:
 * browsers send Origin with every cross-origin and every POST request (Fetch standard,
 * "origin header"), so a missing or foreign Origin is refused. A page on another port of
 * the same host is another origin (RFC 6454), and is refused too. Bearer-token calls carry
 * no ambient credential and are not checked.
 */
export function crossSiteWrite(request: Request): string | null {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return null;
  const origin = request.headers.get("origin");
  if (!origin) return "missing Origin header";
  if (origin === "null") return "Origin null is not this site";
  if (appOrigins().has(origin)) return null;
  // The host the browser addressed (as Next.js checks server actions): a copy reached as
  // localhost instead of 127.0.0.1 still works; a page on another port is still refused.
  let host: string;
  try {
    host = new URL(origin).host;
  } catch {
    return "malformed Origin header";
  }
  if (host !== request.headers.get("host")) return `Origin ${origin.slice(0, 100)} is not this site`;
  return null;
}
