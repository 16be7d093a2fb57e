import { didYouMean, type OptionSchema, type OptionValue, type PartKindSchema } from "@onset/core";
import { raise } from "../errors.js";
import type { OptionNode, Value } from "../syntax.js";
import type { Elaboration, TargetInfo } from "./context.js";
import { checkRange } from "./value-checks.js";
import { spanIn } from "./index-program.js";
import { convertOption, type ValueSite } from "./option-values.js";

/** An option value before conversion: written (on the part or in a file preset) or from a built-in preset. */
export type OptionSource = { readonly node: OptionNode; readonly site: ValueSite } | { readonly fixed: OptionValue };

/** Every option a kind accepts under a variant (`wave=sine`). */
export function allowedOptions(schema: PartKindSchema, variant: string | undefined): Record<string, OptionSchema> {
  const set = variant ? schema.variants?.sets[variant] : undefined;
  return { ...schema.options, ...(set ?? {}) };
}

/** The override target a numeric option makes (unit, dB, inf, range); undefined for other types. */
export function targetOf(option: OptionSchema): TargetInfo | undefined {
  if (option.type !== "number") return undefined;
  return {
    expect: { unit: option.unit, decibel: option.decibel ?? false, allowInfinite: option.allowInfinite ?? false },
    range: { min: option.min, minExclusive: option.minExclusive, max: option.max, integer: option.integer },
    summary: option.summary,
  };
}

/** Raises `unknown-option`, pointing to the wave an option belongs to when that is the mistake. */
export function unknownOption(key: string, schema: PartKindSchema, allowed: Record<string, OptionSchema>, label: string, site: ValueSite, span: { start: number; end: number }): never {
  let hint = `options of ${schema.kind}: ${Object.keys(allowed).map((k) => `${k}=`).join(" ") || "none"}`;
  if (schema.variants) {
    for (const [variant, set] of Object.entries(schema.variants.sets)) {
      if (set[key] && !allowed[key]) {
        hint = `${key}= belongs to ${schema.variants.key}=${variant}`;
        break;
      }
    }
  }
  return raise("unknown-option", `${label} has no option '${key}='${didYouMean(key, Object.keys(allowed))}`, spanIn(site.where, span), { hint });
}

/** Converts one option value by its schema; numbers are checked against the option's range. */
export function convertValue(ctx: Elaboration, key: string, option: OptionSchema, value: Value, site: ValueSite): OptionValue {
  if (option.type !== "number") return convertOption(ctx, key, option, value, site);
  const info = targetOf(option)!;
  const v = ctx.number(value, info.expect, site.scope, site.where, `${key}= of ${site.label}`);
  checkRange(v, info.range!, option.unit, `${key}= of ${site.label}`, spanIn(site.where, value.span), `${key}= is the ${option.summary}`);
  return v;
}
