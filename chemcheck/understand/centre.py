"""The reaction centre: the bonds an atom map says were formed, broken or changed in order.

Reading a map (:func:`chemcheck.understand.mapping.map_reaction`) bond by bond:

* a product bond between two mapped atoms whose origins were not bonded is *formed*;
* a bond of a contributing component, with at least one end mapped, that is not found
  between the images of its ends is *broken* (a bond to a leaving atom counts: the C-Cl of an
  acid chloride that gives an amide);
* a bond present on both sides with another order is an *order* change (aromatic = 1.5).

Hydrogens are implicit: a change in hydrogen count is reported per atom (``h_changes``), as
are formal charges. Only mapped atoms count: a bond with both ends unmapped tells nothing.
Pure RDKit.
"""

from __future__ import annotations

from dataclasses import dataclass

from rdkit import Chem

from ..reading.reaction import Reaction
from .mapping import Atom, AtomMap

__all__ = ["BondChange", "Centre", "reaction_centre"]


@dataclass(frozen=True)
class BondChange:
    """One bond change.

    ``atoms_before`` names the two atoms in the reactants/agents (for a formed bond: the two
    atoms that become bonded, not bonded before), ``atoms_after`` the two atoms in the products
    (for a broken bond: their images when both ends reach a product, else None).
    """

    kind: str  # "formed", "broken", "order"
    atoms_before: tuple[Atom, Atom] | None
    atoms_after: tuple[Atom, Atom] | None
    elements: tuple[str, str]  # element symbols, sorted
    order_before: float  # 0 when formed
    order_after: float  # 0 when broken


@dataclass(frozen=True)
class Centre:
    changes: tuple[BondChange, ...]
    h_changes: tuple[tuple[Atom, int], ...]  # (origin atom, change in hydrogen count), mapped atoms
    charge_changes: tuple[tuple[Atom, int], ...]  # (origin atom, change in formal charge)
    leaving: tuple[tuple[int, tuple[int, ...]], ...]  # (contributing comp, heavy atoms reaching no product)

    def formed(self) -> tuple[BondChange, ...]:
        return tuple(c for c in self.changes if c.kind == "formed")

    def broken(self) -> tuple[BondChange, ...]:
        return tuple(c for c in self.changes if c.kind == "broken")

    def order_changed(self) -> tuple[BondChange, ...]:
        return tuple(c for c in self.changes if c.kind == "order")

    def atoms(self) -> frozenset[Atom]:
        """Reactant/agent atoms at the centre: ends of changed bonds, atoms that gain or lose
        hydrogens or charge."""
        out: set[Atom] = set()
        for c in self.changes:
            if c.atoms_before is not None:
                out.update(c.atoms_before)
        out.update(a for a, _ in self.h_changes)
        out.update(a for a, _ in self.charge_changes)
        return frozenset(out)

    def product_atoms(self) -> frozenset[Atom]:
        """Product atoms at the centre."""
        out: set[Atom] = set()
        for c in self.changes:
            if c.atoms_after is not None:
                out.update(c.atoms_after)
        return frozenset(out)

    def __bool__(self) -> bool:
        return bool(self.changes or self.h_changes or self.charge_changes)


def bond_order(bond: Chem.Bond | None) -> float:
    """Bond order as a number: aromatic 1.5, dative 1, none 0."""
    if bond is None:
        return 0.0
    t = bond.GetBondType()
    if t == Chem.BondType.AROMATIC or bond.GetIsAromatic():
        return 1.5
    if t == Chem.BondType.DATIVE:
        return 1.0
    return float(bond.GetBondTypeAsDouble())


def _bond(rxn: Reaction, a: Atom, b: Atom) -> Chem.Bond | None:
    if a[0] != b[0]:
        return None
    return rxn.components[a[0]].mol.GetBondBetweenAtoms(a[1], b[1])


def _symbol(rxn: Reaction, a: Atom) -> str:
    return rxn.components[a[0]].mol.GetAtomWithIdx(a[1]).GetSymbol()


def _pair(x: Atom, y: Atom) -> tuple[Atom, Atom]:
    return (x, y) if x <= y else (y, x)


def reaction_centre(rxn: Reaction, amap: AtomMap) -> Centre:
    """The bonds formed, broken and changed in order, and per-atom hydrogen and charge changes,
    that ``amap`` implies for ``rxn``."""
    memo = getattr(amap, "_centre", None)
    if memo and memo[0] is rxn:
        return memo[1]
    centre = _reaction_centre(rxn, amap)
    if memo is not None:
        memo[:] = [rxn, centre]
    return centre


