"""Exports (app.exports): the figure, PNG, CSV, the PDF calc sheet and the case file, from engine results.

Unit factors here are written out independently of app.units from the exact definitions 1 in = 0.0254 m,
1 ft = 0.3048 m and 1 lbf = 4.4482216152605 N (NIST SP 811 (2008) Appendix B, from memory). The sheet size
is ISO 216 A4, 210 mm × 297 mm (from memory). The demo and the small cases are invented.
"""

import csv
import dataclasses
import io
import math
import os
import re
import subprocess
import sys
from importlib import resources
from pathlib import Path

import numpy as np
import pypdf
import pytest
from matplotlib.figure import Figure
from PIL import Image

import engine
from app import exports
from app.report import caution_text, general_caution, source_text

REPO_ROOT = Path(__file__).resolve().parents[2]
DATE = "2025-01-15"
KIP = 4448.2216152605  # [N]
FOOT, INCH = 0.3048, 0.0254  # [m]

# Display factors written out for the tests: display value = SI value × factor.
SI = {"x": 1.0, "w": 1e3, "rotation": 1e3, "M": 1e-3, "V": 1e-3, "T": 1e-3}
US = {"x": 1 / FOOT, "w": 1 / INCH, "rotation": 1e3, "M": 1 / (KIP * FOOT), "V": 1 / KIP, "T": 1 / KIP}


def small_case(**changes):
    """A small invented pinned–pinned case with `changes` applied."""
    mapping = {
        "schema": 1,
        "title": "Invented test case",
        "length": 4.0,
        "EI": 2.0e6,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 100e3,
        "loads": [{"type": "uniform", "q": 1.0e3}],
        "imperfection": {"shape": "none", "amplitude": 0.0},
    }
    mapping.update(changes)
    return engine.Case.from_dict(mapping)


@pytest.fixture(scope="module")
def demo_case():
    """The invented demo case shipped in assets/."""
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    return engine.Case.from_json(text)


@pytest.fixture(scope="module")
def demo(demo_case):
    """The demo case solved."""
    return engine.solve(demo_case)


@pytest.fixture(scope="module")
def springs():
    """An invented case with springs, a guided end, a linear load, couples, an upward point load and a bow."""
    return engine.solve(
        small_case(
            title="Invented springs case",
            supports={"left": {"translation": 5e6, "rotation": 2e5}, "right": "guided"},
            loads=[
                {"type": "linear", "q_start": 2e3, "q_end": -1e3},
                {"type": "couple", "C": 3e3, "x": 1.0},
                {"type": "point", "P": -2e3, "x": 2.5},
            ],
            imperfection={"shape": "parabola", "amplitude": 0.01},
        )
    )


@pytest.fixture(scope="module")
def critical(demo_case, demo):
    """The demo at its own first critical load: status critical, every response +inf, the check too."""
    result = engine.solve(dataclasses.replace(demo_case, axial_force=float(demo.critical_loads[0])))
    assert result.status == "critical"
    return result


@pytest.fixture(scope="module")
def unstable():
    """A small invented case above its first critical load (π²EI/L² = 1233.7 kN): status unstable."""
    result = engine.solve(small_case(title="Invented beyond critical", axial_force=1.8e6))
    assert result.status == "unstable"
    return result


@pytest.fixture(scope="module")
def demo_pdf(demo):
    """The demo's calc sheet in SI, with names in the header."""
    return exports.pdf_bytes(demo, prepared_by="A. Engineer", checked_by="B. Checker", date=DATE)


# Each page's frame (heading and footer), which the text extraction puts inside a paragraph that runs on
# from one page to the next.
_FRAME = re.compile(
    r"strutscope · calculation sheet page \d+ of \d+ (?:Elastic analysis of one member, not a full code "
    r"check: see the caution in section \d\. )?"
)


