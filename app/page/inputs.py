"""The inputs of the case, in tabs: member and supports, section and material, loads, initial bow, check.

:class:`InputsView` writes each edit into the one :class:`app.state.MemberState` and shows the state's inputs
back (after an upload, a link or a units switch). The loads table is its own view (:mod:`app.page.loads`).
"""

from __future__ import annotations

import re
from functools import partial

import panel as pn
import param

from app.intake import clean_text
from app.page.fields import ErrorPanes, UnitNumber
from app.page.ltb import LtbSettingsView
from app.page.plane_inputs import PlaneLoadsView, RouteSettingsView
from app.page.restraints import InsideOpener
from app.page.style import (
    BOW_SHAPE_LABELS,
    DIMENSION_LABELS,
    PRESET_LABELS,
    SHAPE_LABELS,
    SUPPORT_LABELS,
    WIDGET_CSS,
    html_pane,
)
from app.page.words import bow_facts, check_facts, section_facts
from app.state import BOW_PRESETS, INPUTS, SECTION_DIMENSIONS, MemberState
from app.units import units

__all__ = ["InputsView"]

_RESTRAINT_OPTIONS = {"fixed": "fixed", "free": "free", "spring": "spring"}


def _compact(name) -> str:
    """A catalogue name without spaces, in one case: 'HEB200' and 'HEB 200' are the same section."""
    return re.sub(r"[\s×]", "", str(name)).upper().replace("X", "x")


