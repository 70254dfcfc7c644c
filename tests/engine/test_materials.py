"""Tests of engine.materials: the catalogue of grades, their sources, and custom materials.

Reference values come from tests/REFERENCES.md §6 and carry its flags: "[text]" values were seen in a
published text, "from memory" values were recalled. Catalogue values are stored exactly, so they are compared
exactly (tolerance 0) after the MPa to Pa conversion.
"""

from __future__ import annotations

import dataclasses
import math

import pytest

from engine.errors import CaseError
from engine.materials import MATERIAL_KINDS, Material, material_from_spec, material_names

MPA = 1e6

# EN 10025-2 minimum f_y [MPa] by nominal thickness <=16 / 16–40 / 40–63 / 63–80 / 80–100 mm
# (references.md §6, [text]).
EN_10025_2 = {
    "S235": (235, 225, 215, 215, 215),
    "S275": (275, 265, 255, 245, 235),
    "S355": (355, 345, 335, 325, 315),
}
# S460N/M (EN 10025-3/-4), from memory.
S460 = (460, 440, 430, 410, 400)

# Thicknesses [m] and the band each belongs to; the edges belong to the thinner band ("t <= 16 mm").
BAND_CASES = [
    (0.003, 0),
    (0.016, 0),
    (0.0161, 1),
    (0.040, 1),
    (0.0405, 2),
    (0.063, 2),
    (0.0631, 3),
    (0.080, 3),
    (0.0801, 4),
    (0.100, 4),
]


@pytest.mark.parametrize("grade", sorted(EN_10025_2))
@pytest.mark.parametrize(("thickness", "band"), BAND_CASES)
def test_en_10025_2_yield_strength_by_thickness(grade, thickness, band):
    """f_y follows the EN 10025-2 thickness bands, edges included (references.md §6 [text]; exact)."""
    material = material_from_spec({"name": grade}, thickness=thickness)
    assert material.fy == EN_10025_2[grade][band] * MPA
    assert material.f_c == material.fy


@pytest.mark.parametrize(("thickness", "band"), BAND_CASES)
def test_s460_yield_strength_by_thickness(thickness, band):
    """S460 takes 460/440/430/410/400 MPa by band (EN 10025-3/-4, from memory; exact)."""
    material = material_from_spec({"name": "S460"}, thickness=thickness)
    assert material.fy == S460[band] * MPA
    assert "from memory" in material.source


@pytest.mark.parametrize(
    ("thickness", "text"),
    [
        (0.016, "t <= 16 mm"),
        (0.020, "16 < t <= 40 mm"),
        (0.050, "40 < t <= 63 mm"),
        (0.070, "63 < t <= 80 mm"),
        (0.090, "80 < t <= 100 mm"),
    ],
)
def test_thickness_band_is_named(thickness, text):
    """The band that gave f_y is recorded in thickness_band and in the source."""
    material = material_from_spec({"name": "S355"}, thickness=thickness)
    assert material.thickness_band == text
    assert text in material.source


def test_no_thickness_takes_the_first_band_and_says_so():
    """Without a thickness an EN steel takes t <= 16 mm and its band text says that it was assumed."""
    material = material_from_spec({"name": "S275"})
    assert material.fy == 275 * MPA
    assert material.thickness_band.startswith("t <= 16 mm")
    assert "assumed" in material.thickness_band


@pytest.mark.parametrize("thickness", [0.1001, 0.120, 1.0])
def test_thickness_beyond_the_table_is_an_error(thickness):
    """Above 100 mm EN 10025-2 tabulates no f_y here, so the thickness is refused, naming the field."""
    with pytest.raises(CaseError, match=r"^material\.thickness: .* mm\) is thicker than the table of S355"):
        material_from_spec({"name": "S355"}, thickness=thickness)


@pytest.mark.parametrize("thickness", [0.0, -0.01, math.nan, math.inf, "16", True])
def test_bad_thickness_is_an_error(thickness):
    """A thickness must be a finite number > 0 [m]; the message names material.thickness."""
    with pytest.raises(CaseError, match=r"^material\.thickness: "):
        material_from_spec({"name": "S235"}, thickness=thickness)


@pytest.mark.parametrize("grade", ["S235", "S275", "S355", "S460"])
def test_en_steel_elastic_constants(grade):
    """E = 210 000 MPa, G = 81 000 MPa (EN 1993-1-1 §3.2.6 [text]); 7850 kg/m³ (EN 1991-1-1, from memory)."""
    material = material_from_spec({"name": grade}, thickness=0.01)
    assert material.kind == "steel"
    assert material.E == 210_000 * MPA
    assert material.G == 81_000 * MPA
    assert material.density == 7850.0
    assert material.E_05 is None
    assert "EN 1993-1-1 §3.2.6" in material.source


