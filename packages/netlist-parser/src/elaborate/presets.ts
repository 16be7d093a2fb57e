import { didYouMean, builtinPresets, partKinds, type PartKindSchema } from "@onset/core";
import { AlreadyReported, raise } from "../errors.js";
import type { OptionNode, PresetStatement } from "../syntax.js";
import type { Elaboration } from "./context.js";
import { spanIn, type Located } from "./index-program.js";
import { allowedOptions, convertValue, unknownOption, type OptionSource } from "./option-schema.js";
import type { ValueSite } from "./option-values.js";
import type { Scope } from "./scope.js";

/** Checks a file preset once, so its problems are reported at the preset and not at every part. */
export function checkPreset(ctx: Elaboration, l: Located<PresetStatement>, globals: Scope): boolean {
  const preset = l.node;
  const schema = partKinds[preset.partKind]!;
  const site: ValueSite = { where: l, scope: globals, label: `preset ${preset.name}` };
  const ok = ctx.attempt(() => {
    const seen = new Set<string>();
    const variantNode = schema.variants ? preset.options.find((o) => o.key === schema.variants!.key) : undefined;
    const variant = variantNode?.value.kind === "word" ? variantNode.value.name : undefined;
    const allowed = allowedOptions(schema, variant && schema.variants?.sets[variant] ? variant : undefined);
    for (const o of preset.options) {
      if (seen.has(o.key)) raise("duplicate-option", `${o.key}= is given twice in preset ${preset.name}`, spanIn(l, o.keySpan), { hint: "keep one of them" });
      seen.add(o.key);
      if (o.key === "preset") raise("unknown-option", `preset ${preset.name} cannot itself use preset=`, spanIn(l, o.keySpan), { hint: "list the options in this preset instead" });
      const option = allowed[o.key];
      if (!option) unknownOption(o.key, schema, allowed, `preset ${preset.name} (${schema.kind})`, site, o.keySpan);
      convertValue(ctx, o.key, option, o.value, site);
    }
    if (builtinPresets[schema.kind]?.[preset.name]) {
      raise("duplicate-name", `preset '${preset.name}' is built in`, spanIn(l, preset.nameSpan), { hint: "give the file's preset another name" });
    }
    return true;
  });
  return ok === true;
}

/**
 * The option sources of a part: its preset's (file-defined first, else built-in), then its
 * written options on top. Returns the preset's name when one applies.
 */
export function mergeOptions(
  ctx: Elaboration,
  schema: PartKindSchema,
  written: ReadonlyMap<string, OptionNode>,
  site: ValueSite,
  failedPresets: ReadonlySet<string>,
): { merged: Map<string, OptionSource>; preset?: string } {
  const merged = new Map<string, OptionSource>();
  const presetNode = written.get("preset");
  let preset: string | undefined;
  if (presetNode && schema.options.preset?.type === "name") {
    const at = spanIn(site.where, presetNode.value.span);
    if (presetNode.value.kind !== "word") raise("expected-word", `preset= of ${site.label} takes a preset name`, at, { hint: "write e.g. preset=general" });
    preset = presetNode.value.name;
    const file = ctx.index.presets.get(preset);
    const builtin = builtinPresets[schema.kind]?.[preset];
    if (file) {
      if (file.node.partKind !== schema.kind) {
        raise("preset-kind", `preset ${preset} is for ${file.node.partKind} parts, not ${schema.kind}`, at, { hint: `use a preset defined for ${schema.kind} parts here` });
      }
      if (failedPresets.has(preset)) throw new AlreadyReported();
      // Presets are written at the top level: their expressions read the file's parameters.
      const presetSite: ValueSite = { where: file, scope: site.scope.parent ?? site.scope, label: site.label };
      for (const o of file.node.options) merged.set(o.key, { node: o, site: presetSite });
    } else if (builtin) {
      for (const [k, v] of Object.entries(builtin)) merged.set(k, { fixed: v });
    } else {
      const names = [...Object.keys(builtinPresets[schema.kind] ?? {}), ...[...ctx.index.presets.values()].filter((p) => p.node.partKind === schema.kind).map((p) => p.node.name)];
      raise("unknown-preset", `unknown preset '${preset}' for ${site.label}${didYouMean(preset, names)}`, at, {
        hint: names.length > 0 ? `presets for ${schema.kind}: ${names.join(", ")}` : `define one with: preset ${preset} ${schema.kind} key=value …`,
      });
    }
  }
  for (const [k, o] of written) if (k !== "preset" || !preset) merged.set(k, { node: o, site });
  return preset === undefined ? { merged } : { merged, preset };
}
