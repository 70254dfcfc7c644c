"""The members table's ``restraints``, ``steps`` and ``foundation`` cells (the case keys of engine issue 16).

Each cell holds items separated by ``;``, in the table's input units (m, kN, like every other input
column):

- ``restraints``: ``x:what[,what...][@plane]``, ``x`` [m] strictly inside the member. ``what`` is ``pinned``
  (translation fixed), ``guided`` (rotation fixed), ``fixed`` (both), ``kt=<kN/m>`` (a translational spring),
  ``kr=<kN·m/rad>`` (a rotational spring), ``hinge`` (a moment release), ``twist`` (the twist φ held) or
  ``kphi=<kN·m/rad>`` (a torsional spring k_φ; the twist is read by the lateral-torsional buckling check
  only); at most one translation, one rotation and one twist per item. ``@plane`` is ``@first``,
  ``@second`` or ``@both`` (default both). Example:
  ``2.0:pinned,twist;4.0:kt=5000;3.0:hinge,pinned@first;5.0:kphi=200``.
- ``steps``: ``x:EI=<kN·m²>``, the bending stiffness from x to the next step, in a row with ``EI_kNm2`` and no
  section; or ``x:section=<catalogue name>``, the section from x to the next step, in a row with a section and
  a material and no EI. Examples: ``3.0:EI=2100``, ``5.0:section=HEB 200``.
- ``foundation``: ``start-end:k=<kN/m²>[@plane]``, a Winkler modulus k (force per length per deflection) from
  start to end [m]. Example: ``0-6:k=5000``.

:func:`inner_data` turns the cells into the case file's lists (SI); a cell that is not of these forms raises
:class:`RowError` naming the column, the item and what is allowed. The engine's own checks (positions inside
the member, a mechanism, ...) name ``restraints[1].x`` and so on; :func:`column_of_path` maps them back.
"""

from __future__ import annotations

import re

from app.batch.columns import _KILO, _NUMBER, RowError

__all__ = ["INNER_COLUMNS", "SYNTAX", "column_of_path", "inner_data"]

#: The three columns, in the case file's key order.
INNER_COLUMNS = ("restraints", "steps", "foundation")

#: What each column allows, as the error messages and the column descriptions say it.
SYNTAX = {
    "restraints": "items x:what[,what][@plane] separated by ';', x in m strictly inside the member; what is "
    "pinned (translation fixed), guided (rotation fixed), fixed (both), kt=<kN/m> (translational spring), "
    "kr=<kN·m/rad> (rotational spring), hinge, twist (twist held) or kphi=<kN·m/rad> (torsional spring), at "
    "most one translation, one rotation and one twist each; plane @first, @second or @both (default both); "
    "e.g. '2.0:pinned,twist;4.0:kt=5000;3.0:hinge,pinned;5.0:kphi=200'",
    "steps": "items x:EI=<kN·m²> (a row with EI_kNm2 and no section) or x:section=<catalogue name> (a row "
    "with a section and a material and no EI), all of one form, separated by ';', x in m strictly inside the "
    "member, increasing; e.g. '3.0:EI=2100' or '5.0:section=HEB 200'",
    "foundation": "items start-end:k=<kN/m²>[@plane] separated by ';', start and end in m on the member, k "
    "the modulus (force per length per deflection) > 0; plane @first, @second or @both (default both); "
    "e.g. '0-6:k=5000'",
}

_UNSIGNED = r"(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?"
_ITEM = re.compile(rf"\s*({_NUMBER})\s*:\s*(.*?)\s*(?:@\s*([A-Za-z]+)\s*)?")
_RANGE_ITEM = re.compile(rf"\s*({_UNSIGNED})\s*-\s*({_UNSIGNED})\s*:\s*(.*?)\s*(?:@\s*([A-Za-z]+)\s*)?")
_SECTION = re.compile(r"\s*section\s*=\s*(\S.*?)\s*", re.IGNORECASE)
_VALUE = re.compile(rf"\s*(kt|kr|kphi|EI|k)\s*=\s*({_NUMBER})\s*", re.IGNORECASE)
_PLANES = ("first", "second", "both")
#: The rigid restraints by name: what each fixes (translation, rotation, twist).
_NAMED = {
    "pinned": {"translation": "fixed"},
    "guided": {"rotation": "fixed"},
    "fixed": {"translation": "fixed", "rotation": "fixed"},
    "twist": {"twist": "fixed"},
}
#: The springs by name: the part each is.
_SPRINGS = {"kt": "translation", "kr": "rotation", "kphi": "twist"}


