import {
  analysisModel,
  analysisModels,
  didYouMean,
  partKinds,
  type AnalysisChecks,
  type AnalysisOption as CoreAnalysisOption,
  type AnalysisOptions,
  type AnalysisSpec,
  type OptionPlace,
  type Probe,
  type SimulatingKind,
  type SourceSpan,
  type SpecCriterion,
  type SpecMetric,
  type UnitSymbol,
} from "@onset/core";
import { problem, raise } from "../errors.js";
import type { AnalysisStatement, CriterionNode, OptionNode, SpecStatement, Value } from "../syntax.js";
import type { Elaboration } from "./context.js";
import { checkRange, type NumberExpectation } from "./value-checks.js";
import { spanIn, type Located } from "./index-program.js";
import { probeOf, probesOf } from "./probes.js";
import type { Scope } from "./scope.js";

/** What an analysis option takes (core's schema: `AnalysisOption`). */
export type AnalysisOption = CoreAnalysisOption;

/** The options of the studies, which the language runs itself (the simulating analyses declare theirs in core). */
const studyOptions: Readonly<Record<"sweep" | "tolerance", AnalysisOptions>> = {
  sweep: {
    from: { type: "number", unit: "1", required: true, summary: "first value (in the target's unit)" },
    to: { type: "number", unit: "1", required: true, summary: "last value (in the target's unit)" },
    steps: { type: "number", unit: "1", min: 2, integer: true, summary: "number of values, both ends included" },
    step: { type: "number", unit: "1", min: 0, minExclusive: true, summary: "increment between values" },
    measure: { type: "word", words: ["startup", "steady"], summary: "what each setting measures: the file's analyses with its start-up run, or its periodic steady state" },
  },
  tolerance: {
    runs: { type: "number", unit: "1", min: 1, integer: true, required: true, summary: "number of Monte Carlo samples" },
    seed: { type: "number", unit: "1", min: 0, integer: true, summary: "seed of the samples" },
    dist: { type: "word", words: ["normal", "uniform"], summary: "distribution of each toleranced value" },
    measure: { type: "word", words: ["startup", "steady"], summary: "what each sample measures: its start-up run, or its periodic steady state" },
  },
};

/** The options of every analysis statement: each simulating analysis's own (core's `analysisModels`), then the studies'. */
export const analysisOptions: Readonly<Record<AnalysisStatement["analysis"], AnalysisOptions>> = {
  ...(Object.fromEntries(Object.entries(analysisModels).map(([keyword, model]) => [keyword, model.options])) as Record<SimulatingKind, AnalysisOptions>),
  ...studyOptions,
};

/** Spec metrics as written, with what they read and their unit (`V` metrics also take `A`). */
export const specMetrics: Readonly<Record<string, { readonly metric: SpecMetric; readonly unit: UnitSymbol }>> = {
  frequency: { metric: "frequency", unit: "Hz" },
  amplitude: { metric: "amplitude", unit: "V" },
  thd: { metric: "thd", unit: "1" },
  startup: { metric: "startup", unit: "s" },
  settling: { metric: "settling", unit: "s" },
  offset: { metric: "offset", unit: "V" },
  rms: { metric: "rms", unit: "V" },
  "peak-to-peak": { metric: "peakToPeak", unit: "V" },
  yield: { metric: "yield", unit: "1" },
};

type Parsed = { num: Record<string, number>; word: Record<string, string>; probe: Record<string, Probe>; probes: Record<string, Probe[]>; given: Map<string, OptionNode> };

function noTolerance(l: Located<unknown>, value: Value, what: string): void {
  if ((value.kind === "number" || value.kind === "paren") && value.tolerance) {
    raise("tolerance-here", `${what} cannot have a tolerance`, spanIn(l, value.tolerance.span), { hint: "tolerances go on part values, part options and parameters" });
  }
}

/**
 * `--set startup.accuracy=1e-6`: every number option of an analysis is also an override target
 * `KEYWORD.option`, whose value wins over the written one (in every statement of that kind).
 */
