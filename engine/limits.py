"""Limits on one case and the safe reading of case-file JSON.

Every limit here bounds the work one case can ask for, or the input one file can hold, well beyond what a
member in practice needs; :mod:`engine.case` enforces them when a case is built (the one place a case is
validated), the JSON Schema of ``strutscope schema`` and the README publish them, and a case beyond one is
refused with a :class:`~engine.errors.CaseError` naming the limit and the count received.

- :data:`MAX_LOADS` transverse loads per case, and :data:`MAX_SEGMENTS` segments (the loads' positions and
  ends cut the member into segments; the solve's work grows with their number);
- :data:`MAX_RESTRAINTS` intermediate restraints, steps in section and foundation stretches (each list;
  checked by :mod:`engine.restraints`), :data:`MAX_ACTIONS` load cases (:mod:`engine.actions`) and
  :data:`MAX_COMBINATIONS` load combinations (:mod:`engine.combinations`);
- :data:`MAX_CASE_BYTES`, :data:`MAX_JSON_DEPTH` and :data:`MAX_NUMBER_DIGITS` bound a case file's text.

:func:`parse_json` reads case-file JSON so that no input gives anything but a CaseError: too large, nested
too deeply (Python's parser would raise RecursionError), numbers of thousands of digits (ValueError from the
integer-conversion limit), bytes that are not UTF-8, and text that holds lone surrogates ("\\ud800", which no
file, PDF or terminal can encode) are refused with the place they were found.
"""

from __future__ import annotations

import json
import re
import unicodedata
from collections.abc import Callable, Mapping
from typing import Any

from engine.errors import CaseError

__all__ = [
    "LIMITS",
    "MAX_ACTIONS",
    "MAX_CASE_BYTES",
    "MAX_COMBINATIONS",
    "MAX_JSON_DEPTH",
    "MAX_LOADS",
    "MAX_NUMBER_DIGITS",
    "MAX_RESTRAINTS",
    "MAX_SEGMENTS",
    "check_text",
    "check_work",
    "parse_json",
    "segment_count",
    "text_problem",
]

#: Transverse loads per case. A member in practice carries a few; 50 point loads solve in well under a
#: second (tests/benchmarks/case_limits.py), where 1 000 took 14 s and 350 MB (issue 11).
MAX_LOADS = 50

#: Segments per case: the member is cut at every point load, couple and end of a partial load. The
#: amplification sweep of the page solves one dense system of 4 unknowns per segment for each of its ~340
#: forces, so its cost grows with the cube of this number (60 segments: about 1.5 s on one core).
MAX_SEGMENTS = 60

#: Items in each of a case's lists ``restraints``, ``steps`` and ``foundation``: far more than any member
#: needs; each adds unknowns to the member's global system (engine.restraints checks it).
MAX_RESTRAINTS = 50

#: Load cases (``actions``) per case (engine.actions checks it).
MAX_ACTIONS = 12

#: Load combinations per case, made by the rule or given in a table: each is solved (engine.combinations
#: checks it).
MAX_COMBINATIONS = 256

#: A case file's size in bytes (the page's upload limit is the same).
MAX_CASE_BYTES = 1_000_000

#: How deeply a case file's JSON may nest objects and arrays (a case file needs 4).
MAX_JSON_DEPTH = 20

#: Digits of one integer in a case file (Python refuses more than 4 300 with a ValueError).
MAX_NUMBER_DIGITS = 100

#: Every limit by name: (value, what it bounds), for the README, the schema and the messages.
LIMITS: Mapping[str, tuple[int, str]] = {
    "loads": (MAX_LOADS, "transverse loads per case"),
    "segments": (MAX_SEGMENTS, "segments per case (cut at every point load, couple and partial load's end)"),
    "restraints": (MAX_RESTRAINTS, "intermediate restraints, steps or foundation stretches (each list)"),
    "actions": (MAX_ACTIONS, "load cases per case"),
    "combinations": (MAX_COMBINATIONS, "load combinations per case"),
    "case_bytes": (MAX_CASE_BYTES, "bytes per case file"),
    "json_depth": (MAX_JSON_DEPTH, "levels of nesting in a case file"),
    "number_digits": (MAX_NUMBER_DIGITS, "digits of one integer in a case file"),
}

