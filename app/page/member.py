"""The member explorer page: the views of :mod:`app.page`, each bound to one :class:`MemberState`, composed.

Layout (1280×720): a header (title, units, the exports and a copy of the link), the inputs on the left in five
tabs, the axial-force control and the keep button above the diagrams in the centre (with the amplification
chart, the buckling modes and the variants in tabs beside the diagrams), and the governing values and the
cautions on the right. Below 1180 px wide the page scrolls sideways rather than cut anything off.
"""

from __future__ import annotations

import logging
import math

import panel as pn
import param

from app.page.actions import CombinationBar, GoverningView, LoadCasesView
from app.page.amplification import AmplificationView
from app.page.combination_views import EnvelopeBand, SuperpositionView
from app.page.diagrams import DiagramsView
from app.page.fields import ErrorPanes
from app.page.files import FilesView
from app.page.force import ForceControl
from app.page.inputs import InputsView
from app.page.ltb import LtbView
from app.page.messages import state_message
from app.page.modes import ModesView
from app.page.results import CautionsView, ValuesView
from app.page.routes import RoutesChart, RoutesView
from app.page.style import WIDGET_CSS, esc, html_pane
from app.page.variants import VariantsView
from app.state import MemberState

__all__ = ["MemberPage"]

_log = logging.getLogger(__name__)

