"""Atom maps: which reactant (or agent) atom each product atom comes from.

Three routes, tried in order:

* ``given`` -- the chemist wrote atom map numbers (``[CH3:1]``); a product atom and a reactant
  or agent atom of the same number are the same atom.
* a computed map -- an algorithmic atom-to-atom mapper (EPAM Indigo's ``automap``, chosen by
  measurement: see ``docs/mapping.md``), bounded by a timeout. The mapper first sees the
  reactants only; when product atoms remain unmapped it is run again with the agents offered
  as reactants, and an agent's atoms are accepted only for the product atoms the reactants
  left open, so a solvent never displaces a reactant.
* ``mcs`` -- the maximum-common-substructure route of :mod:`chemcheck.changes`, when the
  mapper is missing, fails or runs out of time.

When nothing maps, the result has ``source="none"``. Every computed result is cached per
reaction text (and grouping of fragments into components).

Indices are those of ``Component.mol`` as parsed by chemcheck. The mapper reads its own copy
of each fragment, written as SMILES from chemcheck's molecule; the atom output order of that
SMILES translates the mapper's atoms back to chemcheck's, and the elements are checked atom by
atom before any pair is accepted.
"""

from __future__ import annotations

import threading
import time
from dataclasses import dataclass, field

from rdkit import Chem

from .. import _rdlog
from .._memo import Memo
from ..reading.reaction import Reaction

__all__ = ["AtomMap", "map_reaction", "MAPPER"]

Atom = tuple[int, int]  # (component index, atom index in Component.mol)

#: the computed route's name, as written in ``AtomMap.source``
MAPPER = "indigo"


