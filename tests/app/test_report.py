"""app.report: the one wording of a result, in SI and US customary units (cases invented).

Unit factors: 1 kip = 4448.2216152605 N, 1 ft = 0.3048 m, 1 in = 0.0254 m (NIST SP 811 (2008) Appendix B,
exact by definition; from memory).
"""

import dataclasses
import doctest
import json
from importlib import resources

import pytest

import app.export_names
import app.report.numbers
import app.report.words
import engine
from app.report import (
    capacity_text,
    caution_text,
    csv_number,
    load_text,
    quoted_text,
    source_text,
    status_message,
    status_text,
)
from app.units import units

SI, US = units("si"), units("us")


def _case(**changes):
    mapping = json.loads(
        resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    )
    mapping.update(changes)
    return engine.Case.from_dict(mapping)


@pytest.mark.parametrize("module", [app.report.numbers, app.report.words, app.export_names])
def test_examples_in_the_docstrings(module):
    """The examples in the report's and the file names' docstrings hold (they are not collected otherwise)."""
    failed, attempted = doctest.testmod(module)
    assert attempted > 0 and failed == 0


def test_status_in_both_systems():
    """The demo's status quotes N in the display unit: 350 kN is 78.683 kip."""
    result = engine.solve(_case())
    assert status_text(result, SI).startswith("stable: compression 350.00 kN, N/Pcr1 = 0.1067")
    assert status_message(result, US).startswith("compression 78.683 kip")


def test_status_at_and_beyond_the_critical_load():
    """At Pcr1 the status names critical load 1; above it, the loads it lies between."""
    case = _case()
    pcr1 = float(engine.solve(case).critical_loads[0])
    at = engine.solve(dataclasses.replace(case, axial_force=pcr1))
    assert "equals critical load 1" in status_text(at, SI) and "unbounded" in status_text(at, SI)
    beyond = engine.solve(dataclasses.replace(case, axial_force=1.5 * pcr1))
    assert "between critical loads 1 and 2" in status_text(beyond, US) and "kip" in status_text(beyond, US)


def test_point_load_is_f():
    """A point load is F (N is the axial force), in the display units."""
    load = _case().loads[1]
    assert load_text(load, 6.0, SI) == "point load F = 4.000 kN at x = 2.200 m"
    assert load_text(load, 6.0, US) == "point load F = 0.899 kip at x = 7.218 ft"


def test_deflection_caution_in_us_units():
    """The deflection caution is reworded from its SI values: 29.2 mm is 1.150 in."""
    caution = engine.Caution(
        level="warning",
        code="deflection",
        message="Deflection 29.2 mm exceeds the limit span/250 = 24.0 mm (...).",
        source="EN 1990",
        values={"deflection": 0.0292, "limit": 250.0, "allowed": 0.024},
    )
    assert caution_text(caution, US).startswith("Deflection 1.150 in exceeds the limit span/250 = 0.945 in")
    assert caution_text(caution, SI).startswith("Deflection 29.20 mm exceeds the limit span/250 = 24.00 mm")


def test_capacity_in_us_units():
    """The capacity sentence names the governing check with the force in the display unit."""
    case = _case()
    found = engine.capacity(case)
    text = capacity_text(found, US)
    assert "kip" in text and "kN" not in text


def test_sources_and_quoted_quantities():
    """The calc sheet names a source without the flags; SI quantities quoted in it are converted in US."""
    assert source_text("EN 1990 §6.5 (from memory)") == "EN 1990 §6.5"
    assert quoted_text("t <= 40 mm", US) == "t <= 1.575 in"  # 40 / 25.4 = 1.5748
    assert quoted_text("t <= 40 mm", SI) == "t <= 40 mm"


def test_csv_number_significant_figures():
    """Six significant figures; inf as Python writes it (a critical load's unbounded values)."""
    assert csv_number(1234567.0) == "1.23457e+06" and csv_number(-2.5e-7) == "-2.5e-07"
    assert csv_number(float("-inf")) == "-inf"


def test_every_caution_that_quotes_a_unit_is_reworded():
    """Every caution whose engine message quotes mm, kN or m has its own wording in the report."""
    quoting = []
    cases = [
        {"axial_force": 900e3, "loads": [{"type": "uniform", "q": 25e3}]},
        {"imperfection": {"shape": "sine", "amplitude": 0.005}, "out_of_plane": {"restrained": True}},
        {"supports": {"left": "fixed", "right": "free"}, "axial_force": 100e3},
        {"axial_force": 4000e3},
        # an overhang in one plane: its support inside is taken as a fork (its x quoted)
        {"supports": {"left": "pinned", "right": "free"}, "restraints": [{"x": 4.5, "translation": "fixed"}]},
    ]
    for changes in cases:
        for caution in engine.solve(_case(**changes)).cautions:
            if any(f" {unit}" in caution.message for unit in ("mm", "kN", "m ", "m,", "m)")):
                quoting.append(caution)
    expected = {"deflection", "bow-below-code", "out-of-plane-buckling", "ltb-support-held-assumed"}
    assert {c.code for c in quoting} >= expected
    for caution in quoting:
        text = caution_text(caution, US)
        assert " mm" not in text and " kN" not in text, caution.code
        assert not any(f" m{end}" in text for end in (" ", ",", ")")), caution.code


def test_the_superposition_error_has_one_wording_with_its_side():
    """The page printed "8.1 %" and the summary "−8.1%" for the same sum: one wording now says which side."""
    from types import SimpleNamespace

    from app.report.combinations import superposition_error

    def of(error):
        return superposition_error(SimpleNamespace(error=error))

    assert of(0.081) == "8.1 % below the exact value (the unsafe side)"
    assert of(-0.02) == "2.0 % above the exact value"
    assert of(0.0) == "0.0 % (the sum equals the exact value)"
    assert of(float("inf")) == "∞ (a critical load)"
