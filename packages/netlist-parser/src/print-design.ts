import { badArgument, type DesignedCriterion, type DesignedFile, type DesignedPart, type OptionValue } from "@onset/core";
import { formatText } from "./format.js";
import { formatSI } from "./format-number.js";
import { printString } from "./print.js";

function percent(fraction: number): string {
  return `${Number((fraction * 100).toPrecision(6))}%`;
}

function optionValue(v: OptionValue | number | string): string {
  if (typeof v === "number") return formatSI(v);
  if (typeof v === "string") return v;
  return `(${v.map((x) => (typeof x === "number" ? formatSI(x) : x)).join(", ")})`;
}

function partLine(p: DesignedPart): string {
  const value = p.value === undefined ? [] : [`${formatSI(p.value)}${p.tolerance ? `±${percent(p.tolerance)}` : ""}`];
  const options = Object.entries(p.options ?? {}).map(([k, v]) => `${k}=${optionValue(v)}`);
  return [p.kind, p.name, ...p.nodes, ...value, ...options].join(" ") + (p.comment ? `  # ${p.comment}` : "");
}

function criterion(c: DesignedCriterion): string {
  const value = c.percent ? percent(c.value) : formatSI(c.value);
  const op = c.test === "below" ? "<" : c.test === "above" ? ">" : "=";
  return `${c.metric}${op}${value}${c.test === "within" && c.tolerance !== undefined ? `±${percent(c.tolerance)}` : ""}`;
}

/**
 * A designed circuit (`designOscillator`'s `file`) in the language, in the formatter's
 * canonical layout: the header comments, the title, the parts, the analyses and the spec.
 */
export function printDesignedFile(file: DesignedFile): string {
  const lines = [
    ...file.header.map((h) => (h === "" ? "#" : `# ${h}`)),
    "",
    `title ${printString(file.title)}`,
    "",
    ...file.parts.map(partLine),
    "",
    ...file.analyses.map((a) => [a.keyword, ...(a.options ?? []).map(([k, v]) => `${k}=${optionValue(v)}`)].join(" ")),
    ...(file.spec.length > 0 ? [["spec", ...file.spec.map(criterion)].join(" ")] : []),
  ];
  const { text, diagnostics } = formatText(`${lines.join("\n")}\n`, "design.onset");
  // A file from designOscillator always parses; one made by hand may name what the language has no line for.
  if (text === undefined) throw badArgument(`printDesignedFile: the file does not print as circuit text: ${diagnostics.map((d) => d.message).join("; ")}`);
  return text;
}