def pdf_text(data: bytes) -> tuple[int, str]:
    """Page count and the whole text of a PDF, whitespace collapsed, without the pages' frames."""
    reader = pypdf.PdfReader(io.BytesIO(data))
    text = " ".join(page.extract_text() for page in reader.pages)
    return len(reader.pages), _FRAME.sub("", " ".join(text.split()))


def read_csv(text: str):
    """The comment lines and the rows (header first) of an exported CSV (its byte order mark removed)."""
    assert text.startswith("\ufeff")
    lines = text[1:].splitlines()
    comments = [line for line in lines if line.startswith("#")]
    rows = list(csv.reader(line for line in lines if not line.startswith("#")))
    return comments, rows


def column(rows, header):
    """One CSV column as floats."""
    i = rows[0].index(header)
    return np.array([float(row[i]) for row in rows[1:]])


def four_figures(value: float) -> str:
    """A value of magnitude 1 to 9999 to 4 significant figures, fixed-point (the CLI's format)."""
    decimals = max(3 - math.floor(math.log10(abs(value))), 0)
    return f"{value:.{decimals}f}"


def figure_text(fig) -> str:
    """Every text in a figure (title block, annotations, labels), joined."""
    texts = [t.get_text() for t in fig.texts]
    for ax in fig.axes:
        texts += [t.get_text() for t in ax.texts]
        texts += [ax.get_ylabel(), ax.get_xlabel()]
    for legend in fig.legends:
        texts += [t.get_text() for t in legend.get_texts()]
    return "\n".join(texts)


# ----------------------------------------------------------------------------------------------------- PNG


@pytest.mark.parametrize(("dpi", "size"), [(100, (1169, 827)), (150, (1754, 1240))])
def test_png_is_a4_landscape_at_dpi(demo, dpi, size):
    """The PNG decodes at A4 landscape × dpi: 297 × 210 mm (ISO 216, from memory), 1754 × 1240 px at 150."""
    assert size == (round(297 / 25.4 * dpi), round(210 / 25.4 * dpi))
    image = Image.open(io.BytesIO(exports.png_bytes(demo, dpi=dpi, date=DATE)))
    assert image.format == "PNG"
    assert image.size == size
    image.load()


def test_png_refuses_bad_dpi_and_units(demo):
    """A dpi outside 30 to 600 or an unknown units system is refused with the field named."""
    with pytest.raises(ValueError, match="^dpi: 5000"):
        exports.png_bytes(demo, dpi=5000)
    with pytest.raises(ValueError, match="^dpi: True"):
        exports.png_bytes(demo, dpi=True)
    with pytest.raises(ValueError, match="^units: 'metric'"):
        exports.png_bytes(demo, units="metric")


# ----------------------------------------------------------------------------------------------------- figure


def test_figure_shows_governing_values_and_caution(demo):
    """The figure labels the peaks with value and x, names the supports, and has the title and the caution."""
    fig = exports.result_figure(demo, date=DATE)
    assert isinstance(fig, Figure)
    assert tuple(round(v, 2) for v in fig.get_size_inches()) == (11.69, 8.27)
    text = figure_text(fig)
    peak = demo.governing.moment
    assert f"{four_figures(peak.value / 1e3)} kN·m at x = {peak.x:.3f} m" in text
    first = demo.first_order.governing.moment
    assert f"first order {four_figures(first.value / 1e3)} kN·m at x = {first.x:.3f} m" in text
    assert demo.case.title in " ".join(text.split())
    assert DATE in text and "pinned" in text
    assert any(c.code == "scope" for c in demo.cautions)
    general = general_caution(demo)  # the engine's scope caution in the report's one wording
    assert " ".join(general.split()) in " ".join(text.split())
    # The deflection diagram points + w downward, as the sketch does.
    assert fig.axes[1].yaxis_inverted()


def test_figure_in_us_units(springs):
    """In US units the axes and labels say ft, in, kip·ft and kip, and the peak values are converted."""
    fig = exports.result_figure(springs, units="us", date=DATE)
    text = figure_text(fig)
    for label in ("x [ft]", "[in]", "[kip·ft]", "[kip]"):
        assert label in text
    peak = springs.governing.moment
    assert f"{four_figures(peak.value / (KIP * FOOT))} kip·ft at x = {four_figures(peak.x / FOOT)} ft" in text


