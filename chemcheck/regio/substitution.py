"""Electrophilic aromatic substitution: directing effects, combined, with sterics.

Each ring substituent has a strength and a preference (ortho/para or meta); each open ring
position gets the sum of its substituents' contributions, lowered for steric crowding (ortho to
a bulky group, between two substituents, and for bulky electrophiles such as acylium ions).
The ranks follow the usual textbook order: strong activators (NH2, NR2, OH, O-) > moderate
(OR, NHCOR, OCOR) > weak (alkyl, aryl) > halogens (deactivating, ortho/para) > meta directors
(NO2, CN, C=O, SO2R, CF3, NR3+, NH3+).

References: J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 21-22;
M. B. Smith, *March's Advanced Organic Chemistry*, 8th ed., Wiley 2020, ch. 11.
"""

from __future__ import annotations

from rdkit import Chem

from .. import _rdlog
from . import Candidate, attach, rank_labels

# substituent class -> (strength for ortho/para, strength for meta, deactivating?)
DIRECTORS = {
    "strong_op": (3.0, 0.0, False),
    "moderate_op": (2.0, 0.0, False),
    "weak_op": (1.0, 0.0, False),
    "halogen": (0.8, 0.0, True),
    "meta": (-1.0, 0.0, True),
}
STRONGLY_DEACTIVATING = {"meta"}

ELECTROPHILES = {
    "nitration": "[N+](=O)[O-]",
    "bromination": "Br",
    "chlorination": "Cl",
    "iodination": "I",
    "sulfonation": "S(=O)(=O)O",
}


def classify(mol: Chem.Mol, ring_atom: Chem.Atom, x: Chem.Atom) -> tuple[str, str]:
    """(directing class, a short name) of the substituent ``x`` on ``ring_atom``."""
    z = x.GetAtomicNum()
    if z in (9, 17, 35, 53):
        return "halogen", x.GetSymbol()
    if z == 7:
        if x.GetFormalCharge() > 0:
            if any(n.GetAtomicNum() == 8 for n in x.GetNeighbors()):
                return "meta", "NO2"
            return "meta", "ammonium"
        if any(n.GetAtomicNum() in (5, 13, 26, 22, 50, 30) for n in x.GetNeighbors()):
            return "meta", "N-bound Lewis acid"
        others = [n for n in x.GetNeighbors() if n.GetIdx() != ring_atom.GetIdx()]
        if any(n.GetAtomicNum() == 6 and any(b.GetBondTypeAsDouble() == 2 and b.GetOtherAtom(n).GetAtomicNum() == 8 for b in n.GetBonds()) for n in others):
            return "moderate_op", "NHC(=O)R"
        if any(n.GetAtomicNum() == 16 for n in others):
            return "moderate_op", "NHSO2R"
        return "strong_op", "NR2" if not x.GetTotalNumHs() else "NH2"
    if z == 8:
        if x.GetFormalCharge() < 0:
            return "strong_op", "O-"
        if x.GetTotalNumHs():
            return "strong_op", "OH"
        others = [n for n in x.GetNeighbors() if n.GetIdx() != ring_atom.GetIdx()]
        if any(n.GetAtomicNum() == 6 and any(b.GetBondTypeAsDouble() == 2 for b in n.GetBonds()) for n in others):
            return "moderate_op", "OC(=O)R"
        return "moderate_op", "OR"
    if z == 16:
        if sum(1 for n in x.GetNeighbors() if n.GetAtomicNum() == 8) >= 2:
            return "meta", "SO2R"
        return "weak_op", "SR"
    if z == 6:
        if x.GetIsAromatic():
            return "weak_op", "aryl"
        for b in x.GetBonds():
            o = b.GetOtherAtom(x)
            if o.GetIdx() == ring_atom.GetIdx():
                continue
            if b.GetBondTypeAsDouble() >= 2 and o.GetAtomicNum() in (7, 8):
                return "meta", "C=O" if o.GetAtomicNum() == 8 else "CN"
        if sum(1 for n in x.GetNeighbors() if n.GetAtomicNum() == 9) >= 2:
            return "meta", "CF3"
        if any(n.GetAtomicNum() == 7 and n.GetFormalCharge() > 0 for n in x.GetNeighbors()):
            return "halogen", "CH2NR3+"
        return "weak_op", "tBu" if sum(1 for n in x.GetNeighbors() if n.GetAtomicNum() == 6) >= 3 else "alkyl"
    return "weak_op", x.GetSymbol()


