"""The wording of a case's restraints, steps and foundation, and the reaction at every support (issue 16).

One home for every output: the printed summary, the CSV, the calc sheet and the batch's cells. The engine
gives each reaction as the support-side end values of T and M (ends) or as the force along +w and the couple
C on the member (restraints inside, ``engine.restraints.RestraintReaction``); here each becomes the force
**up as drawn** (against + w and a positive load) and the couple **anticlockwise as drawn**, the way
:func:`app.report.reaction_rows` words them (DEVELOPERS.md, "Coordinates and signs").
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

from app.report.numbers import position
from app.units import UNIT_SYSTEMS, Units, units

__all__ = [
    "REACTIONS_NOTE",
    "COUPLE_SENSE",
    "FORCE_SENSE",
    "FOUNDATION_UNITS",
    "all_reactions",
    "has_inner",
    "reactions_note",
    "metadata_rows",
    "support_held_words",
    "support_label",
    "SupportReaction",
    "foundation_show",
    "step_section_name",
    "inner_reactions",
    "inner_reactions_cell",
    "inner_rows",
    "restraint_text",
    "support_reactions",
]

#: The foundation modulus k [N/m², force per length per deflection] in each system: (label, factor from SI),
#: the kind ``foundation_modulus`` of :class:`app.units.Units` (kN/m² in SI, kip/in², kip per inch of member
#: per inch of deflection, in US customary), as the page, the sketch and the batch column show and take it.
FOUNDATION_UNITS = {
    system: (units(system).foundation_modulus.label, units(system).foundation_modulus.factor)
    for system in UNIT_SYSTEMS
}

#: How the reactions are written: the force and the couple each support exerts on the member, as drawn.
REACTIONS_NOTE = (
    "forces and couples the supports exert on the member, drawn with x to the right and +w downward; "
    "they balance the loads"
)

_PLANE_WORDS = {"first": "first plane", "second": "second plane", "both": "both planes"}


@dataclass(frozen=True, kw_only=True)
class SupportReaction:
    """What one support exerts on the member, in SI: ``force`` [N] up as drawn (against + w), ``couple``
    [N·m] anticlockwise as drawn; ``where`` is ``"left"``, ``"right"`` or ``"inner"``, ``index`` the
    restraint's place in its plane's list (None at an end), ``plane`` 1 or 2."""

    where: str
    x: float
    force: float
    couple: float
    index: int | None = None
    plane: int = 1
    #: False for a restraint inside the member that leaves rotation free: its couple is zero by definition
    #: (what the engine returns there is rounding) and the batch's cell leaves it out.
    rotation_restrained: bool = True


def support_reactions(reactions, length: float, plane: int = 1) -> list[SupportReaction]:
    """Every support's reaction of one plane in x order: the left end, the restraints inside (a case file may
    list them in any order; ``index`` keeps each one's place), the right end."""
    out = [
        SupportReaction(where="left", x=0.0, force=reactions.left_T, couple=-reactions.left_M, plane=plane)
    ]
    for inner in sorted(getattr(reactions, "intermediate", ()), key=lambda item: item.x):
        out.append(
            SupportReaction(
                where="inner",
                x=inner.x,
                force=-inner.force,
                couple=-inner.couple,
                index=inner.index,
                plane=plane,
            )
        )
    out.append(
        SupportReaction(
            where="right", x=length, force=-reactions.right_T, couple=reactions.right_M, plane=plane
        )
    )
    return out


def _planes(result):
    yield 1, result
    second = getattr(result, "second_plane", None)
    if second is not None:
        yield 2, second


def _plane_reactions(solved, own, plane: int) -> list[SupportReaction]:
    """One plane's reactions (:func:`support_reactions`), the couple of a restraint or an end that leaves
    rotation free set to its exact 0 (the engine's value there is rounding)."""
    name = "first" if plane == 1 else "second"
    given = [r for r in getattr(solved.case, "restraints", ()) if r.plane in (name, "both")]
    out = []
    ends = getattr(own, "case", None) or solved.case
    for r in support_reactions(own.reactions, solved.case.length, plane):
        inside = r.where == "inner" and r.index is not None and r.index < len(given)
        if inside and given[r.index].rotation == "free":
            r = dataclasses.replace(r, couple=0.0, rotation_restrained=False)
        end = getattr(ends, r.where, None) if r.where in ("left", "right") else None
        if end is not None and end.rotation == "free":  # a pin takes no couple: 0, not rounding (4.6e-15)
            r = dataclasses.replace(r, couple=0.0)
        out.append(r)
    return out


