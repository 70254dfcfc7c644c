"""The inputs of the page's state: one member's case in SI, as parameters, and the one mapping to a case file.

:class:`MemberInputs` is a :class:`param.Parameterized` with no GUI in it. Its inputs are the case's fields in
SI units (m, N, N·m, Pa), each with the soft bounds the page's widgets use and a doc string with its unit.
:meth:`MemberInputs.case_mapping` is the one place that turns the inputs into a case-file mapping, and
:func:`values_from_mapping` is its inverse. :class:`app.state.MemberState` adds the solving.
"""

from __future__ import annotations

import math
from collections.abc import Mapping
from typing import Any

import param

from app.state_actions import ACTION_INPUTS, ActionInputs, actions_mapping
from app.state_ltb import LTB_INPUTS, LtbInputs, ltb_check_keys
from app.state_plane import PLANE_INPUTS, PlaneInputs, plane_check_keys, plane_mapping
from app.state_restraints import INNER_INPUTS, InnerInputs, inner_mapping

__all__ = [
    "BOW_PRESETS",
    "BOW_SHAPES",
    "INPUTS",
    "LOAD_FIELDS",
    "LOAD_TYPES",
    "MemberInputs",
    "RESTRAINTS",
    "SECTION_DIMENSIONS",
    "OPTIONAL_SECTION_KEYS",
    "CUSTOM_CHOICES",
    "custom_choice_values",
    "SECTION_SHAPES",
    "STIFFNESS_SOURCES",
    "SUPPORT_FORMS",
    "default_load",
    "load_magnitude",
]

#: An end is a named support, or "elastic": each restraint fixed, free or a spring.
SUPPORT_FORMS = ("pinned", "fixed", "free", "guided", "elastic")
#: One restraint of an elastic end.
RESTRAINTS = ("fixed", "free", "spring")
NAMED_RESTRAINTS = {
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
    "custom": ("A", "I", "W_el", "W_pl", "A_v", "depth", "Iz", "It", "Iw"),
}
#: Keys of SECTION_DIMENSIONS a case may leave out (None on the page: not given).
OPTIONAL_SECTION_KEYS = ("A_v", "depth", "Iz", "It", "Iw")
#: The custom section's lateral-torsional buckling inputs that are not numbers: (key, input, default).
CUSTOM_CHOICES = (
    ("doubly_symmetric", "section_doubly_symmetric", False),
    ("ltb_curve", "section_ltb_curve", "d"),
)
SECTION_PARAMS = {key: f"section_{key}" for keys in SECTION_DIMENSIONS.values() for key in keys}
MANUFACTURED = ("rhs", "chs")

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
    *SECTION_PARAMS.values(),
    *(name for _, name, _ in CUSTOM_CHOICES),
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
    "bow_extra",
    "check_method",
    "gamma_M0",
    "gamma_M1",
    "deflection_limit",
    "out_of_plane",
    "out_of_plane_length",
    *INNER_INPUTS,
    *PLANE_INPUTS,
    *LTB_INPUTS,
    *ACTION_INPUTS,
)


