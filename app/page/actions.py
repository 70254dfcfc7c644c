"""Load cases on the page (issue 17): the table of load cases, the combination picker and what governs.

- :class:`LoadCasesView`, the "Load cases" input tab: one block per load case (name, category, its own axial
  force, its transverse loads), add and remove, the combination rule, and a button that opens the invented
  demo with load cases;
- :class:`CombinationBar`, above the diagrams: the combination shown ("governing", "envelope" or one by
  name), the slider's mode (the shown combination's N only, or the whole combination by one load factor)
  and the sentence that says which;
- :class:`GoverningView`, in the right column: the combination shown and the governing combination of each
  check and route (the wording of :mod:`app.report.combinations`).

Every value comes from the engine's result; the wording from :mod:`app.report`.
"""

from __future__ import annotations

import json
from functools import partial
from importlib import resources

import panel as pn
import param

from app.page.fields import ErrorPanes, UnitNumber
from app.page.loads import row_fields
from app.page.style import LOAD_LABELS, WIDGET_CSS, esc, html_pane
from app.state import LOAD_TYPES, MemberState
from app.state_actions import ACTION_CATEGORIES, COMBINATION_RULES, ENVELOPE, scale_sentence
from app.units import units

__all__ = ["CombinationBar", "GoverningView", "LoadCasesView", "choice_options", "demo_with_actions"]

#: The invented demo with a permanent and a wind load case (assets/demo_wind_post_actions.json).
DEMO_FILE = "demo_wind_post_actions.json"
_RULE_LABELS = {
    "en1990-6.10": "EN 1990 (6.10)",
    "en1990-6.10ab": "EN 1990 (6.10a)/(6.10b)",
    "asce7-2.3": "ASCE 7 §2.3 (LRFD)",
    "table": "own table (file)",
}
_MODE_LABELS = {"its N only": "axial", "whole combination (λ)": "factor"}
#: The checks the right column always shows; the others open under "every check".
_MAIN_CHECKS = ("strength", "deflection")


def demo_with_actions() -> dict:
    """The invented demo case with load cases, as a case-file mapping."""
    return json.loads(resources.files("assets").joinpath(DEMO_FILE).read_text(encoding="utf-8"))


def choice_options(result) -> dict:
    """The combination picker's options for a result: label → choice ('' governing, 'envelope', a name)."""
    actions = getattr(result, "actions", None)
    if actions is None:
        return {}
    from app.report.combinations import expression

    options = {f"governing ({actions.headline})": "", "envelope (every combination)": ENVELOPE}
    for item in actions.combinations:
        label = f"{item.name} {item.combination.state}: {expression(item.combination, actions.names)}"
        options[label] = item.name
    return options


