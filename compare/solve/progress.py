"""Progress of the long work (meshes solved in the convergence study): a listener the command line
may set; nothing is shown unless one is. Numbers only; the output room draws the bar."""
from __future__ import annotations

from contextlib import contextmanager

_listeners: list = []


def tick(what: str) -> None:
    """Tell the listener (if any) that one more step of ``what`` has started."""
    for fn in _listeners:
        fn(what)


@contextmanager
def listening(fn):
    """Call ``fn(what)`` at every :func:`tick` inside the block."""
    _listeners.append(fn)
    try:
        yield
    finally:
        _listeners.remove(fn)
