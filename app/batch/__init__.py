"""``strutscope batch``: solve a table of members, one per row, into one table of results.

The input is a CSV file (comma-separated, UTF-8, a header row first) with the columns of :data:`COLUMNS`,
in the units their names state. Each row becomes an :class:`engine.Case`, is solved by :func:`engine.solve`
and, when it has a section and a material, sized by :func:`engine.capacity`. The output is
``DIR/results.csv`` with the columns of :func:`result_columns`, one row per member in the input order, and
with ``--pdf`` a calc sheet ``DIR/<id>.pdf`` per solved member.

A row that cannot be solved does not stop the run: it is reported in the results with its row number (the
line of the input file, the header being line 1), the column at fault and a message naming the value and
what is allowed. Only a table that cannot be read at all (no such file, unknown or missing columns) stops
the run, with :class:`TableError`.

The rows are read, solved and written as a stream, so memory stays flat however long the table is. With
more than :data:`PARALLEL_MIN_ROWS` rows and more than one worker, chunks of rows go to a
:class:`concurrent.futures.ProcessPoolExecutor`; a bounded window of chunks is in flight at any time and
results are written in the input order. The results file is written to a temporary file in ``DIR`` and
renamed over ``results.csv`` only when complete, so it is never left half-written. With
``executor="dask://HOST:PORT"`` the chunks go to an existing Dask cluster instead (:mod:`app.batch.cluster`).
After the run, :class:`BatchSummary` holds the counts, the highest utilisations and the first invalid rows
(:mod:`app.batch.summary`, which also gives its JSON form).

This module does no mechanics: every number in the results comes from the engine. It converts units only.
"""

from app.batch.cluster import ExecutorError
from app.batch.columns import (
    COLUMNS,
    PARALLEL_MIN_ROWS,
    RESULTS_FILE,
    BatchSummary,
    Column,
    RowError,
    TableError,
    result_columns,
)
from app.batch.rows import member_case
from app.batch.solving import default_workers, run

__all__ = [
    "COLUMNS",
    "Column",
    "PARALLEL_MIN_ROWS",
    "RESULTS_FILE",
    "BatchSummary",
    "ExecutorError",
    "RowError",
    "TableError",
    "member_case",
    "result_columns",
    "default_workers",
    "run",
]
