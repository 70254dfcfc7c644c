"""EN 1993-1-1 §6.3.3: Annex B and Annex A interaction factors against published worked examples (issue 14).

The examples (tests/REFERENCES.md §12, [text]) are from the design guides *Steel Buildings in Europe*,
prepared under the direction of ArcelorMittal, Peiner Träger and Corus, technical content by CTICM and SCI
(RFCS project SECHALO, RFS2-CT-2008-0030), read in the page-by-page copies at
https://infosteel.eu/images/Steel-Buildings-in-Europe/MSB08/27 to /31 (also at infosteel.be and
steeldays.eu), https://infosteel.be/images/Steel-Buildings-in-Europe/SSB04/121 and .../SSB05/43 to /51,
cited below as MSB08/27, SSB04/121, SSB05/51 and so on:

- **MSB08-WE2**: *Multi-Storey Steel Buildings, Part 8: Design software – section capacity*, Appendix A,
  Worked Example 2, "Combined axial force and bending moment (N-M interaction)", sheets 1–5, pp. 8-18 to
  8-22 (made CZT, checked ENM, 02/2010). IPE 450, S355, N_Ed = 127 kN, M_y,Ed = 356 kNm constant, L_y = L_z =
  L_LT = 1.7 m, γ_M1 = 1.0; Annex B. The same numbers are the rafter check of *Single-Storey Steel Buildings,
  Part 4: Detailed design of portal frames*, Appendix D, sheets 26–28, pp. 4-107 to 4-109 (out-of-plane
  check only; the in-plane k_yy and eq. (6.61) are MSB08's). Both are hand calculations to EN 1993-1-1 with
  its recommended values, printed as calculation sheets, not a program's output.
- **SSB05-chord** and **SSB05-diagonal**: *Single-Storey Steel Buildings, Part 5: Detailed design of
  trusses*, §4.1.1 (upper chord, IPE 330, class 4, pp. 5-33 to 5-36) and §4.1.3 (diagonal, two angles
  150 × 150 × 15, pp. 5-37 to 5-41). S355, γ_M1 = 1.0; Annex A with the elastic (class 3 and 4) formulas.

Each value is fed to strutscope's pure functions as the example prints it, and the result is compared at the
example's rounding: the tolerance is half a unit of the printed last digit, plus, where the example rounded an
intermediate value before using it, the effect of that rounding (worked out beside the check). Where the
example's value and ours differ by more, the test says why and which is the clause's value; the differences
are recorded in DEVELOPERS.md (decisions log, "Annex A and B against published worked examples").
"""

from __future__ import annotations

import math

import pytest

from engine import codes
from engine.classification import classify, effective_area
from engine.design import annex_a, annex_b, ltb
from engine.design.annex_b import InteractionFactors
from engine.materials import material_from_spec
from engine.sections import section_from_spec

FY = 355e6  # S355, t <= 40 mm [Pa] (all three examples)
E = 210e9  # [Pa] (all three examples: E = 210 000 N/mm²)


def _printed(ours: float, printed: float, decimals: int, carried: float = 0.0) -> None:
    """|ours − printed| <= half a unit of the printed last digit + ``carried`` (the example's own rounding of
    an intermediate value it used, worked out at the call)."""
    allowed = 0.5 * 10.0**-decimals + carried
    assert abs(ours - printed) <= allowed + 1e-12, f"{ours!r} is not {printed} within {allowed:g}"


# ----------------------------------------------------------------------- MSB08-WE2: IPE 450, S355, Annex B

#: What the sheets print [text]: A = 9880 mm², W_pl,y = 1702 cm³, i_z = 41.2 mm, N_Ed, M_y,Ed, λ̄_y = 0.12
#: (sheet 4, in k_yy), λ̄_z = 0.540, λ̄_LT = 0.470 (sheets 3–5).
WE2 = {"A": 9880e-6, "W_pl_y": 1702e-6, "N": 127e3, "M_y": 356e3, "lambda_y": 0.12, "lambda_z": 0.540}


