"""The page's layout on screen at 1280×720 (and 1920×1080): every text it shows can be brought into view whole
and is drawn over by nothing; the member sketch's labels stay apart.

Each check reads what the browser laid out: the boxes of the elements, what lies on top at a point
(``elementFromPoint``), and for the sketch (a canvas) the labels' boxes from Bokeh's own scales and the width
the browser measures for each text in the labels' font.
"""

import contextlib
import re

import pytest
from playwright.sync_api import expect

from tests.browser.conftest import TIMEOUT_MS, Server, open_page
from tests.browser.test_page_in_browser import set_number, tab

pytestmark = pytest.mark.browser

SIZES = [(1280, 720), (1920, 1080)]

#: JavaScript helpers, each given an element: the part of it the reader can see (clipped by every scrolling
#: ancestor, across shadow roots, and by the window) and whether anything else is drawn over that part.
_HELPERS = """
function parentOf(node) {
  if (node.parentElement) return node.parentElement;
  const root = node.getRootNode();
  return root && root.host ? root.host : null;
}
function scrollers(el) {
  const found = [];
  for (let node = parentOf(el); node; node = parentOf(node)) {
    if (getComputedStyle(node).overflowY !== 'visible') found.push(node);
  }
  return found;
}
function shown(el) {
  const r = el.getBoundingClientRect();
  let [left, top, right, bottom] = [r.left, r.top, r.right, r.bottom];
  let room = innerHeight;
  for (const node of scrollers(el)) {
    const c = node.getBoundingClientRect();
    const t = c.top + node.clientTop, l = c.left + node.clientLeft;
    [left, top] = [Math.max(left, l), Math.max(top, t)];
    [right, bottom] = [Math.min(right, l + node.clientWidth), Math.min(bottom, t + node.clientHeight)];
    room = Math.min(room, node.clientHeight);
  }
  [left, top] = [Math.max(left, 0), Math.max(top, 0)];
  right = Math.max(Math.min(right, innerWidth), left);
  bottom = Math.max(Math.min(bottom, innerHeight), top);
  return {left, top, right, bottom, room, height: r.height, whole: left <= r.left + 0.5 && top <= r.top + 0.5
          && right >= r.right - 0.5 && bottom >= r.bottom - 0.5};
}
function onTop(el, x, y) {
  const root = el.getRootNode();
  const hit = (root.elementFromPoint ? root : document).elementFromPoint(x, y);
  return hit !== null && (hit === el || el.contains(hit));
}
function uncovered(el, part) {
  if (part.right - part.left < 2 || part.bottom - part.top < 2) return false;
  const inset = Math.min(3, (part.right - part.left) / 4, (part.bottom - part.top) / 4);
  const xs = [part.left + inset, (part.left + part.right) / 2, part.right - inset];
  const ys = [part.top + inset, (part.top + part.bottom) / 2, part.bottom - inset];
  return xs.every((x) => ys.every((y) => onTop(el, x, y)));
}
"""


def _seen(locator, scroll: bool = True) -> dict:
    """What the reader sees of the element, scrolled into view (the least scrolling of its boxes and the
    window, as a reader scrolls to it) unless `scroll` is false: its visible part, whether that is all of it,
    and whether nothing is drawn over the visible part."""
    script = (
        "(el, scroll) => {"
        + _HELPERS
        + " if (scroll) el.scrollIntoView({block: 'nearest', inline: 'nearest', behavior: 'instant'});"
        " const part = shown(el); part.uncovered = uncovered(el, part);"
        " const box = scrollers(el)[0]; part.box = box ? shown(box) : null; return part; }"
    )
    for attempt in range(5):  # a pane the server redraws replaces its elements: the locator finds the new one
        try:
            return locator.evaluate(script, scroll)
        except Exception as error:  # noqa: BLE001 - only a detached element is tried again
            if "not attached" not in str(error) or attempt == 4:
                raise
            locator.page.wait_for_timeout(250)  # a retry after a redraw, not a wait for a result
    raise AssertionError("unreachable")


def _readable(locator) -> bool:
    """Whether the element, scrolled into view, is seen whole and nothing is drawn over it."""
    seen = _seen(locator)
    return seen["whole"] and seen["uncovered"]


def _box(locator) -> dict:
    return locator.evaluate(
        "(el) => { const r = el.getBoundingClientRect();"
        " return {left: r.left, top: r.top, right: r.right, bottom: r.bottom}; }"
    )


def _apart(a: dict, b: dict) -> bool:
    return (
        a["bottom"] <= b["top"]
        or b["bottom"] <= a["top"]
        or a["right"] <= b["left"]
        or b["right"] <= a["left"]
    )


