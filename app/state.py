"""The page's state: one member's inputs in SI, turned into an engine case in one place, and the last good
result.

:class:`MemberState` is a :class:`param.Parameterized` with no GUI in it. Its inputs are the case's fields
in SI units (m, N, N·m, Pa), each with the soft bounds the page's widgets use and a doc string with its
unit. The engine validates every input: hard bounds are left to it on purpose (and an emptied number field
is None), so that a bad value (a negative length, a load beyond the member) reaches the engine and comes
back as its message naming the field, which the page shows next to that input. The inputs are kept as typed
whatever happens (no input is lost), and the outputs keep the last good solution until the inputs are valid
again.

:meth:`MemberState.case_mapping` is the one place that turns the inputs into a case-file mapping, and
:meth:`MemberState.to_case` into an :class:`engine.Case`; :func:`values_from_mapping` is its inverse, which
loads a case file, an upload or a link into the state with one ``param.update`` (one solve).

The outputs are constant parameters, set only here:

- ``result``: the last good :class:`engine.Result`;
- ``sweep``: :func:`engine.sweep` over the axial forces of the amplification chart, recomputed only when the
  case other than the axial force changes (dragging the axial force does not rerun it);
- ``approximation``: the engine's 1/(1 − N/Pcr1) approximation at axial forces below Pcr1, for the same
  chart;
- ``capacity``: :func:`engine.capacity` (axial mode, which does not depend on the axial force), with a
  section;
- ``errors``: the engine's message per field path (``"length"``, ``"loads[1].x"``, ``"supports.left"``, …);
- ``link``: the settled case as compact JSON, which the page mirrors into its URL. It changes when an input
  other than the axial force changes, and when :meth:`MemberState.settle` is called (the page calls it when
  the axial force slider is released or the number is typed), never while the axial force is being dragged.

Nothing here does mechanics: every number comes from the engine.
"""

from __future__ import annotations

import dataclasses
import json
import logging
import math
from collections.abc import Mapping
from functools import partial
from typing import Any

import numpy as np
import param

__all__ = [
    "BOW_PRESETS",
    "BOW_SHAPES",
    "LOAD_FIELDS",
    "LOAD_TYPES",
    "MemberState",
    "RESTRAINTS",
    "SECTION_DIMENSIONS",
    "SECTION_SHAPES",
    "STIFFNESS_SOURCES",
    "SUPPORT_FORMS",
    "default_load",
    "values_from_mapping",
]

_log = logging.getLogger(__name__)

#: An end is a named support, or "elastic": each restraint fixed, free or a spring.
SUPPORT_FORMS = ("pinned", "fixed", "free", "guided", "elastic")
#: One restraint of an elastic end.
RESTRAINTS = ("fixed", "free", "spring")
_NAMED_RESTRAINTS = {
    "pinned": ("fixed", "free"),
    "fixed": ("fixed", "fixed"),
    "free": ("free", "free"),
    "guided": ("free", "fixed"),
}

#: Where EI comes from: the section and material; EI given (no member check); EI given, with a section and
#: material for the member check (the case's EI then overrides E·I for the analysis, as the engine documents).
STIFFNESS_SOURCES = ("section", "EI", "both")

#: "catalogue" or a parametric shape of engine.sections.
SECTION_SHAPES = ("catalogue", "rolled_i", "welded_i", "rhs", "chs", "rectangle", "round", "custom")
#: The dimensions [m] (or, for "custom", properties [m², m⁴, m³]) each shape takes, in the engine's key names.
SECTION_DIMENSIONS = {
    "catalogue": (),
    "rolled_i": ("h", "b", "tw", "tf", "r"),
    "welded_i": ("h", "b", "tw", "tf"),
    "rhs": ("h", "b", "t"),
    "chs": ("D", "t"),
    "rectangle": ("b", "h"),
    "round": ("D",),
    "custom": ("A", "I", "W_el", "W_pl", "A_v"),
}
_SECTION_PARAMS = {key: f"section_{key}" for keys in SECTION_DIMENSIONS.values() for key in keys}
_MANUFACTURED = ("rhs", "chs")

#: The engine's load types and the fields of each (SI: N/m, N, N·m, m).
LOAD_TYPES = ("uniform", "linear", "point", "couple")
LOAD_FIELDS = {
    "uniform": ("q", "start", "end"),
    "linear": ("q_start", "q_end", "start", "end"),
    "point": ("P", "x"),
    "couple": ("C", "x"),
}

BOW_SHAPES = ("none", "sine", "parabola", "sway", "mode")
BOW_PRESETS = ("en1993-table-5.1", "en1993-eq-5.9", "aisc-l/1000", "span")
BOW_CURVES = ("auto", "a0", "a", "b", "c", "d")

