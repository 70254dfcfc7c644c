"""Tests of engine.sections: section properties, the catalogue, names and the validation of section specs.

Reference values, each with its source and tolerance beside it:

- tests/REFERENCES.md §5: catalogue values for IPE 200, IPE 300, HEB 200, HEA 200, SHS 100×100×5
  (hot-finished and cold-formed) and CHS 114.3×5, flagged [memory] there and each recomputed from its
  dimensions there [derived]. Tolerance 0.5 %, the rounding of a catalogue's printed figures.
- The catalogue's own handbook A and I (from memory, stored beside each entry's dimensions in
  engine/sections.py): every entry's dimensions must reproduce them to 1 %, so a typo in either shows.
- The general-purpose finite-element library ``sectionproperties`` (PyPI) as an independent computation of
  the parametric shapes. It meshes polygons, so its only error here is the chords it puts in place of each
  radius (64 per quarter circle, 256 round a tube; about 0.02 % at worst): tolerance 0.2 %.
- Values marked "from memory" in a comment (minor-axis moduli, shear areas, masses) at 0.5 %.
"""

from __future__ import annotations

import dataclasses
import math
import re

import pytest
from scipy import integrate

from engine import catalogue, section_properties, sections
from engine.errors import CaseError
from engine.sections import Section, catalogue_names, normalise_name, section_from_spec

CM = 1e-2  # [m]
CM2 = 1e-4  # [m²]
CM3 = 1e-6  # [m³]
CM4 = 1e-8  # [m⁴]

REFERENCE_TOLERANCE = 0.005  # 0.5 %: catalogue rounding (references.md §5)
CATALOGUE_TOLERANCE = 0.01  # 1 %: handbook values against the stored dimensions
FE_TOLERANCE = 0.002  # 0.2 %: sectionproperties' chords in place of the radii

# The parametric specs of the references.md §5 sections, from the dimensions printed there.
IPE_200 = {"shape": "rolled_i", "h": 0.200, "b": 0.100, "tw": 0.0056, "tf": 0.0085, "r": 0.012}
IPE_300 = {"shape": "rolled_i", "h": 0.300, "b": 0.150, "tw": 0.0071, "tf": 0.0107, "r": 0.015}
HEB_200 = {"shape": "rolled_i", "h": 0.200, "b": 0.200, "tw": 0.009, "tf": 0.015, "r": 0.018}
HEA_200 = {"shape": "rolled_i", "h": 0.190, "b": 0.200, "tw": 0.0065, "tf": 0.010, "r": 0.018}
SHS_HOT = {"shape": "rhs", "h": 0.1, "b": 0.1, "t": 0.005, "manufacture": "hot-finished"}
SHS_COLD = {"shape": "rhs", "h": 0.1, "b": 0.1, "t": 0.005, "manufacture": "cold-formed"}
CHS_114 = {"shape": "chs", "D": 0.1143, "t": 0.005}


def _relative(value: float, expected: float) -> float:
    return abs(value / expected - 1.0)


# ----------------------------------------------------------------------------- references.md §5

# (spec, axis, property, value in cm units). Source: references.md §5 table and bullets (catalogue values
# [memory] there, recomputed from the dimensions [derived]). Tolerance 0.5 %.
_I_H_TABLE = {
    # name: A [cm²], I_y [cm⁴], W_el,y [cm³], W_pl,y [cm³], i_y [cm], I_z [cm⁴], i_z [cm]
    "IPE 200": (28.48, 1943, 194.3, 220.6, 8.26, 142.4, 2.24),
    "IPE 300": (53.81, 8356, 557.1, 628.4, 12.46, 603.8, 3.35),
    "HEB 200": (78.08, 5696, 569.6, 642.5, 8.54, 2003, 5.07),
    "HEA 200": (53.83, 3692, 388.6, 429.5, 8.28, 1336, 4.98),
}
_UNITS = {"A": CM2, "I": CM4, "W_el": CM3, "W_pl": CM3, "i": CM}
REFERENCE_VALUES = []
for _name, (_A, _Iy, _Wely, _Wply, _iy, _Iz, _iz) in _I_H_TABLE.items():
    REFERENCE_VALUES += [
        (_name, {"name": _name}, "major", "A", _A),
        (_name, {"name": _name}, "major", "I", _Iy),
        (_name, {"name": _name}, "major", "W_el", _Wely),
        (_name, {"name": _name}, "major", "W_pl", _Wply),
        (_name, {"name": _name}, "major", "i", _iy),
        (_name, {"name": _name}, "minor", "I", _Iz),
        (_name, {"name": _name}, "minor", "i", _iz),
    ]
