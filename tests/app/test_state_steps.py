"""The page state's steps by section: on a case with a catalogue section (and no EI of its own) a new step
takes the case's section, to be picked from the catalogue; the case solves with each segment's own section,
the link carries the rows, and switching the case to EI keeps the rows with the engine's message on them.

References: the engine itself (engine.solve of the same case file: the page adds no mechanics), and the
ordering of the segments' stiffness: HEB 160 has a smaller I_y than HEB 200 (EN 10365 tables, from memory),
so the member stepped down to it is softer than the uniform one: a lower critical load, a larger deflection
and a larger second-order utilisation. The default page case is invented.
"""

import json

import numpy as np
import pytest

import engine
from app.page.fields import page_message
from app.state import MemberState


def _max_deflection(result) -> float:
    return float(np.max(np.abs(result.deflection)))


def _second_order(result) -> float:
    (route,) = [r for r in result.routes if r.route == "second-order"]
    return route.utilization


def test_a_step_by_section_solves_with_the_weaker_segment_as_the_engine_does():
    state = MemberState()  # the demo: a catalogue section (HEB 200) and material, no EI of its own
    assert (state.stiffness_from, state.section_shape, state.section_name) == (
        "section",
        "catalogue",
        "HEB 200",
    )
    uniform = state.result
    state.add_item("steps")
    assert state.steps == [{"x": 0.5 * state.length, "section": {"name": "HEB 200"}}]
    state.set_item("steps", 0, section={"name": "HEB 160"})
    assert state.errors == {}
    stepped = state.result
    assert state.case_mapping()["steps"] == [{"x": 0.5 * state.length, "section": {"name": "HEB 160"}}]
    # the page's result is the engine's for the same case file
    alone = engine.solve(engine.Case.from_dict(state.case_mapping()))
    assert stepped.critical_loads[0] == pytest.approx(alone.critical_loads[0], rel=1e-12)
    assert _second_order(stepped) == pytest.approx(_second_order(alone), rel=1e-12)
    # the softer second half: lower N_cr, larger deflection and utilisation than the uniform HEB 200
    assert stepped.critical_loads[0] < uniform.critical_loads[0]
    assert _max_deflection(stepped) > _max_deflection(uniform)
    assert _second_order(stepped) > _second_order(uniform)
    # the equivalent-member routes are marked not applied to a stepped member (engine's reason)
    assert {r.route: r.reason for r in stepped.routes if r.route != "second-order"} == {
        "en-member": "stepped-section",
        "aisc": "stepped-section",
    }


def test_the_link_carries_a_step_by_section():
    state = MemberState()
    state.add_item("steps")
    state.set_item("steps", 0, x=4.0, section={"name": "HEB 180"})
    link = json.loads(state.link)
    assert link["steps"] == [{"x": 4.0, "section": {"name": "HEB 180"}}]
    other = MemberState()
    other.link = state.link
    assert other.steps == state.steps
    assert other.errors == {}
    assert other.result.critical_loads[0] == pytest.approx(state.result.critical_loads[0], rel=1e-12)
    again = MemberState()
    again.load_case(engine.Case.from_dict(state.case_mapping()))
    assert again.steps == state.steps


def test_switching_to_ei_keeps_the_rows_and_names_them():
    """The rows are not converted (a section has no EI of its own on the page, an EI no section): they stay
    as they are, the engine's message names them, the last good result stays; switching back solves."""
    state = MemberState()
    state.add_item("steps")
    state.set_item("steps", 0, section={"name": "HEB 160"})
    good = state.result
    state.stiffness_from = "EI"
    assert state.steps == [{"x": 0.5 * state.length, "section": {"name": "HEB 160"}}]
    assert state.result is good
    assert page_message(state.errors["steps[0].section"]).startswith(
        "Step 1, section: a step by section needs"
    )
    state.stiffness_from = "section"
    assert state.errors == {}
    # a new step on an EI case is a step in EI
    state.stiffness_from = "EI"
    state.remove_item("steps", 0)
    state.add_item("steps")
    assert set(state.steps[0]) == {"x", "EI"}
    assert not [path for path in state.errors if path.startswith("steps")]  # (the bow then needs a curve)


def test_the_editor_picks_a_steps_section_from_the_catalogue_list():
    from app.page.restraints import InsideView
    from engine.sections import catalogue_names

    state = MemberState()
    view = InsideView(state)
    assert view.buttons["steps"].label == "+ Step in section"
    state.add_item("steps")
    (row,) = view.rows["steps"]
    assert len(row.fields) == 1  # x only: no EI field, the section is picked
    select = row.choices["section"]
    assert list(select.options) == list(catalogue_names())  # the section picker's list
    assert select.value == "HEB 200"
    select.value = "HEB 160"
    assert state.steps[0]["section"] == {"name": "HEB 160"}
    assert state.errors == {}
    state.stiffness_from = "EI"  # the row stays, with the engine's message beside it
    assert view.buttons["steps"].label == "+ Step in EI"
    (row,) = view.rows["steps"]
    assert row.choices["section"].value == "HEB 160"
    assert any("Step 1, section" in text for text in view.errors.shown())


def test_the_sketch_and_the_words_name_the_steps_section():
    from app.report.restraints import inner_rows
    from app.sketch import sketch
    from app.units import units

    state = MemberState()
    state.add_item("steps")
    state.set_item("steps", 0, section={"name": "HEB 160"})
    assert "HEB 160" in repr(sketch(state.result, units("si")).shapes)
    assert any(
        "section HEB 160 from x = 3" in value for _, value in inner_rows(state.result.case, units("si"))
    )