# One ksi in Pa, from the exact definitions (NIST SP 811, from memory): 1 lbf = 4.4482216152605 N and
# 1 in = 0.0254 m, so 1 ksi = 6.894757293168361 MPa.
KSI = 6.894757293168361 * MPA


def test_one_ksi_is_the_exact_conversion():
    """1 ksi = 1000 lbf/in² = 6.894 757 293 168 361 MPa (NIST SP 811, from memory), to rounding."""
    material = material_from_spec({"name": "ASTM A36"})
    assert material.fy / 36.0 == pytest.approx(KSI, rel=1e-15)


def test_astm_a992():
    """F_y = 50 ksi (ASTM A992 [text]); E = 29 000 ksi, G = 11 200 ksi (AISC 360-16, from memory); exact."""
    material = material_from_spec({"name": "ASTM A992"}, thickness=0.05)
    assert material.fy == pytest.approx(50 * KSI, rel=1e-15)
    assert material.fy == material.f_c
    assert material.fy / MPA == pytest.approx(344.7379, abs=5e-5)  # never rounded up to 345 MPa
    assert material.E == pytest.approx(29_000 * KSI, rel=1e-15)
    assert material.E / MPA == pytest.approx(199_947.96, abs=0.005)
    assert material.G == pytest.approx(11_200 * KSI, rel=1e-15)
    assert material.thickness_band == ""
    assert "[text]" in material.source and "from memory" in material.source


def test_astm_a36():
    """F_y = 36 ksi (ASTM A36, from memory); E as A992; exact."""
    material = material_from_spec({"name": "ASTM A36"})
    assert material.fy == pytest.approx(36 * KSI, rel=1e-15)
    assert material.E == pytest.approx(29_000 * KSI, rel=1e-15)
    assert "ASTM A36 (from memory)" in material.source


@pytest.mark.parametrize(
    ("name", "fy_ksi"), [("ASTM A500 Gr. C rectangular", 50), ("ASTM A500 Gr. C round", 46)]
)
def test_astm_a500_grade_c(name, fy_ksi):
    """A500 Gr. C HSS: F_y = 50 ksi rectangular, 46 ksi round (ASTM A500, from memory); E as A992."""
    material = material_from_spec({"name": name})
    assert material.fy == pytest.approx(fy_ksi * KSI, rel=1e-15)
    assert material.E == pytest.approx(29_000 * KSI, rel=1e-15)
    assert "ASTM A500 Grade C" in material.source and "from memory" in material.source


def test_timber_c24():
    """EN 338 C24: f_m,k 24, f_c,0,k 21, E0,mean 11 000, E0,05 7 400 MPa (references.md §6 [text]); exact."""
    material = material_from_spec({"name": "C24"}, thickness=0.2)
    assert material.kind == "timber"
    assert material.fy == 24 * MPA
    assert material.f_c == 21 * MPA
    # The analysis takes E_0,05 (EN 1995-1-1 §6.3.2, from memory); the mean is kept beside it.
    assert material.E == 7_400 * MPA and material.E_mean == 11_000 * MPA
    assert material.E_05 == 7_400 * MPA
    assert material.density == 420.0  # mean density, from memory
    assert "EN 338" in material.source


def test_glulam_gl24h():
    """EN 14080 GL24h: f_m,k 24, f_c,0,k 24, E0,mean 11 500, E0,05 9 600 MPa, 420 kg/m³ (from memory)."""
    material = material_from_spec({"name": "GL24h"})
    assert (material.fy, material.f_c) == (24 * MPA, 24 * MPA)
    assert (material.E_mean, material.E, material.E_05) == (11_500 * MPA, 9_600 * MPA, 9_600 * MPA)
    assert material.density == 420.0
    assert "EN 14080" in material.source and "from memory" in material.source


def test_aluminium_6082_t6():
    """EN 1999-1-1 §3.2.5: E 70 000, G 27 000 MPa [text]; f_0.2 = 250 MPa and 2700 kg/m³ (from memory)."""
    material = material_from_spec({"name": "6082-T6"})
    assert material.kind == "aluminium"
    assert (material.E, material.G) == (70_000 * MPA, 27_000 * MPA)
    assert (material.fy, material.f_c) == (250 * MPA, 250 * MPA)
    assert material.density == 2700.0
    assert "EN 1999-1-1 §3.2.5 [text]" in material.source


