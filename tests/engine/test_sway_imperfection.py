"""Members with an end that can translate (issue 12, item 8): first-mode bow plus the sway of EN 1993-1-1
eq. (5.5), in the unfavourable direction."""

import dataclasses
import math
from pathlib import Path

import pytest

import engine
from engine import codes
from engine.out_of_plane import OutOfPlaneSettings
from engine.sway import sway_phi

DEMO = Path(__file__).resolve().parents[2] / "assets" / "demo_wind_post.json"


def _cantilever(**changes):
    """The demo as a cantilever held out of plane at its length (so that its in-plane check governs)."""
    case = engine.Case.from_json(DEMO.read_text(encoding="utf-8"))
    changes.setdefault("out_of_plane", OutOfPlaneSettings(buckling_length=case.length))
    return dataclasses.replace(
        case, left=engine.EndSupport.named("fixed"), right=engine.EndSupport.named("free"), **changes
    )


@pytest.mark.parametrize(
    ("h", "m", "alpha_h", "alpha_m"),
    [
        (1.0, 1, 1.0, 1.0),  # 2/√1 = 2, held at the upper limit 1.0
        (4.0, 1, 1.0, 1.0),  # 2/√4 = 1
        (6.0, 1, 2 / math.sqrt(6.0), 1.0),  # inside the limits
        (9.0, 1, 2 / 3, 1.0),  # 2/√9 = 2/3, the lower limit
        (16.0, 1, 2 / 3, 1.0),  # 2/√16 = 0.5, held at 2/3
        (4.0, 2, 1.0, math.sqrt(0.75)),  # α_m = √(0.5 (1 + 1/2))
        (6.0, 4, 2 / math.sqrt(6.0), math.sqrt(0.625)),
    ],
)
def test_sway_phi_of_eq_5_5(h, m, alpha_h, alpha_m):
    """φ = φ0 α_h α_m, φ0 = 1/200, α_h = 2/√h within [2/3, 1], α_m = √(0.5(1 + 1/m)) (EN 1993-1-1:2005
    §5.3.2(3)a, eq. (5.5), from memory)."""
    phi, a_h, a_m = sway_phi(h, m)
    assert a_h == pytest.approx(alpha_h, rel=1e-14) and a_m == pytest.approx(alpha_m, rel=1e-14)
    assert phi == pytest.approx(alpha_h * alpha_m / 200, rel=1e-14)


def test_demo_cantilever_base_moment():
    """Demo member made fixed–free, default Table 5.1 preset: issue 12 found the base moment 71.5 kN·m (half
    sine with the loads) against 76.6 without a bow and 91.3 with the first-mode bow; it is now at least
    the first-mode value, the bow follows the mode and the eq. (5.5) sway (h = L = 6 m) is there, same
    direction."""
    case = _cantilever()
    r = engine.solve(case)
    no_bow = engine.solve(dataclasses.replace(case, imperfection=engine.Imperfection()))
    assert abs(no_bow.moment[0]) == pytest.approx(76.6e3, abs=0.05e3)
    assert abs(r.moment[0]) >= 91.3e3
    assert r.bow.shape == "mode" and "bow-shape" in [c.code for c in r.cautions]
    phi = sway_phi(6.0, 1)[0]
    assert r.bow.sway == pytest.approx(phi, rel=1e-14) and phi == pytest.approx(1 / 244.949, rel=1e-5)
    # Total initial offset at the free tip: the bow's e0 (the mode is 1 there) plus φ·L.
    assert r.initial_bow[-1] == pytest.approx(abs(r.bow.amplitude) + phi * 6.0, rel=1e-12)
    assert "eq. (5.5)" in r.bow.sway_source


def test_cantilever_closed_form_with_bow_and_sway():
    """Fixed–free, axial force only, first-mode bow e0 and sway φ: the base moment is
    N e0/(1 − α) + N φ tan(kL)/k, k = √(N/EI) (Timoshenko & Gere 1961 ch. 1–2, derived: a first-mode bow
    amplifies by exactly 1/(1 − α), and an inclination φ acts as a lateral tip force N φ, whose base moment
    is N φ tan(kL)/k)."""
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "length": 3.0,
            "supports": {"left": "fixed", "right": "free"},
            "section": {"name": "SHS 100x100x5"},
            "material": {"name": "S355"},
            "imperfection": {"preset": "en1993-table-5.1"},
        }
    )
    pcr1 = engine.solve(case).critical_loads[0]
    for alpha in (0.2, 0.5, 0.8):
        r = engine.solve(dataclasses.replace(case, axial_force=alpha * pcr1))
        N, e0, phi = alpha * pcr1, abs(r.bow.amplitude), abs(r.bow.sway)
        k = math.sqrt(N / r.EI)
        expected = N * e0 / (1 - alpha) + N * phi * math.tan(k * 3.0) / k
        assert abs(r.moment[0]) == pytest.approx(expected, rel=1e-9)
        assert e0 == pytest.approx(3.0 / 300, rel=1e-14)  # hot-finished SHS: curve a, L/300 (Table 5.1)
        assert phi == pytest.approx(1 / 200, rel=1e-14)  # h = 3 m: α_h = 2/√3 > 1, held at 1.0


