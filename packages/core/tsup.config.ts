import { defineConfig } from "tsup";

export default defineConfig({
  entry: ["src/index.ts"],
  format: ["esm", "cjs"],
  dts: { entry: "src/index.ts", compilerOptions: { composite: false } },
  sourcemap: true,
  clean: true,
  target: "node20",
});