REFERENCE_VALUES += [
    # SHS 100×100×5 hot-finished, EN 10210-2 (r_o = 1.5t, r_i = t): references.md §5.
    ("SHS 100x100x5", {"name": "SHS 100x100x5"}, "major", "A", 18.7),
    ("SHS 100x100x5", {"name": "SHS 100x100x5"}, "major", "I", 279),
    ("SHS 100x100x5", {"name": "SHS 100x100x5"}, "major", "W_el", 55.9),
    ("SHS 100x100x5", {"name": "SHS 100x100x5"}, "major", "W_pl", 66.4),
    ("SHS 100x100x5", {"name": "SHS 100x100x5"}, "major", "i", 3.86),
    ("SHS 100x100x5 hot", SHS_HOT, "major", "A", 18.7),
    ("SHS 100x100x5 hot", SHS_HOT, "major", "I", 279),
    # SHS 100×100×5 cold-formed, EN 10219-2 (r_o = 2t): references.md §5.
    ("SHS 100x100x5 cold", SHS_COLD, "major", "A", 18.4),
    ("SHS 100x100x5 cold", SHS_COLD, "major", "I", 271),
    ("SHS 100x100x5 cold", SHS_COLD, "major", "W_el", 54.2),
    ("SHS 100x100x5 cold", SHS_COLD, "major", "W_pl", 64.6),
    # CHS 114.3×5: references.md §5.
    ("CHS 114.3x5", {"name": "CHS 114.3x5"}, "major", "A", 17.17),
    ("CHS 114.3x5", {"name": "CHS 114.3x5"}, "major", "I", 256.9),
    ("CHS 114.3x5", {"name": "CHS 114.3x5"}, "major", "W_el", 44.96),
    ("CHS 114.3x5", {"name": "CHS 114.3x5"}, "major", "W_pl", 59.77),
    ("CHS 114.3x5", {"name": "CHS 114.3x5"}, "major", "i", 3.87),
    ("CHS 114.3x5", CHS_114, "major", "W_pl", 59.77),
]


@pytest.mark.parametrize(
    ("label", "spec", "axis", "prop", "expected"),
    REFERENCE_VALUES,
    ids=[f"{r[0]}-{r[2]}-{r[3]}" for r in REFERENCE_VALUES],
)
def test_properties_match_references_section_5(label, spec, axis, prop, expected):
    """Each property of the references.md §5 sections agrees with the published value to 0.5 %."""
    section = section_from_spec(spec, axis=axis)
    value = getattr(section, prop) / _UNITS[prop]
    assert _relative(value, expected) <= REFERENCE_TOLERANCE, f"{label} {axis} {prop}: {value:.5g}"


@pytest.mark.parametrize("spec", [IPE_200, IPE_300, HEB_200, HEA_200], ids=lambda s: f"h={s['h']}")
def test_catalogue_sections_equal_their_parametric_form(spec):
    """A catalogue I/H and the rolled_i spec with the references.md §5 dimensions give the same properties."""
    name = {0.0056: "IPE 200", 0.0071: "IPE 300", 0.009: "HEB 200", 0.0065: "HEA 200"}[spec["tw"]]
    for axis in ("major", "minor"):
        catalogue = section_from_spec({"name": name}, axis=axis)
        parametric = section_from_spec(spec, axis=axis)
        for prop in ("A", "I", "W_el", "W_pl", "i", "A_v"):
            assert getattr(catalogue, prop) == pytest.approx(getattr(parametric, prop), rel=1e-12)


# ----------------------------------------------------------------------------- the catalogue self-check

_HANDBOOK_ENTRIES = (
    [(name, "rolled_i", data) for name, data in catalogue.ROLLED_I.items()]
    + [(name, "rhs", data) for name, data in catalogue.HOLLOW_RECTANGULAR.items()]
    + [(name, "chs", (*data, None)) for name, data in catalogue.HOLLOW_CIRCULAR.items()]
)


@pytest.mark.parametrize(("name", "shape", "data"), _HANDBOOK_ENTRIES, ids=[e[0] for e in _HANDBOOK_ENTRIES])
def test_catalogue_dimensions_reproduce_the_handbook_area_and_second_moments(name, shape, data):
    """Each entry's stored dimensions give its stored handbook A, I_y and I_z (all from memory) to 1 %."""
    _, A, I_y, I_z = data
    major = section_from_spec({"name": name}, axis="major")
    minor = section_from_spec({"name": name}, axis="minor")
    assert _relative(major.A / CM2, A) <= CATALOGUE_TOLERANCE, f"{name} A {major.A / CM2:.4g} vs {A}"
    assert _relative(major.I / CM4, I_y) <= CATALOGUE_TOLERANCE, f"{name} I_y {major.I / CM4:.5g} vs {I_y}"
    if I_z is not None:
        assert _relative(minor.I / CM4, I_z) <= CATALOGUE_TOLERANCE, f"{name} I_z {minor.I / CM4:.5g}"


def test_every_catalogue_entry_is_checked_or_exact_by_formula():
    """Every catalogue name has handbook values to check, or is a timber size whose A and I are exact.

    The US W shapes are checked against their handbook A, I, Z and S in tests/engine/test_w_shapes.py."""
    checked = {entry[0] for entry in _HANDBOOK_ENTRIES} | set(catalogue.W_SHAPES)
    unchecked = [name for name in catalogue_names() if name not in checked]
    assert unchecked == list(catalogue.TIMBER)


def _sizes_in_name(name: str) -> list[float]:
    return [float(part) for part in re.split(r"[ W]", name, maxsplit=1)[1].split("x")]


