"""Batch checks over files and folders, in parallel and on Dask's local schedulers."""

import json
import subprocess
import sys

import nbformat
import pytest

import chemcheck
from chemcheck.batch import check_bag, check_record, read_records, run_batch, write_table

ROWS = [
    ("CCCCN.CC(=O)Cl>>CCCCNC(C)=O", "no base"),
    ("CCCCN.CC(=O)Cl>Et3N>CCCCNC(C)=O", "with base"),
    ("NCc1cccc1>>C", "broken"),
    ("Nc1ccccc1.CC(=O)Cl>AlCl3>CC(=O)c1ccc(N)cc1", "lewis acid"),
]


@pytest.fixture
def csv_file(tmp_path):
    p = tmp_path / "plans.csv"
    lines = ["reaction,name,amounts"] + [f'{r},{n},"{{}}"' for r, n in ROWS]
    p.write_text("\n".join(lines) + "\n")
    return p


def _rules(rows, item):
    return {r["rule"] for r in rows if r["item"] == item and r["rule"]}


def test_csv_batch_in_parallel(csv_file):
    rows = run_batch(read_records(csv_file), workers=2, progress=False, chunk=1)
    assert "acid-scavenger-short" in _rules(rows, "no base")
    assert "acid-scavenger-short" not in _rules(rows, "with base")
    assert "lewis-acid-quenched-by-amine" in _rules(rows, "lewis acid")
    broken = [r for r in rows if r["item"] == "broken"]
    assert broken[0]["error"].startswith("component 1 'NCc1cccc1'")


def test_serial_and_parallel_agree(csv_file):
    a = run_batch(read_records(csv_file), workers=1, progress=False)
    b = run_batch(read_records(csv_file), workers=2, progress=False, chunk=1)
    key = lambda rows: sorted((r["item"], r["rule"] or "", r["error"] or "") for r in rows)  # noqa: E731
    assert key(a) == key(b)


def test_smiles_file_and_notebook_folder(tmp_path):
    smi = tmp_path / "list.smi"
    smi.write_text("# plans\nCCCCN.CC(=O)Cl>>CCCCNC(C)=O first\nCCCCN.CC(=O)Cl>Et3N>CCCCNC(C)=O second\n")
    recs = list(read_records(smi))
    assert [r["item"] for r in recs] == ["first", "second"]
    nb = nbformat.v4.new_notebook()
    cell = nbformat.v4.new_code_cell("...")
    cell.outputs = [nbformat.v4.new_output("display_data", data=chemcheck.check(ROWS[0][0])._repr_mimebundle_())]
    nb.cells.append(cell)
    (tmp_path / "nbs").mkdir()
    nbformat.write(nb, str(tmp_path / "nbs" / "a.ipynb"))
    (tmp_path / "nbs" / "broken.ipynb").write_text("{nope")
    recs = list(read_records(tmp_path / "nbs"))
    assert any(r["reaction"] == ROWS[0][0] for r in recs)
    assert any("not a readable notebook" in (r.get("error") or "") for r in recs)


def test_dask_bag_local_schedulers(csv_file):
    records = list(read_records(csv_file))
    serial = sorted((r["item"], r["rule"] or "") for rec in records for r in check_record(rec))
    for scheduler in ("synchronous", "threads"):
        rows = check_bag(records, npartitions=2, scheduler=scheduler)
        assert sorted((r["item"], r["rule"] or "") for r in rows) == serial


def test_dask_dataframe_map_partitions(csv_file):
    import dask.dataframe as dd
    import pandas as pd

    from chemcheck.batch import COLUMNS, check_partition

    records = list(read_records(csv_file))
    pdf = pd.DataFrame({"reaction": [r["reaction"] for r in records], "item": [r["item"] for r in records]})
    ddf = dd.from_pandas(pdf, npartitions=2)
    meta = pd.DataFrame({c: pd.Series(dtype="object") for c in COLUMNS})
    out = ddf.map_partitions(check_partition, meta=meta).compute(scheduler="threads")
    assert "acid-scavenger-short" in set(out[out["item"] == "no base"]["rule"])
    assert out[out["item"] == "broken"]["error"].iloc[0].startswith("component 1")


