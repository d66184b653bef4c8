"""A gmsh that cannot load its system libraries becomes one line naming the library; starting gmsh
leaves the SIGINT and SIGTERM handlers as they were."""
import builtins
import signal
import subprocess
import sys
import textwrap
from pathlib import Path

import pytest

from fem import gmshload


def test_missing_library_is_named_with_its_package(monkeypatch):
    real_import = builtins.__import__

    def fake(name, *args, **kwargs):
        if name == "gmsh":
            raise OSError("libGLU.so.1: cannot open shared object file: No such file or directory")
        return real_import(name, *args, **kwargs)

    monkeypatch.setattr(builtins, "__import__", fake)
    with pytest.raises(gmshload.GmshMissing) as e:
        gmshload.load_gmsh()
    msg = str(e.value)
    assert "\n" not in msg
    assert "libGLU.so.1" in msg and "libglu1-mesa" in msg


def test_other_import_errors_are_one_line_too():
    msg = gmshload.explain_import_error(ImportError("No module named 'gmsh'\nmore detail"))
    assert "\n" not in msg and "No module named" in msg


@pytest.mark.skipif(sys.platform == "win32", reason="POSIX signals")
def test_starting_gmsh_keeps_the_signal_handlers():
    # gmsh's initialize() sets SIGINT to the system default, and its library resets SIGTERM behind
    # Python's back: without the fix the SIGTERM below ends the child process (exit -15)
    code = textwrap.dedent("""
        import os, signal, time
        seen = []
        for s in (signal.SIGINT, signal.SIGTERM):
            signal.signal(s, lambda n, f: seen.append(n))
        from fem import gmshload
        gmshload.initialize(gmshload.load_gmsh())
        os.kill(os.getpid(), signal.SIGTERM)
        os.kill(os.getpid(), signal.SIGINT)
        time.sleep(0.1)
        print(sorted(seen))
    """)
    root = Path(__file__).resolve().parents[1]
    p = subprocess.run([sys.executable, "-c", code], cwd=root, capture_output=True, text=True, timeout=120)
    assert p.returncode == 0, p.stderr
    assert p.stdout.strip() == f"{sorted([int(signal.SIGINT), int(signal.SIGTERM)])}"
