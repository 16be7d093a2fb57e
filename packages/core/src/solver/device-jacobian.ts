/** The touched entries, in the order they were first touched, and the values last factored. */
export interface DeviceJacobianState {
  readonly rows: Int32Array;
  readonly cols: Int32Array;
  readonly factored: Float64Array;
}

/** Knuth's multiplicative hashing constant (2³² / golden ratio), for the entry table. */
const GOLDEN = 0x9e3779b1;

/**
 * Up to this many unknowns the entries are found through an n×n position table (at most 64 KiB)
 * instead of the hash: small circuits stamp a few dozen entries per iterate, and there the
 * probing cost as much as the devices' own arithmetic.
 */
const POSITION_TABLE_LIMIT = 128;

/**
 * The nonlinear devices' share of the Newton matrix (∂f/∂x + a·∂q/∂x), kept apart from the
 * constant G + a·C so that each iteration can tell whether the factorisation in use still
 * describes the circuit. Devices stamp on every iteration into the entries they have touched,
 * found by an open-addressing hash of (row, col) (Knuth, *TAoCP* vol. 3, §6.4, algorithm L);
 * storage and an iteration's cost follow the device entries, not n². Small circuits index an
 * n×n table of entry positions instead.
 */
export class DeviceJacobian {
  readonly n: number;
  /** Per entry, in the order first touched: its row, column, current and last factored value. */
  rows = new Int32Array(16);
  cols = new Int32Array(16);
  values = new Float64Array(16);
  private factored = new Float64Array(16);
  /**
   * Per entry, as of the last `assemble`: the size of the whole matrix entry it went into
   * (constant part + device part) and its row's floor, which `moved` reads on every iteration.
   */
  private whole = new Float64Array(16);
  private floorAt = new Float64Array(16);
  /** Entries the last `assemble` saw (later ones are judged against the constant part itself). */
  private assembled = 0;
  /** Per entry: its index in the constant matrix's entries (the base array), and in the matrix factored. */
  private baseAt = new Int32Array(16);
  private targetAt = new Int32Array(16);
  private count = 0;
  /** Entry index per hash slot, −1 where free. */
  private table = new Int32Array(32).fill(-1);
  private mask = 31;
  /** Small circuits: entry index at row·n + col, −1 where not touched (undefined: the hash serves). */
  readonly position: Int32Array | undefined;

  constructor(n: number) {
    this.n = n;
    if (n <= POSITION_TABLE_LIMIT) {
      this.position = new Int32Array(n * n).fill(-1);
      // Room for every entry the table can name, so `values` is never replaced (IterateLoad holds it).
      this.values = new Float64Array(Math.max(16, n * n));
    }
  }

  /** How many entries the devices have touched so far (it only grows). */
  get entryCount(): number {
    return this.count;
  }

  /**
   * Adds to entry (row, col), both ≥ 0, touching it first if new. Kept this small so that it
   * inlines into the devices' loads: a double handed to a call that is not inlined is boxed, and
   * those boxes were most of the garbage a small circuit's time step made.
   */
  add(row: number, col: number, value: number): void {
    const position = this.position;
    const known = position !== undefined ? position[row * this.n + col]! : -1;
    // entryOf may grow the arrays: the index first, then the (new) values array.
    const e = known >= 0 ? known : this.entryOf(row, col);
    this.values[e] += value;
  }

  /** The index of entry (row, col), touched first if new (which may grow the arrays). */
  private entryOf(row: number, col: number): number {
    const position = this.position;
    if (position !== undefined) {
      const k = row * this.n + col;
      const e = position[k]!;
      if (e >= 0) return e;
      position[k] = this.count;
      return this.touch(row, col, -1);
    }
    const { table, mask, rows, cols } = this;
    let h = (Math.imul(row, GOLDEN) + col) & mask;
    for (;;) {
      const e = table[h]!;
      if (e < 0) return this.touch(row, col, h);
      if (rows[e] === row && cols[e] === col) return e;
      h = (h + 1) & mask;
    }
  }

  /** Records a new entry at free hash slot h (−1: the position table holds it); returns its index. */
  private touch(row: number, col: number, h: number): number {
    const e = this.count;
    if (e === this.rows.length) this.grow();
    this.rows[e] = row;
    this.cols[e] = col;
    this.values[e] = 0;
    this.baseAt[e] = -1;
    this.targetAt[e] = -1;
    this.count++;
    if (h < 0) return e;
    if (2 * this.count > this.mask) this.rehash();
    else this.table[h] = e;
    return e;
  }