def test_output_formats(tmp_path, csv_file):
    rows = run_batch(read_records(csv_file), workers=1, progress=False)
    csv_out = write_table(rows, tmp_path / "f.csv")
    assert "acid-scavenger-short" in csv_out.read_text()
    json_out = write_table(rows, tmp_path / "f.json")
    assert json.loads(json_out.read_text())[0]["source"].endswith("plans.csv")
    import pandas as pd

    pq = write_table(rows, tmp_path / "f.parquet")
    assert "acid-scavenger-short" in set(pd.read_parquet(pq)["rule"])
    with pytest.raises(chemcheck.ChemcheckError, match="unknown output type"):
        write_table(rows, tmp_path / "f.xlsx")


def test_cli(tmp_path, csv_file):
    out = tmp_path / "out.csv"
    proc = subprocess.run(
        [sys.executable, "-m", "chemcheck", "batch", str(csv_file), "-o", str(out), "-j", "2", "--fail-on", "error"],
        capture_output=True, text=True, timeout=300,
    )
    assert proc.returncode == 1  # the Lewis-acid case is an error
    assert "4 reaction(s)" in proc.stdout and out.exists()


def test_bad_sources():
    with pytest.raises(chemcheck.ChemcheckError, match="no such file"):
        list(read_records("/nonexistent/x.csv"))


# --- careless files: encodings, bad rows, formula cells, time per row ---------------------------


def _cli(*args, cwd=None):
    import os

    env = {**os.environ, "PYTHONPATH": str(__import__("pathlib").Path(__file__).resolve().parent.parent)}
    return subprocess.run([sys.executable, "-m", "chemcheck", "batch", *args], capture_output=True, text=True, timeout=300, env=env, cwd=cwd)


def test_csv_with_byte_order_mark(tmp_path):
    # what a spreadsheet saves as "CSV UTF-8": the file starts with EF BB BF
    p = tmp_path / "bom.csv"
    p.write_bytes("\ufeffreaction,name\nCCCCN.CC(=O)Cl>>CCCCNC(C)=O,first\n".encode("utf-8"))
    notes = []
    [rec] = list(read_records(p, notes))
    assert rec["reaction"] == "CCCCN.CC(=O)Cl>>CCCCNC(C)=O" and rec["item"] == "first" and notes == []


def test_csv_in_windows_1252_is_read_with_a_note(tmp_path):
    p = tmp_path / "cp.csv"
    # "µ" is B5 and "–" (en dash) is 96 in Windows-1252; neither byte sequence is UTF-8
    p.write_bytes("reaction,name,amounts\nCCCCN.CC(=O)Cl>>CCCCNC(C)=O,run – 5 µL,\n".encode("cp1252"))
    notes = []
    [rec] = list(read_records(p, notes))
    assert rec["item"] == "run – 5 µL"
    assert len(notes) == 1 and "read as Windows-1252" in notes[0]


@pytest.mark.parametrize(
    "cell,expected",
    [
        ('"[1, 2]"', "not a list"),
        ('"""1.2 mmol"""', "not a string"),
        ("3", "not a number"),
        ('"{""CCCCN"": 1.2}"', "must be text"),
        ('"{nope"', "amounts is not JSON"),
    ],
)
def test_amounts_cells_are_checked_per_row(tmp_path, cell, expected):
    p = tmp_path / "a.csv"
    p.write_text(f"reaction,amounts\nCCCCN.CC(=O)Cl>>CCCCNC(C)=O,{cell}\nCCCCN.CC(=O)Cl>Et3N>CCCCNC(C)=O,\n")
    recs = list(read_records(p))
    assert len(recs) == 2
    assert expected in recs[0]["error"]
    assert "error" not in recs[1]


