"""`strutscope batch`: a table of members in, a table of results out (app.batch), run in a subprocess.

The reference for every solved row is the engine itself on the same member, built here from the row by hand
(the batch only converts units and reports what the engine returns), plus the Euler load where it applies.
All members are invented.
"""

import csv
import io
import math
import os

import pytest

import engine
from app import batch
from app.outdir import LOCK_FILE, MANIFEST_FILE
from tests.app.test_cli import run_cli

# 1 kip = 4448.2216152605 N and 1 ft = 0.3048 m, exact by definition (NIST SP 811 (2008) Appendix B;
# from memory).
KIP = 4448.2216152605
FOOT = 0.3048

HEADER = [
    "id",
    "length_m",
    "left",
    "right",
    "section",
    "material",
    "EI_kNm2",
    "axis",
    "axial_kN",
    "udl_kN_per_m",
    "point_loads",
    "bow",
    "check_method",
    "deflection_limit",
    "comment",
]


def row(
    identifier,
    length="6.0",
    left="pinned",
    right="pinned",
    section="",
    material="",
    EI="",
    axis="",
    axial="",
    udl="",
    points="",
    bow="",
    method="",
    limit="",
    comment="",
):
    """One row of the members table, cells as text in the order of HEADER."""
    return [
        identifier,
        length,
        left,
        right,
        section,
        material,
        EI,
        axis,
        axial,
        udl,
        points,
        bow,
        method,
        limit,
        comment,
    ]


# Good rows and the case each one means, written out here in SI (m, N, N/m, N·m²) independently of app.batch.
GOOD = {
    "G1": (
        row(
            "G1",
            section="HEB 200",
            material="S355",
            axial="350",
            udl="2.5",
            points="4@2.2",
            bow="en1993-table-5.1",
            comment="invented wind post",
        ),
        {
            "length": 6.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 350e3,
            "loads": [{"type": "uniform", "q": 2.5e3}, {"type": "point", "P": 4e3, "x": 2.2}],
            "imperfection": {"preset": "en1993-table-5.1"},
            "section": {"name": "HEB 200"},
            "material": {"name": "S355"},
        },
    ),
    "G2": (
        row(
            "G2",
            length="2.5",
            left="fixed",
            right="free",
            section="SHS 100x100x5",
            material="S355",
            axial="60",
            points="3@2.5",
            bow="L/300",
            method="plastic",
            limit="150",
        ),
        {
            "length": 2.5,
            "supports": {"left": "fixed", "right": "free"},
            "axial_force": 60e3,
            "loads": [{"type": "point", "P": 3e3, "x": 2.5}],
            "imperfection": {"preset": "span", "ratio": 300},
            "section": {"name": "SHS 100x100x5"},
            "material": {"name": "S355"},
            "check": {"method": "plastic", "deflection_limit": 150},
        },
    ),
    "G3": (
        row("G3", length="4.0", right="fixed", EI="4200", axial="100", udl="1.0", bow="12mm"),
        {
            "length": 4.0,
            "supports": {"left": "pinned", "right": "fixed"},
            "axial_force": 100e3,
            "EI": 4.2e6,
            "loads": [{"type": "uniform", "q": 1e3}],
            "imperfection": {"shape": "sine", "amplitude": 0.012},
        },
    ),
    "G4": (
        row(
            "G4",
            length="5.0",
            section="IPE 300",
            material="S275",
            axis="minor",
            axial="-200",
            udl="3",
            points="2@1;1.5@4.0",
        ),
        {
            "length": 5.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": -200e3,
            "loads": [
                {"type": "uniform", "q": 3e3},
                {"type": "point", "P": 2e3, "x": 1.0},
                {"type": "point", "P": 1.5e3, "x": 4.0},
            ],
            "section": {"name": "IPE 300"},
            "material": {"name": "S275"},
            "axis": "minor",
        },
    ),
    "G5": (
        row(
            "G5",
            length="3.0",
            section="TIMBER 45x195",
            material="C24",
            axial="8",
            udl="1.2",
            bow="aisc-l/1000",
            limit="300",
        ),
        {
            "length": 3.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 8e3,
            "loads": [{"type": "uniform", "q": 1.2e3}],
            "imperfection": {"preset": "aisc-l/1000"},
            "section": {"name": "TIMBER 45x195"},
            "material": {"name": "C24"},
            "check": {"deflection_limit": 300},
        },
    ),
    "G6": (
        row("G6", length="4.5", section="CHS 114.3x5", material="S355", axial="120", bow="en1993-eq-5.9"),
        {
            "length": 4.5,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 120e3,
            "loads": [],
            "imperfection": {"preset": "en1993-eq-5.9"},
            "section": {"name": "CHS 114.3x5"},
            "material": {"name": "S355"},
        },
    ),
    "G7": (
        row(
            "G7",
            length="3.5",
            left="fixed",
            section="IPE 200",
            material="S355",
            axial="150",
            udl="0.8",
            bow="en1993-table-5.1:c",
            method="plastic",
        ),
        {
            "length": 3.5,
            "supports": {"left": "fixed", "right": "pinned"},
            "axial_force": 150e3,
            "loads": [{"type": "uniform", "q": 0.8e3}],
            "imperfection": {"preset": "en1993-table-5.1", "curve": "c"},
            "section": {"name": "IPE 200"},
            "material": {"name": "S355"},
            "check": {"method": "plastic"},
        },
    ),
}

