import { readFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import ts from "typescript";
import { describe, expect, test } from "vitest";

// Every public item carries TSDoc, and the published exports are the development exports
// without the workspace's source condition.

const repo = resolve(dirname(fileURLToPath(import.meta.url)), "../..");
const ENTRIES: Record<string, string> = {
  "@onset/core": "packages/core/src/index.ts",
  "@onset/core/engine": "packages/core/src/engine.ts",
  "@onset/core/node": "packages/core/src/node.ts",
  "@onset/netlist-parser": "packages/netlist-parser/src/index.ts",
  "@onset/netlist-parser/node": "packages/netlist-parser/src/node.ts",
  "@onset/cli": "packages/cli/src/index.ts",
};

function program(): ts.Program {
  const config = ts.getParsedCommandLineOfConfigFile(join(repo, "tsconfig.json"), {}, { ...ts.sys, onUnRecoverableConfigFileDiagnostic: () => {} })!;
  return ts.createProgram(
    Object.values(ENTRIES).map((f) => join(repo, f)),
    config.options,
  );
}

/** True when the declaration has a `/** … *\/` comment of its own (for a variable: on its statement). */
function documented(declaration: ts.Declaration): boolean {
  const node = ts.isVariableDeclaration(declaration) ? declaration.parent.parent : declaration;
  const text = node.getSourceFile().getFullText();
  const ranges = ts.getLeadingCommentRanges(text, node.getFullStart()) ?? [];
  return ranges.some((r) => text.slice(r.pos, r.pos + 3) === "/**" && text.slice(r.pos + 3, r.end - 2).trim().length > 0);
}

describe("the public API", () => {
  test("every export of every entry has a TSDoc comment", () => {
    const p = program();
    const checker = p.getTypeChecker();
    const missing: string[] = [];
    for (const [entry, file] of Object.entries(ENTRIES)) {
      const source = p.getSourceFile(join(repo, file))!;
      const module = checker.getSymbolAtLocation(source)!;
      for (const exported of checker.getExportsOfModule(module)) {
        const symbol = exported.flags & ts.SymbolFlags.Alias ? checker.getAliasedSymbol(exported) : exported;
        const declarations = symbol.declarations ?? [];
        // Declared outside this project (a re-exported type of a dependency): its own package documents it.
        if (declarations.every((d) => d.getSourceFile().fileName.includes("node_modules"))) continue;
        if (!declarations.some(documented)) missing.push(`${entry}: ${exported.name}`);
      }
    }
    expect(missing.join("\n")).toBe("");
  });

  test("each entry file documents itself", () => {
    for (const file of Object.values(ENTRIES)) expect(readFileSync(join(repo, file), "utf8"), file).toMatch(/^\/\*\*[\s\S]*?@packageDocumentation/);
  });

  test("the published exports are the workspace's without the source condition", () => {
    for (const p of ["core", "netlist-parser", "cli"]) {
      const manifest = JSON.parse(readFileSync(join(repo, "packages", p, "package.json"), "utf8"));
      const strip = (exports: Record<string, unknown>) =>
        Object.fromEntries(Object.entries(exports).map(([k, v]) => [k, typeof v === "object" && v !== null ? Object.fromEntries(Object.entries(v).filter(([c]) => c !== "onset-source")) : v]));
      expect(manifest.publishConfig.exports, p).toEqual(strip(manifest.exports));
      expect([manifest.license, manifest.engines.node, manifest.files]).toEqual(["MIT", ">=20", ["dist", "README.md", "LICENSE"]]);
    }
  });
});
