r"""The cross-section check of a two-plane case: N with M_y and M_z at every station of both planes.

A two-plane case (the case file's ``second_plane``) is solved as two uncoupled beam-columns, one per
bending plane. At every station of either plane, each plane's exact solution is evaluated there (both sides
of a node where a point load or couple acts), and the cross-section is checked with N, M_y and M_z together
(y: the major axis, z: the minor one):

- **elastic** (any section):
  :math:`|N|/(A f_c) + |M_y|/(W_{el,y} f_y) + |M_z|/(W_{el,z} f_y) \le 1/\gamma_{M0}`, the linear form of
  EN 1993-1-1 §6.2.1(7), eq. (6.2) (clause from memory), for steel
  :math:`\sigma = N/A + M_y/W_{el,y} + M_z/W_{el,z} \le f_y/\gamma_{M0}`, the two bending terms divided by
  :math:`1 - \rho` where the shear in either plane exceeds half its plastic resistance (§6.2.8, the larger
  :math:`\rho`, on the whole section as for the plastic check);
- **plastic**: EN 1993-1-1 §6.2.9.1(6) (from memory),
  :math:`(M_y/M_{N,y,Rd})^\alpha + (M_z/M_{N,z,Rd})^\beta \le 1`, with :math:`M_{N,y,Rd}` and
  :math:`M_{N,z,Rd}` of §6.2.9.1(5) (:func:`engine.codes.plastic_interaction`, the one-axis rules of the
  one-plane check) and

  - I/H: :math:`\alpha = 2`, :math:`\beta = 5n \ge 1`;
  - RHS: :math:`\alpha = \beta = 1.66/(1 - 1.13 n^2) \le 6`;
  - CHS (and the solid round bar): :math:`\alpha = \beta = 2`, EN 1993-1-1's value for a CHS (from memory);
    with the same :math:`M_N` about every axis it says :math:`\sqrt{M_y^2 + M_z^2} \le M_N`, exact for an
    axisymmetric section given the one-axis rule [derived];
  - solid rectangle: :math:`\alpha = \beta = 1`, the straight line between the two one-axis points
    :math:`M_{N} = M_{pl}(1 - n^2)`, which are exact; the plastic interaction surface is convex, so the line
    lies inside it and is safe [derived] (EN 1993-1-1 gives no exponents for it).

  The utilisation reported is the factor :math:`s` on both moments (at the same N) that brings the left side
  to 1, :math:`(M_y/(s M_{N,y,Rd}))^\alpha + (M_z/(s M_{N,z,Rd}))^\beta = 1`, or :math:`n` if larger: with
  :math:`M_z = 0` it is :math:`M_y/M_{N,y,Rd}`, the one-plane check's own. Where the shear in either plane
  exceeds half its plastic resistance, both plastic moments are reduced by :math:`(1 - \rho)` with the larger
  :math:`\rho` of §6.2.8 (applied to the whole section, conservatively, as the one-plane check does);
- **shear** in each plane: :math:`|V_z|/V_{pl,z,Rd}` and :math:`|V_y|/V_{pl,y,Rd}` with each plane's shear
  area, EN 1993-1-1 §6.2.6 eq. (6.18) (from memory);
- with an eq. (5.9) bow in either plane, the linear member check of that route with both moments,
  :math:`N/(N_{Rk}/\gamma_{M1}) + M_y/(M_{y,Rk}/\gamma_{M1}) + M_z/(M_{z,Rk}/\gamma_{M1}) \le 1`
  (a conservative sum; EN 1993-1-1 §5.3.2(11), from memory).

Not analysed: torsion and warping, the coupling of the planes through a mono- or non-symmetric section (every
section strutscope has is doubly symmetric; a custom one is refused), flexural–torsional and torsional
buckling, lateral-torsional buckling.
"""

from __future__ import annotations

import math

import numpy as np

from engine.checks import (
    BEYOND_CRITICAL_SOURCE,
    EQ_5_9_KIND,
    IN_PLANE_ELASTIC_KIND,
    IN_PLANE_ELASTIC_SOURCE,
    MemberCheck,
    method_used,
)
from engine.classification import compression_area, elastic_modulus, eq_5_9_modulus, worse_class
from engine.codes import plastic_interaction, shear_reduction
from engine.shear_area import axial_ratio, shear_area_kept
from engine.shear_buckling import shear_resistance
from engine.solver.model import Points

