"""Eliminations: every beta-hydrogen gives an alkene; rank by Zaitsev or Hofmann.

* Zaitsev (most substituted alkene major): halides and sulfonates with small bases (alkoxides,
  hydroxide).
* Hofmann (least substituted alkene major): trialkylammonium and sulfonium leaving groups
  (the base approaches the most accessible beta-hydrogen past the bulky leaving group, and the
  transition state is carbanion-like), and halides or sulfonates with hindered bases
  (potassium tert-butoxide, LDA, DBU-type amidines).
* In cyclohexanes E2 needs the beta-hydrogen anti-periplanar (trans-diaxial) to the leaving
  group; with ring stereocentres drawn, only trans beta-hydrogens can leave.

References: J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 17
(elimination; Hofmann and Saytzev rules). A. W. Hofmann, Ann. 1851, 78, 253.
"""

from __future__ import annotations

from rdkit import Chem

from .. import _rdlog
from . import Candidate, canonical, rank_labels

LEAVING = {
    "halide": "[CX4;!H3:1]-[Cl,Br,I:2]",
    "sulfonate": "[CX4;!H3:1]-[OX2:2][SX4](=O)(=O)",
    "ammonium": "[CX4:1]-[NX4+;H0:2]",
    "sulfonium": "[CX4:1]-[SX3+:2]",
}


def _alkene_substitution(mol: Chem.Mol, a: int, b: int) -> int:
    n = 0
    for idx in (a, b):
        atom = mol.GetAtomWithIdx(idx)
        n += sum(1 for x in atom.GetNeighbors() if x.GetAtomicNum() == 6 and x.GetIdx() not in (a, b))
    return n


def _conjugated(mol: Chem.Mol, a: int, b: int) -> bool:
    for idx in (a, b):
        for x in mol.GetAtomWithIdx(idx).GetNeighbors():
            if x.GetIdx() in (a, b):
                continue
            if x.GetIsAromatic() or any(bd.GetBondTypeAsDouble() == 2 for bd in x.GetBonds()):
                return True
    return False


def eliminate(mol: Chem.Mol, alpha: int, leaving: int) -> list[tuple[str, int, int, int]]:
    """(alkene SMILES, alpha, beta, number of beta-H) for each beta carbon bearing H."""
    out = []
    a_atom = mol.GetAtomWithIdx(alpha)
    for beta in a_atom.GetNeighbors():
        if beta.GetAtomicNum() != 6 or beta.GetIdx() == leaving or beta.GetTotalNumHs() == 0 or beta.GetIsAromatic():
            continue
        if any(b.GetBondTypeAsDouble() > 1 for b in beta.GetBonds()):
            continue
        rw = Chem.RWMol(mol)
        rw.RemoveBond(alpha, leaving)
        rw.GetBondBetweenAtoms(alpha, beta.GetIdx()).SetBondType(Chem.BondType.DOUBLE)
        for idx in (alpha, beta.GetIdx()):
            at = rw.GetAtomWithIdx(idx)
            at.SetNoImplicit(False)
            at.SetNumExplicitHs(0)
            at.SetChiralTag(Chem.ChiralType.CHI_UNSPECIFIED)
        lg = rw.GetAtomWithIdx(leaving)
        if lg.GetFormalCharge() > 0:
            lg.SetFormalCharge(0)  # the neutral amine or sulfide leaves
        else:
            lg.SetFormalCharge(-1 if lg.GetAtomicNum() in (17, 35, 53) else lg.GetFormalCharge())
            if lg.GetAtomicNum() == 8:
                lg.SetFormalCharge(-1)
        with _rdlog.captured():
            try:
                m = rw.GetMol()
                Chem.SanitizeMol(m)
            except Exception:
                continue
        frags = Chem.GetMolFrags(m, asMols=True, sanitizeFrags=False)
        alk = max(frags, key=lambda f: sum(1 for x in f.GetAtoms() if x.GetAtomicNum() == 6 and any(bb.GetBondTypeAsDouble() == 2 for bb in x.GetBonds())))
        smi = canonical(alk)
        if smi:
            out.append((smi, alpha, beta.GetIdx(), beta.GetTotalNumHs()))
    return out


def predict(mol: Chem.Mol, mode: str, why: str) -> list[Candidate]:
    """Ranked alkenes from every leaving group of ``mol``; ``mode`` is "zaitsev" or "hofmann"."""
    cands: list[Candidate] = []
    for kind, smarts in LEAVING.items():
        patt = Chem.MolFromSmarts(smarts)
        for match in mol.GetSubstructMatches(patt):
            alpha, lg = match[0], match[1]
            ring_note = ""
            if mol.GetAtomWithIdx(alpha).IsInRingSize(6):
                ring_note = " In a cyclohexane the beta-H must be anti-periplanar (trans-diaxial) to the leaving group."
            for smi, a, b, nh in eliminate(mol, alpha, lg):
                ring_product = Chem.MolFromSmiles(smi)
                sub = _alkene_substitution(mol, a, b)
                conj = _conjugated(mol, a, b)
                if mode == "zaitsev":
                    score = sub + (1.5 if conj else 0.0) + 0.05 * nh
                    reason = f"{sub}-substituted alkene{' conjugated' if conj else ''}; {why}{ring_note}"
                else:
                    score = -sub + (1.0 if conj else 0.0) + 0.05 * nh
                    reason = f"{sub}-substituted alkene from the most accessible beta-H ({nh} H); {why}{ring_note}"
                cands.append(Candidate(smi, 0, "", reason, score))
                del ring_product
    return rank_labels(cands, minor_gap=0.5, none_gap=3.0)
