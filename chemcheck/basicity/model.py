"""Class models for the pKa of one nitrogen's conjugate acid (water, 25 °C).

Each function takes a sanitized RDKit molecule and the index of a nitrogen and returns
(pKa, method label). They follow published linear free-energy relationships (constants and
sources in ``constants.py``); the reference table and the anchoring by analogy that sit on
top of them are in ``__init__.py``.
"""

from __future__ import annotations

import math

from rdkit import Chem

from . import constants as K

_PI_DONORS = {"NH2", "NHR", "NR2", "NHAr", "OMe", "O-"}


def is_aza(atom: Chem.Atom) -> bool:
    """A neutral pyridine-type ring N: two ring bonds, no H, its lone pair in the ring plane."""
    return (
        atom.GetAtomicNum() == 7 and atom.GetIsAromatic() and atom.GetDegree() == 2
        and atom.GetTotalNumHs(includeNeighbors=True) == 0 and atom.GetFormalCharge() == 0
    )
_PI_ACCEPTORS = {
    "NO2", "CN", "CHO", "COR", "COOR", "COOH", "CONH2", "SO2R", "SOR", "SO2N", "CF3", "ethynyl", "N=N", "SH",
    "SO2CF3", "SCF3", "SR",
}


# --------------------------------------------------------------------------- aliphatic (Taft)
def _carbonyl_kind(mol: Chem.Mol, c: Chem.Atom) -> str | None:
    """For an sp2 carbon with a C=O: ketone, ester, amide, acid or carboxylate."""
    has_o = False
    for b in c.GetBonds():
        o = b.GetOtherAtom(c)
        if o.GetAtomicNum() == 8 and b.GetBondType() == Chem.BondType.DOUBLE:
            has_o = True
    if not has_o:
        return None
    for b in c.GetBonds():
        x = b.GetOtherAtom(c)
        if b.GetBondType() != Chem.BondType.SINGLE:
            continue
        if x.GetAtomicNum() == 8:
            if x.GetFormalCharge() < 0:
                return "carboxylate"
            if x.GetTotalNumHs() > 0:
                return "C=O acid"
            return "C=O ester"
        if x.GetAtomicNum() == 7:
            return "C=O amide"
    return "C=O ketone"


def _hetero_key(mol: Chem.Mol, y: Chem.Atom, parent: Chem.Atom) -> str | None:
    """The sigma*(CH2Z) key of a heteroatom substituent Z = y on a carbon."""
    z = y.GetAtomicNum()
    if z in (9, 17, 35, 53):
        return y.GetSymbol()
    if z == 8:
        if y.GetFormalCharge() < 0:
            return "O-"
        if y.GetTotalNumHs() > 0:
            return "OH"
        others = [n for n in y.GetNeighbors() if n.GetIdx() != parent.GetIdx()]
        if any(n.GetIsAromatic() for n in others):
            return "OAr"
        if any(_carbonyl_kind(mol, n) for n in others if n.GetAtomicNum() == 6):
            return "OC(=O)"
        if any(n.GetAtomicNum() in (15, 16) for n in others):
            return "OC(=O)"  # phosphate and sulfonate esters: like an acyloxy group
        return "OR"
    if z == 16:
        n_oxo = sum(1 for n in y.GetNeighbors() if n.GetAtomicNum() == 8 and n.GetDegree() == 1)
        if n_oxo >= 2 and any(n.GetAtomicNum() == 8 and n.GetFormalCharge() < 0 for n in y.GetNeighbors()):
            return "SO3-"  # a sulfonate anion (the zwitterion of taurine)
        if n_oxo >= 2:
            return "SO2"
        if n_oxo == 1:
            return "S(=O)"
        others = [n for n in y.GetNeighbors() if n.GetIdx() != parent.GetIdx()]
        if any((n.GetAtomicNum() == 6 and _carbonyl_kind(mol, n)) or n.GetAtomicNum() == 15 for n in others):
            return "SC(=O)"  # a thioester or phosphorothioate S: its lone pairs go to the acceptor
        return "SH" if y.GetTotalNumHs() else "SR"
    if z == 7:
        if y.GetFormalCharge() > 0:
            if any(n.GetAtomicNum() == 8 and n.GetFormalCharge() < 0 for n in y.GetNeighbors()):
                return "NO2"
            return "ammonium" if y.GetTotalNumHs() > 0 else "quaternary"
        if y.GetIsAromatic():
            return "heteroaryl_n"
        others = [n for n in y.GetNeighbors() if n.GetIdx() != parent.GetIdx()]
        for n in others:
            if n.GetAtomicNum() == 6 and _carbonyl_kind(mol, n):
                return "amide_n"
            if n.GetAtomicNum() == 16:
                return "sulfonamide_n"
            if n.GetAtomicNum() == 7 and n.GetFormalCharge() != 0:
                return "azide"
            if n.GetIsAromatic():
                return "aryl_n"
        if any(b.GetBondType() == Chem.BondType.DOUBLE for b in y.GetBonds()):
            return "imine_n"
        return "amine"
    if z == 14:
        return "Si"
    if z == 15:
        return "P"
    if z == 5:
        return "B"
    return None


def group_sigma_star(
    mol: Chem.Mol, atom: Chem.Atom, parent: Chem.Atom, depth: int = 0, path=None, claimed: dict | None = None
) -> float:
    """Taft sigma* of the group that starts at ``atom`` (bound to ``parent``).

    With ``claimed`` shared between the groups on one N, a substituent that two groups reach
    (a ring substituent that lies on both ring paths from the N: C4 of a piperidine, C3 of a
    tropane) counts once, on the shortest path that reaches it (``claimed`` holds the shortest
    depth of each such atom from a first survey, and the atoms already counted). A nitrogen or a charged group
    still counts on each path: the second N of a ring diamine, neutral and protonated, keeps
    the two steps of piperazine (9.73, 5.35) as they were calibrated."""
    path = (path or set()) | {parent.GetIdx(), atom.GetIdx()}
    if atom.GetIsAromatic():
        aza = sum(1 for n in atom.GetNeighbors() if n.GetAtomicNum() == 7 and n.GetIsAromatic())
        return K.SIGMA_STAR_Z["aryl"] / K.ATTENUATION + 0.0 * aza  # sigma*(Ph) ~ 0.6
    total = 0.0
    for b in atom.GetBonds():
        y = b.GetOtherAtom(atom)
        if y.GetIdx() in path:
            continue
        total += _term(mol, y, atom, b, depth, path, claimed)
    return total


def _term(mol, y: Chem.Atom, a: Chem.Atom, bond, depth: int, path, claimed: dict | None = None) -> float:
    """Contribution of substituent ``y`` on the carbon ``a`` to sigma*(group at a)."""
    z = y.GetAtomicNum()
    if z == 1:
        return 0.0
    if claimed is not None and z != 7 and y.GetFormalCharge() == 0 and (z != 6 or y.GetIsAromatic() or _carbonyl_kind(mol, y) or any(
        b2.GetBondType() != Chem.BondType.SINGLE for b2 in y.GetBonds()
    )):
        i = y.GetIdx()
        if claimed["survey"]:
            claimed["depth"][i] = min(depth, claimed["depth"].get(i, depth))
        elif i in claimed["done"] or depth > claimed["depth"].get(i, depth):
            return 0.0
        else:
            claimed["done"].add(i)
    if z == 6:
        if y.GetIsAromatic():
            # ring N (and the O or S of a five-membered ring: furfuryl, thenyl) of the aryl group
            aza = sum(
                1 for ring in mol.GetRingInfo().AtomRings() if y.GetIdx() in ring
                for i in ring if mol.GetAtomWithIdx(i).GetIsAromatic() and (
                    mol.GetAtomWithIdx(i).GetAtomicNum() == 7
                    or (len(ring) == 5 and mol.GetAtomWithIdx(i).GetAtomicNum() in (8, 16))
                )
            )
            # a ring of its own (not fused): its aza atoms go with the ring's Hammett sum
            own = mol.GetRingInfo().NumAtomRings(y.GetIdx()) == 1 and _ring_of(mol, y.GetIdx(), 6) is not None
            return (
                K.SIGMA_STAR_Z["aryl"]
                + (0.0 if own else K.SIGMA_STAR_Z["aza_in_aryl"] * min(aza, 2))
                + K.BENZYL_RING_FACTOR * _benzyl_ring_sigma(mol, y, with_aza=own)
            )
        if bond.GetBondType() == Chem.BondType.TRIPLE:
            return K.SIGMA_STAR_Z["C#N"] if any(n.GetAtomicNum() == 7 for n in y.GetNeighbors()) else K.SIGMA_STAR_Z["C#C"]
        if bond.GetBondType() == Chem.BondType.DOUBLE:
            return K.SIGMA_STAR_Z["C=C"]
        kind = _carbonyl_kind(mol, y)
        if kind:
            return K.SIGMA_STAR_Z[kind]
        if y.GetHybridization() == Chem.HybridizationType.SP:
            return K.SIGMA_STAR_Z["C#N"] if any(n.GetAtomicNum() == 7 for n in y.GetNeighbors()) else K.SIGMA_STAR_Z["C#C"]
        if any(b2.GetBondType() == Chem.BondType.DOUBLE for b2 in y.GetBonds()):
            other = [b2.GetOtherAtom(y) for b2 in y.GetBonds() if b2.GetBondType() == Chem.BondType.DOUBLE][0]
            return K.SIGMA_STAR_Z["C=N"] if other.GetAtomicNum() == 7 else K.SIGMA_STAR_Z["C=C"]
        if depth >= 3:
            return 0.0
        s = group_sigma_star(mol, y, a, depth + 1, path, claimed)
        # an alkyl carbon on the alpha carbon gives sigma*(Et); farther out an alkyl chain adds
        # nothing in water (n-propyl-, n-butyl-, n-hexylamine 10.57, 10.64, 10.56 against
        # ethylamine 10.65, CRC, from memory; in rings the sums also ran both ways round)
        alkyl_weight = min(1.0, max(0.0, 1.0 - s / 0.25)) if depth == 0 else 0.0
        return K.ATTENUATION * s + K.ALKYL_SIGMA_STAR * alkyl_weight
    key = _hetero_key(mol, y, a)
    return K.SIGMA_STAR_Z.get(key, 0.0) if key else 0.0


def _benzyl_ring_sigma(mol: Chem.Mol, ipso: Chem.Atom, with_aza: bool = False) -> float:
    """Hammett sum of the substituents on the ring of a benzylic carbon (ortho taken as meta);
    with ``with_aza``, the ring's aza atoms as well (constants.AZA_SIGMA, ortho taken as meta: picolyl groups)."""
    ring = _ring_of(mol, ipso.GetIdx(), 6)
    if ring is None:
        return 0.0
    total = 0.0
    for d, key in _ring_substituents(mol, ring, ipso.GetIdx()):
        if key == "aza" and with_aza:
            total += K.AZA_SIGMA["para" if d == 3 else "meta"]
            continue
        if key in ("aza", "fused") or key.startswith("ring_"):
            continue
        total += _sigma_for(key, 2 if d == 1 else d, False)
    return total


