"""The page state: inputs to engine case, bad input, the link and the outputs that do not follow the drag."""

import json
import math
from importlib import resources

import pytest

import engine
from app.state import MemberState, chart_forces, values_from_mapping


def demo_case():
    """The invented demo case shipped in assets/."""
    return engine.Case.from_json(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))


# Invented cases covering every input the page has: springs, each section form, custom material, every load
# type, bow shapes and presets, check settings.
CASES = [
    {
        "length": 4.0,
        "EI": 2.0e6,
        "supports": {"left": "fixed", "right": "free"},
        "axial_force": 150e3,
        "loads": [{"type": "point", "P": 3e3, "x": 4.0}],
        "imperfection": {"shape": "sway", "amplitude": 0.01},
        "title": "Invented cantilever",
    },
    {
        "length": 5.0,
        "EI": 3.0e6,
        "supports": {
            "left": {"translation": "fixed", "rotation": 2.5e6},
            "right": {"translation": 8.0e6, "rotation": "free"},
        },
        "axial_force": -40e3,
        "loads": [
            {"type": "linear", "q_start": 0.0, "q_end": 4e3, "start": 0.5, "end": 4.5},
            {"type": "couple", "C": -6e3, "x": 5.0},
            {"type": "uniform", "q": 1e3, "start": 1.0},
        ],
        "imperfection": {"shape": "parabola", "amplitude": -0.005},
    },
    {
        "length": 3.5,
        "supports": {"left": "pinned", "right": "guided"},
        "axial_force": 90e3,
        "section": {"shape": "rhs", "h": 0.2, "b": 0.1, "t": 0.008, "manufacture": "cold-formed"},
        "axis": "minor",
        "material": {"name": "S275"},
        "stiffness_factor": 0.8,
        "imperfection": {
            "preset": "span",
            "ratio": 400.0,
            "shape": "sine",
            "amplitude": 0.0,
            "curve": "auto",
            "analysis": "elastic",
            "direction": "negative",
        },
        "check": {"method": "plastic", "gamma_M0": 1.05, "gamma_M1": 1.1, "deflection_limit": 300},
    },
    {
        "length": 3.0,
        "EI": 1.5e6,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 60e3,
        "section": {"shape": "custom", "A": 5e-3, "I": 4e-5, "W_el": 3.8e-4, "W_pl": 4.2e-4},
        "material": {"E": 70e9, "fy": 250e6, "name": "invented alloy", "density": 2700.0},
        "imperfection": {
            "preset": "en1993-eq-5.9",
            "shape": "mode",
            "amplitude": 0.0,
            "curve": "b",
            "analysis": "elastic",
            "direction": "load",
        },
    },
    {
        "length": 2.8,
        "supports": {"left": "fixed", "right": "pinned"},
        "axial_force": 20e3,
        "section": {"shape": "chs", "D": 0.1143, "t": 0.005},
        "material": {"name": "S355"},
        "loads": [{"type": "point", "P": -2e3, "x": 1.1}],
    },
]


def test_default_inputs_are_the_demo_case():
    """A new state holds exactly the invented demo case (assets/demo_wind_post.json)."""
    assert MemberState().to_case() == demo_case()


@pytest.mark.parametrize("mapping", CASES, ids=range(len(CASES)))
def test_loaded_case_round_trips_through_the_inputs(mapping):
    """A case put into the state comes back out unchanged, so an upload or a link restores the whole page."""
    case = engine.Case.from_dict(mapping)
    state = MemberState.from_case(case)
    assert state.errors == {}
    assert state.to_case() == case
    assert state.result.case == case


def test_bad_input_keeps_the_last_result_and_names_the_field():
    """A negative length leaves the last good result and records the engine's message under 'length'."""
    state = MemberState()
    good = state.result
    state.length = -1.0
    assert state.result is good
    assert list(state.errors) == ["length"]
    assert state.errors["length"].startswith("length: -1.0 m")
    assert state.length == -1.0  # the input is kept as typed
    state.length = 6.0
    assert state.errors == {} and state.result is not good