# Positions closer than this fraction of the length are one cut (as engine.solver.model merges them).
_SAME_CUT = 1e-12


# ----------------------------------------------------------------------------- text


def text_problem(value: str) -> str | None:
    """Describe the first character of `value` that is not plain, printable text; None when there is none.

    Lone surrogates (U+D800 to U+DFFF: half of a pair, which no UTF-8 file, PDF or terminal can hold) and
    control characters (tabs, line breaks, escape sequences, U+0000 to U+001F, U+007F to U+009F) are
    found, and
    so are the bidirectional controls (U+202A to U+202E, U+2066 to U+2069, U+200E, U+200F, U+061C), which
    reorder
    the text around them when it is shown and can make a title or an id read as something else.

    >>> text_problem("Post A")
    >>> text_problem("Post \\ud800")
    'contains a character that is not valid text (U+D800, a lone surrogate) at position 6'
    """
    for position, char in enumerate(value, start=1):
        code = ord(char)
        if 0xD800 <= code <= 0xDFFF:
            return (
                f"contains a character that is not valid text (U+{code:04X}, a lone surrogate) "
                f"at position {position}"
            )
        if unicodedata.category(char) == "Cc" or char in _BIDI_CONTROLS:
            return (
                f"contains a control character (U+{code:04X}) at position {position}; "
                "only printable text is allowed"
            )
    return None


_BIDI_CONTROLS = frozenset("\u202a\u202b\u202c\u202d\u202e\u2066\u2067\u2068\u2069\u200e\u200f\u061c")


def check_text(path: str, value: str) -> None:
    """Refuse text with a lone surrogate or a control character, naming the field `path`."""
    problem = text_problem(value)
    if problem is not None:
        raise CaseError(f"{path}: {problem}")


# ----------------------------------------------------------------------------- work


def segment_count(length: float, loads) -> int:
    """The number of segments `loads` cut a member of `length` into (as
    :class:`engine.solver.model.Model` cuts it)."""
    cuts = [0.0, float(length)]
    for load in loads:
        if load.type in ("point", "couple"):
            cuts.append(float(load.x))
        else:
            cuts.extend(load.span(length))
    cuts.sort()
    tolerance = _SAME_CUT * float(length)
    nodes = 1
    last = cuts[0]
    for cut in cuts[1:]:
        if cut - last > tolerance:
            nodes += 1
            last = cut
    return max(1, nodes - 1)


def check_load_count(count: int) -> None:
    """Refuse more than :data:`MAX_LOADS` loads, before any is built."""
    if count > MAX_LOADS:
        raise CaseError(
            f"loads: {count} loads given; a case may have at most {MAX_LOADS} "
            f"(the limit bounds the work of one case)"
        )


def check_work(length: float, loads) -> None:
    """Refuse a case beyond :data:`MAX_LOADS` loads or :data:`MAX_SEGMENTS` segments."""
    check_load_count(len(loads))
    segments = segment_count(length, loads)
    if segments > MAX_SEGMENTS:
        raise CaseError(
            f"loads: the loads cut the member into {segments} segments; a case may have at most "
            f"{MAX_SEGMENTS} (every point load, couple and end of a partial load is a cut)"
        )


# ----------------------------------------------------------------------------- JSON

# The characters that open or close strings, escapes and nesting: found by the regular expression engine, so
# that the scan is linear and runs at C speed over long strings (a pattern matching whole strings backtracked
# quadratically on a run of quote–backslash pairs).
_SPECIAL = re.compile(r'["\\\[\]{}]')


def _position(text: str, index: int) -> str:
    line = text.count("\n", 0, index) + 1
    column = index - (text.rfind("\n", 0, index) + 1) + 1
    return f"line {line} column {column}"