def test_figure_at_critical_load_skips_unbounded_curves(critical):
    """At a critical load no plotted line holds inf, the first order is drawn and 'unbounded' is shown."""
    fig = exports.result_figure(critical, date=DATE)
    lines = [line for ax in fig.axes[1:] for line in ax.get_lines()]
    assert lines and all(np.all(np.isfinite(np.asarray(line.get_ydata(), dtype=float))) for line in lines)
    first_moment = critical.first_order.moment / 1e3
    assert any(
        np.allclose(line.get_ydata(), first_moment)
        for line in fig.axes[2].get_lines()
        if len(line.get_ydata()) == len(first_moment)
    )
    assert "unbounded" in figure_text(fig)


def test_exports_use_no_pyplot(tmp_path):
    """Every export, built in a fresh interpreter, leaves matplotlib.pyplot unimported (its state leaks)."""
    code = (
        "import sys, engine\n"
        "from app import exports\n"
        "case = engine.Case.from_dict({'schema': 1, 'title': 'Invented', 'length': 3.0, 'EI': 1e6,"
        " 'supports': {'left': 'fixed', 'right': 'free'}, 'axial_force': 1e4,"
        " 'loads': [{'type': 'point', 'P': 1e3, 'x': 3.0}],"
        " 'imperfection': {'shape': 'none', 'amplitude': 0}})\n"
        "r = engine.solve(case)\n"
        "exports.png_bytes(r, dpi=30); exports.pdf_bytes(r); exports.csv_text(r)\n"
        "assert 'matplotlib.pyplot' not in sys.modules, 'pyplot was imported'\n"
    )
    path = os.pathsep.join(filter(None, [str(REPO_ROOT), os.environ.get("PYTHONPATH")]))
    env = dict(os.environ, PYTHONPATH=path)
    done = subprocess.run(
        [sys.executable, "-c", code], cwd=tmp_path, env=env, capture_output=True, text=True, timeout=120
    )
    assert done.returncode == 0, done.stderr


# ----------------------------------------------------------------------------------------------------- CSV


@pytest.mark.parametrize(
    ("system", "factors", "labels"),
    [
        ("si", SI, {"x": "m", "w": "mm", "M": "kN·m", "V": "kN"}),
        ("us", US, {"x": "ft", "w": "in", "M": "kip·ft", "V": "kip"}),
    ],
)
def test_csv_matches_engine_arrays(demo, system, factors, labels):
    """Each CSV column is the engine's array times the unit factor (to 6 figures); headers carry units."""
    _, rows = read_csv(exports.csv_text(demo, units=system))
    header = rows[0]
    assert len(rows) - 1 == len(demo.x)
    first = demo.first_order
    x, w, M, V = (labels[k] for k in ("x", "w", "M", "V"))
    expected = {
        f"x [{x}]": demo.x * factors["x"],
        f"w [{w}]": demo.deflection * factors["w"],
        f"w1 [{w}]": first.deflection * factors["w"],
        f"w0 [{w}]": demo.initial_bow * factors["w"],
        f"w+w0 [{w}]": demo.total_offset * factors["w"],
        f"w1+w0 [{w}]": first.total_offset * factors["w"],
        "rotation [mrad]": demo.rotation * factors["rotation"],
        "rotation1 [mrad]": first.rotation * factors["rotation"],
        f"M [{M}]": demo.moment * factors["M"],
        f"M1 [{M}]": first.moment * factors["M"],
        f"V [{V}]": demo.shear * factors["V"],
        f"V1 [{V}]": first.shear * factors["V"],
        f"T [{V}]": demo.transverse_force * factors["T"],
        f"T1 [{V}]": first.transverse_force * factors["T"],
        "utilisation [-]": demo.check.stations,
        "utilisation axial+bending [-]": demo.check.axial_bending,
        "utilisation shear [-]": demo.check.shear,
    }
    assert set(expected) == set(header)
    for name, values in expected.items():
        scale = float(np.max(np.abs(values)))
        # Six significant figures: half a unit in the sixth figure is at most 5e-6 of the value.
        np.testing.assert_allclose(column(rows, name), values, rtol=5e-6, atol=1e-12 * scale, err_msg=name)


