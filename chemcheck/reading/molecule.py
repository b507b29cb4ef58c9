"""Reading one SMILES into an RDKit molecule, with errors a chemist can act on.

Metal species and hypervalent reagents that fail RDKit's full sanitization are kept with a
partial sanitization (valences not enforced) and say so; a carbon, nitrogen or oxygen with too
many bonds is a drawing error and is refused.
"""

from __future__ import annotations

import re
from dataclasses import dataclass

from rdkit import Chem

from .. import _rdlog
from . import _smiles
from ..errors import LimitError, ParseError

__all__ = ["ReadMol", "read_smiles", "METALS"]

# Elements whose valence RDKit's sanitizer may reject although the species is a real reagent.
METALS = frozenset(
    "Li Be Na Mg Al K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn Ga Rb Sr Y Zr Nb Mo Ru Rh Pd Ag Cd In Sn Sb "
    "Cs Ba La Ce Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi".split()
)
_HYPERVALENT_OK = frozenset("B Si P S Se Cl Br I Xe Te As".split()) | METALS

_VALENCE = re.compile(r"valence for atom # ?(\d+) (\w+)")
_KEKULE = re.compile(r"Unkekulized atoms:\s*([\d ]+)")
_AROMATIC_NONRING = re.compile(r"non-ring atom (\d+) marked aromatic")
_POSITION = re.compile(r"around position (\d+)")
_SELF_RING = re.compile(r"duplicated ring closure (%?\d+) bonds atom (\d+) to itself")


@dataclass(frozen=True)
class ReadMol:
    mol: Chem.Mol
    sanitization: str  # "full" or "partial"
    note: str | None  # why sanitization was partial


def _raise(reason: str, smiles: str, offset: int | None, *, component: int | None, text: str | None):
    raise ParseError(
        reason,
        component=component,
        text=text if text is not None else smiles,
        position=None if offset is None else offset + 1,
    )


def _explain_syntax(smiles: str, log: list[str], component: int | None, text: str | None):
    sc = _smiles.scan(smiles)
    if sc.unclosed_bracket is not None:
        _raise("'[' is not closed", smiles, sc.unclosed_bracket, component=component, text=text)
    if sc.unclosed_rings:
        label, off = sc.unclosed_rings[0]
        _raise(f"ring closure {label} not closed", smiles, off, component=component, text=text)
    if sc.unbalanced_branch is not None:
        ch = smiles[sc.unbalanced_branch]
        what = "'(' is not closed" if ch == "(" else "')' has no matching '('"
        _raise(what, smiles, sc.unbalanced_branch, component=component, text=text)
    for line in log:
        m = _SELF_RING.search(line)
        if m:
            # 'Cl22': the same ring-closure digit twice on one atom would bond it to itself
            label, start = m.group(1), _atom_offset(smiles, int(m.group(2))) or 0
            first = smiles.find(label, start)
            second = smiles.find(label, first + len(label)) if first >= 0 else -1
            _raise(f"ring closure {label.lstrip('%')} opened and closed on the same atom", smiles,
                   second if second >= 0 else None, component=component, text=text)
        m = _POSITION.search(line)
        if m:
            pos = int(m.group(1))
            _raise("not valid SMILES", smiles, max(pos - 1, 0), component=component, text=text)
    _raise("not valid SMILES", smiles, None, component=component, text=text)


def _atom_offset(smiles: str, atom_index: int) -> int | None:
    positions = _smiles.scan(smiles).atom_positions
    return positions[atom_index] if 0 <= atom_index < len(positions) else None


def _check_rings(mol: Chem.Mol, smiles: str, component: int | None) -> None:
    """Refuse, before ring perception, a molecule with more rings than the work budget allows
    (perception on densely fused graphs takes seconds and hundreds of MB)."""
    from .._budget import MAX_RINGS

    rings = mol.GetNumBonds() - mol.GetNumAtoms() + len(Chem.GetMolFrags(mol))
    if rings > MAX_RINGS:
        where = f"component {component} " if component is not None else ""
        shown = smiles if len(smiles) <= 40 else smiles[:40] + "…"
        raise LimitError(f"{where}'{shown}': {rings} rings; the limit is {MAX_RINGS}")


def read_smiles(
    smiles: str, *, component: int | None = None, text: str | None = None
) -> ReadMol:
    """Parse and sanitize ``smiles``; raise :class:`ParseError` naming the position."""
    if not smiles or not smiles.strip():
        raise ParseError("empty", component=component, text=text if text is not None else smiles)
    if not smiles.isascii():
        # SMILES is ASCII; RDKit's log would also cut a multibyte character in half
        pos = next(i for i, ch in enumerate(smiles) if not ch.isascii())
        _raise(f"character {smiles[pos]!r} cannot appear in SMILES", smiles, pos, component=component, text=text)
    with _rdlog.captured() as log:
        try:
            mol = Chem.MolFromSmiles(smiles, sanitize=False)
        except SystemError:  # RDKit's log bridge failed on the text: treat as unreadable
            mol = None
    if mol is None:
        _explain_syntax(smiles, log, component, text)
    if mol.GetNumAtoms() == 0:
        raise ParseError("no atoms", component=component, text=text if text is not None else smiles)
    _check_rings(mol, smiles, component)
    work = Chem.Mol(mol)
    with _rdlog.captured() as log:
        try:
            Chem.SanitizeMol(work)
            return ReadMol(work, "full", None)
        except Chem.AtomValenceException as exc:
            problem = str(exc)
        except Chem.KekulizeException as exc:
            problem = str(exc)
        except (Chem.AtomKekulizeException, Chem.MolSanitizeException, RuntimeError) as exc:
            problem = str(exc)
    problem = " ".join([problem, *log])
    m = _VALENCE.search(problem)
    if m:
        idx = int(m.group(1))
        symbol = mol.GetAtomWithIdx(idx).GetSymbol() if idx < mol.GetNumAtoms() else m.group(2)
        elements = {a.GetSymbol() for a in mol.GetAtoms()}
        if symbol in _HYPERVALENT_OK or elements & METALS:
            return _partial(mol, f"valence of {symbol} (atom {idx + 1}) not checked")
        _raise(
            f"{symbol} (atom {idx + 1}) has more bonds than it can form",
            smiles,
            _atom_offset(smiles, idx),
            component=component,
            text=text,
        )
    m = _KEKULE.search(problem)
    if m:
        idx = int(m.group(1).split()[0])
        _raise(
            "aromatic ring cannot be drawn with alternating bonds (check ring size, or [nH])",
            smiles,
            _atom_offset(smiles, idx),
            component=component,
            text=text,
        )
    m = _AROMATIC_NONRING.search(problem)
    if m:
        idx = int(m.group(1))
        _raise(
            "lower-case (aromatic) atom outside a ring",
            smiles,
            _atom_offset(smiles, idx),
            component=component,
            text=text,
        )
    _raise("cannot be sanitized", smiles, None, component=component, text=text)
    raise AssertionError("unreachable")


def _partial(mol: Chem.Mol, note: str) -> ReadMol:
    work = Chem.Mol(mol)
    flags = Chem.SanitizeFlags.SANITIZE_ALL ^ Chem.SanitizeFlags.SANITIZE_PROPERTIES
    with _rdlog.captured():
        work.UpdatePropertyCache(strict=False)
        Chem.SanitizeMol(work, flags, catchErrors=True)
    return ReadMol(work, "partial", note)