function setFromOverrides(ctx: Elaboration, analysis: string, table: Readonly<Record<string, AnalysisOption>>, out: Parsed): void {
  for (const [key, option] of Object.entries(table)) {
    if (option.type !== "number") continue;
    const target = `${analysis}.${key}`;
    const info = { expect: { unit: option.unit }, range: option, summary: option.summary };
    ctx.registerTarget(target, info);
    const set = ctx.override(target, info);
    if (set === undefined) continue;
    checkRange(set, option, option.unit, `the value set for ${target}`, undefined, `${key}= is the ${option.summary}`);
    out.num[key] = set;
    delete out.word[key];
  }
}

function readOptions(ctx: Elaboration, l: Located<AnalysisStatement>, globals: Scope, expectOf: (key: string) => NumberExpectation | undefined): Parsed {
  const stmt = l.node;
  const table = analysisOptions[stmt.analysis];
  const out: Parsed = { num: {}, word: {}, probe: {}, probes: {}, given: new Map() };
  for (const arg of stmt.args) {
    if (arg.kind === "flag") {
      if (stmt.analysis === "sweep" && arg.name === "log") continue;
      raise("unknown-option", `${stmt.analysis} has no flag '${arg.name}'${stmt.analysis === "sweep" ? didYouMean(arg.name, ["log"]) : ""}`, spanIn(l, arg.span), {
        hint: stmt.analysis === "sweep" ? "the only flag of sweep is log" : `options of ${stmt.analysis} are written key=value`,
      });
    }
    const option = table[arg.key];
    const keys = Object.keys(table);
    if (!option) {
      raise("unknown-option", `${stmt.analysis} has no option '${arg.key}='${didYouMean(arg.key, keys)}`, spanIn(l, arg.keySpan), {
        hint: keys.length > 0 ? `options of ${stmt.analysis}: ${keys.map((k) => `${k}=`).join(" ")}` : `${stmt.analysis} takes no options`,
      });
    }
    if (out.given.has(arg.key)) raise("duplicate-option", `${arg.key}= is given twice on ${stmt.analysis}`, spanIn(l, arg.keySpan), { hint: "keep one of them" });
    out.given.set(arg.key, arg);
    const what = `${arg.key}= of ${stmt.analysis}`;
    noTolerance(l, arg.value, what);
    switch (option.type) {
      case "number": {
        if (option.words && arg.value.kind === "word" && option.words.includes(arg.value.name)) {
          out.word[arg.key] = arg.value.name;
          break;
        }
        const expect = expectOf(arg.key) ?? { unit: option.unit };
        const v = ctx.number(arg.value, expect, globals, l, what);
        checkRange(v, option, expect.unit, what, spanIn(l, arg.value.span), `${arg.key}= is the ${option.summary}`);
        out.num[arg.key] = v;
        break;
      }
      case "word":
        if (arg.value.kind !== "word" || !option.words.includes(arg.value.name)) {
          const text = l.text.slice(arg.value.span.start, arg.value.span.end);
          raise("bad-word", `${arg.key}=${text} is not a choice for ${stmt.analysis}${didYouMean(text, option.words)}`, spanIn(l, arg.value.span), {
            hint: `${arg.key}= is one of ${option.words.join(", ")}`,
          });
        }
        out.word[arg.key] = arg.value.name;
        break;
      case "probe":
        out.probe[arg.key] = probeOf(ctx, l, arg.value);
        break;
      case "probes":
        out.probes[arg.key] = probesOf(ctx, l, arg.value);
        break;
      case "source": {
        const v = arg.value;
        if (v.kind !== "word") raise("expected-word", `${what} takes the name of a source`, spanIn(l, v.span), { hint: "write e.g. from=Vin" });
        const kind = ctx.partKindsByName.get(v.name);
        if (kind === undefined) {
          raise("unknown-part", `unknown part '${v.name}'${didYouMean(v.name, ctx.partKindsByName.keys())}`, spanIn(l, v.span), { hint: "from= names a vsource or isource of the circuit" });
        }
        if (kind !== "vsource" && kind !== "isource") {
          raise("not-a-source", `${what} must name a vsource or isource, but ${v.name} is a ${kind}`, spanIn(l, v.span), { hint: "add a source where the small signal enters" });
        }
        out.word[arg.key] = v.name;
        break;
      }
    }
  }
  setFromOverrides(ctx, stmt.analysis, table, out);
  for (const [key, option] of Object.entries(table)) {
    if (option.required && !out.given.has(key)) {
      raise("missing-option", `${stmt.analysis} needs ${key}=`, spanIn(l, stmt.keywordSpan), { hint: `${key}= is the ${option.summary}` });
    }
  }
  return out;
}

