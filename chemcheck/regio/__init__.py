"""Regiochemistry and product checks: reaction classes, predicted major and minor products,
and the comparison with what was drawn (by InChIKey, stereo ignored unless drawn on both
sides)."""

from __future__ import annotations

from dataclasses import dataclass, field
from functools import lru_cache

from rdkit import Chem

from .. import _rdlog

__all__ = ["Candidate", "Prediction", "same_compound", "has_stereo", "canonical", "attach"]


@dataclass
class Candidate:
    smiles: str
    rank: int
    label: str  # "major", "minor" or "none" (not formed in practice)
    reason: str
    score: float = 0.0
    drawn: bool = False
    atoms: tuple[int, ...] = ()  # substrate atoms where the change happens (for highlighting)
    route: str = ""  # how to make this product instead, when it is not the expected one

    def to_dict(self) -> dict:
        return {"smiles": self.smiles, "rank": self.rank, "label": self.label, "reason": self.reason, "drawn": self.drawn}


@dataclass
class Prediction:
    reaction_class: str
    evidence: str
    substrate: int  # component index
    candidates: list[Candidate] = field(default_factory=list)

    def to_dict(self) -> dict:
        return {"reaction_class": self.reaction_class, "candidates": [c.to_dict() for c in self.candidates]}


def canonical(mol: Chem.Mol, stereo: bool = False) -> str | None:
    with _rdlog.captured():
        try:
            m = Chem.Mol(mol)
            Chem.SanitizeMol(m)
            return Chem.MolToSmiles(m, isomericSmiles=stereo)
        except Exception:
            return None


def attach(mol: Chem.Mol, atom: int, frag: Chem.Mol, frag_atom: int = 0) -> str | None:
    """Canonical SMILES of ``mol`` with ``frag`` bonded at ``atom`` (one H of it replaced)."""
    h = mol.GetAtomWithIdx(atom).GetTotalNumHs()
    combo = Chem.RWMol(Chem.CombineMols(mol, frag))
    combo.AddBond(atom, mol.GetNumAtoms() + frag_atom, Chem.BondType.SINGLE)
    a = combo.GetAtomWithIdx(atom)
    a.SetNumExplicitHs(max(h - 1, 0))
    a.SetNoImplicit(True)  # the fragment's own atom keeps the hydrogens it was given
    with _rdlog.captured():
        try:
            m = combo.GetMol()
            Chem.SanitizeMol(m)
        except Exception:
            return None
    return canonical(m)


@lru_cache(maxsize=8192)
def _key(smiles: str, stereo: bool) -> str | None:
    with _rdlog.captured():
        m = Chem.MolFromSmiles(smiles)
        if m is None:
            return None
        key = Chem.MolToInchiKey(m)
    return key if stereo else key[:14]


def has_stereo(smiles: str) -> bool:
    return any(ch in smiles for ch in "@/\\")


def same_compound(a: str, b: str, stereo: bool | None = False) -> bool:
    """Same compound by InChIKey. ``stereo=None`` compares stereochemistry only when both
    SMILES specify some (the comparison rule of the product checks)."""
    if stereo is None:
        stereo = has_stereo(a) and has_stereo(b)
    ka, kb = _key(a, stereo), _key(b, stereo)
    return ka is not None and ka == kb


def rank_labels(cands: list[Candidate], *, minor_gap: float, none_gap: float) -> list[Candidate]:
    """Sort by score (high first), dedupe by compound, label major / minor / none by the gap."""
    cands = sorted(cands, key=lambda c: -c.score)
    out: list[Candidate] = []
    seen: set[str] = set()
    for c in cands:
        k = _key(c.smiles, has_stereo(c.smiles))
        if k is None or k in seen:
            continue
        seen.add(k)
        out.append(c)
    if not out:
        return out
    top = out[0].score
    for i, c in enumerate(out, start=1):
        c.rank = i
        gap = top - c.score
        c.label = "major" if gap < minor_gap else ("minor" if gap < none_gap else "none")
    return out
