"""engine.solve against the beam-column closed forms of references.md §1.

Source of every closed form here unless said otherwise: Timoshenko & Gere, *Theory of Elastic Stability*,
2nd ed. (1961), ch. 1 (article numbers from memory), as written in tests/REFERENCES.md §1,
where the forms are flagged [derived] (re-derived from the governing equation). The tabulated check
values are that page's table, to 7 significant figures, so they are compared with abs 1e-6; the forms
evaluated by mpmath at 30 significant digits (tests/support/closed_forms.py) are compared with rel 1e-10.

Values are read at stations only (never interpolated): mid-span is a station because it is where
w' = 0 and V = 0 on these symmetric cases (conventions.md), and loads' positions are stations.
"""

import math

import numpy as np
import pytest

import engine
from tests.support import closed_forms as cf

L = 6.0  # [m], invented
EI = 4.2e6  # [N·m²], invented
P_E = math.pi**2 * EI / L**2
Q = 1.0e4  # [N], invented
q = 2.5e3  # [N/m], invented
M0 = 2.0e4  # [N·m], invented

TABLE_ABS = 1e-6  # table of references.md §1 is given to 6 decimals
MP_REL = 1e-10  # against the mpmath forms

# references.md §1 check values [derived]: P/P_E -> (u, η, λ, χ, sec u, η_t, λ_t, χ_t, sech u)
TABLE = {
    0.3: (0.86036, 1.430086, 1.441074, 1.422814, 1.533356, 0.768470, 0.762984, 0.772154, 0.717612),
    0.7: (1.31422, 3.341993, 3.405094, 3.300660, 3.940607, 0.586937, 0.577606, 0.593263, 0.501185),
}


def _case(P, loads, left="pinned", right="pinned", imperfection=None, length=L, EI_=EI):
    data = {
        "schema": 1,
        "length": length,
        "EI": EI_,
        "supports": {"left": left, "right": right},
        "axial_force": P,
        "loads": loads,
    }
    if imperfection is not None:
        data["imperfection"] = imperfection
    return engine.Case.from_dict(data)


def _at(result, x, length=L):
    """Index of the station at x (the first when it is repeated); fails when x is not a station."""
    idx = np.flatnonzero(np.abs(np.asarray(result.x) - x) <= 1e-12 * length)
    assert idx.size, f"x = {x} m is not a station"
    return int(idx[0])


def _uniform(P, **kw):
    return engine.solve(_case(P, [{"type": "uniform", "q": q}], **kw), stations=401)


def _central(P, **kw):
    return engine.solve(_case(P, [{"type": "point", "P": Q, "x": L / 2}], **kw), stations=401)


def _end_moments(P):
    loads = [{"type": "couple", "C": M0, "x": 0.0}, {"type": "couple", "C": -M0, "x": L}]
    return engine.solve(_case(P, loads), stations=401)


def _ratios(P):
    """Mid-span second-order/first-order ratios of the three basic loads, from engine results."""
    ru, rc, rm = _uniform(P), _central(P), _end_moments(P)
    w_u = ru.deflection[_at(ru, L / 2)] / (5 * q * L**4 / (384 * EI))
    m_u = ru.governing.moment.value / (q * L**2 / 8)
    w_c = rc.deflection[_at(rc, L / 2)] / (Q * L**3 / (48 * EI))
    m_c = rc.governing.moment.value / (Q * L / 4)
    w_m = rm.deflection[_at(rm, L / 2)] / (M0 * L**2 / (8 * EI))
    m_m = rm.moment[_at(rm, L / 2)] / M0
    return w_u, m_u, w_c, m_c, w_m, m_m


# ---------------------------------------------------------------- first-order (P = 0)


def test_first_order_uniform_load():
    """At P = 0 a uniform load gives 5qL⁴/384EI and qL²/8 at mid-span."""
    r = _uniform(0.0)
    # first-order formulas, common practice, no source; rel 1e-12 (no cancellation at P = 0)
    assert r.governing.deflection.value == pytest.approx(5 * q * L**4 / (384 * EI), rel=1e-12)
    assert r.governing.moment.value == pytest.approx(q * L**2 / 8, rel=1e-12)
    assert r.governing.moment.x == pytest.approx(L / 2, abs=1e-12 * L)


def test_first_order_central_point_load():
    """At P = 0 a central point load gives QL³/48EI and QL/4."""
    r = _central(0.0)
    # first-order formulas, common practice, no source; rel 1e-12
    assert r.governing.deflection.value == pytest.approx(Q * L**3 / (48 * EI), rel=1e-12)
    assert r.governing.moment.value == pytest.approx(Q * L / 4, rel=1e-12)


