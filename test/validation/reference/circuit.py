"""A circuit as state equations ds/dt = h(s), for scipy's integrators.

States s: every capacitor's voltage (end a minus end b) and every op-amp's pole voltage x.
Given s, the rest of the network is resistive: each capacitor acts as a voltage source of its
state's value, each op-amp output as the source x behind rout. The unknowns of that resistive
problem are y = [node voltages (gnd excluded; a diode with series resistance adds its junction
node), capacitor currents], and its equations are

    g(y, s) = M·y + Pᵀ·i(P·y) − B·s = 0
      rows "KCL at node k":  Σ currents leaving node k = 0
      rows "capacitor j":    v(a_j) − v(b_j) − s_j = 0

with M the resistors, rin, rout and the capacitor incidence, B the capacitor states and the
op-amp sources, P·y the diode junction voltages u (junction node minus cathode) and i(u) their
currents (devices.py). The linear part is eliminated once: y = M⁻¹·B·s − M⁻¹·Pᵀ·i(u), so the
junction voltages solve the small system

    u + Z·i(u) = A·s,        Z = P·M⁻¹·Pᵀ,  A = P·M⁻¹·B       (one row per diode)

by Newton, to 1e-14 relative or to the solve's rounding floor where that is higher (warm
started from the previous solve), and every quantity the
state equations read (capacitor currents, op-amp inputs, the probe) is W·s − V·i(u) with
W, V rows of M⁻¹·B and M⁻¹·Pᵀ. Then

    capacitor j:  ds_j/dt = i_j / C_j
    op-amp:       dx/dt  = (i_in(vd) − x/Rp − i_clamp(x)) / Cp        (devices.py)

The Jacobian follows from the implicit function theorem, du/ds = (1 + Z·diag(i′))⁻¹·A — exact,
for Radau, LSODA and BDF.
"""

import math

import numpy as np

from devices import DIODE_DEFAULTS, THERMAL_VOLTAGE, diode_current, opamp_clamp_current, opamp_input_current, opamp_parameters, pot_segments

NEWTON_RELATIVE = 1e-14
NEWTON_MAX_ITERATIONS = 100


