"""Ending ``strutscope solve`` and ``strutscope batch`` cleanly on Ctrl-C (SIGINT) and SIGTERM.

:func:`clean_exit` wraps a command's handler: SIGTERM becomes an exception (:class:`Terminated`) like the
KeyboardInterrupt that Ctrl-C already raises, so the ``finally`` and ``except BaseException`` blocks of the
writers run (their temporary ``.part`` files are removed, the batch's worker processes are stopped), and the
command then prints one line and exits with 130 (SIGINT) or 143 (SIGTERM), the shell's 128 + signal number,
without a traceback. Once the first signal has arrived, further SIGINT and SIGTERM are ignored so that the
clean-up itself is not cut short; it is bounded (workers get two seconds before they are killed). They stay
ignored once the command has been stopped (it is ending): a second Ctrl-C after the message would otherwise
meet Python's own handler again and end the process by SIGINT, with a traceback, instead of 130.

:func:`worker_start` is the batch's worker initializer: a worker ignores SIGINT (Ctrl-C reaches the whole
process group; the parent decides) and turns SIGTERM into SystemExit, so that a calc sheet being written
removes its temporary file before the worker ends.
"""

from __future__ import annotations

import contextlib
import functools
import os
import signal
import sys
from collections.abc import Callable

__all__ = ["EXIT_SIGINT", "EXIT_SIGTERM", "Terminated", "clean_exit", "end_process", "worker_start"]

#: Exit codes after an interruption: 128 + the signal's number, as shells report them.
EXIT_SIGINT = 128 + 2
EXIT_SIGTERM = 128 + 15


class Terminated(BaseException):
    """SIGTERM arrived (a BaseException: ``except Exception`` around one row's solve lets it through)."""


def _on_signal(signum, frame) -> None:
    # Ignore both from now on: the clean-up must finish, and it is bounded.
    for name in ("SIGINT", "SIGTERM"):
        if hasattr(signal, name):
            signal.signal(getattr(signal, name), signal.SIG_IGN)
    if signum == signal.SIGINT:
        raise KeyboardInterrupt
    raise Terminated


def clean_exit(command: str) -> Callable:
    """Decorate the handler of `command` so that SIGINT and SIGTERM end it cleanly (see the module)."""

    def decorate(handler: Callable[..., int]) -> Callable[..., int]:
        @functools.wraps(handler)
        def run(*args, **kwargs) -> int:
            installed = {}
            for name in ("SIGINT", "SIGTERM"):
                number = getattr(signal, name, None)
                if number is not None:
                    # ValueError: not the main thread (a test calling main() from a thread)
                    with contextlib.suppress(ValueError):
                        installed[number] = signal.signal(number, _on_signal)
            try:
                return handler(*args, **kwargs)
            except KeyboardInterrupt:
                return _stopped(command, "Ctrl-C (SIGINT)", EXIT_SIGINT)
            except Terminated:
                return _stopped(command, "SIGTERM", EXIT_SIGTERM)
            finally:
                # Put back only where no signal arrived: after one, both stay ignored (module notes).
                if all(signal.getsignal(number) is _on_signal for number in installed):
                    for number, previous in installed.items():
                        signal.signal(number, previous)

        return run

    return decorate


#: Set once a command has been stopped by a signal (read by :func:`end_process`).
_STOPPED = []


def end_process(code: int) -> int:
    """Return `code`; but when a command of this process was stopped by a signal, end the process now.

    A KeyboardInterrupt raised while Python runs code given as text (``exec`` of a string, as the standard
    ``dataclasses`` does while a module is imported) sets CPython's "unhandled KeyboardInterrupt" flag even
    when the exception is caught; at exit the interpreter may then kill itself by SIGINT (exit -2 after our
    clean message) instead of returning 130 (``python -m``). Seen in about 6 runs in 20 of the test when
    Ctrl-C came while the command was still importing. The clean-up has already run (the ``finally`` blocks
    of the writers and the batch), so the process flushes its output and ends with `code` by ``os._exit``.
    Only the program's own entry point calls this (``app.cli.main`` without arguments), never a test that
    calls ``main`` in its own process.
    """
    if not _STOPPED:
        return code
    for stream in (sys.stdout, sys.stderr):
        with contextlib.suppress(Exception):
            stream.flush()
    os._exit(code)


def _stopped(command: str, what: str, code: int) -> int:
    _STOPPED.append(code)
    with contextlib.suppress(OSError, ValueError):  # stderr closed
        print(
            f"strutscope {command}: stopped by {what}; no half-written file was left",
            file=sys.stderr,
            flush=True,
        )
    return code


def _exit_on_term(signum, frame) -> None:
    signal.signal(signal.SIGTERM, signal.SIG_DFL)  # a second SIGTERM ends the worker at once
    raise SystemExit(EXIT_SIGTERM)


def worker_start() -> None:
    """Initializer of a batch worker process: ignore SIGINT, turn SIGTERM into SystemExit."""
    signal.signal(signal.SIGINT, signal.SIG_IGN)
    if hasattr(signal, "SIGTERM"):
        signal.signal(signal.SIGTERM, _exit_on_term)
