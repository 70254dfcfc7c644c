"""The member sketch as renderer-neutral shapes (app.sketch), and the sign convention of M in the figures.

Cases are invented. The checks are on the geometry the module hands to any renderer, and on the matplotlib
renderer drawing every shape of it.
"""

import json
import math
from importlib import resources

import pytest

import engine
from app import exports
from app.exports.sketch_draw import _draw_sketch
from app.sketch import (
    FRAME_LEFT,
    FRAME_RIGHT,
    MOMENT_POSITIVE_DOWN,
    ROLES,
    Arrow,
    Polygon,
    Polyline,
    Text,
    sketch,
)
from app.units import units


def _solved(**changes):
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    mapping = json.loads(text)
    mapping.update(changes)
    return engine.solve(engine.Case.from_dict(mapping))


SUPPORTS = ["pinned", "fixed", "free", "guided", {"translation": 5e6, "rotation": 2e5}]


# Every pair the engine accepts (pinned–free and guided–free or –guided are mechanisms, refused).
PAIRS = [
    (left, right)
    for left in SUPPORTS[:2] + SUPPORTS[3:]
    for right in SUPPORTS
    if (left, right) not in (("pinned", "free"), ("guided", "free"), ("guided", "guided"))
]


@pytest.mark.parametrize(("left", "right"), PAIRS)
def test_every_shape_has_a_known_role_and_finite_points(left, right):
    """Each shape names a role of ROLES; its points are finite (a text may sit at the frame's edge)."""
    result = _solved(supports={"left": left, "right": right}, axial_force=50e3)
    shapes = sketch(result, units("si")).shapes
    assert shapes and all(shape.role in ROLES for shape in shapes)
    for shape in shapes:
        if isinstance(shape, (Polyline, Polygon)):
            values = shape.x + shape.y + shape.dx + shape.dy
            assert len(shape.x) == len(shape.y) == len(shape.dx) == len(shape.dy) >= 2
        elif isinstance(shape, Arrow):
            values = shape.tail + shape.head
        else:
            values = shape.at[1:] if shape.at[0] in (FRAME_LEFT, FRAME_RIGHT) else shape.at
        assert all(math.isfinite(v) for v in values), shape


def test_supports_loads_and_axial_force_in_the_demo():
    """The demo: two hinges on triangles, a point load F and the axial force N labelled, load arrows down."""
    shapes = sketch(_solved(), units("si")).shapes
    hinges = [s for s in shapes if isinstance(s, Polygon) and s.role == "hinge"]
    assert len(hinges) == 4  # a triangle and a hinge circle at each pinned end
    texts = [s.text for s in shapes if isinstance(s, Text)]
    assert "F = 4.000 kN" in texts and "N = 350.00 kN\ncompression" in texts
    assert not any(t.startswith("P =") for t in texts)  # P is not the name of a point load or of N
    loads = [s for s in shapes if isinstance(s, Arrow) and s.role == "load"]
    assert loads and all(s.head[1] < s.tail[1] for s in loads)  # positive loads point down (+ w)


def test_us_sketch_has_no_si_unit():
    """The sketch's texts are in the display units (US here)."""
    texts = " ".join(s.text for s in sketch(_solved(), units("us")).shapes if isinstance(s, Text))
    assert "kip" in texts and "ft" in texts and " kN" not in texts and " mm" not in texts


def test_matplotlib_draws_every_shape():
    """The PNG's renderer draws one artist per shape: the page and the exports show the same geometry."""
    from matplotlib.figure import Figure
    from matplotlib.text import Annotation

    result = _solved(supports={"left": {"translation": 5e6, "rotation": 2e5}, "right": "guided"})
    fig = Figure(figsize=(8, 2))
    ax = fig.add_subplot()
    ax.set_xlim(-1, 7)
    _draw_sketch(ax, result, units("si"))
    shapes = sketch(result, units("si")).shapes
    counts = {
        Polyline: len(ax.lines),
        Polygon: len(ax.patches),
        Arrow: sum(isinstance(t, Annotation) for t in ax.texts),
        Text: sum(not isinstance(t, Annotation) for t in ax.texts),
    }
    for kind, drawn in counts.items():
        assert drawn == sum(type(s) is kind for s in shapes), kind


def test_moment_is_drawn_positive_downward_in_the_figures():
    """M positive downward (the tension side with + w down), in the PNG figure and the calc sheet's figure."""
    assert MOMENT_POSITIVE_DOWN
    result = _solved()
    for figure in (exports.result_figure(result, date="2026-01-15"), exports.calc_sheet_figures(result)[-1]):
        moment_ax = next(ax for ax in figure.axes if ax.get_ylabel().startswith("bending moment M"))
        assert moment_ax.yaxis_inverted()
        assert "(+ downward)" in moment_ax.get_ylabel()


@pytest.mark.parametrize("amplitude", [1e-310, 1e-200, 5e-3])
def test_a_tiny_bow_is_drawn_finite_or_left_out_without_a_warning(amplitude):
    """A bow so small that 0.38/max|w0| overflows (the fuzzer found 1e-310 m) drew NaN with a RuntimeWarning;
    now every drawn point is finite (an invented member)."""
    import warnings

    from app.sketch import sketch
    from app.units import units

    case = engine.Case.from_dict(
        {
            "schema": 1,
            "length": 3.0,
            "EI": 2e6,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 1e3,
            "loads": [],
            "imperfection": {"shape": "sine", "amplitude": amplitude},
        }
    )
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        drawn = sketch(engine.solve(case), units("si"))
    bows = [shape for shape in drawn.shapes if getattr(shape, "role", None) == "bow"]
    for shape in bows:
        assert all(math.isfinite(v) for v in (*shape.x, *shape.y, *shape.dx, *shape.dy))
    if amplitude == 5e-3:
        assert bows, "a 5 mm bow is drawn"
