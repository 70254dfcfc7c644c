"""The equivalent-member routes of a member with intermediate restraints (issue 16): the exact critical load
of each plane, and one equivalent member per segment between braced points.

Every number below is checked against a hand computation with its source named beside it; lengths and loads
are invented.
"""

import math

import pytest

import engine
from engine.sections import section_from_spec

L = 8.0  # [m], invented
E = 210e9  # [Pa], EN 1993-1-1 §3.2.6 (from memory)
FY = 355e6  # [Pa], S355 with t <= 16 mm (HEB 200, t_f = 15 mm), EN 10025-2 (from memory)
ALPHA = {"b": 0.34, "c": 0.49}  # imperfection factors, EN 1993-1-1 Table 6.1 (from memory)


def chi(lam: float, curve: str) -> float:
    """EN 1993-1-1 eq. (6.49): χ = 1/(Φ + √(Φ² − λ̄²)), Φ = 0.5(1 + α(λ̄ − 0.2) + λ̄²), χ <= 1."""
    phi = 0.5 * (1 + ALPHA[curve] * (lam - 0.2) + lam**2)
    return min(1.0, 1.0 / (phi + math.sqrt(phi**2 - lam**2)))


def _data(**extra):
    data = {
        "length": L,
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "supports": {"left": "pinned", "right": "pinned"},
        "restraints": [{"x": L / 2, "translation": "fixed"}],
        "out_of_plane": {"restrained": True},
        "imperfection": {"preset": "en1993-table-5.1"},
        "check": {"gamma_M0": 1.0, "gamma_M1": 1.0, "ltb": {"restrained": True}},
    }
    data.update(extra)
    return data


def test_a_column_braced_at_mid_height_about_its_weak_axis_takes_chi_of_the_half_length():
    # HEB 200 about z–z, pinned ends, braced at mid-height against deflection in that plane: the first mode
    # is two half-waves, N_cr = π²EI_z/(L/2)² (Timoshenko & Gere, Theory of Elastic Stability, ch. 2, from
    # memory), λ̄_z = √(A f_y/N_cr), curve c (EN 1993-1-1 Table 6.2: rolled I, h/b <= 1.2, t_f <= 100 mm,
    # z–z), χ_z by eq. (6.49); N/N_b,z,Rd by eq. (6.62) without moments. I_z = 2003 cm⁴ and A = 78.1 cm² in
    # the producers' tables (from memory; checked to 1 %).
    N = 300e3
    result = engine.solve(engine.Case.from_dict(_data(axis="minor", axial_force=N, loads=[])))
    weak = section_from_spec({"name": "HEB 200"}, "minor")
    assert weak.I == pytest.approx(2003e-8, rel=1e-2)
    assert weak.A == pytest.approx(78.1e-4, rel=1e-2)
    n_cr = math.pi**2 * E * weak.I / (L / 2) ** 2
    lam = math.sqrt(weak.A * FY / n_cr)
    expected = chi(lam, "c")
    en = next(r for r in result.routes if r.route == "en-member")
    assert en.enabled
    assert en.facts["N_cr_z"] == pytest.approx(n_cr, rel=1e-10)
    assert en.facts["L_cr_z"] == pytest.approx(L / 2, rel=1e-10)
    assert en.facts["chi_z"] == pytest.approx(expected, rel=1e-10)
    assert en.terms["eq-6.62"] == pytest.approx(N / (expected * weak.A * FY), rel=1e-10)
    # The whole length would give a much smaller χ: the brace is what the route reads.
    assert chi(math.sqrt(weak.A * FY / (n_cr / 4)), "c") < 0.6 * expected
    assert [seg[:2] for seg in en.facts["segments"]] == [[0.0, L / 2], [L / 2, L]]


