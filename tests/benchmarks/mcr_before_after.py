"""The exact elastic critical moment against the code before its speed work, in the same process.

Run from the repository root with ``python3 -m tests.benchmarks.mcr_before_after [COMMIT]`` (default be758ea);
set ``OPENBLAS_NUM_THREADS=1`` first, as ``strutscope batch`` does. Not collected by pytest; nothing runs at
import time. The older ``engine/design/mcr.py`` is read with ``git show COMMIT:engine/design/mcr.py`` and
loaded as a module of its own (it imports only numpy and engine.validate), so both codes solve the same
problems with the same numpy.

Problems (invented): the member of ``tests.benchmarks.ltb_speed`` (HEB 200, S355, 5 m, 8 kN/m on the top
flange, end couples, its 401-station first-order diagram with shear), solved as the LTB check does
(``critical_moment`` at N = 0, converged, and ``HeldAxial.at`` at 400 kN on that mesh pair: with the same
samples at every call, as a member's trial forces often share its diagram, and with a new diagram at every
call, alternating between two, which the kept coupling of the samples cannot serve), and the three
problems of ``tests.benchmarks.mcr_speed`` (uniform moment, UDL on the top flange, central point load).
Timed by CPU time of the process in alternating blocks (the machine is shared); prints the median block
times, the median of the paired ratios before/after, and the largest relative difference of M_cr.
"""

from __future__ import annotations

import importlib.util
import itertools
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

from engine.design import mcr
from tests.benchmarks import ltb_speed, mcr_speed

ROUNDS, BLOCK = 15, 20


def _old_module(commit: str):
    text = subprocess.run(
        ["git", "show", f"{commit}:engine/design/mcr.py"], check=True, capture_output=True, text=True
    ).stdout
    path = Path(tempfile.mkdtemp()) / "mcr_before.py"
    path.write_text(text, encoding="utf-8")
    spec = importlib.util.spec_from_file_location("mcr_before", path)
    module = importlib.util.module_from_spec(spec)
    sys.modules[spec.name] = module
    spec.loader.exec_module(module)
    return module


def _problems(module):
    """name -> a function of no arguments returning M_cr, for ``module``."""
    case, result, first, minor = ltb_speed._member()
    E, G = result.material.E, result.material.G
    common = dict(
        EI_z=E * minor.I,
        GI_t=G * result.ltb.I_t,
        EI_w=E * result.ltb.I_w,
        length=case.length,
        i0_squared=(result.section.I + minor.I) / result.section.A,
        loads=[{"kind": "uniform", "q": 8e3, "height": 0.1}],
    )
    x, m, v = first.x, first.moment, first.shear
    pair = module.critical_moment(x, m, V=v, scale_axial=False, **common).elements
    family = module.HeldAxial(
        x, m, V=v, mesh_pair=pair, lateral_ends=("fork", "fork"), warping_ends=("free", "free"), **common
    )
    turns = itertools.cycle([(m, v), (m * (1 + 1e-9), v * (1 + 1e-9))])  # a new diagram at every call

    def fresh():
        ms, vs = next(turns)
        return family.at(4e5, x, ms, vs).M_cr

    out = {
        "member, N = 0": lambda: module.critical_moment(x, m, V=v, scale_axial=False, **common).M_cr,
        "member, HeldAxial.at": lambda: family.at(4e5, x, m, v).M_cr,
        "  the same, new diagram": fresh,
    }
    for name, (xs, ms, loads) in mcr_speed.CASES.items():
        kw = dict(
            EI_z=mcr_speed.EI_Z, GI_t=mcr_speed.GI_T, EI_w=mcr_speed.EI_W, length=mcr_speed.L, loads=loads
        )
        out[name] = lambda xs=xs, ms=ms, kw=kw: module.critical_moment(xs, ms, **kw).M_cr
    return out


def _block(function) -> float:
    t0 = time.process_time()
    for _ in range(BLOCK):
        function()
    return (time.process_time() - t0) / BLOCK


def _paired(first, second) -> tuple[dict, list]:
    """Block times of the two functions, alternating which goes first, and the paired ratios first/second."""
    pairs = []
    for i in range(ROUNDS):
        if i % 2:
            b = _block(first)
            pairs.append((b, _block(second)))
        else:
            a = _block(second)
            pairs.append((_block(first), a))
    times = {"before": [p[0] for p in pairs], "after": [p[1] for p in pairs]}
    return times, [p[0] / p[1] for p in pairs]


def main(argv: list[str]) -> None:
    """Print, per problem, the time per call before and after and their paired ratio."""
    commit = argv[0] if argv else "be758ea"
    before, after = _problems(_old_module(commit)), _problems(mcr)
    for name in after:
        difference = abs(after[name]() / before[name]() - 1.0)
        times, ratios = _paired(before[name], after[name])
        print(
            f"{name:22s} before {statistics.median(times['before']) * 1e3:6.3f} ms  after "
            f"{statistics.median(times['after']) * 1e3:6.3f} ms  "
            f"before/after {statistics.median(ratios):5.2f}x "
            f"(blocks {min(ratios):4.2f}-{max(ratios):4.2f})  |ΔM_cr|/M_cr {difference:.1e}"
        )


if __name__ == "__main__":
    main(sys.argv[1:])
