r"""The member's lateral-torsional buckling check (issue 15): exact :math:`M_{cr}`, :math:`\chi_{LT}`,
:math:`M_{b,Rd}` and AISC 360-16 §F2 (§F11.2 for a deep solid rectangle), from the member's own first-order
major-axis moment diagram.

What it reads (all from the solved result, SI):

- the first-order diagram M_y(x) of the major-axis plane (the loads as given, P = 0, no bow) and its loads;
- the section about both axes (I_z, W_y, h) and its torsion properties :math:`I_t, I_w`
  (:mod:`engine.torsion`, or a custom section's ``It``/``Iw``);
- the axial force :math:`N_{Ed}` (compression positive) and ``check.ltb``
  (:class:`engine.design.ltb.LtbSettings`).

Decisions, each on the safe side (DEVELOPERS.md, decisions log, issue 15):

- :math:`M_{cr}` is the exact elastic value (:func:`engine.design.mcr.critical_moment`) for the
  **first-order** diagram, with a compressive :math:`N_{Ed}` held (it softens the member: lower
  :math:`M_{cr}`); a tension is left out (it would raise :math:`M_{cr}`).
- :math:`I_t` and :math:`I_w` of rolled I sections are divided by 1.045 and those of welded I sections by
  1.01 before they enter :math:`M_{cr}`: the closed forms are up to +4.4 % (rolled) and +0.2 % (welded)
  above a finite-element computation (DEVELOPERS.md, issue 15, torsion properties). A custom section's
  values are used as given.
- Transverse loads act at :math:`+h/2` (destabilising, the default), 0 or :math:`-h/2` from the shear
  centre, each load on the flange it comes from.
- :math:`\chi_{LT}` by §6.3.2.2 (Table 6.4) unless ``check.ltb.chi_method`` is ``"rolled"``: then §6.3.2.3
  (Table 6.5, :math:`\bar\lambda_{LT,0} = 0.4`, β = 0.75) for rolled and welded I sections, with f from
  :math:`k_c` of Table 6.6 only when the diagram is within 1 % of the table's shape (else :math:`k_c = 1`).
- :math:`W_y = W_{pl,y}` for class 1–2, else :math:`W_{el,y}`; :math:`M_{Ed}` = max|M_y| of the first-order
  diagram (the value eqs. (6.61)/(6.62) use).
- A cantilever (a free end) is checked with its support ``fixed`` laterally (v = v' = 0 there; its warping
  as stated, free by default): where ``check.ltb.lateral_ends`` says so, or where the support is built in
  within the plane analysed (``built_in_root``: translation and rotation fixed, in both planes of a
  two-plane case) and the case leaves the
  fork there (``root_assumed``, a warning says so: a fork would leave the cantilever free to swing, so a
  built-in support is taken as holding it laterally as well; a decision of the project, DEVELOPERS.md
  decisions log, stop 29). The tip is free (nothing held), the tip's settings are ignored, no tabulated M_cr
  (the C1 tables are for spans between forks), AISC with C_b = 1 for the tip segment, capped by the exact
  M_cr. A support that is not built in (a rotational spring) with a fork: not made (``free-end``), unless
  an intermediate restraint holds the member laterally (``lateral`` fixed or a spring): an overhang past a
  support, checked with the fork and the tip free (:func:`engine.design.mcr.critical_moment` accepts it).
- The check is not made (``applies`` False, the caution stays) for a member with a free end whose support is
  not stated laterally fixed, for an open section without known :math:`I_t, I_w` (``torsion-unknown``), for
  a custom section that is not doubly symmetric, for a custom section without its minor-axis ``Iz``
  (``minor-axis-unknown``), and where a load height is asked for and the depth is
  unknown; for a custom section ``missing`` names the case keys it lacks (``section.Iz``, ...).
- Intermediate restraints (``restraints``, from :func:`engine.member_routes.ltb_restraints`) enter the exact
  :math:`M_{cr}` at the shear centre (lateral v, v') and as twist φ; a brace point (lateral and twist fixed)
  splits the member into segments for the tabulated :math:`M_{cr}` and AISC §F2/§F11.2 (L_b, C_b per
  segment, the worst governs); :math:`\chi_{LT}` uses the exact :math:`M_{cr}` of the whole member. A hinge
  in the plane of minor-axis bending: not made (``lateral-hinge``).
- A custom section (keys ``Iz``, ``It``, ``Iw``, ``doubly_symmetric: true``, :mod:`engine.custom_section`)
  is checked like a catalogue one with its values as given: no torsion factor, :math:`W_{el,y}` (it is not
  classified, and its cross-section check is the elastic one), §6.3.2.2 with the curve it names
  (``ltb_curve``, default d: Table 6.4's other cross-sections), no AISC §F2 (not a catalogued I-shape).
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

import numpy as np

from engine.custom_section import missing_for_ltb
from engine.design import ltb
from engine.design.ltb_segments import aisc_segments, aisc_source, end_pair, piece, segment_mcr
from engine.design.mcr import HeldAxial, critical_moment
from engine.loads import LinearLoad, PointLoad, UniformLoad
from engine.sections import deep_hollow, deep_solid

__all__ = ["SOURCES", "TORSION_FACTORS", "LtbCheck", "check", "not_applied"]

#: The closed-form torsion constants of each shape are divided by these before M_cr (see the module).
TORSION_FACTORS = {"rolled_i": 1.045, "welded_i": 1.01}

SOURCES = (
    "EN 1993-1-1:2005 §6.3.2.1 eq. (6.54), §6.3.2.2 eq. (6.56) Tables 6.3/6.4, §6.3.2.3 eqs. (6.57)/(6.58) "
    "Tables 6.5/6.6 (from memory)",
    "M_cr: finite-element solution of Vlasov's equations (Timoshenko & Gere 1961 ch. 6; Trahair 1993)",
    ltb.C1_SOURCE,
)

_DIAGRAM_CODES = {"point": "point-mid"}
#: M_cr with N held from :class:`engine.design.mcr.HeldAxial` kept per member (equal to solving it afresh, bit
#: for bit); False: solved afresh at every N, the path ``tests/app/test_batch_exact.py`` compares against.
HELD_FAMILY = True
_LINEAR_PIECES = 16
_KC_DEVIATION = 0.01


@dataclass(frozen=True, kw_only=True)
class LtbCheck:
    """The lateral-torsional buckling check of the member (DEVELOPERS.md, issue 15). SI units; NaN where a
    value could not be found (``applies`` False)."""

    applies: bool
    reason: str | None
    M_Ed: float
    M_cr: float
    M_cr_tabulated: float
    C1: float
    diagram: str
    diagram_deviation: float
    difference: float
    lambda_LT: float
    chi_LT: float
    curve: str
    method: str
    f: float
    M_b_Rd: float
    utilisation: float
    load_position: str
    lateral_ends: tuple
    warping_ends: tuple
    mode_x: tuple = ()
    mode_v: tuple = ()
    mode_phi: tuple = ()
    aisc: ltb.AiscLtb | None = None
    sources: tuple = SOURCES
    # Beyond the first list of fields:
    M_cr_0: float = math.nan  # exact M_cr with N = 0 [N·m]
    N_Ed: float = 0.0  # the compression held in M_cr [N]
    I_t: float = math.nan  # [m⁴] as used (after TORSION_FACTORS)
    I_w: float = math.nan  # [m⁶] as used
    W_y: float = math.nan  # [m³]
    C_b_F1_1: float = math.nan  # C_b of eq. (F1-1) before the cap by the exact M_cr
    length: float = math.nan  # [m] between the end restraints
    missing: tuple = ()  # the case keys a custom section lacks for the check ("section.Iz", ...)
    restraints: tuple = ()  # intermediate restraints in M_cr, critical_moment's form ({"x", "lateral", ...})
    segments: tuple = ()  # ((a, b), ...) [m] between brace points (lateral and twist fixed); () for one
    segment: tuple = ()  # (a, b) [m] of the segment that governs the tabulated M_cr and AISC §F2
    root_assumed: bool = False  # a cantilever's built-in support taken as laterally fixed (not stated)
    tip_moves: bool = False  # the free end is free as its support moves (lateral end "supports")
    held_assumed: str = ""  # "left"/"right"/"both": ends whose support moves, taken as forks (one plane)
    supports_assumed: tuple = ()  # x [m] of supports inside taken as forks (a one-plane overhang)
    # L_cr/L out of plane where the member is checked as a cantilever out of its plane (engine.ltb_route)
    out_of_plane_cantilever: float = 0.0


def not_applied(reason: str, settings, M_Ed: float = 0.0, missing: tuple = ()) -> LtbCheck:
    """The check not made: χ_LT = 1 is what the routes then use (and the caution stays)."""
    known = reason in ("no-major-moment", "minor-axis-only", "closed-or-solid", "restrained")
    settings = settings.supports_as_forks()
    return LtbCheck(
        applies=False,
        reason=reason,
        M_Ed=M_Ed,
        M_cr=math.inf if known else math.nan,
        M_cr_tabulated=math.inf if known else math.nan,
        C1=1.0,
        diagram="none",
        diagram_deviation=0.0,
        difference=0.0 if known else math.nan,
        lambda_LT=0.0 if known else math.nan,
        chi_LT=1.0,
        curve="",
        method="",
        f=1.0,
        M_b_Rd=math.nan,
        utilisation=0.0 if known else math.nan,
        load_position=settings.load_position,
        lateral_ends=tuple(settings.lateral_ends),
        warping_ends=tuple(settings.warping_ends),
        missing=tuple(missing),
    )


def _held_laterally(restraints) -> bool:
    """Whether an intermediate restraint holds the shear centre laterally (fixed, or a spring): with a fork
    at the other end, a member with a free end is then an overhang past a support, not a mechanism."""
    return any(r.get("lateral", "free") not in ("free", 0, 0.0) for r in restraints)


def _custom_reason(missing: tuple) -> str:
    """The reason code of a custom section that lacks ``missing`` (its first gap in the check's order)."""
    if "It" in missing or "Iw" in missing:
        return "torsion-unknown"
    if "Iz" in missing:
        return "minor-axis-unknown"
    return "not-doubly-symmetric" if "doubly_symmetric" in missing else "depth-unknown"


def _mcr_loads(loads, length: float, height: float) -> list:
    """The case's transverse loads in :func:`critical_moment`'s form (magnitudes; a linear load as steps)."""
    out = []
    for load in loads:
        if isinstance(load, UniformLoad):
            start, end = load.span(length)
            out.append({"kind": "uniform", "q": abs(load.q), "start": start, "end": end, "height": height})
        elif isinstance(load, LinearLoad):
            start, end = load.span(length)
            edges = np.linspace(start, end, _LINEAR_PIECES + 1)
            for a, b in zip(edges[:-1], edges[1:], strict=True):
                mid = 0.5 * (a + b)
                q = load.q_start + (load.q_end - load.q_start) * (mid - start) / (end - start)
                out.append({"kind": "uniform", "q": abs(q), "start": a, "end": b, "height": height})
        elif isinstance(load, PointLoad):
            out.append({"kind": "point", "F": abs(load.P), "x": load.x, "height": height})
    return out


_CANTILEVER = ltb.StandardDiagram(
    diagram="cantilever", C1=math.nan, C2=math.nan, psi=None, deviation=math.inf
)


def _segments(length: float, restraints) -> tuple:
    """The pieces between brace points, where lateral deflection and twist are both held (``"fixed"``)."""
    points = sorted(
        {float(r["x"]) for r in restraints if r.get("lateral") == "fixed" and r.get("twist") == "fixed"}
    )
    edges = [0.0, *points, float(length)]
    return tuple(zip(edges[:-1], edges[1:], strict=True))


def _tabulated(xs, ms, length, segments, settings, stiffness, z_g):
    """(M_cr tabulated for the whole diagram, its standard diagram, the governing segment): per segment the
    C1 formula for its own length, diagram and ends, scaled to the member's max|M| by the segment's peak; the
    lowest governs."""
    M_max = float(np.max(np.abs(ms)))
    best = None
    for a, b in segments:
        sx, sm = (xs, ms) if len(segments) == 1 else piece(xs, ms, a, b)
        peak = float(np.max(np.abs(sm)))
        if peak == 0.0:
            continue
        std = _standard(sx, sm)
        lateral = end_pair(settings.lateral_ends, a, b, length, "fork")
        warping = end_pair(settings.warping_ends, a, b, length, "free")
        value = ltb.mcr_c1(b - a, *stiffness, std.C1, std.C2, z_g, k=_k(lateral), k_w=_k(warping))
        if best is None or value / peak < best[0]:
            best = (value / peak, std, (a, b))
    return best[0] * M_max, best[1], best[2]


def _k(ends) -> float:
    """Effective length factor of the three-factor formula for the end pair (0.7 mixed: common practice)."""
    fixed = sum(end == "fixed" for end in ends)
    return (1.0, 0.7, 0.5)[fixed]


def _standard(x: np.ndarray, M: np.ndarray) -> ltb.StandardDiagram:
    """The nearest standard diagram; a station given twice (a point load's) counts once, a jump (a couple in
    the span) is none of the table's shapes."""
    twice = np.diff(x) <= 0.0
    if np.any(twice):
        scale = float(np.max(np.abs(M)))
        if np.any(np.abs(np.diff(M))[twice] > 1e-9 * scale):
            return ltb.StandardDiagram(diagram="none", C1=1.0, C2=0.0, psi=None, deviation=math.inf)
        keep = np.concatenate([[True], ~twice])
        x, M = x[keep], M[keep]
    return ltb.c1_for_diagram(x, M)


def _unit(values: np.ndarray) -> tuple:
    peak = float(np.max(np.abs(values))) if values.size else 0.0
    return tuple(float(v) for v in (values / peak if peak > 0.0 else values))


def check(
    *,
    x,
    M,
    loads,
    V=None,
    length: float,
    section_y,
    section_z,
    material,
    N: float,
    settings,
    section_class: int | None,
    free_end: bool | str = False,
    built_in_root: bool = False,
    gamma_M1: float = 1.0,
    cache=None,
    restraints: tuple = (),
    lateral_hinge: bool = False,
    resistance: bool = True,
    modulus: float | None = None,
) -> LtbCheck:
    """The lateral-torsional buckling check of a member (see the module).

    ``x``, ``M``, ``V``: the first-order major-axis diagram [m, N·m] and its shear dM/dx [N] (M is then
    interpolated by cubic pieces, exact for uniform and linear loads); ``loads``: the major plane's loads;
    ``N``: the axial force [N], compression positive; ``settings``: the case's ``check.ltb``; ``cache``:
    ``cache(key, make)`` for what does not depend on N (the M_cr at N = 0); ``restraints``: intermediate
    restraints in :func:`engine.design.mcr.critical_moment`'s form; ``lateral_hinge``: a hinge in the plane of
    minor-axis bending (the check is then not made: the elements cannot release v''); ``resistance`` False
    (a material without EN 1993-1-1's curves): the check is not made (reason ``material-<kind>``), but the
    exact M_cr with N held is kept, a bound of any code's resistance. ``modulus``: W_eff,y of a class 4
    section with its effective properties (EN 1993-1-1 §6.3.2.1(3), W_y = W_eff,y for class 4; from memory),
    in place of W_el,y.
    """
    settings = settings.supports_as_forks()  # the ends a support leaves free come as free_end
    xs = np.asarray(x, dtype=float)
    ms = np.asarray(M, dtype=float)
    vs = None if V is None else np.asarray(V, dtype=float)
    M_Ed = float(np.max(np.abs(ms))) if ms.size else 0.0
    sy, sz = section_y, section_z
    closed = sy.shape in ("rhs", "chs", "rectangle", "round") or not sy.open_section
    if closed and not (deep_solid(sy) or deep_hollow(sy)):
        return not_applied("closed-or-solid", settings, M_Ed)
    if M_Ed == 0.0:
        return not_applied("no-major-moment", settings, M_Ed)
    if settings.restrained:
        return not_applied("restrained", settings, M_Ed)
    lateral_ends, warping_ends = tuple(settings.lateral_ends), tuple(settings.warping_ends)
    root_assumed = False
    if free_end:  # a cantilever: checked when its support is fixed laterally (else it could swing)
        tip = {"left": 0, "right": 1}.get(free_end) if isinstance(free_end, str) else None
        if tip is not None and lateral_ends[1 - tip] != "fixed" and built_in_root:
            # built in within its plane: held laterally too unless the case says otherwise (module notes)
            lateral_ends = tuple("fixed" if i == 1 - tip else end for i, end in enumerate(lateral_ends))
            root_assumed = True
        overhang = tip is not None and lateral_ends[1 - tip] == "fork" and _held_laterally(restraints)
        if tip is None or (lateral_ends[1 - tip] != "fixed" and not overhang):
            return not_applied("free-end", settings, M_Ed)
        lateral_ends = tuple("free" if i == tip else end for i, end in enumerate(lateral_ends))
        warping_ends = tuple("free" if i == tip else end for i, end in enumerate(warping_ends))
    if lateral_hinge:
        return not_applied("lateral-hinge", settings, M_Ed)
    torsion = sy.torsion
    height = {"destabilising": 0.5, "shear-centre": 0.0, "stabilising": -0.5}[settings.load_position]
    custom = sy.shape == "custom"
    if custom:
        missing = missing_for_ltb(sy, height != 0.0)
        if missing:
            keys = tuple(f"section.{key}" for key in missing)
            return not_applied(_custom_reason(missing), settings, M_Ed, keys)
    if torsion.I_t is None or torsion.I_w is None:
        return not_applied("torsion-unknown", settings, M_Ed)
    if not sy.doubly_symmetric:
        return not_applied("not-doubly-symmetric", settings, M_Ed)
    if height != 0.0 and sy.depth is None:
        return not_applied("depth-unknown", settings, M_Ed)
    z_g = height * (sy.depth or 0.0)
    factor = TORSION_FACTORS.get(sy.shape, 1.0)
    I_t, I_w = torsion.I_t / factor, torsion.I_w / factor
    E = material.E
    G = material.G if material.G is not None else E / 2.6  # ν = 0.3
    I_z = sy.I_minor if custom else sz.I
    EI_z, GI_t, EI_w = E * I_z, G * I_t, E * I_w
    i0_sq = (sy.I + I_z) / sy.A
    mcr_loads = _mcr_loads(loads, length, z_g)
    common = dict(
        EI_z=EI_z,
        GI_t=GI_t,
        EI_w=EI_w,
        length=length,
        i0_squared=i0_sq,
        loads=mcr_loads,
        lateral_ends=lateral_ends,
        warping_ends=warping_ends,
        scale_axial=False,
        restraints=tuple(restraints),
    )

    def solve(axial, pair=None):
        try:
            return critical_moment(xs, ms, N=axial, mesh_pair=pair, V=vs, **common)
        except ValueError:  # N held at or above N_cr,z or N_cr,T: no lateral stiffness left
            return None

    # What identifies this problem in the member's cache: a member stepped in section is checked once per
    # segment's section with the same cache (engine.member_routes), so the keys carry the stiffnesses, the
    # section, the material and the restraints, not the settings alone.
    ident = (
        settings,
        sy.name,
        float(material.fy),
        EI_z,
        GI_t,
        EI_w,
        i0_sq,
        z_g,
        lateral_ends,
        warping_ends,
        tuple(tuple(sorted(r.items())) for r in restraints),
    )
    at_zero = solve(0.0) if cache is None else cache(("ltb-mcr0", *ident), lambda: solve(0.0))
    N_held = max(float(N), 0.0)
    # With N the mesh of the N = 0 solution (converged there): M_cr then varies smoothly with N, which the
    # capacity's root finder needs; N only softens the member, so the mesh stays as fine relative to the mode.
    if N_held == 0.0:
        found = at_zero
    elif at_zero is None or cache is None or not HELD_FAMILY:
        found = solve(N_held, at_zero.elements if at_zero is not None else None)
    else:  # the matrices of that mesh pair kept for every N (the capacity's trials): the same M_cr
        held = {name: value for name, value in common.items() if name != "scale_axial"}
        family = cache(
            ("ltb-mcr-held", *ident), lambda: HeldAxial(xs, ms, V=vs, mesh_pair=at_zero.elements, **held)
        )
        try:
            found = family.at(N_held, xs, ms, vs)
        except ValueError:  # as in solve()
            found = None
        else:
            if found is None:  # this diagram's jumps would mesh it otherwise
                found = solve(N_held, at_zero.elements)
    M_cr = 0.0 if found is None else float(found.M_cr)
    M_cr_0 = math.nan if at_zero is None else float(at_zero.M_cr)
    if not resistance:
        return dataclasses.replace(
            not_applied(f"material-{material.kind}", settings, M_Ed),
            lateral_ends=lateral_ends,
            warping_ends=warping_ends,
            M_cr=M_cr,
            M_cr_0=M_cr_0,
            N_Ed=N_held,
            I_t=I_t,
            I_w=I_w,
            length=float(length),
            restraints=tuple(restraints),
            root_assumed=root_assumed,
        )
    segments = _segments(length, restraints)

    def fixed():  # what depends neither on N nor on the bow: kept with M_cr at N = 0
        if free_end:  # the C1 tables are for spans between forks: no tabulated value for a cantilever
            M_tab, std, segment = math.nan, _CANTILEVER, ()
        else:
            M_tab, std, segment = _tabulated(xs, ms, length, segments, settings, (EI_z, GI_t, EI_w), z_g)
        aisc, cb_f1 = None, math.nan
        if sy.shape in ("rolled_i", "welded_i", "rectangle"):  # a rectangle here is a deep one (§F11.2)
            alpha_0 = M_cr_0 / M_Ed
            tip = None if not free_end else (0.0 if free_end == "left" else float(length))
            stiffness = (EI_z, GI_t, EI_w)

            def own(a, b):  # a segment's own exact M_cr (several segments only)
                return segment_mcr(
                    xs,
                    ms,
                    a,
                    b,
                    length=float(length),
                    loads=mcr_loads,
                    stiffness=stiffness,
                    lateral_ends=lateral_ends,
                    warping_ends=warping_ends,
                    restraints=restraints,
                )

            aisc, cb_f1 = aisc_segments(
                xs, ms, sy, sz, material, segments, I_t, I_w, alpha_0, stiffness, tip, own
            )
        return M_tab, std, segment, aisc, cb_f1

    M_tab, std, segment, aisc, cb_f1 = fixed() if cache is None else cache(("ltb-fixed", *ident), fixed)
    plastic = section_class is not None and section_class <= 2
    W_y = sy.W_pl if plastic else sy.W_el
    if section_class == 4 and modulus is not None:
        W_y = modulus
    fy = material.fy
    lam = math.sqrt(W_y * fy / M_cr) if M_cr > 0.0 else math.inf
    rolled = settings.chi_method == "rolled" and sy.shape in ("rolled_i", "welded_i")
    h_over_b = sy.h_over_b if sy.h_over_b is not None else 1.0
    curve = ltb.lt_curve(shape=sy.shape, h_over_b=h_over_b, method="rolled" if rolled else "general")
    if custom and sy.ltb_curve is not None:
        curve = sy.ltb_curve
    f = 1.0
    if math.isinf(lam):
        chi = 0.0
    elif rolled:
        kc = ltb.k_c(std.diagram, std.psi) if std.deviation <= _KC_DEVIATION else 1.0
        f = min(1.0, 1.0 - 0.5 * (1.0 - kc) * (1.0 - 2.0 * (lam - 0.8) ** 2))
        chi = ltb.chi_lt_rolled(lam, curve, kc=kc)
    else:
        chi = ltb.chi_lt_general(lam, curve)
    M_b_Rd = chi * W_y * fy / gamma_M1
    mode = () if found is None else (found.x, found.v, found.phi)
    return LtbCheck(
        applies=True,
        reason=None,
        M_Ed=M_Ed,
        M_cr=M_cr,
        M_cr_tabulated=M_tab,
        C1=std.C1,
        diagram=_DIAGRAM_CODES.get(std.diagram, std.diagram),
        diagram_deviation=std.deviation,
        difference=M_tab / M_cr - 1.0 if M_cr > 0.0 else math.inf,
        lambda_LT=lam,
        chi_LT=chi,
        curve=curve,
        method="6.3.2.3" if rolled else "6.3.2.2",
        f=f,
        M_b_Rd=M_b_Rd,
        utilisation=M_Ed / M_b_Rd if M_b_Rd > 0.0 else math.inf,
        load_position=settings.load_position,
        lateral_ends=lateral_ends,
        warping_ends=warping_ends,
        mode_x=tuple(float(v) for v in mode[0]) if mode else (),
        mode_v=_unit(mode[1]) if mode else (),
        mode_phi=_unit(mode[2]) if mode else (),
        aisc=aisc,
        sources=SOURCES + aisc_source(aisc),
        M_cr_0=M_cr_0,
        N_Ed=N_held,
        I_t=I_t,
        I_w=I_w,
        W_y=W_y,
        C_b_F1_1=cb_f1,
        length=float(length),
        restraints=tuple(restraints),
        segments=segments if len(segments) > 1 else (),
        segment=segment if len(segments) > 1 else (),
        root_assumed=root_assumed,
    )
