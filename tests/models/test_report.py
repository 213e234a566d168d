"""report.html: valid HTML, self-contained, every check shown, cautions first, figures as PNG.

The results folder is the invented test fixture of view_results_fixture.py.
"""
from __future__ import annotations

import base64
import io
import json
import shutil
import subprocess
from html.parser import HTMLParser
from pathlib import Path

import numpy as np
import pytest
from PIL import Image

from spanstay.models.outputs.report import write_report
from view_results_fixture import make_results

VOID = {"area", "base", "br", "col", "embed", "hr", "img", "input", "link", "meta", "source",
        "track", "wbr"}


class _Collect(HTMLParser):
    """Collects tags, every URL-bearing attribute, visible text; checks nesting."""

    def __init__(self) -> None:
        super().__init__(convert_charrefs=True)
        self.stack: list[str] = []
        self.errors: list[str] = []
        self.urls: list[str] = []
        self.images: list[str] = []
        self.text: list[str] = []
        self.tags: list[str] = []

    def handle_starttag(self, tag, attrs):
        self.tags.append(tag)
        for key, value in attrs:
            if key in ("src", "href", "action", "data", "poster", "srcset") and value:
                self.urls.append(value)
        if tag == "img":
            self.images.append(dict(attrs).get("src", ""))
        if tag not in VOID:
            self.stack.append(tag)

    def handle_endtag(self, tag):
        if tag in VOID:
            return
        if not self.stack or self.stack[-1] != tag:
            self.errors.append(f"</{tag}> closes <{self.stack[-1] if self.stack else '-'}>")
            return
        self.stack.pop()

    def handle_data(self, data):
        self.text.append(data)


@pytest.fixture(scope="module")
def report(tmp_path_factory):
    folder = make_results(tmp_path_factory.mktemp("report") / "results", stations=4)
    summary = json.loads((folder / "summary.json").read_text())
    path = write_report(folder, summary)
    parser = _Collect()
    parser.feed(path.read_text(encoding="utf-8"))
    parser.close()
    return folder, summary, path, parser


def test_report_parses_as_html_with_balanced_tags(report):
    _, _, path, parser = report
    assert path.name == "report.html"
    assert parser.tags[:2] == ["html", "head"]
    assert not parser.errors
    assert parser.stack == []  # every element closed


def test_report_links_nothing_outside_itself(report):
    _, _, path, parser = report
    assert parser.urls, "the figures should be embedded as data: URLs"
    for url in parser.urls:
        assert url.startswith("data:image/png;base64,") or url.startswith("#"), url[:60]
    raw = path.read_text(encoding="utf-8").lower()
    assert "http://" not in raw and "https://" not in raw
    assert "@import" not in raw and "url(" not in raw


def test_report_embeds_decodable_png_figures(report):
    folder, _, _, parser = report
    sizes = []
    for src in parser.images:
        data = base64.b64decode(src.split(",", 1)[1])
        with Image.open(io.BytesIO(data)) as img:
            assert img.format == "PNG"
            grey = np.asarray(img.convert("L"), float)
        assert np.mean(np.abs(grey - np.median(grey)) > 8) > 0.005  # something is drawn
        sizes.append(img.size)
    # the report's own figures, also written into the results folder as PNG files
    for name in ("structure_3d", "slack_budget", "cable_profiles", "posts_and_footings"):
        assert (folder / "plots" / f"{name}.png").is_file()
    assert len(parser.images) >= 4


def test_report_lists_every_check_with_its_verdict(report):
    _, summary, _, parser = report
    text = " ".join(parser.text)
    for check in summary["checks"]:
        assert check["id"] in text
    # the fixture has one invented failing check (utilization 1.14)
    assert "1 of 4 checks FAIL" in text
    assert text.count("FAIL") >= 2 and "PASS" in text


def test_cautions_come_first(report):
    _, summary, _, parser = report
    text = " ".join(parser.text)
    first = text.index(summary["cautions"][0])
    assert first < text.index("Checks") < text.index("Inputs")
    for caution in summary["cautions"]:
        assert caution in text


def test_inputs_echoed_with_units(report):
    _, _, _, parser = report
    text = " ".join(parser.text)
    # fixture: heaviest rider 1000 N -> 1.00 kN; hang distance 1.5 m; rope 9.5 mm
    assert "1.00 kN" in text and "1.50 m" in text and "9.50 mm" in text


def test_report_in_us_units(report, tmp_path):
    folder = Path(shutil.copytree(report[0], tmp_path / "results"))
    summary = json.loads((folder / "summary.json").read_text())
    summary["units"] = "us"
    text = write_report(folder, summary).read_text(encoding="utf-8")
    # 1000 N = 224.8 lbf (1 lbf = 4.4482216152605 N exactly, NIST SP 811)
    assert "225 lbf" in text
    # 1.5 m = 4.92 ft (1 ft = 0.3048 m exactly)
    assert "4.92 ft" in text


def test_report_without_vtk_still_written(report, tmp_path):
    folder = Path(shutil.copytree(report[0], tmp_path / "results"))
    summary = json.loads((folder / "summary.json").read_text())
    shutil.rmtree(folder / "vtk")
    path = write_report(folder, summary)
    text = path.read_text(encoding="utf-8")
    assert "No 3D results to draw from" in text
    for check in summary["checks"]:
        assert check["id"] in text


def _chromium() -> str | None:
    for name in ("chromium", "chromium-browser", "google-chrome"):
        found = shutil.which(name)
        if found:
            return found
    return None


@pytest.mark.skipif(_chromium() is None, reason="no Chromium here for a headless screenshot "
                    "(it is optional and not installed on this machine)")
def test_headless_screenshot_is_not_blank(report, tmp_path):
    _, _, path, _ = report
    shot = tmp_path / "shot.png"
    subprocess.run([_chromium(), "--headless", "--disable-gpu", "--no-sandbox",
                    f"--screenshot={shot}", "--window-size=1200,1600", path.as_uri()],
                   check=True, timeout=60, capture_output=True)
    grey = np.asarray(Image.open(shot).convert("L"), float)
    assert np.mean(np.abs(grey - np.median(grey)) > 10) > 0.01


def test_report_figures_are_listed_in_the_summary_plots(report):
    folder, summary, _, _ = report
    for name in ("structure_3d", "slack_budget", "cable_profiles", "posts_and_footings"):
        assert (folder / summary["plots"][name]).is_file()


def test_a_figure_that_cannot_be_drawn_is_noted_not_fatal(report, tmp_path):
    folder = Path(shutil.copytree(report[0], tmp_path / "results"))
    summary = json.loads((folder / "summary.json").read_text())
    summary["slack_budget"]["shares"] = {"cable stretch": "not a number"}
    text = write_report(folder, summary).read_text(encoding="utf-8")
    assert "could not be drawn" in text
    for check in summary["checks"]:
        assert check["id"] in text
