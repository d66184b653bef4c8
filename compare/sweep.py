"""Parametric sweeps: one case, some of its fields varied over values or ranges, every variant run
as ``shaftcheck run`` would run it (same parser, same accuracy evidence, same exit code), on a Dask
cluster (local worker processes by default, or an existing scheduler).

A varied field is named by its path in the case file, ``section.keyways[0].fillet``; its values are a
range ``a:b:n`` (n values from a to b, both included, the same unit on both ends: ``0.1mm:1.5mm:15``)
or a list ``a,b,c``. Several varied fields give every combination. The same can be written in the
case file::

    [sweep]
    vary = { "section.keyways[0].fillet" = "0.2mm:1.0mm:5", "loads.torque" = ["300 N*m", "450 N*m"] }
    plot = ["torsion.kts", "governing.factor"]     # results drawn against the varied field

Each finished variant is kept in a cache folder as ``<hash>.json``, the hash taken over the variant's
whole input (the case as varied, the material table it names, the tool version), so a rerun of an
interrupted sweep computes only what is missing. A variant refused by the input checks is recorded
with its one-line error and does not stop the others.

Numbers and records only: the files are written by :mod:`compare.output.sweep_files`, the progress
line by the command line.
"""
from __future__ import annotations

import copy
import hashlib
import itertools
import json
import logging
import math
import os
import re
import time
from dataclasses import dataclass, field
from pathlib import Path

from classic._validity import OutOfRangeError
from fem.errors import InputError, LimitError, SolveError

from ._version import __version__
from .case.case import parse_case, parse_toml, read_input_file
from .checks.materials import read_table, table_path
from .output.results import build_results
from .pipeline import analyse

#: Most variants one sweep may have (a limit, like max_dofs: a typo in n must not start a month of work).
MAX_VARIANTS = 10_000

#: Seconds to wait for an existing Dask scheduler before giving up (an unreachable address is bad input).
CONNECT_TIMEOUT = 5.0

#: Results drawn when the case names none: (results.json path, label).
DEFAULT_PLOTS = ("torsion.kts", "torsion.J", "governing.factor")

#: Columns of a row taken from results.json: column name -> path in the results.
COLUMNS = {
    "J": "torsion.J",
    "kts": "torsion.kts",
    "tau_max": "torsion.tau_max",
    "shear_tau_max": "shear.tau_max",
    "von_mises_max": "combined.von_mises_max",
    "static_von_mises": "static.von_mises",
    "fatigue_goodman": "fatigue.goodman",
    "governing_factor": "governing.factor",
    "governing_criterion": "governing.criterion",
    "meets_design_factor": "governing.meets_design_factor",
    "gci_J": "convergence.J.gci",
    "gci_tau_max": "convergence.tau_max.gci",
    "gci_shear_tau_max": "convergence.shear_tau_max.gci",
    "accuracy_achieved": "accuracy.achieved",
    "accuracy_met": "accuracy.met",
    "dofs": "mesh.dofs",
}

_NUMBER = re.compile(r"^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*?)\s*$")
_STEP = re.compile(r"\.?([A-Za-z_][A-Za-z0-9_]*)|\[(\d+)\]")


@dataclass
class Varied:
    """One varied field: its path and its values as written (strings keep their unit)."""

    path: str
    values: list


@dataclass
class Variant:
    index: int
    values: dict  # path -> value as written
    data: dict  # the case as varied (the [sweep] table removed)
    key: str  # hash of the input


@dataclass
class Record:
    """The outcome of one variant."""

    index: int
    values: dict
    key: str
    exit_code: int
    error: str | None = None
    results: dict | None = None
    cached: bool = False
    seconds: float = 0.0


@dataclass
class Sweep:
    varied: list
    plots: list
    variants: list
    records: list = field(default_factory=list)


