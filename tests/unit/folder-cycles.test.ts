import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import ts from "typescript";
import { describe, expect, it } from "vitest";

// Folders must not import each other in a circle (common practice: an acyclic dependency graph
// between modules; cf. the Acyclic Dependencies Principle, R. C. Martin, "Agile Software
// Development", 2002). Imports are resolved with TypeScript's own module resolution and the
// project's tsconfig (paths "@/*"), type-only imports included.

const ROOT = path.resolve(__dirname, "../..");
// app/ and components/ are left out: client components import their server actions from app/,
// which is how the framework wires a form to its action.
const TOP = ["lib", "models", "workers"];

/**
 * The unit a file belongs to: lib/<sub> for lib's subfolders, the file itself for lib's top-level
 * modules (lib/db.ts, lib/queue.ts: each its own service client or helper), else the top folder.
 */
function folderOf(file: string): string {
  const parts = path.relative(ROOT, file).split(path.sep);
  if (parts[0] === "lib") return parts.length > 2 ? `lib/${parts[1]}` : parts.join("/");
  return parts[0]!;
}

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const full = path.join(dir, e.name);
    if (e.isDirectory()) return sourceFiles(full);
    return /\.tsx?$/.test(e.name) && !e.name.endsWith(".d.ts") ? [full] : [];
  });
}

function folderGraph(): Map<string, Map<string, string>> {
  const config = ts.getParsedCommandLineOfConfigFile(
    path.join(ROOT, "tsconfig.json"),
    {},
    { ...ts.sys, onUnRecoverableConfigFileDiagnostic: () => {} },
  )!;
  const host = ts.createCompilerHost(config.options);
  const graph = new Map<string, Map<string, string>>();
  for (const file of TOP.flatMap((t) => sourceFiles(path.join(ROOT, t)))) {
    const from = folderOf(file);
    const info = ts.preProcessFile(readFileSync(file, "utf8"), true, true);
    for (const ref of info.importedFiles) {
      const resolved = ts.resolveModuleName(ref.fileName, file, config.options, host).resolvedModule;
      if (!resolved || resolved.isExternalLibraryImport || !resolved.resolvedFileName.startsWith(ROOT)) continue;
      const to = folderOf(resolved.resolvedFileName);
      if (to === from) continue;
      const edges = graph.get(from) ?? new Map<string, string>();
      if (!edges.has(to)) edges.set(to, `${path.relative(ROOT, file)} → ${path.relative(ROOT, resolved.resolvedFileName)}`);
      graph.set(from, edges);
    }
  }
  return graph;
}

/** Strongly connected components with more than one folder (Tarjan, SIAM J. Comput. 1972, 1, 146). */
function cycles(graph: Map<string, Map<string, string>>): string[][] {
  let index = 0;
  const stack: string[] = [];
  const on = new Set<string>();
  const idx = new Map<string, number>();
  const low = new Map<string, number>();
  const out: string[][] = [];
  const visit = (v: string) => {
    idx.set(v, index);
    low.set(v, index++);
    stack.push(v);
    on.add(v);
    for (const w of graph.get(v)?.keys() ?? []) {
      if (!idx.has(w)) {
        visit(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (on.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
    }
    if (low.get(v) === idx.get(v)) {
      const component: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        on.delete(w);
        component.push(w);
      } while (w !== v);
      if (component.length > 1) out.push(component.sort());
    }
  };
  for (const v of graph.keys()) if (!idx.has(v)) visit(v);
  return out;
}

describe("imports between folders", () => {
  it("finds a cycle when there is one (the check itself)", () => {
    const g = new Map([
      ["a", new Map([["b", "a → b"]])],
      ["b", new Map([["c", "b → c"]])],
      ["c", new Map([["a", "c → a"]])],
      ["d", new Map([["a", "d → a"]])],
    ]);
    expect(cycles(g)).toEqual([["a", "b", "c"]]);
  });

  it("run one way only: no folder imports, through others, a folder that imports it", () => {
    const graph = folderGraph();
    const found = cycles(graph).map((component) => {
      const inside = new Set(component);
      const arrows = component.flatMap((from) =>
        [...(graph.get(from) ?? [])].filter(([to]) => inside.has(to)).map(([, example]) => `  ${example}`),
      );
      return `${component.join(" ⇄ ")}\n${arrows.join("\n")}`;
    });
    expect(found, found.join("\n\n")).toEqual([]);
  });
});