def _check_depth(text: str) -> None:
    depth = 0
    in_string = False
    skip = -1  # the index of a character escaped by a backslash
    for match in _SPECIAL.finditer(text):
        index = match.start()
        if index == skip:
            continue
        char = text[index]
        if in_string:
            if char == "\\":
                skip = index + 1
            elif char == '"':
                in_string = False
        elif char == '"':
            in_string = True
        elif char in "[{":
            depth += 1
            if depth > MAX_JSON_DEPTH:
                raise CaseError(
                    f"case: the JSON nests objects and arrays more than {MAX_JSON_DEPTH} levels "
                    f"deep (at {_position(text, index)}); a case file needs 4"
                )
        elif char in "]}":
            depth -= 1


def _integer(digits: str) -> int:
    count = len(digits.lstrip("-"))
    if count > MAX_NUMBER_DIGITS:
        raise CaseError(
            f"case: a number of {count} digits is too long; numbers in a case file have at most "
            f"{MAX_NUMBER_DIGITS} digits"
        )
    return int(digits)


def _check_strings(data: Any) -> None:
    """Refuse lone surrogates in any key or string value, naming the field path (no recursion)."""
    stack: list[tuple[str, Any]] = [("", data)]
    while stack:
        path, value = stack.pop()
        if isinstance(value, str):
            if any(0xD800 <= ord(char) <= 0xDFFF for char in value):
                raise CaseError(f"{path or 'case'}: {text_problem(value)}")
        elif isinstance(value, dict):
            for key, item in value.items():
                where = f"{path}.{key}" if path else key
                if any(0xD800 <= ord(char) <= 0xDFFF for char in key):
                    raise CaseError(f"{path or 'case'}: a key {text_problem(key)}")
                stack.append((where, item))
        elif isinstance(value, list):
            stack.extend((f"{path}[{index}]", item) for index, item in enumerate(value))


def parse_json(text: str | bytes, object_pairs_hook: Callable | None = None) -> Any:
    """Parse case-file JSON; every problem is a :class:`CaseError` saying what and where.

    Parameters
    ----------
    text : str or bytes
        JSON text; bytes are UTF-8 (a byte-order mark is allowed; UTF-16 and UTF-32 are recognised as
        :func:`json.loads` recognises them).
    object_pairs_hook : callable, optional
        Passed to :func:`json.loads` (the case uses it to refuse repeated keys).

    Returns
    -------
    The parsed data: dicts, lists, strings, numbers, booleans and None.
    """
    if not isinstance(text, (str, bytes, bytearray)):
        raise CaseError(f"case: a {type(text).__name__} is not JSON text")
    if len(text) > MAX_CASE_BYTES:
        raise CaseError(
            f"case: {len(text)} bytes is too large; a case file may have at most {MAX_CASE_BYTES} bytes"
        )
    try:
        if isinstance(text, (bytes, bytearray)):
            try:
                text = bytes(text).decode(json.detect_encoding(text))
            except UnicodeDecodeError as error:
                raise CaseError(
                    f"case: the bytes cannot be decoded as UTF-8 text ({error.reason} at byte "
                    f"{error.start + 1})"
                ) from None
        _check_depth(text)
        try:
            data = json.loads(text, object_pairs_hook=object_pairs_hook, parse_int=_integer)
        except json.JSONDecodeError as error:
            raise CaseError(
                f"case: not valid JSON: {error.msg} at line {error.lineno} column {error.colno}"
            ) from None
        except CaseError:
            raise
        except RecursionError:
            raise CaseError(
                f"case: the JSON nests objects and arrays too deeply; a case file needs 4 levels "
                f"(at most {MAX_JSON_DEPTH})"
            ) from None
        except ValueError as error:  # an integer-conversion limit, or a number Python cannot read
            raise CaseError(f"case: a number cannot be read ({str(error).split(';')[0]})") from None
        _check_strings(data)
    except MemoryError:
        raise CaseError("case: not enough memory to read the case file") from None
    return data
