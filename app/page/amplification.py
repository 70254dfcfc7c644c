"""The amplification chart: second order over first order against N/Pcr1, exact from the engine's sweep, with
the textbook 1/(1 − N/Pcr1) and the current axial force.
"""

from __future__ import annotations

import numpy as np
import panel as pn
import param
from bokeh.core.properties import value
from bokeh.models import (
    BoxAnnotation,
    ColumnDataSource,
    HoverTool,
    LabelSet,
    Legend,
    LegendItem,
    Range1d,
    Span,
)
from bokeh.plotting import figure

from app.page.style import BOW, FIRST, SECOND, esc, finite, html_pane
from app.page.words import plain
from app.state import MemberState
from app.units import units

__all__ = ["AmplificationView"]

#: The chart opens on N/Pcr1 from −1 to this much past Pcr1 (the useful range); pan or zoom out for the rest.
_SHOWN_BEYOND = 1.5


class AmplificationView(pn.viewable.Viewer):
    """The amplification chart of the state's case (built once, its sources refreshed)."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.sweep_source = ColumnDataSource(data={"n": [], "moment": [], "deflection": []}, name="sweep")
        self.approximation_source = ColumnDataSource(data={"n": [], "value": []})
        self.current = ColumnDataSource(data={"n": [], "moment": [], "deflection": []}, name="current")
        self.critical_source = ColumnDataSource(data={"n": [], "text": [], "y": []})
        self.note = html_pane(margin=(4, 8))
        self._figure()
        self.panel = pn.Column(
            self.note,
            pn.pane.Bokeh(self.figure, sizing_mode="stretch_both"),
            name="Amplification",
            sizing_mode="stretch_both",
            margin=0,
        )
        state.param.watch(lambda *_: self.draw(), ["sweep", "approximation", "chart_note", "units"])
        state.param.watch(lambda *_: self.draw_current(), ["result"])
        self.draw()

    def __panel__(self):
        return self.panel

    def _figure(self) -> None:
        amp = figure(
            height=380,
            sizing_mode="stretch_both",
            y_range=Range1d(0, 8, reset_start=0, reset_end=8),
            x_range=Range1d(-1.05, _SHOWN_BEYOND),
            tools="pan,wheel_zoom,box_zoom,reset",
            toolbar_location="right",
            min_border_left=62,
        )
        amp.add_layout(BoxAnnotation(left=1.0, fill_color="#a3261b", fill_alpha=0.07, line_alpha=0))
        amp.add_layout(Span(location=1.0, dimension="height", line_color="#a3261b", line_width=1.5))
        amp.add_layout(Span(location=1.0, dimension="width", line_color="#9aa3a8", line_width=1))
        amp.segment(
            "n",
            0,
            "n",
            8,
            source=self.critical_source,
            line_color="#a3261b",
            line_dash="4 3",
            line_width=1.2,
        )
        amp.add_layout(
            LabelSet(
                x="n",
                y="y",
                text="text",
                source=self.critical_source,
                x_offset=-4,
                text_align="right",
                text_font_size="12px",
                text_color="#a3261b",
            )
        )
        self.unstable_label = LabelSet(
            x="x",
            y="y",
            text="text",
            source=ColumnDataSource(data={"x": [1.0], "y": [0.25], "text": ["unstable beyond Pcr1 →"]}),
            x_offset=-6,
            text_align="right",
            text_font_size="12.5px",
            text_color="#a3261b",
            text_font_style="bold",
        )
        amp.add_layout(self.unstable_label)
        r_exact_m = amp.line("n", "moment", source=self.sweep_source, line_color=SECOND, line_width=2.6)
        r_exact_w = amp.line("n", "deflection", source=self.sweep_source, line_color=BOW, line_width=2.2)
        r_approx = amp.line(
            "n",
            "value",
            source=self.approximation_source,
            line_color=FIRST,
            line_width=1.8,
            line_dash="6 4",
        )
        r_now_m = amp.scatter(
            "n", "moment", source=self.current, size=11, fill_color=SECOND, line_color="#fff"
        )
        amp.scatter(
            "n",
            "deflection",
            source=self.current,
            size=10,
            marker="square",
            fill_color=BOW,
            line_color="#fff",
        )
        amp.add_layout(
            Legend(
                items=[
                    LegendItem(label=value("moment, exact: max|M| / max|M₁ + N·w0|"), renderers=[r_exact_m]),
                    LegendItem(
                        label=value("deflection, exact: max|w+w0| / max|w₁+w0|"), renderers=[r_exact_w]
                    ),
                    LegendItem(label=value("1/(1 − N/Pcr1), textbook"), renderers=[r_approx]),
                    LegendItem(label=value("current axial force"), renderers=[r_now_m]),
                ],
                label_text_font_size="12.5px",
                orientation="vertical",
                margin=4,
                padding=4,
                spacing=0,
            ),
            "below",  # outside the plot: it hides no curve and no label
        )
        amp.xaxis.axis_label = "N / Pcr1 (compression +, tension −)"
        amp.yaxis.axis_label = "amplification (second order / first order)"
        for axis in (amp.xaxis, amp.yaxis):
            axis.axis_label_text_font_style = "normal"
            axis.axis_label_text_font_size = "13px"
            axis.major_label_text_font_size = "12.5px"
        amp.add_tools(
            HoverTool(
                renderers=[r_exact_m],
                mode="vline",
                tooltips=[
                    ("N/Pcr1", "@n{0.000}"),
                    ("moment", "@moment{0.000}"),
                    ("deflection", "@deflection{0.000}"),
                ],
            )
        )
        self.figure = amp

    def draw(self) -> None:
        """Draw the sweep, the approximation, the critical loads and the note."""
        m = self.state
        result, sweep, approximation = m.result, m.sweep, m.approximation
        if result is None:
            return
        pcr = np.asarray(result.critical_loads, dtype=float)
        if sweep is not None:
            n = np.asarray(sweep.axial_force, dtype=float) / pcr[0]
            self.sweep_source.data = {
                "n": n,
                "moment": finite(sweep.moment_amplification),
                "deflection": finite(sweep.deflection_amplification),
            }
            # The useful range in view: tension of Pcr1 to past Pcr1 (pan or zoom out for the higher modes).
            start, end = max(float(n[0]), -1.0) - 0.05, min(float(n[-1]), _SHOWN_BEYOND)
            self.figure.x_range.update(start=start, end=end, reset_start=start, reset_end=end)
        else:  # never the curves of another case
            self.sweep_source.data = {"n": [], "moment": [], "deflection": []}
        if approximation is not None:
            forces, values = approximation
            self.approximation_source.data = {"n": np.asarray(forces) / pcr[0], "value": finite(values)}
        else:
            self.approximation_source.data = {"n": [], "value": []}
        U = units(m.units)
        self.critical_source.data = {
            "n": list(pcr[:3] / pcr[0]),
            "y": [7.1, 6.6, 6.1],
            "text": [f"Pcr{k + 1} = {U.show('force', pcr[k])}" for k in range(3)],
        }
        note = f"<div class='ss-error'>{esc(m.chart_note)}</div>" if m.chart_note else ""
        self.note.object = note + (
            "<div class='ss-note'>Exact curves from the engine's sweep of the axial force (exact peaks "
            "at every force); the dashed line is the textbook 1/(1 − N/Pcr1) (Timoshenko &amp; Gere 1961, "
            "ch. 1), given below Pcr1 only. Vertical lines: the critical loads. Shaded: beyond Pcr1, "
            "where the member would have buckled (the linear solution is shown, as the textbooks plot "
            "it).</div>"
        )
        self.draw_current()

    def draw_current(self) -> None:
        """The marker of the current axial force."""
        result = self.state.result
        if result is None:
            return
        amplification = result.amplification
        self.current.data = {
            "n": [float(result.axial_force / result.critical_loads[0])],
            "moment": [plain(amplification.moment)],
            "deflection": [plain(amplification.deflection)],
        }
