"""The batch's ``restraints``, ``steps`` and ``foundation`` columns and the restraints' reactions (issue 16).

Every member here is invented. The reading of a cell is checked against the case file it must equal (written
out here, in SI), so the cell syntax is checked against the case file contract, not against itself; the
solved rows against a handbook beam table value and against the engine on the same member.
"""

from __future__ import annotations

import csv

import pytest

import engine
from app import batch
from app.batch import RowError, member_case
from app.batch.inner import SYNTAX

# 1 kip = 4448.2216152605 N and 1 ft = 0.3048 m, exact by definition (NIST SP 811 (2008) Appendix B;
# from memory).
KIP = 4448.2216152605
FOOT = 0.3048

BASE = {"id": "R1", "length_m": "6", "left": "pinned", "right": "pinned", "EI_kNm2": "4200"}


def case_of(**cells):
    return member_case({**BASE, **cells})


# ------------------------------------------------------------------------------------------------------
# Good cells: each equals the case file written out in SI.


@pytest.mark.parametrize(
    ("cell", "expected"),
    [
        ("2.0:pinned;4.0:kt=5000", [{"x": 2.0, "translation": "fixed"}, {"x": 4.0, "translation": 5.0e6}]),
        ("3:guided", [{"x": 3.0, "rotation": "fixed"}]),
        ("3:fixed", [{"x": 3.0, "translation": "fixed", "rotation": "fixed"}]),
        (" 3 : kt=100 , kr=50 ", [{"x": 3.0, "translation": 1.0e5, "rotation": 5.0e4}]),
        (
            "2:pinned;4:hinge,pinned@first",
            [
                {"x": 2.0, "translation": "fixed"},
                {"x": 4.0, "translation": "fixed", "hinge": True, "plane": "first"},
            ],
        ),
        ("2:PINNED @ Both", [{"x": 2.0, "translation": "fixed"}]),
        ("2:guided,kt=1e3;", [{"x": 2.0, "translation": 1.0e6, "rotation": "fixed"}]),
        ("3.0:twist", [{"x": 3.0, "twist": "fixed"}]),
        (
            "2:pinned,twist;4:kphi=200;5:Twist,kr=1@first",
            [
                {"x": 2.0, "translation": "fixed", "twist": "fixed"},
                {"x": 4.0, "twist": 2.0e5},
                {"x": 5.0, "rotation": 1.0e3, "twist": "fixed", "plane": "first"},
            ],
        ),
    ],
)
def test_a_restraints_cell_is_the_case_files_list(cell, expected):
    want = engine.Case.from_dict(
        {
            "schema": 1,
            "length": 6.0,
            "EI": 4.2e6,
            "supports": {"left": "pinned", "right": "pinned"},
            "loads": [],
            "restraints": expected,
        }
    )
    assert case_of(restraints=cell).restraints == want.restraints


def test_a_twist_cell_reads_as_the_case_files_restraint_and_a_negative_kphi_is_refused():
    from app.batch.inner import inner_data

    def cells(text):
        return lambda column: text if column == "restraints" else ""

    assert inner_data(cells("3.0:twist")) == {"restraints": [{"x": 3.0, "twist": "fixed"}]}
    assert inner_data(cells("3.0:kphi=2.5")) == {"restraints": [{"x": 3.0, "twist": 2.5e3}]}  # kN·m/rad
    with pytest.raises(RowError) as caught:
        inner_data(cells("3.0:kphi=-1"))
    assert caught.value.column == "restraints"
    assert str(caught.value).startswith("restraints: '3.0:kphi=-1' gives kphi = -1, which must be >= 0")
    # A row with a section reaches the lateral-torsional buckling check: a torsional spring at mid-length
    # raises M_cr, a held twist more (a spring adds strain energy ½ k_φ φ² ≥ 0, held is k_φ → ∞: the Rayleigh
    # quotient cannot fall; common practice, no source). Invented row.
    row = {**BASE, "EI_kNm2": "", "section": "HEB 200", "material": "S355", "udl_kN_per_m": "5"}
    m_cr = [engine.solve(case_of(**row, restraints=r)).ltb.M_cr for r in ("", "3:kphi=200", "3:twist")]
    assert m_cr[0] < m_cr[1] < m_cr[2]


