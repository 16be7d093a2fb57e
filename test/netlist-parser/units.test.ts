import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { decodeNumber, parseQuantity, SI_PREFIXES, UNIT_SPELLINGS, type NumberLiteral, type NumberProblem } from "@onset/netlist-parser";

function literal(text: string): NumberLiteral {
  const r = decodeNumber(text);
  if ("code" in r) throw new Error(`${text}: ${r.message}`);
  return r;
}
function problemOf(text: string): NumberProblem {
  const r = decodeNumber(text);
  if (!("code" in r)) throw new Error(`${text} decoded to ${r.value}`);
  return r;
}

// SI prefixes and their powers of ten (the SI brochure, BIPM, 9th edition, table 7).
const PREFIX_TABLE: ReadonlyArray<[string, number]> = [
  ["f", -15],
  ["p", -12],
  ["n", -9],
  ["u", -6],
  ["µ", -6], // U+00B5 micro sign
  ["μ", -6], // U+03BC Greek small mu
  ["m", -3],
  ["k", 3],
  ["M", 6],
  ["G", 9],
  ["T", 12],
];

const SI_UNITS: ReadonlyArray<[string, string]> = [
  ["Ω", "Ω"],
  ["\u2126", "Ω"], // ohm sign
  ["ohm", "Ω"],
  ["F", "F"],
  ["H", "H"],
  ["V", "V"],
  ["A", "A"],
  ["S", "S"],
  ["s", "s"],
  ["Hz", "Hz"],
  ["rad", "rad"],
  ["V/s", "V/s"],
];

describe("decodeNumber: the unit table", () => {
  test("the prefix table is exactly the SI prefixes the spec lists", () => {
    expect(Object.entries(SI_PREFIXES).sort()).toEqual([...PREFIX_TABLE].sort());
  });

  test("the unit table is exactly the spec's units plus S, rad, deg and V/s", () => {
    expect(Object.keys(UNIT_SPELLINGS).sort()).toEqual([...SI_UNITS.map(([u]) => u), "deg", "%", "dB"].sort());
  });

  for (const [prefix, power] of PREFIX_TABLE) {
    test(`prefix ${prefix} is 1e${power}, alone and before every SI unit`, () => {
      expect(literal(`3${prefix}`).value).toBe(Number(`3e${power}`));
      for (const [unit, symbol] of SI_UNITS) {
        if (unit === "V/s") continue;
        const l = literal(`4.7${prefix}${unit}`);
        expect(l.value).toBe(Number(`4.7e${power}`));
        expect(l.symbol).toBe(symbol);
        expect(l.prefix).toBe(prefix);
      }
    });
  }

  for (const [unit, symbol] of SI_UNITS) {
    test(`unit ${unit} alone measures ${symbol}`, () => {
      const l = literal(`15.8${unit}`);
      expect(l).toMatchObject({ value: 15.8, symbol, form: "si", unit });
    });
  }

  test("percent is a hundredth; 5% is 0.05", () => {
    expect(literal("5%")).toMatchObject({ value: 0.05, symbol: "1", form: "percent" });
    expect(literal("0.5%").value).toBe(0.005);
  });

  test("dB is 20·log10 of a voltage ratio (definition of the decibel)", () => {
    expect(literal("20dB").value).toBeCloseTo(10, 12);
    expect(literal("106dB").value).toBeCloseTo(Math.pow(10, 106 / 20), 6);
    expect(1 / literal("6dB").value).toBeCloseTo(0.501187, 6);
  });

  test("deg is converted to radians (π/180 per degree, mathematics)", () => {
    expect(literal("180deg").value).toBe(Math.PI);
    expect(literal("90deg")).toMatchObject({ value: Math.PI / 2, symbol: "rad", form: "degree" });
  });

  test("slew units: V/us is 1e6 V/s, kV/s is 1e3 V/s, V/ns is 1e9 V/s", () => {
    expect(literal("0.5V/us")).toMatchObject({ value: 0.5e6, symbol: "V/s" });
    expect(literal("13V/µs").value).toBe(13e6);
    expect(literal("2kV/s").value).toBe(2e3);
    expect(literal("1V/ns").value).toBe(1e9);
    expect(literal("3V/ms").value).toBe(3e3);
  });

  test("decimals: exponents, a leading dot, exponent and prefix together", () => {
    expect(literal("1e-9").value).toBe(1e-9);
    expect(literal(".5").value).toBe(0.5);
    expect(literal("1E3").value).toBe(1000);
    expect(literal("1.5e3k").value).toBe(1.5e6);
    expect(literal("2.2e-3uF").value).toBe(2.2e-9);
  });

  test("prefixed values are rounded once from the decimal (33n is exactly 33e-9)", () => {
    expect(literal("33n").value).toBe(33e-9);
    expect(literal("10.7k").value).toBe(10700);
  });
});