function withSpan<T extends object>(spec: T, span: SourceSpan, l?: Located<AnalysisStatement>, o?: Parsed): T & { span: SourceSpan } {
  if (!l || !o || o.given.size === 0) return { ...spec, span };
  return { ...spec, span, optionSpans: optionSpansOf(l, o) };
}

/** Where each written option's value is, by its key. */
function optionSpansOf(l: Located<AnalysisStatement>, o: Parsed): Record<string, SourceSpan> {
  const spans: Record<string, SourceSpan> = {};
  for (const [key, arg] of o.given) spans[key] = spanIn(l, arg.value.span);
  return spans;
}

/** Cross-option rules of an analysis model, reported on the option's key or value (on the keyword when it was set from outside the file). */
function checksOn(ctx: Elaboration, l: Located<AnalysisStatement>, o: Parsed): AnalysisChecks {
  const at = (option: string, place: OptionPlace): SourceSpan => {
    const node = o.given.get(option);
    return spanIn(l, node === undefined ? l.node.keywordSpan : place === "key" ? node.keySpan : node.value.span);
  };
  return {
    fail: (option, place, code, message, hint) => raise(code, message, at(option, place), { hint }),
    warn: (option, place, code, message, hint) => {
      ctx.diagnostics.push(problem(code, message, at(option, place), { severity: "warning", hint }));
    },
  };
}

/** Elaborates one analysis statement into its AnalysisSpec. */
export function elaborateAnalysis(ctx: Elaboration, l: Located<AnalysisStatement | SpecStatement>, globals: Scope): AnalysisSpec {
  const span = spanIn(l, l.node.span);
  if (l.node.kind === "spec") return withSpan({ kind: "spec" as const, criteria: l.node.criteria.map((c) => criterion(ctx, l as Located<SpecStatement>, c, globals)) }, span);
  const stmt = l.node;
  const a = l as Located<AnalysisStatement>;
  if (stmt.analysis === "sweep") return sweep(ctx, a, globals, span);
  const o = readOptions(ctx, a, globals, () => undefined);
  if (stmt.analysis === "tolerance") {
    const measure = o.word.measure === "steady" ? { measure: "steady" as const } : {};
    return withSpan({ kind: "tolerance" as const, runs: o.num.runs!, seed: o.num.seed ?? 1, dist: (o.word.dist ?? "normal") as "normal" | "uniform", ...measure }, span, a, o);
  }
  const partStates = new Set(ctx.parts.flatMap((p) => Object.keys(partKinds[p.kind]?.states ?? {})));
  const values = { numbers: o.num, words: o.word, probes: o.probe, probeLists: o.probes, written: new Set(o.given.keys()), partStates, spans: optionSpansOf(a, o) };
  return withSpan(analysisModel(stmt.analysis)!.build(values, checksOn(ctx, a, o)), span, a, o);
}

