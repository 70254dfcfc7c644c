"""The plain case of one load combination, and a service combination solved with its bow both ways.

:func:`combination_case` turns a combination (:mod:`engine.combinations`) into a plain derived case: the
case's member, supports and check settings with the summed factored loads and axial force of the actions.
:mod:`engine.envelope` solves every combination through it.

Service combinations are solved without the bow unless ``combinations.service_bow``. With it, the bow is
unfavourable for the deflection when it points the way that gives the larger deflection, which is not always
the way the strength check prefers (a preset's automatic direction is chosen by the strength check). So each
plane's bow is solved both ways, fixed, and the larger deflection kept (:func:`solve_service`); the planes of
a two-plane case are uncoupled, so each plane's direction is chosen on its own deflection.
"""

from __future__ import annotations

import dataclasses
import math

from engine import analysis
from engine.actions import scaled
from engine.combinations import Combination
from engine.inputs import Imperfection
from engine.plane import default_bow
from engine.prepared import prepare

__all__ = [
    "SERVICE_BASIS",
    "combination_case",
    "reversals",
    "service_plan",
    "service_result",
    "solve_service",
]


def _combination_bow(bow, state: str, service_bow: bool, sign: float, fixed: bool = False):
    """A plane's bow in a combination: none in a service one (unless ``service_bow``), a preset tried both
    ways (``fixed``: pointing positive, or negative for ``sign`` -1), a bow given by shape and amplitude
    reversed for ``sign`` -1."""
    if state == "service" and not service_bow:
        return Imperfection()
    if bow.preset is not None:
        direction = ("positive" if sign > 0 else "negative") if fixed else "load"
        return bow if bow.direction == direction else dataclasses.replace(bow, direction=direction)
    if sign < 0:
        return dataclasses.replace(bow, amplitude=-bow.amplitude)
    return bow


def _shaped(bow) -> bool:
    """True for a bow given by shape and amplitude (not a preset, not zero): solved both ways."""
    return bow is not None and bow.preset is None and bow.shape != "none" and bow.amplitude != 0.0


def _reversible(bow) -> bool:
    """True for a bow that has two directions (a preset, or a shape with an amplitude)."""
    return bow is not None and (bow.preset is not None or _shaped(bow))


def combination_case(
    case,
    combination: Combination,
    *,
    bow_sign: float = 1.0,
    second_bow_sign: float = 1.0,
    fixed: bool = False,
):
    """The plain case of one combination: factored loads summed, factored axial forces summed, in each plane.

    A factor of 1 leaves a load object as it is, so a one-action case under a factor of 1 is the plain case it
    was made from. ``bow_sign`` -1 reverses a bow given by shape and amplitude; ``second_bow_sign`` the
    second plane's. ``fixed`` (a service combination with its bow) fixes a preset's direction by the sign
    instead of leaving it automatic, and gives the second plane its default bow explicitly. In a two-plane
    case each action's ``second_loads`` go to the second plane.
    """
    loads, second, axial = [], [], 0.0
    for action, factor in zip(case.actions, combination.factors, strict=True):
        if factor == 0.0:
            continue
        axial += factor * action.axial_force
        loads.extend(scaled(load, factor) for load in action.loads)
        second.extend(scaled(load, factor) for load in action.second_loads or ())
    state, service_bow = combination.state, case.combinations.service_bow
    changes = {
        "actions": None,
        "combinations": None,
        "loads": tuple(loads),
        "axial_force": axial,
        "imperfection": _combination_bow(case.imperfection, state, service_bow, bow_sign, fixed),
    }
    plane = case.second_plane
    if plane is not None:
        bow = plane.imperfection
        if fixed and bow is None:
            bow = default_bow(case)
        if bow is not None or (state == "service" and not service_bow):
            bow = _combination_bow(bow or Imperfection(), state, service_bow, second_bow_sign, fixed)
        # None stays None: the default bow, a preset whose direction is automatic (tried both ways).
        changes["second_plane"] = dataclasses.replace(plane, loads=tuple(second), imperfection=bow)
    return dataclasses.replace(case, **changes)


def reversals(case) -> tuple:
    """The (first, second) plane bow reversals to try beside none: each plane whose bow is shaped."""
    first = _shaped(case.imperfection)
    second = case.second_plane is not None and _shaped(case.second_plane.imperfection)
    signs = [(a, b) for a in (False, True) for b in (False, True) if (a <= first and b <= second)]
    return tuple(signs[1:])


