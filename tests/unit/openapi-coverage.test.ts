import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { describe, expect, it } from "vitest";
import { openApiDocument } from "@/lib/http/openapi";

// Every route handler under app/api/v1 is described in the served OpenAPI document,
// with each HTTP method it exports, so the description cannot fall behind the code.
function routes(dir: string, root: string): { path: string; methods: string[] }[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name);
    if (statSync(full).isDirectory()) return routes(full, root);
    if (name !== "route.ts") return [];
    const path =
      "/api/v1/" +
      relative(root, dir)
        .replace(/\\/g, "/")
        .replace(/\[([^\]]+)\]/g, "{$1}");
    const source = readFileSync(full, "utf8");
    const methods = ["GET", "POST", "PUT", "PATCH", "DELETE"].filter((m) =>
      new RegExp(`export (const|async function) ${m}\\b`).test(source),
    );
    return [{ path: path.replace(/\/$/, ""), methods }];
  });
}

describe("OpenAPI document", () => {
  const doc = openApiDocument();
  const root = join(process.cwd(), "app", "api", "v1");

  it("describes every /api/v1 route handler and each of its methods", () => {
    const found = routes(root, root);
    expect(found.length).toBeGreaterThan(10);
    for (const route of found) {
      const item = (doc.paths as Record<string, Record<string, unknown>>)[route.path];
      expect(item, route.path).toBeDefined();
      for (const method of route.methods) expect(item[method.toLowerCase()], `${method} ${route.path}`).toBeDefined();
    }
  });

  it("has unique operation ids", () => {
    const ids = Object.values(doc.paths as Record<string, Record<string, { operationId?: string }>>).flatMap((item) =>
      Object.values(item).map((op) => op.operationId),
    );
    expect(new Set(ids).size).toBe(ids.length);
  });
});
