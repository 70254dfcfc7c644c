"""The sweep: the peaks of one member at many axial forces, solved together (the amplification curves)."""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from engine import bow_variants
from engine.analysis import CRITICAL_TOLERANCE, check_stations, solve
from engine.errors import CaseError
from engine.prepared import prepare
from engine.reference import reference_peaks
from engine.results import Governing, Peak, SweepResult
from engine.solver.batch import Batch
from engine.solver.model import Points
from engine.solver.peaks import refine_peaks, strongest_tension_kappa

__all__ = ["ROUTE_SWEEP_TOP", "route_sweep", "route_sweep_forces", "sweep"]

#: A route sweep stops at this fraction of the lowest first critical load of the planes (at Pcr1 itself every
#: second-order value is unbounded).
ROUTE_SWEEP_TOP = 0.95


def _at_critical(P: np.ndarray, pcr: np.ndarray) -> np.ndarray:
    """Whether each axial force is at each critical load (to CRITICAL_TOLERANCE): shape (forces, loads)."""
    P = np.atleast_1d(P)
    return (P[:, None] > 0) & (np.abs(P[:, None] / pcr[None, :] - 1.0) < CRITICAL_TOLERANCE)


def sweep(case, axial_forces, stations: int = 101) -> SweepResult:
    """Governing values of ``case`` for many axial forces at once (the other loads as given).

    Where a code preset leaves the bow's direction automatic, both directions are swept and each value is the
    worse of the two at each force; where a preset's bow takes the first mode's shape, the half sine between
    the ends is swept too (:attr:`engine.member.BowChoice.alternatives`).

    Parameters
    ----------
    case : Case
        Its own ``axial_force`` is ignored.
    axial_forces : array_like
        Axial forces [N], compression positive, finite.
    stations : int
        Uniform stations used to bracket the exact peaks.

    Returns
    -------
    SweepResult
        Arrays in the order of ``axial_forces``.
    """
    n = check_stations(stations)
    P = np.atleast_1d(np.asarray(axial_forces, dtype=float)).ravel()
    if P.size == 0 or not np.isfinite(P).all():
        raise CaseError("axial_forces: give at least one finite axial force [N]")
    prep = prepare(case)
    out, first, critical = _sweep_arrays(prep, P, n)
    choice = prep.member.bow if prep.member is not None else None
    kinds = ()
    if choice is not None and prep.has_bow:  # the half sines between the ends beside a first-mode bow too
        kinds = bow_variants.keys(choice.automatic, len(choice.alternatives))
    for kind in kinds:
        other, _, _ = _sweep_arrays(prep.variant(kind), P, n)
        for key in ("deflection", "total_offset", "shear"):
            better = other[key][0] > out[key][0]
            out[key] = tuple(np.where(better, o, v) for o, v in zip(other[key], out[key], strict=True))
        better = other["moment"][0] > out["moment"][0]  # the moment and its amplifications go together
        for key in ("moment", "amp_m", "amp_m1"):
            out[key] = tuple(np.where(better, o, v) for o, v in zip(other[key], out[key], strict=True))
    pcr = prep.buckling.critical_loads
    return SweepResult(
        axial_force=P,
        peak_deflection=out["deflection"][0],
        peak_deflection_x=out["deflection"][1],
        peak_total_offset=out["total_offset"][0],
        peak_total_offset_x=out["total_offset"][1],
        peak_moment=out["moment"][0],
        peak_moment_x=out["moment"][1],
        peak_shear=out["shear"][0],
        peak_shear_x=out["shear"][1],
        moment_amplification=out["amp_m"][0],
        moment_amplification_first_order=out["amp_m1"][0],
        deflection_amplification=(
            out["total_offset"][0] / out["d1"] if out["d1"] > 0 else np.full(P.size, np.nan)
        ),
        simple_amplification=np.where(P < pcr[0], 1.0 / np.where(P < pcr[0], 1.0 - P / pcr[0], 1.0), np.nan),
        stable=(P < pcr[0]) & ~critical,
        critical=critical,
        critical_loads=pcr.copy(),
        first_order=first,
    )


