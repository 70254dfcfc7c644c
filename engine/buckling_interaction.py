r"""Member buckling with the moments, counted by the second-order route where no equivalent-member route can.

The second-order route (EN 1993-1-1 §5.2.2(7)a) checks the cross-section on the exact second-order forces
with the code's bow in each plane analysed, and beside it out-of-plane buckling for N alone
(:math:`N/N_{b,Rd}`, :mod:`engine.out_of_plane`, one-plane cases) and lateral-torsional buckling for the
major-axis moment alone (:math:`M_{y,II}/M_{b,Rd}`). Two interactions are in none of those terms:

- out-of-plane buckling with the moment in the plane analysed (a one-plane case whose other plane can
  buckle): EN 1993-1-1 §6.3.3 eq. (6.62), or eq. (6.61) for bending about the minor axis;
- lateral-torsional buckling (χ_LT < 1) with the axial force and the other moment: eqs. (6.61) and (6.62);
- in-plane buckling of a plane analysed with a bow below the code's, or none
  (:attr:`engine.design.en_member.Plane.bow_short`): the analysis then does not cover the member's own
  buckling, which EN 1993-1-1 §5.2.2(7)b leaves to §6.3 (from memory): that plane's equation, eq. (6.61)
  for the major axis, (6.62) for the minor, counted with or without a moment.

The ``en-member`` route counts them all. On two kinds of member it is refused or not applied, and nothing else
counted them (the headline could then miss a failing check):

- a member on an elastic **foundation** (the route cannot be enabled: Annex A/B's diagrams do not cover a
  member bedded along its length), one plane or two;
- a one-plane member **stepped in section** (the route takes one section along the member);
- a **custom section** of steel (one plane: its properties are given about one axis; the route is not
  applied, its class and curves being unknown): read as class 3 (:data:`CUSTOM_CLASS`) with curve d about
  both axes and, in Annex B, the largest of Table B.1's and B.2's factors (:func:`custom_planes`).

For these the second-order route gets the term ``buckling-interaction``: the largest of those equations
(:func:`equations`) made by the ``en-member`` route (:func:`engine.design.en_member.route`, the Annex the
case chose) with

- on a foundation, each plane's own first-order moment diagram read as "not one of the tables' shapes", so
  that :math:`C_{my} = C_{mz} = C_{mLT} = 1` in Annex B (Table B.3's largest value) and
  :math:`C_{mi,0} \ge 1` in Annex A, and without the sway note's 0.9; the larger of that and the route's
  own reading of the diagrams is kept (Annex A's row for a uniform load, :math:`1 + 0.03 N/N_{cr}`, can
  exceed the general formula) [derived: never below the route's own reading]; on a stepped member the
  diagram as the route reads it (a step changes the sections, not the shape the tables read: a step to the
  member's own section then changes nothing);
- the exact critical load of each plane analysed (the foundation, restraints and steps count) and the
  out-of-plane check's critical load for the other plane of a one-plane case;
- on a stepped member, each segment's section, material and lateral-torsional buckling check in turn, with
  the largest first-order moment of the whole member; the largest value over the segments is kept
  (conservative: the peak moment is taken with the weakest section) [derived].

The first-order moment, as the equations take it (the in-plane bow is inside χ): with the second-order
moment a strut's bow would be counted twice. A decision of the project (DEVELOPERS.md, decisions log,
2026-12-03), not a code rule.
"""

from __future__ import annotations

import dataclasses
import math

from engine.classification import SectionClass
from engine.design import en_member
from engine.design.diagram import zero

__all__ = ["CUSTOM_CLASS", "TERM", "conservative", "custom_planes", "equations", "larger", "of_route"]

#: The second-order route's term code.
TERM = "buckling-interaction"


#: The class a custom section is read with by :func:`conservative`: 3, its elastic properties (it is not
#: classified here: its plates are not known), as its cross-section and lateral-torsional buckling checks take
#: it.
CUSTOM_CLASS = SectionClass(
    klass=3, parts=(), epsilon=math.nan, basis="a custom section, not classified: its elastic properties"
)


@dataclasses.dataclass(frozen=True)
class _OtherAxis:
    """A custom section about its other axis, as far as the equivalent-member equations read it."""

    A: float
    A_v: float
    I: float
    W_el: float
    W_pl: float
    shape: str = "custom"


def custom_planes(first, section, out_of_plane, E):
    """The planes (y, z) of a one-plane custom steel section for :func:`conservative`: ``first`` the plane
    analysed (its exact N_cr and first-order diagram), every buckling curve d (the most unfavourable of Table
    6.2, which has no row for an arbitrary section: as :mod:`engine.out_of_plane` takes it), and the other
    plane the section about its other axis (I = Iz given, no loads) buckling at the out-of-plane check's
    N_cr, or never where that check is not made (then no equation of that plane is formed; the warning that
    it was not made stands). A section that gives nothing about its other axis (no Iz, or bent about its
    minor axis) has that plane read as not buckling: only the plane analysed's own equation can then be
    formed (where its bow leaves its buckling out: ``Plane.bow_short``)."""
    other_axis = "z" if first.axis == "y" else "y"
    known = section.I_minor is not None and first.axis == "y"
    I_other = section.I_minor if known else section.I  # unknown: never buckles, its I is not read
    # About that axis only what the equations read: no moment acts there, and no modulus is given (the
    # largest any section of that area and I could have, never used against a moment)
    bound = math.sqrt(section.A * I_other)
    turned = _OtherAxis(A=section.A, A_v=section.A, I=I_other, W_el=bound, W_pl=bound)
    checked = known and out_of_plane is not None and out_of_plane.checked
    other = en_member.Plane(
        axis=other_axis,
        section=turned,
        N_cr=out_of_plane.N_cr if checked else math.inf,
        EI=E * I_other,
        diagram=zero(),
        M_second=0.0,
        N_cr_source="out-of-plane length" if checked else "restrained",
        curve="d",
    )
    first = dataclasses.replace(first, curve="d")
    return (first, other) if first.axis == "y" else (other, first)


