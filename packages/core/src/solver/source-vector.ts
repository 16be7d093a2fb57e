import type { SourceTerm } from "../devices/device.js";

/** The excitation vector u(t) of the MNA equations: every independent source's value at one time. */
export class SourceVector {
  readonly u: Float64Array;
  private readonly sources: readonly SourceTerm[];
  /** Per source: after this time it adds nothing. */
  private readonly quietAfter: Float64Array;
  /** Whether `u` holds zeros (set when every source was silent). */
  private zero = false;

  constructor(n: number, sources: readonly SourceTerm[]) {
    this.u = new Float64Array(n);
    this.sources = sources;
    this.quietAfter = Float64Array.from(sources, (s) => s.quietAfter ?? Infinity);
  }

  /** Fills `u` with every source's value at `t`, scaled by `scale`; `left` takes the value just before an edge. */
  load(t: number, scale: number, left: boolean): void {
    const { sources, quietAfter, u } = this;
    let active = false;
    // Counted on quietAfter: an empty source list is an array of another kind (a second map here).
    for (let k = 0; k < quietAfter.length; k++) {
      if (!(t > quietAfter[k]!)) {
        active = true;
        break;
      }
    }
    if (!active) {
      // Every source is silent: u is zero, and stays so without refilling it at each step.
      if (!this.zero) u.fill(0);
      this.zero = true;
      return;
    }
    for (let i = 0; i < u.length; i++) u[i] = 0;
    for (let k = 0; k < sources.length; k++) sources[k]!.addSource(t, scale, u, left);
    this.zero = false;
  }
}
