r"""From a case to the member the solver analyses: the stiffness, the section and material, and the bow.

- **Stiffness.** :math:`EI` is the case's ``EI`` when given, else :math:`E I` of the material and section
  about
  the chosen axis; either way multiplied by ``stiffness_factor`` (for example :math:`0.8\tau_b` of the
  AISC 360-16
  direct analysis method, Appendix 1/Chapter C, from memory), which changes the analysis only.
- **Bow.** An explicit ``shape`` and ``amplitude``, or a code preset:

  - ``en1993-table-5.1``: :math:`e_0 = L/n` of EN 1993-1-1:2005 Table 5.1 for the buckling curve and the
    analysis type (elastic or plastic) [text: Simões da Silva et al., ECCS 2010, table 2.20];
  - ``en1993-eq-5.9``: the first-mode-shaped bow of EN 1993-1-1 §5.3.2(11), eq. (5.9) (from memory), whose
    elastic second-order cross-section check reproduces :math:`\chi N_{Rk}` exactly (the Ayrton–Perry
    identity);
  - ``aisc-l/1000``: :math:`L/1000`, AISC 303-16 §7.13.1.1 [text];
  - ``span``: :math:`L/n` with the case's ``ratio``.

  The curve is chosen from the section, axis, thickness and manufacture by EN 1993-1-1 Table 6.2 unless
  the case
  names one.
- **Direction.** The code asks for the imperfection in the unfavourable direction (EN 1993-1-1 §5.3.2, from
  memory), which depends on the axial force (a bow with the loads straightens under tension). With a preset's
  ``direction: "load"`` (automatic, the default) the analysis solves the member with the bow (and sway) both
  ways and keeps the worse (:func:`engine.analysis.solve`); ``amplitude`` here is the sign that points with
  the loads' first-order deflection. ``positive`` or ``negative`` fix it.
- **Members with an end that can translate** (free, guided, or a translational spring): a preset's bow takes
  the shape of the member's first buckling mode (a half sine between the ends does not fit a cantilever), and
  the Table 5.1, span and AISC presets add the global sway of :mod:`engine.sway` (EN 1993-1-1 eq. (5.5), or
  AISC's 1/500), pointing the same way as the bow. The eq. (5.9) bow has none: EN 1993-1-1 §5.3.2(11) makes
  the first-mode imperfection the unique global and local one (from memory).
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

import numpy as np

from engine import codes
from engine.case import Imperfection
from engine.classification import area_in_compression, eq_5_9_modulus
from engine.design.en_member import curve_of
from engine.errors import CaseError
from engine.imperfections import Bow, bow_for
from engine.materials import material_from_spec
from engine.mode_peak import mode_curvature_peak
from engine.restraints import by_section, for_plane, foundations_for_plane
from engine.sections import section_from_spec
from engine.solver import restrained
from engine.solver.batch import Batch
from engine.solver.buckling import Buckling
from engine.solver.model import Model, Points
from engine.sway import AISC_OUT_OF_PLUMB, SOURCE_AISC, SOURCE_EN, can_sway, sway_anchor, sway_phi

__all__ = ["BowChoice", "Member", "Segment", "critical_loads", "resolve", "segments_of", "si_label"]


def si_label(template: str, values: dict) -> str:
    """A bow label's template in SI: bow sizes in mm to 0.01 mm, heights in m (the engine's own wording)."""
    shown = {name: (f"{v:g} m" if name == "h" else f"{v * 1e3:.2f} mm") for name, v in values.items()}
    return template.format(**shown)


@dataclass(frozen=True, kw_only=True)
class BowChoice:
    """The initial bow the analysis uses, and why.

    Attributes
    ----------
    shape : str
    amplitude : float
        Signed largest |w0| [m].
    label : str
        In words, in SI, e.g. ``EN 1993-1-1 Table 5.1, curve b, elastic analysis: e0 = L/250 = 24.00 mm``.
    label_template : str
        The same words with the quantities as ``{name}`` fields, e.g. ``... e0 = L/250 = {amplitude}``.
    label_values : dict
        The quantities of the template in SI: ``amplitude`` and ``e0`` (bow sizes) [m], ``h`` (a height) [m].
        An application words the label in its own units from these two (``app/report`` does).
    source : str
    curve : str or None
        The buckling curve, when a section and steel material are known.
    curve_reason : str or None
        Why that curve (EN 1993-1-1 Table 6.2 row), or "given".
    code_amplitude : float or None
        The EN 1993-1-1 Table 5.1 amplitude for comparison [m], None when not applicable. ``code_bow``: an EN
        preset (Table 5.1 or eq. (5.9)) with a curve no laxer than Table 6.2's (``member_routes.bow_short``).
    code_label, code_source : str
    opposes_load : bool
        The bow points against the first-order deflection of the loads.
    sway : float
        Signed global sway φ [rad] on top of the bow (0 for none): w0 += sway · |x - sway_anchor|.
    sway_anchor : float
        The end held against translation, where the sway is zero [m].
    sway_label, sway_source : str
    automatic : bool
        The direction is the case's automatic one: the analysis solves both and keeps the worse.
    direction : str
        This bow's direction in words: "with the loads' deflection", "against the loads' deflection", or
        "+w"/"-w" when the loads give no direction.
    direction_governing : str or None
        On a result's bow: which direction governed and why, when both were solved.
    directions : tuple
        On a result's bow: ``(direction, strength utilisation or None, max|M| [N·m])`` of each direction
        solved, the one used first.
    favourable : bool
        On a result's bow: the direction used is the favourable one (reversed, it gives a larger utilisation
        or moment); only where the case fixes the direction. ``notes``: how the bow was adapted to the member.
    alternatives : tuple of BowChoice
        Where a preset's bow takes the first mode's shape (not eq. (5.9)'s): the same e0 as a half sine,
        the same sway, with the sway and (with a sway) against it, the worst kept (:func:`resolve`).
    """

    shape: str
    amplitude: float
    label: str
    source: str
    curve: str | None = None
    curve_reason: str | None = None
    code_amplitude: float | None = None
    code_bow: bool = False
    code_label: str = ""
    code_source: str = ""
    opposes_load: bool = False
    sway: float = 0.0
    sway_anchor: float = 0.0
    sway_label: str = ""
    sway_source: str = ""
    automatic: bool = False
    direction: str = ""
    direction_governing: str | None = None
    directions: tuple = ()
    favourable: bool = False
    notes: tuple = ()
    label_template: str = ""
    label_values: dict = dataclasses.field(default_factory=dict, compare=False, hash=False)
    alternatives: tuple = ()

    @property
    def sway_slope(self) -> float:
        """dw0/dx of the sway part [-] (the sway grows away from its anchor)."""
        return self.sway if self.sway_anchor == 0.0 else -self.sway

    def reversed(self) -> BowChoice:
        """The same bow and sway pointing the other way."""
        word = {
            "with the loads' deflection": "against the loads' deflection",
            "against the loads' deflection": "with the loads' deflection",
            "+w": "-w",
            "-w": "+w",
        }
        return dataclasses.replace(
            self,
            amplitude=-self.amplitude,
            sway=-self.sway,
            opposes_load=not self.opposes_load if self.direction.endswith("deflection") else False,
            direction=word.get(self.direction, self.direction),
        )


@dataclass(frozen=True, kw_only=True)
class Segment:
    """One length of a member stepped in section: from ``start`` to ``end`` [m], its ``section`` (about the
    case's axis, from ``spec``) and its ``material`` (f_y for that section's thickness)."""

    start: float
    end: float
    spec: object
    section: object
    material: object


def segments_of(case) -> tuple:
    """The segments of a case stepped in section (the case's own section up to the first step, then each
    step's), or () when its steps are not by section (:func:`engine.restraints.by_section`)."""
    if not by_section(case):
        return ()
    specs = [case.section, *(s.section for s in case.steps)]
    cuts = [0.0, *(float(s.x) for s in case.steps), float(case.length)]
    out = []
    for spec, a, b in zip(specs, cuts[:-1], cuts[1:], strict=True):
        section = section_from_spec(dict(spec), case.axis)
        out.append(
            Segment(
                start=a,
                end=b,
                spec=spec,
                section=section,
                material=material_from_spec(dict(case.material), section.t_max),
            )
        )
    return tuple(out)


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
    segments : tuple of Segment
        A member stepped in section: each segment's section and material (the first is ``section``); () for a
        uniform member.
    """

    EI: float
    EI_source: str
    section: object
    material: object
    bow: BowChoice
    segments: tuple = ()


_STEEL_LIKE = ("steel",)


def _curve(case, section, material, segments=()):
    imp = case.imperfection
    if imp.curve != "auto":
        return imp.curve, "given in the case"
    return _table_curve(section, material, segments)


def _table_curve(section, material, segments=()):
    """Table 6.2's curve of the section (the segments' worst), or (None, None) without a steel section."""
    if section is None or material is None or material.kind not in _STEEL_LIKE:
        return None, None
    if segments:  # stepped in section: the segments' worst curve (the largest bow of Table 5.1)
        found = [curve_of(s.section, s.material) for s in segments]
        curve, why = max(found, key=lambda c: codes.BUCKLING_CURVES.index(c[0]))
        return curve, f"{why}; the worst curve of the segments (stepped in section)"
    return curve_of(section, material)  # section is about case.axis (section_from_spec(..., case.axis))


def _code_bow(imp, curve, section, material, segments) -> bool:
    """Whether the bow is an EN 1993-1-1 preset (Table 5.1, eq. (5.9)) on a curve no laxer than Table 6.2's
    own: a curve given below it gives a smaller bow than the code's (an audit: curve a0 about z–z of an
    HEB 200 read 0.239 where the automatic curve reads 0.337)."""
    if imp.preset not in ("en1993-table-5.1", "en1993-eq-5.9") or curve is None:
        return False
    if imp.curve == "auto":
        return True
    own, _ = _table_curve(section, material, segments)
    order = codes.BUCKLING_CURVES
    return own is None or order.index(curve) >= order.index(own)


def _step_EI(case, step) -> float:
    """A step's EI [N·m²] before the stiffness factor: its own, or E·I of its section about the axis."""
    if step.section is None:
        return step.EI
    section = section_from_spec(dict(step.section), case.axis)
    return material_from_spec(dict(case.material), section.t_max).E * section.I


