import { cubicOnInterval, cubicScratch, cubicValue, intervalAt } from "./local-cubic.js";

/**
 * Fills `out` with the local cubic of (`t`, `v`) at the uniform times `start + m·step`
 * (computed that way rather than accumulated, so long grids do not drift). Each interval's cubic
 * is built once however many output points fall in it. Times outside the record extrapolate the
 * end cubics; callers keep the grid inside.
 */
export function resampleUniform(
  t: Float64Array,
  v: Float64Array,
  start: number,
  step: number,
  out: Float64Array,
): void {
  const c = cubicScratch();
  const lastInterval = t.length - 2;
  let i = intervalAt(t, start);
  cubicOnInterval(t, v, i, c);
  let t0 = t[i];
  let h = t[i + 1] - t0;
  for (let m = 0; m < out.length; m++) {
    const time = start + m * step;
    if (time > t[i + 1] && i < lastInterval) {
      while (i < lastInterval && time > t[i + 1]) i++;
      cubicOnInterval(t, v, i, c);
      t0 = t[i];
      h = t[i + 1] - t0;
    }
    out[m] = cubicValue(c, (time - t0) / h);
  }
}
