"""The page state's restraints, steps and foundation (engine issue 16): rows added, edited and removed as the
loads are, bad values named in the page's words with their value and range, the last good result kept, and
the link and a case file carrying them.

Reference: two equal spans under a uniform load q, no axial force: the middle support takes 1.25 q l (the
continuous-beam table of a structural engineering handbook, two equal spans, UDL; from memory). Invented
case.
"""

import json

import pytest

import engine
from app.page.fields import page_message
from app.state import MemberState, values_from_mapping

Q, SPAN = 2.5e3, 3.0  # [N/m], [m]: each of the two spans

TWO_SPANS = {
    "title": "Invented two-span beam",
    "length": 2 * SPAN,
    "EI": 4.2e6,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 0.0,
    "loads": [{"type": "uniform", "q": Q}],
    "imperfection": {"shape": "none", "amplitude": 0.0},
}


def _state(**extra) -> MemberState:
    return MemberState(**values_from_mapping({**TWO_SPANS, **extra}))


def test_an_added_brace_gives_the_handbook_middle_reaction():
    state = _state()
    assert state.result.reactions.intermediate == ()
    state.add_item("restraints")
    assert state.restraints == [{"x": SPAN, "translation": "fixed"}]
    assert state.errors == {}
    (inner,) = state.result.reactions.intermediate
    # 1.25 q l along -w (the brace pushes up against the load): handbook two-span table, from memory
    assert inner.force == pytest.approx(-1.25 * Q * SPAN, rel=1e-9)


def test_rows_are_edited_and_removed_and_the_case_follows():
    state = _state()
    state.add_item("restraints")
    state.set_item("restraints", 0, translation="spring")
    assert state.restraints[0]["translation"] == 1.0e6
    state.set_item("restraints", 0, translation=2.0e6, rotation="fixed", plane="both")
    assert state.restraints == [{"x": SPAN, "translation": 2.0e6, "rotation": "fixed"}]
    assert state.to_case().restraints[0].rotation == "fixed"
    state.set_item("restraints", 0, hinge=True)  # a hinge frees the rotation
    assert state.restraints == [{"x": SPAN, "translation": 2.0e6, "hinge": True}]
    state.add_item("foundation")
    assert state.foundation == [{"start": 0.0, "end": 2 * SPAN, "k": 1.0e7}]
    state.add_item("steps")
    assert state.steps == [{"x": SPAN, "EI": 2.1e6}]
    assert state.errors == {}
    assert len(state.to_case().steps) == 1
    state.remove_item("restraints", 0)
    state.remove_item("steps", 0)
    assert state.restraints == [] and state.steps == []
    assert "restraints" not in state.case_mapping() and "steps" not in state.case_mapping()
    assert state.case_mapping()["foundation"] == [{"start": 0.0, "end": 2 * SPAN, "k": 1.0e7}]


def test_a_bad_value_is_named_with_its_range_and_the_last_result_is_kept():
    state = _state()
    state.add_item("restraints")
    good = state.result
    state.set_item("restraints", 0, x=9.0)
    assert state.result is good  # the last good result stays (shown as stale)
    assert state.restraints[0]["x"] == 9.0  # the input is kept as typed
    (message,) = state.errors.values()
    assert page_message(message).startswith("Restraint 1, at x: 9.0 m lies outside")
    assert "0 to 6 m" in message
    state.set_item("restraints", 0, x=None)  # an emptied field is named, not dropped
    assert page_message(state.errors["restraints[0].x"]).startswith("Restraint 1, at x: None is not a number")
    state.set_item("restraints", 0, x=2.0)
    assert state.errors == {}
    state.add_item("foundation")
    state.set_item("foundation", 0, k=-1.0)
    (message,) = state.errors.values()
    assert page_message(message).startswith("Foundation 1, modulus k: -1.0 N/m²")
    assert "> 0" in message


def test_the_first_row_takes_the_route_the_engine_allows():
    """The engine refuses the equivalent-member routes on a foundation and the eq. (5.9) bow with steps
    (DEVELOPERS.md, its conservative refusals): the page's first foundation range switches to the
    second-order route at once, its first step an eq. (5.9) bow to Table 5.1; a restraint keeps the routes
    (each segment between braced points is checked as an equivalent member)."""
    state = MemberState()  # the demo: the default routes count the equivalent member too
    routes = list(state.routes)
    assert routes != ["second-order"]
    state.add_item("restraints")
    assert state.errors == {}
    assert list(state.routes) == routes
    assert len(state.result.reactions.intermediate) == 1
    assert {r.route for r in state.result.routes if r.utilization is not None} >= {"en-member"}
    state.add_item("foundation")
    assert state.errors == {}
    assert list(state.routes) == ["second-order"]


def test_the_link_and_a_case_file_carry_every_row():
    state = _state(
        restraints=[{"x": 2.0, "translation": "fixed"}, {"x": 4.0, "translation": 5.0e5, "rotation": 1.0e5}],
        steps=[{"x": 1.5, "EI": 3.0e6}],
        foundation=[{"start": 4.5, "end": 6.0, "k": 2.0e6}],
    )
    assert state.errors == {}
    link = json.loads(state.link)
    assert link["restraints"][1] == {"x": 4.0, "translation": 5.0e5, "rotation": 1.0e5}
    other = MemberState()
    other.link = state.link
    assert (other.restraints, other.steps, other.foundation) == (
        state.restraints,
        state.steps,
        state.foundation,
    )
    assert other.result.reactions.intermediate == state.result.reactions.intermediate
    # the case file (download, upload) is the same mapping: engine.Case round-trips it
    case = engine.Case.from_dict(state.case_mapping())
    again = MemberState()
    again.load_case(case)
    assert (again.restraints, again.steps, again.foundation) == (
        state.restraints,
        state.steps,
        state.foundation,
    )
    assert again.to_case() == case


