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


from ..reading.reaction import Reaction
from .graph import bond_order, graph_of
from .mapping import Atom, AtomMap

__all__ = ["BondChange", "Centre", "bond_order", "reaction_centre"]


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
    graphs = {c.index: graph_of(c) for c in comps}
    origin = amap.origin
    image_of = amap.image
    changes: list[BondChange] = []
    seen_before: set[tuple[Atom, Atom]] = set()
    # product side: every bond between two mapped product atoms
    for p in rxn.products:
        pg = graphs[p.index]
        for i, j, after_order in pg.bonds:
            pa, pb = (p.index, i), (p.index, j)
            oa, ob = origin(*pa), origin(*pb)
            if oa is None or ob is None:
                continue
            before = graphs[oa[0]].order.get((oa[1], ob[1])) if oa[0] == ob[0] else None
            els = tuple(sorted((pg.symbol[i], pg.symbol[j])))
            pair_before = _pair(oa, ob)
            seen_before.add(pair_before)
            if before is None:
                changes.append(BondChange("formed", pair_before, _pair(pa, pb), els, 0.0, after_order))
            elif before != after_order:
                changes.append(BondChange("order", pair_before, _pair(pa, pb), els, before, after_order))
    # origin side: bonds of contributing components that do not survive. A partial map (a
    # chemist's map of the centre only, or a mapper's incomplete one) leaves atoms unmapped
    # that did reach a product: they are matched to unmapped product atoms by growing the map
    # along bonds of the same elements and order, and a bond to one of them is not broken.
    implied = _implied(rxn, amap, graphs) if amap.coverage < 1 else {}

    def image(a: Atom) -> Atom | None:
        return image_of(*a) or implied.get(a)

    for ci in sorted(amap.contributing):
        g = graphs[ci]
        for i, j, o in g.bonds:
            ra, rb = (ci, i), (ci, j)
            if image_of(ci, i) is None and image_of(ci, j) is None:
                continue
            pair = _pair(ra, rb)
            if pair in seen_before:
                continue
            ia, ib = image(ra), image(rb)
            if ia is not None and ib is not None and ia[0] == ib[0] and (ia[1], ib[1]) in graphs[ia[0]].order:
                # both ends reach a product, bonded (through an implied atom, or a second image)
                continue
            after = _pair(ia, ib) if ia is not None and ib is not None else None
            els = tuple(sorted((g.symbol[i], g.symbol[j])))
            changes.append(BondChange("broken", pair, after, els, o, 0.0))
    h_changes: list[tuple[Atom, int]] = []
    q_changes: list[tuple[Atom, int]] = []
    for p_atom, o_atom in amap.pairs:
        pg, og = graphs[p_atom[0]], graphs[o_atom[0]]
        if pg.z[p_atom[1]] <= 1:
            continue
        dh = pg.hs[p_atom[1]] - og.hs[o_atom[1]]
        if dh:
            h_changes.append((o_atom, dh))
        dq = pg.charge[p_atom[1]] - og.charge[o_atom[1]]
        if dq:
            q_changes.append((o_atom, dq))
    leaving = []
    for ci in sorted(amap.contributing):
        g = graphs[ci]
        gone = tuple(
            i for i, z in enumerate(g.z)
            if z > 1 and image_of(ci, i) is None and (ci, i) not in implied
        )
        if gone:
            leaving.append((ci, gone))
    order = {"broken": 0, "formed": 1, "order": 2}
    changes.sort(key=lambda c: (order[c.kind], c.atoms_before or (), c.atoms_after or ()))
    return Centre(tuple(changes), tuple(sorted(h_changes)), tuple(sorted(q_changes)), tuple(leaving))


def _implied(rxn: Reaction, amap: AtomMap, graphs) -> dict[Atom, Atom]:
    """Unmapped reactant atoms matched to unmapped product atoms, grown from the mapped pairs
    along bonds of the same order between atoms of the same element (first match wins)."""
    taken_p = {p for p, _ in amap.pairs}
    out: dict[Atom, Atom] = {}
    queue = [(o, p) for p, o in amap.pairs]
    while queue:
        (rc, ra), (pc, pa) = queue.pop()
        rg, pg = graphs[rc], graphs[pc]
        for rb in rg.neighbours[ra]:
            rkey = (rc, rb)
            if rg.z[rb] <= 1 or rkey in out or amap.image(*rkey) is not None:
                continue
            r_order = rg.order[(ra, rb)]
            for pb in pg.neighbours[pa]:
                pkey = (pc, pb)
                if pkey in taken_p or pg.z[pb] != rg.z[rb]:
                    continue
                if pg.order[(pa, pb)] != r_order:
                    continue
                out[rkey] = pkey
                taken_p.add(pkey)
                queue.append((rkey, pkey))
                break
    return out
