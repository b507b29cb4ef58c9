"""Which atoms change between reactants and products, with or without atom maps.

With atom maps, a reactant atom and a product atom of the same map number are the same atom.
Without them, each product is compared with each reactant by their maximum common
substructure (RDKit FMCS: elements and bond orders compared, ring atoms matched to ring
atoms only, bounded by a timeout), which maps the reactant's atoms onto the product; a mapped
atom that has more heavy neighbours in the product than in the reactant has formed a new bond,
and its new neighbours that lie outside the common part are the partner atoms.
"""

from __future__ import annotations

from dataclasses import dataclass

from rdkit import Chem
from rdkit.Chem import rdFMCS

from . import _rdlog
from ._memo import Memo
from .perceive import canonical_key
from .reading.reaction import Reaction

__all__ = ["NewBond", "new_bonds_at_nitrogen", "new_bonds_from_map", "atom_correspondence"]

MCS_TIMEOUT_S = 1
_TERMINAL_HALOGEN = Chem.MolFromSmarts("[#17,#35,#53;D1]")
_TERMINAL_HETERO = Chem.MolFromSmarts("[#7,#8,#16,#17,#35,#53;D1]")


@dataclass(frozen=True)
class NewBond:
    reactant: int  # component index
    reactant_atom: int
    product: int
    product_atom: int
    partners: tuple[int, ...]  # product atom indices bound to the atom in the product only
    charge_before: int
    charge_after: int
    heavy_before: int
    heavy_after: int
    kind_before: str = ""
    kind_after: str = ""


_PLACED = Memo(2048)  # (reactant SMILES, product SMILES, product atoms held) -> placement


def _mcs_map(r_mol: Chem.Mol, r_key: tuple, p_mol: Chem.Mol, p_key: tuple, avoid: frozenset = frozenset()) -> tuple[tuple[int, int], ...]:
    """Pairs (reactant atom, product atom), both in canonical atom order (``r_key`` and
    ``p_key`` from :func:`canonical_key`), of the closest placement of the reactant's common
    part in the product, on product atoms outside ``avoid`` (those another reactant holds).
    Remembered by the two canonical SMILES, so the answer does not depend on how either was
    drawn; the molecules are renumbered into that order, not parsed again."""
    key = (r_key[0], p_key[0], avoid)
    hit = _PLACED.get(key)
    if hit is None:
        with _rdlog.captured():
            r = Chem.RenumberAtoms(r_mol, r_key[1])
            p = Chem.RenumberAtoms(p_mol, p_key[1])
            hit = _PLACED.put(key, _placement(r, p, avoid))
    return hit


def _placement(r: Chem.Mol, p: Chem.Mol, avoid: frozenset) -> tuple[tuple[int, int], ...]:
    """The placement of ``r`` in ``p``: a salt or hydrate by its largest part."""
    if r.GetNumAtoms() < 2:
        return ()
    frags = Chem.GetMolFrags(r)
    if len(frags) == 1:
        return _place(r, p, avoid)
    # a salt or a hydrate: its largest part is placed (a counter-ion that reaches the
    # product, the ammonium of NH4SCN, is completed from its neighbours or by the mapper)
    keep = max(frags, key=lambda f: (sum(1 for i in f if r.GetAtomWithIdx(i).GetAtomicNum() > 1), len(f)))
    if len(keep) < 2:
        return ()
    part = Chem.RWMol(r)
    for i in sorted(set(range(r.GetNumAtoms())) - set(keep), reverse=True):
        part.RemoveAtom(i)
    part = part.GetMol()
    part.UpdatePropertyCache(strict=False)
    Chem.FastFindRings(part)
    back = sorted(keep)
    return tuple((back[a], b) for a, b in _place(part, p, avoid))


