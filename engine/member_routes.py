"""The routes of the member check side by side (issue 14), and the headline utilisation.

:func:`evaluate` turns a solved result into one :class:`engine.design.routes.RouteCheck` per route of
:data:`engine.design.routes.ROUTES`, in that order:

- ``"second-order"``: the member check the analysis made (:mod:`engine.checks`), as it is;
- ``"en-member"``: :mod:`engine.design.en_member`;
- ``"aisc"``: :mod:`engine.design.aisc_member`.

Each plane is read from the result: the plane analysed from the result itself, the second plane from
``result.second_plane`` when the case has one, else a plane without loads whose critical load is the
out-of-plane one of :mod:`engine.out_of_plane` (π²EI/L_cr² with the case's ``out_of_plane`` buckling length,
or the member length; ``restrained`` means buckling in it is prevented, N_cr = ∞).

:func:`headline` is the largest utilisation of the enabled routes (``check.routes``), routes not applied
ignored; when no enabled route applies, the second-order check stands in (and the result says so).
"""

from __future__ import annotations

import dataclasses
import math

from engine import segment_routes
from engine.buckling_interaction import CUSTOM_CLASS, conservative, custom_planes, equations, larger, of_route
from engine.buckling_interaction import TERM as INTERACTION
from engine.checks import EQ_5_9_KIND, IN_PLANE_ELASTIC_KIND
from engine.classification import classify_at, worse_class
from engine.design import aisc_member, en_member
from engine.design.diagram import describe, zero
from engine.design.en_member import Plane, not_applied
from engine.design.routes import ROUTES, RouteCheck
from engine.ltb_route import lateral_torsional, ltb_restraints
from engine.ltb_route import made as _made
from engine.ltb_route import major as _major
from engine.member import segments_of
from engine.out_of_plane import ELASTIC_KIND as OUT_OF_PLANE_ELASTIC
from engine.out_of_plane import KIND as OUT_OF_PLANE
from engine.out_of_plane import other_axis_sways, sways
from engine.sections import section_from_spec
from engine.sway_buckling import term as sway_term
from engine.torsional_terms import custom_torsional, member_torsional, weakest_segment
from engine.torsional_terms import term as torsion_term

__all__ = ["FALLBACK", "STEPPED", "attach", "evaluate", "headline", "ltb_restraints"]

#: The note of a headline that fell back on the second-order check (no enabled route applied).
FALLBACK = "headline-fallback-second-order"
#: Why the equivalent-member routes are not applied to a member stepped in section: EN 1993-1-1 §6.3.1 and
#: §6.3.3 are written for uniform members (§6.3.4 covers others; from memory), AISC H1 likewise.
STEPPED = "stepped-section"
#: Why the second-order route counts the en-member route's eqs. (6.61)/(6.62) itself: that route is not
#: enabled (a decision of the project, DEVELOPERS.md decisions log 2026-12-03).
NOT_ENABLED = "en-member-not-enabled"

_KINDS = {
    "elastic stress": "cross-section",
    "plastic N–M": "cross-section",
    EQ_5_9_KIND: "eq-5.9-linear",
    "shear": "shear",
    OUT_OF_PLANE: "out-of-plane",
    OUT_OF_PLANE_ELASTIC: "out-of-plane-elastic",
    IN_PLANE_ELASTIC_KIND: "in-plane-elastic",
    "class 4 section": "class-4",
    "elastic buckling": "elastic-buckling",
}

#: The second-order route's term M_y,II/M_cr where the lateral-torsional check is not made for the material
#: (no EN 1993-1-1 curves) but the exact M_cr is known: a bound, as no code's resistance exceeds M_cr.
LTB_ELASTIC = "lateral-torsional-elastic"

_SOURCE_2ND = (
    "EN 1993-1-1:2005 §5.2.2(7)a: elastic second-order analysis with the equivalent bow, then the "
    "cross-section checks of §6.2; §6.3.1 about the other axis (clauses from memory)"
)


def _bow_free_moment(res) -> float | None:
    """max|M| of the plane's second-order solution without its bow, where the result knows it."""
    amp = res.amplification
    if amp.moment_bow_free is None:
        return None
    if amp.moment_first_order is None:  # no first-order moment: nothing for the loads to amplify
        return 0.0
    return amp.moment_bow_free * res.governing.moment.magnitude / amp.moment_first_order


