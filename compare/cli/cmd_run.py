"""``shaftcheck run CASE.toml [--out DIR]``: analyse one case, print the summary, write results."""
from __future__ import annotations

import gc
import json
import math
import os
import secrets
import shutil
import time
from contextlib import contextmanager
from pathlib import Path

from fem.errors import InputError

try:
    import fcntl
except ImportError:  # not POSIX: outputs are moved in without a lock (see _locked)
    fcntl = None

from ..case.case import load_case
from ..checks.materials import read_table, table_path
from ..output.design_report import report_files
from ..output.screen import print_summary, progress_bar
from ..output.report import summary
from ..output.results import build_results
from ..output.figure_shaft import shaft_figure_svg
from ..output.report_composite import composite_report_files
from ..output.results_composite import composite_summary
from ..output.results_segment import segment_summary
from ..output.vtu import composite_vtu_bytes, layout_segment_vtu_bytes, segment_vtu_bytes
from ..output.report_checklist import checklist_summary
from ..output.results_shaft import shaft_summary
from ..output.vtu import write_fields_vtu
from ..pipeline import analyse
from ..case.case import check_fineness
from .interrupt import Interrupted, held


def register(sub) -> None:
    p = sub.add_parser("run", help="analyse one case file")
    p.add_argument("case", help="case file (TOML)")
    p.add_argument("--out", default=None, help="output folder for results.json and section.vtu (default: out/<case name>)")
    p.add_argument("--fineness", default=None, help="override analysis.fineness (mesh density)")
    p.add_argument("--no-vtu", action="store_true", help="do not write the VTU file")
    p.add_argument("--quiet", action="store_true", help="print nothing on success (and no progress bar)")
    p.add_argument("--no-report", action="store_true",
                   help="do not write report.html, results.csv and figures/")
    p.add_argument("--verbose", action="store_true", help="print every detail instead of the one-screen summary")
    p.set_defaults(func=run)


def run(args) -> int:
    case = load_case(args.case)
    fineness = option_number("--fineness", args.fineness)
    if fineness is not None:
        fineness = check_fineness("--fineness", fineness, as_written=args.fineness)
    if case.analysis.materials:  # a bad material table is refused before the long solve, not after it
        read_table(table_path(case))
    out = Path(args.out) if args.out else Path("out") / Path(args.case).stem
    check_out(out)  # before the work, not after it
    with progress_bar(quiet=args.quiet):
        a = analyse(case, fineness=fineness)
    res = build_results(a)
    files = {"results.json": json.dumps(res, indent=2, ensure_ascii=False) + "\n"}
    vtu = not args.no_vtu and a.mesh is not None  # no section mesh when only feature factors were asked for
    layout = "shaft" in a.extra and bool(res.get("section_loads"))
    composite = "composite" in a.extra  # bonded regions of several materials: their own report
    if "segment" in a.extra and not args.no_vtu:  # the 3-D segment's surface stresses
        files["segment.vtu"] = segment_vtu_bytes(a)
    elif (a.extra.get("shaft") or {}).get("segments") and not args.no_vtu:  # a layout's 3-D station features
        files["segment.vtu"] = layout_segment_vtu_bytes(a)
    if composite and not args.no_vtu:  # the composite section's regions and stresses (cell data)
        files["section.vtu"] = composite_vtu_bytes(a)
    segment = "segment" in a.extra  # a 3-D segment study: its own report
    report = not args.no_report and (a.mesh is not None or composite or segment)
    if report:  # a layout whose governing station is composite gets the layout report
        # the analysis's objects outlive the report: frozen while it is drawn, the cyclic garbage
        # collector does not walk them on each full collection among the figures' many small objects
        # (thawed after, so that a caller running several cases in one process loses nothing)
        gc.freeze()
        try:
            if segment:
                from ..output.report_segment import segment_report_files  # noqa: PLC0415  lazy import of a slow dependency (matplotlib through report_html's figures), only when a report is drawn
            files.update(composite_report_files(a, res) if composite and not layout else
                         segment_report_files(a, res) if segment else report_files(a, res))
        finally:
            gc.unfreeze()
    if (res.get("shaft") or {}).get("diagrams"):  # the layout's diagrams (the report's, when it drew them)
        files["shaft.svg"] = files.get("figures/shaft_diagrams.svg") or shaft_figure_svg(res, case.units)
    write_outputs(out, files, a if vtu else None)
    if not args.quiet:
        written = [out / "results.json"] + ([out / "section.vtu"] if vtu or "section.vtu" in files else [])
        if "segment.vtu" in files:
            written.append(out / "segment.vtu")
        if "shaft.svg" in files:
            written.append(out / "shaft.svg")
        if report:
            written += [out / "report.html", out / "results.csv", out / "figures"]
        block = "\n".join(b for b in (shaft_summary(res, case.units), checklist_summary(res, case.units)) if b)
        if block:
            print(block + "\n")
        if "segment" in a.extra:  # a 3-D segment study
            print(segment_summary(res, case.units))
            print("\nwritten: " + ", ".join(str(w) for w in written))
        elif composite:  # bonded regions of several materials (a layout's governing station, too)
            print(composite_summary(res, case.units))
            print("\nwritten: " + ", ".join(str(w) for w in written))
        elif a.mesh is None:  # factors only: the shaft block above is the whole answer
            print(summary(res, case.units))
            print("\nwritten: " + ", ".join(str(w) for w in written))
        else:
            print_summary(res, case.units, written, verbose=args.verbose)
    return res.get("exit_code", 0)


