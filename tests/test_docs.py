"""The documentation (README.md and docs/*.md) against the tool, so the pages cannot drift from it:
every complete case example parses as a case file does, the Python API walk-through runs, every link
between the pages reaches an existing page and heading, every error message shown on the
troubleshooting page is what the command line prints today, and README stays short. What is checked
here is the documentation itself; the numbers the tool computes are checked against published sources
elsewhere (docs/method.md lists where)."""
import contextlib
import io
import re
import tomllib
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parents[1]
DOCS = ROOT / "docs"
PAGES = sorted(DOCS.glob("*.md"))
FENCE = re.compile(r"^( *)```(\w*)\n(.*?)^\1```", re.S | re.M)


def blocks(page: Path, lang: str) -> list[str]:
    out = []
    for m in FENCE.finditer(page.read_text(encoding="utf-8")):
        if m.group(2) == lang:
            indent = len(m.group(1))
            out.append("\n".join(line[indent:] for line in m.group(3).split("\n")))
    return out


TOML = [(p.name, i, b) for p in PAGES for i, b in enumerate(blocks(p, "toml"))]


def test_the_pages_are_there():
    names = {p.name for p in PAGES}
    assert {"case-files.md", "outputs.md", "layout.md", "shoulders-grooves.md", "segments-3d.md",
            "sweeps.md", "api.md", "method.md", "speed.md", "troubleshooting.md"} <= names
    assert len(TOML) >= 10


@pytest.mark.parametrize("page,i,text", TOML, ids=[f"{n}-{i}" for n, i, _ in TOML])
def test_toml_examples_parse(page, i, text):
    """A block that is a fragment says so in its first line (``# fragment``) and is only parsed as
    TOML; a complete case ([case] or [section]) goes through the case parser as a case file does."""
    data = tomllib.loads(text)
    first = text.lstrip().split("\n", 1)[0].strip()
    if first == "# fragment":
        return
    assert "case" in data or "section" in data, f"{page} block {i}: neither a case nor marked '# fragment'"
    from compare.case.case import parse_case

    parse_case(data, base_dir=ROOT / "cases")


def test_api_walk_through_runs_in_order(tmp_path, monkeypatch):
    """docs/api.md read as a notebook: its python blocks, in order, in one namespace."""
    monkeypatch.chdir(ROOT)
    code = blocks(DOCS / "api.md", "python")
    assert len(code) >= 2
    import tempfile

    monkeypatch.setattr(tempfile, "tempdir", str(tmp_path))  # the page's temporary folder lands here
    ns = {"__name__": "docs_api"}
    with contextlib.redirect_stdout(io.StringIO()) as printed:
        for block in code:
            exec(compile(block, "docs/api.md", "exec"), ns)
    assert (ns["out"] / "keyed-api" / "results.json").is_file()
    lines = printed.getvalue().splitlines()
    sweep = [line.split() for line in lines if line.endswith(("True", "False"))]
    assert [row[0] for row in sweep] == ["0.2", "0.4", "0.8"], lines  # the loop printed one line per radius
    kts = [float(row[2]) for row in sweep]
    assert all(k > 1 for k in kts) and kts == sorted(kts, reverse=True)  # a larger keyseat fillet, a lower Kts


def slug(heading: str) -> str:
    s = heading.strip().lower()
    s = re.sub(r"[^\w\- ]", "", s)
    return s.replace(" ", "-")


def anchors(page: Path) -> set[str]:
    text = FENCE.sub("", page.read_text(encoding="utf-8"))
    return {slug(m.group(1)) for m in re.finditer(r"^#+ (.*)$", text, re.M)}


LINK = re.compile(r"\]\(([^)\s]+)\)")


def test_links_between_pages_reach_a_page_and_a_heading():
    checked = 0
    for page in [ROOT / "README.md", *PAGES]:
        text = FENCE.sub("", page.read_text(encoding="utf-8"))
        for target in LINK.findall(text):
            if re.match(r"[a-z]+:", target):
                continue
            path, _, anchor = target.partition("#")
            dest = (page.parent / path).resolve() if path else page
            assert dest.exists(), f"{page.name}: link to missing {target}"
            if anchor:
                assert anchor in anchors(dest), f"{page.name}: no heading '{anchor}' in {dest.name}"
            checked += 1
    assert checked >= 20


SHOWN = re.compile(r"^`(tests/bad_inputs/[\w.]+\.toml)`\n\n```text\n(.*?)\n```", re.M)


def test_troubleshooting_messages_are_what_the_command_line_prints(tmp_path, monkeypatch, run_cli):
    monkeypatch.chdir(ROOT)
    shown = SHOWN.findall((DOCS / "troubleshooting.md").read_text(encoding="utf-8"))
    assert len(shown) >= 15
    for path, message in shown:
        code, _, err = run_cli("run", "--no-report", "--no-vtu", path, "--out", str(tmp_path / Path(path).stem))
        assert code == 2, (path, err)
        assert err.strip() == message, (path, err, message)


def test_readme_is_short_and_keeps_the_caution_and_the_set_up():
    text = (ROOT / "README.md").read_text(encoding="utf-8")
    assert len(text.splitlines()) <= 220
    assert "**Caution.**" in text and "licensed engineer" in text
    assert "pip install -e '.[test]' && shaftcheck run cases/conveyor_gear_seat.toml" in text
    for page in PAGES:
        assert f"docs/{page.name}" in text, f"README's map does not name docs/{page.name}"


def test_method_page_names_every_test_module():
    """docs/method.md says what each test module checks: a new module must be listed there."""
    text = (DOCS / "method.md").read_text(encoding="utf-8")
    missing = [p.name for p in sorted((ROOT / "tests").glob("test_*.py")) if f"`tests/{p.name}`" not in text]
    assert not missing, f"docs/method.md does not list {missing}"


def test_no_merge_conflict_left_in_the_text():
    """No line of the project's text (pages, code, cases) is a merge-conflict marker: one was found left
    in a results table of docs/layout.md (common practice: such a line is never meant to stay)."""
    marker = re.compile(r"^(<{7} |={7}$|>{7} )", re.M)
    files = [p for ext in ("*.md", "*.py", "*.toml", "*.json") for p in ROOT.rglob(ext)
             if not any(part.startswith(".") or part in ("out", "build") for part in p.relative_to(ROOT).parts)
             and "egg-info" not in str(p)]
    assert len(files) > 100  # the walk found the project
    hits = [str(p.relative_to(ROOT)) for p in files if marker.search(p.read_text(encoding="utf-8", errors="replace"))]
    assert hits == []