@pytest.mark.parametrize("name", catalogue_names())
def test_catalogue_names_agree_with_their_dimensions(name):
    """The sizes in a name are its stored dimensions: h for IPE and HEB, every size for hollow and timber.

    A W shape's name is its nominal depth and weight, checked in tests/engine/test_w_shapes.py."""
    sizes = _sizes_in_name(name)
    section = section_from_spec({"name": name})
    dims_mm = {key: value * 1000.0 for key, value in section.dimensions.items()}
    if name.startswith(("IPE", "HEB")):
        assert dims_mm["h"] == pytest.approx(sizes[0], rel=1e-12)
    elif name.startswith(("SHS", "RHS")):
        assert [dims_mm["h"], dims_mm["b"], dims_mm["t"]] == pytest.approx(sizes, rel=1e-12)
    elif name.startswith("CHS"):
        assert [dims_mm["D"], dims_mm["t"]] == pytest.approx(sizes, rel=1e-12)
    elif name.startswith("TIMBER"):
        assert [dims_mm["b"], dims_mm["h"]] == pytest.approx(sizes, rel=1e-12)
    else:
        assert name.startswith(("HEA", "W")), name  # HEA and W sizes are nominal: not h itself


def test_catalogue_covers_the_sizes_asked_for():
    """The catalogue holds IPE 80 to 600, HEA and HEB 100 to 400 at least, and the §5 hollow sections."""
    names = set(catalogue_names())
    ipe = {
        f"IPE {n}"
        for n in (80, 100, 120, 140, 160, 180, 200, 220, 240, 270, 300, 330, 360, 400, 450, 500, 550, 600)
    }
    he = {
        f"HE{letter} {n}"
        for letter in "AB"
        for n in (100, 120, 140, 160, 180, 200, 220, 240, 260, 280, 300, 320, 340, 360, 400)
    }
    assert ipe | he | {"SHS 100x100x5", "CHS 114.3x5", "TIMBER 45x195"} <= names
    assert len(names) == len(catalogue_names())


@pytest.mark.parametrize("name", catalogue_names())
def test_catalogue_names_are_canonical(name):
    """Every catalogue name is its own normal form, so a normalised user name can find it."""
    assert normalise_name(name) == name


# ----------------------------------------------------------------------------- sectionproperties


@pytest.fixture(scope="module")
def fe():
    """Return a function computing A, I, W_el and W_pl (both axes, mm units) with sectionproperties."""
    from sectionproperties.analysis import Section as FESection

    def properties(geometry):
        # [mm²]; the properties of a polygon integrate exactly, so the mesh size hardly matters
        geometry.create_mesh(mesh_sizes=[20.0])
        analysis = FESection(geometry)
        analysis.calculate_geometric_properties()
        analysis.calculate_plastic_properties()
        ixx, iyy, _ = analysis.get_ic()
        zxx_plus, zxx_minus, zyy_plus, zyy_minus = analysis.get_z()
        sxx, syy = analysis.get_s()
        return {
            ("major", "A"): analysis.get_area(),
            ("minor", "A"): analysis.get_area(),
            ("major", "I"): ixx,
            ("minor", "I"): iyy,
            ("major", "W_el"): min(zxx_plus, zxx_minus),
            ("minor", "W_el"): min(zyy_plus, zyy_minus),
            ("major", "W_pl"): sxx,
            ("minor", "W_pl"): syy,
        }

    return properties


def _fe_geometry(spec: dict):
    """The sectionproperties geometry of a spec, in millimetres, x across the width and y up the depth."""
    from sectionproperties.pre.library import (
        circular_hollow_section,
        circular_section,
        i_section,
        rectangular_hollow_section,
        rectangular_section,
    )

    n_r = 64  # chords per quarter circle
    mm = {key: value * 1000.0 for key, value in spec.items() if isinstance(value, float)}
    shape = spec["shape"]
    if shape == "rolled_i":
        return i_section(d=mm["h"], b=mm["b"], t_f=mm["tf"], t_w=mm["tw"], r=mm["r"], n_r=n_r)
    if shape == "welded_i":
        return i_section(d=mm["h"], b=mm["b"], t_f=mm["tf"], t_w=mm["tw"], r=0.0, n_r=1)
    if shape == "rhs":
        section = section_from_spec(spec)
        r_o, r_i = section.dimensions["r_o"] * 1000.0, section.dimensions["r_i"] * 1000.0
        return rectangular_hollow_section(d=mm["h"], b=mm["b"], t=mm["t"], r_out=r_o, r_in=r_i, n_r=n_r)
    if shape == "chs":
        return circular_hollow_section(d=mm["D"], t=mm["t"], n=4 * n_r)
    if shape == "rectangle":
        return rectangular_section(d=mm["h"], b=mm["b"])
    return circular_section(d=mm["D"], n=4 * n_r)


