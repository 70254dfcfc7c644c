"""The inputs of issue 14: the loads of either bending plane, and the route settings of the member check.

:class:`PlaneLoadsView` is the Loads tab: a switch between the plane analysed and the second plane (bending
about the other axis), each with its own loads table (:class:`app.page.loads.LoadsView`, a second instance
for the second plane, built when first shown), and for the second plane its supports and whether the member
bends in it at all. :class:`RouteSettingsView` is the part of the Check tab that chooses which routes count
toward the headline utilisation, the EN 1993-1-1 Annex and the AISC method.
"""

from __future__ import annotations

import panel as pn
import param

from app.page.fields import ErrorPanes, UnitNumber
from app.page.loads import LoadsView
from app.page.style import SUPPORT_LABELS, WIDGET_CSS, html_pane
from app.report.routes import other_axis, plane_name
from app.state import MemberState
from app.state_plane import PLANE_SUPPORTS, ROUTE_CODES

__all__ = ["PlaneLoadsView", "RouteSettingsView"]

_FROM_FILE = "as in the case file"
# The routes by name without their settings (the Annex and the method are chosen beside them).
_ROUTE_LABELS = {
    "second-order": "second order + cross-section",
    "en-member": "EN 1993-1-1 equivalent member",
    "aisc": "AISC 360-16 (H1.1)",
}


class PlaneLoadsView(pn.viewable.Viewer):
    """The Loads tab: the plane analysed, or the second plane with its supports and loads."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, errors: ErrorPanes, **params) -> None:
        super().__init__(state=state, **params)
        self.errors = errors
        self.loads = LoadsView(state)
        self.second_loads: LoadsView | None = None
        self.plane_switch = pn.widgets.RadioButtonGroup(
            options=self._options(), value="own", color="light", margin=(4, 4, 2, 4), stylesheets=[WIDGET_CSS]
        )
        self.plane_switch.param.watch(lambda *_: self._switch(), "value")
        self.enable = pn.widgets.Checkbox(
            label="", value=state.plane2, margin=(4, 6), stylesheets=[WIDGET_CSS]
        )
        self.enable.param.watch(self._enabled, "value")
        support_options = {SUPPORT_LABELS.get(k, k): k for k in PLANE_SUPPORTS}
        self.ends = {
            side: pn.widgets.Select(
                label=where, options=dict(support_options), width=140, stylesheets=[WIDGET_CSS]
            )
            for side, where in (("left", "left end, x = 0"), ("right", "right end, x = L"))
        }
        for side, widget in self.ends.items():
            widget.param.watch(lambda event, side=side: self._support(side, event), "value")
        self.stiffness = UnitNumber(
            "EI about the other axis",
            "stiffness",
            get=lambda: state.plane2_EI,
            put=lambda value: state.param.update(plane2_EI=value),
            system=lambda: state.units,
            width=170,
        )
        self.second = pn.Column(
            self.enable,
            pn.Row(self.ends["left"], self.ends["right"], margin=0),
            self.stiffness.widget,
            errors.pane("second_plane.supports", "second_plane.imperfection", "second_plane.EI"),
            errors.pane("second_plane", exact=True),
            html_pane(
                "<div class='ss-note'>The second plane's initial bow is the code's default (EN 1993-1-1 "
                "Table 5.1, pointing with its loads). Its x runs as in the plane analysed.</div>"
            ),
            margin=0,
            visible=False,
        )
        self.holder = pn.Column(self.loads, margin=0, sizing_mode="stretch_both")
        self.panel = pn.Column(
            self.plane_switch, self.second, self.holder, name="Loads", margin=0, sizing_mode="stretch_both"
        )
        state.param.watch(
            lambda *_: self.show(),
            ["plane2", "plane2_left", "plane2_right", "plane2_EI", "axis", "stiffness_from", "units"],
        )
        self.show()

    def __panel__(self):
        return self.panel

    def _options(self) -> dict:
        own = self.state.axis
        return {plane_name(own): "own", f"2nd plane: {plane_name(other_axis(own))}": "second"}

    def _switch(self) -> None:
        second = self.plane_switch.value == "second"
        if second and self.second_loads is None:
            self.second_loads = LoadsView(self.state, field="plane2_loads")
        self.second.visible = second
        self.holder.objects = [self.second_loads if second else self.loads]
        self._show_loads()

    def _show_loads(self) -> None:
        if self.second_loads is not None:
            self.second_loads.panel.visible = self.state.plane2

    def _enabled(self, event) -> None:
        if self.state.plane2 != event.new:
            self.state.plane2 = event.new

    def _support(self, side: str, event) -> None:
        if event.new in PLANE_SUPPORTS and getattr(self.state, f"plane2_{side}") != event.new:
            self.state.param.update({f"plane2_{side}": event.new})

    def show(self) -> None:
        """Show the state's second-plane inputs (after a load, a link or an edit)."""
        state = self.state
        options = self._options()
        if self.plane_switch.options != options:
            self.plane_switch.options = options
        other = plane_name(other_axis(state.axis))
        self.enable.name = f"the member also bends about the {other}"
        if self.enable.value != state.plane2:
            self.enable.value = state.plane2
        for side, widget in self.ends.items():
            value = getattr(state, f"plane2_{side}")
            names = {SUPPORT_LABELS.get(k, k): k for k in PLANE_SUPPORTS}
            if not isinstance(value, str) or value not in PLANE_SUPPORTS:
                names[_FROM_FILE] = _FROM_FILE  # a spring from a case file: kept as it came
                value = _FROM_FILE
            if widget.options != names:
                widget.options = names
            if widget.value != value:
                widget.value = value
            widget.disabled = not state.plane2
        self.stiffness.show()
        self.stiffness.widget.visible = state.plane2 and state.stiffness_from in ("EI", "both")
        self._show_loads()


