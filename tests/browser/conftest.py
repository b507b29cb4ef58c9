"""JupyterLab and real Chromium for browser tests (see ../../DEVELOPERS.md, "Browser tests").

One JupyterLab server per session on a free loopback port, with its runtime, config and IPython
folders in a temporary directory; one Chromium (Debian's, never a downloaded build) driven by
Playwright. Everything is stopped at the end of the session.
"""

from __future__ import annotations

import json
import os
import shutil
import signal
import socket
import subprocess
import sys
import tempfile
import time
import urllib.request
from pathlib import Path

import pytest

from ..conftest import chromium_path

pytestmark = pytest.mark.browser


def _free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


class Lab:
    def __init__(self, root: Path, port: int, proc: subprocess.Popen):
        self.root = root
        self.port = port
        self.proc = proc
        self.url = f"http://127.0.0.1:{port}"

    def write_notebook(self, name: str, cells: list[dict], metadata: dict | None = None) -> Path:
        nb = {
            "cells": cells,
            "metadata": metadata
            or {"kernelspec": {"name": "python3", "display_name": "Python 3", "language": "python"}},
            "nbformat": 4,
            "nbformat_minor": 5,
        }
        path = self.root / name
        path.write_text(json.dumps(nb))
        return path


def code_cell(source: str, outputs: list | None = None, metadata: dict | None = None, cell_id: str | None = None) -> dict:
    return {
        "cell_type": "code",
        "id": cell_id or f"c{abs(hash(source)) % 10**8}",
        "metadata": metadata or {},
        "source": source,
        "execution_count": None,
        "outputs": outputs or [],
    }


@pytest.fixture(scope="session")
def lab():
    tmp = Path(tempfile.mkdtemp(prefix="chemcheck-lab-"))
    root = tmp / "notebooks"
    root.mkdir()
    env = dict(os.environ)
    for var, sub in (("JUPYTER_RUNTIME_DIR", "runtime"), ("JUPYTER_CONFIG_DIR", "config"), ("IPYTHONDIR", "ipython")):
        (tmp / sub).mkdir()
        env[var] = str(tmp / sub)
    env["JUPYTERLAB_SETTINGS_DIR"] = str(tmp / "settings")
    # no news pop-up over the screenshots
    news = tmp / "settings" / "@jupyterlab" / "apputils-extension"
    news.mkdir(parents=True)
    (news / "notification.jupyterlab-settings").write_text('{"fetchNews": "false"}')
    # the extension built in this checkout wins over the one linked into the environment
    built = Path(__file__).resolve().parents[2] / "chemcheck" / "labextension"
    if (built / "package.json").exists():
        (tmp / "data" / "labextensions").mkdir(parents=True)
        (tmp / "data" / "labextensions" / "chemcheck-jupyterlab").symlink_to(built)
        env["JUPYTER_PATH"] = os.pathsep.join([str(tmp / "data"), *filter(None, [env.get("JUPYTER_PATH")])])
    env["PYTHONPATH"] = os.pathsep.join([str(Path(__file__).resolve().parents[2]), *filter(None, [env.get("PYTHONPATH")])])
    env["JUPYTERLAB_WORKSPACES_DIR"] = str(tmp / "workspaces")
    port = _free_port()
    cmd = [
        sys.executable, "-m", "jupyterlab", "--no-browser", "--ServerApp.token=", "--ServerApp.password=",
        "--ServerApp.ip=127.0.0.1", f"--port={port}", "--ServerApp.port_retries=0",
        f"--ServerApp.root_dir={root}", "--LabApp.extension_manager=readonly",
        "--ServerApp.disable_check_xsrf=True", "--LabApp.news_url=", "--LabApp.expose_app_in_browser=True", "--LabApp.check_for_updates_class=jupyterlab.NeverCheckForUpdate",
    ]
    if os.geteuid() == 0:
        cmd.append("--allow-root")
    log = open(tmp / "lab.log", "w")
    proc = subprocess.Popen(cmd, env=env, stdout=log, stderr=subprocess.STDOUT, start_new_session=True)
    url = f"http://127.0.0.1:{port}/api/status"
    deadline = time.time() + 90
    while time.time() < deadline:
        if proc.poll() is not None:
            break
        try:
            with urllib.request.urlopen(url, timeout=2) as r:
                if r.status == 200:
                    break
        except OSError:
            time.sleep(0.3)
    else:
        proc.kill()
        raise RuntimeError("JupyterLab did not start: " + (tmp / "lab.log").read_text()[-2000:])
    if proc.poll() is not None:
        raise RuntimeError("JupyterLab exited: " + (tmp / "lab.log").read_text()[-2000:])
    try:
        yield Lab(root, port, proc)
    finally:
        try:
            os.killpg(proc.pid, signal.SIGTERM)
            proc.wait(timeout=15)
        except (ProcessLookupError, subprocess.TimeoutExpired):
            os.killpg(proc.pid, signal.SIGKILL)
        log.close()
        shutil.rmtree(tmp, ignore_errors=True)