def test_first_order_end_moments():
    """At P = 0 equal end moments give M0L²/8EI at mid-span and M = M0 everywhere."""
    r = _end_moments(0.0)
    # first-order formulas, common practice, no source; rel 1e-12
    assert r.deflection[_at(r, L / 2)] == pytest.approx(M0 * L**2 / (8 * EI), rel=1e-12)
    np.testing.assert_allclose(r.moment, M0, rtol=1e-12)


def test_first_order_off_centre_point_load():
    """At P = 0 an off-centre point load gives w = Qbx(L² − b² − x²)/6LEI left of the load and M = Qbx/L."""
    a = 0.3 * L
    b = L - a
    r = engine.solve(_case(0.0, [{"type": "point", "P": Q, "x": a}]), stations=401)
    x = np.asarray(r.x)
    left = x <= a
    # simply supported beam, point load, common practice, no source; atol 1e-12 of the peak
    w_ref = np.where(
        left,
        Q * b * x * (L**2 - b**2 - x**2) / (6 * L * EI),
        Q * a * (L - x) * (L**2 - a**2 - (L - x) ** 2) / (6 * L * EI),
    )
    m_ref = np.where(left, Q * b * x / L, Q * a * (L - x) / L)
    np.testing.assert_allclose(r.deflection, w_ref, rtol=0, atol=1e-12 * np.max(np.abs(w_ref)))
    np.testing.assert_allclose(r.moment, m_ref, rtol=0, atol=1e-12 * np.max(np.abs(m_ref)))


def test_first_order_result_is_the_zero_force_solve():
    """result.first_order of a compressed case is the P = 0 solution, w = qx(L³ − 2Lx² + x³)/24EI."""
    r = _uniform(0.5 * P_E)
    fo = r.first_order
    x = np.asarray(fo.x)
    assert fo.axial_force == 0.0
    # simply supported span under uniform load, common practice, no source; atol 1e-12 of the peak
    w_ref = q * x * (L**3 - 2 * L * x**2 + x**3) / (24 * EI)
    m_ref = q * x * (L - x) / 2
    np.testing.assert_allclose(fo.deflection, w_ref, rtol=0, atol=1e-12 * np.max(w_ref))
    np.testing.assert_allclose(fo.moment, m_ref, rtol=0, atol=1e-12 * np.max(m_ref))


# ---------------------------------------------------------------- the check-value table


@pytest.mark.parametrize("ratio", [0.3, 0.7])
def test_compression_table(ratio):
    """At P/P_E = 0.3 and 0.7 the engine's amplifications are the tabulated η, λ, χ, tan u/u and sec u."""
    u_tab, eta, lam, chi, sec_u = TABLE[ratio][:5]
    w_u, m_u, w_c, m_c, w_m, m_m = _ratios(ratio * P_E)
    # references.md §1 check values [derived]; abs 1e-6 (table given to 6 decimals)
    assert w_u == pytest.approx(eta, abs=TABLE_ABS)
    assert m_u == pytest.approx(lam, abs=TABLE_ABS)
    assert w_c == pytest.approx(chi, abs=TABLE_ABS)
    assert w_m == pytest.approx(lam, abs=TABLE_ABS)
    assert m_m == pytest.approx(sec_u, abs=TABLE_ABS)
    # central point load: M = (QL/4) tan u / u (Timoshenko & Gere ch. 1);
    # u is tabulated to 5 decimals, so abs 1e-4
    assert m_c == pytest.approx(math.tan(u_tab) / u_tab, abs=1e-4)


@pytest.mark.parametrize("ratio", [0.3, 0.7])
def test_compression_table_mpmath(ratio):
    """At P/P_E = 0.3 and 0.7 the engine's amplifications equal the closed forms evaluated with mpmath."""
    P = ratio * P_E
    u = cf.u_of(P, EI, L)
    got = _ratios(P)
    want = (cf.eta(u), cf.lam(u), cf.chi(u), cf.tan_ratio(u), cf.lam(u), cf.sec(u))
    # Timoshenko & Gere ch. 1 forms, mpmath 30 digits; rel 1e-10
    for name, g, w in zip(("eta", "lam", "chi", "tan u/u", "lam (end M)", "sec u"), got, want, strict=True):
        assert g == pytest.approx(float(w), rel=MP_REL), name


