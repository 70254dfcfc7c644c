r"""From a case to the member the solver analyses: the stiffness, the section and material, and the bow.

- **Stiffness.** :math:`EI` is the case's ``EI`` when given, else :math:`E I` of the material and section about
  the chosen axis; either way multiplied by ``stiffness_factor`` (for example :math:`0.8\tau_b` of the AISC 360-16
  direct analysis method, Appendix 1/Chapter C, from memory), which changes the analysis only.
- **Bow.** An explicit ``shape`` and ``amplitude``, or a code preset:

  - ``en1993-table-5.1``: :math:`e_0 = L/n` of EN 1993-1-1:2005 Table 5.1 for the buckling curve and the
    analysis type (elastic or plastic) [text: Simões da Silva et al., ECCS 2010, table 2.20];
  - ``en1993-eq-5.9``: the first-mode-shaped bow of EN 1993-1-1 §5.3.2(11), eq. (5.9) (from memory), whose
    elastic second-order cross-section check reproduces :math:`\chi N_{Rk}` exactly (the Ayrton–Perry identity);
  - ``aisc-l/1000``: :math:`L/1000`, AISC 303-16 §7.13.1.1 [text];
  - ``span``: :math:`L/n` with the case's ``ratio``.

  The curve is chosen from the section, axis, thickness and manufacture by EN 1993-1-1 Table 6.2 unless the case
  names one. A preset's bow points the way the loads deflect the member (``direction: "load"``, the
  unfavourable way) unless the case says ``positive`` or ``negative``.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

import numpy as np

from engine import codes
from engine.buckling import critical_loads
from engine.case import Imperfection
from engine.classification import eq_5_9_modulus
from engine.imperfections import Bow, bow_for
from engine.materials import material_from_spec
from engine.sections import section_from_spec

__all__ = ["BowChoice", "Member", "resolve"]


@dataclass(frozen=True, kw_only=True)
class BowChoice:
    """The initial bow the analysis uses, and why.

    Attributes
    ----------
    shape : str
    amplitude : float
        Signed largest |w0| [m].
    label : str
        In words, e.g. ``EN 1993-1-1 Table 5.1, curve b, elastic analysis: e0 = L/250 = 24.0 mm``.
    source : str
    curve : str or None
        The buckling curve, when a section and steel material are known.
    curve_reason : str or None
        Why that curve (EN 1993-1-1 Table 6.2 row), or "given".
    code_amplitude : float or None
        The EN 1993-1-1 Table 5.1 amplitude for comparison [m], None when not applicable.
    code_label, code_source : str
    opposes_load : bool
        The bow points against the first-order deflection of the loads.
    """

    shape: str
    amplitude: float
    label: str
    source: str
    curve: str | None = None
    curve_reason: str | None = None
    code_amplitude: float | None = None
    code_label: str = ""
    code_source: str = ""
    opposes_load: bool = False


@dataclass(frozen=True, kw_only=True)
class Member:
    """The resolved member.

    Attributes
    ----------
    EI : float
        Bending stiffness the analysis uses [N·m²], the stiffness factor applied.
    EI_source : str
    section : Section or None
    material : Material or None
    bow : BowChoice
    """

    EI: float
    EI_source: str
    section: object
    material: object
    bow: BowChoice


_STEEL_LIKE = ("steel",)


def _curve(case, section, material):
    imp = case.imperfection
    if imp.curve != "auto":
        return imp.curve, "given in the case"
    if section is None or material is None or material.kind not in _STEEL_LIKE:
        return None, None
    grade = material.name if material.name.upper().startswith("S") else None
    return codes.buckling_curve(shape=section.shape, manufacture=section.manufacture, axis=case.axis,
                                h_over_b=section.h_over_b, t_max=section.t_max, grade=grade)


def mode_curvature_peak(buckling) -> float:
    r""":math:`|\eta''_{cr}|_{max}` [1/m²] of the first mode, normalised to max|η| = 1, found exactly.

    The mode is :math:`c_0 + c_1\xi + c_2\varphi_2 + c_3\varphi_3` in ξ = x/L (:mod:`engine.buckling`), so
    :math:`L^2\eta'' = c_2\cos\lambda\xi + (c_3/\lambda)\sin\lambda\xi = R\cos(\lambda\xi - \theta)`:
    the peak is R where :math:`\lambda\xi - \theta` is a multiple of π inside the member, else at an end.
    """
    lam = float(buckling.wavenumbers[0])
    c = buckling._coefficients[0]
    a, b = float(c[2]), float(c[3]) / lam
    R = math.hypot(a, b)
    theta = math.atan2(b, a)
    k_low = math.ceil((0.0 - theta) / math.pi - 1e-12)
    inside = (theta + k_low * math.pi) <= lam * (1 + 1e-12)
    ends = max(abs(a), abs(a * math.cos(lam) + b * math.sin(lam)))
    return (R if inside else ends) / buckling.length**2


def _first_order_projection(case, EI, shape_values, x):
    """∫ w1 · w0 dx of the loads' first-order deflection onto a bow shape (its sign is all that matters)."""
    from engine.solution import Batch, Model, Points

    plain = dataclasses.replace(case, EI=EI, imperfection=Imperfection(), section=None, material=None,
                                stiffness_factor=1.0)
    model = Model(plain, Bow(shape="none", amplitude=0.0, length=plain.length))
    batch = Batch(model, [0.0])
    pts = Points(model, model.segment_of(x), x - model.xa[model.segment_of(x)])
    w1 = batch.states(0, pts)["w"]
    values = w1 * shape_values
    return float(np.sum(0.5 * (values[1:] + values[:-1]) * np.diff(x))), float(np.abs(w1).max())


