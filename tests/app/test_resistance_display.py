"""The resistance side of issue 12 as the user sees it: CLI text and JSON, the batch table, the page's values
and inputs, the calc sheet (out-of-plane N/N_b,Rd, section class, 'fails' at or above Pcr1, γ_M1)."""

import csv
import json
import math

import pytest

import engine
from app.cli import format_summary, summary_data
from app.state import MemberState, values_from_mapping
from tests.app.test_cli import demo_case, run_cli

SHS = {
    "schema": 1,
    "title": "Invented SHS strut above Pcr1",
    "length": 10.0,
    "supports": {"left": "pinned", "right": "pinned"},
    "section": {"name": "SHS 100x100x5"},
    "material": {"name": "S355"},
    "imperfection": {"preset": "en1993-table-5.1"},
}


def _shs_above_critical():
    pcr = engine.solve(engine.Case.from_dict(SHS)).critical_loads[0]
    return dict(SHS, axial_force=1.5 * float(pcr))


def test_cli_above_critical_exits_one_and_writes_null(tmp_path):
    """Issue 12 item 4: SHS 100×100×5, 10 m, N = 1.5 Pcr1: exit 1 without --strict, JSON utilisation null with
    status 'unstable' and fails true; the text says 'fails', never a number below 1."""
    path = tmp_path / "shs.json"
    path.write_text(json.dumps(_shs_above_critical()), encoding="utf-8")
    done = run_cli("solve", str(path), "--json", cwd=tmp_path)
    assert done.returncode == 1, done.stderr
    data = json.loads(done.stdout)
    assert data["status"] == "unstable" and data["utilization"] is None
    assert data["check"]["fails"] is True and data["check"]["valid"] is False
    text = run_cli("solve", str(path), cwd=tmp_path)
    assert text.returncode == 1
    assert "(fails)" in text.stdout and "0.50" not in text.stdout.split("Member check")[1].split("\n")[1]


def test_batch_marks_a_member_above_critical(tmp_path):
    """The batch's results.csv: utilisation inf, stability unstable, and the run exits 1 (issue 12)."""
    pcr = engine.solve(engine.Case.from_dict(SHS)).critical_loads[0]
    table = tmp_path / "members.csv"
    with open(table, "w", encoding="utf-8", newline="") as stream:
        writer = csv.writer(stream)
        writer.writerow(
            [
                "id",
                "length_m",
                "left",
                "right",
                "section",
                "material",
                "axial_kN",
                "bow",
                "Lcr_out_m",
                "out_of_plane",
            ]
        )
        over = f"{1.5 * pcr / 1e3:.3f}"
        writer.writerow(
            ["over", "10", "pinned", "pinned", "SHS 100x100x5", "S355", over, "en1993-table-5.1", "", ""]
        )
        writer.writerow(
            ["post", "6", "pinned", "pinned", "HEB 200", "S355", "350", "en1993-table-5.1", "", ""]
        )
        writer.writerow(
            [
                "braced",
                "6",
                "pinned",
                "pinned",
                "HEB 200",
                "S355",
                "350",
                "en1993-table-5.1",
                "",
                "restrained",
            ]
        )
        writer.writerow(
            ["half", "6", "pinned", "pinned", "HEB 200", "S355", "350", "en1993-table-5.1", "3", ""]
        )
    done = run_cli("batch", str(table), "--out", str(tmp_path / "out"), "--workers", "1", cwd=tmp_path)
    assert done.returncode == 1, done.stdout + done.stderr
    with open(tmp_path / "out" / "results.csv", encoding="utf-8", newline="") as stream:
        rows = {row["id"]: row for row in csv.DictReader(stream)}
    assert rows["over"]["utilization"] == "inf" and rows["over"]["stability"] == "unstable"
    assert rows["over"]["governing_check"] == "second-order: elastic buckling"
    # Issue 14: out of plane governs the second-order route; the headline is the worst route counted.
    assert float(rows["post"]["out_of_plane_utilization"]) == float(rows["post"]["utilization_second_order"])
    assert float(rows["post"]["utilization"]) >= float(rows["post"]["utilization_second_order"])
    assert abs(float(rows["post"]["out_of_plane_utilization"]) - 0.4226) < 5e-4  # the demo's N/N_b,z,Rd
    assert float(rows["post"]["capacity_kN"]) < 830  # N_b,z,Rd = 828 kN caps the capacity
    assert rows["braced"]["out_of_plane_utilization"] == ""
    assert float(rows["half"]["out_of_plane_utilization"]) < float(rows["post"]["out_of_plane_utilization"])
    assert rows["post"]["section_class"] == "1"


