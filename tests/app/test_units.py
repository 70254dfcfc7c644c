"""Display units (app.units): factors against published conversion factors, round trips and formatting.

Conversion factors: NIST Special Publication 811 (2008), *Guide for the Use of the International System of
Units*, Appendix B (B.8, factors in alphabetical order), from memory; NIST prints them to 7 significant
figures, hence the 5e-7 relative tolerance. The definitions 1 in = 0.0254 m and 1 lbf = 4.4482216152605 N
are exact, so the factors built from them are checked to 1e-15.
"""

import dataclasses
import doctest
import math

import numpy as np
import pytest

import app.units
from app.units import KINDS, UNIT_SYSTEMS, Unit, Units, format_number, units

# NIST SP 811 (2008) Appendix B.8 (from memory): (kind, SI value of one US unit in the SI display unit).
NIST_US = [
    ("force", 4.448222),  # kip to kN: 4.448 222 E+03 N
    ("moment", 1.355818),  # kip·ft to kN·m: lbf·ft to N·m 1.355 818
    ("stress", 6.894757),  # ksi to MPa: kip/in² to Pa 6.894 757 E+06
    ("line_load", 14.59390),  # kip/ft to kN/m: lbf/ft to N/m 1.459 390 E+01
    ("translational_spring", 175.1268),  # kip/in to kN/m: lbf/in to N/m 1.751 268 E+02
    ("second_moment", 41.62314),  # in⁴ to cm⁴: 4.162 314 E-07 m⁴
]

# Exact by definition (NIST SP 811 (2008) Appendix B, from memory): one US unit in the SI display unit.
EXACT_US = [
    ("length", 0.3048),  # ft to m
    ("small_length", 25.4),  # in to mm
    ("area", 6.4516),  # in² to cm²
    ("warping", 2.54**6),  # in⁶ to cm⁶: (2.54 cm)⁶, exact
    ("stiffness", 4448.2216152605e-3 * 0.3048**2),  # kip·ft² to kN·m², derived from the exact definitions
    ("rotational_spring", 4448.2216152605e-3 * 0.3048),  # kip·ft/rad to kN·m/rad, derived
]

# SI prefixes (BIPM, The International System of Units, 9th ed. (2019), Table 7; from memory): the display
# value of 1 SI base-unit value.
SI_FACTORS = {
    "force": ("kN", 1e-3),
    "length": ("m", 1.0),
    "small_length": ("mm", 1e3),
    "moment": ("kN·m", 1e-3),
    "line_load": ("kN/m", 1e-3),
    "stress": ("MPa", 1e-6),
    "stiffness": ("kN·m²", 1e-3),
    "area": ("cm²", 1e4),
    "second_moment": ("cm⁴", 1e8),
    "warping": ("cm⁶", 1e12),
    "rotation": ("mrad", 1e3),
    "translational_spring": ("kN/m", 1e-3),
    "rotational_spring": ("kN·m/rad", 1e-3),
}


@pytest.mark.parametrize(("kind", "si_per_us"), NIST_US)
def test_us_factors_match_nist(kind, si_per_us):
    """One US unit converts to NIST SP 811's published SI value (7 significant figures, from memory)."""
    us, si = units("us"), units("si")
    one_us_in_si = 1.0 / us.unit(kind).factor  # SI base value of one US unit
    assert si.convert(kind, one_us_in_si) == pytest.approx(si_per_us, rel=5e-7)


@pytest.mark.parametrize(("kind", "si_per_us"), EXACT_US)
def test_us_factors_exact_by_definition(kind, si_per_us):
    """Units from 1 in = 0.0254 m and 1 lbf = 4.4482216152605 N are exact to rounding (NIST SP 811 App. B)."""
    us, si = units("us"), units("si")
    assert si.convert(kind, 1.0 / us.unit(kind).factor) == pytest.approx(si_per_us, rel=1e-15)


def test_si_labels_and_factors():
    """The SI system shows kN, m, mm, kN·m, MPa, kN·m², cm², cm⁴ with the SI prefixes' factors (BIPM 2019)."""
    si = units("si")
    for kind, (label, factor) in SI_FACTORS.items():
        assert si.label(kind) == label
        assert si.unit(kind).factor == pytest.approx(factor, rel=1e-15)


