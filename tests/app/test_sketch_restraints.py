"""The sketch and the page of a member with restraints, steps and a foundation (engine issue 16). Invented
cases.

The sketch's symbols are strutscope's own: a brace (a post on a hatched foot), a zigzag spring on the ground,
a collar of two bars for a fixed rotation, a spiral for an elastic one, a white circle for a hinge, a
hatched band for a foundation and a change of the member's line weight at a step.
"""

import math

import pytest

import engine
from app import exports
from app.page.member import MemberPage
from app.page.restraints import InsideView
from app.serve import make_page
from app.sketch import ROLES, Polygon, Polyline, Text, sketch
from app.state import MemberState, values_from_mapping
from app.units import units

BASE = {
    "title": "Invented braced beam",
    "length": 6.0,
    "EI": 4.2e6,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 1.0e5,
    "loads": [{"type": "uniform", "q": 2.5e3}],
}
EVERYTHING = {
    "restraints": [
        {"x": 2.0, "translation": "fixed"},
        {"x": 3.0, "translation": 5.0e5, "hinge": True},
        {"x": 4.0, "translation": "fixed", "rotation": 1.0e5},
        {"x": 5.0, "rotation": "fixed"},
    ],
    "steps": [{"x": 4.5, "EI": 8.4e6}],
    "foundation": [{"start": 4.5, "end": 6.0, "k": 2.0e6}],
}


def _sketch(system="si", **extra):
    result = engine.solve(engine.Case.from_dict({**BASE, **extra}))
    return result, sketch(result, units(system))


def _near(shapes, x, role):
    return [
        s
        for s in shapes
        if isinstance(s, Polyline) and s.role == role and all(abs(xi - x) < 1e-9 for xi in s.x)
    ]


def test_each_restraint_has_its_symbol_at_its_x():
    _, drawn = _sketch(**EVERYTHING)
    shapes = drawn.shapes
    assert all(s.role in ROLES for s in shapes)
    assert all(math.isfinite(v) for s in shapes if isinstance(s, Polyline) for v in (*s.x, *s.dx, *s.dy))
    brace = [s for s in _near(shapes, 2.0, "support") if isinstance(s, Polygon)]
    assert len(brace) == 1  # the post
    assert _near(shapes, 2.0, "hatch")  # its foot's hatching
    assert _near(shapes, 3.0, "spring")  # the zigzag
    assert any(isinstance(s, Polygon) and s.role == "hinge" for s in _near(shapes, 3.0, "hinge"))
    assert _near(shapes, 4.0, "spring")  # the spiral of the elastic rotation
    collar = [s for s in _near(shapes, 5.0, "support") if s.width == 1.6]
    assert len(collar) == 2
    labels = [s.text for s in shapes if isinstance(s, Text)]
    assert [f"R{i}" for i in range(1, 5)] == [t for t in labels if t.startswith("R")]
    assert any(t.startswith("foundation k = 2000 kN/m²") for t in labels)  # the unit the CSV and batch use


def test_a_step_changes_the_line_weight_and_a_plain_member_keeps_one_line():
    _, plain = _sketch()
    (member,) = [s for s in plain.shapes if s.role == "member"]
    assert member.width == 2.6
    _, stepped = _sketch(steps=[{"x": 4.5, "EI": 8.4e6}])
    members = [s for s in stepped.shapes if s.role == "member"]
    assert [(s.x[0], s.x[-1]) for s in members] == [(0.0, 4.5), (4.5, 6.0)]
    assert members[1].width == pytest.approx(2.6 * 2 ** (1 / 3))  # twice the EI: the cube root in weight
    assert members[1].width > members[0].width


def test_the_foundation_band_spans_its_range_in_us_units():
    _, drawn = _sketch("us", foundation=[{"start": 1.5, "end": 6.0, "k": 2.0e6}])
    hatch = [s for s in drawn.shapes if s.role == "hatch" and s.dy == (-0.13, -0.21)]
    start, end = 1.5 / 0.3048, 6.0 / 0.3048
    assert hatch and all(start - 1e-9 <= s.x[0] < end for s in hatch)
    labels = [s.text for s in drawn.shapes if isinstance(s, Text)]
    assert any(t.startswith("foundation k = ") and t.endswith("kip/in²") for t in labels)


