import { describe, expect, it } from "vitest";
import { url } from "../helpers/app";

// Sources: HTTP status codes as RFC 9110 defines them (200, 201, 304, 400, 401, 403, 404, 409, 413, 415, 422, 503);
// every other number checked here is a count or value this test itself created (known truth of its fixtures).

describe("GET /api/health", () => {
  it("reports every service up with 200 while the test stack runs", async () => {
    const response = await fetch(url("/api/health"));
    const body = (await response.json()) as { status: string; services: Record<string, { status: string }> };
    expect(response.status).toBe(200);
    expect(body.status).toBe("up");
    expect(Object.keys(body.services).sort()).toEqual(["database", "mail", "redis", "storage"]);
    for (const service of Object.values(body.services)) expect(service.status).toBe("up");
  });
});