def test_msb08_section_properties_and_slenderness():
    """IPE 450 as strutscope's catalogue holds it gives the example's A = 9880 mm², W_pl,y = 1702 cm³,
    I_z = 1676 cm⁴, i_z = 41.2 mm (MSB08-WE2 sheets 1–5, MSB08/27–31) and, through eq. (6.50) with the Euler
    load over L = 1.7 m, λ̄_z = 0.540 (sheet 4, MSB08/30) and λ̄_y = 0.12 (sheet 4, in k_yy)."""
    major = section_from_spec({"name": "IPE 450"}, "major")
    minor = section_from_spec({"name": "IPE 450"}, "minor")
    _printed(major.A * 1e6, 9880, -1)  # printed to 10 mm² (98.8 cm²)
    _printed(major.W_pl * 1e6, 1702, 0)
    _printed(minor.I * 1e8, 1676, 0)
    _printed(math.sqrt(minor.I / minor.A) * 1e3, 41.2, 1)
    L = 1.7
    for section, printed, decimals in ((minor, 0.540, 3), (major, 0.12, 2)):
        N_cr = math.pi**2 * E * section.I / L**2
        _printed(codes.slenderness(section.A, FY, N_cr), printed, decimals)


def test_msb08_classification_ratios_and_alpha():
    """Table 5.2 ratios of MSB08-WE2 sheet 1 (MSB08/27): web c/t = 378.8/9.4 = 40.3, flange c/t = 69.3/14.6 =
    4.7, ε = 0.81, and the web class 1 with α = 0.55 under N_Ed = 127 kN with bending. strutscope classes the
    web in bending and compression with α from N (DEVELOPERS.md, "Section class"): the same α and class 1.
    In uniform compression the web is class 4 (40.3 > 42ε = 34.2), so its resistance to N takes A_eff
    (conservative, beyond the sheet, which uses A: its N term is small). Without compression: class 1."""
    section = section_from_spec({"name": "IPE 450"}, "major")
    steel = material_from_spec({"name": "S355"})
    found = classify(section, steel, compression=True, axial_force=127e3)
    web, flange = found.parts
    _printed(web.ratio, 40.3, 1)
    _printed(flange.ratio, 4.7, 1)
    _printed(found.epsilon, 0.81, 2)
    _printed(web.alpha, 0.55, 2)
    _printed(flange.limits[0], 7.3, 1)  # 9ε, printed 7.3
    assert (web.klass, flange.klass, found.klass) == (1, 1, 1)
    assert classify(section, steel, compression=True).klass == 4  # uniform compression
    assert found.A_eff is not None and found.A_eff < section.A
    assert classify(section, steel, compression=False).klass == 1


def test_msb08_buckling_reduction_factors():
    """χ of eq. (6.49) and χ_LT of eq. (6.57) for MSB08-WE2: curves a (y–y) and b (z–z) of Table 6.2 for a
    rolled I with h/b = 2.37 > 1.2, t_f = 14.6 mm (sheets 3–4, MSB08/29–30); χ_y = 1.0 at λ̄_y = 0.12
    (N_b,y,Rd = A f_y = 3507 kN, sheet 3); LTB curve c (h/b > 2, Table 6.5) and χ_LT = 0.961 at
    λ̄_LT = 0.470 with λ̄_LT,0 = 0.4, β = 0.75 (sheet 3, MSB08/29; also SSB04 sheet 28, SSB04/121).

    χ_z: the sheet prints Φ_z = 0.704 and χ_z = 0.865; eq. (6.49) with the unrounded Φ = 0.70366 gives 0.8661.
    The sheet used Φ rounded to 0.704 in the root (that rounded Φ gives 0.8653, its 0.865), and
    dχ/dΦ = −χ²(1 + Φ/√(Φ² − λ̄²)) ≈ −1.9 here, so Φ's rounding (±0.0005) moves χ by up to ±0.00096. Ours is
    the clause's value; the sheet's is 0.1 % lower (its N_b,z,Rd = 3034 kN against 3038 kN), on the safe side.
    """
    curve_y, _ = codes.buckling_curve(
        shape="rolled_i", manufacture="rolled", axis="y", h_over_b=450 / 190, t_max=0.0146, grade="S355"
    )
    curve_z, _ = codes.buckling_curve(
        shape="rolled_i", manufacture="rolled", axis="z", h_over_b=450 / 190, t_max=0.0146, grade="S355"
    )
    assert (curve_y, curve_z) == ("a", "b")
    assert codes.reduction_factor(WE2["lambda_y"], curve_y) == 1.0
    _printed(WE2["A"] * FY / 1e3, 3507, 0)
    chi_z = codes.reduction_factor(WE2["lambda_z"], curve_z)
    _printed(chi_z, 0.865, 3, carried=0.00096)
    phi, lam = 0.704, WE2["lambda_z"]  # the sheet's rounded Φ: its own χ_z back
    _printed(1.0 / (phi + math.sqrt(phi**2 - lam**2)), 0.865, 3)
    assert ltb.lt_curve(shape="rolled_i", h_over_b=450 / 190, method="rolled") == "c"
    _printed(ltb.chi_lt_rolled(0.470, "c"), 0.961, 3)
    _printed(1 / 0.470**2, 4.53, 2)  # the cap 1/λ̄_LT² the sheet prints


