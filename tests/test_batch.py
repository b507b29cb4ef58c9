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
