"""A report as a chemist reads it, rendered by the extension in Chromium: the verdict, tables
that never break a number, text contrast in the light and the dark theme, rings that clear the
atom labels. Screenshots are kept as test artefacts (tests/browser/artifacts/); with
CHEMCHECK_DOCS_IMAGES=1 the ones the README shows are copied to docs/images/."""

import os
import shutil
from pathlib import Path

import pytest

import chemcheck

from .conftest import code_cell, open_notebook, run_first_cell

pytestmark = pytest.mark.browser

ARTIFACTS = Path(__file__).resolve().parent / "artifacts"
DOCS_IMAGES = Path(__file__).resolve().parents[2] / "docs" / "images"
DOCS_SHOWN = {
    "report-light-1400.png",
    "report-dark-1400.png",
    "review-panel.png",
}  # what the README shows

# a demo scenario of our own: an amide at the bench and the same amide at 100 g scale
AMIDE = "NCc1ccc(F)cc1.O=C(Cl)c1ccco1>CCN(CC)CC.ClCCl>O=C(NCc1ccc(F)cc1)c1ccco1"
AMIDE_AMOUNTS = {
    "NCc1ccc(F)cc1": "1.25 g",
    "O=C(Cl)c1ccco1": "1.1 equiv",
    "CCN(CC)CC": "1.5 equiv",
    "ClCCl": "20 mL",
}
LARGE = "NCc1ccccc1.CC(=O)Cl>CCN(CC)CC.ClCCl>CC(=O)NCc1ccccc1"
LARGE_AMOUNTS = {
    "NCc1ccccc1": "107 g",
    "CC(=O)Cl": "1.1 equiv",
    "CCN(CC)CC": "1.5 equiv",
    "ClCCl": "1.25 L",
}
FLAGGED = "Nc1ccccc1.CC(=O)Cl>AlCl3>CC(=O)c1ccc(N)cc1"


def report_cell(reaction, amounts, cell_id, count):
    bundle = chemcheck.check(reaction, amounts)._repr_mimebundle_()
    cell = code_cell(
        f"chemcheck.check({reaction!r}, {amounts!r})",
        outputs=[{"output_type": "display_data", "data": bundle, "metadata": {}}],
        cell_id=cell_id,
    )
    cell["execution_count"] = count
    return cell, bundle


def shot(target, name: str) -> Path:
    ARTIFACTS.mkdir(exist_ok=True)
    path = ARTIFACTS / name
    target.screenshot(path=str(path))
    if os.environ.get("CHEMCHECK_DOCS_IMAGES") == "1" and name in DOCS_SHOWN:
        DOCS_IMAGES.mkdir(parents=True, exist_ok=True)
        shutil.copy(path, DOCS_IMAGES / name)
    return path


def test_report_from_a_real_check_renders_with_the_custom_renderer(lab, page):
    lab.write_notebook(
        "render.ipynb",
        [code_cell("import chemcheck\nchemcheck.check('CCN.CC(=O)Cl>Et3N>CCNC(C)=O')")],
    )
    open_notebook(page, lab, "render.ipynb")
    run_first_cell(page)
    report = page.wait_for_selector(".jp-OutputArea-output .cc-report", timeout=60_000)
    # the missing HCl is in the Balance section (closed by default), not a note in the list
    assert report.query_selector('.cc-finding[data-rule="unbalanced-equation"]') is None
    balance = report.query_selector("details.cc-balance")
    assert balance.evaluate("d => !d.open")
    assert "HCl is not drawn" in balance.text_content()
    # the custom renderer won, not the static HTML fallback of the same bundle
    assert page.locator(".jp-OutputArea-output .chemcheck-static-report").count() == 0
    # the scheme is drawn as an image
    img = page.locator(".cc-scheme-img").first
    assert img.evaluate("i => i.complete && i.naturalWidth > 0")
    assert page.page_errors == []


# Measured in the page: every table cell and header, every text node of the report.
MEASURE = r"""
() => {
  const parse = c => { const m = c.match(/rgba?\(([^)]+)\)/); if (!m) return null;
    const v = m[1].split(',').map(Number); return [v[0], v[1], v[2], v.length > 3 ? v[3] : 1]; };
  const over = (top, base) => { const a = top[3];
    return [0, 1, 2].map(i => top[i] * a + base[i] * (1 - a)).concat([1]); };
  const lum = c => { const f = x => { x /= 255; return x <= 0.04045 ? x / 12.92 : ((x + 0.055) / 1.055) ** 2.4; };
    return 0.2126 * f(c[0]) + 0.7152 * f(c[1]) + 0.0722 * f(c[2]); };
  const background = el => { const layers = [];
    for (let n = el; n && n.nodeType === 1; n = n.parentElement) {
      const c = parse(getComputedStyle(n).backgroundColor);
      if (c && c[3] > 0) { layers.push(c); if (c[3] >= 1) break; } }
    let bg = [255, 255, 255, 1];
    for (const c of layers.reverse()) bg = over(c, bg);
    return bg; };
  const out = { cells: 0, overflow: [], broken: [], texts: 0, low: [] };
  const reports = [...document.querySelectorAll('.jp-OutputArea-output .cc-report')];
  for (const r of reports) for (const d of r.querySelectorAll('details')) d.open = true;
  for (const r of reports) {
    for (const cell of r.querySelectorAll('.cc-table th, .cc-table td')) {
      if (!cell.textContent.trim()) continue;
      out.cells++;
      if (cell.scrollWidth > cell.clientWidth + 1) out.overflow.push(cell.textContent);
      if (cell.classList.contains('cc-num') || cell.tagName === 'TH') {
        const range = document.createRange(); range.selectNodeContents(cell);
        const lines = new Set([...range.getClientRects()].filter(x => x.width > 0).map(x => Math.round(x.top)));
        if (lines.size > 1) out.broken.push(cell.textContent);
      }
    }
    const walker = document.createTreeWalker(r, NodeFilter.SHOW_TEXT);
    for (let t = walker.nextNode(); t; t = walker.nextNode()) {
      const el = t.parentElement;
      if (!t.textContent.trim() || !el || el.getClientRects().length === 0) continue;
      out.texts++;
      const bg = background(el);
      const fg = over(parse(getComputedStyle(el).color), bg);
      const [a, b] = [lum(fg), lum(bg)].sort((x, y) => y - x);
      const ratio = (a + 0.05) / (b + 0.05);
      if (ratio < 4.5) out.low.push([t.textContent.trim().slice(0, 40), el.className, ratio.toFixed(2)]);
    }
  }
  return out;
}
"""


