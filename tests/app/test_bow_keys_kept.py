"""A case file's imperfection keys that the page has no input for are kept, not dropped.

An independent audit loaded an invented fixed–free HEB 200 (6 m, 300 kN, 5 kN at the top) with the
EN 1993-1-1 Table 5.1 preset and ``columns: 4`` (m of eq. (5.5), which lowers the sway α_m): the command line
gave max|M| = 64.08 kN·m and the page 66.34 kN·m, and the page's link and case file lost the key.
Reference: the engine's own solve of the same file (the page does no mechanics).
"""

from __future__ import annotations

import engine
from app.state import MemberState

CASE = {
    "schema": 1,
    "title": "Invented: cantilever post, four columns in the row",
    "length": 6.0,
    "supports": {"left": "fixed", "right": "free"},
    "axial_force": 300e3,
    "loads": [{"type": "point", "P": 5e3, "x": 6.0}],
    "imperfection": {"preset": "en1993-table-5.1", "columns": 4},
    "section": {"name": "HEB 200"},
    "material": {"name": "S355"},
}


def test_a_presets_columns_reach_the_solve_and_the_case_file():
    state = MemberState()
    state.load_mapping(CASE)
    assert state.errors == {}
    assert state.case_mapping()["imperfection"]["columns"] == 4
    expected = engine.solve(engine.Case.from_dict(CASE)).governing.moment.magnitude
    assert state.result.governing.moment.magnitude == expected
    without = dict(CASE, imperfection={"preset": "en1993-table-5.1"})
    assert engine.solve(engine.Case.from_dict(without)).governing.moment.magnitude > 1.02 * expected


def test_the_kept_keys_follow_their_form_of_bow():
    """A preset's extra key is not written into a bow given by shape and amplitude, and comes back with the
    preset."""
    state = MemberState()
    state.load_mapping(CASE)
    state.bow_from = "shape"
    assert "columns" not in state.case_mapping()["imperfection"]
    state.bow_from = "preset"
    assert state.case_mapping()["imperfection"]["columns"] == 4