@pytest.mark.parametrize("ratio", [0.3, 0.7])
def test_tension_table(ratio):
    """In tension P = −0.3 P_E and −0.7 P_E the engine gives the tabulated η_t, λ_t, χ_t and sech u."""
    u_tab, *_, eta_t, lam_t, chi_t, sech_u = TABLE[ratio]
    w_u, m_u, w_c, m_c, w_m, m_m = _ratios(-ratio * P_E)
    # references.md §1 check values [derived], u → iu; abs 1e-6
    assert w_u == pytest.approx(eta_t, abs=TABLE_ABS)
    assert m_u == pytest.approx(lam_t, abs=TABLE_ABS)
    assert w_c == pytest.approx(chi_t, abs=TABLE_ABS)
    assert w_m == pytest.approx(lam_t, abs=TABLE_ABS)
    assert m_m == pytest.approx(sech_u, abs=TABLE_ABS)
    # tanh u / u (tension version of tan u / u, [derived]); abs 1e-4 as u is tabulated to 5 decimals
    assert m_c == pytest.approx(math.tanh(u_tab) / u_tab, abs=1e-4)


@pytest.mark.parametrize("ratio", [0.3, 0.7])
def test_tension_table_mpmath(ratio):
    """In tension the engine's amplifications equal η_t, λ_t, χ_t, tanh u/u, sech u evaluated with mpmath."""
    P = -ratio * P_E
    u = cf.u_of(P, EI, L)
    got = _ratios(P)
    want = (cf.eta_t(u), cf.lam_t(u), cf.chi_t(u), cf.tanh_ratio(u), cf.lam_t(u), cf.sech(u))
    # Timoshenko & Gere ch. 1 forms with u → iu, mpmath 30 digits; rel 1e-10
    for name, g, w in zip(
        ("eta_t", "lam_t", "chi_t", "tanh u/u", "lam_t (end M)", "sech u"), got, want, strict=True
    ):
        assert g == pytest.approx(float(w), rel=MP_REL), name


def test_amplification_factors_of_uniform_load():
    """result.amplification gives η(u) for the peak deflection and λ(u) for the peak moment (uniform load)."""
    P = 0.3 * P_E
    u = cf.u_of(P, EI, L)
    r = _uniform(P)
    # Timoshenko & Gere ch. 1, mpmath 30 digits; rel 1e-10
    assert r.amplification.deflection == pytest.approx(float(cf.eta(u)), rel=MP_REL)
    assert r.amplification.moment == pytest.approx(float(cf.lam(u)), rel=MP_REL)


# ---------------------------------------------------------------- whole diagrams


@pytest.mark.parametrize("sign", [1.0, -1.0], ids=["compression", "tension"])
def test_uniform_load_moment_diagram(sign):
    """Under a uniform load M(x) = (q/k²)(cos k(x − L/2)/cos u − 1) (cosh in tension) at every station."""
    P = sign * 0.7 * P_E
    r = _uniform(P)
    x = np.asarray(r.x)
    k = math.sqrt(abs(P) / EI)
    u = k * L / 2
    if sign > 0:
        m_ref = q / k**2 * (np.cos(k * (x - L / 2)) / math.cos(u) - 1)
    else:
        m_ref = q / k**2 * (1 - np.cosh(k * (x - L / 2)) / math.cosh(u))
    # [derived] from the same ODE as references.md §1 (its mid-span value is (qL²/8)λ); atol 1e-10 of the peak
    np.testing.assert_allclose(r.moment, m_ref, rtol=0, atol=1e-10 * np.max(np.abs(m_ref)))
    # w = (M − qx(L − x)/2)/P: moment equilibrium of the deflected member [derived]; atol 1e-9 of the peak
    w_ref = (m_ref - q * x * (L - x) / 2) / P
    np.testing.assert_allclose(r.deflection, w_ref, rtol=0, atol=1e-9 * np.max(np.abs(w_ref)))


@pytest.mark.parametrize("sign", [1.0, -1.0], ids=["compression", "tension"])
def test_off_centre_point_load_diagrams(sign):
    """An off-centre point load at a = 0.3L gives the closed-form w and M at every station on both sides."""
    a = 0.3 * L
    b = L - a
    P = sign * 0.7 * P_E
    k = math.sqrt(abs(P) / EI)
    r = engine.solve(_case(P, [{"type": "point", "P": Q, "x": a}]), stations=401)
    x = np.asarray(r.x)
    left = x <= a
    xx = np.where(left, x, L - x)  # mirror for x ≥ a: swap a and b [derived]
    cc = np.where(left, b, a)
    if sign > 0:
        # references.md §1: w = Q sin kb sin kx /(P k sin kL) − Qbx/(PL), M = Q sin kb sin kx /(k sin kL)
        m_ref = Q * np.sin(k * cc) * np.sin(k * xx) / (k * math.sin(k * L))
    else:
        # tension, k → ik [derived]
        m_ref = Q * np.sinh(k * cc) * np.sinh(k * xx) / (k * math.sinh(k * L))
    w_ref = (m_ref - Q * cc * xx / L) / P
    # atol 1e-10 of each peak
    np.testing.assert_allclose(r.moment, m_ref, rtol=0, atol=1e-10 * np.max(np.abs(m_ref)))
    np.testing.assert_allclose(r.deflection, w_ref, rtol=0, atol=1e-10 * np.max(np.abs(w_ref)))
    i = _at(r, a)
    assert r.moment[i] == pytest.approx(
        Q * math.sin(k * b) * math.sin(k * a) / (k * math.sin(k * L))
        if sign > 0
        else Q * math.sinh(k * b) * math.sinh(k * a) / (k * math.sinh(k * L)),
        rel=1e-10,
    )


