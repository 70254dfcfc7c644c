"""The batch's ``steps`` column by section: ``x:section=<catalogue name>`` in a row with a section and a
material is the case file's step by section, and the row solves as the engine solves that case.

References: the case file contract (engine/restraints.py, a step ``{"x": ..., "section": {"name": ...}}``),
written out here, and engine.solve of the same case (the batch adds no mechanics). HEB 200 has a smaller I_y
than HEB 240 (EN 10365 tables, from memory), so the member stepped down to it has a lower critical load and
a larger deflection than the uniform one. Every member here is invented.
"""

from __future__ import annotations

import csv

import numpy as np
import pytest

import engine
from app import batch
from app.batch import RowError, member_case
from app.batch.inner import SYNTAX
from engine.restraints import steps_from_data

BASE = {
    "id": "S1",
    "length_m": "10",
    "left": "pinned",
    "right": "pinned",
    "section": "HEB 240",
    "material": "S355",
    "axial_kN": "300",
    "udl_kN_per_m": "5",
    "comment": "invented column stepped in section",
}


def test_a_section_step_is_the_case_files_step_by_section():
    got = member_case({**BASE, "steps": "5.0:section=HEB 200"})
    # the case file's list, read by the engine's own reader of the key
    assert got.steps == steps_from_data([{"x": 5.0, "section": {"name": "HEB 200"}}])
    assert [s.to_data() for s in got.steps] == [{"x": 5.0, "section": {"name": "HEB 200"}}]
    spaced = member_case({**BASE, "steps": " 3 : Section = HEB 220 ; 6:section=HEB 200"})
    assert [s.to_data() for s in spaced.steps] == [
        {"x": 3.0, "section": {"name": "HEB 220"}},
        {"x": 6.0, "section": {"name": "HEB 200"}},
    ]


def _run(tmp_path, rows):
    header = list(dict.fromkeys(key for row in rows for key in row))
    table = tmp_path / "members.csv"
    with open(table, "w", encoding="utf-8", newline="") as stream:
        writer = csv.DictWriter(stream, fieldnames=header)
        writer.writeheader()
        writer.writerows(rows)
    summary = batch.run(str(table), str(tmp_path / "out"), workers=1, progress=False)
    with open(tmp_path / "out" / "results.csv", encoding="utf-8", newline="") as stream:
        return summary, list(csv.DictReader(stream))


def test_a_row_stepped_in_section_solves_as_the_engine_and_is_softer(tmp_path):
    stepped = {**BASE, "id": "S", "steps": "5.0:section=HEB 200"}
    summary, (uniform_row, stepped_row) = _run(tmp_path, [{**BASE, "id": "U", "steps": ""}, stepped])
    assert summary.solved == 2, summary.errors
    alone = engine.solve(member_case(stepped))
    assert float(stepped_row["Pcr1_kN"]) == pytest.approx(alone.critical_loads[0] / 1e3, rel=1e-9)
    assert float(stepped_row["w_max_mm"]) == pytest.approx(
        float(np.max(np.abs(alone.deflection))) * 1e3, rel=1e-9
    )
    assert float(stepped_row["Pcr1_kN"]) < float(uniform_row["Pcr1_kN"])
    assert float(stepped_row["w_max_mm"]) > float(uniform_row["w_max_mm"])
    assert float(stepped_row["utilization"]) > float(uniform_row["utilization"])


@pytest.mark.parametrize(
    ("cells", "said"),
    [
        ({"steps": "5.0:section=HEB 999"}, "'HEB 999' is not in the catalogue"),  # the engine's check
        ({"steps": "5.0:section="}, SYNTAX["steps"]),
        ({"steps": "5.0:section=HEB 200@second"}, SYNTAX["steps"]),
        # a step by section in a row with EI and no section: the engine's refusal, in the steps column
        (
            {"section": "", "material": "", "EI_kNm2": "4200", "steps": "5.0:section=HEB 200"},
            "needs a case with a section and a material and no EI",
        ),
        ({"steps": "3:EI=2000;5.0:section=HEB 200"}, "not allowed beside steps by section"),
    ],
)
def test_a_bad_section_step_is_refused_naming_the_column(cells, said):
    with pytest.raises(RowError) as caught:
        member_case({**BASE, **cells})
    assert caught.value.column == "steps"
    assert str(caught.value).startswith("steps")
    assert said in str(caught.value)


def test_the_syntax_names_both_forms():
    assert "x:EI=<kN·m²>" in SYNTAX["steps"] and "x:section=<catalogue name>" in SYNTAX["steps"]
