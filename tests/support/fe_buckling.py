"""Independent reference for critical loads: a finite-element model with Hermite cubic beam elements.

Written from the case-file contract alone (DEVELOPERS.md, "Case file": supports, ``restraints``, ``steps``,
``foundation``), sharing no code with ``engine/``. Each element of length h and stiffness EI has the standard
bending stiffness, geometric stiffness and (for a foundation of modulus k) foundation stiffness of the cubic
Hermite interpolation (Przemieniecki, Theory of Matrix Structural Analysis, 1968, ch. 15, from memory):

    K  = EI/h³ [[12, 6h, -12, 6h], [6h, 4h², -6h, 2h²], [-12, -6h, 12, -6h], [6h, 2h², -6h, 4h²]]
    Kg = 1/(30h) [[36, 3h, -36, 3h], [3h, 4h², -3h, -h²], [-36, -3h, 36, -3h], [3h, -h², -3h, 4h²]]
    Kf = k h/420 [[156, 22h, 54, -13h], [22h, 4h², 13h, -3h²], [54, 13h, 156, -22h], [-13h, -3h², -22h, 4h²]]

A fixed translation or rotation removes its freedom, a spring adds to the diagonal, a hinge gives its node two
rotations. The critical loads solve (K + Kf) φ = P Kg φ, taken as the eigenvalues μ = 1/P of
Kg φ = μ (K + Kf) φ (K + Kf is positive definite for a stable member). The discretisation error falls as h⁴,
but the rounding grows with the condition of K (as the fourth power of the element count): with 60 to 100
elements both stay near 1e-7 for the first three modes of the cases in tests/engine/test_restraints.py.
"""

from __future__ import annotations

import numpy as np
from scipy.linalg import eigh

__all__ = ["fe_critical_loads"]

_NAMED = {"pinned": ("fixed", "free"), "fixed": ("fixed", "fixed"), "free": ("free", "free"),
          "guided": ("free", "fixed")}  # fmt: skip


def _end(spec):
    return _NAMED[spec] if isinstance(spec, str) else (spec["translation"], spec["rotation"])


def fe_critical_loads(case: dict, count: int = 3, elements: int = 300) -> np.ndarray:
    """The first ``count`` critical loads [N] of a case mapping (first plane), by ``elements`` elements."""
    L, EI0 = float(case["length"]), float(case["EI"])
    restraints = [r for r in case.get("restraints", ()) if r.get("plane", "both") != "second"]
    steps = sorted(case.get("steps", ()), key=lambda s: s["x"])
    foundation = [f for f in case.get("foundation", ()) if f.get("plane", "both") != "second"]
    cuts = {0.0, L, *(float(r["x"]) for r in restraints), *(float(s["x"]) for s in steps)}
    for f in foundation:
        cuts |= {float(f["start"]), float(f["end"])}
    cuts = np.array(sorted(cuts))
    xs = [0.0]
    for a, b in zip(cuts[:-1], cuts[1:], strict=True):
        m = max(2, int(round(elements * (b - a) / L)))
        xs.extend(a + (b - a) * np.arange(1, m + 1) / m)
    xs = np.array(xs)
    n_nodes = xs.size
    at = {round(float(r["x"]), 9): r for r in restraints}
    # Freedoms: w and θ per node (θ- and θ+ at a hinge).
    w_dof, th_left, th_right, index = [], [], [], 0
    for x in xs:
        r = at.get(round(float(x), 9))
        w_dof.append(index)
        index += 1
        if r is not None and r.get("hinge", False):
            th_left.append(index)
            th_right.append(index + 1)
            index += 2
        else:
            th_left.append(index)
            th_right.append(index)
            index += 1
    K = np.zeros((index, index))
    G = np.zeros((index, index))
    for e in range(n_nodes - 1):
        a, b = xs[e], xs[e + 1]
        h, mid = b - a, 0.5 * (a + b)
        EI = EI0
        for s in steps:
            if s["x"] <= mid:
                EI = float(s["EI"])
        k = sum(float(f["k"]) for f in foundation if f["start"] < mid < f["end"])
        Ke = EI / h**3 * np.array(
            [[12, 6 * h, -12, 6 * h], [6 * h, 4 * h * h, -6 * h, 2 * h * h],
             [-12, -6 * h, 12, -6 * h], [6 * h, 2 * h * h, -6 * h, 4 * h * h]]
        )  # fmt: skip
        Ke += k * h / 420 * np.array(
            [[156, 22 * h, 54, -13 * h], [22 * h, 4 * h * h, 13 * h, -3 * h * h],
             [54, 13 * h, 156, -22 * h], [-13 * h, -3 * h * h, -22 * h, 4 * h * h]]
        )  # fmt: skip
        Ge = 1 / (30 * h) * np.array(
            [[36, 3 * h, -36, 3 * h], [3 * h, 4 * h * h, -3 * h, -h * h],
             [-36, -3 * h, 36, -3 * h], [3 * h, -h * h, -3 * h, 4 * h * h]]
        )  # fmt: skip
        dofs = [w_dof[e], th_right[e], w_dof[e + 1], th_left[e + 1]]
        K[np.ix_(dofs, dofs)] += Ke
        G[np.ix_(dofs, dofs)] += Ge
    removed = []

    def hold(dof, value, scale):
        if value == "fixed":
            removed.append(dof)
        elif value != "free":
            K[dof, dof] += float(value) * scale

    (lt, lr), (rt, rr) = _end(case["supports"]["left"]), _end(case["supports"]["right"])
    hold(w_dof[0], lt, 1.0)
    hold(th_right[0], lr, 1.0)
    hold(w_dof[-1], rt, 1.0)
    hold(th_left[-1], rr, 1.0)
    for r in restraints:
        i = int(np.argmin(np.abs(xs - float(r["x"]))))
        hold(w_dof[i], r.get("translation", "free"), 1.0)
        hold(th_left[i], r.get("rotation", "free"), 1.0)
    keep = np.setdiff1d(np.arange(index), removed)
    K, G = K[np.ix_(keep, keep)], G[np.ix_(keep, keep)]
    # Symmetric scaling for conditioning (congruence keeps the eigenvalues of the pencil).
    d = 1.0 / np.sqrt(np.abs(np.diag(K)))
    K, G = K * d[:, None] * d[None, :], G * d[:, None] * d[None, :]
    mu = eigh(G, K, eigvals_only=True)
    mu = np.sort(mu[mu > 0])[::-1]
    return 1.0 / mu[:count]
