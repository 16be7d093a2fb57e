import { builtinModules } from "node:module";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import { build, type Plugin } from "esbuild";
import { describe, expect, test } from "vitest";

// The platform-neutral entries bundle for a browser: no module of theirs imports a Node
// built-in (the worker pool and the file reader live in the `/node` entries). Bundled from the
// sources here; the packed-install test does the same from the installed tarballs.

const repo = resolve(dirname(fileURLToPath(import.meta.url)), "../..");
const builtins = new Set(builtinModules.flatMap((m) => [m, `node:${m}`]));

/** Records every import of a Node built-in, and who made it, instead of failing at the first. */
function builtinImports(found: string[]): Plugin {
  return {
    name: "node-builtins",
    setup(b) {
      b.onResolve({ filter: /.*/ }, (args) => {
        if (!builtins.has(args.path) && !args.path.startsWith("node:")) return undefined;
        found.push(`${args.path} from ${args.importer.slice(repo.length + 1)}`);
        return { path: args.path, external: true };
      });
    },
  };
}

async function bundle(entry: string): Promise<{ builtins: string[] }> {
  const found: string[] = [];
  await build({
    entryPoints: [join(repo, entry)],
    bundle: true,
    platform: "browser",
    format: "esm",
    conditions: ["onset-source"],
    write: false,
    logLevel: "silent",
    plugins: [builtinImports(found)],
  });
  return { builtins: found };
}

describe("browser bundles", () => {
  test.each(["packages/core/src/index.ts", "packages/netlist-parser/src/index.ts"])("%s imports no Node built-in", async (entry) => {
    expect((await bundle(entry)).builtins).toEqual([]);
  });

  test("the Node entries do import them (the check can fail)", async () => {
    expect((await bundle("packages/core/src/node.ts")).builtins).toEqual(expect.arrayContaining(["node:os from packages/core/src/study/worker-pool.ts", "node:worker_threads from packages/core/src/study/worker-pool.ts"]));
    expect((await bundle("packages/netlist-parser/src/node.ts")).builtins.length).toBeGreaterThan(0);
  });
});
