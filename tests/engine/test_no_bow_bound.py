"""N/Pcr1 of a plane analysed without a bow counts as a bound of the utilisation.

Without a bow (a material whose code bow strutscope does not set, such as timber, or a bow left out), the
second-order stresses do not see buckling until N reaches Pcr1: an invented two-plane timber stud at 0.95 of
its minor-axis critical load read 0.231 and passed, with no load in that plane. No code's buckling
resistance exceeds the elastic critical load (tests/engine/test_out_of_plane_bound.py says why), so the member
check counts N/Pcr1 of each plane without a bow (kind "in-plane elastic buckling";
"elastic buckling without a bow" before stop 38). Pcr1 by Euler's
load π²EI/L² (Timoshenko & Gere 1961, ch. 2); E_0,05 of C24 7 400 MPa (EN 338, from memory), the modulus of
timber stability since stop 38.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import engine
from tests.engine.test_out_of_plane_bound import n_cr_minor, stud

KIND = "in-plane elastic buckling"


def test_a_two_plane_stud_near_its_minor_axis_critical_load_reads_at_least_n_over_pcr():
    """11.4 kN on the stud with an unloaded, unbowed second plane: 11.4/12.02 = 0.949 (17 kN against
    17.86 kN with E_mean before stop 38, which read 0.231 before the bound)."""
    case = stud(
        axial_force=11.4e3,
        second_plane={"supports": {"left": "pinned", "right": "pinned"}, "loads": []},
    )
    r = engine.solve(case)
    assert r.second_plane.critical_loads[0] == pytest.approx(n_cr_minor(), rel=1e-9)
    assert r.check.strength_kind == KIND
    assert r.utilization == pytest.approx(11.4e3 / n_cr_minor(), rel=1e-9)
    assert r.check.in_plane_utilization < 0.3


def test_one_plane_about_the_minor_axis_braced_out_of_plane():
    """The stud bent about its minor axis (Pcr1 = 12.02 kN with E_0,05), braced about the other: 8 kN gives
    0.666."""
    r = engine.solve(
        stud(
            axial_force=8e3,
            axis="minor",
            loads=[{"type": "uniform", "q": 50.0}],
            out_of_plane={"restrained": True},
        )
    )
    assert r.critical_loads[0] == pytest.approx(n_cr_minor(), rel=1e-9)
    assert r.check.strength_kind == KIND
    assert r.utilization == pytest.approx(8e3 / n_cr_minor(), rel=1e-9)


def test_a_steel_member_without_its_bow_counts_it_and_with_the_code_bow_does_not():
    """HEB 200 S355 about its minor axis, 6 m, braced out of plane, 500 kN: Pcr1 = π²EI_z/L²; with the bow
    left out N/Pcr1 counts; with the code's bow the second-order check itself sees buckling."""
    data = {
        "schema": 1,
        "length": 6.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 500e3,
        "loads": [{"type": "uniform", "q": 100.0}],
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "axis": "minor",
        "out_of_plane": {"restrained": True},
    }
    bare = engine.solve(engine.Case.from_dict(data))
    minor = engine.sections.section_from_spec({"name": "HEB 200"}, "minor")
    euler = math.pi**2 * bare.material.E * minor.I / 6.0**2
    assert bare.critical_loads[0] == pytest.approx(euler, rel=1e-9)
    assert bare.utilization >= 500e3 / euler * (1 - 1e-12)
    bowed = engine.solve(engine.Case.from_dict(data | {"imperfection": {"preset": "en1993-table-5.1"}}))
    assert bowed.check.strength_kind != KIND
    assert bowed.utilization > 500e3 / euler  # the bow's amplified moment


def test_no_bound_in_tension():
    r = engine.solve(stud(axial_force=-12e3, axis="minor", out_of_plane={"restrained": True}))
    assert r.check.strength_kind != KIND


@settings(max_examples=30, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(
    length=st.floats(1.5, 5.0),
    ratio=st.floats(0.05, 0.98),
    axis=st.sampled_from(["major", "minor"]),
    two=st.booleans(),
)
def test_without_a_bow_the_utilisation_is_never_below_n_over_pcr1_of_any_plane(length, ratio, axis, two):
    """The invariant, one plane or two, for the timber stud at a fraction of its smaller critical load."""
    extra = {"second_plane": {"supports": {"left": "pinned", "right": "pinned"}, "loads": []}} if two else {}
    probe = engine.solve(stud(length=length, axis=axis, axial_force=0.0, **extra))
    pcrs = [float(probe.critical_loads[0])]
    if two:
        pcrs.append(float(probe.second_plane.critical_loads[0]))
    force = ratio * min(pcrs)
    r = engine.solve(stud(length=length, axis=axis, axial_force=force, **extra))
    assert r.utilization >= force / min(pcrs) * (1 - 1e-12)
