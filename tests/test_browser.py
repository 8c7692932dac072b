"""Real-browser tests: the notebooks in JupyterLab, driven by Debian's headless Chromium.

JupyterLab serves a temporary copy of notebooks/ on 127.0.0.1 with isolated Jupyter, matplotlib and
browser state; Playwright drives /usr/bin/chromium (no browser download). The start-notebook test runs
all cells, types a new operating temperature into the stack editor, checks that the stress figure
changed, then runs the finite-element check from its button. The job-notebook test does the same for
each job panel with one of its entries. Screenshots go to $BILAYER_ARTIFACTS (default test-artifacts/).
"""
from __future__ import annotations

import json
import os
import secrets
import shutil
import signal
import socket
import subprocess
import sys
import time
import urllib.request
from pathlib import Path

import pytest

pytestmark = [pytest.mark.browser, pytest.mark.slow]

ROOT = Path(__file__).resolve().parent.parent
NOTEBOOKS = ROOT / "notebooks"
CHROMIUM = Path("/usr/bin/chromium")
ARTIFACTS = Path(os.environ.get("BILAYER_ARTIFACTS", ROOT / "test-artifacts"))
CHROMIUM_ARGS = [
    "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update",
    "--no-first-run", "--disable-sync", "--disable-quic", "--disable-dev-shm-usage",
]
KERNEL_READY = """() => {
    const k = window.jupyterapp?.shell.currentWidget?.sessionContext?.session?.kernel;
    return !!k && k.connectionStatus === 'connected' && k.status === 'idle'; }"""
ALL_RUN = """n => {
    const p = [...document.querySelectorAll('.jp-Notebook .jp-CodeCell .jp-InputPrompt')]
        .map(e => e.textContent.trim());
    return p.length === n && p.every(t => /^\\[\\d+\\]:$/.test(t)); }"""
STRESS_IMAGE = "img.bilayer-stress-figure"


def image_source(selector: str) -> str:
    """JavaScript returning the src of the first image matching ``selector`` (a blob: or data: URL)."""
    return f"() => document.querySelector('{selector}')?.src || ''"


STRESS_SRC = image_source(STRESS_IMAGE)


def _free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


def _request(url: str, token: str, method: str = "GET") -> int:
    request = urllib.request.Request(url, method=method, headers={"Authorization": f"token {token}"})
    with urllib.request.urlopen(request, timeout=5) as response:
        return response.status


def _write_settings(folder: Path) -> None:
    """Lab settings: no news or update toasts, no autosave, every cell kept in the DOM."""
    settings = {
        "@jupyterlab/apputils-extension/notification": {"fetchNews": "false", "checkForUpdates": False},
        "@jupyterlab/docmanager-extension/plugin": {"autosave": False},
        "@jupyterlab/notebook-extension/tracker": {"windowingMode": "none"},
    }
    for name, values in settings.items():
        package, plugin = name.rsplit("/", 1)
        path = folder / package / f"{plugin}.jupyterlab-settings"
        path.parent.mkdir(parents=True, exist_ok=True)
        path.write_text(json.dumps(values))