@pytest.mark.parametrize(
    ("spelling", "name"),
    [
        ("s355", "S355"),
        (" S 355 ", "S355"),
        ("astm a992", "ASTM A992"),
        ("A992", "ASTM A992"),
        ("a36", "ASTM A36"),
        ("A500C round", "ASTM A500 Gr. C round"),
        ("astm a500 gr c rectangular", "ASTM A500 Gr. C rectangular"),
        ("c24", "C24"),
        ("GL24H", "GL24h"),
        ("en aw-6082 t6", "EN AW-6082 T6"),
        ("S355J2", "S355"),
        ("s235 jr", "S235"),
        ("S275J0", "S275"),
        ("S460NL", "S460"),
        ("S460M", "S460"),
    ],
)
def test_names_ignore_case_and_spaces(spelling, name):
    """Catalogued names are read without regard to case, spaces, hyphens or a quality suffix (J2, NL, ...)."""
    assert material_from_spec({"name": spelling}).name == name


def test_every_catalogued_name_resolves_and_cites_its_source():
    """Each name of material_names() builds a material whose source flags how sure each value is."""
    names = material_names()
    assert names == (
        "S235",
        "S275",
        "S355",
        "S460",
        "ASTM A992",
        "ASTM A36",
        "ASTM A500 Gr. C rectangular",
        "ASTM A500 Gr. C round",
        "C24",
        "GL24h",
        "EN AW-6082 T6",
    )
    for name in names:
        material = material_from_spec({"name": name})
        assert material.name == name
        assert material.kind in MATERIAL_KINDS
        assert "[text]" in material.source or "from memory" in material.source
        assert material.f_c <= material.fy
        # A yield strain fy/E below 1 % catches a MPa-for-Pa slip in the table (common practice, no source).
        assert 1e-4 < material.fy / material.E < 1e-2


@pytest.mark.parametrize(
    ("name", "suggestion"), [("S356", "S355"), ("S235JJ", "S235"), ("C42", "C24"), ("ASTM A922", "ASTM A992")]
)
def test_unknown_name_suggests_the_nearest(name, suggestion):
    """An unknown grade is a CaseError naming material.name, the value and the nearest catalogued name."""
    with pytest.raises(CaseError, match=r"^material\.name: ") as error:
        material_from_spec({"name": name})
    message = str(error.value)
    assert repr(name) in message
    assert f"did you mean {suggestion!r}" in message
    assert "'S235'" in message  # lists what is allowed


def test_unknown_name_without_a_near_match_lists_the_grades():
    """A name far from every grade gets no suggestion but still lists the catalogue."""
    with pytest.raises(CaseError, match=r"^material\.name: 'unobtainium' is not a catalogued material; "):
        material_from_spec({"name": "unobtainium"})


@pytest.mark.parametrize(
    ("key", "suggestion"), [("fyy", "fy"), ("e", "E"), ("densty", "density"), ("fc", "f_c")]
)
def test_unknown_key_names_the_field_and_suggests(key, suggestion):
    """An unknown key is a CaseError naming material.<key> with the nearest allowed key."""
    with pytest.raises(CaseError, match=rf"^material\.{key}: unknown key \(did you mean {suggestion!r}\?\)"):
        material_from_spec({"E": 2e11, "fy": 3e8, key: 1.0})


def test_custom_material_defaults():
    """A custom material takes f_c = fy, density 7850 kg/m³ and the name 'custom' unless told otherwise."""
    material = material_from_spec({"E": 2.1e11, "fy": 3.55e8})
    assert (material.name, material.kind) == ("custom", "custom")
    assert (material.E, material.fy, material.f_c) == (2.1e11, 3.55e8, 3.55e8)
    assert material.density == 7850.0
    assert material.G is None and material.E_05 is None
    assert material.thickness_band == ""
    assert "custom" in material.source and "assumed" in material.source


def test_custom_material_takes_every_given_value():
    """Every optional custom key is stored as given, and the thickness does not change it."""
    spec = {
        "name": "test alloy (invented)",
        "kind": "aluminium",
        "E": 7.2e10,
        "G": 2.7e10,
        "fy": 2.0e8,
        "f_c": 1.8e8,
        "density": 2800,
        "E_05": 6.0e10,
    }
    material = material_from_spec(spec, thickness=0.3)
    assert material == Material(
        name="test alloy (invented)",
        kind="aluminium",
        E=7.2e10,
        G=2.7e10,
        fy=2.0e8,
        f_c=1.8e8,
        density=2800.0,
        E_05=6.0e10,
        thickness_band="",
        source=material.source,
    )
    assert "density given" in material.source


