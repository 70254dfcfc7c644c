"""Long and foreign titles in the exports (issue 11): never past the edge, no missing-glyph boxes or warnings.

The check is geometric: every text of the PNG figure and of each calc-sheet page is laid out by matplotlib's
own renderer (Agg), and its bounding box must lie inside the figure, and the title block's texts inside the
block's frame. Titles are invented.
"""

from __future__ import annotations

import warnings

import pytest
from matplotlib.backends.backend_agg import FigureCanvasAgg

import engine
from app import exports, fonts

LONG_TITLES = {
    "one word": "W" * 200,
    "words": " ".join(["Invented façade wind post on grid line"] * 6)[:200],
    "digits": "1234567890" * 20,
}
FOREIGN_TITLES = {
    "CJK": "外壁 風柱 A-1 (invented)",
    "emoji": "Post 🏗 A 🙂 (invented)",
    "mixed": "柱 ☃ α ≤ 10 (invented)",
}


def solved(title: str):
    """A small invented case with `title`, solved."""
    return engine.solve(
        engine.Case.from_dict(
            {
                "title": title,
                "length": 4.0,
                "EI": 2.0e6,
                "supports": {"left": "pinned", "right": "pinned"},
                "axial_force": 1e5,
                "loads": [{"type": "uniform", "q": 1e3}],
            }
        )
    )


def text_boxes(figure):
    """(text, bounding box in pixels) of every text drawn on `figure`, and the figure's size in pixels."""
    renderer = FigureCanvasAgg(figure).get_renderer()
    figure.draw(renderer)
    width, height = figure.bbox.width, figure.bbox.height
    boxes = [(text.get_text(), text.get_window_extent(renderer)) for text in figure.texts if text.get_text()]
    return boxes, width, height


def assert_inside(boxes, left, right, bottom, top, what):
    """Every box lies within the rectangle (pixels, one pixel of rounding allowed)."""
    for text, box in boxes:
        assert box.x0 >= left - 1 and box.x1 <= right + 1, f"{what}: {text!r} runs past the side ({box})"
        assert box.y0 >= bottom - 1 and box.y1 <= top + 1, f"{what}: {text!r} runs past the edge ({box})"


@pytest.mark.parametrize("name", list(LONG_TITLES))
def test_a_long_title_stays_inside_the_png_title_block(name):
    """A 200-character title wraps (or ends with an ellipsis) inside the figure's title block."""
    figure = exports.result_figure(solved(LONG_TITLES[name]))
    boxes, width, height = text_boxes(figure)
    assert_inside(boxes, 0, width, 0, height, "figure")
    block = [(text, box) for text, box in boxes if box.x0 >= 0.685 * width]  # the block spans 0.685–0.985
    assert block, "no text in the title block"
    assert_inside(block, 0.685 * width, 0.985 * width, 0, height, "title block")
    title_lines = [text for text, _ in block if text.rstrip("…") and text.rstrip("…") in LONG_TITLES[name]]
    assert 1 <= len(title_lines) <= 3


@pytest.mark.parametrize("name", list(LONG_TITLES))
def test_a_long_title_stays_inside_every_calc_sheet_page(name):
    """On every page of the calc sheet a 200-character title stays on the page, and within its margins."""
    title = LONG_TITLES[name]
    pages = exports.calc_sheet_figures(solved(title), prepared_by="A. Engineer")
    for number, page in enumerate(pages, start=1):
        boxes, width, height = text_boxes(page)
        assert_inside(boxes, 0, width, 0, height, f"page {number}")
    first, width, _ = text_boxes(pages[0])
    margin = 16 / 25.4 * pages[0].dpi
    lines = [(text, box) for text, box in first if text.rstrip("…") and text.rstrip("…") in title]
    assert 1 <= len(lines) <= 3
    assert_inside(lines, margin, width - margin, 0, pages[0].bbox.height, "page 1 margins")


def test_a_title_too_long_for_three_lines_ends_with_an_ellipsis():
    """A title that would need more than three lines is shortened to three, the last ending with '…'."""
    boxes, _, _ = text_boxes(exports.result_figure(solved("W" * 200)))
    lines = [text for text, _ in boxes if set(text.rstrip("…")) == {"W"}]
    assert len(lines) == 3 and lines[-1].endswith("…")


@pytest.mark.parametrize("name", list(FOREIGN_TITLES))
def test_foreign_titles_draw_without_missing_glyph_warnings(name, capfd):
    """CJK and emoji titles export to PNG, PDF and CSV with no 'Glyph ... missing' warning on stderr."""
    title = FOREIGN_TITLES[name]
    result = solved(title)
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        exports.png_bytes(result, dpi=40)
        exports.pdf_bytes(result)
        exports.csv_text(result)
        boxes, _, _ = text_boxes(exports.result_figure(result))
    messages = [str(warning.message) for warning in caught]
    assert not [m for m in messages if "Glyph" in m or "missing from" in m], messages
    assert "Glyph" not in capfd.readouterr().err
    shown = fonts.drawable(title)
    assert any(shown in text for text, _ in boxes)  # covered characters kept, the rest shown as '?'
    assert title.isascii() or shown != title or len(fonts.families()) > 1


def test_characters_no_font_covers_become_question_marks():
    """With only DejaVu Sans, CJK and emoji become '?'; Latin, Greek and the symbols strutscope uses stay."""
    if len(fonts.families()) > 1:
        pytest.skip("a fallback font is installed here")
    assert fonts.drawable("柱 A ☃ 🏗 façade α_cr ≤ 10 — ±") == "? A ☃ ? façade α_cr ≤ 10 — ±"
