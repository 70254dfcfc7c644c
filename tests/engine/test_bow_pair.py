"""A two-plane member's bows: the pair of directions worst for the check of both planes together.

EN 1993-1-1 §5.3.2 (from memory) takes each imperfection in its unfavourable direction. With both planes'
directions automatic each plane used to keep the direction worse for its own one-plane check, and the check
of N, M_y and M_z together (§6.2.1(7), the elastic stress) ran on that pair alone: an independent check found
an aluminium HEB 200 at 0.303 where the worst pair gives 0.370 (18 % low). The reference here is built
apart from the two-plane code: each plane solved as a one-plane case with its bow's direction fixed, the
linear stress N/A + |M_y|/W_el,y + |M_z|/W_el,z over f on a fine grid, the worst of the four pairs. The member
and its loads are invented (after the audit's case).
"""

from __future__ import annotations

import dataclasses
import itertools

import numpy as np
import pytest

import engine
from engine.sections import section_from_spec

BOW = {"preset": "span", "ratio": 250, "shape": "sine"}


def _case(material: str, method: str) -> dict:
    return {
        "schema": 1,
        "length": 5.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 150e3,
        "loads": [{"type": "point", "P": 20e3, "x": 3.5}],
        "imperfection": dict(BOW, direction="load"),
        "section": {"name": "HEB 200"},
        "axis": "major",
        "material": {"name": material},
        "check": {"method": method, "gamma_M0": 1.0, "gamma_M1": 1.0, "routes": ["second-order"]},
        "second_plane": {
            "supports": {"left": "pinned", "right": "pinned"},
            "loads": [{"type": "couple", "C": 6.0e3, "x": 0.0}, {"type": "couple", "C": 5.85e3, "x": 5.0}],
            "imperfection": dict(BOW, direction="load"),
        },
    }


def _moments(data, way_y, way_z, x):
    """|M_y| and |M_z| on the grid x from two one-plane solves, each bow pointing the fixed way."""
    first = {k: v for k, v in data.items() if k != "second_plane"}
    first["imperfection"] = dict(BOW, direction=way_y)
    second = dict(
        first, axis="minor", loads=data["second_plane"]["loads"], imperfection=dict(BOW, direction=way_z)
    )
    out = []
    for plane in (first, second):
        result = engine.solve(engine.Case.from_dict(plane))
        out.append(np.abs(np.interp(x, np.asarray(result.x), np.asarray(result.moment))))
    return out


def test_the_aluminium_member_takes_the_worst_pair_of_directions():
    data = _case("EN AW-6082 T6", "elastic")
    result = engine.solve(engine.Case.from_dict(data))
    y = section_from_spec({"name": "HEB 200"}, "major")
    z = section_from_spec({"name": "HEB 200"}, "minor")
    f = result.material.fy
    x = np.union1d(np.linspace(0.0, 5.0, 20001), [3.5])
    worst = 0.0
    for way_y, way_z in itertools.product(("positive", "negative"), repeat=2):
        m_y, m_z = _moments(data, way_y, way_z, x)
        worst = max(worst, float(np.max(150e3 / y.A + m_y / y.W_el + m_z / z.W_el)) / f)
    assert worst == pytest.approx(0.3703, abs=5e-4)  # the audit's independent finite elements: 0.3703
    assert result.check.utilization == pytest.approx(worst, rel=1e-4)
    assert "both planes together" in result.second_plane.bow.direction_governing


def test_the_pair_is_never_better_than_any_fixed_pair():
    """Steel, plastic check: the two-plane check with automatic directions is at least each of the four
    fixed pairs' (the same code run with the directions fixed)."""
    data = _case("S355", "plastic")
    data["axial_force"], data["loads"] = 500e3, [{"type": "point", "P": 60e3, "x": 3.5}]
    data["second_plane"]["loads"] = [
        {"type": "couple", "C": 20e3, "x": 0.0},
        {"type": "couple", "C": 19.5e3, "x": 5.0},
    ]
    automatic = engine.solve(engine.Case.from_dict(data)).check.utilization
    fixed = []
    for way_y, way_z in itertools.product(("positive", "negative"), repeat=2):
        case = engine.Case.from_dict(data)
        plane = dataclasses.replace(
            case.second_plane,
            imperfection=dataclasses.replace(case.second_plane.imperfection, direction=way_z),
        )
        case = dataclasses.replace(
            case, imperfection=dataclasses.replace(case.imperfection, direction=way_y), second_plane=plane
        )
        fixed.append(engine.solve(case).check.utilization)
    assert automatic == pytest.approx(max(fixed), rel=1e-9)


@pytest.mark.parametrize("direction", ["positive", "negative"])
@pytest.mark.parametrize("x_z", [0.6, 2.5])
def test_a_fixed_direction_still_pairs_the_bow_shapes_of_both_planes(direction, x_z):
    """Directions the case fixes: each plane's shapes in that direction (first mode, half sine with the sway
    and against it) are paired for the check of both planes together, the worst kept; the shape chosen on
    the plane's own check alone was up to 0.9 % low (found by an independent audit). Checked here against
    every pair of the same-direction variants, each solved on its own and checked by the same two-plane
    check (a regression guard: the pieces are the engine's, the pairing is what is tested)."""
    from engine.biaxial import pair_check
    from engine.prepared import prepare
    from engine.raw import raw as solve_raw
    from tests.engine.test_bow_half_sine import spring_post

    bow = {"preset": "en1993-table-5.1", "direction": direction}
    plane = {"supports": {"left": "pinned", "right": "pinned"}, "imperfection": bow}
    plane["loads"] = [{"type": "point", "P": 15e3, "x": x_z}]
    case = engine.Case.from_dict(spring_post(900e3, bow, second_plane=plane))
    result = engine.solve(case)
    first, second = prepare(case), prepare(case.second_plane_case())
    P, worst = case.axial_force, 0.0
    for k1 in ("forward", "half_sine", "half_sine_opposed"):
        p1 = first if k1 == "forward" else first.variant(k1)
        r1 = solve_raw(p1, 401, P)
        r2 = solve_raw(second, 401, P)
        pair = pair_check(case, P, ((result, p1, r1), (result.second_plane, second, r2)))
        worst = max(worst, pair.utilization)
    assert result.check.utilization == pytest.approx(worst, rel=1e-9)
