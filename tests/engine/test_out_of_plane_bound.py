"""N/N_cr about the other axis counts as a bound where the code's out-of-plane check is not made.

A one-plane member of a material without EN 1993-1-1's buckling curves (timber, aluminium, a custom material)
was given no out-of-plane check: its utilisation showed the in-plane stress alone, so a timber stud loaded
beyond its elastic critical load about the minor axis passed (0.249, `fails` false) with a danger caution
beside it. Its N_cr about the other axis is known, and no code's buckling resistance exceeds it (for the
curves of EN 1993-1-1 and EN 1995-1-1, both of the form 1/(Φ + √(Φ² − λ̄²)), χ·λ̄² <= 1, so
χ·A·f <= N_cr; common practice, no source for other codes), so N/N_cr is a bound below which the code's
utilisation cannot lie, and the member check counts it (kind "out-of-plane elastic buckling").

References: Euler's load π²EI/L² (Timoshenko & Gere 1961, ch. 2); C24 of EN 338 (E_0,mean = 11 000 MPa,
from memory); the section's I about the minor axis b³h/12 written out here. Members are invented.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import engine
from engine.capacity import capacity

E_C24 = 7_400e6  # EN 338 C24, E_0,05 [Pa] (from memory): the stability modulus, EN 1995-1-1 §6.3.2


def stud(**changes) -> engine.Case:
    """An invented pinned timber stud, 45 × 195 mm C24, bent about its major axis."""
    data = {
        "schema": 1,
        "title": "Invented timber stud",
        "length": 3.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 10e3,
        "loads": [{"type": "uniform", "q": 0.8e3}],
        "section": {"name": "TIMBER 45x195"},
        "material": {"name": "C24"},
        "axis": "major",
    }
    data.update(changes)
    return engine.Case.from_dict(data)


def n_cr_minor(b=0.045, h=0.195, length=3.0, E=E_C24) -> float:
    """Euler's load about the minor axis of a b × h rectangle (I = h·b³/12)."""
    return math.pi**2 * E * (h * b**3 / 12) / length**2


def test_the_bound_governs_a_slender_stud_and_equals_n_over_euler_load():
    """10 kN on the stud: N/N_cr,z = 10/12.02 = 0.832 governs over the in-plane stress (N_cr,z with
    E_0,05 since stop 38; it was 15 kN against 17.86 kN with E_mean)."""
    r = engine.solve(stud())
    out = r.check.out_of_plane
    assert not out.checked and out.N_cr == pytest.approx(n_cr_minor(), rel=1e-12)
    assert out.N_cr == pytest.approx(12.02e3, rel=1e-3)
    expected = 10e3 / n_cr_minor()
    assert out.elastic_utilization == pytest.approx(expected, rel=1e-12)
    assert r.check.strength_kind == "out-of-plane elastic buckling"
    assert r.check.strength_utilization == pytest.approx(expected, rel=1e-12)
    assert r.check.in_plane_utilization < expected  # the stress alone read 0.219
    assert r.utilization == pytest.approx(expected, rel=1e-12)  # the headline
    second = next(route for route in r.routes if route.route == "second-order")
    assert second.governing == "out-of-plane-elastic"
    assert second.terms["out-of-plane-elastic"] == pytest.approx(expected, rel=1e-12)
    warning = next(c for c in r.cautions if c.code == "out-of-plane-not-checked")
    assert warning.level == "warning" and "bound" in warning.message
    assert warning.values["elastic_utilization"] == pytest.approx(expected, rel=1e-12)


def test_beyond_the_euler_load_about_the_other_axis_the_member_fails():
    """20 kN > N_cr,z: the utilisation exceeds 1 (it read 0.249, a pass), beside the danger caution."""
    r = engine.solve(stud(axial_force=20e3))
    assert r.status == "stable"  # in plane it is far from its own critical load
    assert r.check.out_of_plane.elastic_bound == pytest.approx(20e3 / n_cr_minor(), rel=1e-12)
    assert r.check.utilization == pytest.approx(20e3 / n_cr_minor(), rel=1e-12)
    # Beyond N_cr,z no lateral stiffness is left: M_cr = 0, and the LTB bound M/M_cr is unbounded.
    assert r.utilization > 1.0
    assert any(c.level == "danger" and c.code == "out-of-plane-buckling" for c in r.cautions)


