// Issue 5: the twin-T tuning reference from power-on, against its own state equations under odex.
import { createRequire } from "node:module";
import { opampConstants, THERMAL_VOLTAGE, risingCrossings } from "@onset/core";
import { buildSystem, TransientStepper } from "@onset/core/engine";
import { printTable, timeBest } from "../table.mjs";
import { TWIN_T_MAX_STEP as MAX_STEP, twinTCircuit as circuit } from "../twin-t.mjs";

const require = createRequire(import.meta.url);
const { Solver } = require("odex");

export const title = "Start-up: the 440 Hz twin-T tuning reference, engine against odex on its state equations";

const UNTIL = 0.15;
const FROM = 0.1; // frequency measured from the crossings in [FROM, UNTIL]
const RUNS = 60; // the engine's run is timed this often (best and median reported)

function frequencyOf(t, v) {
  const c = risingCrossings(Float64Array.from(t), Float64Array.from(v), 0, 1e-3, FROM, UNTIL);
  return (c.length - 1) / (c[c.length - 1] - c[0]);
}

function engineRun(c, tolerances, capacity = Math.ceil((4 * UNTIL) / MAX_STEP)) {
  const system = buildSystem(c);
  const stepper = new TransientStepper(system, { start: "rest", maxStep: MAX_STEP, tolerances });
  const o = system.nodeIndex.get("o");
  // Recorded into typed arrays, as the startup analysis records its probe; at the default
  // tolerances the steps are about UNTIL/maxStep (the largest step binds), so 4× that is ample.
  const t = new Float64Array(capacity);
  const v = new Float64Array(capacity);
  let count = 0;
  stepper.observe((time, x) => {
    if (count === capacity) throw new Error("bench recorder full: raise its capacity");
    t[count] = time;
    v[count++] = x[o];
  });
  const started = performance.now();
  stepper.advance(UNTIL);
  const stepping = performance.now() - started;
  return { t: t.subarray(0, count), v: v.subarray(0, count), stats: stepper.stats, stepping };
}

/**
 * The same circuit as state equations for an explicit ODE solver. States: v(m1) on Cs, the
 * voltages on Ca and Cb, and the op-amp's pole node. Each evaluation solves the resistive rest
 * of the network (o, n, p, f and the two capacitor currents) by Newton, with the two-diode
 * strings in closed form: i = 2·Is·sinh(v/(2·n·VT)) across Rf2.
 */
function stateEquations(c) {
  const part = (name) => c.parts.find((p) => p.name === name);
  const val = (name) => part(name).value;
  const Ra = val("N1.Ra"), Rb = val("N1.Rb"), Cs = val("N1.Cs"), Ca = val("N1.Ca"), Cb = val("N1.Cb"), Rs = val("N1.Rs");
  const Rin = val("Rin"), Rf1 = val("Rf1"), Rf2 = val("Rf2"), Rp1 = val("Rp1"), Rp2 = val("Rp2");
  const d = part("D1").options;
  const is = d.saturation;
  const nvt2 = 2 * d.emission * THERMAL_VOLTAGE;
  const k = opampConstants(part("U1"));
  const [lo, hi] = [k.rails[0] + k.headroom, k.rails[1] - k.headroom];
  const sp = (z, w) => (z / w > 30 ? z : z / w < -30 ? w * Math.exp(z / w) : w * Math.log1p(Math.exp(z / w)));
  // algebraic unknowns y = [vo, vn, vp, vf, iCa, iCb], solved by Newton with a numeric 6×6 solve
  let y = [0, 0, 0, 0, 0, 0];
  const residual = (s, y) => {
    const [v1, q2, q3, xp] = s;
    const [vo, vn, vp, vf, iCa, iCb] = y;
    const vm2 = vo - q2;
    const vt = vm2 - q3;
    const u = vf - vo;
    const ifo = u / Rf2 + 2 * is * Math.sinh(u / nvt2) + 2e-12 * u;
    return [
      (vo - xp) / k.rout + (vo - v1) / Ra + iCa - ifo + (vo - vp) / Rp1,
      iCa - iCb - vm2 / Rs,
      iCb + (v1 - vt) / Rb - (vt - vn) / Rin,
      (vt - vn) / Rin - (vn - vf) / Rf1 - (vn - vp) / k.rin,
      (vn - vf) / Rf1 - ifo,
      (vo - vp) / Rp1 - vp / Rp2 - (vp - vn) / k.rin,
    ];
  };
  const solveAlgebraic = (s) => {
    for (let iter = 0; iter < 50; iter++) {
      const r = residual(s, y);
      const J = [];
      for (let j = 0; j < 6; j++) {
        const h = 1e-7 * Math.max(1, Math.abs(y[j]));
        const yp = y.slice();
        yp[j] += h;
        const rp = residual(s, yp);
        for (let i = 0; i < 6; i++) (J[i] ??= [])[j] = (rp[i] - r[i]) / h;
      }
      // Gaussian elimination with partial pivoting on [J | −r]
      const a = J.map((row, i) => [...row, -r[i]]);
      for (let col = 0; col < 6; col++) {
        let p = col;
        for (let i = col + 1; i < 6; i++) if (Math.abs(a[i][col]) > Math.abs(a[p][col])) p = i;
        [a[col], a[p]] = [a[p], a[col]];
        for (let i = col + 1; i < 6; i++) {
          const m = a[i][col] / a[col][col];
          for (let j = col; j < 7; j++) a[i][j] -= m * a[col][j];
        }
      }
      const dy = new Array(6);
      for (let i = 5; i >= 0; i--) {
        let sum = a[i][6];
        for (let j = i + 1; j < 6; j++) sum -= a[i][j] * dy[j];
        dy[i] = sum / a[i][i];
      }
      let big = 0;
      for (let i = 0; i < 6; i++) {
        y[i] += dy[i];
        big = Math.max(big, Math.abs(dy[i]) / (1e-9 + 1e-9 * Math.abs(y[i])));
      }
      if (big < 1) break;
    }
    return y;
  };
  const rhs = (_t, s) => {
    const [v1, , , xp] = s;
    const [vo, vn, vp, , iCa, iCb] = solveAlgebraic(s);
    const vt = vo - s[1] - s[2];
    const vd = vp - vn + k.vos;
    const iIn = Number.isFinite(k.iMax) ? k.iMax * Math.tanh((k.gm * vd) / k.iMax) : k.gm * vd;
    const clamp = k.gClamp * (sp(xp - hi, k.knee) - sp(lo - xp, k.knee));
    return [((vo - v1) / Ra - (v1 - vt) / Rb) / Cs, iCa / Ca, iCb / Cb, (iIn - xp / k.rPole - clamp) / k.cPole];
  };
  return { rhs, output: (s) => solveAlgebraic(s)[0], initial: [0, 0.5, 0, 0] };
}

