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
    "fused": (0.0, 0.0, False),  # read as alpha/beta in predict(), not as ortho/para
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
    """(ring atom, class, name, substituent atom) for every group on the ring. An aromatic ring
    fused on is listed as ``fused`` (class "fused"): it is no ortho/para director; it makes the
    positions next to the fusion (alpha) the reactive ones (see ``predict``)."""
    ring_set = set(ring)
    subs = []
    for idx in ring:
        atom = mol.GetAtomWithIdx(idx)
        for x in atom.GetNeighbors():
            if x.GetIdx() not in ring_set:
                fused = mol.GetRingInfo().NumAtomRings(idx) > 1 and x.GetIsAromatic()
                if fused and _pi_donor_ring_atom(x):
                    # the N-H, N-R, O or S of a fused azole, pyrrole or lactam ring gives its lone
                    # pair to this ring as an amino or alkoxy group would (benzimidazolone,
                    # quinoxalinone, benzofuran)
                    cls, name = classify(mol, atom, x)
                else:
                    cls, name = ("fused", "fused ring") if fused else classify(mol, atom, x)
                subs.append((idx, cls, name, x.GetIdx()))
    return subs


def _pi_donor_ring_atom(x: Chem.Atom) -> bool:
    """A heteroatom of the fused ring whose lone pair is in its pi system (pyrrole-type N,
    furan O, thiophene S), not a pyridine-type N."""
    if x.GetAtomicNum() in (8, 16):
        return True
    if not (x.GetAtomicNum() == 7 and x.GetFormalCharge() == 0 and (x.GetDegree() == 3 or x.GetTotalNumHs() > 0)):
        return False
    # the N of a triazole or tetrazole ring gives its lone pair to that electron-poor ring's
    # sextet, not to the benzene (Joule & Mills, Heterocyclic Chemistry, 5th ed., ch. 25:
    # azoles with three or four N are pi-deficient; from memory)
    mol = x.GetOwningMol()
    for ring in mol.GetRingInfo().AtomRings():
        if x.GetIdx() in ring and len(ring) == 5 and sum(mol.GetAtomWithIdx(i).GetAtomicNum() == 7 for i in ring) >= 3:
            return False
    return True


# Alpha positions of a benzo-fused aromatic ring (C1 of naphthalene, C5 and C8 of quinoline and
# isoquinoline) react first under kinetic control: the cation formed there keeps the other ring
# aromatic in more of its resonance forms. Naphthalene nitration gives about 95:5 alpha:beta,
# bromination and Friedel-Crafts acylation in CS2 alpha; quinoline and isoquinoline nitrate in
# H2SO4 at C5 and C8, the protonated N-ring deactivated (Clayden, Greeves, Warren, Organic
# Chemistry, 2nd ed., ch. 22; J. A. Joule, K. Mills, Heterocyclic Chemistry, 5th ed., Wiley
# 2010, ch. 9). A bulky electrophile (an acylium complex in nitrobenzene, sulfonation at high
# temperature) is held off by the peri hydrogen and goes beta.
ALPHA_BONUS = 1.5
ALPHA_BULKY = 0.3


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


# SMILES rooted at the bonding atom, score bonus, note[, how to make that product otherwise]
Electrophile = tuple


def predict(mol: Chem.Mol, electrophiles: str | list[Electrophile], klass: str, bulky: bool) -> list[Candidate]:
    """Ranked products of substitution at every open position of every benzene ring.

    ``electrophiles`` is one SMILES (rooted at the atom that bonds to the ring) or a list of
    (SMILES, score bonus, note) when the electrophile itself has alternatives (a rearranged
    carbocation, a sulfonic acid or its chloride)."""
    if isinstance(electrophiles, str):
        electrophiles = [(electrophiles, 0.0, "")]
    frags = []
    with _rdlog.captured():
        for smi, bonus, note, *route in electrophiles:
            frag = Chem.MolFromSmiles(smi)
            if frag is not None:
                frags.append((frag, bonus, note, route[0] if route else ""))
    if not frags:
        return []
    cands = []
    activated: set[int] = set()  # positions ortho or para to an activating group
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
                if cls == "fused":
                    if d == 1:
                        score += ALPHA_BULKY if bulky else ALPHA_BONUS
                        reasons.append(
                            "alpha to the ring fusion (peri-crowded for this bulky electrophile)" if bulky
                            else "alpha to the ring fusion (kinetic control: the other ring stays aromatic)"
                        )
                    continue
                op, _m, _deact = DIRECTORS[cls]
                if d in (1, 3):
                    rel = "ortho" if d == 1 else "para"
                    if cls in ("strong_op", "moderate_op"):
                        activated.add(pos)
                    score += op
                    if cls == "meta":
                        reasons.append(f"{rel} to {name} (meta director)")
                    else:
                        reasons.append(f"{rel} to {name}")
                    if d == 1:
                        ortho_to += 1
                        if name in ("tBu", "NHC(=O)R", "N-bound Lewis acid") or bulky:
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
            where = "; ".join(reasons) or "unsubstituted ring"
            for frag, bonus, note, route in frags:
                smi = attach(mol, pos, frag)
                if smi:
                    reason = f"{note}; {where}" if note else where
                    cands.append(Candidate(smi, 0, "", reason, score + bonus, atoms=(pos,), route=route))
    ranked = rank_labels(cands, minor_gap=0.5, none_gap=2.5)
    # a position ortho or para to an activating group is never ruled out: where directors
    # compete (fused heteroarenes, several donors) the scores rank, they do not exclude
    for c in ranked:
        if c.label == "none" and c.atoms and c.atoms[0] in activated:
            c.label = "minor"
    return ranked


