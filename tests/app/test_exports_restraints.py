"""The CSV export and the calc sheet of a case with restraints, steps and a foundation (issue 16).

Every case here is invented. The CSV is read back and compared with the case and the engine's result (a
round trip through the text, to the CSV's six significant figures); the middle reaction of two equal spans
under a uniform load with a handbook beam table value.
"""

from __future__ import annotations

import csv

import pytest

import engine
from app import exports
from tests.app.test_unit_systems import _offending

# 1 kip = 4448.2216152605 N, 1 ft = 0.3048 m, 1 in = 0.0254 m, exact by definition (NIST SP 811 (2008)
# Appendix B; from memory).
KIP, FOOT, INCH = 4448.2216152605, 0.3048, 0.0254
SIX_FIGURES = 5e-6  # the CSV writes six significant figures

TWO_SPANS = {
    "schema": 1,
    "title": "invented two-span rail",
    "length": 8.0,
    "EI": 4.2e6,
    "supports": {"left": "pinned", "right": "pinned"},
    "loads": [{"type": "uniform", "q": 12.5e3}],
    "restraints": [{"x": 4.0, "translation": "fixed"}],
}

EVERYTHING = {
    **TWO_SPANS,
    "title": "invented braced post on a bedding",
    "axial_force": 40e3,
    "restraints": [
        {"x": 2.0, "translation": "fixed", "hinge": True},
        {"x": 4.0, "translation": "fixed"},
        {"x": 6.0, "translation": 8.0e5, "rotation": 3.0e5},
    ],
    "steps": [{"x": 3.0, "EI": 6.3e6}, {"x": 5.0, "EI": 4.2e6}],
    "foundation": [{"start": 0.0, "end": 1.0, "k": 5.0e6}],
}


def metadata(text: str) -> dict[str, list[str]]:
    """The CSV's metadata rows by key: value and note cells (the ``# `` dropped)."""
    assert text.startswith("\ufeff")
    rows = csv.reader(line for line in text[1:].splitlines() if line.startswith("#"))
    return {row[0][2:]: row[1:] for row in rows}


def solved(mapping):
    return engine.solve(engine.Case.from_dict(mapping))


def test_csv_gives_the_beam_table_middle_reaction_and_the_end_ones():
    # Two equal spans l under q, N = 0: end reactions 3/8 q l, middle 10/8 q l (AISC Steel Construction
    # Manual, Table 3-23, continuous beam of two equal spans, uniformly distributed load; from memory).
    q, span = 12.5, 4.0
    rows = metadata(exports.csv_text(solved(TWO_SPANS), units="si"))
    middle = rows["reaction restraint at x = 4.000 m F [kN]"]
    assert float(middle[0]) == pytest.approx(1.25 * q * span, rel=SIX_FIGURES)
    assert middle[1].startswith("up as drawn")
    for end in ("left end (x = 0)", "right end (x = L)"):
        assert float(rows[f"reaction {end} F [kN]"][0]) == pytest.approx(0.375 * q * span, rel=SIX_FIGURES)
        assert float(rows[f"reaction {end} C [kN·m]"][0]) == 0.0
    assert float(rows["reaction restraint at x = 4.000 m C [kN·m]"][0]) == 0.0  # rotation free: no couple
    assert float(rows["restraint 1 x [m]"][0]) == 4.0 and rows["restraint 1 x [m]"][1] == "translation fixed"


# Per system: unit labels and the factor from the shown unit to SI.
UNITS = {
    "si": {
        "length": ("m", 1.0),
        "force": ("kN", 1e3),
        "moment": ("kN·m", 1e3),
        "k_t": ("kN/m", 1e3),
        "k_r": ("kN·m/rad", 1e3),
        "EI": ("kN·m²", 1e3),
        "k": ("kN/m²", 1e3),
    },
    "us": {
        "length": ("ft", FOOT),
        "force": ("kip", KIP),
        "moment": ("kip·ft", KIP * FOOT),
        "k_t": ("kip/in", KIP / INCH),
        "k_r": ("kip·ft/rad", KIP * FOOT),
        "EI": ("kip·ft²", KIP * FOOT**2),
        "k": ("kip/in²", KIP / INCH**2),
    },
}


