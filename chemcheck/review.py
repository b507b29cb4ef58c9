"""Review recorded checks in notebooks: what was found, what the current rules find, what was
acknowledged, and whether anything unacknowledged at or above a severity remains.

Reports are the outputs of MIME type ``application/vnd.chemcheck.report+json`` in code cells.
Acknowledgements live in the cell metadata under ``"chemcheck"``:
``{"acknowledgements": [{"finding": KEY, "rule": ..., "who": ..., "when": ..., "note": ...}]}``;
``KEY`` is :func:`finding_key`, the same function as the extension's ``findingKey``.
"""

from __future__ import annotations

import json
from dataclasses import dataclass, field
from pathlib import Path

from .errors import ChemcheckError
from .report import MIME_TYPE

__all__ = ["finding_key", "ReportReview", "NotebookReview", "review_notebook", "NotebookError"]

_ORDER = {"info": 0, "warning": 1, "error": 2}


class NotebookError(ChemcheckError):
    """A notebook file that cannot be read."""


def finding_key(rule: str, message: str, atoms) -> str:
    """Stable key of a finding: the rule id and a 32-bit hash of rule, message and atoms.

    Mirrors ``findingKey`` in extension/src/render.ts (a Java-style 31-hash over UTF-16 code
    units), so acknowledgements written in JupyterLab are recognised here.
    """
    atom_text = ",".join(f"{a[0]}:{a[1]}" for a in atoms)
    s = f"{rule}|{message}|{atom_text}"
    units = s.encode("utf-16-le")
    h = 0
    for i in range(0, len(units), 2):
        h = (31 * h + int.from_bytes(units[i : i + 2], "little")) & 0xFFFFFFFF
    return f"{rule}#{h:x}"


@dataclass
class ReportReview:
    cell: int
    reaction: str
    amounts: dict
    recorded: list[dict]
    current: list[dict] | None  # None when the recorded input no longer reads
    recheck_error: str | None
    acknowledgements: list[dict]
    new: list[dict] = field(default_factory=list)  # found now, not recorded
    gone: list[dict] = field(default_factory=list)  # recorded, not found now

    def acknowledged(self, f: dict) -> dict | None:
        key = finding_key(f["rule"], f["message"], f.get("atoms", []))
        for a in self.acknowledgements:
            if a.get("finding") == key:
                return a
        return None

    def open_findings(self, at_least: str) -> list[dict]:
        findings = self.current if self.current is not None else self.recorded
        return [f for f in findings if _ORDER[f["severity"]] >= _ORDER[at_least] and self.acknowledged(f) is None]

    def to_dict(self) -> dict:
        findings = self.current if self.current is not None else self.recorded
        return {
            "cell": self.cell,
            "reaction": self.reaction,
            "amounts": self.amounts,
            "recheck_error": self.recheck_error,
            "findings": [
                {**f, "acknowledged": self.acknowledged(f)} for f in findings
            ],
            "new": self.new,
            "gone": self.gone,
        }


@dataclass
class NotebookReview:
    path: str
    reports: list[ReportReview]

    def open_findings(self, at_least: str) -> list[tuple[ReportReview, dict]]:
        return [(r, f) for r in self.reports for f in r.open_findings(at_least)]

    def to_dict(self, at_least: str = "warning") -> dict:
        return {
            "notebook": self.path,
            "reports": [r.to_dict() for r in self.reports],
            "open": len(self.open_findings(at_least)),
        }


def _ident(f: dict) -> tuple:
    return (f["rule"], f["message"], tuple(tuple(a) for a in f.get("atoms", [])))


def review_notebook(path: str | Path, recheck: bool = True) -> NotebookReview:
    import nbformat

    from .scale import recheck as _again  # a scaled report is checked again with its scale settings

    p = Path(path)
    try:
        nb = nbformat.read(str(p), as_version=4)
    except FileNotFoundError:
        raise NotebookError(f"{p}: no such notebook") from None
    except (json.JSONDecodeError, nbformat.reader.NotJSONError, UnicodeDecodeError) as exc:
        raise NotebookError(f"{p}: not a readable notebook (not valid JSON: {exc})") from None
    except Exception as exc:  # nbformat's own validation and version errors
        raise NotebookError(f"{p}: not a readable notebook ({type(exc).__name__}: {exc})") from None
    reports: list[ReportReview] = []
    for index, cell in enumerate(nb.get("cells", [])):
        if cell.get("cell_type") != "code":
            continue
        meta = cell.get("metadata", {}).get("chemcheck", {})
        acks = [a for a in (meta.get("acknowledgements", []) if isinstance(meta, dict) else []) if isinstance(a, dict)]
        for out in cell.get("outputs", []):
            data = out.get("data", {}) if isinstance(out, dict) else {}
            payload = data.get(MIME_TYPE)
            if not isinstance(payload, dict) or "input" not in payload:
                continue
            inp = payload.get("input") or {}
            reaction = str(inp.get("reaction", ""))
            amounts = {str(k): str(v) for k, v in (inp.get("amounts") or {}).items()}
            recorded = [f for f in payload.get("findings", []) if isinstance(f, dict) and "rule" in f]
            current = None
            err = None
            if recheck:
                try:
                    current = _again(reaction, amounts or None, inp.get("scale")).to_dict()["findings"]
                except ChemcheckError as exc:
                    err = str(exc)
            rr = ReportReview(index, reaction, amounts, recorded, current, err, acks)
            if current is not None:
                before = {_ident(f) for f in recorded}
                after = {_ident(f) for f in current}
                rr.new = [f for f in current if _ident(f) not in before]
                rr.gone = [f for f in recorded if _ident(f) not in after]
            reports.append(rr)
    return NotebookReview(str(p), reports)