# --------------------------------------------------------------------------- carbocations
def _carbon_degree(mol: Chem.Mol, idx: int) -> int:
    return sum(1 for n in mol.GetAtomWithIdx(idx).GetNeighbors() if n.GetAtomicNum() == 6)


def _stabilised(mol: Chem.Mol, idx: int) -> bool:
    """Benzylic or allylic centres (and heteroatom-stabilised ones) do not rearrange."""
    for n in mol.GetAtomWithIdx(idx).GetNeighbors():
        if n.GetIsAromatic() or n.GetAtomicNum() in (7, 8, 16):
            return True
        if any(b.GetBondTypeAsDouble() > 1 for b in n.GetBonds()):
            return True
    return False


def _rooted(mol: Chem.Mol, centre: int) -> str | None:
    """SMILES of the alkyl group with ``centre`` carrying one hydrogen fewer, rooted there."""
    rw = Chem.RWMol(mol)
    a = rw.GetAtomWithIdx(centre)
    h = a.GetTotalNumHs()
    if h == 0:
        return None
    a.SetNumExplicitHs(h - 1)
    a.SetNoImplicit(True)
    with _rdlog.captured():
        try:
            m = rw.GetMol()
            Chem.SanitizeMol(m)
            return Chem.MolToSmiles(m, rootedAtAtom=centre)
        except Exception:
            return None


def alkyl_cations(alkane: Chem.Mol, centre: int) -> list[Electrophile]:
    """The alkyl groups a Friedel-Crafts alkylation transfers from the carbocation (or
    polarised C-X...Lewis acid complex) at ``centre`` of the parent alkane: the carbon skeleton
    as drawn, and the one reached by 1,2-hydride or 1,2-methyl shifts to a more substituted
    (more stable) cation, tertiary > secondary > primary.

    Primary halides beyond ethyl rearrange (1-chloropropane gives mainly isopropylbenzene,
    isobutyl chloride tert-butylbenzene); neopentyl gives the tert-pentyl product by a methyl
    shift. Methyl, ethyl, benzylic and allylic cations do not rearrange. (G. A. Olah,
    *Friedel-Crafts and Related Reactions*, Wiley 1963-65; Clayden, Greeves, Warren, *Organic
    Chemistry*, 2nd ed., OUP 2012, ch. 21.)"""
    drawn = _rooted(alkane, centre)
    if drawn is None:
        return []
    out: list[Electrophile] = []
    mol, at = Chem.Mol(alkane), centre
    shifts = []
    methyl_shift = False
    for _ in range(3):
        if _stabilised(mol, at):
            break
        here = _carbon_degree(mol, at)
        if here >= 3:
            break
        best = None
        for n in mol.GetAtomWithIdx(at).GetNeighbors():
            if n.GetAtomicNum() != 6 or n.GetIsAromatic() or n.GetHybridization() != Chem.HybridizationType.SP3:
                continue
            deg = _carbon_degree(mol, n.GetIdx())
            if n.GetTotalNumHs() > 0 and deg > here and (best is None or deg > best[1]):
                best = (n.GetIdx(), deg, "hydride")
            elif n.GetTotalNumHs() == 0 and deg == 4 and best is None:
                best = (n.GetIdx(), 3, "methyl")
        if best is None:
            break
        nxt, _deg, how = best
        if how == "methyl":
            rw = Chem.RWMol(mol)
            me = next(x.GetIdx() for x in rw.GetAtomWithIdx(nxt).GetNeighbors()
                      if x.GetIdx() != at and x.GetAtomicNum() == 6 and x.GetDegree() == 1)
            rw.RemoveBond(nxt, me)
            rw.AddBond(at, me, Chem.BondType.SINGLE)
            with _rdlog.captured():
                m2 = rw.GetMol()
                Chem.SanitizeMol(m2)
            mol = m2
            methyl_shift = True
        shifts.append(how)
        at = nxt
    start = _carbon_degree(alkane, centre)
    final = _carbon_degree(mol, at) if shifts else start
    if not shifts:
        return [(drawn, 0.0, "alkyl group as drawn (the carbocation does not rearrange)")]
    moved = _rooted(mol, at)
    kinds = {1: "primary", 2: "secondary", 3: "tertiary"}
    gain = 0.8 * (min(final, 3) - min(max(start, 1), 3)) + (1.0 if methyl_shift else 0.0)
    how = " then ".join(
        f"1,2-{k} shift" if n == 1 else f"{n} successive 1,2-{k} shifts"
        for k, n in ((k, shifts.count(k)) for k in dict.fromkeys(shifts))
    )
    if moved:
        out.append((moved, gain, f"rearranged alkyl group: the {kinds[min(max(start, 1), 3)]} carbocation becomes "
                    f"{kinds[min(final, 3)]} by a {how}"))
    route = (
        "Friedel-Crafts acylation with the acyl chloride of the same chain (acylium ions do not rearrange), "
        "then reduction of the ketone (Wolff-Kishner or Clemmensen)"
    )
    if gain >= 2.5:
        out.append((drawn, 0.0, "unrearranged alkyl group: not expected, the primary carbocation rearranges", route))
    else:
        out.append((drawn, 0.0, "unrearranged alkyl group (formed in part, more at low temperature)", route))
    return out
