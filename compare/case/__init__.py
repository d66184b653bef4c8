"""The case: the case-file schema and parser (:mod:`.case`) and units at the edges (:mod:`.units`).

The bottom room of :mod:`compare`: imports only :mod:`fem` (geometry, errors) and libraries.
"""
from .case import Case, load_case, parse_case

__all__ = ["Case", "load_case", "parse_case"]
