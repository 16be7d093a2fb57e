import { defineConfig } from "tsup";

// Sibling packages stay external so the CLI and the engine's Monte Carlo workers load one copy
// of each (the worker entry lives in @onset/core, beside its own build).
export default defineConfig({
  entry: { index: "src/index.ts", main: "src/main.ts" },
  format: ["esm", "cjs"],
  dts: { entry: "src/index.ts", compilerOptions: { composite: false } },
  sourcemap: true,
  clean: true,
  shims: true,
  target: "node20",
  external: ["@onset/core", "@onset/netlist-parser"],
});
