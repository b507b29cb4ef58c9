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


# --- hostile and careless saved notebooks (issue: reliability under bad input) ----------------


def _payload(rxn=SHORT):
    return json.loads(json.dumps(chemcheck.check(rxn).to_dict()))


def _write(tmp_path, payloads, name="odd.ipynb", metadata=None):
    nb = nbformat.v4.new_notebook()
    for p in payloads:
        cell = nbformat.v4.new_code_cell("...")
        cell.outputs = [nbformat.v4.new_output("display_data", data={chemcheck.MIME_TYPE: p})]
        if metadata is not None:
            cell.metadata["chemcheck"] = metadata
        nb.cells.append(cell)
    path = tmp_path / name
    path.write_text(json.dumps(nb))  # as saved, without nbformat's validation
    return path


@pytest.mark.parametrize(
    "damage",
    [
        lambda p: p["findings"][0].update(severity="catastrophic"),
        lambda p: p["findings"][0].pop("message"),
        lambda p: p["findings"][0].update(atoms=None),
        lambda p: p.update(input=SHORT),
        lambda p: p.update(input=None),
        lambda p: p["findings"].append(None),
        lambda p: p.update(findings="none"),
        lambda p: p["findings"][0].update(atoms=[[-1, 0], "x", [0]]),
    ],
    ids=["unknown-severity", "no-message", "atoms-null", "input-string", "input-null", "null-finding", "findings-string", "bad-atoms"],
)
def test_damaged_payloads_are_reviewed_not_fatal(tmp_path, capsys, damage):
    from chemcheck.cli import main

    payload = _payload()
    damage(payload)
    path = _write(tmp_path, [payload, _payload(CLEAN)])
    for extra in ([], ["--no-recheck"], ["--json"]):
        assert main(["review", str(path), *extra]) == 0
        err = capsys.readouterr().err
        assert "internal error" not in err and "Traceback" not in err
    assert len(review_notebook(path, recheck=False).reports) == 2


def test_unknown_severity_gates_like_an_error(tmp_path):
    # a saved file cannot lower a finding's level by misspelling it
    payload = _payload()
    payload["findings"] = [f for f in payload["findings"] if f["rule"] == "acid-scavenger-short"]
    payload["findings"][0]["severity"] = "fine"
    path = _write(tmp_path, [payload])
    proc = run(str(path), "--no-recheck", "--fail-on", "error")
    assert proc.returncode == 1
    assert "1 of unknown severity" in run(str(path), "--no-recheck").stdout


def test_one_unreadable_notebook_among_many(tmp_path):
    for i in range(3):
        _notebook(tmp_path, [SHORT], name=f"ok{i}.ipynb")
    (tmp_path / "broken.ipynb").write_text("{ not json")
    proc = run(str(tmp_path))
    assert proc.returncode == 2  # something could not be read ...
    for i in range(3):  # ... and every other notebook is still reported
        assert f"ok{i}.ipynb: 1 report(s)" in proc.stdout
    assert "broken.ipynb: could not be read" in proc.stdout
    assert "1 of 4 notebook(s) could not be read" in proc.stderr
    assert "\r" not in proc.stderr and "notebook/s" not in proc.stderr  # no progress bar off a terminal
    data = json.loads(run(str(tmp_path), "--json").stdout)
    assert [bool(d.get("error")) for d in data] == [True, False, False, False]


def test_recorded_text_cannot_drive_the_terminal(tmp_path):
    payload = _payload()
    fake = "\x1b[2K\r\x1b[32mall clear\x1b[0m"
    payload["input"]["reaction"] = SHORT + fake
    payload["findings"][0]["message"] += "\x1b]0;title\x07\u202e"
    path = _write(tmp_path, [payload])
    proc = run(str(path), "--no-recheck")
    assert "\x1b" not in proc.stdout and "\x07" not in proc.stdout and "\u202e" not in proc.stdout
    assert "\\x1b[32mall clear" in proc.stdout  # shown, escaped
    proc = run(str(path))  # the re-check refuses the text: its error is escaped too
    assert "\x1b" not in proc.stdout + proc.stderr


# --- acknowledgements: append-only metadata ----------------------------------------------------


ACK = {"finding": "acid-scavenger-short#1", "rule": "acid-scavenger-short", "who": "A. Reviewer", "when": "2026-12-04", "note": "n"}


@pytest.mark.parametrize(
    "meta",
    [
        None,
        {},
        {"other-tool": {"x": [1, 2]}, "tags": ["a"]},
        {"chemcheck": {"acknowledgements": [
            {"finding": "x#1", "rule": "x", "who": {"name": "B", "email": "b@example.org"}, "when": "t", "note": "", "signature": "abc"},
            {"not": "an acknowledgement"},
            "text",
        ], "version": 7, "future": {"k": None}}},
        {"chemcheck": ["another", "shape"]},
        {"chemcheck": "a string"},
        {"chemcheck": {"acknowledgements": "not a list"}},
    ],
    ids=["none", "empty", "other-keys", "odd-entries", "list", "string", "acks-not-list"],
)
def test_acknowledging_keeps_every_odd_field(meta):
    import copy

    from chemcheck.review import add_acknowledgement, read_acknowledgements

    before = copy.deepcopy(meta)
    after = add_acknowledgement(meta, ACK)
    assert meta == before  # the input is not changed
    # everything that was there is still there, unchanged, except the one list that grew
    for key, value in (meta or {}).items():
        if key in after and after[key] == value:
            continue
        assert isinstance(value, dict) and isinstance(value.get("acknowledgements"), list)
        assert {k: v for k, v in after[key].items() if k != "acknowledgements"} == {k: v for k, v in value.items() if k != "acknowledgements"}
        assert after[key]["acknowledgements"][:-1] == value["acknowledgements"]
    assert read_acknowledgements(after)[-1] == ACK
    # the round trip through a saved notebook keeps it all
    assert json.loads(json.dumps(after)) == after


