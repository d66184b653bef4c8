"""The import graph of the project, read from the source with ``ast`` (nothing is imported).

Rules (DEVELOPERS.md, 'Layout'): inside ``compare/`` imports run one way only, down the flow of a
case — api → cli → output → pipeline → checks → pairs → solve → case; ``fem/`` and ``classic/``
sit below all of them and never import ``compare/`` or each other. No import circle anywhere, and no
import inside a function in ``compare/`` unless its line says it is a lazy import of a slow
dependency. Only ``output/`` and ``cli/`` print.
"""
from __future__ import annotations

import ast
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
PACKAGES = ("compare", "fem", "classic")

#: Rank of each room of compare/: a module may import modules of its own rank or lower.
RANKS = {
    "compare._version": 0,
    "compare.case": 1,
    "compare.solve": 2,
    "compare.pairs": 3,
    "compare.checks": 4,
    "compare.pipeline": 5,
    "compare.output": 6,
    "compare.sweep": 6,  # runs whole cases (pipeline, results) on Dask; below cli/ which calls it
    "compare.cli": 7,
    "compare.api": 8,
    "compare": 8,  # the package itself re-exports the API
}


def module_files() -> dict[str, Path]:
    out = {}
    for pkg in PACKAGES:
        for p in sorted((ROOT / pkg).rglob("*.py")):
            parts = list(p.relative_to(ROOT).with_suffix("").parts)
            if parts[-1] == "__init__":
                parts = parts[:-1]
            out[".".join(parts)] = p
    return out


def _is_package(name: str, files: dict[str, Path]) -> bool:
    return name in files and files[name].name == "__init__.py"


def _resolve(module: str, node: ast.ImportFrom, files) -> str:
    if node.level == 0:
        return node.module or ""
    base = module.split(".")
    if not _is_package(module, files):
        base = base[:-1]
    base = base[: len(base) - (node.level - 1)]
    return ".".join(base + ([node.module] if node.module else []))


def imports_of(module: str, path: Path, files) -> list[tuple[str, int, bool, str]]:
    """(imported module, line, inside a function, source line) for every import of the project's
    own packages in the file; ``from pkg import sub`` counts as an import of the submodule."""
    tree = ast.parse(path.read_text(encoding="utf-8"))
    lines = path.read_text(encoding="utf-8").splitlines()
    found = []

    def visit(node, in_func):
        for child in ast.iter_child_nodes(node):
            inner = in_func or isinstance(child, (ast.FunctionDef, ast.AsyncFunctionDef, ast.Lambda))
            targets = []
            if isinstance(child, ast.Import):
                targets = [a.name for a in child.names]
            elif isinstance(child, ast.ImportFrom):
                base = _resolve(module, child, files)
                subs = [f"{base}.{a.name}" for a in child.names if f"{base}.{a.name}" in files]
                targets = subs if subs and len(subs) == len(child.names) else [base] + subs
            for t in targets:
                found.append((t, child.lineno, in_func, lines[child.lineno - 1]))
            visit(child, inner)

    visit(tree, False)
    return found


def project_graph():
    files = module_files()
    edges: dict[str, set[str]] = {m: set() for m in files}
    func_level = []
    for m, p in files.items():
        for target, line, in_func, text in imports_of(m, p, files):
            if in_func and m.startswith("compare"):
                func_level.append((m, line, text.strip()))
            top = target.split(".")[0]
            if top not in PACKAGES:
                continue
            # the nearest project module that exists (``import fem.mesh`` → fem.mesh)
            while target and target not in files:
                target = target.rpartition(".")[0]
            if target and target != m:
                edges[m].add(target)
    return files, edges, func_level


def rank(module: str) -> int | None:
    best = None
    for prefix, r in RANKS.items():
        if module == prefix or module.startswith(prefix + "."):
            if best is None or len(prefix) > len(best[0]):
                best = (prefix, r)
    return None if best is None else best[1]


