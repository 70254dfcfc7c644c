"""Steps by section (issue 16): a member whose segments have their own sections, so that EI and the
cross-section check use each segment's own section.

Every number below is checked against a source named beside it; lengths and loads are invented.
"""

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.optimize import brentq

import engine
from engine.sections import section_from_spec

L = 8.0  # [m], invented
E = 210e9  # [Pa], EN 1993-1-1 §3.2.6 (from memory)
FY = 355e6  # [Pa], S355 with t <= 16 mm (HEB 200, t_f = 15 mm), EN 10025-2 (from memory)
FY_THICK = 345e6  # [Pa], S355 with 16 < t <= 40 mm (HEB 300, t_f = 19 mm), EN 10025-2 (from memory)


def _data(steps, P=0.0, loads=(), left="fixed", right="free", **extra):
    data = {
        "length": L,
        "section": {"name": "HEB 300"},
        "material": {"name": "S355"},
        "supports": {"left": left, "right": right},
        "axial_force": P,
        "loads": list(loads),
        "steps": list(steps),
        "check": {"routes": ["second-order"]},
    }
    data.update(extra)
    return data


def test_round_trip_and_errors_name_the_path():
    case = engine.Case.from_dict(_data([{"x": 5.0, "section": {"name": "HEB 200"}}]))
    assert engine.Case.from_dict(case.to_dict()) == case
    assert case.to_dict()["steps"] == [{"x": 5.0, "section": {"name": "HEB 200"}}]
    with pytest.raises(engine.CaseError, match=r"steps\[1\]\.section\.name: 'HEB 2000' is not in"):
        engine.Case.from_dict(
            _data([{"x": 3.0, "section": {"name": "HEB 240"}}, {"x": 5.0, "section": {"name": "HEB 2000"}}])
        )
    with pytest.raises(engine.CaseError, match=r"steps\[0\]\.EI: give exactly one of EI"):
        engine.Case.from_dict(_data([{"x": 5.0, "EI": 1e7, "section": {"name": "HEB 200"}}]))
    with pytest.raises(engine.CaseError, match=r"steps\[1\]\.EI: a step by EI is not allowed beside"):
        engine.Case.from_dict(_data([{"x": 3.0, "section": {"name": "HEB 240"}}, {"x": 5.0, "EI": 1e7}]))
    no_section = _data([{"x": 5.0, "section": {"name": "HEB 200"}}], EI=2e7)
    del no_section["section"], no_section["material"]
    with pytest.raises(engine.CaseError, match=r"steps\[0\]\.section: a step by section needs a case with a"):
        engine.Case.from_dict(no_section)


def test_stepped_cantilever_from_two_catalogue_sections_against_its_characteristic_equation():
    # A cantilever fixed at x = 0, free at x = L, loaded at the top; the lower part (l2) of EI2, the upper
    # (l1) of EI1: tan(k1 l1) · tan(k2 l2) = k1/k2, k_i = √(P/EI_i) (Timoshenko & Gere, Theory of Elastic
    # Stability, 2nd ed., ch. 2, buckling of a bar with changes in cross section; from memory, re-derived:
    # y = δ(1 - cos k2 x) below the step, y = δ + B sin k1 (L - x) above, w and w' continuous at the step).
    # EI_i = E·I_y of HEB 300 below and HEB 200 above (I_y 25 170 and 5 696 cm⁴ in the steel producers'
    # section tables, from memory: checked to 0.5 % here).
    l2 = 5.0
    l1 = L - l2
    I2 = section_from_spec({"name": "HEB 300"}, "major").I
    I1 = section_from_spec({"name": "HEB 200"}, "major").I
    assert I2 == pytest.approx(25170e-8, rel=5e-3)
    assert I1 == pytest.approx(5696e-8, rel=5e-3)
    EI2, EI1 = E * I2, E * I1
    case = engine.Case.from_dict(_data([{"x": l2, "section": {"name": "HEB 200"}}]))

    def characteristic(P):
        k1, k2 = math.sqrt(P / EI1), math.sqrt(P / EI2)
        return math.sin(k1 * l1) * math.sin(k2 * l2) * k2 - k1 * math.cos(k1 * l1) * math.cos(k2 * l2)

    lo, hi = math.pi**2 * EI1 / (4 * L**2), math.pi**2 * EI2 / (4 * L**2)
    reference = brentq(characteristic, lo, hi, xtol=1e-14 * hi, rtol=1e-15)
    buckling = engine.critical_loads(case, 1)
    assert buckling.critical_loads[0] == pytest.approx(reference, rel=1e-11)
    assert buckling.effective_lengths() == pytest.approx(
        math.pi * np.sqrt(np.array([EI2, EI1]) / reference), rel=1e-11
    )
    assert engine.solve(case).critical_loads[0] == pytest.approx(reference, rel=1e-11)