def test_load_beyond_the_member_is_reported_on_its_row():
    """A point load at 7.5 m on a 6 m member gives the engine's message under loads[1].x."""
    state = MemberState()
    state.set_load(1, x=7.5)
    assert state.error_for("loads[1]") == "loads[1].x: 7.5 m lies outside the member (0 to 6 m)"
    assert state.error_for("loads[0]") == ""
    assert state.result.case.loads[1].x == 2.2


def test_error_raised_while_solving_is_reported():
    """The eq. (5.9) bow without a section is refused by the engine's solve and shown under imperfection."""
    state = MemberState(stiffness_from="EI", bow_preset="en1993-eq-5.9", bow_shape="mode")
    assert state.error_for("imperfection").startswith("imperfection.preset: 'en1993-eq-5.9' needs a section")


def test_emptied_number_field_is_the_engines_error():
    """An emptied number (None) reaches the engine, which names the field."""
    state = MemberState()
    state.param.update(stiffness_from="EI", bow_from="shape")
    assert state.errors == {}
    state.EI = None
    assert state.error_for("EI").startswith("EI: required key is missing")


def test_dragging_the_axial_force_leaves_the_chart_and_the_link_alone():
    """Changing only N re-solves but keeps the sweep, the approximation, the capacity and the link."""
    state = MemberState()
    sweep, capacity, link, approximation = state.sweep, state.capacity, state.link, state.approximation
    for force in (400e3, 900e3, 2.0e6):
        state.axial_force = force
        assert state.result.axial_force == force
    assert state.sweep is sweep and state.capacity is capacity and state.approximation is approximation
    assert state.link == link
    state.settle()
    assert json.loads(state.link)["axial_force"] == 2.0e6


def test_changing_the_case_renews_the_chart_and_the_link():
    """A new length recomputes the sweep and the capacity and writes the link at once."""
    state = MemberState()
    sweep = state.sweep
    state.length = 7.0
    assert state.sweep is not sweep
    assert json.loads(state.link)["length"] == 7.0


def test_link_restores_the_inputs_in_another_state():
    """A state given another state's link holds the same case."""
    first = MemberState(left_end="fixed", length=4.5, axial_force=120e3)
    first.add_load("couple")
    second = MemberState()
    second.link = first.link
    assert second.to_case() == first.to_case()


def test_link_decoded_by_the_url_sync_is_read_too():
    """Panel's URL sync hands the query's JSON over decoded, as a mapping: the state reads it as the case."""
    first = MemberState(length=7.5)
    second = MemberState()
    second.link = json.loads(first.link)
    assert second.to_case() == first.to_case()
    assert isinstance(second.link, str)


def test_link_with_invalid_inputs_restores_them_with_the_message():
    """A link made while an input was invalid brings that input back, with the engine's message again."""
    first = MemberState()
    first.set_load(0, start=9.0)
    second = MemberState()
    second.link = first.link
    assert second.loads[0]["start"] == 9.0
    assert second.error_for("loads[0]").startswith("loads[0].start: 9.0 m lies outside the member")


def test_link_that_is_not_a_case_is_an_error_not_a_crash():
    """A link that is not JSON gives a message under 'case' and keeps the inputs."""
    state = MemberState()
    before = state.to_case()
    state.link = "{not json"
    assert state.error_for("case").startswith("case: the link")
    assert state.to_case() == before


def test_named_and_elastic_supports_map_to_engine_supports():
    """Named ends map to their names; an elastic end to its springs (k_t [N/m], k_r [N·m/rad])."""
    state = MemberState(
        left_end="fixed",
        right_end="elastic",
        right_translation="spring",
        right_k_t=5e6,
        right_rotation="free",
    )
    case = state.to_case()
    assert case.left == engine.EndSupport.named("fixed")
    assert case.right == engine.EndSupport(translation=5e6, rotation="free")


