"""Numbers as typed into the page's fields: read on the server, never guessed at, refused in the page's words.

A new-user audit of the served page found that "6,5" typed into a number field was read as 65, that an
emptied field showed "NaN" with a message about "None", that an absurd axial force refused with load cases
stayed refused when the last good force was typed again, and that messages quoted the engine's SI base units
(N, N/m, Pa, m for a section's millimetres) rather than the page's. Each test here failed before the fix.
The widget's ``text`` is what the browser sends (tests/browser/test_typed_numbers_in_browser.py types it).
"""

import html
import json
import math
import re
from importlib import resources

import panel as pn
import pytest

import engine
from app.page import MemberPage
from app.page.fields import shown_message
from app.page.number_text import NumberText, Unread, number_text, read_number
from app.state import MemberState


@pytest.fixture(autouse=True)
def clean_panel_state():
    yield
    pn.state.reset()


def visible_errors(page):
    """The text (HTML unescaped) of every error pane that is shown, and of the stale banner."""
    shown = [*page.errors.shown(), *page.inputs.loads.errors.shown(), *page.load_cases.errors.shown()]
    shown += [*page.load_cases.block_errors.shown(), *([page.stale.object] if page.stale.visible else [])]
    return [html.unescape(text) for text in shown]


def start_page():
    """The page on the start demo: the invented wind post with load cases G and W."""
    text = resources.files("assets").joinpath("demo_wind_post_actions.json").read_text("utf-8")
    return MemberPage(MemberState.from_case(engine.Case.from_json(text)))


# ------------------------------------------------------------------ reading the text


@pytest.mark.parametrize(
    ("text", "expected"),
    [
        ("6.5", 6.5),
        (" 6.5 ", 6.5),
        (".5", 0.5),
        ("5.", 5.0),
        ("-2e3", -2000.0),
        ("\u22122", -2.0),
        ("", None),
    ],
)
def test_a_number_with_a_point_is_read(text, expected):
    assert read_number(text) == expected


@pytest.mark.parametrize("text", ["6,5", "1,000", "1 000", "6.5.1", "abc", "nan", "inf", "1_000", "0x10"])
def test_a_text_that_is_not_a_plain_number_is_kept_and_never_read_as_another_number(text):
    value = read_number(text)
    assert isinstance(value, Unread) and math.isnan(value) and value.text == text
    assert number_text(value) == text  # the field shows what was typed


def test_a_text_not_read_stays_itself_under_the_load_factor():
    """A load case's axial force times the slider's λ is still the text typed, for the message to quote."""
    value = read_number("6,5")
    assert (value * 1.35) is value and (2.0 * value) is value and (value / 4.0) is value


def test_the_box_shows_a_value_without_a_trailing_point_zero_and_an_empty_value_as_nothing():
    box = NumberText(label="Span L [m]", value=6.0)
    assert box.text == "6"
    box.value = 19.685
    assert box.text == "19.685"
    box.value = None
    assert box.text == ""  # never "NaN"
    box.text = "6.50"  # as typed: read, and left as typed
    assert box.value == 6.5 and box.text == "6.50"


# ------------------------------------------------------------------ item 1: a decimal comma


def test_a_decimal_comma_in_the_span_is_refused_naming_the_field_the_text_and_the_range():
    """Before: the browser dropped the comma and the span became 65 m. Now the case is refused, the last good
    result stays (marked stale), the field keeps "6,5", and a point is asked for."""
    page = MemberPage()
    result = page.model.result
    page.length_input.text = "6,5"
    assert page.model.result is result and page.model.result.case.length == 6.0
    assert page.length_input.text == "6,5"
    said = (
        "Span L: '6,5' is not a number; use a point for decimals (6.5); enter a number >= 0.001 and <= 1000 m"
    )
    assert any(said in text for text in visible_errors(page)), visible_errors(page)
    assert page.stale.visible and all(button.disabled for button in page.files.buttons)
    page.length_input.text = "6.5"
    assert page.model.result.case.length == 6.5
    assert not page.stale.visible and visible_errors(page) == []