function odexRun(model, tolerance) {
  const solver = new Solver(4);
  solver.relativeTolerance = tolerance;
  solver.absoluteTolerance = tolerance * 1e-3;
  solver.maxSteps = 5e6;
  solver.denseOutput = false;
  const t = [];
  const v = [];
  const result = solver.solve(model.rhs, 0, model.initial, UNTIL, (_n, _x0, x, y) => {
    t.push(x);
    v.push(model.output(y));
  });
  return { t, v, steps: result.nStep, evaluations: result.nEval };
}

export async function run() {
  const c = circuit();
  const engine = timeBest(() => engineRun(c, undefined), RUNS);
  let stepping = Infinity;
  for (let i = 0; i < RUNS; i++) stepping = Math.min(stepping, engineRun(c, undefined).stepping);
  // The reference run comes after the timed ones, so its tiny steps do not shape the compiled code being timed.
  const precise = engineRun(c, { lteRelative: 1e-8, lteVoltage: 1e-10 }, 4_000_000);
  const reference = frequencyOf(precise.t, precise.v);
  const fEngine = frequencyOf(engine.result.t, engine.result.v);
  const model = stateEquations(c);
  const rows = [];
  const st = engine.result.stats;
  rows.push({
    integrator: "onset (trapezoidal MNA, default tolerances)",
    "simulated": `${UNTIL * 1e3} ms`,
    steps: st.accepted,
    "wall ms": `${engine.ms.toFixed(1)} (median ${engine.median.toFixed(1)})`,
    "steps/s": `${Math.round(st.accepted / (engine.ms / 1000)).toLocaleString("en-US")} (median ${Math.round(st.accepted / (engine.median / 1000)).toLocaleString("en-US")})`,
    "Newton/step": (st.newtonIterations / (st.accepted + st.rejected)).toFixed(2),
    "frequency error": `${(((fEngine - reference) / reference) * 100).toFixed(4)} %`,
  });
  // odex: the loosest tolerance (decades) whose frequency is within 0.05 % of the reference
  let odexChoice;
  for (const tol of [1e-4, 1e-5, 1e-6, 1e-7, 1e-8]) {
    const started = performance.now();
    const r = odexRun(model, tol);
    const ms = performance.now() - started;
    const f = frequencyOf(r.t, r.v);
    const error = Math.abs(f / reference - 1);
    rows.push({
      integrator: `odex (extrapolation), rtol ${tol}`,
      "simulated": `${UNTIL * 1e3} ms`,
      steps: r.steps,
      "wall ms": ms.toFixed(1),
      "steps/s": Math.round(r.steps / (ms / 1000)).toLocaleString("en-US"),
      "Newton/step": `${(r.evaluations / r.steps).toFixed(1)} evals`,
      "frequency error": `${(((f - reference) / reference) * 100).toFixed(4)} %`,
    });
    if (error <= 5e-4) {
      odexChoice = { ms, tol };
      break;
    }
  }
  printTable(rows);
  console.log(`\nreference frequency (onset at LTE tolerance 1e-8): ${reference.toFixed(4)} Hz over ${FROM * 1e3}–${UNTIL * 1e3} ms`);
  if (odexChoice) console.log(`engine / odex wall-time ratio at ≤ 0.05 % frequency error: ${(odexChoice.ms / engine.ms).toFixed(1)}× (odex at rtol ${odexChoice.tol}; ${(odexChoice.ms / engine.median).toFixed(1)}× on the engine's median)`);
  console.log(`engine wall time: best and median of ${RUNS} runs after a warm-up, each from building the MNA system to the last step; odex: one run per tolerance`);
  console.log(`stepping alone (advance, without building the system and stepper): ${Math.round(st.accepted / (stepping / 1000)).toLocaleString("en-US")} accepted steps/s (best of ${RUNS})`);
  console.log("targets: ≥ 1,000,000 accepted steps/s; ≥ 7× faster than odex at equal frequency accuracy (0.05 %)");
}
