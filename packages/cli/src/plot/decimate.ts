/**
 * Reduces a line, already in pixel coordinates, to what a screen can show: consecutive points
 * in the same pixel column keep only their first, lowest, highest and last point, in their
 * original order. The drawn shape is the same (every column still spans its full min…max and
 * joins its neighbours where the data did), but a million samples become a few per column.
 *
 * Non-finite coordinates end the current run, so the line is broken there. Each run is
 * returned as interleaved `x0, y0, x1, y1, …`.
 */
export function decimateColumns(xs: ArrayLike<number>, ys: ArrayLike<number>, columnWidth = 1): Float64Array[] {
  const runs: Float64Array[] = [];
  let run: number[] = [];
  let column = Number.NaN;
  let first = -1;
  let last = -1;
  let lowest = -1;
  let highest = -1;

  const flushColumn = (): void => {
    if (first < 0) return;
    const kept = [...new Set([first, lowest, highest, last])].sort((a, b) => a - b);
    for (const i of kept) run.push(xs[i] as number, ys[i] as number);
    first = -1;
  };
  const endRun = (): void => {
    flushColumn();
    if (run.length > 0) runs.push(Float64Array.from(run));
    run = [];
    column = Number.NaN;
  };

  const n = Math.min(xs.length, ys.length);
  for (let i = 0; i < n; i += 1) {
    const x = xs[i] as number;
    const y = ys[i] as number;
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      endRun();
      continue;
    }
    const c = Math.floor(x / columnWidth);
    if (c !== column || first < 0) {
      flushColumn();
      column = c;
      first = last = lowest = highest = i;
      continue;
    }
    last = i;
    if (y < (ys[lowest] as number)) lowest = i;
    if (y > (ys[highest] as number)) highest = i;
  }
  endRun();
  return runs;
}
