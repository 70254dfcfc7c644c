"""The member explorer in a real browser: the served page, driven as an engineer would drive it."""

import csv
import io
import json
import math
import re
import time
import urllib.parse
from importlib import resources

import pytest
from playwright.sync_api import Error as PlaywrightError
from playwright.sync_api import expect

import engine
from tests.browser.conftest import TIMEOUT_MS, VIEWPORT, open_page

pytestmark = pytest.mark.browser

NUMBER = re.compile(r"-?\d+(?:\.\d+)?(?:e[+-]?\d+)?")


def demo_case():
    """The invented demo case the server opens."""
    return engine.Case.from_json(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))


def value_cell(page, quantity: str):
    """The value cell of the governing-values row named `quantity`."""
    name = page.locator("td.q", has_text=re.compile(rf"^{re.escape(quantity)}$"))
    return page.locator("table.ss-values tr").filter(has=name).locator("td.v")


def number(text: str) -> float:
    """The first number in `text`."""
    return float(NUMBER.search(text.replace("−", "-")).group(0))


def shown_as(value: float, unit: str) -> re.Pattern:
    """A pattern for `value` as the page prints it, trailing zeros or not (400 as 400, 400.0 or 400.00)."""
    text = f"{value:g}"
    return re.compile("^" + re.escape(text) + (r"(\.0+)?" if "." not in text else "0*") + f" {unit}$")


def stations(page) -> dict:
    """The plotted stations, read from the page's Bokeh document."""
    return page.evaluate("""() => {
        const s = Bokeh.documents[0].get_model_by_name('stations');
        return {x: Array.from(s.data.x), M2: Array.from(s.data.M2), w2: Array.from(s.data.w2)};
    }""")


def wait_for_number(page, cell, expected: float, rel: float) -> None:
    """Wait (up to the suite's TIMEOUT_MS) until the first number in `cell` is `expected` within `rel`."""
    deadline = time.monotonic() + TIMEOUT_MS / 1000
    while True:
        text = cell.inner_text(timeout=TIMEOUT_MS)
        if NUMBER.search(text.replace("−", "-")) and number(text) == pytest.approx(expected, rel=rel):
            return
        if time.monotonic() > deadline:
            pytest.fail(f"{text!r} did not become {expected:g} within {TIMEOUT_MS} ms")
        page.wait_for_timeout(100)  # a poll of the shown value, not a fixed wait for it


def tab(page, title: str) -> None:
    """Open the tab titled `title`."""
    page.locator(".bk-tab").filter(has_text=re.compile(rf"^{re.escape(title)}$")).first.click()


def set_number(page, label: str, value) -> None:
    """Type `value` into the number input labelled `label` and commit it."""
    field = page.get_by_label(label, exact=True)
    field.fill(str(value))
    field.press("Enter")


def test_page_loads_offline_without_console_errors(app, server):
    """The page loads with no console error, and every request goes to the local server (no CDN)."""
    page = app.page
    for title in ("Section", "Loads", "Bow", "Check", "Member"):
        tab(page, title)
    for title in ("Amplification", "Buckling modes", "Variants", "Diagrams"):
        tab(page, title)
    expect(value_cell(page, "max |M|")).to_contain_text("kN·m")
    expect(page.locator("li[data-code='scope']")).to_be_visible()
    assert app.errors == []
    origin = server.url.rstrip("/")
    outside = [url for url in app.requests if not url.startswith((origin, "blob:", "data:"))]
    assert outside == []
    assert len(app.requests) > 5  # the page did load its scripts, from the server


def test_dragging_the_axial_force_amplifies_the_moment_up_to_instability(app):
    """Keyboard steps on the slider raise the governing moment; past Pcr1 the instability caution shows."""
    page = app.page
    moment = value_cell(page, "max |M|")
    handle = page.locator(".noUi-handle").first
    handle.focus()
    readings = [number(moment.inner_text())]
    force = page.locator(".ss-readout b").first
    for _ in range(6):
        before, shown = moment.inner_text(), force.inner_text()
        page.keyboard.press("PageUp")  # five slider steps (equal steps of N this far below Pcr1)
        expect(force).not_to_have_text(shown)
        expect(moment).not_to_have_text(before)
        readings.append(number(moment.inner_text()))
    assert readings == sorted(readings) and readings[-1] > readings[0]
    # each equal step of N adds more moment than the one before: the amplification grows towards Pcr1
    steps = [b - a for a, b in zip(readings, readings[1:], strict=False)]
    assert steps[-1] > steps[0]
    expect(page.locator("li[data-code='beyond-critical-load']")).to_have_count(0)
    page.keyboard.press("End")  # 1.25 Pcr1
    expect(page.locator("li[data-code='beyond-critical-load']")).to_be_visible()
    expect(page.locator(".ss-badge")).to_have_text("unstable")


