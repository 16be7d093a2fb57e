import { isOnsetError, partKinds, type OptionSchema, type OptionValue, type PartKindSchema, type PartSpec, type SourceSpan } from "@onset/core";
import { deviceModels } from "@onset/core/engine";
import { raise } from "../errors.js";
import type { OptionNode, PartStatement } from "../syntax.js";
import type { Elaboration, TargetInfo } from "./context.js";
import { checkRange } from "./value-checks.js";
import { spanIn, type Located } from "./index-program.js";
import { allowedOptions, targetOf, unknownOption, type OptionSource } from "./option-schema.js";
import { convertOption, type ValueSite } from "./option-values.js";
import { mergeOptions } from "./presets.js";
import type { Scope } from "./scope.js";

/** The wave (or other variant) a part's options choose, if any. */
function variantOf(schema: PartKindSchema, merged: ReadonlyMap<string, OptionSource>): string | undefined {
  if (!schema.variants) return undefined;
  const source = merged.get(schema.variants.key);
  if (!source) return undefined;
  const word = "fixed" in source ? source.fixed : source.node.value.kind === "word" ? source.node.value.name : undefined;
  return typeof word === "string" && schema.variants.sets[word] ? word : undefined;
}

/** The part's main value: its override, else the written value (its tolerance recorded). */
function partValue(ctx: Elaboration, l: Located<PartStatement>, scope: Scope, schema: PartKindSchema, name: string, label: string, info: TargetInfo): number | undefined {
  const stmt = l.node;
  const what = `the value of ${label}`;
  const set = ctx.override(name, info);
  let value = set;
  const written = stmt.value;
  if (written) {
    const nominal = ctx.atPlace({ target: name, part: name }, () => {
      const v = ctx.number(written, info.expect, scope, l, what);
      if ((written.kind === "number" || written.kind === "paren") && written.tolerance) {
        ctx.addTolerance(name, v, ctx.tolerance(written.tolerance, info.expect, scope, l, what), spanIn(l, written.span), info.expect.unit);
      }
      return v;
    });
    value = set ?? nominal;
  }
  const vs = schema.value!;
  if (value === undefined && vs.required) {
    raise("missing-value", `${label} needs a value (${vs.summary} in ${vs.unit === "1" ? "plain numbers" : vs.unit})`, spanIn(l, stmt.span), {
      hint: `write the value after the ${schema.pins.length} nodes, e.g. ${stmt.partKind} ${stmt.name} ${stmt.pins.map((p) => p.name).join(" ")} 10${vs.unit === "1" ? "" : "k"}`,
    });
  }
  if (value !== undefined) checkRange(value, info.range!, vs.unit, what, spanIn(l, (stmt.value ?? stmt).span), `the value is the ${vs.summary}`);
  return value;
}

/** Converts the merged options, applies overrides, fills defaults and checks ranges. */
function partOptions(
  ctx: Elaboration,
  name: string,
  label: string,
  merged: ReadonlyMap<string, OptionSource>,
  allowed: Record<string, OptionSchema>,
  variantOptions: Readonly<Record<string, OptionSchema>>,
  variantText: string,
  span: SourceSpan,
): Record<string, OptionValue> {
  const options: Record<string, OptionValue> = {};
  for (const [key, source] of merged) {
    const option = allowed[key];
    if (!option) continue;
    const info = targetOf(option);
    const set = info ? ctx.override(`${name}.${key}`, info) : undefined;
    if ("fixed" in source) {
      options[key] = set ?? source.fixed;
      continue;
    }
    const { node, site } = source;
    const v = node.value;
    if (!info) {
      options[key] = ctx.atPlace({ target: `${name}.${key}`, part: name }, () => convertOption(ctx, key, option, v, site));
      continue;
    }
    const what = `${key}= of ${label}`;
    const target = `${name}.${key}`;
    const nominal = ctx.atPlace({ target, part: name }, () => {
      const n = ctx.number(v, info.expect, site.scope, site.where, what);
      if ((v.kind === "number" || v.kind === "paren") && v.tolerance) {
        ctx.addTolerance(target, n, ctx.tolerance(v.tolerance, info.expect, site.scope, site.where, what), spanIn(site.where, v.span), info.expect.unit);
      }
      return n;
    });
    options[key] = set ?? nominal;
  }
  for (const [key, option] of Object.entries(allowed)) {
    if (key in options) continue;
    const info = targetOf(option);
    const set = info ? ctx.override(`${name}.${key}`, info) : undefined;
    if (set !== undefined) options[key] = set;
    else if ((option.type === "number" || option.type === "word") && option.default !== undefined) options[key] = option.default;
    else if (variantOptions[key] && option.type !== "name") {
      // An option of the chosen wave without a default is required (sine amp=, freq=, …).
      raise("missing-option", `${label} with ${variantText} needs ${key}=`, span, { hint: `${key}= is the ${option.summary}` });
    }
  }
  for (const [key, option] of Object.entries(allowed)) {
    const info = targetOf(option);
    const v = options[key];
    if (!info || typeof v !== "number" || option.type !== "number") continue;
    const source = merged.get(key);
    const where = source && !("fixed" in source) ? spanIn(source.site.where, source.node.value.span) : span;
    checkRange(v, info.range!, option.unit, `${key}= of ${label}`, where, `${key}= is the ${option.summary}`);
  }
  return options;
}

