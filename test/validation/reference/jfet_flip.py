"""The JFET-held Wien of examples/jfet-loop-source.onset with Rs 3.9 kOhm, Cf 0.47 uF and Rb 220 kOhm:
its periodic orbits of one cycle and of two, and their Floquet multipliers.
python3 jfet_flip.py CYCLES   (1: the orbit of one cycle; 2: of two, the period-doubled swing)

State equations from the documented device laws (docs/language.md; devices.py for the op-amp and
the diode; the JFET's square law, symmetric in drain and source, gate junctions Is 10 fA, n 1, and
1 pS drain to source): states v(s) - v(p) (C1), v(p) (C2), v(c) (Cfil) and the op-amp's pole x;
the nodes o, n, d, g and D1's junction solved by Newton at each evaluation. The orbit: Newton on
phi_T(x) - x = 0 with o(x) = 0 as the phase condition, the Jacobian by finite differences of
solve_ivp Radau runs (rtol 1e-10, atol 1e-12); the multipliers are the eigenvalues of the
finite-difference monodromy matrix. Prints JSON: period, frequency, multipliers, and each
cycle's half peak-to-peak at o (from its rising zero crossing)."""
import json
import sys

import numpy as np
from scipy.integrate import solve_ivp

from devices import opamp_parameters, opamp_input_current, opamp_clamp_current, diode_current, THERMAL_VOLTAGE

def make(Rs=3.9e3, Cf=0.47e-6, Rb=220e3, R=7.87e3, C=10e-9, Rf=10e3, Ra=470e3, Rc=470e3, idss=8e-3, vp=-2.5):
    op = opamp_parameters("general")
    beta = idss / vp**2
    Is_d, nvt_d, rs_d = 2.5e-9, 1.8 * THERMAL_VOLTAGE, 0.5
    Is_g, nvt_g = 1e-14, THERMAL_VOLTAGE
    leak = 1e-12
    rout, rin = op["rout"], op["rin"]

    def channel(vg, v):  # n-channel, v >= 0 drain->source
        vov = vg - vp
        if vov <= 0: return 0.0, 0.0, 0.0
        if v < vov: return beta * (2 * vov * v - v * v), 2 * beta * v, beta * (2 * vov - 2 * v)
        return beta * vov * vov, 2 * beta * vov, 0.0

    def jfet(d, g):  # source at gnd: current into drain (channel d->s), d/dd, d/dg
        if d >= 0:
            i, gm, gds = channel(g, d)
            return i, gds, gm
        i, gm, gds = channel(g - d, -d)  # swapped: i(d->s) = -ch(vgd, vsd)
        return -i, gm + gds, -gm

    state = {"y": np.zeros(5)}

    def solve(v1, v2, vc, x):
        p = v2; s = v1 + v2
        y = state["y"].copy()
        for it in range(100):
            o, n, d, g, j = y
            iD, gD = diode_current(j - o, Is_d, nvt_d)
            ich, dch_dd, dch_dg = jfet(d, g)
            igd, ggd = diode_current(g - d, Is_g, nvt_g)
            igs, ggs = diode_current(g, Is_g, nvt_g)
            F = np.array([
                (o - x) / rout + (o - s) / R + (o - n) / Rf - iD,
                (n - o) / Rf + (n - d) / Rs + (n - p) / rin,
                (d - n) / Rs + ich + (d - g) / Ra - igd + leak * d,
                (g - d) / Ra + (g - vc) / Rc + igd + igs,
                (j - vc) / rs_d + iD,
            ])
            J = np.array([
                [1 / rout + 1 / R + 1 / Rf + gD, -1 / Rf, 0, 0, -gD],
                [-1 / Rf, 1 / Rf + 1 / Rs + 1 / rin, -1 / Rs, 0, 0],
                [0, -1 / Rs, 1 / Rs + dch_dd + 1 / Ra + ggd + leak, dch_dg - 1 / Ra - ggd, 0],
                [0, 0, -1 / Ra - ggd, 1 / Ra + 1 / Rc + ggd + ggs, 0],
                [-gD, 0, 0, 0, 1 / rs_d + gD],
            ])
            dy = np.linalg.solve(J, -F)
            big = np.max(np.abs(dy))
            if big > 0.2: dy *= 0.2 / big
            y = y + dy
            if big < 1e-13 * (1 + np.max(np.abs(y))):
                break
        state["y"] = y
        return y, s, p

    def rhs(t, u):
        v1, v2, vc, x = u
        y, s, p = solve(v1, v2, vc, x)
        o, n, d, g, j = y
        i1 = (o - s) / R  # through R1 into C1
        dv1 = i1 / C
        dv2 = (i1 - p / R - (p - n) / rin) / C
        dvc = -((vc - g) / Rc + vc / Rb + (vc - j) / rs_d) / Cf
        iin, _ = opamp_input_current(p - n, op)
        icl, _ = opamp_clamp_current(x, op)
        dx = (iin - x / op["r_pole"] - icl) / op["c_pole"]
        return [dv1, dv2, dvc, dx]

    def out(u):
        y, _, _ = solve(*u)
        return y[0]
    return rhs, out


rhs, out = make()
cycles = int(sys.argv[1])
# Newton's start (a guess only): the state at a rising crossing of o after 0.3 s of a start-up run.
x = np.array([-1.61064, 0.00650468, -4.29035, 0.0])
T = cycles * 0.000498938
def flow(x, T):
    s = solve_ivp(rhs, (0, T), x, method="Radau", rtol=1e-10, atol=1e-12, max_step=T / (200 * cycles))
    return s.y[:, -1]
def residual(z):
    x, T = z[:4], z[4]
    return np.concatenate([flow(x, T) - x, [out(x)]])
z = np.concatenate([x, [T]])
for it in range(8):
    r = residual(z)
    J = np.zeros((5, 5))
    for j in range(5):
        h = 1e-6 * max(abs(z[j]), 1e-3 if j < 4 else T)
        zp = z.copy(); zp[j] += h
        J[:, j] = (residual(zp) - r) / h
    dz = np.linalg.solve(J, -r)
    z = z + dz
    print("iter", it, "residual", float(np.max(np.abs(r[:4]))), "step", float(np.max(np.abs(dz[:4]))), file=sys.stderr)
    if np.max(np.abs(r[:4])) < 1e-9: break
M = J[:4, :4] + np.eye(4)
mu = sorted(np.linalg.eigvals(M), key=lambda m: -abs(m))
# the orbit's peaks per cycle at the probe
x, T = z[:4], z[4]
s = solve_ivp(rhs, (0, T), x, method="Radau", rtol=1e-10, atol=1e-12, max_step=T / (2000 * cycles), dense_output=True)
tt = np.linspace(0, T, 4000 * cycles + 1)
oo = np.array([out(u) for u in s.sol(tt).T])
peaks = [(float(oo[i * 4000:(i + 1) * 4000].max() - oo[i * 4000:(i + 1) * 4000].min()) / 2) for i in range(cycles)]
print(json.dumps({"cycles": cycles, "period": float(T), "frequency": float(cycles / T), "multipliers": [[float(m.real), float(m.imag)] for m in mu], "envelopes": peaks}))