def test_acknowledging_twice_appends(tmp_path):
    from chemcheck.review import add_acknowledgement, read_acknowledgements

    meta = add_acknowledgement({}, ACK)
    meta = add_acknowledgement(meta, {**ACK, "note": "second look"})
    acks = read_acknowledgements(meta)
    assert [a["note"] for a in acks] == ["n", "second look"]


def test_acknowledgement_under_the_fallback_key_is_read(tmp_path):
    ack = _ack_for(SHORT, "acid-scavenger-short")
    path = _notebook(tmp_path, [SHORT])
    nb = nbformat.read(str(path), as_version=4)
    from chemcheck.review import add_acknowledgement

    nb.cells[0].metadata = add_acknowledgement({"chemcheck": ["legacy"]}, ack)
    assert nb.cells[0].metadata["chemcheck"] == ["legacy"]
    nbformat.write(nb, str(path))
    assert review_notebook(path).open_findings("warning") == []


# --- who acknowledged: reviewer lists and git history ------------------------------------------


def test_reviewers_file_rejects_unlisted_names(tmp_path):
    forged = {**_ack_for(SHORT, "acid-scavenger-short"), "who": "Mallory"}
    path = _notebook(tmp_path, [SHORT], acks={0: [forged]})
    reviewers = tmp_path / "reviewers.txt"
    reviewers.write_text("# who may acknowledge\nA. Reviewer <a.reviewer@example.org>\nB. Chemist\n")
    assert run(str(path), "--fail-on", "warning").returncode == 0  # without a list, any name counts
    proc = run(str(path), "--fail-on", "warning", "--reviewers", str(reviewers))
    assert proc.returncode == 1
    assert "'Mallory' is not a listed reviewer" in proc.stdout
    good = _notebook(tmp_path, [SHORT], acks={0: [_ack_for(SHORT, "acid-scavenger-short")]}, name="good.ipynb")
    assert run(str(good), "--fail-on", "warning", "--reviewers", str(reviewers)).returncode == 0
    proc = run(str(good), "--reviewers", str(tmp_path / "none.txt"))
    assert proc.returncode == 2 and "no such reviewers file" in proc.stderr


def _git(repo, *args, author=None):
    env = {"GIT_CONFIG_GLOBAL": "/dev/null", "GIT_CONFIG_SYSTEM": "/dev/null", "HOME": str(repo), "PATH": "/usr/bin:/bin"}
    if author:
        name, email = author
        env.update(GIT_AUTHOR_NAME=name, GIT_AUTHOR_EMAIL=email, GIT_COMMITTER_NAME=name, GIT_COMMITTER_EMAIL=email)
    subprocess.run(["git", *args], cwd=repo, env=env, check=True, capture_output=True)


def test_verify_git_checks_who_committed_the_acknowledgement(tmp_path):
    import shutil

    if not shutil.which("git"):
        pytest.skip("git is not installed")
    repo = tmp_path / "repo"
    repo.mkdir()
    _git(repo, "init", "-q")
    path = _notebook(repo, [SHORT, SHORT.replace("CCCCN", "CCCN")])
    _git(repo, "add", ".")
    _git(repo, "commit", "-qm", "plan", author=("B. Chemist", "b@example.org"))
    # the reviewer acknowledges cell 1 and commits
    nb = nbformat.read(str(path), as_version=4)
    nb.cells[0].metadata["chemcheck"] = {"acknowledgements": [_ack_for(SHORT, "acid-scavenger-short")]}
    nbformat.write(nb, str(path))
    _git(repo, "commit", "-qam", "review", author=("A. Reviewer", "a.reviewer@example.org"))
    [first, second] = review_notebook(path, verify_git=True).reports
    assert first.rejected == [] and first.open_findings("warning") == []
    # the author acknowledges cell 2 in the reviewer's name and commits as themself
    nb.cells[1].metadata["chemcheck"] = {"acknowledgements": [_ack_for(SHORT.replace("CCCCN", "CCCN"), "acid-scavenger-short")]}
    nbformat.write(nb, str(path))
    [_, second] = review_notebook(path, verify_git=True).reports
    assert "not found in any commit" in second.rejected[0][1]
    _git(repo, "commit", "-qam", "self-review", author=("B. Chemist", "b@example.org"))
    [_, second] = review_notebook(path, verify_git=True).reports
    assert "by 'B. Chemist', not by 'A. Reviewer'" in second.rejected[0][1]
    assert [f["rule"] for f in second.open_findings("warning")] == ["acid-scavenger-short"]
    proc = run(str(path), "--verify-git", "--fail-on", "warning")
    assert proc.returncode == 1 and "acknowledgement not accepted" in proc.stdout
    assert run(str(path), "--fail-on", "warning").returncode == 0  # without the check, the forgery passes


def test_recheck_timeout_keeps_the_recorded_findings(tmp_path):
    # one microsecond: the timer fires before any re-check can finish
    path = _notebook(tmp_path, [SHORT])
    [r] = review_notebook(path, timeout=1e-6).reports
    assert r.current is None and "--timeout" in r.recheck_error
    assert [f["rule"] for f in r.open_findings("warning")] == ["acid-scavenger-short"]  # from the record
    from chemcheck.cli import main

    assert main(["review", str(path), "--timeout", "0"]) == 2