__all__ = [
    "ELASTIC_KIND",
    "PLASTIC_KIND",
    "check_biaxial",
    "exponents",
    "moment_factor",
    "pair_bound",
    "pair_check",
    "pair_stations",
    "plane_at",
    "worst_pair",
]

#: The kinds of the two-plane check.
ELASTIC_KIND = "elastic stress N–M_y–M_z"
PLASTIC_KIND = "plastic N–M_y–M_z"

_PLASTIC_SHAPES = ("rolled_i", "welded_i", "rhs", "chs", "rectangle", "round")
_SOURCES = {
    "elastic": "EN 1993-1-1:2005 §6.2.1(7), eq. (6.2), linear form, both axes; §6.2.8 (clauses from memory)",
    "plastic": "EN 1993-1-1:2005 §6.2.9.1(5)–(6) and §6.2.8 (clause numbers from memory)",
    "shear": "EN 1993-1-1:2005 §6.2.6, eq. (6.18), each plane with its shear area (from memory)",
    "eq-5.9": "EN 1993-1-1:2005 §5.3.2(11), eqs. (5.9)–(5.10), linear N–M_y–M_z with γ_M1 (from memory)",
}


def exponents(shape: str, n):
    r"""α and β of EN 1993-1-1 §6.2.9.1(6) for ``shape`` at :math:`n = N_{Ed}/N_{pl,Rd}` (arrays or floats).

    >>> exponents("rolled_i", 0.0), exponents("rolled_i", 0.5)
    ((2.0, 1.0), (2.0, 2.5))
    >>> round(exponents("rhs", 0.0)[0], 2), exponents("rhs", 0.95)[0]
    (1.66, 6.0)
    """
    n = np.abs(n)
    if shape in ("rolled_i", "welded_i"):
        return 2.0, np.maximum(5.0 * n, 1.0) if np.ndim(n) else max(5.0 * float(n), 1.0)
    if shape == "rhs":
        with np.errstate(divide="ignore"):
            gap = 1.0 - 1.13 * np.square(n)
            value = np.where(gap > 0.0, 1.66 / np.where(gap > 0.0, gap, 1.0), 6.0)
        value = np.minimum(value, 6.0)
        value = value if np.ndim(n) else float(value)
        return value, value
    if shape in ("chs", "round"):
        return 2.0, 2.0
    return 1.0, 1.0  # the solid rectangle: the straight line (safe by convexity)


def moment_factor(a, b, alpha, beta):
    r"""The factor s with :math:`(a/s)^\alpha + (b/s)^\beta = 1` (a, b >= 0; α, β >= 1), elementwise.

    With t = 1/s, :math:`g(t) = (a t)^\alpha + (b t)^\beta - 1` is convex and increasing; Newton's method from
    :math:`t_0 = 1/\max(a, b)`, where :math:`g \ge 0`, decreases monotonically to the root.

    >>> float(moment_factor(0.6, 0.0, 2.0, 1.0)), round(float(moment_factor(0.3, 0.4, 2.0, 2.0)), 12)
    (0.6, 0.5)
    """
    a, b, alpha, beta = np.broadcast_arrays(*(np.asarray(v, dtype=float) for v in (a, b, alpha, beta)))
    shape = a.shape
    a, b, alpha, beta = (v.ravel() for v in (a, b, alpha, beta))
    top = np.maximum(a, b)
    out = top.copy()
    both = (a > 0) & (b > 0) & np.isfinite(top)
    # Below 1e-300 the start 1/max(a, b) overflows (a member at an axial force of 2e-308 N, found by
    # hypothesis): there s lies between max(a, b) and max(a·2^(1/α), b·2^(1/β)), where each term is at most
    # 1/2, and the larger end is kept (on the safe side, and of rounding size).
    tiny = both & (top < 1e-300)
    if tiny.any():
        out[tiny] = np.maximum(a[tiny] * 2.0 ** (1.0 / alpha[tiny]), b[tiny] * 2.0 ** (1.0 / beta[tiny]))
        both &= ~tiny
    if both.any():
        a, b, alpha, beta = a[both], b[both], alpha[both], beta[both]
        t = 1.0 / top[both]
        for _ in range(60):
            ua, ub = (a * t) ** alpha, (b * t) ** beta
            g = ua + ub - 1.0
            step = g / ((alpha * ua + beta * ub) / t)
            t = t - step
            if np.all(np.abs(step) <= 1e-15 * t):
                break
        out[both] = 1.0 / t
    return out.reshape(shape)


