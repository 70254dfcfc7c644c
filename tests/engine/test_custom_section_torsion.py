"""A custom steel section in compression: torsional buckling counted where it states its torsion constants,
and a danger caution where it is not stated doubly symmetric.

An independent audit (stop 39) found both missing: a custom IPE 300 (the catalogue's own A, I, Iz, It, Iw)
held about its minor axis every 1.5 m passed at 0.691 where the catalogue section fails at 1.038 by torsional
buckling, and a single angle given as a custom section passed at 0.927 where flexural–torsional buckling gives
about 1.15 by hand, with no caution beyond the general one.

Reference for the torsional term, by hand: N_cr,T = (G·I_t + π²E·I_w/L_T²)/i0², i0² = (I_y + I_z)/A, with
L_T = L for fork ends (Timoshenko & Gere 1961, ch. 5, from memory); χ_T by EN 1993-1-1 eq. (6.49) with curve
d (α = 0.76, Table 6.1), as a custom section's curves are read (its own are unknown); N_b,T,Rd = χ_T·A·f_y
(γ_M1 = 1), EN 1993-1-1 §6.3.1.4. G = 81 000 MPa, E = 210 000 MPa (EN 1993-1-1 §3.2.6, from memory).
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.sections import section_from_spec

E, G, FY = 210e9, 81e9, 355e6


def _custom_ipe(doubly_symmetric: bool = True) -> dict:
    major = section_from_spec({"name": "IPE 300"}, "major")
    minor = section_from_spec({"name": "IPE 300"}, "minor")
    return {
        "shape": "custom",
        "A": major.A,
        "I": major.I,
        "W_el": major.W_el,
        "W_pl": major.W_pl,
        "A_v": major.A_v,
        "doubly_symmetric": doubly_symmetric,
        "open_section": True,
        "Iz": minor.I,
        "It": major.torsion.I_t,
        "Iw": major.torsion.I_w,
        "depth": 0.3,
        "width": 0.15,
        "t_max": 0.0107,
    }


def _case(section: dict, N: float) -> engine.Case:
    return engine.Case.from_dict(
        {
            "schema": 1,
            "title": "Invented column held about its minor axis every 1.5 m",
            "length": 6.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": N,
            "loads": [],
            "out_of_plane": {"buckling_length": 1.5},
            "imperfection": {"preset": "en1993-table-5.1", "curve": "b"},
            "section": section,
            "material": {"name": "S355"},
        }
    )


def _by_hand(section: dict, N: float) -> float:
    i0_sq = (section["I"] + section["Iz"]) / section["A"]
    n_cr = (G * section["It"] + math.pi**2 * E * section["Iw"] / 6.0**2) / i0_sq
    lam = math.sqrt(section["A"] * FY / n_cr)
    phi = 0.5 * (1 + 0.76 * (lam - 0.2) + lam * lam)
    chi = min(1.0, 1 / (phi + math.sqrt(phi * phi - lam * lam)))
    return N / (chi * section["A"] * FY)


@pytest.mark.parametrize("N", [400e3, 700e3, 950e3])
def test_a_custom_section_with_torsion_constants_counts_torsional_buckling(N):
    section = _custom_ipe()
    r = engine.solve(_case(section, N))
    assert r.material.G == pytest.approx(G, rel=1e-3)
    second = next(x for x in r.routes if x.route == "second-order")
    assert second.terms["torsional-buckling"] == pytest.approx(_by_hand(section, N), rel=2e-3)
    assert r.utilization >= second.terms["torsional-buckling"]
    if N == 950e3:
        assert r.utilization > 1.0 and any(c.code == "member-fails" for c in r.cautions)


def test_a_custom_section_not_stated_doubly_symmetric_in_compression_is_a_danger():
    r = engine.solve(_case(_custom_ipe(doubly_symmetric=False), 300e3))
    found = [c for c in r.cautions if c.code == "flexural-torsional-not-checked"]
    assert [c.level for c in found] == ["danger"]
    tension = engine.solve(_case(_custom_ipe(doubly_symmetric=False), -300e3))
    assert not any(c.code == "flexural-torsional-not-checked" for c in tension.cautions)


def _cruciform(**keys) -> dict:
    """Two 300×6 mm plates crossed (invented): A = 2·0.3·0.006, I = Iz = 0.006·0.3³/12 (the other plate's
    own I is negligible), I_t = 2·0.3·0.006³/3, I_w ≈ 0 (thin plates meeting at a point); from the textbook
    formulas of thin plates (from memory)."""
    section = {
        "shape": "custom",
        "A": 2 * 0.3 * 0.006,
        "I": 0.006 * 0.3**3 / 12,
        "W_el": 0.006 * 0.3**2 / 6,
        "W_pl": 0.006 * 0.3**2 / 4,
        "doubly_symmetric": True,
        "open_section": True,
    }
    section.update(keys)
    return section


def _strut(section: dict, axis: str = "major") -> engine.Case:
    return engine.Case.from_dict(
        {
            "schema": 1,
            "title": "Invented cruciform strut",
            "length": 3.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 500e3,
            "section": section,
            "material": {"name": "S355"},
            "axis": axis,
        }
    )


def test_a_cruciform_without_iz_is_checked_with_iz_equal_to_i():
    """Without Iz the torsional check takes Iz = I (Iz ≤ I: the largest i0², the lowest N_cr,T, a safe
    bound): N_cr,T = G·I_t/i0² with I_w ≈ 0; an audit found it unchecked, 0.577 where it is 1.657."""
    keys = {"It": 2 * 0.3 * 0.006**3 / 3, "Iw": 1e-12}
    section = _cruciform(**keys)
    r = engine.solve(_strut(section))
    i0_sq = 2 * section["I"] / section["A"]
    n_cr = (G * keys["It"] + math.pi**2 * E * keys["Iw"] / 9.0) / i0_sq
    lam = math.sqrt(section["A"] * FY / n_cr)
    phi = 0.5 * (1 + 0.76 * (lam - 0.2) + lam * lam)
    chi = 1 / (phi + math.sqrt(phi * phi - lam * lam))
    assert r.utilization == pytest.approx(500e3 / (chi * section["A"] * FY), rel=2e-3)
    assert r.utilization > 1.6


@pytest.mark.parametrize(
    ("keys", "axis"),
    [({}, "major"), ({"It": 2 * 0.3 * 0.006**3 / 3, "Iw": 1e-12, "Iz": 0.006 * 0.3**3 / 12}, "minor")],
    ids=["no torsion constants", "bent about its minor axis"],
)
def test_an_open_custom_section_whose_torsional_buckling_cannot_be_checked_is_a_danger(keys, axis):
    r = engine.solve(_strut(_cruciform(**keys), axis))
    assert [c.level for c in r.cautions if c.code == "torsional-buckling-not-checked"] == ["danger"]
    closed = engine.solve(_strut(_cruciform(open_section=False, **keys), axis))
    assert not any(c.code == "torsional-buckling-not-checked" for c in closed.cautions)
