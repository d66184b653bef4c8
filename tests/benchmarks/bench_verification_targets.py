"""Every verification case at a given accuracy target (default 0.1 % and 0.01 %): true error against
the published exact value, the estimate (GCI) beside it, the self-checks (J bracket and others), the
size and the time. Prints figures; asserts nothing (not part of pytest; the suite runs the fastest
cases at 0.01 %, tests/test_compare_verification_targets.py).

    python tests/benchmarks/bench_verification_targets.py ["0.01 %" ...]
"""
from __future__ import annotations

import sys
import time
import tomllib
from pathlib import Path

from compare.pipeline import analyse
from compare.output.results import build_results
from compare.case import parse_case
from compare.cli.cmd_verify import EXPECTED
from compare.case.units import to_si

ROOT = Path(__file__).resolve().parents[2]


def run(path: Path, accuracy: str):
    raw = tomllib.loads(path.read_text(encoding="utf-8"))
    raw.setdefault("analysis", {})["accuracy"] = accuracy
    expected = raw.pop("expected")
    source = raw["case"].pop("source", None)
    t0 = time.perf_counter()
    res = build_results(analyse(parse_case(raw)))
    dt = time.perf_counter() - t0
    rows = []
    for key, value in expected.items():
        dim, where, ckey = EXPECTED[key]
        exact = to_si(value, dim, key, None)
        fe = res[where[0]][where[1]]
        err = abs(fe - exact) / abs(exact)
        rows.append((key, err, res["convergence"][ckey]["gci"], res["convergence"][ckey].get("observed_order")))
    return res, rows, dt, source


def main(targets):
    print(f"{'case':<16} {'target':>7} {'quantity':<16} {'DOFs':>7} {'s':>6} {'true err':>9} {'GCI':>9} "
          f"{'p_obs':>6} covered  checks")
    for f in sorted((ROOT / "cases" / "verification").glob("*.toml")):
        for acc in targets:
            try:
                res, rows, dt, _ = run(f, acc)
            except Exception as exc:  # report and go on
                print(f"{f.stem:<16} {acc:>7} {type(exc).__name__}: {exc}")
                continue
            bad = [c["name"] for c in res["checks"] if not c["passed"]]
            for key, err, gci, p in rows:
                ps = f"{p:6.2f}" if p is not None else "     —"
                gs = f"{gci:9.2e}" if gci is not None else "        —"
                print(f"{f.stem:<16} {acc:>7} {key:<16} {res['mesh']['dofs']:7d} {dt:6.1f} {err:9.2e} {gs} {ps} "
                      f"{'yes' if gci is not None and err <= gci else 'NO ':<7}  {'ok' if not bad else 'FAILED ' + '; '.join(bad)}",
                      flush=True)




def keyed_runaway(rd=0.01, targets=("0.1 %",), reference="0.005 %"):
    """A keyed shaft with fillet r/d = 0.01 (no exact value): the estimate at each target against the
    difference from a much finer run (self-consistency only, not an outside value)."""
    from compare.case import parse_case  # noqa: PLC0415

    def case(acc):
        return parse_case({"case": {"units": "mm-N-MPa"},
                           "section": {"shape": "keyed", "diameter": 30,
                                       "keyways": [{"width": 8, "depth": 4, "fillet": 30 * rd}]},
                           "loads": {"torque": "100 N*m"}, "material": {"shear_modulus": "80 GPa"},
                           "analysis": {"accuracy": acc, "max_seconds": 1200, "max_dofs": 1_000_000}})

    ref = build_results(analyse(case(reference)))["torsion"]["tau_max"]
    for acc in targets:
        res = build_results(analyse(case(acc)))
        c = res["convergence"]["tau_max"]
        err = abs(res["torsion"]["tau_max"] - ref) / ref
        print(f"keyed r/d={rd:<6} {acc:>7} tau_max  DOFs {res['mesh']['dofs']:7d}  difference from the {reference} run "
              f"{err:9.2e}  GCI {c['gci']:9.2e}  p_obs {c['observed_order'] or float('nan'):6.2f}  "
              f"{'covered' if c['gci'] >= err else 'NOT covered'}", flush=True)


if __name__ == "__main__":
    main(sys.argv[1:] or ["0.1 %", "0.01 %"])
    keyed_runaway()
