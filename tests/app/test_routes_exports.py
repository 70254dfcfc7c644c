"""The second plane and the routes in the exports: CSV columns and metadata, the calc sheet's text (issue 14).

Routes are built by hand (invented numbers, tests/app/test_routes_report.py); the second plane is the demo
member solved about its minor axis under an invented load.
"""

import csv
import dataclasses
import io
import json
from importlib import resources

import numpy as np
import pypdf
import pytest

import engine
from app import exports
from tests.app.test_routes_report import ROUTES
from tests.app.test_unit_systems import FORBIDDEN


@pytest.fixture(scope="module")
def two_planes():
    """The demo with a second plane (minor axis, uniform 1 kN/m, invented) and hand-made routes."""
    mapping = json.loads(
        resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    )
    result = engine.solve(engine.Case.from_dict(mapping))
    other = dict(mapping, axis="minor", loads=[{"type": "uniform", "q": 1.0e3}])
    second = engine.solve(engine.Case.from_dict(other))
    return dataclasses.replace(result, routes=ROUTES, second_plane=second)


def _table(text):
    lines = [line for line in text.lstrip("\ufeff").splitlines() if not line.startswith("#")]
    return list(csv.DictReader(lines))


def test_csv_has_second_plane_columns(two_planes):
    """The CSV names the second plane's columns by its axis (_z) and its M_z peaks at the exact value."""
    text = exports.csv_text(two_planes, units="si")
    rows = _table(text)
    for name in ("w_z [mm]", "w0_z [mm]", "rotation_z [mrad]", "M_z [kN·m]", "V_z [kN]"):
        assert name in rows[0]
    m_z = np.array([float(row["M_z [kN·m]"]) for row in rows])
    exact = abs(float(two_planes.second_plane.governing.moment.value)) / 1e3
    # A uniform load on a pinned span peaks at mid-span, which is a station of both planes here.
    assert np.max(np.abs(m_z)) == pytest.approx(exact, rel=1e-5)
    assert "# Pcr1_z [kN]" in text and "# max|M_z| [kN·m]" in text
    assert "# route AISC 360-16 (LRFD) [-],0.951,H1-1a; for comparison" in text


def test_one_plane_csv_has_no_plane_columns(two_planes):
    """A one-plane result has no _z column and no route row when the engine gives no routes."""
    plain = dataclasses.replace(two_planes, routes=(), second_plane=None)
    text = exports.csv_text(plain, units="si")
    assert "M_z" not in text and "# route " not in text


def _pdf_text(result, system):
    reader = pypdf.PdfReader(io.BytesIO(exports.pdf_bytes(result, units=system)))
    return "\n".join(page.extract_text() for page in reader.pages)


@pytest.mark.parametrize("system", ["si", "us"])
def test_calc_sheet_has_each_route_and_the_second_plane(two_planes, system):
    """The calc sheet names each route, its utilisation, the headline, facts, sources and the second plane."""
    text = " ".join(_pdf_text(two_planes, system).split())
    assert "second order + cross-section 0.812, cross-section (enabled)" in text
    assert "0.903, eq. (6.62) (headline)" in text
    assert "AISC 360-16 (LRFD) 0.951, H1-1a (for comparison)" in text
    assert "Headline utilisation 0.903 by EN 1993-1-1 equivalent member (Annex B), eq. (6.62)" in text
    assert "source: AISC 360-16 §E3, §H1.1" in text
    assert "Second plane bending about the minor axis (z–z)" in text
    assert ("F_cr = 215.0 MPa" if system == "si" else "F_cr = 31.18 ksi") in text
    found = [text[max(0, m.start() - 40) : m.end() + 5] for m in FORBIDDEN[system].finditer(text)]
    assert not found


def test_png_figure_draws_both_planes():
    """With a second plane the figure has two sets of diagrams, each headed by the axis it bends about."""
    from app.exports.figure import result_figure
    from app.exports.ltb_mode import has_ltb_mode

    fig = result_figure(two_planes_result(), units="us")
    texts = [text.get_text() for text in fig.texts]
    assert "bending about the major axis (y–y)" in texts and "bending about the minor axis (z–z)" in texts
    # a sketch and three diagrams per plane, and the lateral-torsional buckling mode's panel when checked
    mode = int(has_ltb_mode(two_planes_result()))
    assert len(fig.axes) == 8 + mode
    single = result_figure(dataclasses.replace(two_planes_result(), second_plane=None), units="us")
    assert len(single.axes) == 4 + mode


def two_planes_result():
    """The demo solved by the engine with a second plane (minor axis, uniform 1 kN/m, invented)."""
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    mapping = json.loads(text)
    mapping["second_plane"] = {
        "supports": {"left": "pinned", "right": "pinned"},
        "loads": [{"type": "uniform", "q": 1.0e3}],
    }
    return engine.solve(engine.Case.from_dict(mapping))


def test_calc_sheet_has_a_figure_page_per_plane():
    """A two-plane calc sheet ends with one figure page per plane, each headed by its axis, each drawing its
    own plane's moment (the largest |M| plotted is that plane's, in kN·m); a one-plane sheet keeps one."""
    result = two_planes_result()
    pages = exports.calc_sheet_figures(result)
    heads = [" ".join(t.get_text() for t in page.texts) for page in pages[-2:]]
    assert "Figures, bending about the major axis (y–y)" in heads[0]
    assert "Figures, bending about the minor axis (z–z)" in heads[1]
    total = len(pages)
    assert f"page {total - 1} of {total}" in heads[0] and f"page {total} of {total}" in heads[1]
    for page, plane in zip(pages[-2:], (result, result.second_plane), strict=True):
        drawn = max(
            float(np.nanmax(np.abs(line.get_ydata())))
            for ax in page.axes
            for line in ax.get_lines()
            if ax.get_ylabel().startswith("bending moment M") and len(line.get_ydata()) > 10
        )
        assert drawn == pytest.approx(abs(plane.governing.moment.value) / 1e3, rel=1e-3)
    single = exports.calc_sheet_figures(dataclasses.replace(result, second_plane=None))
    assert len(single) == total - 1
    assert "Figures: " in " ".join(t.get_text() for t in single[-1].texts)
