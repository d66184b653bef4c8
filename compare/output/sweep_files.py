"""The files of a sweep: ``sweep.csv`` and ``sweep.parquet`` (one row per variant), ``sweep.png`` and
``sweep.svg`` (each chosen result against the varied field) and ``sweep.html`` (a short page of them).
Text and bytes only: the command line writes them through ``write_outputs``."""
from __future__ import annotations

import csv
import html
import io
import math

from .report import CAUTION

SWEEP_CAUTION = ("Each row is a separate run with its own accuracy evidence and warnings. A row with a "
                 "non-zero exit code has no verdict the numbers support (2 bad input, 3 accuracy not shown "
                 "or a solve stopped, 4 no verdict: read its warnings in a single run of that variant).")


def _cell(v):
    if v is None:
        return ""
    if isinstance(v, float):
        return repr(v)
    return str(v)


def csv_text(rows: list[dict]) -> str:
    cols = _columns(rows)
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(cols)
    for r in rows:
        w.writerow([_cell(r.get(c)) for c in cols])
    return buf.getvalue()


def _columns(rows: list[dict]) -> list[str]:
    cols: list[str] = []
    for r in rows:
        cols.extend(c for c in r if c not in cols)
    return cols


def parquet_bytes(rows: list[dict]) -> bytes:
    import pyarrow as pa  # noqa: PLC0415  lazy import of a slow dependency: only sweeps write parquet
    import pyarrow.parquet as pq  # noqa: PLC0415  lazy import of a slow dependency

    cols = _columns(rows)
    arrays = {}
    for c in cols:
        vals = [r.get(c) for r in rows]
        kinds = {type(v) for v in vals if v is not None}
        if kinds <= {int, float} and float in kinds:
            vals = [None if v is None else float(v) for v in vals]
        elif len(kinds) > 1:
            vals = [None if v is None else str(v) for v in vals]
        arrays[c] = pa.array(vals)
    sink = pa.BufferOutputStream()
    pq.write_table(pa.table(arrays), sink)
    return sink.getvalue().to_pybytes()


def figures(rows: list[dict], varied: list[str], plots: list[str], x_numbers: list) -> tuple[bytes, str]:
    """One panel per plotted result against the first varied field (its number as written); with
    several varied fields, one line per combination of the others. Variants without a value (failed,
    or the result does not apply) are left out. Returns (PNG bytes, SVG text)."""
    import matplotlib  # noqa: PLC0415  lazy import of a slow dependency

    matplotlib.use("Agg")
    import matplotlib.pyplot as plt  # noqa: PLC0415  lazy import of a slow dependency

    n = max(len(plots), 1)
    fig, axes = plt.subplots(n, 1, figsize=(6.4, 2.6 * n), squeeze=False)
    first, others = varied[0], varied[1:]
    for ax, key in zip(axes[:, 0], plots):
        groups: dict = {}
        for r, x in zip(rows, x_numbers):
            y = r.get(key)
            if x is None or not isinstance(y, (int, float)) or isinstance(y, bool) or not math.isfinite(y):
                continue
            label = ", ".join(f"{o} = {r.get(o)}" for o in others)
            groups.setdefault(label, []).append((x, y))
        for label, pts in groups.items():
            pts.sort()
            ax.plot([p[0] for p in pts], [p[1] for p in pts], "o-", label=label or None)
        ax.set_ylabel(key)
        ax.grid(True, alpha=0.3)
        if any(groups) and len(groups) > 1:
            ax.legend(fontsize="small")
        if not groups:
            ax.text(0.5, 0.5, "no variant has this result", transform=ax.transAxes, ha="center")
    axes[-1, 0].set_xlabel(first)
    fig.tight_layout()
    png, svg = io.BytesIO(), io.StringIO()
    fig.savefig(png, format="png", dpi=110)
    fig.savefig(svg, format="svg")
    plt.close(fig)
    return png.getvalue(), svg.getvalue()


def html_page(title: str, rows: list[dict], varied: list[str], plots: list[str]) -> str:
    e = html.escape
    failed = [r for r in rows if r.get("error")]
    shown = ["variant", *varied, *plots, "warnings", "exit_code"]
    head = "".join(f"<th>{e(c)}</th>" for c in shown)
    body = []
    for r in rows:
        cls = ' class="bad"' if r.get("exit_code") else ""
        cells = "".join(f"<td>{e(_fmt(r.get(c)))}</td>" for c in shown)
        body.append(f"<tr{cls}>{cells}</tr>")
    fails = "".join(f"<li>variant {r['variant']}: {e(str(r['error']))}</li>" for r in failed)
    return f"""<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>{e(title)} — sweep</title>
<style>body{{font-family:sans-serif;max-width:60em;margin:1em auto}}td,th{{padding:2px 8px;text-align:right}}
tr.bad{{background:#fdd}}.caution{{border:1px solid #c90;padding:.5em;background:#ffe}}</style></head>
<body><h1>{e(title)}: sweep of {e(", ".join(varied))}</h1>
<p class="caution">{e(CAUTION)}</p><p class="caution">{e(SWEEP_CAUTION)}</p>
<p>{len(rows)} variants, {len(failed)} without results. All rows: sweep.csv, sweep.parquet.</p>
<img src="sweep.svg" alt="results against {e(varied[0])}">
{f"<h2>Variants without results</h2><ul>{fails}</ul>" if failed else ""}
<table><tr>{head}</tr>
{chr(10).join(body)}
</table></body></html>
"""


def _fmt(v) -> str:
    if v is None:
        return "—"
    if isinstance(v, float):
        return f"{v:.6g}"
    return str(v)


def sweep_files(title: str, rows: list[dict], varied: list[str], plots: list[str], x_numbers: list) -> dict:
    """Every file of a sweep, name -> text or bytes."""
    png, svg = figures(rows, varied, plots, x_numbers)
    return {"sweep.csv": csv_text(rows), "sweep.parquet": parquet_bytes(rows), "sweep.png": png,
            "sweep.svg": svg, "sweep.html": html_page(title, rows, varied, plots)}
