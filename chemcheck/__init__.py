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
from .reaction import Component, Reaction, parse_reaction
from .report import MIME_TYPE, Report
from .scale import scale

__all__ = [
    "__version__",
    "check",
    "scale",
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
]


def _jupyter_labextension_paths():
    return [{"src": "labextension", "dest": "chemcheck-jupyterlab"}]