#: The inputs that make the case. ``units`` is not among them: it changes the display only.
INPUTS = (
    "title",
    "length",
    "left_end",
    "left_translation",
    "left_k_t",
    "left_rotation",
    "left_k_r",
    "right_end",
    "right_translation",
    "right_k_t",
    "right_rotation",
    "right_k_r",
    "stiffness_from",
    "EI",
    "stiffness_factor",
    "section_shape",
    "section_name",
    *_SECTION_PARAMS.values(),
    "section_manufacture",
    "section_extra",
    "axis",
    "material_from",
    "material_name",
    "material_E",
    "material_fy",
    "material_extra",
    "axial_force",
    "loads",
    "bow_from",
    "bow_shape",
    "bow_amplitude",
    "bow_preset",
    "bow_curve",
    "bow_analysis",
    "bow_direction",
    "bow_ratio",
    "check_method",
    "gamma_M0",
    "gamma_M1",
    "deflection_limit",
    "out_of_plane",
    "out_of_plane_length",
)

# The amplification chart runs from this much tension (in units of Pcr1) to past the third critical load.
_CHART_TENSION = 2.0
_CHART_BEYOND_THIRD = 1.12


def default_load(kind: str, length: float, magnitude: float | None = None) -> dict:
    """A new row of the loads table, of type `kind` on a member of `length` [m], in the case-file form.

    Parameters
    ----------
    kind : str
        One of :data:`LOAD_TYPES`.
    length : float
        Member length [m], for the default position (mid-span for a point load).
    magnitude : float, optional
        Keep this magnitude [N/m, N or N·m] (when a row changes type).
    """
    if kind not in LOAD_TYPES:
        raise ValueError(f"type: {kind!r} is not a load type; allowed: {', '.join(LOAD_TYPES)}")
    middle = (
        0.5 * length if isinstance(length, (int, float)) and math.isfinite(length) and length > 0 else 1.0
    )
    if kind == "uniform":
        return {"type": "uniform", "q": 1.0e3 if magnitude is None else magnitude}
    if kind == "linear":
        return {"type": "linear", "q_start": 0.0, "q_end": 2.0e3 if magnitude is None else magnitude}
    if kind == "point":
        return {"type": "point", "P": 5.0e3 if magnitude is None else magnitude, "x": middle}
    return {"type": "couple", "C": 5.0e3 if magnitude is None else magnitude, "x": 0.0}


def load_magnitude(load: Mapping) -> float | None:
    """The magnitude field of a load row: q, q_end, P or C [SI]; None when missing."""
    for key in ("q", "q_end", "P", "C"):
        if key in load:
            return load[key]
    return None


def _field_of(message: str) -> str:
    """The field path an engine message starts with (``loads[1].x: ...`` gives ``loads[1].x``)."""
    head, sep, _ = message.partition(":")
    if not sep or " " in head.strip():
        return "case"
    return head.strip()


