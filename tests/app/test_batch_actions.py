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
