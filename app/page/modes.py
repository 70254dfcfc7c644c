"""The buckling modes: the first three elastic buckling modes of the supports, with their critical loads."""

from __future__ import annotations

import numpy as np
import panel as pn
import param
from bokeh.core.properties import value
from bokeh.models import ColumnDataSource, Legend, LegendItem, Range1d, Span
from bokeh.plotting import figure

from app.page.style import BOW, SECOND, TRANSVERSE, esc, finite, html_pane
from app.state import MemberState
from app.units import units

__all__ = ["ModesView"]


class ModesView(pn.viewable.Viewer):
    """The buckling modes tab: the effective length factor and the three mode shapes."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, x_range: Range1d, **params) -> None:
        super().__init__(state=state, **params)
        self.x_range = x_range
        self.source = ColumnDataSource(data={"x": [], "m1": [], "m2": [], "m3": []}, name="modes")
        self.title = html_pane(margin=(4, 8))
        self._drawn = None
        self._figure()
        self.panel = pn.Column(
            self.title,
            pn.pane.Bokeh(self.figure, sizing_mode="stretch_both"),
            name="Buckling modes",
            sizing_mode="stretch_both",
            margin=0,
        )
        state.param.watch(lambda *_: self.draw(), ["result"])
        state.param.watch(lambda *_: self.draw(force=True), ["units"])
        self.draw()

    def __panel__(self):
        return self.panel

    def _figure(self) -> None:
        modes = figure(
            height=400,
            sizing_mode="stretch_width",
            x_range=self.x_range,
            y_range=Range1d(-1.15, 1.15),
            tools="xpan,xwheel_zoom,reset",
            toolbar_location="right",
            min_border_left=62,
        )
        self.mode_items = []
        for n, (colour, dash) in enumerate(((SECOND, "solid"), (BOW, "7 3"), (TRANSVERSE, "2 3")), start=1):
            r = modes.line(
                "x", f"m{n}", source=self.source, line_color=colour, line_width=2.4, line_dash=dash
            )
            self.mode_items.append(LegendItem(label=value(f"mode {n}"), renderers=[r]))
        modes.add_layout(
            Legend(
                items=self.mode_items,
                location="bottom_left",
                label_text_font_size="12.5px",
                background_fill_alpha=0.85,
            )
        )
        modes.add_layout(Span(location=0, dimension="width", line_color="#9aa3a8", line_width=1))
        modes.xaxis.axis_label = "x [m]"
        modes.yaxis.axis_label = "mode shape (largest value +1)"
        for axis in (modes.xaxis, modes.yaxis):
            axis.axis_label_text_font_style = "normal"
            axis.axis_label_text_font_size = "13px"
            axis.major_label_text_font_size = "12.5px"
        self.figure = modes

    def draw(self, force: bool = False) -> None:
        """Draw the modes of the result's case (only when the case other than N changed)."""
        result = self.state.result
        if result is None:
            return
        key = (result.case.without_axial_force(), self.state.units)
        if key == self._drawn and not force:
            return
        self._drawn = key
        case = result.case
        U = units(self.state.units)
        le = U.length.factor
        xs = np.linspace(0.0, case.length, 241)
        shapes = result.buckling.mode_shapes(xs)
        self.source.data = {
            "x": xs * le,
            "m1": finite(shapes[0]),
            "m2": finite(shapes[1]),
            "m3": finite(shapes[2]),
        }
        pcr = result.critical_loads
        for n, item in enumerate(self.mode_items):
            item.label = value(f"mode {n + 1}: Pcr{n + 1} = {U.show('force', pcr[n])}")
        self.figure.xaxis.axis_label = f"x [{U.label('length')}]"
        K = result.buckling.effective_length_factor
        self.title.object = (
            f"<div class='ss-readout'>Effective length factor <b>K = {K:.3f}</b> "
            f"(Pcr1 = π²EI/(K·L)²) &nbsp; EI = {esc(U.show('stiffness', result.EI))}</div>"
            "<div class='ss-note'>First three elastic buckling modes of these supports, each scaled to a "
            "largest value of +1 (engine: exact characteristic equation, Wittrick–Williams count).</div>"
        )
