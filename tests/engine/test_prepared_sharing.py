"""Members that differ in their title only share one prepared member (engine.prepared), and each result is
still its own case's: the same numbers as a solve in a fresh cache, and its own title."""

from __future__ import annotations

import dataclasses

import numpy as np

import engine
from engine import prepared


def _demo():
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "length": 6.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "section": {"name": "HEB 200"},
            "material": {"name": "S355"},
            "axial_force": 350e3,
            "loads": [{"type": "uniform", "q": 2.5e3}],
            "imperfection": {"preset": "en1993-table-5.1"},
            "title": "first member (invented)",
        }
    )
    return case


def test_a_renamed_member_shares_the_prepared_member_and_keeps_its_own_title():
    engine.clear_caches()
    first = _demo()
    second = dataclasses.replace(first, title="second member (invented)", axial_force=300e3)
    engine.solve(first)
    assert prepared.prepare(second) is prepared.prepare(first)
    shared = engine.solve(second)
    engine.clear_caches()
    alone = engine.solve(second)
    assert shared.case.title == "second member (invented)"
    assert shared.utilization == alone.utilization
    np.testing.assert_array_equal(shared.moment, alone.moment)
    np.testing.assert_array_equal(shared.deflection, alone.deflection)
    assert shared.governing == alone.governing and shared.routes == alone.routes
    assert engine.capacity(second) == engine.capacity(dataclasses.replace(second, title="x"))


def test_members_that_differ_in_anything_but_the_title_do_not_share():
    engine.clear_caches()
    first = _demo()
    longer = dataclasses.replace(first, length=6.5, title="other")
    assert prepared.prepare(longer) is not prepared.prepare(first)
