"""HTML report of a design record: self-contained, complete, and showing what the record holds.

External references: the report is parsed with the standard library's html.parser; embedded images
are decoded and opened with Pillow (PNG) and xml.etree (SVG); quantities are compared with
bilayer.core.units.format_quantity of the record's own SI values.
"""
from __future__ import annotations

import base64
import io
import re
import xml.etree.ElementTree as ElementTree
from html.parser import HTMLParser
from pathlib import Path

import pytest

pytest.importorskip("matplotlib")

from PIL import Image  # noqa: E402

from bilayer.core.cautions import CAUTIONS
from bilayer.cli.entry import main
from bilayer.core.materials import default_library
from bilayer.records.record import read_record
from bilayer.report.html_report import equations, report_html
from bilayer.thermostat.element import THERMOSTAT_CAUTIONS
from bilayer.core.units import format_quantity

EXAMPLE = Path(__file__).resolve().parent.parent / "bilayer" / "examples" / "hive_entrance_strip.record.toml"
FORMAT1 = Path(__file__).parent / "data" / "record_format1.toml"


class _Page(HTMLParser):
    """Every tag with its attributes, and the visible text."""

    def __init__(self, html: str):
        super().__init__()
        self.tags: list[tuple[str, dict]] = []
        self.text: list[str] = []
        self.feed(html)

    def handle_starttag(self, tag, attrs):
        self.tags.append((tag, dict(attrs)))

    def handle_data(self, data):
        self.text.append(data)

    def images(self) -> list[dict]:
        return [attrs for tag, attrs in self.tags if tag == "img"]

    @property
    def visible(self) -> str:
        return " ".join(" ".join(self.text).split())


@pytest.fixture(scope="module")
def example_html() -> str:
    return report_html(read_record(EXAMPLE), "si", generated="2026-12-02T09:00:00Z")


def _decode(uri: str) -> tuple[str, bytes]:
    head, data = uri.split(",", 1)
    assert head.endswith(";base64")
    return head[5:-7], base64.b64decode(data)


def test_report_is_self_contained(example_html):
    page = _Page(example_html)
    assert not any(tag in ("script", "link", "iframe", "object", "embed") for tag, _ in page.tags)
    for tag, attrs in page.tags:
        for name in ("src", "href", "srcset", "action", "data"):
            if name in attrs:
                assert attrs[name].startswith(("data:", "#")), (tag, name, attrs[name][:80])
    assert not re.search(r"url\(\s*['\"]?(?!data:)", example_html)  # no CSS fetches
    assert not re.search(r"@import", example_html)
    assert "Content-Security-Policy" in example_html  # and the browser is told to fetch nothing


def test_report_embeds_the_figures_and_equations(example_html):
    images = _Page(example_html).images()
    figures = [img for img in images if img.get("class") == "bilayer-figure"]
    assert [img["alt"] for img in figures] == ["Stress through the thickness", "Deflected shape", "Sign conventions"]
    for img in figures:
        kind, data = _decode(img["src"])
        assert kind == "image/png"
        width, height = Image.open(io.BytesIO(data)).size
        assert width > 300 and height > 150
    svgs = [img for img in images if img["src"].startswith("data:image/svg+xml")]
    record = read_record(EXAMPLE)
    assert len(svgs) == len(equations(record.design.stack.n_layers, record.design.state.value))
    for img in svgs:
        root = ElementTree.fromstring(_decode(img["src"])[1])
        assert root.tag.endswith("svg") and len(list(root.iter())) > 5
    assert "<code>" not in example_html.split("id='equations'")[1].split("id='assumptions'")[0]  # none fell back


def test_report_shows_cautions_sources_reviews_and_values(example_html):
    page = _Page(example_html)
    text = page.visible
    record = read_record(EXAMPLE)
    for caution in (*CAUTIONS, *THERMOSTAT_CAUTIONS):
        assert " ".join(caution.split()) in text
    citation = default_library().citations["callister2008"]
    assert citation in text
    for material in record.materials.values():
        for source in material.sources.values():
            assert " ".join(source.split()) in text
    for entry in record.reviews:
        assert entry.reviewer in text and " ".join(entry.comment.split()) in text
    assert "accepted with notes by M. Varga" in text
    curvature = record.results["curvature"]
    for value in curvature:
        assert format_quantity(value, "curvature", "si", digits=4) in text
    for warning in record.results["warnings"]:
        assert warning in text
    for assumption in record.results["assumptions"]:
        assert assumption in text
    assert "Check: OK" in text
    assert record.inputs_hash in text


def test_us_report_uses_us_units():
    record = read_record(EXAMPLE)
    text = _Page(report_html(record, "us")).visible
    stress = record.results["layers"][0]["stress_top"][0]
    assert format_quantity(stress, "stress", "us", digits=4) in text
    assert "degF" in text and " MPa" not in text.split("Equations used")[0].split("Results")[1]


def test_report_of_a_drifted_record_says_so(tmp_path):
    path = tmp_path / "drift.toml"
    text = EXAMPLE.read_text()
    record = read_record(EXAMPLE)
    value = record.results["layers"][1]["stress_bottom"][0]
    assert text.count(repr(value)) >= 1
    path.write_text(text.replace(repr(value), repr(value * 1.01), 1))
    page = _Page(report_html(read_record(path))).visible
    assert "Check: FAILED: results drifted" in page
    assert "layer 2 (low-expansion side): σx at bottom face: recorded" in page


def test_report_of_a_migrated_three_layer_wide_record():
    record = read_record(FORMAT1)
    html = report_html(record, "si")
    text = _Page(html).visible
    assert "migrated from record format 1" in text and "σy at bottom face" in text
    assert len([i for i in _Page(html).images() if i.get("class") == "bilayer-figure"]) == 3


def test_report_command_writes_the_file(tmp_path, capsys):
    out = tmp_path / "report.html"
    assert main(["report", str(EXAMPLE), "-o", str(out), "--units", "us"]) == 0
    assert "check: OK" in capsys.readouterr().err
    html = out.read_text(encoding="utf-8")
    assert html.startswith("<!DOCTYPE html>") and "US customary" in html
