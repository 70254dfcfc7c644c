r"""Lateral-torsional buckling code rules as pure functions of numbers (issue 15, groundwork).

Sources, each with how sure the project is of it ("from memory": recalled, to be checked against a copy):

- The three-factor formula for :math:`M_{cr}` (ENV 1993-1-1:1992 Annex F, eq. (F.2); the same form in the
  NCCI SN003, *Elastic critical moment for lateral torsional buckling*), and its C1/C2 values for the
  standard diagrams (ENV Annex F Tables F.1.1/F.1.2, SN003 tables): from memory.
- EN 1993-1-1:2005 §6.3.2.2 (general case: Tables 6.3 and 6.4, eq. (6.56)) and §6.3.2.3 (rolled or
  equivalent welded sections: Table 6.5, eqs. (6.57) and (6.58), Table 6.6): from memory.
- ANSI/AISC 360-16 §F1 eq. (F1-1) (C_b) and §F2 eqs. (F2-1) to (F2-7) (doubly symmetric compact I-shapes),
  §F11.2 eqs. (F11-2) to (F11-4) (rectangular bars bent about their major axis): from memory.
"""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Mapping
from dataclasses import dataclass
from types import MappingProxyType

import numpy as np

from engine.errors import CaseError
from engine.validate import choice, positive, real

__all__ = [
    "CHI_METHODS",
    "IMPERFECTION_FACTORS_LT",
    "LATERAL_FROM_SUPPORTS",
    "LOAD_POSITIONS",
    "LtbSettings",
    "STANDARD_DIAGRAMS",
    "AiscLtb",
    "StandardDiagram",
    "aisc_f11",
    "aisc_f2",
    "c1_for_diagram",
    "c1_linear",
    "chi_lt_general",
    "chi_lt_rolled",
    "cb_aisc",
    "k_c",
    "lt_curve",
    "mcr_c1",
]

#: Imperfection factors α_LT of the lateral-torsional buckling curves, EN 1993-1-1:2005 Table 6.3 (from
#: memory; the same numbers as Table 6.1).
IMPERFECTION_FACTORS_LT = MappingProxyType({"a": 0.21, "b": 0.34, "c": 0.49, "d": 0.76})

#: C1 and C2 of simply supported (fork) members with k = k_w = 1 under the standard diagrams (C2 for the load
#: height; ENV 1993-1-1 Annex F Table F.1.2 / SN003, from memory). ``linear`` takes C1 from :func:`c1_linear`.
STANDARD_DIAGRAMS = MappingProxyType(
    {
        "uniform": (1.0, 0.0),
        "udl": (1.127, 0.454),
        "point": (1.348, 0.630),
    }
)

#: Where the transverse loads act relative to the shear centre (check.ltb.load_position).
LOAD_POSITIONS: tuple[str, ...] = ("destabilising", "shear-centre", "stabilising")
#: How χ_LT is found (check.ltb.chi_method): ``general`` (§6.3.2.2 for every section, the conservative
#: default) or ``rolled`` (§6.3.2.3 with f for rolled and equivalent welded I sections, §6.3.2.2 for the
#: rest).
CHI_METHODS: tuple[str, ...] = ("general", "rolled")
#: The lateral condition of an end (check.ltb.lateral_ends): ``supports`` (the default) takes it from the
#: end's support (:func:`engine.ltb_route.lateral_sides`), ``fork`` holds v and φ (free about the minor
#: axis), ``fixed`` holds v and v' as well.
LATERAL_FROM_SUPPORTS = "supports"
_LATERAL = (LATERAL_FROM_SUPPORTS, "fork", "fixed")
_WARPING = ("free", "fixed")
_LTB_KEYS = ("load_position", "lateral_ends", "warping_ends", "chi_method", "restrained")


