/** A CSV cell (RFC 4180): quoted when it holds a comma, a quote or a line break. */
export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A number as the shortest text that reads back to the same double; empty when absent or not finite. */
export function csvNumber(value: number | null | undefined): string {
  return value === null || value === undefined || !Number.isFinite(value) ? "" : String(value);
}

/** The error-bar columns of the settled figures (absolute, in each figure's unit). */
export const ERROR_COLUMNS = ["frequencyError", "amplitudeError", "rmsError", "thdError"] as const;

/** The cells of {@link ERROR_COLUMNS} for a result's `numericalError` (empty when it has none). */
export function errorCells(bars: { readonly frequency: number; readonly amplitude: number; readonly rms: number; readonly thd: number } | null | undefined): string[] {
  return [bars?.frequency, bars?.amplitude, bars?.rms, bars?.thd].map((v) => csvNumber(v));
}

/** A whole CSV document: the header row, then the rows, each line ended by CRLF-free `\n`. */
export function csvDocument(header: readonly string[], rows: Iterable<readonly string[]>): string {
  const lines = [header.map(csvField).join(",")];
  for (const row of rows) lines.push(row.join(","));
  return `${lines.join("\n")}\n`;
}
