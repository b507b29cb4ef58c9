"""Batch checks: every reaction of a CSV or SMILES file, or every recorded check in a folder of
notebooks, in parallel over the cores, into one table of findings (CSV, JSON or Parquet).

For archives that outgrow one machine the same per-record function runs on Dask:

    import dask.bag as db
    from chemcheck.batch import check_record
    rows = db.from_sequence(records, npartitions=8).map(check_record).flatten().compute()

or on a dask.dataframe of reactions with ``check_partition`` in ``map_partitions``.
"""

from __future__ import annotations

import csv
import json
import os
import sys
from collections.abc import Iterable, Iterator
from concurrent.futures import ProcessPoolExecutor
from pathlib import Path

from .errors import ChemcheckError

__all__ = ["Record", "read_records", "check_record", "check_partition", "run_batch", "write_table", "COLUMNS", "check_bag"]

COLUMNS = ["source", "item", "reaction", "rule", "severity", "message", "fix", "error"]
Record = dict  # {"source": str, "item": str, "reaction": str, "amounts": dict}


def read_records(path: str | Path) -> Iterator[Record]:
    """Reactions from a .csv (columns ``reaction`` and optional ``amounts`` as JSON, or
    ``amount:<component>`` columns), a .smi/.txt/.rsmi file (one reaction per line, optional
    name after whitespace), or a folder of notebooks (their recorded checks)."""
    p = Path(path)
    if p.is_dir():
        from .review import review_notebook

        for nb in sorted(x for x in p.rglob("*.ipynb") if ".ipynb_checkpoints" not in x.parts):
            try:
                rev = review_notebook(nb, recheck=False)
            except ChemcheckError as exc:
                yield {"source": str(nb), "item": "", "reaction": "", "amounts": {}, "error": str(exc)}
                continue
            for r in rev.reports:
                yield {"source": str(nb), "item": f"cell {r.cell + 1}", "reaction": r.reaction, "amounts": r.amounts}
        return
    if not p.exists():
        raise ChemcheckError(f"{p}: no such file or folder")
    suffix = p.suffix.lower()
    if suffix == ".csv":
        with p.open(newline="") as fh:
            reader = csv.DictReader(fh)
            if not reader.fieldnames or "reaction" not in reader.fieldnames:
                raise ChemcheckError(f"{p}: a CSV needs a 'reaction' column (found: {', '.join(reader.fieldnames or [])})")
            for i, row in enumerate(reader, start=2):
                amounts = {}
                if row.get("amounts"):
                    try:
                        amounts = json.loads(row["amounts"])
                    except json.JSONDecodeError as exc:
                        yield {"source": str(p), "item": f"line {i}", "reaction": row["reaction"], "amounts": {}, "error": f"amounts is not JSON: {exc}"}
                        continue
                for k, v in row.items():
                    if k and k.startswith("amount:") and v:
                        amounts[k[len("amount:"):]] = v
                yield {"source": str(p), "item": row.get("name") or f"line {i}", "reaction": row["reaction"] or "", "amounts": amounts}
        return
    if suffix in (".smi", ".txt", ".rsmi", ".smiles"):
        with p.open() as fh:
            for i, line in enumerate(fh, start=1):
                line = line.strip()
                if not line or line.startswith("#"):
                    continue
                parts = line.split(maxsplit=1)
                reaction = parts[0]
                name = parts[1] if len(parts) > 1 and not parts[1].startswith("|") else f"line {i}"
                if len(parts) > 1 and parts[1].startswith("|"):
                    reaction = line
                yield {"source": str(p), "item": name, "reaction": reaction, "amounts": {}}
        return
    raise ChemcheckError(f"{p}: unknown file type '{suffix}' (use .csv, .smi, or a folder of notebooks)")


