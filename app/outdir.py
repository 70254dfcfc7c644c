"""The ``--out`` folder of ``strutscope batch``: one run at a time, and no stale calc sheets.

- :func:`locked` holds an exclusive lock on ``DIR/.strutscope.lock`` for the whole run (``fcntl.flock``
  where there is one, which the system releases when the process ends, however it ends; elsewhere a file
  created with ``O_EXCL`` and removed at the end). A second run into the same folder is refused at once with
  :class:`FolderError` (``strutscope batch`` exits with 2). The lock file stays in the folder: removing it
  would let two runs lock two different files of one name.
- :func:`Manifest` lists the calc sheets a run wrote, in ``DIR/.strutscope-manifest.json``. When a run
  completes, the sheets the previous run listed and this one did not write are removed, so the folder holds
  exactly the sheets of its ``results.csv``. Only files named in the manifest are ever removed: sheets
  written before manifests existed, and any file of the user's, are left alone.
- :func:`staging` and :func:`publish`: a run's calc sheets are written into a staging folder and moved
  beside ``results.csv`` once it is replaced, so an interrupted run leaves none of its own sheets beside the
  previous run's table.
- :func:`check_not_input` refuses an ``--out`` whose ``results.csv`` would be the input table itself.
"""

from __future__ import annotations

import contextlib
import json
import os
import shutil
from collections.abc import Iterator

__all__ = [
    "LOCK_FILE",
    "MANIFEST_FILE",
    "FolderError",
    "Manifest",
    "check_not_input",
    "locked",
    "publish",
    "remove_temporaries",
    "staging",
    "TEMPORARY_PREFIX",
]

LOCK_FILE = ".strutscope.lock"
MANIFEST_FILE = ".strutscope-manifest.json"

#: Temporary files of a run (results and calc sheets) start with this and end with ``.part``.
TEMPORARY_PREFIX = ".strutscope-"


class FolderError(Exception):
    """The output folder cannot be used (another run holds it, or results.csv would overwrite the input)."""


@contextlib.contextmanager
def locked(folder: str) -> Iterator[None]:
    """Hold the folder's run lock; raise :class:`FolderError` when another run holds it."""
    path = os.path.join(folder, LOCK_FILE)
    busy = (
        f"another strutscope batch is writing into this folder (it holds {LOCK_FILE}); wait for it to "
        "finish or choose another --out folder"
    )
    try:
        import fcntl
    except ImportError:  # not POSIX: a file that exists while a run goes on
        try:
            handle = os.open(path, os.O_CREAT | os.O_EXCL | os.O_WRONLY, 0o644)
        except FileExistsError:
            raise FolderError(busy + f" (if no run is going on, remove {path})") from None
        try:
            yield
        finally:
            os.close(handle)
            with contextlib.suppress(OSError):
                os.unlink(path)
        return
    handle = os.open(path, os.O_CREAT | os.O_RDWR, 0o644)
    try:
        try:
            fcntl.flock(handle, fcntl.LOCK_EX | fcntl.LOCK_NB)
        except BlockingIOError:
            raise FolderError(busy) from None
        os.ftruncate(handle, 0)
        os.write(handle, f"{os.getpid()}\n".encode())
        yield
    finally:
        os.close(handle)  # closing releases the lock


def check_not_input(table: str, folder: str, results_name: str) -> None:
    """Refuse a folder whose results file is the input table (it would be overwritten while read)."""
    target = os.path.join(folder, results_name)
    same = False
    try:
        same = os.path.samefile(table, target)
    except OSError:  # the results file does not exist yet: compare the paths
        same = os.path.realpath(table) == os.path.realpath(target)
    if same:
        raise FolderError(
            f"--out would write {results_name} over the input table {table}; choose another "
            "folder for the results"
        )


def remove_temporaries(folder: str) -> None:
    """Remove the temporary files a run left (after an interruption; the lock makes them this run's)."""
    with contextlib.suppress(OSError):
        for name in os.listdir(folder):
            if name.startswith(TEMPORARY_PREFIX) and name.endswith(".part"):
                with contextlib.suppress(OSError):
                    os.unlink(os.path.join(folder, name))


class Manifest:
    """The calc sheets of the previous completed run in a folder, and those of this run."""

    def __init__(self, folder: str) -> None:
        self.folder = folder
        self.previous = self._read()
        self.written: set[str] = set()

    def _read(self) -> set[str]:
        try:
            with open(os.path.join(self.folder, MANIFEST_FILE), encoding="utf-8") as stream:
                names = json.load(stream).get("calc_sheets", [])
        except (OSError, ValueError, AttributeError):
            return set()
        # Only plain file names of calc sheets: never a path out of the folder.
        return {
            name
            for name in names
            if isinstance(name, str)
            and name.endswith(".pdf")
            and os.path.basename(name) == name
            and not name.startswith(".")
        }

    def add(self, name: str) -> None:
        self.written.add(name)

    def complete(self) -> list[str]:
        """Remove the previous run's sheets this run did not write, record this run's; return the removed."""
        removed = []
        for name in sorted(self.previous - self.written):
            path = os.path.join(self.folder, name)
            with contextlib.suppress(OSError):
                if os.path.isfile(path) and not os.path.islink(path):
                    os.unlink(path)
                    removed.append(name)
        if not self.written and not self.previous:
            return removed  # no calc sheets now or before: no manifest needed
        data = json.dumps({"written_by": "strutscope batch", "calc_sheets": sorted(self.written)}, indent=1)
        temporary = os.path.join(self.folder, f"{TEMPORARY_PREFIX}manifest.part")
        with open(temporary, "w", encoding="utf-8") as stream:
            stream.write(data + "\n")
        os.replace(temporary, os.path.join(self.folder, MANIFEST_FILE))
        return removed


def staging(out_dir: str) -> str:
    """A fresh folder for this run's calc sheets inside ``out_dir`` (a previous run's leftover removed)."""
    folder = os.path.join(os.path.abspath(out_dir), f"{TEMPORARY_PREFIX}sheets")
    shutil.rmtree(folder, ignore_errors=True)
    os.makedirs(folder)
    return folder


def publish(staging: str, out_dir: str) -> None:
    """Move the staged calc sheets beside results.csv (each replaced atomically) and remove the folder."""
    for name in sorted(os.listdir(staging)):
        if name.endswith(".pdf"):
            os.replace(os.path.join(staging, name), os.path.join(out_dir, name))
    shutil.rmtree(staging, ignore_errors=True)
