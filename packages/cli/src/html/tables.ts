import type { Json } from "../json/results.js";
import { escapeHtml, tag, textTag } from "./markup.js";

/** A JSON object's field as a number, or null. */
export function num(doc: Json | undefined, key: string): number | null {
  const v = field(doc, key);
  return typeof v === "number" ? v : null;
}

/** A JSON object's field as text, or null. */
export function str(doc: Json | undefined, key: string): string | null {
  const v = field(doc, key);
  return typeof v === "string" ? v : null;
}

/** A JSON object's field as a list (empty when absent). */
export function list(doc: Json | undefined, key: string): readonly Json[] {
  const v = field(doc, key);
  return Array.isArray(v) ? (v as readonly Json[]) : [];
}

/** A JSON object's field, or undefined. */
export function field(doc: Json | undefined, key: string): Json | undefined {
  if (doc === null || doc === undefined || typeof doc !== "object" || Array.isArray(doc)) return undefined;
  return (doc as { readonly [k: string]: Json | undefined })[key];
}

/** A cell: text, or markup already built (`{ html }`), right-aligned when numeric. */
export type Cell = string | { readonly html: string };

const cellMarkup = (c: Cell): string => (typeof c === "string" ? escapeHtml(c) : c.html);

/** A table of label–value rows (the metrics of one analysis). */
export function pairsTable(rows: readonly (readonly [string, Cell])[]): string {
  return tag("table", { class: "pairs" }, tag("tbody", {}, rows.map(([label, value]) => tag("tr", {}, textTag("th", { scope: "row" }, label) + tag("td", {}, cellMarkup(value)))).join("")));
}

/** A table with a header row; `numeric[i]` right-aligns column i. */
export function dataTable(headers: readonly string[], rows: readonly (readonly Cell[])[], numeric: readonly boolean[] = [], caption?: string): string {
  const cls = (i: number) => (numeric[i] ? "num" : undefined);
  const head = tag("thead", {}, tag("tr", {}, headers.map((h, i) => textTag("th", { scope: "col", class: cls(i) }, h)).join("")));
  const body = tag("tbody", {}, rows.map((r) => tag("tr", {}, r.map((c, i) => tag("td", { class: cls(i) }, cellMarkup(c))).join(""))).join(""));
  return tag("table", { class: "data" }, (caption === undefined ? "" : textTag("caption", {}, caption)) + head + body);
}

/** A pass/fail word styled by its outcome. */
export function outcomeCell(pass: boolean, yes = "pass", no = "FAIL"): Cell {
  return { html: textTag("span", { class: pass ? "good" : "bad" }, pass ? yes : no) };
}
