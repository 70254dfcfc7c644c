"""Hostile files, links and typing on the page (issue 11), without a server.

Each bad upload is refused whole with a message naming what was wrong, the previous case stays, and the log
gets one line that holds none of the file's contents. A link that cannot be read says so and keeps the case.
A refused value (1e400 is infinite) logs nothing. A lone surrogate typed into the title is replaced, so that
the link (and every message to the browser) can still be encoded. Each check failed before issue 11:
RecursionError, ValueError and UnicodeError escaped the upload (Panel then logged the uploaded bytes), the
surrogate reached the link, and 1e400 logged a traceback with the whole case.
"""

from __future__ import annotations

import json
import logging
from importlib import resources

import panel as pn
import pytest

from app.page import MemberPage

SECRET = "Invented-secret-title-7f3a"  # must never reach the log


@pytest.fixture
def page():
    """A page on the invented demo case, without a server."""
    yield MemberPage()
    pn.state.reset()


def demo_mapping() -> dict:
    """The invented demo case as a mapping."""
    return json.loads(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))


def upload(page, data: bytes, filename: str = "case.json") -> str:
    """Deliver `data` to the page's upload widget as the browser would; return the message shown."""
    page.upload.value = None
    page.upload.filename = filename
    page.upload.value = data
    return page.upload_message.object


def _with_title(text: str) -> bytes:
    mapping = demo_mapping()
    mapping["title"] = SECRET
    return json.dumps(mapping).replace(json.dumps(SECRET), text).encode("utf-8", "surrogatepass")


_DEEP = json.dumps(SECRET)[:-1] + '", "x": ' + "[" * 3000 + "]" * 3000 + ', "y": "'
_HUGE = b'"length": ' + b"7" * 5000

HOSTILE = [
    ("nesting", ("[" * 50_000 + "]" * 50_000).encode(), "nests"),
    ("nesting-in-a-case", _with_title(_DEEP), "nests"),
    ("digits", _with_title(json.dumps(SECRET)).replace(b'"length": 6.0', _HUGE), "digits"),
    ("surrogate", _with_title('"\\ud800 ' + SECRET + '"'), "lone surrogate"),
    ("raw surrogate", _with_title('"\ud800' + SECRET + '"'), "UTF-8"),
    ("invalid utf-8", b'{"title": "' + SECRET.encode() + b'\xc3\x28"}', "UTF-8"),
    ("invalid json", b'{"title": "' + SECRET.encode() + b'", ', "not valid JSON"),
]


@pytest.mark.parametrize("label, data, words", HOSTILE, ids=[item[0] for item in HOSTILE])
def test_a_hostile_upload_is_refused_whole_with_a_message_and_one_log_line(page, caplog, label, data, words):
    """Deep nesting, huge numbers, surrogates, bad UTF-8, bad JSON: a message, the case kept, one log line."""
    before = page.model.case_mapping()
    good = page.model.result
    with caplog.at_level(logging.INFO):
        message = upload(page, data)
    assert "ss-error" in message and "upload: case.json" in message and words in message, message
    assert page.model.case_mapping() == before and page.model.result is good  # never half applied
    records = [record for record in caplog.records if record.levelno >= logging.WARNING]
    assert len(records) == 1, [record.getMessage() for record in records]
    logged = records[0].getMessage() + (records[0].exc_text or "")
    assert "refused" in logged and SECRET not in logged and records[0].exc_info is None


def test_a_good_upload_after_a_hostile_one_loads(page):
    """After a refused file the page still loads a good one (nothing was left half done)."""
    upload(page, HOSTILE[0][1])
    mapping = demo_mapping()
    mapping["length"] = 5.0
    assert "loaded" in upload(page, json.dumps(mapping).encode())
    assert page.model.result.case.length == 5.0


@pytest.mark.parametrize(
    "link, words",
    [
        ("{not json", "not valid JSON"),
        ("[1, 2]", "does not hold a case"),
        ('{"title": "\\ud800"}', "lone surrogate"),
    ],
)
def test_a_link_that_cannot_be_read_says_why_and_keeps_the_case(page, caplog, link, words):
    """A link's case that is not JSON, not an object or not text: a message naming it; the case stays."""
    before = page.model.case_mapping()
    with caplog.at_level(logging.INFO):
        page.model.link = link
    message = page.model.error_for("case")
    assert message.startswith("case: the link") and words in message, message
    assert page.model.case_mapping() == before
    assert [r.levelno for r in caplog.records if r.levelno >= logging.WARNING] == [logging.WARNING]


def test_typing_1e400_logs_nothing_and_keeps_the_link(page, caplog):
    """1e400 (infinite) in the length: the engine's message at the input, no log record, the link kept."""
    link = page.model.link
    with caplog.at_level(logging.INFO):
        page.length_input.value = float("1e400")
    assert "length" in page.model.error_for("length") and "finite" in page.model.error_for("length")
    assert page.model.link == link
    assert [record.getMessage() for record in caplog.records if record.levelno >= logging.WARNING] == []


def test_a_lone_surrogate_typed_in_the_title_is_replaced(page):
    """A lone surrogate typed into the title becomes U+FFFD: the title, the link and the result encode."""
    page.title_input.value = "Post \ud800 A"
    assert page.model.title == "Post \ufffd A"
    assert page.title_input.value == "Post \ufffd A"
    page.model.link.encode("utf-8")
    page.model.result.case.to_json().encode("utf-8")