# Parametric shapes, each with the corner radius rule it exercises. Dimensions of the real sizes as in the
# catalogue; the welded girder, the cold-formed RHS and the solids are invented.
FE_SPECS = {
    "rolled IPE 200": IPE_200,
    "rolled HEB 200": HEB_200,
    "welded I 600x250x8x15": {"shape": "welded_i", "h": 0.6, "b": 0.25, "tw": 0.008, "tf": 0.015},
    "RHS 150x100x6.3 hot-finished": {
        "shape": "rhs",
        "h": 0.15,
        "b": 0.1,
        "t": 0.0063,
        "manufacture": "hot-finished",
    },
    "RHS 200x120x5 cold-formed (r_o = 2t)": {
        "shape": "rhs",
        "h": 0.2,
        "b": 0.12,
        "t": 0.005,
        "manufacture": "cold-formed",
    },
    "RHS 200x120x8 cold-formed (r_o = 2.5t)": {
        "shape": "rhs",
        "h": 0.2,
        "b": 0.12,
        "t": 0.008,
        "manufacture": "cold-formed",
    },
    "SHS 200x200x12.5 cold-formed (r_o = 3t)": {
        "shape": "rhs",
        "h": 0.2,
        "b": 0.2,
        "t": 0.0125,
        "manufacture": "cold-formed",
    },
    "CHS 114.3x5": CHS_114,
    "rectangle 45x195": {"shape": "rectangle", "b": 0.045, "h": 0.195},
    "round 30": {"shape": "round", "D": 0.03},
}


@pytest.mark.parametrize("label", list(FE_SPECS))
def test_parametric_shapes_agree_with_sectionproperties(label, fe):
    """A, I, W_el and W_pl about both axes agree with sectionproperties' finite elements to 0.2 %."""
    spec = FE_SPECS[label]
    reference = fe(_fe_geometry(spec))
    units = {"A": 1e-6, "I": 1e-12, "W_el": 1e-9, "W_pl": 1e-9}  # mm², mm⁴, mm³ in m
    worst = []
    for axis in ("major", "minor"):
        section = section_from_spec(spec, axis=axis)
        for prop, unit in units.items():
            value = getattr(section, prop) / unit
            expected = reference[(axis, prop)]
            worst.append((_relative(value, expected), axis, prop, value, expected))
    error, axis, prop, value, expected = max(worst)
    assert error <= FE_TOLERANCE, f"{label} {axis} {prop}: {value:.6g} vs sectionproperties {expected:.6g}"


# ----------------------------------------------------------------------------- the spandrel


def test_spandrel_constants_match_a_numerical_integration():
    """The spandrel's area, centroid offset and own second moment match a scipy quadrature to 1e-9."""
    r = 0.012
    # The spandrel with its straight edges on x = 0 and y = 0 and the arc centred on (r, r):
    # for 0 <= x <= r it spans 0 <= y <= r - sqrt(r² - (r - x)²).
    top = lambda x: r - math.sqrt(r * r - (r - x) ** 2)  # noqa: E731
    area, _ = integrate.quad(top, 0.0, r, epsabs=0, epsrel=1e-13)
    first, _ = integrate.quad(lambda x: x * top(x), 0.0, r, epsabs=0, epsrel=1e-13)
    about_edge, _ = integrate.quad(lambda x: x * x * top(x), 0.0, r, epsabs=0, epsrel=1e-13)
    offset = first / area
    got_area, got_offset, got_own = section_properties.spandrel(r)
    assert got_area == pytest.approx(area, rel=1e-9)
    assert got_offset == pytest.approx(offset, rel=1e-9)
    assert got_own == pytest.approx(about_edge - area * offset**2, rel=1e-9)


# ----------------------------------------------------------------------------- minor axis


# Minor-axis moduli W_el,z and W_pl,z [cm³] (from memory, handbook tables); I_z from references.md §5.
MINOR_AXIS = {
    "IPE 200": (142.4, 28.47, 44.61),
    "IPE 300": (603.8, 80.50, 125.2),
    "HEB 200": (2003, 200.3, 305.8),
    "HEA 200": (1336, 133.6, 203.8),
}


@pytest.mark.parametrize("name", list(MINOR_AXIS))
def test_minor_axis_takes_the_minor_axis_values(name):
    """About the minor axis an I/H gives I_z, W_el,z and W_pl,z (0.5 %) and swaps depth and width."""
    I_z, W_el_z, W_pl_z = MINOR_AXIS[name]
    major = section_from_spec({"name": name})
    minor = section_from_spec({"name": name}, axis="minor")
    assert _relative(minor.I / CM4, I_z) <= REFERENCE_TOLERANCE
    assert _relative(minor.W_el / CM3, W_el_z) <= REFERENCE_TOLERANCE
    assert _relative(minor.W_pl / CM3, W_pl_z) <= REFERENCE_TOLERANCE
    assert minor.W_el == pytest.approx(minor.I / (major.width / 2.0), rel=1e-12)
    assert (minor.depth, minor.width) == (major.width, major.depth)
    assert minor.axis == "minor" and major.axis == "major"
    assert minor.A == major.A and minor.t_max == major.t_max and minor.h_over_b == major.h_over_b


