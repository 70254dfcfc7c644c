"""The engine's entry points: :func:`solve` one case, :func:`sweep` many axial forces."""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from engine import aisc_moments, member_routes
from engine.amplification import approximations, braced
from engine.biaxial import pair_check, worst_pair
from engine.bow_variants import choose, variants
from engine.cautions import assess, merge_plane_cautions
from engine.codes import alpha_cr_limit
from engine.errors import CaseError
from engine.out_of_plane import utilisation as out_of_plane_utilisation
from engine.prepared import prepare
from engine.raw import CRITICAL_TOLERANCE
from engine.raw import raw as _raw
from engine.reference import reference_peak
from engine.restraints import RestraintReaction
from engine.results import (
    Amplification,
    Equilibrium,
    Governing,
    Peak,
    Reactions,
    Result,
    ServiceCheck,
)
from engine.route_cautions import with_route_cautions
from engine.solver.model import Points
from engine.stepped import member_check
from engine.validate import within

__all__ = ["CRITICAL_TOLERANCE", "check_stations", "solve", "strength_solve"]

_MAX_STATIONS = 100_000
_FIVE = np.arange(5)


def check_stations(stations) -> int:
    if isinstance(stations, bool) or not isinstance(stations, (int, np.integer)):
        raise CaseError(f"stations: {stations!r} must be a whole number from 2 to {_MAX_STATIONS}")
    if not 2 <= int(stations) <= _MAX_STATIONS:
        raise CaseError(f"stations: {stations} must be from 2 to {_MAX_STATIONS}")
    return int(stations)


#: Values within this fraction of the largest |value| are a tie: the first along the member is the peak.
_TIE = 1e-12


def _peak(x, values) -> Peak:
    """The largest |value| and where it is; of values equal to rounding (:data:`_TIE`), the first along x.

    A symmetric member has the same |V| at both ends: which of the two is larger by a last bit depends on the
    linear algebra library's rounding (numpy 1.26 and 2.x picked opposite ends of one member, 2026-12-03),
    so a plain argmax reported the same member's shear with another sign and place on another machine.
    """
    i = int(_first_largest(np.abs(values)))
    return Peak(value=float(values[i]), x=float(x[i]))


def _first_largest(magnitude):
    """Index along the last axis of the first value within :data:`_TIE` of the largest (a NaN, which the
    engine never returns, is found as by argmax)."""
    top = magnitude.max(axis=-1, keepdims=True)
    first = (magnitude >= top * (1.0 - _TIE)).argmax(axis=-1)
    return np.where(np.isnan(top[..., 0]), magnitude.argmax(axis=-1), first)


def _ratio(num: float, den: float) -> float | None:
    return None if den <= 1e-300 else num / den


def _message(status, P, pcr, n_crit) -> str:
    kN = 1e-3
    if status == "critical":
        return (
            f"The axial force {P * kN:.6g} kN equals critical load {n_crit} ({pcr[n_crit - 1] * kN:.6g} kN): "
            "no equilibrium exists and the response is unbounded."
        )
    if status == "unstable":
        between = int(np.searchsorted(pcr, P))
        return (
            f"The axial force {P * kN:.6g} kN exceeds the first critical load {pcr[0] * kN:.6g} kN "
            f"(P/Pcr1 = {P / pcr[0]:.4g}, between critical loads {between} and {between + 1}): this "
            "equilibrium is unstable; the member buckles before it is reached."
        )
    if P > 0:
        return (
            f"Compression {P * kN:.6g} kN, P/Pcr1 = {P / pcr[0]:.4g} (alpha_cr = {float(pcr[0]) / P:.4g}); "
            "stable equilibrium."
        )
    if P < 0:
        return f"Tension {-P * kN:.6g} kN; stable equilibrium, no flexural buckling."
    return "No axial force: first-order solution."


