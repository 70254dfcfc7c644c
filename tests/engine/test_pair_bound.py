"""The bound that spares the two-plane check of a pair of bow variants (engine.biaxial.pair_bound).

A two-plane case checks every pair of the planes' bow variants with N, M_y and M_z together and keeps the
worst (EN 1993-1-1 §5.3.2, from memory: each imperfection in its unfavourable direction). A pair is checked
in full only where an upper bound of its utilisation could exceed the worst found: the check at one point
with each plane's largest |M| and |V| and the plastic exponents at their least. These tests draw invented
members (I, RHS, CHS; steel and aluminium; elastic and plastic checks; shear above half the resistance,
§6.2.8; the eq. (5.9) bow) and check, against the full check of every pair (the reference: the same code's
exhaustive path), that the bound is never below it and that the pair kept is the one the exhaustive search
keeps.
"""

from __future__ import annotations

import itertools
import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import engine
from engine import analysis, biaxial
from engine.prepared import prepare

SECTIONS = ("HEB 200", "IPE 300", "SHS 100x100x5", "CHS 114.3x5")


@st.composite
def two_plane_cases(draw) -> dict:
    length = draw(st.sampled_from((1.0, 2.5, 5.0)))
    section = draw(st.sampled_from(SECTIONS))
    shear = draw(st.booleans())  # a heavy load near a support: V above half its resistance
    big = 6e5 if section.startswith(("HEB", "IPE")) else 1.5e5
    x = draw(st.sampled_from((0.05, 0.3, 0.5, 0.8))) * length
    load = {"type": "point", "P": big if shear else draw(st.floats(1e3, 4e4)), "x": x}
    preset = draw(
        st.sampled_from(
            (
                {"preset": "span", "ratio": 250, "shape": "sine"},
                {"preset": "en1993-table-5.1", "curve": "c"},
                {"preset": "en1993-eq-5.9", "curve": "c"},
            )
        )
    )
    ends = draw(st.sampled_from((("pinned", "pinned"), ("fixed", "pinned"), ("fixed", "free"))))
    return {
        "schema": 1,
        "length": length,
        "supports": {"left": ends[0], "right": ends[1]},
        "axial_force": draw(st.floats(0.0, 0.6)),  # a fraction of the squash load, set below
        "loads": [load],
        "imperfection": preset,
        "section": {"name": section},
        "axis": draw(st.sampled_from(("major", "minor"))),
        "material": {"name": draw(st.sampled_from(("S355", "EN AW-6082 T6")))},
        "check": {"method": draw(st.sampled_from(("elastic", "plastic"))), "routes": ["second-order"]},
        "second_plane": {
            "supports": {"left": "pinned", "right": "pinned"},
            "loads": [
                {"type": "uniform", "q": draw(st.floats(0.0, 8e3))},
                {"type": "couple", "C": draw(st.floats(-8e3, 8e3)), "x": 0.0},
            ],
            "imperfection": preset,
        },
    }


def _planes(case):
    """Each plane's kept variant and those not kept, as engine.analysis._solve_pair solves them."""
    prep = prepare(case)
    others = ([], [])
    r1, prep1, raw1, _ = analysis._solve_plane(case, prep, 401, True, paired=True, unkept=others[0])
    derived = case.second_plane_case()
    r2, prep2, raw2, _ = analysis._solve_plane(
        derived, prepare(derived), 401, True, paired=True, unkept=others[1]
    )
    return (r1, prep1, raw1), (r2, prep2, raw2), others


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(data=two_plane_cases())
def test_the_bound_is_never_below_the_full_check_and_the_pick_is_the_exhaustive_ones(data):
    probe = engine.solve(engine.Case.from_dict(dict(data, axial_force=0.0)))
    squash = probe.section.A * probe.material.fy
    pcr = min(float(probe.critical_loads[0]), float(probe.second_plane.critical_loads[0]))
    force = min(data["axial_force"] * squash, 0.9 * pcr)
    case = engine.Case.from_dict(dict(data, axial_force=force))
    first, second, others = _planes(case)
    if "critical" in (first[0].status, second[0].status):
        return
    options = ([(None, *first[1:])] + others[0], [(None, *second[1:])] + others[1])
    for a, b in itertools.product(*options):
        pair = ((first[0], *a[1:]), (second[0], *b[1:]))
        full = biaxial.pair_check(case, force, pair).utilization
        bound = biaxial.pair_bound(case, force, pair)
        assert bound >= full * (1.0 - 1e-12) or (math.isinf(full) and math.isinf(bound)), (a[0], b[0])
    # The pick with the bound equals the exhaustive one (every pair checked in full).
    check = biaxial.pair_check(case, force, (first, second))
    picked = biaxial.worst_pair(case, force, check, first, second, others)
    with pytest.MonkeyPatch.context() as patch:
        patch.setattr(biaxial, "pair_bound", lambda *args: math.inf)
        assert biaxial.worst_pair(case, force, check, first, second, others) == picked


def test_heavy_shear_reaches_the_reduction_so_the_bound_is_tested_there():
    """Guard of the drawn test: an HEB 200 of 1 m with 600 kN at 0.05 m has V above half V_pl,Rd (§6.2.8),
    so the exponents at the least n differ from the check's own."""
    data = {
        "schema": 1,
        "length": 1.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 3e5,
        "loads": [{"type": "point", "P": 6e5, "x": 0.05}],
        "imperfection": {"preset": "span", "ratio": 250, "shape": "sine"},
        "section": {"name": "HEB 200"},
        "axis": "major",
        "material": {"name": "S355"},
        "check": {"method": "plastic", "routes": ["second-order"]},
        "second_plane": {
            "supports": {"left": "pinned", "right": "pinned"},
            "loads": [{"type": "uniform", "q": 5e3}],
            "imperfection": {"preset": "span", "ratio": 250, "shape": "sine"},
        },
    }
    case = engine.Case.from_dict(data)
    first, second, others = _planes(case)
    check = biaxial.pair_check(case, 3e5, (first, second))
    assert float(check.shear.max()) > 0.5  # V/V_Rd above one half: ρ > 0 (§6.2.8)
    assert others[0] and others[1]  # variants in both planes: pairs to bound
    for a, b in itertools.product([(None, *first[1:])] + others[0], [(None, *second[1:])] + others[1]):
        pair = ((first[0], *a[1:]), (second[0], *b[1:]))
        assert biaxial.pair_bound(case, 3e5, pair) >= biaxial.pair_check(case, 3e5, pair).utilization