def _carries_cation(mol: Chem.Mol, start: Chem.Atom, parent: Chem.Atom, depth: int = 4) -> bool:
    """A positively charged atom (other than the N of a nitro group) within ``depth`` bonds of
    ``start``, away from ``parent``."""
    seen = {parent.GetIdx(), start.GetIdx()}
    frontier = [start]
    for _ in range(depth + 1):
        nxt = []
        for a in frontier:
            if a.GetFormalCharge() > 0 and not any(y.GetFormalCharge() < 0 for y in a.GetNeighbors()):
                return True
            for y in a.GetNeighbors():
                if y.GetIdx() not in seen:
                    seen.add(y.GetIdx())
                    nxt.append(y)
        frontier = nxt
    return False


def aliphatic(mol: Chem.Mol, n_idx: int) -> tuple[float, str]:
    n = mol.GetAtomWithIdx(n_idx)
    heavy = [x for x in n.GetNeighbors() if x.GetAtomicNum() > 1]
    if not heavy:
        return 9.25, "ammonia"
    cls = {2: "primary", 1: "secondary", 0: "tertiary"}.get(n.GetTotalNumHs(), "tertiary")
    a, rho = K.TAFT_AMINE[cls]
    # a neutral electron-withdrawing group counts K.TAFT_EWG_SCALE times; the sigma* of a
    # charged group (the ammonium ion of a diamine's second step) is used as it stands
    sigma = 0.0
    # a substituent can be reached twice only through a ring: only then survey the shortest
    # depth at which each one is reached
    claimed: dict | None = None
    if mol.GetRingInfo().NumRings():
        claimed = {"survey": True, "depth": {}, "done": set()}
        for x in heavy:
            group_sigma_star(mol, x, n, claimed=claimed)
        claimed["survey"] = False
    for x in heavy:
        g = group_sigma_star(mol, x, n, claimed=claimed)
        sigma += g * K.TAFT_EWG_SCALE if g > 0 and not _carries_cation(mol, x, n) else g
    # steric hindrance to solvation: the fewer N-H a crowded ammonium ion has, the less water
    # can stabilise it, which the sigma* of branched alkyl groups does not see
    # (2,2,6,6-tetramethylpiperidine is no stronger a base than piperidine)
    crowd = 0.0
    for x in heavy:
        if x.GetAtomicNum() == 6 and not x.GetIsAromatic():
            branches = sum(1 for y in x.GetNeighbors() if y.GetIdx() != n_idx and y.GetAtomicNum() == 6)
            crowd += max(0, branches - 1)
    pka = a - rho * sigma - K.CROWDED_AMMONIUM[cls] * crowd
    return pka, f"Taft equation, {cls} amine (sum sigma* {sigma:+.2f})"


# --------------------------------------------------------------------------- aromatic rings
def _in_fused_ring(mol: Chem.Mol, ring_atom: Chem.Atom, x: Chem.Atom) -> bool:
    """``x`` belongs to a ring fused on at ``ring_atom`` (not to a substituent)."""
    rings = mol.GetRingInfo()
    return rings.NumAtomRings(ring_atom.GetIdx()) > 1 and rings.AreAtomsInSameRing(ring_atom.GetIdx(), x.GetIdx())


def classify_substituent(mol: Chem.Mol, ring_atom: Chem.Atom, x: Chem.Atom, ring: set[int]) -> str:
    """A Hammett key for the substituent that starts at ``x`` on ``ring_atom``."""
    z = x.GetAtomicNum()
    if z in (9, 17, 35, 53):
        return x.GetSymbol()
    if z == 6:
        if x.GetIsAromatic():
            return "fused" if _in_fused_ring(mol, ring_atom, x) else "Ph"
        nbrs = [n for n in x.GetNeighbors() if n.GetIdx() != ring_atom.GetIdx()]
        kinds = _carbonyl_kind(mol, x)
        if kinds:
            if kinds == "carboxylate":
                return "COO-"
            if kinds == "C=O acid":
                return "COOH"
            if kinds == "C=O ester":
                return "COOR"
            if kinds == "C=O amide":
                return "CONH2"
            return "CHO" if x.GetTotalNumHs() else "COR"
        for b in x.GetBonds():
            o = b.GetOtherAtom(x)
            if o.GetIdx() == ring_atom.GetIdx():
                continue
            if b.GetBondType() == Chem.BondType.TRIPLE:
                return "CN" if o.GetAtomicNum() == 7 else "ethynyl"
            if b.GetBondType() == Chem.BondType.DOUBLE:
                if o.GetAtomicNum() == 7:
                    return "COR"
                return "vinyl"
        n_f = sum(1 for n in nbrs if n.GetAtomicNum() == 9)
        n_cl = sum(1 for n in nbrs if n.GetAtomicNum() == 17)
        if n_f >= 3 or (n_f == 2 and x.GetTotalNumHs() == 0):
            return "CF3"  # CF3, CF2R (C2F5)
        if n_cl >= 3:
            return "CCl3"
        if n_f + n_cl >= 2:
            return "CHX2"  # CHF2, CHCl2
        if any(n.GetAtomicNum() == 7 and n.GetFormalCharge() > 0 and not any(
            y.GetAtomicNum() == 8 for y in n.GetNeighbors()
        ) for n in nbrs):
            return "CH2N+"  # an ammonium one carbon out: the first site protonated (nicotine)
        if any(n.GetAtomicNum() == 7 for n in nbrs):
            return "CH2N"
        if any(n.GetAtomicNum() in (8, 9, 16, 17, 35, 53) for n in nbrs):
            return "CH2X"
        carbons = sum(1 for n in nbrs if n.GetAtomicNum() == 6)
        if carbons >= 3:
            return "tBu"
        if carbons == 0:
            return "CH3"
        if rings_fused_alkyl(mol, ring_atom, x, ring):
            return "alkyl"
        return "alkyl"
    if z == 7:
        if x.GetFormalCharge() > 0:
            if any(n.GetAtomicNum() == 8 for n in x.GetNeighbors()):
                return "NO2"
            return "NH3+" if x.GetTotalNumHs() else "NR3+"
        if x.GetIsAromatic():
            pyrrole_type = x.GetDegree() == 3 or x.GetTotalNumHs() > 0
            if pyrrole_type and _in_fused_ring(mol, ring_atom, x) and _ring_of(mol, x.GetIdx(), 5) is not None:
                return "fused_nR"  # the pyrrole-type N of a fused azole
            return "NHAc"
        nbrs = [n for n in x.GetNeighbors() if n.GetIdx() != ring_atom.GetIdx()]
        for n in nbrs:
            if n.GetAtomicNum() == 6 and _carbonyl_kind(mol, n):
                return "NHAc"
            if n.GetAtomicNum() == 16:
                return "NHAc"
            if n.GetAtomicNum() == 7 and any(b.GetBondType() == Chem.BondType.DOUBLE for b in x.GetBonds()):
                return "N=N"
        if any(b.GetBondType() == Chem.BondType.DOUBLE for b in x.GetBonds()):
            return "N=N"
        if any(n.GetIsAromatic() for n in nbrs):
            return "NHAr"  # an anilino group: its lone pair is shared with the other ring
        h = x.GetTotalNumHs()
        return {2: "NH2", 1: "NHR"}.get(h, "NR2")
    if z == 8:
        if x.GetFormalCharge() < 0:
            return "O-"
        if x.GetTotalNumHs():
            return "OH"
        nbrs = [n for n in x.GetNeighbors() if n.GetIdx() != ring_atom.GetIdx()]
        if any(n.GetIsAromatic() for n in nbrs):
            return "OPh"
        if any(n.GetAtomicNum() == 6 and _carbonyl_kind(mol, n) for n in nbrs):
            return "OAc"
        if any(n.GetAtomicNum() == 6 and sum(1 for m in n.GetNeighbors() if m.GetAtomicNum() == 9) >= 2 for n in nbrs):
            return "OCF3"
        return "OMe"
    if z == 16:
        n_oxo = sum(1 for n in x.GetNeighbors() if n.GetAtomicNum() == 8 and n.GetDegree() == 1)
        if n_oxo >= 2:
            if any(n.GetAtomicNum() == 7 for n in x.GetNeighbors()):
                return "SO2N"
            if any(n.GetAtomicNum() == 8 and (n.GetFormalCharge() < 0 or n.GetTotalNumHs()) for n in x.GetNeighbors()):
                return "SO3-"
            return "SO2CF3" if _perfluoro_neighbour(x, ring_atom) else "SO2R"
        if n_oxo == 1:
            return "SOR"  # sulfinyl
        if x.GetTotalNumHs():
            return "SH"
        return "SCF3" if _perfluoro_neighbour(x, ring_atom) else "SR"
    if z == 14:
        return "SiR3"
    if z == 5:
        return "B"
    return "H"


def _perfluoro_neighbour(x: Chem.Atom, ring_atom: Chem.Atom) -> bool:
    """Whether ``x`` carries a carbon with two or more fluorines (SCF3, SO2CF3, SCF2H)."""
    return any(
        n.GetIdx() != ring_atom.GetIdx() and n.GetAtomicNum() == 6
        and sum(1 for m in n.GetNeighbors() if m.GetAtomicNum() == 9) >= 2
        for n in x.GetNeighbors()
    )


def rings_fused_alkyl(mol, ring_atom, x, ring) -> bool:
    return False


def _ring_of(mol: Chem.Mol, idx: int, size: int | None = None) -> list[int] | None:
    best = None
    for ring in mol.GetRingInfo().AtomRings():
        if idx in ring and all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in ring):
            if size is not None and len(ring) != size:
                continue
            if best is None or len(ring) < len(best):
                best = list(ring)
    return best


def _ordered_positions(ring: list[int], start: int) -> dict[int, int]:
    """Distance around the ring from ``start`` for each ring atom."""
    i = ring.index(start)
    n = len(ring)
    return {ring[(i + k) % n]: min(k, n - k) for k in range(n)}


