"""Pieces every ``strutscope`` command shares: the general caution for ``--help``, argument types, output."""

from __future__ import annotations

import argparse
import contextlib
import os
import sys
import tempfile
import textwrap
from collections.abc import Sequence
from importlib import metadata

from app.report.scope import GENERAL_CAUTION
from app.safe_text import terminal

#: The general caution for ``--help``: app.report's one wording (app/report/scope.py imports nothing, so
#: --help does not load the engine). Every summary prints the same (:func:`app.report.general_caution`).
CAUTION = GENERAL_CAUTION

#: What a case with load cases gets, said under the general caution in --help.
COMBINED = (
    'A case with load cases ("actions") is combined, each combination solved whole (EN 1990 or ASCE 7 '
    "rules with recommended factors recalled from memory, a National Annex may change them; or a table of "
    "your own)."
)

#: The invented demo case, package data of :mod:`assets`: the one the page opens (:mod:`app.serve`), the wind
#: post with a permanent (G) and a wind (W) load case, so that ``solve --demo`` prints the page's numbers.
DEMO_CASE = "demo_wind_post_actions.json"
#: The same post without load cases (350 kN and its own loads), solved by its path: ``strutscope solve
#: assets/demo_wind_post.json`` from a checkout.
PLAIN_DEMO_CASE = "demo_wind_post.json"


DEFAULT_STATIONS = 401


class _InputError(Exception):
    """Input that cannot be read or is invalid; ``str()`` is what is printed after ``error: <source>:``."""

    def __init__(self, source: str, message: str) -> None:
        super().__init__(message)
        self.source = source


# --------------------------------------------------------------------------------------------------------
# Command line: shared pieces.


def _count(text: str, minimum: int, why: str = "") -> int:
    """A whole number of at least `minimum` from the command line; `why` is added to the refusal."""
    try:
        count = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"{text!r} is not a whole number") from None
    if count < minimum:
        raise argparse.ArgumentTypeError(f"{count} must be at least {minimum}{why}")
    return count


def _station_count(text: str) -> int:
    return _count(text, 2, " (the two ends)")


def _worker_count(text: str) -> int:
    return _count(text, 1)


def _version() -> str:
    try:
        return metadata.version("strutscope")
    except metadata.PackageNotFoundError:
        return "unknown (not installed)"


def _epilog(*examples: str) -> str:
    lines = ["examples:", *(f"  {example}" for example in examples), ""]
    lines.extend(textwrap.wrap(CAUTION, width=100))
    lines.extend(textwrap.wrap(COMBINED, width=100))
    return "\n".join(lines)


def _add_parser(commands, name: str, *, help: str, description: str, examples: Sequence[str]):
    # Raw formatting keeps the examples one to a line, so the description is wrapped here.
    return commands.add_parser(
        name,
        help=help,
        description=textwrap.fill(description, width=100),
        epilog=_epilog(*examples),
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )


def _add_units(parser, what: str) -> None:
    parser.add_argument(
        "--units",
        choices=("si", "us"),
        default="si",
        help=f"display units of {what}: si (kN, m, mm, kN·m; the default) or us (kip, ft, in, kip·ft)",
    )


def _add_signatures(parser) -> None:
    for option in ("--prepared-by", "--checked-by"):
        parser.add_argument(option, default="", metavar="NAME", help="name on the calc sheet (with --pdf)")


def _write_file(path: str, data: bytes) -> None:
    """Write `data` to `path` through a temporary file beside it, so that no half-written file is left."""
    directory = os.path.dirname(os.path.abspath(path))
    handle, temporary = tempfile.mkstemp(dir=directory, prefix=".", suffix=".part")
    try:
        with os.fdopen(handle, "wb") as stream:
            stream.write(data)
        os.chmod(temporary, 0o666 & ~_umask())
        os.replace(temporary, path)
    except BaseException:
        with contextlib.suppress(OSError):
            os.unlink(temporary)
        raise


def _umask() -> int:
    mask = os.umask(0)
    os.umask(mask)
    return mask


def _error(text: str) -> None:
    """Print an error line on stderr, control characters from the input escaped (app.safe_text.terminal)."""
    print(terminal(text), file=sys.stderr)


def _print(text: str) -> bool:
    """Print `text` (control characters escaped); return False when the reader went away (``... | head``)."""
    try:
        print(terminal(text, keep_newlines=True))
        sys.stdout.flush()
    except BrokenPipeError:
        # As the Python docs advise, point stdout at devnull so that the flush at exit does not raise again.
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return False
    return True


def _beyond_critical(result) -> bool:
    """At or above the first critical load (no stable equilibrium): exit code 1 even without ``--strict``."""
    return result.status in ("unstable", "critical")


def _failing(result) -> bool:
    """A failed member check or a danger caution (what ``--strict`` turns into exit code 1)."""
    return (result.utilization is not None and result.utilization > 1.0) or any(
        caution.level == "danger" for caution in result.cautions
    )


# --------------------------------------------------------------------------------------------------------
# strutscope solve
