// Prints rows of objects as an aligned plain-text table.
export function printTable(rows) {
  const keys = Object.keys(rows[0]);
  const width = keys.map((k) => Math.max(k.length, ...rows.map((r) => String(r[k]).length)));
  const line = (cells) => cells.map((c, i) => String(c).padStart(width[i])).join("  ");
  console.log(line(keys));
  console.log(width.map((w) => "-".repeat(w)).join("  "));
  for (const r of rows) console.log(line(keys.map((k) => r[k])));
}

/** Best and median of `repeat` wall times (ms) of `fn`, after one warm-up call. */
export function timeBest(fn, repeat = 3) {
  fn();
  const times = [];
  let result;
  for (let i = 0; i < repeat; i++) {
    const t0 = performance.now();
    result = fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return { ms: times[0], median: times[Math.floor(times.length / 2)], result };
}
