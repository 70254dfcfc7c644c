"""The calc sheet's lateral-torsional buckling check (issue 15), worded by :mod:`app.report.ltb`, and its
page with the first buckling mode (lateral v and twist φ)."""

from __future__ import annotations

import textwrap

from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.figure import Figure

from app.exports.figure import page_heading
from app.exports.ltb_mode import draw_ltb_mode, has_ltb_mode
from app.exports.style import _DANGER, _FONT, _GREY, _INK, A4_PORTRAIT, _title
from app.report.ltb import ltb_words
from app.units import Units

__all__ = ["ltb_items", "ltb_mode_figure"]


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


def ltb_mode_figure(result, U: Units) -> Figure | None:
    """A calc-sheet page (A4 portrait) with the first lateral-torsional buckling mode at M_cr: the lateral
    displacement v of the shear centre and the twist φ, each scaled to a largest |value| of 1, along the
    member in the display unit, the intermediate restraints marked. None when the check was not made."""
    if not has_ltb_mode(result):
        return None
    ltb = result.ltb
    words = ltb_words(result, U)
    fig = Figure(figsize=A4_PORTRAIT)
    FigureCanvasAgg(fig)
    draw_ltb_mode(fig.add_axes((0.14, 0.58, 0.80, 0.30)), result, U)
    page_heading(fig, f"Lateral-torsional buckling mode at M_cr = {words.text('M_cr')}: {_title(result)}")
    note = (
        "v: the shear centre's lateral displacement; φ: the twist. "
        + ("Dotted lines: restraints inside the member. " if getattr(ltb, "restraints", ()) else "")
        + f"Settings: {words.settings}."
    )
    fig.text(
        0.14,
        0.53,
        "\n".join(textwrap.wrap(note, 110)),
        ha="left",
        va="top",
        fontsize=7,
        color=_GREY,
        family=_FONT,
        parse_math=False,
    )
    return fig
