"""The summary after a batch run: counts by status, the highest utilisations, the invalid rows with their line
numbers; and ``--summary-json``."""

from __future__ import annotations

import csv
import json
import math
from pathlib import Path

from app import batch
from tests.app.test_cli import run_cli

TABLE = Path(__file__).parent / "data" / "batch_generated_members.csv"  # 150 invented members
#: The danger cautions' codes that this table's members carry (engine.cautions, level "danger").
_DANGER = {"not-a-code-check"}


def _results(folder):
    with open(folder / "results.csv", encoding="utf-8", newline="") as stream:
        return list(csv.DictReader(stream))


def test_summary_counts_and_the_ten_highest_utilisations_agree_with_the_results_file(tmp_path):
    summary = batch.run(str(TABLE), str(tmp_path), workers=1, progress=False)
    rows = _results(tmp_path)
    solved = [row for row in rows if row["status"] == "ok"]
    assert summary.solved == len(solved) and summary.error_count == len(rows) - len(solved)
    stability = {}
    for row in solved:
        stability[row["stability"]] = stability.get(row["stability"], 0) + 1
    assert summary.by_stability == stability

    # The ten highest code checks, ties to the earlier row, from the file itself; the utilisations that are
    # not code checks (the timber rows' elastic bounds) ranked apart.
    def ranked(basis):
        return sorted(
            (row for row in solved if row["utilization"] != "" and basis(row["utilization_basis"])),
            key=lambda row: (-float(row["utilization"]), int(row["row"])),
        )

    code = ranked(lambda cell: cell == "code check")
    assert [(row, identifier) for _, row, identifier in summary.highest] == [
        (int(row["row"]), row["id"]) for row in code[:10]
    ]
    others = ranked(lambda cell: cell != "code check")
    assert summary.not_code_check_count == len(others) > 10
    assert [(row, identifier, basis) for _, row, identifier, basis in summary.not_code_checks] == [
        (int(row["row"]), row["id"], row["utilization_basis"]) for row in others[:10]
    ]
    values = [value for value, _, _ in summary.highest]
    assert values == sorted(values, reverse=True) and math.isinf(values[0])  # some members are beyond Pcr1
    # The invalid rows are reported with the line of the input file (the header is line 1).
    with open(TABLE, encoding="utf-8", newline="") as stream:
        lines = {row["id"]: number for number, row in enumerate(csv.DictReader(stream), start=2)}
    assert summary.errors and all(lines[identifier] == row for row, identifier, _, _ in summary.errors)
    # A member that fails by a danger caution while its utilisation is at most 1 is named (the file's cautions
    # cell holds its code). Since stop 38 (timber analysed with E_0,05) every timber member of this table
    # fails by its utilisation: none is left here (the example table's TB-01 is one: test_batch_headline.py).
    by_caution = [
        row
        for row in solved
        if row["utilization"] != ""
        and float(row["utilization"]) <= 1.0
        and any(code in _DANGER for code in row["cautions"].split(";"))
    ]
    assert [(row, identifier) for row, identifier, _ in summary.danger] == [
        (int(row["row"]), row["id"]) for row in by_caution
    ]
    assert summary.danger_count == len(by_caution) == 0


def test_summary_json_for_machines_and_the_printed_summary(tmp_path):
    done = run_cli(
        "batch", str(TABLE), "--out", "out", "--workers", "1", "--summary-json", "summary.json", cwd=tmp_path
    )
    assert done.returncode == 1  # invalid rows
    document = json.loads((tmp_path / "summary.json").read_text(encoding="utf-8"))
    assert document["schema"] == 2 and document["members"] == 150
    assert document["by_status"] == {"ok": 146, "error": 4}
    assert sum(document["by_stability"].values()) == 146
    assert len(document["highest_utilizations"]) == 10
    assert document["highest_utilizations"][0]["utilization"] == "inf"
    assert {item["basis"] for item in document["highest_utilizations"]} == {"code check"}
    assert len(document["not_code_checks"]) == 10 and document["not_code_check_count"] == 24
    assert [item["row"] for item in document["invalid_rows"]] == sorted(
        item["row"] for item in document["invalid_rows"]
    )
    assert all(item["column"] == "length_m" for item in document["invalid_rows"])
    printed = done.stdout
    assert "highest utilisations by a code check (10):" in printed and "invalid rows (4)" in printed
    assert "NOT code checks, not ranked above (24 members, the 10 highest)" in printed
    assert "solved members by stability:" in printed
    assert document["failing_by_caution"] == [] and document["failing_by_caution_count"] == 0
    assert "failing by a danger caution" not in printed


def test_summary_json_to_standard_output_moves_the_printed_summary_to_standard_error(tmp_path):
    done = run_cli("batch", str(TABLE), "--out", "out", "--summary-json", "-", cwd=tmp_path)
    assert json.loads(done.stdout)["members"] == 150
    assert "highest utilisations" in done.stderr


# Two invented posts with load cases (G and W columns), as tests/app/test_batch_actions.py writes them.
_ACTIONS = (
    "id,length_m,left,right,section,material,bow,axial_G_kN,axial_W_kN,udl_W_kN_per_m,point_loads_G,"
    "combination_rule\n"
    "P1,6,pinned,pinned,HEB 200,S355,en1993-table-5.1,240,-20,1.7,1.5@2.2,\n"
    "P2,5,pinned,pinned,HEB 160,S355,en1993-table-5.1,150,-10,1.2,,\n"
)


def test_the_printed_caution_is_the_scope_of_the_rows_solved(tmp_path):
    """A table of plain members is told the general caution (app.report's one wording: how load cases are
    combined); a table of members with load cases is told that the combination factors are recalled values
    (the engine's scope of such a case), never that combinations are not checked (they were)."""
    from app.report.scope import GENERAL_CAUTION
    from engine.envelope import SCOPE

    plain = run_cli("batch", str(TABLE), "--out", "plain", "--workers", "1", cwd=tmp_path)
    assert f"Caution: {GENERAL_CAUTION}" in plain.stdout
    assert "combinations are not checked" not in plain.stdout
    assert "recalled from memory" not in plain.stdout
    (tmp_path / "actions.csv").write_text(_ACTIONS, encoding="utf-8")
    done = run_cli(
        "batch", "actions.csv", "--out", "loads", "--workers", "1", "--summary-json", "s.json", cwd=tmp_path
    )
    assert done.returncode == 0, done.stderr
    assert f"Caution (rows with load cases): {SCOPE.message}" in done.stdout
    assert "load combinations are not checked" not in done.stdout
    assert json.loads((tmp_path / "s.json").read_text(encoding="utf-8"))["with_combinations"] == 2