class _ActionBlock:
    """The widgets of one load case: name, category, N, remove; its loads with type, fields and remove."""

    def __init__(self, state: MemberState, index: int, errors: ErrorPanes) -> None:
        action = state.actions[index]
        self.index = index
        self.name = pn.widgets.TextInput(
            value=str(action.get("name", "")),
            placeholder="name",
            width=70,
            margin=(2, 3),
            stylesheets=[WIDGET_CSS],
        )
        self.name.param.watch(lambda event: state.set_action(index, name=event.new), "value")
        categories = list(ACTION_CATEGORIES)
        if action.get("category") not in categories:
            categories.append(action.get("category"))
        self.category = pn.widgets.Select(
            options=categories,
            value=action.get("category"),
            width=104,
            margin=(2, 3),
            stylesheets=[WIDGET_CSS],
        )
        self.category.param.watch(lambda event: state.set_action(index, category=event.new), "value")
        self.remove = pn.widgets.Button(
            label="✕", width=32, margin=(2, 3), color="light", description=f"remove load case {index + 1}"
        )
        self.remove.on_click(lambda *_: state.remove_action(index))
        self.axial = UnitNumber(
            "N",
            "force",
            get=lambda: state.actions[index].get("axial_force") if index < len(state.actions) else None,
            put=lambda value: state.set_action(index, axial_force=value),
            system=lambda: state.units,
            width=84,
            margin=(0, 3),
        )
        self.fields = []
        rows = []
        for number, load in enumerate(action.get("loads") or []):
            kind = load.get("type") if isinstance(load, dict) else None
            fields = [
                UnitNumber(
                    text,
                    unit_kind,
                    get=partial(self._load_value, state, number, key),
                    put=lambda value, number=number, key=key: state.set_action_load(
                        index, number, **{key: value}
                    ),
                    system=lambda: state.units,
                    width=66,
                    margin=(0, 2),
                    placeholder={"start": "0 (start)", "end": "L (end)"}.get(key, ""),
                )
                for key, text, unit_kind in row_fields(kind)
            ]
            self.fields += fields
            drop = pn.widgets.Button(
                label="✕",
                width=30,
                margin=(18, 2, 0, 2),
                color="light",
                description=f"remove load {number + 1}",
            )
            drop.on_click(partial(self._drop_load, state, number))
            kind_label = LOAD_LABELS.get(kind, str(kind))
            rows.append(
                pn.Row(
                    html_pane(
                        f"<div class='ss-note'>{esc(kind_label)}</div>", width=52, margin=(22, 2, 0, 6)
                    ),
                    *[field.widget for field in fields],
                    drop,
                    margin=0,
                )
            )
        self.add_type = pn.widgets.Select(
            options={v: k for k, v in LOAD_LABELS.items()}, value="uniform", width=90, margin=(2, 3)
        )
        self.add_load = pn.widgets.Button(label="+ load", width=64, margin=(2, 3), color="light")
        self.add_load.on_click(partial(self._add_load, state))
        self.error = errors.pane(f"actions[{index}]")
        self.panel = pn.Column(
            pn.Row(self.name, self.category, self.axial.widget, self.remove, margin=0),
            *rows,
            pn.Row(self.add_type, self.add_load, margin=0),
            self.error,
            margin=(0, 0, 6, 0),
            styles={"border-bottom": "1px solid #e4e7e1"},
            css_classes=["ss-load-case"],
        )

    def _load_value(self, state, number, key):
        if self.index >= len(state.actions):
            return None
        loads = state.actions[self.index].get("loads") or []
        return loads[number].get(key) if number < len(loads) else None

    def _drop_load(self, state, number, *_):
        loads = [load for i, load in enumerate(state.actions[self.index].get("loads") or []) if i != number]
        state.set_action(self.index, loads=loads)

    def _add_load(self, state, *_):
        from app.state import default_load

        kind = self.add_type.value if self.add_type.value in LOAD_TYPES else "uniform"
        loads = [*(state.actions[self.index].get("loads") or []), default_load(kind, state.length)]
        state.set_action(self.index, loads=loads)

    def show(self) -> None:
        self.axial.show()
        for field in self.fields:
            field.show()


