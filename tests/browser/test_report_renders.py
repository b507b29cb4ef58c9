"""A report from a real chemcheck.check(...) call, rendered by the extension in Chromium."""

import pytest

from .conftest import code_cell, open_notebook, run_first_cell

pytestmark = pytest.mark.browser


def test_report_from_a_real_check_renders_with_the_custom_renderer(lab, page):
    lab.write_notebook(
        "render.ipynb",
        [code_cell("import chemcheck\nchemcheck.check('CCN.CC(=O)Cl>Et3N>CCNC(C)=O')")],
    )
    open_notebook(page, lab, "render.ipynb")
    run_first_cell(page)
    report = page.wait_for_selector(".jp-OutputArea-output .cc-report", timeout=60_000)
    text = report.inner_text()
    assert "HCl is not drawn" in text
    assert "unbalanced-equation" in text
    # the custom renderer won, not the static HTML fallback of the same bundle
    assert page.locator(".jp-OutputArea-output .chemcheck-static-report").count() == 0
    # the scheme is drawn as an image
    img = page.locator(".cc-scheme-img").first
    assert img.evaluate("i => i.complete && i.naturalWidth > 0")
    assert page.page_errors == []
