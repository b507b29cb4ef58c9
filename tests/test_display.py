"""The durable bundle, drawings, 3D, the check pad and the cell magic (no kernel needed)."""

import re
import xml.etree.ElementTree as ET
from html import escape

import pytest

import chemcheck
from chemcheck.display.bundle import mimebundle
from chemcheck.display.draw import draw_component
from chemcheck.display.threed import MOL3D_MIME, view3d
from chemcheck.findings import Finding
from chemcheck.magic import parse_cell

FLAGGED = "Nc1ccccc1.CC(=O)Cl>AlCl3>CC(=O)c1ccc(N)cc1"


def test_bundle_has_every_static_type():
    b = chemcheck.check(FLAGGED)._repr_mimebundle_()
    assert set(b) == {chemcheck.MIME_TYPE, "text/html", "text/plain", "image/svg+xml"}
    ET.fromstring(b["image/svg+xml"])  # well-formed SVG


def _said(f, text: str, esc=lambda x: x) -> bool:
    """A finding is in the report: whole, or (hazard cautions) without the deferral sentence,
    which the Safety section says once."""
    body = f.message[: -len(f.fix)].rstrip() if f.fix and f.message.endswith(f.fix) else f.message
    return esc(body) in text


def test_every_finding_is_in_the_html_and_the_text():
    report = chemcheck.check(FLAGGED)
    b = report._repr_mimebundle_()
    for f in report.findings:
        assert _said(f, b["text/html"], escape), f.rule
        assert _said(f, b["text/plain"]), f.rule
    html = b["text/html"].lower()
    assert "<script" not in html and "<style" not in html
    # inline colours only (severity badges and borders): nothing that positions or hides content
    for decl in re.findall(r' style="([^"]*)"', html):
        for prop in re.findall(r"([a-z-]+)\s*:", decl):
            assert prop in {
                "background-color", "color", "padding", "padding-left", "border-radius", "font-weight",
                "border-left", "margin", "text-align", "white-space", "overflow-x", "max-width",
                "height", "opacity", "font-style", "list-style",
            }, prop


def test_safety_sentence_is_said_once_and_fixes_never_repeat_the_message():
    # acetyl chloride and AlCl3: two hazard classes, one SDS / safety-review sentence
    b = chemcheck.check(FLAGGED)._repr_mimebundle_()
    for kind in ("text/html", "text/plain"):
        assert b[kind].count("institution") == 1, kind
    assert "Fix:</em> Check the SDS" not in b["text/html"]


def test_notes_are_not_acknowledged_and_the_missing_by_product_is_drawn():
    from chemcheck.display.html import render_html

    report = chemcheck.check("NCc1ccccc1.CC(=O)Cl>CCN(CC)CC>CC(=O)NCc1ccccc1")
    b = report._repr_mimebundle_()
    payload = b[chemcheck.MIME_TYPE]
    assert report.by_rule("unbalanced-equation")
    assert payload["drawing"]["by_products"] == ["HCl"]
    assert "+ HCl" in b["image/svg+xml"]
    html = render_html(payload, acknowledgements=[])
    # the note is folded into the Balance section, not listed as a finding to acknowledge
    assert "Not acknowledged" not in html
    assert "HCl is not drawn among the products" in html.split("<summary><strong>Balance")[1]


def test_payload_carries_the_inputs_so_the_check_can_be_repeated():
    report = chemcheck.check("CCCCN.CC(=O)Cl>Et3N>CCCCNC(C)=O", {"CCCCN": "1 mmol"})
    payload = report._repr_mimebundle_()[chemcheck.MIME_TYPE]
    again = chemcheck.check(payload["input"]["reaction"], payload["input"]["amounts"])
    assert [f.rule for f in again.findings] == [f.rule for f in report.findings]


def test_user_strings_are_escaped_in_the_html():
    report = chemcheck.check("CCN")
    hostile = '<img src=x onerror="alert(1)"><script>alert(2)</script>'
    report.findings = [Finding("x-y", "warning", hostile, fix=hostile, title=hostile)]
    report.components[0].name = hostile
    html = mimebundle(report)["text/html"]
    assert "<script>" not in html and "<img src=x" not in html
    assert escape(hostile) in html


def test_highlighted_atoms_are_drawn_in_the_scheme():
    report = chemcheck.check(FLAGGED)
    svg = report._repr_mimebundle_()["image/svg+xml"]
    # RDKit draws highlights as filled ellipses/paths in the severity colour (error red #DB332D)
    assert "#DB332D" in svg.upper()


def test_drawing_background_is_transparent():
    d = draw_component(chemcheck.check("c1ccccc1N").components[0].mol)
    assert "fill:#FFFFFF" not in d.svg.replace(" ", "").upper().replace("FILL:#FFFFFF;FILL-OPACITY:0", "")