@pytest.fixture(scope="session")
def browser_context():
    from playwright.sync_api import sync_playwright

    exe = chromium_path()
    profile = tempfile.mkdtemp(prefix="chemcheck-chromium-")
    with sync_playwright() as p:
        ctx = p.chromium.launch_persistent_context(
            profile,
            executable_path=exe,
            headless=True,
            args=[
                "--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                "--disable-background-networking", "--disable-component-update", "--disable-sync",
            ],
            viewport={"width": 1400, "height": 1000},
        )
        try:
            yield ctx
        finally:
            ctx.close()
            shutil.rmtree(profile, ignore_errors=True)


@pytest.fixture
def page(browser_context):
    pg = browser_context.new_page()
    errors: list[str] = []
    pg.on("pageerror", lambda e: errors.append(str(e)))
    pg.page_errors = errors  # type: ignore[attr-defined]
    yield pg
    pg.close()


KERNEL_READY = """
async () => {
  const app = window.jupyterapp;
  const w = app && app.shell.currentWidget;
  if (!w || !w.sessionContext) { return false; }
  await w.context.ready;
  await w.sessionContext.ready;
  const k = w.sessionContext.session && w.sessionContext.session.kernel;
  return !!k && k.connectionStatus === 'connected' && k.status === 'idle';
}
"""


def open_notebook(page, lab: Lab, name: str, *, wait_kernel: bool = True):
    page.goto(f"{lab.url}/lab/tree/{name}?reset")
    page.wait_for_selector(".jp-Notebook", timeout=60_000)
    if wait_kernel:
        page.wait_for_function(KERNEL_READY, timeout=90_000, polling=250)


def run_all_cells(page):
    page.evaluate("window.jupyterapp.commands.execute('notebook:run-all-cells')")


def run_first_cell(page):
    page.evaluate(
        """async () => {
          const app = window.jupyterapp;
          const nb = app.shell.currentWidget.content;
          nb.activeCellIndex = 0;
          await app.commands.execute('notebook:run-cell');
        }"""
    )


def save_notebook(page, timeout: float = 60.0):
    """Save every open notebook and wait until each is clean on disk.

    The save is awaited in the page (its failure is reported, not lost); a dialog JupyterLab
    raises on the way (the file changed on disk, a kernel question) is answered so the save
    goes through, and its text is part of the failure message if the save never completes.
    """
    start = """() => {
          window.__ccSave = window.__ccSave || {};
          for (const w of window.jupyterapp.shell.widgets('main')) {
            if (!w.context || !w.context.model) continue;
            const path = w.context.path;
            if (window.__ccSave[path] === 'pending') continue;
            window.__ccSave[path] = 'pending';
            w.context.save().then(
              () => { window.__ccSave[path] = w.context.model.dirty ? 'dirty' : 'saved'; },
              err => { window.__ccSave[path] = 'failed: ' + err; }
            );
          }
        }"""
    page.evaluate("() => { window.__ccSave = {}; }")
    page.evaluate(start)
    deadline = time.monotonic() + timeout
    seen, attempts = [], 1
    while True:
        states = page.evaluate("() => window.__ccSave")
        if states and all(state == "saved" for state in states.values()):
            return
        dialog = page.locator(".jp-Dialog")
        if dialog.count():
            seen.append(dialog.first.inner_text())
            overwrite = dialog.first.locator("button", has_text="Overwrite")
            (overwrite if overwrite.count() else dialog.first.locator(".jp-mod-accept")).first.click()
        elif attempts < 4 and any(s != "pending" and s != "saved" for s in states.values()):
            attempts += 1  # changed again after the save (kernel metadata), or the save failed
            page.evaluate(start)
        if time.monotonic() > deadline:
            raise AssertionError(f"notebook not saved within {timeout} s: {states}; dialogs seen: {seen}")
        time.sleep(0.25)