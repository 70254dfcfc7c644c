"""The general caution (the engine's ``scope`` caution), worded once for every output: the page, the
summaries, the exports, the JSON summary and ``--help`` (:data:`app.cli_common.CAUTION`). It imports nothing,
so that ``--help`` need not load the engine.

One wording for a plain case and a case with load cases: the loads of a plain case are taken as given, those
of a case with load cases are combined by the rule it names; the factors and the choice of actions stay the
engineer's. (The engine's own message, ``engine.cautions.GENERAL``, says the same in the engine's words; it is
not shown.)
"""

from __future__ import annotations

__all__ = ["GENERAL_CAUTION"]

GENERAL_CAUTION = (
    "Elastic, one member. Not checked: torsion, non-symmetric sections, patch loading, connections; "
    "lateral-torsional buckling and class 4 as the cautions say. Load cases are combined by EN 1990 "
    "(6.10)/(6.10a,b) or ASCE 7 rules; the factors and the choice of actions are yours. Have them checked "
    "against your local codes by a licensed engineer."
)
