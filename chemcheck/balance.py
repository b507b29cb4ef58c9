"""Element and charge balance of a drawn equation, and the by-products that close it.

Chemists rarely draw the HCl of an acylation or the water of a condensation. The balance looks
for small integer coefficients (1 to 3) and up to two common small by-products that make the
equation balance; what remains unexplained is reported as the element difference.
"""

from __future__ import annotations

import itertools
from collections import Counter
from dataclasses import dataclass, field
from functools import lru_cache

from rdkit import Chem
from rdkit.Chem import rdMolDescriptors

from ._memo import Memo
from .reaction import Component, Reaction

__all__ = ["Balance", "balance", "element_counts"]

# Small molecules commonly left out of a drawn equation (common practice).
BY_PRODUCTS: tuple[tuple[str, str], ...] = (
    ("HCl", "Cl"), ("HBr", "Br"), ("HI", "I"), ("HF", "F"), ("H2O", "O"), ("CO2", "O=C=O"),
    ("CO", "[C-]#[O+]"), ("N2", "N#N"), ("NH3", "N"), ("H2", "[H][H]"), ("methanol", "CO"),
    ("ethanol", "CCO"), ("tert-butanol", "CC(C)(C)O"), ("acetic acid", "CC(=O)O"),
    ("trifluoroacetic acid", "OC(=O)C(F)(F)F"), ("p-toluenesulfonic acid", "Cc1ccc(cc1)S(=O)(=O)O"),
    ("methanesulfonic acid", "CS(=O)(=O)O"), ("triflic acid", "OS(=O)(=O)C(F)(F)F"),
    ("imidazole", "c1c[nH]cn1"), ("succinimide", "O=C1CCC(=O)N1"), ("SO2", "O=S=O"),
    ("trimethylamine", "CN(C)C"), ("dimethylamine", "CNC"), ("methyl hydrogen sulfate", "COS(=O)(=O)O"),
    ("NaCl", "[Na+].[Cl-]"), ("KCl", "[K+].[Cl-]"), ("NaBr", "[Na+].[Br-]"), ("KBr", "[K+].[Br-]"),
    ("NaI", "[Na+].[I-]"), ("KI", "[K+].[I-]"), ("AgI", "[Ag]I"), ("AgBr", "[Ag]Br"), ("AgCl", "[Ag]Cl"),
    ("H2SO4", "OS(=O)(=O)O"), ("HNO3", "O[N+](=O)[O-]"), ("benzyl alcohol", "OCc1ccccc1"),
    ("phenol", "Oc1ccccc1"), ("p-nitrophenol", "Oc1ccc(cc1)[N+](=O)[O-]"), ("HOBt", "On1nnc2ccccc21"),
)


def element_counts(mol: Chem.Mol) -> Counter:
    counts: Counter = Counter()
    for atom in mol.GetAtoms():
        sym = atom.GetSymbol()
        if atom.GetAtomicNum() == 0:
            sym = "*"
        counts[sym] += 1
        h = atom.GetTotalNumHs()
        if h:
            counts["H"] += h
    return counts


def _charge(mol: Chem.Mol) -> int:
    return sum(a.GetFormalCharge() for a in mol.GetAtoms())


@lru_cache(maxsize=1)
def _by_product_vectors() -> tuple[tuple[str, str, Counter, int], ...]:
    out = []
    for name, smi in BY_PRODUCTS:
        mol = Chem.MolFromSmiles(smi)
        out.append((name, rdMolDescriptors.CalcMolFormula(mol), element_counts(mol), _charge(mol)))
    return tuple(out)


@dataclass(frozen=True)
class Missing:
    name: str
    formula: str
    count: int
    side: str  # "product" (left out of the products) or "reactant" (needed on the left)


@dataclass
class Balance:
    drawn_balanced: bool
    balanced: bool
    coefficients: dict[int, int] = field(default_factory=dict)  # component index -> coefficient
    missing: list[Missing] = field(default_factory=list)
    residual: dict[str, int] = field(default_factory=dict)  # reactants minus products, unexplained
    charge_difference: int = 0
    checked: bool = True  # False when there is nothing to compare (no products drawn)

    def to_dict(self) -> dict:
        return {
            "checked": self.checked,
            "drawn_balanced": self.drawn_balanced,
            "balanced": self.balanced,
            "coefficients": {str(k): v for k, v in self.coefficients.items()},
            "missing": [m.__dict__ for m in self.missing],
            "residual": dict(self.residual),
            "charge_difference": self.charge_difference,
        }


def _key(c: Counter) -> frozenset:
    return frozenset((k, v) for k, v in c.items() if v)