def test_a_thousands_separator_is_refused_rather_than_guessed():
    page = MemberPage()
    page.inputs.loads.rows[0].fields["q"].widget.text = "1,000"
    said = (
        "Load 1, q: '1,000' is not a number; "
        "use a point for decimals and no thousands separator (1.000 or 1000)"
    )
    assert any(said in text for text in visible_errors(page)), visible_errors(page)
    assert page.stale.visible


def test_a_text_typed_in_a_load_case_is_quoted_in_the_load_cases_words():
    page = start_page()
    block = page.load_cases.blocks[0]
    block.fields[0].widget.text = "2,5"
    errors = visible_errors(page)
    assert any("'2,5' is not a number; use a point for decimals (2.5)" in text for text in errors), errors
    assert page.stale.visible


def test_the_link_keeps_the_last_case_it_can_hold_while_a_text_is_refused():
    page = MemberPage()
    link = page.model.link
    page.length_input.text = "6,5"
    assert page.model.link == link and json.loads(link)["length"] == 6.0


# ------------------------------------------------------------------ item 2: an emptied field


def test_an_emptied_span_says_it_is_empty_with_the_range_and_keeps_the_last_result():
    """Before: "Span L: None is not a number; …", and the field showed "NaN" once left."""
    page = MemberPage()
    result = page.model.result
    page.length_input.text = ""
    errors = visible_errors(page)
    assert any("Span L is empty; enter a number >= 0.001 and <= 1000 m" in text for text in errors), errors
    assert not any("None" in text for text in errors)
    assert page.model.result is result and page.stale.visible and page.length_input.text == ""


def test_an_emptied_axial_force_with_load_cases_is_named():
    """Before: with load cases an emptied N did nothing at all (no message, the old refusal or none)."""
    page = start_page()
    page.force_input.text = ""
    errors = visible_errors(page)
    assert any(
        "Axial force N is empty; enter a number between -1.000e+09 kN and 1.000e+09 kN" in t for t in errors
    )


# ------------------------------------------------------------------ item 3: the last good force typed again


def test_a_refused_force_with_load_cases_goes_when_the_last_good_force_is_typed_again():
    """Before: 1e30 kN set λ ≈ 3e27 on the load cases, the solve was refused ("Load case 1, axial force:
    8.163265306122448e+32 N …"), and typing 294 kN again changed nothing: the shown N was already 294 kN."""
    page = start_page()
    good = page.force_input.value
    assert good == 294.0
    page.force_input.value = 1e30
    errors = visible_errors(page)
    assert any(
        "Axial force N: 1.000e+30 kN must be between -1.000e+09 kN and 1.000e+09 kN" in t for t in errors
    )
    assert page.stale.visible
    page.force_input.value = good
    assert page.model.errors == {} and not page.stale.visible
    assert page.model.result.axial_force == pytest.approx(294e3)


def test_a_refused_force_without_load_cases_goes_when_the_last_good_force_is_typed_again():
    page = MemberPage()
    page.force_input.text = "1e30"
    assert page.stale.visible
    page.force_input.text = "350"
    assert page.model.errors == {} and not page.stale.visible


# ------------------------------------------------------------------ item 4: the page's units in messages