@pytest.mark.parametrize(
    ("spec", "swapped"),
    [
        ({"shape": "rectangle", "b": 0.045, "h": 0.195}, {"shape": "rectangle", "b": 0.195, "h": 0.045}),
        (
            {"shape": "rhs", "h": 0.2, "b": 0.1, "t": 0.008, "manufacture": "hot-finished"},
            {"shape": "rhs", "h": 0.1, "b": 0.2, "t": 0.008, "manufacture": "hot-finished"},
        ),
        (
            {"shape": "rhs", "h": 0.25, "b": 0.15, "t": 0.012, "manufacture": "cold-formed"},
            {"shape": "rhs", "h": 0.15, "b": 0.25, "t": 0.012, "manufacture": "cold-formed"},
        ),
    ],
    ids=["rectangle", "rhs hot-finished", "rhs cold-formed"],
)
def test_minor_axis_of_a_rectangular_shape_is_the_major_axis_turned_over(spec, swapped):
    """The minor axis of h × b has the properties of the major axis of b × h, interaction a included."""
    minor = section_from_spec(spec, axis="minor")
    turned = section_from_spec(swapped, axis="major")
    for prop in ("A", "I", "W_el", "W_pl", "i", "A_v", "depth", "width", "interaction_a", "t_max"):
        expected = getattr(turned, prop)
        if expected is None:  # e.g. a rectangle has no interaction a: compare plainly, not through approx
            assert getattr(minor, prop) is None, prop
        else:
            assert getattr(minor, prop) == pytest.approx(expected, rel=1e-12), prop


@pytest.mark.parametrize(
    "spec", [CHS_114, {"shape": "round", "D": 0.03}, SHS_HOT], ids=["chs", "round", "shs"]
)
def test_sections_symmetric_about_both_axes_give_the_same_values_about_each(spec):
    """A tube, a bar and a square hollow section have the same properties about either axis."""
    major, minor = section_from_spec(spec), section_from_spec(spec, axis="minor")
    for prop in ("A", "I", "W_el", "W_pl", "A_v"):
        assert getattr(minor, prop) == pytest.approx(getattr(major, prop), rel=1e-12)


# ----------------------------------------------------------------------------- shear areas and the rest


# A_v,z [cm²] for shear parallel to the web (from memory, handbook tables), to 0.5 %.
@pytest.mark.parametrize(
    ("name", "expected"), [("IPE 200", 14.00), ("IPE 300", 25.68), ("HEB 200", 24.83), ("HEA 200", 18.08)]
)
def test_rolled_shear_area_parallel_to_the_web_matches_the_handbook(name, expected):
    """A rolled I/H's A_v for major-axis bending is A − 2btf + (tw + 2r)tf, as the handbook prints it."""
    assert _relative(section_from_spec({"name": name}).A_v / CM2, expected) <= REFERENCE_TOLERANCE


def test_shear_areas_follow_their_formulas():
    """Shear areas: welded h_w tw, flanges A − h_w tw, RHS A·h/(b + h), CHS 2A/π, solids 2A/3 and 3A/4."""
    welded = {"shape": "welded_i", "h": 0.6, "b": 0.25, "tw": 0.008, "tf": 0.015}
    hw_tw = (0.6 - 2 * 0.015) * 0.008
    assert section_from_spec(welded).A_v == pytest.approx(hw_tw, rel=1e-12)
    minor = section_from_spec(welded, axis="minor")
    assert minor.A_v == pytest.approx(minor.A - hw_tw, rel=1e-12)
    ipe = section_from_spec(IPE_200, axis="minor")
    assert ipe.A_v == pytest.approx(ipe.A - (0.2 - 2 * 0.0085) * 0.0056, rel=1e-12)
    rhs = {"shape": "rhs", "h": 0.2, "b": 0.1, "t": 0.008, "manufacture": "hot-finished"}
    major = section_from_spec(rhs)
    assert major.A_v == pytest.approx(major.A * 0.2 / 0.3, rel=1e-12)
    assert section_from_spec(rhs, axis="minor").A_v == pytest.approx(major.A * 0.1 / 0.3, rel=1e-12)
    chs = section_from_spec(CHS_114)
    assert chs.A_v == pytest.approx(2 * chs.A / math.pi, rel=1e-12)
    timber = section_from_spec({"name": "TIMBER 45x195"})
    assert timber.A_v == pytest.approx(2 * 0.045 * 0.195 / 3, rel=1e-12)
    bar = section_from_spec({"shape": "round", "D": 0.03})
    assert bar.A_v == pytest.approx(0.75 * math.pi * 0.03**2 / 4, rel=1e-12)


def test_interaction_a_follows_en_1993_1_1_6_2_9_1():
    """a = (A − 2btf)/A for an I/H, a_w and a_f for an RHS, each capped at 0.5, None for the rest."""
    ipe = section_from_spec({"name": "IPE 200"})
    assert ipe.interaction_a == pytest.approx((ipe.A - 2 * 0.1 * 0.0085) / ipe.A, rel=1e-12)
    deep = section_from_spec({"shape": "welded_i", "h": 1.5, "b": 0.2, "tw": 0.012, "tf": 0.012})
    assert deep.interaction_a == 0.5  # (A − 2btf)/A = 0.88 here
    rhs = {"shape": "rhs", "h": 0.3, "b": 0.1, "t": 0.01, "manufacture": "hot-finished"}
    major, minor = section_from_spec(rhs), section_from_spec(rhs, axis="minor")
    assert (major.A - 2 * 0.1 * 0.01) / major.A > 0.5 and major.interaction_a == 0.5  # a_w, capped
    assert minor.interaction_a == pytest.approx((minor.A - 2 * 0.3 * 0.01) / minor.A, rel=1e-12)  # a_f
    assert minor.interaction_a < 0.5
    assert section_from_spec(CHS_114).interaction_a is None
    assert section_from_spec({"name": "TIMBER 45x195"}).interaction_a is None


