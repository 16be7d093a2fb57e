import { defineConfig } from "vitest/config";

// Tests import the packages' TypeScript sources through the `onset-source` export condition,
// so no build is needed to run them (the end-to-end CLI tests use the built files).
const conditions = ["onset-source", "import", "module", "node", "default"];

export default defineConfig({
  resolve: { conditions },
  ssr: { resolve: { conditions, externalConditions: conditions } },
  test: {
    include: ["test/**/*.test.ts"],
    setupFiles: ["./test/support/fast-check-seed.ts"],
    reporters: ["default", "./test/support/tally-reporter.ts"],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: "forks",
  },
});
