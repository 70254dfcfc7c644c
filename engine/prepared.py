"""What a case keeps between solves at different axial forces, and the cache of it per case.

The page drags the axial force, so everything that does not depend on it is built once per case and kept:
the member (EI, section, material, bow from :mod:`engine.member`), the critical loads, the solver's model,
the stations, the first-order solution, the reference data for M_I + N·w0, the design data (section class,
out-of-plane resistance) and the reversed-bow and bow-free variants. :func:`prepare` keeps the last 32
cases, keyed by :meth:`engine.case.Case.without_axial_force` (the one definition of what a force-independent
result depends on) with the title left out (it names the member and enters no number; the prepared member
never reads it); :func:`clear_cache` forgets them.
"""

from __future__ import annotations

import dataclasses

import numpy as np

from engine.case import Imperfection
from engine.classification import classify_at
from engine.errors import CaseError
from engine.imperfections import bow_for
from engine.member import resolve
from engine.out_of_plane import resistance
from engine.reference import ReferenceData
from engine.solver.batch import STATE_FIELDS, Batch
from engine.solver.model import Model, Points
from engine.solver.peaks import base_stations, refine_peaks
from engine.solver.restrained import critical_loads
from engine.sway import sway_anchor

__all__ = ["Prepared", "clear_cache", "prepare"]

#: Out-of-plumb variants kept per prepared member: ± the 1/500 tilt at 1.0 and 1.6 (ASD) and the direct
#: analysis method's, whose tilt 0.002·c follows τ_b (a new one per force above α·N/P_ns = 0.5).
_TILTS_KEPT = 8


def _free_end(case) -> str | None:
    """The end free in translation and rotation of a member whose other end is held ("left", "right"), or
    None: the reference moment's line of action (:class:`engine.reference.ReferenceData`)."""
    free = [
        e for e, s in (("left", case.left), ("right", case.right)) if s.translation == s.rotation == "free"
    ]
    return free[0] if len(free) == 1 else None


@dataclasses.dataclass(frozen=True)
class OutOfPlumb:
    """A sway alone, as :class:`engine.member.BowChoice` gives one: φ [rad], zero at ``sway_anchor`` [m]."""

    sway: float
    sway_anchor: float

    @property
    def sway_slope(self) -> float:
        """dw0/dx [-] (the sway grows away from its anchor)."""
        return self.sway if self.sway_anchor == 0.0 else -self.sway