def test_changing_the_supports_gives_the_textbook_critical_load(app):
    """Fixed–free gives π²EI/(4L²) and K = 2; fixed–fixed 4π²EI/L² and K = 0.5.

    Timoshenko & Gere, Theory of Elastic Stability (1961), ch. 2 (references.md §2, Euler loads); the page
    shows four significant figures, so the tolerance is 5e-4.
    """
    page = app.page
    case = demo_case()
    EI, L = engine.solve(case).EI, case.length
    pcr = value_cell(page, "Pcr1")
    expect(pcr).to_have_text(re.compile(r"^\d"))
    assert number(pcr.inner_text()) == pytest.approx(math.pi**2 * EI / L**2 * 1e-3, rel=5e-4)
    page.get_by_label("Left end, x = 0 (bottom)").select_option(label="fixed")
    page.get_by_label("Right end, x = L (top)").select_option(label="free")
    expect(page.locator("table.ss-values")).to_contain_text("K = 2.000")
    assert number(pcr.inner_text()) == pytest.approx(math.pi**2 * EI / (4 * L**2) * 1e-3, rel=5e-4)
    page.get_by_label("Right end, x = L (top)").select_option(label="fixed")
    expect(page.locator("table.ss-values")).to_contain_text("K = 0.500")
    assert number(pcr.inner_text()) == pytest.approx(4 * math.pi**2 * EI / L**2 * 1e-3, rel=5e-4)


def test_adding_a_point_load_changes_the_curves(app):
    """A point load added in the loads table changes the plotted moment to the engine's new solution."""
    page = app.page
    before = stations(page)
    moment = value_cell(page, "max |M|")
    old = moment.inner_text()
    tab(page, "Loads")
    page.get_by_role("button", name="+ Add load").click()
    expect(moment).not_to_have_text(old)
    expect(page.get_by_text("Load 3", exact=True)).to_be_visible()
    after = stations(page)
    assert after["M2"] != before["M2"]
    mapping = demo_case().to_dict()
    mapping["loads"].append({"type": "point", "P": 5.0e3, "x": 3.0})  # the new row's defaults: 5 kN at L/2
    expected = engine.solve(engine.Case.from_dict(mapping), stations=401)
    assert max(abs(v) for v in after["M2"]) == pytest.approx(
        expected.governing.moment.magnitude * 1e-3, rel=1e-12
    )


def test_bad_input_shows_the_engines_message_and_keeps_the_plots(app):
    """A negative span shows the engine's message next to the input; the plots keep the last good result."""
    page = app.page
    before = stations(page)
    set_number(page, "Span L [m]", -1)
    expect(page.get_by_text("Span L: -1.0 m must be >= 0.001 and <= 1000 m").first).to_be_visible()
    expect(page.get_by_text("Input not accepted")).to_be_visible()
    assert stations(page) == before
    assert app.errors == []