class Circuit:
    def __init__(self, title):
        self.title = title
        self.nodes = {}
        self.parts = []  # (kind, name, nodes, value[, options]) for the transcription check
        self._resistors = []  # (a, b, R)
        self._capacitors = []  # (a, b, C)
        self._diodes = []  # (junction, cathode, Is, nVt)
        self._opamps = []  # (plus, minus, out, parameters)

    def node(self, name):
        if name == "gnd":
            return -1
        if name not in self.nodes:
            self.nodes[name] = len(self.nodes)
        return self.nodes[name]

    # Parts, in the Onset language's pin order.
    def resistor(self, name, a, b, value):
        self.parts.append(("resistor", name, [a, b], value))
        self._resistors.append((self.node(a), self.node(b), value))

    def capacitor(self, name, a, b, value):
        self.parts.append(("capacitor", name, [a, b], value))
        self._capacitors.append((self.node(a), self.node(b), value))

    def pot(self, name, end1, wiper, end2, value, at=0.5, taper="linear"):
        self.parts.append(("pot", name, [end1, wiper, end2], value, {"at": at, "taper": taper}))
        r1, r2 = pot_segments(value, at, taper)
        self._resistors.append((self.node(end1), self.node(wiper), r1))
        self._resistors.append((self.node(wiper), self.node(end2), r2))

    def diode(self, name, anode, cathode, **options):
        o = dict(DIODE_DEFAULTS, **options)
        self.parts.append(("diode", name, [anode, cathode], None, o))
        a = self.node(anode)
        j = a
        if o["series"] > 0:
            j = self.node(name + ".junction")
            self._resistors.append((a, j, o["series"]))
        self._diodes.append((j, self.node(cathode), o["saturation"], o["emission"] * THERMAL_VOLTAGE))

    def opamp(self, name, plus, minus, out, **options):
        p = opamp_parameters(**options)
        self.parts.append(("opamp", name, [plus, minus, out], None, {k: p[k] for k in ("gain", "gbw", "slew", "rout", "rin", "headroom", "knee", "vos", "rails")}))
        self._opamps.append((self.node(plus), self.node(minus), self.node(out), p))

    # -----------------------------------------------------------------------------------------
    def compile(self, probe="o"):
        """Builds and reduces the network; call once after the last part."""
        n = len(self.nodes)
        m = len(self._capacitors)
        nd = len(self._diodes)
        no = len(self._opamps)
        size = n + m + nd
        M = np.zeros((size, size))
        B = np.zeros((size, m + no + nd))

        def conductance(a, b, g):
            for i, si in ((a, 1), (b, -1)):
                if i < 0:
                    continue
                for k, sk in ((a, 1), (b, -1)):
                    if k >= 0:
                        M[i, k] += si * sk * g

        def source(row, a, b, column):
            # A branch current (a → b through the source) and v(a) − v(b) = value[column].
            if a >= 0:
                M[a, row] += 1.0
                M[row, a] += 1.0
            if b >= 0:
                M[b, row] -= 1.0
                M[row, b] -= 1.0
            B[row, column] = 1.0

        for a, b, r in self._resistors:
            conductance(a, b, 1.0 / r)
        for j, (a, b, _) in enumerate(self._capacitors):
            source(n + j, a, b, j)
        for d, (j, c, _, _) in enumerate(self._diodes):
            source(n + m + d, j, c, m + no + d)
        for k, (plus, minus, out, p) in enumerate(self._opamps):
            if math.isfinite(p["rin"]):
                conductance(plus, minus, 1.0 / p["rin"])
            # (v_out − x)/rout leaves the output node.
            M[out, out] += 1.0 / p["rout"]
            B[out, m + k] = 1.0 / p["rout"]
        Y = np.linalg.solve(M, B)
        # Rows read by the state equations: capacitor currents, each op-amp's vd, the probe;
        # then the diode branch currents.
        rows = [np.eye(size)[n + j] for j in range(m)]
        for plus, minus, _, _ in self._opamps:
            r = np.zeros(size)
            if plus >= 0:
                r[plus] += 1.0
            if minus >= 0:
                r[minus] -= 1.0
            rows.append(r)
        rows.append(np.eye(size)[self.nodes[probe]])
        rows += [np.eye(size)[n + m + d] for d in range(nd)]
        R = np.array(rows) @ Y
        ns = m + no
        self.size, self.node_count, self.state_count = size, n, ns
        self.capacitances = [c for _, _, c in self._capacitors]
        self.opamp_parameters = [p for _, _, _, p in self._opamps]
        outputs = m + no + 1
        self.Ws, self.Wu = R[:outputs, :ns], R[:outputs, ns:]
        self.Ds, self.Du = R[outputs:, :ns], R[outputs:, ns:]
        self.M, self.B, self.Y = M, B, Y
        # Plain lists for the hot path: numpy's per-call overhead dwarfs 4×4 arithmetic.
        self._Ws, self._Wu, self._Ds, self._Du = (x.tolist() for x in (self.Ws, self.Wu, self.Ds, self.Du))
        self._u = [0.0] * nd
        self._diode_laws = [(sat, nvt) for _, _, sat, nvt in self._diodes]
        return self

    def state_names(self):
        return [f"C{j}" for j in range(len(self._capacitors))] + [f"pole{k}" for k in range(len(self._opamps))]

    def _junctions(self, s):
        """Junction voltages u, currents i(u) and slopes i′(u) at states s."""
        nd = len(self._diode_laws)
        if nd == 0:
            return [], [], []
        s = s.tolist() if isinstance(s, np.ndarray) else s
        ns = len(s)
        rd = range(nd)
        drive = [sum(row[k] * s[k] for k in range(ns)) for row in self._Ds]
        u = list(self._u)
        Du = self._Du
        laws = self._diode_laws
        Wu = self._Wu
        # Each output the state equations read is judged against the size of the terms that
        # make it up (its rounding scale).
        magnitude = [sum(abs(ws[k] * s[k]) for k in range(ns)) + sum(abs(wu[d] * u[d]) for d in rd) + 1e-300 for ws, wu in zip(self._Ws, Wu)]
        last = math.inf
        for _ in range(NEWTON_MAX_ITERATIONS):
            i = [0.0] * nd
            g = [0.0] * nd
            for d in rd:
                i[d], g[d] = diode_current(u[d], *laws[d])
            # The diode's own current equals the network's branch current through its port.
            r = [drive[d] + sum(Du[d][e] * u[e] for e in rd) - i[d] for d in rd]
            J = [[(g[d] if d == e else 0.0) - Du[d][e] for e in rd] for d in rd]
            du = _solve_small(J, r)
            # Damp a junction step past a few tenths of a volt (a far start only).
            largest = max(abs(x) for x in du)
            scale = 0.2 / largest if largest > 0.2 else 1.0
            u = [u[d] + scale * du[d] for d in rd]
            size = max(abs(sum(wu[d] * du[d] for d in rd)) / m for wu, m in zip(Wu, magnitude))
            # Quadratic convergence: the iteration after one below 1e-9 is at 1e-14 or at the
            # rounding floor of the solve, whichever is higher. (Two diodes in series, both off,
            # leave the split of voltage between them to picoamperes: the solve cannot pin it to
            # 1e-14, but it moves no output.)
            if scale == 1.0 and (size <= NEWTON_RELATIVE or last <= 1e-9):
                break
            last = size if scale == 1.0 else math.inf
        else:
            raise RuntimeError(f"{self.title}: junction Newton did not converge at s = {list(s)}")
        self._u = u
        for d in rd:
            i[d], g[d] = diode_current(u[d], *laws[d])
        return u, i, g

    def _outputs(self, s, u):
        s = s.tolist() if isinstance(s, np.ndarray) else s
        return [sum(w * x for w, x in zip(ws, s)) + sum(w * x for w, x in zip(wu, u)) for ws, wu in zip(self._Ws, self._Wu)]

    def probe_value(self, s):
        u, _, _ = self._junctions(s)
        return self._outputs(s, u)[-1]

    def node_voltages(self, s):
        """Every node voltage by name at states s (for checks)."""
        u, _, _ = self._junctions(s)
        y = self.Y @ np.concatenate((np.asarray(s, dtype=float), u))
        return {name: y[k] for name, k in self.nodes.items()}

    def rhs(self, t, s):
        u, _, _ = self._junctions(s)
        out = self._outputs(s, u)
        m = len(self.capacitances)
        ds = [out[j] / c for j, c in enumerate(self.capacitances)]
        for k, p in enumerate(self.opamp_parameters):
            x = s[m + k]
            i_in, _ = opamp_input_current(out[m + k] + p["vos"], p)
            i_cl, _ = opamp_clamp_current(x, p)
            ds.append((i_in - x / p["r_pole"] - i_cl) / p["c_pole"])
        return ds

    def jacobian(self, t, s):
        u, _, g = self._junctions(s)
        out = self._outputs(s, u)
        m = len(self.capacitances)
        ns = self.state_count
        dout = self.Ws
        if u:
            # i(u) = Ds·s + Du·u  ⇒  du/ds = (diag(i′) − Du)⁻¹·Ds
            dout = self.Ws + self.Wu @ np.linalg.solve(np.diag(g) - self.Du, self.Ds)
        J = np.zeros((ns, ns))
        for j, c in enumerate(self.capacitances):
            J[j] = dout[j] / c
        for k, p in enumerate(self.opamp_parameters):
            x = s[m + k]
            _, g_in = opamp_input_current(out[m + k] + p["vos"], p)
            _, g_cl = opamp_clamp_current(x, p)
            J[m + k] = g_in * dout[m + k] / p["c_pole"]
            J[m + k, m + k] += (-1.0 / p["r_pole"] - g_cl) / p["c_pole"]
        return J


def _solve_small(J, b):
    """J·x = b on plain lists (1–4 unknowns): Cramer's rule up to 2, else elimination with partial pivoting."""
    n = len(b)
    if n == 1:
        return [b[0] / J[0][0]]
    if n == 2:
        (a, c), (d, e) = J
        det = a * e - c * d
        return [(b[0] * e - c * b[1]) / det, (a * b[1] - d * b[0]) / det]
    a = [row[:] + [b[k]] for k, row in enumerate(J)]
    for col in range(n):
        piv = max(range(col, n), key=lambda r: abs(a[r][col]))
        a[col], a[piv] = a[piv], a[col]
        for r in range(col + 1, n):
            f = a[r][col] / a[col][col]
            if f:
                for k in range(col, n + 1):
                    a[r][k] -= f * a[col][k]
    x = [0.0] * n
    for r in range(n - 1, -1, -1):
        x[r] = (a[r][n] - sum(a[r][k] * x[k] for k in range(r + 1, n))) / a[r][r]
    return x
