"""The member sketch: the member to scale along x, its supports, loads, initial bow and axial force.

:class:`SketchView` draws on its own Bokeh figure, which shares the diagrams' x range. The drawing of the
geometry (:meth:`SketchView.draw`) is the seam where a sketch geometry shared with the exports plugs in.
"""

from __future__ import annotations

import math

import numpy as np
import param
from bokeh.models import Arrow, ColumnDataSource, LabelSet, Range1d, VeeHead
from bokeh.plotting import figure

from app.page.style import BOW, LOAD, MEMBER
from app.state import MemberState
from app.units import units

__all__ = ["SketchView"]


class SketchView(param.Parameterized):
    """The sketch figure and its sources, drawn from the state's result."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, x_range: Range1d, **params) -> None:
        super().__init__(state=state, **params)
        self.lines = ColumnDataSource(data={"xs": [], "ys": [], "color": [], "width": [], "dash": []})
        self.arrows = ColumnDataSource(data={"x0": [], "y0": [], "x1": [], "y1": []})
        self.text = ColumnDataSource(data={"x": [], "y": [], "text": [], "align": [], "baseline": []})
        self.points = ColumnDataSource(data={"x": [], "y": [], "marker": [], "size": []})
        self.axial_arrows = ColumnDataSource(data={"x0": [], "y0": [], "x1": [], "y1": []})
        self.axial_text = ColumnDataSource(data={"x": [], "y": [], "text": [], "align": []})
        self.x_range = x_range
        sketch = figure(
            height=98,
            sizing_mode="stretch_width",
            x_range=self.x_range,
            y_range=Range1d(-1.75, 1.6),
            toolbar_location=None,
            tools="",
            min_border_left=62,
            min_border_right=14,
            min_border_top=2,
            min_border_bottom=2,
        )
        sketch.axis.visible = False
        sketch.grid.visible = False
        sketch.outline_line_color = None
        sketch.multi_line(
            "xs", "ys", source=self.lines, line_color="color", line_width="width", line_dash="solid"
        )
        sketch.scatter(
            "x",
            "y",
            marker="marker",
            size="size",
            source=self.points,
            fill_color="#ffffff",
            line_color=MEMBER,
            line_width=1.5,
        )
        for source, colour, head, width in ((self.arrows, LOAD, 7, 1.6), (self.axial_arrows, MEMBER, 9, 2.5)):
            sketch.add_layout(
                Arrow(
                    end=VeeHead(size=head, line_color=colour, line_width=min(width, 2.0)),
                    source=source,
                    x_start="x0",
                    y_start="y0",
                    x_end="x1",
                    y_end="y1",
                    line_color=colour,
                    line_width=width,
                )
            )
        for source, size, baseline, style in (
            (self.text, "12px", "baseline", "normal"),
            (self.axial_text, "12.5px", None, "bold"),
        ):
            sketch.add_layout(
                LabelSet(
                    x="x",
                    y="y",
                    text="text",
                    text_align="align",
                    text_baseline=baseline or "middle",
                    source=source,
                    text_font_size=size,
                    text_color=MEMBER,
                    text_font_style=style,
                )
            )
        self.figure = sketch

    def draw(self) -> None:
        """Draw the result's member, supports, loads and bow (what does not change with N)."""
        result = self.state.result
        if result is None:
            return
        case = result.case
        U = units(self.state.units)
        le = U.length.factor
        L = case.length * le
        lines = {"xs": [], "ys": [], "color": [], "width": [], "dash": []}
        points = {"x": [], "y": [], "marker": [], "size": []}
        arrows = {"x0": [], "y0": [], "x1": [], "y1": []}
        text = {"x": [], "y": [], "text": [], "align": [], "baseline": []}

        def line(xs, ys, color=MEMBER, width=1.5):
            lines["xs"].append(list(xs))
            lines["ys"].append(list(ys))
            lines["color"].append(color)
            lines["width"].append(width)
            lines["dash"].append("solid")

        def label(x, y, words, align="center", baseline="middle"):
            text["x"].append(x)
            text["y"].append(y)
            text["text"].append(words)
            text["align"].append(align)
            text["baseline"].append(baseline)

        # the member, and its initial bow exaggerated (positive w drawn downwards)
        line([0.0, L], [0.0, 0.0], MEMBER, 4)
        bow = np.asarray(result.initial_bow, dtype=float)
        amplitude = float(np.max(np.abs(bow))) if bow.size else 0.0
        if amplitude > 0:
            line(np.asarray(result.x) * le, -0.42 * bow / amplitude, BOW, 1.8)
            label(
                0.5 * L,
                -0.62,
                f"initial bow {U.show('small_length', amplitude)} (exaggerated)",
                "center",
                "top",
            )
        for side, x_end, outward in (("left", 0.0, -1.0), ("right", L, 1.0)):
            self._support(getattr(case, side), x_end, outward, L, line, points, label)
        # loads: arrows along +w (downwards on the sketch), lengths in proportion within each kind
        distributed = [ld for ld in case.loads if ld.type in ("uniform", "linear")]
        q_top = (
            max(
                [
                    abs(v)
                    for ld in distributed
                    for v in ((ld.q,) if ld.type == "uniform" else (ld.q_start, ld.q_end))
                ]
                or [1.0]
            )
            or 1.0
        )
        forces = [abs(ld.P) for ld in case.loads if ld.type == "point"]
        p_top = max(forces or [1.0]) or 1.0
        for ld in case.loads:
            if ld.type in ("uniform", "linear"):
                a, b = ld.span(case.length)
                qa, qb = (ld.q, ld.q) if ld.type == "uniform" else (ld.q_start, ld.q_end)
                count = max(2, int(round(12 * (b - a) / case.length)) + 1)
                xs = np.linspace(a, b, count)
                qs = np.linspace(qa, qb, count)
                tops = []
                for xq, q in zip(xs, qs, strict=False):
                    height = 0.25 + 0.55 * abs(q) / q_top
                    top = height if q >= 0 else -height
                    tops.append(top)
                    if q != 0:
                        arrows["x0"].append(xq * le)
                        arrows["y0"].append(top)
                        arrows["x1"].append(xq * le)
                        arrows["y1"].append(0.06 if q > 0 else -0.06)
                line(xs * le, tops, LOAD, 1.4)
                words = (
                    U.show("line_load", qa)
                    if ld.type == "uniform"
                    else f"{U.show('line_load', qa)} → {U.show('line_load', qb)}"
                )
                up = max(tops) > 0
                label(
                    b * le,
                    (max(tops) + 0.08) if up else (min(tops) - 0.08),
                    words,
                    "right",
                    "bottom" if up else "top",
                )
            elif ld.type == "point":
                height = 0.4 + 0.7 * abs(ld.P) / p_top
                top = height if ld.P >= 0 else -height
                arrows["x0"].append(ld.x * le)
                arrows["y0"].append(top)
                arrows["x1"].append(ld.x * le)
                arrows["y1"].append(0.05 if ld.P >= 0 else -0.05)
                label(
                    ld.x * le,
                    top + (0.06 if ld.P >= 0 else -0.06),
                    U.show("force", ld.P),
                    "center",
                    "bottom" if ld.P >= 0 else "top",
                )
            elif ld.type == "couple":
                theta = np.linspace(0.2 * math.pi, 1.8 * math.pi, 30)
                radius_x, radius_y = 0.035 * L, 0.42
                sense = 1.0 if ld.C >= 0 else -1.0
                cx = ld.x * le
                line(cx + radius_x * np.cos(theta), radius_y * np.sin(sense * theta), LOAD, 1.6)
                end_x = cx + radius_x * math.cos(1.8 * math.pi)
                end_y = radius_y * math.sin(sense * 1.8 * math.pi)
                arrows["x0"].append(cx + radius_x * math.cos(1.7 * math.pi))
                arrows["y0"].append(radius_y * math.sin(sense * 1.7 * math.pi))
                arrows["x1"].append(end_x)
                arrows["y1"].append(end_y)
                label(cx + 0.05 * L, 0.5, U.show("moment", ld.C), "left", "middle")
        self.lines.data = lines
        self.points.data = points
        self.arrows.data = arrows
        self.text.data = text

    @staticmethod
    def _support(end, x_end, outward, L, line, points, label) -> None:
        """A support symbol of our own at one end: the restraints drawn as they act."""
        t, r = end.translation, end.rotation
        name = end.name
        u = 0.03 * L  # a unit of width along x
        if name == "pinned":
            points["x"].append(x_end)
            points["y"].append(-0.32)
            points["marker"].append("triangle")
            points["size"].append(18)
            line([x_end - 1.3 * u, x_end + 1.3 * u], [-0.62, -0.62], MEMBER, 2)
        elif name == "fixed" or (t == "fixed" and r == "fixed"):
            line([x_end, x_end], [-0.8, 0.8], MEMBER, 4)
            for y in np.linspace(-0.75, 0.75, 6):
                line([x_end, x_end + outward * 0.8 * u], [y, y - 0.2], MEMBER, 1.2)
        elif name == "guided":
            # a sleeve: the end slides sideways but cannot turn
            line([x_end + outward * 0.4 * u, x_end + outward * 0.4 * u], [-0.8, 0.8], MEMBER, 3)
            line([x_end + outward * 1.2 * u, x_end + outward * 1.2 * u], [-0.8, 0.8], MEMBER, 1.2)
            points["x"] += [x_end + outward * 0.8 * u] * 2
            points["y"] += [-0.45, 0.45]
            points["marker"] += ["circle", "circle"]
            points["size"] += [7, 7]
        elif name == "free":
            label(x_end + outward * 0.4 * u, -0.35, "free", "left" if outward > 0 else "right", "middle")
        else:
            if not isinstance(t, str):  # translation spring: a zigzag below the end
                ys = np.linspace(-0.08, -1.0, 9)
                xs = [x_end + (0.6 * u if i % 2 else -0.6 * u) if 0 < i < 8 else x_end for i in range(9)]
                line(xs, ys, MEMBER, 1.5)
                line([x_end - 1.2 * u, x_end + 1.2 * u], [-1.05, -1.05], MEMBER, 2)
            elif t == "fixed":
                points["x"].append(x_end)
                points["y"].append(-0.32)
                points["marker"].append("triangle")
                points["size"].append(18)
                line([x_end - 1.3 * u, x_end + 1.3 * u], [-0.62, -0.62], MEMBER, 2)
            if not isinstance(r, str):  # rotation spring: a coil at the end
                theta = np.linspace(0, 3.2 * math.pi, 40)
                radius = np.linspace(0.1, 0.45, 40)
                line(
                    x_end + outward * 0.9 * u + radius * np.cos(theta) * u * 1.6,
                    radius * np.sin(theta) + 0.35,
                    MEMBER,
                    1.3,
                )
            elif r == "fixed":
                line([x_end, x_end], [-0.5, 0.5], MEMBER, 3)
            label(x_end + outward * 0.3 * u, 1.05, "springs", "left" if outward > 0 else "right", "middle")

    def draw_force(self) -> None:
        """The axial force arrows and label; they follow N while it is dragged."""
        result = self.state.result
        if result is None:
            return
        U = units(self.state.units)
        P = float(result.axial_force)
        # The sketch's axial force arrows and label follow N while it is dragged.
        L = result.case.length * U.length.factor
        if P == 0:
            self.axial_arrows.data = {"x0": [], "y0": [], "x1": [], "y1": []}
        else:
            out, near = 0.075 * L, 0.012 * L
            if P > 0:  # compression: arrows push on the ends
                x0, x1 = [-out, L + out], [-near, L + near]
            else:
                x0, x1 = [-near, L + near], [-out, L + out]
            self.axial_arrows.data = {"x0": x0, "y0": [0.0, 0.0], "x1": x1, "y1": [0.0, 0.0]}
        self.axial_text.data = {
            "x": [L + 0.095 * L],
            "y": [-1.4],
            "text": [f"N = {U.show('force', P)}"],
            "align": ["right"],
        }
