"""The check pad, the 3D view and a recorded report, in JupyterLab in real Chromium."""

import json

import pytest

import chemcheck

from .conftest import code_cell, open_notebook, run_all_cells, save_notebook
from .png import colour_stats

pytestmark = pytest.mark.browser


def test_pad_renders_and_follows_typing(lab, page):
    lab.write_notebook(
        "pad.ipynb",
        [code_cell("import chemcheck\np = chemcheck.pad('CCCCN.CC(=O)Cl>>CCCCNC(C)=O')\np", cell_id="pad")],
    )
    open_notebook(page, lab, "pad.ipynb")
    run_all_cells(page)
    report = page.locator(".cc-pad .cc-report")
    report.first.wait_for(timeout=60_000)
    page.wait_for_selector('.cc-pad .cc-finding[data-rule="acid-scavenger-short"]', timeout=30_000)
    box = page.locator(".cc-pad-reaction input")
    box.fill("CCCCN.CC(=O)Cl>Et3N>CCCCNC(C)=O")
    page.wait_for_function(
        "() => document.querySelector('.cc-pad .cc-report') && "
        "!document.querySelector('.cc-pad .cc-finding[data-rule=\"acid-scavenger-short\"]') && "
        "document.querySelector('.cc-pad .cc-title').textContent.includes('Et3N')",
        timeout=30_000,
    )
    # bad input: the error shows inline and the text stays as typed
    box.fill("CCCCN.NCc1ccccc>>C")
    page.wait_for_selector(".cc-pad-status .cc-pad-error", timeout=30_000)
    assert "ring closure 1 not closed" in page.locator(".cc-pad-status").inner_text()
    assert box.input_value() == "CCCCN.NCc1ccccc>>C"
    assert page.page_errors == []


# an amide coupling of our own scenario, six components as a chemist writes them
SIX = "OC(=O)c1ccc(Cl)cc1.NCc1ccc(F)cc1>CCN(C(C)C)C(C)C.CN(C)C(On1nnc2cccnc21)=[N+](C)C.F[P-](F)(F)(F)(F)F.{solvent}>O=C(NCc1ccc(F)cc1)c1ccc(Cl)cc1"


def test_pad_keystroke_to_render_time_is_measured(lab, page):
    # a benchmark figure, not a timed assertion: each edit must render; the times are written
    # to tests/browser/artifacts/pad_timing.json for docs/performance.md
    import statistics
    import time
    from pathlib import Path

    from chemcheck.display.pad import DEBOUNCE_S

    first = SIX.format(solvent="CN(C)C=O")
    lab.write_notebook(
        "pad-timing.ipynb",
        [code_cell(f"import chemcheck\np = chemcheck.pad({first!r})\np", cell_id="padt")],
    )
    open_notebook(page, lab, "pad-timing.ipynb")
    run_all_cells(page)
    page.locator(".cc-pad .cc-report").first.wait_for(timeout=60_000)
    box = page.locator(".cc-pad-reaction input")
    times = []
    solvents = ["ClCCl", "CN(C)C=O", "C1CCOC1", "CC#N"]
    for k in range(16):
        solvent = solvents[(k + 1) % len(solvents)]
        text = SIX.format(solvent=solvent)
        t0 = time.perf_counter()
        box.fill(text)
        page.wait_for_function(
            "s => { const t = document.querySelector('.cc-pad .cc-title'); return t && t.textContent.includes(s); }",
            arg=solvent,
            timeout=30_000,
        )
        times.append((time.perf_counter() - t0) * 1000)
    times.sort()
    out = {
        "edits": len(times),
        "median_ms": round(statistics.median(times), 1),
        "p95_ms": round(times[int(0.95 * (len(times) - 1))], 1),
        "debounce_ms": round(1000 * DEBOUNCE_S),
    }
    artifacts = Path(__file__).resolve().parent / "artifacts"
    artifacts.mkdir(exist_ok=True)
    (artifacts / "pad_timing.json").write_text(json.dumps(out, indent=1))
    print("pad keystroke to render:", out)
    assert len(times) == 16 and page.page_errors == []


