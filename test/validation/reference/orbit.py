"""The settled orbit of an oscillator's state equations, and its metrics at one probe.

1. Growth and settling: LSODA at rtol 1e-9 from a 1 V start on the first capacitor (the settled
   orbit does not depend on the start). The states at each rising crossing of the probe through
   0 V (a Poincaré section) are recorded; their change per cycle d_k falls geometrically once
   the amplitude control has taken over. When d_k is below 1e-6 twice running, the largest
   ratio d_k/d_(k−1) seen on the way down from 1e-3 (μ, the slowest decay) sets how many more
   cycles shrink d by another 1e-6 (at least 20); those run at the tight tolerance (rtol 1e-11).
2. The orbit at tight tolerance: from that state, the integrator under test (Radau, and LSODA as
   the cross-check) at rtol 1e-11, atol 1e-11 V, largest step T/1000, over WARM_UP + STRETCH
   periods. Metrics are measured on the period that starts at the first crossing after WARM_UP
   periods and again on the last full period; the settle check needs every metric to move less
   than 1e-7 relative (THD: 1e-7 of itself or 1e-9 absolute) over the STRETCH periods between.
3. Metrics of one period [t0, t0 + T) from the dense output:
   - frequency: (N − 1)/(t_N − t_1) over the N rising crossings in the stretch (times located
     by scipy's event root finding on the dense output);
   - 2^14 uniform samples t0 + k·T/2^14 of the probe; amplitude = (max − min)/2 with each
     extreme refined by a bounded scalar search on the dense output; offset = mean; rms =
     sqrt(mean(v²)) (offset included); harmonic h's amplitude = 2·|X_h|/2^14 (X = rfft, one
     period so harmonic h is bin h); THD_F over harmonics 2…10 and 2…30 = sqrt(Σ a_h²)/a_1.
"""

import math
import time

import numpy as np
from scipy.integrate import solve_ivp
from scipy.optimize import minimize_scalar

COARSE_METHOD = "LSODA"
COARSE_RTOL = 1e-9
COARSE_CHUNK_PERIODS = 20
COARSE_MAX_PERIODS = 20000
COARSE_NEAR = 1e-6  # per-cycle change of the section state that starts the final stretch
COARSE_GAIN = 1e-6  # how much further that stretch shrinks it (to about 1e-12)
FINE_RTOL = 1e-11
FINE_ATOL = 1e-11  # V
STEPS_PER_PERIOD = 1000  # largest step T/1000 in the tight run: keeps the dense output exact
WARM_UP = 5
STRETCH = 20
SAMPLES = 2**14
SETTLE_CHECK = 1e-7
HARMONICS = 30


def _crossing_event(c):
    def event(t, s):
        return c.probe_value(s)

    event.direction = 1
    return event


def coarse_settle(c, f0):
    """Phase 1: a state on the probe's rising zero crossing, on the converged orbit."""
    period = 1 / f0
    s = np.zeros(c.state_count)
    s[0] = 1.0
    t = 0.0
    section = []
    started = time.perf_counter()
    nfev = 0
    target = None
    ratio = None
    while t < COARSE_MAX_PERIODS * period:
        # Down to the target the orbit is approached at COARSE_RTOL; the last stretch runs at the
        # tight tolerance, so the tight runs start on their own orbit (a slow amplitude loop
        # would otherwise carry the loose run's offset, about rtol/(1 − ratio), into them).
        rtol, atol = (COARSE_RTOL, COARSE_RTOL) if target is None else (FINE_RTOL, FINE_ATOL)
        sol = solve_ivp(c.rhs, (t, t + COARSE_CHUNK_PERIODS * period), s, method=COARSE_METHOD, rtol=rtol, atol=atol, jac=c.jacobian, events=_crossing_event(c))
        if sol.status != 0:
            raise RuntimeError(f"{c.title}: {COARSE_METHOD} failed: {sol.message}")
        nfev += sol.nfev
        section += list(sol.y_events[0])
        times = sol.t_events[0]
        t, s = sol.t[-1], sol.y[:, -1]
        if len(times) >= 2:
            period = (times[-1] - times[0]) / (len(times) - 1)
        if target is None and len(section) >= 4:
            states = np.array(section)
            d = np.linalg.norm(np.diff(states, axis=0), axis=1) / np.linalg.norm(states[-1])
            if d[-1] < COARSE_NEAR and d[-2] < COARSE_NEAR:
                # The slowest decay seen on the way down from 1e-3 sets how long to go on.
                k = [j for j in range(1, len(d)) if COARSE_NEAR <= d[j - 1] <= 1e-3 and d[j] >= COARSE_NEAR / 10]
                ratio = max((d[j] / d[j - 1] for j in k), default=0.5)
                ratio = min(max(ratio, 0.1), 0.999)
                target = len(section) + max(20, math.ceil(math.log(COARSE_GAIN) / math.log(ratio)))
        if target is not None and len(section) >= target:
            return {"state": section[-1], "period": period, "cycles": len(section), "ratio": ratio, "seconds": time.perf_counter() - started, "nfev": nfev}
    raise RuntimeError(f"{c.title}: no settled orbit within {COARSE_MAX_PERIODS} periods")


