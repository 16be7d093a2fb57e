import { defineConfig } from "tsup";

// Entries: the stable API (index), the solver internals (engine), the Node-only worker pool
// (node) and the worker itself, resolved next to the running module (worker.js beside the ESM
// build, worker.cjs beside the CJS build). Splitting keeps one copy of each class shared by
// the entries of a format (CJS too), so `instanceof OnsetError` holds across them. `shims`
// gives the CJS build its import.meta.url. No source maps: they tripled the tarball.
//
// `errors` is not a public door: the bundler files each module into the chunk of the entries
// that reach it, and the argument checks with the typed error are reached by every entry, as
// is the whole engine. An entry of their own gives them a chunk of their own, so that a
// function that only checks its arguments does not pull the engine's chunk (and fft.js, which
// it imports) into a user's bundle: 39 kB for one function otherwise.
export default defineConfig({
  entry: { index: "src/index.ts", engine: "src/engine.ts", node: "src/node.ts", worker: "src/worker.ts", errors: "src/circuit/arguments.ts" },
  format: ["esm", "cjs"],
  dts: { entry: { index: "src/index.ts", engine: "src/engine.ts", node: "src/node.ts" }, compilerOptions: { composite: false } },
  splitting: true,
  sourcemap: false,
  clean: true,
  shims: true,
  target: "node20",
});