def _diagram(res, case):
    """The first-order diagram of a plane (exact wherever it turns: every zero of V is a station)."""
    first = res.first_order
    return describe(
        x=first.x,
        moment=first.moment,
        deflection=first.deflection,
        shear=first.shear,
        loads=case.loads,
        length=case.length,
        sway=sways(case),
    )


def _curve(section, material):
    return en_member.curve_of(section, material)[0] if material.kind == "steel" else None


def bow_short(res) -> bool:
    """Whether the second-order analysis of the plane solved in ``res`` leaves its member buckling out: its
    bow is not an EN 1993-1-1 preset on a curve no laxer than Table 6.2's (``BowChoice.code_bow``: a bow
    given by shape and amplitude, a span ratio or AISC's L/1000 may be too small, or of a shape the first
    mode does not take up: a tilt on a pinned member, a half sine between two restraints), or the case fixes
    its direction (the favourable way it reads up to 20 % on the unsafe side; whether it is favourable can
    flip with N, so any fixed direction counts, which keeps the utilisation continuous in N). Audits found
    each read at N/Pcr1 only."""
    bow = getattr(res, "bow", None)
    if bow is None:
        return False  # no member (no section or material): no route is formed
    return not bow.code_bow or not bow.automatic


def _plane(res, axis, case, *, M_second, cache, which):
    amp = res.amplification
    untilted = amp.moment_untilted if amp is not None else None
    if amp is not None and amp.moment_out_of_plumb is not None:  # AISC §C2.2a: out of plumb, in M_r
        if untilted is None and case.check.aisc_method == "LRFD":  # without the tilt: the bow-free moment
            untilted = M_second
        M_second = amp.moment_out_of_plumb
    diagram = _made(cache, ("routes-diagram", which), lambda: _diagram(res, case))
    curve = _made(cache, ("routes-curve", which), lambda: _curve(res.section, res.material))
    return Plane(
        axis=axis,
        section=res.section,
        N_cr=float(res.critical_loads[0]),
        EI=float(res.EI),
        diagram=diagram,
        M_second=M_second,
        curve=curve,
        M_asd=amp.moment_asd if amp is not None else None,
        M_direct=amp.moment_direct if amp is not None else None,
        length=float(case.length),
        M_untilted=untilted,
        bow_short=bow_short(res),
    )


def _planes(result, M_second, out_of_plane, cache):
    """The y and z planes of the member (``y`` bends about the major axis)."""
    case = result.case
    first_axis = "y" if case.axis == "major" else "z"
    other_axis = "z" if first_axis == "y" else "y"
    first = _plane(result, first_axis, case, M_second=M_second, cache=cache, which="first")
    second = result.second_plane
    if second is not None:
        M_other = _bow_free_moment(second)
        other = _plane(second, other_axis, second.case, M_second=M_other, cache=cache, which="second")
    else:
        if out_of_plane is not None and out_of_plane.checked:
            N_cr, source = out_of_plane.N_cr, "out-of-plane length"
        else:
            N_cr, source = math.inf, "restrained"
        other = _unloaded_plane(
            case, case.section, result.material, N_cr, source, cache, "routes-other-section"
        )
        if other_axis_sways(out_of_plane, case.length):  # the aisc route's notional tilt acts over L
            other = dataclasses.replace(other, sway_length=float(case.length))
    return (first, other) if first_axis == "y" else (other, first)


def _unloaded_plane(case, spec, material, N_cr, source, cache, key):
    """The other plane of a one-plane case: the section ``spec`` about the other axis, no loads, buckling at
    ``N_cr`` (found by ``source``); its section and curve cached under ``key``."""
    other_name = "minor" if case.axis == "major" else "major"

    def turned():
        section = section_from_spec(dict(spec), other_name)
        return section, _curve(section, material)

    section, curve = _made(cache, key, turned)
    return Plane(
        axis="z" if case.axis == "major" else "y",
        section=section,
        N_cr=N_cr,
        EI=material.E * section.I,
        diagram=zero(),
        M_second=0.0,
        N_cr_source=source,
        curve=curve,
    )