def restraint_reactions(model, seg, xi, T, M) -> tuple:
    """The force and couple of every intermediate restraint on the member, from the state on both sides of
    its node: force = T(x-) - T(x+) - F, couple = M(x+) - M(x-) - C (the jumps the loads do not explain)."""
    out = []
    for index, node in enumerate(model.restraint_nodes.tolist()):
        left = np.nonzero((seg == node - 1) & (xi == model.h[node - 1]))[0]
        right = np.nonzero((seg == node) & (xi == 0.0))[0]
        force = float(T[left[-1]] - T[right[0]] - model.force[node])
        couple = float(M[right[0]] - M[left[-1]] - model.couple[node])
        out.append(RestraintReaction(index=index, x=float(model.nodes[node]), force=force, couple=couple))
    return tuple(out)


def _build(
    case,
    prep,
    count,
    P,
    st,
    x,
    seg,
    xi,
    status="stable",
    n_crit=0,
    first_order=False,
    bow_free=None,
    cautions=True,
    paired=False,
    bow=None,
    merge=None,
    aisc_solves=True,
) -> Result:
    model, buckling = prep.model, prep.buckling
    pcr = buckling.critical_loads
    w0 = st["w0"]
    if status == "critical":
        w = rot = M = T = V = np.full(x.size, np.inf)
    else:
        w, rot, M, T, V = st["w"], st["rotation"], st["M"], st["T"], st["V"]
    total = w + w0
    # The five governing values with one pass over a stacked array (no NaN here: critical values are +inf);
    # of values equal to rounding the first along the member, as :func:`_peak`.
    stacked = np.stack((w, total, M, V, T))
    at = _first_largest(np.abs(stacked))
    values, where = stacked[_FIVE, at].tolist(), x[at].tolist()
    governing = Governing(
        deflection=Peak(value=values[0], x=where[0]),
        total_offset=Peak(value=values[1], x=where[1]),
        moment=Peak(value=values[2], x=where[2]),
        shear=Peak(value=values[3], x=where[3]),
        transverse_force=Peak(value=values[4], x=where[4]),
    )
    source = None
    if not first_order:

        def source(result, seg=seg, xi=xi):
            if merge is not None:  # the base stations' P = 0 state is kept: only the peaks are evaluated
                st0 = prep.first_order_at(count, merge)
            else:
                st0 = prep.first_order(count)[0].states(0, Points(prep.model, seg, xi))
            return _build(case, prep, count, 0.0, st0, result.x, seg, xi, first_order=True)

    if status == "critical":
        reactions = Reactions(left_T=math.inf, left_M=math.inf, right_T=math.inf, right_M=math.inf)
        equilibrium = None
        amplification = Amplification(moment=math.inf, deflection=math.inf, moment_first_order=math.inf)
    else:
        # Support-side end values: state(0-) = state(0+) - jump(0), state(L+) = state(L-) + jump(L).
        last = model.nodes.size - 1
        tl = float(T[0] + model.force[0])
        ml = float(M[0] - model.couple[0])
        tr = float(T[-1] - model.force[last])
        mr = float(M[-1] + model.couple[last])
        inner = restraint_reactions(model, seg, xi, T, M)
        reactions = Reactions(left_T=tl, left_M=ml, right_T=tr, right_M=mr, intermediate=inner)
        L = model.L
        # Judge the residual against every force in play: loads, reactions, couples over the span, and the
        # largest shear and transverse force (a couple alone has reactions of rounding size). The restraints'
        # reactions count as loads.
        couples = model.couple_scale + sum(abs(r.couple) for r in inner)
        load_scale = model.load_scale + sum(abs(r.force) for r in inner)
        total_load = model.total_load + sum(r.force for r in inner)
        total_moment = model.total_moment + sum(r.force * (L - r.x) for r in inner)
        scale_t = load_scale + abs(tl) + abs(tr) + couples / model.L + abs(values[3]) + abs(values[4])
        res_t = (tl - tr - total_load) / scale_t if scale_t > 0 else 0.0
        drift = float(total[-1] - total[0])
        lhs = mr - ml - model.total_couple - sum(r.couple for r in inner)
        rhs = L * tl - total_moment + P * drift
        scale_m = abs(ml) + abs(mr) + couples + L * (abs(tl) + load_scale) + abs(P * drift)
        res_m = (lhs - rhs) / scale_m if scale_m > 0 else 0.0
        # On a foundation the ground's reaction is spread along the member: no residuals are formed.
        equilibrium = (
            None if model.has_foundation else Equilibrium(transverse=float(res_t), moment=float(res_m))
        )
        if first_order:
            one = 1.0 if governing.moment.magnitude > 0 else None
            amplification = Amplification(
                moment=one,
                deflection=1.0 if governing.total_offset.magnitude > 0 else None,
                moment_first_order=one,
            )
        else:
            amplification = _amplification(case, prep, count, P, governing, bow_free, aisc_solves)
    member = prep.member
    section = member.section if member is not None else None
    material = member.material if member is not None else None
    check = service = None
    # The deflection check is a service check: on the loads as given, without the code's bow. At N = 0 the
    # bow moves nothing (it was skipped there: a beam with a bow preset had no deflection check at all).
    if bow_free is not None:
        w_service = bow_free["deflection"]
    elif not prep.has_bow or P == 0.0:
        w_service = governing.deflection
    else:
        w_service = None
    if not first_order and status != "critical":
        # A plane of a two-plane case (the member check is made on both planes together) or a member given
        # by EI alone (no member check; the deflection limit is geometry alone: an audit found a batch row's
        # deflection_limit ignored without a word): the deflection check by itself.
        if paired or section is None or material is None:
            if w_service is not None:
                allowed = model.L / case.check.deflection_limit
                service = ServiceCheck(
                    utilization=abs(w_service.value) / allowed,
                    deflection=w_service.value,
                    x=w_service.x,
                    allowed=allowed,
                    limit=case.check.deflection_limit,
                )
        else:
            check = member_check(
                member,
                prep.section_class(P),
                x=x,
                axial_force=P,
                moment=M,
                shear=V,
                deflection=np.array([w_service.value if w_service is not None else values[0]]),
                length=model.L,
                axis=case.axis,
                settings=case.check,
                route="eq-5.9" if case.imperfection.preset == "en1993-eq-5.9" else None,
                beyond_critical=status == "unstable",
                out_of_plane=out_of_plane_utilisation(prep.out_of_plane(), P),
                in_plane_bound=prep.elastic_bound(P),
            )
            if w_service is not None:
                service = ServiceCheck(
                    utilization=check.deflection_utilization,
                    deflection=w_service.value,
                    x=w_service.x,
                    allowed=check.deflection_allowed,
                    limit=check.settings.deflection_limit,
                )
    if status != "stable":  # beyond the first critical load no service state exists (read 0.929 "passing")
        service = None
    result = Result(
        case=case,
        axial_force=float(P),
        x=x,
        deflection=w,
        rotation=rot,
        moment=M,
        shear=V,
        transverse_force=T,
        initial_bow=w0,
        total_offset=total,
        status=status,
        stable=status == "stable",
        message=_message(status, P, pcr, n_crit),
        critical_loads=pcr.copy(),
        buckling=buckling,
        alpha_cr=float(pcr[0]) / P if P > 0 else math.inf,
        governing=governing,
        reactions=reactions,
        amplification=amplification,
        equilibrium=equilibrium,
        _first_order_source=source,
        EI=model.EI,
        section=section,
        material=material,
        bow=bow if bow is not None else (member.bow if member is not None else None),
        check=check,
        utilization=(
            check.utilization
            if check is not None
            else (math.inf if status == "critical" and section is not None else None)
        ),
        service=service,
    )
    if not first_order and section is not None and material is not None and not paired:  # routes, issue 14
        out = prep.out_of_plane()
        result = member_routes.attach(result, bow_free=bow_free, out_of_plane=out, cache=prep.design)
    if not first_order and cautions:
        result = _with_cautions(result, prep, favourable=False)
    return result