def pair_stations(x1, x2, tol):
    """Pair the entries of two planes' station lists that cover the same positions.

    ``x1`` and ``x2`` are sorted (non-decreasing) and list the same positions (within ``tol``), each position
    once or, where a plane has a node with a jump, twice (left side first). Returns the indices ``(i1, i2)``
    of the combined list: at a position listed k1 and k2 times, max(k1, k2) entries, pairing the j-th entries
    (the last one repeated), so that left sides go with left sides.
    """
    x1, x2 = np.asarray(x1), np.asarray(x2)
    starts1 = np.concatenate([[0], np.nonzero(np.diff(x1) > tol)[0] + 1])
    starts2 = np.concatenate([[0], np.nonzero(np.diff(x2) > tol)[0] + 1])
    if starts1.size != starts2.size:  # not the same positions: pair each entry with its nearest (a fallback)
        near = np.clip(np.searchsorted(x2, x1), 1, x2.size - 1)
        near -= (x1 - x2[near - 1]) < (x2[near] - x1)
        return np.arange(x1.size), near
    count1 = np.diff(np.concatenate([starts1, [x1.size]]))
    count2 = np.diff(np.concatenate([starts2, [x2.size]]))
    many = np.maximum(count1, count2)
    first = np.repeat(np.cumsum(many) - many, many)
    k = np.arange(first.size) - first
    i1 = np.repeat(starts1, many) + np.minimum(k, np.repeat(count1, many) - 1)
    i2 = np.repeat(starts2, many) + np.minimum(k, np.repeat(count2, many) - 1)
    return i1, i2


