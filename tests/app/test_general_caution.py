"""The general caution reads the same everywhere: the engine, the command line, the page and the sheet."""

import pathlib

import app.cli
import app.report
from engine.cautions import GENERAL


def test_every_copy_of_the_general_caution_is_the_reports():
    """The CLI's closing line (--help need not import the engine), the report's general caution and the
    scope caution as every output words it (the page, the exports, the summaries, the JSON summary) are
    app.report's one wording, for a plain case and a case with load cases alike (the engine's own messages,
    GENERAL and the combined SCOPE, are not shown)."""
    from importlib import resources

    import engine
    from app.report.scope import GENERAL_CAUTION
    from app.summary_json import summary_data

    assert GENERAL_CAUTION == app.cli.CAUTION == app.report.general_caution()
    text = resources.files("assets").joinpath("demo_wind_post_actions.json").read_text(encoding="utf-8")
    combined = engine.solve(engine.Case.from_json(text))
    plain = engine.solve(combined.actions.combinations[0].case)
    for result in (plain, combined):
        assert app.report.general_caution(result) == GENERAL_CAUTION
        scope = next(c for c in result.cautions if c.code == "scope")
        assert app.report.caution_text(scope) == GENERAL_CAUTION
        listed = summary_data("invented", result.case, result)["cautions"]
        assert [c["message"] for c in listed if c["code"] == "scope"] == [GENERAL_CAUTION]
    assert GENERAL.code == "scope"


def test_no_other_wording_of_the_general_caution_in_the_outputs():
    """The exports, the report, the page and the batch hold no other copy of the caution: they read
    app.report.scope's (its one place)."""
    root = pathlib.Path(app.report.__file__).parents[1]
    opening = "Elastic, one member. Not checked: torsion"
    for folder in ("exports", "report", "batch", "page"):
        for path in (root / folder).glob("*.py"):
            if path != root / "report" / "scope.py":
                assert opening not in path.read_text(encoding="utf-8"), path


def test_the_general_caution_names_what_is_not_checked():
    """It names the checks strutscope does not make yet (rule: when a check is added, the cautions change),
    and says truthfully how load cases are combined: no longer that load combinations are not checked."""
    from app.report.scope import GENERAL_CAUTION

    for unchecked in ("lateral-torsional buckling", "class 4", "connections"):
        assert unchecked in GENERAL_CAUTION
    assert "(6.61)/(6.62)" not in GENERAL_CAUTION  # checked since issue 14 (the en-member route)
    assert "licensed engineer" in GENERAL_CAUTION
    assert "combinations are not" not in GENERAL_CAUTION
    assert "EN 1990 (6.10)/(6.10a,b) or ASCE 7" in GENERAL_CAUTION
    assert "the factors and the choice of actions are yours" in GENERAL_CAUTION
    # about the length of the caution it replaces (the page pins it below the others at 1280×720)
    assert len(GENERAL_CAUTION) <= len(GENERAL.message) + 100


def test_help_says_how_a_case_with_load_cases_is_combined():
    """--help shows the general caution, which no longer says that load combinations are not checked (stale
    since combinations are made), and beside it that a case with load cases is combined."""
    import subprocess
    import sys

    out = subprocess.run(
        [sys.executable, "-m", "app.cli", "--help"], capture_output=True, text=True, check=True
    ).stdout
    flat = " ".join(out.split())
    assert "combinations are not checked" not in flat
    assert "Load cases are combined by EN 1990 (6.10)/(6.10a,b) or ASCE 7 rules" in flat
    assert 'A case with load cases ("actions") is combined' in flat