def _amplification(case, prep, count, P, governing, bow_free, aisc=True) -> Amplification:
    """The exact amplifications and the approximations; ``aisc`` False (the capacity finder, the aisc route
    not counted) leaves out that route's own solves (:mod:`engine.aisc_moments`)."""
    _, _, _, m1, d1, ends = prep.first_order(count)
    if prep.has_bow and P != 0.0:
        ref, ref_x = reference_peak(prep.reference(count), P)
    else:  # no bow's moment: the reference is the first-order moment itself
        ref, ref_x = m1, None
    m2 = governing.moment.magnitude
    elm = aisc and case.check.aisc_analysis == "effective-length"  # which of the aisc route's own solves
    m_exact, m_first = _ratio(m2, ref), _ratio(m2, m1)
    if bow_free is not None:
        m_free = _ratio(bow_free["moment"], m1)
    else:
        m_free = None if prep.has_bow and P != 0.0 else m_first
    return Amplification(
        moment=m_exact,
        deflection=_ratio(governing.total_offset.magnitude, d1),
        approximations=approximations(
            case, P, prep.buckling.critical_loads[0], m_exact, ends, bow_free=m_free
        ),
        moment_first_order=m_first,
        moment_bow_free=m_free,
        reference_moment=ref,
        reference_moment_x=ref_x,
        moment_asd=aisc_moments.asd_moment(case, prep, count, P) if elm else None,
        moment_out_of_plumb=aisc_moments.plumb_moment(case, prep, count, P) if elm else None,
        moment_direct=aisc_moments.direct_moment(case, prep, count, P) if aisc and not elm else None,
        moment_untilted=(
            aisc_moments.untilted_moment(case, prep, count, P)
            if aisc and aisc_moments.other_plane_sways(case, prep)
            else None
        ),
    )