function sweep(ctx: Elaboration, l: Located<AnalysisStatement>, globals: Scope, span: SourceSpan): AnalysisSpec {
  const target = l.node.target!;
  const info = ctx.targets.get(target.name);
  if (!info) {
    raise("unknown-target", `cannot sweep '${target.name}': no parameter, part value or part option has that name${didYouMean(target.name, ctx.targets.keys())}`, spanIn(l, target.span), {
      hint: "sweep a parameter (R), a part's value (Ra), a part option (P1.at) or an instance parameter (N1.R)",
    });
  }
  const o = readOptions(ctx, l, globals, (key) => (key === "from" || key === "to" ? info.expect : undefined));
  const log = l.node.args.some((a) => a.kind === "flag" && a.name === "log");
  const { from, to, steps, step } = o.num;
  if (steps === undefined && step === undefined) raise("missing-option", "sweep needs steps= or step=", spanIn(l, l.node.keywordSpan), { hint: "steps= counts the values (both ends included); step= is the increment" });
  if (steps !== undefined && step !== undefined) raise("conflicting-options", "sweep takes steps= or step=, not both", spanIn(l, o.given.get("step")!.span), { hint: "keep one of them" });
  if (log && step !== undefined) raise("conflicting-options", "a log sweep takes steps=, not step=", spanIn(l, o.given.get("step")!.span), { hint: "write steps= (values spaced evenly on a log scale)" });
  if (log && !(from! > 0 && to! > 0)) raise("out-of-range", "a log sweep needs from= and to= above 0", spanIn(l, o.given.get(from! > 0 ? "to" : "from")!.value.span), { hint: "remove log, or sweep positive values" });
  for (const key of ["from", "to"] as const) {
    const v = o.num[key]!;
    const hint = info.summary === undefined ? undefined : `${target.name} is the ${info.summary}`;
    if (info.range) checkRange(v, info.range, info.expect.unit, `${key}= of sweep ${target.name}`, spanIn(l, o.given.get(key)!.value.span), hint);
  }
  return withSpan(
    {
      kind: "sweep" as const,
      target: target.name,
      from: from!,
      to: to!,
      ...(steps === undefined ? {} : { steps }),
      ...(step === undefined ? {} : { step }),
      log,
      ...(o.word.measure === "steady" ? { measure: "steady" as const } : {}),
    },
    span,
    l,
    o,
  );
}

function criterion(ctx: Elaboration, l: Located<SpecStatement>, c: CriterionNode, globals: Scope): SpecCriterion {
  const at = spanIn(l, c.span);
  const text = l.text.slice(c.span.start, c.span.end);
  const def = specMetrics[c.metric];
  if (!def) {
    raise("unknown-metric", `unknown spec metric '${c.metric}'${didYouMean(c.metric, Object.keys(specMetrics))}`, spanIn(l, c.metricSpan), {
      hint: `metrics are ${Object.keys(specMetrics).join(", ")}`,
    });
  }
  const expectFor = (v: Value): NumberExpectation => {
    const sym = v.kind === "number" ? v.literal.symbol : undefined;
    return { unit: def.unit === "V" && sym === "A" ? "A" : def.unit };
  };
  const what = `the ${c.metric} limit`;
  const num = (v: Value) => ctx.number(v, expectFor(v), globals, l, what);
  const tol = (v: Value) => ((v.kind === "number" || v.kind === "paren") && v.tolerance ? v.tolerance : undefined);
  if (c.op === "<" || c.op === ">") {
    if (tol(c.value)) raise("tolerance-here", `${c.metric}${c.op}… takes a plain limit, not a tolerance`, spanIn(l, tol(c.value)!.span), { hint: `write ${c.metric}=value±band for a band` });
    return { metric: def.metric, test: c.op === "<" ? "below" : "above", limit: num(c.value), text, span: at };
  }
  if (c.high) {
    if (tol(c.value) || tol(c.high)) raise("tolerance-here", "a range low..high takes plain limits", at, { hint: `write ${c.metric}=low..high` });
    const low = num(c.value);
    const high = num(c.high);
    if (!(low <= high)) raise("bad-range", `the range of ${c.metric} runs backwards (${text})`, at, { hint: "write the lower limit first" });
    return { metric: def.metric, test: "within", low, high, text, span: at };
  }
  const band = tol(c.value);
  if (!band) {
    raise("spec-form", `${c.metric}=… needs a band`, at, { hint: `write ${c.metric}=value±tolerance or ${c.metric}=low..high, or use < or >` });
  }
  const center = num(c.value);
  const b = ctx.tolerance(band, expectFor(c.value), globals, l, what);
  const half = "relative" in b ? Math.abs(center) * b.relative : b.absolute;
  return { metric: def.metric, test: "within", low: center - half, high: center + half, text, span: at };
}