# Bad rows and the column each must be reported against.
BAD = {
    "B1": (row("B1", section="HEB 990", material="S355", axial="200", udl="1"), "section"),
    "B2": (row("B2", length="-3.0", EI="4200", axial="150"), "length_m"),
    "B3": (row("B3", EI="4200", axial="150", points="7-2.0"), "point_loads"),
    "B4": (row("B4", left="free", right="free", EI="4200", udl="2"), "left/right"),
    "B5": (row("B5", EI="4200", udl="1", points="2@1;5@9"), "point_loads"),
    "B6": (row("B6", EI="4200", axial="100", bow="L300"), "bow"),
    "B7": (row("B7", EI="4200", axial="12,5"), "axial_kN"),
    "B8": (row("G1", EI="4200"), "id"),  # the id of the first row again
    "B9": (row("B9", right="pined", EI="4200"), "right"),
    "B10": (row("B10", section="IPE 200", material="S999"), "material"),
    "B11": (row("B11", length="", EI="4200"), "length_m"),
}

# Good and bad rows interleaved: the results must come back in this order.
ORDER = [
    "G1",
    "B1",
    "B2",
    "G2",
    "B3",
    "B4",
    "G3",
    "B5",
    "B6",
    "G4",
    "B7",
    "B8",
    "G5",
    "B9",
    "B10",
    "G6",
    "B11",
    "G7",
]


def table_rows(copies=1):
    """The rows of ORDER, `copies` times (ids after the first copy suffixed so that they stay unique)."""
    rows = []
    for copy in range(copies):
        for key in ORDER:
            cells = list(GOOD[key][0] if key in GOOD else BAD[key][0])
            if copy:
                cells[0] = f"{cells[0]}-{copy}"
            rows.append((key, cells))
    return rows


def write_table(path, rows, header=HEADER):
    """Write a members table and return its path."""
    with open(path, "w", encoding="utf-8", newline="") as stream:
        writer = csv.writer(stream)
        writer.writerow(header)
        writer.writerows(rows)
    return path


def read_results(folder):
    """The rows of folder/results.csv as dicts."""
    with open(folder / "results.csv", encoding="utf-8", newline="") as stream:
        return list(csv.DictReader(stream))


def listing(folder):
    """The files of an output folder, without the run lock and the calc-sheet manifest (app.outdir)."""
    return sorted(name for name in os.listdir(folder) if name not in (LOCK_FILE, MANIFEST_FILE))


def number(text):
    """A results cell as a float (None for an empty cell)."""
    return None if text == "" else float(text)


def expected_governing(result):
    """What produces the headline: the worst counted route of the engine's result and its governing term."""
    from app.report.route_names import governing_text

    if result.check is None or result.utilization is None:
        return ""
    counted = [route for route in result.routes if route.enabled and route.utilization is not None]
    top = max(counted, key=lambda route: route.utilization)
    assert top.utilization == pytest.approx(result.utilization, rel=1e-12)  # the headline is that route's
    return f"{top.route}: {governing_text(top.governing)}"


