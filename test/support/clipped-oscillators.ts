// Independent references for hard-clipped oscillators: their state equations with an ideal,
// memoryless amplifier v_o = clip(·, ±rail), integrated by odex (Hairer & Wanner's
// Gragg–Bulirsch–Stoer extrapolation code, ported to JavaScript), and their settled frequency
// and THD measured here by zero crossings and a direct Fourier integral — no project code.
import { Solver } from "odex";

export interface SettledReference {
  /** Hz, from the rising zero crossings of the output over the last `periods` periods. */
  readonly frequency: number;
  /** Output harmonic amplitudes 1 … 10 (V) over those periods. */
  readonly harmonics: readonly number[];
  /** THD_F over harmonics 2 … 10. */
  readonly thd: number;
}

const clip = (v: number, rail: number) => Math.max(-rail, Math.min(rail, v));

/** Integrates y′ = f(y) to `until` and measures the output over its last `periods` periods. */
export function settled(rhs: (y: number[]) => number[], y0: number[], output: (y: number[]) => number, until: number, periods = 10): SettledReference {
  const solver = new Solver(y0.length);
  solver.relativeTolerance = 1e-10;
  solver.absoluteTolerance = 1e-12;
  solver.maxSteps = 5e6;
  solver.denseOutput = true;
  const dt = until / 2e6;
  const samples: number[] = [];
  let next = 0;
  solver.solve((_x, y) => rhs(y), 0, y0, until, (_n, _xOld, x, yNow, dense) => {
    while (next * dt <= x && samples.length < 2e6 + 1) {
      // the first call, at the start, comes without a dense interpolant
      const y = dense ? y0.map((_, c) => dense(c, next * dt)) : yNow;
      samples.push(output(y));
      next++;
    }
  });
  // rising zero crossings, linear between the fine samples
  const crossings: number[] = [];
  for (let k = 1; k < samples.length; k++) {
    if (samples[k - 1]! < 0 && samples[k]! >= 0) crossings.push((k - 1 + -samples[k - 1]! / (samples[k]! - samples[k - 1]!)) * dt);
  }
  const last = crossings.length - 1;
  const start = crossings[last - periods]!;
  const end = crossings[last]!;
  const frequency = periods / (end - start);
  // a_h, b_h = (2/T)∫ v·(cos, sin)(2πh t/T) dt over the window, by the trapezoid rule on the fine grid
  const harmonics: number[] = [];
  for (let h = 1; h <= 10; h++) {
    let a = 0;
    let b = 0;
    const w = 2 * Math.PI * h * frequency;
    for (let k = Math.ceil(start / dt); k * dt <= end; k++) {
      const t = k * dt;
      a += samples[k]! * Math.cos(w * t) * dt;
      b += samples[k]! * Math.sin(w * t) * dt;
    }
    harmonics.push((2 / (end - start)) * Math.hypot(a, b));
  }
  const thd = Math.sqrt(harmonics.slice(1).reduce((s, x) => s + x * x, 0)) / harmonics[0]!;
  return { frequency, harmonics, thd };
}

/**
 * Wien bridge (series R–C from the output to v₊, R ∥ C to ground) around an amplifier of gain
 * A clipping at ±rail; states: the series capacitor's voltage and v₊ (started at 1 mV).
 */
export function wienReference(A: number, R: number, C: number, rail: number, until: number): SettledReference {
  const out = (y: number[]) => clip(A * y[1]!, rail);
  return settled(
    (y) => {
      const i = (out(y) - y[0]! - y[1]!) / R;
      return [i / C, (i - y[1]! / R) / C];
    },
    [0, 1e-3],
    out,
    until,
  );
}

/**
 * Three-section C–R ladder (C from the output, R to ground at each junction, the last R into the
 * virtual ground of an inverting stage of gain k = Rf/R) clipping at ±rail. States: the three
 * capacitor voltages. Unclipped, the output is −k·v_c with v_c = v_o − (q₁ + q₂ + q₃), so
 * v_o = k·S/(1 + k); clipped, the inverting input leaves virtual ground and sits on the
 * divider R–Rf between v_c and the output.
 */
export function ladderReference(k: number, R: number, C: number, rail: number, until: number): SettledReference {
  const output = (y: number[]) => {
    const S = y[0]! + y[1]! + y[2]!;
    return clip((k * S) / (1 + k), rail);
  };
  return settled(
    (y) => {
      const vo = output(y);
      const va = vo - y[0]!;
      const vb = va - y[1]!;
      const vc = vb - y[2]!;
      const n = (vc * k * R + vo * R) / (R + k * R);
      const i3 = (vc - n) / R;
      const i2 = vb / R + i3;
      const i1 = va / R + i2;
      return [i1 / C, i2 / C, i3 / C];
    },
    [1e-3, 0, 0],
    output,
    until,
  );
}
