"""Load combinations of named actions: EN 1990 (eq. 6.10, or 6.10a/6.10b; serviceability 6.14b, 6.15b,
6.16b), ASCE 7 §2.3 (LRFD; serviceability by §2.4), and the user's own table.

Pure functions of the actions' categories (:mod:`engine.actions`); no mechanics. A combination is a factor
per action; it multiplies the action's transverse loads *and* its axial force, so a wind action with uplift
(a negative, tensile axial force) under the least permanent factor gives the least compression, or tension.

Sources (recommended values; a National Annex may change them). **All from memory**, not read from a copy:

- EN 1990:2002 + A1:2005, Table A1.2(B) (set B, STR/GEO): γ_G,sup = 1.35, γ_G,inf = 1.00, γ_Q = 1.50
  (0 where favourable), ξ = 0.85 in eq. (6.10b).
- EN 1990 Table A1.1 (buildings), ψ0/ψ1/ψ2: imposed A, B 0.7/0.5/0.3; C, D 0.7/0.7/0.6; E 1.0/0.9/0.8;
  F 0.7/0.7/0.6; G 0.7/0.5/0.3; H (roofs) 0/0/0; snow (Finland, Iceland, Norway, Sweden, or a site above
  1000 m) 0.7/0.5/0.2, snow at most 1000 m 0.5/0.2/0; wind 0.6/0.2/0; temperature (non-fire) 0.6/0.5/0.
- ASCE/SEI 7-16 §2.3.1 (LRFD basic combinations 1–5, numbered as 7-16 numbers them; the combinations with
  seismic load effects, §2.3.6, are not made) and §2.4.1 (ASD combinations 1–7, used here for the deflection
  check; §2.4.5's seismic ones are not made).

Decisions (the safe side, DEVELOPERS.md "Load cases and combinations"): ``imposed`` without a letter takes
the largest ψ of every category (E's 1.0/0.9/0.8); ``snow`` the larger of the two snow rows; each permanent
action is its own source and is tried at both γ_G,sup and γ_G,inf; each variable action is tried present and
absent (γ_Q = 0 where favourable), and each present one as the leading action; ASCE 7's L factor stays 1.0 in
combinations 3 and 4 (the 0.5 of exception 1 is not taken).
"""

from __future__ import annotations

import itertools
from dataclasses import dataclass

from engine import limits
from engine.errors import CaseError

__all__ = [
    "ASCE_LRFD",
    "ASCE_SERVICE",
    "Combination",
    "EN_GAMMA",
    "EN_PSI",
    "MAX_COMBINATIONS",
    "asce_symbol",
    "combine",
    "permanent_exclusive",
    "psi_of",
]

#: EN 1990 Table A1.2(B), recommended values (from memory).
EN_GAMMA = {"G_sup": 1.35, "G_inf": 1.00, "Q": 1.50, "xi": 0.85}
EN_GAMMA_SOURCE = "EN 1990:2002+A1 Table A1.2(B), recommended values (from memory)"
#: EN 1990 Table A1.1, (ψ0, ψ1, ψ2) for buildings (from memory).
EN_PSI = {
    "imposed-A": (0.7, 0.5, 0.3),
    "imposed-B": (0.7, 0.5, 0.3),
    "imposed-C": (0.7, 0.7, 0.6),
    "imposed-D": (0.7, 0.7, 0.6),
    "imposed-E": (1.0, 0.9, 0.8),
    "imposed-F": (0.7, 0.7, 0.6),
    "imposed-G": (0.7, 0.5, 0.3),
    "imposed-H": (0.0, 0.0, 0.0),
    "imposed": (1.0, 0.9, 0.8),  # no category named: the largest of each column (E), the safe side
    "snow": (0.7, 0.5, 0.2),  # Finland, Iceland, Norway, Sweden, or above 1000 m: the larger row
    "snow-low": (0.5, 0.2, 0.0),  # other CEN states, at most 1000 m above sea level
    "wind": (0.6, 0.2, 0.0),
    "temperature": (0.6, 0.5, 0.0),
}
EN_PSI_SOURCE = "EN 1990:2002+A1 Table A1.1, buildings (from memory)"
_ASCE_SYMBOLS = {
    "permanent": "D",
    **{f"imposed-{letter}": "L" for letter in "ABCDEFG"},
    "imposed": "L",
    "imposed-H": "Lr",
    "snow": "S",
    "snow-low": "S",
    "wind": "W",
}
_X = ("Lr", "S", "R")  # "(Lr or S or R)"
#: ASCE 7-16 §2.3.1 LRFD basic combinations 1–5 (7-16's numbering; the seismic ones are §2.3.6's, not made),
#: each "or" written out (from memory).
ASCE_LRFD = (
    ("1", ({"D": 1.4},)),
    ("2", tuple({"D": 1.2, "L": 1.6, x: 0.5} for x in _X)),
    ("3", tuple({"D": 1.2, x: 1.6, **other} for x in _X for other in ({"L": 1.0}, {"W": 0.5}))),
    ("4", tuple({"D": 1.2, "W": 1.0, "L": 1.0, x: 0.5} for x in _X)),
    ("5", ({"D": 0.9, "W": 1.0},)),
)
#: ASCE 7-16 §2.4.1 ASD combinations 1–7 (7-16's numbering; the seismic ones are §2.4.5's, not made), from
#: memory, for the deflection check.
ASCE_SERVICE = (
    ("1", ({"D": 1.0},)),
    ("2", ({"D": 1.0, "L": 1.0},)),
    ("3", tuple({"D": 1.0, x: 1.0} for x in _X)),
    ("4", tuple({"D": 1.0, "L": 0.75, x: 0.75} for x in _X)),
    ("5", ({"D": 1.0, "W": 0.6},)),
    ("6", tuple({"D": 1.0, "L": 0.75, "W": 0.45, x: 0.75} for x in _X)),
    ("7", ({"D": 0.6, "W": 0.6},)),
)
ASCE_SOURCE = "ASCE/SEI 7-16 §2.3.1 (LRFD) and §2.4.1 (ASD, for service) (from memory)"
#: At most this many combinations per case (bounds the work of one case; engine.limits holds it).
MAX_COMBINATIONS = limits.MAX_COMBINATIONS


