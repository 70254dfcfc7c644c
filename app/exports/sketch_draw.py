"""The member sketch drawn with matplotlib."""

from __future__ import annotations

import numpy as np
from matplotlib.patches import Polygon

from app.exports.style import _ACCENT, _DANGER, _FILL, _GREY, _INK
from app.report import has_bow, support_text
from app.units import Units

# --------------------------------------------------------------------------------------------------------
# The figure.


class _Scale:
    """Converts lengths in inches into data units of one axes (the sketch is drawn in inches on the page)."""

    def __init__(self, ax):
        fig_w, fig_h = ax.figure.get_size_inches()
        box = ax.get_position()
        x0, x1 = ax.get_xlim()
        y0, y1 = ax.get_ylim()
        self.x = (x1 - x0) / (box.width * fig_w)
        self.y = (y1 - y0) / (box.height * fig_h)

    def dx(self, inches: float) -> float:
        return inches * self.x

    def dy(self, inches: float) -> float:
        return inches * self.y


def _hatch(ax, s, x0, x1, y0, y1, *, direction):
    """Short diagonal ticks behind a ground or wall line from (x0, y0) to (x1, y1)."""
    n = 6
    for t in np.linspace(0.0, 1.0, n):
        x, y = x0 + t * (x1 - x0), y0 + t * (y1 - y0)
        if direction == "down":
            ax.plot([x, x - s.dx(0.07)], [y, y - s.dy(0.09)], color=_INK, lw=0.7)
        else:  # "left" or "right" of a wall
            sign = -1 if direction == "left" else 1
            ax.plot([x, x + sign * s.dx(0.09)], [y, y - s.dy(0.07)], color=_INK, lw=0.7)


def _zigzag(ax, s, x, y_top, y_bottom):
    n = 7
    ys = np.linspace(y_top, y_bottom, 2 * n + 1)
    xs = np.full_like(ys, x)
    xs[1:-1:2] += s.dx(0.06)
    xs[2:-1:2] -= s.dx(0.06)
    xs[1] = x + s.dx(0.03)
    ax.plot(xs, ys, color=_INK, lw=0.9)


def _coil(ax, s, x, y, outward):
    """A rotational spring: a spiral of 1.6 turns around the end."""
    theta = np.linspace(0.0, 1.6 * 2 * np.pi, 120)
    r = 0.03 + 0.11 * theta / theta[-1]
    ax.plot(x + outward * s.dx(r * np.cos(theta)), y + s.dy(r * np.sin(theta)), color=_INK, lw=0.9)


def _draw_support(ax, s, end, xe, outward, U: Units):
    """Draw one end's restraint with strutscope's own simple symbols; return its label."""
    translation, rotation = end.translation, end.rotation
    label = support_text(end, U, sep="\n")
    if rotation == "fixed":
        if translation == "fixed":
            wall = xe
        else:  # guided: the end plate rides on two rollers against the wall
            wall = xe + outward * s.dx(0.13)
            ax.plot([xe, xe], [-s.dy(0.17), s.dy(0.17)], color=_INK, lw=1.6)
            for yy in (-0.09, 0.09):
                cx = xe + outward * s.dx(0.065)
                t = np.linspace(0, 2 * np.pi, 40)
                ax.plot(cx + s.dx(0.05 * np.cos(t)), s.dy(yy) + s.dy(0.05 * np.sin(t)), color=_INK, lw=0.8)
        ax.plot([wall, wall], [-s.dy(0.24), s.dy(0.24)], color=_INK, lw=1.3)
        _hatch(ax, s, wall, wall, s.dy(0.24), -s.dy(0.24), direction="left" if outward < 0 else "right")
        if not isinstance(translation, str):
            _zigzag(ax, s, xe, 0.0, -s.dy(0.42))
            ax.plot([xe - s.dx(0.1), xe + s.dx(0.1)], [-s.dy(0.42)] * 2, color=_INK, lw=1.0)
            _hatch(ax, s, xe - s.dx(0.1), xe + s.dx(0.1), -s.dy(0.42), -s.dy(0.42), direction="down")
        return label
    if translation == "fixed":
        depth, half = s.dy(0.22), s.dx(0.12)
        ax.add_patch(
            Polygon(
                [[xe, 0.0], [xe - half, -depth], [xe + half, -depth]],
                closed=True,
                fc="white",
                ec=_INK,
                lw=0.9,
                zorder=3,
            )
        )
        ax.plot([xe - 1.5 * half, xe + 1.5 * half], [-depth] * 2, color=_INK, lw=1.0)
        _hatch(ax, s, xe - 1.5 * half, xe + 1.5 * half, -depth, -depth, direction="down")
    elif not isinstance(translation, str):
        _zigzag(ax, s, xe, 0.0, -s.dy(0.42))
        ax.plot([xe - s.dx(0.1), xe + s.dx(0.1)], [-s.dy(0.42)] * 2, color=_INK, lw=1.0)
        _hatch(ax, s, xe - s.dx(0.1), xe + s.dx(0.1), -s.dy(0.42), -s.dy(0.42), direction="down")
    if not isinstance(rotation, str):
        _coil(ax, s, xe, 0.0, outward)
    elif translation != "free":
        t = np.linspace(0, 2 * np.pi, 40)  # the hinge
        ax.fill(xe + s.dx(0.035 * np.cos(t)), s.dy(0.035 * np.sin(t)), fc="white", ec=_INK, lw=0.8, zorder=4)
    return label