def _place(r: Chem.Mol, p: Chem.Mol, avoid: frozenset) -> tuple[tuple[int, int], ...]:
    """The closest placement of ``r`` (one connected molecule), or of its largest common part,
    in ``p``, on product atoms outside ``avoid``."""

    rdh, pdh = _degree_and_hs(r), _degree_and_hs(p)

    def cost(rm, pm) -> int:
        return sum(abs(rdh[a][0] - pdh[b][0]) + abs(rdh[a][1] - pdh[b][1]) for a, b in zip(rm, pm))

    def best_of(r, p, rm, placements):
        free = [pm for pm in placements if not avoid.intersection(pm)]
        if len(free) < 2:
            return free[0] if free else None
        return min(free, key=lambda pm: cost(rm, pm))

    with _rdlog.captured():
        # the whole reactant inside the product (an amine that is acylated or alkylated): the
        # common substructure is the reactant itself, found without the MCS search
        whole = p.GetSubstructMatches(r, uniquify=False, maxMatches=200)
        rm = tuple(range(r.GetNumAtoms()))
        best = best_of(r, p, rm, whole)
        if best is not None:
            return tuple(zip(rm, best))
        # the reactant without one terminal halogen (an acid or sulfonyl chloride, an alkyl
        # halide that has reacted): again no search is needed
        if r.GetNumAtoms() >= 3:
            for (x,) in r.GetSubstructMatches(_TERMINAL_HALOGEN):
                rm, core = _without(r, x)
                best = best_of(r, p, rm, p.GetSubstructMatches(core, uniquify=False, maxMatches=200))
                if best is not None:
                    return tuple(zip(rm, best))
        # the reactant's whole skeleton with other bond orders (a C=C, C#C, C#N, C=O or aromatic
        # ring reduced, an alcohol oxidised): elements and connections compared, any bond
        found = p.GetSubstructMatches(_skeleton(r), uniquify=False, maxMatches=200)
        rm = tuple(range(r.GetNumAtoms()))
        best = best_of(r, p, rm, found)
        if best is not None:
            return tuple(zip(rm, best))
        # the reactant without one terminal N, O or S (the OH of an acid coupled to an amine,
        # the O of a ketone or amide that leaves in a condensation, the NH2 of a diazotisation),
        # its bonds as drawn, then free: the closest placement of all of them
        if r.GetNumAtoms() >= 3:
            for generic in (False, True):
                options = []
                for (x,) in r.GetSubstructMatches(_TERMINAL_HETERO):
                    rm, core = _without(r, x)
                    query = _skeleton(core) if generic else core
                    for pm in p.GetSubstructMatches(query, uniquify=False, maxMatches=200):
                        if not avoid.intersection(pm):
                            options.append((cost(rm, pm), rm, pm))
                if options:
                    _, rm, pm = min(options, key=lambda o: o[0])
                    return tuple(zip(rm, pm))
        res = rdFMCS.FindMCS(
            [r, p],
            timeout=MCS_TIMEOUT_S,
            atomCompare=rdFMCS.AtomCompare.CompareElements,
            bondCompare=rdFMCS.BondCompare.CompareOrder,
            ringMatchesRingOnly=True,
            completeRingsOnly=False,
            matchValences=False,
        )
        if not res.smartsString or res.numAtoms < max(2, int(0.5 * r.GetNumHeavyAtoms())):
            return ()
        q = Chem.MolFromSmarts(res.smartsString)
        if q is None:
            return ()
        rm = r.GetSubstructMatch(q)
        pms = p.GetSubstructMatches(q, uniquify=False, maxMatches=200)
    if not rm or not pms:
        return ()
    best = best_of(r, p, rm, pms)
    return tuple(zip(rm, best)) if best is not None else ()


def _without(mol: Chem.Mol, x: int) -> tuple[tuple[int, ...], Chem.Mol]:
    """``mol`` without atom ``x``, and the indices in ``mol`` of the atoms it keeps."""
    core = Chem.RWMol(mol)
    core.RemoveAtom(x)
    core = core.GetMol()
    core.UpdatePropertyCache(strict=False)
    Chem.FastFindRings(core)
    return tuple(i for i in range(mol.GetNumAtoms()) if i != x), core


def _skeleton(mol: Chem.Mol) -> Chem.Mol:
    """``mol`` as a query whose bonds match any bond (atoms keep their element)."""
    params = Chem.AdjustQueryParameters.NoAdjustments()
    params.makeBondsGeneric = True
    params.aromatizeIfPossible = False
    return Chem.AdjustQueryProperties(mol, params)


def _degree_and_hs(mol: Chem.Mol) -> list[tuple[int, int]]:
    """(neighbours, hydrogens) of every atom, read once: the closest placement changes the
    fewest of them (principle of minimal chemical distance)."""
    out = []
    for i in range(mol.GetNumAtoms()):
        a = mol.GetAtomWithIdx(i)
        out.append((a.GetDegree(), a.GetTotalNumHs()))
    return out


def atom_correspondence(reaction: Reaction) -> dict[tuple[int, int], tuple[int, int]]:
    """(reactant component, atom) -> (product component, atom); computed once per reaction."""
    cached = getattr(reaction, "_correspondence", None)
    if cached is not None:
        return cached
    out = _correspondence(reaction)
    reaction._correspondence = out
    return out


