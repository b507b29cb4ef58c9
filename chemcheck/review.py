"""Review recorded checks in notebooks: what was found, what the current rules find, what was
acknowledged, and whether anything unacknowledged at or above a severity remains.

Reports are the outputs of MIME type ``application/vnd.chemcheck.report+json`` in code cells.
Acknowledgements live in the cell metadata under ``"chemcheck"``:
``{"acknowledgements": [{"finding": KEY, "rule": ..., "who": ..., "when": ..., "note": ...}]}``;
``KEY`` is :func:`finding_key`, the same function as the extension's ``findingKey``.

Saved notebooks are input like any other: a payload may be hand-edited, truncated or written by
another version. Reading them never fails on a field's shape; what cannot be read is said.
Acknowledging is append-only: :func:`add_acknowledgement` keeps every field and entry it does not
understand, and writes under :data:`FALLBACK_KEY` when ``chemcheck`` holds something else.

What an acknowledgement proves: that someone who could edit the notebook wrote that name beside
that finding. ``reviewers`` (a list of accepted names) and ``verify_git`` (the commit that added
the acknowledgement has the named reviewer as author) narrow that down; see docs/index.md.
"""

from __future__ import annotations

import json
import subprocess
from dataclasses import dataclass, field
from pathlib import Path

from .errors import ChemcheckError
from .report import MIME_TYPE

__all__ = [
    "finding_key", "ReportReview", "NotebookReview", "review_notebook", "NotebookError",
    "read_acknowledgements", "add_acknowledgement", "reviewer_name", "read_reviewers",
    "METADATA_KEY", "FALLBACK_KEY", "SEVERITIES",
]

METADATA_KEY = "chemcheck"
FALLBACK_KEY = "chemcheck-review"  # used when METADATA_KEY holds a value of another shape
SEVERITIES = ("error", "warning", "info")
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
    units = s.encode("utf-16-le", "surrogatepass")
    h = 0
    for i in range(0, len(units), 2):
        h = (31 * h + int.from_bytes(units[i : i + 2], "little")) & 0xFFFFFFFF
    return f"{rule}#{h:x}"


# --- reading saved payloads defensively ---------------------------------------------------------


def _clean_atoms(value) -> list[list[int]]:
    """Atom pairs as saved; anything that is not a pair of non-negative integers is dropped."""
    out = []
    for a in value if isinstance(value, list) else []:
        if (
            isinstance(a, (list, tuple)) and len(a) == 2
            and all(isinstance(x, int) and not isinstance(x, bool) and x >= 0 for x in a)
        ):
            out.append([a[0], a[1]])
    return out


def _clean_finding(f) -> dict | None:
    """A recorded finding with every field of the expected type, or None if it names no rule.

    A severity other than error/warning/info is kept as written and ranks as an error: a saved
    file cannot lower the level at which a finding gates a review by misspelling it."""
    if not isinstance(f, dict) or not isinstance(f.get("rule"), str) or not f["rule"]:
        return None
    sev = f.get("severity")
    return {
        **f,
        "severity": sev if isinstance(sev, str) else "unknown",
        "message": f.get("message") if isinstance(f.get("message"), str) else "",
        "title": f.get("title") if isinstance(f.get("title"), str) else "",
        "atoms": _clean_atoms(f.get("atoms")),
        "fix": f.get("fix") if isinstance(f.get("fix"), str) else None,
    }


def _rank(severity: str) -> int:
    return _ORDER.get(severity, _ORDER["error"])


def _read_input(payload: dict) -> tuple[str, dict[str, str]]:
    inp = payload.get("input")
    if isinstance(inp, str):
        return inp, {}
    if not isinstance(inp, dict):
        return "", {}
    reaction = inp.get("reaction")
    reaction = reaction if isinstance(reaction, str) else ""
    raw = inp.get("amounts")
    amounts = {str(k): str(v) for k, v in raw.items()} if isinstance(raw, dict) else {}
    return reaction, amounts


