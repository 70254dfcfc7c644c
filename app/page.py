"""The member explorer page: the view of one :class:`app.state.MemberState`.

:class:`MemberPage` is a :class:`panel.viewable.Viewer`. It builds its widgets, its ``ColumnDataSource``
objects and its Bokeh figures once, in ``__init__``, and on every new result assigns each source's ``data``
whole inside ``pn.io.hold()``, so a step of the axial-force slider sends one message and nothing is rebuilt.
Only the rows of the loads table are rebuilt, when rows are added, removed or change type.

Widgets show display units (:mod:`app.units`); the state stays in SI. Every number shown comes from the
engine's result; the view only converts units, formats text and draws.

Layout (1280×720): a header (title, units, downloads, upload), the inputs on the left in five groups, the
axial force control above the diagrams in the centre (with the amplification chart, the buckling modes and
the variants in tabs beside the diagrams), and the governing values and the cautions on the right, always
visible.
"""

from __future__ import annotations

import html
import io
import logging
import math
import re
from functools import partial

import numpy as np
import panel as pn
import param
from bokeh.core.properties import value
from bokeh.models import (
    Arrow,
    BoxAnnotation,
    ColumnDataSource,
    HoverTool,
    LabelSet,
    Legend,
    LegendItem,
    Range1d,
    Span,
    VeeHead,
)
from bokeh.plotting import figure

from app.intake import clean_text
from app.state import (
    BOW_PRESETS,
    INPUTS,
    LOAD_TYPES,
    SECTION_DIMENSIONS,
    MemberState,
)
from app.units import Unit, units

__all__ = ["MAX_LOAD_ROWS", "MAX_VARIANTS", "MemberPage", "UPLOAD_LIMIT", "page_stylesheet"]

_log = logging.getLogger(__name__)

#: Variants kept at most.
MAX_VARIANTS = 4
#: Load rows listed for editing at most: each row is a dozen widgets, and building hundreds of them held
#: the server for seconds (issue 11); further loads are analysed and drawn, and edited in the case file.
MAX_LOAD_ROWS = 12
_ROWS_AT_ONCE = 2
#: Largest case file accepted for upload [bytes].
UPLOAD_LIMIT = 1_000_000

# Colours of our own: teal for second order, slate for first order, ochre for the bow, plum for T; the
# variants muted. Levels: brick red, amber, slate blue.
_SECOND = "#0d6e7a"
_FIRST = "#5b6670"
_BOW = "#b07a1e"
_TRANSVERSE = "#7a3b69"
_MEMBER = "#14263a"
_LOAD = "#a3261b"
_VARIANT_COLOURS = ("#9c8fc4", "#d09a5a", "#86b08a", "#c98fa8")
_VARIANT_LETTERS = "ABCD"
_LEVEL_NAMES = {"danger": "Danger", "warning": "Warning", "info": "Note"}
# Shown only if a result ever came without the engine's own general caution (it always has it).
_GENERAL_CAUTION = (
    "Elastic analysis of one member in one plane. Not a full code check: lateral-torsional buckling, "
    "biaxial bending and the interaction of EN 1993-1-1 eqs. (6.61)/(6.62), class 4 sections, "
    "connections and load combinations are not checked. Check the results against your local codes "
    "and have them reviewed by a licensed engineer."
)

_SUPPORT_LABELS = {
    "pinned": "pinned",
    "fixed": "fixed",
    "free": "free",
    "guided": "guided",
    "elastic": "elastic (springs)",
}
_SHAPE_LABELS = {
    "catalogue": "catalogue",
    "rolled_i": "rolled I",
    "welded_i": "welded I",
    "rhs": "RHS / SHS",
    "chs": "CHS",
    "rectangle": "solid rectangle",
    "round": "solid round",
    "custom": "custom properties",
}
_DIMENSION_LABELS = {
    "h": "depth h",
    "b": "width b",
    "tw": "web t_w",
    "tf": "flange t_f",
    "r": "root r",
    "t": "wall t",
    "D": "diameter D",
    "A": "area A",
    "I": "I about axis",
    "W_el": "W_el",
    "W_pl": "W_pl",
    "A_v": "shear area A_v",
}
_PRESET_LABELS = {
    "en1993-table-5.1": "EN 1993-1-1 Table 5.1 (e0 = L/n by curve)",
    "en1993-eq-5.9": "EN 1993-1-1 eq. (5.9), first-mode bow",
    "aisc-l/1000": "AISC 303-16: L/1000",
    "span": "span/n, n given",
}
_BOW_SHAPE_LABELS = {
    "none": "none",
    "sine": "half sine",
    "parabola": "parabola",
    "sway": "sway (a·x/L)",
    "mode": "first buckling mode",
}
_LOAD_LABELS = {"uniform": "uniform", "linear": "linear", "point": "point", "couple": "couple"}

_CSS = """
:host { --ss-ink: #14263a; --ss-muted: #5b6670; --ss-rule: #d5d9d2; --ss-accent: #0d6e7a;
        font-family: "DejaVu Sans", "Segoe UI", "Helvetica Neue", Arial, sans-serif; color: var(--ss-ink); }
.ss-brand { font-size: 19px; font-weight: 700; letter-spacing: 0.02em; color: #ffffff; white-space: nowrap; }
.ss-brand span { font-weight: 400; color: #b9d4d8; font-size: 14px; margin-left: 8px; }
.ss-title { color: #e8eef0; font-size: 13px; white-space: nowrap; overflow: hidden; text-overflow: ellipsis; }
.ss-heading { font-size: 13px; font-weight: 700; text-transform: uppercase; letter-spacing: 0.06em;
              color: var(--ss-muted); margin: 2px 0 2px 0; }
.ss-error { color: #a3261b; font-size: 12.5px; line-height: 1.3; background: #fbeceb;
            border-left: 3px solid #a3261b; padding: 3px 6px; margin: 0; }
.ss-note { color: var(--ss-muted); font-size: 12px; line-height: 1.3; }
.ss-readout { font-size: 13.5px; line-height: 1.5; white-space: nowrap; }
.ss-readout b { font-size: 15px; }
.ss-badge { display: inline-block; padding: 1px 7px; border-radius: 3px; font-size: 12px; font-weight: 700;
            color: #fff; letter-spacing: 0.03em; }
.ss-stable { background: #2e6b3c; } .ss-unstable, .ss-critical { background: #a3261b; }
.ss-stale { background: #8a5a00; }
table.ss-values { border-collapse: collapse; width: 100%; font-size: 12.5px; line-height: 1.2; }
table.ss-values th { text-align: left; font-weight: 700; color: var(--ss-muted); font-size: 12px;
                     text-transform: uppercase; letter-spacing: 0.04em; padding: 4px 3px 1px 3px;
                     border-bottom: 1px solid var(--ss-rule); }
table.ss-values td { padding: 1px 3px; vertical-align: top; }
table.ss-values td.q { color: var(--ss-muted); white-space: nowrap; }
table.ss-values td.v { font-weight: 600; white-space: nowrap; }
table.ss-values td.f { color: var(--ss-muted); }
table.ss-values tr.danger td.v { color: #a3261b; }
table.ss-values tr.warn td.v { color: #8a5a00; }
ul.ss-cautions { list-style: none; padding: 0; margin: 0; font-size: 12.5px; line-height: 1.3; }
ul.ss-cautions li { padding: 3px 4px 4px 7px; margin-bottom: 3px; border-left: 4px solid #35506b;
                    background: #f4f6f8; }
ul.ss-cautions li.danger { border-left-color: #a3261b; background: #fbeceb; }
ul.ss-cautions li.warning { border-left-color: #b77900; background: #fdf5e6; }
ul.ss-cautions .lvl { font-weight: 700; font-size: 12px; text-transform: uppercase; margin-right: 4px; }
ul.ss-cautions li.danger .lvl { color: #a3261b; } ul.ss-cautions li.warning .lvl { color: #8a5a00; }
ul.ss-cautions li.info .lvl { color: #35506b; }
ul.ss-cautions .src { display: block; color: var(--ss-muted); font-size: 12px; font-style: italic; }
ul.ss-cautions.general li { border-left-color: #14263a; background: #e9edf1; margin: 0; }
.ss-key { font-size: 12.5px; color: var(--ss-ink); line-height: 1.35; }
.ss-key span { white-space: nowrap; }
.ss-key i { display: inline-block; width: 16px; height: 0; vertical-align: middle; margin: 0 3px 0 7px; }
table.ss-compare { border-collapse: collapse; font-size: 12.5px; }
table.ss-compare th, table.ss-compare td { padding: 3px 6px; border-bottom: 1px solid var(--ss-rule);
                                          text-align: right; white-space: nowrap; }
table.ss-compare tr.case td { white-space: normal; max-width: 92px; font-size: 12px; vertical-align: top; }
table.ss-compare th:first-child, table.ss-compare td:first-child { text-align: left; color: var(--ss-muted); }
table.ss-compare th { font-size: 12px; }
"""

_WIDGET_CSS = """
:host { --font-size: 13.5px; font-size: 13.5px; }
label, .bk-input-group > label { font-size: 12.5px; color: #3c4750; }
input, select, .bk-input { font-size: 13.5px; }
"""


# The document-level stylesheet (the page background and body font); components carry their own stylesheets,
# since Panel renders each in its own shadow root.
_GLOBAL_CSS = """/* strutscope's own look: ink-blue header, white panels, a teal accent for second order.
   Sized for a 1280×720 projector: 14 px body text, nothing below 12 px. */
:root {
  --ss-ink: #14263a;
  --ss-paper: #f6f7f4;
  --ss-panel: #ffffff;
  --ss-rule: #d5d9d2;
  --ss-muted: #5b6670;
  --ss-accent: #0d6e7a;
  --ss-danger: #a3261b;
  --ss-warning: #8a5a00;
  --ss-info: #35506b;
}
html, body {
  background: var(--ss-paper);
  color: var(--ss-ink);
  font-family: "DejaVu Sans", "Segoe UI", "Helvetica Neue", Arial, sans-serif;
  font-size: 14px;
  margin: 0;
  overflow-x: hidden;
}
"""


def page_stylesheet() -> str:
    """The page's document-level stylesheet (CSS text)."""
    return _GLOBAL_CSS


def _finite(values) -> np.ndarray:
    """A float array with every non-finite value (the engine's +inf at a critical load) made NaN."""
    array = np.array(values, dtype=float)
    array[~np.isfinite(array)] = np.nan
    return array