def _with_cautions(result, prep, favourable: bool) -> Result:
    """``result`` with its cautions (``favourable``: the bow used is the favourable way)."""
    return dataclasses.replace(result, cautions=_cautions(result, prep, favourable, result.check))


def _cautions(result, prep, favourable: bool, check) -> tuple:
    """The cautions of ``result`` with ``check`` as its member check."""
    case, section, buckling = result.case, result.section, prep.buckling
    pcr1 = float(buckling.critical_loads[0])
    slender = buckling.effective_length_factor * prep.model.L / section.i if section is not None else None
    out = getattr(getattr(check, "out_of_plane", None), "N_cr", None)  # one plane: the other axis counts too
    if slender is not None and out is not None and result.material is not None and 0.0 < out < math.inf:
        slender = max(slender, math.pi * math.sqrt(result.material.E * section.A / out))  # its L_cr/i
    facts = dict(prep.bow_facts(), opposes_load=favourable)
    # The analysis is elastic whatever the cross-section check: the limit of an elastic global analysis.
    return with_route_cautions(
        assess(
            P=result.axial_force,
            pcr1=pcr1,
            alpha_cr_limit=alpha_cr_limit("elastic"),
            status=result.status,
            slenderness=slender,
            section=section,
            material=result.material,
            axis=case.axis,
            check=check,
            bow=facts,
            service=result.service,
            gamma_M1=case.check.gamma_M1,
            segments=tuple((s.section, s.material) for s in getattr(prep.member, "segments", ())),
        ),
        result.routes,
        result.ltb,
    )


def solve(case, stations: int = 401) -> Result:
    """Solve one case exactly: deflection, rotation, moment, shear and transverse force at the stations.

    Where a code preset leaves the bow's direction automatic, both directions are solved and the worse is
    returned (``result.bow.direction_governing`` says which). The deflection check (``result.service``) is
    made on the loads as given without the bow.

    Parameters
    ----------
    case : Case
        The member (:class:`engine.Case`).
    stations : int
        Number of uniformly spaced stations (2 to 100 000). Nodes, doubled jump points and exact interior
        peaks are added, so ``result.x`` is longer.

    Returns
    -------
    Result
        With ``first_order`` (P = 0) at the same stations. At a critical load ``status == "critical"`` and the
        response is +inf; above the first critical load ``stable`` is False.

    Examples
    --------
    >>> import engine
    >>> case = engine.Case.from_dict({"schema": 1, "length": 4.0, "EI": 1e6,
    ...     "supports": {"left": "pinned", "right": "pinned"}, "loads": [{"type": "uniform", "q": 1e3}]})
    >>> r = engine.solve(case)
    >>> round(r.governing.moment.value, 6), r.governing.moment.x       # qL²/8 at mid-span
    (2000.0, 2.0)
    """
    return _solve(case, prepare(case), check_stations(stations))


def strength_solve(case, stations: int = 401) -> Result:
    """:func:`solve` without what does not bear on the strength utilisation (for the capacity finder)."""
    return _solve(case, prepare(case), check_stations(stations), details=False)


