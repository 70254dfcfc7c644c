"""The page's inputs of what acts inside the member (engine issue 16): restraints, steps in EI, foundation.

:class:`InnerInputs` is the part of :class:`app.state_inputs.MemberInputs` that holds them, in the case
file's own form and SI like every input (lists of mappings, as ``loads``): ``restraints`` (``x``,
``translation`` and ``rotation`` "fixed", "free" or a spring [N/m, N·m/rad], ``hinge``, ``plane``, ``twist``
"fixed", "free" or a torsional spring k_φ [N·m/rad]), ``steps``
(``x``, ``EI`` [N·m²]) and ``foundation`` (``start``, ``end``, ``k`` [N/m²], ``plane``). Rows are added,
edited and removed as the loads are (:meth:`InnerInputs.add_item`, :meth:`InnerInputs.set_item`,
:meth:`InnerInputs.remove_item`); the engine validates them when the state solves and its message names the
row and the field (``restraints[1].x``), which the page shows beside it. :func:`inner_mapping` and
:func:`inner_values` turn them into the case file's keys and back: an empty list is not written, so a case
without them is the same file as before.
"""

from __future__ import annotations

from collections.abc import Mapping
from typing import Any

import param

__all__ = [
    "INNER_FIELDS",
    "INNER_INPUTS",
    "InnerInputs",
    "SPRING_DEFAULTS",
    "default_item",
    "inner_settings",
    "inner_mapping",
    "inner_values",
    "step_section",
]

#: The inputs held here (the state watches them as it watches every other input).
INNER_INPUTS = ("restraints", "steps", "foundation")

#: The case-file keys of each list's rows.
INNER_FIELDS = {
    "restraints": ("x", "translation", "rotation", "hinge", "plane", "twist"),
    "steps": ("x", "EI", "section"),
    "foundation": ("start", "end", "k", "plane"),
}

#: The spring a restraint gets when its translation, rotation or twist is switched to "spring" (SI: N/m,
#: N·m/rad, N·m/rad): a round, moderate value to be edited (common practice, no source).
SPRING_DEFAULTS = {"translation": 1.0e6, "rotation": 1.0e6, "twist": 1.0e6}
#: A new foundation's modulus k [N/m²] (a 0.2 m wide flange on a bedding of 50 MN/m³; invented).
_FOUNDATION_K = 1.0e7


def step_section(inputs) -> str | None:
    """The catalogue name a new step takes when the case's steps go by section, else None (steps in EI).

    The engine takes a step by section in a case with a section and a material and no EI of its own; the page
    offers it when that section is a catalogue one (its rows pick a catalogue name), steps in EI otherwise.
    """
    if getattr(inputs, "stiffness_from", None) == "section" and getattr(inputs, "section_shape", None) == (
        "catalogue"
    ):
        return getattr(inputs, "section_name", None)
    return None


def default_item(field: str, length: float, EI: float | None = None, section: str | None = None) -> dict:
    """A new row of list `field` on a member of `length` [m] (EI [N·m²]: the member's own, for a step;
    `section`: the case's catalogue name, for a step by section).

    A restraint is a rigid brace against translation at mid-length, a step halves EI (or takes the case's
    section, to be picked) from mid-length on and a foundation runs along the whole member.
    """
    middle = 0.5 * length if isinstance(length, (int, float)) and length > 0 else 1.0
    if field == "restraints":
        return {"x": middle, "translation": "fixed"}
    if field == "steps" and section:
        return {"x": middle, "section": {"name": section}}
    if field == "steps":
        own = EI if isinstance(EI, (int, float)) and EI > 0 else 1.0e6
        return {"x": middle, "EI": 0.5 * own}
    if field == "foundation":
        return {"start": 0.0, "end": 2.0 * middle, "k": _FOUNDATION_K}
    raise ValueError(
        f"field: {field!r} is not a list of the member's inside; allowed: {', '.join(INNER_INPUTS)}"
    )


