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
import signal
import sys
import threading
from collections.abc import Iterable, Iterator
from contextlib import contextmanager
from concurrent.futures import ProcessPoolExecutor
from pathlib import Path

from .errors import ChemcheckError

__all__ = [
    "Record", "read_records", "check_record", "check_partition", "run_batch", "write_table",
    "COLUMNS", "check_bag", "read_text", "escape_cell", "time_limit", "TimeUp",
]

COLUMNS = ["source", "item", "reaction", "rule", "severity", "message", "fix", "error"]
Record = dict  # {"source": str, "item": str, "reaction": str, "amounts": dict}
_FIELD_LIMIT = 16 * 1024 * 1024  # one CSV cell; the check itself refuses oversized reactions


def read_text(path: Path, notes: list[str] | None = None) -> str:
    """A text file's content: UTF-8 with or without a byte-order mark, else Windows-1252 (what
    spreadsheet programs on Windows save as "CSV") with a note, else Latin-1 with a note."""
    data = path.read_bytes()
    try:
        return data.decode("utf-8-sig")
    except UnicodeDecodeError as exc:
        where = f"byte {exc.start + 1}"
    for encoding, label in (("cp1252", "Windows-1252"), ("latin-1", "Latin-1")):
        try:
            text = data.decode(encoding)
        except UnicodeDecodeError:
            continue
        if notes is not None:
            notes.append(f"{path}: not UTF-8 (at {where}); read as {label}")
        return text
    raise ChemcheckError(f"{path}: the text encoding cannot be read")  # pragma: no cover - latin-1 reads anything


def _error_record(source: str, item: str, reaction: str, error: str) -> Record:
    return {"source": source, "item": item, "reaction": reaction, "amounts": {}, "error": error}


def _amounts_cell(text: str) -> tuple[dict | None, str | None]:
    """The ``amounts`` cell of a CSV row: a JSON object of component -> amount text."""
    try:
        value = json.loads(text)
    except (json.JSONDecodeError, RecursionError) as exc:
        return None, f"amounts is not JSON: {exc}"
    if not isinstance(value, dict):
        kind = {list: "a list", str: "a string", int: "a number", float: "a number", bool: "true/false"}.get(type(value), "null")
        return None, f"amounts must be a JSON object like {{\"CCN\": \"1.2 mmol\"}}, not {kind}"
    for k, v in value.items():
        if not isinstance(v, str):
            return None, f"amounts: the amount for '{k}' must be text like \"1.2 mmol\" (a number needs its unit)"
    return value, None


def read_records(path: str | Path, notes: list[str] | None = None) -> Iterator[Record]:
    """Reactions from a .csv (columns ``reaction`` and optional ``amounts`` as JSON, or
    ``amount:<component>`` columns), a .smi/.txt/.rsmi file (one reaction per line, optional
    name after whitespace), or a folder of notebooks (their recorded checks).

    A row that cannot be read becomes a record with an ``error``; the others go on. Notes on the
    file as a whole (an encoding other than UTF-8) are appended to ``notes``."""
    p = Path(path)
    if p.is_dir():
        from .review import review_notebook

        for nb in sorted(x for x in p.rglob("*.ipynb") if ".ipynb_checkpoints" not in x.parts):
            try:
                rev = review_notebook(nb, recheck=False)
            except ChemcheckError as exc:
                yield _error_record(str(nb), "", "", str(exc))
                continue
            for r in rev.reports:
                yield {"source": str(nb), "item": f"cell {r.cell + 1}", "reaction": r.reaction, "amounts": r.amounts}
        return
    if not p.exists():
        raise ChemcheckError(f"{p}: no such file or folder")
    suffix = p.suffix.lower()
    if suffix == ".csv":
        yield from _csv_records(p, read_text(p, notes))
        return
    if suffix in (".smi", ".txt", ".rsmi", ".smiles"):
        for i, line in enumerate(read_text(p, notes).splitlines(), start=1):
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