def inner_reactions(result) -> list[SupportReaction]:
    """The restraints' reactions inside the member, both planes (the first plane's first).

    For a case with load cases (``result.actions``) each restraint's force and couple are the largest in
    size over the ultimate combinations (each keeps its sign; the two may come from different combinations):
    what the restraint must be designed for, whichever combination governs the member.
    """
    actions = getattr(result, "actions", None)
    results = [result]
    if actions is not None:
        results = [c.result for c in actions.combinations if c.combination.state == "ultimate"] or results
    chosen: dict = {}
    for solved in results:
        for plane, own in _planes(solved):
            for r in _plane_reactions(solved, own, plane)[1:-1]:
                key = (plane, r.index, r.x)
                best = chosen.get(key)
                if best is None:
                    chosen[key] = r
                    continue
                force = r.force if abs(r.force) > abs(best.force) else best.force
                couple = r.couple if abs(r.couple) > abs(best.couple) else best.couple
                chosen[key] = dataclasses.replace(r, force=force, couple=couple)
    return list(chosen.values())


def inner_reactions_cell(reactions: list[SupportReaction], U: Units, number) -> str:
    """The batch's ``inner_reactions`` cell: ``x:F=<force>,C=<couple>`` per restraint separated by ';'
    (``,C=`` only where the restraint holds rotation), a second-plane one ending ``@second``, in the
    display units; ``number`` writes a value."""
    items = []
    for r in reactions:
        plane = "@second" if r.plane == 2 else ""
        couple = f",C={number(U.convert('moment', r.couple))}" if r.rotation_restrained else ""
        items.append(
            f"{number(U.convert('length', r.x))}:F={number(U.convert('force', r.force))}{couple}{plane}"
        )
    return ";".join(items)


def foundation_show(U: Units, k: float) -> str:
    """A foundation modulus [N/m²] in the display units, e.g. ``"5000 kN/m²"``."""
    from app.report.numbers import format_number

    unit = U.unit("foundation_modulus")
    return f"{format_number(unit.from_si(k))} {unit.label}" if math.isfinite(k) else format_number(k)


def _restraint_part(value, kind: str, symbol: str, U: Units) -> str | None:
    if value == "free":
        return None
    if value == "fixed":
        return "fixed"
    return f"spring {symbol} = {U.show(kind, value)}"


#: A restraint's parts that are fixed, free or a spring: (key, quantity of the spring, its symbol). The twist
#: (φ, about the member's axis) is read by the lateral-torsional buckling check only.
_PARTS = (
    ("translation", "translational_spring", "k_t"),
    ("rotation", "rotational_spring", "k_r"),
    ("twist", "rotational_spring", "k_φ"),
)


def restraint_text(r, U: Units, two_planes: bool = False) -> str:
    """One restraint inside the member, e.g. ``"x = 3.000 m: translation fixed, hinge"`` or
    ``"x = 3.000 m: twist fixed (lateral-torsional buckling)"``; a twist alone acts in no bending plane, so
    no plane is named for it."""
    parts = []
    for name, kind, symbol in _PARTS:
        said = _restraint_part(getattr(r, name, "free"), kind, symbol, U)
        if said is not None:
            parts.append(f"{name} {said}" + (" (lateral-torsional buckling)" if name == "twist" else ""))
    if r.hinge:
        parts.append("hinge (moment released)")
    bends = getattr(r, "bends", True)
    plane = f" ({_PLANE_WORDS[r.plane]})" if two_planes and bends else ""
    return f"x = {position(U, r.x)}: {', '.join(parts)}{plane}"


def step_section_name(step) -> str:
    """The section a step by section names (its catalogue name, else its shape, else "custom section")."""
    spec = dict(step.section)
    return str(spec.get("name") or spec.get("shape") or "custom section")


def _step_text(s, U: Units) -> str:
    if s.EI is None:  # a step by section
        return f"section {step_section_name(s)} from x = {position(U, s.x)}"
    return f"EI = {U.show('stiffness', s.EI)} from x = {position(U, s.x)}"


def inner_rows(case, U: Units) -> list[tuple[str, str]]:
    """(label, text) of each restraint, step and foundation range of the case, in the case's order; empty
    when it has none."""
    two = getattr(case, "second_plane", None) is not None
    rows = []
    for number, r in enumerate(getattr(case, "restraints", ()), start=1):
        rows.append((f"restraint {number}", restraint_text(r, U, two)))
    for number, s in enumerate(getattr(case, "steps", ()), start=1):
        rows.append((f"step {number}", _step_text(s, U)))
    for number, f in enumerate(getattr(case, "foundation", ()), start=1):
        plane = f" ({_PLANE_WORDS[f.plane]})" if two else ""
        rows.append(
            (
                f"foundation {number}",
                f"k = {foundation_show(U, f.k)} from x = {position(U, f.start)} to "
                f"{position(U, f.end)}{plane}",
            )
        )
    return rows


def support_label(r: SupportReaction, U: Units, two_planes: bool = False) -> str:
    """Where a reaction acts, as every output names it: ``left end (x = 0)``, ``right end (x = L)``,
    ``restraint at x = 3.000 m``; with two planes, ``second plane, `` before the second plane's."""
    label = {"left": "left end (x = 0)", "right": "right end (x = L)"}.get(r.where)
    label = label or f"restraint at x = {position(U, r.x)}"
    if two_planes:
        label = f"{'first' if r.plane == 1 else 'second'} plane, {label}"
    return label


