"""The command line: :func:`main` (the ``shaftcheck`` script) and one module per subcommand.

May import every other room of :mod:`compare`; only :mod:`compare.api` imports it.
"""
from .main import EXIT_ACCURACY, EXIT_FAILED, EXIT_INPUT, EXIT_OK, build_parser, main

__all__ = ["main", "build_parser", "EXIT_OK", "EXIT_FAILED", "EXIT_INPUT", "EXIT_ACCURACY"]
