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
from . import Candidate, canonical, rank_labels, stereo

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


def _six_ring(mol: Chem.Mol, a: int, b: int) -> tuple[int, ...] | None:
    for ring in mol.GetRingInfo().AtomRings():
        if len(ring) == 6 and a in ring and b in ring and not any(mol.GetAtomWithIdx(i).GetIsAromatic() for i in ring):
            return ring
    return None


class _StereoView:
    """Anti-periplanar checks for one substrate, embedded once and only when needed."""

    def __init__(self, mol: Chem.Mol):
        self.mol = mol
        self._emb = None
        self._tried = False

    def embedded(self):
        if not self._tried:
            self._tried = True
            self._emb = stereo.embed(self.mol)
        return self._emb

    def ring_verdict(self, alpha: int, leaving: int, beta: int) -> str | None:
        """"trans" when a beta-H can be trans-diaxial to the leaving group, "cis" when none
        can, None when the ring or its configuration is not drawn."""
        ring = _six_ring(self.mol, alpha, beta)
        if ring is None:
            return None
        a, b = self.mol.GetAtomWithIdx(alpha), self.mol.GetAtomWithIdx(beta)
        if b.GetTotalNumHs() >= 2:
            return "trans"  # one of two hydrogens is always on the opposite face
        if not (stereo.configured(a) and stereo.configured(b)):
            return None
        emb = self.embedded()
        if emb is None:
            return None
        hs = emb.hydrogens(beta)
        faces = [emb.ring_faces_opposite(ring, alpha, leaving, beta, h) for h in hs]
        if any(f is None for f in faces):
            return None
        return "trans" if any(faces) else "cis"

    def open_chain_alkene(self, alpha: int, leaving: int, beta: int) -> str | None:
        """The alkene geometry an anti-periplanar E2 gives, when both carbons are configured
        stereocentres on an open chain (stereospecific); None otherwise."""
        mol = self.mol
        bond = mol.GetBondBetweenAtoms(alpha, beta)
        if bond is None or bond.IsInRing():
            return None
        a, b = mol.GetAtomWithIdx(alpha), mol.GetAtomWithIdx(beta)
        if not (stereo.configured(a) and stereo.configured(b)) or b.GetTotalNumHs() != 1:
            return None
        emb = self.embedded()
        if emb is None:
            return None
        hs = emb.hydrogens(beta)
        return emb.anti_alkene(alpha, leaving, beta, hs[0]) if len(hs) == 1 else None


_BETA = {3: "a CH3", 2: "a CH2", 1: "a CH"}
_DEGREE = {0: "unsubstituted", 1: "monosubstituted", 2: "disubstituted", 3: "trisubstituted", 4: "tetrasubstituted"}


def _opposite_geometry(smiles: str) -> str | None:
    """The same alkene with its one specified C=C geometry inverted."""
    with _rdlog.captured():
        m = Chem.MolFromSmiles(smiles)
        if m is None:
            return None
        flipped = False
        for bd in m.GetBonds():
            st = bd.GetStereo()
            if st in (Chem.BondStereo.STEREOE, Chem.BondStereo.STEREOTRANS):
                bd.SetStereo(Chem.BondStereo.STEREOCIS)
                flipped = True
            elif st in (Chem.BondStereo.STEREOZ, Chem.BondStereo.STEREOCIS):
                bd.SetStereo(Chem.BondStereo.STEREOTRANS)
                flipped = True
        return Chem.MolToSmiles(m) if flipped else None


_ANTI = (
    " In a cyclohexane E2 needs the beta-H anti-periplanar (trans-diaxial) to the leaving group."
)


def predict(mol: Chem.Mol, mode: str, why: str) -> list[Candidate]:
    """Ranked alkenes from every leaving group of ``mol``; ``mode`` is "zaitsev" or "hofmann".

    Drawn configurations are used: in cyclohexanes a beta-CH whose hydrogen is cis to the
    leaving group gives no E2 alkene; on open chains with both carbons configured the alkene
    geometry of the anti-periplanar elimination is given, and the other geometry is listed as
    not formed."""
    cands: list[Candidate] = []
    view = _StereoView(mol)
    for kind, smarts in LEAVING.items():
        patt = Chem.MolFromSmarts(smarts)
        for match in mol.GetSubstructMatches(patt):
            alpha, lg = match[0], match[1]
            in_ring = mol.GetAtomWithIdx(alpha).IsInRingSize(6)
            options = eliminate(mol, alpha, lg)
            most_h = max((nh for *_, nh in options), default=0)
            for smi, a, b, nh in options:
                sub = _alkene_substitution(mol, a, b)
                conj = _conjugated(mol, a, b)
                if mode == "zaitsev":
                    score = sub + (1.5 if conj else 0.0) + 0.05 * nh
                    reason = f"{_DEGREE.get(sub, 'substituted')} alkene{', conjugated' if conj else ''}; {why}"
                else:
                    score = -sub + (1.0 if conj else 0.0) + 0.05 * nh
                    # each alkene described by its own beta carbon: the most accessible one (the
                    # most hydrogens) is the one the hindered base takes, the others are not
                    where = (
                        f"from the most accessible beta-H ({_BETA[nh]})" if nh == most_h
                        else f"from a more hindered beta-H ({_BETA[nh]}), disfavoured"
                    )
                    reason = f"{_DEGREE.get(sub, 'substituted')} alkene {where}; {why}"
                verdict = view.ring_verdict(alpha, lg, b) if in_ring else None
                if verdict == "cis":
                    cands.append(Candidate(
                        smi, 0, "",
                        f"{_DEGREE.get(sub, 'substituted')} alkene, but the only beta-H on this carbon is cis to the "
                        "leaving group, so it cannot be "
                        "anti-periplanar (trans-diaxial): no E2 alkene forms on this side", score - 10.0,
                        atoms=(alpha, b),
                        route="start from the diastereomer in which this beta-H is trans to the leaving group",
                    ))
                    continue
                if verdict == "trans" and _six_ring(mol, alpha, b) is not None:
                    reason += "; a beta-H trans to the leaving group can be anti-periplanar (trans-diaxial)"
                elif in_ring:
                    reason += "." + _ANTI
                geo = view.open_chain_alkene(alpha, lg, b) if not in_ring else None
                if geo:
                    cands.append(Candidate(geo, 0, "", reason + "; anti-periplanar E2 is stereospecific: this geometry", score, atoms=(alpha, b)))
                    other = _opposite_geometry(geo)
                    if other:
                        cands.append(Candidate(
                            other, 0, "",
                            "the other alkene geometry needs a syn-periplanar elimination, which E2 does not take",
                            score - 10.0, atoms=(alpha, b),
                            route="start from the other diastereomer of the substrate",
                        ))
                    continue
                cands.append(Candidate(smi, 0, "", reason, score, atoms=(alpha, b)))
    return rank_labels(cands, minor_gap=0.5, none_gap=3.0)
