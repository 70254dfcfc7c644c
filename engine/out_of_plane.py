r"""Flexural buckling out of the plane of bending, EN 1993-1-1:2005 §6.3.1 (eqs. 6.46–6.49).

strutscope analyses one plane. A compressed member can also buckle about its OTHER axis (for bending about the
major axis of an I/H, the minor one), and until both planes are analysed this module makes the code's member
check for it:

.. math::

    N_{cr,o} = \frac{\pi^2 E I_o}{L_{cr,o}^2}, \quad
    \bar\lambda_o = \sqrt{\frac{A f_y}{N_{cr,o}}}, \quad
    N_{b,o,Rd} = \frac{\chi_o A f_y}{\gamma_{M1}}, \quad \frac{N_{Ed}}{N_{b,o,Rd}} \le 1

(:math:`A_{eff}` of EN 1993-1-5 §4.4 in place of :math:`A` for a section that is class 4 in uniform
compression, :func:`engine.classification.effective_area`), with :math:`\chi_o` of eq. (6.49) for the
buckling curve of EN 1993-1-1 Table 6.2 about that axis, and
:math:`L_{cr,o}` the case's ``out_of_plane.buckling_length`` (default: the member length, pin-ended about the
other axis; twice the member length where an end is free to translate in the plane analysed,
:data:`SWAY_NOTE`). ``{"restrained": true}`` says that out-of-plane buckling is prevented (the check is
then left out, and the result says so). The stiffness factor of the case is not applied: it belongs to the
in-plane analysis.

Only steel sections with a buckling curve are checked: a custom section (its properties are given about one
axis) or another material gets a warning that the check was not made. Another material with a catalogue or
parametric section still gets its elastic N_cr about the other axis, and N/N_cr counts in the member check as
a bound (kind :data:`ELASTIC_KIND`): no code's buckling resistance exceeds the elastic critical load (for
EN 1993-1-1's curves χ·λ̄² <= 1, so χ·A·f_y <= N_cr; common practice, no source for other materials), so the
code's utilisation is at least N/N_cr, and a member loaded beyond N_cr fails the check. Circular sections are
the same about every axis. Lateral-torsional buckling and the N–M interaction about both axes (§6.3.3) are
not covered here.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass
from typing import Any

from engine import codes
from engine.classification import area_in_compression
from engine.design.en_member import curve_of
from engine.errors import CaseError
from engine.sections import section_from_spec

__all__ = [
    "ELASTIC_KIND",
    "ELASTIC_SOURCE",
    "KIND",
    "OutOfPlane",
    "OutOfPlaneSettings",
    "SWAY_NOTE",
    "other_axis_sways",
    "resistance",
    "sways",
    "utilisation",
]

#: The check's kind in the member check.
KIND = "out-of-plane buckling"

#: The member check's kind where the code's check about the other axis is not made (a material without
#: buckling curves here) but its elastic critical load is known: N/N_cr, a bound the utilisation is not
#: below.
ELASTIC_KIND = "out-of-plane elastic buckling"

ELASTIC_SOURCE = (
    "Euler: N_cr = π²EI/L_cr² about the other axis; a code's buckling resistance does not exceed it, so "
    "N/N_cr is a bound of the code's utilisation (common practice, no source)"
)

SOURCE = "EN 1993-1-1:2005 §6.3.1.1–6.3.1.2, eqs. (6.46)–(6.49); curve by Table 6.2 (cells from memory)"

_MAX_LENGTH = 10_000.0


@dataclass(frozen=True, kw_only=True)
class OutOfPlaneSettings:
    """The case's ``out_of_plane`` key.

    Parameters
    ----------
    buckling_length : float or None
        L_cr about the other axis [m], 1 mm to 10 000 m; None: the member length.
    restrained : bool
        True when out-of-plane buckling is prevented (by bracing, a wall, ...): the check is not made.
    """

    buckling_length: float | None = None
    restrained: bool = False

    def __post_init__(self) -> None:
        if not isinstance(self.restrained, bool):
            raise CaseError(f"out_of_plane.restrained: {self.restrained!r} must be true or false")
        if self.buckling_length is not None:
            value = self.buckling_length
            if (
                isinstance(value, bool)
                or not isinstance(value, (int, float))
                or not math.isfinite(value)
                or not 0.001 <= value <= _MAX_LENGTH
            ):
                raise CaseError(
                    f"out_of_plane.buckling_length: {value!r} m must be a number from 0.001 to "
                    f"{_MAX_LENGTH:g} m"
                )
            if self.restrained:
                raise CaseError(
                    "out_of_plane.buckling_length: not allowed with 'restrained': true (a "
                    "restrained member does not buckle out of plane); give one or the other"
                )
            object.__setattr__(self, "buckling_length", float(value))

    @classmethod
    def from_data(cls, data: Any) -> OutOfPlaneSettings:
        """From the case file's mapping, naming unknown keys."""
        if isinstance(data, OutOfPlaneSettings):
            return data
        if not hasattr(data, "keys"):
            raise CaseError(
                f"out_of_plane: {data!r} is not an object; expected "
                '{"buckling_length": ...} or {"restrained": true}'
            )
        unknown = [key for key in data if key not in ("buckling_length", "restrained")]
        if unknown:
            raise CaseError(
                f"out_of_plane.{unknown[0]}: unknown key; allowed: 'buckling_length', 'restrained'"
            )
        return cls(**dict(data))

    def to_dict(self) -> dict:
        """The case-file form."""
        data: dict = {}
        if self.buckling_length is not None:
            data["buckling_length"] = self.buckling_length
        if self.restrained:
            data["restrained"] = True
        return data