class InnerInputs(param.Parameterized):
    """Restraints, steps and foundation ranges in the case-file form (SI; validated by the engine)."""

    restraints = param.List(
        default=[],
        item_type=dict,
        doc="Intermediate restraints: x [m]; translation and rotation 'fixed', 'free' or a spring k_t [N/m], "
        "k_r [N·m/rad]; hinge (a moment release); plane 'first', 'second' or 'both'; twist 'fixed', 'free' "
        "or a torsional spring k_φ [N·m/rad] (lateral-torsional buckling only).",
    )
    steps = param.List(
        default=[],
        item_type=dict,
        doc="Steps along the member: EI [N·m²] or a section ({'name': ...}) from x [m] to the next step.",
    )
    foundation = param.List(
        default=[],
        item_type=dict,
        doc="Elastic foundation ranges: modulus k [N/m²] from start to end [m], in a plane or both.",
    )

    def add_item(self, field: str) -> None:
        """Append a row with default values to list `field` (restraints, steps or foundation).

        The first row of a list also takes the settings the engine refuses beside it (its conservative
        refusals, DEVELOPERS.md), in the same update, so the case solves once: the first foundation range
        leaves only the second-order route, and the first step turns an eq. (5.9) bow into the Table 5.1 bow.
        A restraint needs neither (the engine checks each segment between braced points by every route).
        """
        row = default_item(field, getattr(self, "length", 1.0), getattr(self, "EI", None), step_section(self))
        values: dict[str, Any] = {field: [*getattr(self, field), row]}
        if not getattr(self, field):
            values.update(inner_settings(self, field))
        self.param.update(**values)

    def remove_item(self, field: str, index: int) -> None:
        """Remove row `index` (0-based) of list `field`."""
        setattr(self, field, [row for i, row in enumerate(getattr(self, field)) if i != index])

    def set_item(self, field: str, index: int, **fields: Any) -> None:
        """Change fields of row `index` of list `field`. An emptied number (None) is kept as None, so the
        engine names the field, its value and what it allows (the row stays as typed); a restraint's hinge
        set false, its plane "both" and its twist "free" are left out (the case file's defaults).

        A restraint's translation, rotation or twist set to "spring" becomes :data:`SPRING_DEFAULTS`'
        stiffness; a hinge set frees the rotation (a hinge takes no rotation restraint).
        """
        rows = [dict(row) for row in getattr(self, field)]
        row = rows[index]
        for key, value in fields.items():
            if value == "spring" and key in SPRING_DEFAULTS:
                value = row[key] if _is_spring(row.get(key)) else SPRING_DEFAULTS[key]
            if key == "hinge" and value:
                row.pop("rotation", None)
            if (
                (key == "hinge" and not value)
                or (key == "plane" and value in (None, "both"))
                or (key == "twist" and value == "free")
            ):
                row.pop(key, None)
            else:
                row[key] = value
        rows[index] = row
        setattr(self, field, rows)


def inner_settings(inputs, field: str) -> dict:
    """The route and bow settings a case needs when its first row of ``field`` is added (empty if none).

    The engine refuses the equivalent-member routes on a foundation (no table covers a member bedded along
    its length) and the eq. (5.9) bow with steps (its amplitude is scaled at the critical section of a
    uniform member); the page takes the settings it allows rather than answer the row with an error.
    """
    values: dict[str, Any] = {}
    routes = getattr(inputs, "routes", None)
    if field == "foundation" and routes is not None and list(routes) != ["second-order"]:
        values["routes"] = ["second-order"]
    if field == "steps" and getattr(inputs, "bow_preset", None) == "en1993-eq-5.9":
        values["bow_preset"] = "en1993-table-5.1"
    return values


def _is_spring(value: Any) -> bool:
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def inner_mapping(inputs) -> dict:
    """The case file's ``restraints``, ``steps`` and ``foundation`` keys, each only when it has rows."""
    return {
        field: [dict(row) for row in getattr(inputs, field)]
        for field in INNER_INPUTS
        if getattr(inputs, field)
    }


def inner_values(mapping: Mapping) -> dict:
    """The inputs of :class:`InnerInputs` for a case-file mapping (the inverse of :func:`inner_mapping`).

    A list's rows are taken as they are (the engine names what is wrong); a value that is not a list of
    mappings is kept out of the state and shown by the engine when the file is read.
    """
    values: dict[str, Any] = {}
    for field in INNER_INPUTS:
        rows = mapping.get(field, [])
        if not isinstance(rows, list) or not all(isinstance(row, Mapping) for row in rows):
            raise TypeError(f"{field}: expected a list of objects")
        values[field] = [dict(row) for row in rows]
    return values