def test_a_link_with_a_bad_row_restores_it_with_the_message():
    state = _state()
    state.add_item("restraints")
    state.set_item("restraints", 0, x=7.5)
    other = MemberState()
    other.link = state.link_now()
    assert other.restraints == [{"x": 7.5, "translation": "fixed"}]
    assert "restraints[0].x" in other.errors


def test_a_file_whose_list_is_not_a_list_is_refused_by_type():
    with pytest.raises(TypeError, match="restraints"):
        values_from_mapping({**TWO_SPANS, "restraints": {"x": 1.0}})


def test_a_message_in_us_units_gives_the_value_and_both_ends_of_the_range_in_feet():
    """The engine writes SI; a US page shows the value and the range in feet (1 ft = 0.3048 m exactly, NIST
    SP 811), and a range's lower end is converted too, never left in metres beside a bound in feet."""
    from app.page.fields import shown_message

    state = _state()
    state.add_item("restraints")
    state.set_item("restraints", 0, x=9.0)
    (message,) = state.errors.values()
    said = shown_message(message, "us")
    assert said.startswith("Restraint 1, at x: 29.53 ft lies outside")
    assert "(0 ft to 19.69 ft" in said and " m" not in said.replace(" member", "")
    assert shown_message("length: 0.0001 m must be >= 0.001 and <= 1000 m", "us").endswith(
        ">= 0.003 ft and <= 3281 ft"
    )
    assert shown_message(message, "si") == page_message(message)  # SI: the engine's own words


def test_a_twist_held_inside_raises_m_cr_and_the_link_carries_it():
    """The demo (HEB 200 in S355, pinned, 6 m: the lateral-torsional buckling check applies) with a restraint
    holding the twist at mid-length and nothing else: the exact M_cr rises; a torsional spring lies between
    none and held (a spring adds strain energy ½ k_φ φ² ≥ 0 and holding it is the limit k_φ → ∞, so M_cr
    cannot fall: the Rayleigh quotient; common practice, no source). The link and the case file carry it."""
    state = MemberState()  # the demo
    free = state.result.ltb.M_cr
    assert state.result.ltb.applies
    state.add_item("restraints")
    state.set_item("restraints", 0, translation="free", twist="fixed")
    assert state.errors == {}
    assert state.restraints == [{"x": 3.0, "translation": "free", "twist": "fixed"}]
    held = state.result.ltb.M_cr
    assert held > 1.5 * free
    state.set_item("restraints", 0, twist="spring")  # the default spring, to be edited
    assert state.restraints[0]["twist"] == 1.0e6
    spring = state.result.ltb.M_cr
    assert free < spring < held
    state.set_item("restraints", 0, twist=2.0e5)
    assert state.to_case().restraints[0].twist == 2.0e5
    link = json.loads(state.link)
    assert link["restraints"] == [{"x": 3.0, "translation": "free", "twist": 2.0e5}]
    other = MemberState()
    other.link = state.link
    assert other.restraints == state.restraints
    assert other.result.ltb.M_cr == pytest.approx(state.result.ltb.M_cr, rel=1e-12)
    again = MemberState()
    again.load_case(engine.Case.from_dict(state.case_mapping()))
    assert again.to_case().restraints == state.to_case().restraints
    state.set_item("restraints", 0, translation="fixed", twist="free")  # "free" is the default: left out
    assert state.restraints == [{"x": 3.0, "translation": "fixed"}]


def test_the_editor_offers_the_twist_with_its_spring_in_the_display_unit():
    """The row's twist select (free, fixed, spring) writes the state; a spring shows k_φ in kN·m/rad or
    kip·ft/rad (1 kip·ft = 1355.8179483314 N·m: 1 kip = 4448.2216152605 N, 1 ft = 0.3048 m, NIST SP 811
    (2008) Appendix B; from memory)."""
    from app.page.restraints import InsideView

    state = MemberState()
    view = InsideView(state)
    state.add_item("restraints")
    (row,) = view.rows["restraints"]
    row.choices["twist"].value = "fixed"
    assert state.restraints[0]["twist"] == "fixed"
    (row,) = view.rows["restraints"]  # rebuilt: the twist changed kind
    row.choices["twist"].value = "spring"
    (row,) = view.rows["restraints"]
    (k_phi,) = [f for f in row.fields if f.widget.name.startswith("k_φ")]
    assert "kN·m/rad" in k_phi.widget.name and k_phi.widget.value == pytest.approx(1.0e3)
    state.units = "us"
    (row,) = view.rows["restraints"]
    (k_phi,) = [f for f in row.fields if f.widget.name.startswith("k_φ")]
    assert "kip·ft/rad" in k_phi.widget.name
    assert k_phi.widget.value == pytest.approx(1.0e6 / 1355.8179483314, rel=1e-3)
    row.choices["twist"].value = "free"
    assert "twist" not in state.restraints[0]
