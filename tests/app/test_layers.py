"""The app's modules form no import cycle, counting the imports made inside functions.

The app defers some imports for start-up time (``strutscope --help`` loads neither the engine nor Panel; the
exports load matplotlib when a file is asked for); none of them dodges a cycle: with every deferred import
counted as if it were at module level, there is still no cycle. The graph is read with ``ast`` by the engine's
own layer test, pointed at ``app/``.
"""

import pathlib

import pytest

from tests.engine import test_layers as layers

APP = pathlib.Path(__file__).resolve().parents[2] / "app"


@pytest.fixture
def app_graph(monkeypatch):
    monkeypatch.setattr(layers, "ENGINE", APP)
    return layers._graph


@pytest.mark.parametrize("with_deferred", [False, True])
def test_the_app_has_no_import_cycle(app_graph, with_deferred):
    """No chain of imports inside app/ leads back to where it started, deferred imports included."""
    graph = app_graph(with_deferred)
    assert "app.page.member" in graph and "app.report.words" in graph  # the reader sees the packages
    assert layers._cycle(graph) is None, " -> ".join(layers._cycle(graph))


@pytest.mark.parametrize("path", sorted(APP.rglob("*.py")), ids=lambda p: str(p.relative_to(APP)))
def test_every_app_module_is_under_the_size_limit(path):
    """No module of app/ is longer than 600 lines (the project's rule for every module)."""
    lines = path.read_text(encoding="utf-8").count("\n")
    assert lines <= layers.MAX_LINES, f"{path}: {lines} lines"
