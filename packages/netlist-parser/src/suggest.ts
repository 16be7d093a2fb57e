/** Optimal-string-alignment distance (Levenshtein with adjacent transpositions). */
export function editDistance(a: string, b: string): number {
  const m = a.length;
  const n = b.length;
  let prev2 = new Array<number>(n + 1).fill(0);
  let prev = Array.from({ length: n + 1 }, (_, j) => j);
  let cur = new Array<number>(n + 1).fill(0);
  for (let i = 1; i <= m; i++) {
    cur[0] = i;
    for (let j = 1; j <= n; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      let d = Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + cost);
      if (i > 1 && j > 1 && a[i - 1] === b[j - 2] && a[i - 2] === b[j - 1]) d = Math.min(d, prev2[j - 2]! + 1);
      cur[j] = d;
    }
    [prev2, prev, cur] = [prev, cur, prev2];
  }
  return prev[n]!;
}

/**
 * The candidate closest to `word`, or undefined when none is close enough to be a likely typo:
 * a case-only difference wins, otherwise the smallest edit distance of at most one third of the
 * longer name (and at least 1).
 */
export function closest(word: string, candidates: Iterable<string>): string | undefined {
  let best: string | undefined;
  let bestScore = Infinity;
  const lower = word.toLowerCase();
  for (const c of candidates) {
    if (c === word) continue;
    const score = c.toLowerCase() === lower ? 0.5 : editDistance(word, c);
    const limit = Math.max(1, Math.floor(Math.max(word.length, c.length) / 3));
    if (score <= limit && score < bestScore) {
      best = c;
      bestScore = score;
    }
  }
  return best;
}

/** ` (did you mean 'x'?)` when a close candidate exists, else the empty string. */
export function didYouMean(word: string, candidates: Iterable<string>): string {
  const c = closest(word, candidates);
  return c === undefined ? "" : ` (did you mean '${c}'?)`;
}

/** `'a', 'b' and 'c'` for messages, shortened past `limit` names. */
export function listNames(names: readonly string[], limit = 8): string {
  const quoted = names.slice(0, limit).map((n) => `'${n}'`);
  if (names.length > limit) return `${quoted.join(", ")} and ${names.length - limit} more`;
  if (quoted.length <= 1) return quoted.join("");
  return `${quoted.slice(0, -1).join(", ")} and ${quoted[quoted.length - 1]}`;
}