def _solve(case, prep, n: int, details: bool = True, rank: str = "strength") -> Result:
    """:func:`solve` on a prepared case; ``details=False`` (the capacity finder) leaves out what does not
    bear on the strength utilisation: the bow-free solve (service check, B1) and the favourable-bow check.
    ``rank="deflection"``: each plane's bow variant with the largest deflection (:func:`_solve_plane`)."""
    if case.second_plane is not None:
        return _solve_pair(case, prep, n, details, rank)
    result, chosen, _, favourable = _solve_plane(case, prep, n, details, rank=rank)
    return _with_cautions(result, chosen, favourable=favourable)


def _solve_plane(
    case, prep, n: int, details: bool, paired: bool = False, pick=None, unkept=None, rank="strength"
):
    """One plane solved, without its cautions: ``(result, prepared member used, its raw solution,
    favourable)``, the member used being the variant of the bow that was kept.

    The bow is solved in each direction where its direction is automatic (and, with ``details``, the other
    direction where the case fixes it, to say whether it is favourable), and as a half sine between the ends
    where a preset takes the first mode's shape (:attr:`engine.member.BowChoice.alternatives`); the worse is
    kept (:func:`_severity`). ``unkept`` (a list) receives the variants that could have been kept and were
    not, as ``(key, prepared member, raw solution)``, and ``pick`` (such a key) keeps that one instead: a
    two-plane case keeps the pair worst for the check of both planes together (:func:`_solve_pair`).
    ``rank="deflection"`` (a service combination solved with its bow) keeps the variant with the largest
    deflection among all those solved, whichever direction the case gives."""
    P = float(case.axial_force)
    raw = _raw(prep, n, P)
    status = raw[0]
    choice = prep.member.bow if prep.member is not None else None
    live = choice is not None and prep.has_bow and P != 0.0 and status != "critical"
    reverse = live and (choice.automatic or details)
    shapes = len(choice.alternatives) if live else 0
    bow_free = free_raw = None
    # The aisc route's M_r is the bow-free moment, so the capacity finder needs it too when that route counts.
    aisc_solves = details or "aisc" in case.check.routes
    if aisc_solves and prep.has_bow and P != 0.0 and status != "critical":
        member = prep.member
        checked = member is not None and member.section is not None and member.material is not None
        # with details, a member given by EI alone too: its deflection check needs the bow-free solve (an
        # audit found it dropped in tension and on a cantilever)
        if checked or details or (0 < P < prep.buckling.critical_loads[0] and braced(case)):
            free_raw = _raw(prep.variant("bow_free"), n, P)
            bow_free = _free_peaks(free_raw)
    if not (reverse or shapes):
        result = _build(
            case,
            prep,
            n,
            P,
            *raw[2:6],
            status=status,
            n_crit=raw[1],
            bow_free=bow_free,
            cautions=False,
            paired=paired,
            merge=raw[9],
            aisc_solves=aisc_solves,
        )
        return result, prep, raw, False
    found = variants(prep, n, P, raw, free_raw, reverse, shapes)
    if rank == "deflection":
        severity = {key: _deflection_rank(r) for key, (p, r) in found.items()}
    else:
        severity = {key: _severity(case, p, P, r) for key, (p, r) in found.items()}
    key, text, facts, favourable = choose(found, severity, choice, shapes, pick, unkept, rank)
    chosen_prep, chosen_raw = found[key]
    bow = dataclasses.replace(
        chosen_prep.member.bow, direction_governing=text, directions=facts, favourable=favourable
    )
    result = _build(
        case,
        chosen_prep,
        n,
        P,
        *chosen_raw[2:6],
        status=chosen_raw[0],
        n_crit=chosen_raw[1],
        bow_free=bow_free,
        cautions=False,
        paired=paired,
        bow=bow,
        merge=chosen_raw[9],
        aisc_solves=aisc_solves,
    )
    return result, chosen_prep, chosen_raw, favourable


def _deflection_rank(raw) -> tuple:
    """What decides a service bow's variant: (max|w|, max|M|), +inf at a critical load."""
    status, _, values, _ = raw[:4]
    if status == "critical":
        return math.inf, math.inf
    return float(np.abs(values["w"]).max()), float(np.abs(values["M"]).max())