@lru_cache(maxsize=1)
def _by_product_table() -> dict[frozenset, list[Missing]]:
    """What up to two by-products (each 1 to 3 times) add, keyed by element vector and charge."""
    table: dict[frozenset, list[Missing]] = {}
    singles = []
    for name, formula, vec, q in _by_product_vectors():
        for k in (1, 2, 3):
            singles.append(((name, formula, k), Counter({e: n * k for e, n in vec.items()}), q * k))
    for info, vec, q in singles:
        table.setdefault(_key(vec) | {("__q", q)}, [Missing(info[0], info[1], info[2], "product")])
    for (a, va, qa), (b, vb, qb) in itertools.combinations(singles, 2):
        if a[0] == b[0] or a[2] > 2 or b[2] > 2:
            continue
        key = _key(va + vb) | {("__q", qa + qb)}
        table.setdefault(key, [Missing(a[0], a[1], a[2], "product"), Missing(b[0], b[1], b[2], "product")])
    return table


@lru_cache(maxsize=16)
def _coefficient_sets(n: int) -> tuple[tuple[int, ...], ...]:
    """Coefficients 1-3 for each of up to six species (1 each beyond), smallest sums first."""
    ranges = [range(1, 4)] * n if n <= 6 else [range(1, 2)] * n
    return tuple(sorted(itertools.product(*ranges), key=sum))


_COUNTS = Memo()


def counts_of(component: Component) -> Counter:
    """Element counts of a component (a fresh Counter), remembered by its canonical SMILES."""
    hit = _COUNTS.get(component.smiles)
    if hit is None:
        hit = _COUNTS.put(component.smiles, element_counts(component.mol))
    return Counter(hit)


_BALANCED = Memo()  # (reactant SMILES, product SMILES) -> result of _balance


def balance(reaction: Reaction) -> Balance:
    """Whether the drawn equation balances, and the smallest coefficients and by-products that
    balance it. Depends only on the structures: remembered by the components' SMILES."""
    reactants = reaction.reactants
    products = reaction.products
    if not products:
        return Balance(False, False, checked=False)
    key = (tuple(c.smiles for c in reactants), tuple(c.smiles for c in products))
    hit = _BALANCED.get(key)
    if hit is None:
        hit = _BALANCED.put(key, _balance(reaction))
    drawn_ok, ok, coeffs, missing, residual, charge = hit
    species = reactants + products
    return Balance(drawn_ok, ok, {c.index: k for c, k in zip(species, coeffs)}, list(missing), dict(residual), charge)


def _balance(reaction: Reaction) -> tuple:
    reactants = reaction.reactants
    products = reaction.products
    species: list[tuple[Component, int]] = [(c, 1) for c in reactants] + [(c, -1) for c in products]
    vectors = [counts_of(c) for c, _ in species]
    charges = [Chem.GetFormalCharge(c.mol) for c, _ in species]

    def diff_for(coeffs: tuple[int, ...]) -> tuple[Counter, int]:
        total: Counter = Counter()
        charge = 0
        for (c, sign), vec, q, k in zip(species, vectors, charges, coeffs):
            for el, n in vec.items():
                total[el] += sign * k * n
            charge += sign * k * q
        return total, charge

    ones = tuple(1 for _ in species)
    drawn, drawn_q = diff_for(ones)
    drawn_ok = not _key(drawn) and drawn_q == 0

    table = _by_product_table()
    bps = _by_product_vectors()

    def lookup(vec: Counter, q: int, side: str) -> list[Missing] | None:
        found = table.get(_key(vec) | {("__q", q)})
        if found is None:
            return None
        return [Missing(m.name, m.formula, m.count, side) for m in found]

    best = None
    n = len(species)
    for coeffs in _coefficient_sets(n):
        extra = sum(coeffs) - n  # drawn coefficients (all 1) are preferred
        if best is not None and extra > best[0]:
            break  # the sets come in order of their sum: none of the rest can do better
        diff, q = diff_for(coeffs)
        if not _key(diff) and q == 0:
            cand = (extra, 0, coeffs, [])
        else:
            pos = Counter({e: v for e, v in diff.items() if v > 0})
            neg = Counter({e: -v for e, v in diff.items() if v < 0})
            found: list[Missing] | None = None
            if pos and not neg:
                found = lookup(pos, q, "product")
            elif neg and not pos:
                found = lookup(neg, -q, "reactant")
            elif extra == 0:
                # a reagent left out on the left and a by-product on the right (a hydrolysis)
                for name, formula, vec, rq in bps:
                    if rq:
                        continue
                    rest = diff + vec
                    rest = Counter({e: v for e, v in rest.items() if v})
                    if rest and all(v > 0 for v in rest.values()):
                        right = lookup(rest, q, "product")
                        if right and len(right) == 1:
                            found = [Missing(name, formula, 1, "reactant"), *right]
                            break
            cand = None
            if found:
                needed = sum(1 for m in found if m.side == "reactant")
                cand = (extra + len(found) + 0.5 * needed, len(found), coeffs, found)
        if cand and (best is None or cand[:2] < best[:2]):
            best = cand
    if best is not None:
        return (drawn_ok, True, tuple(best[2]), tuple(best[3]), {}, 0)
    return (
        False,
        False,
        tuple(1 for _ in species),
        (),
        {e: n for e, n in sorted(drawn.items()) if n},
        drawn_q,
    )
