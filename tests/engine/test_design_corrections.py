"""Three corrections on the unsafe side found by an audit against the codes' own formulas (stop 31).

- EN 1993-1-1:2005 Table 5.1 (from memory; text: ECCS 2010, table 2.20): the bow of a member checked
  plastically is the plastic column's, whatever the preset's ``analysis`` says.
- EN 1993-1-1:2005 Annex B, Table B.2 (from memory): an I/H member bent about its major axis and free to
  twist takes Table B.2's k_zy with C_mLT, whether or not its LTB check could be made.
- ANSI/AISC 360-16 Table B4.1b case 11 (from memory): a built-up I flange in major-axis bending has
  λ_r = 0.95·√(k_c·E/F_L), F_L = 0.7·F_y, k_c = 4/√(h/t_w) within 0.35–0.76.
"""

from __future__ import annotations

import math
import sys

import pytest

import engine
from engine.design.aisc_member import flexure_class
from engine.sections import section_from_spec

#: EN 1993-1-1 Table 5.1: e0/L per curve, (elastic, plastic) (from memory; ECCS 2010 table 2.20).
TABLE_5_1 = {"a0": (350, 300), "a": (300, 250), "b": (250, 200), "c": (200, 150), "d": (150, 100)}


def _column(method: str, curve: str, analysis: str | None, supports=("pinned", "pinned")) -> dict:
    preset = {"preset": "en1993-table-5.1", "curve": curve}
    if analysis is not None:
        preset["analysis"] = analysis
    return {
        "schema": 1,
        "length": 8.0,
        "supports": {"left": supports[0], "right": supports[1]},
        "axial_force": 400e3,
        "loads": [{"type": "uniform", "q": 2e3}],
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "imperfection": preset,
        "check": {"method": method},
    }


@pytest.mark.parametrize("curve", sorted(TABLE_5_1))
@pytest.mark.parametrize("analysis", [None, "elastic", "plastic"])
@pytest.mark.parametrize("method", ["elastic", "plastic"])
def test_table_5_1_column_follows_a_plastic_check(curve, analysis, method):
    """e0 = L/ratio of the plastic column when the check is plastic; the stated (default elastic) column
    otherwise (Table 5.1, from memory)."""
    result = engine.solve(engine.Case.from_dict(_column(method, curve, analysis)))
    column = "plastic" if method == "plastic" or analysis == "plastic" else "elastic"
    ratio = TABLE_5_1[curve][column == "plastic"]
    assert abs(result.bow.amplitude) == pytest.approx(8.0 / ratio, rel=1e-12)
    assert f"{column} analysis" in result.bow.label
    said = any("plastic value" in note for note in result.bow.notes)
    assert said == (method == "plastic" and analysis != "plastic")


def test_plastic_check_takes_the_larger_bow_on_a_sway_member():
    """A cantilever (first-mode bow and sway) under a plastic check: the same plastic column."""
    result = engine.solve(engine.Case.from_dict(_column("plastic", "b", None, ("fixed", "free"))))
    assert abs(result.bow.amplitude) == pytest.approx(8.0 / 200, rel=1e-12)


def _k_zy_table_b2(lam_z: float, n_z: float, C_mLT: float) -> float:
    """EN 1993-1-1 Annex B Table B.2, class 1/2, k_zy (from memory)."""
    if lam_z < 0.4:
        return min(0.6 + lam_z, 1.0 - 0.1 * lam_z * n_z / (C_mLT - 0.25))
    return max(1.0 - 0.1 * lam_z * n_z / (C_mLT - 0.25), 1.0 - 0.1 * n_z / (C_mLT - 0.25))


def _en_member(supports: dict, check: dict):
    """The en-member route of an HEB 200 S235 beam-column, 5 m, 200 kN and 3 kN/m (the audit's case)."""
    data = {
        "schema": 1,
        "length": 5.0,
        "supports": supports,
        "axial_force": 200e3,
        "loads": [{"type": "uniform", "q": 3e3}],
        "section": {"name": "HEB 200"},
        "material": {"name": "S235"},
        "imperfection": {"preset": "en1993-table-5.1"},
        "check": check,
    }
    return next(r for r in engine.solve(engine.Case.from_dict(data)).routes if r.route == "en-member")


