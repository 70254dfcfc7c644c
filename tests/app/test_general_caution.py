"""The general caution reads the same everywhere: the engine, the command line, the page and the sheet."""

import pathlib

import app.cli
import app.report
from engine.cautions import GENERAL


def test_every_copy_of_the_general_caution_is_the_engines():
    """The CLI's closing line (kept apart so that --help need not import the engine) and the report's general
    caution, which the page, the exports and the batch show, equal the engine's scope caution."""
    assert GENERAL.message == app.cli.CAUTION
    assert GENERAL.message == app.report.general_caution()


def test_no_other_wording_of_the_general_caution_in_the_outputs():
    """The exports, the report and the batch hold no copy of the caution: they read the engine's."""
    root = pathlib.Path(app.report.__file__).parents[1]
    opening = "Elastic analysis of one member in one or two"
    for folder in ("exports", "report", "batch", "page"):
        for path in (root / folder).glob("*.py"):
            assert opening not in path.read_text(encoding="utf-8"), path


def test_the_general_caution_names_what_is_not_checked():
    """It names the checks strutscope does not make yet (rule: when a check is added, the cautions change)."""
    for unchecked in (
        "lateral-torsional buckling",
        "class 4",
        "connections",
        "load combinations",
    ):
        assert unchecked in GENERAL.message
    assert "(6.61)/(6.62)" not in GENERAL.message  # checked since issue 14 (the en-member route)
    assert "licensed engineer" in GENERAL.message


def test_help_says_a_case_with_load_cases_is_combined():
    """--help shows the plain case's caution (load combinations not checked) and, beside it, that a case with
    load cases is combined (it said only the former, which is wrong for such a case)."""
    import subprocess
    import sys

    out = subprocess.run(
        [sys.executable, "-m", "app.cli", "--help"], capture_output=True, text=True, check=True
    ).stdout
    flat = " ".join(out.split())
    assert "load combinations are not checked" in flat
    assert 'A case with load cases ("actions") is combined' in flat
