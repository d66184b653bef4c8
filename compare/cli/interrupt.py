"""Interruption: SIGINT (Ctrl+C) and SIGTERM end a command with one line and leave nothing behind.

The command line installs the handlers (:func:`install_handlers`) for the length of a command. The
first SIGINT or SIGTERM raises :class:`Interrupted` wherever Python is running. It derives from
``BaseException``, so no ``except Exception`` on the way swallows it, and the ``finally`` blocks on
the way out remove temporary files. Later signals are ignored while that clean-up runs.

:func:`held` defers both signals over a short step that must be done whole or not at all (moving
finished results into place, removing temporary files): a signal that arrives meanwhile is raised as
:class:`Interrupted` when the step is over. The deferral is done in Python, not with a signal mask,
because a signal sent to the process may be taken by any of its threads (BLAS, OpenMP) while Python
runs its handler in the main thread.

A signal that lands during a long call into compiled code (meshing, a sparse solve) takes effect
when that call returns.
"""
from __future__ import annotations

import signal
import threading
from contextlib import contextmanager

SIGNALS = (signal.SIGINT, signal.SIGTERM)

_state = {"installed": False, "fired": False, "holding": 0, "pending": None}


class Interrupted(BaseException):
    """The run was interrupted by a signal; ``exit_code`` is 128 + the signal number (shell custom)."""

    def __init__(self, signum: int):
        self.signum = int(signum)
        super().__init__(self.name)

    @property
    def name(self) -> str:
        return signal.Signals(self.signum).name

    @property
    def exit_code(self) -> int:
        return 128 + self.signum


def _main_thread() -> bool:
    return threading.current_thread() is threading.main_thread()


def _handler(signum, frame):  # noqa: ARG001
    if _state["fired"] or _state["pending"] is not None:
        return  # an interruption is already under way
    if _state["holding"]:
        _state["pending"] = signum
        return
    _state["fired"] = True
    raise Interrupted(signum)


def install_handlers():
    """Turn SIGINT and SIGTERM into :class:`Interrupted`; return a function that puts the previous
    handlers back. Main thread only: elsewhere Python cannot install signal handlers, and nothing
    changes."""
    if not _main_thread() or _state["installed"]:
        return lambda: None
    _state.update(installed=True, fired=False, holding=0, pending=None)
    previous = {s: signal.signal(s, _handler) for s in SIGNALS}

    def restore() -> None:
        _state["fired"] = True  # from here on a signal is ignored until the old handlers are back
        for s, h in previous.items():
            signal.signal(s, h if h is not None else signal.SIG_DFL)
        _state.update(installed=False, fired=False, holding=0, pending=None)

    return restore


@contextmanager
def held():
    """Defer SIGINT and SIGTERM over the block; one that arrived meanwhile is raised after it."""
    if not _main_thread():
        yield
        return
    _state["holding"] += 1
    try:
        yield
    finally:
        _state["holding"] -= 1
        signum = _state["pending"]
        if not _state["holding"] and signum is not None:
            _state["pending"] = None
            if not _state["fired"]:
                _state["fired"] = True
                raise Interrupted(signum)
