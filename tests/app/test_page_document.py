"""The served page's Bokeh models pass Bokeh's own integrity checks.

The server skips Bokeh's document validation for every new page (`app/serve.py`, start-up, issue 10): this
test runs the same checks (`bokeh.core.validation.check_integrity`, Bokeh's reference) once on a built page,
on the demo case, so a layout mistake that Bokeh calls an error still fails here.
"""

import panel as pn
from bokeh.core.validation.check import check_integrity
from bokeh.document import Document

from app.serve import make_page


def _plain_demo():
    """The plain invented demo (no load cases), which the page opened at start before issue 17's switch."""
    from importlib import resources

    import engine

    return engine.Case.from_json(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))


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


def test_the_first_page_carries_no_unused_models():
    """Start-up (issue 10): the browser builds every model of the first page, so the page sends none it
    does not show: no selection or mute copies of a glyph (nothing is selected or muted), no kept variants'
    lines before a variant is kept, and the tabs not shown are built when opened. 429 models before this was
    trimmed, 311 after (2026-12-02); the bound leaves room for a few widgets, not another figure's worth.
    The start page (the demo with load cases, issue 17) adds the combination picker and the governing block:
    325 models (2026-12-03), the plain demo's page 317; both stay under the same bound."""
    from bokeh.models import GlyphRenderer

    def picker(models):
        return [m for m in models if getattr(m, "title", None) == "Combination shown"]

    def governing(models):
        return [m for m in models if "ss-governing" in (getattr(m, "css_classes", None) or [])]

    for page, with_actions in ((make_page(), True), (make_page(_plain_demo()), False)):
        models = _models(page)
        renderers = [m for m in models if isinstance(m, GlyphRenderer)]
        assert renderers, "the page drew no glyphs"
        assert [r for r in renderers if r.nonselection_glyph is not None or r.muted_glyph is not None] == []
        assert not [m for m in models if getattr(m, "name", None) and str(m.name).startswith("variant_")]
        # the envelope band's models are made when "envelope" is first chosen
        assert not [m for m in models if str(getattr(m, "name", None) or "").startswith("envelope_")]
        # a case without load cases sends neither the combination picker nor the governing-combination block
        assert bool(picker(models)) is with_actions and bool(governing(models)) is with_actions
        assert len(models) <= 330, (with_actions, len(models))


def test_a_kept_variant_gets_its_lines_when_kept():
    """The variants' lines, left out of the first page, appear on the diagrams once a variant is kept."""
    page = make_page()
    diagrams = page.diagrams
    assert diagrams.renderers["M"]["variants"] == []
    page.keep_variant()
    lines = [diagrams.renderers[kind]["variants"] for kind in ("w", "M", "V")]
    assert [len(line) for line in lines] == [1, 1, 1] and all(line[0].visible for line in lines)
    # drawn under the case's own lines
    assert diagrams.fig_M.renderers[0] is diagrams.renderers["M"]["variants"][0]
    page.variants.clear()
    assert not diagrams.renderers["M"]["variants"][0].visible


def _served_document():
    """A document as a server's session has it: with a session context (stands in for Bokeh's)."""
    from types import SimpleNamespace

    document = Document()
    document._session_context = lambda: SimpleNamespace(request=SimpleNamespace(arguments={}), id="test")
    return document


def _delayed_builds(document):
    return [c for c in document.session_callbacks if type(c).__name__ == "TimeoutCallback"]


def test_a_served_request_is_answered_at_once_and_the_page_built_just_after():
    """Start-up (issue 10): a served request gets an empty frame at once (its HTML goes out, and the browser
    loads its scripts) and the page is built into the frame a moment later, before the browser asks for it.
    Before this change the page was built inside the request, and the browser waited for it."""
    from panel.io.state import set_curdoc

    from app.serve import BUILD_DELAY_MS

    document = _served_document()
    with set_curdoc(document):
        frame = make_page()
    assert frame.objects == []  # nothing built inside the request
    [build] = _delayed_builds(document)
    assert build.timeout == BUILD_DELAY_MS
    build.callback()
    [page] = frame.objects
    texts = [str(pane.object) for pane in page.select(pn.pane.HTML)]
    # the values are there when the browser asks for the page
    assert [text for text in texts if "ss-values" in text and "kN" in text]
    build.callback()  # a second call builds nothing more
    assert frame.objects == [page]


def test_a_page_that_fails_to_build_says_so_instead_of_staying_blank(monkeypatch, capsys):
    from panel.io.state import set_curdoc

    import app.serve

    def broken(case, runner):
        raise RuntimeError("a fault for the test")

    monkeypatch.setattr(app.serve, "_build_page", broken)
    document = _served_document()
    with set_curdoc(document):
        frame = make_page()
    _delayed_builds(document)[0].callback()
    [message] = frame.objects
    assert "could not build this page" in message.object
    assert "RuntimeError: a fault for the test" in capsys.readouterr().err
