"""A preset's bow on a member whose first mode is (nearly) a rigid tilt: the half sine between the ends.

Where an end can translate (or there are restraints or a foundation) a preset's bow takes the shape of the
first buckling mode, amplitude e0. A pinned base with its top on a soft spring (k < π²EI/L³) buckles as a
rigid tilt (N_cr = kL), so that bow was straight: no moment at all, the capacity the squash load (found
unsafe by an independent check, by up to 46 % on the second-order route). EN 1993-1-1 §5.3.2(3) (from
memory) reads the member's local bow relative to its chord, beside the sway: the same e0 as a half sine
between the ends, with the sway, is now solved as well and the worse kept.

Reference (closed form, independent of the solver): relative to its chord the member is pin-ended, and the
chord's tilt carries no moment, so a half-sine bow e0 gives M(x) = N e0 sin(πx/L)/(1 − N/N_E), N_E = π²EI/L²
(Timoshenko & Gere, Theory of Elastic Stability §1.12, from memory). The elastic stress check then gives the
capacity from N/A + M/W_el = f_y. Members invented (after the audit's cases).
"""

from __future__ import annotations

import math

import pytest
from scipy.optimize import brentq

import engine

L = 5.0


def _case(k_ratio: float, N: float, routes=("second-order",)) -> engine.Case:
    EI = _EI()  # the spring is a multiple of the member's own EI/L³
    return engine.Case.from_dict(
        {
            "schema": 1,
            "length": L,
            "supports": {"left": "pinned", "right": {"translation": k_ratio * EI / L**3, "rotation": "free"}},
            "axial_force": N,
            "imperfection": {"preset": "en1993-table-5.1"},
            "section": {"name": "HEB 200"},
            "axis": "major",
            "material": {"name": "S355"},
            "check": {"method": "elastic", "gamma_M0": 1.0, "gamma_M1": 1.0, "routes": list(routes)},
            "out_of_plane": {"restrained": True},
        }
    )


def _EI() -> float:
    """E·I of the HEB 200 S355 about its major axis, as the engine takes it."""
    data = {"schema": 1, "length": L, "supports": {"left": "pinned", "right": "pinned"}}
    data |= {"section": {"name": "HEB 200"}, "axis": "major", "material": {"name": "S355"}}
    return engine.solve(engine.Case.from_dict(data)).EI


@pytest.mark.parametrize("k_ratio", [1.0, 5.0, 9.0])
@pytest.mark.parametrize("fraction", [0.5, 0.9])
def test_a_member_tilting_on_a_spring_keeps_its_local_bow(k_ratio, fraction):
    probe = engine.solve(_case(k_ratio, 0.0))
    N = fraction * probe.critical_loads[0]
    result = engine.solve(_case(k_ratio, N))
    assert result.critical_loads[0] == pytest.approx(k_ratio * result.EI / L**2, rel=1e-9)  # N_cr = kL
    e0 = abs(result.bow.amplitude)
    assert e0 == pytest.approx(L / 250, rel=1e-12)  # Table 5.1, curve b, elastic analysis (from memory)
    N_E = math.pi**2 * result.EI / L**2
    assert result.governing.moment.magnitude == pytest.approx(N * e0 / (1 - N / N_E), rel=1e-7)
    assert result.bow.shape == "sine"


def test_the_capacity_of_the_tilting_member_is_the_local_bows():
    """k = 9EI/L³: 1900 kN by the closed form (it read 2772 kN, the squash load A·f_y)."""
    result = engine.solve(_case(9.0, 0.0))
    A, W, fy = result.section.A, result.section.W_el, result.material.fy
    N_E = math.pi**2 * result.EI / L**2

    def excess(N):
        return N / A + N * (L / 250) / (1 - N / N_E) / W - fy

    expected = brentq(excess, 1.0, 0.999 * N_E, xtol=1e-6)
    assert expected == pytest.approx(1900.2e3, rel=1e-4)  # the audit's own finite elements: 1900.2 kN
    capacity = engine.capacity(_case(9.0, 0.0))
    assert capacity.axial_force == pytest.approx(expected, rel=1e-6)


@pytest.mark.parametrize(
    "supports",
    [
        {"left": "fixed", "right": "free"},
        {"left": "fixed", "right": {"translation": 5e5, "rotation": "free"}},
        {"left": {"translation": "fixed", "rotation": 2e6}, "right": "free"},
    ],
    ids=["cantilever", "fixed-spring", "soft-base"],
)
def test_the_kept_bow_is_the_worst_of_the_directions_and_shapes_solved(supports):
    """Every variant solved is reported with its strength utilisation; the result is the largest of them."""
    data = {
        "schema": 1,
        "length": L,
        "supports": supports,
        "axial_force": 300e3,
        "loads": [{"type": "uniform", "q": 2e3}],
        "imperfection": {"preset": "en1993-table-5.1"},
        "section": {"name": "HEB 200"},
        "axis": "major",
        "material": {"name": "S355"},
        "check": {"routes": ["second-order"]},
        "out_of_plane": {"restrained": True},
    }
    result = engine.solve(engine.Case.from_dict(data))
    facts = result.bow.directions
    assert len(facts) == 4
    assert {("half sine" in f[0]) for f in facts} == {True, False}
    assert result.check.utilization == pytest.approx(max(f[1] for f in facts), rel=1e-9)
