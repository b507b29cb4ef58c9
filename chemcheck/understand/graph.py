"""Plain-Python tables of a component's atoms and bonds, read once per molecule.

Reading a centre or scoring a mapper's answer visits every atom and bond of every component
many times; each visit through RDKit's Python wrappers (``GetAtoms()``, ``GetBondBetweenAtoms``)
costs about a microsecond, more than the arithmetic it feeds. The tables hold what those
readings need (element, hydrogen count, charge, neighbours, bond orders) in lists and a dict,
built once per component and kept on it.
"""

from __future__ import annotations

from dataclasses import dataclass

from rdkit import Chem

from .._memo import Memo

__all__ = ["Graph", "graph_of", "text_key", "bond_order"]

_AROMATIC = Chem.BondType.AROMATIC
_DATIVE = Chem.BondType.DATIVE


def bond_order(bond: Chem.Bond | None) -> float:
    """Bond order as a number: aromatic 1.5, dative 1, none 0."""
    if bond is None:
        return 0.0
    t = bond.GetBondType()
    if t == _AROMATIC or bond.GetIsAromatic():
        return 1.5
    if t == _DATIVE:
        return 1.0
    return float(bond.GetBondTypeAsDouble())


@dataclass(frozen=True)
class Graph:
    """One molecule's atoms and bonds. ``order`` holds both orientations of each bond."""

    z: tuple[int, ...]  # atomic number per atom
    symbol: tuple[str, ...]
    hs: tuple[int, ...]  # hydrogens on the atom, explicit H atoms included
    charge: tuple[int, ...]
    neighbours: tuple[tuple[int, ...], ...]
    order: dict[tuple[int, int], float]
    bonds: tuple[tuple[int, int, float], ...]  # (begin, end, order) in RDKit's bond order


def _hs(atom: Chem.Atom) -> int:
    try:
        return atom.GetTotalNumHs(includeNeighbors=True)
    except RuntimeError:  # a partly sanitized molecule without implicit counts
        return atom.GetNumExplicitHs()


def build(mol: Chem.Mol) -> Graph:
    n = mol.GetNumAtoms()
    atoms = [mol.GetAtomWithIdx(i) for i in range(n)]
    nbrs: list[list[int]] = [[] for _ in range(n)]
    order: dict[tuple[int, int], float] = {}
    bonds = []
    for k in range(mol.GetNumBonds()):
        b = mol.GetBondWithIdx(k)
        i, j = b.GetBeginAtomIdx(), b.GetEndAtomIdx()
        o = bond_order(b)
        order[(i, j)] = order[(j, i)] = o
        nbrs[i].append(j)
        nbrs[j].append(i)
        bonds.append((i, j, o))
    return Graph(
        z=tuple(a.GetAtomicNum() for a in atoms),
        symbol=tuple(a.GetSymbol() for a in atoms),
        hs=tuple(_hs(a) for a in atoms),
        charge=tuple(a.GetFormalCharge() for a in atoms),
        neighbours=tuple(tuple(x) for x in nbrs),
        order=order,
        bonds=tuple(bonds),
    )


_BY_TEXT = Memo(4096)  # (text as written, SMILES, atoms, bonds) -> Graph


def text_key(comp) -> tuple:
    """The key of answers remembered per component as written: the same text gives the same
    molecule in the same atom order (the SMILES and size guard against a molecule replaced)."""
    return (comp.text, comp.smiles, comp.mol.GetNumAtoms(), comp.mol.GetNumBonds())


def graph_of(comp) -> Graph:
    """The tables of ``comp.mol``, built on first use and kept on the component (rebuilt if its
    molecule is replaced). The same text gives the same molecule in the same atom order, so the
    tables of a solvent or reagent met before are reused."""
    mol = comp.mol
    hit = comp.__dict__.get("_graph")
    if hit is not None and hit[0] is mol:
        return hit[1]
    key = text_key(comp)
    g = _BY_TEXT.get(key)
    if g is None:
        g = _BY_TEXT.put(key, build(mol))
    comp.__dict__["_graph"] = (mol, g)
    return g
