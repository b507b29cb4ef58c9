"""Capture RDKit's log so it never reaches the user's stderr.

RDKit writes parse and sanitization problems to its own log (stderr by default) and returns
``None`` or raises a bare exception. From the moment chemcheck reads its first molecule the log
goes through Python's ``logging``: inside ``captured()`` the lines are handed back so they can
become a clear error message; elsewhere (drawing, 3D, worker threads, the user's own RDKit calls
in the same process) they go to the logger ``chemcheck.rdkit``, which is silent unless the
application configures logging (``logging.basicConfig()`` shows them again).
"""

from __future__ import annotations

import logging
import re
import threading
from collections.abc import Iterator
from contextlib import contextmanager

from rdkit import rdBase

_lock = threading.Lock()
_installed = False
_local = threading.local()
_STAMP = re.compile(r"^\[\d\d:\d\d:\d\d\] ")
_forward = logging.getLogger("chemcheck.rdkit")
_forward.addHandler(logging.NullHandler())  # no "last resort" printing to stderr


class _Collector(logging.Handler):
    def emit(self, record: logging.LogRecord) -> None:
        sink = getattr(_local, "sink", None)
        message = _STAMP.sub("", record.getMessage())
        if sink is not None:
            sink.append(message)
        else:
            _forward.log(record.levelno, "%s", message)


def _install() -> None:
    global _installed
    if _installed:
        return
    with _lock:
        if _installed:
            return
        rdBase.LogToPythonLogger()
        logger = logging.getLogger("rdkit")
        # RDKit attaches its own stderr handler; ours replaces it.
        for handler in list(logger.handlers):
            if isinstance(handler, logging.StreamHandler) and not isinstance(handler, _Collector):
                logger.removeHandler(handler)
        logger.addHandler(_Collector())
        logger.propagate = False
        logger.setLevel(logging.DEBUG)
        _installed = True


@contextmanager
def captured() -> Iterator[list[str]]:
    """Collect RDKit log lines written inside the block into the yielded list."""
    _install()
    previous = getattr(_local, "sink", None)
    lines: list[str] = []
    _local.sink = lines
    try:
        yield lines
    finally:
        _local.sink = previous


_install()  # at import: no RDKit line of a chemcheck call reaches stderr, whichever thread makes it