@pytest.fixture(scope="module")
def start_server(tmp_path_factory):
    """The real `strutscope serve` with no case named: the start demo with load cases G and W."""
    running = Server(cwd=tmp_path_factory.mktemp("serve_start_layout"))
    yield running
    running.stop()


@contextlib.contextmanager
def page_at(browser, url: str, width: int, height: int):
    """The page at `url` in a fresh context of the window size given."""
    ctx = browser.new_context(viewport={"width": width, "height": height})
    ctx.set_default_timeout(TIMEOUT_MS)
    try:
        yield open_page(ctx, url).page
    finally:
        ctx.close()


def _settled(page) -> None:
    """Wait until the values hold the capacity, which a worker finds after the first result (the right column
    is redrawn when it arrives)."""
    capacity = page.locator("table.ss-values tr").filter(has_text="capacity N")
    expect(capacity).to_contain_text(re.compile(r"\d kN"))


def _every_check_and_route(page) -> None:
    """Open the disclosure of every check and route under the governing combinations."""
    _settled(page)
    summary = page.locator(".ss-governing summary", has_text="every check and route")
    summary.click()
    expect(page.locator(".ss-governing details table.ss-table")).to_be_visible()


@pytest.mark.parametrize("width, height", SIZES)
def test_the_cautions_heading_is_not_drawn_over_the_values(browser, start_server, width, height):
    """With every check and route shown, the Cautions heading is uncovered and clear of the values' box."""
    with page_at(browser, start_server.url, width, height) as page:
        _every_check_and_route(page)
        heading = page.locator(".ss-heading", has_text=re.compile(r"^Cautions"))
        expect(heading).to_be_visible()
        assert _readable(heading), _seen(heading)
        seen_heading = _seen(heading, scroll=False)
        values = _seen(page.locator("table.ss-values"), scroll=False)["box"]  # the values' scrolling box
        assert _apart(values, seen_heading), (values, seen_heading)
        rows = page.locator("table.ss-values tr")
        for i in range(rows.count()):  # every row the values' box shows now is drawn over by nothing
            part = _seen(rows.nth(i), scroll=False)
            if part["bottom"] - part["top"] >= 6:  # a sliver at the box's edge is read once scrolled to
                assert part["uncovered"] and _apart(part, seen_heading), (rows.nth(i).inner_text(), part)


@pytest.mark.parametrize("width, height", SIZES)
def test_every_row_of_the_values_can_be_scrolled_into_view_and_read(browser, start_server, width, height):
    """With every check and route shown, each values row, the last one included, scrolls into view whole."""
    with page_at(browser, start_server.url, width, height) as page:
        _every_check_and_route(page)
        rows = page.locator("table.ss-values tr")
        expect(rows.filter(has_text="out of plane")).not_to_have_count(0)
        assert rows.count() > 10
        for i in range(rows.count()):
            assert _readable(rows.nth(i)), (rows.nth(i).inner_text(), _seen(rows.nth(i)))


@pytest.mark.parametrize("width, height", SIZES)
def test_the_other_axis_badge_and_the_fails_flag_are_both_in_view(browser, server, width, height):
    """Above the minor axis's N_cr (N = 2000 kN), the long badge and the fails-check flag both show whole."""
    with page_at(browser, server.url, width, height) as page:
        set_number(page, "N [kN]", 2000)
        badge = page.locator(".ss-badge")
        expect(badge).to_have_text("buckles about the other axis")
        flag = page.locator(".ss-flag")
        expect(flag).to_have_text("fails check")
        column = page.locator(".ss-heading", has_text="Governing values").bounding_box()
        for locator in (badge, flag, page.locator(".ss-readout b").first):
            assert _readable(locator), (locator, _seen(locator))
            box = locator.bounding_box()
            assert box["x"] + box["width"] <= column["x"] + 0.5, box  # left of the right-hand column
        readout = page.locator(".ss-readout").first
        assert readout.evaluate("(el) => el.scrollWidth <= el.clientWidth + 1")


