"""The page's inputs of the second bending plane and of the routes of the member check (issue 14).

:class:`PlaneInputs` is the part of :class:`app.state_inputs.MemberInputs` that holds them, in SI like every
input: whether the case has a second plane, its supports, its loads and (with the case's own EI) its EI. Its
bow is the code's default (the key left out: the engine takes EN 1993-1-1 Table 5.1 about the other axis),
unless a loaded case gave one, which is kept as it came with any other key of the file's ``second_plane``.
Then which routes count toward the headline utilisation, the EN 1993-1-1 Annex and the AISC method.
:func:`plane_mapping` and :func:`plane_values` turn them into the case file's keys and back.

Keys the case file leaves at their defaults are not written (a one-plane case with the default routes is the
same file as before issue 14).
"""

from __future__ import annotations

from collections.abc import Mapping
from typing import Any

import param

__all__ = [
    "DEFAULT_ROUTES",
    "PLANE_INPUTS",
    "PLANE_SUPPORTS",
    "ROUTE_CODES",
    "PlaneInputs",
    "plane_check_keys",
    "plane_mapping",
    "plane_values",
]

#: Every route of the member check, in the order shown (engine.design.routes.ROUTES).
ROUTE_CODES = ("second-order", "en-member", "aisc")
#: The routes that count by default (the engine's default ``check.routes``).
DEFAULT_ROUTES = ("second-order", "en-member")
#: The named supports of the second plane (springs come only from a case file, and are kept as given).
PLANE_SUPPORTS = ("pinned", "fixed", "free", "guided")

#: The inputs held here (the state watches them as it watches every other input).
PLANE_INPUTS = (
    "plane2",
    "plane2_left",
    "plane2_right",
    "plane2_loads",
    "plane2_EI",
    "plane2_extra",
    "routes",
    "annex",
    "aisc_method",
    "aisc_analysis",
)


class PlaneInputs(param.Parameterized):
    """The second plane's inputs and the route settings (SI; validated by the engine when solved)."""

    plane2 = param.Boolean(
        default=False,
        doc="The member also bends about its other axis (a second plane with its own supports and loads).",
    )
    plane2_left = param.Parameter(
        default="pinned",
        doc="Second plane, support at x = 0: pinned, fixed, free or guided (or a file's spring mapping).",
    )
    plane2_right = param.Parameter(
        default="pinned",
        doc="Second plane, support at x = L: pinned, fixed, free or guided (or a file's spring mapping).",
    )
    plane2_loads = param.List(
        default=[{"type": "uniform", "q": 1.0e3}],
        item_type=dict,
        doc="Transverse loads of the second plane in the case-file form (SI), as ``loads``.",
    )
    plane2_EI = param.Number(
        allow_None=True,
        default=None,
        softbounds=(1.0e4, 1.0e9),
        doc="Second plane's bending stiffness EI [N·m²], needed (only) when the case gives its own EI.",
    )
    plane2_extra = param.Dict(
        default={},
        doc="Further keys of a loaded case file's second_plane (its imperfection, EI), kept as they were.",
    )
    routes = param.List(
        default=list(DEFAULT_ROUTES),
        item_type=str,
        doc="The routes that count toward the headline utilisation (the others are shown for comparison).",
    )
    annex = param.Selector(
        objects=["B", "A"], default="B", doc="EN 1993-1-1 interaction factors: Annex B (method 2) or A."
    )
    aisc_method = param.Selector(
        objects=["LRFD", "ASD"], default="LRFD", doc="AISC 360-16: LRFD (φ) or ASD (Ω)."
    )
    aisc_analysis = param.Selector(
        objects=["effective-length", "direct"],
        default="effective-length",
        doc="AISC 360-16's method of analysis: effective length (Appendix 7) or direct analysis (§C2.3).",
    )


def plane_check_keys(inputs) -> dict:
    """The route settings' keys of the case file's ``check``, only those that differ from the defaults."""
    data: dict[str, Any] = {}
    if list(inputs.routes) != list(DEFAULT_ROUTES):
        data["routes"] = list(inputs.routes)
    if inputs.annex != "B":
        data["annex"] = inputs.annex
    if inputs.aisc_method != "LRFD":
        data["aisc_method"] = inputs.aisc_method
    if inputs.aisc_analysis != "effective-length":
        data["aisc_analysis"] = inputs.aisc_analysis
    return data


def plane_mapping(inputs) -> dict:
    """``{"second_plane": {...}}`` for a two-plane case, {} for one plane."""
    if not inputs.plane2:
        return {}
    data: dict[str, Any] = {
        "supports": {"left": inputs.plane2_left, "right": inputs.plane2_right},
        "loads": [dict(load) for load in inputs.plane2_loads],
    }
    data.update(inputs.plane2_extra)
    if inputs.stiffness_from in ("EI", "both"):
        data["EI"] = inputs.plane2_EI
    return {"second_plane": data}


def plane_values(mapping: Mapping) -> dict:
    """The inputs of :class:`PlaneInputs` for a case-file mapping (the inverse of :func:`plane_mapping`)."""
    values: dict[str, Any] = {}
    plane = mapping.get("second_plane")
    if isinstance(plane, Mapping):
        plane = dict(plane)
        supports = plane.pop("supports", None) or {}
        supports = supports if isinstance(supports, Mapping) else {}
        values["plane2"] = True
        values["plane2_left"] = supports.get("left", "pinned")
        values["plane2_right"] = supports.get("right", "pinned")
        loads = plane.pop("loads", [])
        values["plane2_loads"] = [dict(load) for load in loads] if isinstance(loads, list) else []
        values["plane2_EI"] = plane.pop("EI", None)
        values["plane2_extra"] = plane
    else:
        values["plane2"] = False
        values["plane2_extra"] = {}
    check = mapping.get("check") or {}
    check = check if isinstance(check, Mapping) else {}
    routes = check.get("routes", DEFAULT_ROUTES)
    values["routes"] = list(routes) if isinstance(routes, (list, tuple)) else list(DEFAULT_ROUTES)
    values["annex"] = check.get("annex", "B")
    values["aisc_method"] = check.get("aisc_method", "LRFD")
    values["aisc_analysis"] = check.get("aisc_analysis", "effective-length")
    return values
