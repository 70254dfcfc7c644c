"""The calc sheet's restraints, steps and foundation (inputs) and the reaction at every support (issue 16),
worded by :mod:`app.report`."""

from __future__ import annotations

from app.exports.style import _GREY
from app.report.restraints import FOUNDATION_NOTE, INNER_NOTE, grouped_inner_rows
from app.report.words import REACTIONS_NOTE, every_reaction_rows
from app.units import Units


def has_inner(case) -> bool:
    """Whether the case has restraints, steps or a foundation."""
    return any(getattr(case, key, ()) for key in ("restraints", "steps", "foundation"))


def inner_input_items(item, result, U: Units) -> None:
    """Section 1: each restraint, step and foundation range, grouped, in the case's order."""
    rows = grouped_inner_rows(result.case, U)
    for group, text in rows:
        item(group, text)
    if rows:
        item("", INNER_NOTE, scale=0.85, color=_GREY)


def reaction_items(item, result, U: Units) -> bool:
    """Section 3: the reaction at every support, one a line, for a case with restraints, steps or a
    foundation; returns False (nothing written) for any other case, which keeps its one-line form."""
    if not has_inner(result.case):
        return False
    for n, (where, force, couple) in enumerate(every_reaction_rows(result, U)):
        item("Support reactions" if n == 0 else "", f"{where}: {force}, couple {couple}")
    if getattr(result.case, "foundation", ()):
        item("", FOUNDATION_NOTE, scale=0.85, color=_GREY)
    else:
        item("", REACTIONS_NOTE, scale=0.85, color=_GREY)
    return True
