"""From case to member: stiffness from section and material, code bows, their direction, and bad input."""

import math

import numpy as np
import pytest

import engine

BASE = {
    "schema": 1,
    "length": 5.0,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 2.0e5,
    "section": {"name": "IPE 300"},
    "material": {"name": "S355"},
    "loads": [{"type": "uniform", "q": 3.0e3}],
}


def _solve(**changes):
    return engine.solve(engine.Case.from_dict(dict(BASE, **changes)))


def test_stiffness_is_e_times_i_and_ei_overrides():
    """EI = E·I_y of IPE 300 (E = 210 000 MPa, EN 1993-1-1 §3.2.6; I_y 8356 cm⁴, references §5 from memory);
    a given EI overrides it; the stiffness factor scales either for the analysis."""
    r = _solve()
    assert r.EI == pytest.approx(210e9 * r.section.I, rel=1e-12)
    assert r.section.I == pytest.approx(8356e-8, rel=5e-3)
    assert _solve(EI=1.0e7).EI == 1.0e7
    assert _solve(stiffness_factor=0.8).EI == pytest.approx(0.8 * r.EI, rel=1e-12)
    pcr = math.pi**2 * r.EI / 25.0
    assert r.critical_loads[0] == pytest.approx(pcr, rel=1e-12)


def test_table_5_1_preset_amplitude_and_curve():
    """IPE 300 major axis, rolled, h/b = 2 > 1.2, tf ≤ 40 mm: curve a (EN 1993-1-1 Table 6.2, from memory),
    e0 = L/300 for elastic analysis (Table 5.1 [text: ECCS 2010 table 2.20])."""
    r = _solve(imperfection={"preset": "en1993-table-5.1"})
    assert r.bow.curve == "a"
    assert abs(r.bow.amplitude) == pytest.approx(5.0 / 300, rel=1e-12)
    r = _solve(imperfection={"preset": "en1993-table-5.1", "analysis": "plastic", "curve": "c"})
    assert abs(r.bow.amplitude) == pytest.approx(5.0 / 150, rel=1e-12)


def test_other_presets():
    """AISC L/1000 (AISC 303-16 §7.13.1.1 [text]) and a span ratio L/n."""
    assert abs(_solve(imperfection={"preset": "aisc-l/1000"}).bow.amplitude) == pytest.approx(5e-3, rel=1e-12)
    assert abs(_solve(imperfection={"preset": "span", "ratio": 400}).bow.amplitude) == pytest.approx(
        5.0 / 400
    )


def test_preset_bow_follows_the_load():
    """Direction 'load': the bow takes the sign of the loads' first-order deflection; 'negative' forces it."""
    up = _solve(imperfection={"preset": "aisc-l/1000"})
    down = _solve(imperfection={"preset": "aisc-l/1000"}, loads=[{"type": "uniform", "q": -3.0e3}])
    assert up.bow.amplitude > 0 > down.bow.amplitude
    assert _solve(imperfection={"preset": "aisc-l/1000", "direction": "negative"}).bow.amplitude < 0
    # the bow adds to the deflection: the second-order moment is larger with it than with the opposite bow
    opposite = _solve(imperfection={"shape": "sine", "amplitude": -up.bow.amplitude})
    assert abs(up.governing.moment.value) > abs(opposite.governing.moment.value)


def test_eq_5_9_bow_is_the_first_mode():
    """The eq. (5.9) preset uses the first buckling mode, here a propped cantilever's (not a sine)."""
    r = _solve(supports={"left": "fixed", "right": "pinned"}, imperfection={"preset": "en1993-eq-5.9"})
    assert r.bow.shape == "mode"
    mode = r.modes[0] * r.bow.amplitude
    np.testing.assert_allclose(r.initial_bow, mode, atol=1e-12)


@pytest.mark.parametrize(
    ("imperfection", "field"),
    [
        ({"preset": "en1993-table5.1"}, "imperfection.preset"),
        ({"preset": "span"}, "imperfection.ratio"),
        ({"preset": "aisc-l/1000", "amplitude": 0.01}, "imperfection.amplitude"),
        ({"preset": "en1993-eq-5.9", "shape": "sine"}, "imperfection.shape"),
        ({"shape": "sine", "amplitude": 0.01, "curve": "b"}, "imperfection.curve"),
        ({"preset": "en1993-table-5.1", "curve": "e"}, "imperfection.curve"),
    ],
)
def test_bad_presets_name_their_field(imperfection, field):
    """Each inconsistent bow preset is a CaseError naming its field."""
    with pytest.raises(engine.CaseError, match=field.replace(".", r"\.")):
        engine.Case.from_dict(dict(BASE, imperfection=imperfection))


@pytest.mark.parametrize(
    ("changes", "field"),
    [
        ({"axis": "diagonal"}, "axis"),
        ({"stiffness_factor": 1.5}, "stiffness_factor"),
        ({"stiffness_factor": 0.0}, "stiffness_factor"),
        ({"check": {"method": "plastik"}}, "check.method"),
        ({"check": {"gamma_M0": -1}}, "check.gamma_M0"),
        ({"check": {"gama_M0": 1.0}}, "check"),
        ({"section": {"name": "IPE 201"}}, "section"),
        ({"material": {"name": "S356"}}, "material"),
    ],
)
def test_bad_member_input_names_its_field(changes, field):
    """Bad axis, stiffness factor, check settings, section or material: CaseError naming the field."""
    with pytest.raises(engine.CaseError, match=field):
        engine.Case.from_dict(dict(BASE, **changes))


def test_ei_needs_section_and_material():
    """Without EI the case needs both a section and a material; the message names EI."""
    data = dict(BASE)
    del data["material"]
    with pytest.raises(engine.CaseError, match="EI"):
        engine.Case.from_dict(data)


def test_member_case_round_trips():
    """A case with section, material, axis, stiffness factor, check and preset round-trips via its dict."""
    case = engine.Case.from_dict(
        dict(
            BASE,
            axis="minor",
            stiffness_factor=0.8,
            check={"method": "plastic"},
            imperfection={"preset": "en1993-table-5.1", "curve": "b"},
        )
    )
    again = engine.Case.from_dict(case.to_dict())
    assert again == case and hash(again) == hash(case)
    assert engine.Case.from_json(case.to_json()) == case


def test_critical_loads_of_a_case_without_ei():
    """engine.critical_loads takes its EI from section × material and the stiffness factor, like solve."""
    case = engine.Case.from_dict(dict(BASE, stiffness_factor=0.8))
    assert engine.critical_loads(case).critical_loads[0] == pytest.approx(
        engine.solve(case).critical_loads[0], rel=1e-12
    )
