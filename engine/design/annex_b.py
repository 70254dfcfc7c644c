r"""The equivalent-member check of EN 1993-1-1:2005 §6.3.3 with the interaction factors of Annex B (method 2).

Sources: EN 1993-1-1:2005 §6.3.3(4), eqs. (6.61) and (6.62); Annex B, Table B.1 (members not susceptible to
torsional deformations), Table B.2 (members susceptible to torsional deformations: k_zy differs) and
Table B.3 (equivalent uniform moment factors). Equation numbers, the table cells
and the footnotes are from memory, to be checked against a copy of the standard.

.. math::

    \frac{N_{Ed}}{\chi_y N_{Rk}/\gamma_{M1}} + k_{yy}\frac{M_{y,Ed}}{\chi_{LT} M_{y,Rk}/\gamma_{M1}}
    + k_{yz}\frac{M_{z,Ed}}{M_{z,Rk}/\gamma_{M1}} \le 1 \quad (6.61)

    \frac{N_{Ed}}{\chi_z N_{Rk}/\gamma_{M1}} + k_{zy}\frac{M_{y,Ed}}{\chi_{LT} M_{y,Rk}/\gamma_{M1}}
    + k_{zz}\frac{M_{z,Ed}}{M_{z,Rk}/\gamma_{M1}} \le 1 \quad (6.62)

Decisions (conservative where the standard offers a choice):

- Table B.1's footnote lets :math:`k_{zy} = 0` for I, H and rectangular hollow sections in compression and
  uniaxial bending :math:`M_{y,Ed}`; strutscope keeps :math:`k_{zy} = 0.6\,k_{yy}` (class 1–2) or
  :math:`0.8\,k_{yy}` (class 3), which is never smaller.
- Class 4 sections are not covered (their :math:`\Delta M` terms need effective properties).
"""

from __future__ import annotations

from dataclasses import dataclass

__all__ = [
    "LOAD_FORMS",
    "SWAY_CM",
    "InteractionFactors",
    "MemberCheck",
    "equivalent_moment_factor",
    "interaction_factors",
    "member_check",
]

#: The load forms of Table B.3's rows with a span moment.
LOAD_FORMS: tuple[str, ...] = ("uniform", "concentrated")

#: Table B.3, note: for members with a sway buckling mode, C_my = 0.9 or C_mz = 0.9.
SWAY_CM = 0.9


def _check_ratio(name: str, value: float) -> None:
    if not -1.0 - 1e-12 <= value <= 1.0 + 1e-12:
        raise ValueError(f"{name} must lie between -1 and 1, got {value!r}")


def equivalent_moment_factor(M_h: float, psi: float = 1.0, M_s: float = 0.0, load: str = "uniform") -> float:
    r"""Equivalent uniform moment factor :math:`C_m` of EN 1993-1-1 Annex B, Table B.3 (from memory).

    The moment diagram is described as the table does: the end moments :math:`M_h` and :math:`\psi M_h`
    (:math:`|\psi| \le 1`, :math:`M_h` the larger end moment in magnitude) and the span moment
    :math:`M_s`, which a transverse load of the given form (``"uniform"`` or ``"concentrated"``) adds;
    :math:`M_s = 0` is the linear diagram.

    - Linear diagram: :math:`C_m = 0.6 + 0.4\psi \ge 0.4`.
    - :math:`|M_s| \le |M_h|`, :math:`\alpha_s = M_s/M_h`: for :math:`0 \le \alpha_s \le 1`,
      :math:`C_m = 0.2 + 0.8\alpha_s \ge 0.4` (both forms); for :math:`-1 \le \alpha_s < 0`,
      uniform :math:`0.1 - 0.8\alpha_s` (:math:`\psi \ge 0`) or :math:`0.1(1 - \psi) - 0.8\alpha_s`
      (:math:`\psi < 0`), concentrated :math:`-0.8\alpha_s` (:math:`\psi \ge 0`) or :math:`0.2(-\psi) -
      0.8\alpha_s` (:math:`\psi < 0`), each :math:`\ge 0.4`.
    - :math:`|M_s| > |M_h|`, :math:`\alpha_h = M_h/M_s`: uniform :math:`0.95 + 0.05\alpha_h`, concentrated
      :math:`0.90 + 0.10\alpha_h`; when :math:`\alpha_h < 0` and :math:`\psi < 0` the :math:`\alpha_h` term is
      multiplied by :math:`(1 + 2\psi)`.

    Examples
    --------
    >>> equivalent_moment_factor(0.0, 0.0, 1.0, "uniform")  # simply supported, uniform load
    0.95
    >>> round(equivalent_moment_factor(1.0, -1.0), 12)  # double curvature, end moments only
    0.4
    """
    _check_ratio("psi", psi)
    if load not in LOAD_FORMS:
        raise ValueError(f"load must be one of {LOAD_FORMS}, got {load!r}")
    if M_s == 0.0:
        return max(0.4, 0.6 + 0.4 * psi)
    uniform = load == "uniform"
    if abs(M_s) <= abs(M_h):
        alpha_s = M_s / M_h
        if alpha_s >= 0.0:
            return max(0.4, 0.2 + 0.8 * alpha_s)
        if psi >= 0.0:
            return max(0.4, (0.1 if uniform else 0.0) - 0.8 * alpha_s)
        return max(0.4, (0.1 * (1.0 - psi) if uniform else -0.2 * psi) - 0.8 * alpha_s)
    alpha_h = M_h / M_s
    term = alpha_h * (1.0 + 2.0 * psi) if (alpha_h < 0.0 and psi < 0.0) else alpha_h
    return 0.95 + 0.05 * term if uniform else 0.90 + 0.10 * term