def test_negative_yield_is_an_error_naming_the_field():
    """fy <= 0 is a CaseError naming material.fy, the value and the rule (> 0)."""
    with pytest.raises(CaseError, match=r"^material\.fy: -300000000\.0 Pa must be finite and > 0$"):
        material_from_spec({"E": 2.1e11, "fy": -3e8})


@pytest.mark.parametrize(
    ("key", "value"),
    [
        ("E", 0.0),
        ("E", math.inf),
        ("E", "210 GPa"),
        ("fy", math.nan),
        ("f_c", -1.0),
        ("density", -7850.0),
        ("G", 0.0),
        ("E_05", True),
    ],
)
def test_bad_custom_value_names_its_field(key, value):
    """Each custom value must be a finite number > 0 (density >= 0); the message names material.<key>."""
    spec = {"E": 2.1e11, "fy": 3.55e8, key: value}
    with pytest.raises(CaseError, match=rf"^material\.{key}: "):
        material_from_spec(spec)


@pytest.mark.parametrize("missing", ["E", "fy"])
def test_custom_material_needs_e_and_fy(missing):
    """A custom material without E or fy names the missing key."""
    spec = {"E": 2.1e11, "fy": 3.55e8}
    del spec[missing]
    with pytest.raises(CaseError, match=rf"^material\.{missing}: required key is missing"):
        material_from_spec(spec)


def test_quality_suffix_keeps_the_strength():
    """S355J2 and S355 give the same f_y in every band (EN 10025-2: the suffix is toughness; from memory)."""
    for thickness, band in BAND_CASES:
        material = material_from_spec({"name": "S355J2"}, thickness=thickness)
        assert material.fy == EN_10025_2["S355"][band] * MPA


def test_custom_values_under_a_grade_name_are_refused():
    """A grade name with custom values is ambiguous (override or typo), so it is refused."""
    with pytest.raises(CaseError, match=r"^material\.name: 'S355' is a catalogued grade"):
        material_from_spec({"name": "S355", "fy": 3.0e8, "E": 2.1e11})


def test_bad_kind_is_refused_with_a_suggestion():
    """kind must be one of MATERIAL_KINDS; a near miss is suggested."""
    with pytest.raises(CaseError, match=r"^material\.kind: 'timbre' .*did you mean 'timber'"):
        material_from_spec({"E": 1.1e10, "fy": 2.4e7, "kind": "timbre"})


@pytest.mark.parametrize("spec", [{}, {"name": 355}, "S355", None])
def test_malformed_specs_are_errors(spec):
    """An empty spec, a non-string name or a spec that is not a mapping is a CaseError naming the field."""
    with pytest.raises(CaseError, match=r"^material(\.name)?: "):
        material_from_spec(spec)


def test_path_prefix_is_used_in_messages():
    """The caller's path prefixes every message, so a nested material is located."""
    with pytest.raises(CaseError, match=r"^members\[1\]\.material\.name: 'S999'"):
        material_from_spec({"name": "S999"}, path="members[1].material")
    with pytest.raises(CaseError, match=r"^members\[1\]\.material\.thickness: "):
        material_from_spec({"name": "S355"}, thickness=0.2, path="members[1].material")


def test_material_is_frozen_and_keyword_only():
    """Material is a frozen keyword-only dataclass; dataclasses.replace makes changes and validates them."""
    material = material_from_spec({"name": "S355"}, thickness=0.01)
    with pytest.raises(dataclasses.FrozenInstanceError):
        material.fy = 1.0
    with pytest.raises(TypeError):
        Material("S355", "steel", 2.1e11, None, 3.55e8, 3.55e8, 7850.0, None, "", "")  # type: ignore[misc]
    assert dataclasses.replace(material, fy=3.0e8).fy == 3.0e8
    with pytest.raises(CaseError, match=r"^material\.fy: -1\.0 Pa must be finite and > 0$"):
        dataclasses.replace(material, fy=-1.0)


def test_direct_construction_validates_the_kind():
    """A Material built in Python is checked like one from a spec: an unknown kind is refused."""
    with pytest.raises(CaseError, match=r"^material\.kind: 'concrete' is not a material kind"):
        Material(
            name="x",
            kind="concrete",
            E=3e10,
            G=None,
            fy=3e7,
            f_c=3e7,
            density=2400.0,
            E_05=None,
            thickness_band="",
            source="invented",
        )
