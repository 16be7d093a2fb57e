// Runs only issue 18's strict accuracy checks (accuracy.strict.ts), which are not yet part of the
// default suite: npx vitest run -c test/validation/vitest.strict.config.ts
import { defineConfig } from "vitest/config";
import base from "../../vitest.config";

export default defineConfig({ ...base, test: { ...base.test, include: ["test/validation/**/*.strict.ts"] } });
