"""chemcheck: check amine reactions for known failure modes before they are run.

>>> import chemcheck
>>> report = chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O")
>>> [f.rule for f in report.findings]
['unbalanced-equation']
"""

from ._version import __version__
from .basicity import Site, basic_sites
from .engine import check
from .errors import AmountError, ChemcheckError, LimitError, ParseError
from .findings import Finding
from .properties import properties
from .reading.reaction import Component, Reaction, parse_reaction
from .report import MIME_TYPE, Report
from .scale import scale

__all__ = [
    "__version__",
    "check",
    "scale",
    "properties",
    "basic_sites",
    "Site",
    "parse_reaction",
    "Report",
    "Finding",
    "Reaction",
    "Component",
    "ChemcheckError",
    "ParseError",
    "AmountError",
    "LimitError",
    "MIME_TYPE",
    "pad",
    "view3d",
]


def pad(reaction: str = "", amounts: dict[str, str] | None = None):
    """A live check pad (ipywidgets) for a reaction and its amounts."""
    from .display.pad import pad as _pad

    return _pad(reaction, amounts)


def view3d(report_or_smiles, component=0):
    """A 3D view of one component, flagged atoms highlighted (3Dmol.js, served locally)."""
    from .display.threed import view3d as _view3d

    return _view3d(report_or_smiles, component)


def load_ipython_extension(ipython):
    """``%load_ext chemcheck`` registers the ``%%chemcheck`` cell magic."""
    from .magic import load_ipython_extension as _load

    _load(ipython)


def _jupyter_labextension_paths():
    return [{"src": "labextension", "dest": "chemcheck-jupyterlab"}]
