"""`strutscope batch` with per-action columns: each row solved per combination, the governing one named.

Reference: engine.solve of the same case written as a case file with actions (the batch only reads the table).
Members invented.
"""

import csv

import pytest

import engine
from app import batch
from app.batch.rows import member_case

HEADER = (
    "id,length_m,left,right,section,material,bow,axial_G_kN,axial_W_kN,udl_W_kN_per_m,point_loads_G,"
    "combination_rule"
)


def table(tmp_path, *rows):
    """Write an invented members table and return its path."""
    path = tmp_path / "members.csv"
    path.write_text("\n".join([HEADER, *rows]) + "\n", encoding="utf-8")
    return str(path)


def case_file():
    """The first row's member as a case file with actions (the reference)."""
    return engine.Case.from_dict(
        {
            "title": "P1",
            "length": 6.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "section": {"name": "HEB 200"},
            "material": {"name": "S355"},
            "imperfection": {"preset": "en1993-table-5.1"},
            "actions": [
                {
                    "name": "G",
                    "category": "permanent",
                    "axial_force": 240e3,
                    "loads": [{"type": "point", "P": 1.5e3, "x": 2.2}],
                },
                {
                    "name": "W",
                    "category": "wind",
                    "axial_force": -20e3,
                    "loads": [{"type": "uniform", "q": 1.7e3}],
                },
            ],
        }
    )


ROW = "P1,6,pinned,pinned,HEB 200,S355,en1993-table-5.1,240,-20,1.7,1.5@2.2,"


def test_a_row_with_action_columns_is_the_case_file_with_actions():
    """The row's actions (category from the name's first letter, kN to N) are the case file's."""
    names = HEADER.split(",")
    row = dict(zip(names, ROW.split(","), strict=True))
    case = member_case(row)
    assert case.actions == case_file().actions
    assert case.combinations.rule == "en1990-6.10" and case.loads == () and case.axial_force == 0.0


def test_batch_names_the_governing_combinations(tmp_path):
    """The results row carries the rule and the combinations of the headline and of the deflection check."""
    summary = batch.run(
        table(tmp_path, ROW, ROW.replace("P1", "P2", 1) + "asce7-2.3"),
        str(tmp_path / "out"),
        workers=1,
        progress=False,
    )
    assert summary.solved == 2
    with open(summary.results, encoding="utf-8-sig") as stream:
        rows = list(csv.DictReader(stream))
    reference = engine.solve(case_file())
    first = rows[0]
    assert first["combination_rule"] == "en1990-6.10"
    assert first["strength_combination"] == reference.actions.headline
    assert first["deflection_combination"] == reference.actions.governing_for("deflection").combination
    assert float(first["utilization"]) == pytest.approx(reference.utilization, rel=1e-6)
    assert rows[1]["combination_rule"] == "asce7-2.3" and rows[1]["strength_combination"].startswith("U")


@pytest.mark.parametrize(
    ("cells", "column", "words"),
    [
        ({"axial_kN": "100"}, "axial_kN", "given beside action columns"),
        ({"combination_rule": "en1990-6.11"}, "combination_rule", "is not a rule"),
        ({"udl_W_kN_per_m": "abc"}, "udl_W_kN_per_m", "is not a number"),
        ({"point_loads_G": "1.5@9"}, "point_loads_G", "lies outside the member"),
    ],
)
def test_bad_action_cells_name_their_column(cells, column, words):
    """A bad action cell (or a plain load beside actions) is refused naming its column."""
    names = HEADER.split(",")
    row = dict(zip(names, ROW.split(","), strict=True))
    row.update(cells)
    with pytest.raises(batch.RowError) as caught:
        member_case(row)
    assert caught.value.column == column and words in str(caught.value)


def test_an_action_name_without_a_category_letter_is_refused(tmp_path):
    """A per-action column whose action name starts with no category letter is refused with the table."""
    path = tmp_path / "bad.csv"
    path.write_text("id,length_m,left,right,axial_X_kN\nA,6,pinned,pinned,1\n", encoding="utf-8")
    with pytest.raises(batch.TableError, match="must start with its category's letter"):
        batch.run(str(path), str(tmp_path / "out"), workers=1, progress=False)


@pytest.mark.parametrize(
    ("extra", "words"),
    [
        ("AXIAL_G_kN", "is given twice"),  # one of the two would be lost (an independent audit: 240 kN lost)
        ("UDL_W_kN_per_m", "is given twice"),  # both would be added (1.7 + 1.7 kN/m)
        ("udl_g_kN_per_m", "differ only in case"),  # G and g: one action or two?
    ],
)
def test_a_per_action_column_given_twice_in_another_case_is_refused(tmp_path, extra, words):
    path = tmp_path / "dup.csv"
    path.write_text(f"{HEADER},{extra}\n{ROW},1\n", encoding="utf-8")
    with pytest.raises(batch.TableError, match=words):
        batch.run(str(path), str(tmp_path / "out"), workers=1, progress=False)


def test_with_load_cases_each_value_column_is_the_largest_of_the_ultimate_combinations(tmp_path):
    """The headline combination (1.35 G, the most compression) is not the one with the largest moment (the
    wind's): M_max, the routes' utilisations and the capacity come from the combination that gives the
    largest (the lowest capacity), and ``from_combinations`` names it. Reference: engine.solve of the case
    file, every combination's own result (an independent audit found M_max 35 % low)."""
    header = "id,length_m,left,right,section,material,bow,axial_G_kN,axial_W_kN,udl_W_kN_per_m"
    path = tmp_path / "members.csv"
    path.write_text(
        f"{header}\nM2,6,pinned,pinned,HEB 200,S355,en1993-table-5.1,700,-250,4\n", encoding="utf-8"
    )
    summary = batch.run(str(path), str(tmp_path / "out"), workers=1, progress=False)
    with open(summary.results, encoding="utf-8-sig") as stream:
        row = next(csv.DictReader(stream))
    case = member_case(
        {
            "id": "M2",
            "length_m": "6",
            "left": "pinned",
            "right": "pinned",
            "section": "HEB 200",
            "material": "S355",
            "bow": "en1993-table-5.1",
            "axial_G_kN": "700",
            "axial_W_kN": "-250",
            "udl_W_kN_per_m": "4",
        }
    )
    result = engine.solve(case)
    ultimate = [c for c in result.actions.combinations if c.combination.state == "ultimate"]
    largest = max(ultimate, key=lambda c: c.result.governing.moment.magnitude)
    assert row["strength_combination"] == result.actions.headline != largest.name
    assert float(row["M_max_kNm"]) == pytest.approx(largest.result.governing.moment.value / 1e3, rel=1e-9)
    assert f"M_max={largest.name}" in row["from_combinations"]
    for code in ("second_order", "en_member"):
        top = max(
            next(r.utilization for r in c.result.routes if r.route == code.replace("_", "-"))
            for c in ultimate
        )
        assert float(row[f"utilization_{code}"]) == pytest.approx(top, rel=1e-9)
    lowest_alpha = min(c.result.alpha_cr for c in ultimate)  # EN 1993-1-1 §5.2.1(3) compares it with 10
    assert float(row["alpha_cr"]) == pytest.approx(lowest_alpha, rel=1e-12)
    capacity = engine.capacity_of(result)
    assert float(row["capacity_kN"]) == pytest.approx(capacity.axial_force / 1e3, rel=1e-9)
    assert row["capacity_combination"] == capacity.combination