def _arrow(ax, x0, y0, x1, y1, *, color=_INK, lw=0.9, head=6):
    ax.annotate(
        "",
        xy=(x1, y1),
        xytext=(x0, y0),
        arrowprops=dict(
            arrowstyle=f"-|>,head_length={head / 10:.2f},head_width={head / 20:.2f}",
            color=color,
            lw=lw,
            shrinkA=0,
            shrinkB=0,
        ),
    )


def _draw_loads(ax, s, result, U: Units, L_si: float):
    case = result.case
    f = U.length.factor
    distributed = [load for load in case.loads if load.type in ("uniform", "linear")]
    q_max = 0.0
    for load in distributed:
        values = (load.q,) if load.type == "uniform" else (load.q_start, load.q_end)
        q_max = max(q_max, *(abs(v) for v in values))
    base, band = 0.10, 0.62  # sketch units; the member is at 0, the point loads reach 1.0
    tier = band / max(len(distributed), 1)
    for i, load in enumerate(distributed):
        a, b = load.span(L_si)
        xs = np.linspace(a, b, 60)
        if load.type == "uniform":
            q = np.full_like(xs, load.q)
        else:
            q = load.q_start + (load.q_end - load.q_start) * (xs - a) / (b - a)
        y0 = base + i * tier
        height = 0.85 * tier * np.abs(q) / q_max if q_max > 0 else np.zeros_like(xs)
        top = y0 + height
        ax.fill_between(xs * f, y0, top, color=_FILL, lw=0, alpha=0.7)
        ax.plot(xs * f, top, color=_INK, lw=0.8)
        count = max(3, int(round(12 * (b - a) / L_si)) + 1)
        for xa in np.linspace(a, b, count):
            qa = np.interp(xa, xs, q)
            ya = y0 + (0.85 * tier * abs(qa) / q_max if q_max > 0 else 0.0)
            if ya - y0 < 0.02:
                continue
            if qa > 0:
                _arrow(ax, xa * f, ya, xa * f, y0, lw=0.6, head=4)
            else:
                _arrow(ax, xa * f, y0, xa * f, ya, lw=0.6, head=4)
        if load.type == "uniform":
            text = f"q = {U.show('line_load', load.q)}"
        else:
            text = f"q = {U.show('line_load', load.q_start)} to {U.show('line_load', load.q_end)}"
        ax.text(
            0.5 * (a + b) * f,
            y0 + 0.85 * tier + 0.02,
            text,
            ha="center",
            va="bottom",
            fontsize=6.5,
            color=_INK,
            parse_math=False,
            bbox=dict(fc="white", ec="none", alpha=0.75, pad=0.3),
        )
    for load in case.loads:
        # Labels near an end lean inward, clear of the axial-force label beyond the end.
        where = load.x / L_si if load.type in ("point", "couple") else 0.5
        ha = "left" if where < 0.12 else ("right" if where > 0.88 else "center")
        if load.type == "point":
            xp = load.x * f
            if load.P >= 0:
                _arrow(ax, xp, 0.95, xp, 0.02, lw=1.2, head=7)
            else:
                _arrow(ax, xp, 0.02, xp, 0.95, lw=1.2, head=7)
            xt = xp + {"left": -s.dx(0.05), "right": s.dx(0.05), "center": 0.0}[ha]
            ax.text(
                xt,
                0.98,
                f"F = {U.show('force', load.P)}",
                ha=ha,
                va="bottom",
                fontsize=6.5,
                color=_INK,
                parse_math=False,
            )
        elif load.type == "couple":
            xc = load.x * f
            # A positive couple makes M jump up by C (conventions.md); with + load drawn downward that is a
            # clockwise couple in this sketch.
            clockwise = load.C >= 0
            if clockwise:
                theta = np.linspace(np.radians(160), np.radians(-110), 80)
            else:
                theta = np.linspace(np.radians(20), np.radians(290), 80)
            r = 0.16
            xs = xc + s.dx(r * np.cos(theta))
            ys = s.dy(r * np.sin(theta))
            ax.plot(xs[:-1], ys[:-1], color=_INK, lw=1.1)
            _arrow(ax, xs[-4], ys[-4], xs[-1], ys[-1], lw=1.1, head=6)
            ax.text(
                xc,
                s.dy(r) + 0.04,
                f"C = {U.show('moment', load.C)}",
                ha=ha,
                va="bottom",
                fontsize=6.5,
                color=_INK,
                parse_math=False,
            )