class MemberState(param.Parameterized):
    """The inputs of one member (SI) and the engine's answers; one instance per browser session.

    Build it with no arguments for the invented demo case's inputs, or with :meth:`from_case`. Set inputs as
    parameters (one at a time, or several in one ``param.update``); every change solves once.
    """

    # ------------------------------------------------------------------ member and supports
    title = param.String(
        default="Invented example: façade wind post, gridline C, level 2 (invented building)",
        doc="Case title, free text of at most 200 characters.",
    )
    length = param.Number(
        allow_None=True,
        default=6.0,
        softbounds=(0.5, 30.0),
        doc="Span L [m], from the left end (x = 0, the bottom of a post) to the right end; "
        "the engine allows 0.001 <= L <= 1000 m.",
    )

    left_end = param.Selector(
        objects=list(SUPPORT_FORMS),
        default="pinned",
        doc="Left end (x = 0): a named support, or 'elastic' with a restraint each way.",
    )
    left_translation = param.Selector(
        objects=list(RESTRAINTS),
        default="fixed",
        doc="Left end, translation of an elastic end: fixed, free or a spring k_t.",
    )
    left_k_t = param.Number(
        allow_None=True,
        default=1.0e7,
        softbounds=(0.0, 1.0e9),
        doc="Left end translation spring k_t [N/m], 0 to 1e18.",
    )
    left_rotation = param.Selector(
        objects=list(RESTRAINTS),
        default="spring",
        doc="Left end, rotation of an elastic end: fixed, free or a spring k_r.",
    )
    left_k_r = param.Number(
        allow_None=True,
        default=1.0e6,
        softbounds=(0.0, 1.0e8),
        doc="Left end rotation spring k_r [N·m/rad], 0 to 1e18.",
    )

    right_end = param.Selector(
        objects=list(SUPPORT_FORMS),
        default="pinned",
        doc="Right end (x = L): a named support, or 'elastic' with a restraint each way.",
    )
    right_translation = param.Selector(
        objects=list(RESTRAINTS),
        default="fixed",
        doc="Right end, translation of an elastic end: fixed, free or a spring k_t.",
    )
    right_k_t = param.Number(
        allow_None=True,
        default=1.0e7,
        softbounds=(0.0, 1.0e9),
        doc="Right end translation spring k_t [N/m], 0 to 1e18.",
    )
    right_rotation = param.Selector(
        objects=list(RESTRAINTS),
        default="spring",
        doc="Right end, rotation of an elastic end: fixed, free or a spring k_r.",
    )
    right_k_r = param.Number(
        allow_None=True,
        default=1.0e6,
        softbounds=(0.0, 1.0e8),
        doc="Right end rotation spring k_r [N·m/rad], 0 to 1e18.",
    )

    # ------------------------------------------------------------------ stiffness, section, material
    stiffness_from = param.Selector(
        objects=list(STIFFNESS_SOURCES),
        default="section",
        doc="EI from the section and material, given directly (no member check), or "
        "given directly with a section and material for the member check.",
    )
    EI = param.Number(
        allow_None=True,
        default=4.2e6,
        softbounds=(1.0e4, 1.0e9),
        doc="Bending stiffness EI [N·m²] when given directly; the engine allows 1e-3 <= EI <= 1e16.",
    )
    stiffness_factor = param.Number(
        allow_None=True,
        default=1.0,
        softbounds=(0.1, 1.0),
        doc="Factor on EI for the analysis only, 0 < factor <= 1 (for example 0.8·τ_b "
        "of the AISC 360-16 direct analysis method).",
    )
    section_shape = param.Selector(
        objects=list(SECTION_SHAPES),
        default="catalogue",
        doc="A catalogue section, or a parametric shape given by its dimensions.",
    )
    section_name = param.String(
        default="HEB 200", doc="Catalogue section name, e.g. 'HEB 200' or 'SHS 100x100x5'."
    )
    section_h = param.Number(
        allow_None=True, default=0.200, softbounds=(0.02, 1.5), doc="Depth h [m] (I, RHS, rectangle)."
    )
    section_b = param.Number(
        allow_None=True, default=0.200, softbounds=(0.02, 1.0), doc="Width b [m] (I, RHS, rectangle)."
    )
    section_tw = param.Number(
        allow_None=True, default=0.009, softbounds=(0.002, 0.1), doc="Web thickness t_w [m] (I)."
    )
    section_tf = param.Number(
        allow_None=True, default=0.015, softbounds=(0.002, 0.1), doc="Flange thickness t_f [m] (I)."
    )
    section_r = param.Number(
        allow_None=True, default=0.018, softbounds=(0.0, 0.05), doc="Root radius r [m] (rolled I)."
    )
    section_t = param.Number(
        allow_None=True, default=0.005, softbounds=(0.001, 0.05), doc="Wall thickness t [m] (RHS, CHS)."
    )
    section_D = param.Number(
        allow_None=True, default=0.1143, softbounds=(0.01, 2.0), doc="Outside diameter D [m] (CHS, round)."
    )
    section_A = param.Number(
        allow_None=True, default=7.8e-3, softbounds=(1e-5, 0.5), doc="Area A [m²] of a custom section."
    )
    section_I = param.Number(
        allow_None=True,
        default=5.7e-5,
        softbounds=(1e-9, 1.0),
        doc="Second moment of area I [m⁴] of a custom section, about the bending axis.",
    )
    section_W_el = param.Number(
        allow_None=True,
        default=5.7e-4,
        softbounds=(1e-7, 1.0),
        doc="Elastic section modulus W_el [m³] of a custom section.",
    )
    section_W_pl = param.Number(
        allow_None=True,
        default=6.4e-4,
        softbounds=(1e-7, 1.0),
        doc="Plastic section modulus W_pl [m³] of a custom section.",
    )
    section_A_v = param.Number(
        default=None,
        allow_None=True,
        softbounds=(1e-5, 0.5),
        doc="Shear area A_v [m²] of a custom section; empty means A.",
    )
    section_manufacture = param.Selector(
        objects=["hot-finished", "cold-formed"],
        default="hot-finished",
        allow_None=True,
        doc="How a hollow section is made (sets its corner radii and curve); "
        "None leaves it to the engine (a CHS is then taken as cold-formed).",
    )
    section_extra = param.Dict(
        default={}, doc="Further section keys of a loaded case file, kept as they were."
    )
    axis = param.Selector(objects=["major", "minor"], default="major", doc="The axis the member bends about.")
    material_from = param.Selector(
        objects=["catalogue", "custom"],
        default="catalogue",
        doc="A catalogue material, or a custom one given by E and f_y.",
    )
    material_name = param.String(
        default="S355", doc="Catalogue material name (e.g. 'S355', 'C24'), or a custom material's name."
    )
    material_E = param.Number(
        allow_None=True, default=210e9, softbounds=(1e9, 250e9), doc="Custom material: modulus E [Pa]."
    )
    material_fy = param.Number(
        allow_None=True, default=355e6, softbounds=(1e6, 1000e6), doc="Custom material: strength f_y [Pa]."
    )
    material_extra = param.Dict(
        default={}, doc="Further material keys of a loaded case file, kept as they were."
    )

    # ------------------------------------------------------------------ loads
    axial_force = param.Number(
        allow_None=True,
        default=350e3,
        softbounds=(-2.0e6, 4.0e6),
        doc="Axial force N [N], compression positive, constant along the member; the "
        "engine allows |N| <= 1e12 N. The page scales its slider to Pcr1.",
    )
    loads = param.List(
        default=[{"type": "uniform", "q": 2.5e3}, {"type": "point", "P": 4.0e3, "x": 2.2}],
        item_type=dict,
        doc="Transverse loads in the case-file form (SI): uniform q [N/m], linear q_start and "
        "q_end [N/m], point P [N] at x [m], couple C [N·m] at x [m]; start and end [m] "
        "optional.",
    )

    # ------------------------------------------------------------------ initial bow
    bow_from = param.Selector(
        objects=["preset", "shape"],
        default="preset",
        doc="The initial bow from a code preset, or a shape and amplitude given directly.",
    )
    bow_shape = param.Selector(
        objects=list(BOW_SHAPES),
        default="sine",
        doc="Bow shape: none, half sine, parabola, sway (a·x/L) or the first buckling mode.",
    )
    bow_amplitude = param.Number(
        allow_None=True,
        default=0.02,
        softbounds=(-0.1, 0.1),
        doc="Bow amplitude a [m], the largest |w0|; the engine allows |a| <= L/10.",
    )
    bow_preset = param.Selector(
        objects=list(BOW_PRESETS), default="en1993-table-5.1", doc="Code preset for the bow amplitude."
    )
    bow_curve = param.Selector(
        objects=list(BOW_CURVES),
        default="auto",
        doc="Buckling curve for the EN 1993-1-1 presets; auto picks it from Table 6.2.",
    )
    bow_analysis = param.Selector(
        objects=["elastic", "plastic"],
        default="elastic",
        doc="EN 1993-1-1 Table 5.1 column: elastic or plastic analysis.",
    )
    bow_direction = param.Selector(
        objects=["load", "positive", "negative"],
        default="load",
        doc="Which way a preset bow points: with the loads' deflection, or +w or −w.",
    )
    bow_ratio = param.Number(
        allow_None=True,
        default=300.0,
        softbounds=(100.0, 2000.0),
        doc="n of a span/n bow (preset 'span'); the engine allows 10 to 100000.",
    )

    # ------------------------------------------------------------------ member check
    check_method = param.Selector(
        objects=["elastic", "plastic"],
        default="elastic",
        doc="Cross-section check: elastic stresses or plastic N–M interaction.",
    )
    gamma_M0 = param.Number(
        allow_None=True, default=1.0, softbounds=(1.0, 1.5), doc="Partial factor γ_M0 [-], 0.5 to 3."
    )
    gamma_M1 = param.Number(
        allow_None=True, default=1.0, softbounds=(1.0, 1.5), doc="Partial factor γ_M1 [-], 0.5 to 3."
    )
    deflection_limit = param.Number(
        allow_None=True,
        default=250.0,
        softbounds=(100.0, 1000.0),
        doc="Deflection limit span/n: n [-], 1 to 10000 (250 by default).",
    )
    out_of_plane = param.Selector(
        objects=["buckles", "restrained"],
        default="buckles",
        doc="Flexural buckling about the other axis: checked ('buckles') or prevented ('restrained').",
    )
    out_of_plane_length = param.Number(
        allow_None=True,
        default=None,
        doc="Out-of-plane buckling length L_cr [m]; empty: the member length.",
    )

    # ------------------------------------------------------------------ display and solver settings
    units = param.Selector(
        objects=["si", "us"],
        default="si",
        doc="Display units of the page: SI (kN, m, mm) or US customary (kip, ft, in).",
    )
    stations = param.Integer(
        default=401,
        bounds=(11, 5001),
        doc="Uniform stations of each solve; the engine adds the nodes and the exact peaks.",
    )

    # ------------------------------------------------------------------ outputs (set only by this class)
    result = param.Parameter(default=None, constant=True, doc="The last good engine.Result.")
    sweep = param.Parameter(
        default=None,
        constant=True,
        doc="engine.sweep over the amplification chart's axial forces (case without N).",
    )
    approximation = param.Parameter(
        default=None, constant=True, doc="(axial forces [N], the engine's 1/(1 − N/Pcr1) values) below Pcr1."
    )
    capacity = param.Parameter(
        default=None,
        constant=True,
        doc="engine.capacity of the case (axial mode), or None without a section.",
    )
    capacity_note = param.String(default="", constant=True, doc="Why no capacity is given, when none is.")
    notice = param.String(
        default="", constant=True, doc="A message about the link or the served case, shown above the plots."
    )
    chart_note = param.String(
        default="", constant=True, doc="Why the amplification chart is not shown (yet), when it is not."
    )
    errors = param.Dict(
        default={}, constant=True, doc="The engine's message per field path; empty when the inputs are valid."
    )
    link = param.Parameter(
        default="",
        doc="The settled case as compact JSON text (mirrored into the page's "
        "URL); a mapping set here (Panel's URL sync decodes the JSON) is "
        "read as the case too.",
    )

    #: Served pages solve off the event loop through an :class:`app.work.Runner`; None solves at once.
    _runner = None
    _refresh_id = 0
    _failed_at = 0

    def __init__(self, runner=None, **params: Any) -> None:
        super().__init__(**params)
        self._runner = runner
        self._settled_axial_force = self.axial_force
        self._base_key: str | None = None
        self._base_case = None
        self._written_link = ""
        self.param.watch(self._inputs_changed, list(INPUTS))
        self.param.watch(self._link_changed, ["link"])
        self.param.watch(self._preset_changed, ["bow_preset"])
        self._refresh(full=True)
        self._write_link()

    @classmethod
    def from_case(cls, case, **params: Any) -> MemberState:
        """A state holding `case` (an :class:`engine.Case`), solved once."""
        return cls(**values_from_mapping(case.to_dict()), **params)

    # ------------------------------------------------------------------ inputs to case (the one place)

    def _support_data(self, side: str) -> str | dict:
        form = getattr(self, f"{side}_end")
        if form != "elastic":
            return form
        data = {}
        for part, spring in (("translation", "k_t"), ("rotation", "k_r")):
            restraint = getattr(self, f"{side}_{part}")
            data[part] = getattr(self, f"{side}_{spring}") if restraint == "spring" else restraint
        return data

    def _section_data(self) -> dict:
        shape = self.section_shape
        if shape == "catalogue":
            return {"name": self.section_name, **self.section_extra}
        data: dict[str, Any] = {"shape": shape}
        for key in SECTION_DIMENSIONS[shape]:
            value = getattr(self, _SECTION_PARAMS[key])
            if value is not None:
                data[key] = value
        if shape in _MANUFACTURED and self.section_manufacture is not None:
            data["manufacture"] = self.section_manufacture
        data.update(self.section_extra)
        return data

    def _material_data(self) -> dict:
        if self.material_from == "catalogue":
            return {"name": self.material_name, **self.material_extra}
        data: dict[str, Any] = {"E": self.material_E, "fy": self.material_fy}
        if self.material_name:
            data["name"] = self.material_name
        data.update(self.material_extra)
        return data

    def _imperfection_data(self) -> dict:
        if self.bow_from == "shape":
            return {"shape": self.bow_shape, "amplitude": self.bow_amplitude}
        data = {
            "preset": self.bow_preset,
            "shape": self.bow_shape,
            "amplitude": 0.0,
            "curve": self.bow_curve,
            "analysis": self.bow_analysis,
            "direction": self.bow_direction,
        }
        if self.bow_preset == "span":
            data["ratio"] = self.bow_ratio
        return data

    def case_mapping(self, **overrides: Any) -> dict:
        """The inputs as a case-file mapping (schema 1, SI), with `overrides` of top-level keys applied.

        This is the one place where the page's inputs become a case; it validates nothing (the engine does).
        """
        data: dict[str, Any] = {
            "schema": 1,
            "title": self.title,
            "length": self.length,
            "supports": {"left": self._support_data("left"), "right": self._support_data("right")},
            "axial_force": self.axial_force,
            "loads": [dict(load) for load in self.loads],
            "imperfection": self._imperfection_data(),
        }
        if self.stiffness_from in ("EI", "both"):
            data["EI"] = self.EI
        if self.stiffness_from in ("section", "both"):
            data["section"] = self._section_data()
            data["material"] = self._material_data()
        data["axis"] = self.axis
        if self.stiffness_factor != 1.0:
            data["stiffness_factor"] = self.stiffness_factor
        data["check"] = {
            "method": self.check_method,
            "gamma_M0": self.gamma_M0,
            "gamma_M1": self.gamma_M1,
            "deflection_limit": self.deflection_limit,
        }
        if self.out_of_plane == "restrained":
            data["out_of_plane"] = {"restrained": True}
        elif self.out_of_plane_length is not None:
            data["out_of_plane"] = {"buckling_length": self.out_of_plane_length}
        data.update(overrides)
        return data

    def to_case(self):
        """The inputs as an :class:`engine.Case`; raises :class:`engine.CaseError` naming the field."""
        import engine

        return engine.Case.from_dict(self.case_mapping())

    def load_case(self, case) -> None:
        """Put `case` (an :class:`engine.Case`) into the inputs with one update, so it solves once."""
        self.load_mapping(case.to_dict())

    def load_mapping(self, mapping: Mapping) -> None:
        """Put a case-file mapping into the inputs with one update (the engine validates it as it solves)."""
        values = values_from_mapping(mapping)
        self._settled_axial_force = values.get("axial_force", self.axial_force)
        self.param.update(**values)
        self._write_link()

    # ------------------------------------------------------------------ loads table

    def add_load(self, kind: str) -> None:
        """Append a load row of type `kind` with default values."""
        self.loads = [*self.loads, default_load(kind, self.length)]

    def remove_load(self, index: int) -> None:
        """Remove load row `index` (0-based)."""
        self.loads = [load for i, load in enumerate(self.loads) if i != index]

    def set_load(self, index: int, **fields: Any) -> None:
        """Change fields of load row `index`; a field set to None is removed (start, end: the member's ends).

        A new ``type`` replaces the row with that type's defaults, keeping the magnitude and the position.
        """
        rows = [dict(load) for load in self.loads]
        row = rows[index]
        kind = fields.pop("type", row.get("type"))
        if kind != row.get("type"):
            new = default_load(kind, self.length, load_magnitude(row))
            for key in ("x", "start", "end"):
                if key in row and key in LOAD_FIELDS[kind]:
                    new[key] = row[key]
            if "x" in LOAD_FIELDS[kind] and "x" not in row and "start" in row:
                new["x"] = row["start"]
            row = new
        for key, value in fields.items():
            if value is None:
                row.pop(key, None)
            else:
                row[key] = value
        rows[index] = row
        self.loads = rows

    # ------------------------------------------------------------------ solving

    def settle(self) -> None:
        """Take the current axial force as settled: the link (and so the URL) now carries it."""
        self._settled_axial_force = self.axial_force
        self._write_link()

    def _write_link(self) -> None:
        try:
            text = json.dumps(
                self.case_mapping(axial_force=self._settled_axial_force),
                separators=(",", ":"),
                ensure_ascii=False,
                allow_nan=False,
                sort_keys=True,
            )
        except (ValueError, TypeError):
            # A refused value (1e400 typed is infinite): the engine's message names it next to the input; the
            # link keeps the last case it could hold (issue 11: this logged a traceback with the whole case).
            return
        self._written_link = text
        if text != self.link:
            self.link = text

    def _link_changed(self, event) -> None:
        if event.new == self._written_link or not event.new:
            return
        # A link from the URL: restore its inputs even when they were invalid when it was made (the engine
        # then shows the same message again), so that no input is lost. A link that cannot be read at all
        # leaves the case as it was, and says why in the notice (issue 11: it silently opened the demo).
        from app.intake import IntakeError, case_from_link

        before = self.case_mapping()
        try:
            mapping = case_from_link(event.new, "link")
            self.load_mapping(mapping)
        except IntakeError as error:
            _log.warning("strutscope: a link was refused (%s)", error.kind)
            self._link_failed(str(error).split(": ", 1)[-1])
        except Exception as error:  # noqa: BLE001 - never half applied: put the previous case back
            _log.warning("strutscope: a link was refused (%s)", type(error).__name__)
            self.load_mapping(before)
            self._link_failed(f"it could not be read, {type(error).__name__}")

    def _link_failed(self, reason: str) -> None:
        # Served, a solve of the case kept may still be running: it must not clear this message.
        self._failed_at = self._refresh_id + 1
        self._fail(
            f"case: the link does not hold a case this page can read ({reason}); the page keeps the "
            "case it had"
        )

    def _notify(self, message: str) -> None:
        with param.edit_constant(self):
            self.notice = message

    def _preset_changed(self, event) -> None:
        # The eq. (5.9) bow has the shape of the first buckling mode, and a member bow is never a sway: pick
        # the shape that goes with the preset rather than show an error for the user's last choice.
        if event.new == "en1993-eq-5.9" and self.bow_shape not in ("none", "mode"):
            self.bow_shape = "mode"
        elif event.new != "span" and self.bow_shape == "sway":
            self.bow_shape = "sine"

    def _inputs_changed(self, *events) -> None:
        names = {event.name for event in events}
        only_axial = names <= {"axial_force"}
        self._refresh(full=not only_axial)
        if not only_axial:
            self._write_link()

    def _fail(self, message: str) -> None:
        with param.edit_constant(self):
            self.errors = {_field_of(message): message}

    def _refresh(self, full: bool) -> None:
        """Solve the current inputs; on bad input keep every output and record the engine's message.

        Served, with a runner (:mod:`app.work`), only the validation happens here: the solve runs off the
        event loop and :meth:`_solved` applies it when it is done.
        """
        import engine

        self._refresh_id += 1
        try:
            if full or self._base_case is None:
                case = self.to_case()
            else:
                case = dataclasses.replace(self._base_case, axial_force=self.axial_force)
        except engine.CaseError as error:
            self._base_case = None  # the next change validates the whole case again
            self._failed_at = self._refresh_id
            self._fail(str(error))
            return
        except Exception as error:  # never a traceback on the page: say what failed, keep the last result
            self._base_case = None
            self._failed_at = self._refresh_id
            self._fail(_engine_failure(error))
            return
        if self._runner is None:
            self._solved(case, full, *solve_outcome(case, self.stations))
            return
        self._base_case = case
        self._runner.solve(partial(_solve_job, self, case, self._refresh_id), full)

    def _solved(self, case, full: bool, result, message: str, refresh_id: int | None = None) -> None:
        """Apply a solve: its result, or its message with every output kept.

        Served, a solve can finish after a later input was refused: its result is then only the last good
        result (the refusal's message stays), and its failure is dropped.
        """
        if refresh_id is not None and refresh_id < self._failed_at:
            if result is not None:
                with param.edit_constant(self):
                    self.result = result
            return
        if result is None:
            self._base_case = None
            self._fail(message)
            return
        self._base_case = case
        outputs: dict[str, Any] = {"result": result, "errors": {}}
        if full:
            key = _case_key(case)
            if key != self._base_key:
                self._base_key = key
                if self._runner is None:
                    outputs.update(self._chart_outputs(case, result))
                else:
                    outputs.update(sweep=None, approximation=None, chart_note="computing the chart …")
                    self._runner.chart(partial(_chart_job, self, case, key, result.critical_loads))
        with param.edit_constant(self):
            self.param.update(**outputs)

    def _charted(self, key: str, outputs: dict) -> None:
        """Apply chart outputs computed off the loop, unless the case has changed since."""
        if key != self._base_key:
            return
        with param.edit_constant(self):
            self.param.update(**outputs)

    def _chart_outputs(self, case, result) -> dict:
        """The sweep, the approximation curve and the capacity: they do not depend on the axial force."""
        import engine

        pcr = np.asarray(result.critical_loads, dtype=float)
        outputs: dict[str, Any] = {}
        try:
            sweep = engine.sweep(case, chart_forces(pcr))
            outputs["sweep"] = sweep
            # The engine's 1/(1 - N/Pcr1) at the same forces (NaN from Pcr1 on).
            outputs["approximation"] = (sweep.axial_force, sweep.simple_amplification)
        except Exception as error:  # the chart is secondary: keep the result, log one line without the case
            _log.error("strutscope: amplification sweep failed (%s)", type(error).__name__)
            outputs.update(
                sweep=None,
                approximation=None,
                chart_note=f"the amplification chart could not be computed ({type(error).__name__})",
            )
        else:
            outputs["chart_note"] = ""
        if case.section is not None and case.material is not None:
            try:
                outputs.update(capacity=engine.capacity(case), capacity_note="")
            except Exception as error:
                outputs.update(capacity=None, capacity_note=str(error))
        else:
            outputs.update(capacity=None, capacity_note="needs a section and a material")
        return outputs

    # ------------------------------------------------------------------ errors for the view

    def error_for(self, *prefixes: str) -> str:
        """The engine's message for a field path starting with any of `prefixes`, or an empty string."""
        for path, message in self.errors.items():
            for prefix in prefixes:
                if path == prefix or path.startswith(prefix + ".") or path.startswith(prefix + "["):
                    return message
        return ""


