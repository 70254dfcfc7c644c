"""Eqs. (6.61)/(6.62) of EN 1993-1-1 §6.3.3 without compression (N_Ed = 0 or a tension).

A beam in bending about both axes that can buckle laterally is checked by eqs. (6.61)/(6.62) taken at
N_Ed = 0 (common practice, no source: the equations hold at N_Ed → 0, and a tension is not counted as
relieving). With Annex B (Tables B.1/B.2, from memory) at N_Ed = 0 for a class 1 I section: k_zy = 1 and
k_zz = C_mz, so eq. (6.62) = M_y,Ed/M_b,Rd + C_mz·M_z,Ed/(M_z,Rk/γ_M1). Before, the route checked the
cross-section and M_y/M_b,Rd alone there, and the M_z term dropped out of the LTB check (an independent check
found a member at 1.111 read as 0.918). The members are invented.
"""

from __future__ import annotations

import pytest

import engine


def _case(N: float, routes: list, annex: str = "B", q_z: float = 2e3) -> engine.Case:
    return engine.Case.from_dict(
        {
            "schema": 1,
            "length": 6.0,
            "section": {"name": "IPE 300"},
            "material": {"name": "S235"},
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": N,
            "loads": [{"type": "uniform", "q": 13.5e3}],
            "imperfection": {"preset": "en1993-table-5.1"},
            "check": {"routes": routes, "annex": annex},
            "second_plane": {
                "supports": {"left": "pinned", "right": "pinned"},
                "loads": [{"type": "uniform", "q": q_z}],
            },
        }
    )


def _route(result, code):
    return next(r for r in result.routes if r.route == code)


def test_eq_6_62_at_no_axial_force_by_hand():
    """Annex B at N_Ed = 0: eq. (6.62) = M_y/M_b,Rd + C_mz·M_z/M_z,Rk (γ_M1 = 1), above M_y/M_b,Rd alone."""
    result = engine.solve(_case(0.0, ["second-order", "en-member"]))
    en = _route(result, "en-member")
    f = en.facts
    expected = f["M_y_Ed"] / f["M_b_Rd"] + f["C_mz"] * f["M_z_Ed"] / f["M_z_Rk"]
    assert en.terms["eq-6.62"] == pytest.approx(expected, rel=1e-12)
    assert f["k_zy"] == pytest.approx(1.0, abs=1e-12) and f["k_zz"] == pytest.approx(f["C_mz"], rel=1e-12)
    assert en.terms["eq-6.62"] > en.terms["lateral-torsional"]
    assert result.utilization == pytest.approx(expected, rel=1e-12)
    assert "en-member-no-compression" in en.notes


@pytest.mark.parametrize("annex", ["A", "B"])
@pytest.mark.parametrize("routes", [["second-order", "en-member"], ["second-order"]])
def test_no_compression_is_the_limit_of_a_small_compression(routes, annex):
    """The headline at N = 0 and at a tension of 50 kN equals the headline at N = 1 N to 1e-5 (continuous,
    and a tension does not relieve), whichever routes count."""
    at_limit = engine.solve(_case(1.0, routes, annex)).utilization
    for N in (0.0, -50e3):
        assert engine.solve(_case(N, routes, annex)).utilization == pytest.approx(at_limit, rel=1e-5)


def test_one_moment_and_no_ltb_keeps_the_cross_section_alone():
    """A member held against lateral-torsional buckling with one moment: nothing for eqs. (6.61)/(6.62) to
    add at N = 0 beyond the cross-section (unchanged)."""
    data = _case(0.0, ["second-order", "en-member"]).to_dict()
    data.pop("second_plane")
    data.setdefault("check", {})["ltb"] = {"restrained": True}
    data["out_of_plane"] = {"restrained": True}
    en = _route(engine.solve(engine.Case.from_dict(data)), "en-member")
    assert "eq-6.62" not in en.terms and "en-member-cross-section-only" in en.notes