def _refuse(column: str, item: str, why: str) -> RowError:
    return RowError(column, f"{column}: {item.strip()!r} {why}; allowed: {SYNTAX[column]}")


def _items(column: str, text: str) -> list[str]:
    from engine.limits import MAX_LOADS

    items = [item for item in text.split(";") if item.strip()]
    if len(items) > MAX_LOADS:  # as many as a case's loads; the engine allows no more per list either
        raise RowError(column, f"{column}: {len(items)} items given; at most {MAX_LOADS} are allowed")
    return items


def _plane(column: str, item: str, plane: str | None) -> str | None:
    if plane is None:
        return None
    if plane.lower() not in _PLANES:
        raise _refuse(column, item, f"names the plane {plane!r}")
    return plane.lower()


def _value(column: str, item: str, part: str, keys: tuple[str, ...]) -> float:
    match = _VALUE.fullmatch(part)
    if match is None or match.group(1).lower() not in [key.lower() for key in keys]:
        raise _refuse(column, item, f"has {part.strip()!r}, which is not one of {', '.join(keys)}")
    value = float(match.group(2))
    name = match.group(1).lower()
    # In the table's units, before the engine's own bounds (which it words in SI): a spring of 0 is free.
    if value < 0.0 or (value == 0.0 and name in ("ei", "k")):
        least = ">= 0" if name in _SPRINGS else "> 0"
        raise _refuse(column, item, f"gives {match.group(1)} = {match.group(2)}, which must be {least}")
    return value


def _restraint(item: str) -> dict:
    column = "restraints"
    match = _ITEM.fullmatch(item)
    if match is None:
        raise _refuse(column, item, "is not a restraint")
    data: dict = {"x": float(match.group(1))}
    parts = [part.strip() for part in match.group(2).split(",")]
    if not any(parts):
        raise _refuse(column, item, "says nothing after the colon")
    for part in parts:
        key = part.lower()
        if key == "hinge":
            if data.get("hinge"):
                raise _refuse(column, item, "gives the hinge twice")
            data["hinge"] = True
            continue
        if key in _NAMED:
            given = _NAMED[key]
        else:
            value = _value(column, item, part, (*_NAMED, "hinge", *_SPRINGS))
            name = part.split("=")[0].strip().lower()
            # Springs in the table's units: kN/m, kN·m/rad and kN·m/rad.
            given = {_SPRINGS[name]: value * _KILO}
        for what, restraint in given.items():
            if what in data:
                raise _refuse(
                    column, item, f"gives the {what} twice (one translation, one rotation, one twist)"
                )
            data[what] = restraint
    plane = _plane(column, item, match.group(3))
    if plane is not None:
        data["plane"] = plane
    return data


def _step(item: str) -> dict:
    match = _ITEM.fullmatch(item)
    if match is None or match.group(3) is not None:
        raise _refuse("steps", item, "is not a step")
    named = _SECTION.fullmatch(match.group(2))
    if named is not None:  # the engine checks the name against the catalogue (naming steps[i].section.name)
        return {"x": float(match.group(1)), "section": {"name": named.group(1)}}
    return {
        "x": float(match.group(1)),
        "EI": _value("steps", item, match.group(2), ("EI", "section")) * _KILO,
    }


def _foundation(item: str) -> dict:
    match = _RANGE_ITEM.fullmatch(item)
    if match is None:
        raise _refuse("foundation", item, "is not a foundation range")
    data = {
        "start": float(match.group(1)),
        "end": float(match.group(2)),
        "k": _value("foundation", item, match.group(3), ("k",)) * _KILO,  # kN/m² -> N/m²
    }
    plane = _plane("foundation", item, match.group(4))
    if plane is not None:
        data["plane"] = plane
    return data


_READERS = {"restraints": _restraint, "steps": _step, "foundation": _foundation}


def inner_data(cell) -> dict:
    """The case file's ``restraints``, ``steps`` and ``foundation`` (SI) from a row's cells (those filled).

    ``cell(name)`` returns a column's stripped text. Raises :class:`RowError` naming the column, the item
    and what is allowed.
    """
    data = {}
    for column in INNER_COLUMNS:
        text = cell(column)
        if text:
            data[column] = [_READERS[column](item) for item in _items(column, text)]
    return data


def column_of_path(head: str) -> str | None:
    """The column behind an engine error whose path starts with ``head`` (``restraints`` ...), else None."""
    return head if head in INNER_COLUMNS else None
