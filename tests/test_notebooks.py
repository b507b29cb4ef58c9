"""The demo notebooks run, and their reports survive saving, HTML export and a viewer that does
not know chemcheck (the text/html and text/plain parts of each bundle)."""

from functools import lru_cache
from html import escape, unescape
from pathlib import Path

import nbformat
import pytest
from nbclient import NotebookClient
from nbconvert import HTMLExporter

import chemcheck

NOTEBOOKS = sorted((Path(__file__).parent.parent / "notebooks").glob("*.ipynb"))


@lru_cache(maxsize=None)
def _executed(path: Path) -> str:
    nb = nbformat.read(path, as_version=4)
    NotebookClient(nb, timeout=180, kernel_name="python3", resources={"metadata": {"path": str(path.parent)}}).execute()
    return nbformat.writes(nb)


def _run(path: Path, tmp_path: Path) -> nbformat.NotebookNode:
    saved = tmp_path / path.name
    saved.write_text(_executed(path))  # saved to disk and read back, as a colleague would
    return nbformat.read(saved, as_version=4)


def _reports(nb):
    for cell in nb.cells:
        for out in cell.get("outputs", []):
            data = out.get("data", {})
            if chemcheck.MIME_TYPE in data:
                yield data


@pytest.mark.parametrize("path", NOTEBOOKS, ids=[p.stem for p in NOTEBOOKS])
def test_notebook_runs_and_survives_save_and_export(path, tmp_path):
    nb = _run(path, tmp_path)
    errors = [o for c in nb.cells for o in c.get("outputs", []) if o.get("output_type") == "error"]
    assert errors == []
    reports = list(_reports(nb))
    assert reports, "every demo notebook shows at least one report"
    html_export, _ = HTMLExporter().from_notebook_node(nb)
    for data in reports:
        payload = data[chemcheck.MIME_TYPE]
        for f in payload["findings"]:
            # the static parts a viewer without chemcheck shows; a hazard caution without the
            # deferral sentence (its fix), which the Safety section says once
            fix = f.get("fix") or ""
            said = f["message"][: -len(fix)].rstrip() if fix and f["message"].endswith(fix) else f["message"]
            assert escape(said) in data["text/html"]
            assert said in data["text/plain"]
            # and the nbconvert export (which re-serialises entities)
            assert said in unescape(html_export)


def test_demo_notebooks_cover_the_finding_families(tmp_path):
    seen = set()
    for path in NOTEBOOKS:
        nb = _run(path, tmp_path)
        for data in _reports(nb):
            seen |= {f["rule"] for f in data[chemcheck.MIME_TYPE]["findings"]}
    for rule in (
        "lewis-acid-quenched-by-amine", "acid-scavenger-short", "amine-salt-not-freed",
        "nitrogen-cannot-react-as-drawn", "overalkylation-risk", "uphill-proton-transfer",
        "reagent-solvolysis", "hazard-caution", "amount-mismatch", "unbalanced-equation",
    ):
        assert rule in seen, rule
