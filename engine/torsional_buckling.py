r"""Torsional buckling under the axial force of a doubly symmetric open section (EN 1993-1-1 §6.3.1.4, AISC
360-16 §E4).

A compressed I or H section can buckle by twisting about its shear centre, which for a doubly symmetric
section is its centroid, so the mode is purely torsional (N_cr,TF = N_cr,T). Its elastic critical load
(Timoshenko & Gere 1961 ch. 5, from memory; AISC 360-16 eq. (E4-2) for doubly symmetric members, from
memory):

.. math::

    N_{cr,T} = \frac{1}{i_0^2}\left(G I_t + \frac{\pi^2 E I_w}{L_T^2}\right), \qquad
    i_0^2 = \frac{I_y + I_z}{A}

with :math:`L_T` the torsional buckling length of the weakest stretch between points where the twist is
held: the ends where a fork holds it (every supported end; not a free end, nor an end left free laterally by
the lateral-torsional buckling check, :func:`engine.ltb_route.lateral_sides`) and the restraints inside the
member with ``twist`` fixed. A torsional spring is not counted (the longer length: the safe side).
:math:`L_T = k s` with k = 1, 0.7 or 0.5 as the warping is free at both ends of the stretch, fixed at one or
at both (``check.ltb.warping_ends`` at the member's ends, free by default; free at a restraint inside): the
warping term is the flexural buckling equation again, EI_w φ'''' for EI w'''' (k = 0.7 for 0.699). A
stretch that ends at a free end is a torsional cantilever: k = 2 where its root's warping is fixed, and no
warping stiffness at all (N_cr,T = G I_t / i_0², L_T = ∞) where it is free.
The torsion constants are divided by the factors of the lateral-torsional check
(:data:`engine.design.ltb_member.TORSION_FACTORS`), as there.

It matters where the member is held against flexural buckling about its minor axis but not against twist
(restraints at a flange or at the shear centre without ``twist``): N_cr,z then rises above N_cr,T. The
routes count it (:mod:`engine.member_routes`): EN 1993-1-1 §6.3.1.1 eq. (6.46) with χ_T from eq. (6.49)
for :math:`\bar\lambda_T = \sqrt{A f_y / N_{cr,T}}` (A_eff for class 4) and the curve for the z–z axis
(§6.3.1.4(1), from memory), a term of the second-order and the en-member routes (eqs. (6.61)/(6.62) keep
the flexural χ_z, as EN 1993-1-1 writes them); AISC 360-16 takes the lower of §E3 and §E4 in P_n, so in
eq. (H1-1). Mono- and non-symmetric sections (flexural-torsional buckling) are not covered.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

from engine import codes
from engine.classification import area_in_compression
from engine.design.en_member import curve_of
from engine.design.ltb_member import TORSION_FACTORS

__all__ = ["SOURCE", "TERM", "Torsional", "critical_load", "held_points", "resistance"]

#: The routes' term.
TERM = "torsional-buckling"

SOURCE = (
    "EN 1993-1-1:2005 §6.3.1.4 and §6.3.1.1–6.3.1.2 eqs. (6.46)–(6.49), curve about z–z; N_cr,T of "
    "Timoshenko & Gere (1961) ch. 5; AISC 360-16 §E4 (all from memory)"
)

_SHAPES = ("rolled_i", "welded_i", "custom")


@dataclass(frozen=True, kw_only=True)
class Torsional:
    """The torsional buckling load of the member and, with :func:`resistance`, its check.

    ``N_cr`` [N], ``length`` L_T [m] (twice the stretch at a free end), ``i0_squared`` [m²]; after
    :func:`resistance`: ``lambda_bar``, ``chi``, ``curve``, ``N_b_Rd`` [N] (χ_T·A·f_y/γ_M1, A_eff for
    class 4)."""

    N_cr: float
    length: float
    i0_squared: float
    GI_t: float = math.nan  # G·I_t and E·I_w [N·m², N·m⁴] the member takes (engine.torsional_terms)
    EI_w: float = math.nan
    lambda_bar: float = math.nan
    chi: float = math.nan
    curve: str = ""
    N_b_Rd: float = math.nan


def held_points(case, free_ends) -> list:
    """The x [m] where the twist is held: the supported ends not in ``free_ends`` and the restraints with
    ``twist`` fixed, in order."""
    xs = [x for side, x in (("left", 0.0), ("right", case.length)) if side not in free_ends]
    xs += [float(r.x) for r in case.restraints if r.twist == "fixed"]
    return sorted(set(xs))


def _lengths(case, free_ends) -> list:
    """L_T [m] of every stretch between held points (see the module): k·s with k = 1, 0.7 or 0.5 for warping
    free at both of its ends, fixed at one, fixed at both; at a free end 2s (its root's warping fixed) or
    inf (free: no warping stiffness)."""
    held = held_points(case, free_ends)
    if not held:  # nothing holds the twist
        return []
    warping = dict(zip((0.0, case.length), case.check.ltb.warping_ends, strict=True))
    fixed = [warping.get(x) == "fixed" for x in held]
    out = [(1.0, 0.7, 0.5)[fixed[i] + fixed[i + 1]] * (held[i + 1] - held[i]) for i in range(len(held) - 1)]
    for end, i in (("left", 0), ("right", -1)):
        stretch = held[0] if end == "left" else case.length - held[-1]
        if end in free_ends and stretch > 0.0:
            out.append(2.0 * stretch if fixed[i] else math.inf)
    return out


def critical_load(case, section_y, section_z, material, free_ends=()) -> Torsional | None:
    """N_cr,T of the member (see the module), or None where it does not apply: not a doubly symmetric open
    I/H (or custom) section with known torsion constants, not steel, nothing holds the twist, or a member
    bent about its major axis that the case states restrained out of its plane (``out_of_plane.restrained``:
    held along its length, so that it neither bends nor twists out of plane)."""
    sy = section_y
    torsion = getattr(sy, "torsion", None)
    if (
        material.kind != "steel"
        or sy.shape not in _SHAPES
        or not (sy.open_section and sy.doubly_symmetric)
        or torsion is None
        or torsion.I_t is None
        or torsion.I_w is None
    ):
        return None
    if case.out_of_plane is not None and case.out_of_plane.restrained and case.axis == "major":
        return None
    stretches = _lengths(case, tuple(free_ends))
    if not stretches:
        return None
    factor = TORSION_FACTORS.get(sy.shape, 1.0)
    I_t, I_w = torsion.I_t / factor, torsion.I_w / factor
    G = material.G if material.G is not None else material.E / 2.6
    i0_sq = (sy.I + section_z.I) / sy.A
    L_T = max(stretches)
    warping = 0.0 if math.isinf(L_T) else math.pi**2 * material.E * I_w / L_T**2
    GI_t, EI_w = G * I_t, material.E * I_w
    return Torsional(N_cr=(GI_t + warping) / i0_sq, length=L_T, i0_squared=i0_sq, GI_t=GI_t, EI_w=EI_w)


def resistance(found: Torsional, section_z, material, gamma_M1: float, curve=None, area=None) -> Torsional:
    """``found`` with χ_T and N_b,T,Rd (EN 1993-1-1 eqs. (6.47)–(6.49), the curve about z–z; ``curve`` and
    ``area`` where the section's own are not known, as for a custom section)."""
    area = area_in_compression(section_z, material) if area is None else area
    curve = curve_of(section_z, material)[0] if curve is None else curve
    lam = codes.slenderness(area, material.fy, found.N_cr)
    chi = codes.reduction_factor(lam, curve)
    N_b_Rd = chi * area * material.fy / gamma_M1
    return dataclasses.replace(found, lambda_bar=lam, chi=chi, curve=curve, N_b_Rd=N_b_Rd)
