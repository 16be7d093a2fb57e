import { defineConfig } from "vitest/config";

export default defineConfig({
  resolve: { conditions: ["onset-source", "import", "module", "default"] },
  test: {
    include: ["test/**/*.test.ts"],
    reporters: ["default", "./test/support/tally-reporter.ts"],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    pool: "forks",
  },
});
