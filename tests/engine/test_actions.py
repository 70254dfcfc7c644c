"""Named load cases (actions) and combination settings in the case file: reading, writing and refusing.

The keys are the README's "Load cases and combinations"; every value here is invented.
"""

import copy
import json
from importlib import resources

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import engine
from engine.actions import Action, CombinationSettings


def demo():
    """The invented demo with a permanent and a wind action, as JSON data."""
    text = resources.files("assets").joinpath("demo_wind_post_actions.json").read_text(encoding="utf-8")
    return json.loads(text)


def test_demo_with_actions_reads_and_round_trips():
    """The demo's two actions and its settings are read, and to_dict/from_dict give the same case back."""
    case = engine.Case.from_dict(demo())
    assert [a.name for a in case.actions] == ["G", "W"]
    assert case.actions[1] == Action(
        name="W", category="wind", axial_force=-20e3, loads=(engine.UniformLoad(q=1.7e3),)
    )
    assert case.combinations == CombinationSettings()
    assert engine.Case.from_dict(case.to_dict()) == case
    assert engine.Case.from_json(case.to_json()) == case


def test_case_without_actions_is_written_as_before():
    """A case without actions writes neither key, so its file is exactly what it was."""
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    case = engine.Case.from_dict(json.loads(text))
    assert case.actions is None and case.combinations is None
    assert "actions" not in case.to_dict() and "combinations" not in case.to_dict()


BAD = [
    (("actions", 0, "category"), "crane", "actions[0].psi: required for the category 'crane'"),
    (("actions", 1, "loads", 0, "q"), "x", "actions[1].loads[0].q: 'x' is not a number"),
    (("actions", 0, "loads", 0, "x"), 7.5, "actions[0].loads[0].x: 7.5 m lies outside the member (0 to 6 m)"),
    (("actions", 1, "name"), "G", "actions[1].name: 'G' is given twice"),
    (("actions", 1, "name"), "w ind", "actions[1].name: 'w ind' is not a name"),
    (("actions", 1, "psi"), [0.6, 0.2], "actions[1].psi: [0.6, 0.2] is not a list of three numbers"),
    (("actions", 1, "psi"), [0.6, 1.2, 0], "actions[1].psi[1]: 1.2 must be >= 0 and <= 1"),
    (("actions", 0, "psi"), [0.6, 0.2, 0], "actions[0].psi: [0.6, 0.2, 0] is not allowed for a permanent"),
    (("actions", 0, "axial_force"), 2e12, "actions[0].axial_force: 2000000000000.0 N must be"),
    (("actions", 1, "asce"), "E", "actions[1].asce: 'E' is not an ASCE 7 load symbol"),
    (("combinations", "rule"), "en1990-6.11", "combinations.rule: 'en1990-6.11' is not a combination rule"),
    (("combinations", "service"), ["rare"], "combinations.service[0]: 'rare' is not a serviceability"),
    (("combinations", "service_bow"), "yes", "combinations.service_bow: 'yes' is not allowed"),
    (
        ("combinations", "table"),
        [{"name": "U1", "state": "ultimate", "factors": {"G": 1.5}}],
        "combinations.table[0].name: 'U1' is kept for the combinations strutscope makes",
    ),
    (
        ("combinations", "table"),
        [{"name": "X1", "state": "ultimate", "factors": {"Q": 1.5}}],
        "combinations.table[0].factors: 'Q' is not an action of this case",
    ),
    (
        ("combinations", "table"),
        [{"name": "X1", "state": "ultimate", "factors": {"G": 11}}],
        "combinations.table[0].factors.G: 11.0 must be >= -10 and <= 10",
    ),
    (
        ("combinations", "table"),
        [{"name": "X1", "state": "extreme", "factors": {"G": 1}}],
        "combinations.table[0].state: 'extreme' is not a limit state",
    ),
    (("combinations",), {"rule": "table"}, "combinations.table: the rule 'table' needs at least one row"),
    (("axial_force",), 1e3, "axial_force: 1000.0 N given beside actions"),
    (("loads",), [{"type": "uniform", "q": 1.0}], "loads: 1 loads given beside actions"),
    (("actions",), [], "actions: 0 actions given; 1 to 12 are allowed"),
]


