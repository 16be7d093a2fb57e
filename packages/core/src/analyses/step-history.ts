/** How many accepted points the step control looks back over (a third divided difference needs four). */
const DEPTH = 4;

/** The history ring as a snapshot keeps it. */
export interface StepHistoryState {
  readonly times: Float64Array;
  readonly values: readonly Float64Array[];
  readonly count: number;
  readonly head: number;
}

/**
 * The last few accepted points (time and unknowns), newest first through `time(k)`/`value(k)`;
 * the truncation-error estimates and the Newton predictor read them. A ring, so a step copies
 * one vector and allocates nothing.
 */
export class StepHistory {
  private readonly times = new Float64Array(DEPTH);
  private readonly values: Float64Array[];
  /** How many points are held (at most DEPTH); after a breakpoint only the corner is kept. */
  count = 0;
  private head = 0;

  constructor(n: number) {
    this.values = Array.from({ length: DEPTH }, () => new Float64Array(n));
  }

  push(t: number, x: Float64Array): void {
    this.head = (this.head + 1) % DEPTH;
    this.times[this.head] = t;
    this.values[this.head]!.set(x);
    if (this.count < DEPTH) this.count++;
  }

  /** Forgets all but the newest point (a corner: the waveform's derivatives jump there). */
  restart(): void {
    this.count = 1;
  }

  private slot(back: number): number {
    return (this.head - back + DEPTH) % DEPTH;
  }

  /** The time `back` points before the newest (0 = newest). */
  time(back: number): number {
    return this.times[this.slot(back)]!;
  }

  /** The unknowns `back` points before the newest (0 = newest). */
  value(back: number): Float64Array {
    return this.values[this.slot(back)]!;
  }

  state(): StepHistoryState {
    return { times: Float64Array.from(this.times), values: this.values.map((v) => Float64Array.from(v)), count: this.count, head: this.head };
  }

  restore(state: StepHistoryState): void {
    this.times.set(state.times);
    state.values.forEach((v, k) => this.values[k]!.set(v));
    this.count = state.count;
    this.head = state.head;
  }
}
