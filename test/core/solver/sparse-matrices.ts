import fc from "fast-check";

/** A random sparse n×n matrix with a dominant diagonal, its rows shuffled, and a pattern that covers it. */
export interface SparseCase {
  readonly n: number;
  readonly a: Float64Array;
  readonly pattern: Uint8Array;
  readonly b: Float64Array;
}

export const sparseCase: fc.Arbitrary<SparseCase> = fc.integer({ min: 1, max: 14 }).chain((n) =>
  fc
    .tuple(
      fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n * n, maxLength: n * n }),
      fc.array(fc.integer({ min: 0, max: 9 }), { minLength: n * n, maxLength: n * n }),
      fc.array(fc.boolean(), { minLength: n, maxLength: n }),
      fc.array(fc.double({ min: -10, max: 10, noNaN: true }), { minLength: n, maxLength: n }),
      fc.integer({ min: 0, max: n - 1 }),
    )
    .map(([entries, kinds, signs, b, shift]) => {
      const a = new Float64Array(n * n);
      const pattern = new Uint8Array(n * n);
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          const k = i * n + j;
          if (i === j) {
            a[k] = (signs[i] ? 1 : -1) * (n + 1 + Math.abs(entries[k]!));
            pattern[k] = 1;
          } else if (kinds[k]! < 3) {
            a[k] = entries[k]!; // a nonzero
            pattern[k] = 1;
          } else if (kinds[k] === 3) {
            pattern[k] = 1; // a structural zero
          }
        }
      }
      // Rotate the rows so the pivots are off the diagonal.
      const rotated = new Float64Array(n * n);
      const rotatedPattern = new Uint8Array(n * n);
      for (let i = 0; i < n; i++) {
        const from = ((i + shift) % n) * n;
        rotated.set(a.subarray(from, from + n), i * n);
        rotatedPattern.set(pattern.subarray(from, from + n), i * n);
      }
      return { n, a: rotated, pattern: rotatedPattern, b: Float64Array.from(b) };
    }),
);

/** ‖A·x − b‖∞ and the scale ‖|A|·|x|‖∞ + ‖b‖∞ it is judged against. */
export function residual(n: number, a: Float64Array, x: Float64Array, b: Float64Array): { worst: number; scale: number } {
  let worst = 0;
  let scale = 0;
  for (let i = 0; i < n; i++) {
    let s = -b[i]!;
    let row = Math.abs(b[i]!);
    for (let j = 0; j < n; j++) {
      s += a[i * n + j]! * x[j]!;
      row += Math.abs(a[i * n + j]! * x[j]!);
    }
    worst = Math.max(worst, Math.abs(s));
    scale = Math.max(scale, row);
  }
  return { worst, scale };
}

/** The pattern's entries of a row-major matrix as (row, col, value) lists, in an order given by `shuffle` (a rotation). */
export function entriesOf(n: number, a: Float64Array, pattern: Uint8Array, shuffle = 0): { rows: Int32Array; cols: Int32Array; values: Float64Array } {
  const at: number[] = [];
  for (let k = 0; k < n * n; k++) if (pattern[k]) at.push(k);
  const s = at.length === 0 ? 0 : shuffle % at.length;
  const order = [...at.slice(s), ...at.slice(0, s)];
  return {
    rows: Int32Array.from(order, (k) => Math.floor(k / n)),
    cols: Int32Array.from(order, (k) => k % n),
    values: Float64Array.from(order, (k) => a[k]!),
  };
}
