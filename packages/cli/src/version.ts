import { readFileSync } from "node:fs";

/**
 * The package's version, read from its package.json: one folder up from both `src/` and
 * `dist/`, so the sources and the build agree.
 */
export function cliVersion(): string {
  try {
    const text = readFileSync(new URL("../package.json", import.meta.url), "utf8");
    const version = (JSON.parse(text) as { version?: unknown }).version;
    return typeof version === "string" ? version : "unknown";
  } catch {
    return "unknown";
  }
}