def check_biaxial(
    *,
    x,
    axial_force,
    moment_y,
    moment_z,
    shear_z,
    shear_y,
    section_y,
    section_z,
    material,
    settings,
    section_class=None,
    eq_5_9: bool = False,
    beyond_critical: bool = False,
    service=None,
    axis: str = "major",
    axial_bending_only: bool = False,
    in_plane_bound: float | None = None,
    lowest_exponents: bool = False,
) -> MemberCheck | np.ndarray:
    """The two-plane cross-section check at every combined station.

    Parameters
    ----------
    x : ndarray
        The combined stations [m] (:func:`pair_stations`).
    axial_force : float
        N [N], compression positive (|N| is checked).
    moment_y, moment_z : ndarray
        M_y (bending about the major axis) and M_z (about the minor axis) [N·m] at ``x``.
    shear_z, shear_y : ndarray
        The shear of the major-axis plane (V_z) and of the minor-axis plane (V_y) [N] at ``x``.
    section_y, section_z : Section
        The section's properties about the major and the minor axis.
    material : Material
    settings : CheckSettings
    section_class : SectionClass or None
        The worse class of the two planes (None when not classified).
    eq_5_9 : bool
        A plane's bow is the eq. (5.9) preset: the linear member check is added.
    beyond_critical : bool
        The axial force is above a plane's first critical load: the check fails (+inf).
    service : ServiceCheck or None
        The first plane's deflection check, whose figures are carried over (each plane keeps its own in
        ``Result.service``).
    axis : str
        The first plane's axis: ``resistances["M_Rd"]`` and ``["V_Rd"]`` are about it (``M_Rd_y``,
        ``M_Rd_z``, ``V_Rd_z``, ``V_Rd_y`` name both).
    axial_bending_only : bool
        Return only what becomes ``axial_bending`` of the check (the N–M_y–M_z utilisation at each
        station, with the eq. (5.9) linear check where it applies), for the search between stations.
    in_plane_bound : float or None
        The largest N/Pcr1 of the planes analysed without a bow (as :func:`engine.checks.check_member`):
        it counts as a bound.
    lowest_exponents : bool
        The plastic check's α and β at the n without any shear reduction, the smallest they can be (they
        grow with n, and the factor s falls as they grow): with the largest |M| and |V| of each plane at one
        point this bounds the check from above (:func:`pair_bound`).

    Returns
    -------
    MemberCheck
        ``at`` holds ``x`` (the combined stations, not the result's); ``out_of_plane`` is None (the second
        plane's analysis covers buckling about the other axis).
    """
    g0 = settings.gamma_M0
    N = abs(float(axial_force))
    My, Mz = np.abs(np.asarray(moment_y, dtype=float)), np.abs(np.asarray(moment_z, dtype=float))
    Vz, Vy = np.abs(np.asarray(shear_z, dtype=float)), np.abs(np.asarray(shear_y, dtype=float))
    fy, fc = material.fy, material.axial_strength(axial_force)  # f_t in tension where known (timber)
    shape = section_y.shape
    method, notes = method_used(settings.method, shape, material, section_class, _PLASTIC_SHAPES)
    klass = section_class.klass if section_class is not None else None
    steel_like = material.kind in ("steel", "aluminium", "custom")
    g1 = settings.gamma_M1  # V_b,Rd of a web slender in shear (EN 1993-1-5 §5, engine.shear_buckling)
    V_Rd_z = shear_resistance(section_y, material, "major", g0, g1) if steel_like else None
    V_Rd_y = shear_resistance(section_z, material, "minor", g0, g1) if steel_like else None
    with np.errstate(divide="ignore", invalid="ignore"):
        area = compression_area(section_y, section_class, float(axial_force))  # A_eff: class 4 in compression
        if V_Rd_z is not None:  # §6.2.8, in both checks (see engine.checks)
            rho_z, rho_y = shear_reduction(Vz, V_Rd_z), shear_reduction(Vy, V_Rd_y)
            rho = np.maximum(rho_z, rho_y)
            # §6.2.10(3): the axial resistance with (1 − ρ)f_y in each plane's shear area
            kept = shear_area_kept(area, ((rho_z, section_y.A_v), (rho_y, section_z.A_v)))
        else:
            rho = np.zeros_like(My)
            kept = area
        if method == "elastic":
            N_Rd = area * fc / g0
            # W_eff of a class 4 section: the merged class holds each view's, y first (pair_check)
            M_Rd_y = elastic_modulus(section_y, section_class, 0) * fy / g0
            M_Rd_z = elastic_modulus(section_z, section_class, 1) * fy / g0
            bending = My / M_Rd_y + Mz / M_Rd_z
            n = axial_ratio(N, kept * fc / g0)
            ab = n + np.where(bending > 0, bending / (1.0 - rho), 0.0)  # ρ = 1: no moment resistance
            kind_ab = ELASTIC_KIND
        else:
            fa = min(fy, fc)  # the plastic axial resistance: f_y, or a material's lower f_c or f_t
            N_Rd = area * fa / g0
            M_Rd_y, M_Rd_z = section_y.W_pl * fy / g0, section_z.W_pl * fy / g0
            n = axial_ratio(N, kept * fa / g0)
            n_1 = np.minimum(n, 1.0)
            reduced_y = plastic_interaction(shape=shape, axis="major", n=n_1, a=section_y.interaction_a)
            reduced_z = plastic_interaction(shape=shape, axis="minor", n=n_1, a=section_z.interaction_a)
            cap_y = M_Rd_y * reduced_y * (1.0 - rho)
            cap_z = M_Rd_z * reduced_z * (1.0 - rho)
            a = np.where(My > 0, My / cap_y, 0.0)
            b = np.where(Mz > 0, Mz / cap_z, 0.0)
            a, b = np.where(np.isnan(a), np.inf, a), np.where(np.isnan(b), np.inf, b)
            if lowest_exponents:  # n without the shear reduction: the least n, so the least α and β
                n_1 = np.minimum(axial_ratio(N, area * fa / g0), 1.0)
            alpha, beta = exponents(shape, n_1)
            ab = np.maximum(n, moment_factor(a, b, alpha, beta))
            kind_ab = PLASTIC_KIND
        sh_z = Vz / V_Rd_z if V_Rd_z is not None else np.zeros_like(Vz)
        sh_y = Vy / V_Rd_y if V_Rd_y is not None else np.zeros_like(Vy)
        linear = None
        if eq_5_9 and float(axial_force) > 0:
            g1 = settings.gamma_M1
            W_y = eq_5_9_modulus(section_y, material, settings.method)
            W_z = eq_5_9_modulus(section_z, material, settings.method)
            linear = N * g1 / (area * fy) + My * g1 / (W_y * fy) + Mz * g1 / (W_z * fy)
            ab_section = ab
            ab = np.maximum(ab, linear)
    if axial_bending_only:
        return ab
    if V_Rd_z is None:
        notes.append("Shear is not checked for timber (no shear strength is given for it).")
    sh = np.maximum(sh_z, sh_y)
    strength = np.maximum(ab, sh)
    i = int(np.argmax(strength))
    if ab[i] >= sh[i]:
        kind = kind_ab
        source = _SOURCES[method]
        if linear is not None and linear[i] >= ab_section[i]:
            kind, source = EQ_5_9_KIND, _SOURCES["eq-5.9"]
    else:
        kind = "shear"
        source = _SOURCES["shear"]
    value = float(strength[i])
    where = float(x[i])
    in_plane_value, in_plane_kind = value, kind
    if in_plane_bound is not None and in_plane_bound > value:
        kind, value, source = IN_PLANE_ELASTIC_KIND, in_plane_bound, IN_PLANE_ELASTIC_SOURCE
        where = 0.5 * float(x[-1] + x[0])
    valid = True
    bent = float(My.max(initial=0.0)) > 0.0 or float(Mz.max(initial=0.0)) > 0.0
    effective = section_class is not None and section_class.effective
    if klass == 4 and not effective and (N > 0 or bent):  # as engine.checks.check_member
        kind, value, source, valid = "class 4 section", math.inf, section_class.source, False
    if beyond_critical:
        kind, value, valid = "elastic buckling", math.inf, False
        source = BEYOND_CRITICAL_SOURCE
    return MemberCheck(
        settings=settings,
        utilization=value,
        kind=kind,
        x=where,
        source=source,
        strength_utilization=value,
        strength_kind=kind,
        stations=strength,
        axial_bending=ab,
        shear=sh,
        deflection_utilization=service.utilization if service is not None else 0.0,
        max_deflection=abs(service.deflection) if service is not None else 0.0,
        deflection_allowed=service.allowed if service is not None else math.inf,
        resistances={
            "N_Rd": N_Rd,
            "M_Rd": M_Rd_y if axis == "major" else M_Rd_z,
            "V_Rd": V_Rd_z if axis == "major" else V_Rd_y,
            "M_Rd_y": M_Rd_y,
            "M_Rd_z": M_Rd_z,
            "V_Rd_z": V_Rd_z,
            "V_Rd_y": V_Rd_y,
        },
        notes=tuple(notes),
        section_class=section_class,
        valid=valid,
        out_of_plane=None,
        in_plane_utilization=in_plane_value,
        in_plane_kind=in_plane_kind,
        at=np.asarray(x, dtype=float),
    )