def test_off_centre_point_load_peak_away_from_load():
    """At a = 0.3L, P = 0.7P_E the peak moment is 0.550·QL at k(L − x) = π/2, not 0.530·QL under the load."""
    a = 0.3 * L
    b = L - a
    P = 0.7 * P_E
    k = math.sqrt(P / EI)
    r = engine.solve(_case(P, [{"type": "point", "P": Q, "x": a}]), stations=401)
    peak = r.governing.moment
    # references.md §1 [derived]: 0.550·QL and 0.530·QL (3 decimals, abs 5e-4)
    assert peak.value / (Q * L) == pytest.approx(0.550, abs=5e-4)
    assert r.moment[_at(r, a)] / (Q * L) == pytest.approx(0.530, abs=5e-4)
    # exact: Q sin ka /(k sin kL) at x = L − π/(2k); rel 1e-10 and abs 1e-9·L
    assert peak.value == pytest.approx(Q * math.sin(k * a) / (k * math.sin(k * L)), rel=1e-10)
    assert peak.x == pytest.approx(L - math.pi / (2 * k), abs=1e-9 * L)
    # the peak is a station (conventions.md: stations include V = 0), so the array maximum equals it;
    # rel 1e-12
    assert np.max(np.abs(r.moment)) == pytest.approx(abs(peak.value), rel=1e-12)
    assert abs(b * k) > math.pi / 2  # precondition of the statement in references.md §1


# ---------------------------------------------------------------- initial sine bow


def test_sine_bow_compression():
    """A sine bow a·sin(πx/L) under P = αP_E gives total offset a/(1 − α) and moment Pa/(1 − α) mid-span."""
    a, alpha = 0.02, 0.3
    P = alpha * P_E
    r = engine.solve(_case(P, [], imperfection={"shape": "sine", "amplitude": a}), stations=401)
    i = _at(r, L / 2)
    # references.md §1 [memory; exact]; rel 1e-10
    assert r.total_offset[i] == pytest.approx(a / (1 - alpha), rel=MP_REL)
    assert r.governing.total_offset.value == pytest.approx(a / (1 - alpha), rel=MP_REL)
    assert r.governing.moment.value == pytest.approx(P * a / (1 - alpha), rel=MP_REL)
    # the whole shape stays a sine [derived]; atol 1e-10·a
    np.testing.assert_allclose(
        r.total_offset, a / (1 - alpha) * np.sin(np.pi * np.asarray(r.x) / L), rtol=0, atol=1e-10 * a
    )
    np.testing.assert_allclose(r.initial_bow, a * np.sin(np.pi * np.asarray(r.x) / L), rtol=0, atol=1e-14 * a)


def test_sine_bow_tension():
    """A sine bow under tension P = −αP_E gives total offset a/(1 + α) and moment Pa/(1 + α)."""
    a, alpha = 0.02, 0.7
    P = -alpha * P_E
    r = engine.solve(_case(P, [], imperfection={"shape": "sine", "amplitude": a}), stations=401)
    i = _at(r, L / 2)
    # references.md §1 [memory; exact]; M = P(w + w0) for a pinned member [derived]; rel 1e-10
    assert r.total_offset[i] == pytest.approx(a / (1 + alpha), rel=MP_REL)
    assert r.moment[i] == pytest.approx(P * a / (1 + alpha), rel=MP_REL)


# ---------------------------------------------------------------- numerical regimes

SMALL_U = [1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 3e-2, 1e-1]


