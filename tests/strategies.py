"""Shared hypothesis strategies for strutscope's property tests.

Every strategy here builds plain schema-1 case data as the contract writes it
(DEVELOPERS.md, "Conventions"), ready for ``engine.Case.from_dict``. Nothing here imports the
engine, so the strategies stay usable while the engine changes.

The axial force is left at zero on purpose. A strategy cannot know the first critical load before the case
is solved, and soft springs put it far below any bound written in EI and L alone. Tests therefore call
``engine.critical_loads(case)`` and draw the axial force as a fraction of ``P_cr1`` with
:func:`axial_fractions` (see :func:`with_axial_force`).

Units are SI throughout: [m], [N], [N·m], [N/m], [N·m²], [N·m/rad].
"""

from __future__ import annotations

import copy
import itertools
import math
from collections.abc import Mapping, Sequence

from hypothesis import strategies as st

__all__ = [
    "LENGTH_RANGE",
    "EI_RANGE",
    "LOAD_TYPES",
    "BOW_SHAPES",
    "RESTRAINTS",
    "NAMED_SUPPORTS",
    "STABLE_PATTERNS",
    "STABLE_NAMED_PAIRS",
    "UNSTABLE_NAMED_PAIRS",
    "MIN_GAP",
    "is_stable_pattern",
    "log_uniform",
    "lengths",
    "flexural_rigidities",
    "end_support",
    "supports",
    "named_supports",
    "positions",
    "loads",
    "imperfections",
    "cases",
    "axial_fractions",
    "with_axial_force",
    "support_restraints",
]

#: Member lengths drawn by :func:`lengths` [m].
LENGTH_RANGE = (1.0, 20.0)
#: Flexural rigidities drawn by :func:`flexural_rigidities` [N·m²].
EI_RANGE = (1e5, 1e8)
#: Load types of schema 1.
LOAD_TYPES = ("uniform", "linear", "point", "couple")
#: Initial bow shapes of schema 1.
BOW_SHAPES = ("none", "sine", "parabola", "sway", "mode")
#: How one degree of freedom at an end is held: "spring" means an elastic spring of positive stiffness.
RESTRAINTS = ("fixed", "free", "spring")
#: Named supports as (translation, rotation), from the contract.
NAMED_SUPPORTS = {
    "pinned": ("fixed", "free"),
    "fixed": ("fixed", "fixed"),
    "free": ("free", "free"),
    "guided": ("free", "fixed"),
}
#: Smallest distance between any two load positions or load boundaries, as a fraction of L [-].
MIN_GAP = 1e-3

# Springs are drawn as dimensionless stiffnesses, k_t L³/EI and k_r L/EI, so that "soft" and "stiff" mean the
# same for every length and EI. The range runs from nearly free to nearly rigid without making the end
# conditions so stiff that double precision, rather than the engine, decides the answer.
_SPRING_RANGE = (1e-2, 1e6)


def is_stable_pattern(left: Sequence[str], right: Sequence[str]) -> bool:
    """Return whether a pair of ends, each (translation, rotation) in :data:`RESTRAINTS`, has no mechanism.

    A rigid motion of the member is ``w = a + b x`` with no bending. A restrained left translation stops
    ``a``, a restrained rotation at either end stops ``b``, and a restrained right translation stops
    ``a + b L``. The pair is stable when at least two of these three independent restraints are present
    (a positive spring restrains as a fixed end does). Derived from the end conditions in conventions.md;
    common practice, no source.
    """
    held = lambda kind: kind != "free"  # noqa: E731
    restraints = [held(left[0]), held(left[1]) or held(right[1]), held(right[0])]
    return sum(restraints) >= 2


#: Every stable pair of end patterns, each ((translation, rotation) left, (translation, rotation) right).
STABLE_PATTERNS = tuple(
    (left, right)
    for left in itertools.product(RESTRAINTS, RESTRAINTS)
    for right in itertools.product(RESTRAINTS, RESTRAINTS)
    if is_stable_pattern(left, right)
)

_PATTERN_NAMES = {pattern: name for name, pattern in NAMED_SUPPORTS.items()}

#: Stable pairs of named supports (left, right).
STABLE_NAMED_PAIRS = tuple(
    (_PATTERN_NAMES[left], _PATTERN_NAMES[right])
    for left, right in STABLE_PATTERNS
    if left in _PATTERN_NAMES and right in _PATTERN_NAMES
)
#: Pairs of named supports that form a mechanism (left, right).
UNSTABLE_NAMED_PAIRS = tuple(
    (a, b) for a in NAMED_SUPPORTS for b in NAMED_SUPPORTS if (a, b) not in STABLE_NAMED_PAIRS
)


