"""What one converged elastic critical moment (engine.design.mcr.critical_moment) costs.

Run from the repository root with ``python3 -m tests.benchmarks.mcr_speed``. Not collected by pytest; nothing
runs at import time. The member is invented (about an IPE 300 over 6 m, κ = 1).

Three cases, each converged to 0.1 % (meshes of 8 and 16 elements, Richardson): uniform moment, a
full-length UDL at the top flange, a central point load. The reference, timed in alternating blocks in the
same process (the shared machine's speed drifts within minutes), is one solve of the brute-force kind: a
fixed 64-element mesh, eigenvalues by ``scipy.linalg.eigh`` of the generalized problem. The script prints the
median block times and the median of the paired ratios; there is no target in the script (the issue's is
≤ 20 ms per converged M_cr).
"""

from __future__ import annotations

import math
import statistics
import time

import numpy as np
import scipy.linalg

from engine.design import mcr

ROUNDS, BLOCK = 15, 20
EI_Z, GI_T, L = 2.0e6, 4.0e4, 6.0
EI_W = L**2 * GI_T / math.pi**2  # κ = 1
X = np.linspace(0.0, L, 401)
CASES = {
    "uniform moment": (np.array([0.0, L]), np.array([1.0, 1.0]), None),
    "UDL, top flange": (X, X * (L - X) / 2, [{"kind": "uniform", "q": 1.0, "height": 0.15}]),
    "central point load": (X, np.minimum(X, L - X) / 2, [{"kind": "point", "F": 1.0, "x": L / 2}]),
}


def _engine(x, m, loads) -> float:
    return mcr.critical_moment(x, m, EI_z=EI_Z, GI_t=GI_T, EI_w=EI_W, length=L, loads=loads).M_cr


def _reference(x, m, loads) -> float:
    uniform, point = mcr._loads(loads, L, 0.0)
    nodes = mcr._mesh(L, 64, [p[1] for p in point])
    K, G = mcr._matrices(
        nodes, lambda p: np.interp(p, x, m), (EI_Z, GI_T, EI_W, 0.0, 0.0), uniform, point, True
    )
    free = mcr._free_dofs(nodes.size, ("fork", "fork"), ("free", "free"))
    mu = scipy.linalg.eigh(G[np.ix_(free, free)], K[np.ix_(free, free)], eigvals_only=True)
    return float(np.max(np.abs(m))) / mu[-1]


def _block(function, args) -> float:
    t0 = time.perf_counter()
    for _ in range(BLOCK):
        function(*args)
    return (time.perf_counter() - t0) / BLOCK


def main() -> None:
    """Print, per case, the engine's and the reference's time per M_cr and their paired ratio."""
    for name, args in CASES.items():
        ours, theirs = _engine(*args), _reference(*args)
        engine_times, reference_times, ratios = [], [], []
        for i in range(ROUNDS):  # alternate which goes first
            if i % 2:
                theirs_t, ours_t = _block(_reference, args), _block(_engine, args)
            else:
                ours_t, theirs_t = _block(_engine, args), _block(_reference, args)
            pair = (ours_t, theirs_t)
            engine_times.append(pair[0])
            reference_times.append(pair[1])
            ratios.append(pair[1] / pair[0])
        print(
            f"{name:20s} engine {statistics.median(engine_times) * 1e3:6.2f} ms "
            f"(best {min(engine_times) * 1e3:5.2f})  reference 64 el. + scipy "
            f"{statistics.median(reference_times) * 1e3:6.2f} ms  ratio {statistics.median(ratios):5.2f}x  "
            f"M_cr {ours:.6g} vs {theirs:.6g} N·m ({ours / theirs - 1:+.1e})"
        )


if __name__ == "__main__":
    main()
