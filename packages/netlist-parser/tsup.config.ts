import { defineConfig } from "tsup";

// Entries: the language (index, no Node built-ins) and the file-system reader (node).
export default defineConfig({
  entry: { index: "src/index.ts", node: "src/node.ts" },
  format: ["esm", "cjs"],
  dts: { entry: { index: "src/index.ts", node: "src/node.ts" }, compilerOptions: { composite: false } },
  splitting: true,
  sourcemap: false,
  clean: true,
  target: "node20",
});
