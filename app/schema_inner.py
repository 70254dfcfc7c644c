"""The case file's keys ``restraints``, ``steps`` and ``foundation`` (engine issue 16) in the JSON Schema of
:mod:`app.schema`, kept apart so that module stays short. Written from the engine's contract
(DEVELOPERS.md, "Case file"); tests/app/test_schema.py checks the schema against the engine."""

from __future__ import annotations

from typing import Any

__all__ = ["RESTRAINTS", "inner_properties", "spring_or"]

#: The named restraints of an end or an intermediate restraint (tests/app/test_schema.py compares them
#: with the engine's).
RESTRAINTS = ("fixed", "free")


def _number(description: str, **bounds: float) -> dict[str, Any]:
    return {"type": "number", "description": description, **bounds}


def _closed(properties: dict[str, Any], required: tuple[str, ...] = (), **extra: Any) -> dict[str, Any]:
    schema: dict[str, Any] = {"type": "object", "properties": properties, "additionalProperties": False}
    if required:
        schema["required"] = list(required)
    schema.update(extra)
    return schema


def spring_or(restraint: str, condition: str, unit: str, whose: str = "The end's") -> dict[str, Any]:
    """A restraint: 'fixed', 'free' or a spring stiffness [unit], 0 to 1e18."""
    return {
        "description": f"{whose} {restraint} restraint: 'fixed', 'free' or an elastic spring [{unit}], "
        f"0 to 1e18 ({condition}).",
        "anyOf": [
            {"enum": list(RESTRAINTS)},
            _number(f"spring stiffness [{unit}]", minimum=0, maximum=1e18),
        ],
    }


def inner_properties() -> dict[str, Any]:
    """The three keys' schemas, by name."""
    return {
        "restraints": {
            "type": "array",
            "maxItems": 50,
            "items": _closed(
                {
                    "x": _number("Where [m], strictly between the ends.", exclusiveMinimum=0),
                    "translation": spring_or(
                        "translation",
                        "a spring's force on the member is -k_t w; default 'free'",
                        "N/m",
                        "The",
                    ),
                    "rotation": spring_or(
                        "rotation",
                        "a spring's couple on the member is -k_r w'; default 'free'",
                        "N·m/rad",
                        "The",
                    ),
                    "hinge": {
                        "type": "boolean",
                        "description": "An internal hinge (moment release); its rotation must be 'free'. "
                        "Default false.",
                    },
                    "plane": {
                        "enum": ["first", "second", "both"],
                        "description": "The plane it acts in ('second' needs second_plane). Default 'both'.",
                    },
                    "twist": spring_or(
                        "twist",
                        "phi = 0 or a torsional spring k_phi; read by the lateral-torsional buckling check "
                        "only; default 'free'",
                        "N·m/rad",
                        "The",
                    ),
                },
                ("x",),
                description="A support, spring or hinge inside the member. One per point and plane; one "
                "that restrains nothing, or leaves a mechanism, is refused by strutscope.",
            ),
            "description": "Intermediate restraints and hinges, at most 50. Default none.",
        },
        "steps": {
            "type": "array",
            "maxItems": 50,
            "items": _closed(
                {
                    "x": _number(
                        "Where the new stiffness starts [m], strictly between the ends.", exclusiveMinimum=0
                    ),
                    "EI": _number(
                        "Bending stiffness from x to the next step or the end [N·m²], > 0 and <= 1e16.",
                        exclusiveMinimum=0,
                        maximum=1e16,
                    ),
                    "section": {
                        "$ref": "#/$defs/section",
                        "description": "The section from x to the next step or the end (the forms of "
                        "'section'); its EI is E·I about the case's axis and the check uses it there.",
                    },
                },
                ("x",),
                description="A change of EI or of section, in increasing x; exactly one of EI and section, "
                "every step the same form. By EI: only in a one-plane case that gives its own EI and no "
                "section. By section: only in a one-plane case with a section and a material and no EI.",
                oneOf=[{"required": ["EI"]}, {"required": ["section"]}],
            ),
            "description": "Steps in the bending stiffness, at most 50. Default none.",
        },
        "foundation": {
            "type": "array",
            "maxItems": 50,
            "items": _closed(
                {
                    "start": _number("Where the foundation starts [m], on the member.", minimum=0),
                    "end": _number("Where it ends [m], beyond start, on the member.", exclusiveMinimum=0),
                    "k": _number(
                        "Winkler modulus [N/m²] (force per length per deflection), > 0 and <= 1e12.",
                        exclusiveMinimum=0,
                        maximum=1e12,
                    ),
                    "plane": {
                        "enum": ["first", "second", "both"],
                        "description": "The plane it acts in ('second' needs second_plane). Default 'both'.",
                    },
                },
                ("start", "end", "k"),
                description="An elastic foundation under part or all of the member; it adds -k w to the "
                "load. Ranges of one plane may not overlap.",
            ),
            "description": "Elastic (Winkler) foundation ranges, at most 50. Default none.",
        },
    }