def _reaction_centre(rxn: Reaction, amap: AtomMap) -> Centre:
    comps = rxn.components
    changes: list[BondChange] = []
    seen_before: set[tuple[Atom, Atom]] = set()
    # product side: every bond between two mapped product atoms
    for p in rxn.products:
        for b in p.mol.GetBonds():
            pa, pb = (p.index, b.GetBeginAtomIdx()), (p.index, b.GetEndAtomIdx())
            oa, ob = amap.origin(*pa), amap.origin(*pb)
            if oa is None or ob is None:
                continue
            before = _bond(rxn, oa, ob)
            after_order = bond_order(b)
            els = tuple(sorted((_symbol(rxn, pa), _symbol(rxn, pb))))
            pair_before = _pair(oa, ob)
            seen_before.add(pair_before)
            if before is None:
                changes.append(BondChange("formed", pair_before, _pair(pa, pb), els, 0.0, after_order))
            else:
                ob_order = bond_order(before)
                if ob_order != after_order:
                    changes.append(BondChange("order", pair_before, _pair(pa, pb), els, ob_order, after_order))
    # origin side: bonds of contributing components that do not survive. A partial map (a
    # chemist's map of the centre only, or a mapper's incomplete one) leaves atoms unmapped
    # that did reach a product: they are matched to unmapped product atoms by growing the map
    # along bonds of the same elements and order, and a bond to one of them is not broken.
    implied = _implied(rxn, amap) if amap.coverage < 1 else {}

    def image(a: Atom) -> Atom | None:
        return amap.image(*a) or implied.get(a)

    for ci in sorted(amap.contributing):
        mol = comps[ci].mol
        for b in mol.GetBonds():
            ra, rb = (ci, b.GetBeginAtomIdx()), (ci, b.GetEndAtomIdx())
            if amap.image(*ra) is None and amap.image(*rb) is None:
                continue
            pair = _pair(ra, rb)
            if pair in seen_before:
                continue
            ia, ib = image(ra), image(rb)
            if ia is not None and ib is not None and _bond(rxn, ia, ib) is not None:
                # both ends reach a product, bonded (through an implied atom, or a second image)
                continue
            after = _pair(ia, ib) if ia is not None and ib is not None else None
            els = tuple(sorted((_symbol(rxn, ra), _symbol(rxn, rb))))
            changes.append(BondChange("broken", pair, after, els, bond_order(b), 0.0))
    h_changes: list[tuple[Atom, int]] = []
    q_changes: list[tuple[Atom, int]] = []
    for p_atom, o_atom in amap.pairs:
        pa = comps[p_atom[0]].mol.GetAtomWithIdx(p_atom[1])
        oa = comps[o_atom[0]].mol.GetAtomWithIdx(o_atom[1])
        if pa.GetAtomicNum() <= 1:
            continue
        dh = _hs(pa) - _hs(oa)
        if dh:
            h_changes.append((o_atom, dh))
        dq = pa.GetFormalCharge() - oa.GetFormalCharge()
        if dq:
            q_changes.append((o_atom, dq))
    leaving = []
    for ci in sorted(amap.contributing):
        gone = tuple(
            a.GetIdx()
            for a in comps[ci].mol.GetAtoms()
            if a.GetAtomicNum() > 1 and amap.image(ci, a.GetIdx()) is None and (ci, a.GetIdx()) not in implied
        )
        if gone:
            leaving.append((ci, gone))
    order = {"broken": 0, "formed": 1, "order": 2}
    changes.sort(key=lambda c: (order[c.kind], c.atoms_before or (), c.atoms_after or ()))
    return Centre(tuple(changes), tuple(sorted(h_changes)), tuple(sorted(q_changes)), tuple(leaving))


def _implied(rxn: Reaction, amap: AtomMap) -> dict[Atom, Atom]:
    """Unmapped reactant atoms matched to unmapped product atoms, grown from the mapped pairs
    along bonds of the same order between atoms of the same element (first match wins)."""
    comps = rxn.components
    taken_p = {p for p, _ in amap.pairs}
    out: dict[Atom, Atom] = {}
    queue = [(o, p) for p, o in amap.pairs]
    while queue:
        (rc, ra), (pc, pa) = queue.pop()
        rmol, pmol = comps[rc].mol, comps[pc].mol
        for rb in rmol.GetAtomWithIdx(ra).GetNeighbors():
            rkey = (rc, rb.GetIdx())
            if amap.image(*rkey) is not None or rkey in out or rb.GetAtomicNum() <= 1:
                continue
            r_order = bond_order(rmol.GetBondBetweenAtoms(ra, rb.GetIdx()))
            for pb in pmol.GetAtomWithIdx(pa).GetNeighbors():
                pkey = (pc, pb.GetIdx())
                if pkey in taken_p or pb.GetAtomicNum() != rb.GetAtomicNum():
                    continue
                if bond_order(pmol.GetBondBetweenAtoms(pa, pb.GetIdx())) != r_order:
                    continue
                out[rkey] = pkey
                taken_p.add(pkey)
                queue.append((rkey, pkey))
                break
    return out


def _hs(atom: Chem.Atom) -> int:
    try:
        return atom.GetTotalNumHs(includeNeighbors=True)
    except RuntimeError:  # a partly sanitized molecule without implicit counts
        return atom.GetNumExplicitHs()
