"""The command line: ``chemcheck check``, ``pka``, ``scale``, ``review``, ``batch``.

Bad input exits with status 2 and one line that names the component and the position; no
traceback reaches the user.
"""

from __future__ import annotations

import argparse
import json
import math
import os
import re
import sys
from collections.abc import Sequence

from .errors import ChemcheckError, printable

__all__ = ["main"]


def dumps(value, **kw) -> str:
    """Strict JSON: a non-finite number (which JSON has no spelling for) is written as null."""
    return json.dumps(_finite(value), allow_nan=False, **kw)


def _finite(value):
    if isinstance(value, float):
        return value if math.isfinite(value) else None
    if isinstance(value, dict):
        return {k: _finite(v) for k, v in value.items()}
    if isinstance(value, (list, tuple)):
        return [_finite(v) for v in value]
    return value


def _amounts(pairs: Sequence[str]) -> dict[str, str]:
    from .amounts import add_amount

    out: dict[str, str] = {}
    for pair in pairs or ():
        # SMILES keys contain '=': split at the last '=' that is followed by a number
        cut = max((m.start() for m in re.finditer(r"=(?=\s*[+-]?[\d.])", pair)), default=-1)
        key, sep, value = (pair[:cut], "=", pair[cut + 1 :]) if cut > 0 else pair.partition("=")
        if not sep or not key.strip():
            raise ChemcheckError(f"--amount takes KEY=VALUE (the component as written, then the amount), got '{pair}'")
        add_amount(out, key, value, where=f"--amount given twice for '{key.strip()}'")
    return out


def _cmd_check(args) -> int:
    from . import check

    report = check(args.reaction, _amounts(args.amount) or None)
    if args.json:
        print(dumps(report.to_dict(), indent=2))
    else:
        print(printable_lines(report.to_text()))
    return _fail_code(report.findings, args.fail_on)


def printable_lines(text: str) -> str:
    """Text for the terminal: line breaks kept, every other control character escaped."""
    return "\n".join(printable(line) for line in str(text).split("\n"))


def _fail_code(findings, fail_on: str | None) -> int:
    if not fail_on:
        return 0
    levels = {"error": ("error",), "warning": ("error", "warning")}[fail_on]
    return 1 if any(f.severity in levels for f in findings) else 0


def build_parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="chemcheck", description="Check amine reactions for known failure modes before they are run."
    )
    from ._version import __version__

    parser.add_argument("--version", action="version", version=f"chemcheck {__version__}")
    sub = parser.add_subparsers(dest="command", required=True)

    p = sub.add_parser("check", help="check one reaction (reaction SMILES; reagent names allowed)")
    p.add_argument("reaction", help="reactants>agents>products, e.g. 'CCN.CC(=O)Cl>Et3N>CCNC(C)=O'")
    p.add_argument(
        "--amount", "-a", action="append", default=[], metavar="KEY=VALUE",
        help="amount of a component as written, e.g. 'CCN=1.2 mmol' (repeat for each)",
    )
    p.add_argument("--json", action="store_true", help="print the report payload as JSON")
    p.add_argument("--fail-on", choices=["error", "warning"], help="exit 1 when a finding at this level or above is present")
    p.set_defaults(func=_cmd_check)

    for extra in _EXTRA_COMMANDS:
        extra(sub)
    return parser


_EXTRA_COMMANDS: list = []


def command(fn):
    """Register a function that adds a subcommand to the parser."""
    _EXTRA_COMMANDS.append(fn)
    return fn


def main(argv: Sequence[str] | None = None) -> int:
    from . import _cli_commands  # noqa: F401  registers pka, scale, review, batch

    parser = build_parser()
    args = parser.parse_args(argv)
    try:
        return int(args.func(args) or 0)
    except ChemcheckError as exc:
        print(f"chemcheck: {printable(exc)}", file=sys.stderr)
        return 2
    except KeyboardInterrupt:
        print("chemcheck: interrupted", file=sys.stderr)
        return 130
    except BrokenPipeError:
        return 0
    except Exception as exc:  # an internal fault: one line, the traceback on request
        if os.environ.get("CHEMCHECK_DEBUG"):
            raise
        print(
            f"chemcheck: internal error ({type(exc).__name__}: {printable(exc)}); "
            "set CHEMCHECK_DEBUG=1 for the traceback and report it",
            file=sys.stderr,
        )
        return 3


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