class InputsView(pn.viewable.Viewer):
    """The input tabs of the page, bound to one state."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, errors: ErrorPanes, **params) -> None:
        super().__init__(state=state, **params)
        self.errors = errors
        self.numbers: dict[str, UnitNumber] = {}
        self.choices: dict[str, pn.widgets.Select] = {}
        self.planes = PlaneLoadsView(state, errors)
        self.loads = self.planes.loads  # the loads of the plane analysed
        self.route_settings = RouteSettingsView(state)
        self.ltb_settings = LtbSettingsView(state)  # its messages: the Check tab's pane for check.*
        tabs = [
            self._member_tab(),
            self._section_tab(),
            ("Loads", self.planes),
            self._bow_tab(),
            self._check_tab(),
        ]
        self.tabs = pn.Tabs(
            *tabs,
            dynamic=True,  # only the shown tab is built and sent: the first page draws sooner
            width=318,
            sizing_mode="stretch_height",
            margin=(0, 4, 0, 6),
            stylesheets=[WIDGET_CSS],
        )
        state.param.watch(self._inputs_changed, list(INPUTS))
        state.param.watch(lambda *_: self.show(), ["units"])
        state.param.watch(lambda *_: self.show_facts(), ["result", "units"])
        self.show()
        self.show_facts()

    def __panel__(self):
        return self.tabs

    # ------------------------------------------------------------------ fields

    def _number(
        self, name: str, text: str, kind: str | None, width: int = 130, **params
    ) -> pn.widgets.TextInput:
        field = UnitNumber(
            text,
            kind,
            get=partial(getattr, self.state, name),
            put=lambda value: self.state.param.update({name: value}),
            system=lambda: self.state.units,
            width=width,
            **params,
        )
        self.numbers[name] = field
        return field.widget

    def _select(self, name: str, text: str, options, width: int = 150) -> pn.widgets.Select:
        current = getattr(self.state, name)
        values = list(options.values()) if isinstance(options, dict) else list(options)
        widget = pn.widgets.Select(
            label=text,
            options=options,
            value=current if current in values else values[0],
            width=width,
            stylesheets=[WIDGET_CSS],
        )
        widget.param.watch(partial(self._chosen, name), "value")
        self.choices[name] = widget
        return widget

    def _symmetric_edited(self, event) -> None:
        if self.state.section_doubly_symmetric != bool(event.new):
            self.state.section_doubly_symmetric = bool(event.new)

    def _chosen(self, name: str, event) -> None:
        if event.new is not None and getattr(self.state, name) != event.new:
            self.state.param.update({name: event.new})

    @staticmethod
    def _tab(name: str, *objects) -> pn.Column:
        return pn.Column(*objects, name=name, margin=(4, 2), scroll=True)

    # ------------------------------------------------------------------ tabs

    def _member_tab(self) -> pn.Column:
        state, errors = self.state, self.errors
        self.title_input = pn.widgets.TextInput(
            label="Case title",
            value=state.title,
            sizing_mode="stretch_width",
            stylesheets=[WIDGET_CSS],
            max_length=200,
        )
        self.title_input.param.watch(self._title_edited, "value")
        self.length_input = self._number("length", "Span L", "length", width=140)
        support_options = {label: key for key, label in SUPPORT_LABELS.items()}
        self.ends = {}
        self.inside = InsideOpener(state)  # restraints, steps, foundation: the editor built when opened
        for side, where in (("left", "Left end, x = 0 (bottom)"), ("right", "Right end, x = L (top)")):
            parts = {
                "form": self._select(f"{side}_end", where, support_options, width=200),
                "translation": self._select(
                    f"{side}_translation", "translation", _RESTRAINT_OPTIONS, width=95
                ),
                "rotation": self._select(f"{side}_rotation", "rotation", _RESTRAINT_OPTIONS, width=95),
                "k_t": self._number(f"{side}_k_t", "k_t", "translational_spring", width=130),
                "k_r": self._number(f"{side}_k_r", "k_r", "rotational_spring", width=130),
            }
            parts["springs"] = pn.Column(
                pn.Row(parts["translation"], parts["k_t"], margin=0),
                pn.Row(parts["rotation"], parts["k_r"], margin=0),
                margin=0,
            )
            self.ends[side] = parts
        self.member_tab = self._tab(
            "Member",
            self.title_input,
            errors.pane("title"),
            self.length_input,
            errors.pane("length"),
            self.ends["left"]["form"],
            self.ends["left"]["springs"],
            errors.pane("supports.left"),
            self.ends["right"]["form"],
            self.ends["right"]["springs"],
            errors.pane("supports.right"),
            errors.pane("supports", exact=True),
            self.inside,
            html_pane(
                "<div class='ss-note'>x runs from the left end (the bottom of a post) to the right end. "
                "Springs: T(0) = k_t·w(0), M(0) = −k_r·w′(0) at the left end.</div>"
            ),
        )
        return self.member_tab

    def _section_tab(self) -> pn.Column:
        from engine.materials import material_names
        from engine.sections import catalogue_names

        errors = self.errors
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
            "section_shape", "Section", {label: key for key, label in SHAPE_LABELS.items()}, width=150
        )
        self.catalogue_select = pn.widgets.Select(
            label="catalogue name", options=list(catalogue_names()), width=130, stylesheets=[WIDGET_CSS]
        )
        self.catalogue_select.param.watch(self._catalogue_edited, "value")
        self.dimension_inputs = {
            key: self._number(f"section_{key}", DIMENSION_LABELS[key], kind, width=92)
            for key, kind in (
                *((key, "small_length") for key in ("h", "b", "tw", "tf", "r", "t", "D")),
                ("A", "area"),
                ("I", "second_moment"),
                ("W_el", "section_modulus"),
                ("W_pl", "section_modulus"),
                ("A_v", "area"),
                ("depth", "small_length"),
                ("Iz", "second_moment"),
                ("It", "second_moment"),
                ("Iw", "warping"),
            )
        }
        self.symmetric_input = pn.widgets.Checkbox(
            label="doubly symmetric", value=self.state.section_doubly_symmetric, stylesheets=[WIDGET_CSS]
        )
        self.symmetric_input.param.watch(self._symmetric_edited, "value")
        self.ltb_curve_select = self._select(
            "section_ltb_curve", "LTB curve", {f"{c} (Table 6.4)": c for c in "abcd"}, width=120
        )
        self.manufacture_select = self._select(
            "section_manufacture", "made", {"hot-finished": "hot-finished", "cold-formed": "cold-formed"}, 120
        )
        self.axis_select = self._select(
            "axis", "bending axis", {"major": "major", "minor": "minor"}, width=110
        )
        self.material_from_select = self._select(
            "material_from", "Material", {"catalogue": "catalogue", "custom (E, f_y)": "custom"}, width=130
        )
        self.material_select = pn.widgets.Select(
            label="grade", options=list(material_names()), width=130, stylesheets=[WIDGET_CSS]
        )
        self.material_select.param.watch(self._material_edited, "value")
        self.material_E_input = self._number("material_E", "E", "stress", width=110)
        self.material_fy_input = self._number("material_fy", "f_y", "stress", width=110)
        self.section_facts = html_pane()
        self.section_group = pn.Column(
            pn.Row(self.shape_select, self.catalogue_select, margin=0),
            pn.FlexBox(*self.dimension_inputs.values(), margin=0, gap="0px"),
            pn.Row(self.symmetric_input, self.ltb_curve_select, margin=0),
            pn.Row(self.manufacture_select, self.axis_select, margin=0),
            errors.pane("section", "axis"),
            pn.Row(self.material_from_select, self.material_select, margin=0),
            pn.Row(self.material_E_input, self.material_fy_input, margin=0),
            errors.pane("material"),
            margin=0,
        )
        return self._tab(
            "Section",
            self.stiffness_select,
            self.EI_input,
            errors.pane("EI"),
            self.section_group,
            self.factor_input,
            errors.pane("stiffness_factor"),
            self.section_facts,
        )

    def _bow_tab(self) -> pn.Column:
        self.bow_from_select = self._select(
            "bow_from",
            "Initial bow from",
            {"code preset": "preset", "shape and amplitude": "shape"},
            width=180,
        )
        self.preset_select = self._select(
            "bow_preset", "preset", {PRESET_LABELS[p]: p for p in BOW_PRESETS}, width=280
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
            "bow_shape", "shape", {v: k for k, v in BOW_SHAPE_LABELS.items()}, width=160
        )
        self.amplitude_input = self._number("bow_amplitude", "amplitude a", "small_length", width=110)
        self.bow_facts = html_pane()
        return self._tab(
            "Bow",
            self.bow_from_select,
            self.preset_select,
            pn.Row(self.curve_select, self.analysis_select, margin=0),
            pn.Row(self.direction_select, self.ratio_input, margin=0),
            pn.Row(self.shape_bow_select, self.amplitude_input, margin=0),
            self.errors.pane("imperfection"),
            self.bow_facts,
        )

    def _check_tab(self) -> pn.Column:
        self.method_select = self._select(
            "check_method",
            "cross-section check",
            {"elastic stresses": "elastic", "plastic N–M": "plastic"},
            170,
        )
        self.gamma0_input = self._number("gamma_M0", "γ_M0", None, width=90)
        self.gamma1_input = self._number("gamma_M1", "γ_M1", None, width=90)
        self.limit_input = self._number("deflection_limit", "deflection limit span/n: n", None, width=170)
        self.out_of_plane_select = self._select(
            "out_of_plane", "out of plane", {"buckles (checked)": "buckles", "restrained": "restrained"}, 165
        )
        self.out_of_plane_input = self._number(
            "out_of_plane_length", "out-of-plane L_cr (empty: L, sway 2L)", "length", width=270
        )
        self.prepared_input = pn.widgets.TextInput(
            label="prepared by (calc sheet)", width=140, max_length=60, stylesheets=[WIDGET_CSS]
        )
        self.checked_input = pn.widgets.TextInput(
            label="checked by", width=120, max_length=60, stylesheets=[WIDGET_CSS]
        )
        self.check_facts = html_pane()
        return self._tab(
            "Check",
            self.method_select,
            pn.Row(self.gamma0_input, self.gamma1_input, margin=0),
            self.limit_input,
            self.out_of_plane_select,  # each on its own line: side by side, both were cut
            self.out_of_plane_input,
            self.errors.pane("check"),
            self.errors.pane("out_of_plane"),
            self.check_facts,
            self.route_settings,
            self.ltb_settings,
            pn.Row(self.prepared_input, self.checked_input, margin=0),
        )

    # ------------------------------------------------------------------ widget → state

    def _title_edited(self, event) -> None:
        title = clean_text(event.new) if isinstance(event.new, str) else event.new
        if title != event.new:
            # A lone surrogate is not text (it could not be sent back to any browser): replaced, not kept.
            self.title_input.value = title
        if self.state.title != title:
            self.state.title = title

    def _catalogue_edited(self, event) -> None:
        if event.new is not None and _compact(event.new) != _compact(self.state.section_name):
            self.state.section_name = event.new

    def _material_edited(self, event) -> None:
        if event.new is not None and event.new != self.state.material_name:
            self.state.material_name = event.new

    # ------------------------------------------------------------------ state → widgets

    def show_facts(self) -> None:
        """The section's, the bow's and the check's facts in use, under their inputs."""
        result = self.state.result
        if result is None:
            return
        U = units(self.state.units)
        self.section_facts.object = section_facts(result, U)
        self.bow_facts.object = bow_facts(result, U)
        self.check_facts.object = check_facts(result, U)

    def _inputs_changed(self, *events) -> None:
        if {event.name for event in events} <= {"axial_force"}:
            return  # the force control follows the result
        self.show()

    def show(self) -> None:
        """Show the state's inputs in the widgets (after a load, a link or a units switch)."""
        state = self.state
        for field in self.numbers.values():
            field.show()
        for name, widget in self.choices.items():
            value = getattr(state, name)
            # None (a choice left to the engine, such as a CHS's manufacture) keeps the widget as it is.
            if value is not None and widget.value != value:
                widget.value = value
        if self.symmetric_input.value != state.section_doubly_symmetric:
            self.symmetric_input.value = state.section_doubly_symmetric
        if self.title_input.value != state.title:
            self.title_input.value = state.title
        self._show_catalogue_name()
        if state.material_from == "catalogue":
            options = list(self.material_select.options)
            if state.material_name not in options:
                self.material_select.options = [*options, state.material_name]
            self.material_select.value = state.material_name
        self._visibility()

    def _show_catalogue_name(self) -> None:
        name = self.state.section_name
        options = list(self.catalogue_select.options)
        match = next((o for o in options if _compact(o) == _compact(name)), None)
        if match is None:
            self.catalogue_select.options = [*options, name]
            match = name
        self.catalogue_select.value = match

    def _visibility(self) -> None:
        state = self.state
        for side, parts in self.ends.items():
            elastic = getattr(state, f"{side}_end") == "elastic"
            parts["springs"].visible = elastic
            parts["k_t"].visible = elastic and getattr(state, f"{side}_translation") == "spring"
            parts["k_r"].visible = elastic and getattr(state, f"{side}_rotation") == "spring"
        self.section_group.visible = state.stiffness_from in ("section", "both")
        self.EI_input.visible = state.stiffness_from in ("EI", "both")
        shape = state.section_shape
        self.catalogue_select.visible = shape == "catalogue"
        for key, widget in self.dimension_inputs.items():
            widget.visible = key in SECTION_DIMENSIONS.get(shape, ())
        self.manufacture_select.visible = shape in ("rhs", "chs")
        self.symmetric_input.visible = self.ltb_curve_select.visible = shape == "custom"
        # A second plane makes the out-of-plane check with its own supports and bow (issue 14).
        self.out_of_plane_select.disabled = state.plane2
        self.out_of_plane_input.disabled = state.plane2
        custom = state.material_from == "custom"
        self.material_select.visible = not custom
        self.material_E_input.visible = custom
        self.material_fy_input.visible = custom
        preset = state.bow_from == "preset"
        self.preset_select.visible = preset
        self.curve_select.visible = preset and state.bow_preset in ("en1993-table-5.1", "en1993-eq-5.9")
        self.analysis_select.visible = preset and state.bow_preset == "en1993-table-5.1"
        self.direction_select.visible = preset
        self.ratio_input.visible = preset and state.bow_preset == "span"
        self.amplitude_input.visible = not preset
        self.shape_bow_select.visible = True
