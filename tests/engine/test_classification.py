"""Section class by EN 1993-1-1:2005 Table 5.2, the α_cr limit of §5.2.1(3), and a member above its critical
load (issue 12, items 4 and 10). The Table 5.2 limits are from memory."""

import dataclasses
import math

import pytest

import engine
from engine import codes
from engine.classification import LIMITS, classify, epsilon
from engine.materials import material_from_spec
from engine.sections import section_from_spec


def _classes(spec, grade, axis="major", compression=True):
    section = section_from_spec(spec, axis)
    return classify(section, material_from_spec({"name": grade}, section.t_max), compression=compression)


def test_table_5_2_limits():
    """EN 1993-1-1 Table 5.2 (from memory): internal parts 33/38/42 ε in compression, 72/83/124 ε in bending,
    outstand flanges 9/10/14 ε, CHS d/t 50/70/90 ε²; ε = √(235/f_y)."""
    assert LIMITS["internal compression"] == (33.0, 38.0, 42.0)
    assert LIMITS["internal bending"] == (72.0, 83.0, 124.0)
    assert LIMITS["outstand compression"] == (9.0, 10.0, 14.0)
    assert LIMITS["chs"] == (50.0, 70.0, 90.0)
    assert epsilon(235e6) == 1.0
    assert epsilon(355e6) == pytest.approx(0.8136, abs=1e-4)  # Table 5.2's row of ε values (from memory)
    assert epsilon(275e6) == pytest.approx(0.9244, abs=1e-4)


@pytest.mark.parametrize(
    ("ratio", "expected"), [(32.9, 1), (33.0, 1), (33.1, 2), (38.0, 2), (41.9, 3), (42.0, 3), (42.1, 4)]
)
def test_class_boundaries_of_a_web_in_compression(ratio, expected):
    """A welded I web with c/t either side of 33ε/38ε/42ε (S235, ε = 1) is class 1/2/3/4 (Table 5.2)."""
    tw = 0.01
    h = ratio * tw + 2 * 0.012  # plates <= 16 mm: f_y = 235 MPa (EN 10025-2), ε = 1
    found = _classes({"shape": "welded_i", "h": h, "b": 0.1, "tw": tw, "tf": 0.012}, "S235")
    web = found.parts[0]
    assert web.name == "web" and web.ratio == pytest.approx(ratio, rel=1e-12)
    assert web.klass == expected


@pytest.mark.parametrize(("ratio", "expected"), [(9.0, 1), (9.5, 2), (10.0, 2), (13.9, 3), (14.1, 4)])
def test_class_boundaries_of_an_outstand(ratio, expected):
    """A welded I flange outstand (b − t_w)/2/t_f against 9ε/10ε/14ε (Table 5.2 sheet 2, S235)."""
    tf, tw = 0.01, 0.01
    b = 2 * ratio * tf + tw
    found = _classes({"shape": "welded_i", "h": 0.2, "b": b, "tw": tw, "tf": tf}, "S235")
    assert found.parts[1].ratio == pytest.approx(ratio, rel=1e-12)
    assert found.parts[1].klass == expected


def test_web_in_bending_without_compression():
    """Without axial compression the web takes the bending limits 72ε/83ε/124ε (Table 5.2): c/t = 60 is
    class 1 in bending, class 4 in compression."""
    spec = {"shape": "welded_i", "h": 0.624, "b": 0.2, "tw": 0.01, "tf": 0.012}
    assert _classes(spec, "S235", compression=False).parts[0].klass == 1
    assert _classes(spec, "S235", compression=True).parts[0].klass == 4


@pytest.mark.parametrize(
    ("name", "grade", "expected"),
    [
        ("HEB 200", "S355", 1),  # c/t web 14.9, flange 5.2: stocky (common practice, no source)
        ("IPE 200", "S355", 2),  # web c/t = 28.4 between 33ε = 26.8 and 38ε = 30.9
        ("IPE 600", "S355", 4),  # web c/t = 42.8 > 42ε = 34.7 (f_y 345 MPa for t_f 19 mm): class 4
        ("IPE 600", "S235", 3),  # f_y 225 MPa for t_f 19 mm: 42ε = 42.9 just above 42.8
        ("CHS 114.3x5", "S355", 1),  # d/t = 22.9 <= 50ε² = 33.1
    ],
)
def test_catalogue_sections_in_compression(name, grade, expected):
    """Catalogue sections in compression get the class Table 5.2 gives by hand (ratios worked beside)."""
    assert _classes({"name": name}, grade).klass == expected


def test_chs_limit_uses_epsilon_squared():
    """CHS d/t limits scale with ε² (Table 5.2 sheet 3): d/t = 60 is class 2 in S235 (50 < 60 <= 70) and
    class 4 in S355 (90ε² = 90·235/355 = 59.6 < 60)."""
    spec = {"shape": "chs", "D": 0.3, "t": 0.005}
    assert _classes(spec, "S235").klass == 2
    eps2 = 235 / 355
    expected = next((k for k, limit in ((1, 50), (2, 70), (3, 90)) if limit * eps2 >= 60), 4)
    assert _classes(spec, "S355").klass == expected == 4