def _second_order(result, enabled: bool) -> RouteCheck:
    check = result.check
    if check is None:  # at a critical load: no equilibrium
        return RouteCheck(
            route="second-order",
            enabled=enabled,
            utilization=math.inf,
            governing="elastic-buckling",
            terms={"elastic-buckling": math.inf},
            source=_SOURCE_2ND,
        )
    terms = {
        "cross-section": float(check.axial_bending.max()) if check.axial_bending.size else 0.0,
        "shear": float(check.shear.max()) if check.shear.size else 0.0,
    }
    out = check.out_of_plane
    if out is not None and out.utilization is not None:
        terms["out-of-plane"] = out.utilization
    elif out is not None and out.elastic_bound is not None:
        terms["out-of-plane-elastic"] = out.elastic_bound
    governing = _KINDS.get(check.kind)
    if governing is None:  # the two-plane check's kinds ("elastic stress N–M_y–M_z", ...)
        governing = "cross-section" if ("stress" in check.kind or "N–M" in check.kind) else check.kind
    terms[governing] = check.utilization
    facts = {"kind": check.kind, "x": check.x, "method": check.settings.method}
    if check.section_class is not None:
        facts["section_class"] = check.section_class.klass
    return RouteCheck(
        route="second-order",
        enabled=enabled,
        utilization=check.utilization,
        governing=governing,
        terms=terms,
        facts=facts,
        notes=("second-order-check-notes",) if check.notes else (),
        source=check.source,
    )


def evaluate(result, *, bow_free_moment, out_of_plane, cache=None) -> tuple:
    """Every route of ``result`` (a solved one-plane or two-plane result with a section and material), in the
    order of ROUTES.

    Parameters
    ----------
    bow_free_moment : float or None
        max|M| of the plane analysed, second order, without the bow [N·m] (AISC's M_r); None: not computed
        (the route then uses what the result's amplification knows).
    out_of_plane : OutOfPlane or None
        The out-of-plane resistance of a one-plane case (its N_cr, or restrained).
    cache : callable or None
        ``cache(key, make)``, where what does not depend on the axial force is kept
        (:meth:`engine.prepared.Prepared.design`); None: computed every time.
    """
    return _evaluate(result, bow_free_moment=bow_free_moment, out_of_plane=out_of_plane, cache=cache)[0]


def _evaluate(result, *, bow_free_moment, out_of_plane, cache=None) -> tuple:
    """(routes, ltb check) of :func:`evaluate`: the second-order route with in-plane buckling on a first mode
    that sways (:mod:`engine.sway_buckling`)."""
    (second, *others), found = _routes(
        result, bow_free_moment=bow_free_moment, out_of_plane=out_of_plane, cache=cache
    )
    sway = sway_term(result)
    if sway is not None:
        second = _with_term(second, *sway)
    return (second, *others), found