class Prepared:
    """What a case keeps between solves at different axial forces: its critical loads, model, stations and
    first-order solution. The page drags the axial force, so these are built once per case."""

    def __init__(self, case, member, analysis_case, buckling, design: dict, choice) -> None:
        """Every attribute, for a new case (:meth:`of`) and for its variants (:meth:`variant`).

        ``member`` is the resolved member (None for a plain case), ``analysis_case`` the case the solver runs,
        ``buckling`` its critical loads, ``design`` the cache shared with the variants (section class and
        out-of-plane resistance, independent of the bow) and ``choice`` the bow (a BowChoice or None), whose
        sway enters the model.
        """
        self.case, self.member, self.analysis_case = case, member, analysis_case
        self.buckling = buckling
        self._design = design
        if choice is not None and choice.sway != 0.0:
            bow = bow_for(analysis_case, buckling, choice.sway_slope, choice.sway_anchor)
        else:
            bow = bow_for(analysis_case, buckling)
        self.model = Model(analysis_case, bow)
        self._stations: dict = {}
        self._first: dict = {}
        self._first_states: dict = {}
        self._reference: dict = {}
        self._variants: dict = {}
        #: whether the stations of other prepared members are this one's (engine.raw.reversed_raw), kept
        self.same_stations: dict = {}

    @classmethod
    def of(cls, case) -> Prepared:
        """The prepared member of ``case``: resolved (EI, section, material, bow) unless it is plain."""
        plain = (
            case.section is None
            and case.material is None
            and case.imperfection.preset is None
            and case.stiffness_factor == 1.0
        )
        member, analysis_case = (None, case) if plain else resolve(case)
        choice = member.bow if member is not None else None
        return cls(case, member, analysis_case, critical_loads(analysis_case, 5), {}, choice)

    @property
    def has_bow(self) -> bool:
        """The model has an initial bow or sway."""
        return self.model.bow.shape != "none"

    def variant(self, kind: str) -> Prepared:
        """The member with its bow reversed (``"reversed"``), as its half-sine readings (``"half_sine"``,
        ``"half_sine_opposed"`` against the sway, each also ``..._reversed``:
        :attr:`engine.member.BowChoice.alternatives`), without it (``"bow_free"``), or without it
        but out of plumb by φ (``"plumb<φ>"``, φ signed [rad], e.g. ``"plumb+0.002"``: the aisc route's M_r
        of a member with an end that can translate, AISC 360-16 §C2.2a), cached."""
        hit = self._variants.get(kind)
        if hit is None:
            choice = None
            member = self.member
            imperfection = Imperfection()
            if kind == "reversed" or kind.startswith("half_sine"):
                bow = self.member.bow
                choice = bow if kind == "reversed" else bow.alternatives["opposed" in kind]
                choice = choice.reversed() if kind.endswith("reversed") else choice
                choice = dataclasses.replace(choice, alternatives=())
                member = dataclasses.replace(self.member, bow=choice)
                imperfection = Imperfection(shape=choice.shape, amplitude=choice.amplitude)
            elif kind.startswith("plumb"):
                choice = OutOfPlumb(sway=float(kind[5:]), sway_anchor=sway_anchor(self.case))
            analysis_case = dataclasses.replace(self.analysis_case, imperfection=imperfection)
            hit = Prepared(self.case, member, analysis_case, self.buckling, self._design, choice)
            tilted = [key for key in self._variants if key.startswith("plumb")]
            if kind.startswith("plumb") and len(tilted) >= _TILTS_KEPT:  # the direct analysis method's
                del self._variants[tilted[0]]  # tilt changes with the force where τ_b < 1: bounded
            self._variants[kind] = hit
        return hit

    def reference(self, count):
        """M_I, V_I and the bow at the base stations, for the reference moment M_I + N·w0 (cached)."""
        if count not in self._reference:
            seg, xi, _, _ = self.stations(count, 0.0)
            self._reference[count] = ReferenceData(self.model, seg, xi, _free_end(self.case))
        return self._reference[count]

    def section_class(self, P: float, web_bent=None):
        """The EN 1993-1-1 Table 5.2 class of the section at axial force ``P`` [N] (compression positive; None
        where not classified); a member stepped in section: a tuple, one class per segment. Under compression
        the webs are classified in bending and compression with α from P (:func:`classify_at`; ``web_bent``
        as there). Cached: without compression once, under compression the last force asked (a drag asks each
        force once, and the classes of a whole session must not pile up)."""
        key = ("class", P if P > 0.0 else 0.0, web_bent)
        slot = "class" if P <= 0.0 else "class-compressed"
        hit = self._design.get(slot)
        if hit is not None and hit[0] == key:
            return hit[1]
        member = self.member
        if member is None:
            found = None
        elif member.segments:
            found = tuple(classify_at(s.section, s.material, P, web_bent) for s in member.segments)
        else:
            found = classify_at(member.section, member.material, P, web_bent)
        self._design[slot] = (key, found)
        return found

    def elastic_bound(self, P: float) -> float | None:
        """N/Pcr1 of this compressed plane (the member check's ``in_plane_bound``), else None: without a bow
        the stresses do not see buckling until Pcr1; and for a material other than steel, whose code's
        buckling check is not made here, with a bow too (a bow between the ends does not excite a first mode
        that tilts the member on a spring: an independent audit found an aluminium strut at 0.355 at
        0.995·Pcr1). A steel member with a bow gets the sway term (:mod:`engine.sway_buckling`) instead."""
        if P <= 0.0:
            return None
        if self.has_bow:
            member = self.member
            material = None if member is None else member.material
            if material is None or material.kind == "steel":
                return None
        return P / float(self.buckling.critical_loads[0])

    def out_of_plane(self):
        """The out-of-plane buckling resistance (independent of the axial force), cached."""
        if "out_of_plane" not in self._design:
            member = self.member
            self._design["out_of_plane"] = resistance(
                self.case, member.section, member.material, segments=member.segments
            )
        return self._design["out_of_plane"]

    def design(self, key, make):
        """A design value that depends neither on the axial force nor on the bow (the member-check routes'
        first-order diagrams, the section about the other axis, ...), made by ``make()`` once per case and
        shared with the variants."""
        hit = self._design.get(key)
        if hit is None:
            hit = self._design[key] = make()
        return hit

    def bow_facts(self) -> dict:
        """What the cautions need to know of the bow."""
        if self.member is None:
            imp = self.analysis_case.imperfection
            return {
                "amplitude": imp.amplitude if imp.shape != "none" else 0.0,
                "code_amplitude": None,
                "opposes_load": False,
                "shape": imp.shape,
            }
        bow = self.member.bow
        return {
            "amplitude": bow.amplitude if bow.shape != "none" else 0.0,
            "code_amplitude": bow.code_amplitude,
            "code_label": bow.code_label,
            "code_source": bow.code_source,
            "opposes_load": bow.favourable,
            "shape": bow.shape,
            "notes": bow.notes,
            "sway": bow.sway,
        }

    def stations(self, count, kappa):
        """Base stations (seg, xi, shown) and their Points, cached."""
        key = (count, kappa)
        if key not in self._stations:
            seg, xi, shown = base_stations(self.model, count, kappa)
            every = np.arange(self.model.nseg)
            ends = np.stack(
                [np.searchsorted(seg, every), np.searchsorted(seg, every, side="right") - 1], 1
            ).ravel()
            pts = Points(self.model, seg, xi, ends=ends)
            shown_idx = np.nonzero(shown)[0]
            pts.order_key = (shown_idx, seg[shown_idx] * 2.0 * self.model.L + xi[shown_idx])
            pts.x_exact = self.model.position(seg, xi)  # x, exactly the node at a segment's end
            self._stations[key] = (seg, xi, shown, pts)
        return self._stations[key]

    def first_order(self, count):
        """The P = 0 solution: its batch, exact peak points, largest |M| and |w + w0|, and end moments."""
        if count not in self._first:
            batch = Batch(self.model, [0.0])
            seg, xi, shown, pts = self.stations(count, 0.0)
            st = batch.states(0, pts)
            _, ps, px, pk = refine_peaks(batch, 0, pts, *batch.targets(st, pts), states=st)
            m = max(float(np.abs(st["M"]).max()), float(np.abs(pk["M"]).max(initial=0.0)))
            d = max(
                float(np.abs(st["w"] + st["w0"]).max()), float(np.abs(pk["w"] + pk["w0"]).max(initial=0.0))
            )
            ends = (float(st["M"][0]), float(st["M"][-1]))
            self._first[count] = (batch, ps, px, m, d, ends)
        return self._first[count]

    def first_order_at(self, count, merge) -> dict:
        """The P = 0 state (w, rotation, M, T, V, w0) at the stations of a solution merged by ``merge`` (the
        last item of :func:`engine.raw.raw`): at the base stations once per set of them (kept), at the extra
        points each time. Each point's state is computed from its own segment and position only, so this is
        the state a direct evaluation at the merged stations gives."""
        pts, order, extra_seg, extra_xi = merge
        batch = self.first_order(count)[0]
        hit = self._first_states.get(id(pts))
        if hit is None or hit[0] is not pts:
            hit = self._first_states[id(pts)] = (pts, batch.states(0, pts).stacked())
        both = hit[1]
        if extra_seg.size:
            extra = batch.states(0, Points(self.model, extra_seg, extra_xi)).stacked()
            both = np.concatenate([both, extra], axis=1)
        return dict(zip(STATE_FIELDS, both[:, order], strict=True))


