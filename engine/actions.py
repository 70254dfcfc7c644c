"""Named load cases (actions) and the settings of their combinations: the case file's ``actions`` and
``combinations`` keys.

An action is a set of transverse loads with its own axial force (compression positive) and a category:
``permanent``, ``imposed`` (or ``imposed-A`` … ``imposed-H``, the categories of EN 1990 Table A1.1),
``snow``, ``snow-low`` (sites at most 1000 m above sea level), ``wind``, ``temperature``, or a category the
user names (then ``psi`` is required). Actions sharing an ``exclusive`` name never act together (wind from
the left and from the right, say). :mod:`engine.combinations` turns them into combinations;
:mod:`engine.envelope` solves them. Every problem is a :class:`CaseError` naming the path, the value and what
is allowed (``actions[1].loads[0].x: 7.5 m lies outside the member (0 to 6 m)``).
"""

from __future__ import annotations

import dataclasses
import re
from dataclasses import dataclass
from typing import Any

from engine import limits
from engine.combinations import combine, permanent_exclusive
from engine.errors import CaseError
from engine.loads import (
    CoupleLoad,
    LinearLoad,
    PointLoad,
    UniformLoad,
    load_from_data,
    load_to_data,
    placed_load,
)
from engine.validate import check_keys, choice, expect_mapping, flag, quoted, real, show, within

__all__ = [
    "ACTION_KEYS",
    "ACTION_PLANE_KEYS",
    "COMBINATION_KEYS",
    "KNOWN_CATEGORIES",
    "MAX_ACTIONS",
    "RULES",
    "SERVICE_KINDS",
    "Action",
    "CombinationSettings",
    "UserCombination",
    "actions_from_data",
    "case_actions",
    "scaled",
]

#: Categories with factors in the code tables (:mod:`engine.combinations`); any other name is the user's own.
KNOWN_CATEGORIES = (
    "permanent",
    "imposed",
    *(f"imposed-{letter}" for letter in "ABCDEFGH"),
    "snow",
    "snow-low",
    "wind",
    "temperature",
)
#: Combination rules: EN 1990 eq. (6.10); eqs. (6.10a)/(6.10b); ASCE 7 §2.3 (LRFD); the user's table only.
RULES = ("en1990-6.10", "en1990-6.10ab", "asce7-2.3", "table")
#: EN 1990 serviceability combinations: eqs. (6.14b), (6.15b), (6.16b).
SERVICE_KINDS = ("characteristic", "frequent", "quasi-permanent")
#: ASCE 7 load symbols a user-named category may stand for.
ASCE_SYMBOLS = ("D", "L", "Lr", "S", "R", "W")
STATES = ("ultimate", "service")
ACTION_KEYS = ("name", "category", "axial_force", "loads", "second_plane", "psi", "exclusive", "asce")
#: The keys of an action's ``second_plane``: its loads in the case's second plane (supports, bow and EI are
#: the case's ``second_plane``'s).
ACTION_PLANE_KEYS = ("loads",)
COMBINATION_KEYS = ("rule", "service", "table", "service_bow")
_TABLE_KEYS = ("name", "state", "factors")
MAX_ACTIONS = limits.MAX_ACTIONS
_MAX_TABLE = 200
_MAX_FACTOR = 10.0
_MAX_AXIAL_FORCE = 1e12  # [N], as the case's own
_NAME = re.compile(r"^[A-Za-z0-9][A-Za-z0-9_.+\-]{0,23}$")


def _name(path: str, value: Any) -> str:
    if not isinstance(value, str) or not _NAME.match(value):
        raise CaseError(
            f"{path}: {show(value)} is not a name; it must be 1 to 24 letters, digits or _ . + - "
            "(starting with a letter or digit)"
        )
    return value