def _sigma_for(key: str, position: int, para_acceptor_minus: bool | None) -> float:
    """sigma of a ring substituent at ring distance 2 (meta) or 3 (para). For a para pi-acceptor
    ``para_acceptor_minus`` picks sigma_p- (True: anilines, whose lone pair conjugates with it),
    sigma_p (False), or its field constant F [HLT] (None: a pyridine-type N, whose lone pair
    lies in the ring plane and cannot conjugate with the acceptor; the acceptor then acts by its
    field effect alone. It fits 4-nitropyridine 1.61, 4-cyanopyridine 1.90, 4-acetylpyridine
    3.51, isonicotinamide 3.61 and methyl isonicotinate 3.26, CRC values from memory, which
    sigma_p puts 0.5-1.4 units too low; sigma_m, used until the sixth round, put
    4-nitropyridine and 4-acetylpyridine 0.5 too low)."""
    sm, sp, spm = K.HAMMETT.get(key, (0.0, 0.0, 0.0))
    if position == 2:
        return sm
    if position == 3:
        if para_acceptor_minus is None and key in K.AZINE_PARA_SIGMA:
            return K.AZINE_PARA_SIGMA[key]
        if key in _PI_ACCEPTORS:
            if para_acceptor_minus:
                return spm
            if para_acceptor_minus is None:
                return K.FIELD.get(key, sm)
        return sp
    return 0.0


def _ring_substituents(mol: Chem.Mol, ring: list[int], centre: int):
    """Yield (position, key) for every substituent and ring aza atom, position = ring distance."""
    for d, key, _idx in _ring_substituents_at(mol, ring, centre):
        yield d, key


def _ring_substituents_at(mol: Chem.Mol, ring: list[int], centre: int):
    """As ``_ring_substituents``, with the index of the ring atom that carries each one."""
    pos = _ordered_positions(ring, centre)
    ring_set = set(ring)
    azaring = any(is_aza(mol.GetAtomWithIdx(i)) for i in ring)
    for idx in ring:
        if idx == centre:
            continue
        atom = mol.GetAtomWithIdx(idx)
        d = pos[idx]
        if atom.GetAtomicNum() == 7:
            if atom.GetFormalCharge() > 0:
                yield d, "ring_n+", idx  # a protonated or alkylated ring N: strongly withdrawing
                continue
            if atom.GetDegree() == 3 or atom.GetTotalNumHs() > 0:
                yield d, "ring_nR", idx  # its lone pair is in the pi system: a donor, not an aza
                continue
            yield d, "aza", idx
        elif atom.GetAtomicNum() in (8, 16):
            yield d, "ring_" + atom.GetSymbol(), idx
        for b in atom.GetBonds():
            x = b.GetOtherAtom(atom)
            if x.GetIdx() in ring_set:
                continue
            if x.GetAtomicNum() in (8, 16) and b.GetBondType() == Chem.BondType.DOUBLE:
                yield d, "oxo", idx
                continue
            key = classify_substituent(mol, atom, x, ring_set)
            if key == "CHO" and azaring:
                # an aldehyde on an azine ring is largely hydrated in water, more so in the cation
                # (pyridinecarboxaldehydes): it acts as its gem-diol CH(OH)2
                key = "CH2X"
            yield d, key, idx


def _oxo_or_nr(key: str, d: int) -> tuple[float, float]:
    """(ortho increment, sigma) of a ring C=O, ring N-R or ring N+ at ring distance d."""
    if key == "ring_n+":
        # pyridinium as a substituent: an estimate, twice the sigma of a ring aza atom
        return (2 * K.AZA_ORTHO_INCREMENT, 0.0) if d == 1 else (0.0, 2 * K.AZA_SIGMA["meta" if d == 2 else "para"])
    if key == "oxo":
        if d == 1:
            return K.RING_OXO["ortho"], 0.0
        return 0.0, K.RING_OXO["meta" if d == 2 else "para"]
    if d == 1:
        return 0.0, 0.0
    return 0.0, K.RING_NR_SIGMA["meta" if d == 2 else "para"]


_TWISTABLE = {"NR2": 0.7, "NHR": 0.25, "NO2": 1.0, "COOR": 1.0, "COR": 1.0}


def _twisted_sigma(mol: Chem.Mol, ring: list[int], centre: int, key: str, d: int, sigma: float) -> float:
    """Steric inhibition of resonance (B. M. Wepster, Recl. Trav. Chim. 1957, 76, 335 and later
    papers): a conjugating substituent with non-H neighbours on both sides of it in the ring
    turns out of the ring plane and loses part of its resonance effect. Each flanking group
    removes K.TWIST_LOSS of the resonance part (sigma at this position minus sigma_m), weighted
    by how bulky the group is: an NR2 group 0.7 (4-dimethylamino-3,5-dimethylpyridine keeps
    about half its donation), an NHR group 0.25, as it turns its N-H towards the flanking group.
    Our estimates of the size; the effect is textbook."""
    weight = _TWISTABLE.get(key)
    if weight is None or d < 2:
        return sigma
    sm = K.HAMMETT.get(key, (0.0, 0.0, 0.0))[0]
    pos = _ordered_positions(ring, centre)
    at = [i for i in ring if pos[i] == d]
    best = sigma
    for idx in at:
        atom = mol.GetAtomWithIdx(idx)
        has = any(
            x.GetIdx() not in ring and x.GetAtomicNum() > 1 and _key_of(mol, atom, x, ring) == key
            for x in atom.GetNeighbors()
        )
        if not has:
            continue
        flank = 0
        for nb in atom.GetNeighbors():
            if nb.GetIdx() not in ring or nb.GetIdx() == centre:
                continue
            if any(y.GetIdx() not in ring and y.GetAtomicNum() > 1 for y in nb.GetNeighbors()):
                flank += 1
        if flank:
            best = sigma - min(1.0, K.TWIST_LOSS * flank * weight) * (sigma - sm)
    return best


def _key_of(mol: Chem.Mol, atom: Chem.Atom, x: Chem.Atom, ring: list[int]) -> str:
    return classify_substituent(mol, atom, x, set(ring))


def _aza_beside(mol: Chem.Mol, ring: list[int], idx: int, centre: int) -> list[int]:
    """Pyridine-type ring N next to ring atom ``idx``, other than ``centre``. Seen from the
    site, one at ring distance 1 sits between the site and a second ring N (C2 of a pyrimidine),
    one at distance 2 has a ring N between it and the site (C3 of a pyridazine)."""
    return [
        x.GetIdx() for x in mol.GetAtomWithIdx(idx).GetNeighbors()
        if x.GetIdx() in ring and x.GetIdx() != centre and is_aza(x)
    ]


def _hammett_sum(
    mol: Chem.Mol,
    ring: list[int],
    centre: int,
    ortho_table: dict[str, float],
    *,
    default_ortho: float,
    ring_hetero: float,
    para_minus: bool | None,
    five_ring: bool = False,
    donors: list | None = None,
    beside_donor: bool = False,
) -> tuple[float, float]:
    """(sum of ortho increments, sum of sigma) of a ring's substituents seen from ``centre``.

    With ``donors`` given, each pi-donor ortho or para to the centre is also listed there as
    (ring atom index, "ortho" or "sigma", its term) for the cross-conjugation correction. With
    ``beside_donor`` (pyridine-type N in a ring with no second aza N), a pi-donor meta to the
    centre in a ring that also carries a pi-donor ortho or para to it moves towards its field
    constant (constants.DONOR_META_SHARE)."""
    ortho = sigma = 0.0
    subs = list(_ring_substituents_at(mol, ring, centre))
    # the BETWEEN_AZA terms are for a ring N site; an amino group on a ring carbon is not one
    centre_is_aza = mol.GetAtomWithIdx(centre).GetAtomicNum() == 7
    second_aza = any(key == "aza" for _d, key, _i in subs)
    benzo = _benzo_fusion_atoms(mol, ring) if centre_is_aza else set()
    # an alkoxy group beside the N is not such a donor: its pull on the N outweighs its
    # resonance (2-methoxypyridine 3.28 against 5.25, CRC), and a donor para to it keeps its
    # full sigma_m (5-amino-2-methoxypyridine)
    conjugated_donor = beside_donor and not five_ring and any(
        key in _PI_DONORS and (d == 3 or (d == 1 and key != "OMe")) for d, key, _i in subs
    ) and not any(key == "aza" for _d, key, _i in subs)
    for d, key, idx in subs:
        if five_ring:
            d = {1: 1, 2: 2}.get(d, 2)
        if key == "aza":
            if d == 1:
                ortho += K.AZA_ORTHO_INCREMENT
            else:
                sigma += K.AZA_SIGMA["meta" if d == 2 else "para"]
            continue
        if key in ("oxo", "ring_nR", "ring_n+"):
            o, sg = _oxo_or_nr(key, d)
            ortho += o
            sigma += sg
            if key == "ring_nR" and not five_ring:
                ortho += _ring_n_alkyl(mol, ring, idx, beside=d == 1)
            continue
        if key.startswith("ring_"):
            sigma += ring_hetero
            continue
        if key in ("NHR", "NR2") and d in (1, 3) and donors is not None:
            ortho += _amino_n_withdrawal(mol, ring, idx)
        if key in ("alkyl", "tBu"):
            sigma += _remote_inductive(mol, ring, idx)  # inductive: the same at every position
        elif key in ("CH2X", "CH2N", "CH2N+"):
            sigma += _remote_inductive(mol, ring, idx, beyond_first=True)
        if d == 1:
            term = ortho_table.get(key, default_ortho if key != "H" else 0.0)
            if key in K.BETWEEN_AZA and centre_is_aza and _aza_beside(mol, ring, idx, centre):
                term += K.BETWEEN_AZA[key]
            if centre_is_aza and key in K.HAMMETT and not second_aza and _beta_bond(mol, ring, benzo, centre, idx):
                sm, sp, _ = K.HAMMETT[key]
                term += K.BETA_BOND_RHO * min(0.0, sp - sm)
            ortho += term
            if donors is not None and key in _PI_DONORS:
                donors.append((idx, "ortho", term))
        else:
            sg = _sigma_for(key, d, para_minus)
            if d == 2 and conjugated_donor and key in K.DONOR_META_FIELD:
                sg += K.DONOR_META_SHARE * (K.DONOR_META_FIELD[key] - sg)
            elif d == 2 and centre_is_aza and key in K.FUSION_META_DONOR_FIELD and _para_of(ring, idx) in benzo:
                sg += K.FUSION_META_DONOR_SHARE * (K.FUSION_META_DONOR_FIELD[key] - sg)
            if d == 2 and any(mol.GetBondBetweenAtoms(a, centre) for a in _aza_beside(mol, ring, idx, centre)):
                sg += K.ALPHA_AZA_RESONANCE * (_sigma_for(key, 3, para_minus) - sg)
            if d == 3 and para_minus is None and key in _PI_ACCEPTORS:
                term = sg  # already its field effect alone: a twist takes no resonance away
            else:
                term = _twisted_sigma(mol, ring, centre, key, d, sg)
            sigma += term
            if donors is not None and key in _PI_DONORS and d == 3:
                donors.append((idx, "sigma", term))
    return ortho, sigma


