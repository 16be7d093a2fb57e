import { defineConfig } from "tsup";

// Entries: the stable API (index), the solver internals (engine), the Node-only worker pool
// (node) and the worker itself, resolved next to the running module (worker.js beside the ESM
// build, worker.cjs beside the CJS build). Splitting keeps one copy of each class shared by
// the entries of a format (CJS too), so `instanceof OnsetError` holds across them. `shims`
// gives the CJS build its import.meta.url. No source maps: they tripled the tarball.
export default defineConfig({
  entry: { index: "src/index.ts", engine: "src/engine.ts", node: "src/node.ts", worker: "src/worker.ts" },
  format: ["esm", "cjs"],
  dts: { entry: { index: "src/index.ts", engine: "src/engine.ts", node: "src/node.ts" }, compilerOptions: { composite: false } },
  splitting: true,
  sourcemap: false,
  clean: true,
  shims: true,
  target: "node20",
});