@pytest.fixture(scope="module")
def lab_server(tmp_path_factory):
    if not CHROMIUM.exists():
        pytest.skip("Debian chromium is not installed (apt-get install chromium); tools/test.sh installs it as root")
    pytest.importorskip("playwright")
    pytest.importorskip("jupyterlab")
    state = tmp_path_factory.mktemp("lab")
    root = state / "notebooks"
    shutil.copytree(NOTEBOOKS, root, ignore=shutil.ignore_patterns(".ipynb_checkpoints", "*.toml"))
    _write_settings(state / "settings")
    port, token = _free_port(), secrets.token_hex(16)
    env = dict(
        os.environ,
        JUPYTER_CONFIG_DIR=str(state / "config"), JUPYTER_DATA_DIR=str(state / "data"),
        JUPYTER_RUNTIME_DIR=str(state / "runtime"), JUPYTERLAB_SETTINGS_DIR=str(state / "settings"),
        JUPYTERLAB_WORKSPACES_DIR=str(state / "workspaces"), IPYTHONDIR=str(state / "ipython"),
        MPLCONFIGDIR=str(state / "mpl"), XDG_CACHE_HOME=str(state / "cache"), XDG_CONFIG_HOME=str(state / "xdg"),
        PYTHONPATH=os.pathsep.join(filter(None, [str(ROOT), os.environ.get("PYTHONPATH", "")])),
    )
    env.pop("MPLBACKEND", None)
    command = [
        sys.executable, "-m", "jupyterlab", "--no-browser", "--allow-root",
        "--ServerApp.ip=127.0.0.1", f"--ServerApp.port={port}", "--ServerApp.port_retries=0",
        f"--IdentityProvider.token={token}", f"--ServerApp.root_dir={root}",
        "--LabApp.news_url=None", "--LabApp.check_for_updates_class=jupyterlab.NeverCheckForUpdate",
        "--LabApp.extension_manager=readonly", "--LabApp.expose_app_in_browser=True",
    ]
    ARTIFACTS.mkdir(parents=True, exist_ok=True)
    log = open(ARTIFACTS / "jupyterlab.log", "w")
    process = subprocess.Popen(command, env=env, stdout=log, stderr=subprocess.STDOUT, stdin=subprocess.DEVNULL,
                               start_new_session=True)
    base = f"http://127.0.0.1:{port}"
    try:
        deadline = time.monotonic() + 90
        while True:
            if process.poll() is not None:
                pytest.fail(f"JupyterLab exited early; see {ARTIFACTS / 'jupyterlab.log'}")
            try:
                if _request(f"{base}/api/status", token) == 200:
                    break
            except OSError:
                pass
            if time.monotonic() > deadline:
                pytest.fail("JupyterLab did not answer on /api/status within 90 s")
            time.sleep(0.3)
        yield {"base": base, "token": token}
    finally:
        try:
            _request(f"{base}/api/shutdown", token, method="POST")
            process.wait(timeout=15)
        except Exception:
            if process.poll() is None:
                os.killpg(process.pid, signal.SIGTERM)
                try:
                    process.wait(timeout=10)
                except subprocess.TimeoutExpired:
                    os.killpg(process.pid, signal.SIGKILL)
        log.close()


@pytest.fixture(scope="module")
def browser():
    from playwright.sync_api import sync_playwright

    with sync_playwright() as p:
        chromium = p.chromium.launch(executable_path=str(CHROMIUM), headless=True, args=CHROMIUM_ARGS)
        yield chromium
        chromium.close()


def _code_cells(name: str) -> int:
    notebook = json.loads((NOTEBOOKS / name).read_text())
    return sum(cell["cell_type"] == "code" for cell in notebook["cells"])


def open_and_run_all(page, lab, name: str) -> None:
    page.goto(f"{lab['base']}/lab/tree/{name}?reset&token={lab['token']}")
    page.wait_for_function(KERNEL_READY, timeout=120_000)
    page.locator(".lm-MenuBar-itemLabel", has_text="Run").click()
    page.locator('.lm-Menu-item[data-command="runmenu:run-all"]').click()
    page.wait_for_function(ALL_RUN, arg=_code_cells(name), timeout=240_000)
    page.wait_for_function(KERNEL_READY, timeout=120_000)


def settle(page, expression: str, quiet: float = 0.8, timeout: float = 60.0) -> str:
    """Wait until the kernel is idle and ``expression`` has not changed for ``quiet`` seconds."""
    deadline = time.monotonic() + timeout
    last, since = None, time.monotonic()
    while time.monotonic() < deadline:
        value = page.evaluate(expression)
        idle = page.evaluate(KERNEL_READY)
        if value != last or not idle:
            last, since = value, time.monotonic()
        elif time.monotonic() - since >= quiet:
            return value
        time.sleep(0.15)
    raise AssertionError(f"{expression} did not settle within {timeout} s")


