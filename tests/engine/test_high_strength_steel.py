"""A steel stronger than EN 1993-1-1's grades is named in a caution.

EN 1993-1-1 covers steels up to S460 (§1.1(2), Table 3.1); EN 1993-1-12 extends its rules to S700 with
added requirements; above that no Eurocode for steel applies (all from memory). An audit found a custom
material of kind steel with f_y = 1500 MPa checked as a plain code check, without a word.
"""

from __future__ import annotations

import pytest

import engine


def _case(fy: float) -> engine.Case:
    return engine.Case.from_dict(
        {
            "schema": 1,
            "title": "Invented strut of a custom steel",
            "length": 4.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 200e3,
            "loads": [{"type": "uniform", "q": 2e3}],
            "imperfection": {"preset": "en1993-table-5.1"},
            "section": {"name": "HEB 200"},
            "material": {"kind": "steel", "E": 210e9, "fy": fy},
        }
    )


@pytest.mark.parametrize(
    ("fy", "level"),
    [
        (355e6, None),
        (460e6, None),
        (500e6, "warning"),
        (700e6, "warning"),
        (701e6, "danger"),
        (1500e6, "danger"),
    ],
)
def test_the_grade_beyond_en_1993_1_1_is_named(fy, level):
    r = engine.solve(_case(fy))
    found = [c for c in r.cautions if c.code == "high-strength-steel"]
    if level is None:
        assert not found
    else:
        assert [c.level for c in found] == [level]
        assert f"{fy / 1e6:.0f} MPa" in found[0].message
