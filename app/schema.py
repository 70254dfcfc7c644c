"""The JSON Schema (draft 2020-12) of strutscope's case file, schema 1.

``strutscope schema`` prints it, so that other tools can check a case file before they hand it over. It is
written out by hand from the case file described in the README ("Conventions" and "Sections, materials and
the member check"), with a description and the unit of every value, and it refuses unknown keys at every
level, as the engine does.

A file that passes the schema may still be refused by the engine: JSON Schema cannot compare one value with
another, so positions against the member's length, the bow against L/10, a section's plates against its
depth and supports that leave the member a mechanism are the engine's checks alone. The schema never refuses
a file the engine accepts; the tests check both directions on the files they try.

Nothing here imports the engine or does mechanics; the tests compare the lists of names with the engine's.
"""

from __future__ import annotations

import copy
import functools
import json
from typing import Any

from app.schema_actions import action_properties
from app.schema_check import CHECK_METHODS, check_schema  # noqa: F401 - CHECK_METHODS: the names, here too
from app.schema_inner import RESTRAINTS as RESTRAINTS  # the end restraints, kept under this name
from app.schema_inner import inner_properties
from app.schema_inner import spring_or as _spring_or

__all__ = ["SCHEMA_ID", "case_schema", "schema_text"]

#: The schema's identifier (a URN: the schema is shipped with strutscope, not published at an address).
SCHEMA_ID = "urn:strutscope:case-file:schema-1"

_DRAFT = "https://json-schema.org/draft/2020-12/schema"

# The names the engine accepts, written out here so the schema reads on its own (tests/app/test_schema.py
# compares each list with the engine's).
SUPPORT_NAMES = ("pinned", "fixed", "free", "guided")
LOAD_TYPES = ("uniform", "linear", "point", "couple")
BOW_SHAPES = ("none", "sine", "parabola", "sway", "mode")
BOW_PRESETS = ("en1993-table-5.1", "en1993-eq-5.9", "aisc-l/1000", "span")
CURVES = ("auto", "a0", "a", "b", "c", "d")
BOW_ANALYSES = ("elastic", "plastic")
BOW_DIRECTIONS = ("load", "positive", "negative")
AXES = ("major", "minor")
SECTION_SHAPES = ("rolled_i", "welded_i", "rhs", "chs", "rectangle", "round", "custom")
HOLLOW_MANUFACTURES = ("hot-finished", "cold-formed")
MATERIAL_KINDS = ("steel", "timber", "aluminium", "custom")

# The limits of engine.limits, written out here too (tests/app/test_schema.py compares them with the engine).
MAX_LOADS = 50
MAX_SEGMENTS = 60
MAX_TITLE = 200
# A title is one line of printable text: no control characters (the engine also refuses lone surrogates,
# which a JSON Schema pattern cannot name portably).
_PRINTABLE = "^[^\\u0000-\\u001f\\u007f-\\u009f]*$"


def _number(description: str, **bounds: float) -> dict[str, Any]:
    return {"type": "number", "description": description, **bounds}


def _dimension(description: str) -> dict[str, Any]:
    # Above 10 m a "dimension" is almost surely millimetres typed as metres; the engine refuses it too.
    return _number(
        f"{description} [m], > 0 and <= 10 (metres: 200 mm is 0.2)", exclusiveMinimum=0, maximum=10
    )


def _position(description: str) -> dict[str, Any]:
    # No bounds here: 0 <= x <= length needs the length, and the engine moves a position within 1e-9 L
    # outside the member onto its end, so a schema bound of 0 would refuse files the engine accepts.
    return _number(
        f"{description} [m] from the left end (x = 0); must lie on the member, 0 to length "
        "(checked by strutscope, not by this schema)"
    )


def _closed(properties: dict[str, Any], required: tuple[str, ...] = (), **extra: Any) -> dict[str, Any]:
    """An object with exactly these keys allowed."""
    schema: dict[str, Any] = {"type": "object", "properties": properties, "additionalProperties": False}
    if required:
        schema["required"] = list(required)
    schema.update(extra)
    return schema


def _end(side: str, x: str) -> dict[str, Any]:
    return {"$ref": "#/$defs/end_support", "description": f"The support at the {side} end (x = {x})."}


def _section_shape(
    shape: str, description: str, required: dict[str, Any], optional: dict[str, Any] | None = None
) -> dict[str, Any]:
    properties = {
        "shape": {"const": shape, "description": "The parametric shape."},
        **required,
        **(optional or {}),
    }
    return _closed(properties, ("shape", *required), description=description)


