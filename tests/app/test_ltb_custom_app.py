"""A custom section's lateral-torsional buckling keys in the app (issue 15): the page's inputs (SI or US), the
case file they write, the words when a key is missing.

The custom values are IPE 300's from strutscope's catalogue rounded to four figures (invented member).
"""

import json
from importlib import resources

import panel as pn
import pytest

import engine
from app.page import MemberPage
from app.report.ltb import ltb_words
from app.state import MemberState, values_from_mapping
from app.summary_json import summary_data
from app.units import units

#: IPE 300 (strutscope's catalogue), four figures; I_t and I_w as its check uses them (divided by 1.045).
CUSTOM = {
    "shape": "custom",
    "A": 5.381e-3,
    "I": 8.356e-5,
    "W_el": 5.570e-4,
    "W_pl": 6.284e-4,
    "depth": 0.3,
    "Iz": 6.038e-6,
    "It": 1.906e-7,
    "Iw": 1.205e-7,
    "doubly_symmetric": True,
    "ltb_curve": "a",
}


@pytest.fixture(autouse=True)
def clean_panel_state():
    yield
    pn.state.clear_caches()


def _mapping(section: dict) -> dict:
    mapping = json.loads(resources.files("assets").joinpath("demo_wind_post.json").read_text("utf-8"))
    mapping["section"] = dict(section)
    mapping["check"] = {"routes": ["second-order"]}
    return mapping


def test_custom_ltb_keys_are_inputs_and_round_trip():
    state = MemberState(**values_from_mapping(_mapping(CUSTOM)))
    assert state.section_Iz == CUSTOM["Iz"] and state.section_Iw == CUSTOM["Iw"]
    assert state.section_doubly_symmetric is True and state.section_ltb_curve == "a"
    assert state.section_extra == {}
    assert state.case_mapping()["section"] == CUSTOM


def test_a_custom_section_without_the_keys_writes_none_of_them():
    plain = {k: CUSTOM[k] for k in ("shape", "A", "I", "W_el", "W_pl")}
    state = MemberState(**values_from_mapping(_mapping(CUSTOM)))
    state.load_mapping(_mapping(plain))  # a second load clears what the first gave
    assert state.section_Iz is None and state.section_doubly_symmetric is False
    assert state.case_mapping()["section"] == plain


def test_a_curve_the_page_cannot_hold_is_kept_for_the_engine_to_name():
    state = MemberState(**values_from_mapping(_mapping(dict(CUSTOM, ltb_curve="e"))))
    assert state.section_extra == {"ltb_curve": "e"}
    with pytest.raises(engine.CaseError, match=r"section\.ltb_curve: 'e'"):
        engine.Case.from_dict(state.case_mapping())


@pytest.mark.parametrize("system", ["si", "us"])
def test_page_inputs_show_and_write_the_keys_in_the_display_units(system):
    state = MemberState(**values_from_mapping(_mapping(CUSTOM)))
    state.units = system
    page = MemberPage(state)
    inputs = page.inputs
    iw, iz = inputs.dimension_inputs["Iw"], inputs.dimension_inputs["Iz"]
    U = units(system)
    assert iw.visible and iz.visible and inputs.symmetric_input.visible and inputs.ltb_curve_select.visible
    assert iw.value == pytest.approx(U.convert("warping", CUSTOM["Iw"]), rel=1e-3)
    assert iz.value == pytest.approx(U.convert("second_moment", CUSTOM["Iz"]), rel=1e-3)
    iz.value = U.convert("second_moment", 5e-6)
    assert state.section_Iz == pytest.approx(5e-6, rel=1e-9)
    inputs.symmetric_input.value = False
    assert "doubly_symmetric" not in state.case_mapping()["section"]
    inputs.ltb_curve_select.value = "b"
    assert state.case_mapping()["section"]["ltb_curve"] == "b"


def test_a_missing_key_is_named_in_the_words_and_the_json():
    section = {k: v for k, v in CUSTOM.items() if k != "Iz"}
    result = engine.solve(engine.Case.from_dict(_mapping(section)))
    words = ltb_words(result, units("si"))
    assert not words.applies and "needs: section.Iz" in words.reason
    assert "minor axis" in words.reason
    assert summary_data("x", result.case, result)["ltb"]["missing"] == ["section.Iz"]


def test_a_complete_custom_section_is_checked():
    result = engine.solve(engine.Case.from_dict(_mapping(CUSTOM)))
    assert result.ltb.applies and ltb_words(result, units("si")).applies


def test_command_line_reads_the_keys_from_a_case_file(tmp_path, capsys):
    from app.cli import main

    path = tmp_path / "custom.json"
    path.write_text(json.dumps(_mapping({k: v for k, v in CUSTOM.items() if k != "It"})), "utf-8")
    assert main(["solve", str(path)]) == 0
    assert "needs: section.It" in capsys.readouterr().out
    path.write_text(json.dumps(_mapping(CUSTOM)), "utf-8")
    assert main(["solve", str(path)]) == 0
    text = capsys.readouterr().out
    block = text[text.index("Lateral-torsional buckling (major axis)") :]
    assert "χ_LT" in block and "not checked" not in block.split("\n\n")[0]