def test_steps_and_foundation_cells_are_the_case_files_lists():
    got = case_of(steps="2.5:EI=2100; 4:EI=8.4e3", foundation="0-3:k=5000;3-6:k=2e3@first")
    assert [s.to_data() for s in got.steps] == [{"x": 2.5, "EI": 2.1e6}, {"x": 4.0, "EI": 8.4e6}]
    assert [f.to_data() for f in got.foundation] == [
        {"start": 0.0, "end": 3.0, "k": 5.0e6},
        {"start": 3.0, "end": 6.0, "k": 2.0e6, "plane": "first"},
    ]


def test_only_a_row_on_a_foundation_takes_the_second_order_route_alone():
    # On a foundation the engine offers the member check by the second-order route only
    # (engine.restraints.check_against); the table has no routes column. Restraints keep the default routes:
    # the engine checks each segment between braced points as an equivalent member.
    default = case_of(EI_kNm2="", section="HEB 200", material="S355").check.routes
    assert default != ("second-order",)
    got = case_of(EI_kNm2="", section="HEB 200", material="S355", restraints="3:pinned")
    assert got.check.routes == default
    bedded = case_of(EI_kNm2="", section="HEB 200", material="S355", foundation="0-6:k=2000")
    assert bedded.check.routes == ("second-order",)


# ------------------------------------------------------------------------------------------------------
# Bad cells: the row's error names the column, the cell's text and what is allowed.


@pytest.mark.parametrize(
    ("column", "cell", "allowed"),
    [
        ("restraints", "3:roller", SYNTAX["restraints"]),
        ("restraints", "x:pinned", SYNTAX["restraints"]),
        ("restraints", "3:", SYNTAX["restraints"]),
        ("restraints", "3:fixed,kr=4", SYNTAX["restraints"]),
        ("restraints", "3:pinned,kt=5", SYNTAX["restraints"]),
        ("restraints", "3:hinge,hinge", SYNTAX["restraints"]),
        ("restraints", "3:pinned@third", SYNTAX["restraints"]),
        ("restraints", "3:kt=abc", SYNTAX["restraints"]),
        ("restraints", "3-4:pinned", SYNTAX["restraints"]),
        ("restraints", "3:twist,kphi=5", SYNTAX["restraints"]),
        ("restraints", "3:twist=5", SYNTAX["restraints"]),
        ("restraints", "3:kphi=-1", "must be >= 0"),
        ("restraints", "3:kphi=0", "restrains nothing"),
        ("steps", "3.0:2100", SYNTAX["steps"]),
        ("steps", "3.0:EI=2100@second", SYNTAX["steps"]),
        ("steps", "3.0:k=2100", SYNTAX["steps"]),
        ("foundation", "0:k=5", SYNTAX["foundation"]),
        ("foundation", "0-6:q=5", SYNTAX["foundation"]),
        ("foundation", "0-6:k=5@nowhere", SYNTAX["foundation"]),
        # The engine's own checks, named by the engine's path and the cell as the table gave it.
        ("restraints", "7:pinned", "0 to 6 m, ends excluded"),
        ("restraints", "3:kt=-5", "must be >= 0"),
        ("restraints", "3:kt=1e30", "N/m"),
        ("restraints", "2:pinned@second", "allowed: 'first', 'both'"),
        ("restraints", "3:hinge", "restrain translation beside it"),
        ("restraints", "3:kr=5,hinge", "rotation must be 'free'"),
        ("restraints", "2:pinned;2:pinned", "one restraint per point and plane"),
        ("steps", "4:EI=2000;3:EI=2000", "list steps in increasing x"),
        ("steps", "3:EI=0", "must be > 0"),
        ("steps", "3:EI=1e-9", "N·m²"),
        ("foundation", "6-2:k=5", "must be beyond start"),
        ("foundation", "0-8:k=5", "0 to 6 m"),
        ("foundation", "0-4:k=5;3-6:k=5", "give one modulus per range"),
        ("foundation", "0-6:k=0", "must be > 0"),
        ("foundation", "0-6:k=1e12", "N/m²"),
    ],
)
def test_a_bad_cell_names_its_column_its_text_and_what_is_allowed(column, cell, allowed):
    with pytest.raises(RowError) as caught:
        case_of(**{column: cell})
    message = str(caught.value)
    assert caught.value.column == column
    assert message.startswith(f"{column}")
    # The item or the whole cell as the table gave it.
    assert repr(cell) in message or any(repr(item.strip()) in message for item in cell.split(";"))
    assert allowed in message