def _csv_records(p: Path, text: str) -> Iterator[Record]:
    import io

    csv.field_size_limit(max(csv.field_size_limit(), _FIELD_LIMIT))
    reader = csv.DictReader(io.StringIO(text, newline=""))
    try:
        fields = reader.fieldnames
    except csv.Error as exc:
        raise ChemcheckError(f"{p}: the header line cannot be read as CSV ({exc})") from None
    names = [(f or "").strip() for f in fields or []]
    if "reaction" not in names:
        raise ChemcheckError(f"{p}: a CSV needs a 'reaction' column (found: {', '.join(names)})")
    reader.fieldnames = names  # spaces around a column name are not part of it
    while True:
        line = reader.line_num + 1
        try:
            row = next(reader)
        except StopIteration:
            return
        except csv.Error as exc:
            yield _error_record(str(p), f"line {line}", "", f"the line cannot be read as CSV: {exc}")
            continue
        i = reader.line_num
        reaction = row.get("reaction")
        reaction = reaction if isinstance(reaction, str) else ""
        item = row.get("name") if isinstance(row.get("name"), str) and row.get("name") else f"line {i}"
        amounts: dict = {}
        if isinstance(row.get("amounts"), str) and row["amounts"].strip():
            parsed, error = _amounts_cell(row["amounts"])
            if error:
                yield _error_record(str(p), item, reaction, error)
                continue
            amounts = dict(parsed)
        for k, v in row.items():
            if isinstance(k, str) and k.startswith("amount:") and isinstance(v, str) and v:
                amounts[k[len("amount:"):]] = v
        yield {"source": str(p), "item": item, "reaction": reaction, "amounts": amounts}


class TimeUp(BaseException):
    """Raised in the checking thread when its time is up. A BaseException, so that no
    ``except Exception`` on the way swallows it."""


def _on_alarm(signum, frame):  # pragma: no cover - timing dependent
    raise TimeUp


@contextmanager
def time_limit(seconds: float | None) -> Iterator[bool]:
    """Raise :class:`TimeUp` in the block after ``seconds``. Applied only in the process's main
    thread (signals); yields whether it is applied. It interrupts Python code, so a single long
    call inside RDKit ends before the block does."""
    applied = bool(seconds) and threading.current_thread() is threading.main_thread() and hasattr(signal, "setitimer")
    if not applied:
        yield False
        return
    previous = signal.signal(signal.SIGALRM, _on_alarm)
    signal.setitimer(signal.ITIMER_REAL, float(seconds))
    try:
        yield True
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, previous)


def _error_row(base: dict, error: str) -> dict:
    return {**base, "rule": None, "severity": None, "message": None, "fix": None, "error": error}


def check_record(record: Record, timeout: float | None = None) -> list[dict]:
    """Rows of the findings table for one record (one row with the error when it fails).

    ``timeout`` (seconds) stops the check of this record and records an error row instead. It
    needs the process's main thread (local batch workers have it); elsewhere, as in Dask's
    thread pools, it is not applied. It interrupts Python code, so a single long call inside
    RDKit ends before the row does."""
    from .engine import check

    base = {"source": record.get("source", ""), "item": record.get("item", ""), "reaction": record.get("reaction", "")}
    if record.get("error"):
        return [_error_row(base, record["error"])]
    reaction = record.get("reaction")
    if not isinstance(reaction, str):
        return [_error_row(base, "the reaction must be text")]
    amounts = record.get("amounts") or None
    if amounts is not None and (not isinstance(amounts, dict) or not all(isinstance(v, str) for v in amounts.values())):
        return [_error_row(base, "amounts must map each component to text like '1.2 mmol'")]
    try:
        with time_limit(timeout):
            report = check(reaction, amounts)
    except TimeUp:
        return [_error_row(base, f"not checked: took longer than the {timeout:g} s allowed per row (--timeout)")]
    except ChemcheckError as exc:
        return [_error_row(base, str(exc))]
    except RecursionError:
        return [_error_row(base, "the reaction is too deeply nested to check")]
    except Exception as exc:  # a record must never stop the batch
        return [_error_row(base, f"internal error: {type(exc).__name__}: {exc}")]
    rows = [{**base, "rule": f.rule, "severity": f.severity, "message": f.message, "fix": f.fix, "error": None} for f in report.findings]
    return rows or [{**base, "rule": None, "severity": None, "message": None, "fix": None, "error": None}]


def _chunk(records: list[Record], timeout: float | None = None) -> list[dict]:
    out = []
    for r in records:
        out.extend(check_record(r, timeout))
    return out


def check_partition(df):
    """For ``dask.dataframe.map_partitions``: a pandas frame with a ``reaction`` column (and
    optionally ``amounts`` dicts) to the findings table."""
    import pandas as pd

    rows = []
    for i, row in df.iterrows():
        rows.extend(check_record({"source": row.get("source", ""), "item": str(row.get("item", i)), "reaction": row["reaction"], "amounts": row.get("amounts") or {}}))
    return pd.DataFrame(rows, columns=COLUMNS)


