/** The touched entries, in the order they were first touched, and the values last factored. */
export interface DeviceJacobianState {
  readonly entries: Int32Array;
  readonly factored: Float64Array;
}

/**
 * The nonlinear devices' share of the Newton matrix (∂f/∂x + a·∂q/∂x), kept apart from the
 * constant G + a·C so that each iteration can tell whether the factorisation in use still
 * describes the circuit. Devices stamp on every iteration; only the entries they have ever
 * touched are visited, so an iteration costs O(device entries), not O(n²).
 */
export class DeviceJacobian {
  readonly n: number;
  /** Row-major n×n, nonzero only at touched entries. */
  readonly values: Float64Array;
  /** The values that went into the last factorisation. */
  private readonly factored: Float64Array;
  /** 1 at the entries touched so far. */
  readonly marked: Uint8Array;
  private entries: Int32Array;
  /** The row of each touched entry. */
  private rows: Int32Array;
  private count = 0;

  constructor(n: number) {
    this.n = n;
    this.values = new Float64Array(n * n);
    this.factored = new Float64Array(n * n);
    this.marked = new Uint8Array(n * n);
    this.entries = new Int32Array(16);
    this.rows = new Int32Array(16);
  }

  /** How many entries the devices have touched so far (it only grows). */
  get entryCount(): number {
    return this.count;
  }

  /** Sets mask[k] = 1 at every touched entry. */
  markInto(mask: Uint8Array): void {
    for (let e = 0; e < this.count; e++) mask[this.entries[e]!] = 1;
  }

  /** Zeroes the touched entries before the devices stamp again. */
  clear(): void {
    const { values, entries } = this;
    for (let e = 0; e < this.count; e++) values[entries[e]!] = 0;
  }

  /**
   * Records entry (row, col), both ≥ 0, as touched; callers then add to `values` themselves
   * (the solver's load checks `marked` first, so this runs once per entry).
   */
  touch(row: number, col: number): void {
    const k = row * this.n + col;
    if (this.marked[k] === 1) return;
    this.marked[k] = 1;
    if (this.count === this.entries.length) {
      const entries = new Int32Array(2 * this.count);
      entries.set(this.entries);
      this.entries = entries;
      const rows = new Int32Array(2 * this.count);
      rows.set(this.rows);
      this.rows = rows;
    }
    this.rows[this.count] = row;
    this.entries[this.count++] = k;
  }

  /** matrix ← base + these values, remembered as the factored ones. */
  assemble(base: Float64Array, matrix: Float64Array): void {
    const { values, factored, entries } = this;
    matrix.set(base);
    for (let e = 0; e < this.count; e++) {
      const k = entries[e]!;
      matrix[k] += values[k]!;
      factored[k] = values[k]!;
    }
  }

  /**
   * True when some entry has moved by more than `fraction` of the whole matrix entry it was
   * factored with (base + device part), ignoring changes below `floor[row]`. The chord iteration
   * on the old factorisation then contracts at about that fraction or worse.
   */
  moved(base: Float64Array, fraction: number, floor: Float64Array): boolean {
    const { values, factored, entries, rows } = this;
    for (let e = 0; e < this.count; e++) {
      const k = entries[e]!;
      const was = factored[k]!;
      const change = Math.abs(values[k]! - was);
      if (change > fraction * Math.abs(base[k]! + was) && change > floor[rows[e]!]!) return true;
    }
    return false;
  }

  state(): DeviceJacobianState {
    const entries = this.entries.slice(0, this.count);
    return { entries, factored: Float64Array.from(entries, (k) => this.factored[k]!) };
  }

  /** Touches the snapshot's entries in their order and sets the factored values (on a fresh instance). */
  restore(state: DeviceJacobianState): void {
    const n = this.n;
    state.entries.forEach((k, e) => {
      this.touch(Math.floor(k / n), k % n);
      this.factored[k] = state.factored[e]!;
    });
  }
}
