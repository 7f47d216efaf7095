import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import ts from "typescript";
import { describe, expect, it } from "vitest";

// Every export of a "use server" module is an HTTP endpoint (React's "use server" directive:
// the bundler gives each export an action id any client may call). So such a module exports
// only actions, each built by protectedAction() (session first, then zod), except the
// listed token-guarded ones, whose one-time mailed token is the credential.
const TOKEN_GUARDED: Record<string, string> = {
  "app/invite/actions.ts#acceptInvitationAction": "the invitation token is the credential",
  "app/signin/unlock/actions.ts#unlockAccountAction": "the unlock token mailed to the account's owner is the credential",
};

function sourceFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name);
    if (name === "node_modules" || name.startsWith(".")) return [];
    if (statSync(full).isDirectory()) return sourceFiles(full);
    return /\.(ts|tsx)$/.test(name) ? [full] : [];
  });
}

const root = process.cwd();
const useServerModules = ["app", "lib", "components"]
  .flatMap((d) => sourceFiles(join(root, d)))
  .filter((file) => {
    const source = ts.createSourceFile(file, readFileSync(file, "utf8"), ts.ScriptTarget.Latest, true);
    const first = source.statements[0];
    return first && ts.isExpressionStatement(first) && ts.isStringLiteral(first.expression) && first.expression.text === "use server";
  });

type ExportKind = "protectedAction" | "function" | "other";
function exportsOf(file: string): { name: string; kind: ExportKind }[] {
  const source = ts.createSourceFile(file, readFileSync(file, "utf8"), ts.ScriptTarget.Latest, true);
  const out: { name: string; kind: ExportKind }[] = [];
  for (const statement of source.statements) {
    const exported = ts.canHaveModifiers(statement) && ts.getModifiers(statement)?.some((m) => m.kind === ts.SyntaxKind.ExportKeyword);
    if (ts.isExportDeclaration(statement) || ts.isExportAssignment(statement))
      out.push({ name: statement.getText().slice(0, 60), kind: "other" });
    if (!exported) continue;
    if (ts.isFunctionDeclaration(statement)) out.push({ name: statement.name?.text ?? "default", kind: "function" });
    else if (ts.isVariableStatement(statement)) {
      for (const d of statement.declarationList.declarations) {
        const init = d.initializer;
        const isWrapped = init && ts.isCallExpression(init) && init.expression.getText() === "protectedAction";
        out.push({ name: d.name.getText(), kind: isWrapped ? "protectedAction" : "other" });
      }
    } else if (!ts.isTypeAliasDeclaration(statement) && !ts.isInterfaceDeclaration(statement))
      out.push({ name: statement.getText().slice(0, 60), kind: "other" });
  }
  return out;
}

describe('"use server" modules', () => {
  it("are found (the scan is not empty)", () => {
    expect(useServerModules.length).toBeGreaterThanOrEqual(8);
  });

  it("export only protectedAction() actions or listed token-guarded actions", () => {
    const offenders: string[] = [];
    for (const file of useServerModules) {
      for (const { name, kind } of exportsOf(file)) {
        const id = `${relative(root, file).replace(/\\/g, "/")}#${name}`;
        if (kind === "protectedAction") continue;
        if (kind === "function" && id in TOKEN_GUARDED) continue;
        offenders.push(`${id} (${kind})`);
      }
    }
    expect(offenders).toEqual([]);
  });
});
