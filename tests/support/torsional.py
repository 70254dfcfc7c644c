"""The torsional buckling resistance a solved result's routes counted (engine.torsional_buckling)."""

from __future__ import annotations

import math


def torsional_resistance(result, route: str = "second-order") -> float:
    """N_b,T,Rd [N] of ``route`` in ``result`` (EN 1993-1-1 §6.3.1.4), or inf where it counted none."""
    found = next(r for r in result.routes if r.route == route)
    return float(found.facts.get("N_b_T_Rd", math.inf))
