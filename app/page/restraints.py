"""What acts inside the member (engine issue 16): restraints, steps (in EI, or in section on a catalogue
section) and foundation ranges, edited as the loads are.

:class:`InsideOpener` is all the first page carries: one button in the Member tab, which names how many rows
the case has. The editor, :class:`InsideView`, is built when the button is first pressed (start-up, issue 10:
a plain case's first page gets no more models), or when the engine names one of its fields, so that its
message shows beside the field. Each row is a few fields (:class:`app.page.fields.UnitNumber`, so the units
follow the page's system), a remove button and the pane for the engine's message on that row; rows are
rebuilt only when a list changes length or a restraint changes between rigid, free and spring, otherwise
their fields show the state's values.
"""

from __future__ import annotations

from functools import partial

import panel as pn
import param

from app.page.fields import INNER_ROWS as _TITLES
from app.page.fields import ErrorPanes, UnitNumber
from app.page.loads import remove_button
from app.page.style import WIDGET_CSS, html_pane
from app.state import MemberState
from app.state_restraints import INNER_INPUTS, step_section

__all__ = ["InsideOpener", "InsideView"]

_KINDS = {"fixed": "fixed", "free": "free", "spring": "spring"}
_PLANES = {"both planes": "both", "plane analysed": "first", "second plane": "second"}
_ADD = {"restraints": "+ Restraint", "steps": "+ Step in EI", "foundation": "+ Foundation"}
_ADD_SECTION = "+ Step in section"  # the steps' button on a case with a catalogue section
_ADD_WIDTHS = {"restraints": 92, "steps": 124, "foundation": 100}
#: (key, label, kind of quantity) of the number fields of each list's rows; a restraint's springs are below.
_NUMBERS = {
    "restraints": [("x", "at x", "length")],
    "steps": [("x", "from x", "length"), ("EI", "EI", "stiffness")],
    # k is a force per length of member per deflection, N/m²: kN/m² or kip/in², as the exports and the batch
    "foundation": [
        ("start", "from", "length"),
        ("end", "to", "length"),
        ("k", "modulus k", "foundation_modulus"),
    ],
}
#: The opener's label wraps (its counts do not fit the strip on one line) and reads from the left.
_WRAP = ".bk-btn { white-space: normal; text-align: left; }"
#: A restraint's parts chosen fixed, free or spring, with the spring's symbol and quantity; the twist (φ, for
#: lateral-torsional buckling only) takes a torsional spring shown as the rotation's is.
_SPRINGS = {
    "translation": ("k_t", "translational_spring"),
    "rotation": ("k_r", "rotational_spring"),
    "twist": ("k_φ", "rotational_spring"),
}


def _kind(value) -> str:
    """A restraint's translation, rotation or twist as its select shows it: fixed, free or spring (a number
    or an emptied spring)."""
    return value if value in ("fixed", "free") else "spring"


def _shape(field: str, row: dict) -> tuple:
    """What a row's widgets depend on (rebuilt when it changes)."""
    if field == "steps":
        return (field, "section" in row)
    if field != "restraints":
        return (field,)
    return (field, *(_kind(row.get(part, "free")) for part in _SPRINGS))