def support_restraints(spec) -> tuple:
    """Return (translation, rotation) of a support given by name or as a translation/rotation mapping."""
    if isinstance(spec, str):
        return NAMED_SUPPORTS[spec]
    return (spec["translation"], spec["rotation"])


def log_uniform(low: float, high: float) -> st.SearchStrategy[float]:
    """Floats spread evenly in log10 between ``low`` and ``high`` (both > 0)."""
    return st.floats(math.log10(low), math.log10(high)).map(lambda e: min(max(10.0**e, low), high))


def lengths() -> st.SearchStrategy[float]:
    """Member lengths in :data:`LENGTH_RANGE` [m]."""
    return st.floats(*LENGTH_RANGE, allow_nan=False, allow_infinity=False)


def flexural_rigidities() -> st.SearchStrategy[float]:
    """Flexural rigidities EI in :data:`EI_RANGE` [N·m²], spread in log10."""
    return log_uniform(*EI_RANGE)


@st.composite
def end_support(draw, pattern: Sequence[str], length: float, EI: float, *, allow_names: bool = True):
    """One end in schema-1 form for a (translation, rotation) pattern of :data:`RESTRAINTS`.

    "spring" becomes a positive stiffness: ``k_t = κ EI/L³`` [N/m] and ``k_r = κ EI/L`` [N·m/rad] with κ
    log-uniform in 1e-2..1e6. A pattern without springs is written by name or, just as validly, as the
    equivalent translation/rotation mapping.
    """
    translation, rotation = pattern
    if translation == "spring":
        translation = draw(log_uniform(*_SPRING_RANGE)) * EI / length**3
    if rotation == "spring":
        rotation = draw(log_uniform(*_SPRING_RANGE)) * EI / length
    pattern = (translation, rotation)
    if allow_names and pattern in _PATTERN_NAMES and draw(st.booleans()):
        return _PATTERN_NAMES[pattern]
    return {"translation": translation, "rotation": rotation}


@st.composite
def supports(draw, length: float, EI: float, *, springs: bool = True, patterns=None):
    """A stable (left, right) pair of supports in schema-1 form.

    With ``springs`` False only named supports are drawn. ``patterns`` narrows the choice to a subset of
    :data:`STABLE_PATTERNS`.
    """
    pool = STABLE_PATTERNS if patterns is None else tuple(patterns)
    if not springs:
        pool = tuple(p for p in pool if "spring" not in p[0] + p[1])
    left, right = draw(st.sampled_from(pool))
    return draw(end_support(left, length, EI)), draw(end_support(right, length, EI))


def named_supports() -> st.SearchStrategy[tuple]:
    """A stable (left, right) pair of named supports."""
    return st.sampled_from(STABLE_NAMED_PAIRS)


# Positions are drawn in slots of width 3·MIN_GAP. A position lies in [1, 2]·MIN_GAP inside its slot, so two
# positions are at least MIN_GAP apart, the first is at least MIN_GAP from x = 0 and the last at least
# 2·MIN_GAP from x = L, which leaves room for a load placed exactly on an end.
_SLOT = 3 * MIN_GAP
_SLOTS = int(1.0 / _SLOT)


@st.composite
def positions(draw, count: int):
    """``count`` distinct fractions of L [-], strictly inside the member, pairwise at least MIN_GAP apart.

    The fractions come back in draw order (not sorted), so each load's place is independent of the others.
    """
    slots = draw(st.lists(st.integers(0, _SLOTS - 1), min_size=count, max_size=count, unique=True))
    return [(slot + draw(st.floats(1.0, 2.0)) / 3.0) * _SLOT for slot in slots]


def _signed_magnitude() -> st.SearchStrategy[float]:
    """A load factor in ±[0.1, 1], never zero so that every drawn load acts [-]."""
    return st.tuples(st.floats(0.1, 1.0), st.sampled_from((-1.0, 1.0))).map(lambda t: t[0] * t[1])


