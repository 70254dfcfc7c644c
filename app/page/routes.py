"""The routes of the member check on the page (issue 14): the block beside the governing values, and the
figure of each route's utilisation against the axial force.

:class:`RoutesView` sits at the top of the right-hand column: each route's utilisation, its governing term,
and whether it counts toward the headline (the worst route that counts, marked ★) or is shown for
comparison; under it one line on the planes (one plane and the out-of-plane choice, or both planes). Every
word comes from :mod:`app.report.routes`.

:class:`RoutesChart` is a centre tab, built when first shown: the utilisation of each route from N = 0 to near
the first critical load (:mod:`app.state_routes`, computed once per case off the event loop), the line of
utilisation 1, and a vertical marker at the axial force on screen, moved on each step of the slider.
"""

from __future__ import annotations

import math

import numpy as np
import panel as pn
import param
from bokeh.models import ColumnDataSource, Legend, LegendItem, Range1d, Span
from bokeh.plotting import figure

from app.page.style import esc, html_pane
from app.page.words import symbols
from app.report.combinations import service_strength, utilisation_line
from app.report.routes import (
    headline_exceeds_routes,
    headline_text,
    other_axis,
    plane_axes,
    plane_name,
    route_name,
    route_rows,
)
from app.state import MemberState
from app.state_actions import view_result
from app.units import units

__all__ = ["RoutesChart", "RoutesView", "planes_text", "routes_html"]

#: A colour per route (and the headline's), distinct from the diagrams' second/first-order colours.
ROUTE_COLOURS = {"second-order": "#1f5fa8", "en-member": "#c0621a", "aisc": "#5b8c2a", "headline": "#142838"}
_STATUS = {"headline": "★ headline", "counts": "counts", "for comparison": "comparison"}


def planes_text(result, U) -> str:
    """One line on the planes: both analysed, or the plane analysed and what happens out of it."""
    own, other = plane_axes(result)
    if getattr(result, "second_plane", None) is not None:
        return f"Both planes analysed: {plane_name(own)} and {plane_name(other)}."
    out = None if result.check is None else result.check.out_of_plane
    text = f"One plane: {plane_name(own)}. Out of plane ({plane_name(other_axis(own))}): "
    if out is None:
        strength = service_strength(result, brief=True)  # a service combination: on the ultimate ones
        return text + (f"{strength}." if strength else "not checked (no member check).")
    if not out.checked:
        if out.reason.startswith("restrained"):
            return text + "buckling prevented (restrained, as the case says)."
        return text + f"not checked ({out.reason})."
    return text + f"flexural buckling checked, L_cr = {U.show('length', out.buckling_length)}."


def routes_html(result, U) -> str:
    """The routes block (HTML): a row per route, the headline marked, then the planes line."""
    rows = route_rows(result, U)
    parts = []
    if rows:
        head = next((r for r in rows if r["status"] == "headline"), None)
        title = "Routes" + (f" — headline {head['utilisation']}" if head else "")
        if headline_exceeds_routes(result):
            title = f"Routes — headline {headline_text(result)}"
        parts.append(f"<div class='ss-heading'>{esc(title)}</div><table class='ss-routes'>")
        parts.append("<colgroup><col class='q'><col class='v'><col class='f'></colgroup>")
        for row in rows:
            danger = row["danger"]
            css = " class='danger'" if danger else ""
            muted = " style='opacity:0.75'" if row["status"] == "for comparison" else ""
            term = "" if row["term_in_words"] else (row["governing"] or row["reason"] or "")
            parts.append(
                f"<tr{css}{muted} data-route='{esc(row['route'])}'><td class='q'>{symbols(row['name'])}</td>"
                f"<td class='v'>{symbols(row['utilisation'])} {symbols(term)}</td>"
                f"<td class='f'>{esc(_STATUS[row['status']])}</td></tr>"
            )
        parts.append("</table>")
    else:
        parts.append("<div class='ss-heading'>Routes</div>")
        strength = utilisation_line(result, U) if service_strength(result) else ""
        if strength:
            parts.append(f"<div class='ss-note ss-service-strength'>{symbols(strength)}</div>")
    parts.append(f"<div class='ss-note ss-planes'>{symbols(planes_text(result, U))}</div>")
    return "".join(parts)