def test_atom_coordinates_for_the_renderer():
    payload = chemcheck.check(FLAGGED)._repr_mimebundle_()[chemcheck.MIME_TYPE]
    comp0 = next(c for c in payload["drawing"]["components"] if c["component"] == 0)
    assert len(comp0["atoms"]) == 7
    assert all(0 <= x <= payload["drawing"]["width"] and 0 <= y <= payload["drawing"]["height"] for x, y in comp0["atoms"])


def test_predicted_products_are_drawn_in_the_payload_and_the_static_html():
    import base64
    import re

    import jsonschema

    from chemcheck.report import schema

    # no product drawn: the candidates are what the chemist sees
    b = chemcheck.check("COc1ccccc1.CC(=O)Cl>AlCl3>")._repr_mimebundle_()
    payload = b[chemcheck.MIME_TYPE]
    jsonschema.Draft202012Validator(schema()).validate(payload)
    cands = payload["predictions"][0]["candidates"]
    drawn = [c for c in cands if c.get("svg")]
    assert drawn and all(c["label"] != "none" for c in drawn)
    ET.fromstring(drawn[0]["svg"])
    imgs = re.findall(r'<img src="data:image/svg\+xml;base64,([^"]+)" alt="([^"]+)"', b["text/html"])
    alts = {alt for _data, alt in imgs}
    assert all(c["smiles"] in alts for c in drawn)
    assert any(base64.b64decode(data).decode().startswith("<svg") for data, _ in imgs)


def test_3d_view_has_hydrogens_and_highlights():
    v = view3d(chemcheck.check(FLAGGED), 0)
    b = v._repr_mimebundle_()
    assert MOL3D_MIME in b and "image/svg+xml" in b
    block = b[MOL3D_MIME]["molblock"]
    assert " H " in block  # hydrogens shown
    assert b[MOL3D_MIME]["highlights"] == [{"atom": 0, "color": "#ff1493", "severity": "error"}]


def test_3d_highlight_colours_are_far_from_every_element_colour():
    from pathlib import Path

    from chemcheck.display.threed import HIGHLIGHT_3D

    src = Path(__file__).resolve().parents[1] / "extension" / "node_modules" / "3dmol" / "src" / "colors.ts"
    if not src.exists():
        pytest.skip("3Dmol.js sources not installed (jlpm install in extension/)")
    # every element colour 3Dmol.js can draw (its Jmol, RasMol and default tables)
    table = {int(h, 16) for h in re.findall(r"\b[A-Z][a-z]?\s*:\s*0x([0-9a-fA-F]{6})", src.read_text())}
    assert len(table) > 100

    def rgb(v):
        return ((v >> 16) & 255, (v >> 8) & 255, v & 255)

    for sev, colour in HIGHLIGHT_3D.items():
        c = rgb(int(colour[1:], 16))
        nearest = min(sum((x - y) ** 2 for x, y in zip(c, rgb(e))) ** 0.5 for e in table)
        assert nearest > 60, (sev, nearest)


def test_3d_falls_back_to_2d_when_embedding_is_impossible():
    v = view3d("F[I](F)(F)(F)(F)F", 0)
    b = v._repr_mimebundle_()
    assert MOL3D_MIME not in b and "image/svg+xml" in b and "2D drawing shown" in b["text/plain"]


def test_3d_bad_component():
    with pytest.raises(chemcheck.ChemcheckError, match="out of range"):
        view3d("CCN", 3)


def test_check_pad_updates_and_keeps_bad_input():
    p = chemcheck.pad("CCCCN.CC(=O)Cl>>CCCCNC(C)=O")
    assert p.report is not None and p.report.by_rule("acid-scavenger-short")
    assert len(p.rows.children) == 3  # one amount row per component
    p.reaction.value = "CCCCN.CC(=O)Cl>Et3N>CCCCNC(C)=O"
    p.refresh()
    assert not p.report.by_rule("acid-scavenger-short")
    p.reaction.value = "CCCCN.NCc1ccccc>>C"
    p.refresh()
    assert "ring closure 1 not closed" in p.status.value
    assert p.reaction.value == "CCCCN.NCc1ccccc>>C"  # what was typed is kept


def test_check_pad_amounts_are_read_back():
    p = chemcheck.pad("CCCCN.CC(=O)Cl>Et3N>CCCCNC(C)=O")
    field = p._amount_fields["CCCCN"]
    field.value = "2.0 mmol"
    p.refresh()
    assert "2 mmol" in field._read_label.value
    field.value = "2.0 mm"
    p.refresh()
    assert "unknown unit" in p.status.value


