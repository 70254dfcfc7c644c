"""Invented case files with load cases, built from the plain demos (shared by the engine and app tests)."""

import copy
import json
from importlib import resources

#: A user's table of one ultimate and one service row, each the one action A at factor 1.
FACTOR_ONE = {
    "rule": "table",
    "table": [
        {"name": "Ult", "state": "ultimate", "factors": {"A": 1.0}},
        {"name": "Srv", "state": "service", "factors": {"A": 1.0}},
    ],
}


def demo_data(name: str) -> dict:
    """An invented demo case file (assets/) as JSON data."""
    return json.loads(resources.files("assets").joinpath(name).read_text(encoding="utf-8"))


def as_one_action(plain: dict, combinations: dict | None = FACTOR_ONE) -> dict:
    """``plain`` with its loads and axial force moved into one permanent action A (in a two-plane case the
    second plane's loads too, under the action's ``second_plane``), with ``combinations`` (default: the
    factor-one table; None: no ``combinations`` key)."""
    data = copy.deepcopy(plain)
    action = {
        "name": "A",
        "category": "permanent",
        "axial_force": data.pop("axial_force"),
        "loads": data.pop("loads"),
    }
    if "second_plane" in data:
        action["second_plane"] = {"loads": data["second_plane"].pop("loads")}
    data["actions"] = [action]
    if combinations is not None:
        data["combinations"] = copy.deepcopy(combinations)
    return data
