"""With load cases, the batch's value columns are the largest over the ultimate combinations.

The headline combination (``strength_combination``) is the one with the largest strength utilisation, but
another ultimate combination can give a larger |M|, a larger utilisation of one route, of the out-of-plane
check or of lateral-torsional buckling (an independent audit found M_max 35 % low in the batch where the
command line named the larger one). Each such column takes the largest over the ultimate combinations
(:mod:`engine.envelope`: the peaks of the ultimate envelope, the governing combination of each check and
route, the lowest α_cr), and the column ``from_combinations`` names the combination of every column that
is not the headline's. ``amplification_moment``, ``section_class`` and ``headline_route`` stay the headline's;
``deflection_utilization`` is the governing service combination's, as before.
"""

from __future__ import annotations

from dataclasses import dataclass, field

__all__ = ["Spread", "spread"]


@dataclass(frozen=True)
class Spread:
    """The largest values over the ultimate combinations: ``(value, x, combination)`` of the signed extreme
    of M, V and w in each plane (``second_*`` None for one plane), ``(utilisation, combination)`` of the
    out-of-plane check, ``{route: (utilisation, governing term, combination)}``, the ``(ltb, combination)``
    with the largest lateral-torsional utilisation (None where none applies) and the lowest ``(α_cr,
    combination)`` (None where no combination is compressed)."""

    headline: str
    moment: tuple
    shear: tuple
    deflection: tuple
    second_moment: tuple | None = None
    second_shear: tuple | None = None
    second_deflection: tuple | None = None
    out_of_plane: tuple | None = None
    routes: dict = field(default_factory=dict)
    ltb: tuple | None = None
    alpha_cr: tuple | None = None

    def sources(self) -> str:
        """``column=combination`` for every column taken from a combination other than the headline's."""
        named = [
            ("M_max", self.moment),
            ("V_max", self.shear),
            ("w_max", self.deflection),
            ("second_plane_M_max", self.second_moment),
            ("second_plane_V_max", self.second_shear),
            ("second_plane_w_max", self.second_deflection),
            ("out_of_plane_utilization", self.out_of_plane),
            *((f"utilization_{code.replace('-', '_')}", value) for code, value in self.routes.items()),
            ("ltb", self.ltb),
            ("alpha_cr", self.alpha_cr),
        ]
        return ";".join(f"{c}={v[-1]}" for c, v in named if v is not None and v[-1] != self.headline)


def _extreme(envelope, name: str) -> tuple:
    """(value, x, combination) of the larger-magnitude extreme of one field (the maximum on a tie)."""
    high, low = envelope.peaks[f"{name}_max"], envelope.peaks[f"{name}_min"]
    return high if abs(high[0]) >= abs(low[0]) else low


def spread(result) -> Spread | None:
    """The :class:`Spread` of a result with load cases; None without them (or without an ultimate
    combination)."""
    actions = getattr(result, "actions", None)
    if actions is None or actions.ultimate is None or actions.headline is None:
        return None
    ultimate = [item for item in actions.combinations if item.combination.state == "ultimate"]
    found = {}
    if actions.second_ultimate is not None:
        second = actions.second_ultimate
        found.update(
            second_moment=_extreme(second, "moment"),
            second_shear=_extreme(second, "shear"),
            second_deflection=_extreme(second, "deflection"),
        )
    row = actions.governing_for("out-of-plane")
    if row is not None:
        found["out_of_plane"] = (row.value, row.combination)
    routes = {}
    for item in ultimate:
        for entry in item.result.routes or ():
            if entry.utilization is None:
                continue
            best = routes.get(entry.route)
            if best is None or entry.utilization > best[0]:
                routes[entry.route] = (entry.utilization, entry.governing or "", item.name)
    ltb = None
    for item in ultimate:
        own = getattr(item.result, "ltb", None)
        usable = own is not None and own.applies and own.utilisation is not None
        if usable and (ltb is None or own.utilisation > ltb[0].utilisation):
            ltb = (own, item.name)
    alpha = None  # the lowest α_cr (EN 1993-1-1 §5.2.1(3) compares it with 10): the most compression
    for item in ultimate:
        value = getattr(item.result, "alpha_cr", None)
        if value is not None and (alpha is None or value < alpha[0]):
            alpha = (value, item.name)
    envelope = actions.ultimate
    return Spread(
        headline=actions.headline,
        moment=_extreme(envelope, "moment"),
        shear=_extreme(envelope, "shear"),
        deflection=_extreme(envelope, "deflection"),
        routes=routes,
        ltb=ltb,
        alpha_cr=alpha,
        **found,
    )
