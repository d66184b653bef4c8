"""``shaftcheck sweep CASE.toml [--vary path=values ...] [--out DIR]``: run a case over varied fields
(see :mod:`compare.sweep`), write sweep.csv, sweep.parquet, sweep.png, sweep.svg and sweep.html."""
from __future__ import annotations

import math
import os
import sys
import time
from pathlib import Path

from fem.errors import InputError

from ..output.sweep_files import sweep_files
from ..sweep import number_of, plan, rows, run_sweep
from .cmd_run import check_out, option_number, write_outputs
from ..case.case import check_fineness


def register(sub) -> None:
    p = sub.add_parser("sweep", help="run a case over varied fields (a parametric sweep)")
    p.add_argument("case", help="case file (TOML); a [sweep] table may name the varied fields")
    p.add_argument("--vary", action="append", default=[], metavar="PATH=VALUES",
                   help="a varied field and its values: a:b:n (n values, ends included) or a,b,c; "
                        "e.g. section.keyways[0].fillet=0.1mm:1.5mm:15 (repeat for every combination)")
    p.add_argument("--out", default=None, help="output folder (default: out/<case name>-sweep)")
    p.add_argument("--cache", default=None,
                   help="folder of finished variants, reused by a rerun (default: the output folder's name + .cache)")
    p.add_argument("--workers", default=None,
                   help="worker processes of the local Dask cluster (default: the number of cores; 0: run in this process)")
    p.add_argument("--scheduler", default=None, help="address of an existing Dask scheduler, e.g. tcp://host:8786")
    p.add_argument("--fineness", default=None, help="override analysis.fineness (mesh density) of every variant")
    p.add_argument("--quiet", action="store_true", help="no progress line and no summary")
    p.set_defaults(func=run)


def _workers(text: str | None) -> int:
    if text is None:
        return os.cpu_count() or 1
    v = option_number("--workers", text)
    if v != int(v) or not 0 <= v <= 256:
        raise InputError("--workers", text, "is not a whole number of worker processes from 0 to 256")
    return int(v)


def progress_line(done: int, total: int, computed: int, seconds: float, width: int = 30) -> str:
    """``[#####.....] 5/10 variants, about 40 s left`` (the time left from the variants computed so
    far in this run; cached ones cost nothing)."""
    filled = int(width * done / total) if total else width
    left = ""
    if computed and done < total:
        left = f", about {math.ceil(seconds / computed * (total - done))} s left"
    elif done < total:
        left = ", estimating the time left"
    return f"[{'#' * filled}{'.' * (width - filled)}] {done}/{total} variants{left}"


def run(args) -> int:
    fineness = option_number("--fineness", args.fineness)
    if fineness is not None:
        fineness = check_fineness("--fineness", fineness, as_written=args.fineness)
    workers = _workers(args.workers)
    out = Path(args.out) if args.out else Path("out") / f"{Path(args.case).stem}-sweep"
    check_out(out)
    cache = Path(args.cache) if args.cache else out.with_name(out.name + ".cache")
    sw = plan(args.case, args.vary, fineness)
    show = not args.quiet and sys.stderr is not None

    def progress(done, total, computed, seconds):
        if show:
            end = "\n" if done == total else ""
            print("\r" + progress_line(done, total, computed, seconds), end=end, file=sys.stderr, flush=True)

    t0 = time.perf_counter()
    run_sweep(sw, args.case, cache, workers, args.scheduler, fineness, progress)
    table = rows(sw)
    varied = [v.path for v in sw.varied]
    xs = [number_of(r.get(varied[0])) for r in table]
    title = next((r.results["case"]["title"] for r in sw.records if r.results), Path(args.case).stem)
    write_outputs(out, sweep_files(title, table, varied, sw.plots, xs))
    failed = [r for r in sw.records if r.exit_code != 0]
    if not args.quiet:
        cached = sum(r.cached for r in sw.records)
        print(f"{len(sw.records)} variants ({cached} from the cache) in {time.perf_counter() - t0:.1f} s; "
              f"{len(failed)} with a non-zero exit code")
        for r in failed:
            what = r.error or "see the warnings of a single run of this variant"
            print(f"  variant {r.index} ({', '.join(f'{k} = {v}' for k, v in r.values.items())}): "
                  f"exit {r.exit_code}: {what}")
        print(f"written: {out / 'sweep.csv'}, sweep.parquet, sweep.png, sweep.svg, sweep.html")
    return 0 if not failed else max(r.exit_code for r in failed)
