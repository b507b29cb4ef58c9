"""Malformed saved reports in real Chromium: each shows a short notice for that output only; every
cell of the notebook renders and the review panel lists the valid reports. Acknowledging needs
the reviewer name from the settings."""

import copy
import json

import pytest

import chemcheck

from .conftest import code_cell, open_notebook, save_notebook

pytestmark = pytest.mark.browser

SHORT = "CCCCN.CC(=O)Cl>>CCCCNC(C)=O"
FLAGGED = "Nc1ccccc1.CC(=O)Cl>AlCl3>CC(=O)c1ccc(N)cc1"
UNREADABLE = "This chemcheck output could not be read."


def _bundle(reaction, damage=None):
    bundle = chemcheck.check(reaction)._repr_mimebundle_()
    if damage:
        payload = copy.deepcopy(bundle[chemcheck.MIME_TYPE])
        damage(payload)
        bundle[chemcheck.MIME_TYPE] = payload
    return bundle


def _cell(cell_id, bundle):
    return code_cell("chemcheck.check(...)", outputs=[{"output_type": "display_data", "data": bundle, "metadata": {}}], cell_id=cell_id)


def _set(key, value):
    def damage(payload):
        target, _, last = key.rpartition(".")
        node = payload
        for part in filter(None, target.split(".")):
            node = node[int(part)] if part.isdigit() else node[part]
        if value is _DELETE:
            del node[last]
        else:
            node[int(last) if last.isdigit() else last] = value

    return damage


_DELETE = object()

# the inputs of the issue: each once hid the rest of its notebook
DAMAGES = {
    "atoms-null": _set("findings.0.atoms", None),
    "counts-missing": _set("counts", _DELETE),
    "null-finding": lambda p: p["findings"].append(None),
    "pka-text": _set("basicity.0.pka", "10.6"),
    "atoms-negative": _set("findings.0.atoms", [[-1, 0]]),
}


def test_malformed_reports_hide_nothing(lab, page):
    cells = [_cell("ok1", _bundle(SHORT))]
    cells += [_cell(name, _bundle(SHORT, damage)) for name, damage in DAMAGES.items()]
    cells += [_cell("ok2", _bundle(FLAGGED)), {"cell_type": "markdown", "id": "end", "metadata": {}, "source": "The end of the plan."}]
    lab.write_notebook("malformed.ipynb", cells)
    open_notebook(page, lab, "malformed.ipynb", wait_kernel=False)
    page.wait_for_function(
        f"() => document.querySelectorAll('.jp-OutputArea-output .cc-unreadable').length === {len(DAMAGES)}"
        " && document.querySelectorAll('.jp-OutputArea-output .cc-report').length === 2",
        timeout=60_000,
    )
    # every cell is there, the last one (markdown) rendered
    assert page.evaluate("() => window.jupyterapp.shell.currentWidget.content.widgets.length") == len(cells)
    page.evaluate(
        "async () => { const nb = window.jupyterapp.shell.currentWidget.content;"
        " nb.activeCellIndex = nb.widgets.length - 1; await nb.scrollToItem(nb.widgets.length - 1); }"
    )
    page.wait_for_function("() => [...document.querySelectorAll('.jp-MarkdownOutput')].some(n => n.textContent.includes('The end of the plan.'))", timeout=30_000)
    notices = page.locator(".jp-OutputArea-output .cc-unreadable")
    for i in range(len(DAMAGES)):
        assert UNREADABLE in notices.nth(i).inner_text()
    assert "$.findings[0].atoms" in notices.nth(0).inner_text()  # says where
    # the valid reports still render their findings
    assert page.locator('.jp-OutputArea-output .cc-finding[data-rule="acid-scavenger-short"]').count() >= 1
    assert page.locator('.jp-OutputArea-output .cc-finding[data-rule="lewis-acid-quenched-by-amine"]').count() >= 1
    # the panel lists the valid reports
    page.evaluate("window.jupyterapp.commands.execute('chemcheck:open-review')")
    page.wait_for_function("() => document.querySelectorAll('.cc-review-entry').length === 2", timeout=30_000)
    entries = page.locator(".cc-review-entry")
    # rows are named by execution count and compound labels: the first valid report is the
    # acylation, the second the Friedel-Crafts reaction
    assert "acetyl chloride" in entries.nth(0).inner_text()
    assert "Too little base" in entries.nth(0).inner_text()
    assert "Lewis acid" in entries.nth(1).inner_text()
    assert page.page_errors == []


def _settings_file(lab):
    # JUPYTERLAB_SETTINGS_DIR of the test lab (tests/browser/conftest.py)
    return lab.root.parent / "settings" / "chemcheck-jupyterlab" / "review.jupyterlab-settings"


@pytest.fixture
def no_reviewer_name(lab):
    path = _settings_file(lab)
    saved = path.read_text() if path.exists() else None
    if path.exists():
        path.unlink()
    yield
    if saved is not None:
        path.write_text(saved)


def test_acknowledging_needs_a_reviewer_name(lab, page, no_reviewer_name):
    lab.write_notebook("who.ipynb", [_cell("w1", _bundle(SHORT))])
    open_notebook(page, lab, "who.ipynb", wait_kernel=False)
    item = page.locator('.jp-OutputArea-output .cc-finding[data-rule="acid-scavenger-short"]').first
    item.wait_for(timeout=60_000)
    item.locator(".cc-ack-button").click()
    item.locator(".cc-ack-note-input").fill("2 equiv used")
    item.locator(".cc-ack-save").click()
    page.wait_for_selector(".jp-Dialog", timeout=30_000)
    assert "Reviewer name" in page.locator(".jp-Dialog").inner_text()
    page.locator(".jp-Dialog button").last.click()
    page.wait_for_selector(".jp-Dialog", state="detached", timeout=30_000)
    meta = page.evaluate("() => window.jupyterapp.shell.currentWidget.content.widgets[0].model.getMetadata('chemcheck')")
    assert meta is None  # nothing stored under a guest name
    # with the name set in the settings, the acknowledgement records it
    path = _settings_file(lab)
    path.parent.mkdir(parents=True, exist_ok=True)
    path.write_text(json.dumps({"reviewerName": "A. Reviewer"}))
    open_notebook(page, lab, "who.ipynb", wait_kernel=False)
    item = page.locator('.jp-OutputArea-output .cc-finding[data-rule="acid-scavenger-short"]').first
    item.wait_for(timeout=60_000)
    item.locator(".cc-ack-button").click()
    item.locator(".cc-ack-note-input").fill("2 equiv used")
    item.locator(".cc-ack-save").click()
    page.wait_for_selector('.jp-OutputArea-output .cc-finding.cc-acknowledged[data-rule="acid-scavenger-short"]', timeout=30_000)
    save_notebook(page)
    [ack] = json.loads((lab.root / "who.ipynb").read_text())["cells"][0]["metadata"]["chemcheck"]["acknowledgements"]
    assert ack["who"] == "A. Reviewer"
