"""Solving a case with named load cases: every combination exactly, the envelope, what governs.

Each combination (:mod:`engine.combinations`) becomes a plain derived case (:func:`combination_case`): the
case's member, supports and check settings with the summed factored loads and the summed factored axial force
of the actions, so every check and route of :func:`engine.analysis.solve` runs on it unchanged. Ultimate
combinations carry the case's bow; a code preset's direction is always tried both ways (``"load"``), and a
bow the case gives by shape and amplitude is solved reversed as well wherever the axial force is not zero,
the worse kept. Service combinations are solved without the bow (unless ``combinations.service_bow``) and
give the deflection check. Strength and stability come from the ultimate combinations only, the deflection
from the service ones only.

:func:`solve` is the engine's entry point for any case: a case without actions is
:func:`engine.analysis.solve` exactly; a case with actions returns the governing ultimate combination's
:class:`Result` with ``service`` taken from the governing service combination and ``actions``
(:class:`ActionsResult`) holding every combination, the envelopes and the governing combination of each
check and route.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

import numpy as np

from engine import analysis
from engine.cautions import GENERAL, Caution
from engine.combination_cases import combination_case, reversals, solve_service
from engine.combinations import Combination, combine
from engine.prepared import prepare

__all__ = [
    "ActionsResult",
    "CombinationResult",
    "Envelope",
    "GoverningCombination",
    "clear_cache",
    "combination_case",
    "envelope",
    "read_at",
    "solve",
]


@dataclass(frozen=True, kw_only=True, eq=False)
class CombinationResult:
    """One combination solved: its factors, its derived case and the engine's result of it.

    ``bow_reversed`` is True where the case's bow (given by shape and amplitude) was reversed because that
    way gave the larger utilisation (or |M|); ``second_bow_reversed`` the same for the second plane's bow.
    """

    combination: Combination
    case: object
    result: object
    bow_reversed: bool = False
    second_bow_reversed: bool = False

    @property
    def name(self) -> str:
        return self.combination.name


@dataclass(frozen=True, kw_only=True)
class GoverningCombination:
    """Which combination governs one check or route.

    ``check`` is ``"strength"`` (the headline strength and stability utilisation), ``"in-plane"``,
    ``"out-of-plane"``, ``"shear"``, ``"route:<route>"``, ``"moment"`` (max|M|, no section needed),
    ``"deflection"`` (the service check; max|w| of the service combinations without a section).
    ``value`` is the utilisation [-], or for ``"moment"`` |M| [N·m] and for a deflection without a section
    |w| [m] (``unit`` says which: ``""``, ``"N·m"`` or ``"m"``). ``plane`` is 2 for the second plane's
    ``"moment"`` and ``"deflection"`` in a two-plane case, else 1 (the member checks of a two-plane case,
    strength, in-plane, shear and routes, take both planes together and are listed with plane 1).
    """

    check: str
    combination: str
    state: str
    value: float
    unit: str = ""
    plane: int = 1


@dataclass(frozen=True, kw_only=True, eq=False)
class Envelope:
    """Max and min of M, V and w along the member over a set of combinations.

    ``x`` holds every station of every combination (twice where any of them jumps: left value, then right);
    each combination is read at these points exactly at its own stations and linearly between them, so the
    extremes of the envelope are the combinations' exact extremes. ``peaks`` maps ``"moment_max"``,
    ``"moment_min"``, ``"shear_max"``, ``"shear_min"``, ``"deflection_max"``, ``"deflection_min"`` to
    ``(value, x, combination name)``. ``plane`` 2: the second plane's fields (``result.second_plane``).
    """

    state: str
    names: tuple
    x: np.ndarray
    moment_max: np.ndarray
    moment_min: np.ndarray
    shear_max: np.ndarray
    shear_min: np.ndarray
    deflection_max: np.ndarray
    deflection_min: np.ndarray
    peaks: dict
    plane: int = 1


def read_at(xc, fc, q, right):
    """fc at q, linear between stations; at a doubled station the left (``right`` False) or right value."""
    n = xc.size
    i = np.clip(np.searchsorted(xc, q, side="right" if right else "left"), 1, n - 1)
    x0, x1 = xc[i - 1], xc[i]
    span = x1 - x0
    t = np.divide(q - x0, span, out=np.zeros_like(q), where=span > 0)
    return fc[i - 1] + t * (fc[i] - fc[i - 1])


def _plane(result, plane: int):
    """The first plane's result (the result itself) or the second plane's."""
    return result if plane == 1 else result.second_plane


def envelope(state: str, solved, plane: int = 1) -> Envelope | None:
    """The envelope of the solved combinations (:class:`CombinationResult`) of one limit state, in the first
    plane or (``plane`` 2) the second."""
    if not solved:
        return None
    xs = [_plane(item.result, plane).x for item in solved]
    allx = np.unique(np.concatenate(xs))
    jumps = np.unique(np.concatenate([x[1:][np.diff(x) == 0.0] for x in xs]))
    x = np.sort(np.concatenate((allx, jumps)), kind="stable")
    right = np.zeros(x.size, dtype=bool)
    if jumps.size:
        first = np.searchsorted(x, jumps, side="left")
        right[first + 1] = True
    names = ("moment", "shear", "deflection")
    rows = np.empty((3, len(solved), x.size))
    peaks = {}
    for k, item in enumerate(solved):
        r = _plane(item.result, plane)
        xc = r.x
        stack = np.stack((r.moment, r.shear, r.deflection))
        # Where each point falls among this combination's stations: one search per side for all three fields.
        i = np.searchsorted(xc, x, side="left")
        i[right] = np.searchsorted(xc, x[right], side="right")
        np.clip(i, 1, xc.size - 1, out=i)
        x0 = xc[i - 1]
        span = xc[i] - x0
        t = np.divide(x - x0, span, out=np.zeros_like(x), where=span > 0)
        low, high = stack[:, i - 1], stack[:, i]
        with np.errstate(invalid="ignore"):  # a combination at its critical load is +inf throughout: kept inf
            rows[:, k, :] = np.where(low == high, low, low + t * (high - low))
        top, bottom = stack.argmax(axis=1), stack.argmin(axis=1)
        for f, name in enumerate(names):
            for end, at in (("max", top[f]), ("min", bottom[f])):
                value, key = float(stack[f, at]), f"{name}_{end}"
                best = peaks.get(key)
                if best is None or (value > best[0] if end == "max" else value < best[0]):
                    peaks[key] = (value, float(xc[at]), item.name)
    highs, lows = rows.max(axis=1), rows.min(axis=1)
    fields = {}
    for f, name in enumerate(names):
        fields[f"{name}_max"], fields[f"{name}_min"] = highs[f], lows[f]
    names = tuple(item.name for item in solved)
    return Envelope(state=state, names=names, x=x, peaks=peaks, plane=plane, **fields)


def _strength(result) -> float:
    """The strength utilisation to rank by (-1 without a section), +inf at or above a critical load."""
    if result.status != "stable":
        return math.inf
    return -1.0 if result.utilization is None else float(result.utilization)


def _rank(result) -> tuple:
    """What makes a result worse, in order: the strength utilisation, max|M|, the second plane's max|M|."""
    second = result.second_plane
    return (
        _strength(result),
        result.governing.moment.magnitude,
        0.0 if second is None else second.governing.moment.magnitude,
    )


