"""Every output speaks one units system: no SI unit in US output, no US unit in SI output (issue 13).

The outputs scanned: the command line's summary (``strutscope solve``, in a subprocess and through
``format_summary``), the CSV, the text matplotlib draws on the PNG figure, and the PDF calc sheet's text as
pypdf extracts it. The cases are invented and chosen to fire the cautions and labels that quote quantities:
a code bow, a bow below the code value, the eq. (5.9) bow, a sway, a deflection over its limit, out-of-plane
buckling, springs, tension, and the first critical load.
"""

import io
import re
import subprocess
import sys
from importlib import resources

import pypdf
import pytest
from matplotlib.text import Text

import engine
from app import exports
from app.report import format_summary

# SI unit tokens that must not appear in US output, and the reverse. "m" alone only after a number (a word
# such as "member" is no unit); "mrad" is the rotation unit of both systems.
SI_TOKENS = re.compile(
    r"(?<![\w·/])(kN|kN·m|kN/m|kN·m²|MPa|GPa|mm|cm|cm²|cm⁴|N·m|kg/m³)(?![\w])|\d\s?m(?![\w²³⁴/·])|\[m\]"
)
US_TOKENS = re.compile(
    r"(?<![\w·/])(kip|kips|kip·ft|kip/ft|ksi|ft|lbf|in²|in⁴|lb/ft³)(?![\w])|\d\s?in\b|\[in\]"
)
FORBIDDEN = {"us": SI_TOKENS, "si": US_TOKENS}


def _demo_mapping():
    import json

    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    return json.loads(text)


def _case(**changes):
    mapping = _demo_mapping()
    mapping.update(changes)
    return engine.Case.from_dict(mapping)


CASES = {
    "demo": {},
    "over its limits": {"axial_force": 900e3, "loads": [{"type": "uniform", "q": 25e3}]},
    "bow below the code": {
        "imperfection": {"shape": "sine", "amplitude": 0.005},
        "out_of_plane": {"restrained": True},
    },
    "eq. (5.9) bow": {"imperfection": {"preset": "en1993-eq-5.9"}, "out_of_plane": {"restrained": True}},
    "cantilever with sway": {"supports": {"left": "fixed", "right": "free"}, "axial_force": 100e3},
    "springs": {
        "supports": {"left": {"translation": 5e6, "rotation": 2e5}, "right": "guided"},
        "loads": [
            {"type": "linear", "q_start": 2e3, "q_end": -1e3},
            {"type": "couple", "C": 3e3, "x": 1.0},
            {"type": "point", "P": -2e3, "x": 2.5},
        ],
        "axial_force": 50e3,
    },
    "tension": {"axial_force": -200e3},
    # Issue 14: a second plane (its cautions carry the plane), bending about the minor axis (invented loads).
    "two planes": {
        "second_plane": {
            "supports": {"left": "pinned", "right": "fixed"},
            "loads": [{"type": "point", "P": 3e3, "x": 2.0}, {"type": "uniform", "q": 4e3}],
        },
        "check": {"method": "elastic", "deflection_limit": 1000},
    },
    "beyond the first critical load": {"axial_force": 4000e3},
    # A parametric section (its name is its size) and an ASTM steel (its source quotes a density).
    "parametric RHS, ASTM steel": {
        "section": {"shape": "rhs", "h": 0.2, "b": 0.1, "t": 0.008, "manufacture": "cold-formed"},
        "material": {"name": "ASTM A36"},
    },
}


@pytest.fixture(scope="module", params=sorted(CASES))
def solved(request):
    """One of the invented cases, solved."""
    case = _case(**CASES[request.param])
    return case, engine.solve(case)


def _offending(text: str, system: str) -> list[str]:
    return [text[max(0, m.start() - 50) : m.end() + 10] for m in FORBIDDEN[system].finditer(text)]


@pytest.mark.parametrize("system", ["si", "us"])
def test_summary_speaks_one_system(solved, system):
    """The printed summary holds no unit of the other system (the demo's bow and status were SI in US)."""
    case, result = solved
    capacity = engine.capacity(case) if result.status == "stable" else None
    text = format_summary("invented.json", case, result, units=system, capacity=capacity)
    assert _offending(text, system) == []


@pytest.mark.parametrize("system", ["si", "us"])
def test_csv_speaks_one_system(solved, system):
    """The CSV's header and comments hold no unit of the other system."""
    _, result = solved
    assert _offending(exports.csv_text(result, units=system), system) == []


@pytest.mark.parametrize("system", ["si", "us"])
def test_figure_labels_speak_one_system(solved, system):
    """Every text matplotlib draws on the PNG figure holds no unit of the other system."""
    _, result = solved
    figure = exports.result_figure(result, units=system, date="2026-01-15")
    text = "\n".join(t.get_text() for t in figure.findobj(Text))
    assert _offending(text, system) == []


