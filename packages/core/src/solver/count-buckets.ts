/**
 * Items 0..n−1 filed by a count 0..n in doubly linked lists, so that the Markowitz search can
 * visit the rows and columns of smallest count first and move one in O(1) when its count changes
 * (Duff, Erisman & Reid, *Direct Methods for Sparse Matrices*, §10.2).
 */
export class CountBuckets {
  /** First item of each count, or −1. */
  readonly head: Int32Array;
  readonly next: Int32Array;
  private readonly prev: Int32Array;
  /** The count each item is filed under (−1: not filed). */
  readonly countOf: Int32Array;

  constructor(n: number) {
    this.head = new Int32Array(n + 1).fill(-1);
    this.next = new Int32Array(n).fill(-1);
    this.prev = new Int32Array(n).fill(-1);
    this.countOf = new Int32Array(n).fill(-1);
  }

  insert(item: number, count: number): void {
    const first = this.head[count]!;
    this.next[item] = first;
    this.prev[item] = -1;
    if (first >= 0) this.prev[first] = item;
    this.head[count] = item;
    this.countOf[item] = count;
  }

  remove(item: number): void {
    const count = this.countOf[item]!;
    if (count < 0) return;
    const before = this.prev[item]!;
    const after = this.next[item]!;
    if (before >= 0) this.next[before] = after;
    else this.head[count] = after;
    if (after >= 0) this.prev[after] = before;
    this.countOf[item] = -1;
  }

  /** Files the item under `count` (a no-op when it is filed there already). */
  move(item: number, count: number): void {
    if (this.countOf[item] === count) return;
    this.remove(item);
    this.insert(item, count);
  }
}
