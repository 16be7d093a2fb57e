import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { closestName, didYouMean, isOnsetError } from "@onset/core";
import { buildSystem, editDistance, probeReader } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";

const wordArb = fc.string({ unit: fc.constantFrom(..."abcdeoRCn1_"), minLength: 1, maxLength: 9 });

describe("editDistance(a, b): optimal string alignment (Levenshtein 1966 with transpositions)", () => {
  test("known distances", () => {
    expect(editDistance("kitten", "sitting")).toBe(3); // the textbook example (Levenshtein distance 3)
    expect(editDistance("rnu", "run")).toBe(1); // one adjacent transposition
    expect(editDistance("", "abc")).toBe(3);
    expect(editDistance("ca", "abc")).toBe(3); // OSA: no edit of a transposed pair (true Damerau would give 2)
  });

  test("is zero exactly on equal strings, symmetric, and bounded by the lengths", () => {
    fc.assert(
      fc.property(wordArb, wordArb, (a, b) => {
        const d = editDistance(a, b);
        expect(d === 0).toBe(a === b);
        expect(editDistance(b, a)).toBe(d);
        expect(d).toBeGreaterThanOrEqual(Math.abs(a.length - b.length));
        expect(d).toBeLessThanOrEqual(Math.max(a.length, b.length));
      }),
    );
  });
});

describe("closestName(word, candidates): one rule for every unknown name", () => {
  test("an abbreviation or a longer spelling of a name is suggested (probe=out for the node o)", () => {
    expect(closestName("out", ["o", "n", "p"])).toBe("o");
    expect(closestName("o", ["out", "in"])).toBe("out");
    expect(closestName("amp", ["amplitude", "frequency"])).toBe("amplitude");
  });

  test("a letter-case slip wins over a closer typo, and a typo over a prefix", () => {
    expect(closestName("r1", ["R2", "R1"])).toBe("R1");
    expect(closestName("outp", ["o", "outa"])).toBe("outa");
  });

  test("unrelated names get no suggestion, and a name is never suggested for itself", () => {
    expect(closestName("xyz", ["o", "n1", "gnd"])).toBeUndefined();
    expect(closestName("V9", ["R1"])).toBeUndefined();
    expect(closestName("o", ["o"])).toBeUndefined();
    expect(didYouMean("xyz", ["o"])).toBe("");
  });

  test("any single edit of a name (insert, delete, substitute, transpose) suggests it", () => {
    const editArb = fc.tuple(wordArb, fc.nat(), fc.constantFrom("insert", "delete", "substitute", "transpose"), fc.constantFrom(..."xyzQ"));
    fc.assert(
      fc.property(editArb, ([name, at, kind, letter]) => {
        const i = at % name.length;
        const slip =
          kind === "insert"
            ? name.slice(0, i) + letter + name.slice(i)
            : kind === "delete"
              ? name.slice(0, i) + name.slice(i + 1)
              : kind === "substitute"
                ? name.slice(0, i) + letter + name.slice(i + 1)
                : name.slice(0, i) + (name[i + 1] ?? "") + name[i] + name.slice(i + 2);
        fc.pre(slip !== name && slip.length > 0);
        expect(closestName(slip, [name])).toBe(name);
      }),
    );
  });

  test("didYouMean spells the suggestion as the caller writes names", () => {
    expect(didYouMean("jsn", ["json", "csv"], (n) => `--${n}`)).toBe(" (did you mean '--json'?)");
  });
});

describe("the library's own unknown names use the same rule", () => {
  test("a probe of node 'out' on a circuit whose node is 'o' suggests 'o' (npm API, no language file)", () => {
    const system = buildSystem(circuit([part("vsource", "V1", ["o", "gnd"], 1), part("resistor", "R1", ["o", "gnd"], 1e3)]));
    const messageOf = (fn: () => unknown) => {
      try {
        fn();
      } catch (e) {
        if (isOnsetError(e)) return e.diagnostic.message;
        throw e;
      }
      throw new Error("expected an OnsetError");
    };
    expect(messageOf(() => probeReader(system, { kind: "node", node: "out" }))).toBe("probe 'out' names unknown node 'out' (did you mean 'o'?)");
    expect(messageOf(() => probeReader(system, { kind: "current", part: "R2" }))).toBe("probe 'R2.i': no part 'R2' with a current (did you mean 'R1'?)");
  });
});
