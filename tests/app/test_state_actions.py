"""The page's state with load cases (issue 17): reading, editing, the slider's load factor, the link, the
combination shown and bad input named.

Expected values are the engine's own (the app does no mechanics); the factors of the demo's combinations are
EN 1990 Table A1.2(B) recommended values (from memory), as `engine.combinations` makes them.
"""

import json
from importlib import resources

import pytest

from app.state import MemberState
from app.state_actions import (
    ENVELOPE,
    actions_mapping,
    chosen_item,
    default_action,
    scale_sentence,
    scaled_action,
    shown_result,
)

TEXT = resources.files("assets").joinpath("demo_wind_post_actions.json").read_text(encoding="utf-8")


@pytest.fixture(scope="module")
def mapping():
    return json.loads(TEXT)


@pytest.fixture
def state(mapping):
    s = MemberState()
    s.load_mapping(mapping)
    assert s.errors == {}
    return s


def test_a_case_with_actions_is_solved_with_every_combination(state):
    """The demo's two load cases give ultimate and service combinations; the headline is the governing one."""
    actions = state.result.actions
    assert actions is not None
    assert [a["name"] for a in state.actions] == ["G", "W"]
    states = {item.combination.state for item in actions.combinations}
    assert states == {"ultimate", "service"}
    assert actions.governing_for("strength").combination == actions.headline
    assert actions.governing_for("deflection").state == "service"
    # The slider shows the headline combination's axial force (1.35 x 240 kN with wind favourable, absent).
    assert state.axial_force == pytest.approx(float(state.result.axial_force))


def test_the_link_and_the_saved_mapping_round_trip(state, mapping):
    """The settled link holds the actions and the rule; loading it back gives the same case and result."""
    link = json.loads(state.link)
    assert link["actions"] == mapping["actions"]
    assert link["combinations"]["rule"] == "en1990-6.10"
    assert link["loads"] == [] and link["axial_force"] == 0.0
    other = MemberState()
    other.load_mapping(link)
    assert other.case_mapping() == state.case_mapping()
    assert other.result.actions.headline == state.result.actions.headline
    assert float(other.result.utilization) == float(state.result.utilization)


def test_the_slider_scales_the_shown_combinations_axial_force_only(state):
    """Mode 'axial': N of the shown combination goes where the slider puts it; the loads stay as combined."""
    state.show_combination("U3")
    n0 = float(chosen_item(state.result, "U3").result.axial_force)
    assert state.axial_force == n0
    loads_before = chosen_item(state.result, "U3").case.loads
    state.axial_force = 1.5 * n0
    assert state.errors == {}
    item = chosen_item(state.result, "U3")
    assert float(item.result.axial_force) == pytest.approx(1.5 * n0, rel=1e-12)
    assert item.case.loads == loads_before
    assert state.action_scale == pytest.approx(1.5)
    assert (
        "N of combination U3 by one factor λ = 1.5 on every load case's axial force alone"
        in scale_sentence(state)
    )
    # The link changes only when the force settles, and then carries the scaled actions.
    assert json.loads(state.link)["actions"][0]["axial_force"] == 240e3
    state.settle()
    assert json.loads(state.link)["actions"][0]["axial_force"] == pytest.approx(360e3)


def test_a_typed_force_stays_in_the_box_and_typing_back_restores_the_design_case(state):
    """With the governing combination shown, a typed N near the critical load used to switch the governing
    combination under it, so the box showed another combination's N (3279.4 kN typed read 3614.03, found by a
    new user) and typing the design force back gave another case. The combination governing when N is typed
    is named, so the box keeps the number and typing back restores the design values."""
    headline = state.result.actions.headline
    design_n, design_u = state.axial_force, float(state.result.utilization)
    pcr = float(state.result.critical_loads[0])
    for typed in (pcr, 0.9 * pcr, 3000e3):
        state.axial_force = typed
        state.settle()
        assert state.combination_choice == headline
        assert float(shown_result(state).axial_force) == pytest.approx(typed, rel=1e-12)
        assert state.axial_force == pytest.approx(typed, rel=1e-12)
    state.axial_force = design_n
    state.settle()
    assert float(shown_result(state).axial_force) == pytest.approx(design_n, rel=1e-12)
    assert state.action_scale == pytest.approx(1.0, rel=1e-12)
    assert float(shown_result(state).utilization) == pytest.approx(design_u, rel=1e-12)
    assert state.result.actions.headline == headline


def test_a_load_case_value_too_large_once_factored_is_named_as_typed(state):
    """−1e12 N on G's point load lies inside a load's range (|P| <= 1e12 N) but not once U1 takes it at 1.35:
    the error names the load case's field and the value typed, and the largest it may be (a new user was told
    of "P: −1.350e+09 kN", the factored value under the engine's name)."""
    from app.page.messages import page_message

    actions = [dict(a) for a in state.actions]
    actions[0]["loads"] = [dict(actions[0]["loads"][0], P=-1e12)]
    state.actions = actions
    message = state.errors["actions[0].loads[0].P"]
    assert message.startswith("actions[0].loads[0].P: -1000000000000.0 N must be between -7.407e+11 N")
    assert "combination U1 multiplies it by 1.35" in message
    assert page_message(message).startswith("Load case 1, load 1, force F: -1000000000000.0 N")