@pytest.mark.parametrize(
    "supports",
    [
        {"left": {"translation": "fixed", "rotation": 5e7}, "right": "free"},  # LTB check not made
        {"left": "pinned", "right": "pinned"},  # LTB check made
        {"left": "fixed", "right": "pinned"},
    ],
)
def test_k_zy_of_table_b2_for_a_member_free_to_twist(supports):
    """Table B.2's k_zy whenever the I section can twist (the audit's case: a cantilever on a rotational
    spring, whose LTB check is not made, took Table B.1's 0.6·k_yy: 0.651 against 0.907)."""
    f = _en_member(supports, {"method": "plastic"}).facts
    assert f["table_B"] == "B.2"
    n_z = f["N_Ed"] / (f["chi_z"] * f["N_Rk"] / f["gamma_M1"])
    assert f["k_zy"] == pytest.approx(_k_zy_table_b2(f["lambda_z"], n_z, f["C_mLT"]), rel=1e-12)


def test_k_zy_of_table_b1_where_the_flange_is_restrained():
    """A member whose LTB is stated restrained keeps Table B.1 (k_zy = 0.6·k_yy for class 1/2)."""
    pinned = {"left": "pinned", "right": "pinned"}
    route = _en_member(pinned, {"method": "plastic", "ltb": {"restrained": True}})
    assert route.facts.get("table_B") is None
    assert route.facts["k_zy"] == pytest.approx(0.6 * route.facts["k_yy"], rel=1e-12)


@pytest.mark.parametrize("web_ratio", [20.0, 60.0, 120.0, 200.0])
@pytest.mark.parametrize("Fy", [250e6, 345e6])
def test_built_up_flange_limit_in_major_axis_bending(web_ratio, Fy):
    """Table B4.1b case 11 for a welded I about its major axis; case 13 (1.0√(E/F_y)) about its minor."""
    E, tw, tf = 200e9, 0.008, 0.012
    h = web_ratio * tw + 2 * tf
    spec = {"shape": "welded_i", "h": h, "b": 0.4, "tw": tw, "tf": tf}
    k_c = min(0.76, max(0.35, 4.0 / math.sqrt(web_ratio)))
    _, parts = flexure_class(section_from_spec(dict(spec), "major"), E, Fy)
    assert dict((p[0], p[3]) for p in parts)["flange"] == pytest.approx(
        0.95 * math.sqrt(k_c * E / (0.7 * Fy)), rel=1e-12
    )
    _, parts = flexure_class(section_from_spec(dict(spec), "minor"), E, Fy)
    assert dict((p[0], p[3]) for p in parts)["flange"] == pytest.approx(math.sqrt(E / Fy), rel=1e-12)


def test_a_slender_built_up_flange_is_not_rated_noncompact():
    """The audit's welded I 1016 × 406 × 7.4 × 10.2 mm (b/t = 20, above λ_r = 16.2 at F_y = 345 MPa):
    slender, so the aisc route is not applied (its 0.7·F_y·S was 1.5× §F3.2's M_n)."""
    data = {
        "schema": 1,
        "length": 6.096,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 0.0,
        "loads": [{"type": "uniform", "q": 1e3}],
        "section": {"shape": "welded_i", "h": 1.016, "b": 0.4064, "tw": 0.007366, "tf": 0.01016},
        "material": {"name": "S355"},
        "check": {"ltb": {"restrained": True}},
    }
    route = next(r for r in engine.solve(engine.Case.from_dict(data)).routes if r.route == "aisc")
    assert route.utilization is None and route.reason == "slender-element-flexure"


# AISC 360-16 §C2.1 / Appendix 8 eq. (A-8-3), from memory: ASD's second-order analysis is made at 1.6 × the
# ASD loads and its forces divided by 1.6; the transverse loads enter linearly, so M_r = M_II(1.6·N, loads).
# Closed forms of Timoshenko & Gere, *Theory of Elastic Stability*, §1.10–1.12 (from memory), k² = αN/EI.
PINNED, CANTILEVER = {"left": "pinned", "right": "pinned"}, {"left": "fixed", "right": "free"}
CLOSED_FORMS = {
    "uniform load": (
        PINNED,
        [{"type": "uniform", "q": 2e3}],
        lambda k, L, N: 2e3 / k**2 * (1 / math.cos(k * L / 2) - 1),
    ),
    "central point load": (
        PINNED,
        [{"type": "point", "P": 5e3, "x": 3.0}],
        lambda k, L, N: 5e3 / (2 * k) * math.tan(k * L / 2),
    ),
    "equal end moments": (
        PINNED,
        [{"type": "couple", "C": 1e4, "x": 0.0}, {"type": "couple", "C": -1e4, "x": 6.0}],
        lambda k, L, N: 1e4 / math.cos(k * L / 2),
    ),
    "cantilever, tip load": (
        CANTILEVER,
        [{"type": "point", "P": 1e3, "x": 6.0}],
        # out of plumb by 1/500 (AISC §C2.2a): the notional load N/500 at the tip beside the 1 kN
        lambda k, L, N: (1e3 + N / 500) * math.tan(k * L) / k,
    ),
}


