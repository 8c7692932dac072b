"""The HTML report in a real browser (Debian's headless Chromium driven by Playwright), offline.

Every request the page makes is intercepted: file: URLs are served, anything else is aborted and
recorded, and the test asserts that nothing else was even attempted. The figures and equations must
have decoded (naturalWidth > 0) and the page must show its sections. A full-page screenshot goes to
$BILAYER_ARTIFACTS (default test-artifacts/).
"""
from __future__ import annotations

import os
from pathlib import Path

import pytest

pytestmark = pytest.mark.browser

ROOT = Path(__file__).resolve().parent.parent
EXAMPLE = ROOT / "bilayer" / "examples" / "hive_entrance_strip.record.toml"
CHROMIUM = Path("/usr/bin/chromium")
ARTIFACTS = Path(os.environ.get("BILAYER_ARTIFACTS", ROOT / "test-artifacts"))
CHROMIUM_ARGS = [
    "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update",
    "--no-first-run", "--disable-sync", "--disable-quic", "--disable-dev-shm-usage",
]
IMAGES = """() => [...document.images].map(i => ({alt: i.alt.slice(0, 40), cls: i.className,
    complete: i.complete, width: i.naturalWidth, height: i.naturalHeight, shown: i.getBoundingClientRect().width}))"""


@pytest.fixture(scope="module")
def chromium(tmp_path_factory):
    if not CHROMIUM.exists():
        pytest.skip("Debian chromium is not installed (apt-get install chromium)")
    sync_api = pytest.importorskip("playwright.sync_api")
    state = tmp_path_factory.mktemp("chromium")
    os.environ.setdefault("XDG_CONFIG_HOME", str(state / "config"))  # keep browser state out of $HOME
    os.environ.setdefault("XDG_CACHE_HOME", str(state / "cache"))
    with sync_api.sync_playwright() as playwright:
        browser = playwright.chromium.launch(executable_path=str(CHROMIUM), headless=True, args=CHROMIUM_ARGS)
        yield browser
        browser.close()


def _open_offline(chromium, path: Path):
    """Open ``path`` with every request intercepted: (page, context, blocked URLs, all requested URLs)."""
    context = chromium.new_context(viewport={"width": 1200, "height": 900}, offline=True)
    page = context.new_page()
    blocked: list[str] = []

    def route(request_route):
        if request_route.request.url.startswith("file:"):
            request_route.continue_()
        else:
            blocked.append(request_route.request.url)
            request_route.abort()

    page.route("**/*", route)
    attempted: list[str] = []
    page.on("request", lambda request: attempted.append(request.url))
    page.goto(path.as_uri(), wait_until="load")
    page.wait_for_function("() => [...document.images].every(i => i.complete)")
    return page, context, blocked, attempted


def test_the_interception_sees_a_network_request(chromium, tmp_path):
    """The harness itself: a page that does fetch something is caught (so the report test can fail)."""
    page_file = tmp_path / "fetches.html"
    page_file.write_text("<!DOCTYPE html><html><body><img src='http://192.0.2.1/x.png'></body></html>")
    page, context, blocked, attempted = _open_offline(chromium, page_file)
    assert blocked == ["http://192.0.2.1/x.png"] and "http://192.0.2.1/x.png" in attempted
    context.close()


def test_report_renders_offline_with_its_figures(chromium, tmp_path):
    from bilayer.cli.entry import main

    report = tmp_path / "hive_entrance_strip.html"
    assert main(["report", str(EXAMPLE), "-o", str(report)]) == 0
    page, context, blocked, attempted = _open_offline(chromium, report)
    assert blocked == []
    assert [url for url in attempted if not url.startswith(("file:", "data:"))] == []
    assert attempted[0] == report.as_uri()

    images = page.evaluate(IMAGES)
    figures = [i for i in images if i["cls"] == "bilayer-figure"]
    assert [f["alt"] for f in figures] == ["Stress through the thickness", "Deflected shape", "Sign conventions"]
    assert all(i["complete"] and i["width"] > 0 and i["height"] > 0 for i in images), images
    assert all(f["width"] > 300 and f["shown"] > 300 for f in figures)
    assert len(images) > len(figures) + 5  # the equations are images too
    assert page.locator("#review-state").inner_text().startswith("Review: accepted with notes")
    assert page.locator("#check-state").inner_text().startswith("Check: OK")
    for heading in ("Cautions", "Inputs", "Results", "Figures", "Equations used", "Assumptions and warnings",
                    "Material data and sources", "Review log"):
        assert page.get_by_role("heading", name=heading, exact=True).is_visible()
    ARTIFACTS.mkdir(parents=True, exist_ok=True)
    shot = ARTIFACTS / "report_hive_entrance_strip.png"
    page.screenshot(path=str(shot), full_page=True)
    assert shot.stat().st_size > 50_000
    context.close()
