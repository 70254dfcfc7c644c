"""Independent numerical reference for the second-order beam-column problem.

This module is written from the contract alone (DEVELOPERS.md, "Conventions"): it reads a
schema-1 case dictionary and solves

.. math::

    EI\\,w'''' + P\\,w'' = q - P\\,w_0''

with :func:`scipy.integrate.solve_bvp`, as the first-order system in ``y = (w, θ, M, T)``:

.. math::

    w' = θ, \\quad θ' = -M/EI, \\quad M' = T + P(θ + w_0'), \\quad T' = -q .

It shares no code with ``engine/`` on purpose, so that agreement between the two is evidence.

Concentrated loads and load boundaries split the member into segments. Each segment is mapped to
``t ∈ [0, 1]`` and the segment states are stacked into one system of ``4·nseg`` equations; the
continuity and jump conditions between segments are boundary conditions of that system:
``M(x+) - M(x-) = C`` for a couple and ``T(x+) - T(x-) = -F`` for a point load.

Intermediate restraints, hinges, steps in EI and an elastic foundation (the case keys ``restraints``,
``steps`` and ``foundation`` of the contract, first plane only) are read from the contract too: every
restraint, step and foundation boundary is a segment boundary; a segment has its own EI (θ' = -M/EI_j) and
on a foundation T' = -q + k w. At a restraint the boundary rows change as the contract says: translation
fixed ``w(x-) = 0`` instead of the T jump, a spring ``T+ - T- - k_t w = -F``; rotation fixed ``w'(x-) = 0``
instead of the M jump, a spring ``M+ - M- + k_r w' = C``; a hinge ``M(x-) = 0`` instead of slope continuity.

End conditions are written on the support side of the end, so that a concentrated load at an end
acts on the member: at ``x = 0`` the support side is ``0-``, at ``x = L`` it is ``L+``.
Translation: ``"fixed"`` gives ``w = 0``, ``"free"`` gives ``T = 0``, a spring ``k_t`` gives
``T(0) = k_t w(0)`` and ``T(L) = -k_t w(L)``. Rotation: ``"fixed"`` gives ``w' = 0``, ``"free"``
gives ``M = 0``, a spring ``k_r`` gives ``M(0) = -k_r w'(0)`` and ``M(L) = k_r w'(L)``.

The returned arrays hold the member-side values. Where ``x_eval`` repeats a segment boundary, the
first occurrence gives the value just left of it and the last the value just right of it; a single
occurrence at an interior boundary gives the value just right of it.

Scaling, for conditioning: ``ξ = x/L``, ``w = W ŵ``, ``θ = (W/L) θ̂``, ``M = (EI W/L²) M̂``,
``T = (EI W/L³) T̂``, with ``W`` a reference deflection built from the loads and the bow.
"""

from __future__ import annotations

import math
import warnings
from collections.abc import Callable, Mapping, Sequence

import numpy as np
from scipy.integrate import solve_bvp

__all__ = ["reference_solution", "euler_load", "NAMED_SUPPORTS"]

#: Named supports as (translation, rotation), from the contract.
NAMED_SUPPORTS = {
    "pinned": ("fixed", "free"),
    "fixed": ("fixed", "fixed"),
    "free": ("free", "free"),
    "guided": ("free", "fixed"),
}


def _support(spec) -> tuple:
    """Return (translation, rotation) for a named support or a translation/rotation mapping."""
    if isinstance(spec, str):
        return NAMED_SUPPORTS[spec]
    return (spec["translation"], spec["rotation"])


def _bow_functions(imperfection: Mapping | None, length: float, bow):
    """Return callables (w0, dw0) in metres for the case's initial bow."""
    if bow is not None:
        w0, dw0 = bow[0], bow[1]
        return (lambda x: np.asarray(w0(x), float)), (lambda x: np.asarray(dw0(x), float))
    shape = "none" if not imperfection else imperfection.get("shape", "none")
    a = 0.0 if not imperfection else float(imperfection.get("amplitude", 0.0))
    L = length
    if shape == "none" or a == 0.0:
        zero = lambda x: np.zeros_like(np.asarray(x, float))  # noqa: E731
        return zero, zero
    if shape == "sine":
        return (
            lambda x: a * np.sin(np.pi * np.asarray(x, float) / L),
            lambda x: a * np.pi / L * np.cos(np.pi * np.asarray(x, float) / L),
        )
    if shape == "parabola":
        return (
            lambda x: 4 * a * np.asarray(x, float) * (L - np.asarray(x, float)) / L**2,
            lambda x: 4 * a * (L - 2 * np.asarray(x, float)) / L**2,
        )
    if shape == "sway":
        return (lambda x: a * np.asarray(x, float) / L, lambda x: np.full_like(np.asarray(x, float), a / L))
    if shape == "mode":
        raise ValueError("imperfection 'mode' needs bow=(w0, dw0, d2w0) callables")
    raise ValueError(f"unknown imperfection shape {shape!r}")


