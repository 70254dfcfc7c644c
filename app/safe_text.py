"""Text that leaves strutscope for a spreadsheet or a terminal, made harmless.

Two helpers, used by every writer of CSV and every printout of user text:

- :func:`csv_cell` neutralises a cell a spreadsheet would run as a formula ("CSV injection"): a cell that
  starts with ``=``, ``+``, ``-``, ``@``, a tab or a carriage return and is not a number gets a leading
  apostrophe, which spreadsheets show as text (the usual defence, as the OWASP page "CSV Injection"
  describes it). Numbers such as ``-1.5e3`` and ``-inf`` stay numbers. :func:`csv_row` applies it to a row
  and :func:`csv_writer` wraps :func:`csv.writer` so that no row escapes it.
- :func:`terminal` makes a title, an id, a file name or a message echoed from the input safe to print:
  control characters (escape sequences, carriage returns, line breaks, bells, C1 controls) and the
  invisible bidirectional controls are shown as visible escapes such as ``\\u001b``, so that they neither run
  in the terminal nor add fake lines to a summary. Lone surrogates are shown the same way.
"""

from __future__ import annotations

import csv
import re
import unicodedata
from collections.abc import Iterable
from typing import Any

__all__ = ["FORMULA_PREFIXES", "csv_cell", "csv_comment", "csv_row", "csv_writer", "terminal"]

#: A cell starting with one of these is read as a formula by common spreadsheets.
FORMULA_PREFIXES = ("=", "+", "-", "@", "\t", "\r")

_NUMBER = re.compile(r"[-+]?(?:(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][-+]?\d+)?|inf|infinity|nan)", re.IGNORECASE)

# Invisible characters that reorder what a terminal shows (they can make text read differently).
_BIDI = frozenset("\u061c\u200e\u200f\u202a\u202b\u202c\u202d\u202e\u2066\u2067\u2068\u2069")


def csv_cell(value: Any) -> str:
    """Return `value` as the text of a CSV cell that no spreadsheet runs as a formula.

    >>> csv_cell("=HYPERLINK(\\"x\\")"), csv_cell("-1.5e3"), csv_cell("@SUM(1+1)"), csv_cell(2.5)
    ('\\'=HYPERLINK("x")', '-1.5e3', "'@SUM(1+1)", '2.5')
    """
    text = value if isinstance(value, str) else ("" if value is None else str(value))
    if text.startswith(FORMULA_PREFIXES) and not _NUMBER.fullmatch(text):
        return "'" + text
    return text


def csv_row(cells: Iterable[Any]) -> list[str]:
    """Every cell of a row through :func:`csv_cell`."""
    return [csv_cell(cell) for cell in cells]


class _SafeWriter:
    """A :func:`csv.writer` whose every cell goes through :func:`csv_cell`."""

    def __init__(self, stream, **options) -> None:
        self._writer = csv.writer(stream, **options)

    def writerow(self, row: Iterable[Any]):
        return self._writer.writerow(csv_row(row))

    def writerows(self, rows: Iterable[Iterable[Any]]) -> None:
        for row in rows:
            self.writerow(row)


def csv_writer(stream, **options) -> _SafeWriter:
    """A CSV writer (the options of :func:`csv.writer`) that neutralises every cell it writes."""
    return _SafeWriter(stream, **options)


# A comma, perhaps an opening quote, then a formula prefix: where a spreadsheet would start a formula cell.
_CELL_START = re.compile(r',("?)(?=[=+\-@\t\r])')


def _dangerous(line: str) -> bool:
    cells = next(csv.reader([line]), [])
    return any(csv_cell(cell) != cell for cell in cells)


def csv_comment(text: str) -> str:
    """Return the comment line ``# <text>`` such that no cell a spreadsheet splits from it is a formula.

    A comment line is not quoted (readers skip lines that start with ``#``), but a spreadsheet still splits
    it at the commas; a piece that would start a formula gets the apostrophe after its comma.

    >>> print(csv_comment("title: post A, level 2"))
    # title: post A, level 2
    >>> print(csv_comment('title: a,=1+1,"@x"'))
    # title: a,'=1+1,"'@x"
    """
    line = "# " + " ".join(str(text).split())  # one line: no line breaks, tabs or carriage returns
    if not _dangerous(line):
        return line
    line = _CELL_START.sub(lambda match: f",{match.group(1)}'", line)
    return line if not _dangerous(line) else line.replace(",", ";")


def _escaped(char: str) -> str:
    # \uXXXX for every character, so that a JSON text passed through stays valid JSON.
    return f"\\u{ord(char):04x}"


def terminal(text: Any, *, keep_newlines: bool = False) -> str:
    """Return `text` fit to print: control, bidirectional and surrogate characters shown as escapes.

    With ``keep_newlines`` the line breaks of a text strutscope composed itself are kept; every other
    control character is still escaped. User text (titles, ids, messages) is passed without it.

    >>> print(terminal("Post A\\x1b[2J\\rok: 0 invalid"))
    Post A\\u001b[2J\\rok: 0 invalid
    """
    text = str(text)
    if text.isprintable():
        return text
    out = []
    for char in text:
        if char == "\n" and keep_newlines:
            out.append(char)
        elif char == "\r":
            out.append("\\r")
        elif char == "\n":
            out.append("\\n")
        elif char == "\t":
            out.append("\\t")
        elif unicodedata.category(char) in ("Cc", "Cs") or char in _BIDI:
            out.append(_escaped(char))
        else:
            out.append(char)
    return "".join(out)
