import fc from "fast-check";
import { partKinds } from "@onset/core";

// Generators of syntactically valid circuit files, with varied spacing, comments, blank lines
// and statements wrapped inside brackets, for the formatter's round-trip properties.

const STATEMENT_WORDS = new Set(["title", "param", "include", "preset", "block", "end", "use", "bias", "transient", "startup", "response", "poles", "sweep", "tolerance", "spec", ...Object.keys(partKinds)]);

export const nameArb = fc
  .tuple(fc.constantFrom(..."abcdeghkmnoprstuvwxyzABCDEFGHKLMNOPRSTUVWXYZ_"), fc.stringMatching(/^[A-Za-z0-9_]{0,5}$/))
  .map(([a, b]) => a + b)
  .filter((n) => !STATEMENT_WORDS.has(n));

const keyArb = fc
  .tuple(fc.stringMatching(/^[a-z][a-z0-9]{0,4}$/), fc.option(fc.stringMatching(/^[a-z][a-z0-9]{0,3}$/), { nil: undefined }))
  .map(([a, b]) => (b === undefined ? a : `${a}-${b}`));

const spaceArb = fc.constantFrom(" ", " ", " ", "  ", "\t", "   ");
const PREFIXES = ["", "", "", "f", "p", "n", "u", "µ", "m", "k", "M", "G", "T"];
const UNITS = ["", "", "", "Ω", "ohm", "F", "H", "V", "A", "S", "s", "Hz", "rad", "%", "dB", "deg"];

export const numberArb = fc
  .tuple(
    fc.oneof(fc.integer({ min: 0, max: 99999 }).map(String), fc.tuple(fc.nat(999), fc.nat(999)).map(([a, b]) => `${a}.${b}`), fc.nat(99).map((b) => `.${b}`), fc.nat(99).map((a) => `${a}.`)),
    fc.option(fc.integer({ min: -12, max: 12 }).map((e) => `e${e}`), { nil: "" }),
    fc.constantFrom(...PREFIXES),
    fc.constantFrom(...UNITS),
  )
  .map(([m, e, p, u]) => (u === "%" || u === "dB" || u === "deg" ? `${m}${e}${u}` : `${m}${e}${p}${u}`))
  .filter((t) => !/^\d*\.?\d*(e-?\d+)?(meg|mil)/i.test(t));

const FUNCTIONS = ["sqrt", "exp", "ln", "log10", "sin", "cos", "tan", "atan", "abs", "min", "max"];

/** An expression's text (what goes inside parentheses). */
export const exprArb: fc.Arbitrary<string> = fc.letrec<{ expr: string }>((tie) => ({
  expr: fc.oneof(
    { depthSize: "small", withCrossShrink: true },
    numberArb,
    nameArb,
    fc.constant("pi"),
    fc.tuple(tie("expr"), fc.constantFrom("+", "-", "*", "/", "^"), tie("expr"), fc.constantFrom("", " ")).map(([a, op, b, s]) => `${a}${s}${op}${s}${b}`),
    tie("expr").map((a) => `-${a}`),
    fc.tuple(fc.constantFrom(...FUNCTIONS), fc.array(tie("expr"), { minLength: 1, maxLength: 3 })).map(([f, args]) => `${f}(${args.join(", ")})`),
    fc.array(tie("expr"), { minLength: 1, maxLength: 3 }).map((items) => `(${items.join(", ")})`),
  ),
})).expr;

const toleranceArb = fc.option(
  fc.tuple(fc.constantFrom("±", "+-"), fc.oneof(numberArb, exprArb.map((e) => `(${e})`))).map(([s, v]) => s + v),
  { nil: "" },
);

/** A number-like value: a literal or a parenthesised expression, maybe negative, maybe with a tolerance. */
export const valueArb = fc
  .tuple(fc.constantFrom("", "", "-"), fc.oneof(numberArb, fc.array(exprArb, { minLength: 1, maxLength: 3 }).map((xs) => `(${xs.join(",\n   ")})`)), toleranceArb)
  .map(([s, v, t]) => s + v + t);

const pointsArb = fc
  .array(fc.array(fc.tuple(fc.constantFrom("", "-"), fc.oneof(numberArb, nameArb, exprArb.map((e) => `(${e})`))).map(([s, v]) => s + v), { minLength: 1, maxLength: 3 }), { maxLength: 4 })
  .map((rows) => `[${rows.map((r) => r.join(" ")).join(", ")}]`);

const optionValueArb = fc.oneof(valueArb, nameArb, pointsArb);
const optionArb = fc.tuple(keyArb, optionValueArb).map(([k, v]) => `${k}=${v}`);

function joinWith(parts: readonly string[], spaces: readonly string[]): string {
  return parts.map((p, i) => (i === 0 ? p : (spaces[i % spaces.length] ?? " ") + p)).join("");
}

const kindNames = Object.keys(partKinds);

const partArb = fc
  .tuple(fc.constantFrom(...kindNames), nameArb, fc.array(nameArb, { minLength: 4, maxLength: 4 }), valueArb, fc.array(optionArb, { maxLength: 3 }), fc.boolean(), fc.array(spaceArb, { minLength: 1, maxLength: 4 }))
  .map(([kind, name, nodes, value, options, withValue, spaces]) => {
    const schema = partKinds[kind]!;
    const cells = [kind, name, ...nodes.slice(0, schema.pins.length), ...(schema.value && (schema.value.required || withValue) ? [value] : []), ...options];
    return joinWith(cells, spaces);
  });

