"""Floquet multipliers of a validation case's settled orbit: python3 floquet.py CASE...
Settles the orbit as orbit.py does (LSODA, last stretch at rtol 1e-11), then integrates the state
with its variational equation dPhi/dt = J(x)·Phi (J exact, from circuit.py) over one period, from
the probe's rising zero crossing to the next (event located on the dense output), with Radau at
rtol 1e-11, atol 1e-11; the multipliers are the eigenvalues of Phi(T)."""
import json
import sys
import time

import numpy as np
from scipy.integrate import solve_ivp
import orbit
from circuits import BUILDERS
from compute import small_signal_frequency

def multipliers(name):
    c = BUILDERS[name]().compile("o")
    n = c.state_count
    f0 = small_signal_frequency(c) or 1e3
    coarse = orbit.coarse_settle(c, f0)
    T = coarse["period"]
    x0 = np.asarray(coarse["state"], dtype=float)
    def rhs(t, y):
        x = y[:n]
        Phi = y[n:].reshape(n, n)
        dx = c.rhs(t, x)
        J = c.jacobian(t, x)
        return np.concatenate((dx, (J @ Phi).ravel()))
    def jac(t, y):
        J = c.jacobian(t, y[:n])
        big = np.zeros((n + n * n, n + n * n))
        big[:n, :n] = J
        for k in range(n):  # Phi is row-major: column k of Phi at indices n + i*n + k
            idx = n + np.arange(n) * n + k
            big[np.ix_(idx, idx)] = J
        return big
    def event(t, y):
        return c.probe_value(y[:n]) if t > 0.5 * T else -1.0
    event.direction = 1
    event.terminal = True
    y0 = np.concatenate((x0, np.eye(n).ravel()))
    sol = solve_ivp(rhs, (0, 1.5 * T), y0, method="Radau", rtol=1e-11, atol=1e-11, jac=jac, events=event, max_step=T / 1000)
    te = sol.t_events[0][0]
    M = sol.y_events[0][0][n:].reshape(n, n)
    mu = np.linalg.eigvals(M)
    mu = sorted(mu, key=lambda z: -abs(z))
    return {"period": te, "frequency": 1 / te, "closing": float(np.max(np.abs(sol.y_events[0][0][:n] - x0))), "multipliers": [[float(z.real), float(z.imag)] for z in mu]}

for name in sys.argv[1:]:
    t = time.perf_counter()
    r = multipliers(name)
    r["seconds"] = time.perf_counter() - t
    print(name, json.dumps(r), flush=True)