@dataclass(frozen=True, kw_only=True)
class LtbSettings:
    """The case key ``check.ltb``: the restraint and load data of the lateral-torsional buckling check.

    Defaults are the conservative ones: loads on the flange they come from (destabilising), each end's
    lateral condition taken from its support (``supports``: a fork, free to rotate about the minor axis,
    where the support holds the end across the plane of bending, free where it moves; see
    :func:`engine.ltb_route.lateral_sides`), warping free, χ_LT by §6.3.2.2, not restrained.
    ``restrained`` True is the engineer's statement that the compression flange is restrained along the
    member (by a slab or sheeting): lateral-torsional buckling is prevented, χ_LT = 1 (EN 1993-1-1
    §6.3.2.1(2), from memory).

    >>> LtbSettings.from_data({"lateral_ends": ["fixed", "fork"]}).lateral_ends
    ('fixed', 'fork')
    """

    load_position: str = "destabilising"
    lateral_ends: tuple = (LATERAL_FROM_SUPPORTS, LATERAL_FROM_SUPPORTS)
    warping_ends: tuple = ("free", "free")
    chi_method: str = "general"
    restrained: bool = False

    def __post_init__(self) -> None:
        if not isinstance(self.restrained, bool):
            raise CaseError(f"check.ltb.restrained: {self.restrained!r} must be true or false")
        choice("check.ltb.load_position", self.load_position, LOAD_POSITIONS)
        choice("check.ltb.chi_method", self.chi_method, CHI_METHODS)
        for name, allowed in (("lateral_ends", _LATERAL), ("warping_ends", _WARPING)):
            ends = getattr(self, name)
            if isinstance(ends, (str, bytes)) or not isinstance(ends, (list, tuple)) or len(ends) != 2:
                raise CaseError(
                    f"check.ltb.{name}: {ends!r} must be a [left, right] pair of "
                    + " or ".join(repr(a) for a in allowed)
                )
            for side, end in zip(("left", "right"), ends, strict=True):
                choice(f"check.ltb.{name}.{side}", end, allowed)
            object.__setattr__(self, name, tuple(ends))

    @classmethod
    def from_data(cls, data) -> LtbSettings:
        """From the case-file object (absent keys take the defaults)."""
        if data is None:
            return cls()
        if isinstance(data, LtbSettings):
            return data
        if not isinstance(data, Mapping):
            raise CaseError(f"check.ltb: {data!r} must be an object with keys " + ", ".join(_LTB_KEYS))
        unknown = [key for key in data if key not in _LTB_KEYS]
        if unknown:
            raise CaseError(
                f"check.ltb.{unknown[0]}: not a key of check.ltb; allowed: " + ", ".join(_LTB_KEYS)
            )
        return cls(**data)

    def supports_as_forks(self) -> LtbSettings:
        """These settings with each ``supports`` end read as a fork: the ends a support leaves free are
        passed to the check apart (:func:`engine.ltb_route.lateral_sides`)."""
        ends = tuple("fork" if end == LATERAL_FROM_SUPPORTS else end for end in self.lateral_ends)
        return self if ends == self.lateral_ends else dataclasses.replace(self, lateral_ends=ends)

    def to_dict(self) -> dict:
        """The case-file form (every key)."""
        return {
            "load_position": self.load_position,
            "lateral_ends": list(self.lateral_ends),
            "warping_ends": list(self.warping_ends),
            "chi_method": self.chi_method,
            "restrained": self.restrained,
        }


C1_SOURCE = "ENV 1993-1-1:1992 Annex F Tables F.1.1/F.1.2; NCCI SN003 (from memory)"


def mcr_c1(
    L: float,
    EI_z: float,
    GI_t: float,
    EI_w: float,
    C1: float,
    C2: float = 0.0,
    z_g: float = 0.0,
    k: float = 1.0,
    k_w: float = 1.0,
) -> float:
    r"""Elastic critical moment by the three-factor formula, ENV 1993-1-1:1992 Annex F eq. (F.2) (from
    memory), doubly symmetric section (:math:`z_j = 0`, so C3 drops out):

    .. math::

        M_{cr} = C_1\frac{\pi^2 EI_z}{(kL)^2}\left[\sqrt{\left(\frac{k}{k_w}\right)^2\frac{EI_w}{EI_z}
          + \frac{(kL)^2 GI_t}{\pi^2 EI_z} + (C_2 z_g)^2} - C_2 z_g\right]

    ``z_g`` [m] is the load's distance from the shear centre, positive on the side the load comes from (top
    flange under gravity load: destabilising), as in :func:`engine.design.mcr.critical_moment`. k = 0.5 with
    both ends fixed against lateral rotation, k_w = 0.5 with both ends fixed against warping.

    >>> round(mcr_c1(6.0, 2e6, 4e4, 0.0, 1.0) / (math.pi / 6 * math.sqrt(2e6 * 4e4)), 12)
    1.0
    """
    L = positive("L", L, "m")
    EI_z = positive("EI_z", EI_z, "N·m²")
    GI_t = positive("GI_t", GI_t, "N·m²")
    EI_w = positive("EI_w", EI_w, "N·m⁴", allow_zero=True)
    C1 = positive("C1", C1)
    k = positive("k", k)
    k_w = positive("k_w", k_w)
    zc = real("C2", C2) * real("z_g", z_g, "m")
    kl = k * L
    root = math.sqrt((k / k_w) ** 2 * EI_w / EI_z + kl**2 * GI_t / (math.pi**2 * EI_z) + zc**2)
    return C1 * math.pi**2 * EI_z / kl**2 * (root - zc)