def _benzo_fusion_atoms(mol: Chem.Mol, ring: list[int]) -> set[int]:
    """The atoms ``ring`` shares with fused benzo (aromatic carbocyclic) rings."""
    ring_set = set(ring)
    fusion: set[int] = set()
    for other in mol.GetRingInfo().AtomRings():
        shared = ring_set & set(other)
        if len(shared) == 2 and all(
            mol.GetAtomWithIdx(i).GetAtomicNum() == 6 and mol.GetAtomWithIdx(i).GetIsAromatic() for i in other
        ):
            fusion |= shared
    return fusion


def _beta_bond(mol: Chem.Mol, ring: list[int], fusion: set[int], a: int, b: int) -> bool:
    """Whether ring atoms ``a`` and ``b`` form the bond opposite a benzo fusion (N2-C3 of an
    isoquinoline, the beta-beta bond of a naphthalene), whose double-bond character is the
    lowest of the ring (bond orders about 1.60 against 1.72 for an alpha-beta bond; C. A.
    Coulson's Hueckel orders of naphthalene): a donor there conjugates with the site N through
    it only weakly. ``fusion``: the ring's benzo-fusion atoms (``_benzo_fusion_atoms``)."""
    if len(fusion) != 2:
        return False
    ring_set = set(ring)
    alpha = {n.GetIdx() for f in fusion for n in mol.GetAtomWithIdx(f).GetNeighbors() if n.GetIdx() in ring_set}
    return not ({a, b} & (alpha | fusion))


def _next_to_benzo_fusion(mol: Chem.Mol, ring: list[int], idx: int) -> bool:
    """Whether ring atom ``idx`` is bonded to an atom the ring shares with a fused benzo ring
    (C1 of an isoquinoline)."""
    return any(mol.GetBondBetweenAtoms(idx, f) is not None for f in _benzo_fusion_atoms(mol, ring))


def _ring_neighbours(mol: Chem.Mol, ring: list[int], idx: int) -> list[int]:
    ring_set = set(ring)
    return [n.GetIdx() for n in mol.GetAtomWithIdx(idx).GetNeighbors() if n.GetIdx() in ring_set]


def _chain_oh(mol: Chem.Mol, ring: list[int], idx: int) -> bool:
    """Whether ring atom ``idx`` carries an open sp3 chain with a hydroxy group on its second or
    third carbon (2-(2-hydroxyethyl)pyridine), which can reach the N beside it in a six- or
    seven-membered hydrogen-bonded ring."""
    ring_set = set(ring)
    for c1 in mol.GetAtomWithIdx(idx).GetNeighbors():
        if c1.GetIdx() in ring_set or c1.GetAtomicNum() != 6 or c1.GetIsAromatic() or c1.IsInRing():
            continue
        frontier, seen = [c1], {idx, c1.GetIdx()}
        for _depth in range(2):
            nxt = []
            for c in frontier:
                for y in c.GetNeighbors():
                    if y.GetIdx() in seen:
                        continue
                    seen.add(y.GetIdx())
                    if y.GetAtomicNum() == 6 and not y.GetIsAromatic() and not y.IsInRing() and y.GetHybridization() == Chem.HybridizationType.SP3:
                        nxt.append(y)
            for c in nxt:
                if any(o.GetAtomicNum() == 8 and o.GetTotalNumHs() == 1 and o.GetDegree() == 1 for o in c.GetNeighbors()):
                    return True
            frontier = nxt
    return False


def _locked_nhr(mol: Chem.Mol, ring: list[int], idx: int, site: int) -> bool:
    """Whether ring atom ``idx`` (beside the site N) carries an NHR group whose N-H is held by
    a nitro group on the ring atom on its other side (a 2-(alkylamino)-3-nitropyridine): the
    hydrogen bond turns the N-alkyl group towards the site N, where it crowds the N-H of the
    cation. A carboxamide there does not hold it as firmly (the pyrazinecarboxamides)."""
    ring_set = set(ring)
    atom = mol.GetAtomWithIdx(idx)
    if not any(
        x.GetIdx() not in ring_set and classify_substituent(mol, atom, x, ring_set) == "NHR"
        for x in atom.GetNeighbors()
    ):
        return False
    for nb in atom.GetNeighbors():
        if nb.GetIdx() not in ring_set or nb.GetIdx() == site:
            continue
        for y in nb.GetNeighbors():
            if y.GetIdx() in ring_set:
                continue
            if classify_substituent(mol, nb, y, ring_set) == "NO2":
                return True
    return False


def _para_of(ring: list[int], idx: int) -> int | None:
    """The ring atom para to ``idx`` in a six-membered ring; None in a ring of another size
    (a five-membered ring has no para position)."""
    if len(ring) != 6:
        return None
    pos = _ordered_positions(ring, idx)
    return next((i for i in ring if pos[i] == 3), None)


def _chain_sigma_star(mol: Chem.Mol, x: Chem.Atom, parent: Chem.Atom, ring: list[int]) -> float:
    """Taft sigma* of the group at ``x`` (bound to ``parent``), kept off the aromatic ring; a
    substituent reached along both paths round a ring of the group (a glycosyl group) counts
    once, as for amines."""
    ring_set = set(ring)
    claimed = None
    if x.IsInRing():
        claimed = {"survey": True, "depth": {}, "done": set()}
        group_sigma_star(mol, x, parent, path=ring_set, claimed=claimed)
        claimed["survey"] = False
    return group_sigma_star(mol, x, parent, path=ring_set, claimed=claimed)


def _amino_n_withdrawal(mol: Chem.Mol, ring: list[int], idx: int) -> float:
    """An amino group ortho or para to a ring N carries part of the cation's charge (an
    amidinium-like ion), so an electron-withdrawing group on that amino N lowers the pKa
    through its Taft sigma*, with a share of the amine rho*: constants.AMINO_N_RHO_STAR.
    Alkyl groups are in the Hammett constants of NHR and NR2 already; only sigma* above
    methyl's 0 counts."""
    ring_set = set(ring)
    atom = mol.GetAtomWithIdx(idx)
    total = 0.0
    for n in atom.GetNeighbors():
        if n.GetIdx() in ring_set or n.GetAtomicNum() != 7 or n.GetIsAromatic():
            continue
        for x in n.GetNeighbors():
            if x.GetIdx() == idx or x.GetAtomicNum() != 6 or x.GetIsAromatic():
                continue
            if mol.GetRingInfo().AreAtomsInSameRing(idx, x.GetIdx()):
                continue
            star = _chain_sigma_star(mol, x, n, ring)
            total -= K.AMINO_N_RHO_STAR * max(0.0, star)
    return total


def _remote_inductive(mol: Chem.Mol, ring: list[int], idx: int, beyond_first: bool = False) -> float:
    """The inductive sigma of polar groups further out on an open alkyl chain on ring atom
    ``idx`` (2-(2-hydroxyethyl)pyridine, 3-(3-chloropropyl)aniline), which the Hammett key
    "alkyl" leaves out: Taft's relation sigma_I(X) = 0.45 sigma*(CH2X) with X the whole chain,
    sigma*(CH2X) = 0.4 (one more carbon) times the Taft sigma* of the group at the chain's
    first atom (R. W. Taft, I. C. Lewis, J. Am. Chem. Soc. 1958, 80, 2436; the attenuation of
    Perrin, Dempsey & Serjeant). Electron-withdrawing chains only: the donation of plain alkyl
    groups is in their Hammett constants."""
    ring_set = set(ring)
    atom = mol.GetAtomWithIdx(idx)
    return sum(
        _remote_inductive_of(mol, ring_set, atom, x, beyond_first)
        for x in atom.GetNeighbors() if x.GetIdx() not in ring_set
    )


def _remote_inductive_of(
    mol: Chem.Mol, ring_set: set[int], atom: Chem.Atom, x: Chem.Atom, beyond_first: bool = False
) -> float:
    """``_remote_inductive`` for the one chain that starts at ``x`` on ring atom ``atom``. With
    ``beyond_first`` (a CH2X or CH2N group, whose Hammett constants hold one heteroatom), the
    strongest heteroatom term on the first carbon is left out and the rest counts."""
    if x.GetAtomicNum() != 6 or x.IsInRing() or x.GetIsAromatic():
        return 0.0
    s = group_sigma_star(mol, x, atom, path=ring_set)
    if beyond_first:
        hetero = [
            _term(mol, y, x, mol.GetBondBetweenAtoms(x.GetIdx(), y.GetIdx()), 0, ring_set | {x.GetIdx()})
            for y in x.GetNeighbors() if y.GetIdx() != atom.GetIdx() and y.GetAtomicNum() not in (1, 6)
        ]
        s -= max(hetero, default=0.0)
    return K.SIGMA_I_PER_SIGMA_STAR * K.ATTENUATION * max(0.0, s)


def _ring_n_alkyl(mol: Chem.Mol, ring: list[int], idx: int, beside: bool) -> float:
    """The alkyl group on a ring N-R of a six-membered ring (a 1-alkylpyrimidin-2-one, an
    N-alkylpyridone) acts through its Taft sigma* relative to methyl, as on the pyrrole-type
    N of an azole (constants.AZOLE_N_RHO_STAR); next to the site only an electron-withdrawing
    group counts (a larger alkyl group there crowds the N-H instead)."""
    ring_set = set(ring)
    atom = mol.GetAtomWithIdx(idx)
    total = 0.0
    for x in atom.GetNeighbors():
        if x.GetIdx() in ring_set or x.GetAtomicNum() != 6 or x.GetIsAromatic() or _carbonyl_kind(mol, x):
            continue
        if any(b.GetBondType() != Chem.BondType.SINGLE for b in x.GetBonds()):
            continue
        if mol.GetRingInfo().AreAtomsInSameRing(idx, x.GetIdx()):
            continue  # a fused saturated ring: its atoms lead back to the ring system
        star = _chain_sigma_star(mol, x, atom, ring)
        total -= K.AZOLE_N_RHO_STAR * (max(star, 0.0) if beside else star)
    return total


def _peri_groups(mol: Chem.Mol, ring: list[int], site: int) -> list[Chem.Atom]:
    """Atoms of the groups in the peri position of a ring N next to a ring fusion (C8 of a
    quinoline, C4/C5 of an acridine): on the atom of the fused six-membered ring next to the
    fusion atom. A further ring fused there (benzo[h]quinoline) counts as such a group."""
    n = mol.GetAtomWithIdx(site)
    ring_set = set(ring)
    info = mol.GetRingInfo()
    out = []
    for f in n.GetNeighbors():
        if f.GetIdx() not in ring_set or info.NumAtomRings(f.GetIdx()) < 2:
            continue
        for other in info.AtomRings():
            if f.GetIdx() not in other or len(other) != 6 or set(other) == ring_set:
                continue
            if not all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in other):
                continue
            other_set = set(other)
            for g in f.GetNeighbors():
                if g.GetIdx() not in other_set or g.GetIdx() in ring_set:
                    continue
                if g.GetAtomicNum() != 6:
                    continue
                for x in g.GetNeighbors():
                    if x.GetIdx() in other_set or x.GetAtomicNum() == 1:
                        continue
                    out.append(x)
    return out


