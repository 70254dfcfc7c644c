"""C_mLT of Annex B is read between the points braced laterally (EN 1993-1-1:2005 Table B.3, "points braced in
direction y-y", from memory), also where a restraint holds the member laterally but not against twist.

An independent audit (stop 35): an invented HEB 200 in S235, 6 m pinned, 300 kN, end moments 40 kN·m in
double curvature (ψ = −1), held laterally at mid-span with twist free. The route read C_mLT over the whole
member, 0.4 (Table B.3: 0.6 + 0.4ψ ≥ 0.4), where each half between the lateral points has ψ = 0 and 0.6: a
smaller C_mLT gives a smaller k_zy (Table B.2), eq. (6.62) 3 % low (0.473 against 0.488). The larger of the
two readings is now kept.
"""

from __future__ import annotations

import pytest

import engine


def _case(twist: bool) -> engine.Case:
    restraint = {"x": 3.0, "translation": "fixed", "plane": "second"}
    if twist:
        restraint["twist"] = "fixed"
    return engine.Case.from_dict(
        {
            "schema": 1,
            "length": 6.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 300e3,
            "section": {"name": "HEB 200"},
            "material": {"name": "S235"},
            "imperfection": {"preset": "en1993-table-5.1"},
            "loads": [{"type": "couple", "C": 40e3, "x": 0.0}, {"type": "couple", "C": 40e3, "x": 6.0}],
            "check": {"routes": ["en-member"], "ltb": {"load_position": "shear-centre"}},
            "second_plane": {"supports": {"left": "pinned", "right": "pinned"}, "loads": []},
            "restraints": [restraint],
        }
    )


@pytest.mark.parametrize("twist", [False, True], ids=["lateral-only", "brace-point"])
def test_c_mlt_between_the_points_braced_laterally(twist):
    """C_mLT = 0.6 (each half, ψ = 0, Table B.3) whether the mid-span restraint holds twist or not, and
    k_zy is Table B.2's for class 1 with it: [1 − 0.1·λ̄_z·n_z/(C_mLT − 0.25)] ≥ [1 − 0.1·n_z/(C_mLT − 0.25)]
    (from memory), with the route's own λ̄_z and χ_z."""
    (route,) = [r for r in engine.solve(_case(twist)).routes if r.route == "en-member"]
    f = route.facts
    assert f["section_class"] == 1
    assert f["C_my"] == pytest.approx(0.4)  # the whole member, ψ = −1, for the in-plane factor
    assert f["C_mLT"] == pytest.approx(0.6, rel=1e-9)
    n_z = f["N_Ed"] / (f["chi_z"] * f["N_Rk"] / f["gamma_M1"])
    k_zy = max(1 - 0.1 * f["lambda_z"] * n_z / (0.6 - 0.25), 1 - 0.1 * n_z / (0.6 - 0.25))
    assert f["k_zy"] == pytest.approx(k_zy, rel=1e-9)
    eq_6_62 = n_z + k_zy * f["M_y_Ed"] / (f["chi_LT"] * f["M_y_Rk"] / f["gamma_M1"])
    assert route.terms["eq-6.62"] == pytest.approx(eq_6_62, rel=1e-9)
