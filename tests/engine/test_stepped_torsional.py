"""A member stepped in section keeps EN 1993-1-1 §6.3.1.4's torsional buckling term.

An independent audit (stop 35): an invented HEB 300 in S355, 4 m pinned, 4000 kN, out-of-plane buckling length
1.0 m (so twist is held only at the ends) read 0.970 with the term governing, and 0.904 once "stepped" to the
same HEB 300 at 2 m: the stepped branch of the routes left the term out (capacity 7 % high). The term now
takes each segment's section along the whole member and keeps the smallest N_b,T,Rd. By hand:
N_cr,T = (G·I_t + π²E·I_w/L_T²)/i0², i0² = (I_y + I_z)/A (EN 1993-1-1 §6.3.1.4 with the usual closed form,
Timoshenko & Gere ch. 5; from memory), χ_T by eq. (6.49) on curve c (Table 6.2 about z–z for a rolled H,
h/b ≤ 1.2, t_f ≤ 100 mm), with the engine's I_t and I_w (without the fillets' share).
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import scipy.linalg

import engine
from engine.design.ltb_member import TORSION_FACTORS
from engine.sections import section_from_spec


def _case(steps=None, N=4000e3) -> engine.Case:
    data = {
        "schema": 1,
        "length": 4.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": N,
        "loads": [],
        "section": {"name": "HEB 300"},
        "material": {"name": "S355"},
        "axis": "major",
        "imperfection": {"preset": "en1993-table-5.1", "curve": "auto"},
        "out_of_plane": {"buckling_length": 1.0},
        "check": {"routes": ["second-order"]},
    }
    if steps:
        data["steps"] = steps
    return engine.Case.from_dict(data)


def _chi_c(lam: float) -> float:
    phi = 0.5 * (1 + 0.49 * (lam - 0.2) + lam**2)
    return min(1.0, 1 / (phi + math.sqrt(phi**2 - lam**2)))


def _ritz(pieces, length: float, terms: int) -> float:
    """N_cr,T by Rayleigh–Ritz with φ = Σ a_n sin(nπx/L) (fork ends, warping free), the integrals of each
    piece in closed form and the eigenvalues by scipy.linalg.eigh: a reference independent of the engine's
    finite elements (an upper bound converging from above)."""
    n = np.arange(1, terms + 1)
    k = n * np.pi / length
    K, G = np.zeros((terms, terms)), np.zeros((terms, terms))
    for a, b, GI_t, EI_w, i0 in pieces:
        # ∫ cos(k_m x) cos(k_n x) and ∫ sin(k_m x) sin(k_n x) over [a, b]
        km, kn = k[:, None], k[None, :]
        with np.errstate(divide="ignore", invalid="ignore"):
            diff = np.where(km == kn, b - a, (np.sin((km - kn) * b) - np.sin((km - kn) * a)) / (km - kn))
        total = (np.sin((km + kn) * b) - np.sin((km + kn) * a)) / (km + kn)
        cc, ss = 0.5 * (diff + total), 0.5 * (diff - total)
        K += GI_t * km * kn * cc + EI_w * km**2 * kn**2 * ss
        G += i0 * km * kn * cc
    return float(scipy.linalg.eigh(K, G, eigvals_only=True)[0])


def _pieces(names, edges):
    """(start, end, GI_t, EI_w, i0²) of each piece, as the engine takes the sections (S355: E, G)."""
    out = []
    for name, (a, b) in zip(names, edges, strict=True):
        y = section_from_spec({"name": name}, "major")
        z = section_from_spec({"name": name}, "minor")
        factor = TORSION_FACTORS["rolled_i"]
        out.append((a, b, 81e9 * y.torsion.I_t / factor, 210e9 * y.torsion.I_w / factor, (y.I + z.I) / y.A))
    return out


@pytest.mark.parametrize(
    ("names", "edges"),
    [
        (["HEB 500", "HEB 300", "HEB 500"], [(0, 1), (1, 3), (3, 4)]),
        (["HEB 300", "HEB 320"], [(0, 2), (2, 4)]),
    ],
    ids=["weak middle", "stronger half"],
)
def test_the_stepped_member_s_own_torsional_buckling_load(names, edges):
    """N_cr,T of the stepped member against Rayleigh–Ritz (scipy): a weak HEB 300 middle between HEB 500 ends
    buckles 12.7 % below the HEB 300's own N_cr,T (the stocky ends' larger i0² drives the twist where the
    warping stiffness does little; an independent audit's finite elements gave 13 736 kN), so each segment's
    own value was not a bound; the term is the smallest of each segment's N/N_b,T,Rd at it."""
    steps = [
        {"x": float(a), "section": {"name": name}} for name, (a, _) in zip(names[1:], edges[1:], strict=True)
    ]
    data = _case(steps).to_dict()
    data["section"] = {"name": names[0]}
    result = engine.solve(engine.Case.from_dict(data))
    (route,) = [r for r in result.routes if r.route == "second-order"]
    pieces = _pieces(names, edges)
    # Ritz converges as 1/n here (φ'' jumps at a step): Richardson's 2R(2n) − R(n) (13 736 126 N for the weak
    # middle; 40 terms alone give 13 775 407, 800 give 13 738 107)
    reference = 2 * _ritz(pieces, 4.0, 800) - _ritz(pieces, 4.0, 400)
    assert route.facts["N_cr_T"] == pytest.approx(reference, rel=1e-5)
    terms = []
    for name in set(names):
        section = section_from_spec({"name": name}, "major")
        fy = 345e6  # EN 10025-2 by the flange, 19 to 28 mm: 16 < t ≤ 40 mm (from memory)
        lam = math.sqrt(section.A * fy / route.facts["N_cr_T"])
        terms.append(4000e3 / (_chi_c(lam) * section.A * fy))
    assert route.terms["torsional-buckling"] == pytest.approx(max(terms), rel=1e-9)


@pytest.mark.parametrize("step", [None, "HEB 300"])
def test_the_torsional_term_of_a_stepped_member(step):
    """Unstepped or stepped to itself: the term is the HEB 300's N/N_b,T,Rd by hand (the stepped member's
    finite elements equal the closed form to 1e-6)."""
    steps = None if step is None else [{"x": 2.0, "section": {"name": step}}]
    result = engine.solve(_case(steps))
    (route,) = [r for r in result.routes if r.route == "second-order"]
    facts = route.facts
    section, material = result.section, result.material
    factor = TORSION_FACTORS["rolled_i"]  # the engine's I_t and I_w without the fillets' share
    I_t, I_w = section.torsion.I_t / factor, section.torsion.I_w / factor
    I_z = section_from_spec({"name": "HEB 300"}, "minor").I
    i0_sq = (section.I + I_z) / section.A
    N_cr_T = (material.G * I_t + math.pi**2 * material.E * I_w / 4.0**2) / i0_sq
    assert facts["N_cr_T"] == pytest.approx(N_cr_T, rel=1e-9 if step is None else 1e-6)
    lam = math.sqrt(section.A * material.fy / N_cr_T)
    N_b = _chi_c(lam) * section.A * material.fy / result.case.check.gamma_M1
    assert route.terms["torsional-buckling"] == pytest.approx(
        4000e3 / N_b, rel=1e-9 if step is None else 1e-6
    )
    assert route.governing == "torsional-buckling"