def _draw_sketch(ax, result, U: Units):
    """The member to scale along x: supports, loads, the axial force and the initial bow (exaggerated)."""
    case = result.case
    L_si = float(case.length)
    L = U.length.from_si(L_si)
    ax.set_ylim(-1.25, 1.3)
    ax.axis("off")
    s = _Scale(ax)
    ax.plot([0, L], [0, 0], color=_INK, lw=2.6, solid_capstyle="butt", zorder=2)

    left_label = _draw_support(ax, s, case.left, 0.0, -1, U)
    right_label = _draw_support(ax, s, case.right, L, +1, U)
    for xe, label, ha in ((0.0, left_label, "left"), (L, right_label, "right")):
        ax.text(xe, -s.dy(0.50), label, ha=ha, va="top", fontsize=6.5, color=_INK, parse_math=False)

    _draw_loads(ax, s, result, U, L_si)

    P = float(result.axial_force)
    if P != 0:
        walls = case.left.rotation == "fixed", case.right.rotation == "fixed"
        gap = (0.36 if walls[0] else 0.12), (0.36 if walls[1] else 0.12)
        length = 0.42
        ends = [(0.0, -1, gap[0]), (L, +1, gap[1])]
        if walls[0] != walls[1]:
            # The wall takes the axial force itself: draw it at the other end only.
            ends = [ends[1]] if walls[0] else [ends[0]]
        for xe, outward, g in ends:
            near, far = xe + outward * s.dx(g), xe + outward * s.dx(g + length)
            if P > 0:
                _arrow(ax, far, 0.0, near, 0.0, lw=1.6, head=8)
            else:
                _arrow(ax, near, 0.0, far, 0.0, lw=1.6, head=8)
        label_x = L + s.dx(gap[1]) if (L, +1, gap[1]) in ends else -s.dx(gap[0] + length)
        sense = "compression" if P > 0 else "tension"
        ax.text(
            label_x,
            s.dy(0.09),
            f"P = {U.show('force', abs(P), 5)}\n{sense}",
            ha="left",
            va="bottom",
            fontsize=6.8,
            color=_INK,
            parse_math=False,
            linespacing=1.1,
        )

    if has_bow(result):
        bow = np.asarray(result.initial_bow, dtype=float)
        largest = float(np.max(np.abs(bow)))
        scale = 0.38 / largest
        x = U.length.from_si(np.asarray(result.x, dtype=float))
        ax.plot(x, -bow * scale, color=_ACCENT, lw=1.0, ls=(0, (5, 3)), zorder=1)
        i = int(np.argmax(np.abs(bow)))
        where = x[i] / L if L > 0 else 0.5
        ha = "left" if where < 0.3 else ("right" if where > 0.7 else "center")
        xt = x[i] + (s.dx(0.35) if ha == "left" else (-s.dx(0.35) if ha == "right" else 0.0))
        ax.text(
            xt,
            -bow[i] * scale - np.sign(bow[i]) * 0.05,
            f"initial bow w0, largest {U.show('small_length', largest)} (drawn exaggerated)",
            ha=ha,
            va="top" if bow[i] > 0 else "bottom",
            fontsize=6.5,
            color=_ACCENT,
            parse_math=False,
        )

    if result.status != "stable":
        ax.text(
            ax.get_xlim()[1],
            1.28,
            f"{result.status}: P at or above Pcr1, a state the member never reaches",
            ha="right",
            va="top",
            fontsize=7,
            color=_DANGER,
            fontweight="bold",
            parse_math=False,
        )

    # Dimension line: the sketch is to scale along the member.
    y_dim = -1.05
    ax.plot([0, L], [y_dim, y_dim], color=_GREY, lw=0.6)
    for xe in (0.0, L):
        ax.plot([xe, xe], [y_dim - 0.06, y_dim + 0.06], color=_GREY, lw=0.6)
    ax.text(
        L / 2,
        y_dim + 0.03,
        f"L = {U.show('length', L_si)}",
        ha="center",
        va="bottom",
        fontsize=6.8,
        color=_GREY,
        parse_math=False,
    )
    ax.text(
        ax.get_xlim()[0],
        1.28,
        "Member (to scale along x; + load and + w point down here)",
        ha="left",
        va="top",
        fontsize=7,
        color=_GREY,
        parse_math=False,
    )