def test_the_slider_scales_the_whole_combination_by_one_load_factor(state):
    """Mode 'factor': loads and axial forces of every action times one λ."""
    state.scale_mode = "factor"
    state.show_combination("U1")
    n0 = state.axial_force
    m0 = float(chosen_item(state.result, "U1").result.first_order.governing.moment.magnitude)
    state.axial_force = 0.5 * n0
    item = chosen_item(state.result, "U1")
    assert float(item.result.axial_force) == pytest.approx(0.5 * n0, rel=1e-12)
    # First-order moments are linear in the loads: halved with them (statics, no source needed beyond it).
    assert float(item.result.first_order.governing.moment.magnitude) == pytest.approx(0.5 * m0, rel=1e-9)
    assert "N of combination U1 by one load factor" in scale_sentence(state)


def test_a_combination_without_axial_force_refuses_the_slider_naming_why(state):
    """A combination with N = 0 cannot be scaled by N: the message names the field and keeps the result."""
    state.set_action(0, axial_force=0.0)
    state.set_action(1, axial_force=0.0)
    before = state.result
    state.axial_force = 100e3
    assert "axial_force" in state.errors
    assert "no axial force" in state.errors["axial_force"]
    assert state.result is before


def test_bad_load_case_input_is_named_and_the_last_result_kept(state):
    """A load beyond the member is the engine's message naming actions[0].loads[0].x; the result stays."""
    before = state.result
    state.set_action_load(0, 0, x=7.5)
    (path, message), *_ = state.errors.items()
    assert path == "actions[0].loads[0].x"
    assert "7.5" in message and "0 to 6" in message
    assert state.result is before
    state.set_action_load(0, 0, x=2.2)
    assert state.errors == {}


def test_adding_and_removing_load_cases(state):
    """A new load case gets a free name; removing every one makes the case plain again."""
    state.add_action()
    assert state.actions[-1]["name"] == "Q1" and state.errors == {}
    assert "Q1" in state.result.actions.names
    state.remove_action(2)
    state.remove_action(1)
    state.remove_action(0)
    assert state.actions == []
    assert state.result.actions is None  # a plain case (its own loads are empty)


def test_the_shown_result_follows_the_choice(state):
    """'' and 'envelope' show the headline; a name shows that combination; an unknown name the headline."""
    assert shown_result(state) is state.result
    state.show_combination(ENVELOPE)
    assert shown_result(state) is state.result
    state.show_combination("S1")
    assert shown_result(state) is state.result.actions.of("S1").result
    state.show_combination("nope")
    assert shown_result(state) is state.result


def test_pure_helpers():
    """Names are unique, the factor multiplies magnitudes only, and a plain case writes no action keys."""
    assert default_action([{"name": "Q1"}])["name"] == "Q2"
    action = {"name": "W", "axial_force": 10.0, "loads": [{"type": "point", "P": 2.0, "x": 1.0}]}
    assert scaled_action(action, 2.0, "axial") == {**action, "axial_force": 20.0}
    assert scaled_action(action, 2.0, "factor")["loads"] == [{"type": "point", "P": 4.0, "x": 1.0}]
    both = {**action, "second_plane": {"loads": [{"type": "uniform", "q": 3.0}]}}  # a two-plane case's action
    assert scaled_action(both, 2.0, "axial")["second_plane"] == both["second_plane"]
    assert scaled_action(both, 2.0, "factor")["second_plane"] == {"loads": [{"type": "uniform", "q": 6.0}]}
    assert actions_mapping(MemberState()) == {}


def test_slider_steps_do_not_compound_while_a_solve_is_running(mapping):
    """Served, results lag the slider: λ comes from the result's own λ, so two quick steps land exactly."""

    class Later:
        """A runner that keeps the jobs until asked (as the served page's runner runs them later)."""

        def __init__(self):
            self.jobs = []

        def solve(self, job, full):
            self.jobs.append((job, full))

        def chart(self, job):
            pass

        def routes(self, job):
            pass

        def run(self):
            jobs, self.jobs = self.jobs, []
            for job, full in jobs:
                job(full)()

    runner = Later()
    s = MemberState(runner=runner, solve_first=True)
    s.load_mapping(mapping)
    runner.run()
    n0 = s.axial_force
    s.axial_force = 1.2 * n0  # no result yet for this step
    s.axial_force = 1.5 * n0
    assert s.action_scale == pytest.approx(1.5)
    runner.run()
    assert float(s.result.axial_force) == pytest.approx(1.5 * n0)


def test_a_slider_past_zero_is_refused_rather_than_reverse_the_load_cases(state):
    """N of the opposite sign would need λ < 0 (every load case reversed): refused, naming the field."""
    state.show_combination("U1")  # 1.35 G, in compression
    before = state.result
    state.axial_force = -100e3
    assert "axial_force" in state.errors
    assert "λ > 0 only" in state.errors["axial_force"]
    assert state.result is before and state.action_scale == 1.0
    state.axial_force = 200e3  # back on the right side: accepted
    assert state.errors == {}
    assert float(chosen_item(state.result, "U1").result.axial_force) == pytest.approx(200e3)


def test_another_combinations_cautions_name_it(mapping):
    """Near the critical load several combinations raise the same kinds of danger with different numbers
    (1.1 and 1 times the critical load, found by a new user side by side): each one copied from another
    combination than the one shown names it, in the engine's message and in the page's wording."""
    import engine
    from app.report.words import caution_text

    data = json.loads(json.dumps(mapping))
    data["actions"][0]["axial_force"] = 2450e3  # U1 past its critical load, U2 near it
    result = engine.solve(engine.Case.from_dict(data))
    copied = [c for c in result.cautions if c.values.get("combination")]
    assert copied
    for caution in copied:
        name = caution.values["combination"]
        assert name != result.actions.headline
        assert caution.message.endswith(f"(combination {name})")
        assert caution_text(caution).endswith(f"(combination {name})")