def c1_linear(psi: float) -> float:
    r"""C1 of a linear diagram, end moments M and ψM (−1 ≤ ψ ≤ 1), fork supports:
    :math:`C_1 = 1.88 - 1.40\psi + 0.52\psi^2 \le 2.70` (the fit quoted beside ENV 1993-1-1 Annex F and in
    SN003-era practice; from memory). It ignores the κ dependence of the exact value (see the tests).

    >>> c1_linear(1.0), c1_linear(0.0), c1_linear(-1.0)
    (1.0, 1.88, 2.7)
    """
    psi = real("psi", psi, minimum=-1.0, maximum=1.0)
    return round(min(1.88 - 1.40 * psi + 0.52 * psi * psi, 2.70), 12)


@dataclass(frozen=True, kw_only=True)
class StandardDiagram:
    """The standard diagram a moment diagram was matched to, and its factors.

    ``diagram`` is ``uniform``, ``linear``, ``udl``, ``point`` or ``none`` (no standard shape within
    ``tolerance``: C1 = 1, the uniform-moment value, the lowest of the table); ``psi`` for ``linear``;
    ``deviation`` the largest difference from the matched shape over max|M|.
    """

    diagram: str
    C1: float
    C2: float
    psi: float | None
    deviation: float
    source: str = C1_SOURCE


def c1_for_diagram(x, M, *, tolerance: float = 0.05) -> StandardDiagram:
    """The nearest standard diagram to a sampled M(x) of a fork-supported span, and its C1, C2.

    Shapes compared (normalised by the value of largest magnitude): uniform, linear between the end values,
    the parabola of a full-length uniform load (zero end moments) and the triangle of a central point load.
    The closest wins if its largest deviation is at most ``tolerance`` (5 % of max|M|, common practice, no
    source); otherwise C1 = 1, C2 = 0 (``none``): the uniform moment's C1, the lowest, but without the
    load-height term, so above the exact M_cr under a destabilising load (two top-flange loads at the third
    points: +22 %, an independent audit). It is shown beside the exact M_cr, which the check uses.

    >>> c1_for_diagram([0, 1, 2, 3, 4], [0, 1, 2, 1, 0]).diagram
    'point'
    """
    xs = np.asarray(x, dtype=float)
    ms = np.asarray(M, dtype=float)
    if xs.ndim != 1 or xs.shape != ms.shape or xs.size < 2 or not np.all(np.diff(xs) > 0):
        raise ValueError("x, M: give equal-length 1-D samples (at least 2) with x strictly ascending")
    peak = ms[int(np.argmax(np.abs(ms)))]
    if peak == 0:
        return StandardDiagram(diagram="none", C1=1.0, C2=0.0, psi=None, deviation=0.0)
    m = ms / peak
    xi = (xs - xs[0]) / (xs[-1] - xs[0])
    shapes = {
        "linear": m[0] + (m[-1] - m[0]) * xi,
        "udl": 4.0 * xi * (1.0 - xi),
        "point": 1.0 - np.abs(2.0 * xi - 1.0),
    }
    deviations = {name: float(np.max(np.abs(m - shape))) for name, shape in shapes.items()}
    # A tie (coarse samples) goes to the lower C1: linear (its C1 >= 1 but see below), udl, point.
    best = min(deviations, key=lambda name: (deviations[name], ("udl", "linear", "point").index(name)))
    if deviations[best] > tolerance:
        return StandardDiagram(diagram="none", C1=1.0, C2=0.0, psi=None, deviation=deviations[best])
    if best == "linear":
        large, small = (m[0], m[-1]) if abs(m[0]) >= abs(m[-1]) else (m[-1], m[0])
        psi = float(small / large)
        if psi > 1.0 - 1e-9:
            return StandardDiagram(diagram="uniform", C1=1.0, C2=0.0, psi=1.0, deviation=deviations[best])
        return StandardDiagram(
            diagram="linear", C1=c1_linear(psi), C2=0.0, psi=psi, deviation=deviations[best]
        )
    c1, c2 = STANDARD_DIAGRAMS[best]
    return StandardDiagram(diagram=best, C1=c1, C2=c2, psi=None, deviation=deviations[best])