@pytest.mark.parametrize(
    ("t", "ratio"), [(0.004, 2.0), (0.006, 2.0), (0.0063, 2.5), (0.010, 2.5), (0.0125, 3.0)]
)
def test_cold_formed_corner_radii_step_with_thickness(t, ratio):
    """Cold-formed RHS corners: r_o = 2t to 6 mm, 2.5t to 10 mm, 3t above (EN 10219-2, from memory)."""
    section = section_from_spec({"shape": "rhs", "h": 0.3, "b": 0.2, "t": t, "manufacture": "cold-formed"})
    assert section.dimensions["r_o"] == pytest.approx(ratio * t, rel=1e-12)
    assert section.dimensions["r_i"] == pytest.approx((ratio - 1.0) * t, rel=1e-12)


def test_flags_and_extents_describe_the_shape():
    """open_section, h_over_b, t_max, manufacture and the description follow the shape."""
    ipe = section_from_spec(IPE_200)
    assert ipe.name == "rolled I 200×100×5.6×8.5 r12"
    assert (ipe.open_section, ipe.doubly_symmetric, ipe.manufacture) == (True, True, "rolled")
    assert ipe.h_over_b == pytest.approx(2.0) and ipe.t_max == 0.0085
    assert (ipe.depth, ipe.width) == (0.2, 0.1)
    welded = section_from_spec({"shape": "welded_i", "h": 0.3, "b": 0.2, "tw": 0.02, "tf": 0.012, "a": 0.005})
    assert welded.t_max == 0.02 and welded.manufacture == "welded" and "a" not in welded.dimensions
    shs = section_from_spec({"name": "shs 100x100x5"})
    assert (shs.open_section, shs.h_over_b, shs.t_max) == (False, None, 0.005)
    assert shs.manufacture == "hot-finished"
    assert section_from_spec(CHS_114).manufacture == "cold-formed"
    assert section_from_spec({**CHS_114, "manufacture": "hot-finished"}).manufacture == "hot-finished"
    timber = section_from_spec({"name": "TIMBER 45x195"})
    assert (timber.shape, timber.manufacture) == ("rectangle", "solid")
    assert (timber.t_max, timber.open_section) == (0.045, False)


def test_every_catalogue_section_states_its_source():
    """Each catalogue section's source says where its values come from, "from memory" or "no source"."""
    for name in catalogue_names():
        source = section_from_spec({"name": name}).source
        assert "from memory" in source or "common practice, no source" in source, name


def test_custom_section_takes_its_values_as_given():
    """A custom section keeps A, I, W_el and W_pl, defaults A_v to A and leaves unknown extents as None."""
    spec = {"shape": "custom", "A": 2.8e-3, "I": 1.9e-5, "W_el": 1.9e-4, "W_pl": 2.2e-4}
    section = section_from_spec(spec, axis="minor")
    assert (section.A, section.I, section.W_el, section.W_pl, section.A_v) == (
        2.8e-3,
        1.9e-5,
        1.9e-4,
        2.2e-4,
        2.8e-3,
    )
    assert section.i == pytest.approx(math.sqrt(1.9e-5 / 2.8e-3), rel=1e-12)
    assert (section.depth, section.width, section.t_max, section.axis) == (None, None, None, "minor")
    assert (section.doubly_symmetric, section.open_section) == (False, True)
    given = section_from_spec({**spec, "A_v": 1.4e-3, "depth": 0.2, "t_max": 0.0085, "open_section": False})
    assert (given.A_v, given.depth, given.t_max, given.open_section) == (1.4e-3, 0.2, 0.0085, False)


def test_mass_per_metre_is_area_times_density():
    """IPE 200 in steel of 7850 kg/m³ weighs 22.4 kg/m (handbook, from memory; 0.5 %)."""
    mass = section_from_spec({"name": "IPE 200"}).mass_per_metre(7850.0)
    assert _relative(mass, 22.4) <= REFERENCE_TOLERANCE
    with pytest.raises(CaseError, match=r"^density: -1\.0 kg/m³ must be > 0"):
        section_from_spec({"name": "IPE 200"}).mass_per_metre(-1.0)


