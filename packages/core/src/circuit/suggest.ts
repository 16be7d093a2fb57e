/**
 * Did-you-mean suggestions for every unknown name the project reports (nodes, parts, probes,
 * parameters, options, keywords, units, commands): one rule, so a slip is caught the same way
 * wherever it is made.
 */

/** Optimal-string-alignment distance: Levenshtein (1966) with adjacent transpositions counted as one edit. */
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

/** Rank of the prefix matches: after every typo within the edit limit. */
const PREFIX_RANK = 1000;

/**
 * How likely `candidate` is what `word` meant, lower is likelier; undefined when it is not a
 * likely slip. In order: the same name in another letter case; a typo of at most one edit per
 * three letters of the longer name (at least one); one name a prefix of the other, ignoring
 * case (`out` written for the node `o`, `amp` for `amplitude`).
 */
export function suggestionScore(word: string, candidate: string): number | undefined {
  if (candidate === word || candidate.length === 0 || word.length === 0) return undefined;
  const lw = word.toLowerCase();
  const lc = candidate.toLowerCase();
  if (lw === lc) return 0.5;
  const d = editDistance(word, candidate);
  if (d <= Math.max(1, Math.floor(Math.max(word.length, candidate.length) / 3))) return d;
  if (lw.startsWith(lc) || lc.startsWith(lw)) return PREFIX_RANK + d;
  return undefined;
}

/** The candidate closest to `word` by `suggestionScore` (the first of equals), or undefined. */
export function closestName(word: string, candidates: Iterable<string>): string | undefined {
  let best: string | undefined;
  let bestScore = Infinity;
  for (const c of candidates) {
    const score = suggestionScore(word, c);
    if (score !== undefined && score < bestScore) {
      best = c;
      bestScore = score;
    }
  }
  return best;
}

/** ` (did you mean 'x'?)` when a close candidate exists, else the empty string; `decorate` spells it (`--x`). */
export function didYouMean(word: string, candidates: Iterable<string>, decorate: (name: string) => string = (n) => n): string {
  const c = closestName(word, candidates);
  return c === undefined ? "" : ` (did you mean '${decorate(c)}'?)`;
}