# --- acknowledgements ---------------------------------------------------------------------------


def reviewer_name(who) -> str:
    """The name in an acknowledgement's ``who``: a string, or an object with ``name``."""
    if isinstance(who, str):
        return who.strip()
    if isinstance(who, dict) and isinstance(who.get("name"), str):
        return who["name"].strip()
    return ""


def _reviewer_email(who) -> str:
    if isinstance(who, dict) and isinstance(who.get("email"), str):
        return who["email"].strip()
    if isinstance(who, str) and "<" in who and who.rstrip().endswith(">"):
        return who[who.rindex("<") + 1 : -1].strip()
    return ""


def read_acknowledgements(cell_metadata) -> list[dict]:
    """The acknowledgements of one cell, from ``chemcheck`` and the fall-back key, in the order
    written. Entries without a string ``finding`` are skipped (and left in place)."""
    out = []
    if not isinstance(cell_metadata, dict):
        return out
    for key in (METADATA_KEY, FALLBACK_KEY):
        meta = cell_metadata.get(key)
        if isinstance(meta, dict) and isinstance(meta.get("acknowledgements"), list):
            out.extend(a for a in meta["acknowledgements"] if isinstance(a, dict) and isinstance(a.get("finding"), str))
    return out


def add_acknowledgement(cell_metadata: dict | None, ack: dict) -> dict:
    """The cell metadata after appending ``ack``; nothing already there is changed or dropped.

    The entry goes to ``metadata["chemcheck"]["acknowledgements"]`` when that is a dict with a
    list (or absent); otherwise to ``metadata["chemcheck-review"]``. The input is not modified.
    """
    base = dict(cell_metadata) if isinstance(cell_metadata, dict) else {}
    for key in (METADATA_KEY, FALLBACK_KEY):
        meta = base.get(key)
        if meta is None:
            base[key] = {"acknowledgements": [dict(ack)]}
            return base
        if isinstance(meta, dict) and isinstance(meta.get("acknowledgements", []), list):
            base[key] = {**meta, "acknowledgements": [*meta.get("acknowledgements", []), dict(ack)]}
            return base
    raise ChemcheckError(
        f"cell metadata keys '{METADATA_KEY}' and '{FALLBACK_KEY}' both hold values of another "
        "shape: the acknowledgement was not stored"
    )


def read_reviewers(path: str | Path) -> list[str]:
    """Reviewer names, one a line (``#`` starts a comment); ``Name <email>`` is allowed."""
    p = Path(path)
    try:
        text = p.read_text(encoding="utf-8-sig")
    except FileNotFoundError:
        raise ChemcheckError(f"{p}: no such reviewers file") from None
    except (OSError, UnicodeDecodeError) as exc:
        raise ChemcheckError(f"{p}: the reviewers file cannot be read ({exc})") from None
    names = [line.split("#", 1)[0].strip() for line in text.splitlines()]
    names = [n for n in names if n]
    if not names:
        raise ChemcheckError(f"{p}: the reviewers file lists no one")
    return names


def _same_person(who, listed: str) -> bool:
    name, email = reviewer_name(who), _reviewer_email(who)
    l_email = listed[listed.rindex("<") + 1 : -1].strip() if listed.endswith(">") and "<" in listed else ""
    l_name = listed[: listed.rindex("<")].strip() if l_email else listed.strip()
    if l_email and email:
        return l_email.casefold() == email.casefold()
    bare = name[: name.rindex("<")].strip() if "<" in name else name
    return bool(bare) and bare.casefold() == l_name.casefold()


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
    rejected: list[tuple[dict, str]] = field(default_factory=list)  # acknowledgements not accepted, why

    def acknowledged(self, f: dict) -> dict | None:
        """The latest accepted acknowledgement of ``f``, if any."""
        key = finding_key(f["rule"], f.get("message", ""), f.get("atoms", []))
        for a in reversed(self.acknowledgements):
            if a.get("finding") == key:
                return a
        return None

    @property
    def findings(self) -> list[dict]:
        return self.current if self.current is not None else self.recorded

    def open_findings(self, at_least: str) -> list[dict]:
        return [f for f in self.findings if _rank(f["severity"]) >= _ORDER[at_least] and self.acknowledged(f) is None]

    def to_dict(self) -> dict:
        return {
            "cell": self.cell,
            "reaction": self.reaction,
            "amounts": self.amounts,
            "recheck_error": self.recheck_error,
            "findings": [{**f, "acknowledged": self.acknowledged(f)} for f in self.findings],
            "new": self.new,
            "gone": self.gone,
            "rejected_acknowledgements": [{**a, "reason": why} for a, why in self.rejected],
        }


