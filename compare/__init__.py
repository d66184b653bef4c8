"""shaftcheck: FE against the hand formulas for real shaft sections.

The Python API (:mod:`compare.api`) is re-exported here::

    from compare import Case, analyse
    r = analyse(Case.load("cases/conveyor_gear_seat.toml"))
    r.torsion.J, r.torsion.kts, r.accuracy.met

The rooms, in the order a case flows through them: :mod:`.case` (input), :mod:`.solve`,
:mod:`.pairs`, :mod:`.checks`, :mod:`.pipeline` (the order of the steps), :mod:`.output`,
:mod:`.cli`; DEVELOPERS.md has the map.
"""

from ._version import __version__
from .api import Case, InputError, Result, analyse

__all__ = ["__version__", "Case", "Result", "analyse", "InputError"]
