"""One unit for an elastic foundation's modulus k everywhere a person reads or types it.

k is a force per length of member per deflection (N/m² in the engine). The page's field, the sketch, the
words (the CLI and the calc sheet), the CSV and the batch column all use kN/m² (SI) or kip/in² (US); before
2026-12-03 the page and the sketch showed MPa and ksi while the exports and the batch used kN/m², a factor of
1000 between two readings of the same case in SI. Conversions: 1 kip = 4448.2216152605 N, 1 in = 0.0254 m
(NIST SP 811 (2008) Appendix B, from memory).
"""

from __future__ import annotations

import re

import pytest

import engine
from app.page.fields import shown_message
from app.page.restraints import _NUMBERS
from app.report.restraints import FOUNDATION_UNITS, foundation_show, inner_rows, metadata_rows
from app.sketch import sketch
from app.state import MemberState
from app.units import units

K = 5.0e6  # N/m² (5000 kN/m²; invented)
_SHOWN = {"si": ("5000", "kN/m²"), "us": ("0.725", "kip/in²")}  # 5e6 × 0.0254² / 4448.22 = 0.7252
CASE = {
    "length": 6.0,
    "EI": 4.2e6,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 200e3,
    "loads": [{"type": "uniform", "q": 2e3}],
    "foundation": [{"start": 0.0, "end": 3.0, "k": K}],
}


@pytest.mark.parametrize("system", ["si", "us"])
def test_page_sketch_words_and_csv_show_k_in_the_same_unit(system):
    U = units(system)
    number, label = _SHOWN[system]
    assert U.label("foundation_modulus") == label == FOUNDATION_UNITS[system][0]
    field = dict((key, kind) for key, _, kind in _NUMBERS["foundation"])["k"]
    assert U.label(field) == label  # the page's field takes k in this unit
    result = engine.solve(engine.Case.from_dict(CASE))
    texts = [s.text for s in sketch(result, U).shapes if hasattr(s, "text")]
    (drawn,) = [t for t in texts if t.startswith("foundation k = ")]
    assert drawn == f"foundation k = {number} {label}"
    assert foundation_show(U, K) == f"{number} {label}"
    words = " ".join(text for _, text in inner_rows(result.case, U))
    assert f"k = {number} {label}" in words
    (row,) = [r for r in metadata_rows(result, U) if r[0].startswith("foundation 1 k")]
    assert row[0] == f"foundation 1 k [{label}]"
    assert float(row[1]) == pytest.approx(float(number), rel=1e-3)
    other = "MPa" if system == "si" else "ksi"
    assert all(other not in t for t in [drawn, words, row[0]])


@pytest.mark.parametrize(
    ("system", "expected"),
    [
        ("si", "Foundation 1, modulus k: -1.000 kN/m² must be > 0 kN/m² and <= 1.000e+09 kN/m²"),
        ("us", "Foundation 1, modulus k: -0.000145 kip/in² must be > 0 kip/in² and <= 145038 kip/in²"),
    ],
)
def test_a_refused_modulus_is_named_in_the_unit_the_field_takes(system, expected):
    """The engine's message in N/m² is shown in the field's unit (US: never an SI unit on the page)."""
    state = MemberState()
    state.add_item("foundation")
    state.set_item("foundation", 0, k=-1000.0)  # -1 kN/m², as typed in SI
    (message,) = state.errors.values()
    assert "N/m²" in message  # the engine's own words, in SI
    shown = shown_message(message, system)
    assert shown == expected
    assert not re.search(r"\bN/m²", shown)