def _sweep_arrays(prep, P, n):
    """The peaks of one prepared member at many axial forces: ({field: (values, x)}, first order,
    critical)."""
    model, pcr = prep.model, prep.buckling.critical_loads
    at_critical = _at_critical(P, pcr).any(axis=1)
    # A force exactly at a critical load has no solution; solve a neighbour instead (its values become inf
    # below), so that the batched solve does not fall back to one force at a time.
    allP = np.concatenate([np.where(at_critical, P * (1.0 - 1e-6), P), [0.0]])
    batch = Batch(model, allP)
    critical = at_critical | batch.singular[:-1]
    seg, xi, _, _ = prep.stations(n, strongest_tension_kappa(model, P))
    nP = allP.size
    iP = np.repeat(np.arange(nP), seg.size)
    pts = Points(model, np.tile(seg, nP), np.tile(xi, nP))
    st = batch.states(iP, pts)
    pi, ps, px, pk = refine_peaks(batch, iP, pts, *batch.targets(st, pts))
    nb = seg.size
    x_base = model.position(seg, xi)
    x_peak = model.position(ps, px)

    def peaks(base, peak):
        """Largest |value| per axial force and where, from the stations and the refined peaks."""
        b = np.abs(base).reshape(nP, nb)
        i = np.argmax(b, axis=1)
        val, at = b[np.arange(nP), i], x_base[i]
        if peak.size:
            pv = np.abs(peak)
            order = np.argsort(pv)  # ascending, so the largest of each axial force is written last
            best = np.full(nP, -1.0)
            where = np.zeros(nP)
            best[pi[order]] = pv[order]
            where[pi[order]] = x_peak[order]
            better = best > val
            val, at = np.where(better, best, val), np.where(better, where, at)
        return val, at

    out = {}
    for key, arrays in {
        "deflection": (st["w"], pk["w"]),
        "total_offset": (st["w"] + st["w0"], pk["w"] + pk["w0"]),
        "moment": (st["M"], pk["M"]),
        "shear": (st["V"], pk["V"]),
    }.items():
        out[key] = peaks(*arrays)
    t_first = np.abs(st["T"][-nb:])
    first = Governing(
        **{k: Peak(value=float(v[0][-1]), x=float(v[1][-1])) for k, v in out.items()},
        transverse_force=Peak(value=float(t_first.max()), x=float(x_base[np.argmax(t_first)])),
    )
    result = {}
    for key, (vals, xs) in out.items():
        v, xv = vals[:-1].copy(), xs[:-1].copy()
        v[critical] = np.inf
        result[key] = (v, xv)
    m1 = out["moment"][0][-1]
    ref = reference_peaks(prep.reference(n), P) if prep.has_bow else np.full(P.size, m1)
    with np.errstate(divide="ignore", invalid="ignore"):
        result["amp_m"] = (np.where(ref > 1e-300, result["moment"][0] / ref, np.nan),)
        result["amp_m1"] = (result["moment"][0] / m1 if m1 > 0 else np.full(P.size, np.nan),)
    result["d1"] = out["total_offset"][0][-1]
    return result, first, critical


def route_sweep_forces(result, points: int = 25) -> np.ndarray:
    """Axial forces [N] from 0 to :data:`ROUTE_SWEEP_TOP` times the lowest critical load: each plane's Pcr1,
    and the out-of-plane N_cr of a one-plane member whose buckling about the other axis is checked."""
    pcr = [float(result.critical_loads[0])]
    second = getattr(result, "second_plane", None)
    if second is not None:
        pcr.append(float(second.critical_loads[0]))
    out = None if result.check is None else result.check.out_of_plane
    if out is not None and out.checked and out.N_cr is not None:
        pcr.append(float(out.N_cr))
    positive = [p for p in pcr if math.isfinite(p) and p > 0]
    top = ROUTE_SWEEP_TOP * min(positive) if any(p > 0 for p in pcr) else 0.0
    return np.linspace(0.0, top, points)


def _value(utilisation) -> float:
    if utilisation is None:
        return math.nan
    value = float(utilisation)
    return value if math.isfinite(value) else math.nan


def route_sweep(case, forces, stations: int = 101) -> dict:
    """Each route's utilisation and the headline of ``case`` at ``forces`` [N] (NaN where a route does not
    apply or is unbounded).

    Returns
    -------
    dict
        ``forces`` [N], ``headline`` (``Result.utilization``), ``routes`` {route code: utilisations},
        ``enabled`` {route code: bool}.
    """
    forces = np.asarray(forces, dtype=float)
    headline = np.full(forces.size, math.nan)
    routes: dict[str, np.ndarray] = {}
    enabled: dict[str, bool] = {}
    for i, force in enumerate(forces):
        result = solve(dataclasses.replace(case, axial_force=float(force)), stations=stations)
        headline[i] = _value(result.utilization)
        for route in result.routes:
            routes.setdefault(route.route, np.full(forces.size, math.nan))[i] = _value(route.utilization)
            enabled[route.route] = bool(route.enabled)
    return {"forces": forces, "headline": headline, "routes": routes, "enabled": enabled}