@pytest.mark.parametrize(("path", "value", "message"), BAD, ids=[b[2][:40] for b in BAD])
def test_bad_actions_are_refused_naming_the_field(path, value, message):
    """Each bad value is refused with a message naming the field path, the value and what is allowed."""
    data = demo()
    target = data
    for key in path[:-1]:
        target = target[key]
    target[path[-1]] = value
    with pytest.raises(engine.CaseError) as caught:
        engine.Case.from_dict(data)
    assert str(caught.value).startswith(message), str(caught.value)


def test_combinations_without_actions_is_refused():
    """The combinations key alone (no actions) is refused, naming both keys."""
    data = demo()
    del data["actions"]
    with pytest.raises(engine.CaseError, match="combinations: given without actions"):
        engine.Case.from_dict(data)


def test_user_category_with_psi_and_asce_is_read():
    """A category of the user's own is accepted with its psi (and its ASCE symbol for the asce7-2.3 rule)."""
    data = copy.deepcopy(demo())
    data["actions"].append({"name": "C", "category": "crane", "psi": [0.8, 0.6, 0.3], "asce": "L"})
    data["combinations"] = {"rule": "asce7-2.3"}
    case = engine.Case.from_dict(data)
    assert case.actions[2].psi == (0.8, 0.6, 0.3) and case.actions[2].asce == "L"
    del data["actions"][2]["asce"]
    with pytest.raises(engine.CaseError, match=r"actions\[2\]\.asce: required with rule 'asce7-2.3'"):
        engine.Case.from_dict(data)


def test_too_many_combinations_and_a_category_without_asce_symbol_are_refused_with_the_case():
    """The combination count and the ASCE 7 symbols are checked when the case is read, not at its solve."""
    data = demo()
    data["actions"] = [{"name": f"G{i}", "category": "permanent"} for i in range(6)]
    data["actions"] += [{"name": f"W{i}", "category": "wind"} for i in range(6)]
    with pytest.raises(
        engine.CaseError, match="combinations: 12545 combinations made; a case may have at most 256"
    ):
        engine.Case.from_dict(data)
    data["actions"] = [{"name": "G", "category": "permanent"}, {"name": "T", "category": "temperature"}]
    data["combinations"] = {"rule": "asce7-2.3"}
    with pytest.raises(engine.CaseError, match=r"actions\[1\]\.category: 'temperature' has no load symbol"):
        engine.Case.from_dict(data)


JUNK = st.one_of(
    st.none(),
    st.booleans(),
    st.integers(-(10**6), 10**6),
    st.floats(allow_nan=True, allow_infinity=True),
    st.text(max_size=8),
    st.lists(st.integers(-2, 2), max_size=4),
    st.dictionaries(st.text(max_size=4), st.integers(), max_size=2),
)
FIELDS = ("name", "category", "axial_force", "loads", "psi", "exclusive", "asce", "colour")


@settings(max_examples=60, deadline=None)
@given(
    index=st.integers(0, 1),
    field=st.sampled_from(FIELDS),
    junk=JUNK,
    rule=st.sampled_from(["en1990-6.10", "en1990-6.10ab", "asce7-2.3", "table", 3, None]),
)
def test_fuzzed_actions_solve_or_are_refused_naming_a_field(index, field, junk, rule):
    """Any junk in an action or the rule is refused with a CaseError naming a field, or the case solves."""
    data = {
        "length": 4.0,
        "EI": 3e6,
        "supports": {"left": "pinned", "right": "pinned"},
        "actions": [
            {"name": "G", "category": "permanent", "axial_force": 1e5, "loads": []},
            {"name": "W", "category": "wind", "loads": [{"type": "uniform", "q": 1e3}]},
        ],
        "combinations": {"rule": rule, "table": [{"name": "T1", "state": "ultimate", "factors": {"G": 1.0}}]},
    }
    data["actions"][index][field] = junk
    try:
        case = engine.Case.from_dict(data)
    except engine.CaseError as error:
        head = str(error).split(":", 1)[0]
        assert head.startswith(("actions", "combinations")), str(error)
        return
    result = engine.solve(case)
    assert result.actions is not None and len(result.actions.combinations) >= 1
