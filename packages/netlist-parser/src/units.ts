import { closestName, type UnitSymbol } from "@onset/core";

/** SI prefixes and their powers of ten; `u`, `µ` (micro sign) and `μ` (Greek mu) are micro. */
export const SI_PREFIXES: Readonly<Record<string, number>> = {
  f: -15,
  p: -12,
  n: -9,
  u: -6,
  "µ": -6,
  "μ": -6,
  m: -3,
  k: 3,
  M: 6,
  G: 9,
  T: 12,
};

/** How a written unit changes the number: SI as is, `%` a hundredth, `dB` a ratio, `deg` to radians. */
export type UnitForm = "si" | "percent" | "decibel" | "degree";

/** Unit spellings the language accepts, what each measures, and how it converts. */
export const UNIT_SPELLINGS: Readonly<Record<string, { readonly symbol: UnitSymbol; readonly form: UnitForm }>> = {
  "Ω": { symbol: "Ω", form: "si" },
  "\u2126": { symbol: "Ω", form: "si" },
  ohm: { symbol: "Ω", form: "si" },
  F: { symbol: "F", form: "si" },
  H: { symbol: "H", form: "si" },
  V: { symbol: "V", form: "si" },
  A: { symbol: "A", form: "si" },
  S: { symbol: "S", form: "si" },
  s: { symbol: "s", form: "si" },
  Hz: { symbol: "Hz", form: "si" },
  rad: { symbol: "rad", form: "si" },
  "V/s": { symbol: "V/s", form: "si" },
  deg: { symbol: "rad", form: "degree" },
  "%": { symbol: "1", form: "percent" },
  dB: { symbol: "1", form: "decibel" },
};

/** A number as written and as decoded. */
export interface NumberLiteral {
  /** The token's text, e.g. `4.7k`, `47nF`, `2V/us`. */
  readonly text: string;
  /** The decimal part before any prefix, e.g. `4.7`, `1e-9`. */
  readonly mantissa: string;
  readonly prefix?: string;
  /** The unit as spelled (`Ω`, `ohm`, `V/us`, `%`, `dB`, `deg`). */
  readonly unit?: string;
  /** What the written unit measures; undefined for a bare number. */
  readonly symbol?: UnitSymbol;
  readonly form: UnitForm;
  /** Value in SI base units: prefix applied, `%` as a fraction, `deg` in radians, `dB` as a ratio. */
  readonly value: number;
}

/** Why a number token could not be decoded. */
export interface NumberProblem {
  readonly code: "bad-prefix" | "bad-unit" | "bad-number";
  readonly message: string;
  readonly hint: string;
}

const MANTISSA = /^(\d*(?:\.\d*)?)(?:[eE]([+-]?\d+))?/;
const PREFIX_CHARS = "fpnuµμmkMGT";

/** Every spelling with an optional prefix, for suggestions. */
function allSpellings(): string[] {
  const out = Object.keys(UNIT_SPELLINGS);
  for (const p of Object.keys(SI_PREFIXES)) {
    out.push(p);
    for (const [u, def] of Object.entries(UNIT_SPELLINGS)) if (def.form === "si") out.push(p + u);
  }
  return out;
}
let spellingCache: string[] | undefined;

/** Number of the written decimal with its exponent shifted by `shift`, rounded once. */
function scaled(coefficient: string, exponent: number, shift: number): number {
  return Number(`${coefficient === "" || coefficient === "." ? "0" : coefficient}e${exponent + shift}`);
}