def test_us_labels():
    """The US system shows kip, ft, in, kip·ft, kip/ft, ksi, kip·ft², in², in⁴ (common practice, no source)"""
    us = units("us")
    assert [
        us.label(k)
        for k in (
            "force",
            "length",
            "small_length",
            "moment",
            "line_load",
            "stress",
            "stiffness",
            "area",
            "second_moment",
        )
    ] == ["kip", "ft", "in", "kip·ft", "kip/ft", "ksi", "kip·ft²", "in²", "in⁴"]


@pytest.mark.parametrize("system", UNIT_SYSTEMS)
@pytest.mark.parametrize("kind", KINDS)
def test_round_trip(system, kind):
    """SI -> display -> SI returns the value to rounding, for floats and arrays (scales from 1e-9 to 1e12)."""
    unit = units(system).unit(kind)
    values = np.array([-3.7e12, -1.0, 1e-9, 0.0, 0.0254, 4448.2216152605, 2.5e6])
    np.testing.assert_allclose(unit.to_si(unit.from_si(values)), values, rtol=4e-16, atol=0.0)
    for value in values:
        assert unit.to_si(unit.from_si(float(value))) == pytest.approx(float(value), rel=4e-16, abs=0.0)


def test_show_formats_four_figures_with_unit():
    """show() prints 4 significant figures and the unit: 27170 N·m is '27.17 kN·m' (the CLI's format)."""
    si, us = units("si"), units("us")
    assert si.show("moment", 27170.0) == "27.17 kN·m"
    assert si.show("force", 3279412.0, 5) == "3279.4 kN"
    assert si.show("small_length", -0.008339) == "-8.339 mm"
    assert us.show("small_length", 0.0254) == "1.000 in"
    assert us.show("moment", 4448.2216152605 * 0.3048 * 20.04) == "20.04 kip·ft"
    assert si.show("stiffness", 4.2e6) == "4200 kN·m²"


def test_show_non_finite_and_missing():
    """+inf (the engine's value at a critical load) shows as 'unbounded'; -inf, None and NaN in words too."""
    si = units("si")
    assert si.show("moment", math.inf) == "unbounded"
    assert si.show("moment", -math.inf) == "unbounded (negative)"
    assert si.show("force", None) == "n/a"
    assert si.show("force", math.nan) == "n/a"


def test_show_round_off_noise_is_zero():
    """Round-off such as 1e-13 N·m at a pinned end shows as '0 kN·m' (three decimals at most), not -0.000."""
    si = units("si")
    assert si.show("moment", 1.2e-13) == "0 kN·m"
    assert si.show("moment", -1.2e-13) == "0 kN·m"
    assert format_number(0.0) == "0"
    assert format_number(4.2e9) == "4.200e+09"


def test_units_rejects_unknown_system():
    """An unknown units system is refused with a message naming 'units', the value and what is allowed."""
    with pytest.raises(ValueError, match=r"^units: 'metric' is not a units system; allowed: 'si', 'us'$"):
        units("metric")
    with pytest.raises(ValueError, match="^units: "):
        units("SI")


def test_show_rejects_unknown_kind():
    """An unknown kind of quantity is refused with a message naming 'kind' and listing the allowed kinds."""
    with pytest.raises(ValueError, match=r"^kind: 'velocity' is not a kind of quantity; allowed: 'force'"):
        units("si").show("velocity", 1.0)


def test_units_objects_are_frozen_value_objects():
    """Units and Unit are frozen; units() of a Units returns it; the default system is SI."""
    si = units()
    assert si.system == "si" and units(si) is si
    assert units("si") == si
    with pytest.raises(dataclasses.FrozenInstanceError):
        si.force = Unit(label="N", factor=1.0)
    assert set(KINDS) == {f.name for f in dataclasses.fields(Units)} - {"system"}


def test_module_doctests():
    """The examples in app.units' docstrings run as written."""
    failures, tried = doctest.testmod(app.units, verbose=False)
    assert tried > 0 and failures == 0