def test_check_pad_edit_relabels_rows_and_keeps_amounts_by_component():
    # each new widget costs the browser three messages per keystroke: an edit to one component
    # reuses the rows; an amount stays with the component it was typed for
    p = chemcheck.pad("CCCCN.CC(=O)Cl>CCN(CC)CC>CCCCNC(C)=O")
    boxes = p.rows.children
    p._amount_fields["CCN(CC)CC"].value = "3 mmol"
    p._amount_fields["CCCCN"].value = "2 mmol"
    p.reaction.value = "CCCCN.CC(=O)Cl>CCN(C(C)C)C(C)C>CCCCNC(C)=O"
    p.refresh()
    assert p.rows.children == boxes  # the same widgets, not new ones
    assert p.rows.children[2].children[0].value == "agent: CCN(C(C)C)C(C)C"
    assert p._amount_fields["CCN(C(C)C)C(C)C"].value == ""  # Hünig's base has no amount yet
    assert p._amount_fields["CCCCN"].value == "2 mmol"
    assert p._amounts == {"CCN(CC)CC": "3 mmol", "CCCCN": "2 mmol"}  # relabelling is not an edit
    p.reaction.value = "CCCCN.CC(=O)Cl>CCN(CC)CC>CCCCNC(C)=O"
    p.refresh()
    assert p._amount_fields["CCN(CC)CC"].value == "3 mmol"
    p.reaction.value = "CCCCN.CC(=O)Cl>>CCCCNC(C)=O"
    p.refresh()
    assert p.rows.children == boxes[:3] and p.rows.children[2].children[0].value == "product: CCCCNC(C)=O"


def test_magic_cell_parsing():
    rxn, amounts = parse_cell("# a note\nCCN.CC(=O)Cl>Et3N>CCNC(C)=O\nCC(=O)Cl = 1.1 equiv\nCCN=2 mmol\n")
    assert rxn == "CCN.CC(=O)Cl>Et3N>CCNC(C)=O"
    assert amounts == {"CC(=O)Cl": "1.1 equiv", "CCN": "2 mmol"}
    with pytest.raises(chemcheck.ChemcheckError, match="line 2"):
        parse_cell("CCN\nno amount here")


def test_magic_prints_one_line_on_bad_input(capsys):
    from chemcheck.magic import chemcheck_cell

    chemcheck_cell("", "CCN.NCc1ccccc>>C")
    err = capsys.readouterr().err
    assert err.strip().startswith("chemcheck: component 2") and "Traceback" not in err


def _notebook_with_a_recorded_check(tmp_path):
    import nbformat

    from chemcheck.review import finding_key

    # two errors: the aniline's nitrogen and the Et3N additive both take the AlCl3
    report = chemcheck.check("Nc1ccccc1.CC(=O)Cl>AlCl3.CCN(CC)CC>CC(=O)c1ccc(N)cc1")
    bundle = report._repr_mimebundle_()
    nb = nbformat.v4.new_notebook()
    cell = nbformat.v4.new_code_cell("chemcheck.check(...)", execution_count=2)
    cell.outputs = [nbformat.v4.new_output("display_data", data=bundle)]
    f = report.findings[0]
    assert f.severity == "error"
    cell.metadata["chemcheck"] = {
        "acknowledgements": [
            {
                "finding": finding_key(f.rule, f.message, f.atoms),
                "rule": f.rule,
                "who": "R. Reviewer",
                "when": "2026-12-04T18:40:00.000Z",
                "note": "3 equiv AlCl3 planned",
            }
        ]
    }
    nb.cells = [nbformat.v4.new_markdown_cell("# plan"), cell]
    path = tmp_path / "plan.ipynb"
    nbformat.write(nb, str(path))
    return path


def test_export_shows_acknowledgements_and_severity_colours(tmp_path):
    from chemcheck.export import export_notebook

    out = export_notebook(_notebook_with_a_recorded_check(tmp_path))
    html = out.read_text()
    assert "Acknowledged by R. Reviewer, 4 Dec 2026, 18:40 UTC: 3 equiv AlCl3 planned" in html
    assert "#c62828" in html  # the error badge keeps its colour without the extension's CSS
    assert html.count("Not acknowledged") == 1  # the second error; notes are never asked for


def test_nbconvert_runs_the_exporter_and_the_cli_writes_the_same(tmp_path):
    import os
    import subprocess
    import sys

    from chemcheck.cli import main

    path = _notebook_with_a_recorded_check(tmp_path)
    env = {**os.environ, "PYTHONPATH": os.getcwd()}
    subprocess.run(
        [sys.executable, "-m", "nbconvert", "--to", "chemcheck.export.ChemcheckHTMLExporter",
         "--output", "via-nbconvert", str(path)],
        check=True, env=env, capture_output=True,
    )
    assert "Acknowledged by R. Reviewer" in (tmp_path / "via-nbconvert.html").read_text()
    assert main(["export", str(path), "-o", str(tmp_path / "via-cli.html")]) == 0
    assert "Acknowledged by R. Reviewer" in (tmp_path / "via-cli.html").read_text()


