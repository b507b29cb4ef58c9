import os
import shutil
from pathlib import Path

import pytest

ROOT = Path(__file__).resolve().parent.parent
SHARED_PKA = ROOT.parent / "shared" / "data" / "pka"


def chromium_path() -> str | None:
    return shutil.which("chromium") or shutil.which("chromium-browser")


@pytest.fixture(scope="session")
def pka_dataset_dir() -> Path:
    """The IUPAC digitized pKa subset (CC BY-NC; never shipped): tests read it from ../shared."""
    if not (SHARED_PKA / "amine_pka_dev.csv").exists():
        pytest.skip(f"pKa reference data not found at {SHARED_PKA} (tests only; see its README)")
    return SHARED_PKA


def pytest_collection_modifyitems(config, items):
    if chromium_path():
        return
    skip = pytest.mark.skip(
        reason="chromium is not installed: install Debian's 'chromium' package (make test does, as root)"
    )
    for item in items:
        if "browser" in item.keywords:
            item.add_marker(skip)


os.environ.setdefault("PYDEVD_DISABLE_FILE_VALIDATION", "1")
# in the tests an internal error in a rule fails loudly instead of becoming a note
os.environ["CHEMCHECK_STRICT"] = "1"
