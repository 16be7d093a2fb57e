import { expect } from "vitest";
import { OnsetError } from "@onset/core";

/**
 * Calls `f`: anything thrown must be an OnsetError with a code, the call must end within 5 s,
 * and with `notNaN` a number that comes out must not be NaN (the library's door properties).
 */
export function onlyTypedErrors(f: () => unknown, notNaN = false): void {
  const started = performance.now();
  try {
    const out = f();
    if (notNaN && typeof out === "number") expect(Number.isNaN(out)).toBe(false);
  } catch (e) {
    if (!(e instanceof OnsetError) || typeof e.diagnostic.code !== "string") throw new Error(`not a typed error: ${String(e)}\n${(e as Error).stack}`);
  }
  expect(performance.now() - started).toBeLessThan(5000);
}