const stringArb = fc.string({ maxLength: 12 }).map((s) => `"${s.replace(/[\n\r]/g, " ").replace(/\\/g, "\\\\").replace(/"/g, '\\"')}"`);

const paramArb = fc
  .tuple(nameArb, valueArb, spaceArb, fc.constantFrom("", "", " each", "\teach"))
  .map(([n, v, s, each]) => `param${s}${n}${s}=${s}${v}${each}`);
const useArb = fc
  .tuple(nameArb, nameArb, fc.array(nameArb, { maxLength: 4 }), fc.array(fc.tuple(nameArb, valueArb).map(([k, v]) => `${k}=${v}`), { maxLength: 2 }))
  .map(([n, b, nodes, params]) => ["use", n, b, ...nodes, ...params].join(" "));
const presetArb = fc.tuple(nameArb, fc.constantFrom(...kindNames), fc.array(optionArb, { maxLength: 3 })).map(([n, k, o]) => ["preset", n, k, ...o].join(" "));

const ANALYSES = ["bias", "transient", "startup", "response", "poles", "tolerance"];
const analysisArb = fc.oneof(
  fc.tuple(fc.constantFrom(...ANALYSES), fc.array(fc.oneof(optionArb, keyArb.filter((k) => !k.includes("-"))), { maxLength: 3 })).map(([a, args]) => [a, ...args].join(" ")),
  fc.tuple(nameArb, fc.array(fc.oneof(optionArb, fc.constant("log")), { maxLength: 3 })).map(([t, args]) => ["sweep", t, ...args].join(" ")),
  fc
    .array(
      fc.oneof(
        fc.tuple(keyArb, fc.constantFrom("<", ">"), valueArb).map(([k, op, v]) => `${k}${op}${v}`),
        fc.tuple(keyArb, valueArb).map(([k, v]) => `${k}=${v}`),
        fc.tuple(keyArb, valueArb, valueArb).map(([k, a, b]) => `${k}=${a}${a.endsWith(".") ? " " : ""}..${b}`),
      ),
      { minLength: 1, maxLength: 3 },
    )
    .map((cs) => ["spec", ...cs].join(" ")),
);

const commentArb = fc.string({ maxLength: 15 }).map((s) => `# ${s.replace(/[\n\r]/g, " ")}`);
const trailingArb = fc.option(commentArb.map((c) => `  ${c}`), { nil: "" });

const bodyLineArb = fc.tuple(fc.oneof(partArb, paramArb, useArb, commentArb), trailingArb, fc.constantFrom("", "", "\n")).map(([s, t, blank]) => `${s.startsWith("#") ? s : s + t}\n${blank}`);

const blockArb = fc
  .tuple(nameArb, fc.array(nameArb, { maxLength: 3 }), fc.array(fc.tuple(nameArb, fc.option(valueArb, { nil: undefined })).map(([n, v]) => (v === undefined ? n : `${n}=${v}`)), { maxLength: 2 }), fc.array(bodyLineArb, { maxLength: 4 }), trailingArb)
  .map(([n, ports, params, body, t]) => `${["block", n, `(${ports.join(", ")})`, ...params].join(" ")}${t}\n${body.map((l) => `  ${l}`).join("")}end\n`);

const topLineArb = fc.oneof(
  { weight: 5, arbitrary: bodyLineArb },
  { weight: 1, arbitrary: stringArb.map((s) => `title ${s}\n`) },
  { weight: 1, arbitrary: stringArb.map((s) => `include ${s}\n`) },
  { weight: 1, arbitrary: presetArb.map((s) => `${s}\n`) },
  { weight: 1, arbitrary: blockArb },
  { weight: 2, arbitrary: fc.tuple(analysisArb, trailingArb).map(([a, t]) => `${a}${t}\n`) },
  { weight: 1, arbitrary: fc.constant("\n") },
);

/** A whole file that parses without syntax errors. */
export const programTextArb = fc.array(topLineArb, { maxLength: 14 }).map((lines) => lines.join(""));

/** Small edits that usually break a file: deletions, insertions of syntax characters, duplications. */
export function mutationsArb(text: string): fc.Arbitrary<string> {
  const alphabet = [..."()[]=,+-*/^±<>.#\"\\\n \t0123456789kMmµΩ%abcz", "..", "+-", "meg", "gnd", "end", "block ", "use ", "(", "\u0000", "\u00ff", "😀"];
  const edit = fc.oneof(
    fc.tuple(fc.nat(), fc.nat(8)).map(([at, n]) => (s: string) => {
      const i = s.length === 0 ? 0 : at % (s.length + 1);
      return s.slice(0, i) + s.slice(i + n);
    }),
    fc.tuple(fc.nat(), fc.constantFrom(...alphabet)).map(([at, c]) => (s: string) => {
      const i = s.length === 0 ? 0 : at % (s.length + 1);
      return s.slice(0, i) + c + s.slice(i);
    }),
    fc.tuple(fc.nat(), fc.nat()).map(([a, b]) => (s: string) => {
      const lines = s.split("\n");
      const i = a % lines.length;
      const j = b % lines.length;
      lines.splice(j, 0, lines[i]!);
      return lines.join("\n");
    }),
  );
  return fc.array(edit, { minLength: 1, maxLength: 5 }).map((edits) => edits.reduce((s, e) => e(s), text));
}
