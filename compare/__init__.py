"""FE against the hand formulas: pairs and ratios, case files, reports and the command line."""

__version__ = "0.1.0"
