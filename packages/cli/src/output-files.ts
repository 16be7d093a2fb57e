import { extname } from "node:path";

/**
 * The name of the `k`-th file (0-based) written for an option given `path`: the first keeps the
 * name, later ones insert `-2`, `-3`, … before the extension (`plot.svg`, `plot-2.svg`).
 */
export function numberedPath(path: string, k: number): string {
  if (k === 0) return path;
  const ext = extname(path);
  const stem = ext === "" ? path : path.slice(0, -ext.length);
  return `${stem}-${k + 1}${ext}`;
}