def _build() -> dict[str, Any]:
    defs: dict[str, Any] = {}

    defs["end_support"] = {
        "description": "A named support, or the two restraints of the end given one by one.",
        "oneOf": [
            {
                "enum": list(SUPPORT_NAMES),
                "description": "'pinned' (w = 0, M = 0), 'fixed' (w = 0, w' = 0), 'free' (M = 0, T = 0) or "
                "'guided' (w' = 0, T = 0).",
            },
            _closed(
                {
                    "translation": _spring_or("translation", "T(0) = k_t w(0), T(L) = -k_t w(L)", "N/m"),
                    "rotation": _spring_or("rotation", "M(0) = -k_r w'(0), M(L) = k_r w'(L)", "N·m/rad"),
                },
                ("translation", "rotation"),
                description="The restraints of the end one by one.",
            ),
        ],
    }

    span_keys = {
        "start": _position("Start of the loaded stretch (default 0)"),
        "end": _position("End of the loaded stretch (default the length); greater than start"),
    }
    force = {"maximum": 1e12, "minimum": -1e12}
    defs["load"] = {
        "description": "One transverse load; 'type' says which.",
        "oneOf": [
            _closed(
                {
                    "type": {"const": "uniform"},
                    "q": _number("Intensity [N/m], positive along +w", **force),
                    **span_keys,
                },
                ("type", "q"),
                description="A uniform line load.",
            ),
            _closed(
                {
                    "type": {"const": "linear"},
                    "q_start": _number("Intensity at start [N/m]", **force),
                    "q_end": _number("Intensity at end [N/m]", **force),
                    **span_keys,
                },
                ("type", "q_start", "q_end"),
                description="A line load varying linearly from start to end.",
            ),
            _closed(
                {
                    "type": {"const": "point"},
                    "P": _number("Force [N], positive along +w (not the axial force)", **force),
                    "x": _position("Position"),
                },
                ("type", "P", "x"),
                description="A point load: T jumps by -P at x.",
            ),
            _closed(
                {
                    "type": {"const": "couple"},
                    "C": _number("Couple [N·m]; M jumps by +C at x", minimum=-1e13, maximum=1e13),
                    "x": _position("Position"),
                },
                ("type", "C", "x"),
                description="A concentrated couple: M(x+) - M(x-) = C.",
            ),
        ],
    }

    no_preset = {
        "anyOf": [
            {"not": {"required": ["preset"]}},
            {"properties": {"preset": {"const": None}}, "required": ["preset"]},
        ]
    }
    preset = {"properties": {"preset": {"enum": list(BOW_PRESETS)}}, "required": ["preset"]}

    def preset_is(name: str) -> dict[str, Any]:
        return {"properties": {"preset": {"const": name}}, "required": ["preset"]}

    defs["imperfection"] = _closed(
        {
            "shape": {
                "enum": list(BOW_SHAPES),
                "description": "Shape of the initial bow w0(x): 'none'; 'sine', a half sine wave "
                "between the ends; 'parabola'; 'sway', w0 = a·x/L (an initial "
                "inclination, for a free or guided end); 'mode', the first elastic "
                "buckling mode. Default 'none' ('sine' with a preset, 'mode' with "
                "'en1993-eq-5.9').",
            },
            "amplitude": _number(
                "a [m], the largest |w0|; may be negative; |a| <= length/10 (checked "
                "by strutscope). Must be 0 or left out with a preset, which sets it. "
                "Default 0."
            ),
            "preset": {
                "description": "A code value for the amplitude instead of 'amplitude': "
                "'en1993-table-5.1' (e0 = L/n of EN 1993-1-1:2005 Table 5.1), "
                "'en1993-eq-5.9' (first-mode bow, EN 1993-1-1 §5.3.2(11) eq. (5.9)), "
                "'aisc-l/1000' (AISC 303-16 §7.13.1.1) or 'span' (L/ratio). "
                "null or left out: no preset.",
                "enum": [*BOW_PRESETS, None],
            },
            "curve": {
                "enum": list(CURVES),
                "description": "Buckling curve for the EN 1993-1-1 presets: 'auto' (from EN 1993-1-1 "
                "Table 6.2 by section, axis, thickness, grade and manufacture) or 'a0' "
                "to 'd'. Only with a preset; default 'auto'.",
            },
            "analysis": {
                "enum": list(BOW_ANALYSES),
                "description": "Column of EN 1993-1-1 Table 5.1: 'elastic' or 'plastic'. Only with "
                "a preset; default 'elastic'.",
            },
            "ratio": _number(
                "n of the bow L/n [-], 10 to 100000; with preset 'span' only (and required there)",
                minimum=10,
                maximum=100000,
            ),
            "direction": {
                "enum": list(BOW_DIRECTIONS),
                "description": "Which way a preset's bow points: 'load' (the way the loads deflect "
                "the member, the unfavourable way), 'positive' or 'negative'. Only "
                "with a preset; default 'load'.",
            },
            "columns": {
                "type": "integer",
                "minimum": 1,
                "maximum": 1000,
                "description": "m of EN 1993-1-1 eq. (5.5), for the sway a preset adds on a member "
                "with an end that can translate; only with a preset; default 1.",
            },
        },
        description="The initial bow w0(x), a stress-free initial shape measured like w: a shape and an "
        "amplitude, or a code preset.",
        allOf=[
            # A preset sets the amplitude.
            {"if": preset, "then": {"properties": {"amplitude": {"const": 0}}}},
            # Curve, analysis and direction are a preset's settings.
            {
                "if": no_preset,
                "then": {
                    "properties": {
                        "curve": {"const": "auto"},
                        "analysis": {"const": "elastic"},
                        "direction": {"const": "load"},
                        "columns": {"const": 1},
                    }
                },
            },
            # The ratio goes with preset 'span', and 'span' needs it.
            {
                "if": preset_is("span"),
                "then": {"required": ["ratio"]},
                "else": {"not": {"required": ["ratio"]}},
            },
            # Eq. (5.9)'s bow has the shape of the first buckling mode.
            {"if": preset_is("en1993-eq-5.9"), "then": {"properties": {"shape": {"enum": ["none", "mode"]}}}},
            # 'sway' is an inclination, not a member bow: no code preset but 'span' gives it.
            {
                "if": {"anyOf": [preset_is(name) for name in BOW_PRESETS if name != "span"]},
                "then": {"properties": {"shape": {"not": {"const": "sway"}}}},
            },
        ],
    )

    defs["section"] = {
        "description": "The cross-section: a catalogue name, or a parametric shape with its dimensions in "
        "metres. With a material it gives EI = E·I about 'axis' and the member check.",
        "oneOf": [
            _closed(
                {
                    "name": {
                        "type": "string",
                        "description": "A catalogue section (case- and space-insensitive): IPE 80 to "
                        "600, HEA and HEB 100 to 600, common US W shapes W6 to W24 such as 'W10x49', "
                        "common hot-finished SHS, RHS and CHS, and sawn-timber sizes such as "
                        "'TIMBER 45x195'.",
                        "examples": ["HEB 200", "IPE 300", "W10x49", "SHS 100x100x5", "TIMBER 45x195"],
                    }
                },
                ("name",),
                description="A section from strutscope's catalogue.",
            ),
            _section_shape(
                "rolled_i",
                "A rolled I or H section with root radii.",
                {
                    "h": _dimension("Depth"),
                    "b": _dimension("Flange width"),
                    "tw": _dimension("Web thickness"),
                    "tf": _dimension("Flange thickness"),
                    "r": _dimension("Root radius"),
                },
            ),
            _section_shape(
                "welded_i",
                "A welded I section (fillet welds left out of the properties).",
                {
                    "h": _dimension("Depth"),
                    "b": _dimension("Flange width"),
                    "tw": _dimension("Web thickness"),
                    "tf": _dimension("Flange thickness"),
                },
                {"a": _dimension("Fillet-weld throat (checked only)")},
            ),
            _section_shape(
                "rhs",
                "A rectangular (or square, h = b) hollow section.",
                {
                    "h": _dimension("Depth"),
                    "b": _dimension("Width"),
                    "t": _dimension("Wall thickness"),
                    "manufacture": {
                        "enum": list(HOLLOW_MANUFACTURES),
                        "description": "'hot-finished' (EN 10210-2 corners) or 'cold-formed' "
                        "(EN 10219-2 corners).",
                    },
                },
            ),
            _section_shape(
                "chs",
                "A circular hollow section.",
                {"D": _dimension("Outside diameter"), "t": _dimension("Wall thickness")},
                {
                    "manufacture": {
                        "enum": list(HOLLOW_MANUFACTURES),
                        "description": "Sets the buckling curve only; default 'cold-formed'.",
                    }
                },
            ),
            _section_shape(
                "rectangle",
                "A solid rectangle.",
                {"b": _dimension("Width"), "h": _dimension("Depth in the plane of major-axis bending")},
            ),
            _section_shape("round", "A solid round bar.", {"D": _dimension("Diameter")}),
            _section_shape(
                "custom",
                "Properties given directly, all about the chosen axis.",
                {
                    "A": _number("Area [m²], > 0", exclusiveMinimum=0),
                    "I": _number("Second moment of area [m⁴], > 0", exclusiveMinimum=0),
                    "W_el": _number("Elastic section modulus [m³], > 0", exclusiveMinimum=0),
                    "W_pl": _number("Plastic section modulus [m³], > 0", exclusiveMinimum=0),
                },
                {
                    "A_v": _number("Shear area [m²], > 0; default A", exclusiveMinimum=0),
                    "t_max": _dimension("Thickest plate (selects f_y by thickness)"),
                    "depth": _dimension("Overall depth"),
                    "width": _dimension("Overall width"),
                    "doubly_symmetric": {
                        "type": "boolean",
                        "description": "True when the section is symmetric about both axes (default false).",
                    },
                    "open_section": {
                        "type": "boolean",
                        "description": "True for an open section such as an I (default true).",
                    },
                    "It": _number("St Venant torsion constant I_t [m⁴], > 0", exclusiveMinimum=0),
                    "Iw": _number("Warping constant I_w [m⁶], >= 0", minimum=0),
                    "Iz": _number(
                        "Second moment about the minor axis I_z [m⁴], > 0 and <= I (for the "
                        "lateral-torsional buckling check)",
                        exclusiveMinimum=0,
                    ),
                    "ltb_curve": {
                        "type": "string",
                        "enum": ["a", "b", "c", "d"],
                        "description": "Lateral-torsional buckling curve, EN 1993-1-1 Table 6.4 (default "
                        "'d', the table's other cross-sections).",
                    },
                },
            ),
        ],
    }

    defs["material"] = {
        "description": "The material: a catalogued grade, or custom values in Pa and kg/m³.",
        "oneOf": [
            _closed(
                {
                    "name": {
                        "type": "string",
                        "description": "A catalogued grade (case-insensitive): S235, S275, S355, S460 "
                        "(f_y by thickness per EN 10025-2), ASTM A992, ASTM A36, ASTM A500 Gr. C "
                        "rectangular and round, timber C24 and GL24h, aluminium EN AW-6082 T6.",
                        "examples": ["S355", "ASTM A992", "C24", "EN AW-6082 T6"],
                    }
                },
                ("name",),
                description="A catalogued grade.",
            ),
            _closed(
                {
                    "E": _number("Young's modulus [Pa], > 0", exclusiveMinimum=0),
                    "fy": _number("Yield (or bending) strength [Pa], > 0", exclusiveMinimum=0),
                    "f_c": _number("Compressive strength [Pa], > 0; default fy", exclusiveMinimum=0),
                    "f_t": _number(
                        "Tension strength [Pa] of the stress check, > 0; default f_c", exclusiveMinimum=0
                    ),
                    "density": _number("Density [kg/m³], >= 0; default 7850 (steel)", minimum=0),
                    "G": _number("Shear modulus [Pa], > 0", exclusiveMinimum=0),
                    "E_05": _number("5 % fractile of E [Pa] (timber), > 0", exclusiveMinimum=0),
                    "kind": {"enum": list(MATERIAL_KINDS), "description": "Default 'custom'."},
                    "name": {
                        "type": "string",
                        "description": "A label of your own (default 'custom'), not a catalogued grade.",
                    },
                },
                ("E", "fy"),
                description="Custom values, taken as linear elastic up to the given strength.",
            ),
        ],
    }

    defs["check"] = check_schema(_closed, _number)

    properties = {
        # JSON Schema counts 1.0 as the integer 1 (draft 2020-12 "integer": a number with a zero fractional
        # part), and so does the engine; 1.5, 2, true and "1" are refused by both.
        "schema": {
            "const": 1,
            "type": "integer",
            "description": "Case-file schema version: the integer 1, the only one known. Default 1.",
        },
        "title": {
            "type": "string",
            "maxLength": MAX_TITLE,
            "pattern": _PRINTABLE,
            "description": f"Free text, one line of at most {MAX_TITLE} printable characters (no "
            "control characters such as tabs, line breaks or escape sequences).",
        },
        "length": _number("L [m], 0.001 to 1000", minimum=0.001, maximum=1000),
        "EI": _number(
            "Bending stiffness [N·m²], > 0 and <= 1e16. May be left out when 'section' and "
            "'material' give it; overrides them when given.",
            exclusiveMinimum=0,
            maximum=1e16,
        ),
        "supports": _closed(
            {"left": _end("left", "0"), "right": _end("right", "L")},
            ("left", "right"),
            description="The end supports. A set that leaves the member a mechanism "
            "(free–free, pinned–free, guided–guided) is refused by strutscope.",
        ),
        "axial_force": _number(
            "P [N], compression positive, |P| <= 1e12; constant along the member. Default 0.",
            minimum=-1e12,
            maximum=1e12,
        ),
        "loads": {
            "type": "array",
            "items": {"$ref": "#/$defs/load"},
            "maxItems": MAX_LOADS,
            "description": f"Transverse loads, at most {MAX_LOADS}; together they may cut the member "
            f"into at most {MAX_SEGMENTS} segments (every point load, couple and end of "
            "a partial load is a cut; checked by strutscope, not by this schema). "
            "Default none.",
        },
        "imperfection": {"$ref": "#/$defs/imperfection"},
        "section": {"$ref": "#/$defs/section"},
        "axis": {
            "enum": list(AXES),
            "description": "The axis the member bends about: 'major' (default) or 'minor'.",
        },
        "material": {"$ref": "#/$defs/material"},
        "stiffness_factor": _number(
            "Multiplies EI for the analysis only [-], > 0 and <= 1 (e.g. 0.8·τ_b of "
            "the AISC 360-16 direct analysis method). Default 1.",
            exclusiveMinimum=0,
            maximum=1,
        ),
        "check": {"$ref": "#/$defs/check"},
        "out_of_plane": _closed(
            {
                "buckling_length": _number(
                    "Out-of-plane buckling length L_cr [m], 0.001 to 10000: "
                    "flexural buckling about the axis the member does not bend about "
                    "(EN 1993-1-1 §6.3.1). Default: the member length, or twice it where an "
                    "end is free to translate in the plane analysed (a cantilever's).",
                    minimum=0.001,
                    maximum=10000,
                ),
                "restrained": {
                    "type": "boolean",
                    "description": "true when out-of-plane buckling is prevented (the check is "
                    "not made; for a member bent about its major axis, held along its length, so "
                    "torsional buckling is not checked either); not together with buckling_length. "
                    "Default false.",
                },
            },
            description="Flexural buckling out of the plane analysed (needs a steel section and material).",
        ),
        "second_plane": _closed(
            {
                "supports": _closed(
                    {"left": _end("left", "0"), "right": _end("right", "L")},
                    ("left", "right"),
                    description="The end supports in the second plane (same forms as 'supports').",
                ),
                "loads": {
                    "type": "array",
                    "items": {"$ref": "#/$defs/load"},
                    "maxItems": MAX_LOADS,
                    "description": "Transverse loads in the second plane (as 'loads'). Default none.",
                },
                "imperfection": {"$ref": "#/$defs/imperfection"},
                "EI": _number(
                    "Bending stiffness about the other axis [N·m²], > 0 and <= 1e16: given exactly when "
                    "the case gives its own EI.",
                    exclusiveMinimum=0,
                    maximum=1e16,
                ),
            },
            ("supports",),
            description="Bending about the other axis as well, solved as its own beam-column with the "
            "case's length, section, material and axial force; the cross-section is checked with both "
            "moments. Default bow: EN 1993-1-1 Table 5.1 with a steel section, else none. Not with "
            "'out_of_plane' nor a custom section.",
        ),
        **inner_properties(),
    }
    return {
        "$schema": _DRAFT,
        "$id": SCHEMA_ID,
        "title": "strutscope case file, schema 1",
        "description": "One member under axial force and transverse load, for strutscope's exact "
        "second-order analysis. SI units throughout: m, N, N·m, N/m, Pa, N·m/rad, kg/m³. "
        "x runs from the left end (0) to the right end (L); w and the loads are positive the "
        "same way.",
        "type": "object",
        "properties": {**properties, **action_properties(MAX_LOADS)},
        "required": ["length", "supports"],
        "additionalProperties": False,
        # The stiffness comes from EI, or from E·I of the section and material.
        "anyOf": [{"required": ["EI"]}, {"required": ["section", "material"]}],
        # The second plane makes the out-of-plane check.
        "not": {"required": ["second_plane", "out_of_plane"]},
        "$defs": defs,
    }


@functools.cache
def _built() -> dict[str, Any]:
    return _build()


def case_schema() -> dict[str, Any]:
    """Return the case-file JSON Schema (draft 2020-12) as a new mapping.

    Returns
    -------
    dict
        A fresh deep copy, so the caller may change it.
    """
    return copy.deepcopy(_built())


def schema_text(indent: int = 2) -> str:
    """Return the schema as JSON text (str), non-ASCII characters kept; ``indent`` indents the JSON text."""
    return json.dumps(_built(), indent=indent, ensure_ascii=False)
