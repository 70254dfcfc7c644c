"""The members table's per-action columns (load cases) and its combination rule column.

A column ``axial_<A>_kN`` (the action's own axial force, compression positive), ``udl_<A>_kN_per_m`` (its
uniform load) or ``point_loads_<A>`` (its point loads, ``7@2.0;3.5@4`` in kN@m) gives action ``<A>``. The
action's name (a letter, then up to 15 letters or digits) starts with its category's letter: ``G``
permanent, ``Q`` imposed (EN 1990 Table A1.1 without a category: the largest ψ), ``S`` snow, ``W`` wind,
``T`` temperature. ``combination_rule`` is ``en1990-6.10`` (default), ``en1990-6.10ab`` or ``asce7-2.3``.
A row with any action cell filled is solved per combination; its ``axial_kN``, ``udl_kN_per_m`` and
``point_loads`` must then be empty.
"""

from __future__ import annotations

import re

from app.batch.columns import RowError

__all__ = ["ACTION_COLUMN", "CATEGORY_LETTERS", "action_column", "column_of_path", "row_actions"]

#: The category of an action, by the first letter of its name.
CATEGORY_LETTERS = {"G": "permanent", "Q": "imposed", "S": "snow", "W": "wind", "T": "temperature"}
ACTION_COLUMN = re.compile(
    r"(?i)^(?:(?P<axial>axial)_(?P<a>[A-Za-z][A-Za-z0-9]{0,15})_kN"
    r"|(?P<udl>udl)_(?P<u>[A-Za-z][A-Za-z0-9]{0,15})_kN_per_m"
    r"|(?P<points>point_loads)_(?P<p>[A-Za-z][A-Za-z0-9]{0,15}))$"
)
_RULES = ("en1990-6.10", "en1990-6.10ab", "asce7-2.3")


def action_column(header: str) -> tuple[str, str] | None:
    """``(kind, action name)`` of a per-action column header (kind ``axial``, ``udl`` or ``points``)."""
    match = ACTION_COLUMN.fullmatch(header.strip())
    if match is None:
        return None
    for kind, key in (("axial", "a"), ("udl", "u"), ("points", "p")):
        if match.group(key):
            name = match.group(key)
            if name[0].upper() not in CATEGORY_LETTERS:
                raise ValueError(
                    f"column {header.strip()!r}: the action's name {name!r} must start with its category's "
                    "letter: G (permanent), Q (imposed), S (snow), W (wind) or T (temperature)"
                )
            return kind, name
    return None


def row_actions(row, number, point_loads, kilo: float) -> tuple[list, dict] | None:
    """The row's actions (case-file form, SI) and combinations setting; None when no action cell is filled.

    ``number(column, text, unit, example)`` reads a number and ``point_loads(column, text)`` a list of
    ``(kN, m)``, each raising a RowError naming the column.
    """
    found: dict[str, dict] = {}
    for header, text in row.items():
        spec = action_column(header)
        if spec is None or not (text or "").strip():
            continue
        kind, name = spec
        action = found.setdefault(
            name,
            {"name": name, "category": CATEGORY_LETTERS[name[0].upper()], "axial_force": 0.0, "loads": []},
        )
        if kind == "axial":
            action["axial_force"] = number(header, text.strip(), "kN (compression positive)", "350") * kilo
        elif kind == "udl":
            q = number(header, text.strip(), "kN/m", "2.5")
            if q != 0.0:
                action["loads"].append({"type": "uniform", "q": q * kilo})
        else:
            for force, x in point_loads(header, text):
                action["loads"].append({"type": "point", "P": force * kilo, "x": x})
    rule = (row.get("combination_rule") or "").strip().lower()
    if not found:
        if rule:
            raise RowError(
                "combination_rule",
                f"combination_rule: {rule!r} given without action columns (axial_G_kN, udl_W_kN_per_m, ...)",
            )
        return None
    for column in ("axial_kN", "udl_kN_per_m", "point_loads"):
        if (row.get(column) or "").strip():
            raise RowError(
                column,
                f"{column}: {row[column].strip()!r} given beside action columns; with actions, give each "
                "load with its action (axial_G_kN, udl_W_kN_per_m, point_loads_W)",
            )
    if rule and rule not in _RULES:
        raise RowError(
            "combination_rule", f"combination_rule: {rule!r} is not a rule; allowed: {', '.join(_RULES)}"
        )
    return list(found.values()), {"rule": rule or "en1990-6.10"}


def column_of_path(path: str, row) -> str:
    """The table column behind an engine path ``actions[i]...`` (``actions[i].loads[j]``: the cell that gave
    that load, in the order :func:`row_actions` reads them)."""
    filled = [n for n in row if (row.get(n) or "").strip() and action_column(n) is not None]
    names = list(dict.fromkeys(action_column(n)[1] for n in filled))
    match = re.match(r"actions\[(\d+)\](?:\.loads\[(\d+)\])?", path)
    if match is None or int(match.group(1)) >= len(names):
        return "combination_rule"
    wanted = names[int(match.group(1))]
    own = [n for n in filled if action_column(n)[1] == wanted]
    if match.group(2) is not None:
        sources = []
        for column in own:
            kind = action_column(column)[0]
            if kind == "udl":
                sources.append(column)
            elif kind == "points":
                sources += [column] * len([part for part in row[column].split(";") if part.strip()])
        if int(match.group(2)) < len(sources):
            return sources[int(match.group(2))]
    axial = [n for n in own if action_column(n)[0] == "axial"]
    return axial[0] if axial and ".axial_force" in path else own[0]
