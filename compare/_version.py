"""The version of shaftcheck (one place; ``results.json`` and ``--version`` read it)."""

__version__ = "0.1.0"
