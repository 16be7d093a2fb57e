// Prints rows of objects as an aligned plain-text table.
export function printTable(rows) {
  const keys = Object.keys(rows[0]);
  const width = keys.map((k) => Math.max(k.length, ...rows.map((r) => String(r[k]).length)));
  const line = (cells) => cells.map((c, i) => String(c).padStart(width[i])).join("  ");
  console.log(line(keys));
  console.log(width.map((w) => "-".repeat(w)).join("  "));
  for (const r of rows) console.log(line(keys.map((k) => r[k])));
}

/** Best of `repeat` wall times (ms) of `fn`, after one warm-up call. */
export function timeBest(fn, repeat = 3) {
  fn();
  let best = Infinity;
  let result;
  for (let i = 0; i < repeat; i++) {
    const t0 = performance.now();
    result = fn();
    best = Math.min(best, performance.now() - t0);
  }
  return { ms: best, result };
}