  private grow(): void {
    const size = 2 * this.rows.length;
    const widen = <T extends Int32Array | Float64Array>(a: T): T => {
      const b = new (a.constructor as new (n: number) => T)(size);
      b.set(a);
      return b;
    };
    this.rows = widen(this.rows);
    this.cols = widen(this.cols);
    if (this.values.length < size) this.values = widen(this.values);
    this.factored = widen(this.factored);
    this.whole = widen(this.whole);
    this.floorAt = widen(this.floorAt);
    this.baseAt = widen(this.baseAt);
    this.targetAt = widen(this.targetAt);
  }

  private rehash(): void {
    const size = 4 * (this.mask + 1);
    this.mask = size - 1;
    this.table = new Int32Array(size).fill(-1);
    for (let e = 0; e < this.count; e++) {
      let h = (Math.imul(this.rows[e]!, GOLDEN) + this.cols[e]!) & this.mask;
      while (this.table[h]! >= 0) h = (h + 1) & this.mask;
      this.table[h] = e;
    }
  }

  /** Where entry e sits in the constant part's entries (`moved` reads base[at]; −1: not there). */
  linkBase(e: number, at: number): void {
    this.baseAt[e] = at;
  }

  /** Where entry e sits in the factored matrix's entries (`assemble` adds it there). */
  linkTarget(e: number, at: number): void {
    this.targetAt[e] = at;
  }

  /** Zeroes the touched entries before the devices stamp again. */
  clear(): void {
    // A loop, not fill(): a builtin call costs more than the few dozen entries of a small circuit.
    const values = this.values;
    for (let e = 0; e < this.count; e++) values[e] = 0;
  }

  /**
   * matrix[target] += these values (after `link`), remembered as the factored ones, with the
   * whole entry each makes with the constant part `base` and its row's `floor` (valid until the
   * constant part changes, which always brings a new factorisation).
   */
  assemble(matrix: Float64Array, base: Float64Array, floor: Float64Array): void {
    const { values, factored, targetAt, baseAt, rows, whole, floorAt } = this;
    for (let e = 0; e < this.count; e++) {
      const v = values[e]!;
      matrix[targetAt[e]!] += v;
      factored[e] = v;
      const b = baseAt[e]!;
      whole[e] = Math.abs(b >= 0 ? base[b]! + v : v);
      floorAt[e] = floor[rows[e]!]!;
    }
    this.assembled = this.count;
  }

  /**
   * True when some entry has moved by more than `fraction` of the whole matrix entry it was
   * factored with (base + device part), ignoring changes below `floor[row]`. The chord iteration
   * on the old factorisation then contracts at about that fraction or worse.
   */
  moved(base: Float64Array, fraction: number, floor: Float64Array): boolean {
    const { values, factored, whole, floorAt, assembled } = this;
    for (let e = 0; e < assembled; e++) {
      const change = Math.abs(values[e]! - factored[e]!);
      if (change > fraction * whole[e]! && change > floorAt[e]!) return true;
    }
    return assembled < this.count && this.movedSinceAssembly(base, fraction, floor);
  }

  /** `moved` for the entries touched after the last assembly (apart, to keep `moved` small enough to inline). */
  private movedSinceAssembly(base: Float64Array, fraction: number, floor: Float64Array): boolean {
    const { values, factored, baseAt, rows } = this;
    for (let e = this.assembled; e < this.count; e++) {
      const was = factored[e]!;
      const change = Math.abs(values[e]! - was);
      const b = baseAt[e]!;
      const entry = b >= 0 ? base[b]! + was : was;
      if (change > fraction * Math.abs(entry) && change > floor[rows[e]!]!) return true;
    }
    return false;
  }

  state(): DeviceJacobianState {
    const c = this.count;
    return { rows: this.rows.slice(0, c), cols: this.cols.slice(0, c), factored: this.factored.slice(0, c) };
  }

  /** Touches the snapshot's entries in their order and sets the factored values (on a fresh instance). */
  restore(state: DeviceJacobianState): void {
    this.assembled = 0;
    state.rows.forEach((row, e) => {
      this.add(row, state.cols[e]!, 0);
      this.factored[e] = state.factored[e]!;
    });
  }
}