def _worse(a, b) -> bool:
    """True when result ``b`` is worse than ``a``: larger utilisation, else larger max|M| (first plane, then
    the second). Values within 1e-9 (relative) of each other tie and the next one decides, as
    :func:`engine.analysis._solve_plane` decides a preset's direction: two bow directions whose utilisations
    differ by rounding alone (a route that does not see the bow governs both) are told apart by the moment."""
    for x, y in zip(_rank(a), _rank(b), strict=True):
        close = math.isfinite(x) and math.isfinite(y) and abs(y - x) <= 1e-9 * max(1.0, abs(x), abs(y))
        if x == y or close:
            continue
        return y > x
    return False


def _solve_ultimate(plan, combination, stations) -> CombinationResult:
    derived, prep, others = plan
    result = analysis._solve(derived, prep, stations)
    kept = CombinationResult(combination=combination, case=derived, result=result)
    if derived.axial_force == 0.0:
        return kept
    for other_case, other_prep, (first, second) in others:
        other = analysis._solve(other_case, other_prep, stations)
        if _worse(kept.result, other):
            kept = CombinationResult(
                combination=combination,
                case=other_case,
                result=other,
                bow_reversed=first,
                second_bow_reversed=second,
            )
    return kept


# The combinations of a case and their derived cases with their prepared members, kept per case (the page
# solves the same case again at each step): no validation nor cache lookup per combination then.
_PLANS: dict = {}
_PLAN_CACHE_SIZE = 8
_LAST: list = [None, None]


