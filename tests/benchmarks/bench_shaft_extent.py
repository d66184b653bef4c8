"""A station checked along its feature: the demo countershaft's pulley keyseat (keyway 40 mm), its one
section run against each further candidate check on the same solved section. Prints figures; not a test."""
import time
import tomllib
from pathlib import Path

from compare.case.case import parse_case
from compare.checks.shaft_extent import candidates, with_loads
from compare.pipeline import analyse

ROOT = Path(__file__).resolve().parents[2]


if __name__ == "__main__":
    d = tomllib.loads((ROOT / "cases" / "countershaft_layout.toml").read_text())
    d["shaft"]["sections"] = [d["shaft"]["sections"][0]]  # the pulley keyseat only
    c = parse_case(d)
    t0 = time.perf_counter()
    a = analyse(c)
    total = time.perf_counter() - t0
    lay, st = a.extra["shaft"]["layout"], c.shaft.stations[0]
    base = a.extra["shaft_stations"][0]
    cands = candidates(lay, st)
    times = []
    for cand in cands:
        t0 = time.perf_counter()
        with_loads(base, {k: v * 1.000001 for k, v in cand["loads"].items()}, c.shaft.rotating)  # never the base's
        times.append(time.perf_counter() - t0)
    print(f"pulley keyseat: whole layout run {total:.2f} s (shoulder factors included; the station's section run "
          f"{base.seconds.get('total', float('nan')):.2f} s); {len(cands)} candidates along the keyway, "
          f"{min(times):.3f}-{max(times):.3f} s per candidate check on the solved section")