_SKETCH_LABELS = """() => {
  const doc = Bokeh.documents[0];
  const fig = doc.get_model_by_name('sketch');
  const frame = Bokeh.index.find_one(fig).frame;
  const measure = document.createElement('canvas').getContext('2d');
  const scalar = (v) => (v !== null && typeof v === 'object' && 'value' in v ? v.value : v);
  const boxes = [];
  for (const [name, screen] of [['sketch_text', false], ['sketch_axial_text', false],
                                ['sketch_frame_text', true], ['sketch_danger', true]]) {
    const source = doc.get_model_by_name(name);
    const labels = fig.center.find((r) => r.source === source);
    if (!labels.visible) continue;
    const d = source.data;
    for (let i = 0; i < d.text.length; i++) {
      const lines = d.text[i].split('\\n');
      measure.font = `${d.style[i]} ${d.size[i]} ${scalar(labels.text_font)}`;
      const width = Math.max(...lines.map((line) => measure.measureText(line).width));
      const height = lines.length * parseFloat(d.size[i]) * scalar(labels.text_line_height);
      const x = screen ? frame.bbox.left + d.x[i] : frame.x_scale.compute(d.x[i]);
      const y = frame.y_scale.compute(d.y[i]);
      const left = x - {left: 0, center: width / 2, right: width}[d.align[i]];
      const top = y - {bottom: height, middle: height / 2, top: 0}[d.baseline[i]];
      boxes.push({text: d.text[i], left, top, right: left + width, bottom: top + height});
    }
  }
  return boxes;
}"""


def _settled_labels(page, *wanted: str) -> list:
    """The sketch's label boxes once the texts `wanted` are drawn and two reads in a row agree."""
    before = None
    for _ in range(TIMEOUT_MS // 100):
        boxes = page.evaluate(_SKETCH_LABELS)
        texts = " | ".join(box["text"] for box in boxes)
        if all(text in texts for text in wanted) and boxes == before:
            return boxes
        before = boxes
        page.wait_for_timeout(100)  # a poll of the drawn labels, not a fixed wait for them
    pytest.fail(f"the sketch never showed {wanted}: {before}")


@pytest.mark.parametrize("width, height", SIZES)
def test_the_sketch_labels_do_not_overlap_with_a_couple_at_the_end(browser, server, width, height):
    """HEB 220, 4.5 m, N 900 kN, a couple of 20 kN·m at the top end: no two labels of the sketch overlap."""
    with page_at(browser, server.url, width, height) as page:
        tab(page, "Section")
        page.get_by_label("catalogue name").select_option("HEB 220")
        tab(page, "Member")
        set_number(page, "Span L [m]", 4.5)
        set_number(page, "N [kN]", 900)
        tab(page, "Loads")
        remove = page.get_by_role("button", name="Remove")
        for left in (1, 0):
            remove.nth(left).click()
            expect(remove).to_have_count(left)
        page.get_by_label("add a load").select_option(label="couple")
        page.get_by_role("button", name="+ Add load").click()
        set_number(page, "C [kN·m]", 20)
        set_number(page, "at x [m]", 4.5)
        expect(page.get_by_label("at x [m]", exact=True)).to_have_value("4.5")
        boxes = _settled_labels(page, "C = 20.00 kN·m", "N = 900.00 kN", "L = 4.500 m")
        for i, a in enumerate(boxes):
            for b in boxes[i + 1 :]:
                assert _apart(a, b), (a, b)


@pytest.mark.parametrize("width, height", SIZES)
@pytest.mark.parametrize("case", ["start page", "plain demo above the minor axis's N_cr"])
def test_the_scope_note_covers_no_caution(browser, server, start_server, case, width, height):
    """The scope note is whole in the window, set apart below the cautions' box, and over no caution."""
    url = start_server.url if case == "start page" else server.url
    with page_at(browser, url, width, height) as page:
        if case != "start page":
            set_number(page, "N [kN]", 2000)
            expect(page.locator(".ss-badge")).to_have_text("buckles about the other axis")
        _settled(page)
        note = page.locator("ul.ss-cautions li[data-code='scope']")
        expect(note).to_be_visible()
        seen = _seen(note, scroll=False)  # pinned: in view as the page opens, no scrolling
        assert seen["whole"] and seen["uncovered"], seen
        items = page.locator("ul.ss-cautions li:not([data-code='scope'])")
        expect(items.first).to_be_visible()
        parts = [_seen(items.nth(i), scroll=False) for i in range(items.count())]
        lowest = max(part["bottom"] for part in parts if part["bottom"] > part["top"])
        clear = _box(note)["top"] - lowest  # a strip where neither a caution nor the note is drawn
        assert clear >= 5, f"only {clear:.1f} px between the cautions drawn and the scope note"
        for i in range(items.count()):  # each scrolled into view as a reader scrolls the box to it
            part = _seen(items.nth(i))
            assert part["uncovered"], (items.nth(i).inner_text(), part)
            assert part["bottom"] <= _box(note)["top"], (items.nth(i).inner_text(), part)
            assert part["whole"] or part["height"] > part["room"], (items.nth(i).inner_text(), part)
