"""The report renderer and the review panel in JupyterLab, in real Chromium."""

import copy
import json
import os
import subprocess
import sys
from pathlib import Path

import pytest

import chemcheck

from .conftest import code_cell, open_notebook, save_notebook

pytestmark = pytest.mark.browser

SHORT = "CCCCN.CC(=O)Cl>>CCCCNC(C)=O"
FLAGGED = "Nc1ccccc1.CC(=O)Cl>AlCl3>CC(=O)c1ccc(N)cc1"


def report_cell(reaction, cell_id, metadata=None, count=None):
    bundle = chemcheck.check(reaction)._repr_mimebundle_()
    cell = code_cell(
        f"chemcheck.check({reaction!r})",
        outputs=[{"output_type": "display_data", "data": bundle, "metadata": {}}],
        metadata=metadata,
        cell_id=cell_id,
    )
    cell["execution_count"] = count
    return cell


def test_hovering_a_finding_highlights_its_atoms(lab, page):
    lab.write_notebook("hover.ipynb", [report_cell(FLAGGED, "h1")])
    open_notebook(page, lab, "hover.ipynb", wait_kernel=False)
    finding = page.locator('.cc-finding[data-rule="lewis-acid-quenched-by-amine"]').first
    finding.wait_for(timeout=60_000)
    assert page.locator(".cc-scheme-overlay circle").count() == 0
    finding.hover()
    page.wait_for_function("() => document.querySelectorAll('.cc-scheme-overlay circle').length >= 1")
    # keyboard: focusing a finding highlights too
    page.mouse.move(0, 0)
    page.wait_for_function("() => document.querySelectorAll('.cc-scheme-overlay circle').length === 0")
    finding.focus()
    page.wait_for_function("() => document.querySelectorAll('.cc-scheme-overlay circle').length >= 1")


def test_acknowledgement_is_stored_in_the_notebook(lab, page):
    # start with no reviewer name in the settings (an earlier test may have set one)
    settings = lab.root.parent / "settings" / "chemcheck-jupyterlab" / "review.jupyterlab-settings"
    settings.parent.mkdir(parents=True, exist_ok=True)
    settings.write_text(json.dumps({"reviewerName": ""}))
    lab.write_notebook("ack.ipynb", [report_cell(SHORT, "a1")])
    open_notebook(page, lab, "ack.ipynb", wait_kernel=False)
    item = page.locator('.jp-OutputArea-output .cc-finding[data-rule="acid-scavenger-short"]').first
    item.wait_for(timeout=60_000)
    item.locator(".cc-ack-button").click()
    item.locator(".cc-ack-note-input").fill("2 equiv of amine used, see cell 4")
    item.locator(".cc-ack-save").click()
    # no reviewer name in the settings yet: asked for once, never a made-up guest name
    page.wait_for_selector(".jp-Dialog input", timeout=30_000)
    page.locator(".jp-Dialog input").fill("R. Reviewer")
    page.locator(".jp-Dialog .jp-mod-accept").click()
    page.wait_for_selector('.jp-OutputArea-output .cc-finding.cc-acknowledged[data-rule="acid-scavenger-short"]', timeout=30_000)
    save_notebook(page)
    data = json.loads((lab.root / "ack.ipynb").read_text())
    [ack] = data["cells"][0]["metadata"]["chemcheck"]["acknowledgements"]
    assert ack["rule"] == "acid-scavenger-short" and ack["note"] == "2 equiv of amine used, see cell 4"
    assert ack["who"] == "R. Reviewer" and ack["when"]
    # the exported page keeps the acknowledgement and the severity colour
    out = lab.root / "ack-export.html"
    subprocess.run(
        [sys.executable, "-m", "nbconvert", "--to", "chemcheck.export.ChemcheckHTMLExporter",
         "--output", out.stem, str(lab.root / "ack.ipynb")],
        check=True, capture_output=True, timeout=300,
    )
    html = out.read_text()
    assert "Acknowledged by R. Reviewer" in html and "2 equiv of amine used, see cell 4" in html
    assert "#f9a825" in html  # the warning badge
    # and so does a plain HTML export: the acknowledgement is written into the report's static HTML
    subprocess.run(
        [sys.executable, "-m", "nbconvert", "--to", "html", "--output", "ack-plain", str(lab.root / "ack.ipynb")],
        check=True, capture_output=True, timeout=300,
    )
    plain = (lab.root / "ack-plain.html").read_text()
    assert "acknowledged by R. Reviewer" in plain and "2 equiv of amine used, see cell 4" in plain
    assert "#f9a825" in plain
    # the group's CI sees it
    proc = subprocess.run(
        [sys.executable, "-m", "chemcheck", "review", str(lab.root / "ack.ipynb"), "--fail-on", "warning"],
        capture_output=True, text=True, timeout=300,
    )
    assert proc.returncode == 0, proc.stdout + proc.stderr
    assert "1 acknowledged" in proc.stdout
    # and it survives a reload
    page.reload()
    page.wait_for_selector('.jp-OutputArea-output .cc-finding.cc-acknowledged[data-rule="acid-scavenger-short"]', timeout=60_000)
    assert "Acknowledged by" in page.locator(".jp-OutputArea-output .cc-acknowledged").first.inner_text()