def _free_peaks(raw) -> dict:
    """The largest |M| and |w| (with where) of the member without its bow, from its raw solution."""
    status, _, values, x = raw[:4]
    if status == "critical":
        return {"moment": math.inf, "deflection": Peak(value=math.inf, x=0.0)}
    return {
        "moment": float(np.max(np.abs(values["M"]))),
        "deflection": _peak(x, values["w"]),
    }


def _severity(case, prep, P, raw) -> tuple:
    """What decides the worse direction: the strength utilisation (None where unchecked), then max|M|."""
    status, _, values, x = raw[:4]
    moment = float(np.abs(values["M"]).max()) if status != "critical" else math.inf
    member = prep.member
    if member.section is None or member.material is None:
        return None, moment
    if status == "critical":
        return math.inf, moment
    check = member_check(
        member,
        x=x,
        axial_force=P,
        moment=values["M"],
        shear=values["V"],
        deflection=np.zeros(1),
        length=prep.model.L,
        axis=case.axis,
        settings=case.check,
    )
    return check.strength_utilization, moment


_RANK = {"stable": 0, "unstable": 1, "critical": 2}


def _solve_pair(case, prep, n: int, details: bool, rank: str = "strength") -> Result:
    """A two-plane case: each plane solved as its own beam-column (uncoupled: doubly symmetric sections),
    the cross-section checked with N, M_y and M_z together, the status and α_cr the worse of the two planes,
    and the second plane's cautions merged into the first's."""
    P = float(case.axial_force)
    others = ([], [])
    r1, prep1, raw1, fav1 = _solve_plane(case, prep, n, details, paired=True, unkept=others[0], rank=rank)
    derived = case.second_plane_case()
    with within("second_plane"):  # kept with the case's own (the second plane depends on nothing else)
        prep_two = prep.design("second_plane", lambda: prepare(derived))
    r2, prep2, raw2, fav2 = _solve_plane(
        derived, prep_two, n, details, paired=True, unkept=others[1], rank=rank
    )
    statuses = (r1.status, r2.status)
    check, utilization = None, None
    if "critical" in statuses:
        utilization = math.inf if r1.section is not None else None
    elif r1.section is not None and r1.material is not None:
        check = pair_check(case, P, ((r1, prep1, raw1), (r2, prep2, raw2)))
        picks = (None, None)  # a service solve keeps each plane's largest deflection (planes uncoupled)
        if rank == "strength":
            picks = worst_pair(case, P, check, (r1, prep1, raw1), (r2, prep2, raw2), others)
        if picks[0] is not None:
            r1, prep1, raw1, fav1 = _solve_plane(case, prep, n, details, paired=True, pick=picks[0])
        if picks[1] is not None:
            r2, prep2, raw2, fav2 = _solve_plane(derived, prep_two, n, details, paired=True, pick=picks[1])
        if picks != (None, None):
            check = pair_check(case, P, ((r1, prep1, raw1), (r2, prep2, raw2)))
        utilization = check.utilization
    # Each plane's cautions with the pair's check; the second plane is kept without either (r2 as solved).
    cautions = merge_plane_cautions(
        _cautions(r1, prep1, fav1, check), _cautions(r2, prep2, fav2, check), derived.axis
    )
    status = max(statuses, key=_RANK.__getitem__)
    message = r1.message
    if _RANK[r2.status] > _RANK[r1.status]:
        message = f"Second plane (bending about the {derived.axis} axis): {r2.message}"
    result = dataclasses.replace(
        r1,
        check=check,
        utilization=utilization,
        status=status,
        stable=status == "stable",
        message=message,
        alpha_cr=min(r1.alpha_cr, r2.alpha_cr),
        cautions=cautions,
        second_plane=r2,
    )
    if r1.section is None or r1.material is None:
        return result
    result = member_routes.attach(result, bow_free=None, out_of_plane=None, cache=prep1.design)  # issue 14
    return dataclasses.replace(
        result, cautions=with_route_cautions(result.cautions, result.routes, result.ltb)
    )
