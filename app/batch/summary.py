"""A batch run's summary: counts by status, the highest utilisations, the invalid rows; its JSON form.

What is kept while the rows stream past is bounded whatever the table's length: a few counters, a heap of
:data:`HIGHEST` rows and the first ``error_limit`` invalid rows (every row is in the results file).
"""

from __future__ import annotations

import heapq
import json
import math

from app.batch.columns import _RESULT_LAYOUT, BatchSummary

#: How many of the highest utilisations the summary lists.
HIGHEST = 10

_NAMES = [name for name, _ in _RESULT_LAYOUT]
_UTILISATION = _NAMES.index("utilization")
_STABILITY = _NAMES.index("stability")
_RULE = _NAMES.index("combination_rule")

#: The version of the ``--summary-json`` document (raised when a field changes meaning or goes away).
SUMMARY_SCHEMA = 1


def count_solved(summary: BatchSummary, record: list[str], heap: list) -> None:
    """Count one solved row's stability, and keep it among the highest utilisations when it is one."""
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
    if len(heap) < HIGHEST:
        heapq.heappush(heap, item)
    elif item > heap[0]:
        heapq.heapreplace(heap, item)


def finish(summary: BatchSummary, heap: list) -> None:
    """Put the highest utilisations into the summary, highest first."""
    summary.highest = [
        (value, -negative_row, identifier) for value, negative_row, identifier in sorted(heap)
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
            {"row": row, "id": identifier, "utilization": _number(value)}
            for value, row, identifier in summary.highest
        ],
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
