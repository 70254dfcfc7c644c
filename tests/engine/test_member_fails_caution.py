"""A member whose headline utilisation is above 1 always carries a danger caution.

An audit found an invented W10x49 column failing EN 1993-1-1 eq. (6.62) at 1.014 (the equivalent-member
route, the headline) with no caution at all: the ``overstressed`` caution speaks of the in-plane check only
(0.96 here), so the calc sheet and the figure read as a pass everywhere but in their routes block. The
danger caution ``member-fails`` now says so wherever no other danger caution does. Invented members.
"""

from __future__ import annotations

import pytest

import engine

_COLUMN = {
    "title": "Invented column",
    "length": 4.2672,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 1.9e6,
    "loads": [{"type": "uniform", "q": 6000.0}],
    "imperfection": {"preset": "en1993-table-5.1"},
    "section": {"name": "W10x49"},
    "axis": "major",
    "material": {"name": "ASTM A992"},
    "check": {"method": "elastic", "gamma_M0": 1.0, "gamma_M1": 1.0},
}


def test_a_route_above_1_gets_a_danger_caution():
    result = engine.solve(engine.Case.from_dict(_COLUMN))
    assert result.utilization > 1.0 and result.check.in_plane_utilization < 1.0
    codes = {c.code: c for c in result.cautions}
    caution = codes["member-fails"]
    assert caution.level == "danger" and caution.values["utilization"] == pytest.approx(result.utilization)
    assert caution.values["route"] == "en-member"


@pytest.mark.parametrize("force", [1.0e6, 1.9e6, 2.5e6])
def test_every_headline_above_1_has_a_danger_caution_and_none_below(force):
    result = engine.solve(engine.Case.from_dict(dict(_COLUMN, axial_force=force)))
    dangers = [c for c in result.cautions if c.level == "danger"]
    if result.utilization > 1.0:
        assert dangers
    else:
        assert "member-fails" not in {c.code for c in result.cautions}