/**
 * Elaborates one part line: nodes resolved in its scope, value and options evaluated and checked
 * against the kind's schema (preset merged under the written options, defaults filled in),
 * overrides applied, tolerances recorded, then the device model's own checks.
 */
export function elaboratePart(ctx: Elaboration, l: Located<PartStatement>, scope: Scope, failedPresets: ReadonlySet<string>): void {
  const stmt = l.node;
  const schema = partKinds[stmt.partKind]!;
  const name = scope.prefix + stmt.name;
  const label = `${schema.kind} ${name}`;
  const span = spanIn(l, stmt.span);
  const nodes = stmt.pins.map((p) => scope.node(p.name));
  // Recorded first, so probes and --set still resolve when this part has a problem.
  for (const n of nodes) ctx.nodes.add(n);
  ctx.partKindsByName.set(name, schema.kind);
  const site: ValueSite = { where: l, scope, label };

  const written = new Map<string, OptionNode>();
  for (const o of stmt.options) {
    if (written.has(o.key)) raise("duplicate-option", `${o.key}= is given twice on ${label}`, spanIn(l, o.keySpan), { hint: "keep one of them" });
    written.set(o.key, o);
  }
  const { merged, preset } = mergeOptions(ctx, schema, written, site, failedPresets);
  const variant = variantOf(schema, merged);
  const allowed = allowedOptions(schema, variant);
  for (const [key, source] of merged) if (!allowed[key] && !("fixed" in source)) unknownOption(key, schema, allowed, label, source.site, source.node.keySpan);

  const valueInfo: TargetInfo | undefined = schema.value
    ? { expect: { unit: schema.value.unit }, range: { min: schema.value.min, minExclusive: schema.value.minExclusive }, summary: schema.value.summary }
    : undefined;
  if (valueInfo) ctx.registerTarget(name, valueInfo);
  for (const [key, option] of Object.entries(allowed)) {
    const info = targetOf(option);
    if (info) ctx.registerTarget(`${name}.${key}`, info);
  }

  const value = valueInfo ? partValue(ctx, l, scope, schema, name, label, valueInfo) : undefined;
  if (variant && stmt.value) {
    raise("conflicting-options", `${label} has both a DC value and ${schema.variants!.key}=${variant}`, spanIn(l, stmt.value.span), {
      hint: `remove the value, or remove ${schema.variants!.key}= for a DC source`,
    });
  }
  const variantOptions = variant ? schema.variants!.sets[variant]! : {};
  const options = partOptions(ctx, name, label, merged, allowed, variantOptions, `${schema.variants?.key}=${variant}`, span);
  if (preset) options.preset = preset;

  const part: PartSpec = value === undefined ? { kind: schema.kind, name, nodes, options, span } : { kind: schema.kind, name, nodes, value, options, span };
  const model = deviceModels[schema.kind];
  if (model?.validate) {
    try {
      model.validate(part);
    } catch (e) {
      if (!isOnsetError(e)) throw e;
      const d = e.diagnostic;
      raise(d.code, d.message, d.span ?? span, { ...(d.hint === undefined ? {} : { hint: d.hint }), ...(d.notes === undefined ? {} : { notes: d.notes }) });
    }
  }
  ctx.parts.push(part);
}
