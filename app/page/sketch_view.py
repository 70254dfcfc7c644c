"""The member sketch on the page: the shapes of :func:`app.sketch.sketch`, drawn with Bokeh.

The PNG and the calc sheet draw the same shapes with matplotlib (:mod:`app.exports.sketch_draw`), so the
page and the exports show the same supports, loads, axial force, bow and labels. This module only renders:
each shape becomes a row of one of a few sources (lines, patches, arrows, texts), and each role a colour of
:mod:`app.page.style`. It does no geometry of its own.

Scale. The figure shares the diagrams' x range, so the member lines up above its diagrams; the range keeps
at least :data:`app.sketch.PAD_INCHES` beyond each end for the supports and the axial-force arrows. The y
range is :data:`app.sketch.Y_RANGE` with a strip above it for the texts at the frame's edge. A shape's
fixed-size offsets (``dx``, ``dy``, in inches on paper) become data units with the frame's inner size in
pixels, which the browser reports (before the first report the nominal size is assumed), at
:data:`SKETCH_INCH` pixels to the inch; the view redraws when the size changes.

The axial-force arrows, their label and the danger note (roles ``axial`` and ``danger``) change with N:
:meth:`SketchView.draw_force` rewrites only their small sources on each step of the slider.
"""

from __future__ import annotations

import math

import numpy as np
import param
from bokeh.core.property.descriptors import UnsetValueError
from bokeh.models import Arrow as ArrowAnnotation
from bokeh.models import ColumnDataSource, LabelSet, NormalHead, Range1d
from bokeh.plotting import figure

from app.page.style import BOW, LOAD, MEMBER, lean_figure
from app.sketch import FRAME_LEFT, PAD_INCHES, Y_RANGE, Arrow, Polygon, Polyline, Text, sketch
from app.state import MemberState
from app.state_actions import view_result
from app.units import units

__all__ = ["SKETCH_INCH", "SketchView"]

#: Screen pixels to the inch (CSS), and to the point: line widths and arrow heads keep their size.
PX_PER_INCH = 96.0
PX_PER_PT = PX_PER_INCH / 72.0
#: Screen pixels to the sketch's inch (its fixed-size offsets): the page draws supports, gaps and the axial
#: arrows at three quarters of their size on paper, so that the sketch fits a strip little taller than an
#: inch and the diagrams keep their room at 1280 × 720.
SKETCH_INCH = 72.0
#: Texts are set this much larger than their size in points: the exports' 6.5 pt would be 8.7 px here, too
#: small to read on a screen across a meeting room; 1.15 times makes it 10 px (the note 10.7 px).
TEXT_SCALE = 1.15

#: Colour of each role (the rest in MEMBER); hinges are filled white, load areas light grey.
COLOURS = {
    "load": LOAD,
    "load-fill": LOAD,
    "load-label": LOAD,
    "bow": BOW,
    "bow-label": BOW,
    "dimension": "#5b6670",
    "note": "#5b6670",
    "danger": "#a3261b",
}
FILLS = {"hinge": "#ffffff", "load-fill": "#e6e6e6"}
#: The roles that change with N (drawn by :meth:`SketchView.draw_force`).
FORCE_ROLES = ("axial", "danger")

#: The figure's height [px]: about the least that holds a spring's zigzag and the support labels under the
#: axis (half a sketch inch and a line of text), with the loads and the note strip above it.
HEIGHT = 120
#: Sketch units added above :data:`app.sketch.Y_RANGE`: a strip for the texts at the frame's edge (the note,
#: or the danger note in its place), which the page's larger type would otherwise lay over the load labels.
NOTE_ROOM = 0.3
Y_SPAN = (Y_RANGE[0], Y_RANGE[1] + NOTE_ROOM)
#: Average width of a character, in font sizes, to keep a text inside the frame (Helvetica-like faces).
CHAR_WIDTH = 0.56
#: Lines of a text, in font sizes apart (the labels' ``text_line_height``).
LINE_HEIGHT = 1.1
#: The room a text moved clear of another keeps from it [px] (texts that do not overlap stay where they are).
TEXT_GAP = 2.0
BORDERS = {"left": 62, "right": 14, "top": 2, "bottom": 2}


