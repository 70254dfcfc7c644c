r"""The capacity finder: the largest axial compression the member carries at a strength utilisation of 1.

Two ways to load the member up:

- ``mode="axial"``: the transverse loads stay as given and only the axial force grows;
- ``mode="proportional"``: every load, axial and transverse, grows by one factor :math:`\lambda` (a
  load-factor
  sweep); the case's own axial force is the reference and must be compression.

Either way the bow stays as the case resolves it (a code bow depends on the member, not on the load), and
where its direction is automatic each trial solves both directions and keeps the worse. The strength checks
of :mod:`engine.checks` set the capacity; the deflection check (serviceability) does not.
The search brackets the first crossing of utilisation 1 on a grid below the first critical load and refines it
by Brent's method; if the utilisation never reaches 1 below the critical load, elastic buckling governs
and the
capacity is the critical load itself.

On the EN 1993-1-1 route with the eq. (5.9) bow, the capacity is exactly
:math:`N_{b,Rd} = \chi A f_y/\gamma_{M1}` of eqs. (6.47) and (6.49) for every support set, springs included,
with the elastic or the plastic check method (the route's linear member check; the Ayrton–Perry identity); the
tests check it.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

import numpy as np

from engine.analysis import _solve, check_stations, solve
from engine.buckling_interaction import TERM as INTERACTION
from engine.classification import classify_at
from engine.combination_cases import combination_bow_reversed, combination_case, reversals
from engine.errors import CaseError
from engine.member_routes import LTB_ELASTIC, headline
from engine.out_of_plane import ELASTIC_KIND as OUT_OF_PLANE_ELASTIC
from engine.out_of_plane import KIND as OUT_OF_PLANE
from engine.prepared import prepare
from engine.roots import brentq
from engine.sway_buckling import TERM as SWAY
from engine.torsional_buckling import TERM as TORSIONAL

__all__ = ["Capacity", "capacity", "capacity_of", "lowest_capacity", "ultimate_cases"]

MODES = ("axial", "proportional")


@dataclass(frozen=True, kw_only=True)
class Capacity:
    """The largest axial compression at strength utilisation 1.

    Attributes
    ----------
    axial_force : float
        [N].
    load_factor : float
        The factor on the case's loads (``proportional``), or ``axial_force / case.axial_force`` when that is
        compression, else NaN [-].
    check : str
        The check that governs there (``"elastic stress"``, ``"plastic N–M"``, ``"shear"``, the eq. (5.9)
        route's linear member check), or ``"elastic buckling"`` when the critical load comes first, or
        ``"transverse loads alone"`` when the member fails with no axial force at all, or
        ``"class 4 section"`` when the section is class 4 in compression (EN 1993-1-1 Table 5.2; then
        ``axial_force`` is 0), or ``"out-of-plane elastic buckling"`` when the elastic critical load about the
        other axis comes first where the code's check about it is not made (then ``axial_force`` is that N_cr,
        a bound: the capacity is at most this).
    x : float or None
        Where it governs [m].
    critical_load : float
        Pcr1 [N], for comparison: the smaller of the two planes' for a two-plane case.
    mode : str
    message : str
    route : str
        The route of the member check that governs there (:data:`engine.design.routes.ROUTES`): the capacity
        is where the headline utilisation, the largest of the enabled routes (``check.routes``), reaches 1.
        For the ``en-member`` and ``aisc`` routes ``check`` is the governing term's code (``"eq-6.62"``,
        ``"H1-1a"``, ...).
    combination : str or None
        With load cases (:func:`capacity_of`): the ultimate combination whose capacity is the lowest, the one
        given; None for a plain case.
    """

    axial_force: float
    load_factor: float
    check: str
    x: float | None
    critical_load: float
    mode: str
    message: str
    route: str = "second-order"
    combination: str | None = None


#: The largest axial force a case accepts (engine.case); beyond it a trial is built the validating way, which
#: refuses it as before.
_MAX_AXIAL_FORCE = 1e12


#: The second-order route's terms that the member check (``result.check``) does not hold.
_ROUTE_ONLY_TERMS = ("lateral-torsional", INTERACTION, LTB_ELASTIC, TORSIONAL, SWAY)


def _at_force(case, force: float):
    """``dataclasses.replace(case, axial_force=force)`` without validating the case again.

    Only the axial force changes, and a valid case stays valid at any finite force within the case's limit
    (the same shortcut as :meth:`Case.without_axial_force`); outside it the validating way raises as before.
    """
    force = float(force)
    if not (math.isfinite(force) and abs(force) <= _MAX_AXIAL_FORCE) or force == 0.0:
        return dataclasses.replace(case, axial_force=force) if force != 0.0 else case.without_axial_force()
    twin = object.__new__(type(case))
    twin.__dict__.update(case.__dict__)
    twin.__dict__["axial_force"] = force
    return twin


def _scaled(case, factor, mode, reference):
    if mode == "axial":
        return _at_force(case, factor)
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


def capacity_of(result, mode: str = "axial", stations: int = 201) -> Capacity:
    """:func:`capacity` of what a solved ``result`` holds: its case, or with load cases the lowest over every
    ultimate combination (:func:`lowest_capacity`).

    With load cases each ultimate combination keeps its own transverse loads while its axial force grows
    (``"axial"``), or grows as a whole (``"proportional"``, the combinations in compression). The headline's
    combination alone is not enough: another one with more transverse load (wind with uplift, say, whose
    axial force is smaller) can fail at a lower compression.
    """
    actions = getattr(result, "actions", None)
    if actions is None:
        return capacity(result.case, mode, stations)
    return lowest_capacity(ultimate_cases(actions), mode, stations)


def ultimate_cases(actions) -> tuple:
    """(name, plain case) of every ultimate combination of an :class:`engine.envelope.ActionsResult`, its
    shaped bow as given (:func:`lowest_capacity` tries it both ways)."""
    return tuple(
        (item.name, combination_case(actions.case, item.combination))
        for item in actions.combinations
        if item.combination.state == "ultimate"
    )


def lowest_capacity(named_cases, mode: str = "axial", stations: int = 201) -> Capacity:
    """The lowest :func:`capacity` of the ultimate combinations ``named_cases`` ((name, plain case) pairs),
    named (``Capacity.combination``); each with a bow given by shape and amplitude tried both ways, as every
    ultimate combination is solved (``bow_both_ways``).

    ``"axial"``: the lowest axial force; combinations that differ in their axial force alone share one search
    (their capacity is the same). ``"proportional"``: the lowest load factor over the combinations in
    compression (a factor on a tension has no compression to find); an error when none is, or when a
    combination not in compression reaches utilisation 1 at that factor (an independent audit: 6.1 from U1
    while U2 was at 1.32 there; its utilisation grows with the factor, so the check at the factor suffices).
    """
    found, seen, tension = [], {}, []
    for name, case in named_cases:
        if mode == "proportional" and not float(case.axial_force) > 0.0:
            tension.append((name, case))
            continue
        key = case.without_axial_force() if mode == "axial" else name
        item = seen.get(key)
        if item is None:
            item = seen[key] = capacity(case, mode, stations, bow_both_ways=True)
        if mode == "axial":  # a shared search: the factor on this combination's own axial force
            reference = float(case.axial_force)
            item = dataclasses.replace(
                item, load_factor=item.axial_force / reference if reference > 0 else math.nan
            )
        found.append(dataclasses.replace(item, combination=name))
    if not found:
        if mode == "proportional":
            raise CaseError(
                "axial_force: no ultimate combination is in compression, so no proportional capacity is "
                "found (it is a factor on a combination's compression); use the axial capacity"
            )
        raise CaseError("combinations: no ultimate combination, so no capacity is found")
    measure = (lambda c: c.axial_force) if mode == "axial" else (lambda c: c.load_factor)
    lowest = min(found, key=measure)  # the first of equal ones
    for name, case in tension:  # not in compression: it must not fail below the factor found
        trial = _scaled(case, lowest.load_factor, "proportional", float(case.axial_force))
        # with its bow both ways, as the combination is solved (reversed in tension it is often the worse:
        # an audit found 0.9995 as given and 1.232 reversed at the factor found)
        trials = [trial] + [combination_bow_reversed(trial, f, s) for f, s in reversals(trial)]
        values = [solve(t, stations=stations).utilization for t in trials]
        u = None if None in values else max(values)
        if u is None or u >= 1.0:
            shown = "unbounded" if u is None else f"{u:.3f}"
            raise CaseError(
                f"combinations: {name}, not in compression, reaches utilisation {shown} at the load factor "
                f"{lowest.load_factor:.4g} of {lowest.combination}: the proportional capacity of the "
                "combinations in compression is not the member's; use the axial capacity"
            )
    return lowest


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
    bow_both_ways : bool
        Try a bow given by shape and amplitude pointing both ways (in each plane) and keep the lowest
        capacity: for the governing combination of a case with load cases (``result.case``), whose every
        ultimate combination is solved with such a bow both ways (:func:`engine.combination_cases.reversals`).
        The combination keeps the way worse at its own axial force, which can be the better one in
        compression (a combination in tension keeps the bow reversed). A preset's direction is automatic and
        tried both ways anyway.

    Returns
    -------
    Capacity
    """
    if bow_both_ways:
        found = [capacity(case, mode, stations)]
        for first, second in reversals(case):
            other = combination_bow_reversed(case, first, second)
            found.append(capacity(other, mode, stations))
        return min(found, key=lambda item: item.axial_force)  # the first of equal ones
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
    n = check_stations(stations)
    probe = solve(case.without_axial_force(), stations=n)
    prep = prepare(case)  # the same prepared member for every trial force: looked up once
    pcr1 = float(probe.critical_loads[0])
    if probe.second_plane is not None:  # a two-plane case buckles in the weaker plane first
        pcr1 = min(pcr1, float(probe.second_plane.critical_loads[0]))
    if mode == "axial":
        top = pcr1
    else:
        top = pcr1 / reference

    seen: dict[float, float] = {}  # Brent's method starts from the two grid points already solved
    if mode == "axial":
        # At no axial force the strength solve is the probe: neither the reversed bow nor the bow-free
        # solution is made at P = 0 (engine.analysis._solve_plane), so the details change nothing there.
        seen[0.0] = math.inf if probe.utilization is None else probe.utilization

    def utilisation(t: float) -> float:
        # The headline (the largest enabled route); both directions of an automatic bow, the worse kept; no
        # service check (strength only).
        t = float(t)
        u = seen.get(t)
        if u is None:
            try:
                trial = _scaled(case, t, mode, reference)
            except CaseError:  # loads scaled past what a case accepts (a tiny reference force): failing there
                if mode == "axial":
                    raise
                seen[t] = math.inf
                return math.inf
            r = _solve(trial, prep if mode == "axial" else prepare(trial), n, details=False)
            u = seen[t] = math.inf if r.utilization is None else r.utilization
        return u

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

    compressed_class = classify_at(probe.section, probe.material, 1e-9 * top)
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
            trial = _scaled(case, root, mode, reference)
            r = _solve(trial, prep if mode == "axial" else prepare(trial), n)
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
            second = next((item for item in r.routes or () if item.route == "second-order"), None)
            if second is not None and second.governing in _ROUTE_ONLY_TERMS:
                # A term of the route beyond the member check (lateral-torsional buckling, the out-of-plane
                # interaction): the root itself, never N_b,Rd, which lies above it.
                return found(
                    root,
                    second.governing,
                    None,
                    f"The second-order route governs: utilisation 1 by {second.governing}.",
                )
            if r.check.strength_kind == OUT_OF_PLANE_ELASTIC:
                n_cr = r.check.out_of_plane.N_cr  # exactly: N/N_cr is linear in N
                return found(
                    n_cr if mode == "axial" else n_cr / reference,
                    OUT_OF_PLANE_ELASTIC,
                    None,
                    f"Out-of-plane elastic buckling bounds it: N_cr = {n_cr * 1e-3:.6g} kN about the "
                    f"{r.check.out_of_plane.axis} axis (the code's buckling check about that axis is not "
                    "made: the capacity is at most this).",
                )
            if r.check.strength_kind == OUT_OF_PLANE:
                n_b = r.check.out_of_plane.N_b_Rd  # exactly: N/N_b,Rd is linear in N
                area = "A_eff" if r.check.out_of_plane.effective else "A"
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