def _routes(result, *, bow_free_moment, out_of_plane, cache=None) -> tuple:
    """(routes, ltb check) of :func:`_evaluate` before the sway term."""
    case, material = result.case, result.material
    routes = case.check.routes
    second = _second_order(result, "second-order" in routes)
    enabled_en, enabled_aisc = "en-member" in routes, "aisc" in routes
    reason = ""
    if material.kind != "steel":
        reason = f"material-{material.kind}"
    elif result.section.shape == "custom":
        reason = "custom-section"
    segments = _made(cache, "routes-segments", lambda: segments_of(case))
    if segments and not reason:
        found, each = _stepped_ltb(result, segments, cache)
        if found is not None and _major(result) is not None:
            second = _with_ltb_term(second, found, _major(result))
        if result.second_plane is None:  # steps are refused in a two-plane case
            terms = [
                _segment_interaction(result, segment, one, out_of_plane, cache)
                for segment, one in zip(segments, each, strict=True)
            ]
            second = _with_interaction(second, larger(terms), "stepped-section")
        twist = weakest_segment(result, segments, cache)
        if twist is not None and float(result.axial_force) > 0.0:  # §6.3.1.4 with each segment's section
            second = _with_term(second, *torsion_term(float(result.axial_force), twist))
        en_source = en_member.SOURCE.format(annex=case.check.annex)
        return (
            second,
            not_applied("en-member", enabled_en, STEPPED, en_source),
            not_applied("aisc", enabled_aisc, STEPPED, aisc_member.SOURCE),
        ), found
    if reason:
        en_source = en_member.SOURCE.format(annex=case.check.annex)
        # A custom steel section with its torsion constants: the check still runs; another material: M_cr,
        # whose M_II/M_cr counts as a bound (_with_ltb_term).
        # A member stepped in section of such a material keeps the warning alone (one section's M_cr would
        # not bound the weakest segment's).
        major = None if segments else _major(result)
        found = lateral_torsional(result, None, None, cache) if major is not None else None
        if found is not None and major is not None:
            second = _with_ltb_term(second, found, major)
        if reason == "custom-section" and not segments:  # eqs. (6.61)/(6.62), class 3, curve d
            second = _with_interaction(second, _custom_term(result, out_of_plane, found, cache), reason)
            twist = custom_torsional(result)  # §6.3.1.4 where the section states its torsion constants
            if twist is not None and float(result.axial_force) > 0.0:
                second = _with_term(second, *torsion_term(float(result.axial_force), twist))
        return (
            second,
            not_applied("en-member", enabled_en, reason, en_source),
            not_applied("aisc", enabled_aisc, reason, aisc_member.SOURCE),
        ), found
    if bow_free_moment is None:
        bow_free_moment = _bow_free_moment(result)
    y, z = _planes(result, bow_free_moment, out_of_plane, cache)
    N = float(result.axial_force)

    klass = _worse_class((y.section, z.section), material, N, _bends_major(result))
    beyond = result.status != "stable"
    found = lateral_torsional(result, y, klass, cache)
    major = _major(result)
    if major is not None and found is not None:
        second = _with_ltb_term(second, found, major)
    common = dict(
        N=N,
        material=material,
        section_class=klass,
        settings=case.check,
        enabled=enabled_en,
        beyond=beyond,
        ltb=found,
    )
    en = segment_routes.route(  # a member with braced points: one equivalent member per segment
        y=y, z=z, plane_results=_plane_results(result), cache=lambda k, m: _made(cache, k, m), **common
    )
    if en is None:
        en = en_member.route(y=y, z=z, **common)
    if second.enabled and not enabled_en and not case.foundation:  # the user left eqs. (6.61)/(6.62) out
        term = _route_own_term(en, y, z, found, result, cache, common)
        second = _with_interaction(second, term, NOT_ENABLED)
    if case.foundation:  # the en-member route cannot count it there
        term = conservative(
            y=y,
            z=z,
            N=N,
            material=material,
            section_class=klass,
            settings=case.check,
            ltb=found,
        )
        second = _with_interaction(second, term, "foundation")
    twist = _made(cache, "routes-torsional", lambda: member_torsional(result, y.section, z.section, material))
    if twist is not None and N > 0.0:  # EN 1993-1-1 §6.3.1.4, a term of both EN routes
        second, en = _with_term(second, *torsion_term(N, twist)), _with_term(en, *torsion_term(N, twist))
    aisc = aisc_member.route(
        y=y,
        z=z,
        N=N,
        material=material,
        settings=case.check,
        enabled=enabled_aisc,
        beyond=beyond,
        ltb=found,
        N_cr_T=None if twist is None else twist.N_cr,
    )
    return (second, en, aisc), found


def _with_term(route: RouteCheck, name: str, term: float, facts: dict) -> RouteCheck:
    """``route`` with one more term (its utilisation the larger); a route not applied, or already unbounded,
    is kept as it is."""
    if route.utilization is None or math.isinf(route.utilization):
        return route
    terms = dict(route.terms, **{name: term})
    governing, value = route.governing, route.utilization
    if term > value:
        governing, value = name, term
    merged = dict(route.facts, **facts)
    return dataclasses.replace(route, terms=terms, governing=governing, utilization=value, facts=merged)


def _stepped_ltb(result, segments, cache):
    """The lateral-torsional buckling check of a member stepped in section: made with each segment's section
    along the whole member, and the smallest M_b,Rd of those that apply kept (the weakest segment governs;
    DEVELOPERS.md, decisions log)."""
    N = float(result.axial_force)
    found = []
    for segment in segments:
        klass = _segment_class(segment, N, cache, _bends_major(result))
        found.append(lateral_torsional(result, None, klass, cache, segment=segment))
    applied = [f for f in found if f is not None and f.applies]
    return (min(applied, key=lambda f: f.M_b_Rd) if applied else found[0]), found


def _bends_major(result) -> bool:
    """Whether the member bends about the major axis (a major-axis case, or two planes): the web of an I/H
    is then in bending and compression (:func:`engine.classification.classify`, ``web_bent``)."""
    return result.case.axis == "major" or getattr(result, "second_plane", None) is not None