def test_a_step_in_a_row_with_a_section_is_refused_naming_the_column():
    with pytest.raises(RowError) as caught:
        case_of(EI_kNm2="", section="HEB 200", material="S355", steps="3:EI=2000")
    assert caught.value.column == "steps"
    assert "'3:EI=2000'" in str(caught.value) and "own EI and no section" in str(caught.value)


def test_too_many_items_are_refused_before_any_is_read():
    cell = ";".join(f"{0.1 + 0.1 * i:.1f}:pinned" for i in range(51))
    with pytest.raises(RowError, match=r"restraints: 51 items given; at most 50"):
        case_of(length_m="60", restraints=cell)


# ------------------------------------------------------------------------------------------------------
# Solved rows.


def _run(tmp_path, rows, units="si"):
    header = sorted({key for r in rows for key in r}, key=lambda k: (k != "id", k))
    table = tmp_path / "members.csv"
    with open(table, "w", encoding="utf-8", newline="") as stream:
        writer = csv.DictWriter(stream, fieldnames=header)
        writer.writeheader()
        writer.writerows(rows)
    summary = batch.run(str(table), str(tmp_path / "out"), units=units, workers=1, progress=False)
    with open(tmp_path / "out" / "results.csv", encoding="utf-8", newline="") as stream:
        return summary, list(csv.DictReader(stream))


TWO_SPANS = {
    **BASE,
    "id": "TS",
    "length_m": "8",
    "udl_kN_per_m": "12.5",
    "restraints": "4:pinned",
    "comment": "invented two-span beam",
}


def test_two_equal_spans_under_a_uniform_load_give_the_beam_table_middle_reaction(tmp_path):
    # Continuous beam of two equal spans l under a uniform load q, N = 0: the middle reaction is
    # 10/8 q l = 1.25 q l (AISC Steel Construction Manual, Table 3-23 "Shears, moments and deflections",
    # continuous beam of two equal spans, uniformly distributed load; from memory).
    q, span = 12.5, 4.0
    summary, (got,) = _run(tmp_path, [TWO_SPANS])
    assert summary.solved == 1 and got["status"] == "ok"
    assert float(got["R_inner_max_kN"]) == pytest.approx(1.25 * q * span, rel=1e-9)
    assert float(got["x_R_inner_m"]) == 4.0
    # A restraint that leaves rotation free has no couple: the cell gives the force only.
    x, force = got["inner_reactions"].split(":F=")
    assert float(x) == 4.0 and float(force) == pytest.approx(1.25 * q * span, rel=1e-9)
    # The same table's support moment, -q l²/8 (the same table), as a check that the row is the two-span beam.
    assert float(got["M_max_kNm"]) == pytest.approx(-q * span**2 / 8, rel=1e-9)


def test_us_units_give_the_reactions_in_kip_and_ft(tmp_path):
    summary, (got,) = _run(tmp_path, [TWO_SPANS], units="us")
    assert float(got["R_inner_max_kip"]) == pytest.approx(1.25 * 12.5e3 * 4.0 / KIP, rel=1e-9)
    assert float(got["x_R_inner_ft"]) == pytest.approx(4.0 / FOOT, rel=1e-12)
    assert "R_inner_max_kN" not in got


