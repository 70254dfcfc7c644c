"""Reading and writing case files: :func:`load_case` and :func:`save_case` (atomic replace).

Split from :mod:`engine.case` (the case itself) to keep that module under the size limit.
"""

from __future__ import annotations

import os
from contextlib import suppress

from engine import limits
from engine.case import Case

__all__ = ["load_case", "save_case"]


def load_case(path: str | os.PathLike) -> Case:
    """Read a case file.

    Parameters
    ----------
    path : str or path-like
        A UTF-8 JSON case file.

    Returns
    -------
    Case

    Raises
    ------
    CaseError
        For a file that is not a valid case.
    OSError
        When the file cannot be read.
    """
    with open(path, "rb") as stream:
        # One byte more than the limit is enough to refuse a larger file without reading it all.
        return Case.from_json(stream.read(limits.MAX_CASE_BYTES + 1))


def save_case(case: Case, path: str | os.PathLike) -> None:
    """Write a case file (UTF-8 JSON, two-space indent, final newline).

    Parameters
    ----------
    case : Case
        The case to write.
    path : str or path-like
        Destination; an existing file is replaced atomically: the text goes to a temporary file in the same
        folder, which then replaces the destination, so a reader never sees a half-written file.

    Raises
    ------
    OSError
        When the file cannot be written.
    """
    data = (case.to_json(indent=2) + "\n").encode("utf-8")
    folder = os.path.dirname(os.path.abspath(os.fspath(path)))
    handle, temporary = _temporary_file(folder)
    try:
        with os.fdopen(handle, "wb") as stream:
            stream.write(data)
            stream.flush()
            os.fsync(stream.fileno())
        mask = os.umask(0)
        os.umask(mask)
        os.chmod(temporary, 0o666 & ~mask)
        os.replace(temporary, path)
    except BaseException:
        with suppress(OSError):
            os.unlink(temporary)
        raise


def _temporary_file(folder: str) -> tuple[int, str]:
    """A new file ``.<random>.json.part`` in ``folder``, open for writing and readable by its owner only.

    What :func:`tempfile.mkstemp` does (exclusive creation, a random name, no symbolic link followed), without
    importing :mod:`tempfile`, which brings :mod:`shutil`, :mod:`random` and the compression modules into
    every start of the engine.
    """
    flags = os.O_WRONLY | os.O_CREAT | os.O_EXCL | getattr(os, "O_NOFOLLOW", 0) | getattr(os, "O_BINARY", 0)
    for _ in range(100):
        name = os.path.join(folder, f".{os.urandom(8).hex()}.json.part")
        try:
            return os.open(name, flags, 0o600), name
        except FileExistsError:
            continue
    raise FileExistsError(f"no free temporary name in {folder}")