def test_panel_lists_reports_and_jumps_to_a_cell(lab, page):
    cells = [
        {"cell_type": "markdown", "id": "p0", "metadata": {}, "source": "# Plan"},
        report_cell(SHORT, "p1", count=2),
        code_cell("x = 1", cell_id="p2"),
        report_cell(FLAGGED, "p3", count=5),
    ]
    lab.write_notebook("panel.ipynb", cells)
    open_notebook(page, lab, "panel.ipynb", wait_kernel=False)
    page.wait_for_selector(".jp-OutputArea-output .cc-report", timeout=60_000)
    page.evaluate("window.jupyterapp.commands.execute('chemcheck:open-review')")
    page.wait_for_function("() => document.querySelectorAll('.cc-review-entry').length === 2", timeout=30_000)
    entries = page.locator(".cc-review-entry")
    # rows by the execution count the prompt shows ([2], [5]), markdown cells not counted
    assert page.locator(".cc-review-cell").all_inner_texts() == ["[2]", "[5]"]
    # compounds by label, the reaction SMILES only in the tooltip
    labels = page.locator(".cc-review-labels").all_inner_texts()
    assert labels[1].startswith("aniline (1) + acetyl chloride (2)"), labels
    assert "Nc1ccccc1" not in entries.nth(1).inner_text()
    assert "1 warning" in entries.nth(0).inner_text()
    panel_width = page.locator("#chemcheck-review").evaluate("n => n.getBoundingClientRect().width")
    assert panel_width >= 300, panel_width
    entries.nth(1).locator(".cc-review-jump").click()
    page.wait_for_function("() => window.jupyterapp.shell.currentWidget.content.activeCellIndex === 3")
    from .test_report_renders import shot

    shot(page.locator("#chemcheck-review"), "review-panel.png")
    # the palette command jumps to the next finding still to acknowledge
    page.evaluate(
        "window.jupyterapp.shell.currentWidget.content.activeCellIndex = 0;"
        "window.jupyterapp.commands.execute('chemcheck:next-unacknowledged')"
    )
    page.wait_for_function("() => window.jupyterapp.shell.currentWidget.content.activeCellIndex === 1")
    page.wait_for_function("() => document.activeElement && document.activeElement.matches('.cc-finding')")
    assert page.evaluate("() => window.jupyterapp.commands.hasCommand('chemcheck:next-unacknowledged')")
    # the severity filter hides the notes
    page.locator(".cc-review-filter").select_option("error")
    page.wait_for_function(
        "() => [...document.querySelectorAll('.cc-review-finding')].every(n => n.classList.contains('cc-error'))"
    )


HOSTILE = '<img src=x onerror="window.__pwned=1"><script>window.__pwned=2</script>'


def hostile_bundle():
    bundle = chemcheck.check(SHORT)._repr_mimebundle_()
    payload = copy.deepcopy(bundle[chemcheck.MIME_TYPE])
    payload["input"]["reaction"] = HOSTILE
    for c in payload["components"]:
        c["text"] = HOSTILE
        c["name"] = HOSTILE
        c["smiles"] = HOSTILE
    for f in payload["findings"]:
        f["message"] = "Hostile message " + HOSTILE
        f["fix"] = "javascript:window.__pwned=3"
        f["references"] = ["javascript:window.__pwned=4"]
    for w in payload.get("workup", []):
        w["message"] = HOSTILE
    payload["drawing"]["scheme_svg"] = '<svg xmlns="http://www.w3.org/2000/svg" onload="window.__pwned=5"><script>window.__pwned=6</script></svg>'
    bundle[chemcheck.MIME_TYPE] = payload
    return bundle


@pytest.mark.parametrize("trusted", [False, True])
def test_hostile_payload_renders_as_text(lab, page, trusted):
    name = f"hostile-{trusted}.ipynb"
    ack = {"acknowledgements": [{"finding": "x", "rule": "acid-scavenger-short", "who": HOSTILE, "when": HOSTILE, "note": HOSTILE}]}
    cell = code_cell("chemcheck.check(...)", outputs=[{"output_type": "display_data", "data": hostile_bundle(), "metadata": {}}],
                     metadata={"chemcheck": ack}, cell_id=f"x{int(trusted)}")
    path = lab.write_notebook(name, [cell])
    if trusted:
        jupyter = Path(sys.executable).with_name("jupyter")
        subprocess.run([str(jupyter), "trust", str(path)], check=True, capture_output=True, env=dict(os.environ))
    open_notebook(page, lab, name, wait_kernel=False)
    page.wait_for_selector(".jp-OutputArea-output .cc-report", timeout=60_000)
    page.wait_for_timeout(1000)
    assert page.evaluate("() => window.__pwned") is None
    report = page.locator(".jp-OutputArea-output .cc-report").first
    assert "<script>" in report.inner_text()  # shown as text
    assert report.locator("script").count() == 0
    assert report.locator("img[onerror]").count() == 0
    assert report.locator("a[href^='javascript']").count() == 0
    page.evaluate("window.jupyterapp.commands.execute('chemcheck:open-review')")
    page.wait_for_selector(".cc-review-entry", timeout=30_000)
    page.wait_for_timeout(500)
    assert page.evaluate("() => window.__pwned") is None