def plane_at(raw, prep, other_x, tol):
    """A plane's M and V at its own stations and at the other plane's that are not among them, in order
    along the member (a node's two sides stay left first): ``(x, M, V)``, each plane's exact solution."""
    values, x = raw[2], raw[3]
    pos = np.minimum(np.maximum(np.searchsorted(x, other_x), 1), x.size - 1)
    near = np.minimum(np.abs(other_x - x[pos - 1]), np.abs(x[pos] - other_x))
    extra = np.unique(other_x[near > tol])
    if extra.size:
        extra = extra[np.concatenate([[True], np.diff(extra) > tol])]
        st = _state_at(raw, prep, extra)
        every = np.concatenate([x, extra])
        order = np.argsort(every, kind="stable")
        return (
            every[order],
            np.concatenate([values["M"], st["M"]])[order],
            np.concatenate([values["V"], st["V"]])[order],
        )
    return x, values["M"], values["V"]


def _state_at(raw, prep, xs):
    """A plane's exact state at points inside its segments (no node among them), from the basis functions.
    (The Taylor series about the stations that the peak refinement uses was timed here too: slower for more
    than a few points, as its cost grows with the points while the basis functions' is mostly fixed.)"""
    model = prep.model
    seg = model.segment_of(xs)
    return raw[6].states(0, Points(model, seg, xs - model.xa[seg]))


def _evaluate(raw, prep, xs):
    """A plane's exact M and V at points inside its segments (no node among them)."""
    st = _state_at(raw, prep, xs)
    return st["M"], st["V"]


#: Points inside each interval next to a station near the combined peak.
_REFINE = 16