def test_msb08_annex_b_k_yy_and_eq_6_61():
    """MSB08-WE2 sheet 4 (MSB08/30), in-plane check: C_my = 0.6 + 0.4ψ = 1.0 at ψ = 1 (Table B.3);
    k_yy = min[C_my(1 + (λ̄_y − 0.2) n_y); C_my(1 + 0.8 n_y)] = min[0.997; 1.029] = 0.997 (the sheet cites
    Table B.2, whose k_yy is Table B.1's, from memory); eq. (6.61) = 127/3507 + 0.997 × 356/581 = 0.647 with
    M_b,Rd = χ_LT W_pl,y f_y = 581 kNm.

    Eq. (6.61) from the unrounded chain is 0.64754: the sheet used M_b,Rd rounded to 581 kNm (from 580.65:
    ±0.5 kNm moves the moment term 0.611 by ±0.00053) and k_yy rounded to 0.997 (±0.0005 moves it by
    ±0.0003); with those printed values our eq. (6.61) is the sheet's 0.6471."""
    N, N_Rk = WE2["N"], WE2["A"] * FY
    C_my = annex_b.equivalent_moment_factor(WE2["M_y"], 1.0)
    assert C_my == pytest.approx(1.0, abs=1e-12)
    k = annex_b.interaction_factors(
        N_Ed=N,
        N_Rk=N_Rk,
        chi_y=1.0,
        chi_z=0.865,
        lambda_y=WE2["lambda_y"],
        lambda_z=WE2["lambda_z"],
        C_my=C_my,
        C_mz=1.0,
        section_class=1,
    )
    _printed(k.k_yy, 0.997, 3)
    _printed(C_my * (1 + 0.8 * k.n_y), 1.029, 3)  # the branch the min did not take
    M_y_Rk = WE2["W_pl_y"] * FY
    _printed(0.961 * M_y_Rk / 1e3, 581, 0)
    found = annex_b.member_check(
        N_Ed=N,
        M_y_Ed=WE2["M_y"],
        M_z_Ed=0.0,
        N_Rk=N_Rk,
        M_y_Rk=M_y_Rk,
        M_z_Rk=1.0,
        chi_y=1.0,
        chi_z=0.865,
        factors=k,
        chi_LT=0.961,
    )
    _printed(found.eq_6_61, 0.647, 3, carried=0.00053 + 0.0003)
    rounded = InteractionFactors(0.997, 0.0, 0.0, 0.0, 0.0, 0.0)  # the sheet's printed intermediates
    again = annex_b.member_check(
        N_Ed=N,
        M_y_Ed=WE2["M_y"],
        M_z_Ed=0.0,
        N_Rk=3507e3,
        M_y_Rk=581e3,
        M_z_Rk=1.0,
        chi_y=1.0,
        chi_z=1.0,
        factors=rounded,
    )
    _printed(again.eq_6_61, 0.647, 3)


