"""Every FE result that has a hand-formula counterpart is carried as a pair {fe, classic} with the
classic's source. Ratios are computed from pairs, never typed in.

``kind`` says what the ratio means:

- ``'check'``: the formula is exact (or a published table) for this section, so FE/classic − 1 is
  the FE's error, and ``tolerance`` (with its ``reason``) is what we accept;
- ``'factor'``: the formula is the hand-calc nominal for a section it does not describe exactly
  (full-round formula on a keyed shaft); the ratio is the effect of the real geometry (Kts, the
  stiffness lost to a keyway) and no tolerance applies;
- ``'not applicable'``: no published formula fits; ``classic`` is None and so is the ratio.
"""
from __future__ import annotations

from dataclasses import asdict, dataclass


@dataclass
class Pair:
    quantity: str
    fe: float | None
    classic: float | None
    source: str
    kind: str = "check"
    dimension: str = "dimensionless"
    tolerance: float | None = None
    reason: str = ""
    note: str = ""

    @property
    def ratio(self) -> float | None:
        if self.fe is None or self.classic in (None, 0) or self.kind == "not applicable":
            return None
        return self.fe / self.classic

    @property
    def within(self) -> bool | None:
        """Inside the accepted tolerance: relative to the classic value, or absolute where that is 0."""
        if self.kind != "check" or self.tolerance is None or self.fe is None or self.classic is None:
            return None
        if self.classic == 0:
            return abs(self.fe) <= self.tolerance
        return abs(self.fe / self.classic - 1.0) <= self.tolerance

    def to_dict(self) -> dict:
        d = asdict(self)
        d["ratio"] = self.ratio
        d["within_tolerance"] = self.within
        return d


def not_applicable(quantity: str, fe: float, why: str, dimension: str = "dimensionless") -> Pair:
    return Pair(quantity, fe, None, "", kind="not applicable", dimension=dimension, note=why)
