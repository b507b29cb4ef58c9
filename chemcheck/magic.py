"""The ``%%chemcheck`` cell magic: a reaction and its amounts as lines of text.

    %load_ext chemcheck

    %%chemcheck
    NCc1ccccc1.CC(=O)Cl>Et3N.DCM>CC(=O)NCc1ccccc1
    NCc1ccccc1 = 1.07 g
    CC(=O)Cl = 1.1 equiv
    Et3N = 1.5 equiv

Options on the magic line: ``--scale FACTOR`` and ``--vessel-ml ML`` show the scaled-up check.
Lines starting with ``#`` are comments. Errors are one line, never a traceback.
"""

from __future__ import annotations

import re
import shlex
import sys

from .errors import ChemcheckError

_SPLIT = re.compile(r"\s*=\s*(?=[+-]?[\d.])")


def parse_cell(cell: str) -> tuple[str, dict[str, str]]:
    from .amounts import add_amount

    lines = [ln.strip() for ln in cell.splitlines()]
    lines = [ln for ln in lines if ln and not ln.startswith("#")]
    if not lines:
        raise ChemcheckError("the cell is empty: write the reaction on the first line")
    reaction = lines[0]
    amounts: dict[str, str] = {}
    for n, line in enumerate(lines[1:], start=2):
        cuts = list(_SPLIT.finditer(line))
        if not cuts:
            raise ChemcheckError(f"line {n} '{line}': write 'COMPONENT = AMOUNT' (e.g. 'CCN = 1.2 mmol')")
        m = cuts[-1]
        key, value = line[: m.start()].strip(), line[m.end() :].strip()
        if not key:
            raise ChemcheckError(f"line {n} '{line}': the component is missing before '='")
        add_amount(amounts, key, value, where=f"line {n}")
    return reaction, amounts


def chemcheck_cell(line: str, cell: str):
    from IPython.display import display

    from .engine import check
    from .scale import scale

    try:
        args = shlex.split(line or "")
        factor = vessel = None
        i = 0
        while i < len(args):
            if args[i] == "--scale" and i + 1 < len(args):
                factor = float(args[i + 1])
                i += 2
            elif args[i] == "--vessel-ml" and i + 1 < len(args):
                vessel = float(args[i + 1])
                i += 2
            else:
                raise ChemcheckError(f"unknown option '{args[i]}' (use --scale FACTOR, --vessel-ml ML)")
        reaction, amounts = parse_cell(cell)
        report = check(reaction, amounts or None)
        if factor is not None:
            report = scale(report, factor, vessel_ml=vessel)
    except (ChemcheckError, ValueError) as exc:
        print(f"chemcheck: {exc}", file=sys.stderr)
        return None
    display(report)
    return None


def load_ipython_extension(ipython) -> None:
    ipython.register_magic_function(chemcheck_cell, magic_kind="cell", magic_name="chemcheck")
