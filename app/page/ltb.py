"""Lateral-torsional buckling on the page (issue 15): its settings in the Check tab and its own centre tab.

:class:`LtbSettingsView` is the part of the Check tab that sets the case file's ``check.ltb``: where the loads
act over the depth and the lateral and warping condition of each end (state inputs of
:mod:`app.state_ltb`; they travel in the link and the case file with every other input).

:class:`LtbView` is the "LTB" centre tab, built when first shown: the figures of the check (both critical
moments and their difference, λ̄_LT, χ_LT, M_b,Rd, the utilisation; or why the check could not be made), the
settings and the method, then the first lateral-torsional buckling mode: its lateral displacement v and its
twist φ along the member, each scaled to a largest value of 1 as the engine gives them. Every word comes from
:mod:`app.report.ltb`; the governing-values table shows the same figures in short (:mod:`app.page.words`).
"""

from __future__ import annotations

import re

import numpy as np
import panel as pn
import param
from bokeh.core.properties import value
from bokeh.models import ColumnDataSource, Legend, LegendItem, Range1d, Span
from bokeh.plotting import figure

from app.page.style import CSS, SECOND, TRANSVERSE, WIDGET_CSS, esc, finite, html_pane
from app.report.combinations import service_strength
from app.report.ltb import LOAD_POSITION_LABELS, ltb_of, ltb_words
from app.state import MemberState
from app.state_actions import view_result
from app.state_ltb import CHI_METHODS, LATERAL_ENDS, LOAD_POSITIONS, WARPING_ENDS
from app.units import units

__all__ = ["LtbSettingsView", "LtbView", "ltb_details_html", "ltb_html", "subscripts"]

_FROM_FILE = "as in the case file"
_POSITION_OPTIONS = {
    "destabilising (loaded flange)": "destabilising",
    "at the shear centre": "shear-centre",
    "stabilising (far flange)": "stabilising",
}
_CHI_OPTIONS = {"§6.3.2.2, general case": "general", "§6.3.2.3, rolled or welded I": "rolled"}
_LATERAL_OPTIONS = {"by support": "supports", "fork": "fork", "fixed": "fixed"}
_WARPING_OPTIONS = {"free": "free", "fixed": "fixed"}


def subscripts(text: str) -> str:
    """`text` escaped for HTML, with the index of each symbol as a subscript: ``M_cr`` → M<sub>cr</sub>."""
    return re.sub(r"(?<=\w|̄)_([A-Za-z0-9]+(?:,[A-Za-z0-9]+)?)", r"<sub>\1</sub>", esc(text))


def ltb_html(result, U) -> str:
    """The check's figures (HTML): a heading and a table, or why the check was not made, or that there is
    none."""
    words = ltb_words(result, U)
    strength = service_strength(result, brief=True)
    if words is None and strength:  # a service combination shown: strength on the ultimate combinations
        return f"<div class='ss-note ss-ltb-none'>Lateral-torsional buckling is {esc(strength)}.</div>"
    if words is None:
        return (
            "<div class='ss-note ss-ltb-none'>No lateral-torsional buckling check: it needs a section and a "
            "material (Section tab).</div>"
        )
    parts = ["<div class='ss-heading'>Lateral-torsional buckling, major axis</div>"]
    if not words.applies:
        if words.caution:
            parts.append(
                f"<div class='ss-error ss-ltb-reason'>Not checked: {subscripts(words.reason)}. The caution "
                "about lateral-torsional buckling stays (see Cautions).</div>"
            )
        else:
            parts.append(f"<div class='ss-note ss-ltb-reason'>Not checked: {subscripts(words.reason)}.</div>")
        return "".join(parts)
    parts.append("<table class='ss-values ss-ltb'>")
    parts.append("<colgroup><col class='q'><col class='v'><col class='f'></colgroup>")
    for key, label, shown, note in words.rows:
        css = " class='danger'" if key == "utilisation" and words.fails else ""
        parts.append(
            f"<tr{css} data-ltb='{esc(key)}'><td class='q'>{subscripts(label)}</td>"
            f"<td class='v'>{subscripts(shown)}</td><td class='f'>{subscripts(note)}</td></tr>"
        )
    parts.append("</table>")
    return "".join(parts)


def ltb_details_html(result, U) -> str:
    """The settings, the method and the sources of the check (HTML; "" without a check)."""
    words = ltb_words(result, U)
    if words is None:
        return ""
    parts = [f"<div class='ss-note ss-ltb-settings'>Settings: {subscripts(words.settings)}.</div>"]
    if words.method:
        parts.append(f"<div class='ss-note'>Method: {subscripts(words.method)}.</div>")
    if words.sources:
        parts.append(f"<div class='ss-note'>Sources: {esc('; '.join(words.sources))}.</div>")
    return "".join(parts)


