"""C_m of EN 1993-1-1 Annex B Table B.3 for a diagram of several point loads.

Table B.3 has a row for one concentrated load (C_m = 0.90 + 0.10·α_h, 0.9 on a pin-ended member) and one for a
uniform load (0.95 + 0.05·α_h); several point loads fit neither. Annex A's general term π²EIδ/(ML²) − 1
(Table A.2) measures how strongly a diagram is amplified: one central load −0.178, a uniform load +0.028,
loads at the third points +0.051 (computed below from the closed-form first-order δ and M). So third-point
loads need at least the uniform row, and loads near the ends approach uniform moment (ψ = 1, C_m = 1): the
concentrated row's 0.9 was unsafe (eq. (6.61) 3 % low, found by an independent check). strutscope takes the
table's largest value, C_m = 1, for two or more point loads. Members invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.diagram import annex_a_factor, describe


def _case(loads) -> dict:
    return {
        "schema": 1,
        "length": 6.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 800e3,
        "loads": loads,
        "section": {"name": "HEB 200"},
        "axis": "major",
        "material": {"name": "S355"},
        "out_of_plane": {"restrained": True},
    }


def _c_my(loads) -> float:
    result = engine.solve(engine.Case.from_dict(_case(loads)))
    (route,) = [r for r in result.routes if r.route == "en-member"]
    return route.facts["C_my"]


def test_amplification_terms_of_the_three_diagrams():
    """π²EIδ/(ML²) − 1 for a pin-ended member, closed forms (first-order δ and M, from memory): central load
    PL³/48EI and PL/4; uniform 5qL⁴/384EI and qL²/8; two loads P at the third points 23PL³/648EI and PL/3."""
    assert math.pi**2 * (1 / 48) / (1 / 4) - 1 == pytest.approx(-0.178, abs=1e-3)
    assert math.pi**2 * (5 / 384) / (1 / 8) - 1 == pytest.approx(0.028, abs=1e-3)
    assert math.pi**2 * (23 / 648) / (1 / 3) - 1 == pytest.approx(0.051, abs=1e-3)


def test_one_point_load_keeps_the_concentrated_row():
    assert _c_my([{"type": "point", "P": 40e3, "x": 3.0}]) == pytest.approx(0.90, abs=1e-12)


@pytest.mark.parametrize(
    "positions",
    [(2.0, 4.0), (1.0, 5.0), (1.0, 2.0, 3.0, 4.0, 5.0), (2.0, 4.5)],
    ids=["thirds", "ends", "five", "uneven"],
)
def test_several_point_loads_take_the_largest_value_of_the_table(positions):
    loads = [{"type": "point", "P": 20e3, "x": x} for x in positions]
    assert _c_my(loads) == pytest.approx(1.0, abs=1e-12)


def test_annex_a_reads_several_point_loads_by_its_general_formula():
    """Third-point loads on a pin-ended member: C_my,0 = 1 + 0.051·N/N_cr (Table A.2's general formula)."""
    import numpy as np

    L, P, EI = 6.0, 1.0, 1.0
    x = np.linspace(0.0, L, 6001)
    a = L / 3
    M = np.where(x < a, P * x, np.where(x > L - a, P * (L - x), P * a))
    delta = 23 * P * L**3 / (648 * EI)
    d = describe(
        x=x,
        moment=M,
        deflection=np.full_like(x, delta),
        shear=np.zeros_like(x),
        loads=[_Point(a), _Point(L - a)],
        length=L,
        sway=False,
    )
    assert d.form == "points"
    N_cr = math.pi**2 * EI / L**2
    assert annex_a_factor(d, 0.5 * N_cr, N_cr) == pytest.approx(
        1 + 0.5 * (math.pi**2 * 23 / 648 * 3 - 1), rel=1e-9
    )


class _Point:
    type = "point"
    P = 1.0

    def __init__(self, x):
        self.x = x