def assert_matches_engine(got, mapping):
    """The results row `got` holds engine.solve and engine.capacity of the case `mapping` (kN, m, mm)."""
    case = engine.Case.from_dict({"schema": 1, **mapping})
    result = engine.solve(case, stations=401)
    exact = pytest.approx
    assert got["status"] == "ok", got
    assert got["stability"] == result.status
    assert number(got["Pcr1_kN"]) == exact(result.critical_loads[0] / 1e3, rel=1e-12)
    if math.isinf(result.alpha_cr):  # no compression
        assert got["alpha_cr"] == "inf"
    else:
        assert number(got["alpha_cr"]) == exact(result.alpha_cr, rel=1e-12)
    governing = result.governing
    assert number(got["M_max_kNm"]) == exact(governing.moment.value / 1e3, rel=1e-12)
    assert number(got["x_M_m"]) == exact(governing.moment.x, rel=1e-12, abs=1e-12)
    assert number(got["V_max_kN"]) == exact(governing.shear.value / 1e3, rel=1e-12)
    assert number(got["x_V_m"]) == exact(governing.shear.x, rel=1e-12, abs=1e-12)
    assert number(got["w_max_mm"]) == exact(governing.deflection.value * 1e3, rel=1e-12)
    assert number(got["x_w_m"]) == exact(governing.deflection.x, rel=1e-12, abs=1e-12)
    moment_amplification = result.amplification.moment
    assert number(got["amplification_moment"]) == (
        None if moment_amplification is None else exact(moment_amplification, rel=1e-12)
    )
    assert number(got["utilization"]) == (
        None if result.utilization is None else exact(result.utilization, rel=1e-12)
    )
    assert got["governing_check"] == expected_governing(result)
    kind = None if result.utilization is None else result.material.kind
    assert got["utilization_basis"] == {None: "", "steel": "code check"}.get(
        kind, f"elastic bound only, not a code check ({kind})"
    )
    assert number(got["deflection_utilization"]) == (
        None if result.service is None else exact(result.service.utilization, rel=1e-12)
    )
    if case.section is not None and case.material is not None:
        capacity = engine.capacity(case)
        assert number(got["capacity_kN"]) == exact(capacity.axial_force / 1e3, rel=1e-12)
        assert got["capacity_check"] == capacity.check
    else:
        assert got["capacity_kN"] == "" and got["capacity_check"] == ""
    assert got["cautions"].split(";") == [caution.code for caution in result.cautions]
    return result


@pytest.fixture(scope="module")
def mixed_run(tmp_path_factory):
    """The mixed table of ORDER run once with one worker: (process, folder, rows)."""
    folder = tmp_path_factory.mktemp("mixed")
    table = write_table(folder / "members.csv", [cells for _, cells in table_rows()])
    done = run_cli("batch", str(table), "--out", str(folder / "out"), "--workers", "1", cwd=folder)
    return done, folder / "out", read_results(folder / "out")


def test_every_good_row_matches_engine_solve_on_the_same_member(mixed_run):
    """Each good row's results equal engine.solve and engine.capacity on the member built by hand from it."""
    done, _, rows = mixed_run
    by_id = {got["id"]: got for got in rows if got["status"] == "ok"}
    assert set(by_id) == set(GOOD)
    for key, (_, mapping) in GOOD.items():
        result = assert_matches_engine(by_id[key], mapping)
        if key == "G1":
            # Pinned–pinned: Pcr1 = π²EI/L² (Timoshenko & Gere, Theory of Elastic Stability, 2nd ed., 1961,
            # ch. 2; from memory), EI being E·I of the section about its major axis.
            euler = math.pi**2 * result.EI / 6.0**2
            assert number(by_id[key]["Pcr1_kN"]) == pytest.approx(euler / 1e3, rel=1e-9)


def test_every_bad_row_is_reported_with_its_row_number_and_column(mixed_run):
    """Each bad row has status error, its line in the table (header = line 1), its column and a message."""
    _, _, rows = mixed_run
    for line, (key, got) in enumerate(zip(ORDER, rows, strict=True), start=2):
        assert int(got["row"]) == line
        if key in BAD:
            assert got["status"] == "error", (key, got)
            assert got["field"] == BAD[key][1], (key, got)
            assert got["message"], key
            assert got["Pcr1_kN"] == ""
    messages = {key: got["message"] for key, got in zip(ORDER, rows, strict=True)}
    assert "'HEB 990' is not in the catalogue" in messages["B1"]
    assert "-3.0 m must be >= 0.001" in messages["B2"]
    assert "'7-2.0' is not a point load" in messages["B3"]
    assert "mechanism" in messages["B4"]
    assert "loads[2].x: 9.0 m lies outside the member" in messages["B5"]
    assert "decimal point" in messages["B7"]
    assert "already used on row 2" in messages["B8"]
    assert "did you mean 'pinned'" in messages["B9"]


