"""What the member's lateral-torsional buckling check costs (issue 15): the exact M_cr of a solved member's
own first-order diagram, converged to 0.1 %, and the whole check.

Run from the repository root with ``python3 -m tests.benchmarks.ltb_speed``. Not collected by pytest; nothing
runs at import time. The member is invented: HEB 200, S355, 5 m pin-ended, 8 kN/m on the top flange, end
couples, 400 kN (a non-standard diagram under axial load).

Timed in alternating blocks in the same process (the shared machine's speed drifts within minutes):

- ``M_cr, N = 0``: :func:`engine.design.mcr.critical_moment` on the member's 401-station diagram with its
  shear (cubic pieces), the load on the top flange, converged to 0.1 % (8, 16, ... elements, Richardson);
- ``M_cr, N held``: the same at 400 kN on the mesh the N = 0 solution converged with (what the check does);
- ``check``: :func:`engine.design.ltb_member.check` without a cache (both M_cr, C1 route, χ_LT, AISC F2);
- the reference: one solve of the brute-force kind, a fixed 64-element mesh, eigenvalues by
  ``scipy.linalg.eigh`` of the generalized problem (N = 0).

The script prints median block times and the median paired ratio to the reference; there is no target in the
script (the issue's is ≤ 20 ms per converged M_cr).
"""

from __future__ import annotations

import statistics
import time

import numpy as np
import scipy.linalg

import engine
from engine.design import ltb_member, mcr
from engine.sections import section_from_spec

ROUNDS, BLOCK = 11, 10


def _member():
    case = engine.Case.from_dict(
        {
            "schema": 1,
            "title": "Invented benchmark member",
            "length": 5.0,
            "supports": {"left": "pinned", "right": "pinned"},
            "axial_force": 4e5,
            "section": {"name": "HEB 200"},
            "material": {"name": "S355"},
            "loads": [
                {"type": "uniform", "q": 8e3},
                {"type": "couple", "C": -3e4, "x": 0.0},
                {"type": "couple", "C": 1e4, "x": 5.0},
            ],
        }
    )
    result = engine.solve(case)
    first = result.first_order
    minor = section_from_spec({"name": "HEB 200"}, "minor")
    return case, result, first, minor


def main() -> None:
    """Print the time of each piece and its ratio to the reference."""
    case, result, first, minor = _member()
    found = result.ltb
    E, G = result.material.E, result.material.G
    props = dict(
        EI_z=E * minor.I,
        GI_t=G * found.I_t,
        EI_w=E * found.I_w,
        length=case.length,
        i0_squared=(result.section.I + minor.I) / result.section.A,
        loads=[{"kind": "uniform", "q": 8e3, "height": 0.1}],
        scale_axial=False,
    )
    x, m, v = first.x, first.moment, first.shear

    def zero():
        return mcr.critical_moment(x, m, V=v, **props)

    pair = zero().elements

    def held():
        return mcr.critical_moment(x, m, V=v, N=4e5, mesh_pair=pair, **props)

    def check():
        return ltb_member.check(
            x=x,
            M=m,
            V=v,
            loads=case.loads,
            length=case.length,
            section_y=result.section,
            section_z=minor,
            material=result.material,
            N=4e5,
            settings=case.check.ltb,
            section_class=1,
        )

    def reference():
        uniform, point = mcr._loads(props["loads"], case.length, 0.0)
        nodes = mcr._mesh(case.length, 64, [])
        K, G_ = mcr._matrices(
            nodes,
            lambda p: np.interp(p, x, m),
            (props["EI_z"], props["GI_t"], props["EI_w"], 0.0, 0.0),
            uniform,
            point,
            True,
        )
        free = mcr._free_dofs(nodes.size, ("fork", "fork"), ("free", "free"))
        mu = scipy.linalg.eigh(G_[np.ix_(free, free)], K[np.ix_(free, free)], eigvals_only=True)
        return float(np.max(np.abs(m))) / mu[-1]

    pieces = {"M_cr, N = 0": zero, "M_cr, N held": held, "check": check}
    times = {name: [] for name in (*pieces, "reference")}
    ratios = {name: [] for name in pieces}
    for i in range(ROUNDS):
        order = list(pieces.items()) + [("reference", reference)]
        if i % 2:
            order.reverse()
        block = {}
        for name, function in order:
            t0 = time.perf_counter()
            for _ in range(BLOCK):
                function()
            block[name] = (time.perf_counter() - t0) / BLOCK
            times[name].append(block[name])
        for name in pieces:
            ratios[name].append(block["reference"] / block[name])
    ours, theirs = zero().M_cr, reference()
    print(
        f"converged mesh {pair} elements; M_cr {ours:.6g} vs reference {theirs:.6g} N·m "
        f"({ours / theirs - 1:+.1e}); with N held {held().M_cr:.6g} N·m"
    )
    for name in (*pieces, "reference"):
        line = (
            f"{name:14s} {statistics.median(times[name]) * 1e3:7.2f} ms (best {min(times[name]) * 1e3:6.2f})"
        )
        if name in ratios:
            line += f"  reference/this {statistics.median(ratios[name]):5.2f}x"
        print(line)


if __name__ == "__main__":
    main()
