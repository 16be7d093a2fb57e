"""Prints references.json as the Markdown tables of references.md: python3 table.py"""

import json
from pathlib import Path

document = json.loads((Path(__file__).resolve().parent.parent / "references.json").read_text())

print("| case | frequency (Hz) | amplitude (V) | rms (V) | offset (V) | THD 2–10 | THD 2–30 | source |")
print("|---|---|---|---|---|---|---|---|")
for r in document["cases"]:
    print(
        f"| {r['name']} | {r['frequency']:.9g} | {r['amplitude']:.9g} | {r['rms']:.9g} | {r['offset']:.1e} | "
        f"{100 * r['thd']:.7g} % | {100 * r['thd30']:.7g} % | [np] |"
    )

print()
print("| case | H3/H1 | H5/H1 | H7/H1 | H9/H1 | largest even/H1 | settle check (largest move over 20 periods) | Radau − LSODA (largest, f/A/rms/THD) | cycles to settle (slowest ratio/cycle) | wall time: settle + Radau + LSODA |")
print("|---|---|---|---|---|---|---|---|---|---|")
for r in document["cases"]:
    h = r["harmonics"]
    even = max(h[k] for k in range(1, 30, 2))
    moves = max(r["settleMoves"].values())
    cross = max(abs(v) for k, v in r["crossCheck"]["relativeDifference"].items() if k != "offset")
    s = r["run"]["seconds"]
    print(
        f"| {r['name']} | {h[2] / h[0]:.4e} | {h[4] / h[0]:.4e} | {h[6] / h[0]:.4e} | {h[8] / h[0]:.4e} | {even / h[0]:.0e} | "
        f"{moves:.0e} | {cross:.0e} | {r['run']['coarseCycles']} ({r['run']['coarseRatio']:.3f}) | "
        f"{s['coarse']:.0f} + {s['radau']:.0f} + {s['crossCheck']:.0f} s |"
    )