@pytest.mark.parametrize("length", [1.0, 1.25, 1.5, 2.0])
def test_shs_cantilever_capacity_within_chi_a_fy(length):
    """SHS 100×100×5 S355 cantilevers, Table 5.1 preset, elastic check: capacity ≤ χ·A·f_y with χ of
    EN 1993-1-1 eq. (6.49) at the cantilever's λ̄ (issue 12 found 0.5–5 % above it without the sway)."""
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "length": length,
            "supports": {"left": "fixed", "right": "free"},
            "axial_force": 1e5,
            "section": {"name": "SHS 100x100x5"},
            "material": {"name": "S355"},
            "imperfection": {"preset": "en1993-table-5.1"},
        }
    )
    r = engine.solve(case)
    lam = codes.slenderness(r.section.A, r.material.fy, r.critical_loads[0])
    chi = codes.reduction_factor(lam, r.bow.curve)
    assert engine.capacity(case).axial_force <= chi * r.section.A * r.material.fy


def test_caution_on_the_favourable_cantilever_bow_only():
    """Issue 12: the 'bow-opposes-load' caution fired on the safer reversed bow. Now it fires where the case
    fixes the favourable direction, and the automatic direction equals the unfavourable fixed one."""
    case = _cantilever()
    auto = engine.solve(case)
    signs = {
        d: engine.solve(
            dataclasses.replace(case, imperfection=dataclasses.replace(case.imperfection, direction=d))
        )
        for d in ("positive", "negative")
    }
    worse = max(signs.values(), key=lambda r: r.check.strength_utilization)
    better = min(signs.values(), key=lambda r: r.check.strength_utilization)
    assert auto.utilization == worse.utilization and abs(auto.moment[0]) == abs(worse.moment[0])
    assert "bow-opposes-load" in [c.code for c in better.cautions]
    assert "bow-opposes-load" not in [c.code for c in worse.cautions + auto.cautions]


def test_sway_rules_by_preset_and_supports():
    """Eq. (5.9)'s first-mode bow is the unique global and local imperfection (EN 1993-1-1 §5.3.2(11), from
    memory): no sway added; AISC's preset takes its 1/500 out of plumb (AISC 303-16 §7.13.1.1, from memory); a
    member held at both ends gets no sway; the case's m (columns) lowers φ by α_m."""
    base = {
        "schema": 1,
        "length": 4.0,
        "supports": {"left": "fixed", "right": "free"},
        "axial_force": 1e5,
        "section": {"name": "SHS 100x100x5"},
        "material": {"name": "S355"},
    }
    eq59 = engine.solve(engine.Case.from_dict(dict(base, imperfection={"preset": "en1993-eq-5.9"})))
    assert eq59.bow.sway == 0.0 and eq59.bow.shape == "mode"
    aisc = engine.solve(engine.Case.from_dict(dict(base, imperfection={"preset": "aisc-l/1000"})))
    assert abs(aisc.bow.sway) == pytest.approx(1 / 500, rel=1e-14)
    two = engine.solve(
        engine.Case.from_dict(dict(base, imperfection={"preset": "en1993-table-5.1", "columns": 2}))
    )
    assert abs(two.bow.sway) == pytest.approx(math.sqrt(0.75) / 200, rel=1e-14)
    pinned = engine.solve(
        engine.Case.from_dict(
            dict(
                base,
                supports={"left": "pinned", "right": "pinned"},
                imperfection={"preset": "en1993-table-5.1"},
            )
        )
    )
    assert pinned.bow.sway == 0.0 and pinned.bow.shape == "sine"
    with pytest.raises(engine.CaseError, match="columns"):
        engine.Case.from_dict(dict(base, imperfection={"preset": "en1993-table-5.1", "columns": 0}))
    case = engine.Case.from_dict(dict(base, imperfection={"preset": "en1993-table-5.1", "columns": 3}))
    assert engine.Case.from_dict(case.to_dict()) == case


def test_mirrored_cantilever_gives_the_same_base_moment():
    """Free–fixed is fixed–free seen from the other end (mirror symmetry, common practice, no source): the
    same base moment, the sway zero at the held end and growing to the free one."""
    case = _cantilever(loads=(engine.UniformLoad(q=2.5e3),))
    mirrored = dataclasses.replace(
        case, left=engine.EndSupport.named("free"), right=engine.EndSupport.named("fixed")
    )
    r, m = engine.solve(case), engine.solve(mirrored)
    assert abs(m.moment[-1]) == pytest.approx(abs(r.moment[0]), rel=1e-9)
    assert m.initial_bow[0] == pytest.approx(r.initial_bow[-1], rel=1e-9)
    assert abs(m.initial_bow[-1]) <= 1e-12 and abs(r.initial_bow[0]) <= 1e-12