def option_number(name: str, text: str | None) -> float | None:
    """A number given on the command line, finite; a word, NaN or infinity is an InputError naming
    the option and echoing what was typed."""
    if text is None:
        return None
    try:
        v = float(text)
    except ValueError:
        raise InputError(name, text, "must be a number") from None
    if not math.isfinite(v):
        raise InputError(name, text, "must be a finite number")
    return v


# The names shaftcheck writes into an output folder. A folder holding only these (as plain files) is
# taken to be an earlier output and is replaced as a whole; anything else in it stops the run (exit 2).
OUTPUT_NAMES = frozenset({"results.json", "section.vtu", "segment.vtu", "verify.json", "report.html", "results.csv", "shaft.svg",
                          "sweep.csv", "sweep.parquet", "sweep.png", "sweep.svg", "sweep.html"})
# the one sub-folder shaftcheck writes, and what it may hold
FIGURES, FIGURE_SUFFIXES = "figures", (".png", ".svg")

# Test-only hook: seconds to pause after the results are written to the temporary folder and before
# they are moved into place, so a test can send a signal or start a second run at that moment.
PAUSE_ENV = "SHAFTCHECK_TEST_PAUSE_IN_WRITE"


def _target(out: Path) -> Path:
    """The folder actually replaced: a symbolic link to a folder is followed."""
    return Path(os.path.realpath(out)) if os.path.islink(out) else out


def check_out(out: Path, label: str | None = None) -> None:
    """Refuse an output folder that cannot be written or must not be replaced, before any work is done.

    Raises :class:`fem.errors.InputError` naming ``--out`` for: a name too long for the file system; a
    path that exists and is not a folder; a read-only folder (the output folder or the one it would be
    made in); the current folder or one of its parents; an existing folder holding anything but
    shaftcheck's own output files (:data:`OUTPUT_NAMES`), a sub-folder called ``results.json``
    included.
    """
    out = Path(out)
    label = str(out) if label is None else label

    def bad(reason):
        return InputError("--out", label, reason)

    try:
        lock = Path(os.path.abspath(_target(out))).parent
        while not os.path.isdir(lock) and lock.parent != lock:
            lock = lock.parent
        with _locked(lock):  # the lock under which outputs are moved in: no half-swapped folder is seen
            _check_out(out, bad)
    except OSError as exc:
        raise bad(f"cannot be used ({exc.strerror or exc})") from None


def _check_out(out: Path, bad) -> None:
    if os.path.islink(out) and not os.path.exists(out):
        raise bad("is a broken symbolic link")
    full = Path(os.path.abspath(_target(out)))
    # the nearest existing folder on the way, and the names still to be made below it
    base, missing = full, []
    while not os.path.lexists(base):
        missing.append(base.name)
        base = base.parent
    try:
        name_max = os.pathconf(base, "PC_NAME_MAX")
        path_max = os.pathconf(base, "PC_PATH_MAX")
    except (OSError, ValueError, AttributeError):
        name_max, path_max = 255, 4096
    for name in missing:
        n = len(os.fsencode(name))
        if n > name_max:
            raise bad(f"a name of {n} bytes is too long for the file system (at most {name_max})")
    n = len(os.fsencode(str(full / "results.json")))
    if n > path_max:
        raise bad(f"the path is too long for the file system ({n} bytes with the file name; at most {path_max})")
    if not missing and not full.is_dir():
        raise bad("exists and is not a folder")
    if not base.is_dir():
        raise bad(f"{str(base)!r} is not a folder")
    if full.parent == full or Path(os.getcwd()).resolve().is_relative_to(full.resolve()):
        raise bad("is the current folder or one of its parents; give a folder of its own")
    writable = base if missing else full.parent
    if not os.access(writable, os.W_OK | os.X_OK):
        raise bad(f"cannot be written: the folder {str(writable)!r} is read-only")
    if not missing:
        if not os.access(full, os.W_OK | os.X_OK):
            raise bad("is a read-only folder")
        _check_only_ours(full, bad)


def _check_only_ours(folder: Path, bad) -> None:
    try:
        entries = sorted(os.scandir(folder), key=lambda e: e.name)
    except OSError as exc:
        raise bad(f"cannot be read ({exc.strerror})") from None
    for e in entries:
        if e.name == FIGURES and e.is_dir(follow_symlinks=False):
            _check_figures(Path(e.path), bad)
            continue
        if e.name not in OUTPUT_NAMES:
            raise bad(f"holds {e.name!r}, which shaftcheck did not write; an existing output folder is "
                      "replaced as a whole, so give a new or empty folder")
        if not e.is_file(follow_symlinks=False):
            raise bad(f"holds {e.name!r}, which is not a plain file; remove it or give a new folder")


