"""``shaftcheck verify [--out DIR] [--cases DIR]``: the exact-solution suite.

Every case in ``cases/verification/`` names its published source and gives its exact values in an
``[expected]`` table (keys ``torsion.J``, ``torsion.tau_max``, ``shear.tau_max``, ``shear.kappa_x``,
``shear.kappa_y``). Each case is run exactly as ``shaftcheck run`` runs it (adaptive refinement to the
case's accuracy and the convergence study). A row passes when the true error is within the target and
the estimated error (the GCI of that quantity) covers the true error. Exit 0 when every row passes,
1 otherwise.
"""
from __future__ import annotations

import json
import math
from pathlib import Path

from fem.errors import InputError

from ..case.case import escape_text, load_case, parse_toml, read_input_file
from ..case.units import to_si
from ..output.results import build_results
from ..pipeline import analyse
from .cmd_run import write_outputs

EXPECTED = {
    # key: (dimension, results path, convergence key)
    "torsion.J": ("second_moment", ("torsion", "J"), "J"),
    "torsion.tau_max": ("stress", ("torsion", "tau_max"), "tau_max"),
    "shear.tau_max": ("stress", ("shear", "tau_max"), "shear_tau_max"),
    "shear.kappa_x": ("dimensionless", ("shear", "kappa_x"), "kappa_x"),
    "shear.kappa_y": ("dimensionless", ("shear", "kappa_y"), "kappa_y"),
}


def default_cases() -> Path:
    return Path(__file__).resolve().parents[2] / "cases" / "verification"


def register(sub) -> None:
    p = sub.add_parser("verify", help="run the exact-solution verification suite")
    p.add_argument("--out", default=None, help="folder for verify.json (default: out/verify)")
    p.add_argument("--cases", default=None, help="folder of verification cases (default: cases/verification)")
    p.set_defaults(func=run)


def verify_case(path: Path) -> list[dict]:
    try:
        case = load_case(path)
    except InputError as exc:  # name the file: a folder of cases is run
        if exc.field == "case file":
            raise
        raise InputError(f"{path.name}: {exc.field}", exc.value, exc.reason, exc.unit) from None
    raw = parse_toml(read_input_file(path, "case file"), "case file", str(path))
    source = raw.get("case", {}).get("source")
    expected = case.expected
    if not isinstance(source, str) or not source.strip():
        raise InputError(f"{path.name}: case.source", None, "a verification case must name its published source")
    source = escape_text(source)
    if not expected:
        raise InputError(f"{path.name}: expected", None, "a verification case needs an [expected] table")
    a = analyse(case)
    res = build_results(a)
    rows = []
    for key, exact in expected.items():
        dim, where, ckey = EXPECTED[key]
        fe = res[where[0]][where[1]]
        conv = res["convergence"].get(ckey, {})
        est = conv.get("gci")
        err = abs(fe - exact) / abs(exact)
        target = res["accuracy"]["target"]
        covered = est is not None and err <= est
        rows.append(dict(case=path.stem, quantity=key, exact=exact, fe=fe, relative_error=err, estimated_error=est,
                         covered=bool(covered), target=target, within_target=bool(err <= target),
                         passed=bool(covered and err <= target), source=source, dofs=res["mesh"]["dofs"]))
    return rows


def run(args) -> int:
    folder = Path(args.cases) if args.cases else default_cases()
    files = sorted(folder.glob("*.toml"))
    if not files:
        raise InputError("--cases", str(folder), "holds no verification cases (*.toml)")
    rows = []
    for f in files:
        rows.extend(verify_case(f))
    print(f"{'case':<16} {'quantity':<16} {'exact':>13} {'FE':>13} {'rel. error':>10} {'estimate':>10}  covered  pass")
    for r in rows:
        est = f"{r['estimated_error']:.2e}" if r["estimated_error"] is not None else "—"
        print(f"{r['case']:<16} {r['quantity']:<16} {r['exact']:13.6e} {r['fe']:13.6e} {r['relative_error']:10.2e} "
              f"{est:>10}  {'yes' if r['covered'] else 'NO':<7}  {'ok' if r['passed'] else 'FAIL'}")
    failed = [r for r in rows if not r["passed"]]
    print(f"\n{len(rows) - len(failed)} passed, {len(failed)} failed")
    out = Path(args.out) if args.out else Path("out") / "verify"
    report = {"rows": rows, "passed": not failed, "cases": [f.name for f in files],
              "note": "relative error against the published exact value; estimate = GCI of that quantity "
                      "(Roache 1994, Fs = 1.25); a row passes when the error is within the target and the estimate covers it"}
    write_outputs(out, {"verify.json": json.dumps(report, indent=2, default=_num) + "\n"})
    print(f"written: {out / 'verify.json'}")
    return 0 if not failed else 1


def _num(v):
    return None if isinstance(v, float) and not math.isfinite(v) else float(v)