def solve_outcome(case, stations: int):
    """``(result, "")`` for `case`, or ``(None, message)`` when the engine refuses or fails."""
    import engine

    try:
        return engine.solve(case, stations=stations), ""
    except engine.CaseError as error:
        return None, str(error)
    except Exception as error:  # never a traceback on the page: say what failed, keep the last result
        return None, _engine_failure(error)


def _engine_failure(error: BaseException) -> str:
    """The page's words for an engine failure, and one log line without the case (issue 11)."""
    text = " ".join(str(error).split())
    text = text if len(text) <= 120 else text[:117] + "..."
    _log.error("strutscope: the engine could not solve a case (%s)", type(error).__name__)
    return f"case: the engine could not solve these inputs ({type(error).__name__}: {text})"


def _case_key(case) -> str:
    """A key of the case without its axial force: the chart is recomputed only when it changes."""
    return json.dumps({**case.to_dict(), "axial_force": 0.0}, sort_keys=True, default=str)


def _solve_job(state: MemberState, case, refresh_id: int, full: bool):
    """Off the event loop: solve `case` (a first solve of a big case in a worker, under the budget)."""
    from app import work

    if full and len(case.loads) > work.PROBE_LOADS:
        try:
            work.run_in_worker("probe", work.probe_solve, (case.to_json(), state.stations), work.SOLVE_BUDGET)
        except work.BudgetExceeded:
            _log.warning("strutscope: a case was refused: its solve took longer than %g s", work.SOLVE_BUDGET)
            message = (
                f"case: solving this case takes longer than the server's budget of {work.SOLVE_BUDGET:g} s "
                f"({len(case.loads)} loads); the previous result is kept"
            )
            return partial(state._solved, case, full, None, message, refresh_id)
        except Exception:  # noqa: BLE001 - the solve below reports the engine's own message
            pass
    return partial(state._solved, case, full, *solve_outcome(case, state.stations), refresh_id)