@pytest.mark.parametrize("system", ["si", "us"])
def test_csv_round_trip_of_the_inputs_and_every_reaction(system):
    """The restraints, steps, foundation and reactions read back from the CSV equal the case's and the
    engine's (converted back to SI), in one units system."""
    result = solved(EVERYTHING)
    text = exports.csv_text(result, units=system)
    assert _offending(text, system) == []
    rows = metadata(text)
    units = UNITS[system]

    def read(name, kind):
        label, factor = units[kind]
        return float(rows[f"{name} [{label}]"][0]) * factor

    case = result.case
    for number, r in enumerate(case.restraints, start=1):
        assert read(f"restraint {number} x", "length") == pytest.approx(r.x, rel=SIX_FIGURES)
    assert read("restraint 3 k_t", "k_t") == pytest.approx(8.0e5, rel=SIX_FIGURES)
    assert read("restraint 3 k_r", "k_r") == pytest.approx(3.0e5, rel=SIX_FIGURES)
    assert f"restraint 1 k_t [{units['k_t'][0]}]" not in rows  # a rigid restraint has no spring row
    assert "hinge" in rows[f"restraint 1 x [{units['length'][0]}]"][1]
    for number, s in enumerate(case.steps, start=1):
        assert read(f"step {number} x", "length") == pytest.approx(s.x, rel=SIX_FIGURES)
        assert read(f"step {number} EI", "EI") == pytest.approx(s.EI, rel=SIX_FIGURES)
    assert read("foundation 1 start", "length") == 0.0
    assert read("foundation 1 end", "length") == pytest.approx(1.0, rel=SIX_FIGURES)
    assert read("foundation 1 k", "k") == pytest.approx(5.0e6, rel=SIX_FIGURES)

    # Every support: (label, force up as drawn, couple anticlockwise as drawn), from the engine's signs
    # (DEVELOPERS.md "Coordinates and signs": the left support's force along +w is -T(0), the right one's
    # +T(L); a restraint's force along +w is `force`, its couple C).
    r = result.reactions
    expected = [("left end (x = 0)", r.left_T, -r.left_M), ("right end (x = L)", -r.right_T, r.right_M)]
    keys = [key for key in rows if key.startswith("reaction restraint at x = ") and " F [" in key]
    assert len(keys) == 3
    for key, inner in zip(keys, r.intermediate, strict=True):
        where = key.removeprefix("reaction ").split(" F [")[0]
        shown_x = float(where.split("x = ")[1].split()[0]) * units["length"][1]
        assert shown_x == pytest.approx(inner.x, rel=1e-3)
        expected.append((where, -inner.force, -inner.couple))
    assert sum(key.startswith("reaction ") for key in rows) == 2 * 5  # F and C at each of the 5 supports
    for where, up, anticlockwise in expected:
        assert read(f"reaction {where} F", "force") == pytest.approx(up, rel=SIX_FIGURES, abs=1e-6)
        assert read(f"reaction {where} C", "moment") == pytest.approx(
            anticlockwise, rel=SIX_FIGURES, abs=1e-6
        )
    assert rows[f"reaction {expected[2][0]} C [{units['moment'][0]}]"][0] == "0"  # hinge: rotation free


def test_csv_of_a_case_without_restraints_still_gives_both_end_reactions():
    plain = {**TWO_SPANS, "restraints": []}
    rows = metadata(exports.csv_text(solved(plain)))
    assert not any(key.startswith(("restraint", "step", "foundation")) for key in rows)
    assert float(rows["reaction left end (x = 0) F [kN]"][0]) == pytest.approx(
        0.5 * 12.5 * 8.0, rel=SIX_FIGURES
    )


