"""The page's sketch draws the shapes of app.sketch, the geometry the PNG and the PDF draw too.

Cases are invented. The checks compare the page's Bokeh sources with :func:`app.sketch.sketch` shape by
shape (kind, role, text), and check the conversion of the fixed-size offsets with the frame's size.
"""

import json
from collections import Counter
from importlib import resources

import numpy as np
import panel as pn
import pytest

import engine
from app.page.diagrams import DiagramsView
from app.page.sketch_view import SKETCH_INCH
from app.sketch import PAD_INCHES, Arrow, Polygon, Polyline, Text, sketch
from app.state import MemberState
from app.units import units

SPRINGS = {"translation": 5e6, "rotation": 2e5}


@pytest.fixture(autouse=True)
def clean_panel_state():
    """Reset Panel's global state after every test, so no document or cache leaks between tests."""
    yield
    pn.state.reset()


def _case(**changes):
    """The invented demo case with `changes`."""
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    mapping = json.loads(text)
    mapping.update(changes)
    return engine.Case.from_dict(mapping)


CASES = {
    "demo: pinned, uniform and point load, bow": {},
    "fixed and free, couple, no bow": dict(
        supports={"left": "fixed", "right": "free"},
        loads=[{"type": "couple", "C": -3e3, "x": 4.0}, {"type": "point", "P": -2e3, "x": 6.0}],
        imperfection={"shape": "none", "amplitude": 0.0},
    ),
    "guided and springs, linear load, tension": dict(
        supports={"left": SPRINGS, "right": "guided"},
        axial_force=-120e3,
        loads=[{"type": "linear", "q_start": 1e3, "q_end": -2e3}],
    ),
    "fixed and pinned, parabolic bow, partial uniform load": dict(
        supports={"left": "fixed", "right": "pinned"},
        loads=[{"type": "uniform", "q": 1.5e3, "start": 1.0, "end": 4.0}],
        imperfection={"shape": "parabola", "amplitude": 0.01},
    ),
    "above Pcr1: the danger note": dict(axial_force=4000e3),
}


def _drawn(state):
    """The page's sketch view for `state` and its sources' rows, as (kind, role) counts and texts."""
    view = DiagramsView(state).sketch
    counts = Counter()
    texts = []
    for name, kind in (
        ("lines", "line"),
        ("patches", "polygon"),
        ("arrows", "arrow"),
        ("axial_arrows", "arrow"),
        ("text", "text"),
        ("axial_text", "text"),
        ("frame_text", "text"),
        ("axial_frame_text", "text"),
    ):
        data = getattr(view, name).data
        counts.update((kind, role) for role in data["role"])
        texts += data.get("text", [])
    return view, counts, sorted(texts)


def _expected(result, U):
    """The shapes of app.sketch as (kind, role) counts and texts."""
    kinds = {Polygon: "polygon", Polyline: "line", Arrow: "arrow", Text: "text"}
    shapes = sketch(result, U).shapes
    counts = Counter((kinds[type(s)], s.role) for s in shapes)
    return counts, sorted(s.text for s in shapes if isinstance(s, Text))


@pytest.mark.parametrize("name", CASES)
@pytest.mark.parametrize("system", ["si", "us"])
def test_page_sketch_holds_the_shapes_of_app_sketch(name, system):
    """Every shape of app.sketch is on the page, once, with its role and its text, in SI and in US units."""
    state = MemberState.from_case(_case(**CASES[name]))
    state.units = system
    _, counts, texts = _drawn(state)
    assert (counts, texts) == _expected(state.result, units(system))


def test_danger_note_takes_the_notes_place_and_follows_n():
    """Above Pcr1 the danger note shows and the explanatory note hides; back below, the reverse."""
    state = MemberState.from_case(_case(axial_force=4000e3))
    view, _, texts = _drawn(state)
    assert any(text.startswith(state.result.status) for text in view.axial_frame_text.data["text"])
    assert not view.labels["sketch_frame_text"].visible
    state.axial_force = 350e3
    assert state.result.status == "stable"
    assert view.axial_frame_text.data["text"] == [] and view.labels["sketch_frame_text"].visible


def test_axial_arrows_follow_the_axial_force():
    """Dragging N to tension turns the axial arrows round and rewrites their label, in the axial sources."""
    state = MemberState.from_case(_case())
    view, _, _ = _drawn(state)
    before = dict(view.axial_arrows.data)
    assert view.axial_text.data["text"] == ["N = 350.00 kN\ncompression"]
    state.axial_force = -200e3
    assert view.axial_text.data["text"] == ["N = 200.00 kN\ntension"]
    np.testing.assert_allclose(view.axial_arrows.data["x0"], before["x1"])  # heads and tails swapped
    np.testing.assert_allclose(view.axial_arrows.data["x1"], before["x0"])


def test_offsets_are_converted_with_the_frame_size_and_redrawn_on_resize():
    """An inch offset spans SKETCH_INCH px of the reported frame; a new width refits the range and redraws."""
    state = MemberState.from_case(_case())
    view, _, _ = _drawn(state)
    L = 6.0
    width, _ = view.inner_size()
    r = view.x_range
    assert r.start < 0 and r.end > L
    pad_px = -r.start / (r.end - r.start) * width
    assert pad_px >= PAD_INCHES * SKETCH_INCH - 1e-9  # room for the supports and the axial arrows
    arrow = view.axial_arrows.data
    gap_in = abs(arrow["x1"][0] - arrow["x0"][0]) / (r.end - r.start) * width / SKETCH_INCH
    assert gap_in == pytest.approx(0.42)  # app.sketch's axial arrow is 0.42 in long
    view.figure.set_from_json("inner_width", 1400)  # as the browser reports a wider frame
    width_in = 1400 / SKETCH_INCH
    pad = max(0.1 * L, PAD_INCHES * L / (width_in - 2 * PAD_INCHES))  # a tenth of L is more here
    assert (view.x_range.start, view.x_range.end) == pytest.approx((-pad, L + pad))
    arrow = view.axial_arrows.data
    span = view.x_range.end - view.x_range.start
    assert abs(arrow["x1"][0] - arrow["x0"][0]) / span * width_in == pytest.approx(0.42)