@dataclass(frozen=True, kw_only=True)
class Action:
    """One named load case.

    Attributes
    ----------
    name : str
        1–24 letters, digits or ``_ . + -``; unique within the case.
    category : str
        One of :data:`KNOWN_CATEGORIES` or a name of the user's (then ``psi`` is required).
    axial_force : float
        Its own axial force [N], compression positive, |N| <= 1e12.
    loads : tuple of load objects
        Its transverse loads (the forms of the case's ``loads``), positions on the member.
    second_loads : tuple of load objects or None
        Its transverse loads in the case's second plane (the action's ``second_plane.loads``); None when the
        action gives no ``second_plane`` (then it loads the first plane only). Only in a two-plane case.
    psi : tuple of three floats or None
        ψ0, ψ1, ψ2 in 0–1: required for a user's category, optional otherwise (it then replaces the table's).
    exclusive : str or None
        Actions with the same ``exclusive`` name never act in one combination.
    asce : str or None
        The ASCE 7 symbol a user's category stands for (``D``, ``L``, ``Lr``, ``S``, ``R``, ``W``); needed
        only with the ``asce7-2.3`` rule.
    """

    name: str
    category: str
    axial_force: float = 0.0
    loads: tuple = ()
    second_loads: tuple | None = None
    psi: tuple | None = None
    exclusive: str | None = None
    asce: str | None = None

    @property
    def permanent(self) -> bool:
        return self.category == "permanent"

    def to_data(self) -> dict[str, Any]:
        data: dict[str, Any] = {
            "name": self.name,
            "category": self.category,
            "axial_force": self.axial_force,
            "loads": [load_to_data(load) for load in self.loads],
        }
        if self.second_loads is not None:
            data["second_plane"] = {"loads": [load_to_data(load) for load in self.second_loads]}
        for key in ("psi", "exclusive", "asce"):
            value = getattr(self, key)
            if value is not None:
                data[key] = list(value) if key == "psi" else value
        return data


def _loads(path: str, raw_loads: Any, length: float) -> tuple:
    """A list of load objects read and placed on the member, every error naming ``path``."""
    if isinstance(raw_loads, (str, bytes)) or not isinstance(raw_loads, (list, tuple)):
        raise CaseError(f"{path}: {show(raw_loads)} is not a list of load objects")
    limits.check_load_count(len(raw_loads))
    loads = tuple(load_from_data(f"{path}[{i}]", item) for i, item in enumerate(raw_loads))
    with within(path.rsplit(".", 1)[0]):
        return tuple(placed_load(i, load, length) for i, load in enumerate(loads))


def _second_loads(path: str, data: Any, length: float, two_planes: bool) -> tuple | None:
    """An action's ``second_plane`` (its loads in the case's second plane), None where it gives none."""
    if data is None:
        return None
    if not two_planes:
        raise CaseError(
            f"{path}: {show(data)} is not allowed: the case has no second_plane; give the case's "
            "second_plane (its supports) to load the second plane, or leave this key out"
        )
    data = expect_mapping(path, data, '{"loads": [...]} (the loads of this action in the second plane)')
    check_keys(path, data, ACTION_PLANE_KEYS, ("loads",))
    return _loads(f"{path}.loads", data["loads"], length)