def _chart_job(state: MemberState, case, key: str, critical_loads):
    """Off the event loop: the chart outputs from the worker process, or a note when over the budget."""
    from app import work

    try:
        outputs = work.run_in_worker(
            "chart", work.chart_job, (case.to_json(), chart_forces(critical_loads)), work.CHART_BUDGET
        )
    except work.BudgetExceeded:
        _log.warning("strutscope: a chart was not computed: over its budget of %g s", work.CHART_BUDGET)
        note = f"the amplification chart takes longer than the server's budget of {work.CHART_BUDGET:g} s"
        outputs = {"sweep": None, "approximation": None, "chart_note": note}
    except Exception as error:  # noqa: BLE001 - the chart is secondary
        _log.error("strutscope: a chart was not computed (%s)", type(error).__name__)
        outputs = {
            "sweep": None,
            "approximation": None,
            "chart_note": f"the amplification chart could not be computed ({type(error).__name__})",
        }
    return partial(state._charted, key, outputs)


def chart_forces(critical_loads) -> np.ndarray:
    """The amplification chart's axial forces [N]: from tension of 2·Pcr1 to past Pcr3, dense near each Pcr.

    The critical loads themselves are left out: the curves run off the chart on both sides of each.
    """
    pcr = np.asarray(critical_loads, dtype=float)
    top = _CHART_BEYOND_THIRD * pcr[2]
    parts = [np.linspace(-_CHART_TENSION * pcr[0], top, 260)]
    offsets = np.geomspace(2e-4, 0.06, 14)
    for load in pcr[:3]:
        parts += [load * (1.0 - offsets), load * (1.0 + offsets)]
    forces = np.unique(np.concatenate(parts))
    return forces[(forces >= -_CHART_TENSION * pcr[0]) & (forces <= top)]


