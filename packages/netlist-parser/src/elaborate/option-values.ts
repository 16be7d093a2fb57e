import { didYouMean, type OptionSchema, type OptionValue, type SourceSpan } from "@onset/core";
import { raise } from "../errors.js";
import { soleLiteral, soleName } from "../evaluate.js";
import type { Expr, Value } from "../syntax.js";
import type { Elaboration } from "./context.js";
import { spanIn, type Located } from "./index-program.js";
import type { Scope } from "./scope.js";

/** Where a value is written and what it belongs to, for messages. */
export interface ValueSite {
  readonly where: Located<unknown>;
  readonly scope: Scope;
  /** `opamp U1`, `preset fast`. */
  readonly label: string;
}

function exprAsValue(item: Expr): Value {
  return { kind: "paren", negative: false, items: [item], span: item.span };
}

function textOf(site: ValueSite, span: { start: number; end: number }): string {
  return site.where.text.slice(span.start, span.end);
}

/** Converts a non-numeric option value (word, pair, node pair, points, name) by its schema. */
export function convertOption(ctx: Elaboration, key: string, option: OptionSchema, value: Value, site: ValueSite): OptionValue {
  const at = (s: { start: number; end: number }): SourceSpan => spanIn(site.where, s);
  if ((value.kind === "number" || value.kind === "paren") && value.tolerance && option.type !== "number") {
    raise("tolerance-here", `${key}= of ${site.label} cannot have a tolerance`, at(value.tolerance.span), {
      hint: "tolerances go on part values and numeric options",
    });
  }
  switch (option.type) {
    case "number":
      throw new Error("numeric options are converted by the part");
    case "word":
    case "name": {
      if (value.kind !== "word") {
        const choices = option.type === "word" ? option.words.join(", ") : "a name";
        raise("expected-word", `${key}= of ${site.label} takes a word, not '${textOf(site, value.span)}'`, at(value.span), { hint: `write one of: ${choices}` });
      }
      if (option.type === "word" && !option.words.includes(value.name)) {
        raise("bad-word", `${key}=${value.name} is not a choice for ${site.label}${didYouMean(value.name, option.words)}`, at(value.span), {
          hint: `${key}= is one of ${option.words.join(", ")}`,
        });
      }
      return value.name;
    }
    case "number-pair": {
      if (value.kind !== "paren" || value.items.length !== 2 || value.negative) {
        raise("expected-pair", `${key}= of ${site.label} takes two numbers in parentheses`, at(value.span), { hint: `write e.g. ${key}=(-12, 12)` });
      }
      return value.items.map((item) => ctx.number(exprAsValue(item), { unit: option.unit }, site.scope, site.where, `${key}= of ${site.label}`));
    }
    case "node-pair": {
      if (value.kind !== "paren" || value.items.length !== 2 || value.negative) {
        raise("expected-pair", `${key}= of ${site.label} takes two node names in parentheses`, at(value.span), { hint: `write e.g. ${key}=(vneg, vpos)` });
      }
      return value.items.map((item) => {
        const lit = soleLiteral(item);
        if (lit && lit.literal.value === 0 && lit.literal.symbol === undefined) raise("node-zero", "node '0' is not ground in this language", at(item.span), { hint: "write gnd for the ground node" });
        const name = soleName(item);
        if (!name || name.name.includes(".")) {
          raise("expected-node", `${key}= of ${site.label} takes node names, not '${textOf(site, item.span)}'`, at(item.span), { hint: `write e.g. ${key}=(vneg, vpos)` });
        }
        const node = site.scope.node(name.name);
        ctx.nodes.add(node);
        return node;
      });
    }
    case "points": {
      if (value.kind !== "points") {
        raise("expected-points", `${key}= of ${site.label} takes a list of points in [ ]`, at(value.span), { hint: `write e.g. ${key}=[0 0, 1m 5, 2m 0]` });
      }
      if (value.rows.length === 0) raise("bad-points", `${key}= of ${site.label} has no points`, at(value.span), { hint: "give at least one time–level pair" });
      const flat: number[] = [];
      for (const row of value.rows) {
        if (row.length !== 2) {
          const rowSpan = { start: row[0]!.span.start, end: row[row.length - 1]!.span.end };
          raise("bad-points", `each point of ${key}= is a time and a level, but this one has ${row.length} ${row.length === 1 ? "number" : "numbers"}`, at(rowSpan), {
            hint: "separate points with commas: [t0 v0, t1 v1, ...]",
          });
        }
        row.forEach((item, i) => flat.push(ctx.number(exprAsValue(item), { unit: option.units[i] }, site.scope, site.where, `${i === 0 ? "a time" : "a level"} in ${key}= of ${site.label}`)));
      }
      return flat;
    }
  }
}