def _peri(mol: Chem.Mol, ring: list[int], site: int) -> float:
    """A group in the peri position crowds the N-H of the cation and hinders its solvation
    (8-methylquinoline and benzo[h]quinoline are weaker bases than quinoline; an 8-amino group
    also holds the N lone pair in a hydrogen bond). With a group ortho to the N on its other side
    as well (2,8-dimethylquinoline), or peri groups on both sides (4,5-disubstituted
    acridines), the N-H is squeezed between the two. K.PERI and K.PERI_BUTTRESS are our
    estimates."""
    groups = _peri_groups(mol, ring, site)
    if not groups:
        return 0.0
    if all(_peri_acceptor(mol, g) for g in groups):
        # an oxygen in the peri position (a ring C=O, an ether or a hydroxy O) accepts a
        # hydrogen bond from the N-H of the cation, which pays for the crowding (K.PERI_ACCEPTOR)
        return K.PERI_ACCEPTOR
    n = mol.GetAtomWithIdx(site)
    ortho_sub = False
    for r in n.GetNeighbors():
        if r.GetIdx() not in ring or mol.GetRingInfo().NumAtomRings(r.GetIdx()) > 1:
            continue
        if any(x.GetIdx() not in ring and x.GetAtomicNum() > 1 for x in r.GetNeighbors()):
            ortho_sub = True
    # peri groups on both sides of the N (4,5-disubstituted acridines) squeeze it as well
    sides = {
        f.GetIdx() for f in n.GetNeighbors() for g in groups
        if f.GetIdx() in ring and any(mol.GetBondBetweenAtoms(f.GetIdx(), h.GetIdx()) for h in g.GetNeighbors())
    }
    if len(sides) > 1:
        ortho_sub = True
    # an N-H donor in the peri position (an amino group) holds the ring N's lone pair in a
    # hydrogen bond in the neutral base, which the cation loses (8-aminoquinoline)
    donor = any(
        g.GetAtomicNum() == 7 and not g.GetIsAromatic() and g.GetTotalNumHs() > 0 and g.GetFormalCharge() == 0
        for g in groups
    )
    return K.PERI + (K.PERI_BUTTRESS if ortho_sub else 0.0) + (K.PERI_NH_DONOR if donor else 0.0)


def _peri_acceptor(mol: Chem.Mol, g: Chem.Atom) -> bool:
    """A peri oxygen (of a C=O, an ether or a hydroxy group) that accepts a hydrogen bond from
    the N-H of the cation: 8-hydroxyquinoline 4.91 (Albert, from memory) is as basic as
    quinoline 4.90, where a peri methyl group lowers it."""
    return g.GetAtomicNum() == 8 and not g.GetIsAromatic()


def _donor_cross(mol: Chem.Mol, ring: list[int], site: int, donors: list, rho: float) -> float:
    """Correction to additivity for pi-donors (amino, alkoxy) conjugated with the site N.

    Cross-conjugation: a donor para to another ring aza N, and not next to one, is conjugated
    with that N in the free base, and the additive sums credit it in full to the site. It stays
    conjugated with the other N on protonation, so it adds little to the site's basicity
    (4,6-diaminopyrimidine lies well below 2,4-diaminopyrimidine, where both donors are ortho to
    the other N; in melamine every amino group sits between two ring N and they all count). Such
    a donor loses K.DONOR_CROSS of its ortho or para increment (our estimate, constants.py).
    A donor joined to a ring C=O through a ring carbon (N-C=C-C=O, a vinylogous amide) loses
    K.DONOR_CROSS_OXO of it in the same way."""
    if not donors:
        return 0.0
    aza = [i for i in ring if i != site and is_aza(mol.GetAtomWithIdx(i))]
    oxo = [i for d, key, i in _ring_substituents_at(mol, ring, site) if key == "oxo"]
    if not aza and not oxo:
        return 0.0
    correction = 0.0
    for idx, kind, term in donors:
        inc = term if kind == "ortho" else -rho * term
        if inc <= 0:
            continue
        pos = _ordered_positions(ring, idx)
        if any(pos[o] == 2 and _vinylogous(mol, ring, idx, o) for o in oxo):
            correction -= K.DONOR_CROSS_OXO * inc
            continue
        # para to another aza N and not flanked by one (a donor between two ring N, as in
        # 2-aminopyrimidine or melamine, stays in conjugation with the site)
        if any(pos[a] == 3 for a in aza) and not any(pos[a] == 1 for a in aza):
            correction -= K.DONOR_CROSS * inc
    return correction


def _vinylogous(mol: Chem.Mol, ring: list[int], donor: int, oxo: int) -> bool:
    """Whether the ring atoms of a donor and of a ring C=O two atoms apart are joined through a
    ring carbon (N-C=C-C=O, a vinylogous amide), not through a ring N."""
    return any(
        mol.GetAtomWithIdx(c).GetAtomicNum() == 6
        and mol.GetBondBetweenAtoms(donor, c) is not None
        and mol.GetBondBetweenAtoms(oxo, c) is not None
        for c in ring
    )


def _fused_ring_sigma(mol: Chem.Mol, ring: list[int], site: int) -> float:
    """Hammett sum of substituents on aromatic rings fused to ``ring``, attenuated per ring."""
    info = mol.GetRingInfo()
    aromatic_rings = [set(r) for r in info.AtomRings() if all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in r)]
    base = set(ring)
    away: dict[int, int] = {}  # atom -> rings away from the site ring
    frontier = [base]
    seen_rings = [base]
    level = 0
    while frontier and level < 2:
        level += 1
        nxt = []
        for r in aromatic_rings:
            if r in seen_rings:
                continue
            if any(len(r & f) >= 2 for f in frontier):
                nxt.append(r)
                seen_rings.append(r)
                for a in r - set().union(*[x for x in seen_rings if x is not r]):
                    away.setdefault(a, level)
        frontier = nxt
    if not away:
        return 0.0
    system = set().union(*seen_rings)
    total = 0.0
    for a_idx, lvl in away.items():
        atom = mol.GetAtomWithIdx(a_idx)
        f = K.FUSED_RING_FACTOR ** lvl
        odd = (len(Chem.GetShortestPath(mol, site, a_idx)) - 1) % 2 == 1
        for x in atom.GetNeighbors():
            if x.GetIdx() in system:
                continue
            bond = mol.GetBondBetweenAtoms(a_idx, x.GetIdx())
            if x.GetAtomicNum() in (8, 16) and bond.GetBondType() == Chem.BondType.DOUBLE:
                total += f * K.RING_OXO["para" if odd else "meta"]  # a ring C=O of the fused ring
                continue
            key = classify_substituent(mol, atom, x, system)
            if key in ("fused", "H"):
                continue
            path = Chem.GetShortestPath(mol, site, a_idx)
            d = len(path) - 1
            sm, sp, _spm = K.HAMMETT.get(key, (0.0, 0.0, 0.0))
            # conjugated (odd path) positions act with sigma_p, unless the shortest path runs
            # along the fusion bond: resonance does not cross it
            conjugated = d % 2 == 1 and not _crosses_fusion(mol, path)
            sg = sp if conjugated else sm
            if not conjugated and lvl == 1 and sp < sm and _para_to_n_fusion(mol, a_idx, site):
                sg = sm + K.FUSED_PARA_DONOR_SHARE * (sp - sm)
            term = (K.FUSED_RING_FACTOR ** lvl) * sg
            if key in ("CH3", "alkyl", "tBu"):
                term *= K.FUSED_ALKYL_SHARE
            total += term
    return total


def _para_to_n_fusion(mol: Chem.Mol, a_idx: int, site: int) -> bool:
    """Whether, in its own ring, atom ``a_idx`` is para to a fusion atom bonded to the site N
    (C6 of a quinoline, para to C8a)."""
    info = mol.GetRingInfo()
    fusions = [f for f in mol.GetAtomWithIdx(site).GetNeighbors() if info.NumAtomRings(f.GetIdx()) >= 2]
    if len(fusions) != 1:
        return False  # an acridine N between two fusion atoms: its outer rings share the charge
    f = fusions[0].GetIdx()
    return any(
        a_idx in r and f in r and site not in r and len(r) == 6 and _para_of(list(r), f) == a_idx
        for r in info.AtomRings()
    )


def _crosses_fusion(mol: Chem.Mol, path) -> bool:
    """The path runs along a ring-fusion bond (two consecutive atoms both in two rings): C5 of a
    quinoline seen from N1 (N1-C8a-C4a-C5), against C7 (N1-C8a-C8-C7). A group there is not
    conjugated with the ring N in the way sigma_p assumes: 5-aminoquinoline 5.46 is barely more
    basic than quinoline 4.90, 7-aminoquinoline 6.65 is (Albert, from memory)."""
    info = mol.GetRingInfo()
    return any(info.NumAtomRings(a) > 1 and info.NumAtomRings(b) > 1 for a, b in zip(path, path[1:]))


def _fused_aza_sigma(mol: Chem.Mol, ring: list[int], site: int) -> float:
    """Ring aza atoms of an aromatic ring fused to the azole ring (the pyrimidine ring of a
    purine, the pyridine ring of an imidazopyridine), each as an aza substituent at the reduced
    strength of a fused ring (FUSED_RING_FACTOR), sigma_p at odd path lengths from the site and
    sigma_m at even ones. Without it the imidazole N of a purine would be taken for the most
    basic site; purines protonate at N1 of the pyrimidine ring."""
    ring_set = set(ring)
    total = 0.0
    for other in mol.GetRingInfo().AtomRings():
        if len(ring_set & set(other)) != 2 or not all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in other):
            continue
        for idx in other:
            if idx in ring_set:
                continue
            a = mol.GetAtomWithIdx(idx)
            if not is_aza(a):
                continue
            d = len(Chem.GetShortestPath(mol, site, idx)) - 1
            total += K.FUSED_RING_FACTOR * K.AZA_SIGMA["para" if d % 2 == 1 else "meta"]
    return total


