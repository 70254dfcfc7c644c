"""``strutscope solve`` with restraints, steps and a foundation (issue 16): the printed summary lists them and
the reaction at every support; ``--json`` gives them in the case file's form. Invented cases; the two-span
middle reaction against a handbook beam table value."""

from __future__ import annotations

import json

import pytest

import engine
from app.report import format_summary
from app.summary_json import SUMMARY_VERSION, summary_data
from tests.app.test_cli import run_cli
from tests.app.test_exports_restraints import EVERYTHING, TWO_SPANS


def test_printed_summary_lists_the_restraints_steps_foundation_and_every_reaction_in_x_order():
    case = engine.Case.from_dict(EVERYTHING)
    text = format_summary("invented.json", case, engine.solve(case))
    lines = text.splitlines()
    start = lines.index(next(line for line in lines if line.startswith("  restraints:")))
    assert lines[start].endswith("restraint 1: x = 2.000 m: translation fixed, hinge (moment released)")
    assert lines[start + 1].strip() == "restraint 2: x = 4.000 m: translation fixed"
    assert "rotation spring k_r = 300.0 kN·m/rad" in lines[start + 2]
    assert lines[start + 3] == "  steps in EI:  step 1: EI = 6300 kN·m² from x = 3.000 m"
    assert lines[start + 5] == "  foundation:   foundation 1: k = 5000 kN/m² from x = 0.000 m to 1.000 m"
    heading = next(i for i, line in enumerate(lines) if line.startswith("Reactions ("))
    assert "with the foundation's reaction k·w" in lines[heading]
    supports = [line.split(":")[0].strip() for line in lines[heading + 1 : heading + 6]]
    assert supports == [
        "left end (x = 0)",
        "restraint at x = 2.000 m",
        "restraint at x = 4.000 m",
        "restraint at x = 6.000 m",
        "right end (x = L)",
    ]


def test_json_summary_gives_the_inputs_in_the_case_files_form():
    case = engine.Case.from_dict(EVERYTHING)
    result = engine.solve(case)
    data = json.loads(json.dumps(summary_data("invented", case, result), allow_nan=False))
    assert (
        data["summary_version"] == SUMMARY_VERSION == 9
    )  # the restraint keys are new keys: no version of their own
    for key in ("restraints", "steps", "foundation"):
        assert data[key] == EVERYTHING[key]
        # The keys read back as the case's own lists.
        assert engine.Case.from_dict({**EVERYTHING, key: data[key]}) == case
    inner = data["reactions"]["intermediate"]
    assert [item["index"] for item in inner] == [0, 1, 2]
    assert [item["x"] for item in inner] == [2.0, 4.0, 6.0]
    plain = engine.Case.from_dict({**TWO_SPANS, "restraints": []})
    data = summary_data("invented", plain, engine.solve(plain))
    assert data["restraints"] == data["steps"] == data["foundation"] == []


def test_solve_prints_the_beam_table_middle_reaction(tmp_path):
    path = tmp_path / "two_spans.json"
    path.write_text(json.dumps(TWO_SPANS), encoding="utf-8")
    done = run_cli("solve", str(path), cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    # Two equal spans (AISC Steel Construction Manual, Table 3-23; from memory): middle 10/8 q l = 62.50 kN.
    assert "restraint at x = 4.000 m: force 62.50 kN up, couple 0 kN·m" in done.stdout
    assert "  restraints:   restraint 1: x = 4.000 m: translation fixed" in done.stdout
    done = run_cli("solve", str(path), "--json", cwd=tmp_path)
    (inner,) = json.loads(done.stdout)["reactions"]["intermediate"]
    assert -inner["force"] == pytest.approx(1.25 * 12.5e3 * 4.0, rel=1e-9)