def resolve(case):
    """The member of ``case`` and the plain case (explicit EI and bow) that the solver runs.

    Parameters
    ----------
    case : Case

    Returns
    -------
    member : Member
    analysis_case : Case
        ``case`` with ``EI`` and ``imperfection`` made explicit, and no section or material.
    """
    section = material = None
    if case.section is not None:
        section = section_from_spec(dict(case.section), case.axis)
    if case.material is not None:
        material = material_from_spec(dict(case.material), section.t_max if section is not None else None)
    if case.EI is not None:
        EI, EI_source = case.EI, "EI given in the case"
    else:
        EI = material.E * section.I
        EI_source = f"E·I of {material.name} and {section.name} ({case.axis} axis)"
    if EI < 1e-3:
        from engine.errors import CaseError

        raise CaseError(f"section: E·I = {EI!r} N·m² of this section and material is below 1e-3 N·m², "
                        "smaller than any structural member")
    if case.stiffness_factor != 1.0:
        EI *= case.stiffness_factor
        EI_source += f", times the stiffness factor {case.stiffness_factor:g}"
    L = case.length
    imp = case.imperfection
    curve, reason = _curve(case, section, material)
    code_amp = None
    code_label = code_source = ""
    method = case.check.method
    if curve is not None:
        ratio = codes.bow_ratio(curve, method)
        code_amp = L / ratio
        code_label = f"EN 1993-1-1 Table 5.1, curve {curve}, {method} analysis: L/{ratio}"
        code_source = "EN 1993-1-1:2005 Table 5.1 [text: Simões da Silva et al., ECCS 2010, table 2.20]"
    plain = dataclasses.replace(case, EI=EI, imperfection=Imperfection(), section=None, material=None,
                                stiffness_factor=1.0)
    if imp.preset is None:
        shape, amplitude = imp.shape, imp.amplitude
        label = f"{shape}, amplitude {amplitude * 1e3:.2f} mm (given)" if shape != "none" else "no initial bow"
        source = "given in the case"
    else:
        shape = imp.shape if imp.shape != "none" else ("mode" if imp.preset == "en1993-eq-5.9" else "sine")
        if imp.preset == "en1993-table-5.1":
            if curve is None:
                from engine.errors import CaseError

                raise CaseError("imperfection.curve: the EN 1993-1-1 Table 5.1 preset needs a buckling curve: "
                                "give 'curve' (a0, a, b, c or d) or a steel section and material")
            ratio = codes.bow_ratio(curve, imp.analysis)
            amplitude = L / ratio
            label = f"EN 1993-1-1 Table 5.1, curve {curve}, {imp.analysis} analysis: e0 = L/{ratio}"
            source = code_source or "EN 1993-1-1:2005 Table 5.1 [text: ECCS 2010, table 2.20]"
            code_amp = None  # the user chose the code value itself
        elif imp.preset == "en1993-eq-5.9":
            from engine.errors import CaseError

            if section is None or material is None or curve is None:
                raise CaseError("imperfection.preset: 'en1993-eq-5.9' needs a section and a steel material "
                                "(or a curve), for the slenderness and M_Rk/N_Rk of eq. (5.9)")
            first = critical_loads(plain, 1)
            pcr1 = float(first.critical_loads[0])
            lam = codes.slenderness(section.A, material.fy, pcr1)
            W = eq_5_9_modulus(section, material, method)
            e0 = codes.eq_5_9_amplitude(curve=curve, lambda_bar=lam, M_Rk=W * material.fy,
                                        N_Rk=section.A * material.fy, gamma_M1=case.check.gamma_M1)
            # Eq. (5.9): η_init = e0 · N_cr / (EI |η''_cr|max) · η_cr, with η_cr normalised to max|η| = 1.
            factor = pcr1 / (EI * mode_curvature_peak(first))
            amplitude = e0 * factor
            if amplitude > L / 10:
                # Capping it would make the route unconservative (capacity above χ A f_y / γ_M1): refuse.
                raise CaseError(f"imperfection.preset: the eq. (5.9) bow e0·N_cr/(EI·|η''|max) = "
                                f"{amplitude * 1e3:.0f} mm exceeds L/10 = {L / 10 * 1e3:.0f} mm: the first "
                                "buckling mode of these supports is nearly a rigid-body sway with little "
                                "curvature (soft translational springs); use the Table 5.1 preset with a "
                                "sway imperfection, or stiffer supports")
            label = (f"EN 1993-1-1 eq. (5.9)/(5.10), curve {curve}, lambda_bar = {lam:.3f}, "
                     f"e0 = {e0 * 1e3:.2f} mm, first-mode bow e0·N_cr/(EI·|η''|max) = e0 × {factor:.4g} "
                     f"= {abs(amplitude) * 1e3:.2f} mm")
            source = ("EN 1993-1-1:2005 §5.3.2(11), eqs. (5.9) and (5.10) (from memory); checked on this "
                      "route by the linear N–M interaction with γ_M1")
            code_amp = None
        elif imp.preset == "aisc-l/1000":
            amplitude = L / codes.AISC_OUT_OF_STRAIGHTNESS
            label = "AISC out-of-straightness L/1000"
            source = "AISC 303-16 §7.13.1.1 [text]"
            code_amp = None
        else:  # "span"
            amplitude = L / imp.ratio
            label = f"L/{imp.ratio:g}"
            source = "given in the case as a span ratio"
        amplitude = min(amplitude, L / 10)
    opposes = False
    if shape != "none" and amplitude != 0.0 and case.loads:
        trial = dataclasses.replace(plain, imperfection=Imperfection(shape=shape, amplitude=1.0 * L / 1000))
        buckling = critical_loads(trial, 1) if shape == "mode" else None
        bow = bow_for(trial, buckling)
        x = np.linspace(0.0, L, 201)
        projection, w_scale = _first_order_projection(case, EI, bow.derivatives(x)[0], x)
        if w_scale > 0 and abs(projection) > 1e-12 * w_scale * L * L / 1000:
            if imp.preset is not None:
                if imp.direction == "load":
                    amplitude = math.copysign(abs(amplitude), projection)
                elif imp.direction == "negative":
                    amplitude = -abs(amplitude)
            opposes = projection * amplitude < 0
    elif imp.preset is not None and imp.direction == "negative":
        amplitude = -abs(amplitude)
    if imp.preset is not None and shape != "none":
        label += f" = {abs(amplitude) * 1e3:.2f} mm" if "mm" not in label else ""
    bow = BowChoice(shape=shape, amplitude=float(amplitude), label=label, source=source, curve=curve,
                    curve_reason=reason, code_amplitude=code_amp, code_label=code_label, code_source=code_source,
                    opposes_load=opposes)
    analysis_case = dataclasses.replace(plain, imperfection=Imperfection(shape=shape, amplitude=float(amplitude)))
    return Member(EI=EI, EI_source=EI_source, section=section, material=material, bow=bow), analysis_case