#: The LTB table's own column widths: the notes beside the figures are longer than the values table's.
LTB_CSS = """
table.ss-ltb col.q { width: 21%; } table.ss-ltb col.v { width: 24%; } table.ss-ltb col.f { width: 55%; }
"""


class LtbSettingsView(pn.viewable.Viewer):
    """The ``check.ltb`` settings: load position, lateral and warping condition of each end."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.position = pn.widgets.Select(
            label="LTB load position", options=dict(_POSITION_OPTIONS), width=260, stylesheets=[WIDGET_CSS]
        )
        self.position.param.watch(lambda event: self._set("ltb_load_position", event.new), "value")
        self.chi_method = pn.widgets.Select(
            label="χ_LT by EN 1993-1-1", options=dict(_CHI_OPTIONS), width=260, stylesheets=[WIDGET_CSS]
        )
        self.chi_method.param.watch(lambda event: self._set("ltb_chi_method", event.new), "value")
        self.restrained = pn.widgets.Checkbox(
            label="compression flange restrained along the member (LTB prevented)",
            value=state.ltb_restrained is True,
            margin=(4, 6),
            stylesheets=[WIDGET_CSS],
        )
        self.restrained.param.watch(self._restrained, "value")
        self.ends = {}
        for kind, options in (("lateral", _LATERAL_OPTIONS), ("warping", _WARPING_OPTIONS)):
            for side, where in (("left", "x = 0"), ("right", "x = L")):
                widget = pn.widgets.Select(
                    label=f"{kind} end, {where}", options=dict(options), width=130, stylesheets=[WIDGET_CSS]
                )
                name = f"ltb_{kind}_{side}"
                widget.param.watch(lambda event, name=name: self._set(name, event.new), "value")
                self.ends[name] = widget
        self.note = html_pane(
            "<div class='ss-note'>Destabilising (the default, the conservative choice): the loads act at the "
            "flange they come from, z<sub>g</sub> = +h/2; stabilising: at the other flange. Fork: the end is "
            "held laterally and against twist but free to turn about the minor axis. By support (the "
            "default): a fork where the support holds the end (in the minor-axis plane when it is given), "
            "free where it moves. §6.3.2.2 (the default) "
            "usually gives the lower χ<sub>LT</sub>.</div>"
        )
        self.panel = pn.Column(
            html_pane("<div class='ss-heading'>Lateral-torsional buckling</div>"),
            self.position,
            pn.Row(self.ends["ltb_lateral_left"], self.ends["ltb_lateral_right"], margin=0),
            pn.Row(self.ends["ltb_warping_left"], self.ends["ltb_warping_right"], margin=0),
            self.chi_method,
            self.restrained,
            self.note,
            margin=0,
        )
        state.param.watch(
            lambda *_: self.show(), ["ltb_load_position", "ltb_chi_method", "ltb_restrained", *self.ends]
        )
        self.show()

    def __panel__(self):
        return self.panel

    def _set(self, name: str, chosen) -> None:
        if chosen is None or chosen == _FROM_FILE or getattr(self.state, name) == chosen:
            return
        self.state.param.update({name: chosen})

    def _restrained(self, event) -> None:
        if self.state.ltb_restrained is not event.new:
            self.state.ltb_restrained = bool(event.new)

    @staticmethod
    def _show(widget, options: dict, allowed, current) -> None:
        options = dict(options)
        if current not in allowed:  # a value from a file or link no widget offers: kept, the engine names it
            options[_FROM_FILE] = _FROM_FILE
            current = _FROM_FILE
        if widget.options != options:
            widget.options = options
        if widget.value != current:
            widget.value = current

    def show(self) -> None:
        """Show the state's settings (after a load, a link or an edit)."""
        state = self.state
        self._show(self.position, _POSITION_OPTIONS, LOAD_POSITIONS, state.ltb_load_position)
        self._show(self.chi_method, _CHI_OPTIONS, CHI_METHODS, state.ltb_chi_method)
        restrained = state.ltb_restrained is True
        if self.restrained.value != restrained:
            self.restrained.value = restrained
        for widget in (self.position, self.chi_method, *self.ends.values()):
            widget.disabled = restrained  # prevented: nothing else of the check is used
        for name, widget in self.ends.items():
            lateral = "_lateral_" in name
            self._show(
                widget,
                _LATERAL_OPTIONS if lateral else _WARPING_OPTIONS,
                LATERAL_ENDS if lateral else WARPING_ENDS,
                getattr(state, name),
            )


