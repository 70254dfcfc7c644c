"""The case file's ``actions`` and ``combinations`` keys in the JSON Schema (:mod:`app.schema`).

Written out by hand from the README's "Load cases and combinations"; tests/app/test_schema.py compares the
names with the engine's (:mod:`engine.actions`).
"""

from __future__ import annotations

from typing import Any

__all__ = ["ACTION_CATEGORIES", "COMBINATION_RULES", "SERVICE_KINDS", "action_properties"]

ACTION_CATEGORIES = (
    "permanent",
    "imposed",
    *(f"imposed-{letter}" for letter in "ABCDEFGH"),
    "snow",
    "snow-low",
    "wind",
    "temperature",
)
COMBINATION_RULES = ("en1990-6.10", "en1990-6.10ab", "asce7-2.3", "table")
SERVICE_KINDS = ("characteristic", "frequent", "quasi-permanent")
ASCE_SYMBOLS = ("D", "L", "Lr", "S", "R", "W")
MAX_ACTIONS = 12
_NAME = {
    "type": "string",
    "pattern": "^[A-Za-z0-9][A-Za-z0-9_.+\\-]{0,23}$",
    "description": "1 to 24 letters, digits or _ . + - (starting with a letter or digit).",
}


def _closed(properties: dict[str, Any], required: tuple[str, ...] = (), **extra: Any) -> dict[str, Any]:
    schema: dict[str, Any] = {"type": "object", "properties": properties, "additionalProperties": False}
    if required:
        schema["required"] = list(required)
    schema.update(extra)
    return schema


def action_properties(max_loads: int) -> dict[str, Any]:
    """The ``actions`` and ``combinations`` properties of the case object."""
    action = _closed(
        {
            "name": {
                **_NAME,
                "description": "The action's name, unique in the case. " + _NAME["description"],
            },
            "category": {
                "type": "string",
                "pattern": _NAME["pattern"],
                "description": "One of " + ", ".join(ACTION_CATEGORIES) + " (EN 1990 Table A1.1), "
                "or a name of your own (then psi is required).",
            },
            "axial_force": {
                "type": "number",
                "description": "The action's own axial force [N], compression positive, |N| <= 1e12. "
                "Default 0.",
                "minimum": -1e12,
                "maximum": 1e12,
            },
            "loads": {
                "type": "array",
                "items": {"$ref": "#/$defs/load"},
                "maxItems": max_loads,
                "description": "The action's transverse loads (the forms of 'loads'). Default none.",
            },
            "second_plane": _closed(
                {
                    "loads": {
                        "type": "array",
                        "items": {"$ref": "#/$defs/load"},
                        "maxItems": max_loads,
                        "description": "The action's transverse loads in the second plane (the forms of "
                        "'loads').",
                    }
                },
                ("loads",),
                description="Only in a case with second_plane: the action's loads in that plane (the case's "
                "second_plane.loads must then be empty). Left out: the action loads the first plane only.",
            ),
            "psi": {
                "type": "array",
                "items": {"type": "number", "minimum": 0, "maximum": 1},
                "minItems": 3,
                "maxItems": 3,
                "description": "[psi0, psi1, psi2], 0 to 1: required for a category of your own, "
                "optional for a variable one (replaces the table's), not for a permanent one.",
            },
            "exclusive": {
                **_NAME,
                "description": "Variable actions with the same name here never act together (wind from "
                "the left and from the right); not for a permanent action, which acts in every combination.",
            },
            "asce": {
                "enum": list(ASCE_SYMBOLS),
                "description": "The ASCE 7 load symbol a category of your own stands for (rule asce7-2.3).",
            },
        },
        ("name", "category"),
    )
    row = _closed(
        {
            "name": _NAME,
            "state": {"enum": ["ultimate", "service"], "description": "The limit state."},
            "factors": {
                "type": "object",
                "additionalProperties": {"type": "number", "minimum": -10, "maximum": 10},
                "minProperties": 1,
                "description": "A factor (-10 to 10) per action name; actions left out get 0.",
            },
        },
        ("name", "state", "factors"),
    )
    return {
        "actions": {
            "type": "array",
            "items": action,
            "minItems": 1,
            "maxItems": MAX_ACTIONS,
            "description": "Named load cases. With actions, 'loads' must be empty and 'axial_force' 0: "
            "each combination is solved as its own case with its summed factored loads and axial force.",
        },
        "combinations": _closed(
            {
                "rule": {
                    "enum": list(COMBINATION_RULES),
                    "description": "EN 1990 eq. (6.10) (default), eqs. (6.10a)/(6.10b), ASCE 7 §2.3 "
                    "(LRFD; service by §2.4), or the user's table only.",
                },
                "service": {
                    "type": "array",
                    "items": {"enum": list(SERVICE_KINDS)},
                    "uniqueItems": True,
                    "description": "EN 1990 serviceability combinations for the deflection check. "
                    "Default ['characteristic'].",
                },
                "table": {"type": "array", "items": row, "maxItems": 200, "description": "Your own rows."},
                "service_bow": {
                    "type": "boolean",
                    "description": "Check the deflection with the code bow too. Default false.",
                },
            },
            description="How the actions are combined (needs 'actions').",
        ),
    }