def test_csv_keeps_doubled_stations(demo):
    """The station at the demo's point load (x = 2.2 m) appears twice, with the jump of V either side."""
    _, rows = read_csv(exports.csv_text(demo))
    x = column(rows, "x [m]")
    assert np.count_nonzero(x == 2.2) == np.count_nonzero(demo.x == 2.2) == 2
    V = column(rows, "V [kN]")[x == 2.2]
    # The point load of 4 kN makes T (and here V) drop by 4 kN (conventions.md: T(x+) - T(x-) = -F).
    assert V[0] - V[1] == pytest.approx(4.0, rel=0.05)


def metadata(comments) -> dict:
    """The CSV's metadata lines as {key: [value, note...]}, read as a spreadsheet splits them into cells."""
    rows = list(csv.reader(comments))
    assert all(row[0].startswith("# ") for row in rows)
    return {row[0][2:]: row[1:] for row in rows}


def test_csv_comments(demo):
    """Leading '# ' lines give the title, units system, axial force, Pcr1, status and the general caution."""
    comments, _ = read_csv(exports.csv_text(demo))
    meta = metadata(comments)
    assert meta["title"] == [demo.case.title]
    assert meta["units"] == ["SI (kN, m, mm, kN·m)"]
    assert float(meta["axial force N [kN]"][0]) == pytest.approx(demo.axial_force / 1e3, rel=5e-6)
    assert float(meta["Pcr1 [kN]"][0]) == pytest.approx(float(demo.critical_loads[0]) * 1e-3, rel=5e-6)
    assert meta["status"][0].startswith("stable: compression 350.00 kN")
    assert float(meta["utilisation [-]"][0]) == pytest.approx(demo.utilization, rel=5e-6)
    assert any(c.code == "scope" for c in demo.cautions)
    assert meta["caution"] == [general_caution(demo)]  # the report's one wording of it


def test_csv_opens_cleanly_in_a_spreadsheet(demo):
    """UTF-8 with a byte order mark; a metadata line is key, value and note cells, whatever its commas."""
    text = exports.csv_text(demo)
    assert text.encode("utf-8").startswith(b"\xef\xbb\xbf")  # what spreadsheets take for UTF-8
    comments, rows = read_csv(text)
    assert "," in demo.case.title  # the demo's title has commas: it must stay one cell
    for cells in csv.reader(comments):
        assert 2 <= len(cells) <= 3, cells
    assert metadata(comments)["title"] == [demo.case.title]
    assert all(len(row) == len(rows[0]) for row in rows)


def test_csv_numbers_have_six_significant_figures(demo):
    """Numbers carry six significant figures, not repr's seventeen (6.000000000000001 was written before)."""
    _, rows = read_csv(exports.csv_text(demo))
    cells = [cell for row in rows[1:] for cell in row]
    digits = [len(cell.lstrip("-").replace(".", "").lstrip("0").split("e")[0]) for cell in cells]
    assert max(digits) == 6
    assert "6" in column_text(rows, "x [m]")


def column_text(rows, header):
    """The cells of one CSV column, as text."""
    i = rows[0].index(header)
    return [row[i] for row in rows[1:]]


def test_csv_without_first_order_or_check():
    """A result with no first order and no member check exports without w1, M1 or utilisation columns."""
    result = engine.solve(small_case()).first_order  # the P = 0 solution has no first order of its own
    assert result.first_order is None and result.check is None
    comments, rows = read_csv(exports.csv_text(result))
    assert rows[0] == [
        "x [m]",
        "w [mm]",
        "w0 [mm]",
        "w+w0 [mm]",
        "rotation [mrad]",
        "M [kN·m]",
        "V [kN]",
        "T [kN]",
    ]
    np.testing.assert_allclose(column(rows, "M [kN·m]"), result.moment * 1e-3, rtol=5e-6, atol=1e-15)
    assert metadata(comments)["caution"][0].startswith("Elastic, one member. Not checked")