def _twist(mol: Chem.Mol, n: Chem.Atom, ipso: Chem.Atom, ring: list[int]) -> float:
    """Steric inhibition of resonance: an N,N-dialkylamino group with an alkyl group ortho to it
    (or an N-alkylamino group between two) turns out of the ring plane, its lone pair no longer
    delocalised, and the amine becomes more basic instead of less. Replaces the ortho-alkyl
    increment of primary anilines by K.ORTHO_ALKYL_TWIST per crowding alkyl group. Any other
    group ortho to an NR2 group twists it as well; the increment of primary anilines for that
    group (which holds the hydrogen bond to an N-H and the resonance with the N lone pair) gives
    way to the twist and the group's field effect, K.ORTHO_ALKYL_TWIST - rho * F (HLT field
    constants, constants.FIELD)."""
    n_alkyl = sum(1 for x in n.GetNeighbors() if x.GetIdx() != ipso.GetIdx() and x.GetAtomicNum() == 6 and not x.GetIsAromatic())
    ortho_alkyl = [
        x for r in ipso.GetNeighbors() if r.GetIdx() in ring
        for x in r.GetNeighbors()
        if x.GetIdx() not in ring and x.GetAtomicNum() == 6 and not x.GetIsAromatic()
        and not any(b.GetBondTypeAsDouble() > 1 for b in x.GetBonds())
    ]
    other = 0.0
    alkyl_idx = {x.GetIdx() for x in ortho_alkyl}
    if n_alkyl == 2:
        # any other ortho group crowds an NR2 group the same way; with no N-H left to hold it
        # and no lone pair in conjugation, the group acts by its field effect alone
        ring_set = set(ring)
        for r in ipso.GetNeighbors():
            if r.GetIdx() not in ring_set:
                continue
            for x in r.GetNeighbors():
                if x.GetIdx() in ring_set or x.GetAtomicNum() == 1 or x.GetIdx() in alkyl_idx:
                    continue
                key = classify_substituent(mol, r, x, ring_set)
                if key in K.FIELD and key in K.ORTHO_ANILINE:
                    other += K.ORTHO_ALKYL_TWIST - K.ANILINE_N_ALKYL_RHO * K.FIELD[key] - K.ORTHO_ANILINE[key]
    if not ortho_alkyl or n_alkyl == 0 or (n_alkyl == 1 and len(ortho_alkyl) < 2):
        return other
    per = K.ORTHO_ALKYL_TWIST - K.ORTHO_ANILINE["CH3"]  # undo the primary-aniline increment
    return per * len(ortho_alkyl) + other


def _aryl_terms(mol: Chem.Mol, ipso: Chem.Atom, ring: list[int]) -> tuple[float, float]:
    """(ortho increments, sum sigma) of an aryl or heteroaryl ring seen from the N on ``ipso``,
    as for anilines: sigma_p- for para pi-acceptors, ring aza atoms as substituents, and the
    substituents of a fused ring (naphthylamines) at reduced strength."""
    ortho, sigma = _hammett_sum(
        mol, ring, ipso.GetIdx(), K.ORTHO_ANILINE, default_ortho=-0.5, ring_hetero=0.3,
        para_minus=True, five_ring=len(ring) == 5,
    )
    if len(ring) == 6:
        sigma += _fused_ring_sigma(mol, ring, ipso.GetIdx())
    return ortho, sigma


def aniline(mol: Chem.Mol, n_idx: int) -> tuple[float, str]:
    n = mol.GetAtomWithIdx(n_idx)
    aryls = [x for x in n.GetNeighbors() if x.GetIsAromatic()]
    ipso = aryls[0]
    ring = _ring_of(mol, ipso.GetIdx(), 6) or _ring_of(mol, ipso.GetIdx())
    pka = K.ANILINE["pka0"]
    sigma = 0.0
    ortho = 0.0
    # N-substituents other than the ring: alkyl groups raise, a second aryl lowers sharply
    for x in n.GetNeighbors():
        if x.GetIdx() == ipso.GetIdx() or x.GetAtomicNum() == 1:
            continue
        if x.GetIsAromatic():
            pka -= 3.8  # diphenylamine 0.78 against aniline 4.60 [P65]
        else:
            pka += 0.35 - 3.0 * group_sigma_star(mol, x, n)
    if ring is None:
        return pka, "Hammett equation, aniline"
    ortho, sigma = _aryl_terms(mol, ipso, ring)
    if len(ring) == 6:
        ortho += _twist(mol, n, ipso, ring)
    alkyls = [x for x in n.GetNeighbors() if x.GetIdx() != ipso.GetIdx() and x.GetAtomicNum() == 6 and not x.GetIsAromatic()]
    n_alkyl = len(alkyls)
    if n_alkyl == 2:
        # two N-alkyl groups crowd each other and the ortho C-H: the larger they are, the more
        # the NR2 group turns out of the ring plane and the less its lone pair is delocalised
        # (N,N-diethylaniline 6.57 against N,N-dimethylaniline 5.07 [CRC], while N-ethylaniline
        # 5.12 lies only 0.27 above N-methylaniline 4.85). Per carbon on an alpha carbon.
        ortho += K.ANILINE_DIALKYL_CROWD * sum(
            sum(1 for y in x.GetNeighbors() if y.GetIdx() != n_idx and y.GetAtomicNum() == 6) for x in alkyls
        )
    if n_alkyl == 1 and n.GetTotalNumHs() == 1 and len(ring) == 6:
        # an N-H held by an ortho nitro group keeps the NHR group planar and turns its alkyl
        # group away (constants.LOCKED_NHR)
        ring_set = set(ring)
        if any(
            classify_substituent(mol, r, y, ring_set) == "NO2"
            for r in ipso.GetNeighbors() if r.GetIdx() in ring_set
            for y in r.GetNeighbors() if y.GetIdx() not in ring_set
        ):
            ortho += K.LOCKED_NHR
    rho = K.ANILINE["rho"] if n_alkyl == 0 else K.ANILINE_N_ALKYL_RHO
    return pka + ortho - rho * sigma, f"Hammett equation, aniline (sum sigma {sigma:+.2f})"


# 5-ring azoles: the parent pKa by the ring's signature seen from the basic N (c carbon,
# r pyrrole-type N, p pyridine-type N, o oxygen, s sulfur), positions 1-4 around the ring [P65].
AZOLE_PARENTS: dict[str, tuple[float, str]] = {
    "ccrc": (6.95, "imidazole"),
    "cccr": (2.48, "pyrazole"),
    "ccoc": (0.80, "oxazole"),
    "ccsc": (2.53, "thiazole"),
    "ccco": (-2.97, "isoxazole"),
    "cccs": (-0.51, "isothiazole"),
    "cprc": (2.19, "1,2,4-triazole"),
    "ccrp": (1.17, "1,2,3-triazole"),
    "cpcr": (1.0, "1,2,4-triazole (N2)"),  # our estimate: must lie below the macroscopic 2.19, which is N4
    # N1 of a 4-substituted 4H-1,2,4-triazole: an imidazole-type N with a ring N beside it. Our
    # estimate: imidazole less the cost of the 1,3-aza of 1H-1,2,4-triazole (6.95 - 2.19) scaled
    # by the six-ring ratio of an ortho to a meta aza N (pyridazine 2.33, pyrimidine 1.30,
    # pyridine 5.25 [P65]) gives 3.4 for the ring; per N, as the two equivalent N of
    # 4-methyl-1,2,4-triazole (about 3.4 macroscopic, from memory) add log10 2.
    "crcp": (3.1, "4H-1,2,4-triazole"),
}
_AZOLE_BENZO = -1.35  # benzimidazole 5.53 against imidazole 6.95 [P65]
_AZOLE_N_SUBST = {"alkyl": 0.1, "aryl": -1.85, "acyl": -3.4, "sulfonyl": -4.0, "vinyl": -1.3}


def _ring_signature(mol: Chem.Mol, ring: list[int], site: int) -> str:
    i = ring.index(site)
    n = len(ring)
    seq = []
    for k in range(1, n):
        a = mol.GetAtomWithIdx(ring[(i + k) % n])
        z = a.GetAtomicNum()
        if z == 7:
            seq.append("r" if (a.GetTotalNumHs() > 0 or a.GetDegree() == 3) else "p")
        elif z == 8:
            seq.append("o")
        elif z == 16:
            seq.append("s")
        else:
            seq.append("c")
    fwd = "".join(seq)
    return min(fwd, fwd[::-1])


def azine(mol: Chem.Mol, n_idx: int) -> tuple[float, str]:
    """Pyridine-type nitrogen in an aromatic ring: pyridines, azines, azoles."""
    ring6 = _ring_of(mol, n_idx, 6)
    if ring6 is not None:
        return _six_ring_n(mol, n_idx, ring6)
    ring5 = _ring_of(mol, n_idx, 5)
    if ring5 is None:
        return 2.0, "class value, aromatic N"
    sig = _ring_signature(mol, ring5, n_idx)
    parent = AZOLE_PARENTS.get(sig)
    if parent is None:
        base, label = (-1.0, "azole with several heteroatoms")
    else:
        base, label = parent
    pka = base
    sigma = 0.0
    ring_set = set(ring5)
    # ring atoms next to the basic N, unless they also sit next to a pyrrole-type ring N (C2 of
    # an imidazole: already inside the amidinium of the cation)
    adjacent = {
        x.GetIdx() for x in mol.GetAtomWithIdx(n_idx).GetNeighbors()
        if x.GetIdx() in ring_set and not any(
            y.GetIdx() in ring_set and y.GetIdx() != n_idx and y.GetAtomicNum() == 7
            and (y.GetDegree() == 3 or y.GetTotalNumHs() > 0)
            for y in x.GetNeighbors()
        )
    }
    pyrrole_n = any(
        mol.GetAtomWithIdx(i).GetAtomicNum() == 7 and i != n_idx
        and (mol.GetAtomWithIdx(i).GetDegree() == 3 or mol.GetAtomWithIdx(i).GetTotalNumHs() > 0)
        for i in ring5
    )
    for idx in ring5:
        if idx == n_idx:
            continue
        atom = mol.GetAtomWithIdx(idx)
        for x in atom.GetNeighbors():
            if x.GetIdx() in ring_set:
                continue
            if atom.GetAtomicNum() == 7:
                pka += _azole_n_substituent(mol, atom, x, beside=mol.GetBondBetweenAtoms(idx, n_idx) is not None)
                continue
            key = classify_substituent(mol, atom, x, ring_set)
            if key == "fused":
                continue
            sm, sp, spm = K.HAMMETT.get(key, (0.0, 0.0, 0.0))
            if key in ("alkyl", "tBu"):
                sigma += _remote_inductive_of(mol, ring_set, atom, x)
            elif key in ("CH2X", "CH2N", "CH2N+"):
                sigma += _remote_inductive_of(mol, ring_set, atom, x, beyond_first=True)
            if idx in adjacent:
                if key in _PI_ACCEPTORS and key not in ("SR", "SH") and pyrrole_n:
                    # conjugated with the lone pair of the ring's pyrrole-type N through the
                    # ring C=C (N1-C5=C4-NO2 seen from N3): a push-pull unit that the cation
                    # loses, so the acceptor acts with sigma_p- (4-nitroimidazole about 0,
                    # against 2.5 for the 5-nitroimidazole metronidazole, from memory)
                    sp = spm
                sigma += sm + K.AZOLE_ADJACENT_RESONANCE * (sp - sm)
            elif key in _PI_DONORS and _across_pyrrole_n(mol, ring5, n_idx, idx):
                sigma += sm + K.AZOLE_ACROSS_DONOR * (sp - sm)
            else:
                sigma += sm
    # benzo (or other aromatic) fusion on the ring's carbons
    fused_atoms = [i for i in ring5 if mol.GetRingInfo().NumAtomRings(i) > 1 and mol.GetAtomWithIdx(i).GetAtomicNum() == 6]
    # only an aromatic ring fused there is a benzo ring: a saturated one (a
    # 4,5,6,7-tetrahydroindazole or -benzimidazole) is two alkyl groups, counted above
    aromatic_fusion = any(
        len(set(r) & set(fused_atoms)) >= 2 and set(r) != ring_set and all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in r)
        for r in mol.GetRingInfo().AtomRings()
    )
    if len(fused_atoms) >= 2 and aromatic_fusion:
        fused = _AZOLE_BENZO - K.AZOLE_RHO * (_fused_aza_sigma(mol, ring5, n_idx) + _fused_ring_sigma(mol, ring5, n_idx))
        # substituents on the fused ring (5-nitrobenzimidazoles) count as for quinolines; with
        # an amino group on the carbon between the basic N and the ring's other heteroatom the
        # cation is a guanidinium-like ion whose charge sits largely outside the ring, and the
        # fused ring acts with a share of its effect (constants.AZOLE_AMIDINE_DONOR_SHARE)
        if _amidine_carbon_donor(mol, ring5, n_idx):
            fused *= K.AZOLE_AMIDINE_DONOR_SHARE
        pka += fused
    return pka - K.AZOLE_RHO * sigma, f"ring class ({label}) with substituent terms"


