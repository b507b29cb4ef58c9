"""The wheel carries the prebuilt extension: installed in a fresh environment with no node on
PATH, JupyterLab lists it as enabled."""

import os
import subprocess
import sys
import zipfile
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent


@pytest.fixture(scope="module")
def wheel(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("wheel")
    subprocess.run(
        [sys.executable, "-m", "pip", "wheel", "--no-deps", "--no-build-isolation", "-q", "-w", str(out), str(ROOT)],
        check=True, capture_output=True, text=True, timeout=600,
    )
    [whl] = list(out.glob("chemcheck-*.whl"))
    return whl


def test_wheel_contains_the_labextension_and_schema(wheel):
    names = zipfile.ZipFile(wheel).namelist()
    base = "chemcheck-0.1.0.data/data/share/jupyter/labextensions/chemcheck-jupyterlab/"
    assert base + "package.json" in names
    assert base + "static/3Dmol-min.js" in names
    assert base + "install.json" in names
    assert any(n.startswith(base + "schemas/") for n in names)
    assert "chemcheck/schema/report.schema.json" in names


def test_extension_enabled_in_a_fresh_environment_without_node(wheel, tmp_path):
    venv = tmp_path / "env"
    subprocess.run([sys.executable, "-m", "venv", str(venv)], check=True, timeout=300)
    pip = venv / "bin" / "pip"
    env = {"PATH": str(venv / "bin"), "HOME": str(tmp_path), "PIP_DISABLE_PIP_VERSION_CHECK": "1"}
    for var in ("PIP_INDEX_URL", "PIP_EXTRA_INDEX_URL", "PIP_FIND_LINKS", "PIP_CONFIG_FILE", "PIP_CACHE_DIR"):
        if var in os.environ:
            env[var] = os.environ[var]
    env.setdefault("PIP_CACHE_DIR", str(Path.home() / ".cache" / "pip"))
    subprocess.run([str(pip), "install", "-q", "jupyterlab>=4.4,<5"], check=True, env=env, timeout=900, capture_output=True)
    subprocess.run([str(pip), "install", "-q", "--no-deps", str(wheel)], check=True, env=env, timeout=300, capture_output=True)
    import shutil

    assert shutil.which("node", path=env["PATH"]) is None  # no node for this user
    proc = subprocess.run(
        [str(venv / "bin" / "jupyter"), "labextension", "list"], env=env, capture_output=True, text=True, timeout=300
    )
    text = proc.stdout + proc.stderr
    line = next(ln for ln in text.splitlines() if "chemcheck-jupyterlab" in ln)
    assert "enabled" in line and "OK" in line, text
