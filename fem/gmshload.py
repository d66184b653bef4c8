"""Import gmsh, or say in one line which system library is missing.

gmsh's wheel links to X11/OpenGL runtime libraries even when no window is opened. On a bare server
they may be absent; the import then fails with an OSError naming the library. We turn that into one
line the command line can print (see README, 'System libraries').
"""
from __future__ import annotations

import re
import signal
import threading

from .errors import InputError

_PACKAGES = {
    "libGLU": "libglu1-mesa",
    "libXcursor": "libxcursor1",
    "libXft": "libxft2",
    "libXinerama": "libxinerama1",
    "libXrender": "libxrender1",
    "libXfixes": "libxfixes3",
    "libX11": "libx11-6",
    "libgomp": "libgomp1",
    "libGL": "libgl1",
}


class GmshMissing(InputError):
    """gmsh could not be imported (a missing system library, usually)."""


def explain_import_error(exc: BaseException) -> str:
    """One line naming the missing library and the Debian/Ubuntu package that provides it."""
    text = str(exc)
    m = re.search(r"(lib[A-Za-z0-9_+\-]+)\.so[.0-9]*", text)
    if m:
        lib = m.group(1)
        pkg = next((p for k, p in _PACKAGES.items() if lib.startswith(k)), None)
        hint = f" (Debian/Ubuntu: apt-get install {pkg})" if pkg else ""
        return f"gmsh cannot load the system library {m.group(0)}{hint}; see README 'System libraries'"
    return f"gmsh cannot be imported: {text.splitlines()[0] if text else type(exc).__name__}"


def load_gmsh():
    """Return the gmsh module, or raise :class:`GmshMissing` with a one-line message."""
    try:
        import gmsh  # noqa: PLC0415
    except (ImportError, OSError) as exc:
        raise GmshMissing("gmsh", None, explain_import_error(exc)) from None
    return gmsh


def initialize(gmsh) -> None:
    """Start the gmsh API once, leaving the process's SIGINT and SIGTERM handling as it was.

    gmsh's Python ``initialize()`` sets SIGINT to the system default (end the process at once, no
    clean-up) unless ``interruptible=False``; its C library also resets SIGTERM to the system default
    behind Python's back (``signal.getsignal`` still reports the old handler). Both handlers are put
    back, so a program that handles the two signals itself keeps doing so after meshing starts.
    """
    if gmsh.isInitialized():
        return
    main = threading.current_thread() is threading.main_thread()
    saved = {s: signal.getsignal(s) for s in (signal.SIGINT, signal.SIGTERM)} if main else {}
    try:
        gmsh.initialize(readConfigFiles=False, interruptible=False)
    except TypeError:  # an older gmsh without the keyword
        gmsh.initialize(readConfigFiles=False)
    finally:
        for sig, handler in saved.items():
            if handler is not None:  # None: set outside Python, nothing to put back
                signal.signal(sig, handler)
