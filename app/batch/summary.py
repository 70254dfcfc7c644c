"""A batch run's summary: counts by status, the highest utilisations, the invalid rows; its JSON form.

The highest utilisations are ranked among the code checks alone; a utilisation that is not one (an elastic
bound of a timber, aluminium or custom-material member: ``utilization_basis``, :mod:`app.batch.headline`) is
listed apart, so that it is never read as a checked utilisation beside them.

What is kept while the rows stream past is bounded whatever the table's length: a few counters, a heap of
:data:`HIGHEST` rows and the first ``error_limit`` invalid rows (every row is in the results file).
"""

from __future__ import annotations

import heapq
import json
import math

from app.batch.columns import _RESULT_LAYOUT, BatchSummary
from app.batch.headline import CODE_CHECK

#: How many of the highest utilisations the summary lists.
HIGHEST = 10

_NAMES = [name for name, _ in _RESULT_LAYOUT]
_UTILISATION = _NAMES.index("utilization")
_BASIS = _NAMES.index("utilization_basis")
_STABILITY = _NAMES.index("stability")
_RULE = _NAMES.index("combination_rule")

#: The version of the ``--summary-json`` document (raised when a field changes meaning or goes away). 2 (stop
#: 33): ``highest_utilizations`` holds code checks only; the others are in ``not_code_checks``. Fields added
#: since without a change of meaning: ``failing_by_caution`` and its count (stop 37).
SUMMARY_SCHEMA = 2


def count_solved(summary: BatchSummary, record: list[str], heap: list, not_checked: list) -> None:
    """Count one solved row's stability, and keep it among the highest utilisations when it is one: in `heap`
    when it is a code check, else in `not_checked` (each a heap of at most :data:`HIGHEST`)."""
    stability = record[_STABILITY]
    summary.by_stability[stability] = summary.by_stability.get(stability, 0) + 1
    if record[_RULE]:
        summary.with_combinations += 1
    cell = record[_UTILISATION]
    if cell == "":
        return
    value = float(cell)  # "inf" at or above the critical load
    # Ties go to the earlier row: the heap's least is the lowest utilisation, then the latest row.
    item = (value, -int(record[1]), record[0])
    basis = record[_BASIS]
    if basis != CODE_CHECK:
        summary.not_code_check_count += 1
        heap, item = not_checked, (*item, basis)
    if len(heap) < HIGHEST:
        heapq.heappush(heap, item)
    elif item > heap[0]:
        heapq.heapreplace(heap, item)


def count_danger(summary: BatchSummary, record: list[str], code: str) -> None:
    """Count a solved row that passes its checks (utilisation at most 1) but fails by a danger caution
    (``code``, its first), and name it among the first :data:`HIGHEST` such rows."""
    summary.danger_count += 1
    if len(summary.danger) < HIGHEST:
        summary.danger.append((int(record[1]), record[0], code))


def finish(summary: BatchSummary, heap: list, not_checked: list) -> None:
    """Put the highest utilisations into the summary, highest first: the code checks', and apart the
    others'."""
    summary.highest = [
        (value, -negative_row, identifier) for value, negative_row, identifier in sorted(heap)
    ][::-1]
    summary.not_code_checks = [
        (value, -negative_row, identifier, basis)
        for value, negative_row, identifier, basis in sorted(not_checked)
    ][::-1]


def _number(value: float):
    return value if math.isfinite(value) else ("inf" if value > 0 else "-inf")


def summary_dict(summary: BatchSummary, table: str) -> dict:
    """The run's summary as plain JSON data (``strutscope batch --summary-json``)."""
    return {
        "schema": SUMMARY_SCHEMA,
        "table": table,
        "results": summary.results,
        "members": summary.members,
        "by_status": {"ok": summary.solved, "error": summary.error_count},
        "by_stability": dict(sorted(summary.by_stability.items())),
        "failing": summary.failing,
        "beyond_critical": summary.beyond_critical,
        "workers": summary.workers,
        "pdfs": summary.pdfs,
        "highest_utilizations": [
            {"row": row, "id": identifier, "utilization": _number(value), "basis": CODE_CHECK}
            for value, row, identifier in summary.highest
        ],
        "not_code_checks": [
            {"row": row, "id": identifier, "utilization": _number(value), "basis": basis}
            for value, row, identifier, basis in summary.not_code_checks
        ],
        "not_code_check_count": summary.not_code_check_count,
        "failing_by_caution": [
            {"row": row, "id": identifier, "caution": code} for row, identifier, code in summary.danger
        ],
        "failing_by_caution_count": summary.danger_count,
        "invalid_rows": [
            {"row": row, "id": identifier, "column": column, "message": message}
            for row, identifier, column, message in summary.errors
        ],
        "invalid_rows_listed": len(summary.errors),
        "retried": list(summary.retried),
        "with_combinations": summary.with_combinations,
    }


def summary_json(summary: BatchSummary, table: str) -> str:
    """:func:`summary_dict` as JSON text (infinite utilisations written as the string ``"inf"``)."""
    return json.dumps(summary_dict(summary, table), indent=2, ensure_ascii=False) + "\n"