@dataclass
class NotebookReview:
    path: str
    reports: list[ReportReview]
    error: str | None = None  # the notebook could not be read

    def open_findings(self, at_least: str) -> list[tuple[ReportReview, dict]]:
        return [(r, f) for r in self.reports for f in r.open_findings(at_least)]

    def to_dict(self, at_least: str = "warning") -> dict:
        out = {
            "notebook": self.path,
            "reports": [r.to_dict() for r in self.reports],
            "open": len(self.open_findings(at_least)),
        }
        if self.error is not None:
            out["error"] = self.error
        return out


def _ident(f: dict) -> tuple:
    return (f["rule"], f.get("message", ""), tuple(tuple(a) for a in f.get("atoms", [])))


def _read_notebook(p: Path):
    import nbformat

    try:
        return nbformat.read(str(p), as_version=4)
    except FileNotFoundError:
        raise NotebookError(f"{p}: no such notebook") from None
    except IsADirectoryError:
        raise NotebookError(f"{p}: a folder, not a notebook") from None
    except PermissionError:
        raise NotebookError(f"{p}: not readable (permission denied)") from None
    except (json.JSONDecodeError, nbformat.reader.NotJSONError, UnicodeDecodeError) as exc:
        raise NotebookError(f"{p}: not a readable notebook (not valid JSON: {exc})") from None
    except Exception as exc:  # nbformat's own validation and version errors
        raise NotebookError(f"{p}: not a readable notebook ({type(exc).__name__}: {exc})") from None


def _recheck(
    reaction: str, amounts: dict, timeout: float | None = None, scale_input: dict | None = None
) -> tuple[list[dict] | None, str | None]:
    from .batch import TimeUp, time_limit
    from .scale import recheck as check_again  # a scaled report is checked again with its scale settings

    if not reaction:
        return None, "the saved report holds no reaction"
    try:
        with time_limit(timeout):
            return check_again(reaction, amounts or None, scale_input).to_dict()["findings"], None
    except TimeUp:
        return None, f"not re-checked: took longer than the {timeout:g} s allowed (--timeout); the recorded findings are used"
    except ChemcheckError as exc:
        return None, str(exc)
    except RecursionError:
        return None, "the reaction is too deeply nested to check"
    except Exception as exc:  # one cell must never stop the review of the others
        return None, f"internal error ({type(exc).__name__}: {exc})"


def _payloads(cell) -> list[dict]:
    outputs = cell.get("outputs") if isinstance(cell, dict) else None
    found = []
    for out in outputs if isinstance(outputs, list) else []:
        data = out.get("data") if isinstance(out, dict) else None
        payload = data.get(MIME_TYPE) if isinstance(data, dict) else None
        if isinstance(payload, str):  # some writers store JSON MIME data as text
            try:
                payload = json.loads(payload)
            except ValueError:
                payload = None
        if isinstance(payload, dict) and "input" in payload:
            found.append(payload)
    return found