def all_reactions(result) -> list[SupportReaction]:
    """The reaction at every support of the shown result, ends and restraints in x order, the first plane
    then the second."""
    out = []
    for plane, own in _planes(result):
        out += _plane_reactions(result, own, plane)
    return out


#: How the reactions' signs read, for the CSV's notes and the calc sheet.
FORCE_SENSE = "up as drawn (against + w and a positive load)"
COUPLE_SENSE = "anticlockwise as drawn"


def metadata_rows(result, U: Units) -> list[tuple]:
    """The CSV's metadata rows (key, value, note) of the restraints, steps and foundation (inputs) and of the
    reaction at every support, in the display units; numbers to the CSV's digits."""
    from app.report.numbers import csv_number

    case = result.case
    two = getattr(case, "second_plane", None) is not None
    length, force, moment = U.label("length"), U.label("force"), U.label("moment")
    rows: list[tuple] = []
    for number, r in enumerate(getattr(case, "restraints", ()), start=1):
        what = restraint_text(r, U, two).split(": ", 1)[1]
        rows.append((f"restraint {number} x [{length}]", csv_number(U.convert("length", r.x)), what))
        for name, kind, symbol in _PARTS:
            value = getattr(r, name, "free")
            if not isinstance(value, str):
                rows.append(
                    (f"restraint {number} {symbol} [{U.label(kind)}]", csv_number(U.convert(kind, value)))
                )
    for number, s in enumerate(getattr(case, "steps", ()), start=1):
        rows.append((f"step {number} x [{length}]", csv_number(U.convert("length", s.x))))
        if s.EI is None:  # a step by section
            rows.append((f"step {number} section", step_section_name(s)))
        else:
            label = f"step {number} EI [{U.label('stiffness')}]"
            rows.append((label, csv_number(U.convert("stiffness", s.EI))))
    label = U.label("foundation_modulus")
    for number, f in enumerate(getattr(case, "foundation", ()), start=1):
        rows.append((f"foundation {number} start [{length}]", csv_number(U.convert("length", f.start))))
        rows.append((f"foundation {number} end [{length}]", csv_number(U.convert("length", f.end))))
        note = _PLANE_WORDS[f.plane] if two else "Winkler modulus, force per length per deflection"
        rows.append(
            (f"foundation {number} k [{label}]", csv_number(U.convert("foundation_modulus", f.k)), note)
        )
    for r in all_reactions(result):
        where = support_label(r, U, two)
        rows.append((f"reaction {where} F [{force}]", csv_number(U.convert("force", r.force)), FORCE_SENSE))
        rows.append(
            (f"reaction {where} C [{moment}]", csv_number(U.convert("moment", r.couple)), COUPLE_SENSE)
        )
    return rows


#: The groups of :func:`inner_rows` as a list's first line names them (calc sheet, summary).
GROUP_NAMES = {"restraint": "Restraints inside", "step": "Steps in EI", "foundation": "Elastic foundation"}

#: Under the list of restraints and steps: how the sketch names the restraints and where a step's EI holds.
INNER_NOTE = (
    "restraints R1, R2, ... as the sketch names them; each step's EI holds from its x to the next step"
)

#: Under the reactions of a case with a foundation (instead of :data:`app.report.REACTIONS_NOTE`, whose
#: reactions balance the loads).
FOUNDATION_NOTE = (
    "forces and couples the supports exert on the member, drawn with x to the right and +w downward; with "
    "the foundation's reaction k·w along its range they balance the loads"
)


def grouped_inner_rows(case, U: Units) -> list[tuple[str, str]]:
    """:func:`inner_rows` as (group name on its first line else "", "restraint 1: ...")."""
    out, shown = [], set()
    for label, text in inner_rows(case, U):
        group = label.split()[0]
        out.append(("" if group in shown else GROUP_NAMES[group], f"{label}: {text}"))
        shown.add(group)
    return out


def has_inner(case) -> bool:
    """Whether the case has restraints, steps or a foundation."""
    return any(getattr(case, key, ()) for key in ("restraints", "steps", "foundation"))


def reactions_note(case) -> str:
    """How the reactions read: :data:`app.report.REACTIONS_NOTE`, or :data:`FOUNDATION_NOTE` with a
    foundation (whose own reaction then balances part of the loads)."""
    return FOUNDATION_NOTE if getattr(case, "foundation", ()) else REACTIONS_NOTE


def support_held_words(v: dict, U: Units) -> str:
    """The caution ``ltb-support-held-assumed`` in the display units (its x are lengths)."""
    where = ", ".join(U.show("length", x) for x in v.get("x", ()))
    return (
        f"Lateral-torsional buckling takes the support inside the member (x = {where}) as held laterally "
        "and against twist (a fork), as it takes a supported end: with a free end and the other end not "
        "built in, nothing else would hold the member laterally. One plane does not say how the support "
        "holds the member out of its plane; where it does not hold it so, the check is not covered: give "
        "the plane of minor-axis bending with its restraints."
    )