def test_reactions_of_springs_rotations_and_a_second_plane_match_the_engine(tmp_path):
    rows = [
        {
            **BASE,
            "id": "S1",
            "udl_kN_per_m": "5",
            "point_loads": "3@1.5",
            "restraints": "2:kt=800,kr=300;4:guided",
        },
        {
            **BASE,
            "id": "S2",
            "EI_kNm2": "",
            "section": "HEB 200",
            "material": "S355",
            "axial_kN": "80",
            "udl_kN_per_m": "4",
            "second_left": "pinned",
            "second_right": "pinned",
            "second_udl_kN_per_m": "1",
            "restraints": "3:pinned@second",
            "bow": "none",
            "second_bow": "none",
        },
    ]
    summary, got = _run(tmp_path, rows)
    assert summary.solved == 2, [g["message"] for g in got]
    for cells, out in zip(rows, got, strict=True):
        result = engine.solve(member_case(cells))
        planes = [(1, result)] + ([(2, result.second_plane)] if result.second_plane is not None else [])
        expected = []
        for plane, own in planes:
            for inner in own.reactions.intermediate:
                expected.append((plane, inner.x, -inner.force / 1e3, -inner.couple / 1e3))
        items = out["inner_reactions"].split(";")
        assert len(items) == len(expected)
        for item, (plane, x, force, couple) in zip(items, expected, strict=True):
            assert item.endswith("@second") == (plane == 2)
            where, _, values = item.removesuffix("@second").partition(":")
            parts = dict(part.split("=") for part in values.split(","))
            assert float(where) == x
            assert float(parts["F"]) == pytest.approx(force, rel=1e-9, abs=1e-12)
            if "C" in parts:
                assert float(parts["C"]) == pytest.approx(couple, rel=1e-9, abs=1e-12)
        top = max(expected, key=lambda e: abs(e[2]))
        assert float(out["R_inner_max_kN"]) == pytest.approx(top[2], rel=1e-9)
    assert "C=" in got[0]["inner_reactions"].split(";")[0]  # the spring kr holds rotation
    assert got[1]["inner_reactions"].endswith("@second")


def test_a_row_with_load_cases_gives_each_restraints_largest_reaction_over_the_ultimate_combinations(
    tmp_path,
):
    row = {
        **BASE,
        "id": "LC",
        "length_m": "8",
        "udl_G_kN_per_m": "4",
        "udl_Q_kN_per_m": "6",
        "restraints": "4:pinned",
    }
    summary, (got,) = _run(tmp_path, [row])
    assert summary.solved == 1, got["message"]
    result = engine.solve(member_case(row))
    forces = [
        -c.result.reactions.intermediate[0].force / 1e3
        for c in result.actions.combinations
        if c.combination.state == "ultimate"
    ]
    assert len(forces) >= 2
    assert float(got["R_inner_max_kN"]) == pytest.approx(max(forces, key=abs), rel=1e-9)
    # EN 1990 eq. (6.10) with γ_G = 1.35, γ_Q = 1.5 (EN 1990 Table A1.2(B), recommended values; from memory)
    # on the beam table's 1.25 q l: the largest of the ultimate combinations.
    assert float(got["R_inner_max_kN"]) == pytest.approx(1.25 * (1.35 * 4 + 1.5 * 6) * 4.0, rel=1e-9)


def test_a_bad_cell_is_the_rows_error_with_its_line_and_the_run_goes_on(tmp_path):
    rows = [TWO_SPANS, {**TWO_SPANS, "id": "BAD", "restraints": "4:roller"}, {**TWO_SPANS, "id": "OK2"}]
    summary, got = _run(tmp_path, rows)
    assert summary.solved == 2 and summary.error_count == 1
    assert summary.errors[0][:3] == (3, "BAD", "restraints")
    assert got[1]["status"] == "error" and got[1]["field"] == "restraints"
    assert "'4:roller'" in got[1]["message"] and "allowed:" in got[1]["message"]
    assert got[2]["status"] == "ok"


def test_the_readmes_invented_example_row_solves(tmp_path):
    import re
    from pathlib import Path

    readme = (Path(__file__).parents[2] / "README.md").read_text(encoding="utf-8")
    block = re.search(r"```csv\n(id,length_m,left,right,EI_kNm2,udl_kN_per_m,restraints.*?)```", readme, re.S)
    table = tmp_path / "example.csv"
    table.write_text(block.group(1), encoding="utf-8")
    summary = batch.run(str(table), str(tmp_path / "out"), workers=1, progress=False)
    assert summary.solved == 1, summary.errors
    with open(tmp_path / "out" / "results.csv", encoding="utf-8", newline="") as stream:
        (got,) = list(csv.DictReader(stream))
    assert [item.split(":")[0] for item in got["inner_reactions"].split(";")] == ["2.0", "4.0", "6.0"]