# ----------------------------------------------------------------------------- EN 1993-1-1 §6.3.2


def lt_curve(*, shape: str, h_over_b: float, method: str = "general") -> str:
    """The lateral-torsional buckling curve, EN 1993-1-1:2005 Table 6.4 (``general``, §6.3.2.2) or Table 6.5
    (``rolled``, §6.3.2.3), from memory:

    =================  ==========  ==========
    section            Table 6.4   Table 6.5
    =================  ==========  ==========
    rolled I, h/b ≤ 2  a           b
    rolled I, h/b > 2  b           c
    welded I, h/b ≤ 2  c           c
    welded I, h/b > 2  d           d
    other              d           (not covered: d)
    =================  ==========  ==========

    >>> lt_curve(shape="rolled_i", h_over_b=2.5), lt_curve(shape="rolled_i", h_over_b=2.5, method="rolled")
    ('b', 'c')
    """
    choice("method", method, ("general", "rolled"))
    ratio = positive("h_over_b", h_over_b)
    slender = ratio > 2.0 + 1e-9
    if shape == "rolled_i":
        table = ("b", "c") if method == "rolled" else ("a", "b")
    elif shape == "welded_i":
        table = ("c", "d")
    else:
        return "d"
    return table[slender]


def chi_lt_general(lambda_lt: float, curve: str) -> float:
    r"""χ_LT, EN 1993-1-1:2005 §6.3.2.2 eq. (6.56) (from memory):
    :math:`\Phi = 0.5[1 + \alpha_{LT}(\bar\lambda_{LT} - 0.2) + \bar\lambda_{LT}^2]`,
    :math:`\chi_{LT} = 1/(\Phi + \sqrt{\Phi^2 - \bar\lambda_{LT}^2}) \le 1`.

    >>> round(chi_lt_general(1.0, "b"), 4)
    0.597
    """
    return _chi(lambda_lt, curve, lambda_0=0.2, beta=1.0)


def chi_lt_rolled(
    lambda_lt: float, curve: str, *, kc: float = 1.0, lambda_0: float = 0.4, beta: float = 0.75
):
    r"""χ_LT,mod, EN 1993-1-1:2005 §6.3.2.3 eqs. (6.57) and (6.58) (from memory), recommended
    :math:`\bar\lambda_{LT,0} = 0.4` (at most) and β = 0.75 (at least):

    .. math::

        \Phi = 0.5[1 + \alpha_{LT}(\bar\lambda_{LT} - \bar\lambda_{LT,0}) + \beta\bar\lambda_{LT}^2],\quad
        \chi_{LT} = \frac{1}{\Phi + \sqrt{\Phi^2 - \beta\bar\lambda_{LT}^2}}
          \le \min\left(1, \frac{1}{\bar\lambda_{LT}^2}\right)

    and :math:`\chi_{LT,mod} = \chi_{LT}/f \le \min(1, 1/\bar\lambda_{LT}^2)` with
    :math:`f = 1 - 0.5(1 - k_c)[1 - 2(\bar\lambda_{LT} - 0.8)^2] \le 1` (``kc`` from :func:`k_c`; kc = 1 gives
    f = 1, no modification).

    >>> round(chi_lt_rolled(1.0, "c"), 4)
    0.6391
    """
    kc = positive("kc", kc)
    if kc > 1.0:
        raise ValueError(f"kc: {kc!r} must be in (0, 1]")
    chi = _chi(lambda_lt, curve, lambda_0=lambda_0, beta=beta)
    lam = float(lambda_lt)
    cap = 1.0 if lam <= 1.0 else 1.0 / lam**2
    f = min(1.0, 1.0 - 0.5 * (1.0 - kc) * (1.0 - 2.0 * (lam - 0.8) ** 2))
    return min(chi / f, cap)


def _chi(lambda_lt: float, curve: str, *, lambda_0: float, beta: float) -> float:
    choice("curve", curve, tuple(IMPERFECTION_FACTORS_LT))
    lam = positive("lambda_lt", lambda_lt, allow_zero=True)
    lambda_0 = positive("lambda_0", lambda_0, allow_zero=True)
    beta = positive("beta", beta)
    alpha = IMPERFECTION_FACTORS_LT[curve]
    phi = 0.5 * (1.0 + alpha * (lam - lambda_0) + beta * lam * lam)
    root = phi * phi - beta * lam * lam
    chi = 1.0 / (phi + math.sqrt(max(root, 0.0)))
    cap = 1.0 if lam <= 1.0 else 1.0 / lam**2
    return min(chi, cap)


