"""The page's bow inputs read from a case file's ``imperfection`` (the inverse of
``MemberInputs._imperfection_data``): keys without an input on the page are kept in ``bow_extra``, so that a
loaded case is written back as it came (an audit found a preset's ``columns`` dropped: m of EN 1993-1-1
eq. (5.5), the page's moment 3.5 % off the command line's for the same file)."""

from __future__ import annotations

from collections.abc import Mapping
from typing import Any

__all__ = ["bow_values"]

#: The imperfection keys the page's inputs read, per form of bow (the others are kept in ``bow_extra``).
_BOW_KEYS = {
    "preset": ("preset", "shape", "curve", "analysis", "direction", "ratio", "amplitude"),
    "shape": ("shape", "amplitude"),
}


def bow_values(mapping: Mapping) -> dict:
    """The bow inputs of :class:`app.state.MemberState` for a case-file mapping."""
    bow = dict(mapping.get("imperfection") or {})
    values: dict[str, Any] = {}
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
    # keys without an input on the page (a preset's "columns", say) are kept with the form they came with
    read = _BOW_KEYS[values["bow_from"]]
    values["bow_extra"] = {values["bow_from"]: {k: v for k, v in bow.items() if k not in read}}
    return values