#: The narrowest the page lays itself out [px]; a narrower window (1024×768) scrolls sideways, so nothing is
#: cut off that cannot be scrolled into view.
MIN_WIDTH = 1180


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

    def __init__(self, model: MemberState | None = None, **params) -> None:
        super().__init__(model=model if model is not None else MemberState(), **params)
        state = self.model
        self.errors = ErrorPanes(state)
        self.files = FilesView(state, signatures=self._signatures)
        self.inputs = InputsView(state, self.errors)
        self.variants = VariantsView(state)
        self.force = ForceControl(state, self.errors, beside=self.variants.keep_button)
        self.diagrams = DiagramsView(state)
        # Load cases (issue 17): the envelope band, the picker above the diagrams, what governs, the tab.
        self.band = EnvelopeBand(state, self.diagrams)
        self.combination_bar = CombinationBar(state)
        self.governing = GoverningView(state)
        self.load_cases = LoadCasesView(state)
        # The amplification chart and the modes are built when first shown (or first asked for): about a
        # sixth of the page's build at start-up, for tabs that most sessions open later or never.
        self._later = {
            1: lambda: AmplificationView(state),
            2: lambda: ModesView(state, self.diagrams.x_range),
            4: lambda: RoutesChart(state),
            5: lambda: LtbView(state),
            6: lambda: SuperpositionView(state),
        }
        self._holders = {index: pn.Column(sizing_mode="stretch_both", margin=0) for index in self._later}
        self._built: dict[int, pn.viewable.Viewer] = {}
        self.routes = RoutesView(state)
        self.values = ValuesView(state)
        self.cautions = CautionsView(state)
        self.variants.param.watch(lambda event: setattr(self.diagrams, "variants", event.new), ["kept"])
        self.stale = html_pane(visible=False, margin=(0, 8, 2, 8))
        self.notice = html_pane(margin=(0, 5))
        self.general_error = self.errors.pane("case", "schema", "stations", exact=True)
        self.header_title = html_pane(min_width=60, margin=(18, 10, 0, 4), styles={"flex": "1 1 0"})
        self.units_switch = pn.widgets.RadioButtonGroup(
            options={"SI": "si", "US": "us"},
            value=state.units,
            color="light",
            width=100,
            margin=(10, 6),
            stylesheets=[WIDGET_CSS],
        )
        self.units_switch.param.watch(lambda event: setattr(self.model, "units", event.new), "value")
        self._layout = self._build_layout()
        state.param.watch(lambda *_: self.show_state(), ["result", "errors", "units"])
        state.param.watch(lambda *_: self._notice(), ["notice"])
        self.show_state()
        self._notice()
        if state.result is None:
            self._prescale_slider()

    def __panel__(self):
        return self._layout

    # ------------------------------------------------------------------ public shortcuts used by scripts

    @property
    def stations(self):
        """The plotted stations (a Bokeh ColumnDataSource, display units)."""
        return self.diagrams.stations

    @property
    def force_slider(self):
        """The axial-force slider (its value is a position from 0 to 1, see :mod:`app.page.force`)."""
        return self.force.slider

    @property
    def force_input(self):
        """The exact axial-force entry, in display units."""
        return self.force.entry

    @property
    def length_input(self):
        """The span field, in display units."""
        return self.inputs.length_input

    @property
    def title_input(self):
        """The case title field."""
        return self.inputs.title_input

    @property
    def upload(self):
        """The case-file upload widget."""
        return self.files.upload

    @property
    def upload_message(self):
        """The message about the last upload."""
        return self.files.upload_message

    @property
    def amplification(self) -> AmplificationView:
        """The amplification chart's view (built now if its tab was never shown)."""
        return self._view(1)

    @property
    def modes(self) -> ModesView:
        """The buckling modes' view (built now if its tab was never shown)."""
        return self._view(2)

    @property
    def routes_chart(self) -> RoutesChart:
        """The routes-against-N figure's view (built now if its tab was never shown)."""
        return self._view(4)

    @property
    def ltb(self) -> LtbView:
        """The lateral-torsional buckling tab's view (built now if its tab was never shown)."""
        return self._view(5)

    def _view(self, index: int):
        if index in self._later and index not in self._built:
            self._built[index] = view = self._later[index]()
            self._holders[index].objects = [view]
        return self._built.get(index)

    def keep_variant(self) -> None:
        """Keep the current result as a variant."""
        self.variants.keep()

    # ------------------------------------------------------------------ composition

    def _signatures(self) -> tuple[str, str]:
        return self.inputs.prepared_input.value, self.inputs.checked_input.value

    def _prescale_slider(self) -> None:
        """Served, the first result comes after the page is sent: scale the slider from Pcr1 alone now.

        Only the critical loads are computed (they do not depend on the loads, so this is bounded work); the
        slider's range then need not change under the user's hand once the first result arrives.
        """
        import engine

        try:
            pcr1 = float(engine.critical_loads(self.model.to_case(), count=1).critical_loads[0])
        except Exception:  # noqa: BLE001 - the first result scales it instead, and shows any message
            return
        if math.isfinite(pcr1):
            self.force.scale(pcr1)

    def _build_layout(self):
        header = pn.Row(
            html_pane(
                "<div class='ss-brand'>strutscope<span>member explorer</span></div>",
                sizing_mode="fixed",
                margin=(12, 10, 0, 12),
                width=250,
            ),
            self.header_title,
            html_pane(
                "<div class='ss-title' style='margin-top:6px'>Units</div>",
                sizing_mode="fixed",
                margin=(12, 2, 0, 0),
                width=40,
            ),
            self.units_switch,
            self.files,
            styles={"background": "#14263a"},
            sizing_mode="stretch_width",
            height=54,
            margin=0,
        )
        self.centre_tabs = pn.Tabs(
            ("Diagrams", self.diagrams),
            ("Amplification", self._holders[1]),
            ("Buckling modes", self._holders[2]),
            ("Variants", self.variants),
            ("Routes", self._holders[4]),
            ("LTB", self._holders[5]),
            ("Superposition", self._holders[6]),
            dynamic=True,  # only the shown tab is built and sent: the first page draws sooner
            sizing_mode="stretch_both",
            margin=0,
            stylesheets=[WIDGET_CSS],
        )
        self.centre_tabs.param.watch(lambda event: self._view(event.new), "active")
        centre = pn.Column(
            self.force,
            self.combination_bar,
            self.stale,
            self.files.blocked,
            self.general_error,
            self.notice,
            self.centre_tabs,
            sizing_mode="stretch_both",
            margin=(0, 4),
            styles={"background": "#ffffff"},
        )
        # The values' and the cautions' headings and boxes are the column's own children, so the column
        # shares its height among them and none overflows onto the next; when even their least heights do not
        # fit (the governing combinations' every check and route shown at 1280×720) the column scrolls.
        right = pn.Column(
            self.governing,
            self.routes,
            *self.values.parts,
            *self.cautions.parts,
            width=350,
            sizing_mode="stretch_height",
            scroll=True,
            margin=(0, 6, 4, 0),
            styles={"background": "#ffffff"},
            css_classes=["ss-right"],
        )
        self.inputs.member_tab.insert(0, self.files.case_file)
        # The load cases sit at the top of the Loads tab (a sixth tab's title does not fit the 318 px strip);
        # with load cases the case's own loads are not used, and their table is hidden.
        planes = self.inputs.planes.panel
        self.load_cases.others = list(planes.objects)
        planes.insert(0, self.load_cases)
        self.load_cases.sync()
        body = pn.Row(self.inputs, centre, right, sizing_mode="stretch_both", margin=(4, 0, 0, 0))
        return pn.Column(
            header,
            body,
            sizing_mode="stretch_both",
            margin=0,
            min_height=660,
            min_width=MIN_WIDTH,
            stylesheets=[":host { background: #f6f7f4; }"],
        )

    # ------------------------------------------------------------------ state → page

    def show_state(self) -> None:
        """The title in the header, the engine's messages beside their inputs and the stale-result banner."""
        state = self.model
        with pn.io.hold():
            if state.result is not None:
                title = state.result.case.title or "(untitled case)"
                self.header_title.object = f"<div class='ss-title'>{esc(title)}</div>"
            self.errors.show()
            if state.errors:
                message = state_message(state, next(iter(state.errors.values())))
                self.stale.object = (
                    "<div class='ss-error ss-stale-banner'><b>Input not accepted — the plots and values show "
                    f"the last good result (last valid case).</b> {esc(message)}</div>"
                )
                self.stale.visible = True
            elif self.stale.visible:
                self.stale.visible = False
                self.stale.object = ""

    def _notice(self) -> None:
        message = self.model.notice
        self.notice.object = f"<div class='ss-error ss-notice'>{esc(message)}</div>" if message else ""