@dataclass(frozen=True, kw_only=True)
class OutOfPlane:
    """The out-of-plane flexural buckling check (or why it was not made).

    Attributes
    ----------
    checked : bool
        False when restrained or when it cannot be made (``reason`` says why).
    reason : str
    axis : str
        The axis buckled about (``"minor"`` for major-axis bending, and the other way round).
    buckling_length, N_cr, lambda_bar, chi, N_b_Rd : float or None
        L_cr [m], N_cr [N], λ̄ [-], χ [-], N_b,Rd = χ A f_y/γ_M1 [N] (A_eff in place of A where ``effective``).
    effective : bool
        The section is class 4 in uniform compression: λ̄ and N_b,Rd are on its effective area.
    curve, curve_reason : str or None
    utilization : float or None
        N_Ed/N_b,Rd [-] (0 without compression), None when not checked.
    elastic_utilization : float or None
        N_Ed/N_cr [-] (0 without compression) wherever N_cr is known, checked or not; where the code's check
        is not made it is the bound the member check counts (:data:`ELASTIC_KIND`).
    source : str
    note : str
        A doubt about the default buckling length (an end free to translate in the plane analysed), else "".
    """

    checked: bool
    reason: str = ""
    axis: str = "minor"
    buckling_length: float | None = None
    N_cr: float | None = None
    lambda_bar: float | None = None
    chi: float | None = None
    N_b_Rd: float | None = None
    curve: str | None = None
    curve_reason: str | None = None
    utilization: float | None = None
    elastic_utilization: float | None = None
    source: str = SOURCE
    note: str = ""
    effective: bool = False

    def facts(self) -> dict:
        """The numbers :meth:`describe` words, in SI ([m], [N]) and plain numbers, for an app to word."""
        names = (
            "axis",
            "buckling_length",
            "N_cr",
            "lambda_bar",
            "curve",
            "chi",
            "N_b_Rd",
            "utilization",
            "elastic_utilization",
            "effective",
        )
        return {name: getattr(self, name) for name in names}

    @property
    def elastic_bound(self) -> float | None:
        """N/N_cr where the code's check is not made but N_cr is known (what the member check counts), else
        None."""
        return None if self.checked else self.elastic_utilization

    def describe(self) -> str:
        """One line with the numbers, e.g. for the cautions and the calc sheet."""
        if not self.checked:
            return self.reason
        return (
            f"about the {self.axis} axis: L_cr = {self.buckling_length:.3f} m, "
            f"N_cr = {self.N_cr * 1e-3:.1f} kN, "
            f"lambda_bar = {self.lambda_bar:.3f}, curve {self.curve}, chi = {self.chi:.3f}, "
            f"N_b,Rd = {self.N_b_Rd * 1e-3:.1f} kN"
        )


#: The warning of the default L_cr = 2L (a decision of the project, DEVELOPERS.md decisions log, stop 29): a
#: member with an end free to translate in the plane analysed, and no ``out_of_plane`` given, is taken as a
#: cantilever out of plane too (K = 2, Euler; Timoshenko & Gere 1961 ch. 2), the longest buckling length of
#: a member fixed at one end; held out of plane, it buckles on a shorter length, which the user gives.
SWAY_NOTE = (
    "L_cr is taken as 2L (a cantilever's), because an end is free to translate in the plane analysed and no "
    "out-of-plane buckling length is given. Give out_of_plane.buckling_length (or restrained) where the "
    "member is held out of plane."
)


