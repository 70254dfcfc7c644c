"""The CSV and the calc sheet of a case with load cases name the combination shown and the governing
combination of each check (the engine's ActionsResult is the reference). Demo values invented."""

import io
from importlib import resources

import pypdf

import engine
from app import exports


def solved():
    """The engine's result for the invented demo with a permanent and a wind action."""
    text = resources.files("assets").joinpath("demo_wind_post_actions.json").read_text(encoding="utf-8")
    return engine.solve(engine.Case.from_json(text))


def test_csv_names_the_governing_combinations():
    """The CSV metadata holds the combination shown, each combination and the governing one of each check."""
    result = solved()
    text = exports.csv_text(result)
    actions = result.actions
    assert f"# combination shown,{actions.headline}," in text
    for item in actions.combinations:
        assert f"# combination {item.name}," in text
    strength = actions.governing_for("strength")
    assert (
        f"# governing: strength and stability (headline),{strength.combination},{strength.value:.3f}" in text
    )
    deflection = actions.governing_for("deflection")
    assert f"# governing: deflection (service),{deflection.combination}," in text


def test_calc_sheet_names_the_governing_combinations():
    """The calc sheet lists the combinations and names the governing one of strength and deflection."""
    result = solved()
    reader = pypdf.PdfReader(io.BytesIO(exports.pdf_bytes(result, date="2026-12-02")))
    text = " ".join(" ".join(page.extract_text().split()) for page in reader.pages)
    actions = result.actions
    assert "Load combinations" in text and "1.35 G + 1.5 W" in text
    assert f"Combination shown {actions.headline}" in text
    assert f"Governing: deflection (service) {actions.governing_for('deflection').combination}" in text


def test_two_plane_load_cases_name_each_planes_governing_combination():
    """A two-plane case with load cases (second-plane loads per action): the CSV lists each action's
    second-plane loads and the second plane's governing rows by name, and the JSON summary gives each
    governing row its plane (the engine's ActionsResult is the reference)."""
    from app.summary_json import summary_data
    from tests.support.action_cases import as_one_action, demo_data

    data = as_one_action(demo_data("demo_two_planes.json"), combinations={"rule": "en1990-6.10"})
    result = engine.solve(engine.Case.from_dict(data))
    actions = result.actions
    text = exports.csv_text(result)
    assert "second plane: point load" in text
    for check in ("moment", "deflection"):
        row = actions.governing_for(check, 2)
        assert row is not None and row.plane == 2
    assert "# governing: largest |M| (second plane)," + actions.governing_for("moment", 2).combination in text
    rows = summary_data("invented", actions.case, result)["combinations"]["governing"]
    assert [(r["check"], r["plane"]) for r in rows if r["plane"] == 2] == [("moment", 2), ("deflection", 2)]
    assert len([r for r in rows if r["check"] == "moment"]) == 2
