"""In-plane buckling on a first mode that sways, counted by the second-order route (engine.sway_buckling).

A pinned member whose top rests on a soft translational spring buckles as a rigid tilt: the bow carries almost
no curvature, so the cross-section check on the second-order forces never reached 1 below the critical load.
An independent audit found an HEB 200 (minor axis, 3 m, spring 200 kN/m) passing at 0.97·Pcr1 with 0.35 and
its capacity read as Pcr1 = 600 kN. EN 1993-1-1 §5.2.2(8) (from memory) allows the equivalent member with
the global mode's buckling length; the references here are the closed forms:

- Pcr1 of a rigid bar pinned at the base on a spring k at the top: k·L (statics of the tilted bar), below the
  Euler load π²EI/L² here;
- N_b,Rd = χ·A·f_y/γ_M1, eqs. (6.47)/(6.49) of EN 1993-1-1 with α of Table 6.1 (from memory), written out
  below apart from the engine's own χ;
- on a foundation, Pcr1 from the engine's critical load (checked elsewhere against Hetényi's closed form),
  the same χ·A·f_y.
Every member is invented.
"""

from __future__ import annotations

import math

import pytest

import engine

ALPHA = {"a0": 0.13, "a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76}  # EN 1993-1-1 Table 6.1 (from memory)


def _chi(lam: float, curve: str) -> float:
    """EN 1993-1-1 eq. (6.49) (from memory), written out apart from engine.codes."""
    phi = 0.5 * (1.0 + ALPHA[curve] * (lam - 0.2) + lam**2)
    return min(1.0, 1.0 / (phi + math.sqrt(phi**2 - lam**2)))


def _post(**changes) -> dict:
    data = {
        "schema": 1,
        "length": 3.0,
        "axial_force": 100e3,
        "loads": [],
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "axis": "minor",
        "imperfection": {"preset": "en1993-table-5.1"},
        "out_of_plane": {"restrained": True},
        "supports": {"left": "pinned", "right": {"translation": 2e5, "rotation": "free"}},
        "check": {"routes": ["second-order"]},
    }
    data.update(changes)
    return data


def _by_hand(result, pcr: float, curve: str = "c", gamma_M1: float = 1.0) -> float:
    A, fy = result.section.A, result.material.fy
    return _chi(math.sqrt(A * fy / pcr), curve) * A * fy / gamma_M1


@pytest.mark.parametrize(
    "changes",
    [
        {},  # one section
        {"steps": [{"x": 1.5, "section": {"name": "HEB 220"}}]},  # stepped: the weaker HEB 200 governs
        {"check": {"routes": ["second-order"], "gamma_M1": 1.1}},
    ],
)
def test_a_post_on_a_soft_spring_is_checked_as_an_equivalent_member_on_its_tilting_mode(changes):
    data = _post(**changes)
    gamma = data["check"].get("gamma_M1", 1.0)
    probe = engine.solve(engine.Case.from_dict(data))
    pcr = float(probe.critical_loads[0])
    assert pcr == pytest.approx(2e5 * 3.0, rel=1e-9)  # the rigid tilt: k·L
    n_b = _by_hand(probe, pcr, "c", gamma)  # HEB 200 about z–z: curve c (Table 6.2, from memory)
    assert n_b == pytest.approx(480.0e3 / gamma, rel=2e-3)  # the audit's χ·A·f_y
    found = engine.capacity(engine.Case.from_dict(data))
    assert found.axial_force == pytest.approx(n_b, rel=1e-9)
    assert found.check == "sway-buckling"
    near = engine.solve(engine.Case.from_dict(dict(data, axial_force=0.97 * pcr)))
    assert near.utilization == pytest.approx(0.97 * pcr / n_b, rel=1e-9)  # fails: 1.21, not 0.35
    codes = {c.code: c for c in near.cautions}
    assert codes["sway-buckling-counted"].level == "warning"  # the spring's force is not checked
    assert "spring" in codes["sway-buckling-counted"].message


def test_on_a_foundation_with_a_free_end():
    data = _post(
        supports={"left": "pinned", "right": "free"}, foundation=[{"start": 0.0, "end": 3.0, "k": 6e4}]
    )
    probe = engine.solve(engine.Case.from_dict(data))
    n_b = _by_hand(probe, float(probe.critical_loads[0]))
    assert n_b == pytest.approx(158.8e3, rel=1e-3)  # the audit's figure (175.8 kN was returned)
    assert engine.capacity(engine.Case.from_dict(data)).axial_force == pytest.approx(n_b, rel=1e-9)


def test_a_member_held_at_both_ends_has_no_sway_term():
    """Pinned at both ends the first mode has curvature, the bow sees it: nothing is added."""
    data = _post(supports={"left": "pinned", "right": "pinned"})
    result = engine.solve(engine.Case.from_dict(data))
    second = next(r for r in result.routes if r.route == "second-order")
    assert "sway-buckling" not in second.terms


def test_the_term_never_lowers_a_route_and_is_n_over_n_b_rd_wherever_a_member_can_sway():
    """Every support set that lets an end translate, both axes: the route's utilisation is at least
    N/N_b,Rd with N_cr = Pcr1 (eqs. (6.47)/(6.49) written out here, curve of Table 6.2 about the axis
    analysed: HEB 200 b about y–y, c about z–z, from memory)."""
    for axis, curve in (("major", "b"), ("minor", "c")):
        for right in ("free", "guided", {"translation": 5e5, "rotation": "free"}):
            for left in ("fixed", "pinned"):
                if left == "pinned" and right in ("free", "guided"):
                    continue  # a mechanism
                data = _post(axis=axis, supports={"left": left, "right": right}, axial_force=150e3)
                data["loads"] = [{"type": "uniform", "q": 2e3}]
                result = engine.solve(engine.Case.from_dict(data))
                second = next(r for r in result.routes if r.route == "second-order")
                expected = 150e3 / _by_hand(result, float(result.critical_loads[0]), curve)
                assert second.terms["sway-buckling"] == pytest.approx(expected, rel=1e-9), (axis, left, right)
                assert second.utilization >= expected


def test_a_hinge_held_by_a_spring_kinks_without_curvature_and_is_checked_the_same_way():
    """Pinned ends, a hinge at mid-span on a 400 kN/m spring: two rigid bars kinking at the hinge,
    Pcr1 = k·L/4 (statics of the kinked bars); no end moves, yet the bow carries no curvature (a self-audit
    of this stop)."""
    data = _post(
        length=6.0,
        supports={"left": "pinned", "right": "pinned"},
        restraints=[{"x": 3.0, "translation": 4e5, "hinge": True}],
    )
    probe = engine.solve(engine.Case.from_dict(data))
    pcr = float(probe.critical_loads[0])
    assert pcr == pytest.approx(4e5 * 6.0 / 4.0, rel=1e-9)
    n_b = _by_hand(probe, pcr, "c")
    assert engine.capacity(engine.Case.from_dict(data)).axial_force == pytest.approx(n_b, rel=1e-9)
    warning = next(
        c for c in engine.solve(engine.Case.from_dict(data)).cautions if c.code == "sway-buckling-counted"
    )
    assert warning.level == "warning"  # the spring holds it: its force is not checked


def test_a_custom_steel_section_takes_curve_d():
    """The HEB 200's minor-axis properties typed in as a custom section: curve d (the lowest; a custom
    section's curve is not known), where the catalogue section takes c."""
    from engine.sections import section_from_spec

    minor = section_from_spec({"name": "HEB 200"}, "minor")
    custom = {"shape": "custom", "A": minor.A, "I": minor.I, "W_el": minor.W_el, "W_pl": minor.W_pl}
    data = _post(section=custom, imperfection={"preset": "en1993-table-5.1", "curve": "c"})
    data["check"] = {}  # every route: the equivalent-member routes are not applied to a custom section
    probe = engine.solve(engine.Case.from_dict(data))
    pcr = float(probe.critical_loads[0])
    n_b = _by_hand(probe, pcr, "d")
    assert engine.capacity(engine.Case.from_dict(data)).axial_force == pytest.approx(n_b, rel=1e-9)


def test_a_member_stepped_in_section_is_held_to_chi_a_fy_with_the_plastic_check():
    """No equivalent-member route applies to a stepped member, and the bow of Table 5.1 with the plastic check
    alone overshot χ·A·f_y by up to 2.5 % (an independent audit: 1479.5 kN for 1443.5 kN, with a step that
    changes nothing). The second-order route now counts each segment's N/N_b,Rd with N_cr = Pcr1 too."""
    data = _post(
        length=4.0,
        supports={"left": "pinned", "right": "pinned"},
        steps=[{"x": 2.0, "section": {"name": "HEB 200"}}],  # the same section: a step that changes nothing
        check={"routes": ["second-order", "en-member", "aisc"], "method": "plastic"},
    )
    probe = engine.solve(engine.Case.from_dict(data))
    n_b = _by_hand(probe, float(probe.critical_loads[0]), "c")
    found = engine.capacity(engine.Case.from_dict(data))
    assert found.axial_force == pytest.approx(n_b, rel=1e-9)
    uniform = dict(data)
    del uniform["steps"]
    assert engine.capacity(engine.Case.from_dict(uniform)).axial_force == pytest.approx(n_b, rel=1e-9)
    caution = next(
        c for c in engine.solve(engine.Case.from_dict(data)).cautions if c.code == "sway-buckling-counted"
    )
    assert caution.level == "info" and "stepped in section" in caution.message


def test_a_class_4_segment_is_the_one_reported_when_the_segments_tie():
    """Out-of-plane buckling gives every segment the same utilisation; on that tie the stocky first segment
    was reported (class 3, in-plane 0.196) and the class 4 segment's caution went missing (an independent
    audit: its in-plane utilisation is 0.409). The tie now goes to the larger in-plane utilisation."""
    stocky = {"shape": "welded_i", "h": 0.3, "b": 0.3, "tw": 0.010, "tf": 0.016}
    slender = {"shape": "welded_i", "h": 0.3, "b": 0.3, "tw": 0.004, "tf": 0.010}
    data = {
        "schema": 1,
        "length": 5.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 600e3,
        "loads": [{"type": "uniform", "q": 5e3}],
        "axis": "major",
        "material": {"name": "S355"},
        "imperfection": {"preset": "en1993-table-5.1"},
        "check": {"method": "elastic"},
    }
    for first, second in ((stocky, slender), (slender, stocky)):
        result = engine.solve(
            engine.Case.from_dict(dict(data, section=first, steps=[{"x": 2.5, "section": second}]))
        )
        assert result.check.section_class.klass == 4
        assert result.check.in_plane_utilization == pytest.approx(0.409, abs=2e-3)
        assert "section-class-4-effective" in {c.code for c in result.cautions}