@dataclass(frozen=True)
class AtomMap:
    """Product atom -> origin atom, for one reaction.

    ``source`` is ``"given"`` (maps written by the chemist), ``"indigo"`` (computed),
    ``"mcs"`` (fallback) or ``"none"``. ``pairs`` holds ((product component, atom), (origin
    component, atom)); origins may be reactants or agents (an agent that gives atoms is really
    a reactant). ``coverage`` is the fraction of product heavy atoms mapped; ``note`` says why a
    fallback was used. ``contributing`` names the components that give at least one heavy atom
    to a product.
    """

    source: str
    pairs: tuple[tuple[Atom, Atom], ...]
    coverage: float
    note: str | None = None
    contributing: frozenset[int] = frozenset()
    #: why the maps written in the reaction were set aside for a computed map, when they were
    set_aside: str | None = None
    _forward: dict = field(default_factory=dict, init=False, repr=False, compare=False)
    _backward: dict = field(default_factory=dict, init=False, repr=False, compare=False)
    # the centre this map implies for a reaction, remembered (reaction_centre is asked several
    # times per check: the quick route, the readings compared, the class)
    _centre: list = field(default_factory=list, init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        fwd = self._forward
        back = self._backward
        for p, o in self.pairs:
            fwd[p] = o
            back.setdefault(o, p)

    def origin(self, product_comp: int, atom: int) -> Atom | None:
        """The reactant/agent atom a product atom comes from, or None when unmapped."""
        return self._forward.get((product_comp, atom))

    def image(self, comp: int, atom: int) -> Atom | None:
        """The product atom a reactant/agent atom becomes, or None when it leaves."""
        return self._backward.get((comp, atom))

    @property
    def mapped(self) -> bool:
        return bool(self.pairs)


# --------------------------------------------------------------------------------------------
# given maps


def _given(rxn: Reaction) -> AtomMap:
    origin_by_num: dict[int, Atom] = {}
    # reactants first: a map number repeated on an agent (a reagent written twice) never
    # displaces the reactant's atom
    for comp in sorted(
        (c for c in rxn.components if c.role != "product"), key=lambda c: c.role != "reactant"
    ):
        for a in comp.mol.GetAtoms():
            n = a.GetAtomMapNum()
            if n and n not in origin_by_num:
                origin_by_num[n] = (comp.index, a.GetIdx())
    pairs = []
    for comp in rxn.products:
        for a in comp.mol.GetAtoms():
            o = origin_by_num.get(a.GetAtomMapNum()) if a.GetAtomMapNum() else None
            if o is not None:
                pairs.append(((comp.index, a.GetIdx()), o))
    return _result(rxn, "given", pairs, None)


def _result(rxn: Reaction, source: str, pairs, note: str | None) -> AtomMap:
    from .graph import graph_of

    z = {c.index: graph_of(c).z for c in rxn.components}
    heavy_total = sum(1 for c in rxn.products for n in z[c.index] if n > 1)
    pairs = tuple(sorted(set(pairs)))
    heavy_pairs = [(p, o) for p, o in pairs if z[p[0]][p[1]] > 1]
    coverage = len(heavy_pairs) / heavy_total if heavy_total else 0.0
    contributing = frozenset(o[0] for _, o in heavy_pairs if z[o[0]][o[1]] > 1)
    return AtomMap(source, pairs, round(coverage, 6), note, contributing)


def _none(rxn: Reaction, note: str | None) -> AtomMap:
    return AtomMap("none", (), 0.0, note, frozenset())


# --------------------------------------------------------------------------------------------
# computed maps


class MapperUnavailable(Exception):
    """The mapping library is not installed or cannot start."""


class MapperFailed(Exception):
    """The mapper ran but gave no usable map (error, timeout, atoms out of step)."""


_CACHE = Memo(1024)  # (text, grouping, timeout) -> AtomMap
_local = threading.local()


def clear_cache() -> None:
    _CACHE.clear()


#: seconds the mapper may take on one reaction before its best reading so far, or the
#: common-substructure answer, is used (measured on the curated rows, 5 December: 0.4 s and
#: 2 s agree with the source's maps equally often, 92.6 %; 2 s cost 2.6 times the CPU of 0.4 s
#: over 600 reactions, spent on a few that run into the limit)
MAP_TIMEOUT_S = 0.5


def map_reaction(rxn: Reaction, *, timeout_s: float = MAP_TIMEOUT_S) -> AtomMap:
    """The atom map of ``rxn``: the chemist's maps when written, else a computed map (bounded
    by ``timeout_s`` seconds), else the common-substructure fallback, else ``source="none"``.

    Never raises on odd input: a reaction that cannot be mapped gets ``source="none"`` and a
    ``note`` saying why.
    """
    key = (rxn.text, tuple(c.fragments for c in rxn.components), round(float(timeout_s), 3))
    hit = _CACHE.get(key)
    if hit is not None:
        return hit
    out = _checked_given(rxn, timeout_s) if rxn.mapped else _compute(rxn, timeout_s)
    _CACHE.put(key, out)
    return out


#: a written map is read as it stands when it implies at most this many bond changes (complete,
#: or only the centre numbered); otherwise a computed map is worked out beside it
GIVEN_PLAIN_CHANGES = 4


def _checked_given(rxn: Reaction, timeout_s: float) -> AtomMap:
    """The chemist's maps, unless they imply many bond changes and a computed map that covers
    as much explains the reaction with fewer (minimal chemical distance).

    Maps from automatic extraction sometimes take an agent's atoms for the product's (the N of
    Et3N as the N of a carbamate, two of its carbons as the chain that carried the
    isocyanate): such a map reads as bonds broken in the agent and a nitrogen that cannot react.
    A map that places every product atom and implies few changes is always kept as written.
    """
    given = _given(rxn)
    heavy = {
        (c.index, a.GetIdx()) for c in rxn.products for a in c.mol.GetAtoms() if a.GetAtomicNum() > 1
    }
    try:
        cost_given = _distance(rxn, list(given.pairs), heavy)
    except Exception:
        return given
    open_atoms = len(heavy) - round(given.coverage * len(heavy))
    if cost_given[0] - open_atoms <= GIVEN_PLAIN_CHANGES:
        return given  # complete or partial (only the centre numbered), and plain: as written
    computed = _compute(rxn, timeout_s, quick=False)
    if computed.source != MAPPER or computed.coverage < given.coverage:
        return given
    try:
        cost_computed = _distance(rxn, list(computed.pairs), heavy)
    except Exception:
        return given
    if cost_computed >= cost_given:
        return given
    why = (
        f"the atom maps written imply {cost_given[0] - open_atoms} bond changes"
        + (f" and leave {open_atoms} product atom{'s' if open_atoms != 1 else ''} unplaced" if open_atoms else "")
        + f"; a computed map explains the reaction with {cost_computed[0]} bond changes"
    )
    return AtomMap(computed.source, computed.pairs, computed.coverage, None, computed.contributing, why)


def _compute(rxn: Reaction, timeout_s: float, quick: bool = True) -> AtomMap:
    if not rxn.products:
        return _none(rxn, "the reaction has no products to map")
    if not any(a.GetAtomicNum() > 1 for c in rxn.products for a in c.mol.GetAtoms()):
        return _none(rxn, "the products have no heavy atoms to map")
    from .._budget import MAX_MAPPED_ATOMS, mapping_cap_note

    heavy = sum(c.mol.GetNumHeavyAtoms() for c in rxn.reactants + rxn.products)
    if heavy > MAX_MAPPED_ATOMS:  # the work budget of a check (chemcheck/_budget.py)
        return _none(rxn, mapping_cap_note(heavy))
    if QUICK and quick and not rxn.mapped:
        fast = _quick(rxn)
        if fast is not None:
            return fast
    note = None
    try:
        pairs = _indigo_map(rxn, timeout_s)
        amap = _result(rxn, MAPPER, pairs, None)
        if amap.coverage > 0:
            return amap
        note = "the atom mapper mapped no product atom"
    except MapperUnavailable as exc:
        note = f"the atom mapper is not available ({exc})"
    except MapperFailed as exc:
        note = f"the atom mapper gave no map ({exc})"
    except Exception as exc:  # a molecule the mapper or RDKit chokes on: fall back, never raise
        note = f"the atom mapper failed ({type(exc).__name__})"
    if rxn.mapped:  # the common-substructure route would read the written maps back
        return _none(rxn, note)
    try:
        pairs = _mcs_pairs(rxn)
    except Exception as exc:  # the fallback must never take the check down
        return _none(rxn, f"{note}; the common-substructure route failed too ({type(exc).__name__})")
    if pairs:
        return _result(rxn, "mcs", pairs, f"{note}; atoms matched by common substructure instead")
    return _none(rxn, f"{note}; no common substructure found either")


#: try the common-substructure route first and keep it when its answer is complete and plain
QUICK = True
#: bonds formed, broken or changed in order that a plain answer of the quick route may have
QUICK_MAX_CHANGES = 4
#: ... and at most this many when the centre reads as no catalogued class (measured on the
#: curated rows, 5 December: 2 gives 90.6 % centre agreement, 4 gives 92.4 %, 6 gives 92.1 %;
#: a Suzuki coupling or a Grignard addition is no class of the catalog and reads right)
QUICK_ANY_CLASS_CHANGES = 4


def _quick(rxn: Reaction) -> AtomMap | None:
    """The common-substructure route's map when it is complete and reads as one catalogued
    class with a small centre; else None (the mapper decides).

    The route costs about 1 ms against about 27 ms for the mapper with its repair steps; on
    reactions where every product atom is placed, the centre is a few bonds and the class is
    one the catalog knows, the two agree about as often as the mapper agrees with curated maps
    (figures in docs/mapping.md).
    """
    from .centre import reaction_centre
    from .classes import OTHER, classify

    try:
        pairs = _mcs_pairs(rxn)
        if not pairs:
            return None
        pairs = _carried_through(rxn, pairs)
        amap = _result(rxn, "mcs", pairs, None)
        if 0.8 <= amap.coverage < 0.999:
            # a few product atoms left open (an O or N whose bonds change): complete them from
            # their neighbours' origins as for the mapper's answer
            pairs = _complete(rxn, list(pairs))
            amap = _result(rxn, "mcs", pairs, None)
            if amap.coverage < 0.999:
                pairs = _fill_open(rxn, pairs, [c for c in rxn.reactants if c.mol.GetNumAtoms()])
                amap = _result(rxn, "mcs", pairs, None)
        if amap.coverage < 0.999:
            return None
        centre = reaction_centre(rxn, amap)
        if not centre.changes or len(centre.changes) > QUICK_MAX_CHANGES:
            return None
        if len(centre.changes) > QUICK_ANY_CLASS_CHANGES and classify(rxn, centre).cls.id == OTHER.id:
            return None
    except Exception:  # the quick route never decides on failure: the mapper runs
        return None
    return amap


def _carried_through(rxn: Reaction, pairs: list[tuple[Atom, Atom]]) -> list[tuple[Atom, Atom]]:
    """Pairs for each product none of whose atoms is placed that is the same molecule as an
    agent or reactant giving no atom yet (the trifluoroacetic acid of a salt written beside the
    product, an acid or base written on both sides): that molecule, atom for atom."""
    placed = {p[0] for p, _ in pairs}
    giving = {o[0] for _, o in pairs}
    out = list(pairs)
    for prod in rxn.products:
        if prod.index in placed or not prod.mol.GetNumAtoms():
            continue
        for comp in rxn.agents + rxn.reactants:
            if comp.index in giving or comp.smiles != prod.smiles:
                continue
            match = prod.mol.GetSubstructMatch(comp.mol)
            if len(match) != comp.mol.GetNumAtoms():
                continue
            out.extend(((prod.index, pa), (comp.index, ca)) for ca, pa in enumerate(match))
            giving.add(comp.index)
            break
    return out


def _mcs_pairs(rxn: Reaction) -> list[tuple[Atom, Atom]]:
    from ..changes import atom_correspondence

    corr = atom_correspondence(rxn)
    return [(p, r) for r, p in corr.items()]


# ---- minimal chemical distance


def _settle(rxn: Reaction, pairs: list[tuple[Atom, Atom]], deadline: float = float("inf")) -> list[tuple[Atom, Atom]]:
    """Re-place each block of a mapper's answer (the atoms one origin component gives one
    product component) where it keeps every bond among them and changes fewest atoms.

    Mappers sometimes place a symmetric part one step round (the ring of cyclohexanone turned
    on the cyclohexyl of the amine it gives), which reads as C-C bonds broken and formed. When
    the block's own bonds, elements and orders can be found among the same product atoms, the
    placement with the fewest changes in heavy neighbours and hydrogens (the principle of
    minimal chemical distance) is kept.
    """
    comps = rxn.components
    blocks: dict[tuple[int, int], list[tuple[int, int]]] = {}
    for (pc, pa), (oc, oa) in pairs:
        blocks.setdefault((oc, pc), []).append((oa, pa))
    out: list[tuple[Atom, Atom]] = []
    for (oc, pc), block in blocks.items():
        better = None
        if 3 <= len(block) <= _MAX_BLOCK and time.monotonic() < deadline:
            try:
                better = _replace_block(comps[oc].mol, comps[pc].mol, block)
            except (RuntimeError, ValueError):
                better = None
        for oa, pa in better or block:
            out.append(((pc, pa), (oc, oa)))
    return out


_MAX_PLACEMENTS = 2000
_MAX_BLOCK = 40  # atoms in a block worth re-placing
_MAX_TRIALS = 40  # exchanges tried per heteroatom


def _swap_heteroatoms(rxn: Reaction, pairs, heavy, deadline: float = float("inf"), rounds: int = 4):
    """Exchange the origins of two product heteroatoms of one element, both from one origin
    component, when that removes bond changes: mappers sometimes take the ring N of a
    piperazinone for the N that was acylated, or the oxime O for the carbonyl O reduced."""
    comps = rxn.components
    best = _distance(rxn, pairs, heavy)
    if best == (0, 0):
        return pairs
    for _ in range(rounds):
        from .centre import reaction_centre

        fwd = dict(pairs)
        centre = reaction_centre(rxn, _result(rxn, MAPPER, pairs, None))
        at_centre = {a for c in centre.changes if c.atoms_after for a in c.atoms_after}
        at_centre |= {p for p, o in fwd.items() if any(c.atoms_before and o in c.atoms_before for c in centre.changes)}
        improved = False
        used = set(fwd.values())
        # any reactant or agent may give the atom, when that removes bond changes: the N of
        # ammonium acetate rather than the nitrile N of the cyanoborohydride beside it
        givers = {o[0] for o in used} | {c.index for c in comps if c.role != "product"}
        for p in sorted(at_centre):
            if p not in fwd:
                continue
            el = comps[p[0]].mol.GetAtomWithIdx(p[1]).GetAtomicNum()
            if el in (1, 6):
                continue
            trials = []
            # another product atom of the element, from the same origin component: exchange
            for q, oq in fwd.items():
                if q != p and q[0] == p[0] and oq[0] == fwd[p][0]:
                    if comps[q[0]].mol.GetAtomWithIdx(q[1]).GetAtomicNum() == el:
                        trial = dict(fwd)
                        trial[p], trial[q] = fwd[q], fwd[p]
                        trials.append(trial)
            # an atom of the element left unused
            for ci in sorted(givers):
                for a in comps[ci].mol.GetAtoms():
                    if a.GetAtomicNum() == el and (ci, a.GetIdx()) not in used:
                        trial = dict(fwd)
                        trial[p] = (ci, a.GetIdx())
                        trials.append(trial)
            for trial in trials[:_MAX_TRIALS]:
                if time.monotonic() >= deadline:
                    return list(fwd.items())
                cost = _distance(rxn, list(trial.items()), heavy)
                if cost < best:
                    best, fwd, improved = cost, trial, True
                    break
            if improved:
                break
        pairs = list(fwd.items())
        if not improved:
            break
    return pairs


def _replace_block(rmol: Chem.Mol, pmol: Chem.Mol, block: list[tuple[int, int]]):
    r_atoms = [oa for oa, _ in block]
    image = dict(block)
    internal = [
        b for b in rmol.GetBonds()
        if b.GetBeginAtomIdx() in image and b.GetEndAtomIdx() in image
    ]
    changed = sum(
        1 for b in internal
        if (pb := pmol.GetBondBetweenAtoms(image[b.GetBeginAtomIdx()], image[b.GetEndAtomIdx()])) is None
        or _order(pb) != _order(b)
    )
    current = (changed, _placement_cost(rmol, pmol, block))
    if current[0] == 0:
        # every bond among the block survives: only a symmetric re-placement could differ, and
        # searching for it in a large molecule costs more than it gives
        return None
    # the block as a query: its atoms (elements) and its bonds (orders)
    query = Chem.RWMol()
    index = {}
    for a in r_atoms:
        atom = rmol.GetAtomWithIdx(a)
        qa = Chem.Atom(atom.GetAtomicNum())
        qa.SetIsAromatic(atom.GetIsAromatic())
        qa.SetNoImplicit(True)
        index[a] = query.AddAtom(qa)
    for b in internal:
        query.AddBond(index[b.GetBeginAtomIdx()], index[b.GetEndAtomIdx()], b.GetBondType())
    q = query.GetMol()
    q.UpdatePropertyCache(strict=False)
    targets = set(image.values())
    best = None
    for match in pmol.GetSubstructMatches(q, uniquify=False, useChirality=False, maxMatches=_MAX_PLACEMENTS):
        if set(match) != targets:
            continue
        cand = [(a, match[index[a]]) for a in r_atoms]
        # bond orders: a plain molecule as query compares bond types, aromatic included
        cost = (0, _placement_cost(rmol, pmol, cand))
        if best is None or cost < best[0]:
            best = (cost, cand)
    if best is not None and best[0] < current:
        return best[1]
    return None


def _order(bond: Chem.Bond) -> float:
    return 1.5 if bond.GetIsAromatic() else bond.GetBondTypeAsDouble()


def _placement_cost(rmol: Chem.Mol, pmol: Chem.Mol, pairs) -> int:
    total = 0
    for a, b in pairs:
        ra, pa = rmol.GetAtomWithIdx(a), pmol.GetAtomWithIdx(b)
        rh = sum(1 for n in ra.GetNeighbors() if n.GetAtomicNum() > 1)
        ph = sum(1 for n in pa.GetNeighbors() if n.GetAtomicNum() > 1)
        total += abs(rh - ph) + abs(_hcount(ra) - _hcount(pa))
    return total


def _hcount(atom: Chem.Atom) -> int:
    try:
        return atom.GetTotalNumHs()
    except RuntimeError:
        return atom.GetNumExplicitHs()


# ---- the Indigo route


def _indigo():
    inst = getattr(_local, "indigo", None)
    if inst is None:
        try:
            from indigo import Indigo  # noqa: PLC0415 - optional at import time
        except Exception as exc:  # ImportError, or a broken native library
            raise MapperUnavailable(f"{type(exc).__name__}") from None
        try:
            inst = Indigo()
            inst.setOption("ignore-stereochemistry-errors", True)
            inst.setOption("ignore-noncritical-query-features", True)
        except Exception as exc:
            raise MapperUnavailable(f"{type(exc).__name__}") from None
        _local.indigo = inst
    return inst


def _pieces(comp, variant: int = 0, kekule: bool = False) -> list[tuple[str, list[int]]]:
    """Each fragment of a component as (SMILES, chemcheck atom index of each SMILES atom);
    ``variant`` > 0 starts the SMILES at another atom (the mapper's answer depends on the
    order it reads atoms in)."""
    out = []
    with _rdlog.captured():
        frags_atoms: list = []
        try:
            frags = Chem.GetMolFrags(
                comp.mol, asMols=True, sanitizeFrags=False, fragsMolAtomMapping=frags_atoms
            )
        except Exception as exc:
            raise MapperFailed(f"component {comp.index + 1} cannot be written") from exc
        for frag, atoms in zip(frags, frags_atoms):
            for a in frag.GetAtoms():  # the mapper reads the structure, never written maps
                a.SetAtomMapNum(0)
            frag = _neutral_amines(frag)
            n = frag.GetNumAtoms()
            root = (variant * n) // (VARIANTS + 1) if variant and n > 2 else -1
            try:
                if kekule:
                    frag = Chem.Mol(frag)
                    Chem.Kekulize(frag, clearAromaticFlags=True)
                smi = Chem.MolToSmiles(
                    frag, canonical=True, isomericSmiles=True, rootedAtAtom=root, kekuleSmiles=kekule
                )
            except Exception as exc:
                raise MapperFailed(f"component {comp.index + 1} cannot be written") from exc
            order = [int(x) for x in frag.GetProp("_smilesAtomOutputOrder").strip("[]").split(",") if x.strip()]
            if len(order) != n:
                raise MapperFailed(f"component {comp.index + 1} cannot be written")
            out.append((smi, [atoms[i] for i in order]))
    return out


def _neutral_amines(frag: Chem.Mol) -> Chem.Mol:
    """The fragment with each protonated amine written as the free amine (same atoms, same
    order): the mapper pairs an ammonium salt's N with the neutral N of an amide or imine only
    when both are drawn alike."""
    targets = [
        a.GetIdx() for a in frag.GetAtoms()
        if a.GetAtomicNum() == 7 and a.GetFormalCharge() == 1 and a.GetTotalNumHs() > 0
        and not any(nb.GetFormalCharge() < 0 for nb in a.GetNeighbors())
    ]
    if not targets:
        return frag
    rw = Chem.RWMol(frag)
    for i in targets:
        atom = rw.GetAtomWithIdx(i)
        h = atom.GetTotalNumHs()
        atom.SetFormalCharge(0)
        atom.SetNoImplicit(True)
        atom.SetNumExplicitHs(h - 1)
    out = rw.GetMol()
    out.UpdatePropertyCache(strict=False)
    return out


#: the mapper reads the reaction this many times, its atoms in different orders; the answer
#: with the fewest bond changes (minimal chemical distance) is kept
VARIANTS = 3
#: a reading that places every product atom with at most this many bond changes is kept
#: without trying the others (measured on the curated rows: 2, 4 and 8 agree equally often
#: with the source's maps within 0.3 points; 4 halves the p95 cost of 2)
EARLY_STOP_CHANGES = 4


def _indigo_map(rxn: Reaction, timeout_s: float, variants: int = VARIANTS) -> list[tuple[Atom, Atom]]:
    deadline = time.monotonic() + max(float(timeout_s), 0.0)
    reactants = [c for c in rxn.reactants if c.mol.GetNumAtoms()]
    agents = [c for c in rxn.agents if c.mol.GetNumAtoms()]
    products = [c for c in rxn.products if c.mol.GetNumAtoms()]
    heavy = {
        (c.index, a.GetIdx()) for c in products for a in c.mol.GetAtoms() if a.GetAtomicNum() > 1
    }
    best = None
    failure: MapperFailed | None = None
    for v in range(max(variants, 1)):
        if v and time.monotonic() >= deadline:
            break
        order = reactants if v % 2 == 0 else reactants[::-1]
        others = agents[::-1] if v % 2 else agents
        try:
            try:
                pieces = {c.index: _pieces(c, v) for c in (*reactants, *agents, *products)}
                found = _indigo_once(rxn, order, others, products, pieces, heavy, deadline)
            except MapperFailed as exc:
                if "aromatic" not in str(exc):
                    raise
                # the mapper cannot place hydrogens on some aromatic rings RDKit reads (pyrroles
                # and imidazoles drawn in another tautomer): give it Kekule structures
                pieces = {c.index: _pieces(c, v, kekule=True) for c in (*reactants, *agents, *products)}
                found = _indigo_once(rxn, order, others, products, pieces, heavy, deadline)
            if not heavy <= {p for p, _ in found}:
                found = _fill_open(rxn, found, reactants)
            pairs = _swap_heteroatoms(rxn, _settle(rxn, found, deadline), heavy, deadline)
        except MapperFailed as exc:
            failure = failure or exc
            continue
        cost = _distance(rxn, pairs, heavy)
        if best is None or cost < best[0]:
            best = (cost, pairs)
        if cost[0] <= EARLY_STOP_CHANGES and cost[1] <= 2:
            break  # every product atom placed with a minimal centre: no reading can do better
    if best is None:
        raise failure or MapperFailed("mapper error")
    return best[1]


def _distance(rxn: Reaction, pairs, heavy) -> tuple[int, int]:
    """(product heavy atoms left unmapped + bonds changed, hydrogens moved): smaller is closer."""
    from .centre import reaction_centre

    amap = _result(rxn, MAPPER, pairs, None)
    centre = reaction_centre(rxn, amap)
    open_atoms = len(heavy - {p for p, _ in amap.pairs})
    return (open_atoms + len(centre.changes), sum(abs(d) for _, d in centre.h_changes))


def _indigo_once(rxn, reactants, agents, products, pieces, heavy, deadline) -> list[tuple[Atom, Atom]]:
    first = _complete(rxn, _indigo_run(reactants, products, pieces, deadline))
    covered = {p for p, _ in first}
    if not agents or heavy <= covered or time.monotonic() >= deadline:
        return first
    try:
        second = _indigo_run(reactants + agents, products, pieces, deadline)
    except MapperFailed:
        return first
    # agents fill only the product atoms the reactants left open; an origin atom is used once
    used = {o for _, o in first}
    merged = list(first)
    for p, o in second:
        if p not in covered and o not in used:
            merged.append((p, o))
            used.add(o)
    return _complete(rxn, merged)


def _fill_open(rxn: Reaction, pairs: list[tuple[Atom, Atom]], givers) -> list[tuple[Atom, Atom]]:
    """Product atoms still open, group by connected group, placed on unused atoms of a giver
    with the same elements and bonds; a component that gives nothing yet is tried first (the
    methyl of iodomethane on a quaternary N, which mappers leave open when the charge changes)."""
    comps = rxn.components
    fwd = dict(pairs)
    used = set(fwd.values())
    for prod in rxn.products:
        mol = prod.mol
        open_atoms = {
            a.GetIdx() for a in mol.GetAtoms()
            if a.GetAtomicNum() > 1 and (prod.index, a.GetIdx()) not in fwd
        }
        while open_atoms:
            seed = min(open_atoms)
            group, stack = {seed}, [seed]
            while stack:
                for nb in mol.GetAtomWithIdx(stack.pop()).GetNeighbors():
                    if nb.GetIdx() in open_atoms and nb.GetIdx() not in group:
                        group.add(nb.GetIdx())
                        stack.append(nb.GetIdx())
            open_atoms -= group
            order = sorted(group)
            query = Chem.RWMol()
            for i in order:
                qa = Chem.Atom(mol.GetAtomWithIdx(i).GetAtomicNum())
                qa.SetNoImplicit(True)
                query.AddAtom(qa)
            for b in mol.GetBonds():
                i, j = b.GetBeginAtomIdx(), b.GetEndAtomIdx()
                if i in group and j in group:
                    bt = Chem.BondType.SINGLE if b.GetIsAromatic() else b.GetBondType()
                    query.AddBond(order.index(i), order.index(j), bt)
            q = query.GetMol()
            q.UpdatePropertyCache(strict=False)
            giving = {o[0] for o in used}
            for comp in sorted(givers, key=lambda c: (c.index in giving, c.role != "reactant", c.index)):
                try:
                    matches = comp.mol.GetSubstructMatches(q, uniquify=False, maxMatches=200)
                except RuntimeError:
                    continue
                hit = next((m for m in matches if all((comp.index, x) not in used for x in m)), None)
                if hit is None:
                    continue
                for i, x in zip(order, hit):
                    fwd[(prod.index, i)] = (comp.index, x)
                    used.add((comp.index, x))
                break
    return list(fwd.items())


def _complete(rxn: Reaction, pairs: list[tuple[Atom, Atom]]) -> list[tuple[Atom, Atom]]:
    """Map the product atoms a mapper left open next to mapped ones, onto unused atoms of the
    same element next to their origins: the O of a ketone reduced to an alcohol, the N of a
    nitro group reduced to an amine (mappers skip atoms whose bonds or charges change). The
    reactant's own atom is closer than one an agent would give."""
    comps = rxn.components
    fwd = dict(pairs)
    used = set(fwd.values())
    queue = list(fwd.items())
    while queue:
        (pc, pa), (oc, oa) = queue.pop()
        pmol, omol = comps[pc].mol, comps[oc].mol
        for pn in pmol.GetAtomWithIdx(pa).GetNeighbors():
            pk = (pc, pn.GetIdx())
            if pk in fwd or pn.GetAtomicNum() <= 1:
                continue
            p_order = _order(pmol.GetBondBetweenAtoms(pa, pn.GetIdx()))
            options = [
                (abs(_order(omol.GetBondBetweenAtoms(oa, on.GetIdx())) - p_order), on.GetIdx())
                for on in omol.GetAtomWithIdx(oa).GetNeighbors()
                if on.GetAtomicNum() == pn.GetAtomicNum() and (oc, on.GetIdx()) not in used
            ]
            if not options:
                continue
            ok = (oc, min(options)[1])
            fwd[pk] = ok
            used.add(ok)
            queue.append((pk, ok))
    return list(fwd.items())


def _indigo_run(origins, products, pieces, deadline: float) -> list[tuple[Atom, Atom]]:
    left_ms = int((deadline - time.monotonic()) * 1000)
    if left_ms <= 0:
        raise MapperFailed("out of time")
    ind = _indigo()
    lhs = [(c.index, smi, order) for c in origins for smi, order in pieces[c.index]]
    rhs = [(c.index, smi, order) for c in products for smi, order in pieces[c.index]]
    text = ".".join(s for _, s, _ in lhs) + ">>" + ".".join(s for _, s, _ in rhs)
    try:
        ind.setOption("aam-timeout", max(left_ms, 1))
        r = ind.loadReaction(text)
        r.automap("discard ignore_charges")
    except Exception as exc:  # IndigoException: timeout, unreadable structure
        msg = str(exc).lower()
        if "timeout" in msg or "timed out" in msg:
            raise MapperFailed("out of time") from None
        if "aromatic" in msg:
            raise MapperFailed("mapper error on an aromatic ring") from None
        raise MapperFailed("mapper error") from None
    try:
        mols_l = list(r.iterateReactants())
        mols_r = list(r.iterateProducts())
        if len(mols_l) != len(lhs) or len(mols_r) != len(rhs):
            raise MapperFailed("molecules out of step")
        by_num: dict[int, Atom] = {}
        for m, (ci, _smi, order) in zip(mols_l, lhs):
            for a, idx in _aligned(m, order, ci, origins):
                n = r.atomMappingNumber(a)
                if n > 0:
                    by_num.setdefault(n, (ci, idx))
        pairs = []
        for m, (ci, _smi, order) in zip(mols_r, rhs):
            for a, idx in _aligned(m, order, ci, products):
                n = r.atomMappingNumber(a)
                if n > 0 and n in by_num:
                    pairs.append(((ci, idx), by_num[n]))
    except MapperFailed:
        raise
    except Exception as exc:
        raise MapperFailed("mapper error") from exc
    return pairs


def _aligned(m, order: list[int], ci: int, comps):
    """(Indigo atom, chemcheck atom index) in step, the elements checked one by one."""
    atoms = list(m.iterateAtoms())
    if len(atoms) != len(order):
        raise MapperFailed("atoms out of step")
    mol = next(c.mol for c in comps if c.index == ci)
    out = []
    for a, idx in zip(atoms, order):
        mine = mol.GetAtomWithIdx(idx)
        num = a.atomicNumber() if not a.isPseudoatom() and not a.isRSite() else 0
        if num != mine.GetAtomicNum():
            raise MapperFailed("atoms out of step")
        out.append((a, idx))
    return out
