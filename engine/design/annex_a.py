r"""The interaction factors of EN 1993-1-1:2005 Annex A (method 1) for eqs. (6.61) and (6.62).

Sources: EN 1993-1-1:2005 Annex A, Table A.1 (interaction factors) and Table A.2 (equivalent uniform moment
factors :math:`C_{mi,0}`); the method's background in Boissonnade, Greiner, Jaspart and Lindner, *Rules for
member stability in EN 1993-1-1: background documentation and design guidelines*, ECCS publication 119
(2006). Every formula here is from memory, to be checked against a copy of the standard.

Without lateral-torsional buckling (``ltb`` None: a member not susceptible to torsional deformations, or one
whose check could not be made) the factors are taken with :math:`\bar\lambda_0 = 0`, so that
:math:`C_{my} = C_{my,0}`, :math:`C_{mz} = C_{mz,0}`, :math:`C_{mLT} = 1` and the torsional terms
:math:`a_{LT}` in :math:`b_{LT}, c_{LT}, d_{LT}, e_{LT}` vanish. With ``ltb`` (:class:`TorsionalTerms`),
Table A.1 in full (from memory): :math:`a_{LT} = 1 - I_T/I_y \ge 0`; :math:`\bar\lambda_0` the
slenderness of lateral-torsional buckling under uniform moment; when
:math:`\bar\lambda_0 > 0.2\sqrt{C_1}\sqrt[4]{(1 - N_{Ed}/N_{cr,z})(1 - N_{Ed}/N_{cr,TF})}`,
:math:`C_{my} = C_{my,0} + (1 - C_{my,0})\frac{\sqrt{\varepsilon_y}a_{LT}}{1 + \sqrt{\varepsilon_y}a_{LT}}`
(:math:`\varepsilon_y = \frac{M_{y,Ed}}{N_{Ed}}\frac{A}{W_{el,y}}`) and
:math:`C_{mLT} = C_{my}^2\frac{a_{LT}}{\sqrt{(1 - N_{Ed}/N_{cr,z})(1 - N_{Ed}/N_{cr,T})}} \ge 1`, else
:math:`C_{mLT} = 1`; :math:`C_{mLT}` multiplies :math:`k_{yy}` and :math:`k_{zy}`; and inside
:math:`C_{yy}, C_{yz}, C_{zy}, C_{zz}` the terms

.. math::

    b_{LT} = 0.5a_{LT}\bar\lambda_0^2\frac{M_{y,Ed}}{\chi_{LT}M_{pl,y,Rd}}\frac{M_{z,Ed}}{M_{pl,z,Rd}},\quad
    c_{LT} = 10a_{LT}\frac{\bar\lambda_0^2}{5 + \bar\lambda_z^4}\frac{M_{y,Ed}}{C_{my}\chi_{LT}M_{pl,y,Rd}},

    d_{LT} = 2a_{LT}\frac{\bar\lambda_0}{0.1 + \bar\lambda_z^4}\frac{M_{y,Ed}}{C_{my}\chi_{LT}M_{pl,y,Rd}}
      \frac{M_{z,Ed}}{C_{mz}M_{pl,z,Rd}},\quad
    e_{LT} = 1.7a_{LT}\frac{\bar\lambda_0}{0.1 + \bar\lambda_z^4}\frac{M_{y,Ed}}{C_{my}\chi_{LT}M_{pl,y,Rd}}

are subtracted from the bracket that multiplies :math:`(w_i - 1)` (each lowers its :math:`C_{ij}`, raising
the :math:`k`).

With :math:`\mu_i = (1 - N_{Ed}/N_{cr,i})/(1 - \chi_i N_{Ed}/N_{cr,i})`, :math:`w_i = W_{pl,i}/W_{el,i}
\le 1.5`, :math:`n_{pl} = N_{Ed}/(N_{Rk}/\gamma_{M1})` and :math:`\bar\lambda_{max} = \max(\bar\lambda_y,
\bar\lambda_z)`:

.. math::

    k_{yy} = C_{my}\frac{\mu_y}{1 - N_{Ed}/N_{cr,y}}\frac{1}{C_{yy}}, \quad
    k_{yz} = C_{mz}\frac{\mu_y}{1 - N_{Ed}/N_{cr,z}}\frac{1}{C_{yz}}\,0.6\sqrt{w_z/w_y},

    k_{zy} = C_{my}\frac{\mu_z}{1 - N_{Ed}/N_{cr,y}}\frac{1}{C_{zy}}\,0.6\sqrt{w_y/w_z}, \quad
    k_{zz} = C_{mz}\frac{\mu_z}{1 - N_{Ed}/N_{cr,z}}\frac{1}{C_{zz}}

for class 1 and 2 (plastic properties), and the same without the :math:`C_{ij}` and the :math:`0.6\sqrt{\,}`
factors for class 3 (elastic properties). The :math:`C_{ij}` of class 1–2 are

.. math::

    C_{yy} = 1 + (w_y - 1)\left[\left(2 - \frac{1.6}{w_y}C_{my}^2\bar\lambda_{max}
        - \frac{1.6}{w_y}C_{my}^2\bar\lambda_{max}^2\right)n_{pl}\right] \ge \frac{W_{el,y}}{W_{pl,y}}

    C_{yz} = 1 + (w_z - 1)\left[\left(2 - 14\frac{C_{mz}^2\bar\lambda_{max}^2}{w_z^5}\right)n_{pl}\right]
        \ge 0.6\sqrt{\frac{w_z}{w_y}}\frac{W_{el,z}}{W_{pl,z}}

    C_{zy} = 1 + (w_y - 1)\left[\left(2 - 14\frac{C_{my}^2\bar\lambda_{max}^2}{w_y^5}\right)n_{pl}\right]
        \ge 0.6\sqrt{\frac{w_y}{w_z}}\frac{W_{el,y}}{W_{pl,y}}

    C_{zz} = 1 + (w_z - 1)\left[\left(2 - \frac{1.6}{w_z}C_{mz}^2\bar\lambda_{max}
        - \frac{1.6}{w_z}C_{mz}^2\bar\lambda_{max}^2\right)n_{pl}\right] \ge \frac{W_{el,z}}{W_{pl,z}}
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from engine.design.annex_b import InteractionFactors

__all__ = [
    "W_LIMIT",
    "TorsionalTerms",
    "interaction_factors",
    "lambda_0_limit",
    "moment_factor_general",
    "moment_factor_linear",
]


@dataclass(frozen=True, kw_only=True)
class TorsionalTerms:
    """What Table A.1 needs of lateral-torsional buckling (SI, N and N·m).

    ``a_LT`` = 1 − I_T/I_y ≥ 0; ``lambda_0`` the slenderness under uniform moment; ``C1`` of the diagram;
    ``chi_LT``; ``N_cr_T`` the torsional buckling load (= N_cr,TF of a doubly symmetric section);
    ``M_y_Ed``, ``M_z_Ed``; ``M_pl_y_Rd``, ``M_pl_z_Rd``; ``A``.
    """

    a_LT: float
    lambda_0: float
    C1: float
    chi_LT: float
    N_cr_T: float
    M_y_Ed: float
    M_z_Ed: float
    M_pl_y_Rd: float
    M_pl_z_Rd: float
    A: float


def lambda_0_limit(C1: float, n_z: float, n_T: float) -> float:
    r""":math:`0.2\sqrt{C_1}\sqrt[4]{(1 - N_{Ed}/N_{cr,z})(1 - N_{Ed}/N_{cr,TF})}`, Table A.1 (from memory),
    with ``n_z`` = N_Ed/N_cr,z and ``n_T`` = N_Ed/N_cr,TF.

    >>> lambda_0_limit(1.0, 0.0, 0.0)
    0.2
    """
    return 0.2 * math.sqrt(C1) * ((1.0 - n_z) * (1.0 - n_T)) ** 0.25


#: w_i = W_pl,i/W_el,i is taken at most 1.5 (Table A.1).
W_LIMIT = 1.5


def moment_factor_linear(psi: float, n_cr_ratio: float) -> float:
    r""":math:`C_{mi,0} = 0.79 + 0.21\psi_i + 0.36(\psi_i - 0.33)N_{Ed}/N_{cr,i}` for a linear moment
    diagram, EN 1993-1-1 Annex A, Table A.2 (from memory).

    >>> round(moment_factor_linear(1.0, 0.0), 12)  # uniform moment, no axial force
    1.0
    """
    if not -1.0 - 1e-12 <= psi <= 1.0 + 1e-12:
        raise ValueError(f"psi must lie between -1 and 1, got {psi!r}")
    return 0.79 + 0.21 * psi + 0.36 * (psi - 0.33) * n_cr_ratio


def moment_factor_general(*, N_cr_delta_over_M: float, n_cr_ratio: float) -> float:
    r""":math:`C_{mi,0} = 1 + \left(\frac{\pi^2 E I_i |\delta_x|}{L^2 |M_{i,Ed}(x)|} - 1\right)
    \frac{N_{Ed}}{N_{cr,i}}`, EN 1993-1-1 Annex A, Table A.2 (from memory), for a member with transverse
    loads; the caller gives :math:`\pi^2 E I_i |\delta_x|/(L^2 |M_{i,Ed}|)` as ``N_cr_delta_over_M``.

    A pin-ended member under a uniform load has :math:`5\pi^2/48`, so :math:`C = 1 + 0.03\,N/N_{cr}` (the
    table's special row, rounded):

    >>> round(moment_factor_general(N_cr_delta_over_M=5 * math.pi**2 / 48, n_cr_ratio=1.0), 3)
    1.028
    """
    return 1.0 + (N_cr_delta_over_M - 1.0) * n_cr_ratio


def _ratio(N_Ed: float, N_cr: float) -> float:
    return 0.0 if math.isinf(N_cr) else N_Ed / N_cr


def interaction_factors(
    *,
    N_Ed: float,
    N_Rk: float,
    N_cr_y: float,
    N_cr_z: float,
    chi_y: float,
    chi_z: float,
    lambda_y: float,
    lambda_z: float,
    C_my: float,
    C_mz: float,
    W_el_y: float,
    W_pl_y: float,
    W_el_z: float,
    W_pl_z: float,
    section_class: int,
    gamma_M1: float = 1.0,
    ltb: TorsionalTerms | None = None,
) -> InteractionFactors:
    r"""The interaction factors of EN 1993-1-1 Annex A, Table A.1: with :math:`\bar\lambda_0 = 0`
    (:math:`\chi_{LT} = 1`, :math:`C_{mLT} = 1`) when ``ltb`` is None, else with its terms; see the
    module's notes. Forces in N, moduli in m³.

    ``N_Ed`` is the compressive force [N], ``0 <= N_Ed < min(N_cr_y, N_cr_z)`` (an infinite critical load
    means buckling about that axis is prevented). The returned ``n_y``, ``n_z`` are
    :math:`N_{Ed}/(\chi_i N_{Rk}/\gamma_{M1})` as in Annex B.
    """
    if section_class not in (1, 2, 3):
        raise ValueError(f"section_class must be 1, 2 or 3 (class 4 is not covered), got {section_class!r}")
    if N_Ed < 0.0:
        raise ValueError(f"N_Ed is a compressive force, >= 0; got {N_Ed!r}")
    ry, rz = _ratio(N_Ed, N_cr_y), _ratio(N_Ed, N_cr_z)
    if ry >= 1.0 or rz >= 1.0:
        raise ValueError(f"N_Ed = {N_Ed!r} N reaches a critical load ({N_cr_y!r}, {N_cr_z!r} N)")
    mu_y = (1.0 - ry) / (1.0 - chi_y * ry)
    mu_z = (1.0 - rz) / (1.0 - chi_z * rz)
    C_mLT = 1.0
    b_lt = c_lt = d_lt = e_lt = 0.0
    if ltb is not None:
        rT = _ratio(N_Ed, ltb.N_cr_T)
        if rT >= 1.0:
            raise ValueError(f"N_Ed = {N_Ed!r} N reaches the torsional critical load {ltb.N_cr_T!r} N")
        a_lt = max(ltb.a_LT, 0.0)
        lam0 = ltb.lambda_0
        if lam0 > lambda_0_limit(ltb.C1, rz, rT):
            eps = ltb.M_y_Ed / N_Ed * ltb.A / W_el_y if N_Ed > 0.0 else math.inf
            root = math.sqrt(eps) * a_lt
            C_my = C_my + (1.0 - C_my) * (1.0 if math.isinf(root) else root / (1.0 + root))
            C_mLT = max(1.0, C_my**2 * a_lt / math.sqrt((1.0 - rz) * (1.0 - rT)))
        my = ltb.M_y_Ed / (ltb.chi_LT * ltb.M_pl_y_Rd)
        mz = ltb.M_z_Ed / ltb.M_pl_z_Rd
        lz4 = lambda_z**4
        b_lt = 0.5 * a_lt * lam0**2 * my * mz
        c_lt = 10.0 * a_lt * lam0**2 / (5.0 + lz4) * my / C_my
        d_lt = 2.0 * a_lt * lam0 / (0.1 + lz4) * my / C_my * mz / C_mz
        e_lt = 1.7 * a_lt * lam0 / (0.1 + lz4) * my / C_my
    base_yy = C_my * C_mLT * mu_y / (1.0 - ry)
    base_yz = C_mz * mu_y / (1.0 - rz)
    base_zy = C_my * C_mLT * mu_z / (1.0 - ry)
    base_zz = C_mz * mu_z / (1.0 - rz)
    n_y = N_Ed / (chi_y * N_Rk / gamma_M1)
    n_z = N_Ed / (chi_z * N_Rk / gamma_M1)
    extra = {"C_my": C_my, "C_mLT": C_mLT}
    if section_class == 3:
        return InteractionFactors(base_yy, base_yz, base_zy, base_zz, n_y, n_z, **extra)
    w_y = min(W_pl_y / W_el_y, W_LIMIT)
    w_z = min(W_pl_z / W_el_z, W_LIMIT)
    n_pl = N_Ed / (N_Rk / gamma_M1)
    lam = max(lambda_y, lambda_z)
    c_yy = 1.0 + (w_y - 1.0) * (
        (2.0 - 1.6 / w_y * C_my**2 * lam - 1.6 / w_y * C_my**2 * lam**2) * n_pl - b_lt
    )
    c_yy = max(c_yy, W_el_y / W_pl_y)
    c_yz = 1.0 + (w_z - 1.0) * ((2.0 - 14.0 * C_mz**2 * lam**2 / w_z**5) * n_pl - c_lt)
    c_yz = max(c_yz, 0.6 * math.sqrt(w_z / w_y) * W_el_z / W_pl_z)
    c_zy = 1.0 + (w_y - 1.0) * ((2.0 - 14.0 * C_my**2 * lam**2 / w_y**5) * n_pl - d_lt)
    c_zy = max(c_zy, 0.6 * math.sqrt(w_y / w_z) * W_el_y / W_pl_y)
    c_zz = 1.0 + (w_z - 1.0) * (
        (2.0 - 1.6 / w_z * C_mz**2 * lam - 1.6 / w_z * C_mz**2 * lam**2) * n_pl - e_lt
    )
    c_zz = max(c_zz, W_el_z / W_pl_z)
    return InteractionFactors(
        base_yy / c_yy,
        base_yz / c_yz * 0.6 * math.sqrt(w_z / w_y),
        base_zy / c_zy * 0.6 * math.sqrt(w_y / w_z),
        base_zz / c_zz,
        n_y,
        n_z,
        **extra,
    )
