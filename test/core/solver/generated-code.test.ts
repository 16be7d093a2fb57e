import { describe, expect, test } from "vitest";
import { generatedFunction } from "../../../packages/core/src/solver/generated-code.js";

describe("generated functions", () => {
  test("one text gives one function object, so circuits of one topology share it", () => {
    const f = generatedFunction<(a: number) => number>(["a"], '"use strict"; return a + 1;');
    const g = generatedFunction<(a: number) => number>(["a"], '"use strict"; return a + 1;');
    expect(f).toBe(g);
    expect(f!(41)).toBe(42);
    expect(generatedFunction(["a"], '"use strict"; return a + 2;')).not.toBe(f);
  });

  test("text that does not compile gives undefined (the callers keep their loops)", () => {
    expect(generatedFunction(["a"], "return a +;")).toBeUndefined();
  });
});