def k_c(diagram: str, psi: float | None = None) -> float:
    r"""Correction factor k_c, EN 1993-1-1:2005 Table 6.6 (from memory): uniform moment 1.0; linear with ψ
    :math:`1/(1.33 - 0.33\psi)`; simply supported under a uniform load 0.94; under a central point load 0.86
    (both ≈ 1/√C1: 1/√1.13, 1/√1.35); anything else 1.0 (no modification: the safe side).

    >>> round(k_c("linear", 0.0), 3), k_c("udl"), k_c("point")
    (0.752, 0.94, 0.86)
    """
    if diagram == "linear":
        psi = real("psi", psi, minimum=-1.0, maximum=1.0)
        return 1.0 / (1.33 - 0.33 * psi)
    return {"uniform": 1.0, "udl": 0.94, "point": 0.86}.get(diagram, 1.0)


# ----------------------------------------------------------------------------- AISC 360-16 Chapter F


def cb_aisc(M_max: float, M_A: float, M_B: float, M_C: float) -> float:
    r"""C_b, AISC 360-16 eq. (F1-1) (from memory), absolute values of the unbraced segment's largest moment
    and its moments at the quarter, centre and three-quarter points:
    :math:`C_b = 12.5 M_{max}/(2.5 M_{max} + 3M_A + 4M_B + 3M_C)`.

    >>> cb_aisc(1, 1, 1, 1), round(cb_aisc(1, 0.5, 1, 0.5), 3)
    (1.0, 1.316)
    """
    values = [
        abs(real(name, value, "N·m"))
        for name, value in zip(("M_max", "M_A", "M_B", "M_C"), (M_max, M_A, M_B, M_C), strict=True)
    ]
    if values[0] == 0 or values[0] < max(values[1:]) * (1 - 1e-12):
        raise ValueError(f"M_max: {M_max!r} must be > 0 and the largest of the four moments")
    return 12.5 * values[0] / (2.5 * values[0] + 3 * values[1] + 4 * values[2] + 3 * values[3])


@dataclass(frozen=True, kw_only=True)
class AiscLtb:
    """AISC 360-16 §F2 for a doubly symmetric compact I-shape: the nominal moment and its pieces (SI)."""

    M_n: float
    M_p: float
    L_p: float
    L_r: float
    F_cr: float
    zone: str  # "plastic" (L_b ≤ L_p), "inelastic" or "elastic" (L_b > L_r)
    C_b: float = 1.0
    L_b: float = 0.0
    clause: str = "F2"  # "F11": a rectangular bar (L_p, L_r the L_b at L_b·d/t² = 0.08E/F_y and 1.9E/F_y)


def aisc_f2(
    *,
    L_b: float,
    E: float,
    F_y: float,
    Z_x: float,
    S_x: float,
    r_y: float,
    I_y: float,
    C_w: float,
    J: float,
    h_o: float,
    C_b: float = 1.0,
) -> AiscLtb:
    r"""Nominal flexural strength of a doubly symmetric compact I-shape, AISC 360-16 §F2 (from memory), c = 1:

    - :math:`L_p = 1.76 r_y\sqrt{E/F_y}` (F2-5); :math:`r_{ts}^2 = \sqrt{I_y C_w}/S_x` (F2-7);
    - :math:`L_r = 1.95 r_{ts}\frac{E}{0.7F_y}\sqrt{\frac{Jc}{S_x h_o}
      + \sqrt{\left(\frac{Jc}{S_x h_o}\right)^2 + 6.76\left(\frac{0.7F_y}{E}\right)^2}}` (F2-6);
    - :math:`F_{cr} = \frac{C_b\pi^2E}{(L_b/r_{ts})^2}\sqrt{1 + 0.078\frac{Jc}{S_x h_o}(L_b/r_{ts})^2}`
      (F2-4);
    - :math:`M_n = M_p = F_y Z_x` for :math:`L_b \le L_p` (F2-1); :math:`C_b[M_p - (M_p - 0.7F_yS_x)
      \frac{L_b - L_p}{L_r - L_p}] \le M_p` up to :math:`L_r` (F2-2); :math:`F_{cr}S_x \le M_p` beyond (F2-3).
    """
    L_b = positive("L_b", L_b, "m", allow_zero=True)
    E, F_y, Z_x, S_x, r_y = (
        positive(n, v) for n, v in (("E", E), ("F_y", F_y), ("Z_x", Z_x), ("S_x", S_x), ("r_y", r_y))
    )
    I_y, C_w, J, h_o = (positive(n, v) for n, v in (("I_y", I_y), ("C_w", C_w), ("J", J), ("h_o", h_o)))
    C_b = positive("C_b", C_b)
    M_p = F_y * Z_x
    r_ts = math.sqrt(math.sqrt(I_y * C_w) / S_x)
    jc = J / (S_x * h_o)
    L_p = 1.76 * r_y * math.sqrt(E / F_y)
    L_r = 1.95 * r_ts * E / (0.7 * F_y) * math.sqrt(jc + math.sqrt(jc**2 + 6.76 * (0.7 * F_y / E) ** 2))
    F_cr = (
        math.inf
        if L_b == 0
        else C_b * math.pi**2 * E / (L_b / r_ts) ** 2 * math.sqrt(1 + 0.078 * jc * (L_b / r_ts) ** 2)
    )
    if L_b <= L_p:
        return AiscLtb(M_n=M_p, M_p=M_p, L_p=L_p, L_r=L_r, F_cr=F_cr, zone="plastic", C_b=C_b, L_b=L_b)
    if L_b <= L_r:
        m_n = C_b * (M_p - (M_p - 0.7 * F_y * S_x) * (L_b - L_p) / (L_r - L_p))
        return AiscLtb(
            M_n=min(m_n, M_p), M_p=M_p, L_p=L_p, L_r=L_r, F_cr=F_cr, zone="inelastic", C_b=C_b, L_b=L_b
        )
    return AiscLtb(
        M_n=min(F_cr * S_x, M_p), M_p=M_p, L_p=L_p, L_r=L_r, F_cr=F_cr, zone="elastic", C_b=C_b, L_b=L_b
    )