def _worse_class(sections, material, N, web_bent):
    """The worse class of the section about both axes at axial force N (webs in bending and compression,
    α from N, under compression); None when either view is not classified. Not cached: it depends on N, and
    a drag asks each N once."""
    classes = [classify_at(p, material, N, web_bent) for p in sections]
    return None if None in classes else worse_class(classes)


def _segment_class(segment, N, cache, web_bent=True):
    """The worse class of a segment's section about both axes at axial force N (the section about the
    minor axis cached per section)."""
    key = ("routes-minor-section", segment.spec)
    z = _made(cache, key, lambda: section_from_spec(dict(segment.spec), "minor"))
    return _worse_class((segment.section, z), segment.material, N, web_bent)


def _segment_interaction(result, segment, ltb, out_of_plane, cache):
    """The buckling interaction (:mod:`engine.buckling_interaction`) with one segment's section, material and
    lateral-torsional buckling check, and the whole member's first-order diagram."""
    if out_of_plane is None or segment.material.kind != "steel":
        return None
    if out_of_plane.checked:
        N_cr_other, source = float(out_of_plane.N_cr), "out-of-plane length"
    elif out_of_plane.reason.startswith("restrained"):  # no out-of-plane buckling; LTB with N still counts
        N_cr_other, source = math.inf, "restrained"
    else:
        return None
    case, N = result.case, float(result.axial_force)
    first_axis = "y" if case.axis == "major" else "z"
    klass = _segment_class(segment, N, cache, _bends_major(result))
    if klass is None or klass.klass == 4 and not klass.effective:
        return None
    diagram = _made(cache, ("routes-diagram", "first"), lambda: _diagram(result, case))
    first = Plane(
        axis=first_axis,
        section=segment.section,
        N_cr=float(result.critical_loads[0]),
        EI=segment.material.E * segment.section.I,
        diagram=diagram,
        M_second=None,
        curve=_curve(segment.section, segment.material),
        bow_short=bow_short(result),
    )
    key = ("routes-segment-other", segment.spec)
    other = _unloaded_plane(case, segment.spec, segment.material, N_cr_other, source, cache, key)
    y, z = (first, other) if first_axis == "y" else (other, first)
    return conservative(
        y=y,
        z=z,
        N=N,
        material=segment.material,
        section_class=klass,
        settings=case.check,
        ltb=ltb,
        unit_cm=False,
    )


def _route_own_term(en, y, z, ltb, result, cache, common):
    """The buckling interaction the second-order route leaves out (:func:`engine.buckling_interaction.
    equations`), read from the ``en-member`` route the case did not enable: its own equations, or on a
    member with braced points the piece where they are largest (not always the piece that governs that
    route)."""
    wanted = equations(y, z, ltb)
    if not wanted or en.utilization is None:
        return None
    if "segments" in en.facts:

        def largest(check):
            values = [check.terms.get(e) for e in wanted]
            return max(check.utilization if v is None else v for v in values)

        en = segment_routes.route(
            y=y,
            z=z,
            plane_results=_plane_results(result),
            cache=lambda k, m: _made(cache, k, m),
            key=largest,
            **common,
        )
    return of_route(en, y=y, z=z, ltb=ltb)


def _custom_term(result, out_of_plane, found, cache):
    """The buckling interaction of a one-plane custom steel section (engine.buckling_interaction), None where
    it cannot be formed (no equilibrium, no compression). Without Iz, or bent about its minor axis, nothing
    is given about the other axis: only the plane analysed's own equation, where its bow leaves its buckling
    out (an audit read N/Pcr1 alone, 0.354 where curve d gives 0.521)."""
    N = float(result.axial_force)
    case = result.case
    if result.check is None or not N > 0.0:  # bent about its minor axis too: its own plane (custom_planes)
        return None
    diagram = _made(cache, ("routes-diagram", "first"), lambda: _diagram(result, case))
    first = Plane(
        axis="y" if case.axis == "major" else "z",
        section=result.section,
        N_cr=float(result.critical_loads[0]),
        EI=float(result.EI),
        diagram=diagram,
        M_second=None,
        bow_short=bow_short(result),
    )
    planes = custom_planes(first, result.section, out_of_plane, result.material.E)
    if planes is None:
        return None
    y, z = planes
    common = dict(material=result.material, section_class=CUSTOM_CLASS, settings=case.check, ltb=found)
    return conservative(y=y, z=z, N=N, **common)


