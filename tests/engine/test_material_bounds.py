"""A custom material's values outside what its kind can have are refused, and a member of a material other
than steel keeps the elastic bound N/Pcr1 with a bow (two findings of an independent audit).

- A custom "steel" took E = 2.1e12 Pa or f_y = 3550 MPa (a digit or a unit off) silently: a code check of
  0.149 or 0.231 for 0.314. E of structural steel is 200–210 GPa (EN 1993-1-1 §3.2.6 gives 210 GPa; AISC
  360-16 29 000 ksi = 200 GPa, from memory); the bands are wide (common practice, no source).
- An aluminium strut whose first mode tilts it on a top spring read 0.355 at 0.995·Pcr1 with a bow, where
  the code's resistance cannot exceed Pcr1 (Euler; its first critical load is k·L exactly here, Timoshenko &
  Gere §2.2, from memory).
"""

from __future__ import annotations

import pytest

import engine

_MEMBER = {
    "length": 5.0,
    "supports": {"left": "pinned", "right": "pinned"},
    "axial_force": 300e3,
    "loads": [{"type": "uniform", "q": 2e3}],
    "section": {"name": "HEB 200"},
}


@pytest.mark.parametrize(
    ("material", "field"),
    [
        ({"kind": "steel", "E": 2.1e12, "fy": 3.55e8}, "material.E"),
        ({"kind": "steel", "E": 2.1e11, "fy": 3.55e9}, "material.fy"),
        ({"kind": "steel", "E": 2.1e11, "fy": 3.55e8, "f_t": 5.1e9}, "material.f_t"),
        ({"kind": "timber", "E": 1.1e12, "fy": 2.4e7}, "material.E"),
        ({"kind": "aluminium", "E": 7e9, "fy": 2.5e8}, "material.E"),
        ({"kind": "custom", "E": 2.1e13, "fy": 3.55e8}, "material.E"),
        ({"kind": "timber", "E": 1.1e10, "fy": 2.4e7, "E_05": 1.2e10}, "material.E_05"),
    ],
)
def test_implausible_material_values_are_refused(material, field):
    with pytest.raises(engine.CaseError, match=rf"^{field.replace('.', '[.]')}: "):
        engine.Case.from_dict({**_MEMBER, "material": material})


def test_a_plausible_custom_steel_is_the_catalogue_steel():
    custom = engine.solve(
        engine.Case.from_dict({**_MEMBER, "material": {"kind": "steel", "E": 2.1e11, "fy": 3.55e8}})
    )
    assert custom.utilization > 0.3  # the audit's 0.314 with E = 210 GPa and f_y = 355 MPa


@pytest.mark.parametrize("fraction", [0.9, 0.995])
def test_aluminium_tilting_on_a_spring_keeps_n_over_pcr1_with_a_bow(fraction):
    k, L = 30e3, 3.0
    data = {
        "length": L,
        "supports": {"left": "pinned", "right": {"translation": k, "rotation": "free"}},
        "axial_force": fraction * k * L,
        "section": {"name": "CHS 114.3x5"},
        "material": {"name": "EN AW-6082 T6"},
        "imperfection": {"preset": "span", "ratio": 300},
        "out_of_plane": {"restrained": True},
    }
    result = engine.solve(engine.Case.from_dict(data))
    assert result.critical_loads[0] == pytest.approx(k * L, rel=1e-9)
    assert result.utilization >= fraction * (1 - 1e-12)
