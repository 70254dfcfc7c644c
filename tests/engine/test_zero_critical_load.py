"""A spring so soft that the first critical load underflows to 0 N: compression is refused naming the
supports; no axial force or tension still solves (found by the 10 000-case fuzz test in CI, 2026-12-03:
``ZeroDivisionError`` in ``engine.raw.critical_index``). Invented case."""

from __future__ import annotations

import math

import pytest

import engine

CASE = {
    "schema": 1,
    "title": "Invented near-mechanism",
    "length": 3.0,
    "EI": 2.0e4,
    "supports": {
        "left": {"translation": 1e-194, "rotation": "free"},
        "right": {"translation": 1.0e6, "rotation": "free"},
    },
    "axial_force": 0.0,
    "loads": [{"type": "uniform", "q": 1.0e3}],
    "imperfection": {"shape": "none", "amplitude": 0.0},
}
# pi^2 EI / L^2 (Euler, pinned-pinned: the second critical load of this sway member); the fuzzer's force.
EULER = math.pi**2 * 2.0e4 / 3.0**2


def _case(P):
    return engine.Case.from_dict({**CASE, "axial_force": P})


@pytest.mark.filterwarnings("ignore::RuntimeWarning")
def test_the_first_critical_load_is_zero():
    result = engine.solve(_case(0.0), stations=11)
    assert result.critical_loads[0] == 0.0
    assert result.critical_loads[1] == pytest.approx(EULER, rel=1e-9)


@pytest.mark.filterwarnings("ignore::RuntimeWarning")
@pytest.mark.parametrize("P", [EULER, 1.0e4, 1e-6])
def test_compression_is_refused_naming_the_supports(P):
    with pytest.raises(
        engine.CaseError, match=r"^supports: the ends leave the member a first critical load of 0 N"
    ):
        engine.solve(_case(P), stations=11)


@pytest.mark.filterwarnings("ignore::RuntimeWarning")
@pytest.mark.parametrize("P", [0.0, -5.0e3])
def test_no_axial_force_or_tension_still_solves(P):
    result = engine.solve(_case(P), stations=11)
    assert result.status == "stable"
