"""Tautomers drawn for amino-heteroaromatics and pyridones, put in the form the model reads.

2-Aminopyridine, 4-aminopyridine, cytosine, 2-aminothiazole and their relatives are amino
compounds in water; their imino tautomers (an exocyclic C=N on a ring that carries an N-H,
``N=c1cccc[nH]1``) lie several powers of ten lower (A. R. Katritzky and J. M. Lagowski, Adv.
Heterocycl. Chem. 1963, 1, 339 and later reviews). Both tautomers give the same cation, so the
measured pKa is that of the amino form; a model applied to the imino drawing would instead see
a cyclic amidine (pKa 11-13) or an N-aryl imine. ``amino_form`` moves the ring N-H to the
exocyclic N and returns the molecule with its atoms in the same order. A ring N that carries a
carbon group (1-methyl-2-iminopyridine) is left alone: that imine is fixed and strongly basic.

A 2- or 4-pyridone (a six-membered ring whose only heteroatom is the N-H, with its C=O ortho or
para to it: pyridones, quinolones, acridones) is read through its hydroxypyridine tautomer,
whose cation is the same: ``hydroxy_form``. The model's terms for a hydroxy group ortho or para
to a pyridine N already hold the tautomer equilibrium (2-pyridone 0.75, 4-pyridone 3.27,
Albert, from memory), so a pyridone drawn either way gets one value. Pyrimidinones and other
lactams with a second ring N keep their drawing.
"""

from __future__ import annotations

from rdkit import Chem

from .. import _rdlog

_EXO_IMINE = Chem.MolFromSmarts("[NX2;!R]=[#6;R]")
_PYRIDONE = Chem.MolFromSmarts("[OX1]=[#6;R]")
# quick tests on the aromatic molecule before any kekulized search
_EXO_ON_RING_WITH_NH = Chem.MolFromSmarts("[NX2,OX1;!R]=[#6;a]")
_RING_NH = Chem.MolFromSmarts("[nH]")


def amino_form(mol: Chem.Mol) -> Chem.Mol:
    """The molecule with each exocyclic imine on a ring with an N-H shifted to the amino form,
    and each NH-pyridone to its hydroxypyridine form (``hydroxy_form``)."""
    if not mol.HasSubstructMatch(_EXO_ON_RING_WITH_NH) or not mol.HasSubstructMatch(_RING_NH):
        return mol
    mol = hydroxy_form(mol)
    if not mol.HasSubstructMatch(_EXO_IMINE) or not any(
        a.GetAtomicNum() == 7 and a.GetIsAromatic() and a.GetTotalNumHs() == 1 for a in mol.GetAtoms()
    ):
        return mol
    out = mol
    for _ in range(4):  # one shift per pass; a molecule rarely has more than one such unit
        shifted = _shift_once(out)
        if shifted is None:
            break
        out = shifted
    return out


def hydroxy_form(mol: Chem.Mol) -> Chem.Mol:
    """The molecule with each NH-pyridone drawn as its hydroxypyridine tautomer (same atoms)."""
    if not mol.HasSubstructMatch(_PYRIDONE):
        return mol
    out = mol
    for _ in range(4):
        shifted = _shift_once(out, _PYRIDONE, pyridone=True)
        if shifted is None:
            break
        out = shifted
    return out


def _single_n_ring(mol: Chem.Mol, ring) -> bool:
    return len(ring) == 6 and sum(1 for i in ring if mol.GetAtomWithIdx(i).GetAtomicNum() != 6) == 1


def _shift_once(mol: Chem.Mol, pattern=_EXO_IMINE, pyridone: bool = False) -> Chem.Mol | None:
    kek = Chem.RWMol(mol)
    try:
        Chem.Kekulize(kek, clearAromaticFlags=True)
    except Exception:  # noqa: BLE001 - an unusual ring system: keep the drawing
        return None
    info = mol.GetRingInfo()
    for n_exo, c in kek.GetSubstructMatches(pattern):
        if not mol.GetAtomWithIdx(c).GetIsAromatic():
            continue
        for ring in info.AtomRings():
            if c not in ring or not all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in ring):
                continue
            if pyridone and not _single_n_ring(mol, ring):
                continue
            # the ring N-H next to the imine carbon first (cytosine: N3, not N1)
            for nr in sorted(ring, key=lambda i: len(Chem.GetShortestPath(kek, c, i)) if i != c else 99):
                a = mol.GetAtomWithIdx(nr)
                if a.GetAtomicNum() != 7 or a.GetTotalNumHs() != 1 or a.GetDegree() != 2:
                    continue
                path = Chem.GetShortestPath(kek, c, nr)
                if len(path) not in (2, 4) or not all(i in ring for i in path):
                    continue
                bonds = [kek.GetBondBetweenAtoms(path[i], path[i + 1]) for i in range(len(path) - 1)]
                # single, double, single ... from the imine carbon to the ring N-H
                want = [Chem.BondType.SINGLE if i % 2 == 0 else Chem.BondType.DOUBLE for i in range(len(bonds))]
                if [b.GetBondType() for b in bonds] != want:
                    continue
                rw = Chem.RWMol(kek)
                rw.GetBondBetweenAtoms(n_exo, c).SetBondType(Chem.BondType.SINGLE)
                for b, t in zip(bonds, want):
                    rw.GetBondBetweenAtoms(b.GetBeginAtomIdx(), b.GetEndAtomIdx()).SetBondType(
                        Chem.BondType.DOUBLE if t == Chem.BondType.SINGLE else Chem.BondType.SINGLE
                    )
                ring_n = rw.GetAtomWithIdx(nr)
                ring_n.SetNumExplicitHs(0)
                ring_n.SetNoImplicit(False)
                exo = rw.GetAtomWithIdx(n_exo)
                exo.SetNumExplicitHs(exo.GetTotalNumHs() + 1)
                exo.SetNoImplicit(True)
                new = rw.GetMol()
                with _rdlog.captured():
                    try:
                        Chem.SanitizeMol(new)
                    except Exception:  # noqa: BLE001 - the shift does not give a valid molecule
                        continue
                return new
    return None