def test_results_keep_the_input_order_and_run_reports_invalid_rows(mixed_run):
    """The results list the members in the input order; the run exits 1 (some rows invalid) and names them."""
    done, folder, rows = mixed_run
    assert [got["id"] for got in rows] == [cells[0] for _, cells in table_rows()]
    assert list(rows[0]) == list(batch.result_columns("si"))
    assert done.returncode == 1, done.stderr
    assert f"{len(ORDER)} members" in done.stdout and f"{len(GOOD)} solved" in done.stdout
    assert "row 3 (B1): section = 'HEB 990'" in done.stdout
    assert done.stderr == ""  # no progress bar when stderr is not a terminal
    assert listing(folder) == ["results.csv"]  # no temporary file left behind


def test_parallel_run_gives_the_same_results_in_the_same_order(tmp_path):
    """With --workers 2 and over 50 rows, 2 processes share the rows; results.csv equals the 1-worker one."""
    rows = table_rows(copies=4)
    assert len(rows) > batch.PARALLEL_MIN_ROWS
    table = write_table(tmp_path / "members.csv", [cells for _, cells in rows])
    serial = run_cli("batch", str(table), "--out", "serial", "--workers", "1", "--no-capacity", cwd=tmp_path)
    parallel = run_cli(
        "batch", str(table), "--out", "parallel", "--workers", "2", "--no-capacity", cwd=tmp_path
    )
    assert serial.returncode == parallel.returncode == 1, parallel.stderr
    assert "(2 processes)" in parallel.stdout and "(1 process)" in serial.stdout
    serial_bytes = (tmp_path / "serial" / "results.csv").read_bytes()
    assert (tmp_path / "parallel" / "results.csv").read_bytes() == serial_bytes
    got = read_results(tmp_path / "parallel")
    assert [r["id"] for r in got] == [cells[0] for _, cells in rows]
    assert [r["status"] for r in got] == ["ok" if key in GOOD else "error" for key, _ in rows]
    # The third copy of G4 (tension, two point loads) against the engine, without the capacity search.
    g4 = next(r for r in got if r["id"] == "G4-3")
    result = engine.solve(engine.Case.from_dict({"schema": 1, **GOOD["G4"][1]}))
    assert number(g4["M_max_kNm"]) == pytest.approx(result.governing.moment.value / 1e3, rel=1e-12)
    assert g4["capacity_kN"] == ""


def test_pdf_calc_sheet_for_each_good_row(tmp_path):
    """--pdf writes <id>.pdf per solved row (opens with pypdf, names its member) and none for a bad row."""
    from pypdf import PdfReader

    table = write_table(tmp_path / "members.csv", [GOOD["G1"][0], BAD["B2"][0], GOOD["G3"][0]])
    done = run_cli(
        "batch", str(table), "--out", "out", "--pdf", "--prepared-by", "Invented Engineer", cwd=tmp_path
    )
    assert done.returncode == 1, done.stderr
    assert listing(tmp_path / "out") == ["G1.pdf", "G3.pdf", "results.csv"]
    for name in ("G1", "G3"):
        reader = PdfReader(tmp_path / "out" / f"{name}.pdf")
        text = "".join(page.extract_text() for page in reader.pages)
        assert name in text and "Invented Engineer" in text
    assert "calc sheets: 2 PDF files" in done.stdout


def test_us_units_name_and_convert_the_result_columns(tmp_path):
    """--units us writes Pcr1_kip, M_max_kip_ft, w_max_in and x_M_ft: the engine's values in kip, ft, in."""
    table = write_table(tmp_path / "members.csv", [GOOD["G3"][0]])
    done = run_cli("batch", str(table), "--out", "out", "--units", "us", cwd=tmp_path)
    assert done.returncode == 0, done.stderr
    (got,) = read_results(tmp_path / "out")
    result = engine.solve(engine.Case.from_dict({"schema": 1, **GOOD["G3"][1]}))
    assert number(got["Pcr1_kip"]) == pytest.approx(result.critical_loads[0] / KIP, rel=1e-12)
    moment = result.governing.moment
    assert number(got["M_max_kip_ft"]) == pytest.approx(moment.value / (KIP * FOOT), rel=1e-12)
    assert number(got["w_max_in"]) == pytest.approx(result.governing.deflection.value / 0.0254, rel=1e-12)
    assert number(got["x_M_ft"]) == pytest.approx(result.governing.moment.x / FOOT, rel=1e-12)


