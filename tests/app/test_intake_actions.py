"""The page refuses a case with load cases (actions) whole, naming the command that solves it, instead of
loading it without its loads (its own loads are empty: the page would solve an unloaded member)."""

import json
from importlib import resources

import pytest

import engine
from app.intake import IntakeError, case_from_bytes, case_from_link, check_case

TEXT = resources.files("assets").joinpath("demo_wind_post_actions.json").read_text(encoding="utf-8")


def test_upload_of_a_case_with_actions_is_refused():
    """An uploaded file with actions is refused with a message naming `strutscope solve`."""
    with pytest.raises(IntakeError, match=r"upload: a\.json: holds load cases \(actions\).*strutscope solve"):
        case_from_bytes(TEXT.encode("utf-8"), "upload: a.json")


def test_link_and_served_file_with_actions_are_refused():
    """A link holding actions and a served case file with actions are refused the same way."""
    with pytest.raises(IntakeError, match="holds load cases"):
        case_from_link(json.loads(TEXT), "link")
    with pytest.raises(IntakeError, match="holds load cases"):
        check_case(engine.Case.from_json(TEXT))


def test_a_plain_case_still_loads():
    """The plain demo is still read by the page's intake."""
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    assert case_from_bytes(text.encode("utf-8"), "upload").actions is None
