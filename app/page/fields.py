"""The page's input fields: one unit-aware number field, and the panes that show the engine's messages.

:class:`UnitNumber` is the one number field of the page. It shows an SI value of the state in the display
unit of the page's unit system, rounded to six significant figures (19.685 ft, not 19.685039), and writes
what the user types back in SI. A value the field itself shows is never written back: an edit is written
only when it differs from the rounded display of the state's value, so no flag is needed to tell the page's
own updates from the user's.

:class:`ErrorPanes` holds the panes that show the engine's message for a field, each beside its input, in
the page's words for the field ("Load 2, position", not ``loads[1].x``).
"""

from __future__ import annotations

import math
import re
from collections.abc import Callable

import panel as pn

from app.page.style import CSS, WIDGET_CSS, esc
from app.report import quoted_text
from app.units import Unit, units

__all__ = ["ErrorPanes", "UnitNumber", "field_words", "rounded", "shown_message", "unit_for"]

#: Significant figures of a number shown in a field.
SHOWN_DIGITS = 6


def rounded(value: float | None) -> float | None:
    """`value` to :data:`SHOWN_DIGITS` significant figures (None and non-finite values as they are)."""
    if value is None or not math.isfinite(value) or value == 0:
        return value
    return float(f"{value:.{SHOWN_DIGITS}g}")


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
        widget_params.setdefault("stylesheets", [WIDGET_CSS])
        widget_params.setdefault("format", "0[.][000000]")
        self.widget = pn.widgets.FloatInput(label=self.label(), value=None, **widget_params)
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
        """The state's value as this field shows it: display units, rounded."""
        value = self._get()
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
        if shown != self.widget.value:
            self.widget.value = shown

    def _typed(self, event) -> None:
        if event.new == self.shown():
            return  # this field's own display, or an edit that changes nothing
        unit = self.unit
        value = event.new
        if value is not None and unit is not None:
            value = unit.to_si(value)
        self._put(value)


# The page's names of the case's fields, for the engine's messages (which name the case file's paths).
_FIELD_WORDS = {
    "title": "Case title",
    "length": "Span L",
    "axial_force": "Axial force N",
    "EI": "EI",
    "stiffness_factor": "Factor on EI",
    "axis": "Bending axis",
    "supports.left": "Left end",
    "supports.right": "Right end",
    "supports": "Supports",
    "section": "Section",
    "material": "Material",
    "imperfection": "Initial bow",
    "check": "Check",
    "out_of_plane": "Out of plane",
    "loads": "Loads",
    "second_plane": "Second plane",
    "second_plane.supports.left": "Second plane, left end",
    "second_plane.supports.right": "Second plane, right end",
    "second_plane.loads": "Second plane, loads",
    "restraints": "Restraints",
    "steps": "Steps in EI",
    "foundation": "Foundation",
}
_LOAD_FIELD_WORDS = {
    "x": "position",
    "P": "force F",
    "C": "couple C",
    "q": "q",
    "q_start": "q start",
    "q_end": "q end",
    "start": "from",
    "end": "to",
    "type": "type",
}
_LOAD_PATH = re.compile(r"^(?:second_plane\.)?loads\[(\d+)\](?:\.(\w+))?$")
#: A row of the member's inside (engine issue 16): ``restraints[0].x``, ``steps[1].EI``, ``foundation[0].k``.
_INNER_PATH = re.compile(r"^(restraints|steps|foundation)\[(\d+)\](?:\.(\w+)(?:\.[\w.\[\]]+)?)?$")
#: The page's name of a row of each list (its heading, and its messages).
INNER_ROWS = {"restraints": "Restraint", "steps": "Step", "foundation": "Foundation"}
_INNER_FIELD_WORDS = {
    "x": "at x",
    "translation": "translation",
    "rotation": "rotation",
    "hinge": "hinge",
    "plane": "plane",
    "EI": "EI",
    "section": "section",
    "start": "from",
    "end": "to",
    "k": "modulus k",
}
#: A load case's field (issue 17): ``actions[1].axial_force``, ``actions[0].loads[2].x``.
_ACTION_PATH = re.compile(r"^actions\[(\d+)\](?:\.loads\[(\d+)\])?(?:\.(\w+))?$")