def _plain(case, EI):
    """The case the solver runs: EI explicit; no bow, section, material, stiffness factor or second plane."""
    steps = case.steps
    if steps and case.section is not None:
        steps = tuple(type(s)(x=s.x, EI=_step_EI(case, s)) for s in steps)
    return dataclasses.replace(
        case,
        EI=EI,
        steps=tuple(dataclasses.replace(s, EI=s.EI * case.stiffness_factor) for s in steps),
        restraints=for_plane(case.restraints, "first"),
        foundation=foundations_for_plane(case.foundation, "first"),
        imperfection=Imperfection(),
        section=None,
        material=None,
        stiffness_factor=1.0,
        second_plane=None,
    )


#: The note's end where a preset's first-mode bow has the half-sine readings beside it (not eq. (5.9)'s).
_ALSO_SINE = (
    "; the same e0 as a half sine between the ends, with the same sway, pointing with it and against it "
    "(EN 1993-1-1 §5.3.2(3): a local bow relative to the chord), is solved as well and the worst kept."
)


def _also_sine(preset: str) -> str:
    return "." if preset == "en1993-eq-5.9" else _ALSO_SINE


def _orient(case, plain, EI, shape: str, amplitude: float, sway: float, anchor: float) -> tuple:
    """``(amplitude, sway, direction in words, opposes the loads)`` of a bow and its sway, signed as the case
    asks: a preset with direction ``"load"`` pointing with the loads' first-order deflection (the projection
    of that deflection on bow + sway), ``"negative"`` reversed; a bow given by shape keeps its sign."""
    imp = case.imperfection
    direction = "+w"
    opposes = False
    if (shape != "none" and amplitude != 0.0) or sway != 0.0:
        factor = 1.0 if imp.preset is None or imp.direction != "negative" else -1.0
        if imp.preset is not None:
            amplitude = abs(amplitude)
        # The sign of the projection of the loads' first-order deflection on bow + sway says which way is
        # "with the loads" (the real sizes of both parts, the bow's sign as the case gives it).
        projection = _projection(case, plain, EI, shape, amplitude, sway, anchor)
        direction = ""
        if projection:
            if imp.preset is not None and imp.direction == "load":
                factor = math.copysign(1.0, projection)
            opposes = projection * factor < 0
            direction = "against the loads' deflection" if opposes else "with the loads' deflection"
        amplitude, sway = amplitude * factor, sway * factor
        if not direction:
            direction = "+w" if (amplitude if amplitude != 0.0 else sway) >= 0 else "-w"
    return amplitude, sway, direction, opposes