# ---------------------------------------------------------------------------------------- input
def parse_values(spec, field_name: str) -> list:
    """Values of a varied field: a list as given, ``a,b,c``, or the range ``a:b:n``."""
    if isinstance(spec, list):
        if not spec:
            raise InputError(field_name, spec, "is an empty list of values")
        return list(spec)
    if isinstance(spec, bool) or not isinstance(spec, (str, int, float)):
        raise InputError(field_name, spec, "is not a range a:b:n, a list a,b,c or a list of values")
    if not isinstance(spec, str):
        return [spec]
    text = spec.strip()
    if text.count(":") == 2:
        a, b, n = (s.strip() for s in text.split(":"))
        try:
            count = int(n)
        except ValueError:
            raise InputError(field_name, spec, f"has {n!r} where the number of values n of a:b:n belongs") from None
        if not 2 <= count <= MAX_VARIANTS:
            raise InputError(field_name, spec, f"asks for {count} values; a range has 2 to {MAX_VARIANTS}")
        ma, mb = _NUMBER.match(a), _NUMBER.match(b)
        if not ma or not mb:
            raise InputError(field_name, spec, "has an end that is not a number (with an optional unit)")
        ua, ub = ma.group(2).replace(" ", ""), mb.group(2).replace(" ", "")
        if ua != ub:
            raise InputError(field_name, spec, f"has different units at its ends ({ua or 'none'}, {ub or 'none'})")
        va, vb = float(ma.group(1)), float(mb.group(1))
        if not (math.isfinite(va) and math.isfinite(vb)):
            raise InputError(field_name, spec, "has an end that is not finite")
        out = []
        for i in range(count):
            v = float(f"{va + (vb - va) * i / (count - 1):.12g}")
            out.append(f"{v:.12g} {ua}" if ua else v)
        return out
    if ":" in text:
        raise InputError(field_name, spec, "is not a range a:b:n (three parts)")
    parts = [p.strip() for p in text.split(",")]
    if any(not p for p in parts):
        raise InputError(field_name, spec, "has an empty value in its list")
    return [_plain(p) for p in parts]


def _plain(text: str):
    """A listed value: a plain number stays a number (the case's unit system applies), else text."""
    m = _NUMBER.match(text)
    if m and not m.group(2):
        v = float(m.group(1))
        return int(v) if re.fullmatch(r"[-+]?\d+", m.group(1)) else v
    return text


def _steps(path: str, field_name: str) -> list:
    steps, pos = [], 0
    for m in _STEP.finditer(path):
        if m.start() != pos or (pos == 0 and m.group(0).startswith(".")):
            break
        steps.append(m.group(1) if m.group(1) is not None else int(m.group(2)))
        pos = m.end()
    if not steps or pos != len(path) or not isinstance(steps[0], str):
        raise InputError(field_name, path, "is not a case-file field path such as section.keyways[0].fillet")
    return steps


def set_field(data: dict, path: str, value, field_name: str = "--vary") -> None:
    """Set the field ``path`` of the case dictionary ``data`` (the last name may be new: a default
    made explicit; every table and list index on the way must exist)."""
    steps = _steps(path, field_name)
    node = data
    for i, s in enumerate(steps[:-1]):
        nxt = steps[i + 1]
        if isinstance(s, str):
            if not isinstance(node, dict) or s not in node:
                raise InputError(field_name, path, f"names no field of the case ({'.'.join(map(str, steps[:i + 1]))} is missing)")
            node = node[s]
        else:
            if not isinstance(node, list) or not 0 <= s < len(node):
                raise InputError(field_name, path, f"names no field of the case (no item [{s}])")
            node = node[s]
        if not isinstance(node, (dict, list)) or (isinstance(nxt, int) and not isinstance(node, list)):
            raise InputError(field_name, path, "names no field of the case")
    last = steps[-1]
    if isinstance(last, int):
        if not isinstance(node, list) or not 0 <= last < len(node):
            raise InputError(field_name, path, f"names no field of the case (no item [{last}])")
    elif not isinstance(node, dict):
        raise InputError(field_name, path, "names no field of the case")
    node[last] = value