class InsideRow:
    """The widgets of one row of `field`: its number fields, its choices, its remove button, its messages."""

    def __init__(self, state: MemberState, field: str, index: int, errors: ErrorPanes) -> None:
        self.state, self.field, self.index = state, field, index
        row = getattr(state, field)[index]
        put = partial(state.set_item, field, index)
        numbers = _NUMBERS[field][:1] if field == "steps" and "section" in row else _NUMBERS[field]
        self.fields: list[UnitNumber] = [self._number(key, text, kind, 92) for key, text, kind in numbers]
        self.choices: dict[str, pn.widgets.Widget] = {}
        widgets: list = [field.widget for field in self.fields]
        if field == "steps" and "section" in row:
            widgets.append(self._section_choice(row["section"]))
        lines: list = []
        if field == "restraints":
            for part, (symbol, kind) in _SPRINGS.items():
                select = self._choice(part, part, _KINDS, _kind(row.get(part, "free")), 84)
                line = [select]
                if _kind(row.get(part, "free")) == "spring":
                    number = self._number(part, symbol, kind, 120)
                    self.fields.append(number)
                    line.append(number.widget)
                lines.append(pn.Row(*line, margin=0))
            hinge = pn.widgets.Checkbox(
                label="hinge (M = 0)",
                value=bool(row.get("hinge")),
                margin=(24, 6, 0, 6),
                stylesheets=[WIDGET_CSS],
            )
            hinge.param.watch(lambda event: put(hinge=event.new), "value")
            self.choices["hinge"] = hinge
            widgets.append(hinge)
        if field in ("restraints", "foundation"):
            self.plane = self._choice("plane", "plane", _PLANES, row.get("plane", "both"), 120)
            lines.append(self.plane)
        remove = remove_button(f"remove {_TITLES[field].lower()} {index + 1}")
        remove.on_click(lambda *_: state.remove_item(field, index))
        title = f"<div class='ss-heading'>{_TITLES[field]} {index + 1}</div>"
        self.panel = pn.Column(
            pn.Row(html_pane(title, width=120, margin=(8, 2, 0, 4)), remove, margin=0),
            pn.Row(*widgets, margin=0),
            *lines,
            errors.pane(f"{field}[{index}]"),
            margin=(0, 0, 6, 0),
            styles={"border-bottom": "1px solid #e4e7e1"},
            css_classes=["ss-inside-row"],
        )

    def _section_choice(self, section) -> pn.widgets.Widget:
        """A step's section: the catalogue names of the page's section picker (a section given otherwise in
        a case file is named, not edited)."""
        from engine.sections import catalogue_names

        name = section.get("name") if isinstance(section, dict) else None
        if not isinstance(name, str):
            said = section.get("shape", "custom") if isinstance(section, dict) else "custom"
            return html_pane(f"<div class='ss-note'>section: {said} (from the case file)</div>", width=160)
        options = list(catalogue_names())
        select = pn.widgets.Select(
            label="section",
            options=options if name in options else [*options, name],
            value=name,
            width=130,
            margin=(0, 3),
            stylesheets=[WIDGET_CSS],
        )
        select.param.watch(self._section_chosen, "value")
        self.choices["section"] = select
        return select

    def _section_chosen(self, event) -> None:
        rows = getattr(self.state, self.field)
        if (
            self.index < len(rows)
            and event.new is not None
            and event.new != self._value("section").get("name")
        ):
            self.state.set_item(self.field, self.index, section={"name": event.new})

    def _number(self, key: str, text: str, kind: str, width: int) -> UnitNumber:
        state = self.state
        return UnitNumber(
            text,
            kind,
            get=partial(self._value, key),
            put=lambda value: state.set_item(self.field, self.index, **{key: value}),
            system=lambda: state.units,
            width=width,
            margin=(0, 3),
        )

    def _choice(self, key: str, label: str, options: dict, value, width: int) -> pn.widgets.Select:
        values = list(options.values())
        select = pn.widgets.Select(
            label=label,
            options=options,
            value=value if value in values else values[0],
            width=width,
            margin=(0, 3),
            stylesheets=[WIDGET_CSS],
        )
        select.param.watch(partial(self._chosen, key), "value")
        self.choices[key] = select
        return select

    def _chosen(self, key: str, event) -> None:
        rows = getattr(self.state, self.field)
        if self.index >= len(rows):
            return
        now = rows[self.index].get(key, "free" if key in _SPRINGS else "both")
        shown = _kind(now) if key in _SPRINGS else now
        if event.new is not None and event.new != shown:
            self.state.set_item(self.field, self.index, **{key: event.new})

    def _value(self, key: str):
        rows = getattr(self.state, self.field)
        return rows[self.index].get(key) if self.index < len(rows) else None

    def show(self, plane2: bool) -> None:
        """Show the row's values in its fields (display units) and its plane only in a two-plane case."""
        for field in self.fields:
            field.show()
        row = getattr(self.state, self.field)[self.index]
        if "hinge" in self.choices and self.choices["hinge"].value != bool(row.get("hinge")):
            self.choices["hinge"].value = bool(row.get("hinge"))
        section = self.choices.get("section")
        if section is not None and section.value != row["section"].get("name"):
            section.value = row["section"].get("name")
        if "plane" in self.choices:
            plane = self.choices["plane"]
            if plane.value != row.get("plane", "both") and row.get("plane", "both") in _PLANES.values():
                plane.value = row.get("plane", "both")
            plane.visible = plane2 or row.get("plane", "both") != "both"


