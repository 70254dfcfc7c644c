"""A member stepped in section keeps EN 1993-1-1 §6.3.1.4's torsional buckling term.

An independent audit (stop 35): an invented HEB 300 in S355, 4 m pinned, 4000 kN, out-of-plane buckling length
1.0 m (so twist is held only at the ends) read 0.970 with the term governing, and 0.904 once "stepped" to the
same HEB 300 at 2 m: the stepped branch of the routes left the term out (capacity 7 % high). The term now
takes each segment's section along the whole member and keeps the smallest N_b,T,Rd. By hand:
N_cr,T = (G·I_t + π²E·I_w/L_T²)/i0², i0² = (I_y + I_z)/A (EN 1993-1-1 §6.3.1.4 with the usual closed form,
Timoshenko & Gere ch. 5; from memory), χ_T by eq. (6.49) on curve c (Table 6.2 about z–z for a rolled H,
h/b ≤ 1.2, t_f ≤ 100 mm), with the engine's I_t and I_w (without the fillets' share).
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.ltb_member import TORSION_FACTORS
from engine.sections import section_from_spec


def _case(steps=None, N=4000e3) -> engine.Case:
    data = {
        "schema": 1,
        "length": 4.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": N,
        "loads": [],
        "section": {"name": "HEB 300"},
        "material": {"name": "S355"},
        "axis": "major",
        "imperfection": {"preset": "en1993-table-5.1", "curve": "auto"},
        "out_of_plane": {"buckling_length": 1.0},
        "check": {"routes": ["second-order"]},
    }
    if steps:
        data["steps"] = steps
    return engine.Case.from_dict(data)


def _chi_c(lam: float) -> float:
    phi = 0.5 * (1 + 0.49 * (lam - 0.2) + lam**2)
    return min(1.0, 1 / (phi + math.sqrt(phi**2 - lam**2)))


@pytest.mark.parametrize("step", [None, "HEB 300", "HEB 320"])
def test_the_torsional_term_of_a_stepped_member(step):
    """Unstepped, stepped to itself or to a stronger HEB 320: the term is the HEB 300's N/N_b,T,Rd by hand."""
    steps = None if step is None else [{"x": 2.0, "section": {"name": step}}]
    result = engine.solve(_case(steps))
    (route,) = [r for r in result.routes if r.route == "second-order"]
    facts = route.facts
    section, material = result.section, result.material
    factor = TORSION_FACTORS["rolled_i"]  # the engine's I_t and I_w without the fillets' share
    I_t, I_w = section.torsion.I_t / factor, section.torsion.I_w / factor
    I_z = section_from_spec({"name": "HEB 300"}, "minor").I
    i0_sq = (section.I + I_z) / section.A
    N_cr_T = (material.G * I_t + math.pi**2 * material.E * I_w / 4.0**2) / i0_sq
    assert facts["N_cr_T"] == pytest.approx(N_cr_T, rel=1e-9)
    lam = math.sqrt(section.A * material.fy / N_cr_T)
    N_b = _chi_c(lam) * section.A * material.fy / result.case.check.gamma_M1
    assert route.terms["torsional-buckling"] == pytest.approx(4000e3 / N_b, rel=1e-9)
    assert route.governing == "torsional-buckling"
