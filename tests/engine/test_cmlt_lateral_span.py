"""C_mLT of EN 1993-1-1 Annex B Table B.2 read between the points braced laterally (Table B.3's heading, from
memory: C_my from M_y between the points braced in z, C_mLT from M_y between the points braced laterally).

A member on an in-plane support at mid-length but free laterally over its whole span was checked with the
half span's C_my as its C_mLT (an independent check found eq. (6.62) 8.8 % low and the capacity 6 % high).
Table B.2's k_zy = 1 − 0.1·λ̄_z·n_z/(C_mLT − 0.25), not below 1 − 0.1·n_z/(C_mLT − 0.25) (λ̄_z ≥ 0.4; from
memory), n_z = N_Ed/(χ_z·N_Rk/γ_M1). The members are invented.
"""

from __future__ import annotations

import pytest

import engine


def _case(restraint: dict, N: float = 150e3) -> engine.Case:
    return engine.Case.from_dict(
        {
            "schema": 1,
            "length": 8.0,
            "section": {"name": "IPE 300"},
            "material": {"name": "S355"},
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": N,
            "loads": [{"type": "uniform", "q": 12e3}],
            "restraints": [{"x": 4.0, **restraint}],
            "imperfection": {"preset": "en1993-table-5.1"},
        }
    )


def _en(case):
    return next(r for r in engine.solve(case).routes if r.route == "en-member")


def _k_zy(f) -> float:
    n_z = f["N_Ed"] / (f["chi_z"] * f["N_Rk"] / f["gamma_M1"])
    lam = f["lambda_z"]
    return max(1 - 0.1 * lam * n_z / (f["C_mLT"] - 0.25), 1 - 0.1 * n_z / (f["C_mLT"] - 0.25))


@pytest.mark.parametrize("N", [50e3, 150e3])
def test_an_in_plane_support_alone_does_not_set_c_mlt(N):
    """Held in plane only at x = 4 m: C_my is the half span's (0.55, Table B.3 for a span with one end
    moment and a uniform load, as the route reads it) but C_mLT is the whole span's (a diagram not of Table
    B.3's shapes: 1.0), and k_zy and eq. (6.62) follow it."""
    f = _en(_case({"translation": "fixed"}, N)).facts
    assert f["C_my"] == pytest.approx(0.55, abs=1e-9)
    assert f["C_mLT"] == pytest.approx(1.0, abs=1e-12)
    assert f["k_zy"] == pytest.approx(_k_zy(f), rel=1e-12)


def test_a_lateral_brace_at_the_support_keeps_the_half_span():
    """A two-plane case held at x = 4 m in both planes and against twist (a brace point of the LTB check):
    the half span is the span between lateral braces, and C_mLT = C_my of that span (as before)."""
    data = _case({"translation": "fixed", "twist": "fixed", "plane": "both"}).to_dict()
    data["second_plane"] = {
        "supports": {"left": "pinned", "right": "pinned"},
        "loads": [{"type": "uniform", "q": 0.5e3}],
    }
    f = _en(engine.Case.from_dict(data)).facts
    assert f["C_my"] == pytest.approx(0.55, abs=1e-9)
    assert f["C_mLT"] == pytest.approx(f["C_my"], rel=1e-12)
    assert f["k_zy"] == pytest.approx(_k_zy(f), rel=1e-12)


def test_the_independent_check_value():
    """The reproducer of the independent check: eq. (6.62) 1.576 with C_mLT = 1.0 (it read 1.437)."""
    en = _en(_case({"translation": "fixed"}))
    assert en.terms["eq-6.62"] == pytest.approx(1.576, abs=5e-4)
