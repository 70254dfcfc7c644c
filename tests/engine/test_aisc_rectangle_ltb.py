"""Lateral-torsional buckling of a solid rectangular bar on the ``aisc`` route (AISC 360-16 §F11.2).

The route gave a deep flat bar bent about its stronger axis only §F11.1's yielding, M_n = F_y·Z: a 20 × 200 mm
bar over 6 m read about a third of what §F11.2 gives (unsafe). The formulas, AISC 360-16 §F11 (from memory),
written out here with d the depth in the plane of bending, t the width, L_b the unbraced length:

- L_b·d/t² <= 0.08E/F_y: M_n = M_p = F_y·Z <= 1.6·F_y·S (F11-1);
- 0.08E/F_y < L_b·d/t² <= 1.9E/F_y: M_n = C_b[1.52 − 0.274(L_b·d/t²)(F_y/E)]·F_y·S <= M_p (F11-2);
- L_b·d/t² > 1.9E/F_y: M_n = F_cr·S <= M_p, F_cr = 1.9·E·C_b/(L_b·d/t²) (F11-3, F11-4).

C_b by eq. (F1-1), C_b = 12.5M_max/(2.5M_max + 3M_A + 4M_B + 3M_C) (AISC 360-16 §F1, from memory);
φ_b = 0.90, Ω_b = 1.67 (AISC 360-16 §F1, from memory); with no axial force eq. (H1-1b) is M_r/M_c (AISC
360-16 §H1.1, from memory). ASTM A36: F_y = 36 ksi, E = 29 000 ksi (AISC 360-16 §A3 and the Manual, from
memory); 1 ksi = 1000 lbf/in² (exact definitions of the pound-force and the inch). Members are invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.ltb import aisc_f11

KSI = 1000.0 * 4.4482216152605 / 0.0254**2  # Pa: 1 lbf = 4.4482216152605 N, 1 in = 0.0254 m (exact)
FY, E = 36.0 * KSI, 29_000.0 * KSI  # ASTM A36 (from memory)
PHI_B, OMEGA_B = 0.90, 1.67  # AISC 360-16 §F1 (from memory)
T, D = 0.02, 0.2  # the flat bar: 20 mm wide, 200 mm deep [m]


def _case(length: float, loads: list, *, b=T, h=D, method="LRFD", **changes) -> engine.Case:
    data = {
        "schema": 1,
        "title": "Invented flat bar on the aisc route",
        "length": length,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 0.0,
        "loads": loads,
        "section": {"shape": "rectangle", "h": h, "b": b},
        "material": {"name": "ASTM A36"},
        "axis": "major",
        "check": {"routes": ["aisc"], "aisc_method": method},
    }
    data.update(changes)
    return engine.Case.from_dict(data)


def _couples(M: float, length: float) -> list:
    """End couples giving a uniform moment M along the member (C_b = 1)."""
    return [{"type": "couple", "C": M, "x": 0.0}, {"type": "couple", "C": -M, "x": length}]


def _aisc(case):
    result = engine.solve(case)
    return result, next(r for r in result.routes if r.route == "aisc")


def _hand_f11(L_b: float, d: float, t: float, C_b: float) -> tuple[str, float]:
    """(zone, M_n) of AISC 360-16 §F11 (from memory), written out independently of the engine."""
    S, Z = t * d**2 / 6.0, t * d**2 / 4.0
    M_p = min(FY * Z, 1.6 * FY * S)
    ratio = L_b * d / t**2
    if ratio <= 0.08 * E / FY:
        return "plastic", M_p
    if ratio <= 1.9 * E / FY:
        return "inelastic", min(C_b * (1.52 - 0.274 * ratio * FY / E) * FY * S, M_p)
    return "elastic", min(1.9 * E * C_b / ratio * S, M_p)


def _capacity(M_n: float, method: str) -> float:
    return PHI_B * M_n if method == "LRFD" else M_n / OMEGA_B


def test_the_material_is_the_one_written_out_here():
    result, _ = _aisc(_case(2.0, _couples(1e3, 2.0)))
    assert result.material.fy == pytest.approx(FY, rel=1e-12)
    assert result.material.E == pytest.approx(E, rel=1e-12)


@pytest.mark.parametrize("method", ["LRFD", "ASD"])
@pytest.mark.parametrize(
    ("b", "h", "length", "zone"),
    [
        (0.05, 0.10, 1.5, "plastic"),  # L_b·d/t² = 60 < 0.08E/F_y = 64.4
        (T, D, 2.0, "inelastic"),  # 1000, between 64.4 and 1.9E/F_y = 1530.6
        (T, D, 6.0, "elastic"),  # 3000 > 1530.6
    ],
)
def test_each_zone_under_uniform_moment_matches_the_hand_computation(method, b, h, length, zone):
    """Uniform moment (end couples): C_b = 1 by eq. (F1-1) and by the exact elastic ratio. M_n and the
    utilisation M_r/M_c by the formulas above, LRFD φ_b = 0.90 and ASD Ω_b = 1.67 (from memory)."""
    M = 5e3
    result, route = _aisc(_case(length, _couples(M, length), b=b, h=h, method=method))
    hand_zone, M_n = _hand_f11(length, h, b, 1.0)
    assert hand_zone == zone
    f = route.facts
    if M_n > f["M_cr"]:  # never above the exact elastic M_cr (see test_a_stocky_bar_...)
        M_n, zone = f["M_cr"], "exact-cap"
    assert f["zone_F11"] == zone
    assert f["L_b"] == pytest.approx(length, rel=1e-12)
    assert f["C_b"] == pytest.approx(1.0, rel=1e-5)
    assert f["Lbd_t2"] == pytest.approx(length * h / b**2, rel=1e-12)
    assert f["Lbd_t2_p"] == pytest.approx(0.08 * E / FY, rel=1e-12)
    assert f["Lbd_t2_r"] == pytest.approx(1.9 * E / FY, rel=1e-12)
    assert f["M_n_F11"] == pytest.approx(M_n, rel=1e-5)
    assert f["M_n_y"] == pytest.approx(M_n, rel=1e-5)
    assert f["M_n_y"] <= FY * b * h**2 / 4.0 * (1 + 1e-12)  # never above M_p
    assert route.utilization == pytest.approx(M / _capacity(M_n, method), rel=1e-5)
    assert not {"LTB-not-checked", "LTB-restrained", "aisc-tension-yielding"} & set(route.notes)


@pytest.mark.parametrize("method", ["LRFD", "ASD"])
def test_a_midspan_point_load_takes_c_b_of_eq_f1_1(method):
    """A point load at midspan, at the shear centre: eq. (F1-1) gives 12.5/(2.5 + 1.5 + 4 + 1.5) = 1.316,
    below the exact elastic ratio (about 1.35 for a narrow rectangle, Timoshenko & Gere 1961 §6.3, from
    memory), so it is the C_b used; zone (c) M_n grows by it against uniform moment."""
    length, P = 6.0, 3e3
    loads = [{"type": "point", "P": P, "x": length / 2}]
    _, route = _aisc(
        _case(
            length,
            loads,
            method=method,
            check={"routes": ["aisc"], "aisc_method": method, "ltb": {"load_position": "shear-centre"}},
        )
    )
    C_b = 12.5 / (2.5 + 3 * 0.5 + 4 * 1.0 + 3 * 0.5)
    f = route.facts
    assert f["C_b_F1_1"] == pytest.approx(C_b, rel=1e-9)
    assert f["C_b"] == pytest.approx(C_b, rel=1e-9)
    zone, M_n = _hand_f11(length, D, T, C_b)
    assert zone == f["zone_F11"] == "elastic"
    assert f["M_n_F11"] == pytest.approx(M_n, rel=1e-9)
    assert f["M_n_F11"] == pytest.approx(C_b * _hand_f11(length, D, T, 1.0)[1], rel=1e-9)
    assert route.utilization == pytest.approx(P * length / 4 / _capacity(M_n, method), rel=1e-6)


def test_c_b_cannot_lift_zone_b_above_the_plastic_moment():
    """Zone (b) at L_b = 2 m: C_b·(1.52 − 0.274·1000·F_y/E) = 1.316·1.180 = 1.553 > Z/S = 1.5, so M_n = M_p
    (F11-2's cap); under uniform moment it stays at 1.180·M_y."""
    length = 2.0
    loads = [{"type": "point", "P": 3e3, "x": length / 2}]
    check = {"routes": ["aisc"], "ltb": {"load_position": "shear-centre"}}
    _, route = _aisc(_case(length, loads, check=check))
    M_p = FY * T * D**2 / 4
    assert route.facts["zone_F11"] == "inelastic"
    assert route.facts["M_n_F11"] == pytest.approx(M_p, rel=1e-12)
    _, uniform = _aisc(_case(length, _couples(5e3, length)))
    ratio = 1.52 - 0.274 * (length * D / T**2) * FY / E
    assert uniform.facts["M_n_F11"] == pytest.approx(ratio * FY * T * D**2 / 6, rel=1e-5)
    assert uniform.facts["M_n_F11"] < M_p


@pytest.mark.parametrize("method", ["LRFD", "ASD"])
def test_the_audit_case_now_reads_above_yielding_alone(method):
    """The audit's flat bar, 20 × 200 mm A36, 6 m pinned, 5 kN/m on top (destabilising, the default):
    §F11.1 alone read M/(φ_b·F_y·Z) = 0.50 (LRFD); §F11.2 (zone (c), L_b·d/t² = 3000) gives about 1.35.
    C_b is eq. (F1-1)'s 1.136 capped by the exact elastic ratio (the load on top lowers M_cr), so between 1
    and 1.136; the utilisation is M/M_c with M_n = 1.9·E·C_b/3000·S."""
    length, q = 6.0, 5e3
    _, route = _aisc(_case(length, [{"type": "uniform", "q": q}], method=method))
    M = q * length**2 / 8
    yielding_only = M / _capacity(FY * T * D**2 / 4, method)
    f = route.facts
    assert f["C_b_F1_1"] == pytest.approx(12.5 / (2.5 + 3 * 0.75 + 4 + 3 * 0.75), rel=1e-6)
    assert 1.0 < f["C_b"] <= f["C_b_F1_1"]
    zone, M_n = _hand_f11(length, D, T, f["C_b"])
    assert zone == "elastic"
    # F11-4 lies 0.5 % above the exact elastic M_cr of this 10:1 bar with the load on top: M_cr governs
    assert f["M_cr"] < M_n < 1.01 * f["M_cr"]
    assert f["zone_F11"] == "exact-cap"
    M_n = f["M_cr"]
    assert f["M_n_y"] == pytest.approx(M_n, rel=1e-9)
    assert route.utilization == pytest.approx(M / _capacity(M_n, method), rel=1e-6)
    assert route.utilization > 2.5 * yielding_only
    if method == "LRFD":
        assert yielding_only == pytest.approx(0.50, abs=0.01)
        assert 1.2 < route.utilization < 1.45


def test_bending_about_the_weaker_axis_and_a_square_bar_keep_yielding_alone():
    """§F11.1 (from memory): a bar bent about its minor axis, or a square bar, does not buckle laterally:
    M_n = F_y·Z <= 1.6·F_y·S, no §F11.2 facts and no LTB note."""
    length, q = 6.0, 0.2e3
    M = q * length**2 / 8
    _, minor = _aisc(_case(length, [{"type": "uniform", "q": q}], axis="minor"))
    assert "M_n_F11" not in minor.facts
    assert minor.utilization == pytest.approx(M / (PHI_B * FY * D * T**2 / 4), rel=1e-9)
    assert not {"LTB-not-checked", "LTB-restrained"} & set(minor.notes)
    side = 0.05
    _, square = _aisc(_case(length, [{"type": "uniform", "q": q}], b=side, h=side))
    assert "M_n_F11" not in square.facts
    assert square.utilization == pytest.approx(M / (PHI_B * FY * side**3 / 4), rel=1e-9)
    assert not {"LTB-not-checked", "LTB-restrained"} & set(square.notes)


def test_a_bar_whose_check_cannot_be_made_keeps_the_note_and_yielding():
    """A cantilever on a rotational spring (its fork lets it swing: the check is not made, ``free-end``):
    M_n stays §F11.1's and the route says LTB is not checked (common practice, no source)."""
    case = _case(
        3.0,
        [{"type": "uniform", "q": 1e3}],
        supports={"left": {"translation": "fixed", "rotation": 5e6}, "right": "free"},
    )
    result, route = _aisc(case)
    assert not result.ltb.applies and result.ltb.reason == "free-end"
    assert "LTB-not-checked" in route.notes and "M_n_F11" not in route.facts
    assert route.facts["M_n_y"] == pytest.approx(FY * T * D**2 / 4, rel=1e-12)


def test_tension_note_only_with_tension():
    """§D2(a) (from memory) enters only with a tension: no note at N = 0, a note at N < 0."""
    loads = [{"type": "uniform", "q": 1e3}]
    _, none = _aisc(_case(6.0, loads))
    _, pulled = _aisc(_case(6.0, loads, axial_force=-50e3))
    assert "aisc-tension-yielding" not in none.notes
    assert "aisc-tension-yielding" in pulled.notes


def test_a_pure_strut_has_no_lateral_torsional_buckling_warning():
    """An I strut with no transverse load (no major-axis moment): nothing to buckle laterally, so neither
    the warning nor a route's LTB note (common practice, no source)."""
    case = _case(
        4.0,
        [],
        axial_force=200e3,
        section={"name": "HEB 200"},
        material={"name": "S355"},
        check={"routes": ["aisc", "en-member", "second-order"]},
    )
    result = engine.solve(case)
    assert result.ltb.reason == "no-major-moment"
    assert "lateral-torsional-buckling" not in [c.code for c in result.cautions]
    for route in result.routes:
        assert not {"LTB-not-checked", "LTB-restrained", "chi-LT-1"} & set(route.notes)


@pytest.mark.parametrize("C_b", [1.0, 1.136, 1.316, 1.67, 2.27])
def test_the_helper_never_exceeds_the_plastic_moment_and_is_continuous(C_b):
    """engine.design.ltb.aisc_f11 over L_b from 0 to 20 m: M_n <= M_p = F_y·Z everywhere, non-increasing
    in L_b, and continuous at both limits (F11-1 to F11-2: 1.52 − 0.274·0.08 = 1.498 ≈ 1.5; F11-2 to F11-4:
    1.52 − 0.274·1.9 = 0.999 ≈ 1, as the formulas are written; tolerance 0.2 %)."""
    S, Z = T * D**2 / 6, T * D**2 / 4
    values = []
    for L_b in [i * 0.01 for i in range(2001)]:
        found = aisc_f11(L_b=L_b, d=D, t=T, E=E, F_y=FY, Z_x=Z, S_x=S, C_b=C_b)
        assert found.M_n <= FY * Z * (1 + 1e-12)
        values.append(found.M_n)
    assert all(b <= a * (1 + 1e-12) for a, b in zip(values, values[1:], strict=False))
    for limit in (0.08 * E / FY, 1.9 * E / FY):
        L_b = limit * T**2 / D
        below, above = (
            aisc_f11(L_b=L_b * k, d=D, t=T, E=E, F_y=FY, Z_x=Z, S_x=S, C_b=C_b).M_n
            for k in (1 - 1e-9, 1 + 1e-9)
        )
        assert above == pytest.approx(below, rel=2e-3)
    assert math.isinf(aisc_f11(L_b=0.0, d=D, t=T, E=E, F_y=FY, Z_x=Z, S_x=S, C_b=C_b).F_cr)


def _torsion_constant(d: float, t: float) -> float:
    """J of a solid rectangle d × t (t ≤ d) by the series of Timoshenko & Goodier, *Theory of Elasticity*,
    §109 (from memory): J = d·t³/3·(1 − 192·t/(π⁵·d)·Σ_{n odd} tanh(nπd/(2t))/n⁵)."""
    series = sum(math.tanh(n * math.pi * d / (2 * t)) / n**5 for n in range(1, 60, 2))
    return d * t**3 / 3 * (1 - 192 * t / (math.pi**5 * d) * series)


@pytest.mark.parametrize("ratio", [2.0, 3.0, 5.0])
def test_a_stocky_bar_never_takes_more_than_its_exact_elastic_critical_moment(ratio):
    """F11-4's F_cr = 1.9·E·C_b/(L_b·d/t²) assumes J ≈ d·t³/3, which overstates a stocky bar's torsion
    constant: for d/t = 2 it lies about 17 % above the elastic critical moment of a narrow-rectangle beam
    under uniform moment, M_cr = (π/L)·√(E·I_z·G·J) (Timoshenko & Gere 1961 §6.2, from memory; warping of a
    solid rectangle neglected). The route takes the smaller: the exact M_cr (engine), checked here to 2 %
    against that closed form with J by the series above."""
    t = 0.05
    d = ratio * t
    length = 1.05 * 1.9 * E / FY * t**2 / d  # just into zone (c)
    M = 1e3
    result, route = _aisc(_case(length, _couples(M, length), b=t, h=d))
    f = route.facts
    G = 11_200.0 * KSI  # ASTM A36 (AISC 360-16 §A3, from memory)
    assert result.material.G == pytest.approx(G, rel=1e-9)
    closed = math.pi / length * math.sqrt(E * d * t**3 / 12 * G * _torsion_constant(d, t))
    assert f["M_cr"] == pytest.approx(closed, rel=0.02)
    zone, formula = _hand_f11(length, d, t, 1.0)
    assert zone == "elastic"
    assert formula > f["M_cr"]  # F11-4 above the exact value: the cap applies
    assert f["zone_F11"] == "exact-cap"
    assert f["M_n_y"] == pytest.approx(f["M_cr"], rel=1e-9)
    assert route.utilization == pytest.approx(M / (PHI_B * f["M_cr"]), rel=1e-9)
