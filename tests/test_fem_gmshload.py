"""A gmsh that cannot load its system libraries becomes one line naming the library."""
import builtins

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