def _with_interaction(second: RouteCheck, term, why: str) -> RouteCheck:
    """The second-order route with the buckling interaction ``term`` (a dict of
    :func:`engine.buckling_interaction.conservative`, or None: unchanged); ``why`` the kind of member."""
    if term is None or second.utilization is None or math.isinf(second.utilization):
        return second
    value = term["value"]
    terms = dict(second.terms, **{INTERACTION: value})
    governing, top = second.governing, second.utilization
    if value > top:
        governing, top = INTERACTION, value
    k_name = term["k_name"]
    k_facts = {} if term["k"] is None else {f"{k_name}_cm1" if term["unit_cm"] else k_name: term["k"]}
    facts = dict(
        second.facts,
        **k_facts,
        interaction_one_plane=term["one_plane"],
        interaction_equation=term["equation"],
        interaction_value=value,
        interaction_reason=why,
    )
    return dataclasses.replace(second, terms=terms, governing=governing, utilization=top, facts=facts)


def _plane_results(result) -> dict:
    """Each axis's solved plane and its case (``"y"``: bending about the major axis); None for the other
    plane of a one-plane case (no loads, no restraints of its own)."""
    first = "y" if result.case.axis == "major" else "z"
    other = "z" if first == "y" else "y"
    second = result.second_plane
    return {first: (result, result.case), other: None if second is None else (second, second.case)}


def _with_ltb_term(second: RouteCheck, found, major) -> RouteCheck:
    """The second-order route with the lateral-torsional buckling check of its largest major-axis moment:
    M_y,II/M_b,Rd (EN 1993-1-1 §6.3.2.1 eq. (6.54) with the second-order moment, which is never smaller than
    the first-order one the en-member route uses)."""
    bound = not found.applies and found.reason.startswith("material-") and not math.isnan(found.M_cr)
    if not (found.applies or bound) or second.utilization is None or math.isinf(second.utilization):
        return second
    if major.check is None and major.status == "critical":
        return second
    M_II = float(major.governing.moment.magnitude)
    if bound:  # no code's lateral-torsional resistance exceeds the elastic critical moment: M_II/M_cr
        name, resist = LTB_ELASTIC, found.M_cr
    else:
        name, resist = "lateral-torsional", found.M_b_Rd
    term = M_II / resist if resist > 0.0 else math.inf
    terms = dict(second.terms, **{name: term})
    governing, value = second.governing, second.utilization
    if term > value:
        governing, value = name, term
    facts = dict(second.facts, M_y_II=M_II)
    facts.update({"M_cr": found.M_cr} if bound else {"M_b_Rd": found.M_b_Rd, "chi_LT": found.chi_LT})
    return dataclasses.replace(second, terms=terms, governing=governing, utilization=value, facts=facts)


def headline(routes) -> tuple:
    """(utilisation, route, fell_back): the largest utilisation of the enabled routes that apply; when none
    applies, the second-order route's, with ``fell_back`` True.

    Routes within rounding of the largest (1e-12 relative: a strut without transverse loads gives eq. (6.62)
    and N/N_b,Rd of the second-order route, the same number computed two ways) go to the first in the order
    of ROUTES, and the headline is that route's own value.
    """
    applied = [r for r in routes if r.enabled and r.utilization is not None]
    if applied:
        undefined = next((r for r in applied if math.isnan(r.utilization)), None)
        if undefined is not None:  # a value that could not be formed never passes: unbounded, that route's
            return math.inf, undefined.route, False
        top = max(r.utilization for r in applied)
        floor = top if math.isinf(top) else top - 1e-12 * abs(top)
        best = next(r for r in applied if r.utilization >= floor)
        return best.utilization, best.route, False
    second = next((r for r in routes if r.route == ROUTES[0]), None)
    if second is None:
        return None, "", True
    return second.utilization, second.route, True


def attach(result, *, bow_free: dict | None, out_of_plane, cache=None):
    """``result`` with its routes and the headline utilisation (a result with a section and material)."""
    found, ltb_found = _evaluate(
        result,
        bow_free_moment=None if bow_free is None else bow_free["moment"],
        out_of_plane=out_of_plane,
        cache=cache,
    )
    value, _, _ = headline(found)
    return dataclasses.replace(result, routes=found, utilization=value, ltb=ltb_found)
