"""The practitioners' approximations beside the exact amplification, each checked against its published form."""

import math

import pytest

import engine

EI, L = 2.0e6, 5.0
PE = math.pi**2 * EI / L**2


def _solve(left, right, loads, factor):
    return engine.solve(engine.Case.from_dict({
        "schema": 1, "length": L, "EI": EI, "supports": {"left": left, "right": right},
        "axial_force": factor * PE, "loads": loads}))


def _by_name(result, start):
    return next(a for a in result.amplification.approximations if a.name.startswith(start))


def test_equal_end_moments_single_curvature():
    """Single curvature: Cm = 1 (AISC 360-16 App. 8 eq. for Cm, from memory); exact amplification is sec u
    (Timoshenko & Gere 1961 ch. 1, article number from memory)."""
    M0 = 10e3
    r = _solve("pinned", "pinned", [{"type": "couple", "C": M0, "x": 0.0}, {"type": "couple", "C": -M0, "x": L}], 0.5)
    u = math.pi / 2 * math.sqrt(0.5)
    assert r.amplification.moment == pytest.approx(1 / math.cos(u), rel=1e-12)
    b1 = _by_name(r, "AISC B1")
    assert "Cm = 1.000" in b1.name
    assert b1.value == pytest.approx(1 / (1 - 0.5), rel=1e-12)
    assert b1.error == pytest.approx(2.0 * math.cos(u) - 1, rel=1e-9)


def test_equal_end_moments_reverse_curvature_floor():
    """Reverse curvature: Cm = 0.6 − 0.4·(M1/M2) = 0.2 and B1 ≥ 1 holds it at 1 (AISC 360-16 App. 8, from memory)."""
    M0 = 10e3
    r = _solve("pinned", "pinned", [{"type": "couple", "C": M0, "x": 0.0}, {"type": "couple", "C": M0, "x": L}], 0.3)
    b1 = _by_name(r, "AISC B1")
    assert "Cm = 0.200" in b1.name
    assert b1.value == 1.0
    assert r.amplification.moment == pytest.approx(1.0, abs=1e-12)  # the end moments govern


@pytest.mark.parametrize(("left", "right", "load", "psi"), [
    ("pinned", "pinned", {"type": "uniform", "q": 1e3}, 0.0),
    ("fixed", "pinned", {"type": "uniform", "q": 1e3}, -0.4),
    ("pinned", "fixed", {"type": "uniform", "q": 1e3}, -0.4),
    ("fixed", "fixed", {"type": "uniform", "q": 1e3}, -0.4),
    ("pinned", "pinned", {"type": "point", "P": 1e3, "x": L / 2}, -0.2),
    ("fixed", "pinned", {"type": "point", "P": 1e3, "x": L / 2}, -0.3),
    ("fixed", "fixed", {"type": "point", "P": 1e3, "x": L / 2}, -0.2),
])
def test_moment_gradient_form_uses_the_tabulated_psi(left, right, load, psi):
    """(1 + ψα)/(1 − α) with ψ of AISC 360-16 Commentary Table C-A-8.1 (case matching from memory), and its
    error against the exact amplification stays within the few per cent the table is known for."""
    r = _solve(left, right, [load], 0.3)
    alpha = 0.3 * PE / r.critical_loads[0]
    item = _by_name(r, "(1 + psi")
    assert f"psi = {psi:g}" in item.name
    assert item.value == pytest.approx((1 + psi * alpha) / (1 - alpha), rel=1e-12)
    assert item.error == pytest.approx(item.value / r.amplification.moment - 1, rel=1e-12)
    assert abs(item.error) < 0.05


def test_no_psi_form_for_an_untabulated_case():
    """An off-centre point load is not in Table C-A-8.1, so only 1/(1 − α) and B1 (Cm = 1) are given."""
    r = _solve("pinned", "pinned", [{"type": "point", "P": 1e3, "x": 0.3 * L}], 0.3)
    names = [a.name for a in r.amplification.approximations]
    assert not any(n.startswith("(1 + psi") for n in names)
    assert any("Cm = 1.000" in n for n in names)


def test_no_b1_for_a_sway_member_and_none_beyond_buckling():
    """B1 is for members braced at both ends: a cantilever gets none; above Pcr1 no approximation is given."""
    r = _solve("fixed", "free", [{"type": "point", "P": 1e3, "x": L}], 0.1)
    assert not any(a.name.startswith("AISC B1") for a in r.amplification.approximations)
    r = _solve("pinned", "pinned", [{"type": "uniform", "q": 1e3}], 1.5)
    assert r.stable is False and r.amplification.approximations == ()


def test_tension_lowers_the_moment():
    """In tension the exact amplification is λ_t(u) = 2(1 − sech u)/u² < 1 (Timoshenko & Gere 1961 ch. 1)."""
    r = _solve("pinned", "pinned", [{"type": "uniform", "q": 1e3}], -0.7)
    u = math.pi / 2 * math.sqrt(0.7)
    assert r.amplification.moment == pytest.approx(2 * (1 - 1 / math.cosh(u)) / u**2, rel=1e-12)
    assert r.amplification.approximations[0].value == pytest.approx(1 / 1.7, rel=1e-12)
