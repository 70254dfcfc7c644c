"""Large tables in bounded memory: the ids checked for uniqueness spill to a temporary database on disk."""

from __future__ import annotations

from app.batch.columns import RowError
from app.batch.solving import _checked_ids


def test_a_repeated_id_is_found_whether_its_first_use_is_in_memory_or_on_disk():
    records = [(row, {"id": f"M{(row - 2) % 7}"}) for row in range(2, 40)]  # 7 ids, each used again
    out = list(_checked_ids(iter(records), memory_rows=3))  # the first 3 in memory, the other 4 on disk
    assert [row for row, _ in out] == list(range(2, 40))
    good = [cells["id"] for _, cells in out if isinstance(cells, dict)]
    assert good == [f"M{n}" for n in range(7)]
    bad = [(row, error) for row, error in out if isinstance(error, RowError)]
    assert len(bad) == 38 - 7
    for row, error in bad:
        first = (row - 2) % 7 + 2
        assert error.column == "id" and f"is already used on row {first};" in str(error)


def test_rows_without_an_id_are_never_duplicates():
    records = [(row, {"id": ""}) for row in range(2, 10)]
    assert list(_checked_ids(iter(records), memory_rows=1)) == records
