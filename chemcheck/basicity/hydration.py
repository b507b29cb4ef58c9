"""Covalent hydration of the cations of fused pyrimidines (quinazolines, pteridines).

Water adds across the C=N bond of a ring C-H that lies next to a ring fusion atom and whose
ring N is followed by an N-C=N unit (C4 of quinazoline, C4 of pteridine): the hydrated cation is
a cyclic amidinium and far more basic than the aromatic one. A carbon there that carries a
carbonyl, nitrile or CX3 group instead of H takes the water as well (such groups favour the
hydrates of aldehydes and ketones); an alkyl or aryl group blocks it. The measured (equilibrium) pKa is
then

    pKa = log10((10**pKa_anhydrous + Kn * 10**pKa_hydrate) / (1 + Kn))

with Kn the hydration constant of the neutral base (A. Albert, W. L. F. Armarego and
E. Spinner, J. Chem. Soc. 1961, 2689 and later papers; the treatment is textbook, see
Perrin, Dempsey & Serjeant 1981, ch. 9). Both pKa values come from chemcheck's own models: the
aromatic site as usual, the hydrate through the amidine model on the molecule with water added.
Kn is one constant, from quinazoline (constants.HYDRATION_LOG_KN).
"""

from __future__ import annotations

from dataclasses import dataclass

from rdkit import Chem

from .. import _rdlog
from .model import is_aza


@dataclass(frozen=True)
class HydrationSite:
    carbon: int  # the ring C-H that takes the OH
    n_added: int  # the ring N that takes the H (N3 of quinazoline)
    amidine_c: int
    amidine_n: int  # the =N of the hydrated cation's amidine, where its proton goes
    ring: tuple[int, ...]


def _in_other_aromatic_ring(mol: Chem.Mol, atom: Chem.Atom, ring: set[int]) -> bool:
    return any(
        atom.GetIdx() in r and set(r) != ring and all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in r)
        for r in mol.GetRingInfo().AtomRings()
    )


def _plain_amidine_carbon(cb: Chem.Atom, ring: set[int]) -> bool:
    """C2 carries no halogen or halogenated carbon: with one there the hydrated cation is too
    weak a base to matter (2-chloro-, 2-trifluoromethylquinazoline). An amino, alkoxy or
    alkylthio group at C2 is allowed: it raises the aromatic cation's pKa, and the hydration
    constant, which falls as that pKa rises (constants.HYDRATION_SLOPE), then leaves the
    hydrate little weight in quinazolines (Albert: such groups suppress the hydration there),
    while the far more electron-poor pteridines still hydrate (until the sixth round such groups
    blocked the hydration outright)."""
    for x in cb.GetNeighbors():
        if x.GetIdx() in ring:
            continue
        if x.GetAtomicNum() in (9, 17, 35, 53):
            return False
        if x.GetAtomicNum() != 6:
            continue
        if any(y.GetAtomicNum() in (9, 17, 35, 53) for y in x.GetNeighbors()):
            return False
    return True


def _takes_water(c: Chem.Atom, ring: set[int]) -> bool:
    """The ring carbon can take the OH: it carries H, or an electron-withdrawing carbon group
    (carbonyl, nitrile, CX3) that makes it more electrophilic, as such groups favour the
    hydrates of aldehydes and ketones (chloral, trifluoroacetone, alpha-keto esters)."""
    if c.GetTotalNumHs(includeNeighbors=True) == 1:
        return True
    if c.GetTotalNumHs(includeNeighbors=True) != 0:
        return False
    out = [x for x in c.GetNeighbors() if x.GetIdx() not in ring]
    if len(out) != 1 or out[0].GetAtomicNum() != 6 or out[0].GetIsAromatic():
        return False
    x = out[0]
    if any(b.GetBondType() in (Chem.BondType.DOUBLE, Chem.BondType.TRIPLE) and b.GetOtherAtom(x).GetAtomicNum() in (7, 8)
           for b in x.GetBonds()):
        return True
    return sum(1 for y in x.GetNeighbors() if y.GetAtomicNum() in (9, 17)) >= 3


def hydration_sites(mol: Chem.Mol) -> list[HydrationSite]:
    """Ring C-H positions that hydrate in the cation (see the module docstring)."""
    info = mol.GetRingInfo()
    out = []
    for c in mol.GetAtoms():
        if not (c.GetAtomicNum() == 6 and c.GetIsAromatic() and info.NumAtomRings(c.GetIdx()) == 1):
            continue
        ring = next(r for r in info.AtomRings() if c.GetIdx() in r)
        if not _takes_water(c, set(ring)):
            continue
        if len(ring) != 6 or not all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in ring):
            continue
        ring_set = set(ring)

        def in_ring(a: Chem.Atom) -> list[Chem.Atom]:
            return [x for x in a.GetNeighbors() if x.GetIdx() in ring_set]

        nbrs = in_ring(c)
        if not any(_in_other_aromatic_ring(mol, x, ring_set) for x in nbrs):
            continue
        for na in (x for x in nbrs if is_aza(x)):
            cb = next((x for x in in_ring(na) if x.GetIdx() != c.GetIdx()), None)
            if cb is None or cb.GetAtomicNum() != 6 or info.NumAtomRings(cb.GetIdx()) > 1:
                continue
            nb = next((x for x in in_ring(cb) if x.GetIdx() != na.GetIdx() and is_aza(x)), None)
            if nb is not None and _plain_amidine_carbon(cb, ring_set):
                out.append(HydrationSite(c.GetIdx(), na.GetIdx(), cb.GetIdx(), nb.GetIdx(), tuple(ring)))
    return out


def hydrate(mol: Chem.Mol, site: HydrationSite) -> Chem.Mol | None:
    """The molecule with water added across C=N at ``site`` (atom indices kept; the O is
    appended). None when the result does not sanitize."""
    info = mol.GetRingInfo()
    ring_set = set(site.ring)
    fusion = {i for i in site.ring if info.NumAtomRings(i) >= 2}
    rw = Chem.RWMol(mol)
    for i in (site.carbon, site.n_added, site.amidine_c, site.amidine_n):
        rw.GetAtomWithIdx(i).SetIsAromatic(False)
    for b in rw.GetBonds():
        i, j = b.GetBeginAtomIdx(), b.GetEndAtomIdx()
        if i in ring_set and j in ring_set and not (i in fusion and j in fusion):
            b.SetIsAromatic(False)
            double = {i, j} == {site.amidine_c, site.amidine_n}
            b.SetBondType(Chem.BondType.DOUBLE if double else Chem.BondType.SINGLE)
    o = rw.AddAtom(Chem.Atom(8))
    rw.AddBond(site.carbon, o, Chem.BondType.SINGLE)
    for i in (site.carbon, site.n_added):
        a = rw.GetAtomWithIdx(i)
        a.SetNoImplicit(False)
        a.SetNumExplicitHs(0)
    out = rw.GetMol()
    with _rdlog.captured():
        try:
            Chem.SanitizeMol(out)
        except Exception:  # noqa: BLE001 - an unusual ring system: no hydration considered
            return None
    return out
