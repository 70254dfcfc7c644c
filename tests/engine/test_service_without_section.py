"""The deflection check is made wherever a deflection is computed: on a member given by EI alone, and at
N = 0 with a bow preset.

Two gaps found at stop 39: a batch row given by `EI_kNm2` with a `deflection_limit` had no deflection check
and no word about it (an independent audit), and a member with a code bow had no deflection check at all
at N = 0 (a beam), where the bow moves nothing.

Reference: the pinned member under a uniform load q with a compression N, mid-span deflection
w = (5qL⁴/384EI)·η(u), η(u) = 12(2 sec u − 2 − u²)/(5u⁴), u = (L/2)√(N/EI) (Timoshenko & Gere 1961, §1.11,
from memory; η → 1 as N → 0). EI alone: bending only, no shear deformation.
"""

from __future__ import annotations

import json
import math
from importlib import resources

import pytest

import engine

L, EI, Q = 6.0, 4.2e6, 5e3


def _w(N: float) -> float:
    first = 5 * Q * L**4 / (384 * EI)
    if N == 0.0:
        return first
    u = 0.5 * L * math.sqrt(N / EI)
    return first * 12 * (2 / math.cos(u) - 2 - u * u) / (5 * u**4)


@pytest.mark.parametrize("N", [0.0, 150e3, 300e3, 600e3])
@pytest.mark.parametrize("limit", [250.0, 360.0])
def test_a_member_given_by_ei_alone_gets_its_deflection_check(N, limit):
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "title": "Invented member given by EI",
            "length": L,
            "EI": EI,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": N,
            "loads": [{"type": "uniform", "q": Q}],
            "check": {"deflection_limit": limit},
        }
    )
    r = engine.solve(case)
    assert r.check is None and r.utilization is None
    assert abs(r.service.deflection) == pytest.approx(_w(N), rel=1e-9)
    assert r.service.utilization == pytest.approx(_w(N) / (L / limit), rel=1e-9)
    codes = [c.code for c in r.cautions]
    assert "deflection-basis" in codes
    assert ("deflection" in codes) == (r.service.utilization > 1.0)


def test_a_beam_with_a_bow_preset_gets_its_deflection_check_at_no_axial_force():
    """The demo wind post at N = 0: the deflection check equals the first-order deflection (the bow moves
    nothing without an axial force), as at a small N it tends to."""
    text = resources.files("assets").joinpath("demo_wind_post.json").read_text(encoding="utf-8")
    data = json.loads(text)
    data["axial_force"] = 0.0
    r = engine.solve(engine.Case.from_dict(data))
    assert r.service is not None
    assert r.service.deflection == pytest.approx(r.first_order.governing.deflection.value, rel=1e-12)
    data["axial_force"] = 1.0  # 1 N: the bow-free solve of the service check
    small = engine.solve(engine.Case.from_dict(data))
    assert r.service.utilization == pytest.approx(small.service.utilization, rel=1e-5)


def test_no_deflection_check_beyond_the_first_critical_load():
    """Above Pcr1 there is no service state: the check read 0.929 "as if it had passed" on the unstable
    solution (an audit, stop 39). Pcr1 of the member given by EI: π²EI/L² (Euler)."""
    pcr1 = math.pi**2 * EI / L**2
    data = {
        "schema": 1,
        "length": L,
        "EI": EI,
        "supports": {"left": "pinned", "right": "pinned"},
        "axial_force": 1.2 * pcr1,
        "loads": [{"type": "uniform", "q": Q}],
    }
    r = engine.solve(engine.Case.from_dict(data))
    assert r.status == "unstable" and r.service is None
    assert not any(c.code in ("deflection", "deflection-basis") for c in r.cautions)


@pytest.mark.parametrize(("ends", "N"), [(("fixed", "free"), 100e3), (("pinned", "pinned"), -300e3)])
def test_a_member_given_by_ei_with_a_bow_gets_its_check_in_tension_and_on_a_cantilever(ends, N):
    """The bow-free solve the check needs was made only for a braced member in compression (an audit: a
    cantilever at 1.617 of span/250 and a member in tension had none). The check is the bow-free deflection:
    the same member without its bow gives it."""
    data = {
        "schema": 1,
        "length": L,
        "EI": EI,
        "supports": {"left": ends[0], "right": ends[1]},
        "axial_force": N,
        "loads": [{"type": "uniform", "q": Q}],
        "imperfection": {"shape": "sine", "amplitude": L / 300},
    }
    r = engine.solve(engine.Case.from_dict(data))
    free = engine.solve(engine.Case.from_dict({**data, "imperfection": {"shape": "none"}}))
    assert r.service is not None
    assert r.service.deflection == pytest.approx(free.governing.deflection.value, rel=1e-9)