def _span(load: Mapping, length: float) -> tuple[float, float]:
    start = load.get("start")
    end = load.get("end")
    return (0.0 if start is None else float(start), length if end is None else float(end))


def _first(items):
    return [item for item in items if item.get("plane", "both") != "second"]


def _breakpoints(case: Mapping, length: float) -> np.ndarray:
    """Segment boundaries: both ends, every concentrated load, load boundary, restraint, step and foundation
    boundary."""
    pts = [0.0, length]
    pts += [float(r["x"]) for r in _first(case.get("restraints", ()))]
    pts += [float(st["x"]) for st in case.get("steps", ())]
    for f in _first(case.get("foundation", ())):
        pts += [float(f["start"]), float(f["end"])]
    for load in case.get("loads", ()):
        if load["type"] in ("point", "couple"):
            pts.append(float(load["x"]))
        else:
            pts.extend(_span(load, length))
    pts = np.clip(np.sort(np.asarray(pts, float)), 0.0, length)
    merged = [pts[0]]
    for p in pts[1:]:
        if p - merged[-1] > 1e-9 * length:
            merged.append(p)
    merged[-1] = length
    return np.asarray(merged)


def _nearest_boundary(x: float, bounds: np.ndarray, length: float) -> int | None:
    i = int(np.argmin(np.abs(bounds - x)))
    return i if abs(bounds[i] - x) <= 1e-9 * length else None