def test_the_capacity_is_at_most_the_euler_load_about_the_other_axis():
    """The axial capacity stops below N_cr,z (it was where the in-plane stress reaches 1: 11 times more).
    Braced against lateral-torsional buckling it is N_cr,z exactly (N/N_cr is linear in N); free, the LTB
    bound M/M_cr reaches 1 first, as M_cr falls to 0 at N_cr,z."""
    braced = capacity(stud(check={"ltb": {"restrained": True}}))
    assert braced.check == "out-of-plane elastic buckling"
    assert braced.axial_force == pytest.approx(n_cr_minor(), rel=1e-12)
    assert braced.axial_force < braced.critical_load
    free = capacity(stud())
    assert free.check == "lateral-torsional-elastic"
    assert free.axial_force < n_cr_minor()
    at = engine.solve(stud(axial_force=free.axial_force))
    assert at.utilization == pytest.approx(1.0, abs=1e-9)


def test_restrained_out_of_plane_counts_no_bound():
    """Braced out of plane: no N_cr about the other axis, no bound; the in-plane check alone."""
    r = engine.solve(stud(out_of_plane={"restrained": True}))
    assert r.check.out_of_plane.elastic_utilization is None
    assert r.check.strength_kind != "out-of-plane elastic buckling"


def test_a_given_out_of_plane_length_sets_the_bound():
    """Blocking at mid-height (L_cr,z = 1.5 m) makes N_cr,z four times larger and the bound a quarter."""
    r = engine.solve(stud(out_of_plane={"buckling_length": 1.5}))
    out = r.check.out_of_plane
    assert out.N_cr == pytest.approx(n_cr_minor(length=1.5), rel=1e-12)
    assert out.elastic_utilization == pytest.approx(10e3 / n_cr_minor(length=1.5), rel=1e-12)


def test_in_tension_the_bound_is_zero():
    r = engine.solve(stud(axial_force=-15e3))
    assert r.check.out_of_plane.elastic_utilization == 0.0
    assert r.check.strength_kind != "out-of-plane elastic buckling"


def test_a_steel_member_keeps_its_code_check_and_reports_the_ratio_beside_it():
    """Steel: N/N_b,Rd is the check (never below N/N_cr, since χ·λ̄² <= 1); N/N_cr is reported, not counted."""
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "length": 6.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 350e3,
            "loads": [{"type": "uniform", "q": 2.5e3}],
            "section": {"name": "HEB 200"},
            "material": {"name": "S355"},
            "imperfection": {"preset": "en1993-table-5.1"},
        }
    )
    out = engine.solve(case).check.out_of_plane
    assert out.checked and out.elastic_bound is None
    assert out.elastic_utilization == pytest.approx(350e3 / out.N_cr, rel=1e-12)
    assert out.utilization >= out.elastic_utilization


def test_a_stepped_stud_takes_the_weaker_segment():
    """Stepped from 45 × 195 to 45 × 95 at 2 m: the bound uses the smaller I about the minor axis over the
    whole length (a lower bound of the stepped member's N_cr, Rayleigh), here the same b: the same N_cr,z;
    stepped to 63 × 175 the 45 mm part is the weaker."""
    r = engine.solve(stud(steps=[{"x": 2.0, "section": {"name": "TIMBER 63x175"}}]))
    out = r.check.out_of_plane
    assert out.N_cr == pytest.approx(n_cr_minor(), rel=1e-12)  # the 45 mm part, not the 63 mm one
    assert r.utilization >= 10e3 / n_cr_minor() * (1 - 1e-12)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    length=st.floats(1.0, 6.0),
    force=st.floats(1e3, 80e3),
    name=st.sampled_from(["TIMBER 45x95", "TIMBER 45x195", "TIMBER 75x200", "TIMBER 90x270"]),
    grade=st.sampled_from(["C24", "GL24h"]),
)
def test_the_headline_of_a_timber_member_is_never_below_n_over_n_cr_about_the_other_axis(
    length, force, name, grade
):
    """The invariant: wherever N_cr about the other axis is known, the utilisation is at least N/N_cr."""
    try:
        case = stud(length=length, axial_force=force, section={"name": name}, material={"name": grade})
    except engine.CaseError:
        return
    r = engine.solve(case)
    out = r.check.out_of_plane
    assert out.N_cr is not None
    bound = force / out.N_cr
    assert r.utilization is not None
    assert r.utilization >= bound * (1 - 1e-12)
    if bound > 1.0:
        assert r.utilization > 1.0