def _columns(*names) -> dict:
    return {name: [] for name in names}


LINE_COLUMNS = ("xs", "ys", "color", "width", "dash", "role")
PATCH_COLUMNS = ("xs", "ys", "fill", "color", "width", "alpha", "role")
ARROW_COLUMNS = ("x0", "y0", "x1", "y1", "color", "width", "head", "role")
TEXT_COLUMNS = ("x", "y", "text", "align", "baseline", "size", "color", "style", "ground", "role")


def _reported(fig, name: str):
    """A size the browser reports (None until it has)."""
    try:
        return getattr(fig, name)
    except UnsetValueError:
        return None


#: How the arrow and text sources' columns drive their Bokeh annotations.
ARROW_FIELDS = dict(
    x_start="x0", y_start="y0", x_end="x1", y_end="y1", line_color="color", line_width="width"
)
TEXT_FIELDS = dict(
    x="x",
    y="y",
    text="text",
    text_align="align",
    text_baseline="baseline",
    text_font_size="size",
    text_color="color",
    text_font_style="style",
    text_line_height=LINE_HEIGHT,
    background_fill_color="ground",
    background_fill_alpha=0.8,
)


class _Scale:
    """Data units per inch of the frame in x and y; texts at the frame's edge in screen pixels."""

    def __init__(self, x_range: Range1d, inner_width: float, inner_height: float, bottom: float) -> None:
        self.x = (x_range.end - x_range.start) / max(inner_width / SKETCH_INCH, 1e-6)
        self.y = (Y_SPAN[1] - bottom) / max(inner_height / SKETCH_INCH, 1e-6)
        self.width, self.start = inner_width, x_range.start
        self.height, self.bottom = inner_height, bottom

    def xs(self, x, dx) -> list:
        return np.atleast_1d(np.asarray(x, dtype=float) + np.asarray(dx, dtype=float) * self.x).tolist()

    def ys(self, y, dy) -> list:
        return np.atleast_1d(np.asarray(y, dtype=float) + np.asarray(dy, dtype=float) * self.y).tolist()


def _inside(s: _Scale, x: float, align: str, width: float) -> float:
    """`x` moved along so that a text `width` px wide, aligned there, stays inside the frame: the page's
    frame is narrower than the exports' and its type larger, so the axial-force label would be clipped."""
    px = (x - s.start) / s.x * SKETCH_INCH
    left = px - {"left": 0.0, "center": width / 2, "right": width}[align]
    shift = max(0.0, -left) - max(0.0, left + width - s.width)
    return x + shift / SKETCH_INCH * s.x if shift else x


def _text_size(shape: Text) -> float:
    """A text's font size on the page [px]."""
    return shape.size * PX_PER_PT * TEXT_SCALE


def _bottom(shapes, inner_height: float) -> float:
    """The y range's lower end: :data:`app.sketch.Y_RANGE`'s, or lower so that the lowest text (a support's
    two-line label under a spring) stays inside the frame; the sketch then gets a little flatter."""
    bottom = Y_RANGE[0]
    texts = [t for t in shapes if isinstance(t, Text) and not math.isinf(t.at[0])]
    for _ in range(4):  # a fixed point: the scale depends on the range
        sy = (Y_SPAN[1] - bottom) / max(inner_height / SKETCH_INCH, 1e-6)
        lowest = Y_RANGE[0]
        for t in texts:
            lines = t.text.count("\n") + 1
            below = {"top": lines, "center": lines / 2}.get(t.va, 0.0) * 1.15 * _text_size(t) + 2
            lowest = min(lowest, t.at[1] + (t.at[3] - below / SKETCH_INCH) * sy)
        bottom = min(Y_RANGE[0], lowest)
    return bottom