def test_section_is_a_frozen_value_that_revalidates_on_replace():
    """A section cannot be changed in place, hashes, and replace() with an inconsistent I is a CaseError."""
    section = section_from_spec({"name": "HEB 200"})
    with pytest.raises(dataclasses.FrozenInstanceError):
        section.I = 1.0
    assert hash(section) == hash(section_from_spec({"name": "heb200"}))
    with pytest.raises(CaseError, match=r"^i: .* must equal sqrt\(I/A\)"):
        dataclasses.replace(section, I=2 * section.I)
    renamed = dataclasses.replace(section, name="column C1")
    assert (renamed.name, renamed.I) == ("column C1", section.I)
    with pytest.raises(TypeError):
        Section(name="x")  # keyword-only and every field required


# ----------------------------------------------------------------------------- names


@pytest.mark.parametrize(
    ("written", "canonical"),
    [
        ("heb200", "HEB 200"),
        ("HEB 200", "HEB 200"),
        ("  heb   200 ", "HEB 200"),
        ("HE 200 B", "HEB 200"),
        ("he200a", "HEA 200"),
        ("Ipe 80", "IPE 80"),
        ("shs100x100x5", "SHS 100x100x5"),
        ("SHS 100 × 100 × 5", "SHS 100x100x5"),
        ("shs 100X100X5.0", "SHS 100x100x5"),
        ("chs 114.30×5", "CHS 114.3x5"),
        ("rhs 200x100x8", "RHS 200x100x8"),
        ("timber 45 x 195", "TIMBER 45x195"),
        ("Some Beam", "SOME BEAM"),
    ],
)
def test_names_are_case_and_space_insensitive(written, canonical):
    """normalise_name reads case, spaces, × or x and trailing zeros away, and HE 200 B as HEB 200."""
    assert normalise_name(written) == canonical


@pytest.mark.parametrize("written", ["heb200", "HE 200 B", "Heb 200"])
def test_catalogue_lookup_accepts_any_spelling(written):
    """section_from_spec finds HEB 200 however its name is spelt."""
    assert section_from_spec({"name": written}).name == "HEB 200"


def test_unknown_name_suggests_near_matches():
    """An unknown name is a CaseError at section.name that suggests catalogue names close to it."""
    with pytest.raises(
        CaseError,
        match=r"^section\.name: 'IPE 210' is not in the catalogue \(did you mean "
        r"'IPE 200', 'IPE 220'",
    ):
        section_from_spec({"name": "IPE 210"})
    with pytest.raises(
        CaseError,
        match=r"^section\.name: 'rhs 100x200x8' is not in the catalogue "
        r"\(did you mean 'RHS 200x100x8'\?\)",
    ):
        section_from_spec({"name": "rhs 100x200x8"})
    with pytest.raises(CaseError, match=r"^section\.name: 'UB 203x133x25' is not in the catalogue;"):
        section_from_spec({"name": "UB 203x133x25"})
    with pytest.raises(CaseError, match=r"^members\[1\]\.section\.name: 3 is not a section name"):
        section_from_spec({"name": 3}, path="members[1].section")
    with pytest.raises(TypeError):
        normalise_name(200)


# ----------------------------------------------------------------------------- bad input

ROLLED = {"shape": "rolled_i", "h": 0.2, "b": 0.1, "tw": 0.0056, "tf": 0.0085, "r": 0.012}
WELDED = {"shape": "welded_i", "h": 0.3, "b": 0.2, "tw": 0.01, "tf": 0.01}
RHS = {"shape": "rhs", "h": 0.2, "b": 0.1, "t": 0.008, "manufacture": "hot-finished"}
CUSTOM = {"shape": "custom", "A": 2.8e-3, "I": 1.9e-5, "W_el": 1.9e-4, "W_pl": 2.2e-4}

