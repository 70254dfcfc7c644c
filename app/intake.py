"""Reading a case from outside the page (an upload, a link, a served file): refused whole, with a message.

The engine validates a case field by field. Before it, hostile bytes can fail in the JSON reader itself
(issue 11): nesting deep enough to exhaust the recursion limit (RecursionError), an integer of more than 4 300
digits (ValueError), text that is not UTF-8 (UnicodeDecodeError), a file too large for memory (MemoryError);
and a case can hold a lone surrogate ("\\ud800"), which reads as JSON but is not text: it cannot be encoded
to send to the browser or to write to a file, and it broke every session of the server. Here each of these
becomes :class:`IntakeError`, a ValueError whose message names what was wrong (never the data itself beyond
the field path), so that the page shows it and keeps the previous case. :func:`clean_text` replaces lone
surrogates in typed text instead.
"""

from __future__ import annotations

from collections.abc import Mapping

import engine
from engine.errors import CaseError
from engine.limits import parse_json

__all__ = ["IntakeError", "case_from_bytes", "case_from_link", "check_case", "clean_text", "text_problem"]


class IntakeError(ValueError):
    """A case that cannot be read; the message names what was wrong."""

    def __init__(self, message: str, kind: str) -> None:
        super().__init__(message)
        self.kind = kind  # a short category for the server log, without the user's data


def _engine_message(error: Exception) -> str:
    """The engine's message without its leading "case: " (the caller names what was read)."""
    text = str(error)
    return text[len("case: ") :] if text.startswith("case: ") else text


def _loads(text: str, what: str):
    """Parse JSON text with the engine's bounded reader (:func:`engine.limits.parse_json`)."""
    try:
        return parse_json(text)
    except CaseError as error:
        raise IntakeError(f"{what}: {_engine_message(error)}", "json") from None


def text_problem(value) -> str:
    """Where a lone surrogate sits in `value` (a JSON-like structure), as a field path, or ''."""
    stack = [("", value)]
    while stack:
        path, item = stack.pop()
        if isinstance(item, str):
            try:
                item.encode("utf-8")
            except UnicodeEncodeError:
                return path or "case"
        elif isinstance(item, Mapping):
            for key, inner in item.items():
                if isinstance(key, str) and text_problem(key):
                    return path or "case"
                stack.append((f"{path}.{key}" if path else str(key), inner))
        elif isinstance(item, (list, tuple)):
            stack.extend((f"{path}[{index}]", inner) for index, inner in enumerate(item))
    return ""


def _surrogate_message(path: str) -> str:
    return (
        f"{path}: holds a lone surrogate (a character code from U+D800 to U+DFFF on its own), which is not "
        "text; the case was not loaded"
    )


def check_case(case) -> None:
    """Raise IntakeError when an :class:`engine.Case` holds text that cannot be encoded."""
    path = text_problem(case.to_dict())
    if path:
        raise IntakeError(_surrogate_message(path), "surrogate")


def case_from_bytes(data: bytes, what: str):
    """An :class:`engine.Case` from file bytes; IntakeError naming what was wrong otherwise.

    The engine's reader does the work (its messages name the field; it refuses duplicate keys); the
    failures it does not word yet are worded here.
    """
    try:
        text = bytes(data).decode("utf-8-sig")
    except UnicodeDecodeError as error:
        raise IntakeError(
            f"{what}: cannot be decoded as UTF-8 text (invalid byte at position {error.start})", "utf-8"
        ) from None
    except MemoryError:
        raise IntakeError(f"{what}: is too large to read", "memory") from None
    try:
        case = engine.Case.from_json(text)
    except engine.CaseError as error:
        raise IntakeError(f"{what}: {_engine_message(error)}", "case") from None
    except RecursionError:
        raise IntakeError(f"{what}: arrays and objects are nested too deep to read", "nesting") from None
    except MemoryError:
        raise IntakeError(f"{what}: is too large to read", "memory") from None
    except UnicodeError:
        raise IntakeError(f"{what}: holds text that is not valid Unicode", "unicode") from None
    except ValueError as error:
        if "digits" in str(error):
            raise IntakeError(
                f"{what}: holds a number with more than 4300 digits; numbers must be ordinary decimals",
                "digits",
            ) from None
        raise IntakeError(f"{what}: cannot be read as a case ({type(error).__name__})", "value") from None
    path = text_problem(case.to_dict())
    if path:
        raise IntakeError(f"{what}: {_surrogate_message(path)}", "surrogate")
    return case


def case_from_link(value, what: str = "link: the case in it"):
    """A case mapping from a link's ``case`` value (JSON text, or a mapping Panel already decoded)."""
    if isinstance(value, Mapping):
        mapping = value
    elif isinstance(value, (str, bytes)):
        text = value.decode("utf-8", "strict") if isinstance(value, bytes) else value
        mapping = _loads(text, what)
    else:
        raise IntakeError(f"{what}: does not hold a case (a JSON object)", "json")
    if not isinstance(mapping, Mapping):
        raise IntakeError(f"{what}: does not hold a case (a JSON object)", "json")
    path = text_problem(mapping)
    if path:
        raise IntakeError(f"{what}: {_surrogate_message(path)}", "surrogate")
    return mapping


def clean_text(text: str) -> str:
    """`text` with every lone surrogate replaced by U+FFFD (typed text is kept, never refused)."""
    if not text_problem(text):
        return text
    return text.encode("utf-16", "surrogatepass").decode("utf-16", "replace")
