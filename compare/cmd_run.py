"""``shaftcheck run CASE.toml [--out DIR]``: analyse one case, print the summary, write results."""
from __future__ import annotations

import json
import os
import shutil
import tempfile
from pathlib import Path

from .case import load_case


def register(sub) -> None:
    p = sub.add_parser("run", help="analyse one case file")
    p.add_argument("case", help="case file (TOML)")
    p.add_argument("--out", default=None, help="output folder for results.json and section.vtu (default: out/<case name>)")
    p.add_argument("--fineness", type=float, default=None, help="override analysis.fineness (mesh density)")
    p.add_argument("--no-vtu", action="store_true", help="do not write the VTU file")
    p.add_argument("--quiet", action="store_true", help="print nothing on success")
    p.set_defaults(func=run)


def run(args) -> int:
    from .analysis import analyse  # noqa: PLC0415
    from .report import summary  # noqa: PLC0415

    case = load_case(args.case)
    if args.fineness is not None:
        from .accuracy import check_fineness  # noqa: PLC0415

        check_fineness("--fineness", args.fineness)
    a = analyse(case, fineness=args.fineness)
    res = a.results()
    out = Path(args.out) if args.out else Path("out") / Path(args.case).stem
    files = {"results.json": json.dumps(res, indent=2, ensure_ascii=False) + "\n"}
    write_outputs(out, files, None if args.no_vtu else a)
    if not args.quiet:
        print(summary(res, case.units))
        print(f"\nwritten: {out / 'results.json'}" + ("" if args.no_vtu else f", {out / 'section.vtu'}"))
    return res.get("exit_code", 0)


def write_outputs(out: Path, files: dict[str, str], analysis=None) -> None:
    """Write everything into a temporary folder first, then move it in place: a failure leaves
    nothing half-written."""
    from fem.errors import InputError  # noqa: PLC0415

    out = Path(out)
    if out.exists() and not out.is_dir():
        raise InputError("--out", str(out), "exists and is not a folder")
    parent = out.parent if str(out.parent) else Path(".")
    try:
        parent.mkdir(parents=True, exist_ok=True)
        tmp = Path(tempfile.mkdtemp(prefix=".shaftcheck-", dir=parent))
    except OSError as exc:
        raise InputError("--out", str(out), f"cannot be written ({exc.strerror})") from None
    try:
        for name, text in files.items():
            (tmp / name).write_text(text, encoding="utf-8")
        if analysis is not None:
            write_fields_vtu(tmp / "section.vtu", analysis)
        out.mkdir(parents=True, exist_ok=True)
        for item in tmp.iterdir():
            os.replace(item, out / item.name)
    finally:
        shutil.rmtree(tmp, ignore_errors=True)


def write_fields_vtu(path: Path, a) -> None:
    import numpy as np  # noqa: PLC0415

    from fem.export import nodal_gradient, write_vtu  # noqa: PLC0415

    tr = a.torsion
    g = nodal_gradient(tr.basis, tr.phi)
    k = (abs(a.torque) or 1.0) / tr.J
    data = {"prandtl_phi": tr.phi, "warping_omega": tr.omega,
            "torsion_tau_zx": k * g[1], "torsion_tau_zy": -k * g[0], "torsion_tau": k * np.hypot(g[0], g[1])}
    for name, field in a.extra.get("_vtu", {}).items():
        data[name] = field
    write_vtu(path, a.mesh, data)