def _plan(case) -> tuple:
    if _LAST[0] is case:
        return _LAST[1]
    plan = _PLANS.get(case)
    if plan is None:
        combos = combine(case.actions, case.combinations)
        rows = []
        kinds = reversals(case)
        for combination in combos:
            derived = combination_case(case, combination)
            others = []
            # a service one's bow variants are solved inside its one solve (combination_cases.solve_service)
            for first, second in kinds if combination.state == "ultimate" else ():
                other = combination_case(
                    case,
                    combination,
                    bow_sign=-1.0 if first else 1.0,
                    second_bow_sign=-1.0 if second else 1.0,
                )
                others.append((other, prepare(other), (first, second)))
            rows.append((derived, prepare(derived), tuple(others)))
        plan = (combos, tuple(rows))
        if len(_PLANS) >= _PLAN_CACHE_SIZE:
            _PLANS.pop(next(iter(_PLANS)))
        _PLANS[case] = plan
    _LAST[0], _LAST[1] = case, plan
    return plan


def clear_cache() -> None:
    """Forget the kept combinations and derived cases."""
    _PLANS.clear()
    _LAST[0] = _LAST[1] = None


def _governing(ultimate, service) -> tuple:
    rows = []

    def best(check, state, items, value_of, unit="", plane=1):
        found = None
        for item in items:
            value = value_of(item.result)
            if value is None:
                continue
            if found is None or value > found[1]:
                found = (item.name, value)
        if found is not None:
            rows.append(
                GoverningCombination(
                    check=check, combination=found[0], state=state, value=found[1], unit=unit, plane=plane
                )
            )

    def critical_or(value):  # at or above a critical load the member buckles: it governs whatever else
        return lambda r: math.inf if r.status != "stable" else value(r)

    best("strength", "ultimate", ultimate, critical_or(lambda r: r.utilization))
    best("in-plane", "ultimate", ultimate, critical_or(lambda r: r.check and r.check.in_plane_utilization))
    best(
        "out-of-plane",
        "ultimate",
        ultimate,
        critical_or(lambda r: r.check and r.check.out_of_plane and r.check.out_of_plane.utilization),
    )
    best("shear", "ultimate", ultimate, critical_or(lambda r: r.check and float(np.max(r.check.shear))))
    routes = []
    for item in ultimate:
        routes += [route.route for route in item.result.routes if route.route not in routes]
    for route in routes:

        def of(r, route=route):
            for entry in r.routes:
                if entry.route == route:
                    return entry.utilization
            return None

        best(f"route:{route}", "ultimate", ultimate, of)
    planes = (
        (1, 2) if ultimate + service and (ultimate + service)[0].result.second_plane is not None else (1,)
    )
    for plane in planes:

        def at(value, plane=plane):  # the member's status, the plane's value
            return critical_or(lambda r: value(_plane(r, plane)))

        best("moment", "ultimate", ultimate, at(lambda r: r.governing.moment.magnitude), "N·m", plane)
        if any(_plane(item.result, plane).service is not None for item in service):
            best(
                "deflection", "service", service, at(lambda r: r.service and r.service.utilization), "", plane
            )
        else:
            best("deflection", "service", service, at(lambda r: r.governing.deflection.magnitude), "m", plane)
    return tuple(rows)