def test_csv_at_critical_load_writes_inf(critical):
    """At a critical load the second-order columns read back as +inf and the first-order ones stay finite."""
    _, rows = read_csv(exports.csv_text(critical))
    assert np.all(np.isinf(column(rows, "M [kN·m]")))
    assert np.all(np.isinf(column(rows, "utilisation [-]")))
    np.testing.assert_allclose(
        column(rows, "M1 [kN·m]"), critical.first_order.moment * 1e-3, rtol=5e-6, atol=1e-12
    )


# ----------------------------------------------------------------------------------------------------- PDF


def test_pdf_pages_and_governing_values(demo, demo_pdf):
    """The calc sheet has 2–4 pages; its text holds the governing moment and Pcr1 as printed (CLI format)."""
    pages, text = pdf_text(demo_pdf)
    # Text then the figure page; issue 14's routes and the out-of-plane caution can take a second text page.
    assert 2 <= pages <= 4
    moment = demo.governing.moment
    assert f"{four_figures(moment.value / 1e3)} kN·m" in text  # 27.17 kN·m, as the CLI prints it
    assert f"Pcr1 = {float(demo.critical_loads[0]) / 1e3:.1f} kN" in text  # 3279.4 kN, five figures
    assert f"{four_figures(demo.governing.deflection.value * 1e3)} mm" in text
    assert f"{four_figures(demo.governing.shear.value / 1e3)} kN" in text
    assert f"{demo.utilization:.3f}" in text


def test_pdf_carries_cautions_names_and_references(demo, demo_pdf):
    """The sheet has every caution of the result, the prepared/checked block and the method's references."""
    _, text = pdf_text(demo_pdf)
    for caution in demo.cautions:
        if caution.code == "out-of-plane-checked":  # section 4 states it: "Out of plane N/N_b,Rd = ..."
            assert "Out of plane" in text
            continue
        # As app.report words it: the engine's message, or its SI values in the sheet's units and symbols.
        assert " ".join(caution_text(caution, "si").split()) in text, caution.code
        # The sheet names the reference itself; strutscope's "from memory" flags stay in the code and README.
        assert " ".join(source_text(caution.source).split()) in text, caution.code
        assert "from memory" not in text
    assert "Prepared by: A. Engineer" in text and "Checked by: B. Checker" in text
    assert f"Date: {DATE}" in text
    for reference in (
        "Timoshenko and J. M. Gere",
        "Pestel and F. A. Leckie",
        "Wittrick and F. W. Williams",
        "§5.2.2(7)a",
        "Table 5.1",
        "§6.2",
        "AISC 360-16",
        "Appendix 8",
    ):
        assert reference in text


def test_pdf_blank_names_and_us_units(springs):
    """Without names the sheet leaves lines to sign; in US units the moment is printed in kip·ft."""
    pages, text = pdf_text(exports.pdf_bytes(springs, units="us", date=DATE))
    assert pages == 2
    assert "Prepared by: ____" in text and "Checked by: ____" in text
    moment = springs.governing.moment
    assert f"{four_figures(moment.value / (KIP * FOOT))} kip·ft" in text
    assert "No section and material given" in text


def test_pdf_extracts_lambda_bar_once(demo, demo_pdf):
    """λ̄ (λ and a combining macron, drawn as two glyphs) is extracted once, as the sheet prints it."""
    _, text = pdf_text(demo_pdf)
    # The demo's out-of-plane check prints "λ̄ = 1.550" (its minor-axis slenderness) and λ̄_y, λ̄_z, λ̄_LT.
    assert f"λ̄ = {demo.check.out_of_plane.facts()['lambda_bar']:.3f}," in text
    assert "λ̄_y = " in text and "λ̄_LT = " in text
    assert "λλ" not in text and "\u0304λ" not in text and "\u0304\u0304" not in text


