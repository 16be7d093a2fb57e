/** The line starts of the text last asked about: reporting many problems in one file scans it once. */
let indexed: { text: string; starts: Int32Array } | undefined;

function lineStarts(text: string): Int32Array {
  if (indexed?.text === text) return indexed.starts;
  let count = 1;
  for (let i = text.indexOf("\n"); i >= 0; i = text.indexOf("\n", i + 1)) count++;
  const starts = new Int32Array(count);
  let k = 1;
  for (let i = text.indexOf("\n"); i >= 0; i = text.indexOf("\n", i + 1)) starts[k++] = i + 1;
  indexed = { text, starts };
  return starts;
}

/**
 * Line and column of an offset, 1-based; columns count code points, so `µ` and `Ω` are one
 * column each. Only called when a problem is reported: tokens and nodes keep plain offsets.
 */
export function lineColumnAt(text: string, offset: number): { line: number; column: number } {
  const end = Math.max(0, Math.min(offset, text.length));
  const starts = lineStarts(text);
  // The last line start at or before `end` (binary search).
  let lo = 0;
  let hi = starts.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (starts[mid]! <= end) lo = mid;
    else hi = mid - 1;
  }
  return { line: lo + 1, column: codePointLength(text, starts[lo]!, end) + 1 };
}

/** Offsets of the start and end (before the line break) of the line holding `offset`. */
export function lineBounds(text: string, offset: number): { start: number; end: number } {
  const at = Math.max(0, Math.min(offset, text.length));
  const before = text.lastIndexOf("\n", at - 1);
  const start = before < 0 ? 0 : before + 1;
  let end = text.indexOf("\n", at);
  if (end < 0) end = text.length;
  if (end > start && text.charCodeAt(end - 1) === 13) end--;
  return { start, end: Math.max(start, end) };
}

/** Number of code points in `text[start, end)`. */
export function codePointLength(text: string, start: number, end: number): number {
  let n = 0;
  for (let i = start; i < end; i++) {
    const c = text.charCodeAt(i);
    // A high surrogate followed by its low half is one code point.
    if (c >= 0xd800 && c <= 0xdbff && i + 1 < end) {
      const d = text.charCodeAt(i + 1);
      if (d >= 0xdc00 && d <= 0xdfff) i++;
    }
    n++;
  }
  return n;
}