def _aisc(supports, loads, N, method):
    data = {
        "schema": 1,
        "length": 6.0,
        "supports": supports,
        "axial_force": N,
        "loads": loads,
        "section": {"name": "W10x49"},
        "material": {"name": "ASTM A992"},
        "out_of_plane": {"restrained": True},
        "check": {"routes": ["aisc"], "aisc_method": method, "ltb": {"restrained": True}},
    }
    result = engine.solve(engine.Case.from_dict(data))
    return result, next(r for r in result.routes if r.route == "aisc")


@pytest.mark.parametrize("fraction", [0.1, 0.35, 0.6])
@pytest.mark.parametrize("kind", sorted(CLOSED_FORMS))
@pytest.mark.parametrize("method", ["ASD", "LRFD"])
def test_aisc_M_r_is_the_moment_at_alpha_times_N(method, kind, fraction):
    """M_r of ASD is the exact moment at 1.6·N (LRFD's at N), on four support and load sets."""
    supports, loads, closed = CLOSED_FORMS[kind]
    first, _ = _aisc(supports, loads, 1e3, method)
    N = fraction * float(first.critical_loads[0])
    result, route = _aisc(supports, loads, N, method)
    alpha = 1.6 if method == "ASD" else 1.0
    k = math.sqrt(alpha * N / result.EI)
    assert route.facts["M_r_y"] == pytest.approx(closed(k, 6.0, N), rel=1e-9)


def test_asd_buckles_at_n_cr_over_1_6():
    """At 1.6·N ≥ N_cr the ASD analysis has no equilibrium: unbounded, where LRFD still gives a number."""
    first, _ = _aisc(PINNED, [{"type": "uniform", "q": 2e3}], 1e3, "ASD")
    N = 0.7 * float(first.critical_loads[0])
    assert math.isinf(_aisc(PINNED, [{"type": "uniform", "q": 2e3}], N, "ASD")[1].utilization)
    assert math.isfinite(_aisc(PINNED, [{"type": "uniform", "q": 2e3}], N, "LRFD")[1].utilization)


def test_asd_audit_case():
    """The audit's W10x49, 40 ft, 120 kip and 0.15 kip/ft in ASD: H1-1a 1.094 (it read 0.955 at 1.0·N)."""
    data = {
        "schema": 1,
        "length": 12.192,
        "supports": PINNED,
        "axial_force": 533786.59383126,
        "loads": [{"type": "uniform", "q": 2189.0854405809546}],
        "section": {"name": "W10x49"},
        "material": {"name": "ASTM A992"},
        "out_of_plane": {"restrained": True},
        "check": {"routes": ["aisc"], "aisc_method": "ASD", "ltb": {"restrained": True}},
    }
    route = next(r for r in engine.solve(engine.Case.from_dict(data)).routes if r.route == "aisc")
    assert route.utilization == pytest.approx(1.094, abs=5e-4)


def test_asd_moment_of_both_planes():
    """A two-plane case in ASD: each plane's M_r is its own exact moment at 1.6·N (T&G's secant form)."""
    data = {
        "schema": 1,
        "length": 6.0,
        "supports": PINNED,
        "axial_force": 600e3,
        "loads": [{"type": "uniform", "q": 3e3}],
        "second_plane": {"supports": PINNED, "loads": [{"type": "uniform", "q": 1e3}]},
        "section": {"name": "W10x49"},
        "material": {"name": "ASTM A992"},
        "check": {"routes": ["aisc"], "aisc_method": "ASD"},
    }
    result = engine.solve(engine.Case.from_dict(data))
    route = next(r for r in result.routes if r.route == "aisc")
    for key, q, EI in (("M_r_y", 3e3, result.EI), ("M_r_z", 1e3, result.second_plane.EI)):
        k = math.sqrt(1.6 * 600e3 / EI)
        assert route.facts[key] == pytest.approx(q / k**2 * (1 / math.cos(3.0 * k) - 1), rel=1e-9)