def default_load(kind: str, length: float, magnitude: float | None = None) -> dict:
    """A new row of the loads table, of type `kind` on a member of `length` [m], in the case-file form.

    Parameters
    ----------
    kind : str
        One of :data:`LOAD_TYPES`.
    length : float
        Member length [m], for the default position (mid-span for a point load or a couple).
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
    # Mid-span, where a couple acts whatever the supports (at a fixed end it would go into the support).
    return {"type": "couple", "C": 5.0e3 if magnitude is None else magnitude, "x": middle}


def load_magnitude(load: Mapping) -> float | None:
    """The magnitude field of a load row: q, q_end, P or C [SI]; None when missing."""
    for key in ("q", "q_end", "P", "C"):
        if key in load:
            return load[key]
    return None


class MemberInputs(ActionInputs, LtbInputs, PlaneInputs, InnerInputs):
    """The inputs of one member (SI) and the engine's answers; one instance per browser session.

    Build it with no arguments for the plain invented demo case's inputs (assets/demo_wind_post.json;
    the served page starts on the demo with load cases, :mod:`app.serve`), or with :meth:`from_case`. Set
    inputs as parameters (one at a time, or several in one ``param.update``); every change solves once.
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
    section_depth = param.Number(
        default=None, allow_None=True, softbounds=(0.01, 2.0), doc="Overall depth [m] of a custom section."
    )
    section_Iz = param.Number(default=None, allow_None=True, doc="Custom section: I_z [m⁴] (minor axis).")
    section_It = param.Number(default=None, allow_None=True, doc="Custom section: I_t [m⁴] (torsion).")
    section_Iw = param.Number(default=None, allow_None=True, doc="Custom section: I_w [m⁶] (warping).")
    section_doubly_symmetric = param.Boolean(
        default=False, doc="A custom section symmetric about both axes (needed for the LTB check)."
    )
    section_ltb_curve = param.Selector(
        objects=["a", "b", "c", "d"],
        default="d",
        doc="A custom section's LTB curve, EN 1993-1-1 Table 6.4 (d: other cross-sections, the default).",
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
    bow_extra = param.Dict(
        default={},
        doc="Further imperfection keys of a loaded case file (such as a preset's 'columns'), kept as they "
        "were, per bow_from: {'preset': {...}, 'shape': {...}}.",
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
        doc="Out-of-plane buckling length L_cr [m]; empty: the member length, twice it where an end sways.",
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
            value = getattr(self, SECTION_PARAMS[key])
            if value is not None:
                data[key] = value
        if shape in MANUFACTURED and self.section_manufacture is not None:
            data["manufacture"] = self.section_manufacture
        if shape == "custom":
            for key, name, default in CUSTOM_CHOICES:  # written only where not the default
                if getattr(self, name) != default:
                    data[key] = getattr(self, name)
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
        extra = dict(self.bow_extra.get(self.bow_from) or {})  # keys the page has no input for (no loss)
        if self.bow_from == "shape":
            return {**extra, "shape": self.bow_shape, "amplitude": self.bow_amplitude}
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
        return {**extra, **data}

    def case_mapping(self, **overrides: Any) -> dict:
        """The inputs as a case-file mapping (schema 1, SI), with `overrides` of top-level keys applied.

        This is the one place where the page's inputs become a case; it validates nothing (the engine does).
        With load cases, ``action_scale`` (an override) is the load factor on them (the inputs' own when left
        out), and the case's own loads and axial force are written empty and 0.
        """
        scale = overrides.pop("action_scale", None)
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
            **plane_check_keys(self),
            **ltb_check_keys(self),
        }
        data.update(inner_mapping(self))
        data.update(plane_mapping(self))
        if self.plane2:
            pass  # the second plane's own supports and bow make the out-of-plane check
        elif self.out_of_plane == "restrained":
            data["out_of_plane"] = {"restrained": True}
        elif self.out_of_plane_length is not None:
            data["out_of_plane"] = {"buckling_length": self.out_of_plane_length}
        data.update(overrides)
        data.update(actions_mapping(self, scale))
        return data

    def to_case(self):
        """The inputs as an :class:`engine.Case`; raises :class:`engine.CaseError` naming the field."""
        import engine

        return engine.Case.from_dict(self.case_mapping())


def custom_choice_values(section: dict) -> dict:
    """The CUSTOM_CHOICES inputs of a custom section spec, taken out of ``section`` where the page can hold
    them (a value it cannot hold stays in ``section``, kept for the engine to name); defaults otherwise."""
    values = {}
    for key, name, default in CUSTOM_CHOICES:
        value = section.get(key, default)
        allowed = isinstance(value, bool) if key == "doubly_symmetric" else value in ("a", "b", "c", "d")
        values[name] = value if allowed else default
        if allowed:
            section.pop(key, None)
    return values
