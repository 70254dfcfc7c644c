"""The capacity finder as it was before issue 18, kept as the reference of the faster one.

A verbatim copy of ``engine/capacity.py``'s search at the commit before issue 18's speed work (each trial a
validated case and a full :func:`engine.analysis.strength_solve`): ``tests/app/test_batch_exact.py`` checks
that :func:`engine.capacity` still gives its numbers to 1e-9 relative. Not used by the product. Three later
corrections of what the capacity is (not of how fast it is found) are mirrored, marked so, and at stop 37 the
new route term and the shaped bow tried both ways.
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from engine.analysis import solve, strength_solve
from engine.capacity import Capacity
from engine.classification import classify
from engine.combination_cases import combination_bow_reversed, reversals
from engine.errors import CaseError
from engine.member_routes import LTB_ELASTIC, headline
from engine.out_of_plane import ELASTIC_KIND as OUT_OF_PLANE_ELASTIC
from engine.out_of_plane import KIND as OUT_OF_PLANE
from engine.roots import brentq
from engine.sway_buckling import TERM as SWAY
from engine.torsional_buckling import TERM as TORSIONAL

#: The second-order route's terms beyond the member check (engine.capacity's own list, copied).
_ROUTE_ONLY_TERMS = (
    "lateral-torsional",
    "buckling-interaction",
    LTB_ELASTIC,
    TORSIONAL,
    SWAY,
)  # SWAY: stop 37

__all__ = ["capacity"]

MODES = ("axial", "proportional")


def _scaled(case, factor, mode, reference):
    if mode == "axial":
        return dataclasses.replace(case, axial_force=factor)
    changes = {"axial_force": reference * factor, "loads": _scaled_loads(case.loads, factor)}
    if case.second_plane is not None:  # every load, in both planes
        changes["second_plane"] = dataclasses.replace(
            case.second_plane, loads=_scaled_loads(case.second_plane.loads, factor)
        )
    return dataclasses.replace(case, **changes)


def _scaled_loads(loads, factor) -> tuple:
    out = []
    for load in loads:
        if load.type == "uniform":
            out.append(dataclasses.replace(load, q=load.q * factor))
        elif load.type == "linear":
            out.append(dataclasses.replace(load, q_start=load.q_start * factor, q_end=load.q_end * factor))
        elif load.type == "point":
            out.append(dataclasses.replace(load, P=load.P * factor))
        else:
            out.append(dataclasses.replace(load, C=load.C * factor))
    return tuple(out)


def capacity(case, mode: str = "axial", stations: int = 201, bow_both_ways: bool = False) -> Capacity:
    """The largest axial compression at which the governing strength utilisation reaches 1.

    Parameters
    ----------
    case : Case
        With a section and material (the check needs them).
    mode : {"axial", "proportional"}
        Grow the axial force alone, or all loads by one factor.
    stations : int
        Stations of each trial solve (the peaks are exact whatever the number).

    Returns
    -------
    Capacity
    """
    if bow_both_ways:  # mirrored correction (stop 37): a shaped bow tried both ways, the lowest kept
        found = [capacity(case, mode, stations)]
        for first, second in reversals(case):
            found.append(capacity(combination_bow_reversed(case, first, second), mode, stations))
        return min(found, key=lambda item: item.axial_force)
    if mode not in MODES:
        raise CaseError(f"mode: {mode!r} is not a capacity mode; allowed: 'axial', 'proportional'")
    if case.section is None or case.material is None:
        raise CaseError("section: the capacity needs a section and a material for the member check")
    reference = float(case.axial_force)
    if mode == "proportional" and reference <= 0:
        raise CaseError(
            f"axial_force: {reference!r} N must be compression (> 0) for a proportional capacity: "
            "it is the load the factor multiplies"
        )
    probe = solve(dataclasses.replace(case, axial_force=0.0), stations=stations)
    pcr1 = float(probe.critical_loads[0])
    if probe.second_plane is not None:  # a two-plane case buckles in the weaker plane first
        pcr1 = min(pcr1, float(probe.second_plane.critical_loads[0]))
    if mode == "axial":
        top = pcr1
    else:
        top = pcr1 / reference

    def utilisation(t: float) -> float:
        # The headline (the largest enabled route); both directions of an automatic bow, the worse kept; no
        # service check (strength only).
        r = strength_solve(_scaled(case, t, mode, reference), stations=stations)
        return math.inf if r.utilization is None else r.utilization

    def found(t, check, x, message, route="second-order"):
        force = t if mode == "axial" else t * reference
        factor = t if mode == "proportional" else (force / reference if reference > 0 else math.nan)
        return Capacity(
            axial_force=float(force),
            load_factor=float(factor),
            check=check,
            x=x,
            critical_load=pcr1,
            mode=mode,
            message=message,
            route=route,
        )

    # mirrored correction (stop 27): the class at the smallest compression has the web in bending and
    # compression (alpha from N), as engine.capacity asks it
    compressed_class = classify(probe.section, probe.material, compression=True, axial_force=1e-9 * top)
    if (
        compressed_class is not None
        and compressed_class.klass == 4
        and math.isinf(utilisation(1e-9 * top))  # the headline follows the class-4 refusal
    ):
        return found(
            0.0,
            "class 4 section",
            None,
            f"The section is {compressed_class.describe()} in compression: its gross-section "
            "resistance is not valid, so no axial compression capacity is given (effective "
            "properties, EN 1993-1-5, are not computed).",
        )
    u0 = utilisation(0.0) if mode == "axial" else 0.0
    if mode == "axial" and u0 >= 1.0:
        return found(
            0.0,
            "transverse loads alone",
            probe.check.x if probe.check else None,
            f"The transverse loads alone give utilisation {u0:.3f} ≥ 1: no axial force can be carried.",
            headline(probe.routes)[1] or "second-order",
        )
    # Bracket the first crossing: finer towards the critical load, where the amplification runs away.
    grid = top * (1.0 - np.geomspace(1.0, 1e-9, 48))
    grid[0] = 0.0
    prev_t = 0.0
    for t in grid[1:]:
        u = utilisation(float(t))
        if u >= 1.0:
            root = brentq(lambda s: utilisation(s) - 1.0, prev_t, float(t), xtol=1e-12 * top, rtol=1e-13)
            r = solve(_scaled(case, root, mode, reference), stations=stations)
            _, route, _ = headline(r.routes)
            if route != "second-order":
                governing = next(item for item in r.routes if item.route == route)
                return found(
                    root,
                    governing.governing,
                    None,
                    f"The {route} route governs: utilisation 1 by {governing.governing}.",
                    route,
                )
            # Corrections made since (not speed work), mirrored so that the two still compare: a term of the
            # second-order route beyond the member check governs at the root itself (stop 25), and the
            # bound N/N_cr about the other axis where its code check is not made gives N_cr (stop 26).
            second = next((item for item in r.routes or () if item.route == "second-order"), None)
            if second is not None and second.governing in _ROUTE_ONLY_TERMS:
                return found(
                    root,
                    second.governing,
                    None,
                    f"The second-order route governs: utilisation 1 by {second.governing}.",
                )
            if r.check.strength_kind == OUT_OF_PLANE_ELASTIC:
                n_cr = r.check.out_of_plane.N_cr
                return found(n_cr if mode == "axial" else n_cr / reference, OUT_OF_PLANE_ELASTIC, None, "")
            if r.check.strength_kind == OUT_OF_PLANE:
                n_b = r.check.out_of_plane.N_b_Rd  # exactly: N/N_b,Rd is linear in N
                area = "A_eff" if r.check.out_of_plane.effective else "A"  # mirrored (stop 27)
                return found(
                    n_b if mode == "axial" else n_b / reference,
                    OUT_OF_PLANE,
                    None,
                    f"Out-of-plane flexural buckling governs: N_b,Rd = chi·{area}·f_y/γ_M1 = "
                    f"{n_b * 1e-3:.6g} kN ({r.check.out_of_plane.describe()}).",
                )
            return found(
                root,
                r.check.strength_kind,
                r.check.x,
                f"Strength governs: utilisation 1 by {r.check.strength_kind} at x = {r.check.x:.3f} m.",
            )
        prev_t = float(t)
    return found(
        top,
        "elastic buckling",
        None,
        f"Utilisation stays below 1 up to the first critical load ({pcr1 * 1e-3:.6g} kN): elastic "
        "buckling governs.",
    )