def test_one_bad_row_does_not_stop_the_batch(tmp_path):
    p = tmp_path / "mixed.csv"
    big = "C" * 200_000  # a 200 KB cell: beyond the csv module's default field limit
    p.write_text(f'reaction,name,amounts\nCCCCN.CC(=O)Cl>>CCCCNC(C)=O,ok,\n{big},big,\n"CCN>>CC",list,"[1]"\nNCc1cccc1>>C,broken,\n')
    out = tmp_path / "out.csv"
    proc = _cli(str(p), "-o", str(out), "-j", "1")
    assert proc.returncode == 2, proc.stderr  # rows failed; the table is still written
    import pandas as pd

    table = pd.read_csv(out)
    assert set(table["item"]) == {"ok", "big", "list", "broken"}
    assert "acid-scavenger-short" in set(table[table["item"] == "ok"]["rule"])
    for item in ("big", "list", "broken"):
        assert table[table["item"] == item]["error"].notna().all(), item
    assert "3 could not be checked" in proc.stdout
    assert "\r" not in proc.stderr and "reaction/s" not in proc.stderr  # no progress bar off a terminal


def test_formula_cells_are_escaped_in_csv(tmp_path):
    from chemcheck.batch import escape_cell

    hostile = '=HYPERLINK("http://example.invalid","click")'
    rows = [{"source": "s", "item": hostile, "reaction": "+1", "rule": None, "severity": None, "message": "@SUM(A1)", "fix": "-2", "error": "\tx"}]
    out = write_table(rows, tmp_path / "t.csv")
    import csv as _csv

    [row] = list(_csv.DictReader(out.open()))
    assert row["item"] == "'" + hostile
    assert [row["reaction"], row["message"], row["fix"], row["error"]] == ["'+1", "'@SUM(A1)", "'-2", "'\tx"]
    assert escape_cell("CCN") == "CCN" and escape_cell(None) is None
    # JSON keeps the text as it is
    assert json.loads(write_table(rows, tmp_path / "t.json").read_text())[0]["item"] == hostile


def test_timeout_per_row(csv_file):
    # one microsecond: the timer fires before any check can finish, so every row says so
    rows = run_batch(read_records(csv_file), workers=1, progress=False, timeout=1e-6)
    assert {r["item"] for r in rows} == {n for _, n in ROWS}
    assert all("--timeout" in r["error"] for r in rows)
    # without a timeout the same rows are checked
    assert any(r["rule"] for r in run_batch(read_records(csv_file), workers=1, progress=False))


def test_timeout_must_be_positive(csv_file, tmp_path):
    proc = _cli(str(csv_file), "-o", str(tmp_path / "x.csv"), "--timeout", "0")
    assert proc.returncode == 2 and "--timeout must be a positive" in proc.stderr


def test_batch_on_a_dask_cluster_matches_the_local_run(csv_file, tmp_path, monkeypatch):
    distributed = pytest.importorskip("distributed")
    from pathlib import Path

    # the workers import chemcheck from this tree
    monkeypatch.setenv("PYTHONPATH", str(Path(__file__).resolve().parent.parent))
    local = tmp_path / "local.csv"
    assert _cli(str(csv_file), "-o", str(local), "-j", "1").returncode == 2  # the broken row
    with distributed.LocalCluster(n_workers=2, threads_per_worker=1, processes=True, dashboard_address=None) as cluster:
        remote = tmp_path / "remote.csv"
        proc = _cli(str(csv_file), "-o", str(remote), "--scheduler", cluster.scheduler_address)
        assert proc.returncode == 2, proc.stderr
    assert remote.read_text() == local.read_text()
    proc = _cli(str(csv_file), "-o", str(tmp_path / "x.csv"), "--scheduler", "tcp://127.0.0.1:9")
    assert proc.returncode == 2 and "no Dask scheduler answers" in proc.stderr


def test_progress_bar_on_a_terminal(csv_file, monkeypatch, capsys):
    # the bar is drawn (by tqdm) only when stderr is a terminal
    monkeypatch.setattr(sys.stderr, "isatty", lambda: True, raising=False)
    run_batch(read_records(csv_file), workers=1, progress=True)
    assert "4/4" in capsys.readouterr().err
    monkeypatch.setattr(sys.stderr, "isatty", lambda: False, raising=False)
    run_batch(read_records(csv_file), workers=1, progress=True)
    assert capsys.readouterr().err == ""