def _render(shapes, s: _Scale) -> dict:
    """The sources' data for `shapes`: ``lines``, ``patches``, ``arrows``, ``text`` (x in data units) and
    ``frame_text`` (x in screen pixels from the frame's left edge)."""
    out = {
        "lines": _columns(*LINE_COLUMNS),
        "patches": _columns(*PATCH_COLUMNS),
        "arrows": _columns(*ARROW_COLUMNS),
        "text": _columns(*TEXT_COLUMNS),
        "frame_text": _columns(*TEXT_COLUMNS),
    }

    def add(name, **row):
        for key, value in row.items():
            out[name][key].append(value)

    for shape in shapes:
        colour = COLOURS.get(shape.role, MEMBER)
        if isinstance(shape, Polygon):
            add(
                "patches",
                xs=s.xs(shape.x, shape.dx),
                ys=s.ys(shape.y, shape.dy),
                fill=FILLS.get(shape.role, "#ffffff"),
                color=colour if shape.width > 0 else None,
                width=shape.width * PX_PER_PT,
                alpha=0.7 if shape.role == "load-fill" else 1.0,
                role=shape.role,
            )
        elif isinstance(shape, Polyline):
            add(
                "lines",
                xs=s.xs(shape.x, shape.dx),
                ys=s.ys(shape.y, shape.dy),
                color=colour,
                width=shape.width * PX_PER_PT,
                dash="dashed" if shape.dashed else "solid",
                role=shape.role,
            )
        elif isinstance(shape, Arrow):
            (x0,), (y0,) = s.xs(shape.tail[0], shape.tail[2]), s.ys(shape.tail[1], shape.tail[3])
            (x1,), (y1,) = s.xs(shape.head[0], shape.head[2]), s.ys(shape.head[1], shape.head[3])
            add(
                "arrows",
                x0=x0,
                y0=y0,
                x1=x1,
                y1=y1,
                color=colour,
                width=shape.width * PX_PER_PT,
                head=shape.head_size * PX_PER_PT,
                role=shape.role,
            )
        elif isinstance(shape, Text):
            x, y, dx, dy = shape.at
            size = _text_size(shape)
            if math.isinf(x):  # at the frame's edge, whatever the x range shows, in the note strip
                target, x, y = (
                    "frame_text",
                    (0.0 if x == FRAME_LEFT else s.width) + dx * SKETCH_INCH,
                    y + NOTE_ROOM,
                )
            else:
                target, x = "text", s.xs(x, dx)[0]
                x = _inside(s, x, shape.ha, size * CHAR_WIDTH * max(map(len, shape.text.split("\n"))))
            add(
                target,
                x=x,
                y=s.ys(y, dy)[0],
                text=shape.text,
                align=shape.ha,
                baseline="middle" if shape.va == "center" else shape.va,
                size=f"{size:.1f}px",
                color=colour,
                style="bold" if shape.bold else "normal",
                # A white ground where a line may pass behind (the dimension line, the load's end).
                ground="#ffffff" if shape.role in ("load-label", "axial", "label") else None,
                role=shape.role,
            )
    return out


def _box(row: dict, i: int, s: _Scale, screen_x: bool = False) -> tuple[float, float, float, float]:
    """The box (left, bottom, right, top) [px from the frame's lower left corner] of text `i` of a text
    source's `row` columns, as wide as :data:`CHAR_WIDTH` says and its lines :data:`LINE_HEIGHT` apart."""
    lines = row["text"][i].split("\n")
    size = float(row["size"][i].removesuffix("px"))
    width = size * CHAR_WIDTH * (1.08 if row["style"][i] == "bold" else 1.0) * max(map(len, lines))
    height = size * LINE_HEIGHT * len(lines)
    x = row["x"][i] if screen_x else (row["x"][i] - s.start) / s.x * SKETCH_INCH
    y = (row["y"][i] - s.bottom) / s.y * SKETCH_INCH
    left = x - {"left": 0.0, "center": width / 2, "right": width}[row["align"][i]]
    bottom = y - {"bottom": 0.0, "middle": height / 2, "top": height}[row["baseline"][i]]
    return left, bottom, left + width, bottom + height


