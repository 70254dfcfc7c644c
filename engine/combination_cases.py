"""The plain case of one load combination, and a service combination solved with its bow both ways.

:func:`combination_case` turns a combination (:mod:`engine.combinations`) into a plain derived case: the
case's member, supports and check settings with the summed factored loads and axial force of the actions.
:mod:`engine.envelope` solves every combination through it.

Service combinations are solved without the bow unless ``combinations.service_bow``. With it, the bow is
unfavourable for the deflection when it points the way (and, for a preset on the first mode, has the shape)
that gives the larger deflection, which is not always what the strength check prefers. So each plane keeps
the variant of its bow with the larger deflection (:func:`solve_service`, ``rank="deflection"`` of
:func:`engine.analysis._solve`); the planes of a two-plane case are uncoupled, so each plane's is chosen
on its own deflection.
"""

from __future__ import annotations

import dataclasses

from engine import analysis
from engine.actions import scaled
from engine.combinations import Combination
from engine.inputs import Imperfection

__all__ = [
    "SERVICE_BASIS",
    "combination_bow_reversed",
    "combination_case",
    "reversals",
    "service_result",
    "solve_service",
]


def _combination_bow(bow, state: str, service_bow: bool, sign: float):
    """A plane's bow in a combination: none in a service one (unless ``service_bow``), a preset tried both
    ways, a bow given by shape and amplitude reversed for ``sign`` -1."""
    if state == "service" and not service_bow:
        return Imperfection()
    if bow.preset is not None:
        return bow if bow.direction == "load" else dataclasses.replace(bow, direction="load")
    return _flipped(bow) if sign < 0 else bow


def _flipped(bow):
    """A bow given by shape and amplitude pointing the other way."""
    return dataclasses.replace(bow, amplitude=-bow.amplitude)


def _shaped(bow) -> bool:
    """True for a bow given by shape and amplitude (not a preset, not zero): solved both ways."""
    return bow is not None and bow.preset is None and bow.shape != "none" and bow.amplitude != 0.0


def combination_case(
    case,
    combination: Combination,
    *,
    bow_sign: float = 1.0,
    second_bow_sign: float = 1.0,
):
    """The plain case of one combination: factored loads summed, factored axial forces summed, in each plane.

    A factor of 1 leaves a load object as it is, so a one-action case under a factor of 1 is the plain case it
    was made from. ``bow_sign`` -1 reverses a bow given by shape and amplitude; ``second_bow_sign`` the
    second plane's. In a two-plane case each action's ``second_loads`` go to the second plane.
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
        "imperfection": _combination_bow(case.imperfection, state, service_bow, bow_sign),
    }
    plane = case.second_plane
    if plane is not None:
        bow = plane.imperfection
        if bow is not None or (state == "service" and not service_bow):
            bow = _combination_bow(bow or Imperfection(), state, service_bow, second_bow_sign)
        # None stays None: the default bow, a preset whose direction is automatic (tried both ways).
        changes["second_plane"] = dataclasses.replace(plane, loads=tuple(second), imperfection=bow)
    return dataclasses.replace(case, **changes)


def combination_bow_reversed(case, first: bool, second: bool):
    """``case`` with its bow given by shape and amplitude reversed in the first plane (``first``) and in the
    second (``second``), as :func:`reversals` lists them."""
    changes = {}
    if first:
        changes["imperfection"] = _flipped(case.imperfection)
    if second:
        plane = case.second_plane
        changes["second_plane"] = dataclasses.replace(plane, imperfection=_flipped(plane.imperfection))
    return dataclasses.replace(case, **changes) if changes else case


def reversals(case) -> tuple:
    """The (first, second) plane bow reversals to try beside none: each plane whose bow is shaped."""
    first = _shaped(case.imperfection)
    second = case.second_plane is not None and _shaped(case.second_plane.imperfection)
    signs = [(a, b) for a in (False, True) for b in (False, True) if (a <= first and b <= second)]
    return tuple(signs[1:])


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


_NOT_FOR_SERVICE = ("bow-opposes-load",)  # a strength caution: the service bow is chosen on the deflection


def _reversed(bow, kept) -> bool:
    """True where a bow given by shape and amplitude was kept pointing the other way."""
    return _shaped(bow) and kept is not None and kept.amplitude * bow.amplitude < 0.0


def solve_service(plan, n: int, service_bow: bool) -> tuple:
    """``(case, result, (first, second) bow reversed)`` of a service combination. With ``service_bow`` each
    plane keeps the variant of its bow (either direction; for a preset on the first mode, either shape)
    with the larger deflection: the deflection check's unfavourable bow, chosen on the deflection itself
    (the strength check's choice can be the other; the planes are uncoupled)."""
    derived, prep, _ = plan
    rank = "deflection" if service_bow else "strength"  # without the bow there is nothing to choose
    result = service_result(analysis._solve(derived, prep, n, rank=rank), service_bow)
    if not service_bow:
        return derived, result, (False, False)
    first = _reversed(derived.imperfection, result.bow)
    plane = derived.second_plane
    second = plane is not None and _reversed(plane.imperfection, result.second_plane.bow)
    cautions = tuple(c for c in result.cautions if c.code not in _NOT_FOR_SERVICE)
    return derived, dataclasses.replace(result, cautions=cautions), (first, second)