def find_cycles(edges: dict[str, set[str]]) -> list[list[str]]:
    """Strongly connected components with more than one module (Tarjan), each a circle."""
    index, low, on, stack, out = {}, {}, set(), [], []
    counter = [0]

    def strong(v):
        index[v] = low[v] = counter[0]
        counter[0] += 1
        stack.append(v)
        on.add(v)
        for w in edges.get(v, ()):
            if w not in index:
                strong(w)
                low[v] = min(low[v], low[w])
            elif w in on:
                low[v] = min(low[v], index[w])
        if low[v] == index[v]:
            comp = []
            while True:
                w = stack.pop()
                on.discard(w)
                comp.append(w)
                if w == v:
                    break
            if len(comp) > 1:
                out.append(sorted(comp))

    for v in sorted(edges):
        if v not in index:
            strong(v)
    return out


def direction_violations(edges) -> list[str]:
    bad = []
    for m, targets in edges.items():
        top = m.split(".")[0]
        for t in targets:
            ttop = t.split(".")[0]
            if top in ("fem", "classic") and ttop != top:
                bad.append(f"{m} imports {t}: {top}/ imports neither compare/ nor {'classic' if top == 'fem' else 'fem'}/")
            elif top == "compare" and ttop == "compare":
                rm, rt = rank(m), rank(t)
                if rm is None or rt is None:
                    bad.append(f"{m} or {t} is in no room of the layout (add it to RANKS and DEVELOPERS.md)")
                elif rt > rm:
                    bad.append(f"{m} imports {t}: against the flow (a room imports only the rooms below it)")
    return sorted(bad)


@pytest.fixture(scope="module")
def graph():
    return project_graph()


def test_the_walker_sees_the_known_imports(graph):
    """Guard against a walker that finds nothing: a few imports that are known to be in the source."""
    files, edges, _ = graph
    assert "compare.case.case" in edges["compare.pairs.analysis"]
    assert "compare.checks.step" in edges["compare.pipeline"]
    assert "compare.cli.cmd_run" in edges["compare.cli.main"]  # ``from . import cmd_run``
    assert "fem.errors" in edges["compare.case.case"]
    assert sum(len(v) for v in edges.values()) > 50


def test_no_import_circle(graph):
    _, edges, _ = graph
    assert find_cycles(edges) == []


def test_imports_run_down_the_flow(graph):
    _, edges, _ = graph
    assert direction_violations(edges) == []


def test_every_compare_module_has_a_room(graph):
    files, _, _ = graph
    assert [m for m in files if m.startswith("compare") and rank(m) is None] == []


def test_no_function_level_imports_in_compare(graph):
    _, _, func_level = graph
    bad = [f"{m}:{line}: {text}" for m, line, text in func_level if "lazy import" not in text]
    assert bad == []


def test_only_output_and_cli_print():
    """Checks return numbers and records; only output/ and cli/ write text for the user."""
    bad = []
    for p in sorted((ROOT / "compare").rglob("*.py")):
        rel = p.relative_to(ROOT / "compare").parts
        if rel[0] in ("output", "cli"):
            continue
        for node in ast.walk(ast.parse(p.read_text(encoding="utf-8"))):
            if isinstance(node, ast.Call) and isinstance(node.func, ast.Name) and node.func.id == "print":
                bad.append(f"{p.relative_to(ROOT)}:{node.lineno}")
    assert bad == []


def test_the_checks_catch_a_circle_and_a_wrong_direction():
    """The detectors themselves, on a made-up graph with one circle and one upward import."""
    edges = {"compare.checks.a": {"compare.checks.b"}, "compare.checks.b": {"compare.checks.a"},
             "compare.solve.x": {"compare.output.report"}, "compare.output.report": set(),
             "fem.mesh": {"compare.case.case"}, "compare.case.case": set()}
    assert find_cycles(edges) == [["compare.checks.a", "compare.checks.b"]]
    bad = direction_violations(edges)
    assert len(bad) == 2
    assert any(b.startswith("compare.solve.x imports compare.output.report") for b in bad)
    assert any(b.startswith("fem.mesh imports compare.case.case") for b in bad)
