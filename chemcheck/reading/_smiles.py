"""A small SMILES tokenizer, used only to turn RDKit's complaints into character positions.

RDKit reports atoms by index; a chemist needs the place in what was typed. The tokenizer walks
the string in the order RDKit numbers atoms (OpenSMILES: atoms are numbered as they appear).
"""

from __future__ import annotations

import re
from dataclasses import dataclass

_ORGANIC = re.compile(r"Cl|Br|[BCNOPSFI]|[bcnops]|\*")
_RING = re.compile(r"%\d\d|\d")


@dataclass(frozen=True)
class Scan:
    atom_positions: tuple[int, ...]  # 0-based offset of each atom, in RDKit's atom order
    unclosed_rings: tuple[tuple[str, int], ...]  # (label, 0-based offset of the opening digit)
    unbalanced_branch: int | None  # offset of an unmatched '(' or ')'
    unclosed_bracket: int | None  # offset of a '[' without ']'


def scan(smiles: str) -> Scan:
    atoms: list[int] = []
    open_rings: dict[str, int] = {}
    branches: list[int] = []
    bad_branch: int | None = None
    bad_bracket: int | None = None
    i = 0
    n = len(smiles)
    while i < n:
        ch = smiles[i]
        if ch == "[":
            close = smiles.find("]", i)
            atoms.append(i)
            if close < 0:
                bad_bracket = i
                break
            i = close + 1
            continue
        m = _ORGANIC.match(smiles, i)
        if m:
            atoms.append(i)
            i = m.end()
            continue
        m = _RING.match(smiles, i)
        if m:
            label = m.group(0).lstrip("%")
            if label in open_rings:
                del open_rings[label]
            else:
                open_rings[label] = i
            i = m.end()
            continue
        if ch == "(":
            branches.append(i)
        elif ch == ")":
            if branches:
                branches.pop()
            elif bad_branch is None:
                bad_branch = i
        i += 1
    if branches and bad_branch is None:
        bad_branch = branches[0]
    return Scan(
        atom_positions=tuple(atoms),
        unclosed_rings=tuple(sorted(open_rings.items(), key=lambda kv: kv[1])),
        unbalanced_branch=bad_branch,
        unclosed_bracket=bad_bracket,
    )