_MODELS: dict = {}
_MODEL_CACHE_SIZE = 32
# The case object prepared last and what it gave. A case is immutable, so the same object asked again (a solve
# and a sweep of one case, a benchmark's loop) skips building and hashing its key, a dataclass's hash and
# equality of all its fields (about 2 µs). One tuple, rebound whole, so that threads never pair one case with
# another's entry.
_LAST: tuple = (None, None)


def _key(case):
    """The cache key of ``case``: the case at zero axial force, and without its title, which names the member
    and enters no number (a table of members solves many members that differ in their names only)."""
    key = case.without_axial_force()
    if getattr(key, "title", "") == "":
        return key
    twin = object.__new__(type(key))
    twin.__dict__.update(key.__dict__)
    twin.__dict__["title"] = ""
    return twin


def prepare(case) -> Prepared:
    """The prepared member of ``case``, built on first use and kept for the same case at any axial force."""
    global _LAST
    last = _LAST
    if last[0] is case:
        return last[1]
    key = _key(case)
    hit = _MODELS.get(key)
    if hit is None:
        if getattr(case, "actions", None) is not None:  # solved per combination: engine.envelope
            raise CaseError("actions: a case with load cases is solved per combination (engine.solve)")
        hit = Prepared.of(case)
        if len(_MODELS) >= _MODEL_CACHE_SIZE:
            _MODELS.pop(next(iter(_MODELS)))
        _MODELS[key] = hit
    _LAST = (case, hit)
    return hit


def clear_cache() -> None:
    """Forget cached models (the critical loads have their own cache)."""
    global _LAST
    _MODELS.clear()
    _LAST = (None, None)
