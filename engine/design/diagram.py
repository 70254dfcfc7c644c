r"""What the equivalent uniform moment factors read from a first-order moment diagram, and the factors.

The ``en-member`` route takes :math:`C_{my}, C_{mz}` from the engine's own first-order solution of each plane
(the loads as given, P = 0, no bow), by the rules of the Annex chosen:

**Annex B, Table B.3** (:func:`engine.design.annex_b.equivalent_moment_factor`). The diagram is described as
the table does: :math:`M_h` the end moment of larger magnitude, :math:`\psi` the other end's ratio to it, and
:math:`M_s` the moment at the one interior extremum of the diagram (where V = 0 or at a point load's kink).
strutscope's decisions, each on the safe side:

- no transverse load inside the span (end couples, loads at the ends): the linear diagram, whatever the
  supports;
- every transverse load a uniform load over the whole member: the table's "uniform" row; one point load
  inside the span: "concentrated";
- any other mix (partial or linear loads, one point load and uniform together; form ``"mixed"``): where the
  span moment is the larger (:math:`|M_s| \ge |M_h|`), :math:`C_m = 1`, the table's largest value. Such a
  diagram is none of the table's shapes, and it can be nearly a uniform moment: two short partial loads near
  the ends of a pinned member give 18 kN·m flat over 4.8 m of 6 m, whose Annex A general term is within
  0.3 % of a uniform moment's (C_m = 1), where the uniform row read 0.95 (found by an independent audit: the
  bending term 5 % low); on a trapezoidal load over the whole member this is up to 5 % conservative. Where
  the end moment is the larger, the table's uniform row (``α_s = M_s/M_h``), which is never smaller than the
  concentrated one (Table B.3's formulas differ by 0.1(1 + ψ) ≥ 0, 0.1 or 0.05(1 − α_h) ≥ 0), and never
  below the equivalent uniform moment of the diagram's first sine term (:func:`sine_share`: end couples
  with a short self-balancing dip near one end read 0.4 by the row where that term is 0.966), nor below the
  uniform row read with the moment at mid-span as M_s (the table's figures draw M_s there): one end couple
  with a small relieving load near the other end has its extremum in a small dip (α_s ≈ 0⁻, the row's 0.4)
  where the couple alone reads 0.6 by the linear row, eq. (6.62) 9 % low (an independent audit); at mid-span
  α_s ≈ 0.5 reads 0.6, and the two readings agree where the extremum is at mid-span [derived]; and never
  below Annex A Table A.2's general C_mi,0 = 1 + (N_cr δ/M − 1) N/N_cr, written for any diagram (end couples
  with a point and a uniform load read 0.400 where the exact amplification needs about 0.6, eq. (6.61)
  9–13 % low: an audit at stop 39). Near N = 0 that formula tends to 1: up to some 40 % conservative on a
  fixed-ended member with mixed loads (0.718 by the row), a decision for the safe side where the table has no
  row;
- two or more point loads inside the span (form ``"points"``; with other loads as well, ``"other"``): not the
  table's one concentrated load, and no row fits. Their diagram can be anything from one peak to a nearly
  uniform moment between loads near the ends (ψ = 1's C_m = 1): third-point loads are amplified more than a
  uniform load (Annex A's general term π²EIδ/(ML²) − 1 is +0.051 against +0.028 for a uniform load, and
  −0.178 for one central load), so the concentrated row's 0.9 was unsafe (found by an independent check:
  eq. (6.61) 3 % low on two loads at the third points). :math:`C_m = 1`, the table's largest value;
- a couple inside the span, or a diagram with no interior extremum or more than one, is not one of the
  table's shapes: :math:`C_m = 1`, the table's largest value;
- a member with an end that can translate (free, guided, or a translational spring) may have a sway buckling
  mode: Table B.3's note gives :math:`C_m = 0.9`; strutscope takes the larger of 0.9 and the table's value
  for the diagram (0.9 alone where the diagram is not one of the table's shapes), because a stiff spring makes
  the mode non-sway and the table's value may then be higher.

**Annex A, Table A.2.** A linear diagram on a member whose ends cannot translate:
:math:`C_{mi,0} = 0.79 + 0.21\psi + 0.36(\psi - 0.33)N_{Ed}/N_{cr,i}`. Otherwise the table's general formula
:math:`C_{mi,0} = 1 + (\pi^2 E I_i|\delta_x|/(L^2|M_{i,Ed}(x)|) - 1)N_{Ed}/N_{cr,i}`, with
:math:`\delta_x` the largest first-order deflection and :math:`M_{i,Ed}(x)` the largest first-order moment.
strutscope writes :math:`\pi^2 EI_i/L^2` as the plane's exact critical load :math:`N_{cr,i}` (the same for a
pin-ended member; :math:`L = L_{cr}`): it is the first term of the exact amplification
:math:`M_{II} = M_I + N\delta/(1 - N/N_{cr})`, which the formula expresses. With the member length instead,
a fixed-ended member under a uniform load would get :math:`C = 1 - 0.69\,N/N_{cr}` where the exact
second-order end moment needs :math:`C \approx 0.80` at :math:`N/N_{cr} = 0.5` (unsafe); with
:math:`N_{cr}` it gets :math:`1 + 0.23\,N/N_{cr}` (safe). A couple inside the span: the larger of 1 and the
general formula. Several point loads: the general formula (it reads any diagram of a member whose ends
cannot translate). A uniform load on a member whose ends cannot translate: the larger of the general formula
and the table's row for it, :math:`1 + 0.03\,N_{Ed}/N_{cr,i}` (the row rounds the pin-ended member's
:math:`5\pi^2/48 - 1 = 0.028` up; the concentrated load's row, :math:`1 - 0.18\,N_{Ed}/N_{cr,i}`, rounds
:math:`\pi^2/12 - 1 = -0.178` down, so the general formula is the larger there).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from engine.design import annex_a, annex_b

__all__ = ["Diagram", "annex_a_factor", "annex_b_factor", "describe", "zero"]

_REL = 1e-9


@dataclass(frozen=True)
class Diagram:
    """A first-order moment diagram as the tables read it (SI: N·m, m, N).

    Attributes
    ----------
    form : str
        ``"linear"`` (no transverse load inside the span), ``"uniform"``, ``"concentrated"`` (one point
        load), ``"mixed"`` (other transverse loads; C_m = 1 by Annex B where the span moment governs,
        else the uniform row), ``"points"`` (two or more
        point loads alone) or ``"other"`` (not one of Table B.3's shapes).
    M_h, psi, M_s : float
        Table B.3's end moment of larger magnitude, the end ratio ψ and the interior extremum (0 when linear).
    M_max : float
        max|M| [N·m].
    delta : float
        max|w| [m].
    V_max : float
        max|V| [N].
    sway : bool
        An end can translate.
    sine_share : float
        The equivalent uniform moment of the diagram's first sine term over max|M| (:func:`sine_share`;
        read for a ``"mixed"`` diagram only, 1.0 otherwise).
    M_mid : float
        The moment at mid-span [N·m] (read for a ``"mixed"`` diagram only, 0 otherwise).
    """

    form: str
    M_h: float
    psi: float
    M_s: float
    M_max: float
    delta: float
    V_max: float
    sway: bool
    sine_share: float = 1.0
    M_mid: float = 0.0


def sine_share(x, moment, length: float, M_max: float) -> float:
    r"""The equivalent uniform moment of the first sine term of a diagram over max|M|:
    :math:`\frac{\pi}{2\ell}\left|\int_0^\ell M \sin(\pi s/\ell)\,ds\right| / \max|M|` (1 for a uniform
    moment, 8/π² for a parabola).

    The first buckling mode of a member braced at its ends is the half sine, and only the diagram's first
    sine term is amplified by 1/(1 − N/N_cr) to first order [derived], so a uniform moment of this size is
    amplified as the diagram is. Table B.3 stays above it for the diagrams it tabulates (8/π² = 0.81 against
    0.95 for a uniform load; 0.22 against 0.5 for a fixed-ended one), and it is the floor of a ``"mixed"``
    diagram's C_m: an independent audit built end couples with a short self-balancing dip (M_s ≈ 0 near one
    end, |M_h| > |M_s|) that the uniform row read as C_m = 0.4 where this term is 0.966 (eq. (6.61) 23 % low).
    Trapezoidal rule at the stations [m] (the diagram's own, its peaks among them).
    """
    xs = np.asarray(x, dtype=float)
    if M_max <= 0.0 or length <= 0.0 or xs.size < 2:
        return 1.0
    weighted = np.asarray(moment, dtype=float) * np.sin(np.pi * xs / length)
    integral = float(np.sum(0.5 * (weighted[1:] + weighted[:-1]) * np.diff(xs)))
    return min(1.0, abs(integral) * math.pi / (2.0 * length) / M_max)


def zero(sway: bool = False) -> Diagram:
    """The diagram of a plane without loads."""
    return Diagram("linear", 0.0, 1.0, 0.0, 0.0, 0.0, 0.0, sway)


def _interior(x0: float, x1: float, x: float) -> bool:
    tol = 1e-9 * max(1.0, abs(x1 - x0))
    return x0 + tol < x < x1 - tol


def _extrema(M: np.ndarray, tol: float) -> list:
    """The values of the interior local extrema of a continuous diagram sampled in order (plateaus once)."""
    keep = np.concatenate([[True], np.abs(np.diff(M)) > tol])
    m = M[keep]
    if m.size < 3:
        return []
    d = np.sign(np.diff(m))
    turn = np.nonzero(d[:-1] * d[1:] < 0)[0] + 1
    values: list = []
    for v in m[turn].tolist():
        if not any(abs(v - u) <= tol for u in values):
            values.append(v)
    return values


def describe(*, x, moment, deflection, shear, loads, length: float, sway: bool) -> Diagram:
    """Read a first-order diagram (arrays at the stations, in order along the member) and the case's loads."""
    M = np.asarray(moment, dtype=float)
    M_max = float(np.abs(M).max()) if M.size else 0.0
    delta = float(np.abs(np.asarray(deflection, dtype=float)).max())
    V_max = float(np.abs(np.asarray(shear, dtype=float)).max())
    ends = (float(M[0]), float(M[-1]))
    M_h, other = (ends[0], ends[1]) if abs(ends[0]) >= abs(ends[1]) else (ends[1], ends[0])
    psi = 1.0 if M_h == 0.0 else max(-1.0, min(1.0, other / M_h))
    kinds = set()
    inner_couple = False
    points = 0
    for load in loads:
        if load.type == "couple":
            inner_couple = inner_couple or _interior(0.0, length, load.x)
        elif load.type == "point":
            if _interior(0.0, length, load.x) and load.P != 0.0:
                kinds.add("concentrated")
                points += 1
        elif load.type == "uniform":
            if load.q != 0.0:
                whole = (load.start in (None, 0.0)) and (load.end is None or load.end >= length * (1 - _REL))
                kinds.add("uniform" if whole else "mixed")
        elif load.q_start != 0.0 or load.q_end != 0.0:
            kinds.add("mixed")
    if inner_couple or (points > 1 and len(kinds) > 1):
        return Diagram("other", M_h, psi, 0.0, M_max, delta, V_max, sway)
    if points > 1:  # several point loads: not the table's one concentrated load (module notes)
        return Diagram("points", M_h, psi, 0.0, M_max, delta, V_max, sway)
    if not kinds or M_max == 0.0:
        return Diagram("linear", M_h, psi, 0.0, M_max, delta, V_max, sway)
    form = kinds.pop() if len(kinds) == 1 else "mixed"
    found = _extrema(M, _REL * M_max)
    if len(found) != 1:
        return Diagram("other", M_h, psi, 0.0, M_max, delta, V_max, sway)
    share = sine_share(x, M, length, M_max) if form == "mixed" else 1.0
    mid = float(np.interp(0.5 * length, np.asarray(x, dtype=float), M)) if form == "mixed" else 0.0
    return Diagram(form, M_h, psi, found[0], M_max, delta, V_max, sway, share, mid)


def annex_b_factor(d: Diagram, N_Ed: float = 0.0, N_cr: float = math.inf) -> float:
    """C_m of EN 1993-1-1 Annex B, Table B.3, with strutscope's reading of the diagram (module notes); a
    "mixed" diagram never below Annex A Table A.2's general C_mi,0 at ``N_Ed`` and ``N_cr`` either."""
    if d.M_max == 0.0:
        table = 1.0
    elif d.form in ("other", "points") or (d.form == "mixed" and abs(d.M_s) >= abs(d.M_h)):
        table = None
    elif d.form == "linear":
        table = annex_b.equivalent_moment_factor(d.M_h, d.psi)
    else:
        load = "concentrated" if d.form == "concentrated" else "uniform"
        table = annex_b.equivalent_moment_factor(d.M_h, d.psi, d.M_s, load)
        if d.form == "mixed":  # none of the table's shapes: never below its first sine term, nor below the
            # uniform row read with the mid-span moment as M_s, nor Annex A's general formula, which is
            # written for any diagram (module notes)
            mid = annex_b.equivalent_moment_factor(d.M_h, d.psi, d.M_mid, load)
            table = max(table, d.sine_share, mid, annex_a_factor(d, N_Ed, N_cr))
    if d.sway and d.M_max != 0.0:
        return max(annex_b.SWAY_CM, table if table is not None else 0.0)
    return 1.0 if table is None else table


def annex_a_factor(d: Diagram, N_Ed: float, N_cr: float) -> float:
    """C_mi,0 of EN 1993-1-1 Annex A, Table A.2, with N_cr in place of π²EI/L² (module notes)."""
    ratio = 0.0 if math.isinf(N_cr) else max(N_Ed, 0.0) / N_cr
    if d.M_max == 0.0:
        return 1.0
    if d.form == "linear" and not d.sway:
        return annex_a.moment_factor_linear(d.psi, ratio)
    lever = 0.0 if math.isinf(N_cr) else N_cr * d.delta / d.M_max
    general = annex_a.moment_factor_general(N_cr_delta_over_M=lever, n_cr_ratio=ratio)
    if d.form == "uniform" and not d.sway:
        # The table's own row for a uniform load, 1 + 0.03 N/N_cr, rounds the general formula's 5π²/48 − 1 =
        # 0.028 up; a published worked example uses the row (tests/REFERENCES.md §12). The larger is taken.
        return max(general, 1.0 + 0.03 * ratio)
    return max(1.0, general) if d.form == "other" else general