def review_notebook(
    path: str | Path,
    recheck: bool = True,
    reviewers: list[str] | None = None,
    verify_git: bool = False,
    timeout: float | None = None,
) -> NotebookReview:
    """Read the recorded checks of one notebook, re-check them unless ``recheck`` is false.

    ``reviewers``: accept only acknowledgements whose ``who`` is one of these names.
    ``verify_git``: accept only acknowledgements added in a commit whose author is the named
    reviewer (the notebook must be in a git repository). Rejected acknowledgements are listed
    with the reason and do not count. ``timeout``: seconds allowed per re-check (in the main
    thread); a slower one keeps the recorded findings and says so."""
    p = Path(path)
    nb = _read_notebook(p)
    cells = nb.get("cells") if isinstance(nb, dict) else None
    history = _GitHistory(p) if verify_git else None
    reports: list[ReportReview] = []
    for index, cell in enumerate(cells if isinstance(cells, list) else []):
        if not isinstance(cell, dict) or cell.get("cell_type") != "code":
            continue
        payloads = _payloads(cell)
        if not payloads:
            continue
        acks, rejected = _accepted(read_acknowledgements(cell.get("metadata")), reviewers, history)
        for payload in payloads:
            reaction, amounts = _read_input(payload)
            raw = payload.get("findings")
            recorded = [c for c in (_clean_finding(f) for f in (raw if isinstance(raw, list) else [])) if c]
            inp = payload.get("input")
            scale_input = inp.get("scale") if isinstance(inp, dict) else None
            current, err = _recheck(reaction, amounts, timeout, scale_input) if recheck else (None, None)
            rr = ReportReview(index, reaction, amounts, recorded, current, err, acks, rejected=rejected)
            if current is not None:
                before = {_ident(f) for f in recorded}
                after = {_ident(f) for f in current}
                rr.new = [f for f in current if _ident(f) not in before]
                rr.gone = [f for f in recorded if _ident(f) not in after]
            reports.append(rr)
    return NotebookReview(str(p), reports)


def _accepted(acks: list[dict], reviewers: list[str] | None, history: _GitHistory | None):
    kept, rejected = [], []
    for a in acks:
        who = a.get("who")
        if reviewers is not None and not any(_same_person(who, r) for r in reviewers):
            rejected.append((a, f"'{reviewer_name(who) or '(no name)'}' is not a listed reviewer"))
            continue
        if history is not None:
            why = history.check(a)
            if why:
                rejected.append((a, why))
                continue
        kept.append(a)
    return kept, rejected


class _GitHistory:
    """Who added each acknowledgement to one notebook, from the repository's history."""

    def __init__(self, path: Path) -> None:
        self.path = path.resolve()
        self.root: str | None = None
        self.problem: str | None = None
        proc = self._git("rev-parse", "--show-toplevel", cwd=self.path.parent)
        if proc is None or proc.returncode != 0:
            self.problem = "the notebook is not in a git repository"
        else:
            self.root = proc.stdout.strip()

    @staticmethod
    def _git(*args, cwd) -> subprocess.CompletedProcess | None:
        try:
            return subprocess.run(["git", *args], cwd=cwd, capture_output=True, text=True, timeout=60)
        except (OSError, subprocess.TimeoutExpired):
            return None

    def check(self, ack: dict) -> str | None:
        """None when the latest commit that changed how often this acknowledgement's key occurs
        in the notebook (the one that added it; a removal and re-adding by someone else counts as
        theirs) has the named reviewer as author; otherwise the reason it is not accepted."""
        if self.problem:
            return self.problem
        key = ack["finding"]
        # the path relative to the notebook's own folder: git resolves it whatever the symlinks
        proc = self._git("log", "--format=%H%x09%an%x09%ae", "-S", key, "--", self.path.name, cwd=self.path.parent)
        lines = proc.stdout.strip().splitlines() if proc is not None and proc.returncode == 0 else []
        if not lines:
            return "not found in any commit (added after the last commit, or not under git)"
        commit, author, email = (lines[0].split("\t") + ["", ""])[:3]
        if _same_person(ack.get("who"), f"{author} <{email}>") or _same_person(ack.get("who"), author):
            return None
        return f"added in commit {commit[:10]} by '{author}', not by '{reviewer_name(ack.get('who'))}'"

