"""The page's input fields: one unit-aware number field, and the panes that show the engine's messages.

:class:`UnitNumber` is the one number field of the page. It shows an SI value of the state in the display
unit of the page's unit system, rounded to six significant figures (19.685 ft, not 19.685039), and writes
what the user types back in SI. A value the field itself shows is never written back: an edit is written
only when it differs from the rounded display of the state's value, so no flag is needed to tell the page's
own updates from the user's. Its box is a :class:`app.page.number_text.NumberText`: the text typed is read
on the server, and a text that is not a number ("6,5") reaches the state as an ``Unread``, for the engine to
refuse and the page to quote.

:class:`ErrorPanes` holds the panes that show the engine's message for a field, each beside its input, in
the page's words and units (:mod:`app.page.messages`: "Load 2, position", not ``loads[1].x``).
"""

from __future__ import annotations

import math
from collections.abc import Callable

import panel as pn

from app.page.messages import INNER_ROWS, field_words, page_message, shown_message, state_message
from app.page.number_text import NumberText, Unread, same_value
from app.page.style import CSS, NUMBER_CSS, esc
from app.units import Unit, units

__all__ = [
    "INNER_ROWS",
    "ErrorPanes",
    "UnitNumber",
    "field_words",
    "page_message",
    "rounded",
    "shown_message",
    "si_value",
    "unit_for",
]

#: Significant figures of a number shown in a field.
SHOWN_DIGITS = 6


def rounded(value: float | None) -> float | None:
    """`value` to :data:`SHOWN_DIGITS` significant figures (None and non-finite values as they are)."""
    if value is None or not math.isfinite(value) or value == 0:
        return value
    return float(f"{value:.{SHOWN_DIGITS}g}")


def si_value(value: float | None, unit: Unit | None) -> float | None:
    """A number typed in `unit` in SI; None (an emptied field) and an Unread text as they are."""
    if value is None or unit is None or isinstance(value, Unread):
        return value
    return unit.to_si(value)


def unit_for(system: str, kind: str | None) -> Unit | None:
    """The display unit of `kind` in unit system `system` ('si' or 'us'); None for a plain number."""
    if kind is None:
        return None
    U = units(system)
    if kind == "section_modulus":
        # cm³ or in³: the area unit's length cubed (a units conversion, not a property of the section).
        return Unit(label="cm³" if U.system == "si" else "in³", factor=U.area.factor**1.5)
    return U.unit(kind)


class UnitNumber:
    """A number field bound to one SI value: shown in display units, typed values written back in SI.

    Parameters
    ----------
    text : str
        The label without its unit ("Span L"); the unit is added in brackets.
    kind : str or None
        The kind of quantity (:mod:`app.units`), or None for a plain number.
    get, put : callables
        Read the SI value; write an SI value (None for an emptied field).
    system : callable
        The page's unit system now ('si' or 'us').
    """

    def __init__(
        self,
        text: str,
        kind: str | None,
        get: Callable[[], float | None],
        put: Callable[[float | None], None],
        system: Callable[[], str],
        **widget_params,
    ) -> None:
        self.text, self.kind = text, kind
        self._get, self._put, self._system = get, put, system
        widget_params.setdefault("stylesheets", [NUMBER_CSS])
        self.widget = NumberText(label=self.label(), value=None, **widget_params)
        self.widget.param.watch(self._typed, "value")
        self.show()

    @property
    def unit(self) -> Unit | None:
        """The display unit now."""
        return unit_for(self._system(), self.kind)

    def label(self) -> str:
        """The label with the display unit now."""
        unit = self.unit
        return self.text if unit is None else f"{self.text} [{unit.label}]"

    def shown(self) -> float | None:
        """The state's value as this field shows it: display units, rounded (a text not read as typed)."""
        value = self._get()
        if isinstance(value, Unread):
            return value
        if value is None or isinstance(value, str):
            return None
        unit = self.unit
        return rounded(value if unit is None else unit.from_si(value))

    def show(self) -> None:
        """Show the state's value and the unit's label (after a load, a link or a units switch)."""
        label = self.label()
        if self.widget.label != label:
            self.widget.label = label
        shown = self.shown()
        if not same_value(shown, self.widget.value):
            self.widget.value = shown

    def _typed(self, event) -> None:
        if same_value(event.new, self.shown()):
            return  # this field's own display, or an edit that changes nothing
        self._put(si_value(event.new, self.unit))


class ErrorPanes:
    """The panes that show the engine's message on a field beside its input; hidden when there is none."""

    def __init__(self, state) -> None:
        self.state = state
        self.panes: list[tuple[pn.pane.HTML, tuple[str, ...], bool]] = []

    def pane(self, *prefixes: str, exact: bool = False) -> pn.pane.HTML:
        """A pane for the message on fields under `prefixes` (only those paths if `exact`)."""
        pane = pn.pane.HTML(
            "", visible=False, sizing_mode="stretch_width", stylesheets=[CSS], margin=(0, 5, 4, 5)
        )
        self.panes.append((pane, prefixes, exact))
        return pane

    def clear(self) -> None:
        """Forget every pane (their inputs were rebuilt)."""
        self.panes = []

    def show(self) -> None:
        """Show each pane's message, or hide it."""
        errors = self.state.errors
        for pane, prefixes, exact in self.panes:
            if exact:
                message = next((errors[p] for p in prefixes if p in errors), "")
            else:
                message = self.state.error_for(*prefixes)
            said = state_message(self.state, message) if message else ""
            text = f"<div class='ss-error'>{esc(said)}</div>" if message else ""
            if pane.object != text:
                pane.object = text
            if pane.visible != bool(message):
                pane.visible = bool(message)

    def shown(self) -> list[str]:
        """The text of every pane that is shown."""
        return [pane.object for pane, _, _ in self.panes if pane.visible]
