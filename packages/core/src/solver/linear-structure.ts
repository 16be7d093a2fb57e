import type { MnaSystem } from "./system.js";

/**
 * The entries G + a·C + gmin can have: those of G and C and every diagonal, in row-major order,
 * with the G and C values at each. Built once per circuit; everything about the constant part
 * of the Newton matrix is indexed by these entries.
 */
export interface LinearStructure {
  readonly rows: Int32Array;
  readonly cols: Int32Array;
  /** Row i's entries are rowStart[i] .. rowStart[i+1] − 1. */
  readonly rowStart: Int32Array;
  readonly g: Float64Array;
  readonly c: Float64Array;
  /** The diagonal entries of node rows (where gmin goes). */
  readonly nodeDiagonals: Int32Array;
  /** Entry of (row, col), or undefined. */
  entryOf(row: number, col: number): number | undefined;
}

export function linearStructureOf(system: MnaSystem): LinearStructure {
  const n = system.n;
  const key = (row: number, col: number) => row * n + col;
  const g = new Map<number, number>();
  const c = new Map<number, number>();
  const { gTriplets: gt, cTriplets: ct } = system;
  for (let k = 0; k < gt.rows.length; k++) g.set(key(gt.rows[k]!, gt.cols[k]!), gt.values[k]!);
  for (let k = 0; k < ct.rows.length; k++) c.set(key(ct.rows[k]!, ct.cols[k]!), ct.values[k]!);
  const keys = new Set<number>([...g.keys(), ...c.keys()]);
  for (let i = 0; i < n; i++) keys.add(key(i, i));
  const sorted = Float64Array.from(keys).sort();
  const index = new Map<number, number>();
  sorted.forEach((k, e) => index.set(k, e));
  const rows = Int32Array.from(sorted, (k) => Math.floor(k / n));
  const cols = Int32Array.from(sorted, (k) => k % n);
  const rowStart = new Int32Array(n + 1);
  for (const row of rows) rowStart[row + 1]++;
  for (let i = 0; i < n; i++) rowStart[i + 1] += rowStart[i]!;
  const diagonals: number[] = [];
  system.unknowns.forEach((u, i) => {
    if (u.isNode) diagonals.push(index.get(key(i, i))!);
  });
  return {
    rows,
    cols,
    rowStart,
    g: Float64Array.from(sorted, (k) => g.get(k) ?? 0),
    c: Float64Array.from(sorted, (k) => c.get(k) ?? 0),
    nodeDiagonals: Int32Array.from(diagonals),
    entryOf: (row, col) => index.get(key(row, col)),
  };
}