@pytest.mark.parametrize("width", [900, 1400])
@pytest.mark.parametrize("theme", ["light", "dark"])
def test_report_reads_at_every_width_in_both_themes(lab, page, width, theme):
    cells = [
        report_cell(AMIDE, AMIDE_AMOUNTS, "r1", 1)[0],
        report_cell(LARGE, LARGE_AMOUNTS, "r2", 2)[0],
        report_cell(FLAGGED, {}, "r3", 3)[0],
    ]
    name = f"reading-{theme}-{width}.ipynb"
    lab.write_notebook(name, cells)
    page.set_viewport_size({"width": width, "height": 1600})
    open_notebook(page, lab, name, wait_kernel=False)
    page.wait_for_function(
        "() => document.querySelectorAll('.jp-OutputArea-output .cc-report').length === 3",
        timeout=60_000,
    )
    want = "JupyterLab Dark" if theme == "dark" else "JupyterLab Light"
    page.evaluate(
        f"window.jupyterapp.commands.execute('apputils:change-theme', {{theme: '{want}'}})"
    )
    page.wait_for_function(
        f"() => document.body.dataset.jpThemeLight === '{str(theme == 'light').lower()}'",
        timeout=30_000,
    )
    page.wait_for_timeout(300)  # the theme's style sheet applies on the next frame
    first = page.locator(".jp-OutputArea-output .cc-report").first
    shot(first, f"report-{theme}-{width}.png")
    m = page.evaluate(MEASURE)
    assert m["cells"] > 30 and m["texts"] > 50, m
    assert m["overflow"] == [], m["overflow"]
    assert m["broken"] == [], m["broken"]
    assert m["low"] == [], m["low"]
    page.locator(".jp-OutputArea-output .cc-report").nth(1).scroll_into_view_if_needed()
    shot(
        page.locator(".jp-OutputArea-output .cc-report").nth(1), f"report-large-{theme}-{width}.png"
    )
    # the bench scale reads in mmol and g, the 100 g batch in mol and L: units fit the scale
    headers = (
        page.locator(".jp-OutputArea-output .cc-report")
        .nth(1)
        .locator(".cc-stoich th")
        .all_inner_texts()
    )
    assert "Amount (mol)" in headers and "Volume (L)" in headers, headers


def test_rings_round_highlighted_atoms_clear_their_labels(lab, page):
    cell, bundle = report_cell(FLAGGED, {}, "k1", 1)
    lab.write_notebook("rings.ipynb", [cell])
    open_notebook(page, lab, "rings.ipynb", wait_kernel=False)
    page.wait_for_selector(".jp-OutputArea-output .cc-report", timeout=60_000)
    drawing = bundle[chemcheck.MIME_TYPE]["drawing"]
    boxes = {}
    for comp in drawing["components"]:
        for (x, y), box in zip(comp["atoms"], comp["label_box"]):
            if box is not None:
                boxes[(round(x, 1), round(y, 1))] = box
    checked = 0
    for li in page.locator(".jp-OutputArea-output .cc-finding").all():
        li.focus()
        rings = page.evaluate(
            "() => [...document.querySelectorAll('.cc-scheme-overlay circle')].map(c => "
            "[+c.getAttribute('cx'), +c.getAttribute('cy'), +c.getAttribute('r'), parseFloat(getComputedStyle(c).strokeWidth)])"
        )
        for cx, cy, r, stroke in rings:
            box = boxes.get((round(cx, 1), round(cy, 1)))
            if box is None:
                continue  # an unlabelled carbon
            x, y, w, h = box
            corners = [(x, y), (x + w, y), (x, y + h), (x + w, y + h)]
            inner = r - stroke / 2
            assert all(((px - cx) ** 2 + (py - cy) ** 2) ** 0.5 < inner for px, py in corners), (
                cx,
                cy,
                r,
                box,
            )
            checked += 1
    assert checked >= 2  # the aniline N and the Al of AlCl3
    shot(page.locator(".jp-OutputArea-output .cc-report").first, "report-flagged.png")