@pytest.mark.parametrize(
    ("message", "system", "expected"),
    [
        (
            "axial_force: 1e+33 N must be between -1e+12 and 1e+12 N",
            "si",
            "Axial force N: 1.000e+30 kN must be between -1.000e+09 kN and 1.000e+09 kN",
        ),
        (
            "axial_force: 1e+33 N must be between -1e+12 and 1e+12 N",
            "us",
            "Axial force N: 2.248e+29 kip must be between -2.248e+08 kip and 2.248e+08 kip",
        ),
        (
            "loads[0].q: 2e+12 N/m must be between -1e+12 and 1e+12 N/m",
            "si",
            "Load 1, q: 2.000e+09 kN/m must be between -1.000e+09 kN/m and 1.000e+09 kN/m",
        ),
        (
            "supports.left.translation: -5.0 N/m must be >= 0 and <= 1e+18 N/m",
            "us",
            "Left end, k_t: -2.855e-05 kip/in must be >= 0 kip/in and <= 5.710e+12 kip/in",
        ),
        (
            "section.h: 5.0 m must be <= 10 m (dimensions are in metres: 200 mm is 0.2)",
            "si",
            "Section, depth h: 5000 mm must be <= 10000 mm",
        ),
        (
            "EI: -1.0 N·m² must be >= 0.001 and <= 1e+16 N·m²",
            "si",
            "EI: -0.001 kN·m² must be >= 1e-06 kN·m² and",
        ),
        (
            "material.fy: -5000000.0 Pa must be finite and > 0",
            "si",
            "Material, f_y: -5.000 MPa must be finite",
        ),
        ("section.A: -1.0 m² must be > 0 m²", "si", "Section, area A: -10000 cm² must be > 0 cm²"),
        ("section.I: -1e-06 m⁴ must be > 0 m⁴", "us", "Section, I about axis: -2.403 in⁴ must be > 0 in⁴"),
        # a span is shown in the engine's own metres in SI: its message is the engine's
        (
            "length: -1.0 m must be >= 0.001 and <= 1000 m",
            "si",
            "Span L: -1.0 m must be >= 0.001 and <= 1000 m",
        ),
    ],
)
def test_an_engine_message_is_shown_in_the_units_of_the_page(message, system, expected):
    """Before: SI base units on the page (1e+33 N, N/m, N·m², Pa, m² and metres for a section in mm)."""
    assert shown_message(message, system).startswith(expected)


#: A quantity in an SI base unit that the page never shows (SI) or any SI unit (US).
_BASE = re.compile(r"\d (?:N|N/m|N·m|N·m²|N·m/rad|N/m²|Pa|m²|m³|m⁴|m⁶)(?![\w²³⁴⁶·/])")
_SI = re.compile(r"\d (?:k?N|kN/m|kN·m|MPa|Pa|mm|cm[²³⁴⁶]|m[²³⁴⁶]?)(?![\w²³⁴⁶·/])")


def _refusals() -> list:
    """The engine's messages on a bad value of each kind of number field of the page (invented values)."""
    edits = [
        {"axial_force": 1e33},
        {"left_end": "elastic", "left_translation": "spring", "left_k_t": -1.0},
        {"left_end": "elastic", "left_rotation": "spring", "left_k_r": -1.0},
        {"stiffness_from": "EI", "EI": -1.0},
        {"section_shape": "rolled_i", "section_tw": 50.0},
        {"section_shape": "custom", "section_I": -1.0},
        {"section_shape": "custom", "section_Iw": -1.0},
        {"material_from": "custom", "material_name": "", "material_fy": -5e6},
        {"loads": [{"type": "point", "P": 2e12, "x": 3.0}]},
        {"loads": [{"type": "couple", "C": 2e12, "x": 3.0}]},
        {"bow_from": "shape", "bow_shape": "sine", "bow_amplitude": 5.0},
    ]
    messages = []
    for edit in edits:
        state = MemberState()
        state.param.update(edit)
        messages += list(state.errors.values())
    return messages


@pytest.mark.parametrize("system", ["si", "us"])
def test_no_refusal_of_a_number_field_shows_a_unit_the_page_does_not_use(system):
    messages = _refusals()
    assert len(messages) >= 10, messages
    for message in messages:
        said = shown_message(message, system)
        assert not _BASE.search(said), (message, said)
        if system == "us":
            assert not _SI.search(said), (message, said)