def _six_ring_n(mol: Chem.Mol, n_idx: int, ring6: list[int]) -> tuple[float, str]:
    """A pyridine-type N in a six-membered aromatic ring: Hammett sum of the ring's
    substituents and aza atoms with pyridinium's rho, the fused rings, and the corrections to
    additivity that constants.py documents one by one."""
    pka = K.PYRIDINE["pka0"]
    donors: list = []
    ortho, sigma = _hammett_sum(
        mol, ring6, n_idx, K.ORTHO_PYRIDINE, default_ortho=-1.0, ring_hetero=0.5, para_minus=None,
        donors=donors, beside_donor=True,
    )
    sigma += _fused_ring_sigma(mol, ring6, n_idx)
    pka += _donor_cross(mol, ring6, n_idx, donors, K.PYRIDINE["rho"])
    # an amino group ortho or para to the N carries much of the cation's charge, and the
    # crowded N-H matters less (4-aminoquinaldines, 2,4-diaminoquinazolines)
    strong_donor = any(
        (kind == "ortho" and term > 0) or (kind == "sigma" and term < -0.3) for _i, kind, term in donors
    )
    # in an amino-diazine the other substituents act with a reduced rho, and a third amino
    # group on a pyrimidine adds less (constants.DIAZINE_RHO_FACTOR, THIRD_AMINO)
    subs_at = list(_ring_substituents_at(mol, ring6, n_idx))
    subs = [(d, key) for d, key, _i in subs_at]
    aza = [d for d, key in subs if key == "aza" and d > 1]
    if strong_donor and aza:
        fixed = sum(K.AZA_SIGMA["meta" if d == 2 else "para"] for d in aza)
        fixed += sum(term for _i, kind, term in donors if kind == "sigma")
        sigma = fixed + K.DIAZINE_RHO_FACTOR * (sigma - fixed)
    amino = sum(1 for _d, key in subs if key in ("NH2", "NHR", "NR2", "NHAr"))
    if len(aza) == 1 and amino > 2:
        pka -= K.THIRD_AMINO * (amino - 2)
    # hydrogen bonds from the groups beside the N (constants.ORTHO_OH_HBOND, LOCKED_NHR)
    for i in _ring_neighbours(mol, ring6, n_idx):
        pka += K.ORTHO_OH_HBOND * _chain_oh(mol, ring6, i) + K.LOCKED_NHR * _locked_nhr(mol, ring6, i, n_idx)
    if not aza:
        pka += _pyridine_non_additivity(subs_at, donors, strong_donor)
    if not strong_donor:
        pka += _peri(mol, ring6, n_idx)
    elif any(kind == "ortho" and term > 0 for _i, kind, term in donors) and not any(
        g.GetIsAromatic() for g in _peri_groups(mol, ring6, n_idx)
    ):
        # with an amino group beside the N, a fused ring beside it on the other side adds to
        # the basicity (2-aminoquinoline, 2-aminoquinazoline): constants.DONOR_FUSED_ORTHO;
        # not when a further ring crowds the N from the peri position (benzo[h]quinoline)
        fused_beside = sum(1 for d, key in subs if d == 1 and key == "fused")
        pka += K.DONOR_FUSED_ORTHO * fused_beside
        if not fused_beside:
            # the same amidine-like unit with the donor on the carbon next to the fusion
            # (1-aminoisoquinoline): the donor-N bond is the ring's alpha-beta bond of high
            # double-bond character (constants.DONOR_ALPHA_ORTHO)
            pka += K.DONOR_ALPHA_ORTHO * sum(
                1 for i, kind, term in donors
                if kind == "ortho" and term > 0 and _next_to_benzo_fusion(mol, ring6, i)
            )
    return pka + ortho - K.PYRIDINE["rho"] * sigma, f"Hammett equation, pyridine-type N (sum sigma {sigma:+.2f})"


def _pyridine_non_additivity(subs_at: list, donors: list, strong_donor: bool) -> float:
    """Corrections to the additive sum on a pyridine ring with no second ring N: a second
    electron-withdrawing group beside the N adds less (constants.SECOND_ORTHO_EWG); with an
    amino group ortho or para to the N, which takes much of the cation's charge, an alkoxy
    group conjugated with the N gives up part of its resonance (ALKOXY_DONOR_LOSS) and an alkyl
    group beside the N adds less (DONOR_ALKYL_ORTHO_SHARE)."""
    out = 0.0
    ortho_ewg = sorted(
        K.ORTHO_PYRIDINE[key] for d, key, _i in subs_at if d == 1 and K.ORTHO_PYRIDINE.get(key, 0.0) < 0 and key != "fused"
    )
    if len(ortho_ewg) >= 2:
        out -= (1 - K.SECOND_ORTHO_EWG) * ortho_ewg[-1]
    if not strong_donor:
        return out
    keys_at = {i: key for _d, key, i in subs_at}
    amino_inc = max(
        (term if kind == "ortho" else -K.PYRIDINE["rho"] * term
         for i, kind, term in donors if keys_at.get(i) in ("NH2", "NHR", "NR2")),
        default=0.0,
    )
    n_alkoxy = sum(1 for d, key, _i in subs_at if key == "OMe" and d in (1, 3))
    out -= K.ALKOXY_DONOR_LOSS * max(amino_inc, 0.0) * n_alkoxy
    alkyl_ortho = sum(K.ORTHO_PYRIDINE[key] for d, key, _i in subs_at if d == 1 and key in ("CH3", "alkyl", "tBu"))
    out -= (1 - K.DONOR_ALKYL_ORTHO_SHARE) * alkyl_ortho
    return out


def _across_pyrrole_n(mol: Chem.Mol, ring5: list[int], n_idx: int, idx: int) -> bool:
    """Ring atom ``idx`` sits next to a pyrrole-type ring N that is itself next to the basic N
    (C5 of a 1-substituted pyrazole seen from N2)."""
    for y in mol.GetAtomWithIdx(idx).GetNeighbors():
        if y.GetIdx() not in ring5 or y.GetAtomicNum() != 7 or y.GetIdx() == n_idx:
            continue
        if (y.GetDegree() == 3 or y.GetTotalNumHs() > 0) and mol.GetBondBetweenAtoms(y.GetIdx(), n_idx):
            return True
    return False


def _amidine_carbon_donor(mol: Chem.Mol, ring5: list[int], n_idx: int) -> bool:
    """An amino group on a ring carbon bonded to the basic N and to the ring's other heteroatom
    (C2 of a 2-aminobenzimidazole, a 2-aminobenzoxazole or an 8-aminopurine)."""
    ring_set = set(ring5)
    for c in mol.GetAtomWithIdx(n_idx).GetNeighbors():
        if c.GetIdx() not in ring_set or c.GetAtomicNum() != 6:
            continue
        if not any(y.GetIdx() in ring_set and y.GetIdx() != n_idx and y.GetAtomicNum() in (7, 8, 16)
                   for y in c.GetNeighbors()):
            continue
        for x in c.GetNeighbors():
            if x.GetIdx() not in ring_set and classify_substituent(mol, c, x, ring_set) in ("NH2", "NHR", "NR2", "NHAr"):
                return True
    return False


def _azole_n_substituent(mol, ring_n: Chem.Atom, x: Chem.Atom, beside: bool = False) -> float:
    """Increment for the group on a pyrrole-type ring N. An alkyl group on the ring N bonded to
    the basic N (N1 of a pyrazole seen from N2) crowds the N-H of the cation: a larger alkyl
    group gains nothing from its sigma* there (1-ethyl- and 1-tert-butylpyrazole are no
    stronger bases than 1-methylpyrazole, as alpha-branching leaves primary amines unchanged),
    while an electron-withdrawing group still counts through it."""
    if x.GetIsAromatic():
        if mol.GetRingInfo().AreAtomsInSameRing(ring_n.GetIdx(), x.GetIdx()):
            return 0.0
        return _AZOLE_N_SUBST["aryl"]
    if x.GetAtomicNum() == 6 and _carbonyl_kind(mol, x):
        return _AZOLE_N_SUBST["acyl"]
    if x.GetAtomicNum() == 16:
        return _AZOLE_N_SUBST["sulfonyl"]
    if x.GetAtomicNum() == 6 and any(b.GetBondType() == Chem.BondType.DOUBLE for b in x.GetBonds()):
        return _AZOLE_N_SUBST["vinyl"]
    if x.GetAtomicNum() == 6:
        star = group_sigma_star(mol, x, ring_n)
        if beside:
            return _AZOLE_N_SUBST["alkyl"] - K.AZOLE_N_RHO_STAR * max(star, 0.0)
        return _AZOLE_N_SUBST["alkyl"] - K.AZOLE_N_RHO_STAR * star
    return 0.0