def test_the_exports_draw_it_and_the_saved_case_keeps_every_key():
    result, _ = _sketch(**EVERYTHING)
    assert exports.png_bytes(result, dpi=40).startswith(b"\x89PNG")
    assert exports.pdf_bytes(result).startswith(b"%PDF")
    rows = exports.csv_text(result).splitlines()
    assert len([row for row in rows if row.startswith("2,") or row.startswith("2.0")]) >= 2  # both sides
    saved = engine.Case.from_json(exports.case_json(result.case))
    assert saved.restraints == result.case.restraints
    assert saved.steps == result.case.steps and saved.foundation == result.case.foundation


def test_the_editor_is_built_only_when_opened_or_named():
    page = make_page()
    opener = page.inputs.inside
    assert opener.view is None  # the first page carries the button only (start-up, issue 10)
    opener.toggle()
    assert isinstance(opener.view, InsideView)
    state = page.model
    opener.view.panel.objects[0].objects[0].clicks += 1  # + Restraint
    assert len(opener.view.rows["restraints"]) == 1
    assert "1 restraint" in opener.button.label

    other = MemberPage(
        MemberState(**values_from_mapping({**BASE, "restraints": [{"x": 9.0, "translation": "fixed"}]}))
    )
    assert other.model.errors  # the engine names restraints[0].x ...
    assert other.inputs.inside.open  # ... so the editor opens to show it beside the field
    shown = other.inputs.inside.view.errors.shown()
    assert len(shown) == 1 and "Restraint 1, at x: 9.0 m lies outside" in shown[0]
    assert state.errors == {}


def test_reactions_of_the_second_plane_are_listed_when_it_has_restraints():
    from app.page.words import values_table

    case = {
        **BASE,
        "axial_force": 0.0,  # first order: the handbook's beam
        "section": {"name": "HEB 200"},
        "material": {"name": "S355"},
        "second_plane": {
            "supports": {"left": "pinned", "right": "pinned"},
            "loads": [{"type": "uniform", "q": 1e3}],
        },
        "restraints": [{"x": 3.0, "translation": "fixed", "plane": "second"}],
        "check": {"routes": ["second-order"]},
    }
    case.pop("EI")
    result = engine.solve(engine.Case.from_dict(case))
    table = values_table(result, None, "", units("si"))
    # two equal spans of 3 m under 1 kN/m: 1.25 q l = 3.750 kN (handbook two-span table, from memory)
    assert "restraint at x = 3.000 m, 2nd plane</td><td class='v'>3.750 kN up" in table


def test_the_diagrams_draw_each_jump_at_one_x_and_the_hinge_at_zero_moment():
    """The page's diagrams take the engine's stations: both sides of a brace (the transverse force jumps there
    by the brace's reaction, drawn vertical; DEVELOPERS.md defines the reactions) and M = 0 at a hinge."""
    import numpy as np

    mapping = {
        **BASE,
        "restraints": [{"x": 2.0, "translation": "fixed"}, {"x": 4.0, "translation": "fixed", "hinge": True}],
    }
    page = MemberPage(MemberState(**values_from_mapping(mapping)))
    result = page.model.result
    data = page.diagrams.stations.data
    x, force, moment = (np.asarray(data[key], dtype=float) for key in ("x", "T2", "M2"))
    for inner in result.reactions.intermediate:
        at = np.flatnonzero(np.isclose(x, inner.x, rtol=0, atol=1e-12))
        assert len(at) == 2  # the value just left, then just right
        # the transverse force T jumps by the brace's force on the member: T(x-) - T(x+) = force (kN here)
        assert force[at[0]] - force[at[1]] == pytest.approx(inner.force / 1e3, rel=1e-9)
    hinge = np.flatnonzero(np.isclose(x, 4.0, rtol=0, atol=1e-12))
    assert np.allclose(moment[hinge], 0.0, atol=1e-9)


def test_a_twist_restraint_is_named_beside_its_label():
    """A twist held says "φ held" after the restraint's name, a torsional spring "k_φ"; no other symbol."""
    _, drawn = _sketch(
        restraints=[{"x": 2.0, "twist": "fixed"}, {"x": 4.0, "translation": "fixed", "twist": 3.0e5}]
    )
    labels = [s.text for s in drawn.shapes if isinstance(s, Text) and s.text.startswith("R")]
    assert labels == ["R1 φ held", "R2 k_φ"]
    assert not _near(drawn.shapes, 2.0, "support") and not _near(drawn.shapes, 2.0, "spring")
