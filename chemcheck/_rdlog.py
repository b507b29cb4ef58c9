"""Capture RDKit's log so it never reaches the user's stderr.

RDKit writes parse and sanitization problems to its own log (stderr by default) and returns
``None`` or raises a bare exception. ``captured()`` routes the log to a Python logger for the
duration of a block and hands back the text so it can become a clear error message.
"""

from __future__ import annotations

import logging
import re
import sys
import threading
from collections.abc import Iterator
from contextlib import contextmanager

from rdkit import rdBase

_lock = threading.Lock()
_installed = False
_local = threading.local()
_STAMP = re.compile(r"^\[\d\d:\d\d:\d\d\] ")


class _Collector(logging.Handler):
    def emit(self, record: logging.LogRecord) -> None:
        sink = getattr(_local, "sink", None)
        message = _STAMP.sub("", record.getMessage())
        if sink is not None:
            sink.append(message)
        elif record.levelno >= logging.WARNING:
            # Outside chemcheck's own calls RDKit keeps talking to stderr, as it did before.
            sys.stderr.write(message + "\n")


def _install() -> None:
    global _installed
    if _installed:
        return
    with _lock:
        if _installed:
            return
        rdBase.LogToPythonLogger()
        logger = logging.getLogger("rdkit")
        # RDKit attaches its own stderr handler; ours replaces it and keeps its behaviour
        # (warnings and errors to stderr) outside chemcheck's calls.
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
