"""The general caution reads the same everywhere: the engine, the command line, the page and the sheet."""

import app.cli
import app.exports
import app.page.style
from engine.cautions import GENERAL


def test_every_copy_of_the_general_caution_is_the_engines():
    """The CLI's closing line and the page's and calc sheet's fallbacks equal the engine's scope caution."""
    assert GENERAL.message == app.cli.CAUTION
    assert GENERAL.message == app.exports._FALLBACK_CAUTION
    assert GENERAL.message == app.page.style.GENERAL_CAUTION


def test_the_general_caution_names_what_is_not_checked():
    """It names the checks strutscope does not make yet (rule: when a check is added, the cautions change)."""
    for unchecked in (
        "lateral-torsional buckling",
        "(6.61)/(6.62)",
        "class 4",
        "connections",
        "load combinations",
    ):
        assert unchecked in GENERAL.message
    assert "licensed engineer" in GENERAL.message
