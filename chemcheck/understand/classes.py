"""Reaction classes: the catalog in ``data/reaction_classes.toml`` matched on the centre.

A class is data: the bonds it forms and breaks, described by SMARTS of each end as it stood
before the reaction, with conditions on hydrogen and charge changes and on the metals present.
The first entry that the centre satisfies is the class. A reaction nothing fits is
``other``; rules that need a class stay silent there.
"""

from __future__ import annotations

import tomllib
from dataclasses import dataclass, field
from functools import lru_cache
from importlib import resources

from rdkit import Chem

from .. import _rdlog
from .._memo import Memo
from ..reading.reaction import Reaction
from .centre import BondChange, Centre
from .graph import graph_of, text_key

__all__ = ["ReactionClass", "ClassMatch", "catalog", "classify", "OTHER"]

Atom = tuple[int, int]


@dataclass(frozen=True)
class ReactionClass:
    id: str
    name: str
    family: str
    formed: tuple[tuple[str, str, float | None], ...] = ()
    broken: tuple[tuple[str, str], ...] = ()
    order: tuple[tuple[str, str, float, float], ...] = ()
    gains_h: tuple[str, ...] = ()
    loses_h: tuple[str, ...] = ()
    gains_charge: tuple[str, ...] = ()
    no_changes: bool = False
    metal_any: tuple[str, ...] = ()
    metal_none: tuple[str, ...] = ()
    expects: tuple[str, ...] = ()
    releases: str = "none"


OTHER = ReactionClass(id="other", name="Other (no class fits)", family="other")


@dataclass(frozen=True)
class ClassMatch:
    """The class of a reaction and the centre bonds that made it so."""

    cls: ReactionClass
    formed: tuple[BondChange, ...] = ()  # the formed bonds the class named, in its order
    broken: tuple[BondChange, ...] = ()
    # (origin atom of the first end, origin atom of the second end) of each named formed bond,
    # in the class's orientation: for N-acylation, (the nitrogen, the acyl carbon)
    formed_ends: tuple[tuple[Atom, Atom], ...] = ()
    broken_ends: tuple[tuple[Atom, Atom], ...] = ()
    others: tuple[str, ...] = field(default=())  # ids of further classes the centre also fits

    @property
    def id(self) -> str:
        return self.cls.id

    @property
    def family(self) -> str:
        return self.cls.family

    def to_dict(self) -> dict:
        return {
            "id": self.cls.id,
            "name": self.cls.name,
            "family": self.cls.family,
            "expects": list(self.cls.expects),
            "formed": [[list(a), list(b)] for a, b in self.formed_ends],
            "broken": [[list(a), list(b)] for a, b in self.broken_ends],
        }


@lru_cache(maxsize=1)
def catalog() -> tuple[ReactionClass, ...]:
    data = tomllib.loads(resources.files("chemcheck.data").joinpath("reaction_classes.toml").read_text("utf-8"))
    out = []
    for entry in data["class"]:
        out.append(
            ReactionClass(
                id=entry["id"],
                name=entry["name"],
                family=entry["family"],
                formed=tuple((f[0], f[1], float(f[2]) if len(f) > 2 else None) for f in entry.get("formed", ())),
                broken=tuple((b[0], b[1]) for b in entry.get("broken", ())),
                order=tuple((o[0], o[1], float(o[2]), float(o[3])) for o in entry.get("order", ())),
                gains_h=tuple(entry.get("gains_h", ())),
                loses_h=tuple(entry.get("loses_h", ())),
                gains_charge=tuple(entry.get("gains_charge", ())),
                no_changes=bool(entry.get("no_changes", False)),
                metal_any=tuple(entry.get("metal_any", ())),
                metal_none=tuple(entry.get("metal_none", ())),
                expects=tuple(entry.get("expects", ())),
                releases=entry.get("releases", "none"),
            )
        )
    return tuple(out)


@lru_cache(maxsize=None)
def _query(smarts: str) -> Chem.Mol:
    with _rdlog.captured():
        q = Chem.MolFromSmarts(f"[$({smarts})]")
    if q is None:
        raise ValueError(f"bad SMARTS in the reaction-class catalog: {smarts!r}")
    return q


_HITS = Memo(2048)  # (text as written, SMILES, atoms, bonds) -> {SMARTS: atoms that fit}


class _Matcher:
    """Answers 'does this origin atom fit this SMARTS', each molecule searched once per SMARTS.
    The same text gives the same molecule in the same atom order, so the answers for a reagent
    or building block met before are reused."""

    def __init__(self, rxn: Reaction) -> None:
        self._mols = {c.index: c.mol for c in rxn.components}
        self._hits: dict[int, dict[str, frozenset[int]]] = {}
        for c in rxn.components:
            key = text_key(c)
            table = _HITS.get(key)
            if table is None:
                table = _HITS.put(key, {})
            self._hits[c.index] = table
        # a salt's fragments joined or parted: a product (or reactant) written as several
        # fragments, the amine and its acid
        self.regrouped = any(len(c.fragments) > 1 for c in rxn.products + rxn.reactants)

    def fits(self, atom: Atom, smarts: str) -> bool:
        table = self._hits.get(atom[0])
        if table is None:
            return False
        hits = table.get(smarts)
        if hits is None:
            hits = frozenset()
            with _rdlog.captured():
                try:
                    hits = frozenset(
                        m[0] for m in self._mols[atom[0]].GetSubstructMatches(_query(smarts), maxMatches=10_000)
                    )
                except RuntimeError:
                    hits = frozenset()
            table[smarts] = hits
        return atom[1] in hits