def resistance(case, section, material, segments=()) -> OutOfPlane:
    """N_b,Rd about the axis the member does not bend about (independent of the axial force).

    Parameters
    ----------
    case : Case
        Its ``axis``, ``length``, ``out_of_plane`` and ``check.gamma_M1``.
    section, material : Section, Material
        As resolved for the in-plane analysis (None when the case gives EI only).
    segments : tuple of Segment
        A member stepped in section (:func:`engine.member.segments_of`): N_cr with the smallest I about the
        other axis of all segments over the whole buckling length (a lower bound of the stepped member's
        N_cr: a stiffer part only raises it, Rayleigh's principle), each segment's χ A f_y with that N_cr,
        and the smallest N_b,Rd governs (see :func:`_stepped`).
    """
    if segments and section is not None and material is not None and section.shape != "custom":
        return _stepped(case, segments)
    return _uniform(case, section, material)


def _stepped(case, segments) -> OutOfPlane:
    """The out-of-plane check of a member stepped in section (see :func:`resistance`)."""
    other = "minor" if case.axis == "major" else "major"
    turned = [section_from_spec(dict(s.spec), other) for s in segments]
    weakest = min(range(len(segments)), key=lambda i: segments[i].material.E * turned[i].I)
    found = [
        _uniform(case, segments[i].section, segments[i].material, spec=segments[i].spec)
        for i in range(len(segments))
    ]
    if not all(f.checked for f in found):
        # A material without buckling curves: the smallest N_cr (the weakest segment over the whole buckling
        # length, a lower bound of the stepped member's, as below), so that its bound N/N_cr is the largest.
        known = [f for f in found if not f.checked and f.N_cr is not None]
        if known and len(known) == len(found):
            return min(known, key=lambda f: f.N_cr)
        return next(f for f in found if not f.checked)
    n_cr = found[weakest].N_cr
    out = []
    for seg, one, f in zip(segments, turned, found, strict=True):
        area, effective = _area(one, seg.material)
        lam = codes.slenderness(area, seg.material.fy, n_cr)
        chi = codes.reduction_factor(lam, f.curve)
        out.append(
            dataclasses.replace(
                f,
                N_cr=n_cr,
                lambda_bar=lam,
                chi=chi,
                N_b_Rd=chi * area * seg.material.fy / case.check.gamma_M1,
                effective=effective,
                reason=f"{f.reason}; stepped in section: N_cr with the smallest I about the {other} axis "
                "of the segments, each segment's χ·A·f_y, the smallest governs",
            )
        )
    return min(out, key=lambda f: f.N_b_Rd)


def _uniform(case, section, material, spec=None) -> OutOfPlane:
    """:func:`resistance` of a uniform member (``spec``: the section's specification, default the case's)."""
    settings = case.out_of_plane or OutOfPlaneSettings()
    other = "minor" if case.axis == "major" else "major"
    if settings.restrained:
        return OutOfPlane(
            checked=False,
            axis=other,
            reason="restrained: out-of-plane buckling is prevented (given in the case)",
        )
    if section is None or material is None:
        return OutOfPlane(checked=False, axis=other, reason="no section and material: not checked")
    given = settings.buckling_length
    sway = given is None and sways(case)
    length = given if given is not None else case.length * (2 if sway else 1)
    note = SWAY_NOTE if sway else ""
    if section.shape == "custom":
        if section.I_minor is None or case.axis != "major":
            minor = case.axis != "major"  # then I is the minor axis's: nothing is given about the major
            return OutOfPlane(
                checked=False,
                axis=other,
                reason="a custom section bent about its minor axis has no properties about its major axis: "
                "buckling about it is not checked (nor eqs. (6.61)/(6.62)); give a catalogue or parametric "
                "section to have it checked"
                if minor
                else "a custom section has properties about one axis "
                "only: out-of-plane buckling cannot be checked (give its Iz to have it checked)",
            )
        return _custom(case, section, material, length, _length_reason(settings, sway), note)
    turned = section_from_spec(dict(case.section if spec is None else spec), other)
    n_cr = math.pi**2 * material.E * turned.I / length**2
    if material.kind != "steel":
        return _without_curves(material, other, length, n_cr)
    curve, why = curve_of(turned, material)  # turned is about the other axis
    if curve is None:  # pragma: no cover - every steel shape but custom has a curve
        return OutOfPlane(checked=False, axis=other, reason=f"no buckling curve: {why}")
    area, effective = _area(turned, material)
    lam = codes.slenderness(area, material.fy, n_cr)
    chi = codes.reduction_factor(lam, curve)
    return OutOfPlane(
        checked=True,
        axis=other,
        buckling_length=length,
        N_cr=n_cr,
        lambda_bar=lam,
        chi=chi,
        N_b_Rd=chi * area * material.fy / case.check.gamma_M1,
        effective=effective,
        curve=curve,
        curve_reason=why,
        note=note,
        reason=_length_reason(settings, sway) + (_area_note(area, turned.A) if effective else ""),
    )