def field_words(path: str) -> str:
    """The page's name for a field path of the engine: ``loads[1].x`` is "Load 2, position"."""
    match = _ACTION_PATH.match(path)
    if match:
        words = f"Load case {int(match.group(1)) + 1}"
        if match.group(2) is not None:
            words += f", load {int(match.group(2)) + 1}"
        key = match.group(3)
        return words if key is None else f"{words}, {_LOAD_FIELD_WORDS.get(key, key.replace('_', ' '))}"
    match = _INNER_PATH.match(path)
    if match:
        words = f"{INNER_ROWS[match.group(1)]} {int(match.group(2)) + 1}"
        key = match.group(3)
        return words if key is None else f"{words}, {_INNER_FIELD_WORDS.get(key, key)}"
    match = _LOAD_PATH.match(path)
    if match:
        plane = "Second plane, load" if path.startswith("second_plane.") else "Load"
        words = f"{plane} {int(match.group(1)) + 1}"
        key = match.group(2)
        return words if key is None else f"{words}, {_LOAD_FIELD_WORDS.get(key, key)}"
    if path in _FIELD_WORDS:
        return _FIELD_WORDS[path]
    head, _, rest = path.partition(".")
    if head in _FIELD_WORDS and rest:
        return f"{_FIELD_WORDS[head]}, {rest.replace('_', ' ')}"
    return path


def page_message(message: str) -> str:
    """The engine's message with its field path replaced by the page's name for the field."""
    head, sep, rest = message.partition(":")
    if not sep or " " in head.strip() or head.strip() in ("case", "upload", "link"):
        return message
    return f"{field_words(head.strip())}:{rest}"


#: A range whose unit the engine writes once, after its upper end: ">= 0.001 and <= 1000 m", "0 to 6 m".
_RANGE = re.compile(
    r"(?<![\w.])(-?\d+(?:\.\d+)?)( and [<>]=? | to )(-?\d+(?:\.\d+)?) (mm|MPa|kN·m|kN|m)(?![\w²³⁴·/])"
)


#: The engine's foundation modulus in a message, N/m² (a range's unit written once, after its upper end).
_NUMBER = r"-?\d+(?:\.\d+)?(?:e[+-]?\d+)?"
_MODULUS_RANGE = re.compile(rf"(?<![\w.])({_NUMBER})( and [<>]=? | to )({_NUMBER}) N/m²")
_MODULUS = re.compile(rf"(?<![\w.])({_NUMBER}) N/m²")


def shown_message(message: str, system: str) -> str:
    """The engine's message as the page shows it: the page's name for the field, and in US units the
    engine's SI lengths, forces and moments in the page's units (the value and range as the user typed).
    A foundation modulus (the engine's N/m²) is shown in the page's unit of it in both systems, kN/m² or
    kip/in², as its field takes it.

    A range's unit is written after both ends first, so that its lower end is converted too (">= 0.001 and
    <= 1000 m" is never shown as ">= 0.001 and <= 3281 ft").
    """
    U = units(system)
    text = page_message(message)
    if U.system != "si":
        text = _RANGE.sub(r"\1 \4\2\3 \4", text)
    text = _MODULUS_RANGE.sub(r"\1 N/m²\2\3 N/m²", text)
    text = _MODULUS.sub(lambda match: _modulus_text(U, float(match.group(1))), text)
    return quoted_text(text, U)


def _modulus_text(U, value_si: float) -> str:
    """A foundation modulus [N/m²] of a message in the page's unit; a small one to four figures, never 0."""
    unit = U.unit("foundation_modulus")
    shown = value_si * unit.factor
    if shown != 0.0 and abs(shown) < 1e-3:
        return f"{shown:.4g} {unit.label}"
    return U.show("foundation_modulus", value_si)


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
            said = shown_message(message, self.state.units) if message else ""
            text = f"<div class='ss-error'>{esc(said)}</div>" if message else ""
            if pane.object != text:
                pane.object = text
            if pane.visible != bool(message):
                pane.visible = bool(message)

    def shown(self) -> list[str]:
        """The text of every pane that is shown."""
        return [pane.object for pane, _, _ in self.panes if pane.visible]
