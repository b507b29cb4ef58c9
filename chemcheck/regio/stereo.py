"""Stereochemistry of E2 eliminations, read from a 3D embedding of the drawn stereoisomer.

E2 needs the beta-hydrogen and the leaving group anti-periplanar (dihedral H-C-C-X near 180°).

* In a cyclohexane that means trans-diaxial: only a beta-H on the face opposite to the leaving
  group can leave, so a beta-CH whose hydrogen is cis to the leaving group gives no E2 alkene.
* On an open chain with both carbons configured the reaction is stereospecific: the
  anti-periplanar conformer fixes which groups end up cis on the alkene.

Faces and geometries come from one ETKDG conformer with the drawn configuration enforced
(a fixed seed, bounded time), not from a conformational search: the relative configuration of
two centres does not depend on the conformer, and the alkene geometry is read after the
H-C-C-X dihedral is set to 180°.

Reference: J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 17
(anti-periplanar E2; eliminations in cyclohexanes and stereospecific E2).
"""

from __future__ import annotations

import numpy as np
from rdkit import Chem
from rdkit.Chem import rdDistGeom, rdMolTransforms

from .. import _rdlog

__all__ = ["configured", "Embedded", "embed"]

MAX_HEAVY = 80
TIMEOUT_S = 2


def configured(atom: Chem.Atom) -> bool:
    return atom.GetChiralTag() in (Chem.ChiralType.CHI_TETRAHEDRAL_CW, Chem.ChiralType.CHI_TETRAHEDRAL_CCW)


class Embedded:
    """A molecule with explicit hydrogens (heavy-atom indices unchanged) and one conformer."""

    def __init__(self, mol: Chem.Mol):
        self.mol = mol
        self.conf = mol.GetConformer()

    def _pos(self, idx: int) -> np.ndarray:
        p = self.conf.GetAtomPosition(idx)
        return np.array([p.x, p.y, p.z])

    def hydrogens(self, idx: int) -> list[int]:
        return [n.GetIdx() for n in self.mol.GetAtomWithIdx(idx).GetNeighbors() if n.GetAtomicNum() == 1]

    def ring_faces_opposite(self, ring: tuple[int, ...], a: int, x: int, b: int, y: int) -> bool | None:
        """Whether substituent ``x`` on ring atom ``a`` and ``y`` on ring atom ``b`` are on
        opposite faces of ``ring`` (trans). None when a ring atom has no second substituent to
        compare against."""
        pts = np.array([self._pos(i) for i in ring])
        centre = pts.mean(axis=0)
        normal = np.linalg.svd(pts - centre)[2][2]

        def up(atom: int, sub: int) -> bool | None:
            others = [
                n.GetIdx() for n in self.mol.GetAtomWithIdx(atom).GetNeighbors()
                if n.GetIdx() not in ring and n.GetIdx() != sub
            ]
            if len(others) != 1:
                return None
            here = self._pos(atom)
            return float(np.dot(self._pos(sub) - here, normal)) > float(np.dot(self._pos(others[0]) - here, normal))

        fa, fb = up(a, x), up(b, y)
        if fa is None or fb is None:
            return None
        return fa != fb

    def anti_alkene(self, alpha: int, leaving: int, beta: int, h: int) -> str | None:
        """Isomeric SMILES of the alkene formed when hydrogen ``h`` on ``beta`` leaves
        anti-periplanar to ``leaving`` on ``alpha`` (open chains only)."""
        conf = Chem.Conformer(self.conf)
        work = Chem.RWMol(self.mol)
        work.RemoveAllConformers()
        cid = work.AddConformer(conf, assignId=True)
        with _rdlog.captured():
            try:
                rdMolTransforms.SetDihedralDeg(work.GetConformer(cid), h, beta, alpha, leaving, 180.0)
            except (RuntimeError, ValueError):
                return None
            work.RemoveBond(alpha, leaving)
            work.GetBondBetweenAtoms(alpha, beta).SetBondType(Chem.BondType.DOUBLE)
            for idx in (alpha, beta):
                work.GetAtomWithIdx(idx).SetChiralTag(Chem.ChiralType.CHI_UNSPECIFIED)
                work.GetAtomWithIdx(idx).SetNoImplicit(False)
            lg = work.GetAtomWithIdx(leaving)
            lg.SetFormalCharge(0 if lg.GetFormalCharge() > 0 else -1)
            work.RemoveAtom(h)  # beta keeps its other hydrogens as explicit atoms
            try:
                m = work.GetMol()
                Chem.SanitizeMol(m)
                Chem.AssignStereochemistryFrom3D(m, cid)
                m = Chem.RemoveHs(m)
            except Exception:
                return None
            mapping: list = []
            frags = Chem.GetMolFrags(m, asMols=True, sanitizeFrags=False, fragsMolAtomMapping=mapping)
            keep = next(f for f, atoms in zip(frags, mapping) if alpha in atoms)
            return Chem.MolToSmiles(keep)


def embed(mol: Chem.Mol) -> Embedded | None:
    """One conformer with the drawn configuration, or None (too large, failed, timed out)."""
    if mol.GetNumHeavyAtoms() > MAX_HEAVY:
        return None
    with _rdlog.captured():
        try:
            work = Chem.AddHs(Chem.Mol(mol))
            params = rdDistGeom.ETKDGv3()
            params.randomSeed = 0x5EED
            params.timeout = TIMEOUT_S
            params.maxIterations = 200
            params.enforceChirality = True
            if rdDistGeom.EmbedMolecule(work, params) != 0:
                return None
        except (RuntimeError, ValueError):
            return None
    return Embedded(work)
