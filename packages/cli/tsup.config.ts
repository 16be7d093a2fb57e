import { defineConfig } from "tsup";

// Sibling packages stay external so the CLI and its workers load one copy of each.
export default defineConfig({
  entry: { index: "src/index.ts", main: "src/main.ts", worker: "src/worker.ts" },
  format: ["esm", "cjs"],
  dts: { entry: "src/index.ts", compilerOptions: { composite: false } },
  sourcemap: true,
  clean: true,
  shims: true,
  target: "node20",
  external: ["@onset/core", "@onset/netlist-parser"],
});