def _correspondence(reaction: Reaction) -> dict[tuple[int, int], tuple[int, int]]:
    out: dict[tuple[int, int], tuple[int, int]] = {}
    if reaction.mapped:
        prod_by_map = {}
        for p in reaction.products:
            for a in p.mol.GetAtoms():
                if a.GetAtomMapNum():
                    prod_by_map[a.GetAtomMapNum()] = (p.index, a.GetIdx())
        for r in reaction.reactants:
            for a in r.mol.GetAtoms():
                if a.GetAtomMapNum() and a.GetAtomMapNum() in prod_by_map:
                    out[(r.index, a.GetIdx())] = prod_by_map[a.GetAtomMapNum()]
        return out
    found: list[tuple[int, int, tuple]] = []  # (reactant, product, pairs)
    keys: dict[int, tuple] = {}  # component -> canonical key
    for r in reaction.reactants:
        if r.sanitization != "full":
            continue
        best: tuple[int, tuple] | None = None
        for p in reaction.products:
            if p.sanitization != "full":
                continue
            rk, pk = canonical_key(r.mol), canonical_key(p.mol)
            if rk is None or pk is None:
                continue
            keys[r.index], keys[p.index] = rk, pk
            pairs = _mcs_map(r.mol, rk, p.mol, pk)
            if not pairs:
                continue
            # the canonical SMILES reorders atoms: map back through the canonical ranks
            r_order, p_order = rk[1], pk[1]
            mapped = tuple((r_order[a], p_order[b]) for a, b in pairs)
            if best is None or len(mapped) > len(best[1]):
                best = (p.index, mapped)
        if best is not None:
            found.append((r.index, best[0], best[1]))
    # An atom of a product comes from one reactant only. Where two reactants map onto the same
    # product atoms (the ethyl-N of triethylamine drawn among the reactants onto the N-ethyl of
    # the amide an amine gives), the larger common part holds them; the other keeps the rest of
    # its mapping if that is still a real match, and is dropped if not.
    claimed: set[tuple[int, int]] = set()
    for ri, pi, pairs in sorted(found, key=lambda f: -len(f[2])):
        free = [(ra, pa) for ra, pa in pairs if (pi, pa) not in claimed]
        if len(free) < len(pairs):
            # placed again on the atoms no other reactant holds (the acetyl group of acetic
            # anhydride on the new ketone, not on the acetamide already there)
            rk, pk = keys[ri], keys[pi]
            taken = frozenset(c for c, o in enumerate(pk[1]) if (pi, o) in claimed)
            again = _mcs_map(reaction.components[ri].mol, rk, reaction.components[pi].mol, pk, taken)
            if len(again) > len(free):
                free = [(rk[1][a], pk[1][b]) for a, b in again]
            heavy = reaction.components[ri].mol.GetNumHeavyAtoms()
            if len(free) < max(2, int(0.5 * heavy)):
                continue
        for ra, pa in free:
            out[(ri, ra)] = (pi, pa)
            claimed.add((pi, pa))
    return out


def new_bonds_at_nitrogen(reaction: Reaction) -> list[NewBond]:
    return new_bonds_at(reaction, 7)


def new_bonds_at(reaction: Reaction, element: int = 7) -> list[NewBond]:
    """Reactant atoms of ``element`` that gain a heavy neighbour (or, for N, an acyl group);
    computed once per reaction and element."""
    cache = reaction.__dict__.setdefault("_new_bonds", {})
    if element not in cache:
        cache[element] = tuple(_new_bonds_at(reaction, element))
    return list(cache[element])


def new_bonds_from_map(reaction: Reaction, amap, element: int = 7) -> list[NewBond]:
    """The same as :func:`new_bonds_at`, read from an atom map
    (:class:`chemcheck.understand.mapping.AtomMap`) instead of the common-substructure search."""
    corr: dict[tuple[int, int], tuple[int, int]] = {}
    for product_atom, origin in amap.pairs:
        corr.setdefault(origin, product_atom)
    return _new_bonds_at(reaction, element, corr, amap.contributing)


def _new_bonds_at(
    reaction: Reaction, element: int, corr: dict | None = None, contributing: frozenset[int] = frozenset()
) -> list[NewBond]:
    from .perceive import nitrogen_sites

    if corr is None:
        corr = atom_correspondence(reaction)
    comps = reaction.components
    kinds = {
        c.index: {s.atom_index: s.kind for s in nitrogen_sites(c.mol)}
        for c in comps
        if c.role != "agent" or c.index in contributing
    }
    out = []
    mapped_into: dict[tuple[int, int], set[int]] = {}  # (reactant, product) -> product atoms mapped
    for (ri, _ra), (pi, pa) in corr.items():
        mapped_into.setdefault((ri, pi), set()).add(pa)
    for (ri, ra), (pi, pa) in corr.items():
        ratom = comps[ri].mol.GetAtomWithIdx(ra)
        if ratom.GetAtomicNum() != element:
            continue
        patom = comps[pi].mol.GetAtomWithIdx(pa)
        heavy_r = sum(1 for n in ratom.GetNeighbors() if n.GetAtomicNum() > 1)
        heavy_p = sum(1 for n in patom.GetNeighbors() if n.GetAtomicNum() > 1)
        kb = kinds.get(ri, {}).get(ra, "")
        ka = kinds.get(pi, {}).get(pa, "")
        acylated = kb != ka and ka in ("amide", "sulfonamide", "carbamate", "urea", "imide", "enamine", "iminium", "imine")
        if heavy_p <= heavy_r and not acylated:
            continue
        mapped_from_same = mapped_into[(ri, pi)]
        partners = tuple(n.GetIdx() for n in patom.GetNeighbors() if n.GetAtomicNum() > 1 and n.GetIdx() not in mapped_from_same)
        out.append(
            NewBond(ri, ra, pi, pa, partners, ratom.GetFormalCharge(), patom.GetFormalCharge(), heavy_r, heavy_p, kb, ka)
        )
    return out