def aisc_f11(
    *, L_b: float, d: float, t: float, E: float, F_y: float, Z_x: float, S_x: float, C_b: float = 1.0
) -> AiscLtb:
    r"""Nominal flexural strength of a solid rectangular bar bent about its major axis, AISC 360-16 §F11
    (from memory); ``d`` the depth in the plane of bending, ``t`` the width (``t < d``):

    - :math:`L_bd/t^2 \le 0.08E/F_y`: :math:`M_n = M_p = F_yZ_x \le 1.6F_yS_x` (F11-1), zone ``plastic``;
    - up to :math:`1.9E/F_y`: :math:`M_n = C_b[1.52 - 0.274(L_bd/t^2)(F_y/E)]M_y \le M_p`,
      :math:`M_y = F_yS_x` (F11-2), zone ``inelastic``;
    - beyond: :math:`M_n = F_{cr}S_x \le M_p`, :math:`F_{cr} = 1.9EC_b/(L_bd/t^2)` (F11-3, F11-4), zone
      ``elastic``.

    ``L_p`` and ``L_r`` of the result are the unbraced lengths at the two limits.

    >>> found = aisc_f11(L_b=6.0, d=0.2, t=0.02, E=200e9, F_y=250e6, Z_x=2e-4, S_x=4e-4 / 3, C_b=1.0)
    >>> found.zone, round(found.F_cr / 1e6, 3), round(found.M_n)
    ('elastic', 126.667, 16889)
    """
    L_b = positive("L_b", L_b, "m", allow_zero=True)
    d, t, E, F_y, Z_x, S_x, C_b = (
        positive(n, v)
        for n, v in (("d", d), ("t", t), ("E", E), ("F_y", F_y), ("Z_x", Z_x), ("S_x", S_x), ("C_b", C_b))
    )
    M_p = min(F_y * Z_x, 1.6 * F_y * S_x)
    slenderness = L_b * d / t**2
    L_p, L_r = 0.08 * E / F_y * t**2 / d, 1.9 * E / F_y * t**2 / d
    F_cr = math.inf if L_b == 0 else 1.9 * E * C_b / slenderness
    common = dict(M_p=M_p, L_p=L_p, L_r=L_r, F_cr=F_cr, C_b=C_b, L_b=L_b, clause="F11")
    if slenderness <= 0.08 * E / F_y:
        return AiscLtb(M_n=M_p, zone="plastic", **common)
    if slenderness <= 1.9 * E / F_y:
        m_n = C_b * (1.52 - 0.274 * slenderness * F_y / E) * F_y * S_x
        return AiscLtb(M_n=min(m_n, M_p), zone="inelastic", **common)
    return AiscLtb(M_n=min(F_cr * S_x, M_p), zone="elastic", **common)