def test_each_glyph_of_a_cluster_stands_for_its_own_character():
    """A glyph of a base-and-mark cluster is recorded as its own character; a ligature keeps the cluster."""
    from app.exports.pdf_text import own_characters

    class Font:  # a character map: λ and the macron have glyphs of their own, "fi" only as one ligature
        def get_char_index(self, code):
            return {0x3BB: 10, 0x304: 20, ord("f"): 30, ord("i"): 40}.get(code, 0)

    assert own_characters(Font(), "λ\u0304", 10) == "λ"
    assert own_characters(Font(), "λ\u0304", 20) == "\u0304"
    assert own_characters(Font(), "fi", 99) == "fi"
    assert own_characters(Font(), "λ", 10) == "λ" and own_characters(Font(), 0x3BB, 10) == 0x3BB


def test_pdf_is_reproducible(demo, demo_pdf):
    """The same result, names and date give the same PDF bytes (no creation time is stored)."""
    assert exports.pdf_bytes(demo, prepared_by="A. Engineer", checked_by="B. Checker", date=DATE) == demo_pdf


def test_pdf_refuses_bad_names_and_date(demo):
    """A date that is not a date or text, or a name that is not text, is refused with the field named."""
    with pytest.raises(ValueError, match="^date: 20250115"):
        exports.pdf_bytes(demo, date=20250115)
    with pytest.raises(ValueError, match="^prepared_by: 7"):
        exports.pdf_bytes(demo, prepared_by=7)


def test_critical_and_unstable_export_without_error(critical, unstable):
    """At and beyond a critical load every export succeeds; the sheet says 'unbounded' or 'unstable'."""
    _, text = pdf_text(exports.pdf_bytes(critical, date=DATE))
    assert "unbounded" in text and "critical" in text
    Image.open(io.BytesIO(exports.png_bytes(critical, dpi=40))).load()
    pages, text = pdf_text(exports.pdf_bytes(unstable, date=DATE))
    assert 1 <= pages <= 2 and "unstable" in text
    Image.open(io.BytesIO(exports.png_bytes(unstable, dpi=40))).load()
    assert exports.csv_text(unstable).count("\n") > len(unstable.x)


def test_pdf_of_result_without_first_order():
    """A result with no first order (the P = 0 solution itself) gives a sheet with the general caution."""
    result = engine.solve(small_case()).first_order
    _, text = pdf_text(exports.pdf_bytes(result, date=DATE))
    assert "Elastic, one member. Not checked: torsion" in text
    Image.open(io.BytesIO(exports.png_bytes(result, dpi=40))).load()


# ----------------------------------------------------------------------------------------------------- case


def test_case_json_round_trips(demo_case, springs):
    """The exported case file reads back as the same case (engine.Case.from_json)."""
    for case in (demo_case, springs.case):
        assert engine.Case.from_json(exports.case_json(case)) == case


def test_the_csv_writes_a_rounded_zero_as_zero():
    """M at the demo's pinned end is 0; the solution's rounding there (4.6e-15 kN·m) is written 0, as the
    page shows it, while every value above 1e-12 of its column's largest is kept."""
    import csv as _csv
    import json as _json

    from app import exports as _exports

    data = _json.loads(resources.files("assets").joinpath("demo_wind_post_actions.json").read_text("utf-8"))
    result = engine.solve(engine.Case.from_dict(data))
    rows = [
        r
        for r in _csv.reader(_exports.csv_text(result).lstrip("\ufeff").splitlines())
        if not r[0].startswith("#")
    ]
    header, body = rows[0], rows[1:]
    m = header.index(next(h for h in header if h.startswith("M [")))
    assert body[-1][m] == "0" and body[0][m] == "0"
    assert all("e-1" not in cell for row in body for cell in row)