def _action(path: str, data: Any, length: float, two_planes: bool = False) -> Action:
    data = expect_mapping(path, data, 'an action such as {"name": "G", "category": "permanent", "loads": []}')
    check_keys(path, data, ACTION_KEYS, ("name", "category"))
    name = _name(f"{path}.name", data["name"])
    category = data["category"]
    if not isinstance(category, str) or not _NAME.match(category):
        raise CaseError(
            f"{path}.category: {show(category)} is not a category; allowed: {quoted(KNOWN_CATEGORIES)} "
            "or a name of your own (1 to 24 letters, digits or _ . + -) with psi given"
        )
    axial = real(f"{path}.axial_force", data.get("axial_force", 0.0), "N", magnitude=_MAX_AXIAL_FORCE)
    loads = _loads(f"{path}.loads", data.get("loads", []), length)
    second = _second_loads(f"{path}.second_plane", data.get("second_plane"), length, two_planes)
    psi = data.get("psi")
    if category == "permanent" and psi is not None:
        raise CaseError(f"{path}.psi: {show(psi)} is not allowed for a permanent action (no psi)")
    if psi is not None:
        if isinstance(psi, (str, bytes)) or not isinstance(psi, (list, tuple)) or len(psi) != 3:
            raise CaseError(f"{path}.psi: {show(psi)} is not a list of three numbers [psi0, psi1, psi2]")
        psi = tuple(real(f"{path}.psi[{i}]", v, "", minimum=0.0, maximum=1.0) for i, v in enumerate(psi))
    if category not in KNOWN_CATEGORIES and psi is None:
        raise CaseError(
            f"{path}.psi: required for the category {category!r} of your own (three numbers 0 to 1: "
            f"psi0, psi1, psi2); the categories with tabulated factors are {quoted(KNOWN_CATEGORIES)}"
        )
    exclusive = data.get("exclusive")
    if exclusive is not None:
        exclusive = _name(f"{path}.exclusive", exclusive)
        if category == "permanent":
            raise CaseError(permanent_exclusive(path, exclusive))
    asce = data.get("asce")
    if asce is not None:
        choice(f"{path}.asce", asce, ASCE_SYMBOLS, "an ASCE 7 load symbol")
    return Action(
        name=name,
        category=category,
        axial_force=axial,
        loads=loads,
        second_loads=second,
        psi=psi,
        exclusive=exclusive,
        asce=asce,
    )


@dataclass(frozen=True, kw_only=True)
class UserCombination:
    """One row of the user's table: a name, the limit state and a factor per action (others 0)."""

    name: str
    state: str
    factors: tuple  # ((action name, factor), ...)

    def to_data(self) -> dict[str, Any]:
        return {"name": self.name, "state": self.state, "factors": dict(self.factors)}


@dataclass(frozen=True, kw_only=True)
class CombinationSettings:
    """How the actions are combined (the ``combinations`` key).

    Attributes
    ----------
    rule : str
        One of :data:`RULES`; default ``"en1990-6.10"`` (never less onerous than 6.10a/6.10b).
    service : tuple of str
        The EN 1990 serviceability combinations made for the deflection check (:data:`SERVICE_KINDS`);
        default the characteristic one, the most onerous. The ``asce7-2.3`` rule uses ASCE 7 §2.4 instead.
    table : tuple of UserCombination
        The user's own combinations, added to the rule's (the only ones with rule ``"table"``).
    service_bow : bool
        Check the deflection with the code bow as well (default False: without it).
    """

    rule: str = "en1990-6.10"
    service: tuple = ("characteristic",)
    table: tuple = ()
    service_bow: bool = False

    def to_data(self) -> dict[str, Any]:
        data: dict[str, Any] = {"rule": self.rule, "service": list(self.service)}
        if self.table:
            data["table"] = [row.to_data() for row in self.table]
        if self.service_bow:
            data["service_bow"] = True
        return data


