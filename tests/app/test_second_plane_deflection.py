"""A two-plane case's second-plane deflection check is stated as a number in every output.

An independent audit found an invented HEA 160 (S355, 4 m, pinned) with 7 kN/m in its second plane whose
deflection there is 1.204 of span/250, while the page, `solve --json`, the station CSV, the calc sheet and the
batch's `deflection_utilization` gave the first plane's 0.030; the failure was only a warning caution.

Reference for the numbers: the engine's own second-plane check (`result.second_plane.service`), and its
first-order deflection against the closed form 5qL⁴/(384EI) of a pinned member under a uniform load
(Timoshenko & Gere, from memory) times the amplification bound 1/(1 − N/N_cr) (the second-order value lies
between the two).
"""

from __future__ import annotations

import csv
import io
import json

import pytest

import engine
from app import batch
from app.exports.table import csv_text
from app.page.words import values_table
from app.report import format_summary
from app.summary_json import summary_data
from app.units import units

CASE = {
    "schema": 1,
    "title": "Invented: two-plane post with a heavy minor-axis load",
    "length": 4.0,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 50e3,
    "loads": [{"type": "uniform", "q": 500.0}],
    "imperfection": {"preset": "en1993-table-5.1"},
    "section": {"name": "HEA 160"},
    "material": {"name": "S355"},
    "axis": "major",
    "check": {"deflection_limit": 250},
    "second_plane": {
        "supports": {"left": "pinned", "right": "pinned"},
        "loads": [{"type": "uniform", "q": 7000.0}],
    },
}


@pytest.fixture(scope="module")
def result():
    return engine.solve(engine.Case.from_dict(CASE))


def test_the_second_plane_fails_its_deflection_check(result):
    """The engine's own check, bracketed by hand: 5qL⁴/(384 EI_z) ≤ w ≤ that / (1 − N/N_cr,z), with 1 %
    for the shear deformation the engine adds to the bending one."""
    second = result.second_plane
    EI = float(second.EI)
    first = 5 * 7000.0 * 4.0**4 / (384 * EI)
    bound = first / (1 - 50e3 / float(second.critical_loads[0]))
    assert first <= abs(second.service.deflection) <= bound * 1.01
    assert second.service.utilization == pytest.approx(abs(second.service.deflection) / (4.0 / 250), rel=1e-9)
    assert second.service.utilization > 1.0 > result.service.utilization


def test_every_output_states_the_second_planes_deflection(result, tmp_path):
    value = result.second_plane.service.utilization
    shown = f"{value:.3f}"
    # the page's governing values
    html = values_table(result, None, "", units("si"))
    assert "deflection (service), second plane, minor axis (z–z)" in html and shown in html
    # the printed summary and the JSON
    text = format_summary("invented", result.case, result, "si")
    assert "second plane, minor axis (z–z): max|w| = " in text and f"({shown})" in text
    data = json.loads(json.dumps(summary_data("invented", result.case, result), allow_nan=False))
    assert data["second_plane_service"]["deflection_utilization"] == pytest.approx(value, rel=1e-9)
    # the station CSV's metadata
    rows = {
        r[0]: r
        for r in csv.reader(io.StringIO(csv_text(result).lstrip("\ufeff")))
        if r and r[0].startswith("#")
    }
    row = rows["# deflection utilisation second plane [-]"]
    assert row[2].startswith("second plane, minor axis (z–z)")
    assert float(row[1]) == pytest.approx(value, rel=1e-5)
    # the calc sheet
    import pypdf

    from app.exports import pdf_bytes

    pages = pypdf.PdfReader(io.BytesIO(pdf_bytes(result))).pages
    sheet = " ".join(" ".join(p.extract_text() for p in pages).split())
    assert "Deflection, plane 2 minor axis (z–z): max|w| = 19.26 mm" in sheet and f"({shown})" in sheet
    # the batch: the larger of both planes
    table = tmp_path / "members.csv"
    table.write_text(
        "id,length_m,left,right,section,material,axis,axial_kN,udl_kN_per_m,bow,deflection_limit,"
        "second_left,second_right,second_udl_kN_per_m\n"
        "P1,4,pinned,pinned,HEA 160,S355,major,50,0.5,en1993-table-5.1,250,pinned,pinned,7\n",
        encoding="utf-8",
    )
    out = tmp_path / "out"
    batch.run(str(table), str(out), workers=1, capacity=False, progress=False)
    with open(out / "results.csv", encoding="utf-8-sig", newline="") as handle:
        (record,) = list(csv.DictReader(handle))
    assert record["status"] == "ok", record["message"]
    assert float(record["deflection_utilization"]) == pytest.approx(value, rel=1e-5)


def test_the_batch_column_takes_the_larger_plane(result):
    from app.report.combinations import worst_deflection

    assert worst_deflection(result) == pytest.approx(result.second_plane.service.utilization, rel=1e-12)
