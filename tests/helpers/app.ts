// Where the running test stack is (scripts/test.sh starts it and exports these).
export const APP_URL = process.env.APP_URL ?? `http://127.0.0.1:${process.env.PORT ?? 3100}`;
/** Browsers send their page's origin with every write; cookie-authenticated writes need it (lib/http/sameOrigin.ts). */
export const APP_ORIGIN = new URL(APP_URL).origin;
export const DEMO_PASSWORD = "bandkeep-demo";

export const DEMO = {
  lead: "lead@aurora-lab.test",
  spectroscopist: "spectro@aurora-lab.test",
  steward: "steward@aurora-lab.test",
  collaborator: "guest@partner-uni.test",
  otherGroup: "spectro@borealis-lab.test",
} as const;

export function url(path: string): string {
  return `${APP_URL}${path}`;
}
