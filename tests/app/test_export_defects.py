"""Export defects of issue 13: overlapping peak labels, fonts, page orientation, reactions, file names, JSON.

Cases are invented. Geometry is checked with matplotlib's own renderer (Agg), fonts with pypdf.
"""

import io
import itertools
import json
from importlib import resources

import pypdf
import pytest
from matplotlib.backends.backend_agg import FigureCanvasAgg
from matplotlib.text import Annotation

import engine
from app import exports
from app.export_names import export_filename
from app.report import reaction_rows
from app.units import units
from tests.app.test_exports import _FRAME


def _demo_mapping():
    return json.loads(resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8"))


def _solved(**changes):
    mapping = _demo_mapping()
    mapping.update(changes)
    return engine.solve(engine.Case.from_dict(mapping))


CASES = {
    "demo": {},
    "small axial force (peaks side by side)": {"axial_force": 20e3},
    "large bow against small loads": {
        "imperfection": {"shape": "sine", "amplitude": 0.03},
        "loads": [{"type": "uniform", "q": 0.5e3}],
    },
    "tension": {"axial_force": -300e3},
    "cantilever": {"supports": {"left": "fixed", "right": "free"}, "axial_force": 150e3},
}


def _label_boxes(figure):
    renderer = FigureCanvasAgg(figure).get_renderer()
    figure.draw(renderer)
    out = []
    for ax in figure.axes[1:]:  # the diagrams; the first axes is the sketch
        out.append([t.get_window_extent(renderer) for t in ax.texts if isinstance(t, Annotation)])
    return out


@pytest.mark.parametrize("name", sorted(CASES))
@pytest.mark.parametrize("page", ["figure", "sheet"])
def test_peak_labels_never_overlap(name, page):
    """No two peak labels of a diagram overlap (first- and second-order ones collided), PNG and PDF alike."""
    result = _solved(**CASES[name])
    if page == "figure":
        figure = exports.result_figure(result, date="2026-01-15")
    else:
        figure = exports.calc_sheet_figures(result, date="2026-01-15")[-1]
    for boxes in _label_boxes(figure):
        for a, b in itertools.combinations(boxes, 2):
            assert not a.overlaps(b), (name, a, b)


def test_pdf_embeds_truetype_fonts_not_type3():
    """The calc sheet's fonts are TrueType (matplotlib's Type 42), not Type 3, so its text can be copied."""
    reader = pypdf.PdfReader(io.BytesIO(exports.pdf_bytes(_solved(), date="2026-01-15")))
    subtypes = set()
    for page in reader.pages:
        fonts = page["/Resources"].get("/Font", {})
        for ref in fonts.values():
            font = ref.get_object()
            subtypes.add(str(font["/Subtype"]))
            for descendant in font.get("/DescendantFonts", []):
                subtypes.add(str(descendant.get_object()["/Subtype"]))
    assert "/Type3" not in subtypes
    assert subtypes & {"/TrueType", "/CIDFontType2"}, subtypes


def test_calc_sheet_keeps_one_orientation_and_does_not_repeat_itself():
    """Every page of the calc sheet is A4 portrait, and the figure page has no second title block."""
    result = _solved()
    reader = pypdf.PdfReader(io.BytesIO(exports.pdf_bytes(result, date="2026-01-15")))
    for page in reader.pages:
        width, height = float(page.mediabox.width), float(page.mediabox.height)
        assert width < height  # portrait
        assert width == pytest.approx(210 / 25.4 * 72, abs=1)  # A4, ISO 216: 210 mm × 297 mm
        assert height == pytest.approx(297 / 25.4 * 72, abs=1)
    last = reader.pages[-1].extract_text()
    text = "\n".join(page.extract_text() for page in reader.pages)
    # A paragraph may run on to the next page, with that page's frame extracted inside it.
    text = _FRAME.sub("", " ".join(text.split()))
    # The inputs, the governing values and the general caution are written once, on the text pages.
    assert "Governing values" not in last and "Inputs" not in last
    assert text.count("against your local codes by a licensed engineer") == 1


def test_reactions_are_the_forces_the_supports_exert():
    """The demo's supports push up on the member (downward loads): 10.03 kN and 8.967 kN, summing to the load.

    Total load 2.5 kN/m × 6 m + 4 kN = 19 kN (invented demo). The left reaction is the engine's T(0) and the
    right one −T(L) (DEVELOPERS.md "Coordinates and signs"), both pointing up as drawn.
    """
    result = _solved()
    (_, left, _), (_, right, _) = reaction_rows(result, units("si"))
    assert left == "10.03 kN up" and right == "8.967 kN up"
    assert result.reactions.left_T - result.reactions.right_T == pytest.approx(19e3, rel=1e-9)
    cantilever = _solved(supports={"left": "fixed", "right": "free"}, axial_force=0.0)
    (_, force, couple), _ = reaction_rows(cantilever, units("si"))
    # Fixed left end: the wall holds 19 kN up and turns the member back anticlockwise (x right, w down).
    assert force == "19.00 kN up" and couple.endswith("anticlockwise")


def test_export_file_names_keep_the_title_and_carry_n():
    """ç becomes c instead of "-", and the axial force is in the name, in the units of the export."""
    title = "Invented example: façade wind post, gridline C, level 2 (invented building)"
    name = export_filename(title, 350e3, "pdf")
    assert name.startswith("strutscope-invented-example-facade-wind-post-gridline-c")
    assert name.endswith("_N350kN.pdf")
    assert export_filename(title, -78.683 * 4448.2216152605, "csv", "us").endswith("_N-78.7kip.csv")
    assert export_filename("Стойка 柱", 1e3, "png") == "strutscope-стойка-柱_N1.00kN.png"
    assert export_filename("", 0.0, "json") == "strutscope-case_N0kN.json"


def test_export_file_names_carry_the_combination_shown():
    """With load cases the name holds the combination (or "envelope") before N; without, it is unchanged."""
    title = "Invented post"
    assert export_filename(title, 210e3, "pdf", combination="U4") == "strutscope-invented-post_U4_N210kN.pdf"
    assert export_filename(title, 294e3, "pdf", combination="U2") == "strutscope-invented-post_U2_N294kN.pdf"
    assert export_filename(title, 294e3, "png", combination="envelope").endswith("_envelope_N294kN.png")
    assert export_filename(title, 210e3, "csv", combination="") == export_filename(title, 210e3, "csv")
    # The engine's names use letters, digits and _ . + -; "_" separates the name's fields, so it becomes "-",
    # and anything a file system may refuse (/ \ : * ? " < > |, spaces) becomes one "-".
    assert export_filename(title, 1e3, "csv", combination="ULS_1+wind.2") == (
        "strutscope-invented-post_ULS-1+wind.2_N1.00kN.csv"
    )
    assert export_filename(title, 1e3, "csv", combination='a/b\\c:*?"<>| d') == (
        "strutscope-invented-post_a-b-c-d_N1.00kN.csv"
    )
    assert (
        export_filename(title, 1e3, "csv", combination="..//")
        == "strutscope-invented-post_combination_N1.00kN.csv"
    )


def test_saved_case_holds_no_amplitude_beside_a_preset():
    """A preset sets the bow's size: the saved JSON has no amplitude beside it, and reads back the same."""
    case = engine.Case.from_dict(_demo_mapping())
    data = json.loads(exports.case_json(case))
    assert "preset" in data["imperfection"] and "amplitude" not in data["imperfection"]
    assert engine.Case.from_json(exports.case_json(case)) == case
    given = engine.Case.from_dict(_demo_mapping() | {"imperfection": {"shape": "sine", "amplitude": 0.01}})
    assert json.loads(exports.case_json(given))["imperfection"]["amplitude"] == 0.01