def _settings(data: Any, names: tuple) -> CombinationSettings:
    if isinstance(data, CombinationSettings):
        data = data.to_data()
    data = expect_mapping("combinations", data, f"an object with keys {quoted(COMBINATION_KEYS)}")
    check_keys("combinations", data, COMBINATION_KEYS)
    rule = choice("combinations.rule", data.get("rule", "en1990-6.10"), RULES, "a combination rule")
    service = data.get("service", ["characteristic"])
    if isinstance(service, (str, bytes)) or not isinstance(service, (list, tuple)):
        raise CaseError(
            f"combinations.service: {show(service)} is not a list; allowed items: {quoted(SERVICE_KINDS)}"
        )
    service = tuple(
        choice(f"combinations.service[{i}]", kind, SERVICE_KINDS, "a serviceability combination")
        for i, kind in enumerate(service)
    )
    if len(set(service)) != len(service):
        raise CaseError(f"combinations.service: {show(list(service))} names a combination twice")
    raw_table = data.get("table", [])
    if isinstance(raw_table, (str, bytes)) or not isinstance(raw_table, (list, tuple)):
        raise CaseError(f"combinations.table: {show(raw_table)} is not a list of combinations")
    if len(raw_table) > _MAX_TABLE:
        raise CaseError(f"combinations.table: {len(raw_table)} rows given; at most {_MAX_TABLE} are allowed")
    rows, seen = [], set()
    for i, row in enumerate(raw_table):
        path = f"combinations.table[{i}]"
        row = expect_mapping(path, row, '{"name": ..., "state": "ultimate", "factors": {"G": 1.35}}')
        check_keys(path, row, _TABLE_KEYS, _TABLE_KEYS)
        name = _name(f"{path}.name", row["name"])
        if re.fullmatch(r"[US][0-9]+", name):
            raise CaseError(
                f"{path}.name: {name!r} is kept for the combinations strutscope makes (U1, S1, ...); "
                "choose another name"
            )
        if name in seen:
            raise CaseError(f"{path}.name: {name!r} is given twice; combination names must differ")
        seen.add(name)
        state = choice(f"{path}.state", row["state"], STATES, "a limit state")
        factors = expect_mapping(f"{path}.factors", row["factors"], '{"action name": factor, ...}')
        if not factors:
            raise CaseError(f"{path}.factors: empty; give a factor for at least one action")
        pairs = []
        for key, value in factors.items():
            if key not in names:
                raise CaseError(
                    f"{path}.factors: {show(key)} is not an action of this case; actions: {quoted(names)}"
                )
            pairs.append(
                (key, real(f"{path}.factors.{key}", value, "", minimum=-_MAX_FACTOR, maximum=_MAX_FACTOR))
            )
        if not any(value for _, value in pairs):
            raise CaseError(
                f"{path}.factors: every factor is 0 (a combination without any load); give a factor other "
                "than 0 for at least one action"
            )
        rows.append(UserCombination(name=name, state=state, factors=tuple(pairs)))
    if rule == "table" and not rows:
        raise CaseError("combinations.table: the rule 'table' needs at least one row of factors")
    if rule == "table" and not any(row.state == "ultimate" for row in rows):
        raise CaseError(
            f"combinations.table: every row is a service combination ({len(rows)} given); strength and "
            "stability are checked on ultimate combinations only, so give at least one row with state "
            "'ultimate'"
        )
    bow = flag("combinations.service_bow", data.get("service_bow", False))
    return CombinationSettings(rule=rule, service=service, table=tuple(rows), service_bow=bow)


def actions_from_data(
    raw_actions: Any, raw_settings: Any, length: float, two_planes: bool = False
) -> tuple[tuple, CombinationSettings]:
    """Validate the ``actions`` list and the ``combinations`` settings of a case of this length
    (``two_planes``: the case has a ``second_plane``, so an action may load it)."""
    if isinstance(raw_actions, (str, bytes)) or not isinstance(raw_actions, (list, tuple)):
        raise CaseError(f"actions: {show(raw_actions)} is not a list of actions")
    if not 1 <= len(raw_actions) <= MAX_ACTIONS:
        raise CaseError(f"actions: {len(raw_actions)} actions given; 1 to {MAX_ACTIONS} are allowed")
    actions = tuple(item.to_data() if isinstance(item, Action) else item for item in raw_actions)
    actions = tuple(_action(f"actions[{i}]", item, length, two_planes) for i, item in enumerate(actions))
    names = tuple(action.name for action in actions)
    for i, name in enumerate(names):
        if name in names[:i]:
            raise CaseError(f"actions[{i}].name: {name!r} is given twice; action names must differ")
    everything = tuple(load for action in actions for load in action.loads + (action.second_loads or ()))
    limits.check_work(length, everything)
    settings = _settings({} if raw_settings is None else raw_settings, names)
    if settings.rule == "asce7-2.3":
        for i, action in enumerate(actions):
            if action.category not in KNOWN_CATEGORIES and action.asce is None:
                raise CaseError(
                    f"actions[{i}].asce: required with rule 'asce7-2.3' for the category {action.category!r} "
                    f"of your own; allowed: {quoted(ASCE_SYMBOLS)}"
                )
    return actions, settings