describe("decodeNumber: rejected spellings", () => {
  test.each([
    ["1meg", "bad-prefix"],
    ["1MEG", "bad-prefix"],
    ["2.2Meg", "bad-prefix"],
    ["10megohm", "bad-prefix"],
    ["5mil", "bad-prefix"],
    ["5MIL", "bad-prefix"],
    ["1K", "bad-unit"],
    ["3950K", "bad-unit"],
    ["2mW", "bad-unit"],
    ["1kOhm", "bad-unit"],
    ["1sec", "bad-unit"],
    ["1hz", "bad-unit"],
    ["1x", "bad-unit"],
    ["1e", "bad-unit"],
    ["1m%", "bad-unit"],
    ["1kdB", "bad-unit"],
    ["1mdeg", "bad-unit"],
    ["4k7", "bad-number"],
    ["2u2", "bad-number"],
  ])("%s is rejected as %s", (text, code) => {
    expect(problemOf(text).code).toBe(code);
  });

  test("meg names mega's SI spelling in its hint; mil names milli's", () => {
    expect(problemOf("1meg").hint).toBe("write M for mega (1M = 1e6); lower-case m is milli");
    expect(problemOf("5mil").hint).toBe("write m for milli (5m = 5e-3); the language has no length units");
  });

  test("an unknown unit suggests the closest spelling", () => {
    expect(problemOf("1K").message).toBe("unknown unit 'K' in '1K' (did you mean 'k'?)");
    expect(problemOf("3.5kK").hint).toBe("write k for kilo (10k); a temperature constant such as a thermistor's beta= is written in kelvin as a plain number (beta=3500)");
    expect(problemOf("1hz").message).toBe("unknown unit 'hz' in '1hz' (did you mean 'Hz'?)");
  });
});

describe("parseQuantity(text, unit)", () => {
  test("reads command-line quantities in SI", () => {
    expect(parseQuantity("2.5k", "Ω")).toBe(2500);
    expect(parseQuantity("33n", "F")).toBe(33e-9);
    expect(parseQuantity("10%", "1")).toBe(0.1);
    expect(parseQuantity("-12V", "V")).toBe(-12);
    expect(parseQuantity(" 1kHz ", "Hz")).toBe(1000);
    expect(parseQuantity("106dB", "1")).toBeCloseTo(Math.pow(10, 106 / 20), 6);
  });

  test("returns a typed diagnostic for a wrong unit, a bad prefix or a non-number", () => {
    expect(parseQuantity("47nH", "F", "--cap")).toEqual({
      severity: "error",
      stage: "input",
      code: "unit-mismatch",
      message: "unit mismatch: '47nH' is in henries (H), but --cap is in farads (F)",
      hint: "write 47n or 47nF",
    });
    expect(parseQuantity("1meg", "Ω", "--set R")).toMatchObject({ code: "bad-prefix", message: "--set R: 'meg' in '1meg' is not an SI prefix" });
    expect(parseQuantity("ten", "Ω", "--set R")).toMatchObject({ code: "bad-quantity", message: "--set R: 'ten' is not a number" });
    expect(parseQuantity("1k 2k", "Ω")).toMatchObject({ code: "bad-quantity" });
    expect(parseQuantity("6dB", "Hz")).toMatchObject({ code: "unit-mismatch" });
  });

  test("numbers with random prefixes round-trip: m·10^p written as m+prefix reads back as the decimal m·e(p)", () => {
    const prefixes = Object.entries(SI_PREFIXES);
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 999_999 }),
        fc.integer({ min: 0, max: 4 }),
        fc.integer({ min: 0, max: prefixes.length - 1 }),
        fc.boolean(),
        (digits, decimals, which, negative) => {
          const [prefix, power] = prefixes[which]!;
          const mantissa = decimals === 0 ? String(digits) : (digits / 10 ** decimals).toFixed(decimals);
          const text = `${negative ? "-" : ""}${mantissa}${prefix}`;
          const expected = Number(`${negative ? "-" : ""}${mantissa}e${power}`);
          expect(parseQuantity(text, "1")).toBe(expected);
        },
      ),
      { numRuns: 2000 },
    );
  });
});

describe("decodeNumber: a dissipation constant", () => {
  test("W/K takes a prefix on the W: 40uW/K is 4e-5 W/K, 2mW/K is 2e-3", () => {
    expect(literal("40uW/K")).toMatchObject({ symbol: "W/K", value: 40e-6 });
    expect(literal("2mW/K")).toMatchObject({ symbol: "W/K", value: 2e-3, prefix: "m" });
    expect(literal("0.5W/K")).toMatchObject({ symbol: "W/K", value: 0.5 });
  });
});
