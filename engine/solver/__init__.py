"""The solver layer: the exact second-order solution of one member, knowing nothing of codes or design.

- :mod:`engine.solver.functions`: the beam-column functions φ₀…φ₅ (series and closed forms);
- :mod:`engine.solver.supports`: end conditions as rows in (w, w', M, T), and the mechanism check;
- :mod:`engine.solver.buckling`: critical loads, modes and the effective length factor of a member;
- :mod:`engine.solver.model`: the member model (segments, loads, basis functions), independent of P;
- :mod:`engine.solver.table`: the stations' rows as polynomials in P (the single-force fast path);
- :mod:`engine.solver.batch`: the global system for many axial forces, and the typed :class:`State`;
- :mod:`engine.solver.series`, :mod:`engine.solver.peaks`: stations and peaks between them.

It imports nothing of the engine above it (the case, the sections, the codes, the checks): a model is built
from any object with ``length``, ``EI``, ``left``, ``right`` and ``loads``, and a bow from
:mod:`engine.imperfections`.
"""

from engine.solver.batch import Batch, State
from engine.solver.buckling import Buckling
from engine.solver.model import Model, Points
from engine.solver.peaks import base_stations, refine_peaks, strongest_tension_kappa

__all__ = [
    "Batch",
    "Buckling",
    "Model",
    "Points",
    "State",
    "base_stations",
    "refine_peaks",
    "strongest_tension_kappa",
]
