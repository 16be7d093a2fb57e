import type { AnalysisSpec, Circuit, Diagnostic } from "@onset/core";
import { hasErrors } from "../errors.js";
import type { Program } from "../syntax.js";
import { elaborateAnalysis } from "./analyses.js";
import { Elaboration, type Overrides } from "./context.js";
import { indexProgram } from "./index-program.js";
import { elaborateScope } from "./instances.js";
import { checkPreset } from "./presets.js";
import { Scope } from "./scope.js";
import { sharedDrawWarnings } from "./shared-draws.js";
import { useNestingProblem } from "./use-nesting.js";
import { capPerFile } from "../diagnostic-cap.js";
import { limitsOfProgram } from "../program-limits.js";
import type { SourceLimits } from "../source-limits.js";

/** The full state after elaborating, for the checker and `overrideTargets`. */
export function runElaboration(program: Program, overrides: Overrides, given?: SourceLimits): { ctx: Elaboration; analyses: AnalysisSpec[] } {
  const index = indexProgram(program);
  const limits = limitsOfProgram(program, given);
  const ctx = new Elaboration(index, overrides, limits.maxParameterDepth);
  ctx.diagnostics.push(...index.diagnostics);
  // Flattening recurses once per level of use lines: their depth (and the parts they make) is checked first, without recursion.
  const nesting = useNestingProblem(index, limits);
  if (nesting) {
    ctx.diagnostics.push(nesting);
    return { ctx, analyses: [] };
  }
  const globals = new Scope(undefined, "");
  const failedPresets = new Set<string>();
  for (const [name, preset] of index.presets) if (!checkPreset(ctx, preset, globals)) failedPresets.add(name);
  elaborateScope(ctx, globals, globals, index.statements, failedPresets, []);
  const analyses: AnalysisSpec[] = [];
  for (const a of index.analyses) {
    const spec = ctx.attempt(() => elaborateAnalysis(ctx, a, globals));
    if (spec) analyses.push(spec);
  }
  ctx.diagnostics.push(...ctx.unusedOverrides(), ...sharedDrawWarnings(ctx, analyses));
  return { ctx, analyses };
}

/**
 * Elaborates a program into the engine's circuit model: blocks flattened into hierarchical
 * names, expressions evaluated, options checked and defaulted, presets merged, overrides applied
 * by name and tolerances kept for Monte Carlo. The circuit is undefined when any error is found.
 * Cheap to repeat with different overrides on the same program (the index is cached).
 */
export function elaborate(program: Program, options: { overrides?: Overrides; limits?: SourceLimits } = {}): { circuit: Circuit | undefined; diagnostics: Diagnostic[] } {
  const { ctx, analyses } = runElaboration(program, options.overrides ?? {}, options.limits);
  const diagnostics = capPerFile(ctx.diagnostics, limitsOfProgram(program, options.limits).maxDiagnostics);
  if (hasErrors(diagnostics)) return { circuit: undefined, diagnostics };
  const title = ctx.index.title?.node.text;
  const circuit: Circuit = {
    ...(title === undefined ? {} : { title }),
    parts: ctx.parts,
    analyses,
    tolerances: ctx.toleranceSpecs(),
  };
  return { circuit, diagnostics };
}

/** Every name `--set` and `sweep` accept: parameters, part values, numeric part options, instance parameters. */
export function overrideTargets(program: Program): string[] {
  return [...runElaboration(program, {}).ctx.targets.keys()];
}