# --------------------------------------------------------------------------- other classes
def amidine(mol: Chem.Mol, n_idx: int) -> tuple[float, str]:
    n = mol.GetAtomWithIdx(n_idx)
    carbon = None
    for b in n.GetBonds():
        o = b.GetOtherAtom(n)
        if o.GetAtomicNum() != 6 or any(ob.GetBondType() == Chem.BondType.TRIPLE for ob in o.GetBonds()):
            continue  # not the carbon of a nitrile on this N (cyanoguanidines)
        if sum(1 for x in o.GetNeighbors() if x.GetAtomicNum() == 7) >= 2:
            carbon = o
            break
    if carbon is None:
        return 12.0, "class value, amidine"
    nitrogens = [x for x in carbon.GetNeighbors() if x.GetAtomicNum() == 7]
    guanidine = len(nitrogens) >= 3
    pka = 13.6 if guanidine else 12.4
    for x in carbon.GetNeighbors():
        if x.GetAtomicNum() == 7:
            continue
        if x.GetAtomicNum() != 6:
            # a heteroatom on the amidine carbon (chloroformamidine, isourea, isothiourea): its
            # sigma* is that of CH2Z undone by one attenuation step
            key = _hetero_key(mol, x, carbon)
            pka -= 1.4 * K.SIGMA_STAR_Z.get(key, 0.0) / K.ATTENUATION if key else 0.0
            continue
        pka -= 1.4 * group_sigma_star(mol, x, carbon)  # benzamidine 11.6 against acetamidine [P65]
    for m in nitrogens:
        for x in m.GetNeighbors():
            if x.GetIdx() == carbon.GetIdx() or x.GetAtomicNum() == 1:
                continue
            if x.GetIsAromatic():
                pka -= 2.8 if guanidine else 2.5  # phenylguanidine 10.8 [P65]
                ring = _ring_of(mol, x.GetIdx(), 6) or _ring_of(mol, x.GetIdx())
                if ring is not None:
                    # substituents and aza atoms of the N-aryl ring, through the aniline terms
                    o, sg = _aryl_terms(mol, x, ring)
                    pka += (o - K.ANILINE["rho"] * sg) * K.AMIDINE_ARYL_SHARE
            elif x.GetAtomicNum() == 6 and _carbonyl_kind(mol, x):
                pka -= 5.0
            elif x.GetAtomicNum() == 6 and any(b.GetBondType() == Chem.BondType.TRIPLE for b in x.GetBonds()):
                # a cyano group on an amidine N (cyanoguanidines such as cimetidine's): the
                # cation loses the push-pull of N-C#N; cyanoguanidine is about 0 (from memory)
                pka -= 13.6
            elif x.GetAtomicNum() in (15, 16) and any(
                y.GetAtomicNum() == 8 and mol.GetBondBetweenAtoms(x.GetIdx(), y.GetIdx()).GetBondType() == Chem.BondType.DOUBLE
                for y in x.GetNeighbors()
            ):
                # a sulfonyl or phosphoryl group on an amidine N: sulfonylguanidines such as
                # sulfaguanidine are not protonated in water above pH 1 (from memory); our
                # estimate, well beyond the acyl group's 5 units
                pka -= 13.0
            elif x.GetAtomicNum() == 6:
                pka += 0.05 - K.AMIDINE_N_RHO_STAR * group_sigma_star(mol, x, m)
            elif x.GetAtomicNum() in (7, 8):
                pka -= 4.0
    info = mol.GetRingInfo()
    if not guanidine and any(
        len(r) == 5 and carbon.GetIdx() in r and sum(1 for m in nitrogens if m.GetIdx() in r) == 2
        for r in info.AtomRings()
    ):
        pka += K.AMIDINE_RING5
    return pka, "guanidine class value with substituent terms" if guanidine else "amidine class value with substituent terms"


def hydrazine(mol: Chem.Mol, n_idx: int) -> tuple[float, str]:
    n = mol.GetAtomWithIdx(n_idx)
    pka = 8.1
    for x in n.GetNeighbors():
        if x.GetAtomicNum() == 7:
            for y in x.GetNeighbors():
                if y.GetIdx() == n_idx or y.GetAtomicNum() == 1:
                    continue
                if y.GetIsAromatic():
                    pka -= 2.9
                elif y.GetAtomicNum() == 6 and _carbonyl_kind(mol, y):
                    pka -= 4.9  # acetohydrazide 3.24 [P65]
                elif y.GetAtomicNum() == 16:
                    pka -= 5.5
                else:
                    pka -= 0.45
            if any(b.GetBondType() == Chem.BondType.DOUBLE for b in x.GetBonds()):
                pka -= 4.0
            continue
        if x.GetAtomicNum() == 1:
            continue
        if x.GetIsAromatic():
            pka -= 2.9  # phenylhydrazine 5.21 [P65]
        elif x.GetAtomicNum() == 6 and _carbonyl_kind(mol, x):
            pka -= 8.0
        else:
            pka -= 0.25
    if any(b.GetBondType() == Chem.BondType.DOUBLE for b in n.GetBonds()):
        pka = min(pka, 3.0)
    return pka, "hydrazine class value with substituent terms"


def hydroxylamine(mol: Chem.Mol, n_idx: int) -> tuple[float, str]:
    n = mol.GetAtomWithIdx(n_idx)
    if any(b.GetBondType() == Chem.BondType.DOUBLE for b in n.GetBonds()):
        return 1.0, "class value, oxime"
    pka = 5.96
    for x in n.GetNeighbors():
        if x.GetAtomicNum() == 8:
            if any(y.GetAtomicNum() == 6 for y in x.GetNeighbors()):
                pka -= 1.36  # O-methylhydroxylamine 4.60 [P65]
        elif x.GetIsAromatic():
            pka -= 3.9
        elif x.GetAtomicNum() == 6 and _carbonyl_kind(mol, x):
            pka -= 6.0
    return pka, "hydroxylamine class value with substituent terms"


def imine(mol: Chem.Mol, n_idx: int) -> tuple[float, str]:
    n = mol.GetAtomWithIdx(n_idx)
    carbon = [b.GetOtherAtom(n) for b in n.GetBonds() if b.GetBondType() == Chem.BondType.DOUBLE]
    if carbon and carbon[0].GetIsAromatic() and any(
        x.GetAtomicNum() == 7 and x.GetIsAromatic() for x in carbon[0].GetNeighbors()
    ):
        # =N on a ring carbon next to a ring N-R: an amidine held in a ring (2-iminopyridine
        # type, protonation gives an aminopyridinium); ring substituents as for pyridines
        c = carbon[0]
        ring = _ring_of(mol, c.GetIdx(), 6) or _ring_of(mol, c.GetIdx())
        sigma = 0.0
        pka = 13.0
        if ring:
            # the ring N-R of the amidine (next to the =N carbon, or para to it in a
            # 4-iminopyrimidine) carries part of the cation's charge (the aminopyridinium
            # form): a pi-donor ortho or para to it conjugates with that charge and acts with
            # a share of its resonance part (constants.IMINE_RING_N_DONOR)
            ring_n = [
                i for i in ring
                if mol.GetAtomWithIdx(i).GetAtomicNum() == 7
                and (mol.GetAtomWithIdx(i).GetDegree() == 3 or mol.GetAtomWithIdx(i).GetTotalNumHs() > 0)
            ]
            from_n = _ordered_positions(ring, ring_n[0]) if ring_n else {}
            beside_c = {x.GetIdx() for x in c.GetNeighbors()}
            for d, key, idx in _ring_substituents_at(mol, ring, c.GetIdx()):
                if key in ("aza", "ring_nR", "oxo") or key.startswith("ring_"):
                    sigma += K.IMINE_AZA if key == "aza" else 0.0
                    continue
                if key in _PI_DONORS and from_n.get(idx) in (1, 3) and idx not in beside_c:
                    sm, sp, _ = K.HAMMETT.get(key, (0.0, 0.0, 0.0))
                    sigma += sm + K.IMINE_RING_N_DONOR * (sp - sm)
                    continue
                sigma += _sigma_for(key, 2 if d == 1 else d, False)
            # the group on the ring N of the amidine (benzyl, propargyl) against the N-methyl of
            # the parent: it is an amidine N, with the same rho* as an open-chain one
            for rn in c.GetNeighbors():
                if rn.GetIdx() in ring and rn.GetAtomicNum() == 7 and rn.GetDegree() == 3:
                    for x in rn.GetNeighbors():
                        if x.GetIdx() not in ring and x.GetAtomicNum() == 6 and not x.GetIsAromatic():
                            pka -= K.AMIDINE_N_RHO_STAR * group_sigma_star(mol, x, rn)
        pka -= 4.5 * sigma
        for x in n.GetNeighbors():
            if x.GetIdx() != c.GetIdx() and x.GetAtomicNum() == 6 and not x.GetIsAromatic():
                pka += 0.05 - K.AMIDINE_N_RHO_STAR * group_sigma_star(mol, x, n)
        return pka, "class value, cyclic amidine (imine on an N-heterocycle)"
    if any(x.GetIsAromatic() for x in n.GetNeighbors()):
        return 2.8, "class value, N-aryl imine"
    carbon = [b.GetOtherAtom(n) for b in n.GetBonds() if b.GetBondType() == Chem.BondType.DOUBLE][0]
    aryls = [x for x in carbon.GetNeighbors() if x.GetIsAromatic()]
    conj = bool(aryls)
    pka = 6.9 if conj else 9.0
    label = "class value, imine, with the sigma* of an electron-withdrawing N-substituent"
    if len(aryls) >= 2:
        # a diaryl ketimine (the C=N of a 1,4-benzodiazepine): the groups on both aryl rings
        # act through a Hammett term (an ortho group with its sigma_p), on top of the sigma*
        # of the N-substituent below. K.DIARYL_IMINE_* were fitted on diazepam (3.4) and
        # medazepam (6.2), whose N1 is an amide N in one and an amine N in the other
        sigma = 0.0
        for ipso in aryls:
            ring = _ring_of(mol, ipso.GetIdx(), 6) or _ring_of(mol, ipso.GetIdx())
            if not ring:
                continue
            for d, key, _idx in _ring_substituents_at(mol, ring, ipso.GetIdx()):
                if key not in K.HAMMETT or key == "fused":
                    continue
                sm, sp, _ = K.HAMMETT[key]
                sigma += sp if d in (1, 3) else sm
        pka = K.DIARYL_IMINE_PKA0 - K.DIARYL_IMINE_RHO * sigma
        label = f"diaryl ketimine model (Hammett on both aryl rings, sum sigma {sigma:+.2f}; sigma* of the N-substituent)"
    # an electron-withdrawing group on the imine N (the CH2-C(=O) of a 1,4-benzodiazepine)
    # through its sigma*, with the tertiary-amine rho* [PDS]: the iminium, like a tertiary
    # ammonium ion, has one N-H. Alkyl groups keep the class value.
    for x in n.GetNeighbors():
        if x.GetIdx() != carbon.GetIdx() and x.GetAtomicNum() == 6:
            pka -= K.TAFT_AMINE["tertiary"][1] * max(group_sigma_star(mol, x, n), 0.0)
    return pka, label


def statistical(n_equivalent: int) -> float:
    return math.log10(max(n_equivalent, 1))
