r"""The interaction factors of EN 1993-1-1:2005 Annex A (method 1) for eqs. (6.61) and (6.62).

Sources: EN 1993-1-1:2005 Annex A, Table A.1 (interaction factors) and Table A.2 (equivalent uniform moment
factors :math:`C_{mi,0}`); the method's background in Boissonnade, Greiner, Jaspart and Lindner, *Rules for
member stability in EN 1993-1-1: background documentation and design guidelines*, ECCS publication 119
(2006). Every formula here is from memory, to be checked against a copy of the standard.

Lateral-torsional buckling is not covered yet (:math:`\chi_{LT} = 1`): the factors are taken with
:math:`\bar\lambda_0 = 0`, so that :math:`C_{my} = C_{my,0}`, :math:`C_{mz} = C_{mz,0}`, :math:`C_{mLT} = 1`
and the torsional terms :math:`a_{LT}` in :math:`b_{LT}, c_{LT}, d_{LT}, e_{LT}` vanish.

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

from engine.design.annex_b import InteractionFactors

__all__ = ["W_LIMIT", "interaction_factors", "moment_factor_general", "moment_factor_linear"]

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
) -> InteractionFactors:
    r"""The interaction factors of EN 1993-1-1 Annex A, Table A.1, with :math:`\bar\lambda_0 = 0`
    (:math:`\chi_{LT} = 1`, :math:`C_{mLT} = 1`): see the module's notes. Forces in N, moduli in m³.

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
    base_yy = C_my * mu_y / (1.0 - ry)
    base_yz = C_mz * mu_y / (1.0 - rz)
    base_zy = C_my * mu_z / (1.0 - ry)
    base_zz = C_mz * mu_z / (1.0 - rz)
    n_y = N_Ed / (chi_y * N_Rk / gamma_M1)
    n_z = N_Ed / (chi_z * N_Rk / gamma_M1)
    if section_class == 3:
        return InteractionFactors(base_yy, base_yz, base_zy, base_zz, n_y, n_z)
    w_y = min(W_pl_y / W_el_y, W_LIMIT)
    w_z = min(W_pl_z / W_el_z, W_LIMIT)
    n_pl = N_Ed / (N_Rk / gamma_M1)
    lam = max(lambda_y, lambda_z)
    c_yy = 1.0 + (w_y - 1.0) * (2.0 - 1.6 / w_y * C_my**2 * lam - 1.6 / w_y * C_my**2 * lam**2) * n_pl
    c_yy = max(c_yy, W_el_y / W_pl_y)
    c_yz = 1.0 + (w_z - 1.0) * (2.0 - 14.0 * C_mz**2 * lam**2 / w_z**5) * n_pl
    c_yz = max(c_yz, 0.6 * math.sqrt(w_z / w_y) * W_el_z / W_pl_z)
    c_zy = 1.0 + (w_y - 1.0) * (2.0 - 14.0 * C_my**2 * lam**2 / w_y**5) * n_pl
    c_zy = max(c_zy, 0.6 * math.sqrt(w_y / w_z) * W_el_y / W_pl_y)
    c_zz = 1.0 + (w_z - 1.0) * (2.0 - 1.6 / w_z * C_mz**2 * lam - 1.6 / w_z * C_mz**2 * lam**2) * n_pl
    c_zz = max(c_zz, W_el_z / W_pl_z)
    return InteractionFactors(
        base_yy / c_yy,
        base_yz / c_yz * 0.6 * math.sqrt(w_z / w_y),
        base_zy / c_zy * 0.6 * math.sqrt(w_y / w_z),
        base_zz / c_zz,
        n_y,
        n_z,
    )