def _between(x, values, at, measure, tol):
    """Points between the stations where the combined utilisation may peak, with their columns.

    Each plane's own peaks are stations, but the peak of the combination may lie between two. Near the
    largest values (within 1e-4 of the largest, at most 4 stations) both neighbouring intervals get
    ``_REFINE`` evenly spaced interior points, each plane's exact solution there (nothing is interpolated).
    Between stations h apart a smooth peak of curvature k² (relative) can exceed the best station by about
    (k h)²/8; the points divide h by 17, so what may still be missed is about 300 times less: below 1e-7 of
    the value with the default 401 stations [derived].
    """
    top = float(np.max(values)) if values.size else 0.0
    if not (math.isfinite(top) and top > 0.0):
        return []
    distinct = np.concatenate([[True], np.diff(x) > tol])
    unique_x = x[distinct]
    position = np.cumsum(distinct) - 1
    near = np.flatnonzero(values >= top * (1.0 - 1e-4))
    near = near[np.argsort(-values[near], kind="stable")][:4]
    t = np.arange(1, _REFINE + 1) / (_REFINE + 1)
    ks = np.unique(position[near])
    low = np.concatenate([ks - 1, ks])  # the intervals on either side of each station
    low = low[(low >= 0) & (low + 1 < unique_x.size)]
    start = unique_x[low]
    gap = unique_x[low + 1] - start
    wide = gap > 4.0 * tol * (_REFINE + 1)
    if not wide.any():
        return []
    # Two stations next to each other share an interval: its points once.
    xs = np.unique((start[wide][:, None] + gap[wide][:, None] * t).ravel())
    return [at(xs)]


def pair_check(case, P, planes):
    """The two-plane cross-section check (:mod:`engine.biaxial`) on both planes' stations merged, and on
    points between them near the combined peak (:func:`_between`)."""
    (r1, prep1, raw1), (r2, prep2, raw2) = planes
    tol = 1e-11 * prep1.model.L
    x1, m1, v1 = plane_at(raw1, prep1, raw2[3], tol)
    x2, m2, v2 = plane_at(raw2, prep2, raw1[3], tol)
    i1, i2 = pair_stations(x1, x2, tol)
    major_first = case.axis == "major"

    def arranged(x, m_a, v_a, m_b, v_b):  # (x, M_y, M_z, V_z, V_y) from plane 1's and plane 2's values
        return (x, m_a, m_b, v_a, v_b) if major_first else (x, m_b, m_a, v_b, v_a)

    def at(xs):
        m_a, v_a = _evaluate(raw1, prep1, xs)
        m_b, v_b = _evaluate(raw2, prep2, xs)
        return arranged(xs, m_a, v_a, m_b, v_b)

    fixed = _fixed(case, P, prep1, prep2)

    def measure(columns):
        x, m_y, m_z, v_z, v_y = columns
        return check_biaxial(
            x=x, moment_y=m_y, moment_z=m_z, shear_z=v_z, shear_y=v_y, axial_bending_only=True, **fixed
        )

    columns = arranged(x1[i1], m1[i1], v1[i1], m2[i2], v2[i2])
    extra = _between(columns[0], measure(columns), at, measure, tol)
    if extra:
        merged = [np.concatenate([c, *(e[k] for e in extra)]) for k, c in enumerate(columns)]
        order = np.argsort(merged[0], kind="stable")
        columns = tuple(c[order] for c in merged)
    x, m_y, m_z, v_z, v_y = columns
    return check_biaxial(
        x=x, moment_y=m_y, moment_z=m_z, shear_z=v_z, shear_y=v_y, **fixed, **_whole(case, P, planes)
    )


def _fixed(case, P, prep1, prep2) -> dict:
    """The arguments of :func:`check_biaxial` that are the same at every station of a pair of planes."""
    major_first = case.axis == "major"
    s1, s2 = prep1.member.section, prep2.member.section
    # both planes are analysed: the web is in bending and compression in either view; y first (the moduli)
    c1, c2 = prep1.section_class(P, True), prep2.section_class(P, True)
    classes = [c1, c2] if major_first else [c2, c1]  # one section: both views are classified, or neither
    presets = (case.imperfection.preset, case.second_plane_case().imperfection.preset)
    return {
        "axial_force": P,
        "section_y": s1 if major_first else s2,
        "section_z": s2 if major_first else s1,
        "material": prep1.member.material,
        "settings": case.check,
        "section_class": None if None in classes else worse_class(classes),
        "eq_5_9": "en1993-eq-5.9" in presets,
    }


