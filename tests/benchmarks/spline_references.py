"""A converged reference for the splined demo section's torsion results, independent of the 1 % study's
meshes: cases/splined_pump_shaft.toml run to an accuracy target of 0.05 % from fineness 2 (meshes of
0.3–1.1 million unknowns, about 400 CPU s on a 2-core machine), per unit torque. Its own estimate
(the three-mesh GCI with the parting of the two independent peak evaluations, the project's
estimator checked against exact solutions by tests/test_compare_accuracy.py) is stored as its
uncertainty. Writes tests/data/spline_references.json, which tests/test_compare_spline_coverage.py
reads. Not an outside value: a self-consistency reference, at meshes 25 times finer than the study's.
Not part of pytest.

    python tests/benchmarks/spline_references.py [--out PATH]
"""
from __future__ import annotations

import json
import sys
import time
import tomllib
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path.insert(0, str(ROOT))

from compare.case import parse_case  # noqa: E402
from compare.output.results import build_results  # noqa: E402
from compare.pipeline import analyse  # noqa: E402

CASE = ROOT / "cases" / "splined_pump_shaft.toml"
OUT = ROOT / "tests" / "data" / "spline_references.json"
ACCURACY, FINENESS = "0.05 %", 2.0


def main(argv):
    out = Path(argv[argv.index("--out") + 1]) if "--out" in argv else OUT
    raw = tomllib.loads(CASE.read_text(encoding="utf-8"))
    raw["analysis"] = {"accuracy": ACCURACY, "fineness": FINENESS, "max_dofs": 3_000_000, "max_seconds": 3000}
    t0 = time.process_time()
    case = parse_case(raw)
    res = build_results(analyse(case))
    torque = abs(case.loads.torque)
    refs = {}
    for key, value, scale in (("tau_max", res["torsion"]["tau_max"], 1 / torque), ("J", res["torsion"]["J"], 1.0)):
        conv = res["convergence"][key]
        refs[key] = {"reference": value * scale, "uncertainty": conv["gci"] * abs(value * scale),
                     "meshes_dofs": conv["dofs"] if "dofs" in conv else None,
                     "values": conv.get("values")}  # the study's values: tau_max per unit torque already
        print(key, refs[key])
    doc = {"provenance": (f"{CASE.relative_to(ROOT)} run to {ACCURACY} from fineness {FINENESS:g} by "
                          f"tests/benchmarks/spline_references.py ({res['mesh']['dofs']} unknowns on the finest "
                          f"mesh, {time.process_time() - t0:.0f} CPU s); tau_max per unit torque [Pa/(N m)], "
                          "J [m^4]; uncertainty: the run's own estimate times the value"),
           "references": refs}
    out.write_text(json.dumps(doc, indent=1) + "\n", encoding="utf-8")
    print("written", out)


if __name__ == "__main__":
    main(sys.argv[1:])