def _area(section, material) -> tuple[float, bool]:
    """The area of χ·A·f_y and λ̄ (eqs. 6.47/6.49): the effective area of a section that is class 4 in uniform
    compression (EN 1993-1-1 §6.3.1.1, A_eff of EN 1993-1-5 §4.4), else the gross area; and whether it is the
    effective one."""
    area = area_in_compression(section, material)
    return area, area < section.A


def _area_note(area: float, gross: float) -> str:
    """What the reason adds where the effective area is used."""
    return f"; class 4 in uniform compression: χ·A_eff·f_y with A_eff = {area / gross:.3f}·A"


def sways(case) -> bool:
    """Whether an end of the member is free to translate in the plane analysed (free, guided or a
    translational spring)."""
    return any(end.translation != "fixed" for end in (case.left, case.right))


def other_axis_sways(out, length: float) -> bool:
    """Whether the other axis of a one-plane case sways, from its check ``out`` (an :class:`OutOfPlane` or
    None) and the member's ``length`` [m]: a buckling length above the member's, which a member held against
    translation at both ends about that axis cannot have (the default 2·L of a member whose end translates
    in the plane analysed, or a longer length given). The aisc route then takes the notional load about it
    (engine.aisc_moments, engine.design.aisc_member; DEVELOPERS.md decisions log, stop 34)."""
    if out is None or not out.checked or out.buckling_length is None:
        return False
    return out.buckling_length > length * (1.0 + 1e-12)


def _length_reason(settings, sways: bool = False) -> str:
    """Where L_cr comes from, as a checked result says it."""
    if settings.buckling_length is not None:
        return "given"
    return "twice the member length (default where an end sways)" if sways else "the member length (default)"


def _without_curves(material, axis, length, n_cr) -> OutOfPlane:
    """A material without EN 1993-1-1's curves: not checked, but its elastic critical load is kept (the bound
    N/N_cr that the member check counts, and the cautions)."""
    return OutOfPlane(
        checked=False,
        axis=axis,
        buckling_length=length,
        N_cr=n_cr,
        reason=f"{material.kind} material: the buckling curves of EN 1993-1-1 do not apply, so the code's "
        "out-of-plane buckling check is not made",
    )


def _custom(case, section, material, length, reason, note="") -> OutOfPlane:
    """A custom section bent about its major axis that gives Iz: N_cr = π²E·Iz/L_cr² about the minor axis;
    steel is checked with curve d, the most unfavourable of EN 1993-1-1 Table 6.2 (the table has no row for
    an arbitrary section, and any other curve gives a larger χ), another material gets the bound N/N_cr;
    ``reason`` says where L_cr comes from."""
    n_cr = math.pi**2 * material.E * section.I_minor / length**2
    if material.kind != "steel":
        return _without_curves(material, "minor", length, n_cr)
    lam = codes.slenderness(section.A, material.fy, n_cr)
    chi = codes.reduction_factor(lam, "d")
    return OutOfPlane(
        checked=True,
        axis="minor",
        buckling_length=length,
        N_cr=n_cr,
        lambda_bar=lam,
        chi=chi,
        N_b_Rd=chi * section.A * material.fy / case.check.gamma_M1,
        curve="d",
        curve_reason="a custom section: curve d, the most unfavourable of Table 6.2, with its Iz",
        note=note,
        reason=reason,
    )


def utilisation(template: OutOfPlane, axial_force: float) -> OutOfPlane:
    """The check at one axial force (compression positive): N_Ed/N_b,Rd and N_Ed/N_cr, 0 in tension."""
    force = max(float(axial_force), 0.0)
    elastic = None if not template.N_cr else force / template.N_cr
    if not template.checked:
        if elastic is None:
            return template
        return dataclasses.replace(template, elastic_utilization=elastic)
    return dataclasses.replace(template, utilization=force / template.N_b_Rd, elastic_utilization=elastic)