def reference_solution(
    case_dict: Mapping,
    x_eval: Sequence[float] | np.ndarray,
    tol: float = 1e-10,
    *,
    bow: tuple[Callable, Callable, Callable] | None = None,
    max_nodes: int = 400_000,
    nodes_per_segment: int = 41,
) -> dict:
    """Solve one case with ``solve_bvp`` and return the response at ``x_eval``.

    Parameters
    ----------
    case_dict : mapping
        A schema-1 case (conventions.md): ``length`` [m], ``EI`` [N·m²], ``supports``,
        ``axial_force`` [N] (compression positive), ``loads`` and ``imperfection``.
        An object with a ``to_dict()`` method is accepted too.
    x_eval : array_like
        Positions [m], ascending, in ``[0, length]``. A repeated boundary gives left then right values.
    tol : float
        ``solve_bvp`` tolerance [-]. When the mesh limit stops it, the tolerance is relaxed tenfold
        (to at most 1e-6) and the tolerance reached is returned under ``"tol"``.
    bow : tuple of callables, optional
        ``(w0, dw0, d2w0)`` of ``x`` [m] → [m], [-], [1/m]; used instead of the case's imperfection
        (needed for ``shape = "mode"``).
    max_nodes : int
        Mesh limit handed to ``solve_bvp``.
    nodes_per_segment : int
        Initial mesh nodes on ``t ∈ [0, 1]`` (shared by all segments), besides the ``x_eval`` points.

    Returns
    -------
    dict
        ``x`` [m], ``w`` [m], ``rotation`` [-], ``M`` [N·m], ``V`` [N], ``T`` [N], ``w0`` [m] as arrays,
        plus ``tol`` (reached), ``nodes`` (final mesh size) and ``max_rms_residual`` (largest relative
        collocation residual) as floats.
    """
    if hasattr(case_dict, "to_dict"):
        case_dict = case_dict.to_dict()
    L = float(case_dict["length"])
    EI = float(case_dict["EI"])
    P = float(case_dict.get("axial_force", 0.0))
    loads = list(case_dict.get("loads", ()))
    supports = case_dict["supports"]
    left = _support(supports["left"])
    right = _support(supports["right"])
    w0_fun, dw0_fun = _bow_functions(case_dict.get("imperfection"), L, bow)
    x_eval = np.asarray(x_eval, float)

    # Reference deflection W: the order of magnitude of the first-order response.
    scale = 0.0
    for load in loads:
        t = load["type"]
        if t == "uniform":
            scale += abs(load["q"]) * L**4 / EI
        elif t == "linear":
            scale += max(abs(load["q_start"]), abs(load["q_end"])) * L**4 / EI
        elif t == "point":
            scale += abs(load["P"]) * L**3 / EI
        elif t == "couple":
            scale += abs(load["C"]) * L**2 / EI
    if bow is not None:
        xs = np.linspace(0.0, L, 201)
        scale += float(np.max(np.abs(w0_fun(xs))))
    elif case_dict.get("imperfection"):
        scale += abs(float(case_dict["imperfection"].get("amplitude", 0.0)))
    W = scale if scale > 0 else 1.0

    p = P * L**2 / EI  # P L²/EI [-]
    bounds = _breakpoints(case_dict, L) / L  # ξ at segment boundaries
    nseg = len(bounds) - 1
    h = np.diff(bounds)

    # Distributed load on each segment as q̂(ξ) = c0 + c1 ξ (linear loads are linear in x).
    c0 = np.zeros(nseg)
    c1 = np.zeros(nseg)
    for load in loads:
        if load["type"] not in ("uniform", "linear"):
            continue
        a, b = _span(load, L)
        a, b = a / L, b / L
        if load["type"] == "uniform":
            qa = qb = float(load["q"])
        else:
            qa, qb = float(load["q_start"]), float(load["q_end"])
        slope = (qb - qa) / (b - a)
        for j in range(nseg):
            mid = 0.5 * (bounds[j] + bounds[j + 1])
            if a <= mid <= b:
                c1[j] += slope * L**4 / (EI * W)
                c0[j] += (qa - slope * a) * L**4 / (EI * W)

    # EI (relative to the case's) and the foundation modulus (k L⁴/EI) of each segment.
    mids = 0.5 * (bounds[:-1] + bounds[1:]) * L
    rel_EI = np.ones(nseg)
    for st in case_dict.get("steps", ()):
        rel_EI[mids >= float(st["x"])] = float(st["EI"]) / EI
    k_hat = np.zeros(nseg)
    for f in _first(case_dict.get("foundation", ())):
        k_hat[(mids > float(f["start"])) & (mids < float(f["end"]))] += float(f["k"]) * L**4 / EI
    inner = {}
    for r in _first(case_dict.get("restraints", ())):
        inner[_nearest_boundary(float(r["x"]) / L, bounds, 1.0)] = r

    # Concentrated loads, scaled, at each boundary index.
    F_hat = np.zeros(nseg + 1)
    C_hat = np.zeros(nseg + 1)
    for load in loads:
        if load["type"] not in ("point", "couple"):
            continue
        i = _nearest_boundary(float(load["x"]) / L, bounds, 1.0)
        if load["type"] == "point":
            F_hat[i] += float(load["P"]) * L**3 / (EI * W)
        else:
            C_hat[i] += float(load["C"]) * L**2 / (EI * W)

    def fun(t, y):
        dy = np.empty_like(y)
        for j in range(nseg):
            xi = bounds[j] + h[j] * t
            w, th, m, tt = y[4 * j : 4 * j + 4]
            # The bow's slope as this segment sees it: taken a hair inside at its ends, where a bow in the
            # shape of a mode may kink (at a hinge).
            inside = bounds[j] + h[j] * np.clip(t, 1e-12, 1.0 - 1e-12)
            dw0 = dw0_fun(inside * L) * L / W
            dy[4 * j + 0] = h[j] * th
            dy[4 * j + 1] = -h[j] * m / rel_EI[j]
            dy[4 * j + 2] = h[j] * (tt + p * (th + dw0))
            dy[4 * j + 3] = -h[j] * (c0[j] + c1[j] * xi) + h[j] * k_hat[j] * w
        return dy

    def end_rows(side: str, spec: tuple, w, th, m_s, t_s):
        """Two residuals for one end, on support-side M and T."""
        trans, rot = spec
        rows = []
        sgn = 1.0 if side == "left" else -1.0
        if trans == "fixed":
            rows.append(w)
        elif trans == "free":
            rows.append(t_s)
        else:
            kt = float(trans) * L**3 / EI
            # T(0) = k_t w(0), T(L) = -k_t w(L); divided by (1 + k) to keep the row O(1).
            rows.append((t_s - sgn * kt * w) / (1.0 + kt))
        if rot == "fixed":
            rows.append(th)
        elif rot == "free":
            rows.append(m_s)
        else:
            kr = float(rot) * L / EI
            # M(0) = -k_r w'(0), M(L) = k_r w'(L)
            rows.append((m_s + sgn * kr * th) / (1.0 + kr))
        return rows

    def bc(ya, yb):
        res = []
        # Left end: support side 0-, member side 0+: M(0+) = M(0-) + C, T(0+) = T(0-) - F.
        w, th, m, tt = ya[0:4]
        res += end_rows("left", left, w, th, m - C_hat[0], tt + F_hat[0])
        for j in range(nseg - 1):
            yl = yb[4 * j : 4 * j + 4]
            yr = ya[4 * (j + 1) : 4 * (j + 1) + 4]
            rows = [yr[0] - yl[0], yr[1] - yl[1], yr[2] - yl[2] - C_hat[j + 1], yr[3] - yl[3] + F_hat[j + 1]]
            r = inner.get(j + 1)
            if r is not None:
                trans, rot = r.get("translation", "free"), r.get("rotation", "free")
                if r.get("hinge", False):
                    rows[1] = yl[2]
                if trans == "fixed":
                    rows[3] = yl[0]
                elif trans != "free":
                    kt = float(trans) * L**3 / EI
                    rows[3] = (rows[3] - kt * yl[0]) / (1.0 + kt)
                if rot == "fixed":
                    rows[2] = yl[1]
                elif rot != "free":
                    kr = float(rot) * L / EI
                    rows[2] = (rows[2] + kr * yl[1]) / (1.0 + kr)
            res += rows
        # Right end: member side L-, support side L+: M(L+) = M(L-) + C, T(L+) = T(L-) - F.
        w, th, m, tt = yb[4 * (nseg - 1) : 4 * nseg]
        res += end_rows("right", right, w, th, m + C_hat[nseg], tt - F_hat[nseg])
        return np.asarray(res)

    # Map each x_eval to (segment, t).
    seg_of = np.empty(len(x_eval), int)
    t_of = np.empty(len(x_eval))
    xi_eval = x_eval / L
    for n, xi in enumerate(xi_eval):
        i = _nearest_boundary(xi, bounds, 1.0)
        if i is None:
            j = int(np.searchsorted(bounds, xi) - 1)
            j = min(max(j, 0), nseg - 1)
            seg_of[n], t_of[n] = j, (xi - bounds[j]) / h[j]
            continue
        prev_same = n > 0 and _nearest_boundary(xi_eval[n - 1], bounds, 1.0) == i
        next_same = n + 1 < len(xi_eval) and _nearest_boundary(xi_eval[n + 1], bounds, 1.0) == i
        if i == 0:
            seg_of[n], t_of[n] = 0, 0.0
        elif i == nseg:
            seg_of[n], t_of[n] = nseg - 1, 1.0
        elif next_same and not prev_same:
            seg_of[n], t_of[n] = i - 1, 1.0  # first of a repeated station: left value
        else:
            seg_of[n], t_of[n] = i, 0.0  # last or single: right value
    t_mesh = np.unique(np.concatenate([np.linspace(0.0, 1.0, nodes_per_segment), t_of]))
    # Drop mesh points closer than 1e-12 to each other (solve_bvp needs strictly increasing x).
    keep = np.concatenate([[True], np.diff(t_mesh) > 1e-12])
    t_mesh = t_mesh[keep]

    tol_try = tol
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", RuntimeWarning)
        while True:
            sol = solve_bvp(
                fun,
                bc,
                t_mesh,
                np.zeros((4 * nseg, len(t_mesh))),
                tol=tol_try,
                max_nodes=max_nodes,
                bc_tol=tol_try,
            )
            if sol.status == 0:
                break
            if sol.status == 1 and tol_try < 1e-6:
                tol_try *= 10.0
                continue
            raise RuntimeError(f"solve_bvp failed: {sol.message}")

    Y = sol.sol(np.clip(t_of, 0.0, 1.0))  # (4 nseg, n)
    cols = np.arange(len(x_eval))
    w_h = Y[4 * seg_of + 0, cols]
    th_h = Y[4 * seg_of + 1, cols]
    m_h = Y[4 * seg_of + 2, cols]
    t_h = Y[4 * seg_of + 3, cols]
    w0 = np.asarray(w0_fun(x_eval), float) * np.ones_like(x_eval)
    dw0 = np.asarray(dw0_fun(x_eval), float) * np.ones_like(x_eval)
    w = W * w_h
    rotation = W / L * th_h
    M = EI * W / L**2 * m_h
    T = EI * W / L**3 * t_h
    V = T + P * (rotation + dw0)
    return {
        "x": x_eval.copy(),
        "w": w,
        "rotation": rotation,
        "M": M,
        "V": V,
        "T": T,
        "w0": w0,
        "tol": float(tol_try),
        "nodes": float(sol.x.size),
        "max_rms_residual": float(np.max(sol.rms_residuals)) if sol.rms_residuals.size else 0.0,
    }


def euler_load(EI: float, length: float) -> float:
    """Return π²EI/L² [N] (pinned–pinned critical load), a convenience for tests."""
    return math.pi**2 * EI / length**2
