"""The served page's Bokeh models pass Bokeh's own integrity checks.

The server skips Bokeh's document validation for every new page (`app/serve.py`, start-up, issue 10): this
test runs the same checks (`bokeh.core.validation.check_integrity`, Bokeh's reference) once on a built page,
on the demo case, so a layout mistake that Bokeh calls an error still fails here.
"""

import panel as pn
from bokeh.core.validation.check import check_integrity
from bokeh.document import Document

from app.serve import make_page


def _models(page):
    document = Document()
    root = pn.panel(page).get_root(document)
    document.add_root(root)
    return [model for r in document.roots for model in r.references()]


def test_a_built_page_has_no_bokeh_validation_error():
    page = make_page()
    models = _models(page)
    assert len(models) > 50  # the page was really built
    issues = check_integrity(models)
    assert [f"E-{issue.code} {issue.name}: {issue.extra}" for issue in issues.error] == []


def test_the_check_finds_an_error_in_a_broken_layout():
    """The check itself can fail: a plot with a known Bokeh error (E-1001 BAD_COLUMN_NAME)."""
    from bokeh.models import ColumnDataSource
    from bokeh.plotting import figure

    plot = figure()
    plot.line(x="a", y="missing", source=ColumnDataSource({"a": [1, 2]}))
    issues = check_integrity(plot.references())
    assert [issue.name for issue in issues.error] == ["BAD_COLUMN_NAME"]