@dataclass(frozen=True, kw_only=True)
class Combination:
    """One combination: a factor per action of the case (in the case's order).

    Attributes
    ----------
    name : str
        ``U1``, ``U2`` … (ultimate), ``S1`` … (service), or the user's row name.
    state : str
        ``"ultimate"`` (strength and stability) or ``"service"`` (deflection).
    rule : str
        The rule that made it (:data:`engine.actions.RULES`).
    equation : str
        ``"6.10"``, ``"6.10a"``, ``"6.10b"``, ``"6.14b"`` (characteristic), ``"6.15b"`` (frequent),
        ``"6.16b"`` (quasi-permanent), ``"2.3.1-<n>"``, ``"2.4.1-<n>"``, or ``"table"``.
    factors : tuple of float
        One per action.
    leading : str or None
        The leading variable action's name (EN 1990 combinations with one).
    source : str
    """

    name: str
    state: str
    rule: str
    equation: str
    factors: tuple
    leading: str | None = None
    source: str = ""

    def terms(self, names) -> tuple:
        """``((factor, action name), ...)`` of the actions that act (factor not 0)."""
        return tuple((f, n) for f, n in zip(self.factors, names, strict=True) if f != 0.0)


def psi_of(action) -> tuple:
    """(ψ0, ψ1, ψ2) of a variable action: its own ``psi`` when given, else EN 1990 Table A1.1's."""
    return action.psi if action.psi is not None else EN_PSI[action.category]


def asce_symbol(index: int, action) -> str:
    """The ASCE 7 load symbol of an action; a category ASCE 7's basic combinations do not hold is refused."""
    if action.asce is not None:
        return action.asce
    if action.category not in _ASCE_SYMBOLS:
        raise CaseError(
            f"actions[{index}].category: {action.category!r} has no load symbol in ASCE 7 §2.3's basic "
            "combinations; give 'asce' (D, L, Lr, S, R or W) or use rule 'table'"
        )
    return _ASCE_SYMBOLS[action.category]


def permanent_exclusive(path: str, exclusive: str) -> str:
    """The refusal of ``exclusive`` on a permanent action (it acts in every combination, so it cannot be
    one of alternatives that never act together)."""
    return (
        f"{path}.exclusive: {exclusive!r} is not allowed for a permanent action: a permanent action acts "
        "in every combination; give alternative permanent states as separate cases, or list the "
        "combinations yourself with rule 'table'"
    )


def _subsets(actions, variable) -> list:
    """Every set of variable actions that may act together (at most one of each ``exclusive`` name)."""
    found = []
    for size in range(len(variable) + 1):
        for chosen in itertools.combinations(variable, size):
            groups = [actions[i].exclusive for i in chosen if actions[i].exclusive is not None]
            if len(groups) == len(set(groups)):
                found.append(chosen)
    return found


def _en_ultimate(actions, variable, permanent, subsets, rule) -> list:
    g = EN_GAMMA
    rows = []
    source = f"EN 1990 eq. ({{}}); {EN_GAMMA_SOURCE}; {EN_PSI_SOURCE}"
    for levels in itertools.product((True, False), repeat=len(permanent)):
        for chosen in subsets:
            leads = chosen if chosen else (None,)
            if rule == "en1990-6.10":
                forms = [("6.10", g["G_sup"], lead) for lead in leads]
            else:
                forms = [("6.10a", g["G_sup"], None)] + [
                    ("6.10b", g["xi"] * g["G_sup"], lead) for lead in leads
                ]
            for equation, sup, lead in forms:
                factors = [0.0] * len(actions)
                for i, high in zip(permanent, levels, strict=True):
                    factors[i] = sup if high else g["G_inf"]
                for i in chosen:
                    factors[i] = g["Q"] if i == lead else g["Q"] * psi_of(actions[i])[0]
                name = None if lead is None else actions[lead].name
                rows.append(("ultimate", rule, equation, factors, name, source.format(equation)))
    return rows


