"""Each agent's role in this reaction, from what it can be and what the reaction is.

What a reagent *can* be comes from perception (its groups and kind) and the knowledge base
``data/reagent_roles.toml``; which of those it *is* here comes from the reaction's class and
the atom map: CuI in an N-arylation is the catalyst, AlCl3 with an acyl chloride and an arene
is the Friedel–Crafts Lewis acid, NH4Cl among the agents of a reduction is the quench, and an
agent that gives atoms to the product is a reactant.
"""

from __future__ import annotations

import re
import tomllib
from collections import Counter
from functools import lru_cache
from importlib import resources

from rdkit import Chem

from .. import _rdlog
from ..reading.reaction import Component, Reaction
from .graph import graph_of

__all__ = ["ROLES", "resolve_roles", "formula_counts"]

ROLES = (
    "reactant", "solvent", "base", "catalyst", "ligand", "lewis_acid", "additive", "reductant", "oxidant",
    "coupling_agent", "acid", "drying_agent", "workup", "reagent",
)

# families whose Lewis acid activates an electrophile towards an arene
_EAS_FAMILIES = {"friedel_crafts", "ring_substitution"}
_METALS = {"Pd", "Pt", "Ni", "Cu", "Rh", "Ru", "Ir", "Co", "Ag", "Au", "Os", "Fe", "Mn", "Cr", "Mo", "W", "V", "Re", "Zn", "Ti", "Zr"}


def formula_counts(mol: Chem.Mol) -> Counter[str]:
    counts: Counter[str] = Counter()
    for a in mol.GetAtoms():
        counts[a.GetSymbol()] += 1
        counts["H"] += a.GetTotalNumHs()
    return counts


_ELEMENT = re.compile(r"([A-Z][a-z]?)(\d*)")


def _parse_formula(text: str) -> Counter[str]:
    counts: Counter[str] = Counter()
    for el, n in _ELEMENT.findall(text):
        counts[el] += int(n) if n else 1
    return counts


@lru_cache(maxsize=1)
def _kb() -> dict:
    data = tomllib.loads(resources.files("chemcheck.data").joinpath("reagent_roles.toml").read_text("utf-8"))
    out: dict[str, list[dict]] = {}
    for section, entries in data.items():
        parsed = []
        for e in entries:
            with _rdlog.captured():
                queries = [Chem.MolFromSmarts(s) for s in e.get("smarts", ())]
            parsed.append(
                {
                    "formulas": [_parse_formula(f) for f in e.get("formula", ())],
                    "queries": [q for q in queries if q is not None],
                    "elements": set(e.get("elements", ())),
                    "needs_metal": bool(e.get("needs_metal", False)),
                    "needs_elements": set(e.get("needs_elements", ())),
                    "families": set(e.get("families", ())),
                }
            )
        out[section] = parsed
    return out


def _in_kb(
    section: str, comp: Component, counts: Counter[str], metal_present: bool, family: str, elements: frozenset = frozenset()
) -> bool:
    for e in _kb().get(section, ()):
        if e["families"] and family not in e["families"]:
            continue
        if e["needs_metal"] and not metal_present:
            continue
        if e["needs_elements"] and not e["needs_elements"] & elements:
            continue
        if any(counts == f for f in e["formulas"]):
            return True
        if e["elements"] and e["elements"].intersection(counts):
            return True
        if e["queries"] and any(comp.mol.HasSubstructMatch(q) for q in e["queries"]):
            return True
    return False


def resolve_roles(rxn: Reaction, family: str, contributing: frozenset[int], perception) -> dict[int, str]:
    """The role of every reactant and agent (products are not given one).

    ``perception`` is a callable giving a component's Perception; ``contributing`` names the
    components that give atoms to a product (from the atom map).
    """
    # elements of the reactants and agents (a metal catalyst, an organolithium beside TMEDA)
    elements = frozenset(
        sym for c in rxn.components if c.role != "product" for sym in graph_of(c).symbol
    )
    metal_present = bool(elements & _METALS)
    roles: dict[int, str] = {}
    solvents: list[int] = []
    for comp in rxn.components:
        if comp.role == "product":
            continue
        if comp.role == "reactant" and (comp.index in contributing or not contributing):
            roles[comp.index] = "reactant"
            continue
        if comp.index in contributing:
            roles[comp.index] = "reactant"  # an agent that gives atoms to the product
            continue
        counts = formula_counts(comp.mol)
        p = perception(comp)
        kind = p.kind
        role: str
        if kind == "solvent" or comp.kind_hint == "solvent":
            role = "solvent"
            solvents.append(comp.index)
        elif _in_kb("workup", comp, counts, metal_present, family):
            role = "workup"
        elif _in_kb("drying_agent", comp, counts, metal_present, family):
            role = "drying_agent"
        elif _in_kb("reductant_metal", comp, counts, metal_present, family):
            role = "reductant"
        elif kind == "lewis_acid" and family in _EAS_FAMILIES:
            role = "lewis_acid"
        elif _in_kb("catalyst", comp, counts, metal_present, family):
            role = "catalyst"  # CuI in an N-arylation, PdCl2 in a coupling
        elif kind == "lewis_acid":
            role = "additive"  # TiCl4 removing water, CeCl3 beside NaBH4, ZnCl2 in a reductive amination
        elif _in_kb("ligand", comp, counts, metal_present, family, elements):
            role = "ligand"
        elif _in_kb("additive", comp, counts, metal_present, family):
            role = "additive"
        elif kind in ("base", "acid", "reductant", "oxidant", "coupling_agent", "catalyst"):
            role = kind
        elif comp.role == "reactant":
            role = "reactant"  # drawn as a reactant; the map found no atom of it in the product
        else:
            role = "reagent"
        roles[comp.index] = role
    # water among the agents is the solvent only when nothing else is
    for comp in rxn.components:
        if roles.get(comp.index) == "workup" and comp.formula == "H2O" and not solvents:
            roles[comp.index] = "solvent"
    return roles