@pytest.mark.parametrize(
    ("header", "expected"),
    [
        (HEADER[:1] + ["lenght_m"] + HEADER[2:], "unknown column 'lenght_m' (did you mean 'length_m'?)"),
        ([name for name in HEADER if name != "right"], "required column missing: right"),
        ([";".join(HEADER)], "separated by ';'"),
    ],
)
def test_unusable_header_exits_two_and_writes_nothing(tmp_path, header, expected):
    """An unknown, missing or ';'-joined header exits with 2, names the problem and writes no results."""
    table = write_table(tmp_path / "members.csv", [GOOD["G3"][0][: len(header)]], header=header)
    done = run_cli("batch", str(table), "--out", "out", cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {table}: ")
    assert expected in done.stderr
    assert not (tmp_path / "out").exists()


def test_missing_table_exits_two(tmp_path):
    """A members table that does not exist exits with 2 and names the file."""
    done = run_cli("batch", str(tmp_path / "none.csv"), "--out", "out", cwd=tmp_path)
    assert done.returncode == 2
    assert done.stderr.startswith(f"error: {tmp_path / 'none.csv'}: cannot read the file")


def test_interrupted_run_leaves_the_previous_results_untouched(tmp_path):
    """When a run stops part-way, results.csv keeps its previous content and no temporary file is left."""
    table = write_table(tmp_path / "members.csv", [cells for _, cells in table_rows(copies=2)])
    out = tmp_path / "out"
    out.mkdir()
    (out / "results.csv").write_text("previous results\n", encoding="utf-8")

    def stop(count):
        raise KeyboardInterrupt  # as if the user pressed Ctrl-C after the first chunk

    with pytest.raises(KeyboardInterrupt):
        batch.run(str(table), str(out), workers=1, capacity=False, on_progress=stop)
    assert (out / "results.csv").read_text(encoding="utf-8") == "previous results\n"
    assert listing(out) == ["results.csv"]


def test_interrupted_run_with_calc_sheets_leaves_the_previous_sheets(tmp_path):
    """A run with --pdf stopped part-way leaves results.csv and every calc sheet as the previous run wrote
    them (an audit found the new run's first sheets beside the old results.csv and the old run's other
    sheets): the sheets are staged and published with results.csv."""
    rows = [GOOD["G3"][0], GOOD["G2"][0]]
    table = write_table(tmp_path / "members.csv", rows)
    out = tmp_path / "out"
    batch.run(str(table), str(out), workers=1, capacity=False, pdf=True)
    before = {path.name: path.read_bytes() for path in out.iterdir() if path.suffix in (".pdf", ".csv")}
    assert sum(name.endswith(".pdf") for name in before) == 2
    write_table(tmp_path / "members.csv", [GOOD["G2"][0], GOOD["G3"][0]])  # another run, other sheets

    def stop(count):
        raise KeyboardInterrupt  # Ctrl-C after the first chunk, every sheet of it staged

    with pytest.raises(KeyboardInterrupt):
        batch.run(
            str(table), str(out), workers=1, capacity=False, pdf=True, prepared_by="XY", on_progress=stop
        )
    after = {path.name: path.read_bytes() for path in out.iterdir() if path.suffix in (".pdf", ".csv")}
    assert after == before
    assert not [name for name in os.listdir(out) if name.startswith(".strutscope-") and "sheets" in name]


def test_progress_bar_shows_when_asked(tmp_path, capsys):
    """With progress=True the run draws a tqdm bar counting members on stderr (by default none off a TTY)."""
    table = write_table(tmp_path / "members.csv", [GOOD["G3"][0], GOOD["G2"][0]])
    summary = batch.run(str(table), str(tmp_path / "out"), workers=1, progress=True)
    assert summary.members == 2 and summary.solved == 2 and summary.error_count == 0
    assert "member" in capsys.readouterr().err
    batch.run(str(table), str(tmp_path / "out"), workers=1)
    assert capsys.readouterr().err == ""


def test_example_table_in_assets_runs_with_its_marked_bad_rows(tmp_path):
    """assets/example_members.csv is invented, solves its good rows and reports exactly those marked bad."""
    from importlib import resources

    text = resources.files("assets").joinpath("example_members.csv").read_text(encoding="utf-8")
    rows = list(csv.DictReader(io.StringIO(text)))
    assert all("invented" in r["comment"].lower() or "deliberately bad" in r["comment"].lower() for r in rows)
    (tmp_path / "members.csv").write_text(text, encoding="utf-8")
    done = run_cli("batch", "members.csv", "--out", "out", "--no-capacity", cwd=tmp_path)
    assert done.returncode == 1, done.stderr
    got = read_results(tmp_path / "out")
    marked = ["error" if "deliberately bad" in r["comment"].lower() else "ok" for r in rows]
    assert [r["status"] for r in got] == marked
    assert marked.count("error") >= 3


def test_route_and_second_plane_cells():
    """The batch writes the headline route, each route's utilisation and term, the second plane's values."""
    import dataclasses

    from app.batch.solving import _route_cells, _second_plane_cells
    from tests.app.test_routes_exports import ROUTES

    case = engine.Case.from_dict({"schema": 1, **GOOD["G3"][1]})
    result = engine.solve(case)
    plain = dataclasses.replace(result, routes=(), second_plane=None)
    assert _route_cells(plain) == [""] * 7 and _second_plane_cells(plain, 1e-3, 1e-3, 1e3) == [""] * 4
    both = dataclasses.replace(result, routes=ROUTES, second_plane=result)
    assert _route_cells(both) == ["en-member", "0.812", "cross-section", "0.903", "eq-6.62", "0.951", "H1-1a"]
    pcr, moment, shear, deflection = _second_plane_cells(both, 1e-3, 1e-3, 1e3)
    assert float(pcr) == pytest.approx(result.critical_loads[0] / 1e3, rel=1e-12)
    assert float(moment) == pytest.approx(abs(result.governing.moment.value) / 1e3, rel=1e-12)
    assert float(shear) == pytest.approx(abs(result.governing.shear.value) / 1e3, rel=1e-12)
    assert float(deflection) == pytest.approx(abs(result.governing.deflection.value) * 1e3, rel=1e-12)
    columns = batch.result_columns("us")
    assert columns[-14:-11] == ("combination_rule", "strength_combination", "deflection_combination")
    assert columns[-2:] == ("capacity_combination", "from_combinations")
    assert columns[-25:-14] == (
        "headline_route",
        "utilization_second_order",
        "governing_second_order",
        "utilization_en_member",
        "governing_en_member",
        "utilization_aisc",
        "governing_aisc",
        "second_plane_Pcr1_kip",
        "second_plane_M_max_kip_ft",
        "second_plane_V_max_kip",
        "second_plane_w_max_in",
    )


# A member bent in both planes, given as a row (issue 14). The case file it must equal is written out here,
# so the row's reading is checked against the case file contract, not against itself (invented member).
TWO_PLANE_ROW = {
    "id": "WP2",
    "length_m": "4.2",
    "left": "pinned",
    "right": "pinned",
    "section": "HEB 200",
    "material": "S355",
    "axial_kN": "600",
    "udl_kN_per_m": "3.5",
    "bow": "en1993-table-5.1",
    "second_left": "pinned",
    "second_right": "fixed",
    "second_udl_kN_per_m": "0.8",
    "second_point_loads": "1.5@2.1",
    "comment": "invented two-plane member",
}
TWO_PLANE_CASE = {
    "schema": 1,
    "title": "WP2: invented two-plane member",
    "length": 4.2,
    "supports": {"left": "pinned", "right": "pinned"},
    "section": {"name": "HEB 200"},
    "material": {"name": "S355"},
    "axial_force": 600e3,
    "loads": [{"type": "uniform", "q": 3.5e3}],
    "imperfection": {"preset": "en1993-table-5.1"},
    "second_plane": {
        "supports": {"left": "pinned", "right": "fixed"},
        "loads": [{"type": "uniform", "q": 0.8e3}, {"type": "point", "P": 1.5e3, "x": 2.1}],
    },
}


def test_a_row_with_second_plane_columns_is_the_two_plane_case_file():
    from app.batch.rows import member_case

    from_row = member_case(TWO_PLANE_ROW)
    assert from_row == engine.Case.from_dict(TWO_PLANE_CASE)
    result = engine.solve(from_row)
    assert result.second_plane is not None and result.second_plane.governing.moment.value != 0.0


def test_the_batch_writes_both_planes_of_a_two_plane_row(tmp_path):
    header = list(TWO_PLANE_ROW)
    one_plane = {**TWO_PLANE_ROW, "id": "P1", **{k: "" for k in header if k.startswith("second_")}}
    rows = [TWO_PLANE_ROW, one_plane]
    with open(tmp_path / "members.csv", "w", newline="", encoding="utf-8") as stream:
        writer = csv.DictWriter(stream, fieldnames=header)
        writer.writeheader()
        writer.writerows(rows)
    done = run_cli("batch", "members.csv", "--out", "out", "--no-capacity", cwd=tmp_path)
    assert done.returncode in (0, 1), done.stderr
    got = {r["id"]: r for r in read_results(tmp_path / "out")}
    expected = engine.solve(engine.Case.from_dict(TWO_PLANE_CASE))
    two = got["WP2"]
    assert two["status"] == "ok", two
    assert float(two["second_plane_M_max_kNm"]) == pytest.approx(
        abs(expected.second_plane.governing.moment.value) / 1e3, rel=1e-3
    )
    assert float(two["second_plane_w_max_mm"]) == pytest.approx(
        abs(expected.second_plane.governing.deflection.value) * 1e3, rel=1e-3
    )
    assert float(two["utilization"]) == pytest.approx(expected.utilization, rel=1e-3)
    assert got["P1"]["status"] == "ok" and got["P1"]["second_plane_M_max_kNm"] == ""


@pytest.mark.parametrize(
    ("change", "column", "words"),
    [
        ({"second_right": ""}, "second_right", "needs both its supports"),
        ({"second_left": "hinged"}, "second_left", "hinged"),
        ({"second_bow": "L/abc"}, "second_bow", "is not a bow"),
        ({"second_point_loads": "1.5@9.0"}, "second_point_loads", "9"),
        ({"second_point_loads": "1.5 at 2"}, "second_point_loads", "is not a point load"),
        ({"second_udl_kN_per_m": "0,8"}, "second_udl_kN_per_m", "decimal point"),
        ({"Lcr_out_m": "3.0"}, "Lcr_out_m", "second_plane"),
        ({"second_EI_kNm2": "1500"}, "second_EI_kNm2", "EI"),
        (
            {"axial_kN": "", "udl_kN_per_m": "", "axial_G_kN": "300", "udl_W_kN_per_m": "2"},
            "second_left",
            "load cases",
        ),
    ],
)
def test_a_bad_second_plane_cell_is_named(change, column, words):
    from app.batch.columns import RowError
    from app.batch.rows import member_case

    with pytest.raises(RowError) as raised:
        member_case({**TWO_PLANE_ROW, **change})
    assert raised.value.column == column, str(raised.value)
    assert words in str(raised.value)


def test_a_row_cut_short_is_refused_naming_the_columns_without_a_cell(tmp_path):
    """A row with fewer cells than the header (a line broken off) was solved with its last cells empty: an
    independent audit saw the axial force lost and the row solved as "ok" at N = 0. It is refused now,
    naming the columns that have no cell; the full row beside it is solved."""
    full = ["T1", "6.0", "pinned", "pinned", "HEB 200", "S355", "", "", "800", "2", "", "", "", "", ""]
    cut = full[:8]
    cut[0] = "T2"
    path = write_table(tmp_path / "members.csv", [full, cut])
    summary = batch.run(str(path), str(tmp_path / "out"), workers=1, progress=False)
    rows = read_results(tmp_path / "out")
    assert rows[0]["status"] == "ok"
    assert rows[1]["status"] == "error" and rows[1]["id"] == "T2"
    assert rows[1]["field"] == "axial_kN"
    assert "axial_kN, udl_kN_per_m" in rows[1]["message"] and "no cell" in rows[1]["message"]
    assert summary.error_count == 1


def test_a_us_unit_column_is_refused_with_advice_to_convert(tmp_path):
    """An ``axial_kip`` header was answered "did you mean 'axial_kN'?": renaming it would read kip as kN
    (an independent audit). The message now says the values must be converted."""
    header = [*HEADER[:8], "axial_kip", *HEADER[9:]]
    path = write_table(
        tmp_path / "members.csv", [["K1", "6.0", "pinned", "pinned", "", "", "", "", "180"]], header
    )
    with pytest.raises(batch.TableError) as caught:
        batch.run(str(path), str(tmp_path / "out"), workers=1, progress=False)
    assert "convert the values to SI" in str(caught.value) and "did you mean" not in str(caught.value)