def test_each_download_arrives_and_holds_the_result(app, tmp_path):
    """PNG, CSV, PDF and JSON each download; the CSV matches engine.solve, the PNG is A4 at 150 dpi, the PDF
    has its pages and the governing values, the JSON is the case."""
    from PIL import Image
    from pypdf import PdfReader

    page = app.page
    case = demo_case()
    result = engine.solve(case, stations=401)
    files = {}
    for name in ("Figure PNG", "Stations CSV", "Calc sheet PDF"):
        with page.expect_download(timeout=TIMEOUT_MS) as download:
            page.get_by_role("button", name=name).click()
        path = tmp_path / download.value.suggested_filename
        download.value.save_as(path)
        files[name] = path
    with page.expect_download(timeout=TIMEOUT_MS) as download:
        page.get_by_role("button", name="Case JSON").click()
    files["json"] = tmp_path / download.value.suggested_filename
    download.value.save_as(files["json"])

    rows = [
        line for line in files["Stations CSV"].read_text("utf-8-sig").splitlines() if not line.startswith("#")
    ]
    table = list(csv.DictReader(io.StringIO("\n".join(rows))))
    assert len(table) == len(result.x)
    for row, x, moment, shear in zip(table, result.x, result.moment, result.shear, strict=False):
        assert float(row["x [m]"]) == pytest.approx(x, rel=5e-6, abs=1e-15)
        assert float(row["M [kN·m]"]) == pytest.approx(moment * 1e-3, rel=5e-6, abs=1e-12)
        assert float(row["V [kN]"]) == pytest.approx(shear * 1e-3, rel=5e-6, abs=1e-12)

    with Image.open(files["Figure PNG"]) as image:
        assert image.size == (1754, 1240)  # A4 landscape, 297 × 210 mm at 150 dpi (ISO 216)

    reader = PdfReader(files["Calc sheet PDF"])
    # One or two A4 text pages, then the figure, and a page of the lateral-torsional buckling mode when that
    # check was made.
    mode_page = 1 if result.ltb is not None and result.ltb.applies else 0
    assert len(reader.pages) - mode_page in (2, 3)
    text = " ".join(p.extract_text() for p in reader.pages)
    assert f"{result.governing.moment.magnitude * 1e-3:.2f}" in text  # 27.17 kN·m
    assert f"{result.critical_loads[0] * 1e-3:.0f}" in text  # Pcr1 = 3279 kN

    assert engine.Case.from_json(files["json"].read_bytes()) == case


def test_uploaded_case_restores_the_page(app, tmp_path):
    """An uploaded case file replaces every input; a bad one is refused next to the upload."""
    page = app.page
    case = engine.Case.from_dict(
        {
            "title": "Invented upload check",
            "length": 4.0,
            "EI": 2.0e6,
            "axial_force": 100e3,
            "supports": {"left": "fixed", "right": "pinned"},
            "loads": [{"type": "uniform", "q": 3e3}],
            "imperfection": {"shape": "sine", "amplitude": 0.004},
        }
    )
    path = tmp_path / "invented-upload.json"
    path.write_text(case.to_json(), encoding="utf-8")
    page.locator("input[type=file]").set_input_files(path)
    expected = engine.solve(case).critical_loads[0] * 1e-3
    expect(page.get_by_text("loaded invented-upload.json")).to_be_visible()
    # served, the solve runs off the event loop: wait for the uploaded case's value, not the previous one
    wait_for_number(page, value_cell(page, "Pcr1"), expected, rel=5e-4)
    expect(page.get_by_label("Span L [m]", exact=True)).to_have_value("4")
    expect(page.get_by_label("Case title")).to_have_value("Invented upload check")
    expect(page.get_by_label("Left end, x = 0 (bottom)")).to_have_value(re.compile("."))

    bad = tmp_path / "bad.json"
    bad.write_text(
        json.dumps(
            {
                "length": 4.0,
                "EI": 2e6,
                "supports": {"left": "pinned", "right": "pinned"},
                "loads": [{"type": "point", "P": 1e3, "x": 7.5}],
            }
        ),
        encoding="utf-8",
    )
    page.locator("input[type=file]").set_input_files(bad)
    expect(page.get_by_text("loads[0].x: 7.5 m lies outside the member (0 to 4 m)")).to_be_visible()
    assert number(value_cell(page, "Pcr1").inner_text()) == pytest.approx(expected, rel=5e-4)


def test_two_sessions_keep_their_own_state_and_a_link_reopens_a_case(browser, server):
    """A change in one browser context leaves another alone; the changed page's URL reopens the same case."""
    first_context = browser.new_context(viewport=VIEWPORT)
    second_context = browser.new_context(viewport=VIEWPORT)
    third_context = browser.new_context(viewport=VIEWPORT)
    try:
        for ctx in (first_context, second_context, third_context):
            ctx.set_default_timeout(TIMEOUT_MS)
        first = open_page(first_context, server.url).page
        second = open_page(second_context, server.url).page
        original = value_cell(second, "Pcr1").inner_text()
        set_number(first, "Span L [m]", 8)
        expect(value_cell(first, "Pcr1")).not_to_have_text(original)
        changed = value_cell(first, "Pcr1").inner_text()
        second.get_by_label("Case title").click()  # any round trip to the server
        expect(value_cell(second, "Pcr1")).to_have_text(original)
        expect(second.get_by_label("Span L [m]", exact=True)).to_have_value("6")

        first.wait_for_url(re.compile(r"[?&]case="))
        query = urllib.parse.parse_qs(urllib.parse.urlparse(first.url).query)
        assert json.loads(query["case"][0])["length"] == 8
        third = open_page(third_context, first.url).page
        expect(value_cell(third, "Pcr1")).to_have_text(changed)
        expect(third.get_by_label("Span L [m]", exact=True)).to_have_value("8")
    finally:
        for ctx in (first_context, second_context, third_context):
            ctx.close()