class InsideView(pn.viewable.Viewer):
    """The editor of the member's inside: an add button per list, a row per item, the lists' messages."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.errors = ErrorPanes(state)  # the rows' panes, rebuilt with them
        self.own_errors = ErrorPanes(state)
        self.rows: dict[str, list[InsideRow]] = {field: [] for field in INNER_INPUTS}
        self._shapes: dict[str, list | None] = {field: None for field in INNER_INPUTS}
        self.columns = {field: pn.Column(margin=0, sizing_mode="stretch_width") for field in INNER_INPUTS}
        buttons = self.buttons = {}
        for field in INNER_INPUTS:
            button = pn.widgets.Button(
                label=_ADD[field],
                width=_ADD_WIDTHS[field],
                margin=(4, 2),
                color="primary",
                stylesheets=[WIDGET_CSS],
            )
            button.on_click(lambda *_, field=field: state.add_item(field))
            buttons[field] = button
        self.panel = pn.Column(
            # The three buttons wrap: on a catalogue section "+ Step in section" makes them wider than the
            # inputs column, which then scrolled sideways and cut every label's first letters.
            pn.FlexBox(*buttons.values(), flex_wrap="wrap", margin=0, sizing_mode="stretch_width"),
            *(self.own_errors.pane(field, exact=True) for field in INNER_INPUTS),
            *self.columns.values(),
            html_pane(
                "<div class='ss-note'>A restraint acts at x inside the member: translation and rotation "
                "fixed, free or a spring, or a hinge (M = 0, the slope may jump); its twist (φ held or a "
                "torsional spring k_φ) is read by the lateral-torsional buckling check only. A step sets EI "
                "from its x to the next step (a case with EI given and no section), or on a catalogue "
                "section (no EI given) the section from its x on; rows of the other form are kept and named "
                "until changed. A foundation adds a spring bed of "
                "modulus k (force per length of member per unit deflection) from <i>from</i> to <i>to</i>. "
                "Restraints with a fixed translation divide the member into segments, each checked as an "
                "equivalent member; on a foundation the member check counts the second-order route "
                "only.</div>"
            ),
            margin=0,
            sizing_mode="stretch_width",
            css_classes=["ss-inside"],
        )
        state.param.watch(
            lambda *_: self.sync(),
            [*INNER_INPUTS, "units", "plane2", "length", "stiffness_from", "section_shape"],
        )
        state.param.watch(lambda *_: self.show_errors(), ["errors"])
        self.sync()

    def __panel__(self):
        return self.panel

    def show_errors(self) -> None:
        self.errors.show()
        self.own_errors.show()

    def sync(self) -> None:
        """Rebuild a list's rows when its shape changed; show every row's values."""
        state = self.state
        with pn.io.hold():
            self.buttons["steps"].label = _ADD_SECTION if step_section(state) else _ADD["steps"]
            for field in INNER_INPUTS:
                rows = getattr(state, field)
                shapes = [_shape(field, row) for row in rows]
                if shapes != self._shapes[field]:
                    self._shapes[field] = shapes
                    self._build(field, len(rows))
                for row in self.rows[field]:
                    row.show(state.plane2)
            self.show_errors()

    def _build(self, field: str, count: int) -> None:
        # The rows' error panes go with the rows: keep the other lists' panes, drop this list's.
        self.errors.panes = [p for p in self.errors.panes if not p[1][0].startswith(field + "[")]
        self.rows[field] = [InsideRow(self.state, field, index, self.errors) for index in range(count)]
        self.columns[field].objects = [row.panel for row in self.rows[field]]


class InsideOpener(pn.viewable.Viewer):
    """The Member tab's button that opens (and builds, the first time) the editor of the member's inside."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.view: InsideView | None = None
        self.button = pn.widgets.Button(
            label=self._label(),
            color="light",
            sizing_mode="stretch_width",
            margin=(8, 5, 4, 5),
            stylesheets=[WIDGET_CSS, _WRAP],
            css_classes=["ss-inside-open"],
        )
        self.button.on_click(lambda *_: self.toggle())
        self.panel = pn.Column(self.button, margin=0, sizing_mode="stretch_width")
        state.param.watch(lambda *_: self._changed(), [*INNER_INPUTS, "errors"])
        self._changed()  # a case that opens with a message on one of its fields opens the editor

    def __panel__(self):
        return self.panel

    @property
    def open(self) -> bool:
        return self.view is not None and self.view.panel.visible

    def _label(self) -> str:
        counts = [len(getattr(self.state, field)) for field in INNER_INPUTS]
        names = (("restraint", "restraints"), ("step", "steps"), ("foundation", "foundations"))
        parts = [f"{n} {name[n > 1]}" for n, name in zip(counts, names, strict=True) if n]
        said = f" ({', '.join(parts)})" if parts else ""
        return f"{'▾' if self.open else '▸'} Restraints, steps, foundation{said}"

    def toggle(self) -> None:
        """Open the editor (building it the first time), or close it."""
        if self.view is None:
            self.view = InsideView(self.state)
            self.panel.append(self.view.panel)
        else:
            self.view.panel.visible = not self.view.panel.visible
        self.button.label = self._label()

    def _changed(self) -> None:
        named = any(path.split("[")[0].split(".")[0] in INNER_INPUTS for path in self.state.errors)
        if named and not self.open:
            self.toggle()  # the engine names one of its fields: show the message beside it
        label = self._label()
        if self.button.label != label:
            self.button.label = label