@dataclass(frozen=True, kw_only=True, eq=False)
class ActionsResult:
    """Every combination of a case with actions, solved, with the envelopes and what governs.

    Attributes
    ----------
    case : Case
        The case with its actions.
    names : tuple of str
        The actions' names, in the case's order (the order of each combination's factors).
    combinations : tuple of CombinationResult
        Ultimate ones first, then service ones, then the user's table, as :func:`engine.combinations.combine`.
    ultimate, service : Envelope or None
        The first plane's envelopes.
    second_ultimate, second_service : Envelope or None
        The second plane's (``plane`` 2) in a two-plane case, else None.
    governing : tuple of GoverningCombination
    headline : str
        The ultimate combination whose result is the headline (the largest strength utilisation, or the
        largest |M| without a section).
    """

    case: object
    names: tuple
    combinations: tuple
    ultimate: Envelope | None
    service: Envelope | None
    governing: tuple
    headline: str | None
    stations: int = 401
    second_ultimate: Envelope | None = None
    second_service: Envelope | None = None

    def of(self, name: str) -> CombinationResult:
        """The solved combination of this name (a KeyError names the known ones)."""
        for item in self.combinations:
            if item.name == name:
                return item
        raise KeyError(
            f"{name!r} is not a combination; known: {', '.join(c.name for c in self.combinations)}"
        )

    def governing_for(self, check: str, plane: int = 1) -> GoverningCombination | None:
        """The row of this check (and plane: 2 for the second plane's moment and deflection)."""
        for row in self.governing:
            if row.check == check and row.plane == plane:
                return row
        return None


def solve(case, stations: int = 401):
    """Solve a case: :func:`engine.analysis.solve` without actions; every combination with them.

    With actions the result is the governing ultimate combination's (its diagrams, check, routes and
    cautions), with ``service`` from the governing service combination and ``actions`` the
    :class:`ActionsResult`.
    """
    if getattr(case, "actions", None) is None:
        return analysis.solve(case, stations)
    n = analysis.check_stations(stations)
    combos, plans = _plan(case)
    ultimate, service = [], []
    for combination, plan in zip(combos, plans, strict=True):
        if combination.state == "ultimate":
            ultimate.append(_solve_ultimate(plan, combination, n))
        else:
            derived, result, (first, second) = solve_service(plan, n, case.combinations.service_bow)
            service.append(
                CombinationResult(
                    combination=combination,
                    case=derived,
                    result=result,
                    bow_reversed=first,
                    second_bow_reversed=second,
                )
            )
    governing = _governing(ultimate, service)
    rows = {row.check: row for row in governing if row.plane == 1}
    second_rows = {row.check: row for row in governing if row.plane == 2}
    head_row = rows.get("strength") or rows.get("moment")
    by_name = {item.name: item for item in ultimate + service}
    actions = ActionsResult(
        case=case,
        names=tuple(action.name for action in case.actions),
        combinations=tuple(by_name[c.name] for c in combos),
        ultimate=envelope("ultimate", ultimate),
        service=envelope("service", service),
        governing=governing,
        headline=None if head_row is None else head_row.combination,
        stations=n,
        second_ultimate=envelope("ultimate", ultimate, 2) if second_rows else None,
        second_service=envelope("service", service, 2) if second_rows else None,
    )
    deflection = rows.get("deflection")
    if head_row is None:  # service combinations only: the governing one is shown
        chosen = by_name[deflection.combination].result
        return dataclasses.replace(chosen, actions=actions, utilization=None, check=None)
    chosen = by_name[head_row.combination].result
    service_check = serving = None
    if deflection is not None and deflection.unit == "":
        serving = by_name[deflection.combination].result
        service_check = serving.service
    servings = [(serving, deflection and deflection.combination, 1)]
    if second_rows:  # the second plane's deflection check from its own governing service combination
        second = second_rows.get("deflection")
        serving_two = None
        if second is not None and second.unit == "":
            serving_two = by_name[second.combination].result
        servings.append((serving_two, second and second.combination, 2))
        second_plane = dataclasses.replace(
            chosen.second_plane, service=None if serving_two is None else serving_two.second_plane.service
        )
        chosen = dataclasses.replace(chosen, second_plane=second_plane)
    cautions = _cautions(chosen, ultimate, servings)
    if not service:  # the deflection check is made on service combinations only
        cautions = tuple(sorted((*cautions, NO_SERVICE), key=lambda c: _SEVERITY.get(c.level, 3)))
    return dataclasses.replace(chosen, service=service_check, actions=actions, cautions=cautions)