def test_msb08_out_of_plane_k_zy_is_table_b2s_which_strutscope_does_not_use():
    """MSB08-WE2 sheet 5 (MSB08/31; SSB04 sheet 28, SSB04/121): the IPE 450 is free to twist between its
    1.7 m restraints, so the sheet takes Table B.2 (members susceptible to torsional deformations):
    k_zy = max[1 − 0.1λ̄_z n_z/(C_mLT − 0.25); 1 − 0.1 n_z/(C_mLT − 0.25)] = max(0.997, 0.994) = 0.997 and
    eq. (6.62) = 127/3034 + 0.997 × 356/581 = 0.653. strutscope's Annex B is Table B.1 only (k_zy = 0.6 k_yy =
    0.598, eq. (6.62) 0.409 with the same χ_LT): for a member free to twist Table B.1 is not the rule and
    its k_zy is 40 % low. This is why the en-member route says chi-LT-1 and the lateral-torsional-buckling
    warning stands beside it; Table B.2 is open (DEVELOPERS.md). The check fails when Table B.1's k_zy changes
    or when the printed Table B.2 value no longer lies above it, so the note here is kept true."""
    N, N_Rk = WE2["N"], WE2["A"] * FY
    k = annex_b.interaction_factors(
        N_Ed=N,
        N_Rk=N_Rk,
        chi_y=1.0,
        chi_z=0.865,
        lambda_y=WE2["lambda_y"],
        lambda_z=WE2["lambda_z"],
        C_my=1.0,
        C_mz=1.0,
        section_class=1,
    )
    _printed(k.k_zy, 0.598, 3)
    found = annex_b.member_check(
        N_Ed=N,
        M_y_Ed=WE2["M_y"],
        M_z_Ed=0.0,
        N_Rk=N_Rk,
        M_y_Rk=WE2["W_pl_y"] * FY,
        M_z_Rk=1.0,
        chi_y=1.0,
        chi_z=0.865,
        factors=k,
        chi_LT=0.961,
    )
    _printed(found.eq_6_62, 0.409, 3)
    printed_k_zy, printed_eq_6_62 = 0.997, 0.653  # Table B.2, sheet 5
    assert k.k_zy < printed_k_zy and found.eq_6_62 < printed_eq_6_62


# -------------------------------------------------------- SSB05-chord: IPE 330, class 4, Annex A (elastic)


def test_ssb05_upper_chord_buckling_and_annex_a_k_zz():
    """SSB05-chord (pp. 5-33 to 5-36, SSB05/43, /44, /46): N_cr,z = π² × 210 000 × 788 cm⁴/(1936 mm)² =
    4357 kN, N_cr,y = π² × 210 000 × 11770 cm⁴/(8504 mm)² = 3373 kN; with A_eff = 6095 mm² (class 4),
    λ̄_z = 0.705, χ_z = 0.781 (curve b), N_b,z,Rd = 1690 kN; λ̄_y = 0.8009, χ_y = 0.7952 (curve a),
    N_b,y,Rd = 1720 kN. Annex A, elastic properties: μ_z = 0.899, k_zz = C_mz μ_z/(1 − N_Ed/N_cr,z) = 0.854
    with the printed C_mz = 0.628, N_Ed = 1477 kN; eq. (6.62) = 1477/1690 + 0.854 × 2.86/34.97 = 0.944
    (M_z,Ed = 2.86 kNm, W_eff,z f_y = 34.97 kNm). N_b,y,Rd: 0.7952 × 6095 × 0.355 = 1720.6 kN, printed 1720
    (cut, not rounded: ±1 kN)."""
    N_cr_z = math.pi**2 * E * 788e-8 / 1.936**2
    N_cr_y = math.pi**2 * E * 11770e-8 / 8.504**2
    _printed(N_cr_z / 1e3, 4357, 0)
    _printed(N_cr_y / 1e3, 3373, 0)
    A_eff, N = 6095e-6, 1477e3
    lam_z, lam_y = codes.slenderness(A_eff, FY, 4357e3), codes.slenderness(A_eff, FY, 3373e3)
    _printed(lam_z, 0.705, 3)
    _printed(lam_y, 0.8009, 4)
    chi_z, chi_y = codes.reduction_factor(lam_z, "b"), codes.reduction_factor(lam_y, "a")
    _printed(chi_z, 0.781, 3)
    _printed(chi_y, 0.7952, 4)
    _printed(0.781 * A_eff * FY / 1e3, 1690, 0)
    _printed(0.7952 * A_eff * FY / 1e3, 1720, 0, carried=0.5)
    # λ̄ and the moduli W are not used by Annex A's elastic (class 3 and 4) formulas.
    k = annex_a.interaction_factors(
        N_Ed=N,
        N_Rk=A_eff * FY,
        N_cr_y=3373e3,
        N_cr_z=4357e3,
        chi_y=0.7952,
        chi_z=0.781,
        lambda_y=lam_y,
        lambda_z=lam_z,
        C_my=1.0,
        C_mz=0.628,
        W_el_y=1.0,
        W_pl_y=1.0,
        W_el_z=1.0,
        W_pl_z=1.0,
        section_class=3,
    )
    ratio = N / 4357e3
    _printed(k.k_zz * (1 - ratio) / 0.628, 0.899, 3)  # μ_z, read back from k_zz
    _printed(k.k_zz, 0.854, 3)
    found = annex_b.member_check(
        N_Ed=N,
        M_y_Ed=0.0,
        M_z_Ed=2.86e3,
        N_Rk=A_eff * FY,
        M_y_Rk=1.0,
        M_z_Rk=34.97e3,
        chi_y=0.7952,
        chi_z=0.781,
        factors=k,
    )
    _printed(found.terms_6_62[0], 0.874, 3)  # N_Ed/N_b,z,Rd, printed on p. 5-33
    _printed(found.eq_6_62, 0.944, 3)