def check_bag(records: Iterable[Record], npartitions: int = 4, scheduler=None, progress: bool = False) -> list[dict]:
    """The batch on Dask (``dask.bag``); ``scheduler`` as Dask takes it ("threads",
    "processes", "synchronous", a ``distributed.Client``), or the address of a running Dask
    scheduler ("tcp://host:8786"), to which a client connects for this batch."""
    try:
        import dask.bag as db
    except ImportError as exc:  # pragma: no cover - exercised when dask is absent
        raise ChemcheckError("Dask is not installed: pip install 'chemcheck[dask]'") from exc
    records = list(records)
    bag = db.from_sequence(records, npartitions=max(1, min(npartitions, len(records) or 1))).map(check_record).flatten()
    if isinstance(scheduler, str) and "://" in scheduler:
        return _on_cluster(bag, scheduler, progress)
    return bag.compute(scheduler=scheduler) if scheduler else bag.compute()


def _on_cluster(bag, address: str, progress: bool) -> list[dict]:
    try:
        from distributed import Client
    except ImportError as exc:  # pragma: no cover - exercised when distributed is absent
        raise ChemcheckError("a Dask scheduler address needs dask.distributed: pip install 'chemcheck[dask]'") from exc
    try:
        client = Client(address, timeout=30, set_as_default=False)
    except (OSError, TimeoutError) as exc:
        raise ChemcheckError(f"no Dask scheduler answers at {address} ({exc})") from None
    try:
        future = client.compute(bag)
        if progress and sys.stderr.isatty():
            from tqdm import tqdm

            with tqdm(total=1, desc="on the cluster", unit="batch", file=sys.stderr) as bar:
                rows = future.result()
                bar.update(1)
        else:
            rows = future.result()
        return list(rows)
    finally:
        client.close()


def run_batch(
    records: Iterable[Record],
    workers: int | None = None,
    progress: bool = True,
    chunk: int = 25,
    timeout: float | None = None,
) -> list[dict]:
    """Check every record in parallel over ``workers`` processes (default: the CPU count).

    ``timeout``: seconds allowed per record (an error row when exceeded). ``progress``: a bar on
    stderr, shown only when stderr is a terminal."""
    from functools import partial

    from tqdm import tqdm

    records = list(records)
    workers = workers or os.cpu_count() or 1
    chunks = [records[i : i + chunk] for i in range(0, len(records), chunk)]
    rows: list[dict] = []
    bar = tqdm(total=len(records), unit="reaction", file=sys.stderr, disable=not (progress and sys.stderr.isatty()))
    try:
        if workers <= 1 or len(chunks) <= 1:
            for c in chunks:
                rows.extend(_chunk(c, timeout))
                bar.update(len(c))
        else:
            with ProcessPoolExecutor(max_workers=workers) as pool:
                for c, result in zip(chunks, pool.map(partial(_chunk, timeout=timeout), chunks)):
                    rows.extend(result)
                    bar.update(len(c))
    finally:
        bar.close()
    return rows


_FORMULA_START = ("=", "+", "-", "@", "\t", "\r")


def escape_cell(value):
    """A CSV cell that a spreadsheet would not run as a formula: text starting with = + - @ (or
    a tab or carriage return) gets a leading apostrophe, the usual guard against formula
    injection in exported CSV (common practice; OWASP's CSV injection guidance)."""
    if isinstance(value, str) and value.startswith(_FORMULA_START):
        return "'" + value
    return value


def write_table(rows: list[dict], out: str | Path) -> Path:
    """Write the findings table. In CSV, cells that would start a spreadsheet formula are
    escaped (:func:`escape_cell`); JSON and Parquet keep the text as it is, and JSON is strict
    (no NaN or Infinity)."""
    import pandas as pd

    out = Path(out)
    suffix = out.suffix.lower()
    if suffix == ".csv":
        df = pd.DataFrame([{c: escape_cell(r.get(c)) for c in COLUMNS} for r in rows], columns=COLUMNS)
        df.to_csv(out, index=False)
    elif suffix == ".json":
        from .cli import dumps

        out.write_text(dumps([{c: r.get(c) for c in COLUMNS} for r in rows], indent=1))
    elif suffix == ".parquet":
        df = pd.DataFrame(rows, columns=COLUMNS)
        try:
            df.to_parquet(out, index=False)
        except ImportError as exc:
            raise ChemcheckError("Parquet output needs pyarrow: pip install pyarrow (or write .csv or .json)") from exc
    else:
        raise ChemcheckError(f"{out}: unknown output type '{suffix}' (use .csv, .json or .parquet)")
    return out
