"""The loads table: one row of fields per transverse load, rebuilt only when rows are added, removed or change
type.
"""

from __future__ import annotations

from functools import partial

import panel as pn
import param

from app.page.fields import ErrorPanes, UnitNumber
from app.page.style import LOAD_LABELS, MAX_LOAD_ROWS, ROWS_AT_ONCE, WIDGET_CSS, html_pane
from app.state import LOAD_TYPES, MemberState

__all__ = ["LoadRow", "LoadsView", "remove_button", "row_fields"]


def row_fields(kind: str | None) -> list[tuple[str, str, str | None]]:
    """The fields of a load row of type `kind`: (key, label, kind of quantity)."""
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
        return [("P", "F", "force"), ("x", "at x", "length")]
    if kind == "couple":
        return [("C", "C", "moment"), ("x", "at x", "length")]
    return []


def remove_button(description: str) -> pn.widgets.Button:
    """A row's Remove button (a load's, a restraint's); `description` says which row it removes."""
    return pn.widgets.Button(
        label="Remove",
        width=74,
        margin=(2, 4),
        color="light",
        stylesheets=[WIDGET_CSS],
        description=description,
    )


class LoadRow:
    """The widgets of one load row: its type, its remove button, its number fields and its error pane."""

    def __init__(
        self, state: MemberState, index: int, kind: str | None, errors: ErrorPanes, field: str = "loads"
    ) -> None:
        self.index, self.type, self.field = index, kind, field
        self.type_select = pn.widgets.Select(
            label="",
            options={v: k for k, v in LOAD_LABELS.items()},
            value=kind if kind in LOAD_TYPES else None,
            width=100,
            margin=(2, 4),
            stylesheets=[WIDGET_CSS],
        )
        self.type_select.param.watch(partial(self._type_chosen, state), "value")
        self.remove_button = remove_button(f"remove load {index + 1}")
        self.remove_button.on_click(lambda *_: state.remove_load(index, field=field))
        self.fields = {
            key: UnitNumber(
                text,
                unit_kind,
                get=partial(self._value, state, key),
                put=lambda value, key=key: state.set_load(index, field=field, **{key: value}),
                system=lambda: state.units,
                width=68,
                margin=(0, 3),
                placeholder={"start": "0 (start)", "end": "L (end)"}.get(key, ""),
            )
            for key, text, unit_kind in row_fields(kind)
        }
        self.error = errors.pane(f"{_PATHS[field]}[{index}]")
        self.panel = pn.Column(
            pn.Row(
                html_pane(f"<div class='ss-heading'>Load {index + 1}</div>", width=66, margin=(8, 2, 0, 4)),
                self.type_select,
                self.remove_button,
                margin=0,
            ),
            pn.Row(*[field.widget for field in self.fields.values()], margin=0),
            self.error,
            margin=(0, 0, 6, 0),
            styles={"border-bottom": "1px solid #e4e7e1"},
        )

    def _value(self, state: MemberState, key: str):
        loads = getattr(state, self.field)
        return loads[self.index].get(key) if self.index < len(loads) else None

    def _type_chosen(self, state: MemberState, event) -> None:
        if event.new is not None and event.new != getattr(state, self.field)[self.index].get("type"):
            state.set_load(self.index, field=self.field, type=event.new)

    def show(self) -> None:
        """Show the row's load in its fields, in display units."""
        for field in self.fields.values():
            field.show()


#: The engine's field path of each loads list of the state.
_PATHS = {"loads": "loads", "plane2_loads": "second_plane.loads"}


class LoadsView(pn.viewable.Viewer):
    """The loads tab: an add control, a row per load (the first :data:`MAX_LOAD_ROWS`) and a note.

    `field` is the state's list it edits: ``loads`` (the plane analysed) or ``plane2_loads`` (the second).
    """

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")
    field = param.Selector(objects=list(_PATHS), default="loads", doc="The state's loads list shown.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        field = self.field
        self.errors = ErrorPanes(state)
        self.rows: list[LoadRow] = []
        self._generation = 0
        self._types: list | None = None  # the load types the rows are (being) built for
        self.column = pn.Column(margin=0, sizing_mode="stretch_width")
        self.add_type = pn.widgets.Select(
            label="add a load",
            options={v: k for k, v in LOAD_LABELS.items()},
            value="point",
            width=110,
            stylesheets=[WIDGET_CSS],
        )
        self.add_button = pn.widgets.Button(
            label="+ Add load", color="primary", width=110, margin=(22, 5, 5, 5), stylesheets=[WIDGET_CSS]
        )
        self.add_button.on_click(lambda *_: self.state.add_load(self.add_type.value, field=field))
        self.note = html_pane()
        own_errors = ErrorPanes(state)
        self.panel = pn.Column(
            pn.Row(self.add_type, self.add_button, margin=0),
            own_errors.pane(_PATHS[field], exact=True),
            self.column,
            self.note,
            name="Loads",
            margin=(4, 2),
            scroll=True,
        )
        self._own_errors = own_errors
        state.param.watch(self._changed, [field, "length", "units"])
        state.param.watch(lambda *_: self.show_errors(), ["errors"])
        self.sync()

    def __panel__(self):
        return self.panel

    def _changed(self, *events) -> None:
        self.sync()

    def show_errors(self) -> None:
        """Show the engine's messages on the rows (and on the table as a whole)."""
        self.errors.show()
        self._own_errors.show()

    def sync(self) -> None:
        """Rebuild the rows if the load types changed; show every load's values and the note."""
        state = self.state
        every = getattr(state, self.field)
        loads = every[:MAX_LOAD_ROWS]
        if [load.get("type") for load in loads] != self._types:
            self._build(loads)
        for row in self.rows:
            row.show()
        hidden = len(every) - len(loads)
        self.note.object = (
            (
                f"<div class='ss-note'>Loads {MAX_LOAD_ROWS + 1} to {len(every)} are analysed and "
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
        self.show_errors()

    def _build(self, loads: list) -> None:
        self._types = [load.get("type") for load in loads]
        self._generation += 1
        self.errors.clear()  # the rows' error panes go with the rows
        self.rows = []
        runner = self.state.runner
        now = len(loads) if runner is None else min(len(loads), ROWS_AT_ONCE)
        self.rows = [
            LoadRow(self.state, index, loads[index].get("type"), self.errors, self.field)
            for index in range(now)
        ]
        self.column.objects = [row.panel for row in self.rows]
        if now < len(loads):
            # Served: each row is a dozen widgets and their Bokeh models, about 0.1 s of the event loop that
            # every session shares (issue 11). The first rows go now and the rest on a later tick, so other
            # sessions' events run in between.
            self._append_later(runner, now, self._generation)

    def _append_later(self, runner, start: int, generation: int) -> None:
        def append() -> None:
            loads = getattr(self.state, self.field)[:MAX_LOAD_ROWS]
            if generation != self._generation:
                return  # the rows were built again since
            with pn.io.hold():
                rows = [
                    LoadRow(self.state, i, loads[i].get("type"), self.errors, self.field)
                    for i in range(start, len(loads))
                ]
                self.rows.extend(rows)
                for row in rows:
                    row.show()
                self.column.extend([row.panel for row in rows])  # one change: Bokeh walks the whole document
                self.show_errors()

        runner.later(append)