@settings(max_examples=12, deadline=None)
@given(
    x=st.floats(min_value=0.5, max_value=7.5),
    ratio=st.floats(min_value=0.0, max_value=0.6),
    q=st.floats(min_value=1e3, max_value=3e4),
)
def test_a_step_to_the_case_section_changes_nothing(x, ratio, q):
    loads = [{"type": "uniform", "q": q}]
    common = dict(left="pinned", right="pinned", loads=loads, imperfection={"preset": "en1993-table-5.1"})
    plain_data = _data([], **common)
    pcr = engine.critical_loads(engine.Case.from_dict(plain_data), 1).critical_loads[0]
    P = ratio * pcr
    plain = engine.solve(engine.Case.from_dict({**plain_data, "axial_force": P}), stations=101)
    stepped = engine.solve(
        engine.Case.from_dict(_data([{"x": x, "section": {"name": "HEB 300"}}], P=P, **common)), stations=101
    )
    assert stepped.critical_loads[0] == pytest.approx(plain.critical_loads[0], rel=1e-10)
    assert np.abs(stepped.moment).max() == pytest.approx(np.abs(plain.moment).max(), rel=1e-9)
    assert stepped.check.utilization == pytest.approx(plain.check.utilization, rel=1e-9)
    assert stepped.check.kind == plain.check.kind
    # The one difference: a stepped member's second-order route also counts eq. (6.62) (the en-member route,
    # which counts it on a uniform member, is not applied to a stepped one; DEVELOPERS.md, decisions log); a
    # step to the member's own section gives the uniform member's own eq. (6.62).
    member = next(r for r in plain.routes if r.route == "en-member")
    expected = max(plain.utilization, member.terms.get("eq-6.62", 0.0))
    assert stepped.utilization == pytest.approx(expected, rel=1e-9)


def test_a_station_in_the_smaller_segment_uses_its_own_resistance():
    # A simply supported member, HEB 300 up to x = 4 m, HEB 200 beyond; the elastic cross-section check
    # |N|/(A f_y/γ_M0) + |M|/(W_el f_y/γ_M0) at every station (EN 1993-1-1 §6.2.1(7) eq. (6.2), linear form;
    # from memory) with γ_M0 = 1.0. A, W_el,y of HEB 200: 78.1 cm², 570 cm³ in the producers' tables (from
    # memory; checked to 1 % here).
    q, P = 12e3, 150e3
    data = _data(
        [{"x": 4.0, "section": {"name": "HEB 200"}}],
        P=P,
        loads=[{"type": "uniform", "q": q}],
        left="pinned",
        right="pinned",
        out_of_plane={"restrained": True},
        check={"routes": ["second-order"], "method": "elastic", "gamma_M0": 1.0},
    )
    result = engine.solve(engine.Case.from_dict(data), stations=201)
    small = section_from_spec({"name": "HEB 200"}, "major")
    big = section_from_spec({"name": "HEB 300"}, "major")
    assert small.A == pytest.approx(78.1e-4, rel=1e-2)
    assert small.W_el == pytest.approx(570e-6, rel=1e-2)
    on_small = result.x > 4.0 + 1e-9
    i = int(np.argmax(np.where(on_small, np.abs(result.moment), -1.0)))
    hand = P / (small.A * FY) + abs(result.moment[i]) / (small.W_el * FY)
    assert result.check.axial_bending[i] == pytest.approx(hand, rel=1e-12)
    # The larger segment keeps its own resistance at its stations, with f_y for its thicker flange.
    j = int(np.argmax(np.where(result.x < 4.0 - 1e-9, np.abs(result.moment), -1.0)))
    assert result.check.axial_bending[j] == pytest.approx(
        P / (big.A * FY_THICK) + abs(result.moment[j]) / (big.W_el * FY_THICK), rel=1e-12
    )
    # With N = 0 the member is statically determinate: M = q x (L - x)/2 (statics), whatever the sections.
    first = engine.solve(engine.Case.from_dict({**data, "axial_force": 0.0}), stations=201)
    k = int(np.argmin(np.abs(first.x - 6.0)))
    xk = first.x[k]
    assert first.moment[k] == pytest.approx(q * xk * (L - xk) / 2, rel=1e-10)
    assert first.check.axial_bending[k] == pytest.approx(q * xk * (L - xk) / 2 / (small.W_el * FY), rel=1e-10)
    # The governing utilisation lies in the smaller segment, with its resistances.
    assert result.check.x > 4.0
    assert result.check.resistances["M_Rd"] == pytest.approx(small.W_el * FY, rel=1e-12)