def period_metrics(c, sol, t0, period):
    """Amplitude, offset, rms, harmonics and THD of one period [t0, t0 + period)."""
    times = t0 + period * np.arange(SAMPLES) / SAMPLES
    states = sol(times)
    v = np.array([c.probe_value(states[:, k]) for k in range(SAMPLES)])
    dt = period / SAMPLES

    def refine(k, sign):
        f = lambda t: -sign * c.probe_value(sol(t))
        r = minimize_scalar(f, bounds=(times[k] - dt, times[k] + dt), method="bounded", options={"xatol": 1e-9 * dt})
        return max(sign * v[k], -r.fun) * sign

    high = refine(int(np.argmax(v)), 1)
    low = refine(int(np.argmin(v)), -1)
    X = np.fft.rfft(v) / SAMPLES
    harmonics = 2 * np.abs(X[1 : HARMONICS + 1])
    return {
        "amplitude": 0.5 * (high - low),
        "maximum": high,
        "minimum": low,
        "offset": float(np.mean(v)),
        "rms": float(math.sqrt(np.mean(v * v))),
        "thd10": float(math.sqrt(np.sum(harmonics[1:10] ** 2)) / harmonics[0]),
        "thd30": float(math.sqrt(np.sum(harmonics[1:30] ** 2)) / harmonics[0]),
        "harmonics": [float(a) for a in harmonics],
    }


def _close(a, b):
    moved = {}
    for k in ("amplitude", "rms", "thd10", "thd30"):
        moved[k] = abs(a[k] - b[k]) / abs(b[k])
    moved["offset"] = abs(a["offset"] - b["offset"]) / b["amplitude"]
    return moved


def tight_orbit(c, start, period, method):
    """Phase 2 with one integrator: the metrics, the settle check and the run's cost."""
    started = time.perf_counter()
    until = (WARM_UP + STRETCH + 1.5) * period
    options = {"rtol": FINE_RTOL, "atol": FINE_ATOL, "max_step": period / STEPS_PER_PERIOD, "dense_output": True, "events": _crossing_event(c)}
    if method in ("Radau", "LSODA", "BDF"):
        options["jac"] = c.jacobian
    sol = solve_ivp(c.rhs, (0.0, until), start, method=method, **options)
    if sol.status != 0:
        raise RuntimeError(f"{c.title}: {method} failed: {sol.message}")
    crossings = sol.t_events[0]
    crossings = crossings[crossings > 0.5 * period]  # the start itself sits on a crossing
    first = crossings[crossings >= WARM_UP * period]
    n = len(first)
    frequency = (n - 1) / (first[-1] - first[0])
    early = period_metrics(c, sol.sol, first[0], first[1] - first[0])
    late = period_metrics(c, sol.sol, first[-2], first[-1] - first[-2])
    late_period = first[-1] - first[-2]
    early_period = first[1] - first[0]
    moved = _close(early, late)
    moved["frequency"] = abs(early_period - late_period) / late_period
    result = dict(late)
    result.update(
        {
            "frequency": frequency,
            "periods": n - 1,
            "settle": moved,
            "settled": all(moved[k] < SETTLE_CHECK for k in ("frequency", "amplitude", "rms", "offset")) and all(moved[k] < SETTLE_CHECK or abs(early[k] - late[k]) < 1e-9 for k in ("thd10", "thd30")),
            "steps": int(len(sol.t) - 1),
            "nfev": int(sol.nfev),
            "seconds": time.perf_counter() - started,
        }
    )
    return result