class RoutesView(pn.viewable.Viewer):
    """The routes block beside the governing values."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.block = html_pane(margin=(2, 4, 4, 4), css_classes=["ss-routes-block"])
        state.param.watch(lambda *_: self.draw(), ["result", "units", "errors", "combination_choice"])
        self.draw()

    def __panel__(self):
        return self.block

    def draw(self) -> None:
        """Word the result's routes in the page's units (with load cases, the combination shown's); dimmed
        while the inputs are refused."""
        result = view_result(self.state) if self.state.result is not None else None
        if result is None:
            return
        text = routes_html(result, units(self.state.units))
        if self.state.errors:
            text = f"<div class='ss-stale-values'>{text}</div>"
        if self.block.object != text:
            self.block.object = text


class RoutesChart(pn.viewable.Viewer):
    """Each route's utilisation against the axial force, with the axial force on screen marked."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.sources = {
            code: ColumnDataSource(data={"N": [], "u": []}, name=f"route_{code}") for code in ROUTE_COLOURS
        }
        self.figure = figure(
            height=320,
            sizing_mode="stretch_both",
            tools="pan,wheel_zoom,reset",
            toolbar_location=None,
            min_border_left=56,
            min_border_right=14,
        )
        self.figure.yaxis.axis_label = "utilisation [-]"
        self.figure.y_range = Range1d(0.0, 1.5)
        self.figure.grid.grid_line_color = "#e4e7e1"
        self.figure.add_layout(Span(location=1.0, dimension="width", line_color="#a3261b", line_dash="4 3"))
        self.marker = Span(location=0.0, dimension="height", line_color="#142838", line_width=1.5)
        self.figure.add_layout(self.marker)
        self.lines = {}
        for code, colour in ROUTE_COLOURS.items():
            headline = code == "headline"
            self.lines[code] = self.figure.line(
                "N",
                "u",
                source=self.sources[code],
                line_color=colour,
                line_width=4 if headline else 2.2,
                line_alpha=0.35 if headline else 1.0,
            )
        # Below the plot, not over it: inside, the legend hid the N marker at small forces (a new user's
        # report).
        self.legend = Legend(
            items=[], label_text_font_size="12px", spacing=0, padding=4, margin=2, glyph_height=14
        )
        self.figure.add_layout(self.legend, "below")
        self.note = html_pane(margin=(2, 6))
        self.panel = pn.Column(
            self.note,
            pn.pane.Bokeh(self.figure, sizing_mode="stretch_both", min_height=260, margin=(0, 4)),
            sizing_mode="stretch_both",
            margin=0,
        )
        state.param.watch(lambda *_: self.draw(), ["route_sweep", "route_note", "units"])
        state.param.watch(lambda *_: self.draw_marker(), ["result", "units"])
        state.want_route_sweep()
        self.draw()

    def __panel__(self):
        return self.panel

    def draw(self) -> None:
        """Plot the sweep in the display units (or say why there is none yet)."""
        state = self.state
        sweep = state.route_sweep
        U = units(state.units)
        self.figure.xaxis.axis_label = f"axial force N [{U.label('force')}] (compression)"
        with pn.io.hold():
            if sweep is None:
                for source in self.sources.values():
                    source.data = {"N": [], "u": []}
                note = state.route_note or "computing the routes …"
                self.note.object = f"<div class='ss-note'>{esc(note)}</div>"
                self.legend.items = []
                self.draw_marker()
                return
            forces = np.asarray(sweep["forces"], dtype=float) * U.force.factor
            result = state.result
            items = []
            for code in ROUTE_COLOURS:
                values = sweep["headline"] if code == "headline" else sweep["routes"].get(code)
                if values is None:
                    self.sources[code].data = {"N": [], "u": []}
                    continue
                self.sources[code].data = {"N": forces, "u": np.asarray(values, dtype=float)}
                if code == "headline":
                    label = "headline (worst route that counts)"
                else:
                    label = route_name(code, result)
                    if not sweep["enabled"].get(code, False):
                        label += " — for comparison"
                items.append(LegendItem(label=label, renderers=[self.lines[code]]))
            self.legend.items = items
            shown = [np.asarray(source.data["u"], dtype=float) for source in self.sources.values()]
            finite = np.concatenate([u[np.isfinite(u)] for u in shown] + [np.zeros(1)])
            # Up to 3 at most, so that the routes' differences near 1 stay readable (pan or zoom for more).
            self.figure.y_range.start, self.figure.y_range.end = (
                0.0,
                float(np.clip(finite.max() * 1.08, 1.2, 3.0)),
            )
            top = float(forces[-1]) if forces.size else 0.0
            self.note.object = (
                "<div class='ss-note'>Utilisation of each route from N = 0 to "
                f"{esc(U.show('force', top / U.force.factor))} (0.95 times the lowest critical load of the "
                "member, either plane or out of plane), each point solved exactly; "
                f"{esc(sweep['note'] + '; ' if sweep['note'] else '')}the vertical line is the N on screen."
                "</div>"
            )
            self.draw_marker()

    def draw_marker(self) -> None:
        """Move the vertical marker to the axial force on screen."""
        result = self.state.result
        if result is None:
            return
        value = float(result.axial_force) * units(self.state.units).force.factor
        self.marker.location = value if math.isfinite(value) else 0.0