def test_changing_a_rows_type_keeps_magnitude_and_position():
    """A point load turned into a couple keeps its number and its x."""
    state = MemberState()
    state.set_load(1, type="couple")
    assert state.loads[1] == {"type": "couple", "C": 4.0e3, "x": 2.2}
    state.set_load(0, start=1.0)
    state.set_load(0, start=None)
    assert state.loads[0] == {"type": "uniform", "q": 2.5e3}


def test_rows_are_added_and_removed():
    """add_load appends a row of the engine's type with defaults; remove_load drops that row."""
    state = MemberState()
    for kind in ("uniform", "linear", "point", "couple"):
        state.add_load(kind)
    assert [load["type"] for load in state.loads] == [
        "uniform",
        "point",
        "uniform",
        "linear",
        "point",
        "couple",
    ]
    assert state.errors == {}
    state.remove_load(0)
    assert [load["type"] for load in state.loads] == ["point", "uniform", "linear", "point", "couple"]


def test_first_mode_preset_picks_the_mode_shape():
    """Choosing the eq. (5.9) preset switches a sine bow to the first-mode shape it requires."""
    state = MemberState()
    state.bow_preset = "en1993-eq-5.9"
    assert state.bow_shape == "mode"
    assert state.errors == {}
    assert state.result.bow.shape == "mode"


def test_approximation_curve_is_the_textbook_formula():
    """The chart's dashed curve is 1/(1 − N/Pcr1) (Timoshenko & Gere 1961, ch. 1) at every sampled force."""
    state = MemberState()
    forces, values = state.approximation
    pcr1 = state.result.critical_loads[0]
    assert forces.min() <= -2 * pcr1 * (1 - 1e-12) and (forces < pcr1).sum() > 20
    for force, value in zip(forces, values, strict=True):
        if force < pcr1:
            assert value == pytest.approx(1.0 / (1.0 - force / pcr1), rel=1e-12)
        else:  # the approximation means nothing beyond the first critical load: a gap in the curve
            assert math.isnan(value)


def test_chart_forces_cover_tension_to_past_the_third_critical_load():
    """The sweep runs from 2·Pcr1 in tension to beyond Pcr3, clustered on both sides of each Pcr."""
    pcr = [1.0e6, 4.0e6, 9.0e6]
    forces = chart_forces(pcr)
    assert forces[0] == pytest.approx(-2.0e6) and forces[-1] > 9.0e6
    assert all(force not in pcr for force in forces)
    for load in pcr:
        assert min(abs(forces - load)) < 1e-3 * load


def test_sweep_matches_the_current_solution():
    """The sweep's moment amplification at the current N agrees with the solve (same engine, two routes)."""
    state = MemberState()
    single = engine.sweep(state.result.case, [state.axial_force])
    assert single.moment_amplification[0] == pytest.approx(state.result.amplification.moment, rel=1e-9)


def test_capacity_needs_a_section():
    """With EI only there is no member check, so no capacity and a note saying why."""
    state = MemberState()
    assert state.capacity is not None and state.capacity.axial_force > 0
    state.param.update(stiffness_from="EI", bow_curve="b")  # without a section the curve must be given
    assert state.errors == {}
    assert state.capacity is None
    assert "section" in state.capacity_note


def test_mapping_keys_without_an_input_are_kept():
    """Section and material keys the page has no input for ride along and are written back."""
    values = values_from_mapping(
        {
            "length": 3.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "section": {"shape": "welded_i", "h": 0.3, "b": 0.15, "tw": 0.006, "tf": 0.01, "a": 0.004},
            "material": {"name": "S355"},
        }
    )
    assert values["section_extra"] == {"a": 0.004}
    state = MemberState(**values)
    assert state.case_mapping()["section"]["a"] == 0.004
    assert state.errors == {}


def test_critical_load_gives_an_unbounded_result_not_an_error():
    """N exactly at Pcr1 is solved (status critical, +inf values; README 'At a critical load')."""
    state = MemberState()
    state.axial_force = float(state.result.critical_loads[0])
    assert state.errors == {}
    assert state.result.status == "critical"
    assert math.isinf(state.result.governing.moment.value)