GUIDED = {"left": "fixed", "right": "guided"}


@pytest.mark.parametrize("H", [2e3, -2e3])
@pytest.mark.parametrize("fraction", [0.1, 0.4, 0.55])
@pytest.mark.parametrize("method", ["ASD", "LRFD"])
@pytest.mark.parametrize("supports", ["cantilever", "guided"])
def test_aisc_M_r_holds_the_out_of_plumbness(supports, method, fraction, H):
    """A member with an end that can translate: M_r is the exact moment with the notional load 0.002·N
    (AISC 360-16 §C2.2a, from memory) beside the tip load H, the worse way. A straight tilt is a transverse
    force N·φ at the moving end, so the cantilever has (H + Nφ)·tan(kL)/k and the member fixed at its base and
    guided at its top (H + Nφ)·tan(kL/2)/k (Timoshenko & Gere 1961 §1.11 and §2.2, from memory). ASD solves at
    1.6·N with 1.6 × the notional load and divides by 1.6: k = √(1.6N/EI), the same H + Nφ."""
    ends, half = (CANTILEVER, 1.0) if supports == "cantilever" else (GUIDED, 0.5)
    loads = [{"type": "point", "P": H, "x": 6.0}]
    first, _ = _aisc(ends, loads, 1e3, method)
    N = fraction * float(first.critical_loads[0])
    result, route = _aisc(ends, loads, N, method)
    alpha = 1.6 if method == "ASD" else 1.0
    k = math.sqrt(alpha * N / result.EI)
    expected = (abs(H) + N / 500.0) * math.tan(k * 6.0 * half) / k
    assert route.facts["M_r_y"] == pytest.approx(expected, rel=1e-9)
    assert "aisc-out-of-plumb-in-Mr" in route.notes


@pytest.mark.parametrize("supports", [PINNED, {"left": "fixed", "right": "pinned"}])
def test_aisc_M_r_of_a_member_held_at_both_ends_has_no_out_of_plumbness(supports):
    """Both ends held against translation: no sway, no notional load (the bow-free moment alone)."""
    result, route = _aisc(supports, [{"type": "uniform", "q": 1e3}], 100e3, "LRFD")
    assert result.amplification.moment_out_of_plumb is None
    assert "aisc-out-of-plumb-in-Mr" not in route.notes


def test_aisc_out_of_plumb_audit_case():
    """The audit's W10x49 cantilever, 14 ft, 170 kip and 1 kip at the tip (LRFD): M_r = (1 + 0.34) kip ×
    tan(kL)/k; it read 0.910 of the bow-free moment's H1-1a before (without the notional load)."""
    ft, kip = 0.3048, 4448.2216152605
    loads = [{"type": "point", "P": 1.0 * kip, "x": 14 * ft}]
    data = {
        "schema": 1,
        "length": 14 * ft,
        "supports": CANTILEVER,
        "axial_force": 170 * kip,
        "loads": loads,
        "section": {"name": "W10x49"},
        "material": {"name": "ASTM A992"},
        "out_of_plane": {"restrained": True},
        "check": {"routes": ["aisc"], "aisc_method": "LRFD", "ltb": {"restrained": True}},
    }
    result = engine.solve(engine.Case.from_dict(data))
    route = next(r for r in result.routes if r.route == "aisc")
    k = math.sqrt(170 * kip / result.EI)
    assert route.facts["M_r_y"] == pytest.approx((1.34 * kip) * math.tan(k * 14 * ft) / k, rel=1e-9)


def test_asd_moment_of_a_route_shown_but_not_counted():
    """With the aisc route shown but not counted (routes: second-order only), its ASD M_r is still the exact
    moment at 1.6·N: equal end moments, M0·sec(kL/2) (Timoshenko & Gere, from memory)."""
    loads = [{"type": "couple", "C": 1e4, "x": 0.0}, {"type": "couple", "C": -1e4, "x": 6.0}]
    data = {
        "schema": 1,
        "length": 6.0,
        "supports": PINNED,
        "axial_force": 800e3,
        "loads": loads,
        "section": {"name": "W10x49"},
        "material": {"name": "ASTM A992"},
        "out_of_plane": {"restrained": True},
        "check": {"routes": ["second-order"], "aisc_method": "ASD", "ltb": {"restrained": True}},
    }
    result = engine.solve(engine.Case.from_dict(data))
    route = next(r for r in result.routes if r.route == "aisc")
    k = math.sqrt(1.6 * 800e3 / result.EI)
    assert not route.enabled
    assert route.facts["M_r_y"] == pytest.approx(1e4 / math.cos(3.0 * k), rel=1e-9)


