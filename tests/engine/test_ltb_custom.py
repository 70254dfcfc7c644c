"""Lateral-torsional buckling of a custom section (issue 15): the keys ``Iz``, ``It``, ``Iw`` and
``ltb_curve`` (engine/custom_section.py, engine/design/ltb_member.py).

A custom section given a catalogue section's values must be checked as that section is: the catalogue values
are strutscope's own (engine/catalogue.py, the EN tables' dimensions) rounded to four significant figures,
the rounding a user copying them from a table makes; the torsion constants are those the catalogue section's
check uses (the closed forms divided by 1.045, ``LtbCheck.I_t``/``I_w``). Every member here is invented.
"""

from __future__ import annotations

import math

import pytest

import engine
from engine.design import ltb_member
from engine.sections import section_from_spec

ROUTES = ["second-order"]


def _sig(value: float, figures: int = 4) -> float:
    return float(f"{value:.{figures - 1}e}")


def _down(value: float, figures: int = 4) -> float:
    """Rounded down to ``figures`` (a table's W_el may not pass 2I/depth of its rounded I)."""
    scale = 10.0 ** (math.floor(math.log10(value)) - figures + 1)
    return math.floor(value / scale) * scale


def _case(section, *, length=6.0, loads=None, ltb=None, **extra) -> engine.Case:
    """Pin-ended, S355, a UDL of 10 kN/m (invented)."""
    check = {"routes": ROUTES}
    if ltb is not None:
        check["ltb"] = ltb
    data = {
        "schema": 1,
        "title": "Invented custom-section LTB check",
        "length": length,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 0.0,
        "section": section,
        "material": {"name": "S355"},
        "imperfection": {"preset": "en1993-table-5.1"},
        "loads": [{"type": "uniform", "q": 10e3}] if loads is None else loads,
        "check": check,
        **extra,
    }
    return engine.Case.from_dict(data)


def _custom_of(name: str, curve: str) -> dict:
    """The custom spec of catalogue section ``name``: its values rounded to four figures."""
    major, minor = section_from_spec({"name": name}), section_from_spec({"name": name}, "minor")
    factor = ltb_member.TORSION_FACTORS["rolled_i"]
    return {
        "shape": "custom",
        "A": _sig(major.A),
        "I": _sig(major.I),
        "W_el": _down(major.W_el),
        "W_pl": _sig(major.W_pl),
        "depth": major.depth,
        "width": major.width,
        "doubly_symmetric": True,
        "Iz": _sig(minor.I),
        "It": _sig(major.torsion.I_t / factor),
        "Iw": _sig(major.torsion.I_w / factor),
        "ltb_curve": curve,
    }


@pytest.mark.parametrize(
    ("name", "curve", "position"),
    [
        ("IPE 300", "a", "destabilising"),  # h/b = 2.0: Table 6.4 rolled I h/b <= 2 → a (from memory)
        ("IPE 300", "a", "shear-centre"),
        ("HEB 200", "a", "stabilising"),
    ],
)
def test_custom_section_with_catalogue_values_matches_the_catalogue_section(name, curve, position):
    """Same M_cr (exact and tabulated) to the rounding of the values passed (4 figures: a few 1e-4), and the
    same χ_LT as the catalogue section's check made with W_el,y (a custom section is not classified, so
    W_el,y; the catalogue section, class 1, uses W_pl,y)."""
    settings = {"load_position": position}
    catalogue = engine.solve(_case({"name": name}, ltb=settings))
    custom = engine.solve(_case(_custom_of(name, curve), ltb=settings))
    a, b = catalogue.ltb, custom.ltb
    assert a.applies and b.applies
    assert b.M_cr == pytest.approx(a.M_cr, rel=1e-3)
    assert b.M_cr_tabulated == pytest.approx(a.M_cr_tabulated, rel=1e-3)
    assert b.curve == a.curve == curve
    assert b.W_y == pytest.approx(section_from_spec({"name": name}).W_el, rel=1e-3)
    elastic = ltb_member.check(
        x=catalogue.first_order.x,
        M=catalogue.first_order.moment,
        V=catalogue.first_order.shear,
        loads=catalogue.case.loads,
        length=catalogue.case.length,
        section_y=catalogue.section,
        section_z=section_from_spec({"name": name}, "minor"),
        material=catalogue.material,
        N=0.0,
        settings=catalogue.case.check.ltb,
        section_class=3,
    )
    assert b.chi_LT == pytest.approx(elastic.chi_LT, rel=1e-3)
    assert b.M_b_Rd == pytest.approx(elastic.M_b_Rd, rel=1e-3)
    assert b.aisc is None  # §F2 is for catalogued I-shapes only
    codes = [c.code for c in custom.cautions]
    assert "lateral-torsional-buckling" not in codes


