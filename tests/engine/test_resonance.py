"""A sine bow at P = π²EI/L² on supports for which that is not a critical load: no equilibrium is lost, and
the
solver passes smoothly through the resonance of its particular solution."""

import math

import numpy as np
import pytest

import engine
from tests.support.bvp_reference import reference_solution

PE = math.pi**2  # EI = L = 1


def _case(left, right, factor):
    return {
        "schema": 1,
        "length": 1.0,
        "EI": 1.0,
        "supports": {"left": left, "right": right},
        "axial_force": factor * PE,
        "loads": [{"type": "uniform", "q": 1.0}],
        "imperfection": {"shape": "sine", "amplitude": 0.01},
    }


@pytest.mark.parametrize(
    ("left", "right"),
    [("fixed", "fixed"), ("fixed", "pinned"), ({"translation": "fixed", "rotation": 3.0}, "pinned")],
)
@pytest.mark.parametrize("factor", [1.0, 1.0 - 1e-9, 0.99, 1.02, 0.98 - 1e-9])
def test_resonance_agrees_with_solve_bvp(left, right, factor):
    """At and near P = π²EI/L² the engine matches scipy's solve_bvp (tol 1e-10) to 1e-9 of the peak."""
    data = _case(left, right, factor)
    r = engine.solve(engine.Case.from_dict(data))
    ref = reference_solution(data, np.asarray(r.x))
    for got, key in ((r.deflection, "w"), (r.moment, "M"), (r.shear, "V")):
        assert np.max(np.abs(got - ref[key])) <= 1e-9 * np.max(np.abs(ref[key])), key


def test_no_jump_at_the_edges_of_the_resonance_band():
    """Either side of the 2 % band edge both particular solutions give the same moments (1e-12 relative)."""
    for edge in (0.98, 1.02):
        a = engine.solve(engine.Case.from_dict(_case("fixed", "fixed", edge * (1 - 1e-13))))
        b = engine.solve(engine.Case.from_dict(_case("fixed", "fixed", edge * (1 + 1e-13))))
        assert np.max(np.abs(a.moment - b.moment)) <= 1e-12 * np.max(np.abs(a.moment))