def _check_figures(folder: Path, bad) -> None:
    try:
        entries = sorted(os.scandir(folder), key=lambda e: e.name)
    except OSError as exc:
        raise bad(f"cannot be read ({exc.strerror})") from None
    for e in entries:
        if not e.name.endswith(FIGURE_SUFFIXES) or not e.is_file(follow_symlinks=False):
            raise bad(f"holds {FIGURES}/{e.name!r}, which shaftcheck did not write; an existing output folder is "
                      "replaced as a whole, so give a new or empty folder")


def write_outputs(out: Path, files: dict[str, str | bytes], analysis=None) -> None:
    """Write ``files`` (and ``section.vtu`` from ``analysis``) as the whole content of the folder ``out``.

    Everything is written into a hidden temporary folder beside ``out`` first, then moved into place
    under a lock on the parent folder: an earlier output there is replaced as a whole, never merged.
    Failure or interruption (SIGINT, SIGTERM) leaves ``out`` as it was, or whole with the new results
    if the signal came while they were being moved in, and no temporary folder behind. Two runs
    writing to one ``out`` at once leave the complete output of one of them.
    """
    out = Path(out)
    check_out(out)
    target = _target(out)
    parent = target.parent if str(target.parent) else Path(".")
    tmp, made, done = None, [], False

    def cleanup():
        if tmp is not None:
            shutil.rmtree(tmp, ignore_errors=True)
        if not done:
            for d in reversed(made):  # folders made for this run, innermost first, if still empty
                try:
                    d.rmdir()
                except OSError:
                    break

    try:
        with held():
            made = _make_folders(parent)
            tmp = _fresh_folder(parent, ".shaftcheck-")
        for name, content in files.items():  # names may hold one sub-folder (figures/...)
            path = tmp / name
            path.parent.mkdir(exist_ok=True)
            if isinstance(content, bytes):
                path.write_bytes(content)
            else:
                path.write_text(content, encoding="utf-8")
        if analysis is not None:
            write_fields_vtu(tmp / "section.vtu", analysis)
        pause = os.environ.get(PAUSE_ENV)
        if pause:
            time.sleep(float(pause))
        with held():
            _move_in(tmp, target, lambda reason: InputError("--out", str(out), reason))
            tmp, done = None, True
    except OSError as exc:
        raise InputError("--out", str(out), f"cannot be written ({exc.strerror or exc})") from None
    finally:
        try:
            with held():
                cleanup()
        except Interrupted:
            cleanup()
            raise


def _make_folders(folder: Path) -> list[Path]:
    """Make ``folder`` and its missing parents; return the ones made, outermost first."""
    missing = []
    while not os.path.lexists(folder):
        missing.append(folder)
        folder = folder.parent
    made = []
    for d in reversed(missing):
        try:
            d.mkdir()
        except FileExistsError:  # made meanwhile by another run
            if not d.is_dir():
                raise
            continue
        made.append(d)
    return made


def _fresh_folder(parent: Path, prefix: str) -> Path:
    """A new empty folder with a unique hidden name (made with the usual permissions, unlike mkdtemp)."""
    for _ in range(100):
        d = parent / f"{prefix}{secrets.token_hex(6)}"
        try:
            d.mkdir()
            return d
        except FileExistsError:
            continue
    raise FileExistsError(f"no free temporary name in {parent}")


def _move_in(tmp: Path, target: Path, bad) -> None:
    """Put the folder ``tmp`` at ``target``, replacing an earlier output there, under a lock."""
    parent = target.parent if str(target.parent) else Path(".")
    with _locked(parent):
        if not os.path.lexists(target):
            os.rename(tmp, target)
            return
        if not target.is_dir() or target.is_symlink():
            raise bad("exists and is not a folder")
        _check_only_ours(target, bad)  # again: another program may have written there meanwhile
        old = _fresh_folder(parent, ".shaftcheck-old-")
        os.rename(target, old)  # onto an empty folder: replaces it
        try:
            os.rename(tmp, target)
        except OSError:
            os.rename(old, target)
            raise
        shutil.rmtree(old, ignore_errors=True)


@contextmanager
def _locked(folder: Path):
    """An exclusive lock on ``folder`` (flock on the folder itself: no lock file is left behind).

    Where there is no such lock (not POSIX, a file system without locks, a folder that cannot be
    opened), the block runs unlocked: concurrent runs are then not kept apart."""
    try:
        if fcntl is None:
            raise OSError("no flock here")
        fd = os.open(folder, os.O_RDONLY)
    except OSError:
        yield
        return
    try:
        try:
            fcntl.flock(fd, fcntl.LOCK_EX)
        except OSError:  # no locks on this file system
            pass
        yield
    finally:
        os.close(fd)  # releases the lock