# ------------------------------------------------------- SSB05-diagonal: two angles 150 × 150 × 15, Annex A

#: Printed [text] (pp. 5-37 and 5-41): A = 2 × 43 = 86 cm², N_Ed = 624.4 kN, N_cr,y = 2594 kN,
#: N_cr,z = 1539 kN, M_z,Ed = 2.20 kNm (self weight), W_z = 167 000 mm³; in μ_i and in N_b,Rd the sheet
#: multiplies each χ by 0.915 (derived on the sheets between pp. 5-37 and 5-41, which were not among the
#: pages read, so the test feeds the printed products).
DIAG = {"A": 8600e-6, "N": 624.4e3, "N_cr_y": 2594e3, "N_cr_z": 1539e3, "M_z": 2.20e3, "W_z": 167000e-9}


def test_ssb05_diagonal_reduction_factors():
    """SSB05-diagonal p. 5-41 (SSB05/51) uses χ_y = 0.544 and χ_z = 0.378: eq. (6.49), curve b (angles), at
    λ̄ = √(A f_y/N_cr) with the gross area A = 8600 mm² and the printed critical loads."""
    for N_cr, printed in ((DIAG["N_cr_y"], 0.544), (DIAG["N_cr_z"], 0.378)):
        lam = codes.slenderness(DIAG["A"], FY, N_cr)
        _printed(codes.reduction_factor(lam, "b"), printed, 3)


def test_ssb05_diagonal_moment_factor_row_and_general_formula():
    """C_mz of Table A.2 for the uniformly loaded pin-ended diagonal. The sheet (p. 5-41, SSB05/51) takes the
    table's row C_mz = 1 + 0.03 N_Ed/N_cr,z = 1.012; the table's general formula with the exact deflection
    gives 1 + (5π²/48 − 1) N_Ed/N_cr,z = 1.011. They differ by the row's rounding of 5π²/48 − 1 = 0.0281 to
    0.03 (0.0008 at N_Ed/N_cr,z = 0.406). strutscope takes the larger, the row (engine/design/diagram.py,
    `annex_a_factor`), so it prints the sheet's 1.012; the k factors below use it."""
    ratio = DIAG["N"] / DIAG["N_cr_z"]
    _printed(1 + 0.03 * ratio, 1.012, 3)
    ours = annex_a.moment_factor_general(N_cr_delta_over_M=5 * math.pi**2 / 48, n_cr_ratio=ratio)
    _printed(ours, 1.011, 3)
    assert (1 + 0.03 * ratio) - ours == pytest.approx((0.03 - (5 * math.pi**2 / 48 - 1)) * ratio, rel=1e-9)
    from engine.design.diagram import Diagram, annex_a_factor

    # the engine's reading of a pin-ended member's uniform-load diagram, with q = L = EI = 1: M_max = 1/8,
    # δ = 5/384, N_cr = π²; it takes the table's row
    d = Diagram(form="uniform", M_h=0.0, psi=0.0, M_s=0.125, M_max=0.125, delta=5 / 384, V_max=0.5, sway=0)
    _printed(annex_a_factor(d, ratio * math.pi**2, math.pi**2), 1.012, 3)
    assert annex_a_factor(d, ratio * math.pi**2, math.pi**2) == pytest.approx(1 + 0.03 * ratio, rel=1e-12)


