r"""Out-of-plane buckling with the moment in the plane analysed, where no equivalent-member route counts it.

The second-order route of a one-plane case checks buckling about the other axis for the axial force alone
(:math:`N/N_{b,Rd}`, :mod:`engine.out_of_plane`). Its interaction with the moment in the plane analysed is
EN 1993-1-1 §6.3.3 eq. (6.62) (eq. (6.61) for bending about the minor axis, where the major axis is the
other one), which the ``en-member`` route gives. On two kinds of member that route is refused or not
applied, and nothing else counted the interaction (the headline could then miss a failing check):

- a member on an elastic **foundation** (the route cannot be enabled: Annex A/B's diagrams do not cover a
  member bedded along its length);
- a member **stepped in section** (the route takes one section along the member).

For these the second-order route gets the term ``out-of-plane-interaction``: the equation of the
``en-member`` route (:func:`engine.design.en_member.route`, the Annex the case chose), made with

- on a foundation, the plane's own first-order moment diagram read as "not one of the tables' shapes", so
  that :math:`C_{my} = C_{mLT} = 1` in Annex B (Table B.3's largest value) and :math:`C_{mi,0} \ge 1` in
  Annex A, and without the sway note's 0.9; the larger of that and the route's own reading of the diagram is
  kept (Annex A's row for a uniform load, :math:`1 + 0.03 N/N_{cr}`, can exceed the general formula)
  [derived: never below the route's own reading]; on a stepped member the diagram as
  the route reads it (a step changes the section, not the shape the tables read: a step to the member's own
  section then changes nothing);
- the exact critical load of the plane analysed (the foundation, restraints and steps count) and the
  out-of-plane critical load of the out-of-plane check;
- on a stepped member, each segment's section, material and lateral-torsional buckling check in turn, with
  the largest first-order moment of the whole member; the largest value over the segments is kept
  (conservative: the peak moment is taken with the weakest section) [derived].

A decision of the project (DEVELOPERS.md, decisions log, 2026-12-03), not a code rule.
"""

from __future__ import annotations

import dataclasses
import math

from engine.design import en_member

__all__ = ["TERM", "conservative"]

#: The second-order route's term code.
TERM = "out-of-plane-interaction"


def _other(diagram):
    """The diagram read as not one of the tables' shapes (C_m = 1 in Annex B), without the sway note."""
    return dataclasses.replace(diagram, form="other", sway=False)


def conservative(*, first, other, N, material, section_class, settings, ltb, unit_cm=True) -> dict | None:
    """The equation of the route with the plane analysed ``first`` read at C_m = 1 (``unit_cm``, a member on
    a foundation) or as the route reads it (see the module notes): ``{"value", "equation", "C_mLT", "k",
    "unit_cm"}``, or None where it does not apply (no compression, no moment, buckling about the other axis
    prevented, or the route not applied)."""
    if not N > 0.0 or not first.diagram.M_max > 0.0 or not math.isfinite(other.N_cr):
        return None
    equation = "eq-6.62" if other.axis == "z" else "eq-6.61"
    readings = [first, dataclasses.replace(first, diagram=_other(first.diagram))] if unit_cm else [first]
    best = None
    for read in readings:  # Annex A's table rows may exceed its "other" reading: the larger is kept
        y, z = (read, other) if first.axis == "y" else (other, read)
        check = en_member.route(
            y=y,
            z=z,
            N=N,
            material=material,
            section_class=section_class,
            settings=settings,
            enabled=False,
            ltb=ltb,
        )
        if check.utilization is None:
            return None
        value = check.terms.get(equation)
        if value is None:  # at or above a critical load: the route's own verdict (+inf)
            if not math.isinf(check.utilization):
                return None
            value = check.utilization
        if best is None or value > best[0]:
            best = (float(value), check.facts, read is not first)
    value, facts, unit = best
    k = facts.get("k_zy" if other.axis == "z" else "k_yz")
    return {"value": value, "equation": equation, "C_mLT": facts.get("C_mLT"), "k": k, "unit_cm": unit}


def larger(found: list) -> dict | None:
    """The largest of the terms found (each from :func:`conservative`, None ignored)."""
    found = [f for f in found if f is not None]
    return max(found, key=lambda f: f["value"]) if found else None