def _nice(value: float) -> float:
    """The nearest 1, 2 or 5 times a power of ten at or above `value` (> 0): a slider step."""
    exponent = math.floor(math.log10(value))
    for mantissa in (1.0, 2.0, 5.0, 10.0):
        if mantissa * 10**exponent >= value * (1 - 1e-12):
            return mantissa * 10**exponent
    return 10.0 ** (exponent + 1)


def _slug(text: str) -> str:
    slug = re.sub(r"[^A-Za-z0-9]+", "-", text).strip("-").lower()[:48].strip("-")
    return slug or "case"


def _esc(text) -> str:
    return html.escape(str(text), quote=True)


def _download(callback, suffix: str, label: str, width: int, margin=(10, 3)):
    """A download button of the page: the file strutscope-case.<suffix>, written by `callback` on click."""
    return pn.widgets.FileDownload(
        callback=callback,
        filename=f"strutscope-case.{suffix}",
        label=label,
        color="light",
        width=width,
        margin=margin,
        stylesheets=[_WIDGET_CSS],
    )


class MemberPage(pn.viewable.Viewer):
    """The member explorer for one session: inputs, the axial-force control, plots, values and cautions.

    Parameters
    ----------
    model : MemberState, optional
        The state to show; a new one with the demo inputs when not given.
    """

    model = param.ClassSelector(
        class_=MemberState, doc="The page state: inputs (SI) and the engine's results."
    )
    show_transverse = param.Boolean(default=False, doc="Show the transverse force T beside the shear V.")

    def __init__(self, model: MemberState | None = None, **params) -> None:
        super().__init__(model=model if model is not None else MemberState(), **params)
        self._U = units(self.model.units)
        self._syncing = False
        self._numbers: list[tuple[object, str, str | None]] = []
        self._errors: list[tuple[pn.pane.HTML, tuple[str, ...], bool]] = []
        self._row_errors: list[tuple[pn.pane.HTML, tuple[str, ...], bool]] = []
        self._load_rows: list[dict] = []
        self._row_generation = 0
        self._row_types: list | None = None  # the load types the rows are (being) built for
        self._variants: list[dict] = []
        self._shown_cautions = None
        self._build_sources()
        self._build_figures()
        self._build_inputs()
        self._build_outputs()
        self._layout = self._build_layout()
        self.model.param.watch(self._on_result, ["result", "errors"])
        self.model.param.watch(self._on_chart, ["sweep", "approximation", "capacity", "chart_note"])
        self.model.param.watch(self._on_units, ["units"])
        self.model.param.watch(self._on_notice, ["notice"])
        self.model.param.watch(self._on_inputs, list(INPUTS))
        self.param.watch(self._on_transverse, ["show_transverse"])
        self._push_inputs()
        self._sync_load_rows()
        self._apply_units_to_figures()
        self._redraw(full=True)
        self._draw_chart()
        self._on_notice()
        if self.model.result is None:
            self._prescale_slider()

    def _prescale_slider(self) -> None:
        """Served, the first result comes after the page is sent: scale the slider from Pcr1 alone now.

        Only the critical loads are computed (they do not depend on the loads, so this is bounded work); the
        slider's range then need not change under the user's hand once the first result arrives.
        """
        import engine

        m = self.model
        try:
            pcr1 = float(engine.critical_loads(m.to_case(), count=1).critical_loads[0])
        except Exception:  # noqa: BLE001 - the first result scales it instead, and shows any message
            return
        force = m.axial_force if m.axial_force is not None else 0.0
        if not (math.isfinite(pcr1) and pcr1 > 0 and math.isfinite(force)):
            return
        self._syncing = True
        try:
            self._scale_slider(pcr1, force)
            shown = self._U.force.from_si(force)
            self.force_slider.value = min(max(shown, self.force_slider.start), self.force_slider.end)
            self.force_input.value = shown
        finally:
            self._syncing = False

    def __panel__(self):
        return self._layout

    # ================================================================== sources and figures

    def _build_sources(self) -> None:
        empty = {"x": []}
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
        self.sketch_lines = ColumnDataSource(data={"xs": [], "ys": [], "color": [], "width": [], "dash": []})
        self.sketch_arrows = ColumnDataSource(data={"x0": [], "y0": [], "x1": [], "y1": []})
        self.sketch_text = ColumnDataSource(data={"x": [], "y": [], "text": [], "align": [], "baseline": []})
        self.sketch_points = ColumnDataSource(data={"x": [], "y": [], "marker": [], "size": []})
        self.axial_arrows = ColumnDataSource(data={"x0": [], "y0": [], "x1": [], "y1": []})
        self.axial_text = ColumnDataSource(data={"x": [], "y": [], "text": [], "align": []})
        self.sweep_source = ColumnDataSource(data={"n": [], "moment": [], "deflection": []}, name="sweep")
        self.approximation_source = ColumnDataSource(data={"n": [], "value": []})
        self.current = ColumnDataSource(data={"n": [], "moment": [], "deflection": []}, name="current")
        self.critical_source = ColumnDataSource(data={"n": [], "text": [], "y": []})
        self.modes_source = ColumnDataSource(data={"x": [], "m1": [], "m2": [], "m3": []}, name="modes")
        del empty

    def _diagram(self, height: int, *, flipped: bool, x_axis: bool):
        fig = figure(
            height=height,
            sizing_mode="stretch_width",
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

    def _build_figures(self) -> None:
        self.x_range = Range1d(-0.5, 6.5)
        # ---- sketch: the member to scale along x; supports, loads, bow and axial force schematic across it
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
            "xs", "ys", source=self.sketch_lines, line_color="color", line_width="width", line_dash="solid"
        )
        sketch.scatter(
            "x",
            "y",
            marker="marker",
            size="size",
            source=self.sketch_points,
            fill_color="#ffffff",
            line_color=_MEMBER,
            line_width=1.5,
        )
        sketch.add_layout(
            Arrow(
                end=VeeHead(size=7, line_color=_LOAD, line_width=1.6),
                source=self.sketch_arrows,
                x_start="x0",
                y_start="y0",
                x_end="x1",
                y_end="y1",
                line_color=_LOAD,
                line_width=1.6,
            )
        )
        sketch.add_layout(
            Arrow(
                end=VeeHead(size=9, line_color=_MEMBER, line_width=2),
                source=self.axial_arrows,
                x_start="x0",
                y_start="y0",
                x_end="x1",
                y_end="y1",
                line_color=_MEMBER,
                line_width=2.5,
            )
        )
        sketch.add_layout(
            LabelSet(
                x="x",
                y="y",
                text="text",
                text_align="align",
                text_baseline="baseline",
                source=self.sketch_text,
                text_font_size="12px",
                text_color=_MEMBER,
            )
        )
        sketch.add_layout(
            LabelSet(
                x="x",
                y="y",
                text="text",
                text_align="align",
                text_baseline="middle",
                source=self.axial_text,
                text_font_size="12.5px",
                text_color=_MEMBER,
                text_font_style="bold",
            )
        )
        self.sketch = sketch

        # ---- deflection, moment, shear on one x range
        self.fig_w = self._diagram(124, flipped=True, x_axis=False)
        self.fig_M = self._diagram(124, flipped=True, x_axis=False)
        self.fig_V = self._diagram(150, flipped=False, x_axis=True)
        self.renderers = {}
        for fig, kind, second, first in (
            (self.fig_w, "w", "w2", "w1"),
            (self.fig_M, "M", "M2", "M1"),
            (self.fig_V, "V", "V2", "V1"),
        ):
            variants = [
                fig.line(
                    "x", kind, source=source, line_color=colour, line_width=2, line_alpha=0.75, visible=False
                )
                for source, colour in zip(self.variant_sources, _VARIANT_COLOURS, strict=False)
            ]
            if kind == "w":
                fig.line("x", "w0", source=self.stations, line_color=_BOW, line_width=1.6, line_dash="dotted")
            fig.line("x", first, source=self.stations, line_color=_FIRST, line_width=1.8, line_dash="6 4")
            main = fig.line("x", second, source=self.stations, line_color=_SECOND, line_width=2.6)
            extra = None
            if kind == "V":
                extra = fig.line(
                    "x", "T2", source=self.stations, line_color=_TRANSVERSE, line_width=2, visible=False
                )
                fig.scatter(
                    "x",
                    "y",
                    source=self.peaks["T"],
                    size=8,
                    marker="diamond",
                    fill_color=_TRANSVERSE,
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
                line_color=_FIRST,
                line_width=1.5,
            )
            fig.scatter("x", "y", source=self.peaks[kind], size=8, fill_color=_SECOND, line_color="#ffffff")
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
                    text_color=_SECOND,
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
            text_color=_TRANSVERSE,
            visible=False,
        )
        self.fig_V.add_layout(self.T_label)
        self.fig_V.xaxis.axis_label = "x [m]"

        # ---- amplification chart
        amp = figure(
            height=470,
            sizing_mode="stretch_width",
            y_range=Range1d(0, 8),
            x_range=Range1d(-2.05, 10),
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
                x_offset=4,
                text_font_size="12px",
                text_color="#a3261b",
            )
        )
        self.unstable_label = LabelSet(
            x="x",
            y="y",
            text="text",
            source=ColumnDataSource(
                data={"x": [1.0], "y": [0.25], "text": ["beyond Pcr1: unstable (the member buckles first)"]}
            ),
            x_offset=6,
            text_font_size="12.5px",
            text_color="#a3261b",
            text_font_style="bold",
        )
        amp.add_layout(self.unstable_label)
        r_exact_m = amp.line("n", "moment", source=self.sweep_source, line_color=_SECOND, line_width=2.6)
        r_exact_w = amp.line("n", "deflection", source=self.sweep_source, line_color=_BOW, line_width=2.2)
        r_approx = amp.line(
            "n",
            "value",
            source=self.approximation_source,
            line_color=_FIRST,
            line_width=1.8,
            line_dash="6 4",
        )
        r_now_m = amp.scatter(
            "n", "moment", source=self.current, size=11, fill_color=_SECOND, line_color="#fff"
        )
        amp.scatter(
            "n",
            "deflection",
            source=self.current,
            size=10,
            marker="square",
            fill_color=_BOW,
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
                location="top_left",
                label_text_font_size="12.5px",
                background_fill_alpha=0.85,
            )
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
        self.fig_amp = amp

        # ---- buckling modes
        modes = figure(
            height=440,
            sizing_mode="stretch_width",
            x_range=self.x_range,
            y_range=Range1d(-1.15, 1.15),
            tools="xpan,xwheel_zoom,reset",
            toolbar_location="right",
            min_border_left=62,
        )
        self.mode_items = []
        for n, (colour, dash) in enumerate(
            ((_SECOND, "solid"), (_BOW, "7 3"), (_TRANSVERSE, "2 3")), start=1
        ):
            r = modes.line(
                "x", f"m{n}", source=self.modes_source, line_color=colour, line_width=2.4, line_dash=dash
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
        self.fig_modes = modes

    # ================================================================== inputs

    def _label(self, text: str, kind: str | None, unit: Unit | None = None) -> str:
        if unit is None and kind is None:
            return text
        label = unit.label if unit is not None else self._U.label(kind)
        return f"{text} [{label}]"

    def _unit(self, kind: str | None) -> Unit | None:
        if kind is None:
            return None
        if kind == "section_modulus":
            # cm³ or in³: the area unit's length cubed (a units conversion, not a property of the section).
            area = self._U.area
            return Unit(label="cm³" if self._U.system == "si" else "in³", factor=area.factor**1.5)
        return self._U.unit(kind)

    def _number(self, name: str, text: str, kind: str | None, width: int = 130, **kwargs):
        unit = self._unit(kind)
        widget = pn.widgets.FloatInput(
            label=self._label(text, kind, unit),
            value=None,
            width=width,
            stylesheets=[_WIDGET_CSS],
            format="0[.][000000]",
            **kwargs,
        )
        widget._ss_text = text  # the label without its unit, for the units switch
        self._numbers.append((widget, name, kind))
        widget.param.watch(partial(self._number_edited, name, kind), "value")
        return widget

    def _select(self, name: str, text: str, options, width: int = 150):
        current = getattr(self.model, name)
        values = list(options.values()) if isinstance(options, dict) else list(options)
        widget = pn.widgets.Select(
            label=text,
            options=options,
            value=current if current in values else values[0],
            width=width,
            stylesheets=[_WIDGET_CSS],
        )
        widget.param.watch(partial(self._choice_edited, name), "value")
        self._choices.append((widget, name))
        return widget

    def _error_pane(self, *prefixes: str, exact: bool = False, rows: bool = False) -> pn.pane.HTML:
        """A pane for the engine's message on fields under `prefixes` (only those paths if `exact`)."""
        pane = pn.pane.HTML(
            "", visible=False, sizing_mode="stretch_width", stylesheets=[_CSS], margin=(0, 5, 4, 5)
        )
        (self._row_errors if rows else self._errors).append((pane, prefixes, exact))
        return pane

    def _build_inputs(self) -> None:
        self._choices: list[tuple[object, str]] = []
        m = self.model
        from engine.materials import material_names
        from engine.sections import catalogue_names

        # ---- header: units, downloads, upload
        self.units_switch = pn.widgets.RadioButtonGroup(
            options={"SI": "si", "US": "us"},
            value=m.units,
            color="light",
            width=100,
            margin=(10, 6),
            stylesheets=[_WIDGET_CSS],
        )
        self.units_switch.param.watch(lambda event: setattr(self.model, "units", event.new), "value")
        self.download_png = _download(self._png, "png", "Figure PNG", 104)
        self.download_csv = _download(self._csv, "csv", "Stations CSV", 112)
        self.download_pdf = _download(self._pdf, "pdf", "Calc sheet PDF", 124)
        self.download_json = _download(self._json, "json", "Save this case as JSON", 180, margin=(2, 4, 4, 6))
        self.upload = pn.widgets.FileInput(
            accept=".json,application/json",
            width=280,
            margin=(6, 4, 2, 6),
            stylesheets=[_WIDGET_CSS],
            description="open a case file (JSON, at most 1 MB); it replaces every input",
        )
        self.upload.param.watch(self._uploaded, "value")
        self.upload_message = pn.pane.HTML(
            "", stylesheets=[_CSS], sizing_mode="stretch_width", margin=(0, 5, 2, 5)
        )

        # ---- member and supports
        self.title_input = pn.widgets.TextInput(
            label="Case title",
            value=m.title,
            sizing_mode="stretch_width",
            stylesheets=[_WIDGET_CSS],
            max_length=200,
        )
        self.title_input.param.watch(self._title_edited, "value")
        self.length_input = self._number("length", "Span L", "length", width=140)
        support_options = {label: key for key, label in _SUPPORT_LABELS.items()}
        ends = {}
        for side, where in (("left", "Left end, x = 0 (bottom)"), ("right", "Right end, x = L (top)")):
            form = self._select(f"{side}_end", where, support_options, width=200)
            options = {"fixed": "fixed", "free": "free", "spring": "spring"}
            translation = self._select(f"{side}_translation", "translation", options, width=95)
            rotation = self._select(f"{side}_rotation", "rotation", options, width=95)
            k_t = self._number(f"{side}_k_t", "k_t", "translational_spring", width=130)
            k_r = self._number(f"{side}_k_r", "k_r", "rotational_spring", width=130)
            springs = pn.Column(pn.Row(translation, k_t, margin=0), pn.Row(rotation, k_r, margin=0), margin=0)
            ends[side] = {
                "form": form,
                "springs": springs,
                "translation": translation,
                "rotation": rotation,
                "k_t": k_t,
                "k_r": k_r,
            }
        self.ends = ends
        self.case_file = pn.Column(
            pn.pane.HTML(
                "<div class='ss-heading'>Case file (JSON)</div>", stylesheets=[_CSS], margin=(4, 5, 0, 5)
            ),
            self.upload,
            self.upload_message,
            self.download_json,
            margin=(0, 0, 6, 0),
            styles={"border-bottom": "1px solid #e4e7e1"},
            sizing_mode="stretch_width",
        )
        member_tab = pn.Column(
            self.case_file,
            self.title_input,
            self._error_pane("title"),
            self.length_input,
            self._error_pane("length"),
            ends["left"]["form"],
            ends["left"]["springs"],
            self._error_pane("supports.left"),
            ends["right"]["form"],
            ends["right"]["springs"],
            self._error_pane("supports.right"),
            self._error_pane("supports", exact=True),
            pn.pane.HTML(
                "<div class='ss-note'>x runs from the left end (the bottom of a post) to the right end. "
                "Springs: T(0) = k_t·w(0), M(0) = −k_r·w′(0) at the left end.</div>",
                stylesheets=[_CSS],
                sizing_mode="stretch_width",
            ),
            name="Member",
            margin=(4, 2),
            scroll=True,
        )

        # ---- section and material
        self.stiffness_select = self._select(
            "stiffness_from",
            "Bending stiffness from",
            {
                "section and material": "section",
                "EI given (no member check)": "EI",
                "EI given, section for the check": "both",
            },
            width=280,
        )
        self.EI_input = self._number("EI", "EI", "stiffness", width=150)
        self.factor_input = self._number("stiffness_factor", "factor on EI (analysis)", None, width=130)
        self.shape_select = self._select(
            "section_shape", "Section", {label: key for key, label in _SHAPE_LABELS.items()}, width=150
        )
        names = list(catalogue_names())
        self.catalogue_select = pn.widgets.Select(
            label="catalogue name", options=names, width=130, stylesheets=[_WIDGET_CSS]
        )
        self.catalogue_select.param.watch(self._catalogue_edited, "value")
        self.dimension_inputs = {}
        for key in ("h", "b", "tw", "tf", "r", "t", "D"):
            self.dimension_inputs[key] = self._number(
                f"section_{key}", _DIMENSION_LABELS[key], "small_length", width=92
            )
        for key, kind in (
            ("A", "area"),
            ("I", "second_moment"),
            ("W_el", "section_modulus"),
            ("W_pl", "section_modulus"),
            ("A_v", "area"),
        ):
            self.dimension_inputs[key] = self._number(
                f"section_{key}", _DIMENSION_LABELS[key], kind, width=92
            )
        self.manufacture_select = self._select(
            "section_manufacture",
            "made",
            {"hot-finished": "hot-finished", "cold-formed": "cold-formed"},
            width=120,
        )
        self.axis_select = self._select(
            "axis", "bending axis", {"major": "major", "minor": "minor"}, width=110
        )
        self.material_from_select = self._select(
            "material_from", "Material", {"catalogue": "catalogue", "custom (E, f_y)": "custom"}, width=130
        )
        self.material_select = pn.widgets.Select(
            label="grade", options=list(material_names()), width=130, stylesheets=[_WIDGET_CSS]
        )
        self.material_select.param.watch(self._material_edited, "value")
        self.material_E_input = self._number("material_E", "E", "stress", width=110)
        self.material_fy_input = self._number("material_fy", "f_y", "stress", width=110)
        self.section_facts = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width")
        self.section_group = pn.Column(
            pn.Row(self.shape_select, self.catalogue_select, margin=0),
            pn.FlexBox(*self.dimension_inputs.values(), margin=0, gap="0px"),
            pn.Row(self.manufacture_select, self.axis_select, margin=0),
            self._error_pane("section", "axis"),
            pn.Row(self.material_from_select, self.material_select, margin=0),
            pn.Row(self.material_E_input, self.material_fy_input, margin=0),
            self._error_pane("material"),
            margin=0,
        )
        section_tab = pn.Column(
            self.stiffness_select,
            self.EI_input,
            self._error_pane("EI"),
            self.section_group,
            self.factor_input,
            self._error_pane("stiffness_factor"),
            self.section_facts,
            name="Section",
            margin=(4, 2),
            scroll=True,
        )

        # ---- loads
        self.loads_column = pn.Column(margin=0, sizing_mode="stretch_width")
        self.add_type = pn.widgets.Select(
            label="add a load",
            options={v: k for k, v in _LOAD_LABELS.items()},
            value="point",
            width=110,
            stylesheets=[_WIDGET_CSS],
        )
        self.add_button = pn.widgets.Button(
            label="+ Add load", color="primary", width=110, margin=(22, 5, 5, 5), stylesheets=[_WIDGET_CSS]
        )
        self.add_button.on_click(lambda event: self.model.add_load(self.add_type.value))
        self.loads_note = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width")
        loads_tab = pn.Column(
            pn.Row(self.add_type, self.add_button, margin=0),
            self._error_pane("loads", exact=True),
            self.loads_column,
            self.loads_note,
            name="Loads",
            margin=(4, 2),
            scroll=True,
        )

        # ---- bow
        self.bow_from_select = self._select(
            "bow_from",
            "Initial bow from",
            {"code preset": "preset", "shape and amplitude": "shape"},
            width=180,
        )
        self.preset_select = self._select(
            "bow_preset", "preset", {_PRESET_LABELS[p]: p for p in BOW_PRESETS}, width=280
        )
        self.curve_select = self._select(
            "bow_curve", "buckling curve", {c: c for c in ("auto", "a0", "a", "b", "c", "d")}, width=100
        )
        self.analysis_select = self._select(
            "bow_analysis", "analysis", {"elastic": "elastic", "plastic": "plastic"}, width=100
        )
        self.direction_select = self._select(
            "bow_direction",
            "points",
            {"with the loads": "load", "+w": "positive", "−w": "negative"},
            width=130,
        )
        self.ratio_input = self._number("bow_ratio", "n of span/n", None, width=110)
        self.shape_bow_select = self._select(
            "bow_shape", "shape", {v: k for k, v in _BOW_SHAPE_LABELS.items()}, width=160
        )
        self.amplitude_input = self._number("bow_amplitude", "amplitude a", "small_length", width=110)
        self.bow_facts = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width")
        bow_tab = pn.Column(
            self.bow_from_select,
            self.preset_select,
            pn.Row(self.curve_select, self.analysis_select, margin=0),
            pn.Row(self.direction_select, self.ratio_input, margin=0),
            pn.Row(self.shape_bow_select, self.amplitude_input, margin=0),
            self._error_pane("imperfection"),
            self.bow_facts,
            name="Bow",
            margin=(4, 2),
            scroll=True,
        )

        # ---- check
        self.method_select = self._select(
            "check_method",
            "cross-section check",
            {"elastic stresses": "elastic", "plastic N–M": "plastic"},
            width=170,
        )
        self.gamma0_input = self._number("gamma_M0", "γ_M0", None, width=90)
        self.gamma1_input = self._number("gamma_M1", "γ_M1", None, width=90)
        self.limit_input = self._number("deflection_limit", "deflection limit span/n: n", None, width=170)
        self.out_of_plane_select = self._select(
            "out_of_plane",
            "out of plane",
            {"buckles (checked)": "buckles", "restrained": "restrained"},
            width=140,
        )
        self.out_of_plane_input = self._number(
            "out_of_plane_length", "out-of-plane L_cr (empty: L)", "length", width=150
        )
        self.prepared_input = pn.widgets.TextInput(
            label="prepared by (calc sheet)", width=140, max_length=60, stylesheets=[_WIDGET_CSS]
        )
        self.checked_input = pn.widgets.TextInput(
            label="checked by", width=120, max_length=60, stylesheets=[_WIDGET_CSS]
        )
        self.check_facts = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width")
        check_tab = pn.Column(
            self.method_select,
            pn.Row(self.gamma0_input, self.gamma1_input, margin=0),
            self.limit_input,
            pn.Row(self.out_of_plane_select, self.out_of_plane_input, margin=0),
            self._error_pane("check"),
            self._error_pane("out_of_plane"),
            self.check_facts,
            pn.Row(self.prepared_input, self.checked_input, margin=0),
            name="Check",
            margin=(4, 2),
            scroll=True,
        )

        self.input_tabs = pn.Tabs(
            member_tab,
            section_tab,
            loads_tab,
            bow_tab,
            check_tab,
            dynamic=True,  # only the shown tab is built and sent: the first page draws sooner
            width=318,
            sizing_mode="stretch_height",
            margin=(0, 4, 0, 6),
            stylesheets=[_WIDGET_CSS],
        )

        # ---- axial force: slider scaled to Pcr1, exact entry, live N, N/Pcr1 and α_cr
        self.force_slider = pn.widgets.FloatSlider(
            label="Axial force N",
            start=-1000.0,
            end=1000.0,
            step=1.0,
            value=0.0,
            show_value=False,
            sizing_mode="stretch_width",
            min_width=170,
            bar_color=_SECOND,
            margin=(2, 12, 0, 10),
            stylesheets=[_WIDGET_CSS],
        )
        self.force_slider.param.watch(self._slider_moved, "value")
        self.force_slider.param.watch(lambda event: self.model.settle(), "value_throttled")
        self.force_input = pn.widgets.FloatInput(
            label="N",
            value=None,
            width=98,
            format="0[.][000]",
            stylesheets=[_WIDGET_CSS],
            margin=(2, 4, 0, 4),
        )
        self.force_input.param.watch(self._force_typed, "value")
        self.readout = pn.pane.HTML("", stylesheets=[_CSS], width=222, margin=(4, 2, 0, 4))
        self.force_error = self._error_pane("axial_force")
        self.stale = pn.pane.HTML(
            "", stylesheets=[_CSS], visible=False, sizing_mode="stretch_width", margin=(0, 8, 2, 8)
        )

        # ---- variants
        self.keep_button = pn.widgets.Button(
            label="Keep as variant",
            color="default",
            width=170,
            height=28,
            margin=(0, 6, 0, 4),
            stylesheets=[_WIDGET_CSS],
        )
        self.keep_button.on_click(lambda event: self.keep_variant())
        self.clear_button = pn.widgets.Button(
            label="Clear variants", color="default", width=120, stylesheets=[_WIDGET_CSS]
        )
        self.clear_button.on_click(lambda event: self.clear_variants())

    # ================================================================== outputs and layout

    def _build_outputs(self) -> None:
        self.values_pane = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width", margin=(0, 4))
        self.cautions_pane = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width", margin=(0, 4))
        self.cautions_heading = pn.pane.HTML(
            "<div class='ss-heading'>Cautions</div>",
            stylesheets=[_CSS],
            margin=(2, 4, 0, 4),
            sizing_mode="stretch_width",
        )
        self.general_pane = pn.pane.HTML(
            "", stylesheets=[_CSS], sizing_mode="stretch_width", margin=(2, 4, 2, 4)
        )
        self.key_pane = pn.pane.HTML(
            "", stylesheets=[_CSS], sizing_mode="stretch_width", min_height=22, margin=(4, 4, 0, 4)
        )
        self.modes_title = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width", margin=(4, 8))
        self.amp_note = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width", margin=(4, 8))
        self.compare_pane = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width", margin=(4, 8))
        self.transverse_toggle = pn.widgets.Checkbox(
            label="T beside V",
            value=self.show_transverse,
            width=96,
            margin=(6, 4, 0, 4),
            stylesheets=[_WIDGET_CSS],
        )
        self.transverse_toggle.link(self, value="show_transverse")
        self.general_error = self._error_pane("case", "schema", "stations", exact=True)
        self.notice = pn.pane.HTML("", stylesheets=[_CSS], sizing_mode="stretch_width", margin=(0, 5))
        self.header_title = pn.pane.HTML(
            "", stylesheets=[_CSS], sizing_mode="stretch_width", min_width=80, margin=(18, 10, 0, 4)
        )

    def _build_layout(self):
        header = pn.Row(
            pn.pane.HTML(
                "<div class='ss-brand'>strutscope<span>member explorer</span></div>",
                stylesheets=[_CSS],
                margin=(12, 10, 0, 12),
                width=270,
            ),
            self.header_title,
            pn.pane.HTML(
                "<div class='ss-title' style='margin-top:6px'>Units</div>",
                stylesheets=[_CSS],
                margin=(12, 2, 0, 0),
                width=40,
            ),
            self.units_switch,
            pn.pane.HTML(
                "<div class='ss-title' style='margin-top:6px'>Export</div>",
                stylesheets=[_CSS],
                margin=(12, 2, 0, 14),
                width=48,
            ),
            self.download_png,
            self.download_csv,
            self.download_pdf,
            styles={"background": "#14263a"},
            sizing_mode="stretch_width",
            height=54,
            margin=0,
        )
        force = pn.Column(
            pn.Row(self.force_slider, self.force_input, self.readout, sizing_mode="stretch_width", margin=0),
            self.force_error,
            sizing_mode="stretch_width",
            margin=(4, 0, 0, 0),
        )
        diagrams = pn.Column(
            pn.Row(
                self.key_pane,
                self.transverse_toggle,
                self.keep_button,
                margin=(2, 0, 0, 0),
                sizing_mode="stretch_width",
            ),
            pn.pane.Bokeh(self.sketch, sizing_mode="stretch_width", margin=(0, 4)),
            pn.pane.Bokeh(self.fig_w, sizing_mode="stretch_width", margin=(0, 4)),
            pn.pane.Bokeh(self.fig_M, sizing_mode="stretch_width", margin=(0, 4)),
            pn.pane.Bokeh(self.fig_V, sizing_mode="stretch_width", margin=(0, 4)),
            name="Diagrams",
            sizing_mode="stretch_width",
            margin=0,
        )
        amplification = pn.Column(
            self.amp_note,
            pn.pane.Bokeh(self.fig_amp, sizing_mode="stretch_width"),
            name="Amplification",
            sizing_mode="stretch_width",
            margin=0,
        )
        modes = pn.Column(
            self.modes_title,
            pn.pane.Bokeh(self.fig_modes, sizing_mode="stretch_width"),
            name="Buckling modes",
            sizing_mode="stretch_width",
            margin=0,
        )
        variants = pn.Column(
            pn.Row(self.clear_button, margin=(4, 4)),
            self.compare_pane,
            name="Variants",
            sizing_mode="stretch_width",
            margin=0,
            scroll=True,
        )
        self.centre_tabs = pn.Tabs(
            diagrams,
            amplification,
            modes,
            variants,
            dynamic=True,  # only the shown tab is built and sent: the first page draws sooner
            sizing_mode="stretch_width",
            margin=0,
            stylesheets=[_WIDGET_CSS],
        )
        centre = pn.Column(
            force,
            self.stale,
            self.general_error,
            self.notice,
            self.centre_tabs,
            sizing_mode="stretch_both",
            margin=(0, 4),
            styles={"background": "#ffffff"},
        )
        # The values and the cautions each scroll in their own box, so that both stay in view however
        # many rows
        # the checks add (the member check heads the values); the general caution stays pinned below them.
        self.values_box = pn.Column(
            self.values_pane, scroll=True, sizing_mode="stretch_both", margin=0, min_height=200
        )
        self.cautions_box = pn.Column(
            self.cautions_pane, scroll=True, sizing_mode="stretch_both", margin=0, min_height=150
        )
        right = pn.Column(
            pn.pane.HTML(
                "<div class='ss-heading'>Governing values</div>", stylesheets=[_CSS], margin=(4, 4, 0, 4)
            ),
            self.values_box,
            self.cautions_heading,
            self.cautions_box,
            self.general_pane,
            width=372,
            sizing_mode="stretch_height",
            margin=(0, 6, 4, 0),
            styles={"background": "#ffffff"},
        )
        body = pn.Row(self.input_tabs, centre, right, sizing_mode="stretch_both", margin=(4, 0, 0, 0))
        return pn.Column(
            header,
            body,
            sizing_mode="stretch_both",
            margin=0,
            min_height=660,
            stylesheets=[":host { background: #f6f7f4; }"],
        )

    # ================================================================== widget → state

    def _number_edited(self, name: str, kind: str | None, event) -> None:
        if self._syncing:
            return
        unit = self._unit(kind)
        value = event.new
        if value is not None and unit is not None:
            value = unit.to_si(value)
        self.model.param.update({name: value})

    def _choice_edited(self, name: str, event) -> None:
        if not self._syncing:
            self.model.param.update({name: event.new})

    def _title_edited(self, event) -> None:
        if self._syncing:
            return
        title = clean_text(event.new) if isinstance(event.new, str) else event.new
        if title is not event.new and title != event.new:
            # A lone surrogate is not text (it could not be sent back to any browser): replaced, not kept.
            self._syncing = True
            try:
                self.title_input.value = title
            finally:
                self._syncing = False
        self.model.title = title

    def _catalogue_edited(self, event) -> None:
        if not self._syncing and event.new is not None:
            self.model.section_name = event.new

    def _material_edited(self, event) -> None:
        if not self._syncing and event.new is not None:
            self.model.material_name = event.new

    def _slider_moved(self, event) -> None:
        if self._syncing:
            return
        self.model.axial_force = self._U.force.to_si(event.new)

    def _force_typed(self, event) -> None:
        if self._syncing:
            return
        value = event.new
        self.model.axial_force = None if value is None else self._U.force.to_si(value)
        self.model.settle()

    def _load_edited(self, index: int, key: str, kind: str | None, event) -> None:
        if self._syncing:
            return
        value = event.new
        unit = self._unit(kind)
        if value is not None and unit is not None:
            value = unit.to_si(value)
        self.model.set_load(index, **{key: value})

    # ================================================================== state → widgets

    def _on_inputs(self, *events) -> None:
        names = {event.name for event in events}
        if names <= {"axial_force"}:
            return  # the force widgets follow the result, in _redraw
        self._push_inputs()
        if "loads" in names or "length" in names:
            self._sync_load_rows()

    def _push_inputs(self) -> None:
        """Show the state's inputs in the widgets (after a load, a link or a units switch)."""
        m = self.model
        self._syncing = True
        try:
            for widget, name, kind in self._numbers:
                value = getattr(m, name)
                unit = self._unit(kind)
                shown = value if value is None or unit is None else unit.from_si(value)
                if (
                    shown is None
                    or widget.value is None
                    or not math.isclose(widget.value, shown, rel_tol=1e-12, abs_tol=1e-300)
                ):
                    widget.value = shown
            for widget, name in self._choices:
                value = getattr(m, name)
                # None (a choice left to the engine, such as a CHS's manufacture) keeps the widget as it is.
                if value is not None and widget.value != value:
                    widget.value = value
            if self.title_input.value != m.title:
                self.title_input.value = m.title
            self._show_catalogue_name()
            if m.material_from == "catalogue":
                options = list(self.material_select.options)
                if m.material_name not in options:
                    self.material_select.options = [*options, m.material_name]
                self.material_select.value = m.material_name
            if self.units_switch.value != m.units:
                self.units_switch.value = m.units
        finally:
            self._syncing = False
        self._visibility()

    def _show_catalogue_name(self) -> None:
        name = self.model.section_name
        options = list(self.catalogue_select.options)
        compact = re.sub(r"[\s×]", "", str(name)).upper().replace("X", "x")
        match = next((o for o in options if re.sub(r"\s", "", o).upper().replace("X", "x") == compact), None)
        if match is None:
            self.catalogue_select.options = [*options, name]
            match = name
        self.catalogue_select.value = match

    def _visibility(self) -> None:
        m = self.model
        for side, parts in self.ends.items():
            elastic = getattr(m, f"{side}_end") == "elastic"
            parts["springs"].visible = elastic
            parts["k_t"].visible = elastic and getattr(m, f"{side}_translation") == "spring"
            parts["k_r"].visible = elastic and getattr(m, f"{side}_rotation") == "spring"
        uses_section = m.stiffness_from in ("section", "both")
        self.section_group.visible = uses_section
        self.EI_input.visible = m.stiffness_from in ("EI", "both")
        shape = m.section_shape
        self.catalogue_select.visible = shape == "catalogue"
        for key, widget in self.dimension_inputs.items():
            widget.visible = key in SECTION_DIMENSIONS.get(shape, ())
        self.manufacture_select.visible = shape in ("rhs", "chs")
        custom = m.material_from == "custom"
        self.material_select.visible = not custom
        self.material_E_input.visible = custom
        self.material_fy_input.visible = custom
        preset = m.bow_from == "preset"
        self.preset_select.visible = preset
        self.curve_select.visible = preset and m.bow_preset in ("en1993-table-5.1", "en1993-eq-5.9")
        self.analysis_select.visible = preset and m.bow_preset == "en1993-table-5.1"
        self.direction_select.visible = preset
        self.ratio_input.visible = preset and m.bow_preset == "span"
        self.amplitude_input.visible = not preset
        self.shape_bow_select.visible = True

    # ---- loads table: one row of widgets per load; rebuilt only when rows are added, removed or change type

    def _load_row_spec(self, load: dict) -> list[tuple[str, str, str | None]]:
        kind = load.get("type")
        if kind == "uniform":
            return [("q", "q", "line_load"), ("start", "from", "length"), ("end", "to", "length")]
        if kind == "linear":
            return [
                ("q_start", "q start", "line_load"),
                ("q_end", "q end", "line_load"),
                ("start", "from", "length"),
                ("end", "to", "length"),
            ]
        if kind == "point":
            return [("P", "P", "force"), ("x", "at x", "length")]
        if kind == "couple":
            return [("C", "C", "moment"), ("x", "at x", "length")]
        return []

    def _sync_load_rows(self) -> None:
        loads = self.model.loads[:MAX_LOAD_ROWS]
        types = [load.get("type") for load in loads]
        if types != self._row_types:
            self._build_load_rows()
        for row, load in zip(self._load_rows, loads, strict=False):
            self._fill_row(row, load)
        hidden = len(self.model.loads) - len(loads)
        self.loads_note.object = (
            (
                f"<div class='ss-note'>Loads {MAX_LOAD_ROWS + 1} to {len(self.model.loads)} are analysed and "
                f"drawn but not listed here (the page lists the first {MAX_LOAD_ROWS}): edit them in the "
                "case file.</div>"
                if hidden
                else ""
            )
            + "<div class='ss-note'>Positive loads act along +w (drawn downwards). Empty <i>from</i>/"
            "<i>to</i> means the member's end. A couple C makes M jump by +C.</div>"
            if loads
            else "<div class='ss-note'>No transverse loads: add one above.</div>"
        )

    def _fill_row(self, row: dict, load: dict) -> None:
        """Show `load`'s values (SI in the state) in its row's inputs, in display units."""
        self._syncing = True
        try:
            for key, widget, kind in row["inputs"]:
                unit = self._unit(kind)
                value = load.get(key)
                shown = None if value is None or isinstance(value, str) else unit.from_si(value)
                widget.label = self._label(widget._ss_text, kind)
                old = widget.value
                if shown is None or old is None or not math.isclose(old, shown, rel_tol=1e-12):
                    widget.value = shown
        finally:
            self._syncing = False

    def _build_load_rows(self) -> None:
        loads = self.model.loads[:MAX_LOAD_ROWS]
        self._row_types = [load.get("type") for load in loads]
        self._row_generation += 1
        self._row_errors = []  # the rows' error panes go with the rows
        self._load_rows = []
        runner = self.model._runner
        now = len(loads) if runner is None else min(len(loads), _ROWS_AT_ONCE)
        widgets = [self._make_row(index, loads[index]) for index in range(now)]
        self.loads_column.objects = widgets
        if now < len(loads):
            # Served: each row is a dozen widgets and their Bokeh models, about 0.1 s of the event loop that
            # every session shares (issue 11). The first rows go now and the rest on a later tick, so other
            # sessions' events run in between.
            self._append_rows_later(runner, now, self._row_generation)
        self._show_errors()

    def _append_rows_later(self, runner, start: int, generation: int) -> None:
        def append() -> None:
            loads = self.model.loads[:MAX_LOAD_ROWS]
            if generation != self._row_generation:
                return  # the rows were built again since
            with pn.io.hold():
                widgets = [self._make_row(index, loads[index]) for index in range(start, len(loads))]
                for row, load in zip(self._load_rows[start:], loads[start:], strict=False):
                    self._fill_row(row, load)
                self.loads_column.extend(widgets)  # one change: Bokeh walks the whole document per change
                self._show_errors()

        runner.later(append)

    def _make_row(self, index: int, load: dict):
        """The widgets of load row `index` (appended to ``_load_rows``); returns its column."""
        kind = load.get("type")
        type_select = pn.widgets.Select(
            label="",
            options={v: k for k, v in _LOAD_LABELS.items()},
            value=kind if kind in LOAD_TYPES else None,
            width=100,
            margin=(2, 4),
            stylesheets=[_WIDGET_CSS],
        )
        type_select.param.watch(partial(self._load_type_changed, index), "value")
        remove = pn.widgets.Button(
            label="Remove",
            width=74,
            margin=(2, 4),
            color="light",
            stylesheets=[_WIDGET_CSS],
            description=f"remove load {index + 1}",
        )
        remove.on_click(partial(self._remove_load, index))
        inputs = []
        for key, text, unit_kind in self._load_row_spec(load):
            widget = pn.widgets.FloatInput(
                label=self._label(text, unit_kind),
                value=None,
                width=68,
                format="0[.][000000]",
                margin=(0, 3),
                stylesheets=[_WIDGET_CSS],
                placeholder="end" if key in ("start", "end") else "",
            )
            widget._ss_text = text
            widget.param.watch(partial(self._load_edited, index, key, unit_kind), "value")
            inputs.append((key, widget, unit_kind))
        header = pn.pane.HTML(
            f"<div class='ss-heading'>Load {index + 1}</div>",
            stylesheets=[_CSS],
            width=66,
            margin=(8, 2, 0, 4),
        )
        error = self._error_pane(f"loads[{index}]", rows=True)
        self._load_rows.append({"type": kind, "inputs": inputs, "error": error})
        return pn.Column(
            pn.Row(header, type_select, remove, margin=0),
            pn.Row(*[widget for _, widget, _ in inputs], margin=0),
            error,
            margin=(0, 0, 6, 0),
            styles={"border-bottom": "1px solid #e4e7e1"},
        )

    def _load_type_changed(self, index: int, event) -> None:
        if not self._syncing and event.new is not None:
            self.model.set_load(index, type=event.new)

    def _remove_load(self, index: int, event=None) -> None:
        self.model.remove_load(index)

    # ================================================================== results → sources

    def _on_result(self, *events) -> None:
        names = {event.name for event in events}
        if "result" not in names:
            with pn.io.hold():
                self._show_errors()
            return
        result = self.model.result
        self._redraw(full=result is None or _case_identity(result.case) != self._drawn_case)

    def _on_notice(self, event=None) -> None:
        message = self.model.notice
        self.notice.object = f"<div class='ss-error ss-notice'>{_esc(message)}</div>" if message else ""

    def _on_chart(self, *events) -> None:
        with pn.io.hold():
            self._draw_chart()
            self._draw_values()

    def _on_units(self, event) -> None:
        self._U = units(event.new)
        with pn.io.hold():
            for widget, _, kind in self._numbers:
                widget.label = self._label(widget._ss_text, kind, self._unit(kind))
            self._apply_units_to_figures()
            self._push_inputs()
            self._sync_load_rows()
            self._redraw(full=True)
            self._draw_chart()

    def _on_transverse(self, event) -> None:
        extra = self.renderers["V"]["extra"]
        extra.visible = event.new
        self.T_label.visible = event.new
        for renderer in self.fig_V.select(name="T peak"):
            renderer.visible = event.new
        self._draw_key()

    _drawn_case = None

    def _apply_units_to_figures(self) -> None:
        U = self._U
        sl, mo, fo, le = U.label("small_length"), U.label("moment"), U.label("force"), U.label("length")
        self.fig_w.yaxis.axis_label = f"w + w0 [{sl}] ↓+"
        self.fig_M.yaxis.axis_label = f"M [{mo}] ↓+"
        self.fig_V.yaxis.axis_label = f"V [{fo}]"
        self.fig_V.xaxis.axis_label = f"x [{le}]"
        self.fig_modes.xaxis.axis_label = f"x [{le}]"
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
        self.force_slider.label = f"Axial force N [{fo}]"
        self.force_input.label = f"N [{fo}]"

    def _redraw(self, full: bool) -> None:
        """Push the current result into every source and pane; `full` also redraws what N does not change."""
        result = self.model.result
        with pn.io.hold():
            self._show_errors()
            if result is None:
                return
            if full or self._drawn_case is None:
                self._drawn_case = _case_identity(result.case)
                self._draw_case(result)
            self._draw_stations(result)
            self._draw_force(result)
            self._draw_values()
            self._draw_cautions(result)
            if self._variants:
                self.compare_pane.object = _comparison_table(result, self._variants, self._U)

    def _show_errors(self) -> None:
        m = self.model
        for pane, prefixes, exact in (*self._errors, *self._row_errors):
            if exact:
                message = next((m.errors[p] for p in prefixes if p in m.errors), "")
            else:
                message = m.error_for(*prefixes)
            text = f"<div class='ss-error'>{_esc(message)}</div>" if message else ""
            if pane.object != text:
                pane.object = text
            if pane.visible != bool(message):
                pane.visible = bool(message)
        if m.errors:
            message = next(iter(m.errors.values()))
            self.stale.object = (
                "<div class='ss-error'><b>Input not accepted — the plots and values show the last "
                f"good result.</b> {_esc(message)}</div>"
            )
            self.stale.visible = True
        elif self.stale.visible:
            self.stale.visible = False
            self.stale.object = ""

    def _draw_stations(self, result) -> None:
        U = self._U
        first = result.first_order
        sl, mo, fo, le = U.small_length.factor, U.moment.factor, U.force.factor, U.length.factor
        x = np.asarray(result.x) * le
        data = {
            "x": x,
            "w2": _finite(result.total_offset) * sl,
            "w1": _finite(first.total_offset) * sl,
            "w0": _finite(result.initial_bow) * sl,
            "M2": _finite(result.moment) * mo,
            "M1": _finite(first.moment) * mo,
            "V2": _finite(result.shear) * fo,
            "V1": _finite(first.shear) * fo,
            "T2": _finite(result.transverse_force) * fo,
        }
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

    def _draw_force(self, result) -> None:
        U = self._U
        pcr1 = float(result.critical_loads[0])
        P = float(result.axial_force)
        self._syncing = True
        try:
            self._scale_slider(pcr1, P)
            shown = U.force.from_si(P)
            # Served, a result can arrive after the slider has moved on (solves run off the event loop):
            # the widgets then keep the newer force rather than jump back.
            behind = self.model.axial_force is not None and self.model.axial_force != P
            if behind:
                pass
            elif not math.isclose(self.force_slider.value, shown, rel_tol=1e-9, abs_tol=1e-12):
                self.force_slider.value = min(max(shown, self.force_slider.start), self.force_slider.end)
            typed = self.force_input.value
            if not behind and (typed is None or not math.isclose(typed, shown, rel_tol=1e-12)):
                self.force_input.value = shown
        finally:
            self._syncing = False
        ratio = P / pcr1
        kind = "compression" if P > 0 else "tension" if P < 0 else "no axial force"
        badge = {"stable": "stable", "unstable": "unstable", "critical": "critical"}
        status = result.status
        self.readout.object = (
            f"<div class='ss-readout'><b>{_esc(U.show('force', P, digits=5))}</b> {kind}<br>"
            f"N/Pcr1 <b>{ratio:.3f}</b> · α<sub>cr</sub> <b>{_esc(_ratio_text(result.alpha_cr))}</b> "
            f"<span class='ss-badge ss-{status}'>{badge.get(status, status)}</span></div>"
        )
        n = ratio
        amplification = result.amplification
        self.current.data = {
            "n": [n],
            "moment": [_plain(amplification.moment)],
            "deflection": [_plain(amplification.deflection)],
        }
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

    def _scale_slider(self, pcr1: float, P: float) -> None:
        """Scale the slider to the case: from tension of Pcr1 to 1.25·Pcr1, in steps of about Pcr1/400."""
        f = self._U.force.factor
        step = _nice(pcr1 * f / 400.0)
        start = -math.ceil(pcr1 * f / step) * step
        end = math.ceil(1.25 * pcr1 * f / step) * step
        shown = P * f
        if shown < start:
            start = math.floor(shown / step) * step
        if shown > end:
            end = math.ceil(shown / step) * step
        slider = self.force_slider
        if (slider.start, slider.end, slider.step) != (start, end, step):
            slider.param.update(start=start, end=end, step=step)

    def _draw_case(self, result) -> None:
        """Everything that does not change with N: ranges, the sketch, the modes and the section facts."""
        case = result.case
        U = self._U
        le = U.length.factor
        L = case.length * le
        pad = 0.1 * L
        # No bounds: the browser would clamp the new range to the old bounds (a new length, another unit).
        self.x_range.update(start=-pad, end=L + pad, reset_start=-pad, reset_end=L + pad)
        self._draw_sketch(result)
        xs = np.linspace(0.0, case.length, 241)
        shapes = result.buckling.mode_shapes(xs)
        self.modes_source.data = {
            "x": xs * le,
            "m1": _finite(shapes[0]),
            "m2": _finite(shapes[1]),
            "m3": _finite(shapes[2]),
        }
        pcr = result.critical_loads
        for n, item in enumerate(self.mode_items):
            item.label = value(f"mode {n + 1}: Pcr{n + 1} = {U.show('force', pcr[n])}")
        K = result.buckling.effective_length_factor
        self.modes_title.object = (
            f"<div class='ss-readout'>Effective length factor <b>K = {K:.3f}</b> "
            f"(Pcr1 = π²EI/(K·L)²) &nbsp; EI = {_esc(U.show('stiffness', result.EI))}</div>"
            "<div class='ss-note'>First three elastic buckling modes of these supports, each scaled to a "
            "largest value of +1 (engine: exact characteristic equation, Wittrick–Williams count).</div>"
        )
        self._draw_section_facts(result)
        self.header_title.object = f"<div class='ss-title'>{_esc(case.title or '(untitled case)')}</div>"
        slug = _slug(case.title)
        for widget, extension in (
            (self.download_png, "png"),
            (self.download_csv, "csv"),
            (self.download_pdf, "pdf"),
            (self.download_json, "json"),
        ):
            widget.filename = f"strutscope-{slug}.{extension}"
        self._draw_variants()
        self._draw_key()

    def _draw_section_facts(self, result) -> None:
        U = self._U
        lines = [f"EI used = <b>{_esc(U.show('stiffness', result.EI))}</b>"]
        section = result.section
        if section is not None:
            lines.append(
                f"{_esc(section.name)}, {result.case.axis} axis: A = {_esc(U.show('area', section.A))}, "
                f"I = {_esc(U.show('second_moment', section.I))}, "
                f"i = {_esc(U.show('small_length', section.i))}"
            )
        if result.material is not None:
            lines.append(
                f"{_esc(result.material.name)}: E = {_esc(U.show('stress', result.material.E))}, "
                f"f_y = {_esc(U.show('stress', result.material.fy))}"
            )
        self.section_facts.object = "<div class='ss-note'>" + "<br>".join(lines) + "</div>"
        bow = result.bow
        if bow is not None:
            text = f"In use: {_esc(bow.label)}"
            if bow.curve_reason:
                text += f"<br>Curve: {_esc(bow.curve_reason)}"
            if bow.direction_governing and bow.automatic:
                both = "; ".join(
                    ("" if u is None else f"{d}: utilisation {_ratio_text(u)}, max|M| ")
                    + ("" if u is not None else f"{d}: max|M| ")
                    + U.show("moment", m)
                    for d, u, m in bow.directions
                )
                text += f"<br>Direction: {_esc(bow.direction)}, the worse of both solved ({_esc(both)})"
            elif bow.direction_governing:
                text += f"<br>Direction: {_esc(bow.direction_governing)}"
            if bow.favourable:
                text += "<br><b>The bow points the favourable way: reversed, it gives more.</b>"
        else:
            imperfection = result.case.imperfection
            text = (
                f"In use: {_esc(_BOW_SHAPE_LABELS.get(imperfection.shape, imperfection.shape))}, "
                f"a = {_esc(U.show('small_length', imperfection.amplitude))}"
            )
        self.bow_facts.object = f"<div class='ss-note'>{text}</div>"
        check = result.check
        if check is not None:
            resist = check.resistances
            parts = [
                f"{_esc(name)} = {_esc(U.show(kind, resist.get(name)))}"
                for name, kind in (("N_Rd", "force"), ("M_Rd", "moment"), ("V_Rd", "force"))
                if resist.get(name) is not None
            ]
            self.check_facts.object = (
                f"<div class='ss-note'>Resistances: {', '.join(parts)}<br>"
                f"Deflection allowed: {_esc(U.show('small_length', check.deflection_allowed))}"
                f"<br>{_esc(check.source)}</div>"
            )
        else:
            self.check_facts.object = (
                "<div class='ss-note'>No member check: give a section and a material (Section tab).</div>"
            )

    def _draw_sketch(self, result) -> None:
        case = result.case
        U = self._U
        le = U.length.factor
        L = case.length * le
        lines = {"xs": [], "ys": [], "color": [], "width": [], "dash": []}
        points = {"x": [], "y": [], "marker": [], "size": []}
        arrows = {"x0": [], "y0": [], "x1": [], "y1": []}
        text = {"x": [], "y": [], "text": [], "align": [], "baseline": []}

        def line(xs, ys, color=_MEMBER, width=1.5):
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
        line([0.0, L], [0.0, 0.0], _MEMBER, 4)
        bow = np.asarray(result.initial_bow, dtype=float)
        amplitude = float(np.max(np.abs(bow))) if bow.size else 0.0
        if amplitude > 0:
            line(np.asarray(result.x) * le, -0.42 * bow / amplitude, _BOW, 1.8)
            label(
                0.5 * L,
                -0.62,
                f"initial bow {U.show('small_length', amplitude)} (exaggerated)",
                "center",
                "top",
            )
        for side, x_end, outward in (("left", 0.0, -1.0), ("right", L, 1.0)):
            self._draw_support(getattr(case, side), x_end, outward, L, line, points, label)
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
                line(xs * le, tops, _LOAD, 1.4)
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
                line(cx + radius_x * np.cos(theta), radius_y * np.sin(sense * theta), _LOAD, 1.6)
                end_x = cx + radius_x * math.cos(1.8 * math.pi)
                end_y = radius_y * math.sin(sense * 1.8 * math.pi)
                arrows["x0"].append(cx + radius_x * math.cos(1.7 * math.pi))
                arrows["y0"].append(radius_y * math.sin(sense * 1.7 * math.pi))
                arrows["x1"].append(end_x)
                arrows["y1"].append(end_y)
                label(cx + 0.05 * L, 0.5, U.show("moment", ld.C), "left", "middle")
        self.sketch_lines.data = lines
        self.sketch_points.data = points
        self.sketch_arrows.data = arrows
        self.sketch_text.data = text

    @staticmethod
    def _draw_support(end, x_end, outward, L, line, points, label) -> None:
        """A support symbol of our own at one end: the restraints drawn as they act."""
        t, r = end.translation, end.rotation
        name = end.name
        u = 0.03 * L  # a unit of width along x
        if name == "pinned":
            points["x"].append(x_end)
            points["y"].append(-0.32)
            points["marker"].append("triangle")
            points["size"].append(18)
            line([x_end - 1.3 * u, x_end + 1.3 * u], [-0.62, -0.62], _MEMBER, 2)
        elif name == "fixed" or (t == "fixed" and r == "fixed"):
            line([x_end, x_end], [-0.8, 0.8], _MEMBER, 4)
            for y in np.linspace(-0.75, 0.75, 6):
                line([x_end, x_end + outward * 0.8 * u], [y, y - 0.2], _MEMBER, 1.2)
        elif name == "guided":
            # a sleeve: the end slides sideways but cannot turn
            line([x_end + outward * 0.4 * u, x_end + outward * 0.4 * u], [-0.8, 0.8], _MEMBER, 3)
            line([x_end + outward * 1.2 * u, x_end + outward * 1.2 * u], [-0.8, 0.8], _MEMBER, 1.2)
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
                line(xs, ys, _MEMBER, 1.5)
                line([x_end - 1.2 * u, x_end + 1.2 * u], [-1.05, -1.05], _MEMBER, 2)
            elif t == "fixed":
                points["x"].append(x_end)
                points["y"].append(-0.32)
                points["marker"].append("triangle")
                points["size"].append(18)
                line([x_end - 1.3 * u, x_end + 1.3 * u], [-0.62, -0.62], _MEMBER, 2)
            if not isinstance(r, str):  # rotation spring: a coil at the end
                theta = np.linspace(0, 3.2 * math.pi, 40)
                radius = np.linspace(0.1, 0.45, 40)
                line(
                    x_end + outward * 0.9 * u + radius * np.cos(theta) * u * 1.6,
                    radius * np.sin(theta) + 0.35,
                    _MEMBER,
                    1.3,
                )
            elif r == "fixed":
                line([x_end, x_end], [-0.5, 0.5], _MEMBER, 3)
            label(x_end + outward * 0.3 * u, 1.05, "springs", "left" if outward > 0 else "right", "middle")

    def _draw_chart(self) -> None:
        m = self.model
        result, sweep, approximation = m.result, m.sweep, m.approximation
        if result is None:
            return
        pcr = np.asarray(result.critical_loads, dtype=float)
        if sweep is not None:
            n = np.asarray(sweep.axial_force, dtype=float) / pcr[0]
            self.sweep_source.data = {
                "n": n,
                "moment": _finite(sweep.moment_amplification),
                "deflection": _finite(sweep.deflection_amplification),
            }
            self.fig_amp.x_range.update(start=float(n[0]) - 0.05, end=float(n[-1]))
        else:  # never the curves of another case
            self.sweep_source.data = {"n": [], "moment": [], "deflection": []}
        if approximation is not None:
            forces, values = approximation
            self.approximation_source.data = {"n": np.asarray(forces) / pcr[0], "value": _finite(values)}
        else:
            self.approximation_source.data = {"n": [], "value": []}
        U = self._U
        self.critical_source.data = {
            "n": list(pcr[:3] / pcr[0]),
            "y": [7.1, 6.6, 6.1],
            "text": [f"Pcr{k + 1} = {U.show('force', pcr[k])}" for k in range(3)],
        }
        note = f"<div class='ss-error'>{_esc(m.chart_note)}</div>" if m.chart_note else ""
        self.amp_note.object = note + (
            "<div class='ss-note'>Exact curves from the engine's sweep of the axial force (exact peaks "
            "at every force); the dashed line is the textbook 1/(1 − N/Pcr1) (Timoshenko &amp; Gere 1961, "
            "ch. 1), given below Pcr1 only. Vertical lines: the critical loads. Shaded: beyond Pcr1, "
            "where the member would have buckled (the linear solution is shown, as the textbooks plot "
            "it).</div>"
        )

    # ---- values and cautions

    def _draw_values(self) -> None:
        result = self.model.result
        if result is None:
            return
        self.values_pane.object = _values_table(
            result, self.model.capacity, self.model.capacity_note, self._U
        )

    def _draw_cautions(self, result) -> None:
        """The engine's cautions, most severe first; the general one is pinned below them, always in view."""
        cautions = tuple((c.level, c.code, c.message, c.source) for c in result.cautions)
        if cautions == self._shown_cautions:
            return
        self._shown_cautions = cautions

        def item(level, code, message, source):
            return (
                f"<li class='{level}' data-code='{_esc(code)}'><span class='lvl'>"
                f"{_LEVEL_NAMES.get(level, level)}</span>{_esc(message)}"
                f"<span class='src'>{_esc(source)}</span></li>"
            )

        general = [c for c in cautions if c[1] == "scope"] or [
            ("info", "scope", _GENERAL_CAUTION, "strutscope's scope")
        ]
        others = [c for c in cautions if c[1] != "scope"]
        counts = {level: sum(1 for c in others if c[0] == level) for level in ("danger", "warning", "info")}
        summary = " · ".join(f"{n} {_LEVEL_NAMES[level].lower()}" for level, n in counts.items() if n)
        self.cautions_heading.object = (
            f"<div class='ss-heading'>Cautions{' — ' + summary if summary else ''}</div>"
        )
        self.cautions_pane.object = "<ul class='ss-cautions'>" + "".join(item(*c) for c in others) + "</ul>"
        self.general_pane.object = "<ul class='ss-cautions general'>" + item(*general[0]) + "</ul>"

    def _draw_key(self) -> None:
        parts = [
            f"<i style='border-top: 3px solid {_SECOND}'></i>second order",
            f"<i style='border-top: 2px dashed {_FIRST}'></i>first order",
            f"<i style='border-top: 2px dotted {_BOW}'></i>bow w0",
        ]
        if self.show_transverse:
            parts.append(f"<i style='border-top: 3px solid {_TRANSVERSE}'></i>T")
        for variant, colour in zip(self._variants, _VARIANT_COLOURS, strict=False):
            force = self._U.show("force", variant["result"].axial_force)
            parts.append(
                f"<i style='border-top: 3px solid {colour}'></i>{_esc(variant['letter'])}: N {_esc(force)}"
            )
        self.key_pane.object = (
            "<div class='ss-key'>" + "".join(f"<span>{p}</span> " for p in parts) + "</div>"
        )

    # ================================================================== variants

    def keep_variant(self) -> None:
        """Keep the current result as a variant (at most four; the oldest goes first)."""
        result = self.model.result
        if result is None:
            return
        if len(self._variants) >= MAX_VARIANTS:
            self._variants.pop(0)
        used = {v["letter"] for v in self._variants}
        letter = next(ch for ch in _VARIANT_LETTERS if ch not in used)
        self._variants.append({"letter": letter, "result": result, "label": _variant_label(result, self._U)})
        with pn.io.hold():
            self._draw_variants()
            self._draw_key()

    def clear_variants(self) -> None:
        """Forget every variant."""
        self._variants = []
        with pn.io.hold():
            self._draw_variants()
            self._draw_key()

    def _draw_variants(self) -> None:
        U = self._U
        for i, source in enumerate(self.variant_sources):
            if i < len(self._variants):
                r = self._variants[i]["result"]
                source.data = {
                    "x": np.asarray(r.x) * U.length.factor,
                    "w": _finite(r.total_offset) * U.small_length.factor,
                    "M": _finite(r.moment) * U.moment.factor,
                    "V": _finite(r.shear) * U.force.factor,
                }
                visible = True
            else:
                source.data = {"x": [], "w": [], "M": [], "V": []}
                visible = False
            for kind in ("w", "M", "V"):
                self.renderers[kind]["variants"][i].visible = visible
        current = self.model.result
        self.keep_button.label = f"Keep as variant ({len(self._variants)}/{MAX_VARIANTS})"
        self.compare_pane.object = _comparison_table(current, self._variants, U)

    # ================================================================== downloads and upload

    def _png(self):
        from app.exports import png_bytes

        return io.BytesIO(png_bytes(self.model.result, units=self.model.units))

    def _csv(self):
        from app.exports import csv_text

        return io.StringIO(csv_text(self.model.result, units=self.model.units))

    def _pdf(self):
        from app.exports import pdf_bytes

        return io.BytesIO(
            pdf_bytes(
                self.model.result,
                units=self.model.units,
                prepared_by=self.prepared_input.value,
                checked_by=self.checked_input.value,
            )
        )

    def _json(self):
        from app.exports import case_json

        return io.StringIO(case_json(self.model.result.case))

    def _uploaded(self, event) -> None:
        """Load an uploaded case file whole, or refuse it whole with a message naming what was wrong.

        The server log gets one line per refusal, naming its kind only (never the file's contents).
        """
        from app.intake import IntakeError, case_from_bytes

        data, filename = event.new, self.upload.filename or "the file"
        if data is None:
            return
        name = clean_text(str(filename))
        kind = ""
        if not name.lower().endswith(".json"):
            message, kind = f"upload: {name} is not a .json case file", "name"
        elif len(data) > UPLOAD_LIMIT:
            message = f"upload: {name} is {len(data) / 1e6:.1f} MB; a case file may be at most 1 MB"
            kind = "size"
        else:
            try:
                case = case_from_bytes(data, f"upload: {name}")
            except IntakeError as error:
                message, kind = str(error), error.kind
            except Exception as error:  # noqa: BLE001 - never a traceback: say it, keep the case
                message, kind = f"upload: {name} could not be read ({type(error).__name__})", "error"
        if kind:
            _log.warning("strutscope: an upload was refused (%s)", kind)
            self.upload_message.object = f"<div class='ss-error'>{_esc(message)}</div>"
            return
        before = self.model.case_mapping()
        try:
            self.model.load_case(case)
        except Exception as error:  # noqa: BLE001 - never half applied: put the previous case back
            _log.warning("strutscope: an upload was refused (%s while loading)", type(error).__name__)
            self.model.load_mapping(before)
            message = f"upload: {name} could not be loaded ({type(error).__name__}); the previous case stays"
            self.upload_message.object = f"<div class='ss-error'>{_esc(message)}</div>"
            return
        self.upload_message.object = f"<div class='ss-note' style='color:#cfe3e6'>loaded {_esc(name)}</div>"


# ====================================================================== text of the value tables


def _case_identity(case) -> str:
    """A key of the case without its axial force: the sketch, modes and ranges change only when it does."""
    import dataclasses

    return repr(dataclasses.replace(case, axial_force=0.0))


def _plain(value) -> float:
    return math.nan if value is None or not math.isfinite(float(value)) else float(value)


def _ratio_text(value) -> str:
    if value is None:
        return "n/a"
    value = float(value)
    if math.isinf(value):
        return "∞ (no compression)" if value > 0 else "n/a"
    return f"{value:.3f}"


# Short forms of long check kinds, so that the values column does not wrap.
_SHORT_KINDS = {"out-of-plane buckling": "out of plane", "linear N–M, eq. (5.9) route": "eq. (5.9) N–M"}


def _kind_text(kind: str) -> str:
    return _SHORT_KINDS.get(kind, kind)


def _utilisation_text(value) -> str:
    """A utilisation; an unbounded one (above Pcr1, a class 4 section) reads "∞ fails"."""
    if value is not None and math.isinf(float(value)):
        return "∞ fails"
    return _ratio_text(value)


def _percent(error) -> str:
    if error is None or not math.isfinite(float(error)):
        return "n/a"
    return f"{float(error):+.1%}"


def _values_table(result, capacity, capacity_note: str, U) -> str:
    """The compact governing-values table (HTML) of `result` in units `U`."""
    rows: list[str] = []

    def head(text):
        rows.append(f"<tr><th colspan='3'>{_esc(text)}</th></tr>")

    def row(quantity, value, note="", danger=False, warn=False):
        css = " class='danger'" if danger else " class='warn'" if warn else ""
        rows.append(
            f"<tr{css}><td class='q'>{quantity}</td><td class='v'>{_esc(value)}</td>"
            f"<td class='f'>{_esc(note)}</td></tr>"
        )

    check = result.check
    head("Member check (second-order forces)")
    if check is not None:
        row(
            "utilisation",
            f"{_utilisation_text(check.utilization)} {_kind_text(check.kind)}",
            f"@ {U.show('length', check.x)}",
            check.utilization > 1,
        )
        row(
            "strength only",
            f"{_utilisation_text(check.strength_utilization)} {_kind_text(check.strength_kind)}",
            "" if check.section_class is None else f"class {check.section_class.klass}",
            check.strength_utilization > 1,
        )
        out = check.out_of_plane
        if out is not None and out.checked:
            row(
                "N/N<sub>b,Rd</sub> out of plane",
                _ratio_text(out.utilization),
                f"{out.axis}, χ {out.chi:.3f}",
                out.utilization > 1,
            )
        elif out is not None:
            row(
                "out of plane",
                "not checked",
                "restrained" if out.reason.startswith("restrained") else "see cautions",
            )
        service = result.service
        if service is not None:
            row(
                "deflection (service)",
                f"{_ratio_text(service.utilization)} {U.show('small_length', abs(service.deflection))}",
                "loads as given, no bow",
                False,
                service.utilization > 1,
            )
        if capacity is not None:
            row(
                "capacity N",
                U.show("force", capacity.axial_force),
                capacity.check,
                False,
                result.axial_force > capacity.axial_force,
            )
        elif capacity_note:
            row("capacity N", "n/a", capacity_note)
    else:
        row("utilisation", "n/a", "needs a section and material")
    first = result.first_order
    unstable = result.status != "stable"
    head("Second order · at x · first order")
    for label, field, kind in (
        ("max |w|", "deflection", "small_length"),
        ("max |w + w0|", "total_offset", "small_length"),
        ("max |M|", "moment", "moment"),
        ("max |V|", "shear", "force"),
    ):
        peak = getattr(result.governing, field)
        fpeak = getattr(first.governing, field)
        where = f" @ {U.show('length', peak.x)}" if math.isfinite(peak.value) else ""
        row(label, f"{U.show(kind, peak.magnitude)}{where}", U.show(kind, fpeak.magnitude), unstable)
    reactions = result.reactions
    head("End values, support side (T, M)")
    row("left end", f"{U.show('force', reactions.left_T)}, {U.show('moment', reactions.left_M)}")
    row("right end", f"{U.show('force', reactions.right_T)}, {U.show('moment', reactions.right_M)}")
    head("Buckling")
    pcr = result.critical_loads
    row("Pcr1", U.show("force", pcr[0]), f"K = {result.buckling.effective_length_factor:.3f}")
    row(
        "α<sub>cr</sub> = Pcr1/N",
        _ratio_text(result.alpha_cr),
        "",
        result.alpha_cr <= 1,
        result.axial_force > 0 and result.alpha_cr < 10,
    )
    head("Amplification · error of approximation")
    amplification = result.amplification
    row(
        "M ÷ (M<sub>I</sub> + N·w0)",
        _ratio_text(amplification.moment),
        f"w: {_ratio_text(amplification.deflection)}",
    )
    row("M ÷ M<sub>I</sub>", _ratio_text(amplification.moment_first_order), "bow not in M_I")
    if amplification.moment_bow_free is not None:
        row("M ÷ M<sub>I</sub>, no bow", _ratio_text(amplification.moment_bow_free), "for B1")
    for approximation in amplification.approximations:
        against = " (no bow)" if approximation.compared_with == "moment_bow_free" else ""
        error = _percent(approximation.error) + against
        row(_esc(approximation.name), _ratio_text(approximation.value), error)
    if not amplification.approximations:
        row("approximations", "none at or beyond Pcr1")
    return "<table class='ss-values'>" + "".join(rows) + "</table>"


def _variant_label(result, U) -> str:
    case = result.case
    section = result.section.name if result.section is not None else f"EI {U.show('stiffness', result.EI)}"
    ends = f"{case.left.name or 'elastic'}–{case.right.name or 'elastic'}"
    return f"N {U.show('force', result.axial_force)}, {section}, {ends}"


def _comparison_table(current, variants, U) -> str:
    if not variants:
        return (
            "<div class='ss-note'>No variants yet. Press <b>Keep as variant</b> (beside the axial force) to "
            "keep the current case; up to four are overlaid, muted, on the diagrams and compared here.</div>"
        )
    columns = [("current", current)] + [(v["letter"], v["result"]) for v in variants]

    def cells(fn):
        return "".join(f"<td>{_esc(fn(r))}</td>" for _, r in columns)

    def peak(field, kind):
        return lambda r: U.show(kind, getattr(r.governing, field).magnitude)

    rows = [
        ("case", lambda r: _variant_label(r, U)),
        ("length L", lambda r: U.show("length", r.case.length)),
        ("axial force N", lambda r: U.show("force", r.axial_force)),
        ("Pcr1", lambda r: U.show("force", r.critical_loads[0])),
        ("α_cr", lambda r: _ratio_text(r.alpha_cr)),
        ("max |w + w0|", peak("total_offset", "small_length")),
        ("max |M|", peak("moment", "moment")),
        ("max |V|", peak("shear", "force")),
        ("moment amplification", lambda r: _ratio_text(r.amplification.moment)),
        ("utilisation", lambda r: _ratio_text(r.utilization) if r.utilization is not None else "n/a"),
        ("status", lambda r: r.status),
    ]
    head = "".join(f"<th>{_esc(name)}</th>" for name, _ in columns)
    body = "".join(
        f"<tr{' class=case' if name == 'case' else ''}><td>{_esc(name)}</td>{cells(fn)}</tr>"
        for name, fn in rows
    )
    return f"<table class='ss-compare'><tr><th></th>{head}</tr>{body}</table>"