def case_actions(case) -> tuple[tuple, CombinationSettings]:
    """The validated actions and settings; with actions the case's own loads and axial force are empty."""
    if case.actions is None:
        raise CaseError("combinations: given without actions; give the case's load cases in 'actions'")
    if case.second_plane is not None and case.second_plane.loads:
        raise CaseError(
            f"second_plane.loads: {len(case.second_plane.loads)} loads given beside actions; with actions "
            "every load belongs to an action (actions[i].second_plane.loads in the second plane), so "
            "second_plane.loads must be empty"
        )
    if case.loads:
        raise CaseError(
            f"loads: {len(case.loads)} loads given beside actions; with actions every load belongs to an "
            "action (actions[i].loads), so loads must be empty"
        )
    if case.axial_force != 0.0:
        raise CaseError(
            f"axial_force: {case.axial_force!r} N given beside actions; with actions each action has its "
            "own axial force (actions[i].axial_force), so axial_force must be 0"
        )
    actions, settings = actions_from_data(
        case.actions, case.combinations, case.length, case.second_plane is not None
    )
    combos = combine(actions, settings)  # the count and the ASCE 7 symbols are checked with the case
    _check_factored(actions, combos)
    return actions, settings


#: (field, unit, largest magnitude) of each load form's values, as :mod:`engine.loads` bounds them.
_LOAD_FIELDS = {
    "uniform": (("q", "N/m", 1e12),),
    "linear": (("q_start", "N/m", 1e12), ("q_end", "N/m", 1e12)),
    "point": (("P", "N", 1e12),),
    "couple": (("C", "N·m", 1e13),),
}


def _check_factored(actions, combos) -> None:
    """Every action's values times its largest factor stay within the bounds of a load (and of the case's
    axial force): refused here, naming the value as typed, rather than at the solve naming the factored one
    (a new user typed −1e9 kN, inside the range, and was told of −1.35e9 kN under the engine's name)."""
    for i, action in enumerate(actions):
        factor, name = 0.0, ""
        for combination in combos:
            if abs(combination.factors[i]) > factor:
                factor, name = abs(combination.factors[i]), combination.name
        if factor <= 1.0:
            continue
        items = [("axial_force", action.axial_force, "N", _MAX_AXIAL_FORCE)]
        for where, loads in (("loads", action.loads), ("second_plane.loads", action.second_loads or ())):
            for j, load in enumerate(loads):
                for field, unit, limit in _LOAD_FIELDS[load.type]:
                    items.append((f"{where}[{j}].{field}", getattr(load, field), unit, limit))
        for path, value, unit, limit in items:
            if abs(value) * factor > limit:
                raise CaseError(
                    f"actions[{i}].{path}: {value!r} {unit} must be between {-limit / factor:.4g} {unit} and "
                    f"{limit / factor:.4g} {unit}: combination {name} multiplies it by {factor:g}, and a "
                    f"factored value may not exceed {limit:g} {unit} in magnitude"
                )


def scaled(load, factor: float):
    """The load times ``factor`` (the object itself for 1.0, so a factor of one changes nothing)."""
    if factor == 1.0:
        return load
    if isinstance(load, UniformLoad):
        return dataclasses.replace(load, q=load.q * factor)
    if isinstance(load, LinearLoad):
        return dataclasses.replace(load, q_start=load.q_start * factor, q_end=load.q_end * factor)
    if isinstance(load, PointLoad):
        return dataclasses.replace(load, P=load.P * factor)
    if isinstance(load, CoupleLoad):
        return dataclasses.replace(load, C=load.C * factor)
    raise TypeError(f"not a load: {load!r}")
