"""report.html in a real browser (headless Chromium, Debian's ``chromium`` package; ``.ci/run``
installs it): every image decodes with a non-zero size, nothing is written to the console, it prints
to PDF with a sane page count, and a screenshot is saved in the test's tmp folder. Skipped, with the
reason, only where no Chromium is installed."""
from __future__ import annotations

import re
import shutil
import subprocess
from pathlib import Path

import matplotlib.image as mpimg
import pytest

from compare.cli import main

CHROMIUM = next((shutil.which(n) for n in ("chromium", "chromium-browser") if shutil.which(n)), None)
pytestmark = pytest.mark.skipif(CHROMIUM is None, reason="no Chromium installed (Debian: apt-get install chromium; "
                                                         ".ci/run installs it where apt-get is available)")

CASE = """
[case]
title = "Browser check: round shaft, torque and bending"
units = "mm-N-MPa"
[section]
shape = "keyed"
diameter = 24
[[section.keyways]]
width = 8
depth = 4.0
fillet = 0.4
[loads]
torque = "60 N*m"
bending = ["40 N*m", 0]
[material]
name = "steel (illustrative)"
elastic_modulus = "205 GPa"
poisson = 0.29
yield = 390
ultimate = 630
[analysis]
fineness = 0.5
accuracy = 0.05
"""

# added to a copy of the report only (the report itself has no script): marks what the browser decoded
CHECK = ("<script>window.addEventListener('load',function(){var im=[].slice.call(document.images);"
         "var bad=im.filter(function(i){return !(i.complete&&i.naturalWidth>0&&i.naturalHeight>0)})"
         ".map(function(i){return i.alt});document.body.setAttribute('data-images',im.length);"
         "document.body.setAttribute('data-bad',JSON.stringify(bad));});</script>")


def _chromium(tmp_path, *args):
    cmd = [CHROMIUM, "--headless", "--disable-gpu", "--no-sandbox", f"--user-data-dir={tmp_path / 'profile'}",
           "--enable-logging=stderr", "--v=0", *args]
    return subprocess.run(cmd, capture_output=True, text=True, timeout=180)


@pytest.fixture(scope="module")
def report(tmp_path_factory):
    d = tmp_path_factory.mktemp("browser")
    (d / "c.toml").write_text(CASE, encoding="utf-8")
    assert main(["run", str(d / "c.toml"), "--out", str(d / "out"), "--quiet", "--no-vtu"]) == 0
    return d / "out" / "report.html"


def test_images_decode_and_console_is_quiet(report, tmp_path):
    html = report.read_text(encoding="utf-8")
    n_img = html.count("<img ")
    assert n_img >= 7
    harness = tmp_path / "harness.html"
    harness.write_text(html.replace("</body>", CHECK + "</body>"), encoding="utf-8")
    r = _chromium(tmp_path, "--virtual-time-budget=5000", "--dump-dom", harness.as_uri())
    body = re.search(r"<body[^>]*>", r.stdout)
    assert body, r.stderr[-2000:]
    assert f'data-images="{n_img}"' in body.group(0)
    assert 'data-bad="[]"' in body.group(0), body.group(0)
    # the report itself: nothing at all on the console (it has no script; a failed load would show here)
    r = _chromium(tmp_path, "--dump-dom", report.as_uri())
    console = [ln for ln in r.stderr.splitlines() if ":CONSOLE" in ln]
    assert console == []
    assert "<h1>Browser check" in r.stdout


def test_prints_to_pdf_and_screenshot(report, tmp_path):
    pdf, shot = tmp_path / "report.pdf", tmp_path / "screenshot.png"
    r = _chromium(tmp_path, "--no-pdf-header-footer", f"--print-to-pdf={pdf}", report.as_uri())
    assert pdf.is_file(), r.stderr[-2000:]
    pages = len(re.findall(rb"/Type\s*/Page\b(?!s)", pdf.read_bytes()))
    # one page per section at most (page breaks between sections), a few more for long tables and figures
    print(f"report PDF: {pages} pages, {pdf.stat().st_size} bytes; screenshot {shot}")
    assert 5 <= pages <= 40
    r = _chromium(tmp_path, "--window-size=1100,1600", f"--screenshot={shot}", report.as_uri())
    img = mpimg.imread(shot)
    assert img.shape[0] >= 1000 and img.shape[1] >= 1000
    assert img[..., :3].std() > 0.01  # not a blank page


# --------------------------------------------------------------------------- the report of a whole shaft
LAYOUT = Path(__file__).resolve().parents[1] / "cases" / "countershaft_layout.toml"


@pytest.fixture(scope="module")
def layout_report(tmp_path_factory):
    """The demo countershaft at a coarser mesh and a looser target (every part of the layout report)."""
    d = tmp_path_factory.mktemp("browser_layout")
    text = LAYOUT.read_text(encoding="utf-8").replace('accuracy = "1 %"', 'accuracy = "5 %"\nfineness = 0.5')
    (d / "c.toml").write_text(text, encoding="utf-8")
    assert main(["run", str(d / "c.toml"), "--out", str(d / "out"), "--quiet", "--no-vtu"]) == 0
    return d / "out" / "report.html"


def test_layout_report_renders_and_every_figure_loads(layout_report, tmp_path):
    html = layout_report.read_text(encoding="utf-8")
    n_img = html.count("<img ")
    assert n_img >= 4 + 3 * 3  # the layout's figures and at least three of each station's
    harness = tmp_path / "harness.html"
    harness.write_text(html.replace("</body>", CHECK + "</body>"), encoding="utf-8")
    r = _chromium(tmp_path, "--virtual-time-budget=8000", "--dump-dom", harness.as_uri())
    body = re.search(r"<body[^>]*>", r.stdout)
    assert body, r.stderr[-2000:]
    assert f'data-images="{n_img}"' in body.group(0)
    assert 'data-bad="[]"' in body.group(0), body.group(0)
    r = _chromium(tmp_path, "--dump-dom", layout_report.as_uri())
    assert [ln for ln in r.stderr.splitlines() if ":CONSOLE" in ln] == []
    assert 'id="verdict"' in r.stdout and 'id="station-1"' in r.stdout


def test_layout_report_prints_to_pdf(layout_report, tmp_path):
    pdf, shot = tmp_path / "report.pdf", tmp_path / "screenshot.png"
    r = _chromium(tmp_path, "--no-pdf-header-footer", f"--print-to-pdf={pdf}", layout_report.as_uri())
    assert pdf.is_file(), r.stderr[-2000:]
    pages = len(re.findall(rb"/Type\s*/Page\b(?!s)", pdf.read_bytes()))
    print(f"layout report PDF: {pages} pages, {pdf.stat().st_size} bytes; screenshot {shot}")
    # a page per part at least (page breaks between parts), more for the stations' figures; bounded
    assert 14 <= pages <= 120
    r = _chromium(tmp_path, "--window-size=1100,1600", f"--screenshot={shot}", layout_report.as_uri())
    img = mpimg.imread(shot)
    assert img.shape[0] >= 1000 and img[..., :3].std() > 0.01