def test_check_pad_saves_a_readable_line_not_the_widget_repr(monkeypatch):
    import IPython.display

    shown = []
    monkeypatch.setattr(IPython.display, "display", lambda *a, **k: shown.append((a, k)))
    p = chemcheck.pad("CCCCN.CC(=O)Cl>Et3N>CCCCNC(C)=O")
    p._ipython_display_()
    widget_bundle = shown[0][0][0]
    assert "application/vnd.jupyter.widget-view+json" in widget_bundle
    assert "VBox(" not in widget_bundle["text/plain"] and "CCCCN.CC(=O)Cl" in widget_bundle["text/plain"]


def test_table_headers_carry_units_that_fit_the_scale():
    from chemcheck.display.present import fmt_number, stoich_table

    # a 100 g batch in 1.25 L of dichloromethane (a demo scenario of our own)
    report = chemcheck.check(
        "NCc1ccccc1.CC(=O)Cl>CCN(CC)CC.ClCCl>CC(=O)NCc1ccccc1",
        {"NCc1ccccc1": "107 g", "CC(=O)Cl": "1.1 equiv", "CCN(CC)CC": "1.5 equiv", "ClCCl": "1.25 L"},
    )
    payload = report._repr_mimebundle_()[chemcheck.MIME_TYPE]
    st = stoich_table(payload)
    headers = [c.header for c in st.columns]
    assert headers == ["M (g/mol)", "Equiv", "Amount (mol)", "Mass (g)", "Volume (L)", "Theoretical (g)"]
    amount = st.columns[2].cells
    # benzylamine 107 g / 107.15 g/mol (RDKit average mass) = 0.9986 mol; DCM 1.25 L x 1.327 g/mL
    # (the curated handbook density at 25 °C) / 84.93 g/mol = 19.5 mol, never "1.95e+04 mmol"
    assert amount[0] == "0.999" and amount[3] == "19.5"
    assert [c.label for c in st.compounds][:2] == ["benzylamine (1)", "acetyl chloride (2)"]
    assert report.table.columns.tolist()[:3] == ["role", "formula", "mw"]  # the DataFrame keeps its columns
    assert [fmt_number(x) for x in (1.25, 10.99, 310.4, 0.0451)] == ["1.25", "11.0", "310", "0.0451"]


def test_highlight_halos_sit_under_the_labels_and_clear_them():
    from chemcheck.display.draw import SEVERITY_RGBA, draw_component

    mol = chemcheck.check("Nc1ccccc1").components[0].mol
    d = draw_component(mol, {0: SEVERITY_RGBA["error"]})
    halo = d.svg.index('class="cc-halo"')
    label = d.svg.index("class='atom-0'")
    assert halo < label  # drawn first: the label is painted over it
    m = re.search(r'class="cc-halo" cx="([\d.]+)" cy="([\d.]+)" r="([\d.]+)"[^>]*stroke-width="([\d.]+)"', d.svg)
    cx, cy, r, w = map(float, m.groups())
    x, y, bw, bh = d.label_boxes[0]
    inner = r - w / 2
    assert all(((px - cx) ** 2 + (py - cy) ** 2) ** 0.5 < inner for px, py in ((x, y), (x + bw, y), (x, y + bh), (x + bw, y + bh)))


def test_one_bond_length_for_every_molecule_of_a_scheme():
    payload = chemcheck.check("CCCCCCCCCCN.CC(=O)Cl>>CCCCCCCCCCNC(C)=O")._repr_mimebundle_()[chemcheck.MIME_TYPE]
    lengths = []
    for comp in payload["drawing"]["components"]:
        (x0, y0), (x1, y1) = comp["atoms"][0], comp["atoms"][1]  # atoms 0-1 are bonded in each
        lengths.append(((x1 - x0) ** 2 + (y1 - y0) ** 2) ** 0.5)
    assert max(lengths) - min(lengths) < 1.0, lengths


def test_the_bond_formed_is_marked_in_the_product():
    # benzylamine + acetyl chloride: the new C-N bond of the amide (N-acylation)
    report = chemcheck.check("NCc1ccccc1.CC(=O)Cl>CCN(CC)CC>CC(=O)NCc1ccccc1")
    b = report._repr_mimebundle_()
    centre = report.to_dict()["understanding"]["centre"]["formed_in_products"]
    assert centre and all(c1 == c2 == 3 for (c1, _), (c2, _) in centre)  # in the product, compound 3
    assert len(b[chemcheck.MIME_TYPE]["drawing"]["centre"]) == len(centre)
    assert 'class="cc-centre"' in b["image/svg+xml"]
    assert "marked in teal" in b["text/html"]
