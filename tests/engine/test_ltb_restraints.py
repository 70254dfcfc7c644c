"""Intermediate lateral and torsional restraints in the lateral-torsional buckling check (issues 15 and 16):
``critical_moment(restraints=...)``, the restraint key ``twist``, and the segments between brace points of the
tabulated M_cr and AISC 360-16 §F2.

Sources are named beside each check; "from memory" where recalled. Every member here is invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.mcr import critical_moment
from engine.restraints import Restraint

# An invented doubly symmetric member: EI_z [N·m²], GI_t [N·m²], EI_w [N·m⁴], L [m].
EIZ, GIT, EIW, L = 1.27e6, 1.6e5, 2.5e4, 8.0
UNIFORM = ([0.0, L], [1.0, 1.0])


def closed_form(length: float) -> float:
    """Uniform moment, fork ends, warping free: M_cr = (π/L)·√(EI_z·GI_t·(1 + π²EI_w/(L²GI_t)))
    (Timoshenko & Gere 1961 ch. 6, from memory)."""
    return math.pi / length * math.sqrt(EIZ * GIT * (1.0 + math.pi**2 * EIW / (length**2 * GIT)))


def _mcr(restraints=(), x=UNIFORM[0], M=UNIFORM[1], **kw) -> float:
    return critical_moment(x, M, EI_z=EIZ, GI_t=GIT, EI_w=EIW, length=L, restraints=restraints, **kw).M_cr


BRACE = {"lateral": "fixed", "twist": "fixed"}


def test_a_brace_at_mid_span_gives_the_half_span_closed_form():
    """Uniform moment, lateral and twist held at L/2: the two halves buckle in the antisymmetric mode, which
    is the fork-ended half span's own mode (v'' = φ'' = 0 at the brace: no continuity moment), so M_cr is
    Timoshenko & Gere's closed form at L/2 exactly."""
    found = critical_moment(
        *UNIFORM, EI_z=EIZ, GI_t=GIT, EI_w=EIW, length=L, restraints=[{"x": L / 2, **BRACE}]
    )
    assert found.M_cr == pytest.approx(closed_form(L / 2), rel=1e-5)
    assert found.M_cr > 2.0 * closed_form(L)  # the brace more than doubles it here
    # the mode: no lateral deflection nor twist at the brace
    mid = int(abs(found.x - L / 2).argmin())
    assert abs(found.phi[mid]) < 1e-9 and abs(found.v[mid]) < 1e-9 * max(abs(found.v))


def test_the_mesh_converges_as_h_to_the_fourth():
    """Fixed meshes of 4, 8, 16, 32 elements: each error against the closed form above (an upper bound:
    Rayleigh–Ritz) falls by about 2⁴ = 16 per halving (Hermite cubics in a fourth-order problem)."""
    exact = closed_form(L / 2)
    errors = [_mcr([{"x": L / 2, **BRACE}], elements=n) / exact - 1.0 for n in (4, 8, 16, 32)]
    assert all(e > 0.0 for e in errors)
    ratios = [a / b for a, b in zip(errors[:-1], errors[1:], strict=True)]
    assert all(12.0 < r < 20.0 for r in ratios), (errors, ratios)
    assert errors[-1] < 1e-5


@pytest.mark.parametrize("where", [0.4, 0.3, 0.25])
def test_an_off_centre_brace_lies_between_its_segments_bounds(where):
    """Brace at a·L: the exact M_cr lies between the longer segment alone with fork ends (Timoshenko & Gere's
    closed form: the coupled problem's admissible shapes are a subset of the free-slope segments', so its
    Rayleigh quotient is no lower) and the smaller of the two segments with the brace end also fixed laterally
    and against warping (more constraint: no higher)."""
    found = _mcr([{"x": where * L, **BRACE}])
    lower = closed_form((1.0 - where) * L)
    upper = min(
        critical_moment(
            [0.0, length],
            [1.0, 1.0],
            EI_z=EIZ,
            GI_t=GIT,
            EI_w=EIW,
            length=length,
            lateral_ends=("fork", "fixed"),
            warping_ends=("free", "fixed"),
        ).M_cr
        for length in (where * L, (1.0 - where) * L)
    )
    assert lower < found < upper


def test_top_flange_load_lateral_only_is_weaker_than_a_full_brace():
    """A UDL on the top flange (a = +0.15 m): v held at the shear centre alone leaves the twist free, so it
    gives no more than a brace holding both, and no less than no restraint (constraints only raise the
    Rayleigh quotient)."""
    x = [L * i / 64 for i in range(65)]
    M = [0.5 * 1e3 * xi * (L - xi) for xi in x]
    loads = [{"kind": "uniform", "q": 1e3, "height": 0.15}]
    free = _mcr(x=x, M=M, loads=loads)
    lateral = _mcr([{"x": L / 2, "lateral": "fixed"}], x=x, M=M, loads=loads)
    both = _mcr([{"x": L / 2, **BRACE}], x=x, M=M, loads=loads)
    assert free < lateral <= both * (1 + 1e-9)