def parse_vary_option(text: str) -> Varied:
    """``--vary path=spec``."""
    if "=" not in text:
        raise InputError("--vary", text, "is not path=values (e.g. section.keyways[0].fillet=0.1mm:1.5mm:15)")
    path, spec = (s.strip() for s in text.split("=", 1))
    _steps(path, "--vary")
    return Varied(path, parse_values(spec, "--vary"))


def parse_sweep_table(table) -> tuple[list, list]:
    """The case file's ``[sweep]`` table: ``vary`` (path -> values) and ``plot`` (result paths)."""
    if not isinstance(table, dict):
        raise InputError("sweep", table, "is not a table")
    unknown = set(table) - {"vary", "plot"}
    if unknown:
        name = sorted(unknown)[0]
        raise InputError(f"sweep.{name}", table[name], "is not a field of [sweep] (vary, plot)")
    vary = table.get("vary", {})
    if not isinstance(vary, dict):
        raise InputError("sweep.vary", vary, "is not a table of field paths and values")
    varied = []
    for path, spec in vary.items():
        _steps(path, f"sweep.vary.{path}")
        varied.append(Varied(path, parse_values(spec, f"sweep.vary.{path}")))
    plots = table.get("plot", [])
    if not isinstance(plots, list) or not all(isinstance(p, str) for p in plots):
        raise InputError("sweep.plot", plots, "is not a list of results.json paths (e.g. \"torsion.kts\")")
    return varied, plots


def _table_text(data: dict, case_path: Path) -> str:
    """The text of the material table a variant names (part of its input), or '' if it has none or it
    cannot be read (the variant's own run then reports that)."""
    name = data.get("analysis", {}).get("materials") if isinstance(data.get("analysis"), dict) else None
    if not isinstance(name, str):
        return ""
    try:
        return read_input_file(case_path.parent / name, "analysis.materials")
    except InputError:
        return ""


def variant_key(data: dict, case_path: Path, fineness: float | None) -> str:
    """Hash of everything a variant's results depend on: the case as varied, the material table it
    names, the command-line fineness and the tool version."""
    blob = json.dumps({"case": data, "table": _table_text(data, case_path), "fineness": fineness,
                       "version": __version__}, sort_keys=True, default=str)
    return hashlib.sha256(blob.encode()).hexdigest()[:32]


def plan(case_path: str | Path, vary_options: list[str] = (), fineness: float | None = None) -> Sweep:
    """Read the case file, combine its ``[sweep]`` table with the ``--vary`` options (an option for a
    path the table also varies replaces it) and list every variant."""
    case_path = Path(case_path)
    data = parse_toml(read_input_file(case_path, "case file"), "case file", str(case_path))
    table_varied, plots = parse_sweep_table(data.pop("sweep")) if "sweep" in data else ([], [])
    options = [parse_vary_option(v) for v in vary_options]
    by_path = {v.path: v for v in table_varied}
    by_path.update({v.path: v for v in options})
    varied = list(by_path.values())
    if not varied:
        raise InputError("--vary", None, "nothing is varied: give --vary path=values or a [sweep] table with vary")
    count = math.prod(len(v.values) for v in varied)
    if count > MAX_VARIANTS:
        raise InputError("--vary", " ".join(vary_options) or "[sweep]", f"gives {count} variants; at most {MAX_VARIANTS}")
    variants = []
    for i, combo in enumerate(itertools.product(*(v.values for v in varied))):
        d = copy.deepcopy(data)
        for v, value in zip(varied, combo):
            set_field(d, v.path, value, "--vary" if v in options else f"sweep.vary.{v.path}")
        values = {v.path: value for v, value in zip(varied, combo)}
        variants.append(Variant(i, values, d, variant_key(d, case_path.resolve(), fineness)))
    return Sweep(varied, plots or list(DEFAULT_PLOTS), variants)


