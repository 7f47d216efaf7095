import { spawn } from "node:child_process";
import { afterAll, describe, expect, it } from "vitest";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

// A second app process whose Redis and mail addresses point at closed ports: the
// health check must say which services are down and answer 503.
describe("health when services are down", () => {
  const port = 3190;
  const child = spawn(process.execPath, ["--import", "tsx", "tests/helpers/health-probe.ts"], {
    env: { ...process.env, REDIS_URL: "redis://127.0.0.1:1", SMTP_URL: "smtp://127.0.0.1:1", HEALTH_PROBE_PORT: String(port) },
    stdio: ["ignore", "pipe", "pipe"],
  });
  afterAll(() => {
    child.kill("SIGTERM");
  });

  it("names redis and mail as down, database and storage as up", async () => {
    const output = await new Promise<string>((resolve, reject) => {
      let text = "";
      child.stdout.on("data", (d: Buffer) => {
        text += d.toString();
      });
      child.stderr.on("data", (d: Buffer) => {
        text += d.toString();
      });
      child.on("exit", () => resolve(text));
      setTimeout(() => reject(new Error(`probe did not finish: ${text}`)), 30_000);
    });
    const result = JSON.parse(output.trim().split("\n").pop() ?? "{}") as {
      httpStatus: number;
      services: Record<string, { status: string }>;
    };
    expect(result.httpStatus).toBe(503);
    expect(result.services.redis.status).toBe("down");
    expect(result.services.mail.status).toBe("down");
    expect(result.services.database.status).toBe("up");
    expect(result.services.storage.status).toBe("up");
  });
});