/** Decodes a number token: decimal, optional SI prefix, optional unit, with no spaces. */
export function decodeNumber(text: string): NumberLiteral | NumberProblem {
  const m = MANTISSA.exec(text)!;
  const coefficient = m[1]!;
  const exponent = m[2] === undefined ? 0 : Number(m[2]);
  const mantissa = m[0];
  const suffix = text.slice(mantissa.length);
  if (!/\d/.test(coefficient)) return { code: "bad-number", message: `'${text}' is not a number`, hint: "write digits, e.g. 0.5 or 10k" };
  if (suffix === "") return { text, mantissa, form: "si", value: scaled(coefficient, exponent, 0) };

  const lower = suffix.toLowerCase();
  if (lower.startsWith("meg")) {
    return {
      code: "bad-prefix",
      message: `'meg' in '${text}' is not an SI prefix`,
      hint: `write M for mega (${mantissa}M = ${mantissa}e6); lower-case m is milli`,
    };
  }
  if (lower.startsWith("mil")) {
    return {
      code: "bad-prefix",
      message: `'mil' in '${text}' is not an SI prefix`,
      hint: `write m for milli (${mantissa}m = ${mantissa}e-3); the language has no length units`,
    };
  }
  const slew = /^([fpnuµμmkMGT])?V\/([fpnuµμmkMGT])?s$/.exec(suffix);
  if (slew) {
    const shift = (slew[1] ? SI_PREFIXES[slew[1]]! : 0) - (slew[2] ? SI_PREFIXES[slew[2]]! : 0);
    const literal: NumberLiteral = { text, mantissa, unit: suffix, symbol: "V/s", form: "si", value: scaled(coefficient, exponent, shift) };
    return slew[1] ? { ...literal, prefix: slew[1] } : literal;
  }
  const density = /^([fpnuµμmkMGT])?V\/(?:rtHz|√Hz)$/.exec(suffix);
  if (density) {
    const literal: NumberLiteral = { text, mantissa, unit: suffix, symbol: "V/√Hz", form: "si", value: scaled(coefficient, exponent, density[1] ? SI_PREFIXES[density[1]]! : 0) };
    return density[1] ? { ...literal, prefix: density[1] } : literal;
  }
  const conductance = /^([fpnuµμmkMGT])?W\/K$/.exec(suffix);
  if (conductance) {
    const literal: NumberLiteral = { text, mantissa, unit: suffix, symbol: "W/K", form: "si", value: scaled(coefficient, exponent, conductance[1] ? SI_PREFIXES[conductance[1]]! : 0) };
    return conductance[1] ? { ...literal, prefix: conductance[1] } : literal;
  }
  const whole = UNIT_SPELLINGS[suffix];
  if (whole) return withUnit(text, mantissa, undefined, suffix, coefficient, exponent);
  const first = suffix[0]!;
  const rest = suffix.slice(first.length);
  if (PREFIX_CHARS.includes(first)) {
    if (rest === "") return { text, mantissa, prefix: first, form: "si", value: scaled(coefficient, exponent, SI_PREFIXES[first]!) };
    const unit = UNIT_SPELLINGS[rest];
    if (unit && unit.form === "si") return withUnit(text, mantissa, first, rest, coefficient, exponent);
    if (unit) {
      return { code: "bad-unit", message: `'${rest}' in '${text}' cannot take a prefix`, hint: `write ${scaled(coefficient, exponent, SI_PREFIXES[first]!)}${rest} instead` };
    }
    if (/^\d+$/.test(rest)) {
      return {
        code: "bad-number",
        message: `'${text}' is not a number`,
        hint: `write the decimal point: ${coefficient}.${rest}${first}`,
      };
    }
  }
  spellingCache ??= allSpellings();
  const near = closestName(suffix, spellingCache);
  if (/^[fpnuµμmkMGT]?K$/.test(suffix)) {
    return {
      code: "bad-unit",
      message: `unknown unit '${suffix}' in '${text}'${near === undefined ? "" : ` (did you mean '${near}'?)`}`,
      hint: "write k for kilo (10k); a temperature constant such as a thermistor's beta= is written in kelvin as a plain number (beta=3500)",
    };
  }
  return {
    code: "bad-unit",
    message: `unknown unit '${suffix}' in '${text}'${near === undefined ? "" : ` (did you mean '${near}'?)`}`,
    hint: "units are Ω (or ohm), F, H, V, A, S, s, Hz, V/s, V/rtHz (or V/√Hz), W/K, rad, deg, % and dB, after an optional prefix f p n u µ m k M G T",
  };
}

function withUnit(text: string, mantissa: string, prefix: string | undefined, unit: string, coefficient: string, exponent: number): NumberLiteral {
  const def = UNIT_SPELLINGS[unit]!;
  const shift = prefix ? SI_PREFIXES[prefix]! : 0;
  let value: number;
  switch (def.form) {
    case "percent":
      value = scaled(coefficient, exponent, -2);
      break;
    case "decibel":
      value = Math.pow(10, scaled(coefficient, exponent, 0) / 20);
      break;
    case "degree":
      value = (scaled(coefficient, exponent, 0) * Math.PI) / 180;
      break;
    case "si":
      value = scaled(coefficient, exponent, shift);
      break;
  }
  const literal: NumberLiteral = { text, mantissa, unit, symbol: def.symbol, form: def.form, value };
  return prefix ? { ...literal, prefix } : literal;
}

export function isNumberProblem(x: NumberLiteral | NumberProblem): x is NumberProblem {
  return "code" in x;
}

/** What a context expects of a number: its unit (undefined: any), and whether dB is a ratio there. */
export interface UnitExpectation {
  readonly unit: UnitSymbol | undefined;
  readonly decibel?: boolean;
}

const UNIT_NAMES: Readonly<Record<UnitSymbol, string>> = {
  "Ω": "ohms (Ω)",
  F: "farads (F)",
  H: "henries (H)",
  V: "volts (V)",
  A: "amperes (A)",
  S: "siemens (S)",
  s: "seconds (s)",
  Hz: "hertz (Hz)",
  "V/s": "volts per second (V/s, or V/us)",
  "V/√Hz": "volts per root hertz (V/rtHz or V/√Hz, e.g. 20nV/rtHz)",
  rad: "radians (rad, or deg)",
  K: "kelvin (K), written as a bare number",
  "W/K": "watts per kelvin (W/K, e.g. 2mW/K)",
  "1/V": "per volt (1/V), written as a bare number",
  "1": "a plain ratio",
};

/** How a unit is named in messages. */
export function unitName(unit: UnitSymbol): string {
  return UNIT_NAMES[unit];
}

/** The unit as written after a plain number in examples (`Ω`, `F`, nothing for a ratio). */
export function unitSuffix(unit: UnitSymbol | undefined): string {
  return unit === undefined || unit === "1" ? "" : unit;
}

/**
 * Whether a literal's written unit fits what the context expects; returns the reason when not.
 * A bare number always fits; `%` fits ratios, `dB` ratios that allow decibels, `deg` angles.
 */
export function unitMismatch(literal: NumberLiteral, expected: UnitExpectation): string | undefined {
  if (literal.symbol === undefined || expected.unit === undefined) return undefined;
  if (literal.form === "decibel") {
    if (expected.unit === "1" && expected.decibel) return undefined;
    return expected.unit === "1" ? "dB is accepted only where a gain is expected" : `expected ${unitName(expected.unit)}`;
  }
  if (literal.symbol === expected.unit) return undefined;
  return `expected ${unitName(expected.unit)}`;
}
