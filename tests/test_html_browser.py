"""The HTML report in a real browser: headless Chromium loads each example's page with no
console error, draws every chart at a visible size, and prints it to PDF (A4 and Letter)
with every table inside the page width.

Skips, saying why, when Chromium (Debian package ``chromium``) or pdftotext (``poppler-utils``)
is not installed; ``.ci/run`` installs both when absent.
"""

from __future__ import annotations

import re
import shutil
import subprocess
from html import unescape
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent
EXAMPLES = sorted((ROOT / "examples").glob("*.toml"))
CHROMIUM = next((p for p in (shutil.which("chromium"), "/usr/bin/chromium", shutil.which("chromium-browser"))
                 if p and Path(p).exists()), None)
PDFTOTEXT = shutil.which("pdftotext")

pytestmark = pytest.mark.skipif(CHROMIUM is None, reason="no Chromium installed (apt-get install chromium); "
                                                         "the real-browser checks of the HTML report did not run")
PIL = pytest.importorskip("PIL.Image", reason="Pillow (a matplotlib dependency, test extra) reads the screenshots")

FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
         "--disable-background-networking", "--disable-component-update", "--disable-sync",
         "--host-resolver-rules=MAP * ~NOTFOUND", "--hide-scrollbars"]

# the examples, and two commands whose pages carry charts (the other commands' charts are
# the same inline SVG, checked as XML in test_charts.py)
COMMANDS = {
    "size": ["size", "--pipe", "NPS 6", "--steam-pressure", "10barg", "--ambient-temp", "20C",
             "--material", "mineral wool", "--max-heat-flow", "90W/m"],
    "check-run": ["check", "--pipe", "NPS 4", "--fluid-temp", "60C", "--ambient-temp", "5C", "--layer",
                  "mineral wool:50mm", "--length", "300m", "--flow", "0.5kg/s", "--fluid", "water"],
}
CASES = [pytest.param(["schedule", str(p.relative_to(ROOT))], id=p.stem) for p in EXAMPLES] + \
        [pytest.param(args, id=name) for name, args in COMMANDS.items()]


def _command(tmp_path: Path, name: str, args) -> list[str]:
    profile = tmp_path / f"profile-{name}"
    profile.mkdir(exist_ok=True)
    return [CHROMIUM, *FLAGS, f"--user-data-dir={profile}", "--enable-logging=stderr", "--v=0", *args]


def chromium_all(tmp_path: Path, jobs: dict) -> dict:
    """Run one headless Chromium per job at once (they mostly wait); return each one's log
    (stderr), which carries the page's console."""
    procs = {name: subprocess.Popen(_command(tmp_path, name, args), stdout=subprocess.DEVNULL,
                                    stderr=subprocess.PIPE, text=True, cwd=tmp_path)
             for name, args in jobs.items()}
    logs = {}
    for name, proc in procs.items():
        try:
            _, logs[name] = proc.communicate(timeout=180)
        except subprocess.TimeoutExpired:
            proc.kill()
            proc.communicate()
            raise
        assert proc.returncode == 0, logs[name][-2000:]
    return logs


def chromium(tmp_path: Path, *args: str) -> str:
    return chromium_all(tmp_path, {"one": list(args)})["one"]


def console_lines(log: str) -> list[str]:
    return [line for line in log.splitlines() if ":CONSOLE" in line or "Uncaught" in line]


def ink_fraction(image) -> float:
    """Share of pixels that are not (near) white."""
    grey = image.convert("L")
    histogram = grey.histogram()
    return sum(histogram[:235]) / max(1, grey.width * grey.height)


def test_console_errors_are_caught(tmp_path):
    """Control: the log does show a page's console errors, so an empty list means none."""
    page = tmp_path / "bad.html"
    page.write_text("<!DOCTYPE html><p>x</p><script>console.error('boom'); missing();</script>", encoding="utf-8")
    log = chromium(tmp_path, "--dump-dom", page.as_uri())
    assert any("boom" in line for line in console_lines(log))


@pytest.fixture
def page(run, tmp_path, monkeypatch, request):
    monkeypatch.chdir(ROOT)
    out = tmp_path / "report.html"
    code, _, err = run(*request.param, "--format", "html", "-o", str(out))
    assert (code, err) == (0, "")
    return out