class RouteSettingsView(pn.viewable.Viewer):
    """Which routes count toward the headline, the EN 1993-1-1 Annex, the AISC method and its analysis."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.routes = pn.widgets.CheckBoxGroup(
            options={_ROUTE_LABELS[code]: code for code in ROUTE_CODES},
            value=list(state.routes),
            inline=False,
            margin=(0, 6),
            stylesheets=[WIDGET_CSS],
        )
        self.routes.param.watch(self._routes, "value")
        self.annex = self._select(
            "annex", "EN 1993-1-1 factors", {"Annex B (method 2)": "B", "Annex A (method 1)": "A"}, 172
        )
        self.method = self._select("aisc_method", "AISC 360-16", {"LRFD (φ)": "LRFD", "ASD (Ω)": "ASD"}, 100)
        self.analysis = self._select(
            "aisc_analysis",
            "AISC analysis",
            {"effective length (App. 7)": "effective-length", "direct analysis (§C2.3)": "direct"},
            180,
        )
        self.panel = pn.Column(
            html_pane(
                "<div class='ss-heading'>Routes that count</div><div class='ss-note'>The headline "
                "utilisation is the worst of the routes ticked; the others are shown for comparison.</div>"
            ),
            self.routes,
            pn.Row(self.annex, self.method, margin=0),
            self.analysis,
            margin=0,
        )
        state.param.watch(lambda *_: self.show(), ["routes", "annex", "aisc_method", "aisc_analysis"])

    def __panel__(self):
        return self.panel

    def _routes(self, event) -> None:
        chosen = [code for code in ROUTE_CODES if code in (event.new or [])]
        if chosen != list(self.state.routes):
            self.state.routes = chosen

    def _select(self, name: str, label: str, options: dict, width: int):
        """A select of the state's setting ``name``, writing it when changed."""
        widget = pn.widgets.Select(
            label=label,
            options=options,
            value=getattr(self.state, name),
            width=width,
            stylesheets=[WIDGET_CSS],
        )
        widget.param.watch(lambda event: self._set(name, event.new), "value")
        return widget

    def _set(self, name: str, value) -> None:
        if value is not None and getattr(self.state, name) != value:
            self.state.param.update({name: value})

    def show(self) -> None:
        """Show the state's route settings."""
        state = self.state
        if list(self.routes.value) != list(state.routes):
            self.routes.value = [code for code in ROUTE_CODES if code in state.routes]
        if self.annex.value != state.annex:
            self.annex.value = state.annex
        if self.method.value != state.aisc_method:
            self.method.value = state.aisc_method
        if self.analysis.value != state.aisc_analysis:
            self.analysis.value = state.aisc_analysis