def _number_or(value: Any, default: float) -> Any:
    return value if isinstance(value, (int, float)) and not isinstance(value, bool) else default


def values_from_mapping(mapping: Mapping) -> dict:
    """The inputs of :class:`MemberState` for a case-file mapping (the inverse of ``case_mapping``).

    Keys the page has no input for are kept in ``section_extra`` and ``material_extra``, so a loaded case is
    written back as it came. Values are taken as they are; the engine validates them when the state solves.
    Raises ``TypeError`` or ``ValueError`` for a mapping whose values are of the wrong kind for an input.
    """
    values: dict[str, Any] = {}
    defaults = MemberState.param
    values["title"] = mapping.get("title", "")
    values["length"] = mapping.get("length", defaults.length.default)
    supports = mapping.get("supports", {})
    for side in ("left", "right"):
        data = supports.get(side, "pinned") if isinstance(supports, Mapping) else "pinned"
        if isinstance(data, str):
            values[f"{side}_end"] = data
            values[f"{side}_translation"], values[f"{side}_rotation"] = _NAMED_RESTRAINTS.get(
                data, ("fixed", "free")
            )
        else:
            values[f"{side}_end"] = "elastic"
            for part, spring in (("translation", "k_t"), ("rotation", "k_r")):
                restraint = data.get(part, "fixed")
                if isinstance(restraint, str):
                    values[f"{side}_{part}"] = restraint
                else:
                    values[f"{side}_{part}"] = "spring"
                    values[f"{side}_{spring}"] = restraint
    has_section = "section" in mapping or "material" in mapping
    if "EI" in mapping:
        values["stiffness_from"] = "both" if has_section else "EI"
        values["EI"] = mapping["EI"]
    else:
        values["stiffness_from"] = "section"
    values["stiffness_factor"] = mapping.get("stiffness_factor", 1.0)
    values["axis"] = mapping.get("axis", "major")
    section = dict(mapping.get("section") or {})
    extra: dict[str, Any] = {}
    if "name" in section or not section:
        values["section_shape"] = "catalogue"
        values["section_name"] = section.pop("name", defaults.section_name.default)
        extra = section
    else:
        shape = section.pop("shape")
        values["section_shape"] = shape
        for key in SECTION_DIMENSIONS.get(shape, ()):
            if key in section:
                values[_SECTION_PARAMS[key]] = section.pop(key)
            elif key == "A_v":
                values["section_A_v"] = None
        if shape in _MANUFACTURED:
            values["section_manufacture"] = section.pop("manufacture", None)
        extra = section
    values["section_extra"] = extra
    material = dict(mapping.get("material") or {})
    if "E" in material or "fy" in material:
        values["material_from"] = "custom"
        values["material_E"] = material.pop("E", defaults.material_E.default)
        values["material_fy"] = material.pop("fy", defaults.material_fy.default)
        values["material_name"] = material.pop("name", "")
    else:
        values["material_from"] = "catalogue"
        values["material_name"] = material.pop("name", defaults.material_name.default)
    values["material_extra"] = material
    values["axial_force"] = mapping.get("axial_force", 0.0)
    values["loads"] = [dict(load) for load in mapping.get("loads", [])]
    bow = dict(mapping.get("imperfection") or {})
    if bow.get("preset") is not None:
        values["bow_from"] = "preset"
        values["bow_preset"] = bow["preset"]
        values["bow_shape"] = bow.get("shape", "sine")
        values["bow_curve"] = bow.get("curve", "auto")
        values["bow_analysis"] = bow.get("analysis", "elastic")
        values["bow_direction"] = bow.get("direction", "load")
        if bow.get("ratio") is not None:
            values["bow_ratio"] = bow["ratio"]
    else:
        values["bow_from"] = "shape"
        values["bow_shape"] = bow.get("shape", "none")
        values["bow_amplitude"] = bow.get("amplitude", 0.0)
    check = mapping.get("check") or {}
    values["check_method"] = check.get("method", "elastic")
    values["gamma_M0"] = _number_or(check.get("gamma_M0"), 1.0)
    values["gamma_M1"] = _number_or(check.get("gamma_M1"), 1.0)
    values["deflection_limit"] = _number_or(check.get("deflection_limit"), 250.0)
    out_of_plane = mapping.get("out_of_plane") or {}
    values["out_of_plane"] = "restrained" if out_of_plane.get("restrained") is True else "buckles"
    values["out_of_plane_length"] = out_of_plane.get("buckling_length")
    return values