def test_cli_csv_carries_the_restraints_and_reactions(tmp_path):
    import json

    from tests.app.test_cli import run_cli

    case = tmp_path / "case.json"
    case.write_text(json.dumps(TWO_SPANS), encoding="utf-8")
    out = tmp_path / "s.csv"
    done = run_cli("solve", str(case), "--csv", str(out), "--units", "us", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    rows = metadata(out.read_text(encoding="utf-8"))
    middle = next(values for key, values in rows.items() if key.startswith("reaction restraint"))
    assert float(middle[0]) * KIP == pytest.approx(1.25 * 12.5e3 * 4.0, rel=SIX_FIGURES)


def sheet_text(result, units="si") -> str:
    import io

    import pypdf

    reader = pypdf.PdfReader(io.BytesIO(exports.pdf_bytes(result, units=units, date="2026-12-02")))
    return "\n".join(page.extract_text() for page in reader.pages)


def test_calc_sheet_lists_the_restraints_and_the_reaction_at_every_support():
    text = sheet_text(solved(TWO_SPANS))
    assert "Restraints inside restraint 1: x = 4.000 m: translation fixed" in text
    # Two equal spans (AISC Steel Construction Manual, Table 3-23; from memory): ends 3/8 q l = 18.75 kN,
    # middle 10/8 q l = 62.50 kN, each pushing the member up.
    assert "Support reactions left end (x = 0): 18.75 kN up, couple 0 kN·m" in text
    assert "restraint at x = 4.000 m: 62.50 kN up, couple 0 kN·m" in text
    assert "right end (x = L): 18.75 kN up, couple 0 kN·m" in text
    assert "R1" in text  # the sketch names the restraint as the list does


@pytest.mark.parametrize("system", ["si", "us"])
def test_calc_sheet_of_restraints_steps_and_foundation_speaks_one_system(system):
    result = solved(EVERYTHING)
    text = sheet_text(result, system)
    assert _offending(text, system) == []
    for words in (
        "Restraints inside",
        "translation fixed, hinge (moment released)",
        "Steps in EI",
        "step 2:",
        "Elastic foundation",
        "foundation 1: k = ",
        "restraint 3: x = ",
        "rotation spring k_r = ",
    ):
        assert words in text, words
    reactions = text[text.index("Support reactions") :]
    assert reactions.count("restraint at x = ") == 3
    assert "with the foundation's reaction k·w" in " ".join(reactions.split())
    assert ("kip/in²" if system == "us" else "kN/m²") in text


def test_calc_sheet_of_a_plain_case_keeps_its_one_line_reactions():
    text = sheet_text(solved({**TWO_SPANS, "restraints": []}))
    assert "Restraints inside" not in text and "R1" not in text
    assert "left end (x = 0): 50.00 kN up, couple 0 kN·m; right end (x = L): 50.00 kN up" in " ".join(
        text.split()
    )


def test_reactions_come_in_x_order_whatever_the_case_files_order():
    from app.report.restraints import all_reactions, inner_reactions

    mapping = {
        **TWO_SPANS,
        "restraints": [{"x": 6.0, "translation": 8.0e5}, {"x": 4.0, "translation": "fixed"}],
    }
    result = solved(mapping)
    assert [r.x for r in all_reactions(result)] == [0.0, 4.0, 6.0, 8.0]
    # Each keeps its place in the case's list, so the engine's reaction of that restraint is the one shown.
    found = inner_reactions(result)
    assert [(r.x, r.index) for r in found] == [(4.0, 1), (6.0, 0)]
    by_index = {inner.index: inner for inner in result.reactions.intermediate}
    for r in found:
        assert r.force == -by_index[r.index].force


@pytest.mark.parametrize(
    ("system", "per_unit", "label"), [("si", 1e3, "kN·m/rad"), ("us", KIP * FOOT, "kip·ft/rad")]
)
def test_a_twist_restraint_is_worded_and_in_the_csv(system, per_unit, label):
    """A twist held or a torsional spring (read by the lateral-torsional buckling check only) is named in the
    words and the CSV's note, a spring's k_φ in the display unit; a twist alone names no bending plane."""
    from app.report.restraints import inner_rows
    from app.units import units

    case = {
        **TWO_SPANS,
        "restraints": [{"x": 2.0, "twist": "fixed"}, {"x": 4.0, "translation": "fixed", "twist": 3.0e5}],
        "second_plane": {"supports": {"left": "pinned", "right": "pinned"}, "loads": [], "EI": 1.4e6},
    }
    result = solved(case)
    rows = dict(inner_rows(result.case, units(system)))
    assert rows["restraint 1"].endswith(": twist fixed (lateral-torsional buckling)")  # no plane
    assert "translation fixed, twist spring k_φ = " in rows["restraint 2"]
    assert rows["restraint 2"].endswith(f" {label} (lateral-torsional buckling) (both planes)")
    meta = metadata(exports.csv_text(result, units=system))
    assert meta[f"restraint 1 x [{'m' if system == 'si' else 'ft'}]"][1] == (
        "twist fixed (lateral-torsional buckling)"
    )
    (value,) = meta[f"restraint 2 k_φ [{label}]"][:1]
    assert float(value) == pytest.approx(3.0e5 / per_unit, rel=SIX_FIGURES)