def test_a_two_span_chord_equals_the_hand_check_of_its_governing_span():
    # Two equal spans l = 4 m (pinned ends, a rigid support at mid-length), HEB 200 about y–y, N = 400 kN,
    # a uniform load q on the first span only; out-of-plane buckling and LTB restrained (χ_z = χ_LT = 1).
    # First order, by Clapeyron's three-moment equation: M_B = −q l²/16 over the support, the first span's
    # sagging peak 49 q l²/512 at x = 7l/16, the second span linear from M_B to 0. EN 1993-1-1 Annex B:
    # Table B.3 per span between the braced points (heading of the table): span 1 has |M_s| > |M_h|,
    # α_h = M_h/M_s = −32/49, ψ = 0, uniform load: C_my = 0.95 + 0.05 α_h; span 2 linear, ψ = 0:
    # C_my = 0.6 + 0.4 ψ. Table B.1, class 1 I section: k_yy = C_my(1 + (λ̄_y − 0.2)n_y) <= C_my(1 + 0.8n_y),
    # k_zy = 0.6 k_yy. Eqs. (6.61)/(6.62) and the linear cross-section check of eq. (6.2). N_cr,y =
    # π²EI_y/l² (two pinned spans, Timoshenko & Gere ch. 2, from memory), curve b (Table 6.2, y–y).
    # W_pl,y = 642.5 cm³ (producers' tables, from memory; checked to 1 %). All from memory.
    q, N, l = 20e3, 400e3, L / 2
    loads = [{"type": "uniform", "q": q, "start": 0.0, "end": l}]
    result = engine.solve(engine.Case.from_dict(_data(axial_force=N, loads=loads)))
    s = section_from_spec({"name": "HEB 200"}, "major")
    assert s.W_pl == pytest.approx(642.5e-6, rel=1e-2)
    N_Rk, M_Rk = s.A * FY, s.W_pl * FY
    lam_y = math.sqrt(N_Rk / (math.pi**2 * E * s.I / l**2))
    chi_y = chi(lam_y, "b")
    n_y = N / (chi_y * N_Rk)

    def span(M_Ed, C_my):
        k_yy = C_my * min(1 + (lam_y - 0.2) * n_y, 1 + 0.8 * n_y)
        return {
            "eq-6.61": N / (chi_y * N_Rk) + k_yy * M_Ed / M_Rk,
            "eq-6.62": N / N_Rk + 0.6 * k_yy * M_Ed / M_Rk,
            "cross-section": N / N_Rk + M_Ed / M_Rk,
        }

    first = span(49 / 512 * q * l**2, 0.95 + 0.05 * (-32 / 49))
    second = span(q * l**2 / 16, 0.6)
    hand = max(max(first.values()), max(second.values()))
    en = next(r for r in result.routes if r.route == "en-member")
    assert en.utilization == pytest.approx(hand, rel=1e-9)
    assert en.governing == "eq-6.61"
    assert (en.facts["segment_start"], en.facts["segment_end"]) == (0.0, l)
    assert en.facts["C_my"] == pytest.approx(0.95 + 0.05 * (-32 / 49), rel=1e-9)
    assert en.facts["M_y_Ed"] == pytest.approx(49 / 512 * q * l**2, rel=1e-9)
    # The other span's own check, as the facts list it.
    assert en.facts["segments"][1][2] == pytest.approx(max(second.values()), rel=1e-9)
    # The whole member's diagram read as one (M_h = M_B between the ends, as before the restraints were
    # read) would not give the first span's factor.
    assert en.facts["C_my"] != pytest.approx(1.0)


def test_routes_are_refused_on_a_foundation_and_allowed_with_restraints():
    engine.Case.from_dict(_data(check={"routes": ["second-order", "en-member", "aisc"]}))
    with pytest.raises(engine.CaseError, match=r"check.routes: .* is not available on a foundation"):
        engine.Case.from_dict(
            _data(restraints=[], foundation=[{"start": 0.0, "end": L, "k": 1e6}], check={"routes": ["aisc"]})
        )
