"""The diagrams: deflection, moment and shear along the member under the sketch, first and second order, with
the kept variants overlaid.

:class:`DiagramsView` builds its sources and figures once, and on each result assigns each source's ``data``
whole inside ``pn.io.hold()``, so a step of the axial-force slider sends one message and nothing is rebuilt.
"""

from __future__ import annotations

import math

import numpy as np
import panel as pn
import param
from bokeh.models import ColumnDataSource, HoverTool, LabelSet, Range1d, Span
from bokeh.plotting import figure

from app.page.sketch_view import SketchView
from app.page.style import (
    BOW,
    FIRST,
    MAX_VARIANTS,
    SECOND,
    TRANSVERSE,
    VARIANT_COLOURS,
    WIDGET_CSS,
    esc,
    finite,
    html_pane,
    lean,
    lean_figure,
)
from app.report.routes import plane_axes, plane_name
from app.state import MemberState
from app.state_actions import shown_result
from app.units import units

__all__ = ["DiagramsView"]


class DiagramsView(pn.viewable.Viewer):
    """The sketch and the w, M and V diagrams of the state's result, with the variants overlaid."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")
    show_transverse = param.Boolean(default=False, doc="Show the transverse force T beside the shear V.")
    variants = param.List(default=[], doc="The kept variants (dicts with a 'result'), overlaid muted.")
    plane = param.Selector(
        objects=["own", "second"], default="own", doc="The plane drawn: the case's own, or the second plane."
    )

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.x_range = Range1d(-0.5, 6.5)
        self.sketch = SketchView(state, self.x_range)
        self.stations = ColumnDataSource(
            data={key: [] for key in ("x", "w2", "w1", "w0", "M2", "M1", "V2", "V1", "T2")}, name="stations"
        )
        self.peaks = {
            kind: ColumnDataSource(
                data={"x": [], "y": [], "text": [], "align": [], "dy": []}, name=f"peak_{kind}"
            )
            for kind in ("w", "M", "V", "T")
        }
        self.first_peaks = {kind: ColumnDataSource(data={"x": [], "y": []}) for kind in ("w", "M", "V")}
        self.variant_sources = [
            ColumnDataSource(data={"x": [], "w": [], "M": [], "V": []}, name=f"variant_{i}")
            for i in range(MAX_VARIANTS)
        ]
        self._drawn_case = None
        self._figures()
        self.key = html_pane(min_height=22, margin=(4, 4, 0, 4))
        self.transverse_toggle = pn.widgets.Checkbox(
            label="T beside V",
            value=self.show_transverse,
            width=96,
            margin=(6, 4, 0, 4),
            stylesheets=[WIDGET_CSS],
        )
        self.transverse_toggle.link(self, value="show_transverse")
        self.plane_switch = pn.widgets.RadioButtonGroup(
            options={"major": "own", "minor": "second"},
            value="own",
            color="light",
            visible=False,
            margin=(2, 4, 0, 4),
            stylesheets=[WIDGET_CSS],
        )
        self.plane_switch.link(self, value="plane")
        self.panes = [pn.pane.Bokeh(self.sketch.figure, sizing_mode="stretch_width", margin=(0, 4))] + [
            pn.pane.Bokeh(fig, sizing_mode="stretch_both", min_height=fig.min_height, margin=(0, 4))
            for fig in (self.fig_w, self.fig_M, self.fig_V)
        ]
        self.panel = pn.Column(
            pn.Row(
                self.plane_switch,
                self.key,
                self.transverse_toggle,
                margin=(2, 0, 0, 0),
                sizing_mode="stretch_width",
            ),
            *self.panes,
            name="Diagrams",
            sizing_mode="stretch_both",
            margin=0,
        )
        self.param.watch(self._transverse, ["show_transverse"])
        self.param.watch(lambda *_: self.draw(full=True), ["plane"])
        self.param.watch(lambda *_: self.draw_variants(), ["variants"])
        state.param.watch(self._result, ["result"])
        state.param.watch(lambda *_: self.draw(full=True), ["units"])
        self.draw(full=True)

    def __panel__(self):
        return self.panel

    def _diagram(self, height: int, *, flipped: bool, x_axis: bool):
        fig = figure(
            height=height,
            min_height=height,
            sizing_mode="stretch_both",  # taller screens give the diagrams their height (1920×1080)
            x_range=self.x_range,
            tools="xpan,xwheel_zoom,reset",
            toolbar_location=None,
            min_border_left=62,
            min_border_right=14,
            min_border_top=6,
            min_border_bottom=4 if not x_axis else 30,
        )
        if flipped:
            fig.y_range.flipped = True
        fig.xaxis.visible = x_axis
        fig.yaxis.axis_label_text_font_size = "12.5px"
        fig.yaxis.axis_label_text_font_style = "normal"
        fig.yaxis.major_label_text_font_size = "12px"
        fig.xaxis.major_label_text_font_size = "12px"
        fig.xaxis.axis_label_text_font_size = "12.5px"
        fig.xaxis.axis_label_text_font_style = "normal"
        fig.grid.grid_line_color = "#e4e7e1"
        fig.outline_line_color = "#d5d9d2"
        fig.background_fill_color = "#ffffff"
        fig.border_fill_color = "#ffffff"
        fig.add_layout(Span(location=0, dimension="width", line_color="#9aa3a8", line_width=1))
        return fig

        # ---- deflection, moment, shear on one x range

    def _figures(self) -> None:
        self.fig_w = self._diagram(124, flipped=True, x_axis=False)
        self.fig_M = self._diagram(124, flipped=True, x_axis=False)
        self.fig_V = self._diagram(150, flipped=False, x_axis=True)
        self.renderers = {}
        for fig, kind, second, first in (
            (self.fig_w, "w", "w2", "w1"),
            (self.fig_M, "M", "M2", "M1"),
            (self.fig_V, "V", "V2", "V1"),
        ):
            # The kept variants' lines are made when a variant is first kept (see _variant_lines): the first
            # page carries fewer models and draws sooner (start-up, issue 10).
            variants = []
            if kind == "w":
                fig.line("x", "w0", source=self.stations, line_color=BOW, line_width=1.6, line_dash="dotted")
            fig.line("x", first, source=self.stations, line_color=FIRST, line_width=1.8, line_dash="6 4")
            main = fig.line("x", second, source=self.stations, line_color=SECOND, line_width=2.6)
            extra = None
            if kind == "V":
                extra = fig.line(
                    "x", "T2", source=self.stations, line_color=TRANSVERSE, line_width=2, visible=False
                )
                fig.scatter(
                    "x",
                    "y",
                    source=self.peaks["T"],
                    size=8,
                    marker="diamond",
                    fill_color=TRANSVERSE,
                    line_color="#ffffff",
                    visible=False,
                    name="T peak",
                )
            fig.scatter(
                "x",
                "y",
                source=self.first_peaks[kind],
                size=7,
                fill_color="#ffffff",
                line_color=FIRST,
                line_width=1.5,
            )
            fig.scatter("x", "y", source=self.peaks[kind], size=8, fill_color=SECOND, line_color="#ffffff")
            fig.add_layout(
                LabelSet(
                    x="x",
                    y="y",
                    text="text",
                    text_align="align",
                    source=self.peaks[kind],
                    x_offset=0,
                    y_offset="dy",
                    text_font_size="12.5px",
                    text_color=SECOND,
                    text_font_style="bold",
                    background_fill_color="#ffffff",
                    background_fill_alpha=0.8,
                )
            )
            hover = HoverTool(renderers=[main], mode="vline", line_policy="nearest")
            fig.add_tools(hover)
            self.renderers[kind] = {"main": main, "variants": variants, "hover": hover, "extra": extra}
        self.T_label = LabelSet(
            x="x",
            y="y",
            text="text",
            text_align="align",
            source=self.peaks["T"],
            y_offset="dy",
            text_font_size="12px",
            text_color=TRANSVERSE,
            visible=False,
        )
        self.fig_V.add_layout(self.T_label)
        self.fig_V.xaxis.axis_label = "x [m]"
        for fig in (self.fig_w, self.fig_M, self.fig_V):
            lean_figure(fig)

    # ------------------------------------------------------------------ drawing

    def _result(self, event) -> None:
        result = shown_result(self.state)
        self.draw(full=result is None or result.case.without_axial_force() != self._drawn_case)

    def shown(self):
        """The result drawn: the state's (the combination shown, with load cases), or its second plane's when
        that plane is chosen and exists."""
        result = shown_result(self.state)
        second = getattr(result, "second_plane", None)
        return second if self.plane == "second" and second is not None else result

    def _plane_switch(self, result) -> None:
        """Offer the planes by their axes when the case has a second plane; hide the switch otherwise."""
        two = getattr(result, "second_plane", None) is not None
        own, other = plane_axes(result)
        options = {f"plane: {plane_name(own)}": "own", plane_name(other): "second"}
        if self.plane_switch.options != options:
            self.plane_switch.options = options
        self.plane_switch.visible = two
        if not two and self.plane != "own":
            self.plane = "own"

    def draw(self, full: bool) -> None:
        """Push the result into the sources; `full` also redraws what N does not change."""
        result = shown_result(self.state)
        if result is None:
            return
        U = units(self.state.units)
        with pn.io.hold():
            self._plane_switch(result)
            shown = self.shown()
            second = shown is not result
            drawn = result.case.without_axial_force()
            if full or self._drawn_case != drawn:  # another combination shown: its loads on the sketch
                self._drawn_case = drawn
                self.sketch.fit_range(result.case.length * U.length.factor)
                self._axis_labels(U)
                self.sketch.draw()
                self.draw_variants()
                self.panes[0].visible = not second  # the sketch shows the loads of the case's own plane
            self._draw_stations(shown, U)
            self.sketch.draw_force()

    def _axis_labels(self, U) -> None:
        sl, mo, fo, le = U.label("small_length"), U.label("moment"), U.label("force"), U.label("length")
        self.fig_w.yaxis.axis_label = f"w + w0 [{sl}] ↓+"
        self.fig_M.yaxis.axis_label = f"M [{mo}] ↓+"
        self.fig_V.yaxis.axis_label = f"V [{fo}]"
        self.fig_V.xaxis.axis_label = f"x [{le}]"
        for kind, column, unit in (("w", "w", sl), ("M", "M", mo), ("V", "V", fo)):
            tooltips = [
                ("x", f"@x{{0.000}} {le}"),
                ("second order", f"@{column}2{{0.000}} {unit}"),
                ("first order", f"@{column}1{{0.000}} {unit}"),
            ]
            if kind == "w":
                tooltips.append(("initial bow w0", f"@w0{{0.000}} {unit}"))
            if kind == "V":
                tooltips.append(("T (second order)", f"@T2{{0.000}} {unit}"))
            self.renderers[kind]["hover"].tooltips = tooltips

    def _draw_stations(self, result, U) -> None:
        first = result.first_order
        sl, mo, fo, le = U.small_length.factor, U.moment.factor, U.force.factor, U.length.factor
        x = np.asarray(result.x) * le
        data = {
            "x": x,
            "w2": finite(result.total_offset) * sl,
            "w1": finite(first.total_offset) * sl,
            "w0": finite(result.initial_bow) * sl,
            "M2": finite(result.moment) * mo,
            "M1": finite(first.moment) * mo,
            "V2": finite(result.shear) * fo,
            "V1": finite(first.shear) * fo,
            "T2": finite(result.transverse_force) * fo,
        }
        # The exact axial force [N] of these stations, for a reader of the page's document (the slider holds a
        # position on its non-linear track, the readout a rounded value): set before the data, in one patch.
        self.stations.tags = [float(result.axial_force)]
        self.stations.data = data
        governing, first_governing = result.governing, first.governing
        for kind, field, unit_kind in (
            ("w", "total_offset", "small_length"),
            ("M", "moment", "moment"),
            ("V", "shear", "force"),
            ("T", "transverse_force", "force"),
        ):
            peak = getattr(governing, field)
            factor = U.unit(unit_kind).factor
            if math.isfinite(peak.value):
                align = "right" if peak.x > 0.62 * result.case.length else "left"
                text = f"{U.show(unit_kind, peak.value)} at {U.show('length', peak.x)}"
                # Put the label on the inside of the peak: w and M are drawn positive downwards.
                downwards = (peak.value > 0) == (kind in ("w", "M"))
                dy = 7 if downwards else -20
                self.peaks[kind].data = {
                    "x": [peak.x * le],
                    "y": [peak.value * factor],
                    "text": [text],
                    "align": [align],
                    "dy": [dy],
                }
            else:
                self.peaks[kind].data = {"x": [], "y": [], "text": [], "align": [], "dy": []}
            if kind in self.first_peaks:
                fpeak = getattr(first_governing, field)
                self.first_peaks[kind].data = {"x": [fpeak.x * le], "y": [fpeak.value * factor]}

    def _transverse(self, event) -> None:
        self.renderers["V"]["extra"].visible = event.new
        self.T_label.visible = event.new
        for renderer in self.fig_V.select(name="T peak"):
            renderer.visible = event.new
        self._draw_key()

    def draw_variants(self) -> None:
        """Overlay the kept variants, muted, and list them in the key."""
        U = units(self.state.units)
        hidden = self.plane == "second" and self.shown() is not self.state.result
        for i, source in enumerate(self.variant_sources):
            if i < len(self.variants) and not hidden:
                r = self.variants[i]["result"]
                source.data = {
                    "x": np.asarray(r.x) * U.length.factor,
                    "w": finite(r.total_offset) * U.small_length.factor,
                    "M": finite(r.moment) * U.moment.factor,
                    "V": finite(r.shear) * U.force.factor,
                }
            else:
                source.data = {"x": [], "w": [], "M": [], "V": []}
            shown = i < len(self.variants) and not hidden
            if shown or i < len(self.renderers["w"]["variants"]):
                for line in self._variant_lines(i):
                    line.visible = shown
        self._draw_key()

    def _variant_lines(self, i: int) -> list:
        """The i-th kept variant's lines on the three diagrams, made the first time they are asked for."""
        for fig, kind in ((self.fig_w, "w"), (self.fig_M, "M"), (self.fig_V, "V")):
            lines = self.renderers[kind]["variants"]
            while len(lines) <= i:
                j = len(lines)
                line = fig.line(
                    "x",
                    kind,
                    source=self.variant_sources[j],
                    line_color=VARIANT_COLOURS[j],
                    line_width=2,
                    line_alpha=0.75,
                    visible=False,
                )
                lean(line)
                # under the case's own lines, as the key lists them
                fig.renderers = [line, *(r for r in fig.renderers if r is not line)]
                lines.append(line)
        return [self.renderers[kind]["variants"][i] for kind in ("w", "M", "V")]

    def _draw_key(self) -> None:
        parts = []
        if self.plane == "second" and self.shown() is not self.state.result:
            parts.append(f"<b>second plane, {esc(plane_name(plane_axes(self.state.result)[1]))}</b>")
        parts += [
            f"<i style='border-top: 3px solid {SECOND}'></i>second order",
            f"<i style='border-top: 2px dashed {FIRST}'></i>first order",
            f"<i style='border-top: 2px dotted {BOW}'></i>bow w0",
        ]
        if self.show_transverse:
            parts.append(f"<i style='border-top: 3px solid {TRANSVERSE}'></i>T")
        for variant, colour in zip(self.variants, VARIANT_COLOURS, strict=False):
            parts.append(f"<i style='border-top: 3px solid {colour}'></i>{esc(variant['name'])}")
        self.key.object = "<div class='ss-key'>" + "".join(f"<span>{p}</span> " for p in parts) + "</div>"
