"""Torsional buckling under the axial force (EN 1993-1-1 §6.3.1.4, AISC 360-16 §E4): torsional_buckling.

References: N_cr,T = (G I_t + π² E I_w / L_T²)/i_0² of a doubly symmetric section with forks at both ends
(Timoshenko & Gere 1961 ch. 5, from memory), checked against the engine's own finite-element solution of
Vlasov's equations (engine.design.mcr: the lateral stiffness with N held is lost at N_cr,T where flexure about
z is held off) [derived]; the warping term is the flexural buckling equation again, so warping fixed at both
ends halves L_T (Euler's clamped column, Timoshenko & Gere ch. 2) [derived]; χ of EN 1993-1-1 eq. (6.49)
with α = 0.49 (curve c, Table 6.1, from memory) written out here. Every member is invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design.ltb_member import TORSION_FACTORS
from engine.design.mcr import critical_moment
from engine.sections import section_from_spec

EIZ_BIG, GIT, EIW, I0SQ, L = 1.0e12, 5.0e4, 4.0e4, 0.01, 6.0


def _holds(N: float, warping) -> bool:
    """Whether the FE member (flexure about z held off by a huge EI_z) keeps lateral stiffness at N."""
    try:
        critical_moment(
            [0.0, L],
            [1.0, 1.0],
            EI_z=EIZ_BIG,
            GI_t=GIT,
            EI_w=EIW,
            length=L,
            N=N,
            i0_squared=I0SQ,
            warping_ends=warping,
            elements=32,
            scale_axial=False,  # N held, M scaled
        )
    except ValueError:
        return False
    return True


@pytest.mark.parametrize(("warping", "k"), [(("free", "free"), 1.0), (("fixed", "fixed"), 0.5)])
def test_the_torsional_load_is_where_the_fe_member_loses_its_stiffness(warping, k):
    """Bisection on N in the M_cr solver: the load where the stiffness stops being positive definite is
    (G I_t + π² E I_w/(kL)²)/i_0², to the mesh's accuracy."""
    formula = (GIT + math.pi**2 * EIW / (k * L) ** 2) / I0SQ
    low, high = 0.5 * formula, 1.5 * formula
    assert _holds(low, warping) and not _holds(high, warping)
    for _ in range(40):
        mid = 0.5 * (low + high)
        low, high = (mid, high) if _holds(mid, warping) else (low, mid)
    assert low == pytest.approx(formula, rel=2e-4)


def _column(two: bool = True, **extra):
    """HEB 200, S355, 6 m, pinned, 900 kN, held about z at its third points (a second plane; invented);
    ``two`` False: one plane, no restraints."""
    data = {
        "schema": 1,
        "title": "Invented column",
        "length": 6.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 900e3,
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "imperfection": {"preset": "en1993-table-5.1"},
        "loads": [],
        "second_plane": {"supports": {"left": "pinned", "right": "pinned"}, "loads": []},
        "restraints": [
            {"x": 2.0, "translation": "fixed", "plane": "second"},
            {"x": 4.0, "translation": "fixed", "plane": "second"},
        ],
        "check": {"routes": ["second-order", "en-member", "aisc"]},
    }
    if not two:
        del data["second_plane"]
        data["restraints"] = []
    data.update(extra)
    return engine.Case.from_dict(data)


def _by_hand(result, L_T: float) -> tuple[float, float]:
    """N_cr,T and N_b,T,Rd of the HEB 200 column for L_T, by the formulas written out."""
    y, z = result.section, section_from_spec({"name": "HEB 200"}, "minor")
    E, G, fy = result.material.E, result.material.G, result.material.fy
    f = TORSION_FACTORS["rolled_i"]
    n_cr = (G * y.torsion.I_t / f + math.pi**2 * E * y.torsion.I_w / f / L_T**2) / ((y.I + z.I) / y.A)
    lam = math.sqrt(y.A * fy / n_cr)
    phi = 0.5 * (1.0 + 0.49 * (lam - 0.2) + lam**2)  # curve c: HEB about z–z (Table 6.2)
    chi = min(1.0, 1.0 / (phi + math.sqrt(phi**2 - lam**2)))
    return n_cr, chi * y.A * fy


def test_a_column_held_about_z_but_free_to_twist_is_checked_for_torsional_buckling():
    """Held about z at its third points (N_cr,z rises to that of 2 m) but free to twist between its ends:
    N_cr,T of 6 m is below N_cr,z, and both EN routes count N/N_b,T,Rd; AISC's P_n takes §E4."""
    result = engine.solve(_column())
    n_cr, n_b = _by_hand(result, 6.0)
    assert n_cr < result.second_plane.critical_loads[0]
    for name in ("second-order", "en-member"):
        route = next(r for r in result.routes if r.route == name)
        assert route.facts["N_cr_T"] == pytest.approx(n_cr, rel=1e-12)
        assert route.facts["L_T"] == pytest.approx(6.0, rel=1e-12)
        assert route.terms["torsional-buckling"] == pytest.approx(900e3 / n_b, rel=1e-9)
    aisc = next(r for r in result.routes if r.route == "aisc")
    assert aisc.facts["F_e_T"] == pytest.approx(n_cr / result.section.A, rel=1e-12)


def test_a_twist_restraint_or_warping_held_shortens_the_torsional_length():
    """A restraint holding the twist at mid-height halves L_T; warping fixed at both ends (and free at the
    restraint) gives 0.7 of each half."""
    twist = engine.solve(_column(restraints=[{"x": 3.0, "translation": "fixed", "twist": "fixed"}]))
    route = next(r for r in twist.routes if r.route == "second-order")
    assert route.facts["L_T"] == pytest.approx(3.0, rel=1e-12)
    assert route.facts["N_cr_T"] == pytest.approx(_by_hand(twist, 3.0)[0], rel=1e-12)
    data = _column(restraints=[{"x": 3.0, "translation": "fixed", "twist": "fixed"}]).to_dict()
    data["check"]["ltb"] = {"warping_ends": ["fixed", "fixed"]}
    warped = engine.solve(engine.Case.from_dict(data))
    facts = next(r for r in warped.routes if r.route == "second-order").facts
    assert facts["L_T"] == pytest.approx(0.7 * 3.0, rel=1e-12)


def test_a_cantilever_with_warping_free_at_its_root_has_no_warping_stiffness():
    """A free top, warping free at the foot: N_cr,T = G I_t / i_0² (the warping term needs a held warping
    somewhere, as a pinned-free column has no flexural stiffness)."""
    result = engine.solve(_column(False, supports={"left": "fixed", "right": "free"}, axial_force=100e3))
    facts = next(r for r in result.routes if r.route == "en-member").facts
    y, z = result.section, section_from_spec({"name": "HEB 200"}, "minor")
    expected = result.material.G * y.torsion.I_t / TORSION_FACTORS["rolled_i"] / ((y.I + z.I) / y.A)
    assert math.isinf(facts["L_T"]) and facts["N_cr_T"] == pytest.approx(expected, rel=1e-12)


def test_stated_out_of_plane_restraint_covers_twist_and_tension_has_no_term():
    """``out_of_plane.restrained`` (a member bent about its major axis held along its length) prevents the
    torsional mode too; a member in tension has no torsional term."""
    held = engine.solve(_column(False, out_of_plane={"restrained": True}))
    assert all("torsional-buckling" not in r.terms for r in held.routes)
    pulled = engine.solve(_column(axial_force=-100e3))
    assert all("torsional-buckling" not in r.terms for r in pulled.routes)
