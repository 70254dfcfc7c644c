"""The axial capacity in words (:func:`engine.capacity` and, with load cases, :func:`engine.capacity_of`)."""

from __future__ import annotations

from app.report import route_names as names
from app.report.numbers import position
from app.report.route_names import governing_text, route_name
from app.units import Units

__all__ = ["capacity_combination_text", "capacity_line", "capacity_text", "fails_below_capacity"]


def capacity_combination_text(capacity) -> str:
    """Which combination's capacity is given, with load cases ("" for a plain case)."""
    if not getattr(capacity, "combination", None):
        return ""
    each = "with its own transverse loads" if capacity.mode == "axial" else "grown by one factor"
    return f"{capacity.combination}, the lowest of the ultimate combinations (each {each})"


def capacity_text(capacity, U: Units, result=None) -> str:
    """What governs the axial capacity, in the display units (`result` names the route's Annex or method)."""
    force = U.show("force", capacity.axial_force, 5)
    check = capacity.check
    if check == "elastic buckling":
        return (
            "Utilisation stays below 1 up to the first critical load "
            f"({U.show('force', capacity.critical_load, 5)}): elastic buckling governs."
        )
    if check == "out-of-plane buckling":
        return f"Out-of-plane flexural buckling governs: N_b,Rd = {force} (eq. (6.47))."
    if check == "out-of-plane elastic buckling":
        return (
            f"Out-of-plane elastic buckling bounds it: N_cr = {force} about the other axis. The code's "
            "buckling check about that axis is not made (see the cautions): the capacity is at most this."
        )
    if check in ("transverse loads alone", "class 4 section"):
        return capacity.message  # no quantity with a unit in these
    route = getattr(capacity, "route", "second-order")
    if route != "second-order":
        return (
            f"The route {route_name(route, result)} governs: utilisation 1 by {governing_text(check)} at "
            f"N = {force}."
        )
    if check in names.ROUTE_TERMS:  # the second-order route's terms beside its check along the member
        return f"The second-order route governs: utilisation 1 by {governing_text(check)} at N = {force}."
    where = f" at x = {position(U, capacity.x)}" if capacity.x is not None else ""
    return f"Strength governs: utilisation 1 by {check}{where}."


def fails_below_capacity(capacity, result) -> str:
    """A note where the member fails as given although its axial force is below the capacity (a tension
    combination failing by its bending, say: an audit found "608 kN" printed beside a failing 1.263), else
    ""."""
    value = getattr(result, "utilization", None)
    if value is None or not value > 1.0 or not capacity.axial_force > 0.0:
        return ""  # a capacity of 0 says it already ("transverse loads alone")
    if float(result.axial_force) > capacity.axial_force:
        return ""
    actions = getattr(result, "actions", None)
    where = f" in {actions.headline}" if actions is not None and actions.headline else ""
    return (
        f"The member fails as given{where} (utilisation {value:.3f} > 1) although its axial force is below "
        "this capacity: the capacity is a limit on compression and does not make it pass."
    )


def capacity_line(capacity, U: Units, result=None) -> str:
    """The capacity as the exports state it: the force, how it was found, what governs, which combination."""
    how = "all loads grown by one factor" if capacity.mode == "proportional" else "transverse loads as given"
    force = U.show("force", capacity.axial_force, 5)
    governs = capacity_text(capacity, U, result)
    line = f"N = {force}, the largest compression at utilisation 1 ({how}). {governs}"
    combination = capacity_combination_text(capacity)
    line = f"{line} Combination: {combination}." if combination else line
    note = fails_below_capacity(capacity, result) if result is not None else ""
    return f"{line} {note}" if note else line
