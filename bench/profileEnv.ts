import { execFileSync } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

/**
 * Loads the addresses of a profile from scripts/env.sh (BANDKEEP_PROFILE picks dev or test;
 * variables the caller set win) and returns the app's URL (APP_URL, else http://127.0.0.1:$PORT).
 */
export function loadProfileEnv(): string {
  const envText = execFileSync(
    "bash",
    ["-c", `export BANDKEEP_PROFILE=${process.env.BANDKEEP_PROFILE ?? "dev"}; source scripts/env.sh >/dev/null; env -0`],
    {
      cwd: ROOT,
      encoding: "utf8",
      env: process.env,
    },
  );
  for (const pair of envText.split("\0")) {
    const i = pair.indexOf("=");
    if (i > 0 && process.env[pair.slice(0, i)] === undefined) process.env[pair.slice(0, i)] = pair.slice(i + 1);
  }
  return process.env.APP_URL ?? `http://127.0.0.1:${process.env.PORT}`;
}