@pytest.mark.parametrize("u", SMALL_U)
@pytest.mark.parametrize("sign", [1.0, -1.0], ids=["compression", "tension"])
def test_series_region(u, sign):
    """For u from 1e-6 to 0.1 (where η, λ, χ cancel catastrophically) the amplifications keep 10 digits."""
    P = sign * (2 * u / L) ** 2 * EI
    uu = cf.u_of(P, EI, L)
    got = _ratios(P)
    if sign > 0:
        want = (cf.eta(uu), cf.lam(uu), cf.chi(uu), cf.tan_ratio(uu), cf.lam(uu), cf.sec(uu))
    else:
        want = (cf.eta_t(uu), cf.lam_t(uu), cf.chi_t(uu), cf.tanh_ratio(uu), cf.lam_t(uu), cf.sech(uu))
    # Timoshenko & Gere ch. 1 forms, mpmath 30 digits (precision raised for the cancellation); rel 1e-10
    for name, g, w in zip(("eta", "lam", "chi", "tan", "lam end", "sec"), got, want, strict=True):
        assert g == pytest.approx(float(w), rel=MP_REL), name


def test_near_critical():
    """At P/P_E = 0.99999 the engine's η, λ, χ, sec u agree with mpmath and the member is still stable."""
    P = 0.99999 * P_E
    u = cf.u_of(P, EI, L)
    got = _ratios(P)
    want = (cf.eta(u), cf.lam(u), cf.chi(u), cf.tan_ratio(u), cf.lam(u), cf.sec(u))
    # Timoshenko & Gere ch. 1, mpmath 30 digits. rel 1e-9, not 1e-10: the problem's condition number is
    # α/(1 − α) = 1e5, so float rounding (2.2e-16) of the inputs alone may move the answer by ~2e-11,
    # and a few such roundings inside any float solver by ~1e-10.
    for name, g, w in zip(("eta", "lam", "chi", "tan", "lam end", "sec"), got, want, strict=True):
        assert g == pytest.approx(float(w), rel=1e-9), name
    r = _uniform(P)
    assert r.status == "stable" and r.stable  # conventions/spec: stable below the first critical load


STRONG_U = [10.0, 100.0, 709.0, 711.0, 1000.0, 1e4]
L_T, EI_T = 10.0, 1.0e5  # [m], [N·m²] invented, so that |P| = 4u²EI/L² stays within 1e12 N at u = 1e4


@pytest.mark.parametrize("u", STRONG_U)
def test_strong_tension(u):
    """In strong tension (u to 1e4; cosh overflows past 710) η_t, λ_t, χ_t, sech u stay finite, accurate."""
    P = -((2 * u / L_T) ** 2) * EI_T
    uu = cf.u_of(P, EI_T, L_T)
    kw = {"length": L_T, "EI_": EI_T}
    ru = engine.solve(_case(P, [{"type": "uniform", "q": q}], **kw), stations=401)
    rc = engine.solve(_case(P, [{"type": "point", "P": Q, "x": L_T / 2}], **kw), stations=401)
    end_moments = [{"type": "couple", "C": M0, "x": 0.0}, {"type": "couple", "C": -M0, "x": L_T}]
    rm = engine.solve(_case(P, end_moments, **kw), stations=401)
    iu, ic, im = (_at(r, L_T / 2, L_T) for r in (ru, rc, rm))
    got = {
        "eta_t": ru.deflection[iu] / (5 * q * L_T**4 / (384 * EI_T)),
        "lam_t": ru.moment[iu] / (q * L_T**2 / 8),
        "chi_t": rc.deflection[ic] / (Q * L_T**3 / (48 * EI_T)),
        "tanh u/u": rc.moment[ic] / (Q * L_T / 4),
        "lam_t end": rm.deflection[im] / (M0 * L_T**2 / (8 * EI_T)),
        "sech u": rm.moment[im] / M0,
    }
    want = {
        "eta_t": cf.eta_t(uu),
        "lam_t": cf.lam_t(uu),
        "chi_t": cf.chi_t(uu),
        "tanh u/u": cf.tanh_ratio(uu),
        "lam_t end": cf.lam_t(uu),
        "sech u": cf.sech(uu),
    }
    for r in (ru, rc, rm):
        for arr in (r.deflection, r.rotation, r.moment, r.shear, r.transverse_force):
            assert np.all(np.isfinite(arr))
    # Timoshenko & Gere ch. 1 forms with u → iu, mpmath 30 digits; rel 1e-10. sech u falls below the
    # smallest double past u ≈ 745 (it is ~1e-4343 at u = 1e4), so it also passes within abs 1e-300.
    for name in got:
        if name == "sech u":
            assert got[name] == pytest.approx(float(want[name]), rel=MP_REL, abs=1e-300), name
        else:
            assert got[name] == pytest.approx(float(want[name]), rel=MP_REL), name