# ---------------------------------------------------------------------------------------- running
def run_variant(data: dict, case_path: str, fineness: float | None = None) -> dict:
    """One variant, as ``shaftcheck run`` runs a case: the results dictionary and the exit code, or
    the one-line error and its exit code (2 bad input, 3 a solve or a limit stopped it). Runs on a
    Dask worker; returns plain data only."""
    t0 = time.perf_counter()
    try:
        case = parse_case(copy.deepcopy(data))
        case.path = Path(case_path)
        if case.analysis.materials:
            read_table(table_path(case))
        res = build_results(analyse(case, fineness=fineness))
        out = dict(exit_code=int(res.get("exit_code", 0)), error=None, results=res)
    except (InputError, OutOfRangeError) as exc:
        out = dict(exit_code=2, error=f"error: {exc}", results=None)
    except SolveError as exc:
        out = dict(exit_code=3, error=f"solve failed: {exc}", results=None)
    except LimitError as exc:
        out = dict(exit_code=3, error=f"stopped: {exc}", results=None)
    out["seconds"] = time.perf_counter() - t0
    return out


def _cache_file(cache: Path, key: str) -> Path:
    return cache / f"{key}.json"


def load_cached(cache: Path, variant: Variant) -> Record | None:
    p = _cache_file(cache, variant.key)
    try:
        rec = json.loads(p.read_text(encoding="utf-8"))
    except (OSError, ValueError):
        return None
    if not isinstance(rec, dict) or rec.get("key") != variant.key:
        return None
    return Record(variant.index, variant.values, variant.key, int(rec["exit_code"]), rec.get("error"),
                  rec.get("results"), cached=True, seconds=float(rec.get("seconds", 0.0)))


def store(cache: Path, variant: Variant, out: dict) -> Record:
    """Keep a finished variant (written to a temporary name and renamed: a file in the cache is whole)."""
    rec = Record(variant.index, variant.values, variant.key, out["exit_code"], out["error"], out["results"],
                 seconds=out["seconds"])
    cache.mkdir(parents=True, exist_ok=True)
    tmp = cache / f".{variant.key}.{os.getpid()}.tmp"
    tmp.write_text(json.dumps(dict(key=variant.key, values=variant.values, exit_code=rec.exit_code,
                                   error=rec.error, results=rec.results, seconds=rec.seconds)), encoding="utf-8")
    os.replace(tmp, _cache_file(cache, variant.key))
    return rec


def open_client(workers: int, scheduler: str | None):
    """A Dask client: on the cluster at ``scheduler`` (an unreachable address is an InputError naming
    --scheduler), else on a new local cluster of ``workers`` single-threaded worker processes.
    Returns (client, cluster or None)."""
    import dask.config  # noqa: PLC0415  lazy import of a slow optional dependency (Dask, only for sweeps)
    from distributed import Client, LocalCluster  # noqa: PLC0415  lazy import of a slow dependency

    dask.config.set({
        "distributed.worker.daemon": False,
        # for the local cluster's workers (a cluster at --scheduler has its own settings; docs/sweeps.md):
        # the statistical profiler samples the running variant every 10 ms, and a fixed
        # MALLOC_TRIM_THRESHOLD_ (Dask sets one) also switches off glibc's adaptive mmap threshold, so
        # every large array is mapped and unmapped afresh. With both, one worker ran a 40-variant
        # sweep in 54 s against 35 s in one process (a third of its CPU time in the kernel).
        "distributed.worker.profile.enabled": False,
        "distributed.nanny.pre-spawn-environ.MALLOC_TRIM_THRESHOLD_": None,
    })
    logging.getLogger("distributed").setLevel(logging.CRITICAL)  # its own log lines are not our output
    if scheduler:
        if not re.fullmatch(r"(tcp|tls|inproc|ws|wss)://[^\s/]+(:\d+)?/?", scheduler):
            raise InputError("--scheduler", scheduler, "is not a scheduler address such as tcp://host:8786")
        try:
            return Client(scheduler, timeout=CONNECT_TIMEOUT, set_as_default=False), None
        except (OSError, TimeoutError, ValueError) as exc:
            reason = str(exc).splitlines()[0] if str(exc) else type(exc).__name__
            raise InputError("--scheduler", scheduler, f"cannot be reached ({reason[:160]})") from None
    cluster = LocalCluster(n_workers=workers, threads_per_worker=1, processes=True, dashboard_address=None,
                           silence_logs=40)
    return Client(cluster, set_as_default=False), cluster