def _whole(case, P, planes) -> dict:
    """The arguments of :func:`check_biaxial` for the whole member's check (not for the search between
    stations): the in-plane bound, whether a plane is beyond its critical load, the service check and the
    axis."""
    (r1, prep1, _), (r2, prep2, _) = planes
    bounds = [b for b in (prep1.elastic_bound(P), prep2.elastic_bound(P)) if b is not None]
    return {
        "in_plane_bound": max(bounds) if bounds else None,
        "beyond_critical": "unstable" in (r1.status, r2.status),
        "service": r1.service,
        "axis": case.axis,
    }


#: The margin on each plane's largest |M| and |V| in :func:`pair_bound`: their peaks are stations, found to
#: rounding (engine.solver.peaks), and the check grows with each, so a bound a little high stays a bound.
_BOUND_MARGIN = 1e-7


def pair_bound(case, P, planes) -> float:
    """An upper bound of ``pair_check(case, P, planes).utilization``, for a fraction of its cost.

    The check at one point with each plane's largest |M| and |V| (each plane's exact peaks are among its
    stations) and the plastic exponents at their smallest (``lowest_exponents``). At every point of the
    member each term of :func:`check_biaxial` is then at least as large: n and the elastic sum grow with
    |M| and |V| (§6.2.8's ρ takes area and moment resistance away), the plastic factor s grows with each
    ratio M/M_N,Rd and falls as α and β grow (:func:`moment_factor`, both terms below 1 at the root), the
    shear and eq. (5.9) terms are linear; the in-plane bound, the class-4 refusal and the critical status
    are the pair's own [derived]. ``tests/engine/test_bow_pair.py`` checks it against the full check."""
    (_, _, raw1), (_, _, raw2) = planes
    peaks = []
    for raw in (raw1, raw2):
        values = raw[2]
        for name in ("M", "V"):
            peaks.append(np.array([float(np.max(np.abs(values[name]))) * (1.0 + _BOUND_MARGIN)]))
    m_a, v_a, m_b, v_b = peaks
    if case.axis == "major":
        columns = {"moment_y": m_a, "moment_z": m_b, "shear_z": v_a, "shear_y": v_b}
    else:
        columns = {"moment_y": m_b, "moment_z": m_a, "shear_z": v_b, "shear_y": v_a}
    prep1, prep2 = planes[0][1], planes[1][1]
    return check_biaxial(
        x=np.zeros(1),
        lowest_exponents=True,
        **columns,
        **_fixed(case, P, prep1, prep2),
        **_whole(case, P, planes),
    ).utilization


def worst_pair(case, P, check, first, second, others) -> tuple:
    """Which variant of each plane's bow to keep instead, ``(key or None, key or None)``. Each plane keeps the
    variant worse for its own check (``engine.analysis._solve_plane``), but the check of both planes together
    (N, M_y and M_z at once) may be worse with another pair, e.g. a minor-axis bow against the major axis's
    peak. EN 1993-1-1 §5.3.2 asks for the imperfections in the unfavourable direction: every pair is checked
    together and the worst kept (a pair within 1e-9 of the kept one does not replace it). ``others`` holds
    each plane's variants not kept, as ``(key, prepared member, raw solution)`` (empty where the direction is
    fixed)."""
    r1, r2 = first[0], second[0]
    options = ([(None, *first[1:])] + list(others[0]), [(None, *second[1:])] + list(others[1]))
    worst, picks = check.utilization, (None, None)
    for a in options[0]:
        for b in options[1]:
            if a[0] is None and b[0] is None:
                continue
            pair = ((r1, *a[1:]), (r2, *b[1:]))
            # A pair whose bound cannot replace the worst is not checked in full (the same pick either way;
            # a NaN bound is checked).
            if pair_bound(case, P, pair) <= worst + 1e-9 * max(1.0, abs(worst)):
                continue
            trial = pair_check(case, P, pair)
            if trial.utilization > worst + 1e-9 * max(1.0, abs(worst)):
                worst, picks = trial.utilization, (a[0], b[0])
    return picks