def _words(case, plain, EI, amplitude: float, sway: float, anchor: float) -> tuple:
    """``(direction in words, opposes the loads)`` of a half-sine bow and its sway, signed as given."""
    projection = _projection(case, plain, EI, "sine", amplitude, sway, anchor)
    if projection:
        against = projection < 0
        return ("against" if against else "with") + " the loads' deflection", against
    return ("+w" if amplitude >= 0 else "-w"), False


def _projection(case, plain, EI, shape: str, amplitude: float, sway: float, anchor: float) -> float:
    """∫ w1 · (bow + sway) dx of the loads' first-order deflection, or 0.0 where it says nothing (no loads,
    or a projection at the rounding level)."""
    if not case.loads:
        return 0.0
    L = float(plain.length)
    bow = Imperfection(shape=shape, amplitude=amplitude) if shape != "none" and amplitude != 0.0 else None
    trial = dataclasses.replace(plain, imperfection=bow or Imperfection())
    buckling = critical_loads(trial, 1) if shape == "mode" and bow is not None else None
    x = np.linspace(0.0, L, 201)
    values = bow_for(trial, buckling, sway if anchor == 0.0 else -sway, anchor).derivatives(x)[0]
    projection, w_scale = _first_order_projection(case, EI, values, x)
    if w_scale > 0 and abs(projection) > 1e-12 * w_scale * float(np.abs(values).max()) * L:
        return projection
    return 0.0