@pytest.mark.parametrize("system", ["si", "us"])
def test_pdf_text_speaks_one_system(solved, system):
    """The calc sheet's text holds no unit of the other system ("Deflection 29.2 mm" in US before)."""
    _, result = solved
    reader = pypdf.PdfReader(io.BytesIO(exports.pdf_bytes(result, units=system, date="2026-01-15")))
    text = "\n".join(page.extract_text() for page in reader.pages)
    assert _offending(text, system) == []


def test_the_scanner_finds_units():
    """The scan itself: it finds the SI and US tokens the issue quotes, and passes plain words."""
    assert _offending("e0 = L/250 = 24.00 mm", "us") and _offending("Compression 350 kN", "us")
    assert _offending("L = 6.000 m", "us") and _offending("x [m]", "us")
    assert _offending("19.685 ft", "si") and _offending("0.945 in", "si") and _offending("w [in]", "si")
    assert not _offending("member in the plane, mrad, moment", "us")
    assert not _offending("a member in compression, in tension", "si")


def test_command_line_demo_in_us_has_no_si_unit(tmp_path):
    """`strutscope solve --demo --units us` prints kip and ft only (it printed "24.00 mm" and "350 kN")."""
    done = subprocess.run(
        [sys.executable, "-m", "app.cli", "solve", "--demo", "--units", "us"],
        capture_output=True,
        text=True,
        encoding="utf-8",
        cwd=tmp_path,
        check=False,
    )
    assert done.returncode == 0, done.stderr
    assert "kip" in done.stdout
    assert _offending(done.stdout, "us") == []


def _pdf_text(result) -> str:
    reader = pypdf.PdfReader(io.BytesIO(exports.pdf_bytes(result, date="2026-01-15")))
    return "\n".join(page.extract_text() for page in reader.pages)


def test_pdf_writes_symbols_not_their_spellings():
    """α_cr, ψ, λ̄ and χ are written as symbols in the calc sheet, never alpha_cr, psi, lambda_bar or chi."""
    # A central point load on pinned ends is a case of AISC Commentary Table C-A-8.1 (ψ); the eq. (5.9) bow
    # quotes λ̄, the out-of-plane check χ.
    central = _case(loads=[{"type": "point", "P": 10e3, "x": 3.0}], imperfection={"preset": "en1993-eq-5.9"})
    text = _pdf_text(engine.solve(central))
    assert "α_cr" in text and "ψ =" in text and "λ̄ =" in text and "χ" in text
    for spelling in ("alpha_cr", "psi", "lambda_bar", "chi ="):
        assert spelling not in text, spelling


@pytest.mark.parametrize("system", ["si", "us"])
def test_page_text_speaks_one_system(solved, system):
    """The page's values table, cautions and facts (section, bow, check) hold no unit of the other system."""
    import html

    from app.page import MemberPage
    from app.state import MemberState

    case, _ = solved
    state = MemberState.from_case(case)
    state.units = system
    page = MemberPage(state)
    panes = (
        page.values.table,
        page.cautions.list,
        page.cautions.general,
        page.inputs.section_facts,
        page.inputs.bow_facts,
        page.inputs.check_facts,
        page.routes.block,  # issue 14: the routes and the planes line
    )
    text = html.unescape(re.sub(r"<[^>]+>", " ", " ".join(str(pane.object) for pane in panes)))
    assert "kN" in text or system == "us"  # the scan reads real values, not an empty page
    assert _offending(text, system) == []


@pytest.mark.parametrize(
    ("spec", "si", "us"),
    [
        (
            {"shape": "rhs", "h": 0.2, "b": 0.1, "t": 0.008, "manufacture": "cold-formed"},
            "RHS 200×100×8 mm cold-formed",
            "RHS 7.874×3.937×0.315 in cold-formed",
        ),
        ({"shape": "rectangle", "b": 0.02, "h": 0.2}, "rectangle 20×200 mm", "rectangle 0.7874×7.874 in"),
        (
            {"shape": "chs", "D": 0.1143, "t": 0.005},
            "CHS 114.3×5 mm cold-formed",
            "CHS 4.5×0.1969 in cold-formed",
        ),
        ({"name": "SHS 100x100x5"}, "SHS 100x100x5", "SHS 100x100x5"),
    ],
)
def test_a_parametric_section_is_named_in_the_units_shown(spec, si, us):
    """A section given by its dimensions is named in mm on an SI page and in inches on a US one (it was named
    in millimetres without a unit, a US sheet then mixing the two); a catalogue name stays as written.
    1 in = 25.4 mm exactly."""
    from app.report.section_names import section_name
    from app.units import units
    from engine.sections import section_from_spec

    section = section_from_spec(spec)
    assert section_name(section, units("si")) == si
    assert section_name(section, units("us")) == us


def test_a_density_quoted_by_a_source_is_in_the_units_shown():
    """7850 kg/m³ is 490.1 lb/ft³ (1 lb = 0.45359237 kg, 1 ft = 0.3048 m, exact definitions)."""
    from app.report import quoted_text
    from app.units import units

    assert quoted_text("density 7850 kg/m³: common practice", units("us")) == (
        "density 490.1 lb/ft³: common practice"
    )
    assert quoted_text("density 7850 kg/m³", units("si")) == "density 7850 kg/m³"
