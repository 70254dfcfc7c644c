"""The routes of the member check on a two-plane case (issue 14): the second plane read exactly.

Sources are named beside each check; values recalled rather than read from a copy are marked "from memory".
"""

from __future__ import annotations

import dataclasses
import math

import pytest

import engine
from engine.capacity import capacity
from engine.member_routes import headline
from tests.engine.test_routes import SUBSETS, _case, _route


def _two_planes(second_loads, **kw):
    return _case(
        loads=[{"type": "uniform", "q": 8e3}],
        second_plane={"supports": {"left": "pinned", "right": "pinned"}, "loads": second_loads},
        **kw,
    )


def test_two_plane_case_reads_the_second_plane_exactly():
    """With a second plane the z plane's N_cr is its exact critical load (here pin-ended: π²EI_z/L², Euler)
    and M_z,Ed its first-order max|M| (a mid-span point load: FL/4); with no load in it, the routes equal the
    one-plane case's whose out-of-plane buckling length is the member length."""
    r = engine.solve(_two_planes([{"type": "point", "P": 2e3, "x": 2.5}]))
    en = _route(r, "en-member")
    assert en.facts["N_cr_z"] == pytest.approx(float(r.second_plane.critical_loads[0]), rel=1e-12)
    assert en.facts["N_cr_z_source"] == "exact"
    EI_z = r.material.E * r.second_plane.section.I
    assert en.facts["N_cr_z"] == pytest.approx(math.pi**2 * EI_z / 25.0, rel=1e-9)
    assert en.facts["M_z_Ed"] == pytest.approx(2e3 * 5.0 / 4, rel=1e-9)
    assert en.facts["C_mz"] == pytest.approx(0.90, abs=1e-9)  # Table B.3, concentrated load (from memory)
    aisc = _route(r, "aisc")
    assert aisc.facts["M_r_z"] > 2e3 * 5.0 / 4  # amplified by the axial force
    unloaded = engine.solve(_two_planes([]))
    one = engine.solve(_case(loads=[{"type": "uniform", "q": 8e3}]))
    for a, b in zip(unloaded.routes[1:], one.routes[1:], strict=True):
        assert a.utilization == pytest.approx(b.utilization, rel=1e-9)


@pytest.mark.parametrize("routes", SUBSETS)
def test_two_plane_capacity_reaches_headline_one(routes):
    """The capacity finder's N gives headline utilisation 1 (to 1e-6) on a two-plane case too."""
    case = _two_planes([{"type": "point", "P": 2e3, "x": 2.5}], check={"routes": routes})
    cap = capacity(case)
    r = engine.solve(dataclasses.replace(case, axial_force=cap.axial_force))
    assert r.utilization == pytest.approx(1.0, abs=1e-6)
    assert cap.route == headline(r.routes)[1]
