"""The member sketch as renderer-neutral shapes, and the sign conventions every figure draws with.

:func:`sketch` turns a solved case into a :class:`Sketch`: lines, polygons, arrows and texts, each with a
``role`` (what it shows, which fixes its style) and coordinates that any renderer can place. The PNG and
PDF draw it with matplotlib (:mod:`app.exports.sketch_draw`); the page can draw the same shapes with Bokeh,
so both show the same supports, loads and labels.

Coordinates. A point is ``(x, y)`` plus an offset ``(dx, dy)`` in inches on the page:

- ``x`` is the position along the member in the display length unit (0 at the left end, L at the right);
- ``y`` is in sketch units: the member's axis is 0, the loads rise to about 1.0, the support labels and the
  dimension line go down to about -1.2 (:data:`Y_RANGE`); loads and + w point down, so "up" is -w;
- ``dx``, ``dy`` [in] are fixed-size offsets (support symbols, arrow heads, label gaps), which a renderer
  converts with its own scale: data units per inch of its frame in x and in y.

Texts whose ``x`` is :data:`FRAME_LEFT` or :data:`FRAME_RIGHT` sit at the frame's edge instead. A renderer
gives the member :data:`PAD_INCHES` of room beyond each end for the supports and the axial-force arrows.

Drawing it with Bokeh (the page): set ``y_range`` to :data:`Y_RANGE` and ``x_range`` to the member plus
:data:`PAD_INCHES` each side; with the frame's inner width and height in pixels and 96 px to the inch, the
scales are ``sx = (x_end - x_start) / (inner_width / 96)`` and
``sy = (y_end - y_start) / (inner_height / 96)`` data units per inch, and a point is
``(x + dx·sx, y + dy·sy)``. Draw a :class:`Polyline` as ``multi_line``
(dashed when ``dashed``), a :class:`Polygon` as ``patches`` (white for ``hinge``, grey for ``load-fill``), an
:class:`Arrow` as an ``Arrow`` annotation with a ``NormalHead`` of ``head_size`` pt, a :class:`Text` as a
``text`` glyph (or ``Label``) with its ``ha``/``va`` as ``text_align``/``text_baseline``. Redraw when the
frame's size changes. The diagrams flip their y axis when :data:`MOMENT_POSITIVE_DOWN` says so (M) and always
for w.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from app.report import has_bow, support_text
from app.report.restraints import step_section_name
from app.units import Units

__all__ = [
    "FRAME_LEFT",
    "FRAME_RIGHT",
    "MOMENT_POSITIVE_DOWN",
    "PAD_INCHES",
    "ROLES",
    "Y_RANGE",
    "Arrow",
    "Polygon",
    "Polyline",
    "Sketch",
    "Text",
    "sketch",
]

#: Bending moments are drawn positive downward in every figure (the page, the PNG and the PDF): on the side
#: of the fibre they stretch when + w and positive loads point down, as the deflection is drawn, so that a
#: sagging member's M diagram hangs below the axis like its deflected shape (common practice, no source).
MOMENT_POSITIVE_DOWN = True

#: The sketch's vertical extent in sketch units (bottom, top).
Y_RANGE = (-1.25, 1.3)

#: Room beyond each end of the member for the supports and the axial-force arrows [in].
PAD_INCHES = 0.8

#: ``x`` of a text placed at the left or right edge of the frame.
FRAME_LEFT, FRAME_RIGHT = float("-inf"), float("inf")

#: Every role a shape can have, and what it shows.
ROLES = {
    "member": "the member's axis",
    "support": "a support's outline (wall, plate, triangle, ground line)",
    "hatch": "hatching behind a wall or the ground",
    "hinge": "a hinge or a roller (white filled)",
    "spring": "a translational (zigzag) or rotational (spiral) spring",
    "load": "a load arrow or a distributed load's outline",
    "load-fill": "the area of a distributed load",
    "axial": "the axial-force arrows and their label (they change with N)",
    "bow": "the initial bow, exaggerated (dashed)",
    "dimension": "the dimension line",
    "label": "a text",
    "load-label": "a distributed load's value (on a white ground, over the load)",
    "bow-label": "the initial bow's text",
    "note": "a grey explanatory text",
    "danger": "a text about an unstable state",
}


@dataclass(frozen=True)
class Polyline:
    """An open line through points; ``x``, ``y``, ``dx``, ``dy`` as the module says, one entry a point."""

    role: str
    x: tuple
    y: tuple
    dx: tuple
    dy: tuple
    width: float = 0.9  # [pt]
    dashed: bool = False


@dataclass(frozen=True)
class Polygon(Polyline):
    """A closed, filled outline (the renderer's fill for the role: white for a hinge, grey for a load)."""


@dataclass(frozen=True)
class Arrow:
    """A straight arrow from the tail to the head, each ``(x, y, dx, dy)``; ``head`` its head length [pt]."""

    role: str
    tail: tuple
    head: tuple
    width: float = 0.9
    head_size: float = 6.0


@dataclass(frozen=True)
class Text:
    """A text at ``(x, y, dx, dy)``; ``ha`` left, center or right, ``va`` top, bottom or center; size [pt]."""

    role: str
    text: str
    at: tuple
    ha: str = "left"
    va: str = "bottom"
    size: float = 6.5
    bold: bool = False


@dataclass(frozen=True)
class Sketch:
    """The shapes of one member's sketch, in drawing order, and the member length [display length unit]."""

    length: float
    shapes: tuple


def _line(role, x, y, dx=0.0, dy=0.0, **style) -> Polyline:
    x, y, dx, dy = np.broadcast_arrays(*(np.asarray(v, dtype=float) for v in (x, y, dx, dy)))
    return Polyline(role, tuple(x), tuple(y), tuple(dx), tuple(dy), **style)


def _polygon(role, x, y, dx=0.0, dy=0.0, **style) -> Polygon:
    x, y, dx, dy = np.broadcast_arrays(*(np.asarray(v, dtype=float) for v in (x, y, dx, dy)))
    return Polygon(role, tuple(x), tuple(y), tuple(dx), tuple(dy), **style)


def _pt(x, y=0.0, dx=0.0, dy=0.0) -> tuple:
    return (float(x), float(y), float(dx), float(dy))


def _hatch(out, x0, x1, dx0, dx1, dy0, dy1, *, direction) -> None:
    """Short diagonal ticks behind a ground or wall line from (x0 + dx0, dy0) to (x1 + dx1, dy1)."""
    for t in np.linspace(0.0, 1.0, 6):
        x, dx, dy = x0 + t * (x1 - x0), dx0 + t * (dx1 - dx0), dy0 + t * (dy1 - dy0)
        if direction == "down":
            out.append(_line("hatch", [x, x], 0.0, [dx, dx - 0.07], [dy, dy - 0.09], width=0.7))
        else:  # "left" or "right" of a wall
            sign = -1 if direction == "left" else 1
            out.append(_line("hatch", [x, x], 0.0, [dx, dx + sign * 0.09], [dy, dy - 0.07], width=0.7))


def _zigzag(out, x) -> None:
    n = 7
    dy = np.linspace(0.0, -0.42, 2 * n + 1)
    dx = np.zeros_like(dy)
    dx[1:-1:2] += 0.06
    dx[2:-1:2] -= 0.06
    dx[1] = 0.03
    out.append(_line("spring", x, 0.0, dx, dy))


def _ground_under_spring(out, x) -> None:
    out.append(_line("support", [x, x], 0.0, [-0.1, 0.1], -0.42, width=1.0))
    _hatch(out, x, x, -0.1, 0.1, -0.42, -0.42, direction="down")


def _circle(role, x, cx, cy, r) -> Polygon:
    t = np.linspace(0, 2 * np.pi, 40)
    return _polygon(role, x, 0.0, cx + r * np.cos(t), cy + r * np.sin(t), width=0.8)


def _spiral(out, x, turn, **style) -> None:
    theta = np.linspace(0.0, 1.6 * 2 * np.pi, 120)  # a spiral of 1.6 turns around the point
    r = 0.03 + 0.11 * theta / theta[-1]
    out.append(_line("spring", x, 0.0, turn * r * np.cos(theta), r * np.sin(theta), **style))


def _support(out, end, xe, outward, U: Units) -> str:
    """One end's restraint with strutscope's own simple symbols; returns its label."""
    translation, rotation = end.translation, end.rotation
    label = support_text(end, U, sep="\n")
    if rotation == "fixed":
        wall = 0.0
        if translation != "fixed":  # guided: the end plate rides on two rollers against the wall
            wall = outward * 0.13
            out.append(_line("support", [xe, xe], 0.0, 0.0, [-0.17, 0.17], width=1.6))
            for cy in (-0.09, 0.09):
                out.append(_circle("hinge", xe, outward * 0.065, cy, 0.05))
        out.append(_line("support", [xe, xe], 0.0, wall, [-0.24, 0.24], width=1.3))
        _hatch(out, xe, xe, wall, wall, 0.24, -0.24, direction="left" if outward < 0 else "right")
        if not isinstance(translation, str):
            _zigzag(out, xe)
            _ground_under_spring(out, xe)
        return label
    if translation == "fixed":
        depth, half = 0.22, 0.12
        out.append(_polygon("hinge", xe, 0.0, [0.0, -half, half], [0.0, -depth, -depth]))
        out.append(_line("support", [xe, xe], 0.0, [-1.5 * half, 1.5 * half], -depth, width=1.0))
        _hatch(out, xe, xe, -1.5 * half, 1.5 * half, -depth, -depth, direction="down")
    elif not isinstance(translation, str):
        _zigzag(out, xe)
        _ground_under_spring(out, xe)
    if not isinstance(rotation, str):
        _spiral(out, xe, outward)
    elif translation != "free":
        out.append(_circle("hinge", xe, 0.0, 0.0, 0.035))
    return label


def _member(out, result, L_si: float, f: float) -> None:
    """The member's axis; with steps in EI, one line per stretch, its weight growing with the cube root of its
    EI against the member's own (a change of line weight marks each step)."""
    steps = sorted(getattr(result.case, "steps", ()), key=lambda step: step.x)
    if not steps:
        out.append(_line("member", [0.0, L_si * f], 0.0, width=2.6))
        return
    own = float(getattr(result.case, "EI", None) or result.EI)
    cuts = [0.0, *(step.x for step in steps), L_si]
    stiffness = [own, *(step.EI for step in steps)]
    for a, b, EI in zip(cuts[:-1], cuts[1:], stiffness, strict=True):
        # A step by section carries no EI in the case: its line keeps the member's weight.
        ratio = EI / own if EI is not None and own > 0 and math.isfinite(EI / own) else 1.0
        out.append(
            _line("member", [a * f, b * f], 0.0, width=float(np.clip(2.6 * ratio ** (1 / 3), 1.0, 6.0)))
        )


def _twist_label(twist) -> str:
    """What a restraint's name adds for its twist (read by the lateral-torsional buckling check only)."""
    if twist == "free":
        return ""
    return " φ held" if twist == "fixed" else " k_φ"


def _inner(out, result, U: Units, L_si: float) -> None:
    """Restraints, steps and foundation ranges inside the member (engine issue 16), with symbols of their own:
    a brace (a post on a foot) where translation is fixed, a zigzag spring on the ground where it is elastic,
    a collar of two bars where rotation is fixed, a spiral where it is elastic, a white circle for a hinge, a
    hatched band under the member for a foundation and a tick with the new EI at a step. A restraint of the
    second plane only is drawn dashed and named so; one holding the twist says "φ held" (or "k_φ", a
    torsional spring) after its name."""
    case, f = result.case, U.length.factor
    for start, end, k, plane in ((r.start, r.end, r.k, r.plane) for r in getattr(case, "foundation", ())):
        a, b = start * f, end * f
        dashed = plane == "second"
        for dy in (-0.13, -0.21):  # the band's edges, hatched between
            out.append(_line("support", [a, b], 0.0, 0.0, dy, width=0.8, dashed=dashed))
        for x in (a, b):
            out.append(_line("support", [x, x], 0.0, 0.0, [-0.04, -0.21], width=1.0))
        count = max(2, int(round(24 * (end - start) / L_si)))
        for x in np.linspace(a, b, count + 1)[:-1]:
            out.append(_line("hatch", [x, x], 0.0, [0.0, 0.06], [-0.13, -0.21], width=0.7))
        said = f"foundation k = {U.show('foundation_modulus', k)}" + (" (2nd plane)" if dashed else "")
        out.append(Text("note", said, _pt(a, 0.0, 0.06, -0.23), va="top", size=6.0))
    for index, r in enumerate(getattr(case, "restraints", ())):
        x = r.x * f
        style = {"dashed": True} if r.plane == "second" else {}
        if r.translation == "fixed":
            out.append(
                _polygon("support", x, 0.0, [-0.025, 0.025, 0.025, -0.025], [0, 0, -0.2, -0.2], **style)
            )
            out.append(_line("support", [x, x], 0.0, [-0.1, 0.1], -0.2, width=1.0))
            _hatch(out, x, x, -0.1, 0.1, -0.2, -0.2, direction="down")
        elif not isinstance(r.translation, str):
            _zigzag(out, x)
            _ground_under_spring(out, x)
        if r.rotation == "fixed":
            for side in (-0.05, 0.05):
                out.append(_line("support", [x, x], 0.0, side, [-0.12, 0.12], width=1.6, **style))
        elif not isinstance(r.rotation, str):
            _spiral(out, x, 1.0, **style)
        if r.hinge:
            out.append(_circle("hinge", x, 0.0, 0.0, 0.045))
        label = f"R{index + 1}" + (" 2nd plane" if r.plane == "second" else "") + _twist_label(r.twist)
        out.append(Text("label", label, _pt(x, 0.0, 0.05, 0.06), size=6.0))
    own = float(getattr(case, "EI", None) or result.EI)
    for step in getattr(case, "steps", ()):
        x = step.x * f
        out.append(_line("support", [x, x], 0.0, 0.0, [-0.1, 0.1], width=0.8))
        if step.EI is None:  # a step by section: named by its section
            said = step_section_name(step)
        else:
            said = f"EI {U.show('stiffness', step.EI)}"
            if own > 0:
                said += f" ({step.EI / own:.3g}×)"
        out.append(Text("note", said, _pt(x, 0.0, 0.03, -0.24), va="top", size=6.0))


def _distributed(out, result, U: Units, L_si: float) -> None:
    case, f = result.case, U.length.factor
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
        outline = np.r_[top, np.full_like(xs, y0)]
        out.append(_polygon("load-fill", np.r_[xs, xs[::-1]] * f, outline, width=0.0))
        out.append(_line("load", xs * f, top, width=0.8))
        count = max(3, int(round(12 * (b - a) / L_si)) + 1)
        for xa in np.linspace(a, b, count):
            qa = float(np.interp(xa, xs, q))
            ya = y0 + (0.85 * tier * abs(qa) / q_max if q_max > 0 else 0.0)
            if ya - y0 < 0.02:
                continue
            ends = (_pt(xa * f, ya), _pt(xa * f, y0))
            out.append(Arrow("load", *(ends if qa > 0 else ends[::-1]), width=0.6, head_size=4.0))
        if load.type == "uniform":
            text = f"q = {U.show('line_load', load.q)}"
        else:
            text = f"q = {U.show('line_load', load.q_start)} to {U.show('line_load', load.q_end)}"
        out.append(Text("load-label", text, _pt(0.5 * (a + b) * f, y0 + 0.85 * tier + 0.02), ha="center"))


def _concentrated(out, result, U: Units, L_si: float) -> None:
    f = U.length.factor
    for load in result.case.loads:
        if load.type not in ("point", "couple"):
            continue
        # Labels near an end lean inward, clear of the axial-force label beyond the end.
        where = load.x / L_si
        ha = "left" if where < 0.12 else ("right" if where > 0.88 else "center")
        x = load.x * f
        if load.type == "point":
            ends = (_pt(x, 0.95), _pt(x, 0.02))
            out.append(Arrow("load", *(ends if load.P >= 0 else ends[::-1]), width=1.2, head_size=7.0))
            gap = {"left": -0.05, "right": 0.05, "center": 0.0}[ha]
            out.append(Text("label", f"F = {U.show('force', load.P)}", _pt(x, 0.98, gap), ha=ha))
        else:
            # A positive couple makes M jump up by C (DEVELOPERS.md); with + load drawn downward that is a
            # clockwise couple in this sketch.
            if load.C >= 0:
                theta = np.linspace(np.radians(160), np.radians(-110), 80)
            else:
                theta = np.linspace(np.radians(20), np.radians(290), 80)
            r = 0.16
            dx, dy = r * np.cos(theta), r * np.sin(theta)
            out.append(_line("load", x, 0.0, dx[:-1], dy[:-1], width=1.1))
            out.append(Arrow("load", _pt(x, 0, dx[-4], dy[-4]), _pt(x, 0, dx[-1], dy[-1]), width=1.1))
            out.append(Text("label", f"C = {U.show('moment', load.C)}", _pt(x, 0.04, 0.0, r), ha=ha))


def _axial(out, result, U: Units, L: float) -> None:
    case, N = result.case, float(result.axial_force)
    if N == 0:
        return
    walls = case.left.rotation == "fixed", case.right.rotation == "fixed"
    gap = (0.36 if walls[0] else 0.12), (0.36 if walls[1] else 0.12)
    length = 0.42
    ends = [(0.0, -1, gap[0]), (L, +1, gap[1])]
    if walls[0] != walls[1]:
        # The wall takes the axial force itself: draw it at the other end only.
        ends = [ends[1]] if walls[0] else [ends[0]]
    for xe, outward, g in ends:
        near, far = _pt(xe, 0.0, outward * g), _pt(xe, 0.0, outward * (g + length))
        out.append(Arrow("axial", *((far, near) if N > 0 else (near, far)), width=1.6, head_size=8.0))
    at = _pt(L, 0.0, gap[1], 0.09) if (L, +1, gap[1]) in ends else _pt(0.0, 0.0, -(gap[0] + length), 0.09)
    sense = "compression" if N > 0 else "tension"
    out.append(Text("axial", f"N = {U.show('force', abs(N), 5)}\n{sense}", at, size=6.8))


def _bow(out, result, U: Units, L: float) -> None:
    if not has_bow(result):
        return
    bow = np.asarray(result.initial_bow, dtype=float)
    largest = float(np.max(np.abs(bow)))
    if not (math.isfinite(largest) and largest > 0.0):
        return  # nothing drawable (a bow of 1e-300 m overflows 0.38/largest; the values say what it is)
    x = U.length.from_si(np.asarray(result.x, dtype=float))
    out.append(_line("bow", x, -(bow / largest) * 0.38, width=1.0, dashed=True))
    i = int(np.argmax(np.abs(bow)))
    where = x[i] / L if L > 0 else 0.5
    ha = "left" if where < 0.3 else ("right" if where > 0.7 else "center")
    dx = 0.35 if ha == "left" else (-0.35 if ha == "right" else 0.0)
    text = f"initial bow w0, largest {U.show('small_length', largest)} (drawn exaggerated)"
    at = _pt(x[i], -(bow[i] / largest) * 0.38 - np.sign(bow[i]) * 0.05, dx)
    out.append(Text("bow-label", text, at, ha=ha, va="top" if bow[i] > 0 else "bottom"))


def sketch(result, U: Units) -> Sketch:
    """The member to scale along x: supports, restraints, steps and foundation inside it, loads, the axial
    force N, the initial bow (exaggerated), the dimension line and the notes, as shapes in drawing order."""
    case = result.case
    L_si = float(case.length)
    L = U.length.from_si(L_si)
    out: list = []
    _member(out, result, L_si, U.length.factor)
    _inner(out, result, U, L_si)
    labels = (_support(out, case.left, 0.0, -1, U), _support(out, case.right, L, +1, U))
    for xe, label, ha in ((0.0, labels[0], "left"), (L, labels[1], "right")):
        out.append(Text("label", label, _pt(xe, 0.0, 0.0, -0.50), ha=ha, va="top"))
    _distributed(out, result, U, L_si)
    _concentrated(out, result, U, L_si)
    _axial(out, result, U, L)
    _bow(out, result, U, L)
    if result.status != "stable":
        text = f"{result.status}: N at or above Pcr1, a state the member never reaches"
        out.append(Text("danger", text, _pt(FRAME_RIGHT, 1.28), ha="right", va="top", size=7.0, bold=True))
    y_dim = -1.05  # the dimension line: the sketch is to scale along the member
    out.append(_line("dimension", [0.0, L], y_dim, width=0.6))
    for xe in (0.0, L):
        out.append(_line("dimension", [xe, xe], [y_dim - 0.06, y_dim + 0.06], width=0.6))
    out.append(Text("note", f"L = {U.show('length', L_si)}", _pt(L / 2, y_dim + 0.03), ha="center", size=6.8))
    note = "Member (to scale along x; + load and + w point down here)"
    out.append(Text("note", note, _pt(FRAME_LEFT, 1.28), va="top", size=7.0))
    return Sketch(length=L, shapes=tuple(out))
