"""Traceability of a run: SHA-256 of the case file and of the material table it names.

The files are read through :func:`compare.case.case.read_input_file` (UTF-8, decoded exactly), so
the hash of the re-encoded text is the hash of the file's bytes."""
from __future__ import annotations

import hashlib

from ..case.case import read_input_file
from ..checks.materials import table_path


def sha256_of(path, field: str) -> str:
    return hashlib.sha256(read_input_file(path, field).encode("utf-8")).hexdigest()


def input_hashes(case) -> dict:
    """``{"case_sha256", "materials_sha256"}``; None where the input is not a file (a case built in
    Python) or names no material table."""
    out = {"case_sha256": None, "materials_sha256": None}
    if case.path is not None:
        out["case_sha256"] = sha256_of(case.path, "case")
        if case.analysis.materials:
            out["materials_sha256"] = sha256_of(table_path(case), "analysis.materials")
    return out
