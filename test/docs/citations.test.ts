import { readdirSync, readFileSync, statSync } from "node:fs";
import { join, relative } from "node:path";
import { describe, expect, test } from "vitest";

const root = join(import.meta.dirname, "..", "..");

/** Every text file a reader of the project meets: sources, tests, benchmarks, docs, examples. */
function projectFiles(): string[] {
  const out: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      if (name === "node_modules" || name === "dist" || name.startsWith(".")) continue;
      const path = join(dir, name);
      if (statSync(path).isDirectory()) walk(path);
      else if (/\.(ts|mjs|md|onset)$/.test(name)) out.push(path);
    }
  };
  for (const dir of ["packages", "test", "bench", "docs", "examples"]) walk(join(root, dir));
  return [...out, join(root, "README.md"), join(root, "DEVELOPERS.md")];
}

/** The section numbers docs/references.md defines: `## 2. …` and `### 2.3 …`. */
function referenceSections(): Set<string> {
  const text = readFileSync(join(root, "docs", "references.md"), "utf8");
  return new Set([...text.matchAll(/^#{2,3} (\d+(?:\.\d+)?)\.? /gm)].map((m) => m[1]!));
}

describe("every citation resolves inside the repository", () => {
  const files = projectFiles().map((path) => ({ name: relative(root, path), text: readFileSync(path, "utf8") }));

  test("no file points at material outside the repository", () => {
    const outside = files.flatMap(({ name, text }) =>
      [...text.matchAll(/\.\.\/shared\/|\/work\/|\bshared\/[\w-]+\.md|\breferences §/g)].map((m) => `${name}: ${m[0]}`),
    );
    expect(outside).toEqual([]);
  });

  test("each docs/references.md §N cited names a section that exists", () => {
    const sections = referenceSections();
    expect(sections.has("2.3")).toBe(true);
    const cited = files.flatMap(({ name, text }) => [...text.matchAll(/docs\/references\.md §(\d+(?:\.\d+)?)(?:[–-](\d+(?:\.\d+)?))?/g)].flatMap((m) => [m[1]!, ...(m[2] ? [m[2]] : [])].map((s) => ({ name, s }))));
    expect(cited.length).toBeGreaterThan(30);
    expect(cited.filter(({ s }) => !sections.has(s))).toEqual([]);
  });
});