def run_sweep(sw: Sweep, case_path: str | Path, cache: Path, workers: int = 1, scheduler: str | None = None,
              fineness: float | None = None, progress=None) -> Sweep:
    """Run every variant not already in ``cache``; ``progress(done, total, computed, seconds)`` is
    called after each. ``workers = 0`` runs them one after another in this process (no Dask)."""
    case_path = str(Path(case_path).resolve())
    records: dict[int, Record] = {}
    todo = []
    for v in sw.variants:
        rec = load_cached(cache, v)
        if rec is None:
            todo.append(v)
        else:
            records[v.index] = rec
    t0 = time.perf_counter()
    total = len(sw.variants)

    def done(v, out):
        records[v.index] = store(cache, v, out)
        if progress:
            progress(len(records), total, len(records) - (total - len(todo)), time.perf_counter() - t0)

    local = workers == 0 and not scheduler
    client, cluster = open_client(workers, scheduler) if todo and not local else (None, None)
    try:
        if progress:
            progress(len(records), total, 0, 0.0)
        if local:
            for v in todo:
                done(v, run_variant(v.data, case_path, fineness))
        elif todo:
            from distributed import as_completed  # noqa: PLC0415  lazy import of a slow optional dependency

            futures = {client.submit(run_variant, v.data, case_path, fineness, key=f"shaftcheck-{v.key}",
                                     pure=False): v for v in todo}
            try:
                for fut in as_completed(futures, loop=client.loop):
                    done(futures[fut], fut.result())
            except RuntimeError as exc:
                if not scheduler:
                    raise
                # e.g. the scheduler cannot unpickle the task: shaftcheck is missing from its environment
                reason = str(exc).splitlines()[0] if str(exc) else type(exc).__name__
                raise InputError("--scheduler", scheduler, f"the cluster could not run the variants ({reason[:160]}; "
                                 "are the scheduler and every worker running this shaftcheck?)") from None
    finally:
        if client is not None:
            client.close()
        if cluster is not None:
            cluster.close()
    sw.records = [records[v.index] for v in sw.variants]
    return sw


# ---------------------------------------------------------------------------------------- rows
def lookup(results: dict | None, path: str):
    node = results
    for part in path.split("."):
        if not isinstance(node, dict) or part not in node:
            return None
        node = node[part]
    return node


def number_of(value) -> float | None:
    """The number of a value as written (``"0.4 mm"`` -> 0.4), for plotting against it."""
    if isinstance(value, bool):
        return None
    if isinstance(value, (int, float)):
        return float(value)
    m = _NUMBER.match(str(value))
    return float(m.group(1)) if m else None


def rows(sw: Sweep) -> list[dict]:
    """One flat row per variant: the varied values as written, the results of :data:`COLUMNS`, the
    plotted results, the number of warnings, the exit code and the error line."""
    out = []
    for rec in sw.records:
        row = {"variant": rec.index}
        row.update({p: (v if isinstance(v, str) else float(v)) for p, v in rec.values.items()})
        for col, path in COLUMNS.items():
            row[col] = lookup(rec.results, path)
        for p in sw.plots:
            if p not in COLUMNS.values():
                row[p] = lookup(rec.results, p)
        row["warnings"] = len(rec.results.get("warnings", [])) if rec.results else None
        row["exit_code"] = rec.exit_code
        row["error"] = rec.error
        row["input_hash"] = rec.key
        out.append(row)
    return out
