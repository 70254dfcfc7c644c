"""The calc sheet's lateral-torsional buckling check (issue 15), worded by :mod:`app.report.ltb`."""

from __future__ import annotations

from app.exports.style import _DANGER, _GREY, _INK
from app.report.ltb import ltb_words
from app.units import Units

__all__ = ["ltb_items"]


def ltb_items(item, flow, result, U: Units) -> None:
    """Both critical moments and their difference, λ̄_LT, χ_LT, M_b,Rd, the utilisation, the method and the
    sources; or why the check could not be made. Nothing for a case without a member check."""
    words = ltb_words(result, U)
    if words is None:
        return
    flow.space(3)
    item("Lateral-torsional buckling", "major axis, EN 1993-1-1 §6.3.2", weight="bold")
    item("", f"settings: {words.settings}", scale=0.92)
    if not words.applies:
        stays = "; the caution in section 5 stays" if words.caution else ""
        item("", f"not checked: {words.reason}{stays}", color=_DANGER if words.caution else _INK)
    for key, label, text in words.lines():
        danger = key == "utilisation" and words.fails
        item(
            label,
            text,
            weight="bold" if key == "utilisation" else "normal",
            color=_DANGER if danger else _INK,
        )
    if words.method:
        item("", f"method: {words.method}", scale=0.92)
    for source in words.sources:
        item("", f"source: {source}", scale=0.85, color=_GREY)
