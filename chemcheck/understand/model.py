"""What happens in one reaction, computed once and read by every rule.

``understand()`` maps the atoms, reads the centre, classifies the reaction and gives each agent
its role. Rules read the class family, the nucleophile and electrophile atoms of the centre,
the leaving group and the acid it releases, instead of guessing them from each component.
"""

from __future__ import annotations

from dataclasses import dataclass

from ..reading.reaction import Component, Reaction
from .centre import Centre, reaction_centre
from .classes import OTHER, ClassMatch, classify
from .mapping import AtomMap, map_reaction
from .roles import resolve_roles

__all__ = ["Understanding", "understand", "HX_PKA"]

Atom = tuple[int, int]

# aqueous pKa of the acids a centre releases (CRC Handbook of Chemistry and Physics, 97th ed.,
# "Dissociation constants of inorganic acids"; HCl, HBr, HI are estimates of that table)
HX_PKA = {"F": 3.17, "Cl": -6.0, "Br": -9.0, "I": -10.0}


@dataclass(frozen=True)
class Understanding:
    amap: AtomMap
    centre: Centre
    match: ClassMatch
    roles: dict[int, str]

    @property
    def family(self) -> str:
        return self.match.cls.family

    @property
    def class_id(self) -> str:
        return self.match.cls.id

    @property
    def known(self) -> bool:
        """A class fits (rules that need one stay silent otherwise)."""
        return self.match.cls is not OTHER

    def role(self, comp: Component) -> str | None:
        return self.roles.get(comp.index)

    def components_with_role(self, *roles: str) -> list[int]:
        return [i for i, r in self.roles.items() if r in roles]

    @property
    def nucleophile(self) -> Atom | None:
        """The first end of the class's first formed bond (the N of an N-acylation)."""
        return self.match.formed_ends[0][0] if self.match.formed_ends else None

    @property
    def electrophile(self) -> Atom | None:
        """The second end of the class's first formed bond (the acyl C of an N-acylation)."""
        return self.match.formed_ends[0][1] if self.match.formed_ends else None

    def formed_at(self, comp: int) -> list[tuple[Atom, Atom]]:
        """The class's formed bonds (its own orientation) with an end in ``comp``."""
        return [e for e in self.match.formed_ends if e[0][0] == comp or e[1][0] == comp]

    def leaving_atom(self) -> Atom | None:
        """The atom the class's first broken bond takes away from the electrophile."""
        if not self.match.broken_ends:
            return None
        return self.match.broken_ends[0][1]

    def released_acid(self, reaction: Reaction) -> tuple[str, float] | None:
        """Name and aqueous pKa of the acid the centre releases, or None when it releases none."""
        rel = self.match.cls.releases
        if rel == "none":
            return None
        if rel == "HX":
            x = "Cl"
            leaving = self.leaving_atom()
            if leaving is not None:
                sym = reaction.components[leaving[0]].mol.GetAtomWithIdx(leaving[1]).GetSymbol()
                if sym in HX_PKA:
                    x = sym
            else:
                # the leaving halogen of the electrophile's carbon (an acyl chloride whose C-Cl
                # the map did not reach)
                e = self.electrophile
                if e is not None:
                    atom = reaction.components[e[0]].mol.GetAtomWithIdx(e[1])
                    for nb in atom.GetNeighbors():
                        if nb.GetSymbol() in HX_PKA:
                            x = nb.GetSymbol()
                            break
            return f"H{x}", HX_PKA[x]
        if rel == "carboxylic acid":
            e = self.electrophile
            if e is not None and _is_trifluoroacetyl(reaction, e):
                # trifluoroacetic acid, pKa 0.2-0.5 (CRC; Perrin, IUPAC dissociation constants)
                return "trifluoroacetic acid", 0.3
            return "carboxylic acid", 4.76
        if rel == "sulfonic acid":
            e = self.electrophile
            if e is not None and _is_triflyl(reaction, e):
                return "triflic acid", -14.0
            return "sulfonic acid", -2.0
        return None

    def to_dict(self) -> dict:
        return {
            "class": self.match.to_dict(),
            "also_fits": list(self.match.others),
            "mapping": {"source": self.amap.source, "coverage": round(self.amap.coverage, 3), "note": self.amap.note or self.amap.set_aside},
            "centre": {
                "formed": [_pair(c.atoms_before) for c in self.centre.formed() if c.atoms_before],
                "broken": [_pair(c.atoms_before) for c in self.centre.broken() if c.atoms_before],
                "formed_in_products": [_pair(c.atoms_after) for c in self.centre.formed() if c.atoms_after],
            },
            "roles": [{"component": i, "role": r} for i, r in sorted(self.roles.items())],
        }


def _pair(p) -> list[list[int]]:
    return [list(p[0]), list(p[1])]


def _is_trifluoroacetyl(reaction: Reaction, atom: Atom) -> bool:
    a = reaction.components[atom[0]].mol.GetAtomWithIdx(atom[1])
    for nb in a.GetNeighbors():
        if nb.GetSymbol() == "C" and sum(1 for x in nb.GetNeighbors() if x.GetSymbol() == "F") == 3:
            return True
    return False


def _is_triflyl(reaction: Reaction, atom: Atom) -> bool:
    return _is_trifluoroacetyl(reaction, atom)


def understand(reaction: Reaction, perception) -> Understanding:
    """Map, centre, class and roles of one reaction. ``perception`` gives a component's
    Perception (the rule context's cached one)."""
    amap = map_reaction(reaction)
    centre = reaction_centre(reaction, amap)
    match = classify(reaction, centre) if amap.pairs else ClassMatch(OTHER)
    roles = resolve_roles(reaction, match.cls.family, amap.contributing, perception)
    return Understanding(amap=amap, centre=centre, match=match, roles=roles)
