"""The member sketch of :mod:`app.sketch` drawn with matplotlib (the PNG and the calc sheet's figure page)."""

from __future__ import annotations

import math

import numpy as np

from app.exports.style import _ACCENT, _DANGER, _FILL, _GREY, _INK
from app.sketch import Y_RANGE, Arrow, Polygon, Polyline, Text, sketch
from app.units import Units

# Colour of each role (app.sketch.ROLES); hinges are filled white, load areas grey.
_COLOURS = {"bow": _ACCENT, "bow-label": _ACCENT, "dimension": _GREY, "note": _GREY, "danger": _DANGER}
_FILLS = {"hinge": "white", "load-fill": _FILL}
_ZORDER = {"member": 2, "bow": 1, "hinge": 4, "load-fill": 1}


class _Scale:
    """Data units per inch of one axes in x and y, to place the sketch's fixed-size offsets."""

    def __init__(self, ax):
        fig_w, fig_h = ax.figure.get_size_inches()
        box = ax.get_position()
        x0, x1 = ax.get_xlim()
        y0, y1 = ax.get_ylim()
        self.x = (x1 - x0) / (box.width * fig_w)
        self.y = (y1 - y0) / (box.height * fig_h)
        self.left, self.right = x0, x1

    def xs(self, x, dx):
        return np.asarray(x, dtype=float) + np.asarray(dx, dtype=float) * self.x

    def ys(self, y, dy):
        return np.asarray(y, dtype=float) + np.asarray(dy, dtype=float) * self.y

    def point(self, at):
        x, y, dx, dy = at
        if math.isinf(x):
            x = self.left if x < 0 else self.right
        return float(self.xs(x, dx)), float(self.ys(y, dy))


def _draw(ax, s: _Scale, shape) -> None:
    colour = _COLOURS.get(shape.role, _INK)
    zorder = _ZORDER.get(shape.role, 3)
    if isinstance(shape, Polygon):
        ax.fill(
            s.xs(shape.x, shape.dx),
            s.ys(shape.y, shape.dy),
            fc=_FILLS.get(shape.role, "white"),
            ec=colour if shape.width > 0 else "none",
            lw=shape.width,
            alpha=0.7 if shape.role == "load-fill" else 1.0,
            zorder=zorder,
        )
    elif isinstance(shape, Polyline):
        ax.plot(
            s.xs(shape.x, shape.dx),
            s.ys(shape.y, shape.dy),
            color=colour,
            lw=shape.width,
            ls=(0, (5, 3)) if shape.dashed else "-",
            solid_capstyle="butt" if shape.role == "member" else "projecting",
            zorder=zorder,
        )
    elif isinstance(shape, Arrow):
        head = shape.head_size
        ax.annotate(
            "",
            xy=s.point(shape.head),
            xytext=s.point(shape.tail),
            arrowprops=dict(
                arrowstyle=f"-|>,head_length={head / 10:.2f},head_width={head / 20:.2f}",
                color=colour,
                lw=shape.width,
                shrinkA=0,
                shrinkB=0,
            ),
        )
    elif isinstance(shape, Text):
        x, y = s.point(shape.at)
        box = (
            dict(fc="white", ec="none", alpha=0.75, pad=0.3)
            if shape.role == "label" and "q =" in shape.text
            else None
        )
        ax.text(
            x,
            y,
            shape.text,
            ha=shape.ha,
            va=shape.va,
            fontsize=shape.size,
            color=colour,
            fontweight="bold" if shape.bold else "normal",
            parse_math=False,
            linespacing=1.1,
            bbox=box,
        )


def _draw_sketch(ax, result, U: Units) -> None:
    """Draw :func:`app.sketch.sketch` of `result` into `ax` (its x limits already set, with the padding)."""
    ax.set_ylim(*Y_RANGE)
    ax.axis("off")
    s = _Scale(ax)
    for shape in sketch(result, U).shapes:
        _draw(ax, s, shape)
