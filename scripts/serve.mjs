// Serves the built app with one Next.js request handler per CPU core, all on one port.
//
// `next start` runs one Node.js process, so the app uses one core however many the machine has.
// This is Next.js's documented custom-server entry (next({ dev: false }).getRequestHandler())
// run under node:cluster: the primary forks APP_PROCESSES workers (default: the machine's
// available parallelism, at most 4) that share the listening socket, restarts a worker that
// dies, and stops them all on SIGTERM/SIGINT.
//
// Usage: node scripts/serve.mjs [-H 127.0.0.1] [-p 3000]
import cluster from "node:cluster";
import { createServer } from "node:http";
import { availableParallelism } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { CLIENT_ADDRESS_HEADER, clientAddress, trustedProxies } from "./client-address.mjs";

const argv = process.argv.slice(2);
const option = (flag, fallback) => (argv.includes(flag) ? argv[argv.indexOf(flag) + 1] : fallback);
const hostname = option("-H", process.env.HOSTNAME_LOCAL || "127.0.0.1");
const port = Number(option("-p", process.env.PORT || "3000"));
const requested = Number(process.env.APP_PROCESSES);
const processes = Number.isInteger(requested) && requested > 0 ? requested : Math.min(availableParallelism(), 4);
const dir = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

// The pages a person opens first. Each is asked for once, without a session, before this process
// takes requests: the page's modules load and run up to the sign-in check (a redirect), so the
// first real visit after a start does not pay for loading them (measured by npm run bench:pages).
const WARM_PATHS = [
  "/signin",
  "/",
  "/spectra",
  "/samples",
  "/series",
  "/review",
  "/upload",
  "/stewardship",
  "/stewardship/audit",
  "/settings",
];

/** Serves WARM_PATHS once through this process's own handler on a private loopback port. */
async function warmUp(server) {
  const listener = server.listeners("request")[0];
  const probe = createServer(listener);
  await new Promise((resolve) => probe.listen(0, "127.0.0.1", resolve));
  const { port: probePort } = probe.address();
  try {
    for (const p of WARM_PATHS) {
      await fetch(`http://127.0.0.1:${probePort}${p}`, { redirect: "manual", signal: AbortSignal.timeout(20_000) })
        .then((r) => r.arrayBuffer())
        .catch(() => {});
    }
  } finally {
    probe.close();
  }
}

if (cluster.isPrimary) {
  let stopping = false;
  const fork = () => cluster.fork();
  for (let i = 0; i < processes; i++) fork();
  cluster.on("exit", (worker, code, signal) => {
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    console.error(`app process ${worker.process.pid} exited (${signal ?? code}); starting another`);
    setTimeout(fork, 1000);
  });
  let ready = 0;
  cluster.on("listening", () => {
    ready += 1;
    if (ready === processes) console.log(`Ready: http://${hostname}:${port} (${processes} app processes)`);
  });
  const stop = (signal) => {
    if (stopping) return;
    stopping = true;
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill(signal);
    setTimeout(() => process.exit(0), 10_000).unref();
  };
  process.on("SIGTERM", () => stop("SIGTERM"));
  process.on("SIGINT", () => stop("SIGTERM"));
} else {
  // A worker whose primary is gone has nobody to restart or stop it: leave with it.
  process.on("disconnect", () => process.exit(0));
  const { default: next } = await import("next");
  const app = next({ dev: false, dir, hostname, port });
  const handle = app.getRequestHandler();
  await app.prepare();
  const proxies = trustedProxies(process.env.TRUSTED_PROXIES);
  const server = createServer((req, res) => {
    // The app reads the client's address only from this header, which we always overwrite.
    req.headers[CLIENT_ADDRESS_HEADER] = clientAddress(req.socket.remoteAddress, req.headers["x-forwarded-for"], proxies);
    return handle(req, res);
  });
  // Above the usual proxy idle timeouts, as `next start` does, so kept-alive sockets are not cut mid-request.
  server.keepAliveTimeout = 65_000;
  if (process.env.APP_WARMUP !== "off") await warmUp(server);
  server.listen(port, hostname);
  const close = () => server.close(() => process.exit(0));
  process.on("SIGTERM", close);
  process.on("SIGINT", close);
}