def test_custom_section_in_uniform_moment_against_the_closed_form():
    """Uniform moment, fork ends, warping free, loads none: M_cr = (π/L)·√(EI_z·GI_t·(1 + π²EI_w/(L²GI_t)))
    (Timoshenko & Gere 1961 ch. 6, from memory), with the custom values as given (no torsion factor)."""
    spec = _custom_of("IPE 300", "a")
    L, C = 5.0, 50e3
    loads = [{"type": "couple", "C": C, "x": 0.0}, {"type": "couple", "C": -C, "x": L}]
    r = engine.solve(_case(spec, length=L, loads=loads))
    E, G = r.material.E, r.material.G
    EIz, GIt, EIw = E * spec["Iz"], G * spec["It"], E * spec["Iw"]
    closed = math.pi / L * math.sqrt(EIz * GIt * (1.0 + math.pi**2 * EIw / (L**2 * GIt)))
    assert r.ltb.I_t == spec["It"] and r.ltb.I_w == spec["Iw"]
    assert r.ltb.M_cr == pytest.approx(closed, rel=1e-4)


def test_default_curve_is_d():
    """Without ``ltb_curve`` the curve is d: EN 1993-1-1 Table 6.4's other cross-sections (from memory)."""
    spec = _custom_of("IPE 300", "a")
    del spec["ltb_curve"]
    assert engine.solve(_case(spec)).ltb.curve == "d"


@pytest.mark.parametrize(
    ("drop", "reason", "position"),
    [
        (("Iz",), "minor-axis-unknown", "destabilising"),
        (("It",), "torsion-unknown", "destabilising"),
        (("Iw", "Iz"), "torsion-unknown", "destabilising"),
        (("doubly_symmetric",), "not-doubly-symmetric", "destabilising"),
        (("depth",), "depth-unknown", "destabilising"),
    ],
)
def test_a_missing_key_keeps_the_caution_and_names_the_key(drop, reason, position):
    spec = {k: v for k, v in _custom_of("IPE 300", "a").items() if k not in drop}
    r = engine.solve(_case(spec, ltb={"load_position": position}))
    assert not r.ltb.applies and r.ltb.reason == reason
    expected = tuple(f"section.{k}" for k in ("Iz", "It", "Iw", "doubly_symmetric", "depth") if k in drop)
    assert r.ltb.missing == expected
    warning = next(c for c in r.cautions if c.code == "lateral-torsional-buckling")
    assert warning.values["ltb_reason"] == reason and warning.values["ltb_missing"] == list(expected)


def test_depth_is_not_needed_for_loads_at_the_shear_centre():
    spec = {k: v for k, v in _custom_of("IPE 300", "a").items() if k != "depth"}
    assert engine.solve(_case(spec, ltb={"load_position": "shear-centre"})).ltb.applies


@pytest.mark.parametrize(
    ("key", "value", "words"),
    [
        ("Iz", 9e-5, ("section.Iz", "9e-05 m⁴", "<= I = 8.356e-05 m⁴")),
        ("Iz", -1.0, ("section.Iz", "-1.0", "> 0")),
        ("It", 0.0, ("section.It", "0.0", "> 0")),
        ("ltb_curve", "e", ("section.ltb_curve", "'e'", "'a', 'b', 'c', 'd'")),
    ],
)
def test_bad_values_are_refused_naming_field_value_and_range(key, value, words):
    spec = dict(_custom_of("IPE 300", "a"), **{key: value})
    with pytest.raises(engine.CaseError) as caught:
        _case(spec)
    for word in words:
        assert word in str(caught.value), (word, str(caught.value))


def test_keys_round_trip_through_the_case_file():
    case = _case(_custom_of("IPE 300", "b"))
    again = engine.Case.from_dict(case.to_dict())
    assert again.to_dict()["section"]["Iz"] == case.to_dict()["section"]["Iz"]
    assert again.to_dict()["section"]["ltb_curve"] == "b"