def test_start_notebook_reacts_to_a_typed_temperature(lab_server, browser):
    page = browser.new_page(viewport={"width": 1400, "height": 1000})
    try:
        open_and_run_all(page, lab_server, "start_here.ipynb")
        figure = page.locator(STRESS_IMAGE).first
        figure.wait_for(state="visible", timeout=60_000)
        before = settle(page, STRESS_SRC)
        assert before.startswith("blob:") or before.startswith("data:")
        figure.scroll_into_view_if_needed()
        page.screenshot(path=str(ARTIFACTS / "start_here_before.png"))

        field = page.locator(".widget-text", has=page.locator("label", has_text="operating temperature")).locator("input")
        field.first.scroll_into_view_if_needed()
        field.first.fill("180 degC")
        field.first.press("Enter")
        after = settle(page, STRESS_SRC)
        assert after != before, "the stress figure did not change after the operating temperature was typed"
        assert field.first.input_value() == "180 degC"  # what was typed stays
        title = page.locator(".bilayer-result-table").first.inner_text()
        assert "curvature" in title
        figure.scroll_into_view_if_needed()
        page.screenshot(path=str(ARTIFACTS / "start_here_after.png"))
        figure.screenshot(path=str(ARTIFACTS / "start_here_stress_figure_after.png"))
    finally:
        page.close()


def test_start_notebook_runs_the_fe_check_behind_its_button(lab_server, browser):
    pytest.importorskip("skfem")
    page = browser.new_page(viewport={"width": 1400, "height": 1000})
    try:
        open_and_run_all(page, lab_server, "start_here.ipynb")
        page.locator(".lm-TabBar-tab, .widget-tab .p-TabBar-tab", has_text="FE check").first.click()
        page.locator("button.bilayer-fe-run").first.click()
        figure = page.locator("img.bilayer-fe-figure").first
        figure.wait_for(state="visible", timeout=180_000)
        page.wait_for_function("() => [...document.querySelectorAll('.widget-html')].some("
                               "e => /dofs/.test(e.textContent))", timeout=180_000)
        settle(page, image_source("img.bilayer-fe-figure"))
        figure.scroll_into_view_if_needed()
        page.screenshot(path=str(ARTIFACTS / "start_here_fe_check.png"))
    finally:
        page.close()


JOB_NOTEBOOKS = [
    ("thermostat.ipynb", "thermostat", "length", "35 mm"),
    ("solder_joint.ipynb", "solder_joint", "dnp", "9 mm"),
    ("adhesive_bond.ipynb", "adhesive_bond", "overlap", "30 mm"),
    ("film_on_wafer.ipynb", "film", "substrate_biaxial_modulus", "150 GPa"),
]


@pytest.mark.parametrize("notebook, section, field, value", JOB_NOTEBOOKS, ids=[n for n, *_ in JOB_NOTEBOOKS])
def test_job_panel_reacts_to_a_typed_entry(lab_server, browser, notebook, section, field, value):
    page = browser.new_page(viewport={"width": 1400, "height": 1000})
    try:
        open_and_run_all(page, lab_server, notebook)
        selector = f"img.bilayer-{section}-figure"
        figure = page.locator(selector).first
        figure.wait_for(state="visible", timeout=60_000)
        before = settle(page, image_source(selector))
        entry = page.locator(f".bilayer-field-{field} input").first
        entry.scroll_into_view_if_needed()
        entry.fill(value)
        entry.press("Enter")
        after = settle(page, image_source(selector))
        assert after != before, f"the {section} figure did not change after {field} = {value!r}"
        assert entry.input_value() == value
        figure.scroll_into_view_if_needed()
        page.screenshot(path=str(ARTIFACTS / f"{notebook.removesuffix('.ipynb')}_after.png"))
    finally:
        page.close()