def _metals(rxn: Reaction) -> set[str]:
    out = set()
    for c in rxn.components:
        if c.role == "product":
            continue
        out.update(graph_of(c).symbol)
    return out


def _bond_fits(m: _Matcher, change: BondChange, a: str, b: str) -> tuple[Atom, Atom] | None:
    """The change's two origin atoms in the order (a, b), or None."""
    if change.atoms_before is None:
        return None
    x, y = change.atoms_before
    if m.fits(x, a) and m.fits(y, b):
        return (x, y)
    if m.fits(y, a) and m.fits(x, b):
        return (y, x)
    return None


def _assign(m: _Matcher, specs, changes: tuple[BondChange, ...], extra=None):
    """Distinct changes for each spec, in spec order (small: a greedy pass per spec)."""
    used: set[int] = set()
    chosen: list[tuple[BondChange, tuple[Atom, Atom]]] = []
    for spec in specs:
        found = None
        for i, ch in enumerate(changes):
            if i in used:
                continue
            if extra is not None and not extra(spec, ch):
                continue
            ends = _bond_fits(m, ch, spec[0], spec[1])
            if ends is not None:
                found = (i, ch, ends)
                break
        if found is None:
            return None
        used.add(found[0])
        chosen.append((found[1], found[2]))
    return chosen


def _fits(cls: ReactionClass, m: _Matcher, centre: Centre, elements: set[str]):
    if cls.metal_any and not elements.intersection(cls.metal_any):
        return None
    if cls.metal_none and elements.intersection(cls.metal_none):
        return None
    if cls.no_changes:
        # no bond made or broken: protons moved (drawn as ions), or the fragments of a salt
        # joined or parted (drawn as neutral fragments, "Cl.NCc1ccccc1")
        if centre.changes or not (centre.h_changes or centre.charge_changes or m.regrouped or centre.leaving):
            return None
        return ClassMatch(cls)
    formed = _assign(
        m, cls.formed, centre.formed(), lambda spec, ch: spec[2] is None or abs(ch.order_after - spec[2]) < 0.26
    )
    if formed is None:
        return None
    broken = _assign(m, cls.broken, centre.broken())
    if broken is None:
        return None
    order = _assign(
        m,
        cls.order,
        centre.order_changed(),
        lambda spec, ch: abs(ch.order_before - spec[2]) < 0.26 and abs(ch.order_after - spec[3]) < 0.26,
    )
    if order is None:
        return None
    if not cls.formed and not cls.broken and not cls.order and not cls.no_changes:
        return None
    for smarts in cls.gains_h:
        if not any(d > 0 and m.fits(a, smarts) for a, d in centre.h_changes):
            return None
    for smarts in cls.loses_h:
        if not any(d < 0 and m.fits(a, smarts) for a, d in centre.h_changes):
            return None
    for smarts in cls.gains_charge:
        if not any(d > 0 and m.fits(a, smarts) for a, d in centre.charge_changes):
            return None
    return ClassMatch(
        cls,
        formed=tuple(c for c, _ in formed),
        broken=tuple(c for c, _ in broken),
        formed_ends=tuple(e for _, e in formed),
        broken_ends=tuple(e for _, e in broken),
    )


def classify(rxn: Reaction, centre: Centre) -> ClassMatch:
    """The first catalog class the centre fits, with the others it also fits; ``other`` when
    none does (or when nothing was mapped). Remembered on the centre for its reaction (the
    quick route and the understanding both ask)."""
    memo = centre.__dict__.get("_classified")
    if memo is not None and memo[0] is rxn:
        return memo[1]
    out = _classify(rxn, centre)
    centre.__dict__["_classified"] = (rxn, out)  # a frozen dataclass: its __dict__ holds the memo
    return out


def _classify(rxn: Reaction, centre: Centre) -> ClassMatch:
    if not rxn.products:
        return ClassMatch(OTHER)
    m = _Matcher(rxn)
    elements = _metals(rxn)
    first: ClassMatch | None = None
    others: list[str] = []
    for cls in catalog():
        hit = _fits(cls, m, centre, elements)
        if hit is None:
            continue
        if first is None:
            first = hit
        elif cls.family != first.family:
            others.append(cls.id)
    if first is None:
        return ClassMatch(OTHER)
    return ClassMatch(
        first.cls, first.formed, first.broken, first.formed_ends, first.broken_ends, tuple(dict.fromkeys(others))
    )
