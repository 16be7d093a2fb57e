import { defineConfig } from "tsup";

// The command (main) is ESM only: `bin` runs main.js, and a CommonJS copy of it had no user.
// The library entry (index) is built for both module kinds. Sibling packages stay external so
// the CLI and the engine's Monte Carlo workers load one copy of each (the worker entry lives
// in @onset/core, beside its own build). The two builds run side by side, so the first cleans
// everything but what the second writes.
const common = {
  sourcemap: false,
  shims: true,
  target: "node20",
  external: ["@onset/core", "@onset/netlist-parser"],
} as const;

export default defineConfig([
  { ...common, entry: { index: "src/index.ts", main: "src/main.ts" }, format: ["esm"], dts: { entry: "src/index.ts", compilerOptions: { composite: false } }, clean: ["*", "!index.cjs", "!index.d.cts"] },
  { ...common, entry: { index: "src/index.ts" }, format: ["cjs"], dts: { entry: "src/index.ts", compilerOptions: { composite: false } }, clean: false },
]);
