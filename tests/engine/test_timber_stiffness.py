"""Timber is analysed with E_0,05, the modulus of its code's stability checks.

EN 1995-1-1 §6.3.2 (from memory) sets a column's relative slenderness λ_rel = (λ/π)√(f_c,0,k/E_0,05), so its
resistance k_c·A·f_c,0,k tends to π²E_0,05·I/L², and k_c ≤ 1/λ_rel² (eqs. (6.25)–(6.29), from memory):
N/N_cr with E_0,05 is a lower bound of the code's utilisation, as the tool says of its "elastic bounds".
With E_mean an independent audit found a slender C24 post at 0.49 where the code's characteristic check is
1.00. Values from memory: EN 338 C24 f_c,0,k = 21 MPa, E_0,mean = 11 000 MPa, E_0,05 = 7 400 MPa; EN 14080
GL24h f_c,0,g,k = 24 MPa, E_0,g,05 = 9 600 MPa; β_c = 0.2 (solid) and 0.1 (glulam). Members invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.materials import material_from_spec


def _k_c(lam_rel: float, beta: float) -> float:
    """EN 1995-1-1 eqs. (6.27)–(6.29), from memory."""
    k = 0.5 * (1 + beta * (lam_rel - 0.3) + lam_rel**2)
    return 1 / (k + math.sqrt(k * k - lam_rel**2))


def test_the_critical_load_of_c24_is_euler_with_e_0_05():
    b, h, L = 0.045, 0.195, 3.0
    case = engine.Case.from_dict(
        {
            "length": L,
            "supports": {"left": "pinned", "right": "pinned"},
            "section": {"shape": "rectangle", "b": b, "h": h},
            "material": {"name": "C24"},
            "axis": "major",
        }
    )
    euler = math.pi**2 * 7.4e9 * b * h**3 / 12 / L**2  # Timoshenko & Gere §2.1, from memory
    assert engine.critical_loads(case).critical_loads[0] == pytest.approx(euler, rel=1e-9)
    material = material_from_spec({"name": "C24"})
    assert material.E == 7.4e9 and material.E_mean == 11.0e9
    assert material.G == pytest.approx(690e6 * 7.4 / 11.0, rel=1e-12)  # G_0,05 = G_mean E_0,05/E_mean


@pytest.mark.parametrize(
    ("name", "f_c", "E05", "beta", "ratio"),
    [("C24", 21e6, 7.4e9, 0.2, 300), ("GL24h", 24e6, 9.6e9, 0.1, 500)],
)
@pytest.mark.parametrize("length", [1.5, 2.5, 3.5, 5.0])
def test_a_post_at_the_codes_resistance_is_not_passed(name, f_c, E05, beta, ratio, length):
    """At N = k_c·A·f_c,0,k (the characteristic code utilisation 1, k_mod = γ_M = 1), with the bow a timber
    user gives (L/300 solid, L/500 glulam, EN 1995-1-1 §5.4.4, from memory), the tool's utilisation is at
    least 1; with E_mean it read 0.49 for C24 at 3.5 m."""
    b = h = 0.09
    A, i = b * h, h / math.sqrt(12)
    lam_rel = length / i / math.pi * math.sqrt(f_c / E05)
    N = _k_c(lam_rel, beta) * A * f_c
    case = engine.Case.from_dict(
        {
            "length": length,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": N,
            "section": {"shape": "rectangle", "b": b, "h": h},
            "material": {"name": name},
            "out_of_plane": {"restrained": True},
            "imperfection": {"preset": "span", "ratio": ratio},
        }
    )
    result = engine.solve(case)
    assert result.utilization >= 1.0
    assert N / result.critical_loads[0] <= result.utilization  # the elastic bound is kept


def test_a_custom_timber_without_e_0_05_is_said_to_use_the_e_given():
    case = engine.Case.from_dict(
        {
            "length": 3.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 5e3,
            "section": {"shape": "rectangle", "b": 0.045, "h": 0.195},
            "material": {"name": "spruce", "kind": "timber", "E": 11e9, "fy": 24e6, "f_c": 21e6},
            "axis": "major",
        }
    )
    caution = next(c for c in engine.solve(case).cautions if c.code == "not-a-code-check")
    assert caution.level == "danger"
    assert "No E_0,05 is given" in caution.message and "No tension strength f_t" in caution.message
    assert "shear" in caution.message
