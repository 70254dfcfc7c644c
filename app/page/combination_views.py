"""Load cases on the diagrams (issue 17): the envelope band, and the superposition shown wrong.

- :class:`EnvelopeBand` adds a shaded band to the w, M and V diagrams of the page
  (:class:`app.page.diagrams.DiagramsView`): with "envelope" chosen it spans the engine's envelope
  (``result.actions.ultimate`` for M and V,
  ``result.actions.service`` for w, which the service combinations give without the bow); hidden otherwise.
  It redraws the diagrams when the combination shown changes.
- :class:`SuperpositionView`, a centre tab: the shown combination solved whole against the sum of its load
  cases solved one by one, each at its own axial force (``engine.superposition.compare``), with the error.

Every number comes from the engine; the wording of the comparison from :mod:`app.report.combinations`.
"""

from __future__ import annotations

import numpy as np
import panel as pn
import param
from bokeh.models import ColumnDataSource, Legend, LegendItem
from bokeh.plotting import figure

from app.page.style import FIRST, SECOND, esc, finite, html_pane, lean, lean_figure
from app.state import MemberState
from app.state_actions import ENVELOPE, chosen_item
from app.units import units

__all__ = ["EnvelopeBand", "SuperpositionView", "superposition_of"]

_EMPTY = {"x": [], "lo": [], "hi": []}
_BAND = "#0d6e7a"


class EnvelopeBand:
    """The envelope band on the diagrams, shown with "envelope" chosen."""

    def __init__(self, state: MemberState, diagrams) -> None:
        self.state, self.diagrams = state, diagrams
        self.sources: dict = {}
        self.renderers: dict = {}
        state.param.watch(self._choice, ["combination_choice"])
        state.param.watch(lambda *_: self.draw(), ["result", "units"])
        self.draw()

    def _build(self) -> None:
        """The band's sources and renderers, made when the envelope is first chosen (a lean first page)."""
        diagrams = self.diagrams
        for kind, fig in (("w", diagrams.fig_w), ("M", diagrams.fig_M), ("V", diagrams.fig_V)):
            source = ColumnDataSource(data=dict(_EMPTY), name=f"envelope_{kind}")
            self.sources[kind] = source
            self.renderers[kind] = fig.varea(
                "x", "lo", "hi", source=source, fill_color=_BAND, fill_alpha=0.18, level="underlay"
            )
            lean(self.renderers[kind])

    def _choice(self, *_) -> None:
        with pn.io.hold():
            self.diagrams.draw(full=False)  # the lines follow the combination shown
            self.draw()

    def draw(self) -> None:
        """Fill the band from the result's envelopes, or empty it."""
        state = self.state
        actions = getattr(state.result, "actions", None)
        if actions is None or state.combination_choice != ENVELOPE:
            for source in self.sources.values():
                if len(source.data["x"]):
                    source.data = dict(_EMPTY)
            return
        if not self.sources:
            self._build()
        U = units(state.units)
        le = U.length.factor
        for kind, envelope, field, factor in (
            ("M", actions.ultimate, "moment", U.moment.factor),
            ("V", actions.ultimate, "shear", U.force.factor),
            ("w", actions.service or actions.ultimate, "deflection", U.small_length.factor),
        ):
            if envelope is None:
                self.sources[kind].data = dict(_EMPTY)
                continue
            self.sources[kind].data = {
                "x": np.asarray(envelope.x) * le,
                "lo": finite(getattr(envelope, f"{field}_min")) * factor,
                "hi": finite(getattr(envelope, f"{field}_max")) * factor,
            }


def superposition_of(state: MemberState):
    """``engine.superposition.compare`` of the shown combination (for '' and 'envelope': the largest |M|)."""
    result = state.result
    actions = getattr(result, "actions", None)
    if actions is None:
        return None
    from engine.superposition import compare

    item = chosen_item(result, state.combination_choice)
    if item is None:  # the governing one or the envelope: the combination with the largest |M|, as the CLI
        row = actions.governing_for("moment")
        item = actions.of(row.combination) if row is not None else actions.combinations[0]
    return compare(actions.case, item.combination, stations=actions.stations)


class SuperpositionView(pn.viewable.Viewer):
    """Exact combined M against the sum of the separately amplified load cases, with the error."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.source = ColumnDataSource(data={"x": [], "exact": [], "summed": []}, name="superposition")
        fig = figure(
            height=260,
            sizing_mode="stretch_width",
            tools="",
            toolbar_location=None,
            min_border_left=62,
        )
        fig.y_range.flipped = True
        exact = fig.line("x", "exact", source=self.source, line_color=SECOND, line_width=2.6)
        summed = fig.line("x", "summed", source=self.source, line_color=FIRST, line_width=2, line_dash="6 4")
        fig.add_layout(
            Legend(
                items=[
                    LegendItem(label="exact, solved together", renderers=[exact]),
                    LegendItem(label="sum of the load cases solved alone", renderers=[summed]),
                ],
                location="bottom_center",
                orientation="horizontal",
            ),
            "below",
        )
        lean_figure(fig)
        self.figure = fig
        self.text = html_pane(sizing_mode="stretch_width", margin=(4, 8), css_classes=["ss-superposition"])
        self.panel = pn.Column(
            self.text,
            pn.pane.Bokeh(fig, sizing_mode="stretch_width"),
            sizing_mode="stretch_both",
            margin=0,
        )
        state.param.watch(lambda *_: self.show(), ["result", "units", "combination_choice"])
        self.show()

    def __panel__(self):
        return self.panel

    def show(self) -> None:
        """Compare the shown combination (nothing without load cases)."""
        state = self.state
        U = units(state.units)
        try:
            comparison = superposition_of(state)
        except Exception as error:  # noqa: BLE001 - secondary view: say what failed, keep the page
            name = esc(type(error).__name__)
            self.text.object = f"<div class='ss-error'>The comparison could not be made ({name})</div>"
            return
        if comparison is None:
            self.source.data = {"x": [], "exact": [], "summed": []}
            self.text.object = (
                "<div class='ss-note'>Superposition needs load cases: add them at the top of the Loads "
                "tab.</div>"
            )
            return
        mo = U.moment.factor
        self.source.data = {
            "x": np.asarray(comparison.x) * U.length.factor,
            "exact": finite(comparison.moment_exact) * mo,
            "summed": finite(comparison.moment_superposed) * mo,
        }
        self.figure.yaxis.axis_label = f"M [{U.label('moment')}] ↓+"
        self.figure.xaxis.axis_label = f"x [{U.label('length')}]"
        from app.report import words
        from app.report.combinations import superposition_error

        parts = " + ".join(
            f"{factor:g} {name} at N = {words.axial_text(axial, U)}"
            for name, factor, axial in comparison.parts
        )
        shown = superposition_error(comparison)
        exact = esc(U.show("moment", comparison.moment_peak_exact))
        summed = esc(U.show("moment", comparison.moment_peak_superposed))
        name = esc(comparison.combination)
        self.text.object = (
            f"<div class='ss-heading'>Superposition shown wrong: combination {name}</div>"
            "<table class='ss-table' style='width:100%;font-size:12px'>"
            f"<tr><td>exact, solved together</td><td><b>max|M| = {exact}</b></td></tr>"
            f"<tr><td>sum of the load cases solved alone</td><td><b>max|M| = {summed}</b></td></tr>"
            f"<tr><td>error of the sum</td><td><b>{esc(shown)}</b></td></tr></table>"
            f"<div class='ss-note'>The parts: {esc(parts)}; both sides without the bow. The error is small "
            "near N = 0 and large near Pcr1.</div>"
        )