class LtbView(pn.viewable.Viewer):
    """The LTB tab: the check's figures and the first buckling mode's lateral and twist components."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.source = ColumnDataSource(data={"x": [], "v": [], "phi": []}, name="ltb_mode")
        self.readout = pn.pane.HTML(
            "",
            stylesheets=[CSS, LTB_CSS],
            sizing_mode="stretch_width",
            margin=(2, 8),
            css_classes=["ss-ltb-block"],
        )
        self.caption = html_pane(margin=(0, 8))
        self.details = html_pane(margin=(2, 8))
        self._figure()
        self.plot = pn.pane.Bokeh(self.figure, sizing_mode="stretch_width", height=250, margin=(0, 4))
        # The figures first, then the buckled shape (both in view at 1280×720), then how they were found.
        self.panel = pn.Column(
            self.readout,
            self.plot,
            self.caption,
            self.details,
            name="LTB",
            sizing_mode="stretch_both",
            margin=0,
            scroll=True,
        )
        state.param.watch(lambda *_: self.draw(), ["result", "units", "errors", "combination_choice"])
        self.draw()

    def __panel__(self):
        return self.panel

    def _figure(self) -> None:
        plot = figure(
            height=250,
            sizing_mode="stretch_width",
            x_range=Range1d(0.0, 1.0),
            y_range=Range1d(-1.15, 1.15),
            tools="xpan,xwheel_zoom,reset",
            toolbar_location="right",
            min_border_left=62,
        )
        lateral = plot.line("x", "v", source=self.source, line_color=SECOND, line_width=2.6)
        twist = plot.line(
            "x", "phi", source=self.source, line_color=TRANSVERSE, line_width=2.4, line_dash="7 3"
        )
        self.items = [
            LegendItem(label=value("lateral displacement v"), renderers=[lateral]),
            LegendItem(label=value("twist φ"), renderers=[twist]),
        ]
        plot.add_layout(
            Legend(
                items=self.items,
                location="bottom_left",
                label_text_font_size="12.5px",
                background_fill_alpha=0.85,
            )
        )
        plot.add_layout(Span(location=0, dimension="width", line_color="#9aa3a8", line_width=1))
        plot.yaxis.axis_label = "first LTB mode (each largest |value| 1)"
        for axis in (plot.xaxis, plot.yaxis):
            axis.axis_label_text_font_style = "normal"
            axis.axis_label_text_font_size = "13px"
            axis.major_label_text_font_size = "12.5px"
        self.figure = plot

    def draw(self) -> None:
        """Word the check and draw its mode in the page's units (with load cases, the combination shown's);
        dimmed while the inputs are refused."""
        state = self.state
        if state.result is None:
            return
        result = view_result(state)
        U = units(state.units)
        text = ltb_html(result, U)
        if state.errors:
            text = f"<div class='ss-stale-values'>{text}</div>"
        if self.readout.object != text:
            self.readout.object = text
        details = ltb_details_html(result, U)
        if self.details.object != details:
            self.details.object = details
        ltb = ltb_of(result)
        length = float(result.case.length) * U.length.factor
        self.figure.x_range.start, self.figure.x_range.end = 0.0, length
        self.figure.xaxis.axis_label = f"x [{U.label('length')}]"
        if ltb is None or not ltb.applies or not len(ltb.mode_x):
            self.source.data = {"x": [], "v": [], "phi": []}
            self.plot.visible = False
            if ltb is None:
                caption = "No buckling mode to draw: no member check."
            elif ltb.applies:
                caption = (
                    "No buckling mode to draw: the axial force alone leaves no lateral stiffness (above)."
                )
            else:
                caption = "No buckling mode to draw: the check could not be made (see above)."
        else:
            self.plot.visible = True
            self.source.data = {
                "x": np.asarray(ltb.mode_x, dtype=float) * U.length.factor,
                "v": finite(ltb.mode_v),
                "phi": finite(ltb.mode_phi),
            }
            at = LOAD_POSITION_LABELS.get(ltb.load_position, ltb.load_position).split(":")[0]
            caption = (
                "First lateral-torsional buckling mode at M<sub>cr</sub>: the lateral displacement v of the "
                "shear centre and the twist φ of the section, each scaled to a largest value of 1 (loads "
                f"{esc(at)})."
            )
        self.caption.object = f"<div class='ss-note ss-ltb-caption'>{caption}</div>"