def test_3d_view_draws_pixels(lab, page):
    lab.write_notebook("three.ipynb", [code_cell("import chemcheck\nchemcheck.view3d('Nc1ccc(C(C)=O)cc1')")])
    open_notebook(page, lab, "three.ipynb")
    run_all_cells(page)
    canvas = page.wait_for_selector(".cc-mol3d-stage canvas", timeout=60_000)
    page.wait_for_timeout(1500)  # let WebGL finish its first frame
    shot = page.locator(".cc-mol3d-stage").screenshot()
    colours, drawn = colour_stats(shot)
    assert colours > 20 and drawn > 0.01, (colours, drawn)
    assert canvas.evaluate("c => c.width > 0 && c.height > 0")
    # the library came from the extension's own static folder, not a CDN
    srcs = page.evaluate("() => [...document.scripts].map(s => s.src).filter(s => s.includes('3Dmol'))")
    assert srcs and all("/lab/extensions/chemcheck-jupyterlab/static/" in s for s in srcs)


def test_3d_view_of_a_flagged_atom_has_a_legend(lab, page):
    lab.write_notebook(
        "three-flagged.ipynb",
        [code_cell("import chemcheck\nchemcheck.view3d(chemcheck.check('Nc1ccccc1.CC(=O)Cl>AlCl3>CC(=O)c1ccc(N)cc1'), 0)")],
    )
    open_notebook(page, lab, "three-flagged.ipynb")
    run_all_cells(page)
    page.wait_for_selector(".cc-mol3d-stage canvas", timeout=60_000)
    legend = page.wait_for_selector(".cc-mol3d-legend", timeout=30_000)
    assert legend.inner_text().strip() == "flagged atom (error)"
    swatch = page.evaluate("() => getComputedStyle(document.querySelector('.cc-mol3d-swatch')).backgroundColor")
    assert swatch == "rgb(255, 20, 147)"  # HIGHLIGHT_3D["error"], #ff1493
    # the frame fits the output: the canvas is as wide as its stage
    sizes = page.evaluate(
        "() => { const s = document.querySelector('.cc-mol3d-stage').getBoundingClientRect();"
        " const c = document.querySelector('.cc-mol3d-stage canvas').getBoundingClientRect();"
        " return [s.width, c.width, s.height, c.height]; }"
    )
    assert abs(sizes[0] - sizes[1]) <= 2 and abs(sizes[2] - sizes[3]) <= 2, sizes
    page.wait_for_timeout(1500)  # let WebGL finish its first frame
    from .test_report_renders import shot

    shot(page.locator(".cc-mol3d").first, "view-3d.png")


def test_recorded_report_renders_from_the_file_alone(lab, page):
    lab.write_notebook(
        "record.ipynb",
        [code_cell("import chemcheck\np = chemcheck.pad('CCCCN.CC(=O)Cl>>CCCCNC(C)=O')\np", cell_id="rec")],
    )
    open_notebook(page, lab, "record.ipynb")
    run_all_cells(page)
    page.wait_for_selector(".cc-pad .cc-report", timeout=60_000)
    page.locator(".cc-pad-record").click()
    # the record is an output of the cell, outside the widget
    page.wait_for_function(
        "() => [...document.querySelectorAll('.jp-OutputArea-output .cc-report')]"
        ".some(n => !n.closest('.cc-pad'))",
        timeout=30_000,
    )
    save_notebook(page)
    data = json.loads((lab.root / "record.ipynb").read_text())
    outputs = data["cells"][0]["outputs"]
    recorded = [o for o in outputs if chemcheck.MIME_TYPE in o.get("data", {})]
    assert recorded, "the recorded check is saved in the notebook file"
    assert recorded[0]["data"][chemcheck.MIME_TYPE]["input"]["reaction"] == "CCCCN.CC(=O)Cl>>CCCCNC(C)=O"
    # where no widget runs (a saved file, an export) the pad reads as a line, not a widget repr
    texts = ["".join(o.get("data", {}).get("text/plain", "")) for o in outputs]
    assert not any(t.startswith("VBox(") for t in texts), texts
    assert any(t.startswith("chemcheck pad for CCCCN.CC(=O)Cl") for t in texts), texts
    # reopen without running anything: the report renders from the file
    page.evaluate("window.jupyterapp.commands.execute('kernelmenu:shutdown')")
    page.reload()
    page.wait_for_selector(".jp-Notebook", timeout=60_000)
    page.wait_for_selector(".jp-OutputArea-output .cc-report", timeout=60_000)
    text = page.locator(".jp-OutputArea-output .cc-report").first.inner_text()
    assert "acid-scavenger-short" in text