# (spec, the start of the message: field path and value received).
BAD_SPECS = [
    ({**ROLLED, "h": -0.2}, r"section\.h: -0\.2 m must be > 0"),
    ({**ROLLED, "b": 0}, r"section\.b: 0\.0 m must be > 0"),
    ({**ROLLED, "tw": float("nan")}, r"section\.tw: nan m is not finite"),
    ({**ROLLED, "tf": float("inf")}, r"section\.tf: inf m is not finite"),
    ({**ROLLED, "r": "12"}, r"section\.r: '12' is not a number"),
    ({**ROLLED, "r": True}, r"section\.r: True is a boolean"),
    ({**ROLLED, "r": 0.0}, r"section\.r: 0\.0 m must be > 0"),
    ({**ROLLED, "h": 200}, r"section\.h: 200\.0 m must be <= 10 m \(dimensions are in metres"),
    ({**ROLLED, "tf": 0.1}, r"section\.tf: 0\.1 m must be less than h/2 = 0\.1 m"),
    ({**ROLLED, "tw": 0.1}, r"section\.tw: 0\.1 m must be less than b = 0\.1 m"),
    ({**ROLLED, "h": 0.1, "r": 0.045}, r"section\.r: 0\.045 m is too large to fit between the flanges"),
    ({**ROLLED, "h": 0.5, "r": 0.05}, r"section\.r: 0\.05 m is too large to fit beside the web"),
    ({k: v for k, v in ROLLED.items() if k != "r"}, r"section\.r: required key is missing"),
    ({**ROLLED, "tff": 0.01}, r"section\.tff: unknown key \(did you mean 'tf'\?\)"),
    ({**ROLLED, "shape": "rolled_I"}, r"section\.shape: 'rolled_I' is not a shape \(did you mean 'rolled_i'"),
    ({**WELDED, "tf": 0.15}, r"section\.tf: 0\.15 m must be less than h/2"),
    ({**WELDED, "a": -0.004}, r"section\.a: -0\.004 m must be > 0"),
    ({**WELDED, "r": 0.01}, r"section\.r: unknown key"),
    ({**RHS, "t": 0.05}, r"section\.t: 0\.05 m must be less than min\(h, b\)/2 = 0\.05 m"),
    ({**RHS, "b": 0.06, "t": 0.011, "manufacture": "cold-formed"}, r"section\.t: 0\.011 m is too thick"),
    (
        {**RHS, "manufacture": "hot finished"},
        r"section\.manufacture: 'hot finished' is not a manufacture for a hollow section "
        r"\(did you mean 'hot-finished'",
    ),
    ({k: v for k, v in RHS.items() if k != "manufacture"}, r"section\.manufacture: required key is missing"),
    ({**RHS, "D": 0.1}, r"section\.D: unknown key"),
    ({"shape": "chs", "D": 0.1143, "t": 0.06}, r"section\.t: 0\.06 m must be less than D/2 = 0\.05715 m"),
    ({"shape": "chs", "D": 0.1143, "t": 0.005, "manufacture": "rolled"}, r"section\.manufacture: 'rolled'"),
    ({"shape": "chs", "d": 0.1143, "t": 0.005}, r"section\.d: unknown key \(did you mean 'D'\?\)"),
    ({"shape": "rectangle", "b": 0.045, "h": -0.195}, r"section\.h: -0\.195 m must be > 0"),
    ({"shape": "round", "D": None}, r"section\.D: None is not a number"),
    ({**CUSTOM, "W_pl": 1.0e-4}, r"section\.W_pl: 0\.0001 m³ must be >= W_el"),
    ({**CUSTOM, "W_pl": 1.0e-3}, r"section\.W_pl: 0\.001 m³ must be <= A·i"),
    ({**CUSTOM, "A_v": 3.0e-3}, r"section\.A_v: 0\.003 m² must be <= A"),
    ({**CUSTOM, "depth": 0.3}, r"section\.W_el: 0\.00019 m³ must be <= 2I/depth"),
    ({**CUSTOM, "open_section": "yes"}, r"section\.open_section: 'yes' is not allowed"),
    ({k: v for k, v in CUSTOM.items() if k != "I"}, r"section\.I: required key is missing"),
    ({**CUSTOM, "I": -1.9e-5}, r"section\.I: -1\.9e-05 m⁴ must be > 0"),
    ({"name": "HEB 200", "shape": "rolled_i"}, r"section: give either 'name'"),
    ({"name": "HEB 200", "axis": "major"}, r"section\.axis: unknown key"),
    ({"h": 0.2}, r"section: needs 'name' \(a catalogue section\) or 'shape'"),
    ([0.2, 0.1], r"section: \[0\.2, 0\.1\] is not an object"),
]


@pytest.mark.parametrize(
    ("spec", "message"),
    BAD_SPECS,
    ids=[m.split(":")[0].replace("\\", "") + f"-{n}" for n, (_, m) in enumerate(BAD_SPECS)],
)
def test_bad_spec_is_a_case_error_naming_its_field(spec, message):
    """Each bad section spec is a CaseError whose message starts with the field path and the value."""
    with pytest.raises(CaseError, match="^" + message):
        section_from_spec(spec)


def test_error_paths_start_with_the_path_given():
    """The path argument prefixes every field named in an error, also in checks made by the section."""
    with pytest.raises(CaseError, match=r"^members\[0\]\.section\.tf: "):
        section_from_spec({**ROLLED, "tf": 0.2}, path="members[0].section")
    with pytest.raises(CaseError, match=r"^members\[0\]\.section\.W_pl: "):
        section_from_spec({**CUSTOM, "W_pl": 1.0e-4}, path="members[0].section")


def test_bad_axis_is_a_case_error():
    """An axis other than major or minor is a CaseError naming the axis and suggesting the nearest one."""
    with pytest.raises(CaseError, match=r"^axis: 'majr' is not an axis \(did you mean 'major'\?\)"):
        section_from_spec({"name": "IPE 200"}, axis="majr")


def test_every_required_key_of_every_shape_is_checked_for():
    """Leaving out any one required key of any shape is a CaseError naming that key."""
    full = {
        "rolled_i": ROLLED,
        "welded_i": WELDED,
        "rhs": RHS,
        "chs": CHS_114,
        "rectangle": {"shape": "rectangle", "b": 0.045, "h": 0.195},
        "round": {"shape": "round", "D": 0.03},
        "custom": CUSTOM,
    }
    assert set(full) == set(sections.SHAPES)
    for spec in full.values():
        section_from_spec(spec)  # the full spec is good
        for key in spec:
            if key == "shape":
                continue
            partial = {k: v for k, v in spec.items() if k != key}
            with pytest.raises(CaseError, match=rf"^section\.{re.escape(key)}: required key is missing"):
                section_from_spec(partial)