def test_cli_summary_shows_out_of_plane_and_class():
    """The text summary has the out-of-plane line (N/N_b,Rd, chi, N_b,Rd) and the section class; the JSON the
    same numbers as the engine."""
    case = demo_case()
    result = engine.solve(case)
    text = format_summary("demo", case, result)
    assert "out of plane: 0.423 (N/N_b,Rd about the minor axis" in text
    assert "section:      class 1" in text
    data = summary_data("demo", case, result)
    out = data["check"]["out_of_plane"]
    assert out["utilization"] == result.check.out_of_plane.utilization
    assert out["N_b_Rd"] == result.check.out_of_plane.N_b_Rd and out["curve"] == "c"
    assert data["check"]["section_class"] == 1


def test_page_state_keeps_out_of_plane_and_gamma_m1_acts():
    """The page's inputs carry the out_of_plane key both ways, and its γ_M1 field changes the result (N_b,Rd =
    χ A f_y/γ_M1, EN 1993-1-1 eq. 6.47)."""
    mapping = demo_case().to_dict()
    mapping["out_of_plane"] = {"buckling_length": 3.0}
    values = values_from_mapping(mapping)
    assert values["out_of_plane_length"] == 3.0 and values["out_of_plane"] == "buckles"
    state = MemberState()
    state.load_mapping(mapping)
    assert state.to_case().out_of_plane.buckling_length == 3.0
    state.out_of_plane = "restrained"
    assert state.to_case().out_of_plane.restrained
    state.out_of_plane = "buckles"
    state.out_of_plane_length = None
    before = engine.solve(state.to_case())
    state.gamma_M1 = 1.1
    after = engine.solve(state.to_case())
    # The second-order route's N/N_b,Rd scales with γ_M1 exactly. The headline (issue 14: the largest enabled
    # route, here eq. (6.62)) rises too, but by a little less since issue 15: the member is now checked as
    # susceptible to torsional deformation, and k_zy of EN 1993-1-1 Annex B Table B.2 for such a member falls
    # as n_z = N_Ed/(χ_z N_Rk/γ_M1) grows (from memory).
    assert after.check.utilization == pytest.approx(before.check.utilization * 1.1, rel=1e-12)
    assert before.utilization * 1.05 < after.utilization < before.utilization * 1.1


def test_page_values_table_shows_the_new_rows():
    """The governing-values table shows N/N_b,Rd out of plane, the section class and '∞ fails' above Pcr1."""
    from app.page.words import values_table
    from app.units import units

    result = engine.solve(demo_case())
    html = values_table(result, None, "", units("si"))
    assert "N/N<sub>b,Rd</sub> out of plane" in html and "minor, χ 0.299" in html and "class 1" in html
    over = engine.solve(engine.Case.from_dict(_shs_above_critical()))
    assert "∞ fails" in values_table(over, None, "", units("si"))
    assert math.isinf(over.utilization)


def test_calc_sheet_states_the_definitions():
    """The PDF calc sheet holds the out-of-plane line, the class and the eq. (5.9) definition."""
    import io

    import pypdf

    from app.exports import pdf_bytes

    reader = pypdf.PdfReader(io.BytesIO(pdf_bytes(engine.solve(demo_case()))))
    text = " ".join(" ".join(page.extract_text() for page in reader.pages).split())
    assert 2 <= len(reader.pages) <= 4  # the routes (issue 14) may take a second text page
    assert "N/N_b,Rd = 0.423 about the minor axis" in text
    assert "EN 1993-1-1 Table 5.2" in text and "e0·N_cr/(EI·|η''|max)" in text


def test_schema_knows_the_out_of_plane_key():
    """The JSON Schema (draft 2020-12, checked by jsonschema) accepts the out_of_plane forms the engine
    accepts and refuses an unknown key inside it, as the engine does."""
    import jsonschema

    from app.schema import case_schema

    validator = jsonschema.Draft202012Validator(case_schema())
    base = demo_case().to_dict()
    for value in ({"buckling_length": 3.0}, {"restrained": True}, {}):
        mapping = dict(base, out_of_plane=value)
        engine.Case.from_dict(mapping)
        validator.validate(mapping)
    bad = dict(base, out_of_plane={"length": 3.0})
    assert not validator.is_valid(bad)
    with pytest.raises(engine.CaseError, match=r"^out_of_plane\.length"):
        engine.Case.from_dict(bad)