def _other(diagram):
    """The diagram read as not one of the tables' shapes (C_m = 1 in Annex B), without the sway note."""
    return dataclasses.replace(diagram, form="other", sway=False)


def equations(y, z, ltb) -> tuple:
    """The equations the second-order route does not count on its own (see the module notes): the
    out-of-plane one of a one-plane case whose other plane can buckle (eq. (6.62) when it is z, (6.61) when
    y), an analysed plane's own where its bow is below the code's (``Plane.bow_short``), and both where
    lateral-torsional buckling reduces the major-axis resistance (χ_LT < 1), whose interaction with N (and
    M_z) the route's M_y,II/M_b,Rd term leaves out."""
    found = []
    for plane in (y, z):
        # an analysed plane whose bow is below the code's: its own member buckling is not covered by the
        # second-order analysis (EN 1993-1-1 §5.2.2(7)b, from memory), so its equation counts, with or
        # without a moment (N/N_b,Rd at least; an audit found N/Pcr1 alone counted, 0.295 for 0.512)
        if plane.bow_short and math.isfinite(plane.N_cr):
            found.append("eq-6.61" if plane.axis == "y" else "eq-6.62")
        if plane.N_cr_source == "out-of-plane length" and math.isfinite(plane.N_cr):
            analysed = z if plane is y else y
            if analysed.diagram.M_max > 0.0:
                found.append("eq-6.62" if plane.axis == "z" else "eq-6.61")
    if ltb is not None and ltb.applies and ltb.chi_LT < 1.0 and y.diagram.M_max > 0.0:
        found += ["eq-6.61", "eq-6.62"]
    return tuple(dict.fromkeys(found))


def conservative(*, y, z, N, material, section_class, settings, ltb, unit_cm=True) -> dict | None:
    """The largest of :func:`equations` by the route with the diagrams read at C_m = 1 (``unit_cm``, a
    member on a foundation) or as the route reads them (see the module notes): ``{"value", "equation",
    "k_name", "k", "unit_cm", "one_plane"}`` (``k`` the interaction factor on the one moment of a one-plane
    case, ``unit_cm`` whether the C_m = 1 reading gave the value), or None where nothing is left to count
    (no compression, no equation) or the route is not applied."""
    wanted = equations(y, z, ltb)
    if not N > 0.0 or not wanted:
        return None
    readings = [(y, z)]
    if unit_cm:
        readings.append(tuple(dataclasses.replace(p, diagram=_other(p.diagram)) for p in (y, z)))
    best = None
    for ry, rz in readings:  # Annex A's table rows may exceed its "other" reading: the larger is kept
        check = en_member.route(
            y=ry,
            z=rz,
            N=N,
            material=material,
            section_class=section_class,
            settings=settings,
            enabled=False,
            ltb=ltb,
        )
        found = _largest(check, wanted)
        if found is None:
            return None
        if best is None or found[0] >= best[0]:  # a tie: the C_m = 1 reading names it (it is that too)
            best = (*found, ry is not y)
    return _term(best, y, z)


def of_route(check, *, y, z, ltb) -> dict | None:
    """The term of :func:`conservative` read from an ``en-member`` route already made (``check``, of the
    planes ``y``, ``z`` and the LTB check ``ltb`` as the route read them): the route's own equations, for
    a case that did not enable that route. None where nothing is left to count or the route is not
    applied."""
    wanted = equations(y, z, ltb)
    formed = "eq-6.62" in check.terms  # at N <= 0 too, where the route takes them at N_Ed = 0
    if not wanted or not (check.facts.get("N_Ed", 0.0) > 0.0 or formed):
        return None
    found = _largest(check, wanted)
    return None if found is None else _term((*found, False), y, z)


def _largest(check, wanted) -> tuple | None:
    """(value, equation, facts) of the largest of the ``wanted`` equations of an ``en-member`` route check;
    None when the route is not applied. An equation the route did not form (at or above a critical load)
    takes the route's own verdict (+inf)."""
    if check.utilization is None:
        return None
    best = None
    for equation in wanted:
        value = check.terms.get(equation)
        if value is None:
            if not math.isinf(check.utilization):
                return None
            value = check.utilization
        if best is None or value > best[0]:
            best = (float(value), equation, check.facts)
    return best


def _term(best, y, z) -> dict:
    """The term's dict (see :func:`conservative`) from (value, equation, facts, unit_cm)."""
    value, equation, facts, unit = best
    one_plane = "out-of-plane length" in (y.N_cr_source, z.N_cr_source)
    k_name = None
    if one_plane:  # the factor on the one moment of the equation that governs
        moment_y = y.diagram.M_max > 0.0
        k_name = (
            ("k_yy" if moment_y else "k_yz") if equation == "eq-6.61" else ("k_zy" if moment_y else "k_zz")
        )
    k = None if k_name is None else facts.get(k_name)
    return {
        "value": value,
        "equation": equation,
        "k_name": k_name,
        "k": k,
        "unit_cm": unit,
        "one_plane": one_plane,
    }


def larger(found: list) -> dict | None:
    """The largest of the terms found (each from :func:`conservative`, None ignored)."""
    found = [f for f in found if f is not None]
    return max(found, key=lambda f: f["value"]) if found else None