@pytest.mark.parametrize("page", CASES, indirect=True)
def test_in_chromium(page, tmp_path):
    text = page.read_text(encoding="utf-8")
    svgs = re.findall(r"<svg\b[^>]*>.*?</svg>", text, flags=re.S)
    assert len(svgs) == text.count('<figure class="chart"')
    sizes = [(float(re.search(r'\bwidth="([\d.]+)pt"', svg).group(1)),
              float(re.search(r'\bheight="([\d.]+)pt"', svg).group(1))) for svg in svgs]
    # the charts alone, each in a box 1000 px wide and 760 px high, one below the other
    charts = tmp_path / "charts.html"
    charts.write_text('<!DOCTYPE html><html><body style="margin:0;background:#fff">' + "".join(
        f'<div style="width:1000px;height:760px;overflow:hidden">{svg}</div>' for svg in svgs) + "</body></html>",
        encoding="utf-8")
    jobs = {"page": ["--window-size=1280,2400", f"--screenshot={tmp_path / 'page.png'}", page.as_uri()]}
    if svgs:
        jobs["charts"] = [f"--window-size=1000,{760 * len(svgs)}", f"--screenshot={tmp_path / 'charts.png'}",
                          charts.as_uri()]
    papers = (("letter", 612.0), ("A4", 595.3))
    for paper, _ in papers:
        printable = tmp_path / f"print-{paper}.html"
        printable.write_text(text.replace("</style>", f"@page {{ size: {paper}; }}</style>", 1), encoding="utf-8")
        jobs[paper] = ["--no-pdf-header-footer", f"--print-to-pdf={tmp_path / (paper + '.pdf')}", printable.as_uri()]
    logs = chromium_all(tmp_path, jobs)

    # 1. loads with no console message, and paints: a screenshot with ink on it
    for name, log in logs.items():
        assert console_lines(log) == [], name
    assert ink_fraction(PIL.open(tmp_path / "page.png")) > 0.02

    # 2. every chart is drawn at a visible size: declared size > 0, and each chart paints
    #    ink into its own box
    if svgs:
        image = PIL.open(tmp_path / "charts.png")
        for j, (width, height) in enumerate(sizes):
            assert width > 100 and height > 100
            box = image.crop((0, 760 * j, min(1000, int(width * 4 / 3)), 760 * j + min(760, int(height * 4 / 3))))
            assert ink_fraction(box) > 0.01, f"chart {j + 1} paints nothing"

    # 3. printed on Letter and on A4: every word inside the page, and every column heading
    #    and every row's first cell of every table printed (Chromium drops what runs past
    #    the right edge, so a cut-off column shows as missing text)
    if PDFTOTEXT is None:
        pytest.skip("pdftotext (poppler-utils) not installed: the printed-PDF width check did not run")
    heads = [unescape(h) for h in re.findall(r'<th scope="col">(.*?)</th>', text)]
    firsts = [unescape(c) for c in re.findall(r"<tr><td(?: class=\"num\")?>(.*?)</td>", text)]
    for paper, width_pt in papers:
        pdf = tmp_path / f"{paper}.pdf"
        bbox = subprocess.run([PDFTOTEXT, "-bbox", str(pdf), "-"], capture_output=True, text=True, timeout=60).stdout
        pages = re.findall(r'<page width="([\d.]+)" height="([\d.]+)">', bbox)
        assert pages and all(abs(float(w) - width_pt) < 1.5 for w, _ in pages), pages
        words = re.findall(r'<word xMin="([\d.]+)" yMin="[\d.]+" xMax="([\d.]+)"', bbox)
        assert words and all(float(lo) >= 0 and float(hi) <= width_pt for lo, hi in words)
        # content-stream order (-raw) keeps the lines of one cell together
        raw = subprocess.run([PDFTOTEXT, "-raw", str(pdf), "-"], capture_output=True, text=True, timeout=60).stdout
        printed = re.sub(r"\s+", "", raw)
        for cell in heads + firsts:
            assert re.sub(r"\s+", "", cell) in printed, f"{cell!r} not printed on {paper}"
        # numbered pages: "page 1 of N" in the bottom margin
        assert f"page1of{len(pages)}" in printed
