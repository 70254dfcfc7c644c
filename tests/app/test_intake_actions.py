"""The page reads a case with load cases (actions) as any other: upload, link and served file (issue 17;
before, such a case was refused whole)."""

import json
from importlib import resources

import engine
from app.intake import case_from_bytes, case_from_link, check_case

TEXT = resources.files("assets").joinpath("demo_wind_post_actions.json").read_text(encoding="utf-8")


def test_upload_link_and_served_file_with_actions_are_read():
    """An uploaded file, a link and a served case with actions all come through with their load cases."""
    case = case_from_bytes(TEXT.encode("utf-8"), "upload: a.json")
    assert [action.name for action in case.actions] == ["G", "W"]
    assert [action["name"] for action in case_from_link(json.loads(TEXT), "link")["actions"]] == ["G", "W"]
    check_case(engine.Case.from_json(TEXT))  # raises nothing


def test_a_plain_case_still_loads():
    """The plain demo is still read by the page's intake."""
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    assert case_from_bytes(text.encode("utf-8"), "upload").actions is None
