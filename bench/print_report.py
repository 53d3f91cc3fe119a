"""Print a report the way a person would, in a real headless browser, and check it fits.

Run by hand (Chromium is not a dependency of gaugewalk; on Debian: ``apt-get install chromium
poppler-utils``)::

    .venv/bin/python -m bench.print_report WALK.toml [--out FOLDER] [--png]

For each paper (letter and A4, portrait) it writes ``REPORT-PAPER.pdf`` printed by Chromium
(``--print-to-pdf``) and, with ``--png``, one PNG per page (``pdftoppm``) to look at. It then lays
the page out at the paper's printable width with the print rules applied and measures, in the
browser, every table, figure and cell: anything wider than the page (a cut column) and any
trade size or conductor size broken across lines is printed, and the exit status is 1.
"""

from __future__ import annotations

import argparse
import json
import re
import shutil
import subprocess
import sys
import tempfile
from pathlib import Path

PAPERS = {"letter": (215.9, 279.4), "A4": (210.0, 297.0)}
"""Paper sizes [mm], portrait."""
MARGIN_MM = 12.0
"""The report's @page margin [mm] (``gaugewalk.tui.report.html``)."""
PX_PER_MM = 96 / 25.4

_FLAGS = ("--headless", "--no-sandbox", "--disable-gpu", "--no-first-run",
          "--disable-background-networking", "--disable-component-update", "--disable-sync",
          "--disable-quic")

_MEASURE = """
<script>
window.addEventListener('load', () => {
  const width = document.documentElement.clientWidth;
  const out = {width: width, wide: [], broken: []};
  for (const el of document.querySelectorAll('table, svg, td, th')) {
    const r = el.getBoundingClientRect();
    if (r.right > width + 0.5) {
      const what = el.getAttribute('aria-label') || el.textContent.slice(0, 40);
      out.wide.push(el.tagName + ' ' + what + ' right ' + Math.round(r.right));
    }
  }
  for (const td of document.querySelectorAll('td.nw')) {
    if (td.scrollWidth > td.clientWidth + 0.5) out.broken.push('overflow: ' + td.textContent);
  }
  const pre = document.createElement('pre');
  pre.id = 'measured';
  pre.textContent = JSON.stringify(out);
  document.body.appendChild(pre);
});
</script>
"""


def chromium() -> str:
    for name in ("chromium", "chromium-browser", "google-chrome"):
        found = shutil.which(name)
        if found:
            return found
    sys.exit("no Chromium on this machine: apt-get install chromium")


def _html_for(report_html: str, paper: str) -> str:
    """The report with the paper named in its @page rule."""
    return report_html.replace("@page { size: portrait;", f"@page {{ size: {paper} portrait;")


def measure(browser: str, html: str, width_px: int, folder: Path) -> dict:
    """Lay ``html`` out at ``width_px`` with its print rules on screen; what the browser found."""
    page = html.replace("@media print {", "@media all {").replace("</body>", _MEASURE + "</body>")
    path = folder / f"measure-{width_px}.html"
    path.write_text(page, encoding="utf-8")
    done = subprocess.run(
        [browser, *_FLAGS, f"--window-size={width_px},2000", "--virtual-time-budget=5000",
         "--dump-dom", path.as_uri()], capture_output=True, text=True, timeout=120, check=True)
    found = re.search(r'<pre id="measured">(.*?)</pre>', done.stdout, re.S)
    if not found:
        raise RuntimeError("the browser did not measure the page")
    return json.loads(found.group(1).replace("&quot;", '"').replace("&amp;", "&"))


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("walk", help="walk file (.toml)")
    parser.add_argument("--out", default=None, help="folder for the PDFs and PNGs")
    parser.add_argument("--png", action="store_true", help="also write each page as a PNG")
    args = parser.parse_args(argv)
    browser = chromium()
    out = Path(args.out or tempfile.mkdtemp(prefix="gaugewalk-print-"))
    out.mkdir(parents=True, exist_ok=True)
    report = out / "report.html"
    from gaugewalk.tui.cli.main import main as gaugewalk

    if gaugewalk(["report", args.walk, "-o", str(report), "--replace"]) != 0:
        return 2
    html = report.read_text(encoding="utf-8")
    failed = False
    for paper, (width_mm, _) in PAPERS.items():
        page = out / f"report-{paper}.html"
        page.write_text(_html_for(html, paper), encoding="utf-8")
        pdf = out / f"report-{paper}.pdf"
        subprocess.run([browser, *_FLAGS, "--no-pdf-header-footer", f"--print-to-pdf={pdf}",
                        page.as_uri()], capture_output=True, timeout=120, check=True)
        if args.png and shutil.which("pdftoppm"):
            subprocess.run(["pdftoppm", "-png", "-r", "70", str(pdf), str(out / f"{paper}")],
                           check=True)
        width_px = int((width_mm - 2 * MARGIN_MM) * PX_PER_MM)
        found = measure(browser, html, width_px, out)
        state = "fits" if not (found["wide"] or found["broken"]) else "DOES NOT FIT"
        print(f"{paper} portrait, {width_px} px printable: {state}; {pdf}")
        for line in found["wide"] + found["broken"]:
            print(f"  {line}")
            failed = True
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