def _overlaps(box, other) -> bool:
    """Whether two boxes (left, bottom, right, top) share more than a sliver (half a pixel) each way."""
    return (
        box[0] < other[2] - 0.5
        and other[0] < box[2] - 0.5
        and box[1] < other[3] - 0.5
        and other[1] < box[3] - 0.5
    )


def _apart(texts: dict, fixed: list, s: _Scale) -> None:
    """Move the texts of `texts` (a text source's columns, x in data units), in order, the least distance
    that keeps each clear of the boxes in `fixed` and of the texts placed before it, inside the frame: a
    load's value at the member's end ran under the axial force's label, which the frame's edge pushes in."""
    placed = list(fixed)
    for i in range(len(texts["text"])):
        box = _box(texts, i, s)
        moves = [(0.0, 0.0)]
        for o in placed:
            moves += [(o[0] - TEXT_GAP - box[2], 0.0), (o[2] + TEXT_GAP - box[0], 0.0)]
            moves += [(0.0, o[1] - TEXT_GAP - box[3]), (0.0, o[3] + TEXT_GAP - box[1])]
        for dx, dy in sorted(moves, key=lambda move: math.hypot(*move)):
            moved = (box[0] + dx, box[1] + dy, box[2] + dx, box[3] + dy)
            inside = moved[0] >= 0.0 and moved[2] <= s.width and moved[1] >= 0.0 and moved[3] <= s.height
            if (inside or (dx, dy) == (0.0, 0.0)) and not any(_overlaps(moved, o) for o in placed):
                texts["x"][i] += dx / SKETCH_INCH * s.x
                texts["y"][i] += dy / SKETCH_INCH * s.y
                box = moved
                break
        placed.append(box)


