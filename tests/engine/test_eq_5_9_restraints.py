"""The eq. (5.9) bow of EN 1993-1-1 §5.3.2(11) on a member with intermediate restraints or a foundation: the
first mode scaled by e0·N_cr/max(EI|η''_cr|), the maximum taken along every segment of the exact mode.

Every number below is checked against a hand computation with its source named beside it; lengths, springs
and moduli are invented.
"""

import math

import numpy as np
import pytest

import engine
from engine.sections import section_from_spec

L = 8.0  # [m], invented
E = 210e9  # [Pa], EN 1993-1-1 §3.2.6 (from memory)
FY = 355e6  # [Pa], S355 with t <= 16 mm (HEB 200, t_f = 15 mm), EN 10025-2 (from memory)
ALPHA_C = 0.49  # curve c, EN 1993-1-1 Table 6.1 (from memory); HEB 200 about z–z: Table 6.2
G1 = 1.1  # γ_M1, invented (not 1, so that eq. (5.10)'s last factor counts)
WEAK = section_from_spec({"name": "HEB 200"}, "minor")


def chi(lam: float) -> float:
    """EN 1993-1-1 eq. (6.49), curve c."""
    phi = 0.5 * (1 + ALPHA_C * (lam - 0.2) + lam**2)
    return min(1.0, 1.0 / (phi + math.sqrt(phi**2 - lam**2)))


def e0_hand(n_cr: float) -> tuple:
    """(e0, λ̄, χ) of EN 1993-1-1 eq. (5.10) (from memory) with the elastic M_Rk = W_el f_y:
    e0 = α(λ̄ − 0.2) M_Rk/N_Rk · (1 − χλ̄²/γ_M1)/(1 − χλ̄²)."""
    N_Rk, M_Rk = WEAK.A * FY, WEAK.W_el * FY
    lam = math.sqrt(N_Rk / n_cr)
    c = chi(lam)
    return ALPHA_C * (lam - 0.2) * M_Rk / N_Rk * (1 - c * lam**2 / G1) / (1 - c * lam**2), lam, c


def _data(**extra):
    data = {
        "length": L,
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "axis": "minor",
        "supports": {"left": "pinned", "right": "pinned"},
        "loads": [],
        "out_of_plane": {"restrained": True},
        "imperfection": {"preset": "en1993-eq-5.9"},
        "check": {"routes": ["second-order"], "method": "elastic", "gamma_M0": 1.0, "gamma_M1": G1},
    }
    data.update(extra)
    return data


def test_prismatic_pinned_member_through_the_segmented_mode_is_the_sine_bow_of_eq_5_10():
    # A spring of 1e-6 N/m at x = 3 m restrains nothing measurable (N_cr moves by ~1e-12) but sends the
    # member through the segmented mode. For the pinned prismatic member the first mode is sin(πx/L) and
    # N_cr/(EI|η''|max) = (π²EI/L²)/(EI π²/L²) = 1: the bow is e0 sin(πx/L) with e0 of eq. (5.10).
    case = engine.Case.from_dict(_data(restraints=[{"x": 3.0, "translation": 1e-6}], axial_force=2e5))
    assert hasattr(engine.critical_loads(case, 1), "moment_peak")
    result = engine.solve(case)
    e0, lam, _ = e0_hand(math.pi**2 * E * WEAK.I / L**2)
    assert lam == pytest.approx(2.067, abs=1e-3)
    assert result.bow.shape == "mode"
    assert abs(result.bow.amplitude) == pytest.approx(e0, rel=1e-9)
    sine = abs(result.bow.amplitude) * np.sin(np.pi * result.x / L)
    assert np.abs(np.abs(result.initial_bow) - sine).max() <= 1e-9 * e0


def test_a_column_braced_at_mid_height_takes_e0_of_the_half_length():
    # Braced at mid-height: the mode is sin(2πx/L), N_cr = 4π²EI/L² (Timoshenko & Gere ch. 2, from memory),
    # EI|η''|max = EI(2π/L)² = N_cr, so the bow's amplitude is e0 of eq. (5.10) with λ̄ of the half length.
    case = engine.Case.from_dict(_data(restraints=[{"x": L / 2, "translation": "fixed"}], axial_force=2e5))
    e0, _, _ = e0_hand(4 * math.pi**2 * E * WEAK.I / L**2)
    assert abs(engine.solve(case).bow.amplitude) == pytest.approx(e0, rel=1e-9)


@pytest.mark.parametrize(
    "extra",
    [
        {"restraints": [{"x": 3.0, "translation": "fixed"}]},
        {"restraints": [{"x": 2.5, "translation": 4e5}, {"x": 5.0, "rotation": 2e5}]},
        {"foundation": [{"start": 0.0, "end": L, "k": 2e5}]},
        {
            "foundation": [{"start": 2.0, "end": 6.0, "k": 1e6}],
            "supports": {"left": "fixed", "right": "pinned"},
        },
    ],
)
def test_the_eq_5_9_bow_reproduces_chi_n_rk_on_restrained_and_bedded_members(extra):
    # EN 1993-1-1 §5.3.2(11): with the eq. (5.9) bow the member check N/(N_Rk/γ_M1) + M/(M_Rk/γ_M1) reaches
    # 1 exactly at N = χ N_Rk/γ_M1, χ from λ̄ = √(N_Rk/N_cr) by eq. (6.49) (the Ayrton–Perry identity behind
    # eq. (5.10); engine.codes.eq_5_9_amplitude). It holds for any first mode whose bow is amplified by
    # 1/(1 − N/N_cr) and whose largest moment EI|η''| is the one the amplitude is scaled by.
    case = engine.Case.from_dict(_data(**extra))
    n_cr = engine.critical_loads(case, 1).critical_loads[0]
    _, lam, c = e0_hand(n_cr)
    N = c * WEAK.A * FY / G1
    result = engine.solve(engine.Case.from_dict(_data(**extra, axial_force=N)))
    assert result.check.utilization == pytest.approx(1.0, rel=1e-9)
    assert result.check.kind == "linear N–M, eq. (5.9) route"
    # A little less force passes, a little more fails.
    below = engine.solve(engine.Case.from_dict(_data(**extra, axial_force=0.99 * N)))
    assert below.check.utilization < 1.0
