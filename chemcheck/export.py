"""Static exports of notebooks with their recorded checks and the acknowledgements on them.

A report output carries a ``text/html`` fallback written when the check ran; acknowledgements
come later, in the cell metadata (``"chemcheck": {"acknowledgements": [...]}``). The
preprocessor here renders each recorded report again from its payload, with the cell's
acknowledgements and the severity colours, so the exported page shows the review trail:

    jupyter nbconvert --to chemcheck_html NOTEBOOK.ipynb
    chemcheck export NOTEBOOK.ipynb [-o OUT.html]

Only nbconvert and the display code are needed: no kernel runs and nothing is checked again.
"""

from __future__ import annotations

from pathlib import Path

from .errors import ChemcheckError
from .report import MIME_TYPE

__all__ = [
    "ChemcheckHTMLExporter",  # noqa: F822  (built on first use by __getattr__)
    "ChemcheckPreprocessor",  # noqa: F822
    "add_export_command",
    "export_notebook",
    "render_recorded",
]


def render_recorded(nb) -> int:
    """Rewrite the ``text/html`` of every recorded report in ``nb`` (a notebook node) from its
    payload and its cell's acknowledgements; returns how many reports were rendered."""
    from .display.html import render_html

    done = 0
    for cell in nb.get("cells", []):
        if cell.get("cell_type") != "code":
            continue
        meta = cell.get("metadata", {}).get("chemcheck", {})
        acks = meta.get("acknowledgements", []) if isinstance(meta, dict) else []
        acks = [a for a in acks if isinstance(a, dict)]
        for out in cell.get("outputs", []):
            data = out.get("data") or {}
            payload = data.get(MIME_TYPE)
            if not isinstance(payload, dict) or "findings" not in payload:
                continue
            try:
                data["text/html"] = render_html(payload, acknowledgements=acks)
            except (KeyError, TypeError, ValueError):
                continue  # a payload of another version: keep the recorded fallback
            done += 1
    return done


def _classes() -> dict:
    """The nbconvert classes, built on first use (nbconvert is slow to import)."""
    if _CLASSES:
        return _CLASSES
    try:
        from nbconvert.exporters import HTMLExporter
        from nbconvert.preprocessors import Preprocessor
    except ImportError as exc:  # pragma: no cover - nbconvert ships with JupyterLab
        raise ChemcheckError(f"exporting needs nbconvert ({exc})") from None

    class ChemcheckPreprocessor(Preprocessor):
        """nbconvert preprocessor: recorded checks rendered with their acknowledgements."""

        def preprocess(self, nb, resources):
            render_recorded(nb)
            return nb, resources

    class ChemcheckHTMLExporter(HTMLExporter):
        """HTML export (``--to chemcheck_html``) with the chemcheck review trail."""

        export_from_notebook = "HTML with chemcheck reviews"

        def __init__(self, *args, **kwargs):
            super().__init__(*args, **kwargs)
            self.register_preprocessor(ChemcheckPreprocessor, enabled=True)

    for cls in (ChemcheckPreprocessor, ChemcheckHTMLExporter):
        cls.__module__ = __name__
    _CLASSES.update(
        ChemcheckPreprocessor=ChemcheckPreprocessor, ChemcheckHTMLExporter=ChemcheckHTMLExporter
    )
    return _CLASSES


_CLASSES: dict = {}


def __getattr__(name: str):
    if name in ("ChemcheckPreprocessor", "ChemcheckHTMLExporter"):
        return _classes()[name]
    raise AttributeError(name)


def export_notebook(path: str | Path, out: str | Path | None = None) -> Path:
    """Write ``NOTEBOOK.html`` beside the notebook (or at ``out``); returns the path written."""
    import json

    import nbformat

    p = Path(path)
    try:
        nb = nbformat.read(str(p), as_version=4)
    except FileNotFoundError:
        raise ChemcheckError(f"{p}: no such notebook") from None
    except (json.JSONDecodeError, nbformat.reader.NotJSONError, UnicodeDecodeError) as exc:
        raise ChemcheckError(f"{p}: not a readable notebook (not valid JSON: {exc})") from None
    except Exception as exc:  # nbformat's own validation and version errors
        raise ChemcheckError(
            f"{p}: not a readable notebook ({type(exc).__name__}: {exc})"
        ) from None
    body, _resources = _classes()["ChemcheckHTMLExporter"]().from_notebook_node(nb)
    target = Path(out) if out else p.with_suffix(".html")
    target.write_text(body, encoding="utf-8")
    return target


def add_export_command(sub) -> None:
    """The ``chemcheck export NOTEBOOK`` subcommand (register with ``cli.command``)."""
    p = sub.add_parser(
        "export", help="export a notebook to HTML with its checks and acknowledgements"
    )
    p.add_argument("notebook", help="the .ipynb file")
    p.add_argument("-o", "--output", help="the HTML file to write (default: beside the notebook)")
    p.set_defaults(func=lambda args: print(export_notebook(args.notebook, args.output)) or 0)
