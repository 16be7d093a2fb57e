import { defineConfig } from "tsup";

// The worker is its own entry, resolved next to the running module (worker.js beside the ESM
// build, worker.cjs beside the CJS build); `shims` gives the CJS build its import.meta.url.
export default defineConfig({
  entry: { index: "src/index.ts", worker: "src/worker.ts" },
  format: ["esm", "cjs"],
  dts: { entry: "src/index.ts", compilerOptions: { composite: false } },
  sourcemap: true,
  clean: true,
  shims: true,
  target: "node20",
});