@dataclass(frozen=True)
class InteractionFactors:
    """The four interaction factors of Table B.1 and the relative axial forces they were found at [-]."""

    k_yy: float
    k_yz: float
    k_zy: float
    k_zz: float
    n_y: float
    n_z: float
    C_my: float | None = None  # Annex A with lateral-torsional buckling: C_my as modified by a_LT
    C_mLT: float = 1.0


def interaction_factors(
    *,
    N_Ed: float,
    N_Rk: float,
    chi_y: float,
    chi_z: float,
    lambda_y: float,
    lambda_z: float,
    C_my: float,
    C_mz: float,
    section_class: int,
    hollow: bool = False,
    gamma_M1: float = 1.0,
    C_mLT: float | None = None,
) -> InteractionFactors:
    r"""Interaction factors of EN 1993-1-1 Annex B, Table B.1 (members not susceptible to torsional
    deformations).

    With :math:`n_i = N_{Ed}/(\chi_i N_{Rk}/\gamma_{M1})`, for class 1 and 2 (plastic properties):

    - :math:`k_{yy} = C_{my}(1 + (\bar\lambda_y - 0.2)n_y) \le C_{my}(1 + 0.8n_y)`;
    - :math:`k_{zz} = C_{mz}(1 + (2\bar\lambda_z - 0.6)n_z) \le C_{mz}(1 + 1.4n_z)` for I and H sections,
      :math:`C_{mz}(1 + (\bar\lambda_z - 0.2)n_z) \le C_{mz}(1 + 0.8n_z)` for hollow sections;
    - :math:`k_{yz} = 0.6\,k_{zz}`, :math:`k_{zy} = 0.6\,k_{yy}`;

    and for class 3 (elastic properties):

    - :math:`k_{yy} = C_{my}(1 + 0.6\bar\lambda_y n_y) \le C_{my}(1 + 0.6n_y)`, and :math:`k_{zz}` alike in z;
    - :math:`k_{yz} = k_{zz}`, :math:`k_{zy} = 0.8\,k_{yy}`.

    ``N_Ed`` is the compressive force [N] (>= 0), ``N_Rk`` [N] the characteristic resistance :math:`A f_y`.

    With ``C_mLT`` given (a member susceptible to torsional deformations, lateral-torsional buckling
    possible; not for hollow sections), :math:`k_{zy}` is that of Table B.2 (from memory), the other three
    as above:

    - class 1–2, :math:`\bar\lambda_z \ge 0.4`: :math:`k_{zy} = \max\left(1 - \frac{0.1\bar\lambda_z n_z}
      {C_{mLT} - 0.25}, 1 - \frac{0.1 n_z}{C_{mLT} - 0.25}\right)`;
    - class 1–2, :math:`\bar\lambda_z < 0.4`: :math:`k_{zy} = \min\left(0.6 + \bar\lambda_z,
      1 - \frac{0.1\bar\lambda_z n_z}{C_{mLT} - 0.25}\right)`;
    - class 3: :math:`k_{zy} = \max\left(1 - \frac{0.05\bar\lambda_z n_z}{C_{mLT} - 0.25},
      1 - \frac{0.05 n_z}{C_{mLT} - 0.25}\right)`.

    >>> k = interaction_factors(N_Ed=500e3, N_Rk=1e6, chi_y=0.9, chi_z=0.5, lambda_y=0.5, lambda_z=1.2,
    ...     C_my=1.0, C_mz=1.0, section_class=1, C_mLT=0.6)
    >>> round(k.k_zy, 6)  # 1 - 0.1*1.2*1.0/0.35 = 0.657 is below the bound 1 - 0.1*1.0/0.35
    0.714286
    """
    if section_class not in (1, 2, 3):
        raise ValueError(f"section_class must be 1, 2 or 3 (class 4 is not covered), got {section_class!r}")
    if N_Ed < 0.0:
        raise ValueError(f"N_Ed is a compressive force, >= 0; got {N_Ed!r}")
    n_y = N_Ed / (chi_y * N_Rk / gamma_M1)
    n_z = N_Ed / (chi_z * N_Rk / gamma_M1)
    torsional = C_mLT is not None and not hollow
    if torsional and not C_mLT > 0.25:
        raise ValueError(f"C_mLT must be > 0.25 (Table B.3 gives at least 0.4), got {C_mLT!r}")
    if section_class == 3:
        k_yy = C_my * min(1.0 + 0.6 * lambda_y * n_y, 1.0 + 0.6 * n_y)
        k_zz = C_mz * min(1.0 + 0.6 * lambda_z * n_z, 1.0 + 0.6 * n_z)
        k_zy = 0.8 * k_yy
        if torsional:
            d = C_mLT - 0.25
            k_zy = max(1.0 - 0.05 * lambda_z * n_z / d, 1.0 - 0.05 * n_z / d)
        return InteractionFactors(k_yy, k_zz, k_zy, k_zz, n_y, n_z, C_mLT=C_mLT or 1.0)
    k_yy = C_my * min(1.0 + (lambda_y - 0.2) * n_y, 1.0 + 0.8 * n_y)
    if hollow:
        k_zz = C_mz * min(1.0 + (lambda_z - 0.2) * n_z, 1.0 + 0.8 * n_z)
    else:
        k_zz = C_mz * min(1.0 + (2.0 * lambda_z - 0.6) * n_z, 1.0 + 1.4 * n_z)
    k_zy = 0.6 * k_yy
    if torsional:
        d = C_mLT - 0.25
        if lambda_z >= 0.4:
            k_zy = max(1.0 - 0.1 * lambda_z * n_z / d, 1.0 - 0.1 * n_z / d)
        else:
            k_zy = min(0.6 + lambda_z, 1.0 - 0.1 * lambda_z * n_z / d)
    return InteractionFactors(k_yy, 0.6 * k_zz, k_zy, k_zz, n_y, n_z, C_mLT=C_mLT or 1.0)


