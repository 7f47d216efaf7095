import { describe, expect, it } from "vitest";
import { url } from "../helpers/app";

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