def test_ssb05_diagonal_annex_a_factors_and_eqs_6_61_6_62():
    """SSB05-diagonal p. 5-41 (SSB05/51), Annex A with elastic properties: μ_y = 0.863, μ_z = 0.691,
    k_yz = C_mz μ_y/(1 − N_Ed/N_cr,z) = 1.47, k_zz = C_mz μ_z/(1 − N_Ed/N_cr,z) = 1.18 (C_mz = 1.012);
    eq. (6.61) = 624400/(0.915 × 0.544 × 8600 × 355) + 1.47 × 2.20·10⁶/(167000 × 355) = 0.465, eq. (6.62) with
    χ_z and k_zz = 0.635, its axial term alone 0.591 (the sheet: "increases from 0,591 to 0,635")."""
    chi_y, chi_z = 0.915 * 0.544, 0.915 * 0.378  # the sheet's printed products
    N, N_Rk = DIAG["N"], DIAG["A"] * FY
    # λ̄ and the moduli W are not used by Annex A's elastic (class 3 and 4) formulas.
    k = annex_a.interaction_factors(
        N_Ed=N,
        N_Rk=N_Rk,
        N_cr_y=DIAG["N_cr_y"],
        N_cr_z=DIAG["N_cr_z"],
        chi_y=chi_y,
        chi_z=chi_z,
        lambda_y=1.0,
        lambda_z=1.0,
        C_my=1.0,
        C_mz=1.012,
        W_el_y=1.0,
        W_pl_y=1.0,
        W_el_z=DIAG["W_z"],
        W_pl_z=DIAG["W_z"],
        section_class=3,
    )
    rz = N / DIAG["N_cr_z"]
    _printed(k.k_yz * (1 - rz) / 1.012, 0.863, 3)  # μ_y, read back from k_yz
    _printed(k.k_zz * (1 - rz) / 1.012, 0.691, 3)  # μ_z, read back from k_zz
    _printed(k.k_yz, 1.47, 2)
    _printed(k.k_zz, 1.18, 2)
    found = annex_b.member_check(
        N_Ed=N,
        M_y_Ed=0.0,
        M_z_Ed=DIAG["M_z"],
        N_Rk=N_Rk,
        M_y_Rk=1.0,
        M_z_Rk=DIAG["W_z"] * FY,
        chi_y=chi_y,
        chi_z=chi_z,
        factors=k,
    )
    _printed(found.terms_6_62[0], 0.591, 3)
    _printed(found.eq_6_61, 0.465, 3)
    _printed(found.eq_6_62, 0.635, 3)


def test_ssb05_upper_chord_effective_area():
    """SSB05-chord (p. 5-33, SSB05/43): IPE 330 S355 is class 4 in compression, A_eff = 6095 mm². Ours, by
    EN 1993-1-5 §4.4 (engine.classification.effective_area): web c = 330 − 2·11.5 − 2·18 = 271 mm, c/t =
    36.13, λ̄_p = 36.13/(28.4 × 0.8136 × 2) = 0.7819, ρ = 0.9191, A − (1 − ρ) c t_w = 6260.6 − 164.4 =
    6096.2 mm². The sheet prints neither its A nor its λ̄_p: rounding A to the mm² (±0.5) and λ̄_p to three
    digits (±0.0005, dρ/dλ̄_p = −0.72, so ±0.7 mm² of A_eff) are carried."""
    section = section_from_spec({"name": "IPE 330"}, "major")
    steel = material_from_spec({"name": "S355"}, section.t_max)
    assert classify(section, steel, compression=True).klass == 4
    _printed(effective_area(section, steel) * 1e6, 6095, 0, carried=0.5 + 0.75)