def _benzene_rings(mol: Chem.Mol) -> list[list[int]]:
    out = []
    for ring in mol.GetRingInfo().AtomRings():
        if len(ring) == 6 and all(mol.GetAtomWithIdx(i).GetIsAromatic() and mol.GetAtomWithIdx(i).GetAtomicNum() == 6 for i in ring):
            out.append(list(ring))
    return out


def ring_substituents(mol: Chem.Mol, ring: list[int]):
    ring_set = set(ring)
    subs = []
    for idx in ring:
        atom = mol.GetAtomWithIdx(idx)
        for x in atom.GetNeighbors():
            if x.GetIdx() not in ring_set:
                fused = mol.GetRingInfo().NumAtomRings(idx) > 1 and x.GetIsAromatic()
                cls, name = ("weak_op", "fused ring") if fused else classify(mol, atom, x)
                subs.append((idx, cls, name, x.GetIdx()))
    return subs


def deactivation(mol: Chem.Mol) -> list[tuple[int, str]]:
    """Strongly deactivating substituents on the most reactive benzene ring (ring atom, name)."""
    out = []
    for ring in _benzene_rings(mol):
        subs = ring_substituents(mol, ring)
        if any(cls in ("strong_op", "moderate_op") for _, cls, _, _ in subs):
            continue
        out.extend((idx, name) for idx, cls, name, _ in subs if cls == "meta")
    return out


def _distance(ring: list[int], a: int, b: int) -> int:
    i, j = ring.index(a), ring.index(b)
    d = abs(i - j)
    return min(d, 6 - d)


def predict(mol: Chem.Mol, electrophile_smiles: str, klass: str, bulky: bool) -> list[Candidate]:
    cands = []
    with _rdlog.captured():
        frag = Chem.MolFromSmiles(electrophile_smiles)
    if frag is None:
        return []
    for ring in _benzene_rings(mol):
        subs = ring_substituents(mol, ring)
        occupied = {idx for idx, _, _, _ in subs}
        for pos in ring:
            atom = mol.GetAtomWithIdx(pos)
            if pos in occupied or atom.GetTotalNumHs() == 0:
                continue
            score = 0.0
            reasons = []
            ortho_to = 0
            for idx, cls, name, _x in subs:
                d = _distance(ring, idx, pos)
                op, _m, _deact = DIRECTORS[cls]
                if d in (1, 3):
                    rel = "ortho" if d == 1 else "para"
                    score += op
                    if cls == "meta":
                        reasons.append(f"{rel} to {name} (meta director)")
                    else:
                        reasons.append(f"{rel} to {name}")
                    if d == 1:
                        ortho_to += 1
                        if name in ("tBu", "NHC(=O)R", "N-bound Lewis acid", "fused ring") or bulky:
                            score -= 1.2
                            reasons.append("crowded ortho position")
                        else:
                            score -= 0.4  # ortho is statistically favoured but sterically less
                elif d == 2:
                    reasons.append(f"meta to {name}")
                    if cls == "meta":
                        score += 1.0
            if ortho_to >= 2:
                score -= 1.5
                reasons.append("between two substituents")
            smi = attach(mol, pos, frag)
            if smi:
                cands.append(Candidate(smi, 0, "", "; ".join(reasons) or "unsubstituted ring", score))
    return rank_labels(cands, minor_gap=0.5, none_gap=2.5)