def test_springs_go_from_none_to_a_brace():
    """A lateral and torsional spring at L/2: M_cr rises with the stiffness from the unrestrained value to the
    braced one (Trahair 1993 ch. 9 on elastic restraints, from memory: monotone in k)."""
    values = [_mcr([{"x": L / 2, "lateral": k, "twist": k * 1e-2}]) for k in (1e-3, 1e3, 1e5, 1e7, 1e12)]
    assert all(b >= a * (1.0 - 1e-9) for a, b in zip(values[:-1], values[1:], strict=True))
    assert values[0] == pytest.approx(closed_form(L), rel=1e-4)
    assert values[-1] == pytest.approx(closed_form(L / 2), rel=1e-4)


def test_bad_restraints_are_refused():
    with pytest.raises(ValueError, match=r"restraints\[0\]\.x"):
        _mcr([{"x": L, **BRACE}])
    with pytest.raises(ValueError, match=r"restraints\[0\]\.lateral"):
        _mcr([{"x": 1.0, "lateral": -5.0}])


# ------------------------------------------------------------------------------------------- the member


def _case(restraints, *, two_planes=True, routes=("second-order",), position="shear-centre", length=6.0):
    """IPE 300, S355, pin-ended, 10 kN/m (invented)."""
    data = {
        "schema": 1,
        "title": "Invented braced beam",
        "length": length,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 0.0,
        "section": {"name": "IPE 300"},
        "material": {"name": "S355"},
        "imperfection": {"preset": "en1993-table-5.1"},
        "loads": [{"type": "uniform", "q": 10e3}],
        "check": {"routes": list(routes), "ltb": {"load_position": position}},
        "restraints": list(restraints),
    }
    if two_planes:
        data["second_plane"] = {"supports": {"left": "pinned", "right": "pinned"}, "loads": []}
    return engine.Case.from_dict(data)


def test_a_lateral_brace_in_the_minor_plane_enters_m_cr_and_splits_the_segments():
    free = engine.solve(_case([])).ltb
    braced = engine.solve(
        _case([{"x": 3.0, "translation": "fixed", "plane": "second", "twist": "fixed"}])
    ).ltb
    assert braced.applies and braced.M_cr > 2.5 * free.M_cr
    assert braced.restraints == (
        {"x": 3.0, "lateral": "fixed", "lateral_rotation": "free", "twist": "fixed"},
    )
    assert braced.segments == ((0.0, 3.0), (3.0, 6.0)) and braced.segment in braced.segments
    # AISC 360-16 §F2: L_b is the unbraced length (§F1, from memory)
    assert braced.aisc.L_b == pytest.approx(3.0) and free.aisc.L_b == pytest.approx(6.0)
    # the tabulated value per segment (fork ends at the brace, no continuity) stays below the exact one
    assert braced.M_cr_tabulated <= braced.M_cr
    assert braced.chi_LT > free.chi_LT


def test_lateral_restraint_alone_is_not_a_brace_point():
    """v held without the twist: M_cr counts it, but the segments (tabulated, AISC L_b) stay the whole member
    (a brace point needs both: the safe reading)."""
    lateral = engine.solve(_case([{"x": 3.0, "translation": "fixed", "plane": "second"}])).ltb
    assert lateral.segments == () and lateral.aisc.L_b == pytest.approx(6.0)
    assert lateral.M_cr > engine.solve(_case([])).ltb.M_cr


def test_a_one_plane_support_is_not_lateral_and_a_twist_is():
    """A one-plane case's restraint acts in the plane analysed (major axis): not lateral, so M_cr is that of
    the unbraced continuous member; a twist restraint enters, with every route (it bends no plane)."""
    support = engine.solve(_case([{"x": 3.0, "translation": "fixed"}], two_planes=False)).ltb
    assert support.restraints == () and support.applies
    plain = engine.solve(_case([], two_planes=False, routes=("second-order", "en-member", "aisc")))
    twisted = engine.solve(
        _case([{"x": 3.0, "twist": "fixed"}], two_planes=False, routes=("second-order", "en-member", "aisc"))
    )
    assert twisted.ltb.M_cr > 2.0 * plain.ltb.M_cr
    assert twisted.ltb.restraints == ({"x": 3.0, "twist": "fixed"},)
    assert all(r.utilization is not None for r in twisted.routes)
    assert twisted.reactions.intermediate == () or len(twisted.reactions.intermediate) == 0


def test_a_hinge_in_the_minor_plane_leaves_the_check_undone():
    case = _case(
        [
            {"x": 2.0, "translation": "fixed", "plane": "second"},
            {"x": 3.0, "hinge": True, "plane": "second"},
            {"x": 4.0, "translation": "fixed", "plane": "second"},
        ]
    )
    result = engine.solve(case)
    assert not result.ltb.applies and result.ltb.reason == "lateral-hinge"
    assert "lateral-torsional-buckling" in [c.code for c in result.cautions]


def test_twist_key_validates_and_round_trips():
    assert Restraint(x=1.0, twist="fixed").to_data() == {"x": 1.0, "twist": "fixed"}
    assert Restraint(x=1.0, twist=2e4).twist == 2e4
    with pytest.raises(engine.CaseError, match=r"twist: 'held' is not a restraint"):
        Restraint(x=1.0, twist="held")
    with pytest.raises(engine.CaseError, match="restrains nothing"):
        Restraint(x=1.0, twist="free")
    case = _case([{"x": 3.0, "twist": "fixed"}], two_planes=False)
    assert engine.Case.from_dict(case.to_dict()).to_dict()["restraints"] == [{"x": 3.0, "twist": "fixed"}]