def test_class_4_is_not_a_pass():
    """A class 4 section without effective properties here (a CHS with d/t = 60 > 90ε² = 59.6 in S355, Table
    5.2; its effective section belongs to EN 1993-1-6) in compression: utilisation +inf, check not valid, a
    danger caution, capacity 0 with 'class 4 section' (issue 12 item 10)."""
    tube = {"shape": "chs", "D": 0.3, "t": 0.005}
    data = {
        "schema": 1,
        "title": "Invented class 4 beam-column",
        "length": 4.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 50e3,
        "loads": [{"type": "uniform", "q": 2e3}],
        "section": tube,
        "material": {"name": "S355"},
        "imperfection": {"preset": "en1993-table-5.1"},
    }
    case = engine.Case.from_dict(data)
    r = engine.solve(case)
    assert r.check.section_class.klass == 4 and not r.check.section_class.effective
    assert math.isinf(r.utilization) and not r.check.valid
    assert r.check.kind == "class 4 section"
    assert "section-class-4" in [c.code for c in r.cautions if c.level == "danger"]
    cap = engine.capacity(case)
    assert cap.axial_force == 0.0 and cap.check == "class 4 section"
    # IPE 600 S355 (web c/t = 42.8): class 4 in uniform compression, class 1 under 50 kN with α from N; in
    # tension its web is classified in bending: class 1 too; both finite
    ipe = engine.Case.from_dict({**data, "section": {"name": "IPE 600"}, "material": {"name": "S355"}})
    assert engine.solve(ipe).check.section_class.klass == 1
    pulled = engine.solve(dataclasses.replace(ipe, axial_force=-50e3))
    assert pulled.check.section_class.klass == 1 and math.isfinite(pulled.utilization)


def test_class_3_with_the_plastic_method_falls_back_to_elastic():
    """A class 3 section with the plastic method is checked elastically, and a note says so (EN 1993-1-1
    §6.2.9, plastic resistance needs class 1 or 2)."""
    # flange outstand (0.298 − 0.01)/2/0.012 = 12: class 3 (10ε < 12 <= 14ε, S235); web c/t = 40: class 1
    # with α from N = 100 kN (α = 0.55, limit 396/(13α − 1) = 64)
    spec = {"shape": "welded_i", "h": 0.424, "b": 0.298, "tw": 0.01, "tf": 0.012}
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "length": 4.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 100e3,
            "loads": [{"type": "uniform", "q": 5e3}],
            "section": spec,
            "material": {"name": "S235"},
            "check": {"method": "plastic"},
        }
    )
    r = engine.solve(case)
    assert r.check.section_class.klass == 3
    assert [p.klass for p in r.check.section_class.parts] == [1, 3]
    assert r.check.in_plane_kind == "elastic stress"
    assert "section-class" not in [c.code for c in r.cautions]  # the check's note says it
    assert any("class 1 or 2" in c.message for c in r.cautions if c.code == "check-note")


def test_alpha_cr_limit_is_ten_for_an_elastic_analysis():
    """EN 1993-1-1 §5.2.1(3) eq. (5.1) (from memory): 10 for elastic, 15 for plastic GLOBAL analysis; the
    caution uses 10 with the plastic cross-section check too (strutscope's analysis is elastic)."""
    assert codes.alpha_cr_limit("elastic") == 10.0 and codes.alpha_cr_limit("plastic") == 15.0
    base = {
        "schema": 1,
        "length": 6.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "check": {"method": "plastic"},
    }
    pcr = engine.solve(engine.Case.from_dict(base)).critical_loads[0]
    r = engine.solve(engine.Case.from_dict({**base, "axial_force": pcr / 12}))  # α_cr = 12: 10 < 12 < 15
    assert "second-order-matters" not in [c.code for c in r.cautions]
    r = engine.solve(engine.Case.from_dict({**base, "axial_force": pcr / 8}))
    caution = next(c for c in r.cautions if c.code == "second-order-matters")
    assert "< 10" in caution.message and "elastic global analysis" in caution.message


def test_above_the_critical_load_the_member_fails():
    """Issue 12 item 4: SHS 100×100×5, 10 m, N = 1.5 Pcr1: utilisation +inf (not 0.50), check not valid, kind
    'elastic buckling' (Euler: no stable equilibrium above Pcr1, Timoshenko & Gere 1961 ch. 2)."""
    base = {
        "schema": 1,
        "length": 10.0,
        "supports": {"left": "pinned", "right": "pinned"},
        "section": {"name": "SHS 100x100x5"},
        "material": {"name": "S355"},
        "imperfection": {"preset": "en1993-table-5.1"},
    }
    pcr = engine.solve(engine.Case.from_dict(base)).critical_loads[0]
    r = engine.solve(engine.Case.from_dict({**base, "axial_force": 1.5 * pcr}))
    assert r.status == "unstable"
    assert math.isinf(r.utilization) and math.isinf(r.check.strength_utilization)
    assert r.check.kind == "elastic buckling" and not r.check.valid
    at = engine.solve(engine.Case.from_dict({**base, "axial_force": float(pcr)}))
    assert at.status == "critical" and math.isinf(at.utilization)