def check_record(record: Record) -> list[dict]:
    """Rows of the findings table for one record (one row with the error when it fails)."""
    from .engine import check

    base = {"source": record.get("source", ""), "item": record.get("item", ""), "reaction": record.get("reaction", "")}
    if record.get("error"):
        return [{**base, "rule": None, "severity": None, "message": None, "fix": None, "error": record["error"]}]
    try:
        report = check(record["reaction"], record.get("amounts") or None)
    except ChemcheckError as exc:
        return [{**base, "rule": None, "severity": None, "message": None, "fix": None, "error": str(exc)}]
    except Exception as exc:  # a record must never stop the batch
        return [{**base, "rule": None, "severity": None, "message": None, "fix": None, "error": f"internal error: {type(exc).__name__}: {exc}"}]
    rows = [{**base, "rule": f.rule, "severity": f.severity, "message": f.message, "fix": f.fix, "error": None} for f in report.findings]
    return rows or [{**base, "rule": None, "severity": None, "message": None, "fix": None, "error": None}]


def _chunk(records: list[Record]) -> list[dict]:
    out = []
    for r in records:
        out.extend(check_record(r))
    return out


def check_partition(df):
    """For ``dask.dataframe.map_partitions``: a pandas frame with a ``reaction`` column (and
    optionally ``amounts`` dicts) to the findings table."""
    import pandas as pd

    rows = []
    for i, row in df.iterrows():
        rows.extend(check_record({"source": row.get("source", ""), "item": str(row.get("item", i)), "reaction": row["reaction"], "amounts": row.get("amounts") or {}}))
    return pd.DataFrame(rows, columns=COLUMNS)


def check_bag(records: Iterable[Record], npartitions: int = 4, scheduler: str | None = None) -> list[dict]:
    """The batch on Dask (``dask.bag``); ``scheduler`` as Dask takes it ("threads",
    "processes", "synchronous", or a distributed client's)."""
    try:
        import dask.bag as db
    except ImportError as exc:  # pragma: no cover - exercised when dask is absent
        raise ChemcheckError("Dask is not installed: pip install 'chemcheck[dask]'") from exc
    bag = db.from_sequence(list(records), npartitions=npartitions).map(check_record).flatten()
    return bag.compute(scheduler=scheduler) if scheduler else bag.compute()


def run_batch(records: Iterable[Record], workers: int | None = None, progress: bool = True, chunk: int = 25) -> list[dict]:
    """Check every record in parallel over ``workers`` processes (default: the CPU count)."""
    records = list(records)
    workers = workers or os.cpu_count() or 1
    chunks = [records[i : i + chunk] for i in range(0, len(records), chunk)]
    rows: list[dict] = []
    done = 0
    show = progress and sys.stderr.isatty()

    def tick():
        if show:
            bar = "#" * int(30 * done / max(len(records), 1))
            print(f"\r[{bar:<30s}] {done}/{len(records)}", end="", file=sys.stderr, flush=True)

    if workers <= 1 or len(chunks) <= 1:
        for c in chunks:
            rows.extend(_chunk(c))
            done += len(c)
            tick()
    else:
        with ProcessPoolExecutor(max_workers=workers) as pool:
            for c, result in zip(chunks, pool.map(_chunk, chunks)):
                rows.extend(result)
                done += len(c)
                tick()
    if show:
        print(file=sys.stderr)
    return rows


def write_table(rows: list[dict], out: str | Path) -> Path:
    import pandas as pd

    out = Path(out)
    df = pd.DataFrame(rows, columns=COLUMNS)
    suffix = out.suffix.lower()
    if suffix == ".csv":
        df.to_csv(out, index=False)
    elif suffix == ".json":
        out.write_text(json.dumps(rows, indent=1))
    elif suffix == ".parquet":
        try:
            df.to_parquet(out, index=False)
        except ImportError as exc:
            raise ChemcheckError("Parquet output needs pyarrow: pip install pyarrow (or write .csv or .json)") from exc
    else:
        raise ChemcheckError(f"{out}: unknown output type '{suffix}' (use .csv, .json or .parquet)")
    return out