@pytest.mark.parametrize("method", ["LRFD", "ASD"])
@pytest.mark.parametrize("fraction", [0.2, 0.3, 0.45])
def test_aisc_route_warns_past_appendix_7s_drift_ratio(method, fraction):
    """AISC 360-16 Appendix 7 §7.2.1 (from memory): the effective length method only while the second-order
    drift is at most 1.5 × the first-order one; a cantilever's tip drift grows about as 1/(1 − αN/N_cr), past
    1.5 at αN > N_cr/3 (α = 1.6 for ASD)."""
    loads = [{"type": "point", "P": 2e3, "x": 6.0}]
    first, _ = _aisc(CANTILEVER, loads, 1e3, method)
    N_cr = float(first.critical_loads[0])
    _, route = _aisc(CANTILEVER, loads, fraction * N_cr, method)
    alpha = 1.6 if method == "ASD" else 1.0
    ratio = 1.0 / (1.0 - alpha * fraction) if alpha * fraction < 1 else math.inf
    assert route.facts["drift_ratio"] == pytest.approx(ratio, rel=1e-9)
    assert ("aisc-elm-drift-limit" in route.notes) == (ratio > 1.5)


def _tip_loaded_cantilever(routes: list) -> engine.Case:
    """An invented W10x49 cantilever mast, 4 m, 2 kN at the tip, LRFD, held laterally."""
    return engine.Case.from_dict(
        {
            "schema": 1,
            "length": 4.0,
            "supports": CANTILEVER,
            "axial_force": 100e3,
            "loads": [{"type": "point", "P": 2e3, "x": 4.0}],
            "section": {"name": "W10x49"},
            "material": {"name": "ASTM A992"},
            "out_of_plane": {"restrained": True},
            "check": {"routes": routes, "aisc_method": "LRFD", "ltb": {"restrained": True}},
        }
    )


def test_capacity_counts_the_out_of_plumbness_where_the_aisc_route_counts():
    """The axial capacity with the aisc route counted is the force where that route's H1-1 (its M_r out of
    plumb by 1/500, AISC 360-16 §C2.2a, from memory) reaches 1: solved there, it reads 1 with the note."""
    found = engine.capacity(_tip_loaded_cantilever(["aisc"]))
    assert found.route == "aisc"
    at = engine.solve(
        engine.Case.from_dict(dict(_tip_loaded_cantilever(["aisc"]).to_dict(), axial_force=found.axial_force))
    )
    route = next(r for r in at.routes if r.route == "aisc")
    assert route.utilization == pytest.approx(1.0, abs=1e-6)
    assert "aisc-out-of-plumb-in-Mr" in route.notes


def test_capacity_without_the_aisc_route_solves_no_out_of_plumb_member(monkeypatch):
    """Where the aisc route does not count, the capacity finder does not pay its two out-of-plumb solves per
    trial force (a speed choice: the route's number is not in the capacity), and the capacity is the same."""
    case = _tip_loaded_cantilever(["second-order", "en-member"])
    expected = engine.capacity(case).axial_force
    forces, trials = [], []
    finder = sys.modules["engine.capacity"]  # the module (``engine.capacity`` is its function)
    plumb, solve = engine.aisc_moments.plumb_moment, finder._solve
    monkeypatch.setattr(
        engine.aisc_moments,
        "plumb_moment",
        lambda case, prep, n, P, *a: forces.append(P) or plumb(case, prep, n, P, *a),
    )
    monkeypatch.setattr(finder, "_solve", lambda *a, **k: trials.append(1) or solve(*a, **k))
    engine.clear_caches()
    assert engine.capacity(case).axial_force == expected
    assert len(trials) >= 4
    assert len([P for P in forces if P > 0.0]) == 1  # the full solve at the root alone, not each trial
    engine.solve(case)  # the page's solve still shows the aisc route, out of plumb
    assert len([P for P in forces if P > 0.0]) == 2
