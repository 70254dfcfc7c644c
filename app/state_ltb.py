"""The page's inputs of the lateral-torsional buckling check (issue 15): the case file's ``check.ltb``.

:class:`LtbInputs` is the part of :class:`app.state_inputs.MemberInputs` that holds them: where the transverse
loads act over the depth, the lateral and warping end conditions of each end, the clause χ_LT is found by,
and whether the compression flange is restrained along the member (LTB prevented, the engineer's statement).
:func:`ltb_check_keys` and :func:`ltb_values` turn them into the case file's ``check.ltb`` and back. Only
settings that differ from the defaults are written (a case with the default LTB settings is the same file as
before issue 15); the defaults are the engine's, the conservative ones (destabilising load, lateral ends as
the supports say, warping free, §6.3.2.2, not restrained). The engine validates the values when it solves (a
value no widget offers, from a file or a link, comes back as its message).
"""

from __future__ import annotations

from collections.abc import Mapping
from typing import Any

import param

__all__ = [
    "CHI_METHODS",
    "LATERAL_ENDS",
    "LOAD_POSITIONS",
    "LTB_DEFAULTS",
    "LTB_INPUTS",
    "WARPING_ENDS",
    "LtbInputs",
    "ltb_check_keys",
    "ltb_values",
]

#: Where the transverse loads act over the depth (the case file's ``check.ltb.load_position``).
LOAD_POSITIONS = ("destabilising", "shear-centre", "stabilising")
#: Lateral end condition of each end: as its support says (supports: a fork where it holds the end, free
#: where it moves; the engine's engine/ltb_route.py), free to rotate about the minor axis (fork) or held
#: (fixed).
LATERAL_ENDS = ("supports", "fork", "fixed")
#: Warping end condition of each end.
WARPING_ENDS = ("free", "fixed")
#: How χ_LT is found: EN 1993-1-1 §6.3.2.2 (general case) or §6.3.2.3 (rolled or equivalent welded sections).
CHI_METHODS = ("general", "rolled")

#: The engine's defaults (engine/design/ltb_member.py): the conservative ones.
LTB_DEFAULTS: dict[str, Any] = {
    "load_position": "destabilising",
    "lateral_ends": ["supports", "supports"],
    "warping_ends": ["free", "free"],
    "chi_method": "general",
    "restrained": False,
}

#: The inputs held here (the state watches them as it watches every other input).
LTB_INPUTS = (
    "ltb_load_position",
    "ltb_lateral_left",
    "ltb_lateral_right",
    "ltb_warping_left",
    "ltb_warping_right",
    "ltb_chi_method",
    "ltb_restrained",
    "ltb_extra",
)


class LtbInputs(param.Parameterized):
    """The ``check.ltb`` settings (validated by the engine when solved).

    Parameters are plain :class:`param.Parameter` so that a value from a file or a link that no widget offers
    is kept as it came and reaches the engine, which names it in its message.
    """

    ltb_load_position = param.Parameter(
        default="destabilising",
        doc="Where the transverse loads act for lateral-torsional buckling: 'destabilising' (at the flange "
        "they come from, z_g = +h/2), 'shear-centre' or 'stabilising' (the other flange, z_g = −h/2).",
    )
    ltb_lateral_left = param.Parameter(
        default="supports",
        doc="Lateral end condition at x = 0: 'supports' (as its support says), 'fork' (free about the minor "
        "axis) or 'fixed'.",
    )
    ltb_lateral_right = param.Parameter(
        default="supports",
        doc="Lateral end condition at x = L: 'supports' (as its support says), 'fork' (free about the minor "
        "axis) or 'fixed'.",
    )
    ltb_warping_left = param.Parameter(default="free", doc="Warping at x = 0: 'free' or 'fixed'.")
    ltb_warping_right = param.Parameter(default="free", doc="Warping at x = L: 'free' or 'fixed'.")
    ltb_chi_method = param.Parameter(
        default="general",
        doc="χ_LT by EN 1993-1-1 §6.3.2.2 ('general', the default: the lower χ_LT) or §6.3.2.3 ('rolled': "
        "rolled or equivalent welded I sections).",
    )
    ltb_restrained = param.Parameter(
        default=False,
        doc="True: the engineer states that the compression flange is restrained along the member (by a slab "
        "or sheeting), so lateral-torsional buckling is prevented (χ_LT = 1, EN 1993-1-1 §6.3.2.1(2)).",
    )
    ltb_extra = param.Dict(
        default={},
        doc="Keys of a loaded case file's check.ltb the inputs above cannot hold (an unknown key, a pair "
        "that is not a pair), kept as they came so that the engine names them.",
    )


def ltb_check_keys(inputs) -> dict:
    """``{"ltb": {...}}`` for the case file's ``check`` with the settings that differ from the defaults."""
    data: dict[str, Any] = {}
    if inputs.ltb_load_position != LTB_DEFAULTS["load_position"]:
        data["load_position"] = inputs.ltb_load_position
    lateral = [inputs.ltb_lateral_left, inputs.ltb_lateral_right]
    if lateral != LTB_DEFAULTS["lateral_ends"]:
        data["lateral_ends"] = lateral
    warping = [inputs.ltb_warping_left, inputs.ltb_warping_right]
    if warping != LTB_DEFAULTS["warping_ends"]:
        data["warping_ends"] = warping
    if inputs.ltb_chi_method != LTB_DEFAULTS["chi_method"]:
        data["chi_method"] = inputs.ltb_chi_method
    if inputs.ltb_restrained is not LTB_DEFAULTS["restrained"]:
        data["restrained"] = inputs.ltb_restrained
    data.update(inputs.ltb_extra)
    return {"ltb": data} if data else {}


def ltb_values(mapping: Mapping) -> dict:
    """The inputs of :class:`LtbInputs` for a case-file mapping (the inverse of :func:`ltb_check_keys`).

    A key the inputs cannot hold (unknown, or a pair that is not a list of two) goes into ``ltb_extra`` as it
    came, so that the engine refuses it with its message rather than the page dropping it.
    """
    check = mapping.get("check") or {}
    check = check if isinstance(check, Mapping) else {}
    ltb = check.get("ltb") or {}
    ltb = dict(ltb) if isinstance(ltb, Mapping) else {}
    values: dict[str, Any] = {
        "ltb_load_position": ltb.pop("load_position", LTB_DEFAULTS["load_position"]),
        "ltb_chi_method": ltb.pop("chi_method", LTB_DEFAULTS["chi_method"]),
        "ltb_restrained": ltb.pop("restrained", LTB_DEFAULTS["restrained"]),
    }
    for key, name in (("lateral_ends", "lateral"), ("warping_ends", "warping")):
        pair = ltb.pop(key, LTB_DEFAULTS[key])
        if not (isinstance(pair, (list, tuple)) and len(pair) == 2):
            ltb[key] = pair
            pair = LTB_DEFAULTS[key]
        values[f"ltb_{name}_left"], values[f"ltb_{name}_right"] = pair
    values["ltb_extra"] = ltb
    return values