@st.composite
def loads(
    draw,
    length: float,
    *,
    types: Sequence[str] = LOAD_TYPES,
    min_size: int = 1,
    max_size: int = 4,
    partial: bool | None = None,
    allow_ends: bool = False,
    scale: float = 1e4,
):
    """A list of schema-1 load mappings on a member of ``length`` [m].

    Distributed loads run over the whole member or over a part of it (``partial`` forces the choice).
    Magnitudes: ``q`` up to ``scale`` [N/m], a point load up to ``scale·L`` [N] and a couple up to
    ``scale·L²`` [N·m], with either sign. Every position and span boundary is inside the member and at least
    MIN_GAP·L from every other. With ``allow_ends``, a point load or couple may also sit exactly on an end
    (at most one load per end).
    """
    kinds = draw(st.lists(st.sampled_from(tuple(types)), min_size=min_size, max_size=max_size))
    spans = []
    for kind in kinds:
        if kind in ("uniform", "linear"):
            spans.append(draw(st.booleans()) if partial is None else partial)
        else:
            spans.append(None)
    needed = sum(2 if s else 1 if s is None else 0 for s in spans)
    fractions = iter(draw(positions(needed)))
    free_ends = [0.0, 1.0]
    result = []
    for kind, span in zip(kinds, spans, strict=True):
        if kind in ("point", "couple"):
            where = next(fractions)
            if allow_ends and free_ends and draw(st.integers(0, 3)) == 0:
                where = free_ends.pop(draw(st.integers(0, len(free_ends) - 1)))
            x = length * where
            if kind == "point":
                result.append({"type": "point", "P": draw(_signed_magnitude()) * scale * length, "x": x})
            else:
                result.append({"type": "couple", "C": draw(_signed_magnitude()) * scale * length**2, "x": x})
            continue
        load = {"type": kind}
        if kind == "uniform":
            load["q"] = draw(_signed_magnitude()) * scale
        else:
            load["q_start"] = draw(st.floats(-1.0, 1.0)) * scale
            load["q_end"] = draw(_signed_magnitude()) * scale
            if draw(st.booleans()):
                load["q_start"], load["q_end"] = load["q_end"], load["q_start"]
        if span:
            a, b = sorted((next(fractions), next(fractions)))
            load["start"], load["end"] = length * a, length * b
        result.append(load)
    return result


@st.composite
def imperfections(draw, length: float, *, shapes: Sequence[str] = BOW_SHAPES, max_ratio: float = 1 / 200):
    """A schema-1 imperfection mapping: a bow shape with amplitude up to ``max_ratio·L`` [m], either sign."""
    shape = draw(st.sampled_from(tuple(shapes)))
    if shape == "none":
        return {"shape": "none", "amplitude": 0.0}
    amplitude = draw(_signed_magnitude()) * max_ratio * length
    return {"shape": shape, "amplitude": amplitude}


@st.composite
def cases(
    draw,
    *,
    load_types: Sequence[str] = LOAD_TYPES,
    bow_shapes: Sequence[str] = BOW_SHAPES,
    springs: bool = True,
    patterns=None,
    min_loads: int = 1,
    max_loads: int = 4,
    allow_end_loads: bool = False,
    partial: bool | None = None,
):
    """A whole schema-1 case mapping with stable supports, loads and a bow; ``axial_force`` is 0.

    Set the axial force from the case's own first critical load with :func:`with_axial_force`.
    """
    length = draw(lengths())
    EI = draw(flexural_rigidities())
    left, right = draw(supports(length, EI, springs=springs, patterns=patterns))
    case_loads = draw(
        loads(
            length,
            types=load_types,
            min_size=min_loads,
            max_size=max_loads,
            allow_ends=allow_end_loads,
            partial=partial,
        )
    )
    return {
        "schema": 1,
        "title": "Generated case (invented)",
        "length": length,
        "EI": EI,
        "supports": {"left": left, "right": right},
        "axial_force": 0.0,
        "loads": case_loads,
        "imperfection": draw(imperfections(length, shapes=bow_shapes)),
    }


@st.composite
def two_plane_cases(draw, **options):
    """A whole case mapping (:func:`cases`) with a ``second_plane``: its own stable supports, loads, bow and
    EI (the case gives EI, so the second plane must too); ``axial_force`` is 0."""
    case = draw(cases(**options))
    length = case["length"]
    EI = draw(flexural_rigidities())
    left, right = draw(supports(length, EI, springs=options.get("springs", True)))
    case["second_plane"] = {
        "supports": {"left": left, "right": right},
        "loads": draw(loads(length, min_size=0, max_size=3)),
        "imperfection": draw(imperfections(length)),
        "EI": EI,
    }
    return case


def axial_fractions(low: float = -5.0, high: float = 0.95) -> st.SearchStrategy[float]:
    """Axial force as a fraction of the first critical load P/P_cr1 [-] in [low, high], zero included.

    Negative is tension. The default stays 5 % below the first critical load.
    """
    return st.one_of(st.just(0.0), st.floats(low, high, allow_nan=False))


def with_axial_force(case: Mapping, axial_force: float) -> dict:
    """Return a deep copy of a case mapping with ``axial_force`` [N] (compression positive) set."""
    result = copy.deepcopy(dict(case))
    result["axial_force"] = float(axial_force)
    return result