def test_every_part_is_inside_a_1280_by_720_screen(app, tmp_path):
    """At 1280×720 the header, inputs, force control, four diagrams, values and cautions all lie in view."""
    page = app.page
    expect(page.locator(".noUi-handle").first).to_be_visible()
    regions = {
        "header": page.locator(".ss-brand"),
        "exports": page.get_by_role("button", name="Calc sheet PDF"),
        "units": page.get_by_role("button", name="US"),
        "inputs": page.locator(".bk-tab").filter(has_text=re.compile("^Member$")).first,
        "span": page.get_by_label("Span L [m]", exact=True),
        "slider": page.locator(".noUi-handle").first,
        "force entry": page.get_by_label("N [kN]", exact=True),
        "values": page.locator("table.ss-values tr").filter(has_text="utilisation").first,
        "cautions": page.locator("ul.ss-cautions li").first,
        "general caution": page.locator("li[data-code='scope']"),
        "variant button": page.get_by_role("button", name=re.compile("^Keep as variant")),
    }
    canvases = page.locator(".bk-Figure canvas")
    expect(canvases.first).to_be_visible()
    boxes = [canvases.nth(i).bounding_box() for i in range(canvases.count())]
    shown = [box for box in boxes if box and box["width"] > 0 and box["height"] > 0]
    assert len(shown) >= 4  # sketch, deflection, moment, shear
    for name, locator in regions.items():
        expect(locator).to_be_visible()
        shown.append(locator.bounding_box() | {"name": name})
    for box in shown:
        assert box["x"] >= 0 and box["y"] >= 0, box
        assert box["x"] + box["width"] <= VIEWPORT["width"] + 0.5, box
        assert box["y"] + box["height"] <= VIEWPORT["height"] + 0.5, box
    width = page.evaluate("() => document.documentElement.scrollWidth")
    assert width <= VIEWPORT["width"]
    page.screenshot(path=tmp_path / "page.png")


def _uncovered(page, locator, attempts: int = 5) -> bool:
    """Whether the element's centre, once scrolled into view, is the element itself (nothing lies over it).

    A pane the server redraws (the cautions when the capacity arrives from the worker) replaces its elements;
    the locator then finds the new one on the next attempt."""
    for attempt in range(attempts):
        try:
            return _uncovered_once(locator)
        except PlaywrightError as error:
            if "not attached" not in str(error) or attempt == attempts - 1:
                raise
            page.wait_for_timeout(250)
    return False


def _uncovered_once(locator) -> bool:
    # Scrolled to the middle of its box, as a reader scrolls to read it: scrolled only just into view, an
    # item of the cautions box sits under the box's pinned general caution, which covers the bottom edge.
    locator.scroll_into_view_if_needed()
    locator.evaluate("(el) => el.scrollIntoView({block: 'center', inline: 'nearest'})")
    return locator.evaluate(
        """(el) => { const r = el.getBoundingClientRect();
                     const root = el.getRootNode();
                     const hit = (root.elementFromPoint ? root : document).elementFromPoint(
                         r.left + r.width / 2, r.top + Math.min(r.height / 2, 12));
                     return hit !== null && (el === hit || el.contains(hit)); }"""
    )


def test_every_caution_can_be_read_at_1280_by_720(app):
    """Each caution, scrolled into view in its box, lies inside the screen and is not covered by anything."""
    page = app.page
    items = page.locator("ul.ss-cautions li")
    expect(items.first).to_be_visible()
    assert items.count() >= 3  # the demo: two warnings, a note, and the general caution
    for i in range(items.count()):
        item = items.nth(i)
        assert _uncovered(page, item), item.inner_text()
        box = item.bounding_box()
        assert box["y"] >= 0 and box["y"] + min(box["height"], 24) <= VIEWPORT["height"] + 0.5, box
        assert box["x"] >= 0 and box["x"] + box["width"] <= VIEWPORT["width"] + 0.5, box
    general = page.locator("li[data-code='scope']")
    box = general.bounding_box()
    assert box["y"] + box["height"] <= VIEWPORT["height"] + 0.5, box  # pinned: always in view, no scrolling
