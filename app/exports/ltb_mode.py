"""The first lateral-torsional buckling mode (issue 15) drawn in one axes: shared by the calc sheet's mode
page (:mod:`app.exports.sheet_ltb`) and the PNG's mode panel (:mod:`app.exports.figure`)."""

from __future__ import annotations

import numpy as np

from app.exports.style import _ACCENT, _FONT, _GREY, _GRID, _INK, _LIGHT
from app.units import Units

__all__ = ["draw_ltb_mode", "has_ltb_mode"]

#: The y label of the mode's axes (each component scaled to a largest |value| of 1).
MODE_LABEL = "first LTB mode (each largest |value| 1)"


def has_ltb_mode(result) -> bool:
    """Whether the lateral-torsional buckling check was made and the engine gave its first mode."""
    ltb = getattr(result, "ltb", None)
    return ltb is not None and bool(ltb.applies) and bool(len(getattr(ltb, "mode_x", ())))


def draw_ltb_mode(ax, result, U: Units, *, size: float = 8.0, xlim=None) -> None:
    """Draw the lateral displacement v of the shear centre and the twist φ of ``result.ltb``'s first mode,
    each scaled to a largest |value| of 1, along the member in the display unit, the intermediate restraints
    dotted; `size` is the label font size, `xlim` the x range (the mode's own by default). The caller checks
    :func:`has_ltb_mode` first."""
    ltb = result.ltb
    x = np.asarray(ltb.mode_x, dtype=float) * U.length.factor
    ax.plot(x, np.asarray(ltb.mode_v, dtype=float), color=_INK, lw=1.4, label="lateral displacement v")
    ax.plot(x, np.asarray(ltb.mode_phi, dtype=float), color=_ACCENT, lw=1.4, ls="--", label="twist φ")
    ax.axhline(0.0, color=_LIGHT, lw=0.8)
    for restraint in getattr(ltb, "restraints", ()) or ():
        ax.axvline(float(restraint["x"]) * U.length.factor, color=_GREY, lw=0.8, ls=":")
    ax.set_xlim(*(xlim if xlim is not None else (float(x[0]), float(x[-1]))))
    ax.set_ylim(-1.1, 1.1)
    ax.set_xlabel(f"x [{U.label('length')}]", family=_FONT, fontsize=size)
    ax.set_ylabel(MODE_LABEL, family=_FONT, fontsize=size)
    ax.tick_params(labelsize=size - 1)
    ax.grid(True, color=_GRID, lw=0.5)
    ax.legend(loc="upper right", fontsize=size - 1, frameon=False, prop={"family": _FONT, "size": size - 1})