def _first_order_projection(case, EI, shape_values, x):
    """∫ w1 · w0 dx of the loads' first-order deflection onto a bow shape (its sign is all that matters)."""
    plain = _plain(case, EI)
    model = Model(plain, Bow(shape="none", amplitude=0.0, length=plain.length))
    batch = Batch(model, [0.0])
    pts = Points(model, model.segment_of(x), x - model.xa[model.segment_of(x)])
    w1 = batch.states(0, pts)["w"]
    values = w1 * shape_values
    return float(np.sum(0.5 * (values[1:] + values[:-1]) * np.diff(x))), float(np.abs(w1).max())


def critical_loads(case, count: int = 5) -> Buckling:
    """The first elastic critical compressive loads and modes of the member in ``case``.

    EI is the case's own, or E·I of its section and material, times the stiffness factor (:func:`resolve`);
    the loads [N] are then those of :func:`engine.solver.buckling.critical_loads` for that EI.

    Examples
    --------
    >>> from engine.case import Case, EndSupport
    >>> pinned = EndSupport.named("pinned")
    >>> case = Case(length=2.0, EI=2.0, stiffness_factor=0.5, left=pinned, right=pinned)
    >>> round(float(critical_loads(case, 1).critical_loads[0] / (3.141592653589793**2 / 4)), 9)
    1.0
    """
    if case.EI is None or case.stiffness_factor != 1.0:
        case = resolve(case)[1]
    return restrained.critical_loads(case, count)


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
        raise CaseError(
            f"section: E·I = {EI!r} N·m² of this section and material is below 1e-3 N·m², "
            "smaller than any structural member"
        )
    if case.stiffness_factor != 1.0:
        EI *= case.stiffness_factor
        EI_source += f", times the stiffness factor {case.stiffness_factor:g}"
    L = case.length
    imp = case.imperfection
    segments = segments_of(case)
    if segments:
        section, material = segments[0].section, segments[0].material
    curve, reason = _curve(case, section, material, segments)
    label_values = {}
    code_amp = None
    code_label = code_source = ""
    method = case.check.method
    if curve is not None:
        ratio = codes.bow_ratio(curve, method)
        code_amp = L / ratio
        code_label = f"EN 1993-1-1 Table 5.1, curve {curve}, {method} analysis: L/{ratio}"
        code_source = "EN 1993-1-1:2005 Table 5.1 [text: Simões da Silva et al., ECCS 2010, table 2.20]"
    plain = _plain(case, EI)
    notes = []
    if imp.preset is None:
        shape, amplitude = imp.shape, imp.amplitude
        label = f"{shape}, amplitude {{amplitude}} (given)" if shape != "none" else "no initial bow"
        source = "given in the case"
    else:
        shape = imp.shape if imp.shape != "none" else ("mode" if imp.preset == "en1993-eq-5.9" else "sine")
        if imp.preset == "en1993-table-5.1":
            if curve is None:
                raise CaseError(
                    "imperfection.curve: the EN 1993-1-1 Table 5.1 preset needs a buckling curve: "
                    "give 'curve' (a0, a, b, c or d) or a steel section and material"
                )
            # Table 5.1's column follows the cross-section check: a plastic check needs the plastic
            # column's larger bow whatever the preset states (the elastic one would err on the unsafe side).
            column = "plastic" if method == "plastic" else imp.analysis
            ratio = codes.bow_ratio(curve, column)
            amplitude = L / ratio
            label = f"EN 1993-1-1 Table 5.1, curve {curve}, {column} analysis: e0 = L/{ratio}"
            source = code_source or "EN 1993-1-1:2005 Table 5.1 [text: ECCS 2010, table 2.20]"
            if column != imp.analysis:
                notes.append(
                    "The check is plastic, so the bow is Table 5.1's plastic value (the preset stated "
                    "elastic analysis, whose smaller bow belongs with an elastic cross-section check)."
                )
            code_amp = None  # the user chose the code value itself
        elif imp.preset == "en1993-eq-5.9":
            if section is None or material is None or curve is None:
                raise CaseError(
                    "imperfection.preset: 'en1993-eq-5.9' needs a section and a steel material "
                    "(or a curve), for the slenderness and M_Rk/N_Rk of eq. (5.9)"
                )
            first = critical_loads(plain, 1)
            pcr1 = float(first.critical_loads[0])
            # A_eff for a section class 4 in uniform compression (λ̄ and N_Rk of eq. (5.9); EN 1993-1-5 §4.4)
            area = area_in_compression(section, material)
            lam = codes.slenderness(area, material.fy, pcr1)
            W = eq_5_9_modulus(section, material, method)
            e0 = codes.eq_5_9_amplitude(
                curve=curve,
                lambda_bar=lam,
                M_Rk=W * material.fy,
                N_Rk=area * material.fy,
                gamma_M1=case.check.gamma_M1,
            )
            # Eq. (5.9): η_init = e0 · N_cr / (EI |η''_cr|max) · η_cr, with η_cr normalised to max|η| = 1;
            # with restraints or a foundation, EI|η''_cr| is the mode's own moment, found along every segment.
            peak = first.moment_peak() if hasattr(first, "moment_peak") else EI * mode_curvature_peak(first)
            factor = pcr1 / peak if peak > 0.0 else math.inf  # a rigid-body mode has no curvature
            amplitude = e0 * factor if e0 > 0.0 else 0.0
            if amplitude > L / 10:
                # Capping it would make the route unconservative (capacity above χ A f_y / γ_M1): refuse.
                size = (
                    f"= {amplitude * 1e3:.0f} mm exceeds L/10 = {L / 10 * 1e3:.0f} mm"
                    if math.isfinite(amplitude)
                    else "is unbounded: the mode has no curvature"
                )
                raise CaseError(
                    f"imperfection.preset: the eq. (5.9) bow e0·N_cr/(EI·|η''|max) {size}: the first "
                    "buckling mode of these supports is nearly a rigid-body sway with little "
                    "curvature (soft translational springs); use the Table 5.1 preset with a "
                    "sway imperfection, or stiffer supports"
                )
            label = (
                f"EN 1993-1-1 eq. (5.9)/(5.10), curve {curve}, λ̄ = {lam:.3f}, "
                f"e0 = {{e0}}, first-mode bow e0·N_cr/(EI·|η''|max) = e0 × {factor:.4g} = {{amplitude}}"
            )
            label_values["e0"] = float(e0)
            source = (
                "EN 1993-1-1:2005 §5.3.2(11), eqs. (5.9) and (5.10) (from memory); checked on this "
                "route by the linear N–M interaction with γ_M1"
            )
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
    sway = anchor = 0.0
    sway_label = sway_source = ""
    reshaped = False  # a sine or parabola preset bow taken as the first mode (the notes below say why)
    if imp.preset is not None and shape in ("sine", "parabola") and (plain.restraints or plain.foundation):
        notes.append(
            f"The {shape} bow between the ends does not fit a member with intermediate restraints or a "
            "foundation: the bow takes the shape of the member's first buckling mode, with the amplitude "
            "of the whole member (EN 1993-1-1 §5.3.2(11), from memory)" + _also_sine(imp.preset)
        )
        shape, reshaped = "mode", True
    if imp.preset is not None and can_sway(plain):
        if shape in ("sine", "parabola"):
            notes.append(
                f"The {shape} bow between the ends does not fit a member with an end that can "
                "translate: the bow takes the shape of the member's first buckling mode instead "
                "(EN 1993-1-1 §5.3.2(11), from memory)" + _also_sine(imp.preset)
            )
            shape, reshaped = "mode", True
        if imp.preset != "en1993-eq-5.9" and shape != "sway":  # a sway shape is a sway already
            anchor = sway_anchor(plain)
            if imp.preset == "aisc-l/1000":
                phi = AISC_OUT_OF_PLUMB
                sway_label, sway_source = "sway 1/500 (AISC out of plumb)", SOURCE_AISC
            else:
                phi, a_h, a_m = sway_phi(L, imp.columns)
                sway_label = (
                    f"sway φ = φ0·α_h·α_m = (1/200)·{a_h:.3f}·{a_m:.3f} "
                    f"= 1/{1 / phi:.0f} (h = L = {{h}}, m = {imp.columns})"
                )
                sway_source = SOURCE_EN
                label_values["h"] = float(L)
            sway = phi
    amplitude, sway, direction, opposes = _orient(case, plain, EI, shape, amplitude, sway, anchor)
    if imp.preset is not None and shape != "none":
        label += " = {amplitude}" if "{amplitude}" not in label else ""
    base_label = label
    if reshaped:
        label += ", first-mode shape"
    if sway_label:
        label += f"; {sway_label}"
    label_values["amplitude"] = abs(float(amplitude))
    bow = BowChoice(
        shape=shape,
        amplitude=float(amplitude),
        label=si_label(label, label_values),
        label_template=label,
        label_values=label_values,
        source=source,
        curve=curve,
        curve_reason=reason,
        code_amplitude=code_amp,
        code_bow=_code_bow(imp, curve, section, material, segments),
        code_label=code_label,
        code_source=code_source,
        opposes_load=opposes,
        sway=float(sway),
        sway_anchor=float(anchor),
        sway_label=si_label(sway_label, label_values),
        sway_source=sway_source,
        automatic=imp.preset is not None and imp.direction == "load",
        direction=direction,
        notes=tuple(notes),
    )
    if reshaped and imp.preset != "en1993-eq-5.9":
        # EN 1993-1-1 §5.3.2(3): the sway and a local bow e0 relative to the chord (a half sine between the
        # ends), each its unfavourable way. The first mode alone can carry no curvature (a rigid tilt on a
        # spring: no moment, found unsafe by an independent check): the half sine is solved too, both ways.
        sine_sway = _orient(case, plain, EI, "sine", abs(amplitude), abs(sway), anchor)
        signs = (1.0, -1.0) if sine_sway[1] != 0.0 else (1.0,)
        made = []
        for sign in signs:
            amp = sign * sine_sway[0]
            words = _words(case, plain, EI, amp, sine_sway[1], anchor)
            text = base_label + ", half sine between the ends" + ("" if sign > 0 else ", against the sway")
            text += f"; {sway_label}" if sway_label else ""
            made.append(
                dataclasses.replace(
                    bow,
                    shape="sine",
                    amplitude=float(amp),
                    sway=float(sine_sway[1]),
                    direction=words[0],
                    opposes_load=words[1],
                    label=si_label(text, label_values),
                    label_template=text,
                )
            )
        bow = dataclasses.replace(bow, alternatives=tuple(made))
    analysis_case = dataclasses.replace(
        plain, imperfection=Imperfection(shape=shape, amplitude=float(amplitude))
    )
    member = Member(
        EI=EI, EI_source=EI_source, section=section, material=material, bow=bow, segments=segments
    )
    return member, analysis_case
