"""The calc sheet's lateral-torsional buckling check (issue 15), worded by :mod:`app.report.ltb`, and its
page with the first buckling mode (lateral v and twist φ)."""

from __future__ import annotations

import textwrap

import numpy as np
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.figure import Figure

from app.exports.figure import page_heading
from app.exports.style import (
    _ACCENT,
    _DANGER,
    _FONT,
    _GREY,
    _GRID,
    _INK,
    _LIGHT,
    A4_PORTRAIT,
    _title,
)
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
    ltb = getattr(result, "ltb", None)
    if ltb is None or not ltb.applies or not len(getattr(ltb, "mode_x", ())):
        return None
    words = ltb_words(result, U)
    fig = Figure(figsize=A4_PORTRAIT)
    FigureCanvasAgg(fig)
    ax = fig.add_axes((0.14, 0.58, 0.80, 0.30))
    x = np.asarray(ltb.mode_x, dtype=float) * U.length.factor
    ax.plot(x, np.asarray(ltb.mode_v, dtype=float), color=_INK, lw=1.4, label="lateral displacement v")
    ax.plot(x, np.asarray(ltb.mode_phi, dtype=float), color=_ACCENT, lw=1.4, ls="--", label="twist φ")
    ax.axhline(0.0, color=_LIGHT, lw=0.8)
    for restraint in getattr(ltb, "restraints", ()) or ():
        ax.axvline(float(restraint["x"]) * U.length.factor, color=_GREY, lw=0.8, ls=":")
    ax.set_xlim(float(x[0]), float(x[-1]))
    ax.set_ylim(-1.1, 1.1)
    ax.set_xlabel(f"x [{U.label('length')}]", family=_FONT, fontsize=8)
    ax.set_ylabel("first LTB mode (each largest |value| 1)", family=_FONT, fontsize=8)
    ax.tick_params(labelsize=7)
    ax.grid(True, color=_GRID, lw=0.5)
    ax.legend(loc="upper right", fontsize=7, frameon=False, prop={"family": _FONT, "size": 7})
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
