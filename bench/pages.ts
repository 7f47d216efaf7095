/**
 * Page-speed bench: Debian's chromium (headless, playwright-core) signs in as each demo role and
 * loads that role's main pages one after another, ROUNDS times each, and prints per page the time
 * to first byte (the server's render) and to the largest contentful paint, p50 and p95; also the
 * first visit of each role after sign-in and the time from pressing "Sign in" to the Overview.
 * The floor, measured in the same run by the same browser: the app's cheapest route
 * (`/api/health`, served from a 2 s cache) and the sign-in page. Targets: server render p95 under
 * 200 ms on the demo data, first visit under 1 s, sign-in to Overview under 1 s.
 *
 * It runs against an app that is already up (APP_URL, else http://127.0.0.1:$PORT from the profile
 * in scripts/env.sh; BANDKEEP_PROFILE picks dev or test), with the demo scenario loaded.
 *
 * Usage: npm run bench:pages [-- --rounds 7]
 */
import { chromium, type Page } from "playwright-core";
import { loadProfileEnv } from "./profileEnv";

const args = process.argv.slice(2);
const roundsAt = args.indexOf("--rounds");
const ROUNDS = roundsAt >= 0 ? Number(args[roundsAt + 1]) : 7;

const APP = loadProfileEnv();

const { DEMO, DEMO_PASSWORD } = await import("@/tests/helpers/app");
const { demoIds } = await import("@/tests/helpers/demo-ids");
const { closeDb } = await import("@/lib/db");

const ids = await demoIds();
await closeDb();

const ROLES: { role: string; email: string; pages: string[] }[] = [
  {
    role: "lead",
    email: DEMO.lead,
    pages: ["/", "/spectra", `/spectra/${ids.privateSpectrum.id}`, "/samples", "/series", `/series/${ids.sharedSeries.id}`, "/review"],
  },
  { role: "spectroscopist", email: DEMO.spectroscopist, pages: ["/", "/upload", "/spectra", "/samples"] },
  { role: "steward", email: DEMO.steward, pages: ["/stewardship", "/stewardship/policies", "/stewardship/audit", "/stewardship/storage"] },
  { role: "guest", email: DEMO.collaborator, pages: ["/", "/series", `/series/${ids.sharedSeries.id}`] },
];

type Timing = { ttfb: number; lcp: number };

async function load(page: Page, pathName: string): Promise<Timing> {
  const response = await page.goto(`${APP}${pathName}`, { waitUntil: "load" });
  if (!response || response.status() !== 200) throw new Error(`${pathName}: HTTP ${response?.status()}`);
  return page.evaluate(
    () =>
      new Promise<Timing>((resolve) => {
        const nav = performance.getEntriesByType("navigation")[0] as PerformanceNavigationTiming;
        let lcp = 0;
        new PerformanceObserver((list) => {
          for (const e of list.getEntries()) lcp = e.startTime;
        }).observe({ type: "largest-contentful-paint", buffered: true });
        setTimeout(() => resolve({ ttfb: nav.responseStart - nav.startTime, lcp }), 100);
      }),
  );
}

function quantile(values: number[], q: number): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)] ?? NaN;
}

const fmt = (ms: number) => `${ms.toFixed(0).padStart(5)} ms`;
const row = (label: string, ttfb: number[], lcp: number[]) =>
  `${label.padEnd(44)} ${fmt(quantile(ttfb, 0.5))} ${fmt(quantile(ttfb, 0.95))}   ${fmt(quantile(lcp, 0.5))} ${fmt(quantile(lcp, 0.95))}`;

const browser = await chromium.launch({
  executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
  headless: true,
  args: [
    "--no-sandbox",
    "--disable-gpu",
    "--no-first-run",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
  ],
});

const lines: string[] = [];
const firstVisits: string[] = [];
const signIns: number[] = [];
let worstP95 = 0;
try {
  // The floor: the app's cheapest route and the sign-in page, in the same browser and run.
  const floorContext = await browser.newContext();
  const floorPage = await floorContext.newPage();
  const health: number[] = [];
  const signinPage: Timing[] = [];
  for (let i = 0; i < ROUNDS; i++) {
    const t0 = performance.now();
    await floorPage.request.get(`${APP}/api/health`);
    health.push(performance.now() - t0);
    signinPage.push(await load(floorPage, "/signin"));
  }
  await floorContext.close();

  for (const { role, email, pages } of ROLES) {
    const context = await browser.newContext({ viewport: { width: 1360, height: 900 } });
    const page = await context.newPage();
    await page.goto(`${APP}/signin`);
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill(DEMO_PASSWORD);
    const t0 = performance.now();
    await page.getByRole("button", { name: "Sign in" }).click();
    // the sign-in page has a heading of its own: wait for the Overview's URL first
    await page.waitForURL((u) => !u.pathname.startsWith("/signin"));
    await page.getByRole("heading", { level: 1 }).first().waitFor();
    signIns.push(performance.now() - t0);
    for (const p of pages) {
      const timings: Timing[] = [];
      for (let i = 0; i < ROUNDS; i++) timings.push(await load(page, p));
      const [first] = timings;
      firstVisits.push(`${`${role} ${p.replace(/[0-9a-f-]{36}/, "{id}")}`.padEnd(44)} ${fmt(first!.ttfb)} ${fmt(first!.lcp)}`);
      const ttfb = timings.slice(1).map((t) => t.ttfb);
      worstP95 = Math.max(worstP95, quantile(ttfb, 0.95));
      lines.push(
        row(
          `${role} ${p.replace(/[0-9a-f-]{36}/, "{id}")}`,
          ttfb,
          timings.slice(1).map((t) => t.lcp),
        ),
      );
    }
    await context.close();
  }

  console.log(`Page loads in headless chromium against ${APP}, ${ROUNDS} loads each (first load reported apart)\n`);
  console.log(
    `${"page (role path)".padEnd(44)} ${"TTFB p50".padStart(8)} ${"p95".padStart(8)}   ${"LCP p50".padStart(8)} ${"p95".padStart(8)}`,
  );
  console.log(row("floor: GET /api/health (cheapest route)", health, health));
  console.log(
    row(
      "floor: /signin (no session)",
      signinPage.map((t) => t.ttfb),
      signinPage.map((t) => t.lcp),
    ),
  );
  for (const l of lines) console.log(l);
  console.log(`\nfirst visit after sign-in (TTFB, LCP):`);
  for (const l of firstVisits) console.log(l);
  console.log(`\nsign-in to Overview heading: ${signIns.map((ms) => `${ms.toFixed(0)} ms`).join(", ")} (target < 1000 ms)`);
  console.log(
    `worst server render p95: ${worstP95.toFixed(0)} ms (target < 200 ms), ${(worstP95 / quantile(health, 0.95)).toFixed(1)}× the health floor's p95`,
  );
} finally {
  await browser.close();
}
