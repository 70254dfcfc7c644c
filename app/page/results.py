"""The right-hand column: the governing values and the cautions, each in its own scrolling box, with the
general caution pinned below them, in view unless the column itself has to scroll (when even the boxes'
least heights do not fit it).

Each view hands the right column its parts (:attr:`ValuesView.parts`, :attr:`CautionsView.parts`): the
headings, the boxes and the general caution are the column's own children, so that the column shares its
height out among them and none is drawn over another (a box nested in a column of its own overflowed that
column when the column above grew, and the values ran under the cautions' heading).
"""

from __future__ import annotations

import panel as pn
import param

from app.page.style import LEVEL_NAMES, SCROLL_BOX_CSS, esc, heading, html_pane
from app.page.words import symbols, values_table
from app.report import caution_text, general_caution, route_rows
from app.report.combinations import not_governing_title, shown_line
from app.state import MemberState
from app.state_actions import view_result
from app.units import units

__all__ = ["CautionsView", "ValuesView"]


class ValuesView(pn.viewable.Viewer):
    """The governing-values table of the state's result (stale values dimmed and marked while refused)."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self.table = html_pane(margin=(0, 4))
        self.box = scroll_box(self.table, min_height=110, css_classes=["ss-values-box"])
        #: The heading and the box, for the right column to hold as its own children.
        self.parts = (heading("Governing values"), self.box)
        watched = ["result", "capacity", "capacity_note", "units", "errors", "combination_choice"]
        state.param.watch(lambda *_: self.draw(), watched)
        self.draw()

    def __panel__(self):
        return pn.Column(*self.parts, sizing_mode="stretch_both", margin=0)

    def draw(self) -> None:
        """Word the result's governing values; dim and mark them while the inputs are refused."""
        state = self.state
        if state.result is None:
            return
        result = view_result(state)
        other = "" if result is state.result else shown_line(result)[0]
        if other:  # a combination other than the governing one: its values; the capacity is the headline's
            table = values_table(result, None, "shown with the governing combination", units(state.units))
            # One line over the values (the whole note a click away): at 1280×720 the note in full left one
            # row of the values in view.
            table = (
                "<details class='ss-stale-mark ss-other-combination'>"
                f"<summary>{esc(not_governing_title(result))}</summary>"
                f"<div class='ss-note'>{esc(other)}</div></details>{table}"
            )
        else:
            table = values_table(result, state.capacity, state.capacity_note, units(state.units))
        if state.errors:
            table = (
                "<div class='ss-stale-mark'>Last valid case — not the inputs on screen</div>"
                f"<div class='ss-stale-values'>{table}</div>"
            )
        self.table.object = table


class CautionsView(pn.viewable.Viewer):
    """The engine's cautions, most severe first; the general one pinned below them."""

    state = param.ClassSelector(class_=MemberState, doc="The page state: inputs (SI) and results.")

    def __init__(self, state: MemberState, **params) -> None:
        super().__init__(state=state, **params)
        self._shown = None
        self.heading = heading("Cautions", margin=(2, 4, 0, 4))
        self.list = html_pane(margin=(0, 4))
        self.box = scroll_box(self.list, min_height=90, css_classes=["ss-cautions-box"])
        # Set apart from the box above by a gap and a rule: a caution cut at the box's edge is not under it.
        self.general = html_pane(margin=(6, 4, 2, 4), css_classes=["ss-general"])
        #: The heading, the box and the general caution, for the right column to hold as its own children.
        self.parts = (self.heading, self.box, self.general)
        state.param.watch(lambda *_: self.draw(), ["result", "units", "combination_choice"])
        self.draw()

    def __panel__(self):
        return pn.Column(*self.parts, sizing_mode="stretch_both", margin=0)

    def draw(self) -> None:
        """List the result's cautions by severity, worded in the page's units (app.report); with load cases,
        those of the combination shown."""
        result = view_result(self.state)
        if result is None:
            return
        U = units(self.state.units)
        cautions = tuple((c.level, c.code, caution_text(c, U), c.source) for c in result.cautions)
        cautions += route_notes(result, U)
        if cautions == self._shown:
            return
        self._shown = cautions

        def item(level, code, message, source):
            return (
                f"<li class='{level}' data-code='{esc(code)}'><span class='lvl'>"
                f"{LEVEL_NAMES.get(level, level)}</span>{symbols(message)}"
                f"<span class='src'>{esc(source)}</span></li>"
            )

        general = [c for c in cautions if c[1] == "scope"] or [
            ("info", "scope", general_caution(result), "strutscope's scope")
        ]
        others = [c for c in cautions if c[1] != "scope"]
        # Every item listed is counted, the general note below the box too (a new user counted five notes
        # under "4 note"), in the plural past one.
        counts = {level: sum(1 for c in others + general[:1] if c[0] == level) for level in LEVEL_NAMES}
        summary = " · ".join(
            f"{n} {LEVEL_NAMES[level].lower()}{'' if n == 1 else 's'}" for level, n in counts.items() if n
        )
        self.heading.object = f"<div class='ss-heading'>Cautions{' — ' + summary if summary else ''}</div>"
        self.list.object = "<ul class='ss-cautions'>" + "".join(item(*c) for c in others) + "</ul>"
        self.general.object = "<ul class='ss-cautions general'>" + item(*general[0]) + "</ul>"


def scroll_box(pane, min_height: int, css_classes: list[str]) -> pn.Column:
    """A box that scrolls `pane` when it is taller than the box's share of the column: at least `min_height`
    px, at most as tall as its content (the rest goes to the other box), its lower edge faded while more lies
    below it."""
    return pn.Column(
        pane,
        scroll=True,
        sizing_mode="stretch_both",
        margin=0,
        min_height=min_height,
        css_classes=css_classes,
        stylesheets=[SCROLL_BOX_CSS],
    )


def route_notes(result, U) -> tuple:
    """The routes' notes as cautions (level, code, words, source), each once, named by its route."""
    seen, notes = set(), []
    # The engine's own route cautions (issue 14) say these: the lateral-torsional notes join its LTB warning.
    said = {c.code for c in result.cautions} | {"chi-LT-1", "LTB-not-checked"}
    for row in route_rows(result, U):
        route = next(r for r in result.routes if r.route == row["route"])
        pairs = list(zip(route.notes, row["notes"], strict=True))
        pairs += [(None, note) for note in row["setting_notes"]]  # how a setting reaches the route
        for code, (level, words) in pairs:
            if code in said:
                continue
            if words in seen:
                continue
            seen.add(words)
            notes.append(
                (level, f"route-{row['route']}", f"{row['name']}: {words}", row["source"] or row["name"])
            )
    return tuple(notes)
