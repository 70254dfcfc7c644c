"""The calc sheet's restraints, steps and foundation (inputs) and the reaction at every support (issue 16),
worded by :mod:`app.report`."""

from __future__ import annotations

from app.exports.style import _GREY
from app.report.restraints import INNER_NOTE, grouped_inner_rows, has_inner, reactions_note
from app.report.words import every_reaction_rows
from app.units import Units


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
    item("", reactions_note(result.case), scale=0.85, color=_GREY)
    return True
