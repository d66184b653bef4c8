"""The one-screen terminal summary and the progress bar of ``shaftcheck run``.

The summary leads with the designer's question — does the section pass, where, by how much, how
sure is the number — then one compact table and the files written. On a terminal it is drawn with
``rich``; otherwise (a pipe, a file, a test) it is plain text. ``--verbose`` prints the full detail
of :func:`compare.output.report.summary` instead."""
from __future__ import annotations

import sys
from contextlib import contextmanager


from ..solve.progress import listening
from .headline import headline_rows
from .report import CAUTION, summary

#: the groups of the compact table, in order
GROUPS = ("section", "torsion", "shear", "combined", "static", "fatigue", "governing", "accuracy")
_SHOWN = {"section.Ixy", "combined.sigma1_max"}  # rows left to --verbose and the CSV


def _v(v, digits=5) -> str:
    return "—" if v is None else f"{v:.{digits}g}"


def headline(res: dict, system) -> list[str]:
    """The lines that answer the question first: warnings, then the verdict and how sure it is."""
    out = [f"shaftcheck {res['tool']['version']} — {res['case']['title']}"]
    for w in res.get("warnings", []):
        out.append(f"WARNING: {w['text']}")
    gov = res.get("governing")
    if gov and gov.get("no_verdict") and gov.get("reason_text"):  # not a corner (a 3-D study short of its target)
        out.append(f"VERDICT: none — {gov['reason_text'].removeprefix('no verdict: ')}; no factor of safety governs "
                   "(the factors in the table are estimates, not a verdict)")
    elif gov and gov.get("no_verdict"):
        out.append("VERDICT: none — a sharp re-entrant corner leaves the stress unbounded; no factor of safety governs "
                   "(factors in the table are for the rest of the section only)")
    elif gov:
        nd = gov.get("design_factor")
        if nd is None:
            word = "no design factor given"
        else:
            word = "PASSES" if gov["factor"] >= nd else "DOES NOT PASS"
            word += f" the design factor {nd:g} (margin n/nd = {gov['factor'] / nd:.3g})"
            if gov.get("verdict_supported") is False:  # compare/output/results.py UNSUPPORTED_PASS
                word = (f"NOT SHOWN — n = {gov['factor']:.3g} is above the design factor {nd:g}, but the warnings "
                        "above say the numbers cannot support a pass")
        out.append(f"VERDICT: {word}")
        out.append(f"  lowest {gov['text']}")
    else:
        out.append("VERDICT: no factor of safety (no strengths given)")
    acc = res.get("accuracy")
    seg = ((res.get("static") or {}).get("fe_local") or (res.get("fatigue") or {}).get("fe_local") or {})
    three_d = "accuracy_met" in seg  # a station with a 3-D feature (compare/checks/segment_local.py)
    if acc:
        if acc.get("met"):
            out.append(f"  accuracy: within {100 * acc['achieved']:.2g} % (target {100 * acc['target']:.3g} %, three-mesh study"
                       + (" of the 2-D section; the 3-D feature's study: "
                          + ("within the target" if seg["accuracy_met"] else "NOT SHOWN") if three_d else "") + ")")
        else:
            out.append(f"  accuracy: NOT SHOWN within the target {100 * acc['target']:.3g} % — see --verbose")
    return out


def table_rows(res: dict, system) -> list[tuple]:
    rows = []
    for r in headline_rows(res, system):
        if r["results_json_key"] in _SHOWN or r["group"] == "accuracy":
            continue
        unit = f" {r['unit']}" if r["unit"] and r["unit"] != "1" else ""
        err = "" if r["estimated_error"] is None else f"{100 * r['estimated_error']:.2g} %"
        rows.append((r["group"], r["quantity"], _v(r["value"]) + unit,
                     "" if r["hand_value"] is None else _v(r["hand_value"]) + unit,
                     "" if r["ratio"] is None else f"{r['ratio']:.4g}", err))
    return rows


def plain_summary(res: dict, system, written=()) -> str:
    """The one-screen summary as plain text (what a pipe or a file gets)."""
    lines = headline(res, system) + [""]
    head = ("", "quantity", "FE", "hand", "ratio", "error est.")
    rows = table_rows(res, system)
    w = [max(len(str(x[i])) for x in [head, *rows]) for i in range(6)]
    lines.append("  ".join(str(h).ljust(w[i]) for i, h in enumerate(head)).rstrip())
    last = None
    for r in rows:
        g = r[0] if r[0] != last else ""
        last = r[0]
        lines.append("  ".join(str(c).ljust(w[i]) if i < 2 else str(c).rjust(w[i]) for i, c in
                               enumerate((g, *r[1:]))).rstrip())
    if written:
        lines += ["", "written: " + ", ".join(str(p) for p in written)]
    lines += ["", "Caution: " + CAUTION]
    return "\n".join(lines)


def print_summary(res: dict, system, written=(), verbose: bool = False, file=None) -> None:
    file = file or sys.stdout
    if verbose:
        print(summary(res, system), file=file)
        if written:
            print("\nwritten: " + ", ".join(str(p) for p in written), file=file)
        return
    if not file.isatty():
        print(plain_summary(res, system, written), file=file)
        return
    from rich.console import Console  # noqa: PLC0415  lazy import of a slow dependency: rich only when drawing on a terminal
    from rich.table import Table  # noqa: PLC0415  lazy import of a slow dependency (rich)

    con = Console(file=file, highlight=False)
    for i, line in enumerate(headline(res, system)):
        style = "bold red" if line.startswith(("WARNING", "VERDICT: none", "VERDICT: DOES")) else (
            "bold" if i == 0 or line.startswith("VERDICT") else None)
        con.print(line, style=style, markup=False)
    t = Table(show_edge=False, box=None, pad_edge=False, header_style="bold")
    for name, just in (("", "left"), ("quantity", "left"), ("FE", "right"), ("hand", "right"), ("ratio", "right"),
                       ("error est.", "right")):
        t.add_column(name, justify=just)
    last = None
    for r in table_rows(res, system):
        t.add_row(*(r[0] if r[0] != last else "", *r[1:]))
        last = r[0]
    con.print(t)
    if written:
        con.print("written: " + ", ".join(str(p) for p in written), markup=False)
    con.print("Caution: " + CAUTION, style="dim", markup=False)


@contextmanager
def progress_bar(quiet: bool = False, stream=None):
    """A progress display on stderr while the block runs (meshes solved so far); nothing when
    ``quiet`` or when stderr is not a terminal."""
    stream = stream or sys.stderr
    if quiet or not stream.isatty():
        yield
        return
    from rich.console import Console  # noqa: PLC0415  lazy import of a slow dependency: rich only when drawing on a terminal
    from rich.progress import (  # noqa: PLC0415  lazy import of a slow dependency (rich)
        BarColumn, Progress, SpinnerColumn, TextColumn, TimeElapsedColumn)

    con = Console(file=stream)
    with Progress(SpinnerColumn(), TextColumn("{task.description}"), BarColumn(), TextColumn("{task.completed} meshes"),
                  TimeElapsedColumn(), console=con, transient=True) as prog:
        task = prog.add_task("solving and refining", total=None)
        with listening(lambda what: prog.advance(task)):
            yield
