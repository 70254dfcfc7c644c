"""Points where the member's stiffness chain is cut (ends, restraints, steps, foundation ends) must be the
same point or at least MIN_APART·L apart.

A piece h long enters the critical-load count with a stiffness of order EI/h³; an independent audit found
two 1 N/m springs 10 µm apart on a 5 m member raising Pcr1 from 1661 kN to 3512 kN ("stable" above the true
critical load). Reference: Euler's π²EI/L² for a pinned member (springs of 1e-3 N/m change it by less than
1e-9 relative), Timoshenko & Gere (1961) §2.1, from memory.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.restraints import MIN_APART

_BASE = {"length": 5.0, "supports": {"left": "pinned", "right": "pinned"}, "EI": 1e6, "axial_force": 0.0}
_EULER = math.pi**2 * 1e6 / 25.0


@pytest.mark.parametrize(
    "extra",
    [
        {"restraints": [{"x": 2.0, "translation": 1e-3}, {"x": 2.00001, "translation": 1e-3}]},
        {"restraints": [{"x": 1e-5, "translation": 1e-3}]},
        {"steps": [{"x": 1.0, "EI": 2e6}, {"x": 1.00001, "EI": 1e6}]},
        {
            "restraints": [{"x": 2.0, "translation": 1e-3}],
            "foundation": [{"start": 2.001, "end": 3.0, "k": 1.0}],
        },
        # below the old "same point" tolerance of 1e-9·L: the solver kept a piece 1e-11 m long (an audit: a
        # rotational spring and a step that far apart raised Pcr1 4.7 times, "stable" above the true one)
        {"restraints": [{"x": 2.42, "rotation": 1e6}], "steps": [{"x": 2.42 + 1e-11, "EI": 1e7}]},
        {"restraints": [{"x": 2.0, "translation": 1e-3}], "steps": [{"x": 2.0 + 4e-9, "EI": 2e6}]},
    ],
    ids=[
        "two-springs",
        "spring-at-end",
        "two-steps",
        "foundation-end",
        "spring-step-1e-11",
        "spring-step-4e-9",
    ],
)
def test_cuts_closer_than_the_limit_are_refused(extra):
    with pytest.raises(engine.CaseError, match="must be the same point or at least"):
        engine.Case.from_dict({**_BASE, **extra})


@pytest.mark.parametrize("gap", [1.01 * MIN_APART * 5.0, 2e-2, 5e-2])
def test_cuts_at_the_limit_keep_the_critical_load_exact(gap):
    case = engine.Case.from_dict(
        {**_BASE, "restraints": [{"x": 2.0, "translation": 1e-3}, {"x": 2.0 + gap, "translation": 1e-3}]}
    )
    assert engine.critical_loads(case).critical_loads[0] == pytest.approx(_EULER, rel=1e-6)


def test_a_foundation_starting_at_a_restraint_is_one_point():
    case = engine.Case.from_dict(
        {
            **_BASE,
            "restraints": [{"x": 2.0, "translation": 1e-3}],
            "foundation": [{"start": 2.0, "end": 3.0, "k": 1e-3}],
        }
    )
    assert engine.critical_loads(case).critical_loads[0] == pytest.approx(_EULER, rel=1e-6)