#: A case with load cases and no service combination: its deflection is not checked (an independent audit
#: found the check gone without a word).
NO_SERVICE = Caution(
    level="warning",
    code="deflection-not-checked",
    message=(
        "No service combination is made (combinations.service is empty, or the table has no service row): "
        "the deflection is not checked. Name a service combination to check it."
    ),
    source="EN 1990 §6.5 and §A1.4 (from memory): deflections are checked on service combinations",
)


_SERVICE_CODES = ("deflection", "deflection-basis")
_SEVERITY = {"danger": 0, "warning": 1, "info": 2}


def _cautions(chosen, ultimate, servings) -> tuple:
    """The headline's cautions: its own, the deflection ones of the governing service combination (of each
    plane, ``servings``: (result, name, plane)) instead of its own, and any warning or danger of another
    ultimate combination whose code it does not hold."""
    kept = [SCOPE] + [c for c in chosen.cautions if c.code not in _SERVICE_CODES and c.code != "scope"]
    codes = {c.code for c in kept}
    for item in ultimate:  # an ultimate combination's own deflection is no service check: never copied
        for caution in item.result.cautions:
            if caution.level in ("danger", "warning") and caution.code not in codes | set(_SERVICE_CODES):
                kept.append(
                    dataclasses.replace(
                        caution,
                        message=f"{caution.message} (combination {item.name})",
                        values={**caution.values, "combination": item.name},
                    )
                )
                codes.add(caution.code)
    for serving, name, plane in servings:
        if serving is None:
            continue
        for caution in serving.cautions:
            if caution.values.get("plane", 1) != plane:
                continue
            if caution.code == "deflection":
                kept.append(caution)
            elif caution.code == "deflection-basis":
                check = _plane(serving, plane).service
                where = " in the second plane" if plane == 2 else ""
                message = (
                    f"Deflection utilisation {check.utilization:.3f}{where}: the service check of "
                    f"combination {name}, the governing service combination, apart from the strength one, "
                    "on its factored loads and without the bow."
                )
                kept.append(dataclasses.replace(caution, message=message))
    kept.sort(key=lambda c: _SEVERITY.get(c.level, 3))  # stable: the general caution leads the infos
    return tuple(kept)


#: The general caution of a case with load cases (the plain one takes the loads as given).
SCOPE = dataclasses.replace(
    GENERAL,
    message=(
        "Elastic analysis of one member in one or two uncoupled planes, per load combination. Not a full "
        "code check: torsion, non-symmetric sections, patch loading of a slender web and connections are "
        "not checked; lateral-torsional buckling and class 4 sections are checked unless a caution says "
        "otherwise; the combination factors are recommended values "
        "recalled from memory (a National Annex may change them). Check the results against your local "
        "codes and have them reviewed by a licensed engineer."
    ),
)
