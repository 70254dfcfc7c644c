"""strutscope's engine: the exact second-order analysis of one member under axial force and bending.

Pure numerics (numpy and the standard library). SI units throughout: m, N, N·m, Pa. See DEVELOPERS.md
("Conventions") for signs and the case-file schema, and the README for the method and its references. This
module is a façade: it re-exports the public names of the layers below it (DEVELOPERS.md, "How the engine is
put together").
"""

from engine import envelope, prepared, solver
from engine.capacity import Capacity, capacity, capacity_of, lowest_capacity, ultimate_cases
from engine.case import (
    Case,
    CoupleLoad,
    EndSupport,
    Imperfection,
    LinearLoad,
    PointLoad,
    Spec,
    UniformLoad,
)
from engine.case_files import load_case, save_case
from engine.cautions import Caution
from engine.checks import CheckSettings, MemberCheck
from engine.design import mcr
from engine.envelope import solve
from engine.errors import CaseError
from engine.member import critical_loads
from engine.results import (
    Amplification,
    Approximation,
    Equilibrium,
    Governing,
    Peak,
    Reactions,
    Result,
    SweepResult,
)
from engine.solver.buckling import Buckling
from engine.sweeps import sweep

__all__ = [
    "Amplification",
    "Approximation",
    "Buckling",
    "Capacity",
    "Case",
    "CaseError",
    "Caution",
    "CheckSettings",
    "CoupleLoad",
    "EndSupport",
    "Equilibrium",
    "Governing",
    "Imperfection",
    "LinearLoad",
    "MemberCheck",
    "Peak",
    "PointLoad",
    "Reactions",
    "Result",
    "Spec",
    "SweepResult",
    "UniformLoad",
    "capacity",
    "capacity_of",
    "clear_caches",
    "critical_loads",
    "load_case",
    "lowest_capacity",
    "save_case",
    "solve",
    "sweep",
    "ultimate_cases",
]


def clear_caches() -> None:
    """Forget cached critical loads and prepared cases, so a benchmark can time the uncached path."""
    solver.buckling.clear_cache()
    solver.restrained.clear_cache()
    prepared.clear_cache()
    envelope.clear_cache()
    mcr.clear_cache()
