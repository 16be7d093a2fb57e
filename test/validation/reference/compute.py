"""Computes the validation references: python3 test/validation/reference/compute.py [case…]

(`compute.py --parts` rewrites only each case's transcription, `parts`, from circuits.py.)

For each case of test/validation/cases.json: the circuit's state equations (circuits.py,
circuit.py, devices.py), its settled orbit (orbit.py) with Radau and, from the same start, with
LSODA as the cross-check, and the metrics at the probe. Writes test/validation/references.json
(cases given on the command line replace their entries; the others are kept).
"""

import json
import math
import platform
import sys
import time
from pathlib import Path

import numpy as np
import scipy

import orbit
from circuits import BUILDERS

HERE = Path(__file__).resolve().parent
CASES = HERE.parent / "cases.json"
OUTPUT = HERE.parent / "references.json"
CROSS_CHECK = "LSODA"


def small_signal_frequency(c):
    eigenvalues = np.linalg.eigvals(c.jacobian(0.0, np.zeros(c.state_count)))
    return float(np.max(np.abs(eigenvalues.imag))) / (2 * math.pi)


def _number(x):
    return "inf" if x == math.inf else "-inf" if x == -math.inf else x


def transcription(name):
    """The parts as circuits.py transcribed them: kind, name, nodes, value, device options."""
    parts = []
    for part in BUILDERS[name]().parts:
        kind, part_name, nodes, value = part[:4]
        entry = {"kind": kind, "name": part_name, "nodes": nodes, "value": value}
        if len(part) > 4:
            entry["options"] = {k: ([_number(x) for x in v] if isinstance(v, tuple) else _number(v)) for k, v in part[4].items()}
        parts.append(entry)
    return parts


def reference(name, probe):
    c = BUILDERS[name]().compile(probe)
    started = time.perf_counter()
    coarse = orbit.coarse_settle(c, small_signal_frequency(c))
    print(f"{name}: coarse orbit after {coarse['cycles']} cycles (ratio {coarse['ratio']:.3f}/cycle), {coarse['seconds']:.0f} s", flush=True)
    main = orbit.tight_orbit(c, coarse["state"], coarse["period"], "Radau")
    print(f"{name}: Radau {main['seconds']:.0f} s, settle moves {max(main['settle'].values()):.1e}", flush=True)
    check = orbit.tight_orbit(c, coarse["state"], coarse["period"], CROSS_CHECK)
    print(f"{name}: {CROSS_CHECK} {check['seconds']:.0f} s", flush=True)
    difference = {k: (check[k] - main[k]) / abs(main[k]) for k in ("frequency", "amplitude", "rms", "thd10", "thd30")}
    difference["offset"] = (check["offset"] - main["offset"]) / main["amplitude"]
    return {
        "name": name,
        "probe": probe,
        "frequency": main["frequency"],
        "amplitude": main["amplitude"],
        "rms": main["rms"],
        "offset": main["offset"],
        "thd": main["thd10"],
        "thd30": main["thd30"],
        "harmonics": main["harmonics"],
        "settled": main["settled"],
        "settleMoves": main["settle"],
        "crossCheck": {"method": CROSS_CHECK, "relativeDifference": difference, "settled": check["settled"]},
        "run": {
            "coarseCycles": coarse["cycles"],
            "coarseRatio": coarse["ratio"],
            "measuredPeriods": main["periods"],
            "radauSteps": main["steps"],
            "seconds": {"coarse": round(coarse["seconds"], 1), "radau": round(main["seconds"], 1), "crossCheck": round(check["seconds"], 1), "total": round(time.perf_counter() - started, 1)},
        },
    }


def main(names):
    cases = json.loads(CASES.read_text())["cases"]
    document = json.loads(OUTPUT.read_text()) if OUTPUT.exists() else {"cases": []}
    by_name = {r["name"]: r for r in document["cases"]}
    for case in cases:
        if names == ["--parts"]:
            # Refresh only the transcriptions (after an edit to circuits.py that moves no value).
            if case["name"] not in by_name:
                continue
            r = by_name[case["name"]]
        elif names and case["name"] not in names:
            continue
        else:
            r = reference(case["name"], case["probe"])
        r["file"] = case["file"]
        r["parts"] = transcription(case["name"])
        by_name[case["name"]] = r
        document = {
            "source": (
                f"[np] scipy {scipy.__version__}, numpy {np.__version__}, Python {platform.python_version()}: "
                f"solve_ivp Radau, rtol {orbit.FINE_RTOL:g}, atol {orbit.FINE_ATOL:g} V, max step T/{orbit.STEPS_PER_PERIOD}, "
                f"from a state settled by {orbit.COARSE_METHOD} (rtol {orbit.COARSE_RTOL:g}, its last stretch at {orbit.FINE_RTOL:g}); cross-checked with {CROSS_CHECK} at the same settings. "
                "Scripts: test/validation/reference/*.py; definitions: test/validation/references.md."
            ),
            "units": {"frequency": "Hz", "amplitude": "V", "rms": "V", "offset": "V", "thd": "1", "thd30": "1", "harmonics": "V"},
            "cases": [by_name[c["name"]] for c in cases if c["name"] in by_name],
        }
        OUTPUT.write_text(json.dumps(document, indent=1) + "\n")


if __name__ == "__main__":
    main(sys.argv[1:])