class LoadCasesView(pn.viewable.Viewer):
    """The load cases of the case (or an offer to start some) and the rule, at the top of the Loads tab.

    ``others`` are the views hidden while the case has load cases (the case's own loads table).
    """

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.errors = ErrorPanes(state)
        self.block_errors = ErrorPanes(state)
        self.blocks: list[_ActionBlock] = []
        self.others: list = []
        self._shape = None
        self.column = pn.Column(margin=0, sizing_mode="stretch_width")
        self.rule = pn.widgets.Select(
            label="Combination rule",
            options={_RULE_LABELS[rule]: rule for rule in COMBINATION_RULES},
            value=state.combination_rule,
            width=190,
            stylesheets=[WIDGET_CSS],
        )
        self.rule.param.watch(lambda event: setattr(self.state, "combination_rule", event.new), "value")
        self.add = pn.widgets.Button(
            label="+ New load case", color="primary", width=124, margin=(4, 5), stylesheets=[WIDGET_CSS]
        )
        self.add.on_click(lambda *_: self._add())
        self.demo = pn.widgets.Button(
            label="Demo with load cases",
            width=150,
            margin=(4, 5),
            color="light",
            stylesheets=[WIDGET_CSS],
        )
        self.demo.on_click(lambda *_: self.state.load_mapping(demo_with_actions()))
        self.note = html_pane()
        self.rule_error = self.errors.pane("combinations")
        self.heading = html_pane("<div class='ss-heading'>Load cases</div>", margin=(4, 5, 0, 5))
        self.settings = pn.Column(self.rule, self.rule_error, margin=0)
        self.panel = pn.Column(
            self.heading,
            self.note,
            pn.Row(self.add, self.demo, margin=0),
            self.column,
            self.settings,
            name="Load cases",
            margin=(2, 2, 6, 2),
            sizing_mode="stretch_width",
            styles={"border-bottom": "2px solid #d5d9d2"},
            css_classes=["ss-load-cases"],
        )
        state.param.watch(lambda *_: self.sync(), ["actions", "units", "length"])
        state.param.watch(lambda event: setattr(self.rule, "value", event.new), ["combination_rule"])
        state.param.watch(lambda *_: self.show_errors(), ["errors"])
        self.sync()

    def __panel__(self):
        return self.panel

    def _add(self) -> None:
        if not self.state.actions and (self.state.loads or self.state.axial_force):
            # The case's own loads and N become the first load case (permanent), so nothing is lost.
            first = {
                "name": "G",
                "category": "permanent",
                "axial_force": self.state.axial_force or 0.0,
                "loads": [dict(load) for load in self.state.loads],
            }
            self.state.actions = [first]
            return
        self.state.add_action()

    def sync(self) -> None:
        """Rebuild the blocks when load cases or their loads were added, removed or changed type."""
        actions = self.state.actions
        shape = [
            (a.get("name"), a.get("category"), tuple(load.get("type") for load in a.get("loads") or []))
            for a in actions
        ]
        if shape != self._shape:
            self._shape = shape
            self.block_errors = ErrorPanes(self.state)  # the blocks' error panes go with the blocks
            self.blocks = [_ActionBlock(self.state, i, self.block_errors) for i in range(len(actions))]
            self.column.objects = [block.panel for block in self.blocks]
        for block in self.blocks:
            block.show()
        self.settings.visible = bool(actions)
        self.demo.visible = not actions
        for other in self.others:
            other.visible = not actions
        if actions:
            text = (
                "Each load case: name, category, its own axial force N (compression positive) and its loads. "
                "The engine makes the ultimate and service combinations of the rule below and solves each "
                "exactly; strength from the ultimate ones, deflection from the service ones."
            )
        else:
            text = (
                "No load cases: the case is solved with the loads of the Loads tab and the axial force "
                "above. <b>+ New load case</b> turns them into load case G (permanent)."
            )
        self.note.object = f"<div class='ss-note'>{text}</div>"
        self.show_errors()

    def show_errors(self) -> None:
        """Show the engine's messages on the load cases and on the rule."""
        self.errors.show()
        self.block_errors.show()