class SketchView(param.Parameterized):
    """The sketch figure and its sources, drawn from the state's result with :func:`app.sketch.sketch`."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, x_range: Range1d, **params) -> None:
        super().__init__(state=state, **params)
        self.x_range = x_range
        self.lines = ColumnDataSource(data=_columns(*LINE_COLUMNS), name="sketch_lines")
        self.patches = ColumnDataSource(data=_columns(*PATCH_COLUMNS), name="sketch_patches")
        self.arrows = ColumnDataSource(data=_columns(*ARROW_COLUMNS), name="sketch_arrows")
        self.text = ColumnDataSource(data=_columns(*TEXT_COLUMNS), name="sketch_text")
        self.frame_text = ColumnDataSource(data=_columns(*TEXT_COLUMNS), name="sketch_frame_text")
        # What changes with N: the axial-force arrows, their label and the danger note.
        self.axial_arrows = ColumnDataSource(data=_columns(*ARROW_COLUMNS), name="sketch_axial_arrows")
        self.axial_text = ColumnDataSource(data=_columns(*TEXT_COLUMNS), name="sketch_axial_text")
        self.axial_frame_text = ColumnDataSource(data=_columns(*TEXT_COLUMNS), name="sketch_danger")
        fig = figure(
            name="sketch",
            height=HEIGHT,
            sizing_mode="stretch_width",
            x_range=self.x_range,
            y_range=Range1d(*Y_SPAN),
            toolbar_location=None,
            tools="",
            min_border_left=BORDERS["left"],
            min_border_right=BORDERS["right"],
            min_border_top=BORDERS["top"],
            min_border_bottom=BORDERS["bottom"],
        )
        fig.axis.visible = False
        fig.grid.visible = False
        fig.outline_line_color = None
        fig.patches(
            "xs",
            "ys",
            source=self.patches,
            fill_color="fill",
            fill_alpha="alpha",
            line_color="color",
            line_width="width",
        )
        fig.multi_line(
            "xs", "ys", source=self.lines, line_color="color", line_width="width", line_dash="dash"
        )
        for source in (self.arrows, self.axial_arrows):
            fig.add_layout(
                ArrowAnnotation(
                    end=NormalHead(size="head", line_color="color", fill_color="color", line_width=1),
                    source=source,
                    **ARROW_FIELDS,
                )
            )
        self.labels = {}
        for source, x_units in (
            (self.text, "data"),
            (self.axial_text, "data"),
            (self.frame_text, "screen"),
            (self.axial_frame_text, "screen"),
        ):
            self.labels[source.name] = LabelSet(source=source, x_units=x_units, **TEXT_FIELDS)
            fig.add_layout(self.labels[source.name])
        lean_figure(fig)
        self.figure = fig
        fig.on_change("inner_width", self._resized)
        fig.on_change("inner_height", self._resized)

    # ------------------------------------------------------------------ size and range

    def inner_size(self) -> tuple[float, float]:
        """The frame's inner width and height [px]: as the browser reports them, else the nominal size."""
        fig = self.figure
        width = _reported(fig, "inner_width") or (fig.width or 600) - BORDERS["left"] - BORDERS["right"]
        height = _reported(fig, "inner_height") or HEIGHT - BORDERS["top"] - BORDERS["bottom"]
        return float(width), float(height)

    def padding(self, L: float) -> float:
        """Room beyond each end of a member `L` long, in the x range's units: a tenth of L, and at least
        :data:`PAD_INCHES` on the frame for the supports and the axial-force arrows."""
        width_in = self.inner_size()[0] / SKETCH_INCH
        return max(0.1 * L, PAD_INCHES * L / max(width_in - 2 * PAD_INCHES, 1.0))

    def fit_range(self, L: float) -> None:
        """Show the member `L` long with its padding (no bounds: the browser would clamp a new range to the
        old bounds after a change of length or units)."""
        pad = self.padding(L)
        self.x_range.update(start=-pad, end=L + pad, reset_start=-pad, reset_end=L + pad)

    def _resized(self, attr, old, new) -> None:
        result = self.state.result
        if result is None:
            return
        r = self.x_range
        if r.start == r.reset_start and r.end == r.reset_end:  # not zoomed or panned: refit
            self.fit_range(result.case.length * units(self.state.units).length.factor)
        self.draw()
        self.draw_force()

    # ------------------------------------------------------------------ drawing

    def _data(self, fit: bool):
        """The result's shapes and the scale to draw them with; `fit` fits the y range to them first (with
        load cases, the combination shown)."""
        result = view_result(self.state) if self.state.result is not None else None
        if result is None:
            return None
        shapes = sketch(result, units(self.state.units)).shapes
        width, height = self.inner_size()
        if fit:
            self.figure.y_range.start = _bottom(shapes, height)
        return shapes, _Scale(self.x_range, width, height, self.figure.y_range.start)

    def draw(self) -> None:
        """Draw the sketch's shapes that do not change with N: member, supports, loads, bow, labels."""
        found = self._data(fit=True)
        if found is None:
            return
        shapes, scale = found
        data = _render([s for s in shapes if s.role not in FORCE_ROLES], scale)
        # Texts keep clear of the axial force's label and of the note (or the danger note in its place).
        force = _render([s for s in shapes if s.role in FORCE_ROLES], scale)
        frame = force["frame_text"] if force["frame_text"]["text"] else data["frame_text"]
        fixed = [_box(force["text"], i, scale) for i in range(len(force["text"]["text"]))]
        fixed += [_box(frame, i, scale, screen_x=True) for i in range(len(frame["text"]))]
        _apart(data["text"], fixed, scale)
        self.lines.data = data["lines"]
        self.patches.data = data["patches"]
        self.arrows.data = data["arrows"]
        self.text.data = data["text"]
        self.frame_text.data = data["frame_text"]

    def draw_force(self) -> None:
        """The axial-force arrows, their label and the danger note; they follow N while it is dragged."""
        found = self._data(fit=False)
        if found is None:
            return
        shapes, scale = found
        data = _render([s for s in shapes if s.role in FORCE_ROLES], scale)
        self.axial_arrows.data = data["arrows"]
        self.axial_text.data = data["text"]
        self.axial_frame_text.data = data["frame_text"]
        # The danger note takes the note's place in the strip (both are too long for one line on a screen).
        self.labels["sketch_frame_text"].visible = not data["frame_text"]["text"]