def service_plan(case, combination) -> tuple:
    """``(derived case, prepared, variants)`` of a service combination. With ``service_bow`` and an axial
    force, each plane whose bow has two directions is tried both ways: ``variants`` holds the other
    ``(case, prepared, (first reversed, second reversed))``; otherwise it is empty and the case as before."""
    derived = combination_case(case, combination)
    if not case.combinations.service_bow or derived.axial_force == 0.0:
        return derived, prepare(derived), ()
    fixed = combination_case(case, combination, fixed=True)
    first = _reversible(fixed.imperfection)
    second = fixed.second_plane is not None and _reversible(fixed.second_plane.imperfection)
    if not (first or second):
        return derived, prepare(derived), ()
    variants = []
    for a in (False, True):
        for b in (False, True):
            if (a, b) == (False, False) or a > first or b > second:
                continue
            other = combination_case(
                case, combination, bow_sign=-1.0 if a else 1.0, second_bow_sign=-1.0 if b else 1.0, fixed=True
            )
            variants.append((other, prepare(other), (a, b)))
    return fixed, prepare(fixed), tuple(variants)


def _service_with_bow(result):
    """The deflection check on w with the bow (``combinations.service_bow``)."""
    if result.service is None or result.status == "critical":
        return result
    peak = result.governing.deflection
    service = dataclasses.replace(
        result.service,
        utilization=abs(peak.value) / result.service.allowed,
        deflection=peak.value,
        x=peak.x,
        basis="second order at the combination's axial force, with the initial bow (as the case asks)",
    )
    return dataclasses.replace(result, service=service)


SERVICE_BASIS = "second order at the combination's axial force, on its factored loads, without the bow"


def service_result(result, service_bow: bool):
    """A service combination's result with its deflection check's basis (each plane's in a two-plane case)."""

    def one(r):
        if service_bow:
            return _service_with_bow(r)
        if r.service is None:
            return r
        return dataclasses.replace(r, service=dataclasses.replace(r.service, basis=SERVICE_BASIS))

    result = one(result)
    if result.second_plane is not None:
        result = dataclasses.replace(result, second_plane=one(result.second_plane))
    return result


def _deflection(result, plane: int) -> float:
    """What decides a service bow's direction: the plane's deflection utilisation (else max|w|), +inf at or
    above a critical load."""
    if result.status != "stable":
        return math.inf
    r = result if plane == 1 else result.second_plane
    if r.service is not None:
        return float(r.service.utilization)
    return float(r.governing.deflection.magnitude)


_NOT_FOR_SERVICE = ("bow-opposes-load",)  # a fixed direction's strength caution: the service one is chosen


def _kept(reversed_: bool, plane):
    """A plane's result with its bow's direction said as the service check chose it."""
    bow = plane.bow
    if bow is None:
        return plane
    way = "reversed" if reversed_ else "as given"
    text = f"{bow.direction}: the worse of the two directions for the deflection ({way})"
    kept = dataclasses.replace(bow, direction_governing=text, favourable=False)
    return dataclasses.replace(plane, bow=kept)


def solve_service(plan, n: int, service_bow: bool) -> tuple:
    """``(case, result, (first, second) bow reversals)`` of a service combination: the derived case as it is,
    or with ``service_bow`` each plane's bow the way that gives the larger deflection (planes uncoupled)."""
    derived, prep, variants = plan
    base = service_result(analysis._solve(derived, prep, n), service_bow)
    if not variants:
        return derived, base, (False, False)
    solved, cases = {(False, False): base}, {(False, False): derived}
    for other, other_prep, signs in variants:
        solved[signs] = service_result(analysis._solve(other, other_prep, n), service_bow)
        cases[signs] = other
    tol = 1e-9

    def worse(x, y):
        return y > x + tol * max(1.0, abs(x))

    def reversed_worse(signs, plane):
        return signs in solved and worse(_deflection(base, plane), _deflection(solved[signs], plane))

    first = reversed_worse((True, False), 1)
    two = base.second_plane is not None
    second = two and reversed_worse((False, True), 2)
    result = solved[(first, second)]
    result = _kept(first, result)
    if two:
        result = dataclasses.replace(result, second_plane=_kept(second, result.second_plane))
    cautions = tuple(c for c in result.cautions if c.code not in _NOT_FOR_SERVICE)
    return cases[(first, second)], dataclasses.replace(result, cautions=cautions), (first, second)
