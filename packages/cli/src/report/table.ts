/** A column of a text table: its header and how its cells line up. */
export interface Column {
  readonly header: string;
  /** Numbers read best right-aligned; names left-aligned. @defaultValue "left" */
  readonly align?: "left" | "right";
}

// Colour codes take no room on screen.
const width = (text: string) => [...text.replace(/\u001b\[[0-9;]*m/g, "")].length;

/**
 * Lines of a plain-text table: a header row, then the rows, columns separated by two spaces
 * and as wide as their widest cell. Trailing spaces are trimmed.
 */
export function table(columns: readonly Column[], rows: readonly (readonly string[])[], indent = "  "): string[] {
  const widths = columns.map((c, i) => Math.max(width(c.header), ...rows.map((r) => width(r[i] ?? ""))));
  const line = (cells: readonly string[], header: boolean) =>
    indent +
    columns
      .map((c, i) => {
        const cell = cells[i] ?? "";
        const pad = " ".repeat(widths[i]! - width(cell));
        return c.align === "right" && !header ? pad + cell : cell + pad;
      })
      .join("  ")
      .trimEnd();
  return [line(columns.map((c) => c.header), true), ...rows.map((r) => line(r, false))];
}

/** Lines of `label  value` pairs with the labels padded to one width. */
export function pairs(entries: readonly (readonly [string, string])[], indent = "  "): string[] {
  const labelWidth = Math.max(0, ...entries.map(([label]) => width(label)));
  return entries.map(([label, value]) => `${indent}${label}${" ".repeat(labelWidth - width(label))}  ${value}`.trimEnd());
}