def _en_service(actions, variable, permanent, subsets, kinds) -> list:
    rows = []
    for kind in kinds:
        equation = {"characteristic": "6.14b", "frequent": "6.15b", "quasi-permanent": "6.16b"}[kind]
        source = f"EN 1990 eq. ({equation}), {kind} combination; {EN_PSI_SOURCE}"
        for chosen in subsets:
            leads = chosen if (chosen and kind != "quasi-permanent") else (None,)
            for lead in leads:
                factors = [0.0] * len(actions)
                for i in permanent:
                    factors[i] = 1.0
                for i in chosen:
                    psi = psi_of(actions[i])
                    if kind == "characteristic":
                        factors[i] = 1.0 if i == lead else psi[0]
                    elif kind == "frequent":
                        factors[i] = psi[1] if i == lead else psi[2]
                    else:
                        factors[i] = psi[2]
                name = None if lead is None else actions[lead].name
                rows.append(("service", "en1990", equation, factors, name, source))
    return rows


def _asce(actions, permanent, subsets, table, state, clause) -> list:
    symbols = [asce_symbol(i, action) for i, action in enumerate(actions)]
    rows = []
    for number, variants in table:
        for variant in variants:
            for chosen in subsets:
                factors = [0.0] * len(actions)
                for i in permanent:
                    factors[i] = variant.get("D", 0.0)
                for i in chosen:
                    factors[i] = variant.get(symbols[i], 0.0)
                rows.append((state, "asce7-2.3", f"{clause}-{number}", factors, None, ASCE_SOURCE))
    return rows


def combine(actions, settings) -> tuple:
    """The combinations of ``actions`` (:class:`engine.actions.Action`) under ``settings``
    (:class:`engine.actions.CombinationSettings`): the rule's ultimate ones, then its service ones, then the
    user's table, each factor vector once (the first kept).

    >>> from engine.actions import Action, CombinationSettings
    >>> g = Action(name="G", category="permanent", axial_force=1e5)
    >>> w = Action(name="W", category="wind", axial_force=-2e4)
    >>> for c in combine((g, w), CombinationSettings()):
    ...     print(c.name, c.equation, c.factors)
    U1 6.10 (1.35, 0.0)
    U2 6.10 (1.35, 1.5)
    U3 6.10 (1.0, 0.0)
    U4 6.10 (1.0, 1.5)
    S1 6.14b (1.0, 0.0)
    S2 6.14b (1.0, 1.0)
    """
    permanent = [i for i, action in enumerate(actions) if action.category == "permanent"]
    variable = [i for i, action in enumerate(actions) if action.category != "permanent"]
    for i in permanent:
        if actions[i].exclusive is not None:
            raise CaseError(permanent_exclusive(f"actions[{i}]", actions[i].exclusive))
    if len(permanent) > 6:
        raise CaseError(
            f"actions: {len(permanent)} permanent actions; at most 6 "
            "(each is tried at both permanent factors)"
        )
    subsets = _subsets(actions, variable)
    rows = []
    if settings.rule.startswith("en1990"):
        rows += _en_ultimate(actions, variable, permanent, subsets, settings.rule)
        rows += _en_service(actions, variable, permanent, subsets, settings.service)
    elif settings.rule == "asce7-2.3":
        rows += _asce(actions, permanent, subsets, ASCE_LRFD, "ultimate", "2.3.1")
        rows += _asce(actions, permanent, subsets, ASCE_SERVICE, "service", "2.4.1")
    made, seen, counts = [], set(), {"ultimate": 0, "service": 0}
    for state, rule, equation, factors, lead, source in rows:
        factors = [round(f, 12) for f in factors]  # 1.5 × 0.6 is 0.9, not 0.8999999999999999
        key = (state, tuple(factors))
        if key in seen or not any(factors):
            continue
        seen.add(key)
        counts[state] += 1
        name = f"{'U' if state == 'ultimate' else 'S'}{counts[state]}"
        made.append(
            Combination(
                name=name,
                state=state,
                rule=rule,
                equation=equation,
                factors=tuple(factors),
                leading=lead,
                source=source,
            )
        )
    index = {action.name: i for i, action in enumerate(actions)}
    for row in settings.table:
        factors = [0.0] * len(actions)
        for name, factor in row.factors:
            factors[index[name]] = factor
        made.append(
            Combination(
                name=row.name,
                state=row.state,
                rule="table",
                equation="table",
                factors=tuple(factors),
                source="the user's table of factors",
            )
        )
    if len(made) > MAX_COMBINATIONS:
        raise CaseError(
            f"combinations: {len(made)} combinations made; a case may have at most {MAX_COMBINATIONS} "
            "(name exclusive actions, or give a table with rule 'table')"
        )
    return tuple(made)
