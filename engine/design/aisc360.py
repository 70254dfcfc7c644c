r"""AISC 360-16: flexural buckling strength (§E3) and the axial force–moment interaction (§H1.1).

Sources: ANSI/AISC 360-16, *Specification for Structural Steel Buildings*: eqs. (E3-1) to (E3-4), the
resistance and safety factors of §E1 and §F1, and eqs. (H1-1a)/(H1-1b). Equation numbers and factor values
from memory, to be checked against a copy of the Specification.

The elastic buckling stress is taken from the member's own critical load, :math:`F_e = P_{cr}/A_g`, so that
supports, springs and restraints count as the exact analysis finds them; for a pin-ended strut this is
eq. (E3-4), :math:`F_e = \pi^2 E/(L_c/r)^2`. The branch of eq. (E3-2)/(E3-3) is chosen by
:math:`F_y/F_e \le 2.25`, the Specification's equivalent of :math:`L_c/r \le 4.71\sqrt{E/F_y}`.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from types import MappingProxyType

__all__ = [
    "ELASTIC_LIMIT",
    "METHODS",
    "RESISTANCE",
    "Interaction",
    "E7_FACTORS",
    "critical_stress",
    "effective_width",
    "interaction",
    "round_hss_area",
    "stiffness_reduction",
    "tau_b",
]

#: :math:`F_y/F_e` above which the elastic branch (E3-3) applies: 2.25, that is
#: :math:`L_c/r > 4.71\sqrt{E/F_y}`.
ELASTIC_LIMIT = 2.25

#: Design methods: LRFD (resistance factor φ) and ASD (safety factor Ω).
METHODS: tuple[str, ...] = ("LRFD", "ASD")

#: Resistance factors φ (LRFD) and safety factors Ω (ASD) for compression (§E1) and flexure (§F1).
RESISTANCE = MappingProxyType(
    {
        ("compression", "LRFD"): 0.90,
        ("compression", "ASD"): 1.67,
        ("flexure", "LRFD"): 0.90,
        ("flexure", "ASD"): 1.67,
    }
)


def critical_stress(Fy: float, Fe: float) -> float:
    r"""Flexural buckling stress :math:`F_{cr}` [Pa], AISC 360-16 eqs. (E3-2) and (E3-3).

    .. math::

        F_{cr} = 0.658^{F_y/F_e} F_y \ (F_y/F_e \le 2.25), \qquad F_{cr} = 0.877 F_e \ \text{otherwise}

    Parameters
    ----------
    Fy : float
        Specified minimum yield stress [Pa], > 0.
    Fe : float
        Elastic buckling stress [Pa], > 0 (may be infinite: no buckling, :math:`F_{cr} = F_y`).

    Examples
    --------
    >>> round(critical_stress(345e6, 345e6) / 345e6, 4)  # F_y/F_e = 1
    0.658
    """
    if not (Fy > 0 and Fe > 0) or math.isnan(Fy) or math.isnan(Fe):
        raise ValueError(f"Fy and Fe must be positive, got Fy = {Fy!r} Pa and Fe = {Fe!r} Pa")
    ratio = Fy / Fe
    if ratio <= ELASTIC_LIMIT:
        return 0.658**ratio * Fy
    return 0.877 * Fe


@dataclass(frozen=True)
class Interaction:
    """The left-hand side of eq. (H1-1a) or (H1-1b) and which one applies.

    Attributes
    ----------
    utilization : float
        The left-hand side [-]: at most 1 passes.
    equation : str
        ``"H1-1a"`` when :math:`P_r/P_c \\ge 0.2`, else ``"H1-1b"``.
    axial : float
        :math:`P_r/P_c` [-].
    bending : float
        :math:`M_{rx}/M_{cx} + M_{ry}/M_{cy}` [-].
    """

    utilization: float
    equation: str
    axial: float
    bending: float


def interaction(Pr: float, Pc: float, Mrx: float, Mcx: float, Mry: float = 0.0, Mcy: float = math.inf):
    r"""Combined compression and bending of a doubly symmetric member, AISC 360-16 §H1.1.

    .. math::

        \frac{P_r}{P_c} \ge 0.2:\ \frac{P_r}{P_c} + \frac{8}{9}\left(\frac{M_{rx}}{M_{cx}} +
        \frac{M_{ry}}{M_{cy}}\right) \le 1 \ \text{(H1-1a)}, \qquad
        \frac{P_r}{P_c} < 0.2:\ \frac{P_r}{2P_c} + \frac{M_{rx}}{M_{cx}} + \frac{M_{ry}}{M_{cy}} \le 1
        \ \text{(H1-1b)}

    Forces in N and moments in N·m, all magnitudes (the signs are dropped); the available strengths
    :math:`P_c, M_{cx}, M_{cy}` already include φ or Ω. The two branches meet at :math:`P_r/P_c = 0.2`,
    :math:`\sum M_r/M_c = 0.9`, where both equal 1.

    Examples
    --------
    >>> round(interaction(0.2, 1.0, 0.9, 1.0).utilization, 12)
    1.0
    """
    for name, value in (("Pc", Pc), ("Mcx", Mcx), ("Mcy", Mcy)):
        if not value > 0:
            raise ValueError(f"{name} must be positive, got {value!r}")
    axial = abs(Pr) / Pc
    bending = abs(Mrx) / Mcx + abs(Mry) / Mcy
    if axial >= 0.2:
        return Interaction(axial + 8.0 / 9.0 * bending, "H1-1a", axial, bending)
    return Interaction(axial / 2.0 + bending, "H1-1b", axial, bending)


#: AISC 360-16 Table E7.1 (from memory): (c1, c2) of the effective width, eq. (E7-3), for stiffened elements
#: except the walls of rectangular HSS, the walls of rectangular HSS, and all other (unstiffened) elements.
#: c2 = (1 − √(1 − 4c1))/(2c1), so that b_e = b exactly at the limit of eq. (E7-2).
E7_FACTORS = {"stiffened": (0.18, 1.31), "hss wall": (0.20, 1.38), "unstiffened": (0.22, 1.49)}


def effective_width(b: float, ratio: float, limit: float, kind: str, Fy: float, Fcr: float) -> float:
    r"""The effective width :math:`b_e` [m] of an element of width ``b`` and slenderness ``ratio`` = λ, with
    the limit λ_r of Table B4.1a, under the member's critical stress ``Fcr`` [Pa], AISC 360-16 §E7.1
    (from memory):

    .. math::

        b_e = b \ (\lambda \le \lambda_r\sqrt{F_y/F_{cr}}), \qquad
        b_e = b\left(1 - c_1\sqrt{F_{el}/F_{cr}}\right)\sqrt{F_{el}/F_{cr}}, \quad
        F_{el} = \left(c_2\frac{\lambda_r}{\lambda}\right)^2 F_y \ \text{otherwise}

    with :math:`c_1, c_2` of :data:`E7_FACTORS` for ``kind``.

    >>> round(effective_width(0.3, 60.0, 36.0, "stiffened", 345e6, 345e6) / 0.3, 4)
    0.6748
    """
    if ratio <= limit * math.sqrt(Fy / Fcr):
        return b
    c1, c2 = E7_FACTORS[kind]
    root = math.sqrt((c2 * limit / ratio) ** 2 * Fy / Fcr)
    return min(b, b * (1.0 - c1 * root) * root)


def round_hss_area(A_g: float, D_over_t: float, E: float, Fy: float) -> float:
    r"""The effective area of a round HSS, AISC 360-16 eq. (E7-6)/(E7-7) (from memory): :math:`A_g` for
    :math:`D/t \le 0.11E/F_y`, :math:`\left(\frac{0.038E}{F_y(D/t)} + \frac{2}{3}\right)A_g` up to
    :math:`D/t = 0.45E/F_y` (beyond, the Specification does not apply: NaN)."""
    if D_over_t <= 0.11 * E / Fy:
        return A_g
    if D_over_t >= 0.45 * E / Fy:
        return math.nan
    return (0.038 * E / (Fy * D_over_t) + 2.0 / 3.0) * A_g


#: AISC 360-16 §C2.3(a): every stiffness that contributes to stability is taken at 0.8 × (from memory).
DIRECT_STIFFNESS = 0.8


def tau_b(ratio: float) -> float:
    r"""AISC 360-16 §C2.3(b) eqs. (C2-2a)/(C2-2b) (from memory): the further reduction :math:`\tau_b` of the
    flexural stiffness, ``ratio`` = :math:`\alpha P_r/P_{ns}` (α = 1.0 LRFD, 1.6 ASD): 1 up to 0.5, then
    :math:`4\,r(1 - r)`; 0 at or above 1 (no stiffness left: the member cannot carry the force)."""
    if ratio <= 0.5:
        return 1.0
    if ratio >= 1.0:
        return 0.0
    return 4.0 * ratio * (1.0 - ratio)


def stiffness_reduction(ratio: float) -> float:
    """The direct analysis method's factor on EI, 0.8·τ_b (§C2.3), at ``ratio`` = αP_r/P_ns."""
    return DIRECT_STIFFNESS * tau_b(ratio)
