"""chemcheck review: recorded checks, re-checks, acknowledgements, exit codes."""

import json
import subprocess
import sys

import nbformat
import pytest

import chemcheck
from chemcheck.review import finding_key, review_notebook

SHORT = "CCCCN.CC(=O)Cl>>CCCCNC(C)=O"  # a warning: no base (amounts assumed)
CLEAN = "CCCCN.CC(=O)Cl>Et3N>CCCCNC(C)=O"


def _notebook(tmp_path, reactions, acks=None, name="plan.ipynb"):
    nb = nbformat.v4.new_notebook()
    for i, rxn in enumerate(reactions):
        cell = nbformat.v4.new_code_cell(f"chemcheck.check({rxn!r})")
        bundle = chemcheck.check(rxn)._repr_mimebundle_()
        cell.outputs = [nbformat.v4.new_output("display_data", data=bundle)]
        if acks and i in acks:
            cell.metadata["chemcheck"] = {"acknowledgements": acks[i]}
        nb.cells.append(cell)
    path = tmp_path / name
    nbformat.write(nb, str(path))
    return path


def _ack_for(rxn, rule):
    f = chemcheck.check(rxn).by_rule(rule)[0]
    return {"finding": finding_key(f.rule, f.message, f.atoms), "rule": rule, "who": "A. Reviewer", "when": "2026-12-01", "note": "2 equiv amine used"}


def run(*args):
    return subprocess.run([sys.executable, "-m", "chemcheck", "review", *args], capture_output=True, text=True, timeout=300)


def test_key_matches_the_extension():
    # the same literal is asserted in extension/test/render.test.ts
    assert finding_key("x-y", "At most about 50 % conversion – K ≈ 10^5 😀", []) == "x-y#82dd598e"


def test_review_collects_reports_and_rechecks(tmp_path):
    path = _notebook(tmp_path, [SHORT, CLEAN])
    nb = review_notebook(path)
    assert [r.cell for r in nb.reports] == [0, 1]
    assert [f["rule"] for _, f in nb.open_findings("warning")] == ["acid-scavenger-short"]


def test_acknowledged_findings_do_not_fail(tmp_path):
    path = _notebook(tmp_path, [SHORT], acks={0: [_ack_for(SHORT, "acid-scavenger-short")]})
    assert review_notebook(path).open_findings("warning") == []
    assert run(str(path), "--fail-on", "warning").returncode == 0


def test_fail_on_gates_the_notebook(tmp_path):
    path = _notebook(tmp_path, [SHORT, CLEAN])
    proc = run(str(path), "--fail-on", "warning")
    assert proc.returncode == 1
    assert "1 unacknowledged finding" in proc.stderr
    assert run(str(path), "--fail-on", "error").returncode == 0
    assert run(str(path)).returncode == 0


def test_changes_since_recording_are_reported(tmp_path):
    path = _notebook(tmp_path, [SHORT])
    nb = nbformat.read(str(path), as_version=4)
    payload = nb.cells[0].outputs[0]["data"][chemcheck.MIME_TYPE]
    payload["findings"] = [f for f in payload["findings"] if f["rule"] != "acid-scavenger-short"]
    payload["findings"].append({"rule": "old-rule", "severity": "info", "title": "", "message": "gone", "atoms": [], "fix": None, "references": []})
    nbformat.write(nb, str(path))
    [r] = review_notebook(path).reports
    assert [f["rule"] for f in r.new] == ["acid-scavenger-short"]
    assert [f["rule"] for f in r.gone] == ["old-rule"]
    out = run(str(path)).stdout
    assert "new since recorded" in out and "no longer found" in out


def test_json_output(tmp_path):
    path = _notebook(tmp_path, [SHORT])
    data = json.loads(run(str(path), "--json").stdout)
    assert data[0]["reports"][0]["reaction"] == SHORT
    assert data[0]["open"] == 1


def test_notebook_without_reports_is_fine(tmp_path):
    path = tmp_path / "empty.ipynb"
    nbformat.write(nbformat.v4.new_notebook(), str(path))
    proc = run(str(path), "--fail-on", "error")
    assert proc.returncode == 0 and "no recorded checks" in proc.stdout


def test_broken_notebook_is_a_clear_error(tmp_path):
    path = tmp_path / "broken.ipynb"
    path.write_text("{ not json")
    proc = run(str(path))
    assert proc.returncode == 2
    assert "broken.ipynb: not a readable notebook" in proc.stderr and "Traceback" not in proc.stderr
    proc = run(str(tmp_path / "missing.ipynb"))
    assert proc.returncode == 2 and "no such notebook" in proc.stderr


def test_folders_are_searched(tmp_path):
    _notebook(tmp_path, [SHORT], name="a.ipynb")
    _notebook(tmp_path, [CLEAN], name="b.ipynb")
    out = run(str(tmp_path)).stdout
    assert "a.ipynb" in out and "b.ipynb" in out