@dataclass(frozen=True)
class MemberCheck:
    """The left-hand sides of eqs. (6.61) and (6.62) [-], and their three terms each."""

    eq_6_61: float
    eq_6_62: float
    terms_6_61: tuple[float, float, float]
    terms_6_62: tuple[float, float, float]

    @property
    def utilization(self) -> float:
        """The larger of the two equations [-]."""
        return max(self.eq_6_61, self.eq_6_62)


def member_check(
    *,
    N_Ed: float,
    M_y_Ed: float,
    M_z_Ed: float,
    N_Rk: float,
    M_y_Rk: float,
    M_z_Rk: float,
    chi_y: float,
    chi_z: float,
    factors: InteractionFactors,
    chi_LT: float = 1.0,
    gamma_M1: float = 1.0,
) -> MemberCheck:
    r"""Eqs. (6.61) and (6.62) of EN 1993-1-1 §6.3.3(4) (numbers from memory); forces in N, moments in N·m.

    The moments are the largest first-order moments along the member, in magnitude; :math:`\chi_{LT} = 1`
    means lateral-torsional buckling is prevented or not yet checked (the caller says which).
    """
    axial_y = N_Ed / (chi_y * N_Rk / gamma_M1)
    axial_z = N_Ed / (chi_z * N_Rk / gamma_M1)
    bend_y = abs(M_y_Ed) / (chi_LT * M_y_Rk / gamma_M1)
    bend_z = abs(M_z_Ed) / (M_z_Rk / gamma_M1)
    t61 = (axial_y, factors.k_yy * bend_y, factors.k_yz * bend_z)
    t62 = (axial_z, factors.k_zy * bend_y, factors.k_zz * bend_z)
    return MemberCheck(sum(t61), sum(t62), t61, t62)
