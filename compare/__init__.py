"""FE against the hand formulas: pairs and ratios, case files, reports and the command line."""

from ._version import __version__

__all__ = ["__version__"]