def test_stepped_member_routes_and_out_of_plane_are_conservative():
    data = _data(
        [{"x": 5.0, "section": {"name": "HEB 200"}}],
        P=300e3,
        loads=[{"type": "point", "P": 10e3, "x": L}],
        imperfection={"preset": "en1993-table-5.1"},
    )
    del data["check"]  # the default routes: the equivalent-member ones are shown as not applied
    result = engine.solve(engine.Case.from_dict(data))
    second = next(r for r in result.routes if r.route == "second-order")
    # The headline is the second-order route: the member check, or eq. (6.62) that the route adds on a
    # stepped member (engine.out_of_plane_interaction), whichever is larger.
    assert result.utilization == second.utilization
    assert second.utilization == max(result.check.utilization, *second.terms.values())
    reasons = {r.route: r.reason for r in result.routes}
    assert reasons["en-member"] == reasons["aisc"] == "stepped-section"
    # Out of plane: N_cr with the weaker I_z over the whole buckling length, HEB 200's χ A f_y. The member
    # is a cantilever in its plane and no out-of-plane length is given: L_cr = 2L (Euler's cantilever,
    # Timoshenko & Gere 1961 ch. 2; the project's default, DEVELOPERS.md decisions log, stop 29).
    oop = result.check.out_of_plane
    weak = section_from_spec({"name": "HEB 200"}, "minor")
    assert oop.buckling_length == 2 * L
    assert oop.N_cr == pytest.approx(math.pi**2 * E * weak.I / (2 * L) ** 2, rel=1e-12)
    assert oop.N_b_Rd == pytest.approx(oop.chi * weak.A * FY / 1.0, rel=1e-12)


@pytest.mark.parametrize("P", [0.0, 200e3])
def test_lateral_torsional_buckling_of_a_stepped_member_is_the_weaker_sections(P):
    """A simply supported member stepped HEB 300 -> HEB 200 under a uniform load (statically determinate: the
    first-order diagram is that of any EI) is checked for lateral-torsional buckling with each segment's
    section along the whole member, and the weakest governs (DEVELOPERS.md, decisions log). So its M_cr and
    M_b,Rd equal those of a uniform HEB 200 member ([derived]: the same problem). This also guards the
    member's cache: every segment is checked with the same cache, and a key of the settings alone returned
    the first segment's (the stiffer section's) M_cr for the second, an unsafe value."""
    loads = [{"type": "uniform", "q": 8e3}]
    common = {"left": "pinned", "right": "pinned", "P": P, "loads": loads}
    steps = [{"x": 5.0, "section": {"name": "HEB 200"}}]
    stepped = engine.solve(engine.Case.from_dict(_data(steps, **common)))
    uniform = _data([], **common)
    uniform["section"] = {"name": "HEB 200"}
    weak = engine.solve(engine.Case.from_dict(uniform))
    assert stepped.ltb.applies and weak.ltb.applies
    assert stepped.ltb.M_cr == pytest.approx(weak.ltb.M_cr, rel=1e-12)
    assert stepped.ltb.M_cr_0 == pytest.approx(weak.ltb.M_cr_0, rel=1e-12)
    assert stepped.ltb.M_b_Rd == pytest.approx(weak.ltb.M_b_Rd, rel=1e-12)