class CombinationBar(pn.viewable.Viewer):
    """Above the diagrams, with load cases: which combination is shown, and what the slider scales."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.picker = pn.widgets.Select(
            label="Combination shown", options={}, width=214, margin=(0, 6, 0, 10), stylesheets=[WIDGET_CSS]
        )
        self.picker.param.watch(self._picked, "value")
        self.mode = pn.widgets.RadioButtonGroup(
            options=_MODE_LABELS,
            value=state.scale_mode,
            color="light",
            margin=(18, 6, 0, 6),
            stylesheets=[WIDGET_CSS],
        )
        self.mode.param.watch(lambda event: setattr(self.state, "scale_mode", event.new), "value")
        self.sentence = html_pane(
            sizing_mode="stretch_width", margin=(0, 10, 2, 10), css_classes=["ss-scale-mode"]
        )
        # Placed in the page only once a case has load cases: a plain case's first page carries none of its
        # models (start-up, issue 10).
        self._content = [
            pn.Row(
                self.picker,
                html_pane("<div class='ss-note' style='margin-top:22px'>Slider scales:</div>", width=84),
                self.mode,
                margin=0,
            ),
            self.sentence,
        ]
        self.panel = pn.Column(visible=False, sizing_mode="stretch_width", margin=(2, 0))
        state.param.watch(lambda *_: self.show(), ["result", "combination_choice", "scale_mode", "actions"])
        self.show()

    def __panel__(self):
        return self.panel

    _updating = False

    def _picked(self, event) -> None:
        if self._updating:  # new options reset the picker to their first: not the user's choice
            return
        if event.new is not None and event.new != self.state.combination_choice:
            self.state.show_combination(event.new)

    def show(self) -> None:
        state = self.state
        options = choice_options(state.result) if state.actions else {}
        self.panel.visible = bool(options)
        if not options:
            return
        if not self.panel.objects:
            self.panel.objects = list(self._content)
        choice = state.combination_choice if state.combination_choice in options.values() else ""
        self._updating = True
        try:
            if self.picker.options != options:
                self.picker.options = options
            if self.picker.value != choice:
                self.picker.value = choice
        finally:
            self._updating = False
        if self.mode.value != state.scale_mode:
            self.mode.value = state.scale_mode
        extra = ""
        if choice == ENVELOPE:
            extra = (
                " Envelope: the shaded band spans the largest and smallest M and V of the ultimate "
                "combinations and w of the service ones; the lines are the governing combination."
            )
        self.sentence.object = f"<div class='ss-note'>{esc(scale_sentence(state) + extra)}</div>"


class GoverningView(pn.viewable.Viewer):
    """The combination shown and the governing combination of each check (right column)."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.pane = html_pane(sizing_mode="stretch_width", margin=(4, 6), css_classes=["ss-governing"])
        # The pane joins the page when a result has load cases (start-up: see CombinationBar).
        self.panel = pn.Column(visible=False, sizing_mode="stretch_width", margin=0)
        state.param.watch(lambda *_: self.show(), ["result", "units", "combination_choice", "errors"])
        self.show()

    def __panel__(self):
        return self.panel

    def show(self) -> None:
        result = self.state.result
        actions = getattr(result, "actions", None)
        self.panel.visible = actions is not None
        if actions is None:
            return
        if not self.panel.objects:
            self.panel.objects = [self.pane]
        from app.report.combinations import governing_rows, headline_note

        U = units(self.state.units)
        worded = governing_rows(actions, result, U)

        def rows(keep) -> str:
            return "".join(
                f"<tr><td>{esc(check)}</td><td><b>{esc(name)}</b></td><td>{esc(value)}</td></tr>"
                for row, (check, name, value) in zip(actions.governing, worded, strict=True)
                if keep(row.check)
            )

        main = rows(lambda code: code in _MAIN_CHECKS)
        rest = rows(lambda code: code not in _MAIN_CHECKS)
        text = (
            "<div class='ss-heading'>Governing combination per check</div>"
            f"<table class='ss-table' style='width:100%;font-size:12px'>{main}</table>"
            f"<details><summary class='ss-note'>every check and route ({len(worded)})</summary>"
            f"<table class='ss-table' style='width:100%;font-size:12px'>{rest}</table>"
            f"<div class='ss-note'>{esc(headline_note(actions))}</div></details>"
        )
        if self.state.errors:  # the last valid case's combinations, dimmed as every value is while refused
            text = f"<div class='ss-stale-values'>{text}</div>"
        self.pane.object = text
