"""What the batch's headline ``utilization`` is (stop 33): whether it is a code check (``utilization_basis``),
kept apart from the ranking when it is not, and what produces it (``governing_check``).

A timber member's utilisation is only an elastic bound (N/N_cr about the other axis with the mean E, M/M_cr)
and the stress over the characteristic strength: no timber code's check (no k_mod, γ_M, k_c) is made, so a
code's utilisation can be higher. Read as a pass beside the steel members' code checks it is unsafe. All
members are invented.
"""

from __future__ import annotations

import csv
import json
import re
from importlib.resources import files
from pathlib import Path

import pytest

from app import batch
from app.report.route_names import governing_text
from tests.app.test_cli import run_cli

EXAMPLE = str(files("assets") / "example_members.csv")
GENERATED = Path(__file__).parent / "data" / "batch_generated_members.csv"  # 150 invented members
TIMBER = "elastic bound only, not a code check (timber)"
ALUMINIUM = "elastic bound only, not a code check (aluminium)"


def _results(folder: Path) -> dict[str, dict[str, str]]:
    with open(folder / "results.csv", encoding="utf-8", newline="") as stream:
        return {row["id"]: row for row in csv.DictReader(stream)}


@pytest.fixture(scope="module")
def example(tmp_path_factory):
    folder = tmp_path_factory.mktemp("example")
    summary = batch.run(EXAMPLE, str(folder), workers=1, progress=False)
    return summary, _results(folder)


def test_the_timber_members_utilisation_is_marked_not_a_code_check(example):
    _, rows = example
    assert rows["TB-01"]["utilization_basis"] == TIMBER
    # the number itself is kept (0.6657 with E_0,05 since stop 38; 0.4479 with E_mean)
    assert abs(float(rows["TB-01"]["utilization"]) - 0.6657) < 1e-4
    steel = ("WP-C2", "WP-C3", "ST-01", "ST-02", "CH-01", "CL-01", "CT-01")
    assert {rows[name]["utilization_basis"] for name in steel} == {"code check"}
    assert {row["utilization_basis"] for row in rows.values() if row["status"] == "error"} == {""}


def test_a_utilisation_that_is_not_a_code_check_is_not_ranked_with_the_code_checks(example):
    summary, _ = example
    assert "TB-01" not in [identifier for _, _, identifier in summary.highest]
    assert [identifier for _, _, identifier in summary.highest] == [
        "ST-02",
        "CL-01",
        "ST-01",
        "WP-C3",
        "WP-C2",
        "CH-01",
        "CT-01",
    ]
    ((value, row, identifier, basis),) = summary.not_code_checks
    assert (row, identifier, basis) == (9, "TB-01", TIMBER) and abs(value - 0.6657) < 1e-4
    assert summary.not_code_check_count == 1


def test_the_printed_summary_and_the_json_list_it_apart(tmp_path):
    done = run_cli(
        "batch", EXAMPLE, "--out", "out", "--workers", "1", "--summary-json", "s.json", cwd=tmp_path
    )
    assert done.returncode == 1  # the four bad rows
    printed = done.stdout
    ranking, _, rest = printed.partition("NOT code checks")
    assert "highest utilisations by a code check (7):" in ranking and "TB-01" not in ranking
    apart = rest.split("invalid rows")[0]
    assert "elastic bound only" in apart.splitlines()[0]
    assert f"row 9 (TB-01): 0.6657 [{TIMBER}]" in apart
    document = json.loads((tmp_path / "s.json").read_text(encoding="utf-8"))
    assert document["schema"] == 2
    assert "TB-01" not in [item["id"] for item in document["highest_utilizations"]]
    assert {item["basis"] for item in document["highest_utilizations"]} == {"code check"}
    (item,) = document["not_code_checks"]
    assert (item["row"], item["id"], item["basis"]) == (9, "TB-01", TIMBER)
    # It passes its bound (0.6657) but fails by the danger caution of a material whose code is not checked.
    assert document["failing_by_caution"] == [{"row": 9, "id": "TB-01", "caution": "not-a-code-check"}]
    assert "  row 9 (TB-01): not-a-code-check" in printed
    assert document["not_code_check_count"] == 1


def test_aluminium_is_not_a_code_check_and_a_stiffness_alone_has_no_basis(tmp_path):
    table = tmp_path / "members.csv"
    table.write_text(
        "id,length_m,left,right,section,material,EI_kNm2,axial_kN,bow\n"
        "AL,3,pinned,pinned,SHS 100x100x5,EN AW-6082 T6,,50,L/300\n"
        "ST,3,pinned,pinned,SHS 100x100x5,S355,,50,en1993-table-5.1\n"
        "EI,3,pinned,pinned,,,4000,50,L/300\n",
        encoding="utf-8",
    )
    summary = batch.run(str(table), str(tmp_path / "out"), workers=1, progress=False)
    rows = _results(tmp_path / "out")
    assert rows["AL"]["utilization_basis"] == ALUMINIUM
    assert rows["ST"]["utilization_basis"] == "code check"
    assert rows["EI"]["utilization"] == rows["EI"]["utilization_basis"] == rows["EI"]["governing_check"] == ""
    assert [identifier for _, _, identifier in summary.highest] == ["ST"]
    assert [identifier for _, _, identifier, _ in summary.not_code_checks] == ["AL"]


def test_governing_check_names_what_produces_the_utilisation(example):
    _, rows = example
    post = rows["WP-C2"]
    # The headline 0.530 is the en-member route's eq. (6.62), not the second-order route's out-of-plane 0.423.
    assert post["governing_check"] == "en-member: eq. (6.62)"
    assert float(post["utilization"]) == float(post["utilization_en_member"])
    # The out-of-plane column keeps its own meaning: the second-order route's check about the other axis.
    assert float(post["out_of_plane_utilization"]) == float(post["utilization_second_order"])
    assert rows["TB-01"]["governing_check"] == (
        "second-order: out-of-plane elastic buckling, N/N_cr (a bound)"
    )


def test_governing_check_agrees_with_the_route_columns_on_every_row(tmp_path):
    batch.run(str(GENERATED), str(tmp_path), workers=1, progress=False)
    checked = 0
    for row in _results(tmp_path).values():
        if row["utilization"] == "":
            assert row["governing_check"] == ""
            continue
        route = row["headline_route"]
        key = route.replace("-", "_")
        assert row["governing_check"] == f"{route}: {governing_text(row[f'governing_{key}'])}", row["id"]
        assert float(row["utilization"]) == pytest.approx(float(row[f"utilization_{key}"]), rel=1e-12)
        checked += 1
    assert checked == 146


def test_the_readme_documents_the_columns():
    readme = (Path(__file__).parents[2] / "README.md").read_text(encoding="utf-8")
    listed = re.search(r"`DIR/results.csv` has one row per member in input order: `(.*?)`", readme, re.S)
    assert [name.strip() for name in listed.group(1).split(",")] == list(batch.result_columns("si"))
    assert "`utilization_basis`" in readme and "not_code_checks" in readme
