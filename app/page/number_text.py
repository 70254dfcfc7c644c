"""The page's number box: the text as the user typed it, read on the server, never guessed at.

A browser's number box drops what it does not take as it is typed, so "6,5" reached the page as 65 and an
emptied box showed "NaN". :class:`NumberText` is a plain text box instead: the browser sends the text, and
:func:`read_number` reads it here. A text that is not a number (a decimal comma, a thousands separator, a
word) is never read as some other number: it becomes an :class:`Unread`, a not-a-number that keeps the
text. The state holds it as it holds any refused value, so the engine refuses the case (naming the field and
its range), the page keeps the last good result and marks it stale, and the box keeps the text (no input is
lost). An emptied box is None, as before.
"""

from __future__ import annotations

import math
import re

import panel as pn
import param

__all__ = ["NumberText", "Unread", "number_text", "read_number", "same_value"]

#: A number as the page reads it: digits with a point for decimals and an optional exponent (6.5, .5, 2e5).
_NUMBER = re.compile(r"[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?")
#: The longest typed text a box keeps (a number never needs more).
MAX_TEXT = 60


class Unread(float):
    """Text typed into a number box that is not a number: NaN to the engine and to arithmetic, with the text.

    Scaling keeps it as it is (a load case's axial force times the slider's load factor is still the text
    typed), so the message can quote the text wherever the value goes.
    """

    text: str

    def __new__(cls, text: str) -> Unread:
        unread = super().__new__(cls, math.nan)
        unread.text = text
        return unread

    def __mul__(self, other) -> Unread:
        return self

    __rmul__ = __truediv__ = __rtruediv__ = __neg__ = __mul__

    __repr__ = float.__repr__  # "nan" in the engine's messages, however they quote a value

    def __reduce__(self):
        return (Unread, (self.text,))


def read_number(text: str | None) -> float | None:
    """The number in `text` as typed in display units: None when empty, an :class:`Unread` when not a number.

    >>> read_number(" 6.5 "), read_number(""), read_number("−2e3")
    (6.5, None, -2000.0)
    >>> read_number("6,5").text
    '6,5'
    """
    cleaned = (text or "").strip().replace("\u2212", "-")  # a minus sign copied from a document
    if not cleaned:
        return None
    if _NUMBER.fullmatch(cleaned):
        return float(cleaned)  # 1e400 is inf: the engine names it as not finite
    return Unread(cleaned[:MAX_TEXT])


def number_text(value: float | None) -> str:
    """The text a box shows for `value`: plain digits without a trailing ".0", the text of an Unread.

    >>> number_text(6.0), number_text(19.685), number_text(None), number_text(1e30)
    ('6', '19.685', '', '1e+30')
    """
    if value is None:
        return ""
    if isinstance(value, Unread):
        return value.text
    if value == 0:
        return "0"
    text = repr(float(value))
    return text[:-2] if text.endswith(".0") else text


def same_value(a, b) -> bool:
    """Whether two values of a box are the same: equal numbers (NaN too), both None, or the same Unread."""
    if a is None or b is None or isinstance(a, Unread) or isinstance(b, Unread):
        return a is b
    return a == b or (math.isnan(a) and math.isnan(b))


class NumberText(pn.widgets.TextInput):
    """A text box holding one number: ``value`` is the number read (None, a float or an Unread), ``text``
    the text shown. Setting ``value`` shows it; text typed in the browser sets ``value``."""

    value = param.Number(default=None, allow_None=True, doc="The number read from the text.")
    text = param.String(default="", doc="The text in the box, as typed or as shown for the value.")

    # The browser's text is sent when typed (Enter or leaving the box), not at every key as `value_input`.
    _rename = {**pn.widgets.TextInput._rename, "value": None, "value_input": None, "text": "value"}

    def __init__(self, **params) -> None:
        params.setdefault("max_length", MAX_TEXT)
        super().__init__(**params)
        self.text = number_text(self.value)
        self._reading = False
        self.param.watch(self._text_changed, "text")
        self.param.watch(self._value_changed, "value")

    def _process_event(self, event) -> None:
        if event.event_name == "enter-pressed":  # the box's text: TextInput would write it into `value`
            self.text = event.value_input
            self.enter_pressed = True

    def _text_changed(self, event) -> None:
        if self._reading:
            return
        value = read_number(event.new)
        self._reading = True
        try:
            if not same_value(value, self.value):
                self.value = value
        finally:
            self._reading = False

    def _value_changed(self, event) -> None:
        if self._reading:
            return
        text = number_text(event.new)
        if text != self.text:
            self._reading = True
            try:
                self.text = text
            finally:
                self._reading = False
