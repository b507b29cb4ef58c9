"""Element and charge balance of a drawn equation, and the by-products that close it.

Chemists rarely draw the HCl of an acylation or the water of a condensation. The balance looks
for small integer coefficients (1 to 3) and up to two common small by-products that make the
equation balance; what remains unexplained is reported as the element difference.

An organic by-product is offered only where it can come from the other side: its carbon
skeleton must stand in a reactant (methanol from a methyl ester or ether, tert-butanol from a
Boc group), cut off by breaking at most two bonds; a reagent needed on the left must stand in
a product the same way. Otherwise a wrong product (one carbon short, say) would be "balanced"
by methanol that nothing releases, and the chemist would be told to draw it.
"""

from __future__ import annotations

import itertools
from collections import Counter
from dataclasses import dataclass, field
from functools import lru_cache

from rdkit import Chem
from rdkit.Chem import rdMolDescriptors

from ._memo import Memo
from .reading.reaction import Component, Reaction
from .understand.graph import graph_of

__all__ = ["Balance", "balance", "element_counts"]

# Small molecules commonly left out of a drawn equation (common practice).
BY_PRODUCTS: tuple[tuple[str, str], ...] = (
    ("HCl", "Cl"), ("HBr", "Br"), ("HI", "I"), ("HF", "F"), ("H2O", "O"), ("CO2", "O=C=O"),
    ("CO", "[C-]#[O+]"), ("N2", "N#N"), ("NH3", "N"), ("H2", "[H][H]"), ("methanol", "CO"),
    ("ethanol", "CCO"), ("tert-butanol", "CC(C)(C)O"), ("isobutylene", "C=C(C)C"), ("acetic acid", "CC(=O)O"),
    ("trifluoroacetic acid", "OC(=O)C(F)(F)F"), ("p-toluenesulfonic acid", "Cc1ccc(cc1)S(=O)(=O)O"),
    ("methanesulfonic acid", "CS(=O)(=O)O"), ("triflic acid", "OS(=O)(=O)C(F)(F)F"),
    ("imidazole", "c1c[nH]cn1"), ("succinimide", "O=C1CCC(=O)N1"), ("SO2", "O=S=O"),
    ("trimethylamine", "CN(C)C"), ("dimethylamine", "CNC"), ("methyl hydrogen sulfate", "COS(=O)(=O)O"),
    ("NaCl", "[Na+].[Cl-]"), ("KCl", "[K+].[Cl-]"), ("NaBr", "[Na+].[Br-]"), ("KBr", "[K+].[Br-]"),
    ("NaI", "[Na+].[I-]"), ("KI", "[K+].[I-]"), ("AgI", "[Ag]I"), ("AgBr", "[Ag]Br"), ("AgCl", "[Ag]Cl"),
    ("H2SO4", "OS(=O)(=O)O"), ("HNO3", "O[N+](=O)[O-]"), ("benzyl alcohol", "OCc1ccccc1"),
    ("phenol", "Oc1ccccc1"), ("p-nitrophenol", "Oc1ccc(cc1)[N+](=O)[O-]"), ("HOBt", "On1nnc2ccccc21"),
    ("N-hydroxysuccinimide", "O=C1CCC(=O)N1O"), ("toluene", "Cc1ccccc1"),
    ("trimethylsilanol", "C[Si](C)(C)O"), ("chloride", "[Cl-]"), ("bromide", "[Br-]"), ("iodide", "[I-]"),
    ("ethyl chloride", "CCCl"), ("ethyl bromide", "CCBr"), ("ethyl iodide", "CCI"),
    ("methyl chloride", "CCl"), ("methyl bromide", "CBr"), ("methyl iodide", "CI"),
    ("3-chlorobenzoic acid", "OC(=O)c1cccc(Cl)c1"),
    ("DMSO (and the proton the base takes)", "CS(C)=O.[H+]"),
    ("dimethyl sulfide (and the proton the base takes)", "CSC.[H+]"),
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


# By-products formed from their parts rather than cut whole from a reactant, with the groups
# (SMARTS) one of the molecules on the other side must hold for them to appear. Product side:
# CO2 from a carbon with two oxygens (acids, carbonates, carbamates, Boc2O, CDI), CO from an
# oxalyl, formyl-O/N or metal carbonyl unit, isobutylene from a tert-butyl ester, carbamate or
# ether (acidic removal of Boc and tBu groups), H2 from a hydride or an active metal. Reactant side
# (a reagent needed on the left): CO2 and CO must end up on a product carbon. Common practice.
_NEVER = "[!*]"  # a query no molecule matches
_FORMED: dict[str, dict[str, tuple[str, ...]]] = {
    "CO2": {"product": ("[#6](~[#8])~[#8]",), "reactant": ("[#6](~[#8])~[#8]",)},
    "CO": {"product": ("[#6](=[#8])[#6]=[#8]", "[CX3H1](=O)[#7,#8]", "[#6-]#[#8+]"), "reactant": ("[#6]=[#8]",)},
    # Boc removal; as a reagent, only where a product gains a tert-butyl ester, ether or amine
    "isobutylene": {"product": ("[CX4]([CH3])([CH3])([CH3])[#8,#7]",), "reactant": ("[CX4]([CH3])([CH3])([CH3])[#8,#7]",)},
    "H2": {"product": ("[#1-]", "[#5,#13,#14;!H0]", "[Li,Na,K,Mg,Ca,Zn]"), "reactant": ()},
    # the alkyl halide of a Michaelis-Arbuzov reaction: from a trialkyl phosphite (or a
    # phosphonite) and the halide it displaces; never a reagent the equation asks for
    **{
        name: {"product": ("[CH3,$([CH2][CH3])][OX2][PX3]",), "reactant": (_NEVER,)}
        for name in ("ethyl chloride", "ethyl bromide", "ethyl iodide", "methyl chloride", "methyl bromide", "methyl iodide")
    },
    # a sulfoxonium or sulfonium ylide (Corey-Chaykovsky) leaves DMSO or dimethyl sulfide; the
    # base takes the proton of the salt
    "DMSO (and the proton the base takes)": {"product": ("[S+]([CH3])([CH3])=O",), "reactant": (_NEVER,)},
    "dimethyl sulfide (and the proton the base takes)": {
        "product": ("[S+;X3]([CH3])([CH3])[CH3]",), "reactant": (_NEVER,),
    },
    # HNO3 leaves only from a nitrate (nitric acid, a nitrate ester or salt, an acyl nitrate): a
    # C-nitro group that vanishes is reduced, not cut off as nitric acid
    "HNO3": {
        "product": ("[NX3+](=[OX1])([OX1-])[OX2,OX1-]", "[NX3](=[OX1])(=[OX1])[OX2]", "[NX2+](=O)=O"),
        "reactant": ("[$([NX3+](=O)[O-]),$([NX3](=O)=O)]",),
    },
}


@lru_cache(maxsize=1)
def _formed_queries() -> dict[tuple[str, str], tuple[Chem.Mol, ...]]:
    return {(name, side): tuple(Chem.MolFromSmarts(q) for q in qs) for name, sides in _FORMED.items() for side, qs in sides.items()}


@lru_cache(maxsize=1)
def _skeletons() -> dict[str, tuple[Chem.Mol, tuple[int, ...]]]:
    """For each carbon-bearing by-product: a query of its heavy-atom skeleton (elements,
    aromaticity and bond orders; charges and hydrogens free) and the heavy degree of each atom."""
    out = {}
    for name, smi in BY_PRODUCTS:
        mol = Chem.MolFromSmiles(smi)
        if not any(a.GetAtomicNum() == 6 for a in mol.GetAtoms()):
            continue
        if len(Chem.GetMolFrags(mol)) > 1:
            continue  # salts: formed from their ions
        bare = Chem.RWMol(mol)
        for a in bare.GetAtoms():
            a.SetFormalCharge(0)
        query = Chem.MolFromSmarts(Chem.MolToSmarts(bare))
        out[name] = (query, tuple(a.GetDegree() for a in mol.GetAtoms()))
    return out


def _cut_from(name: str, mols: tuple[Chem.Mol, ...], side: str) -> bool:
    """Whether the by-product ``name`` (missing on ``side``) can come from one of ``mols``: cut
    whole by breaking at most two bonds (its atoms there have at most two more heavy neighbours
    in all than in it), or, for the formed ones, from a group that gives it."""
    if name in _FORMED:
        queries = _formed_queries()[(name, side)]
        return not queries or any(m.HasSubstructMatch(q) for m in mols for q in queries)
    entry = _skeletons().get(name)
    if entry is None:
        return True
    query, degrees = entry
    for mol in mols:
        for match in mol.GetSubstructMatches(query, uniquify=False, maxMatches=200):
            extra = sum(mol.GetAtomWithIdx(i).GetDegree() - d for i, d in zip(match, degrees))
            if extra <= 2:
                return True
    return False


# Acids a hydrolysis frees from an amide or sulfonamide (N-deacetylation, removal of a
# trifluoroacetyl, tosyl or mesyl group): the acyl part as it stands on the nitrogen, the OH
# supplied by the water (common practice).
_HYDROLYSIS_ACIDS = {
    "acetic acid": "[CH3][CX3](=O)[#7]",
    "trifluoroacetic acid": "FC(F)(F)[CX3](=O)[#7]",
    "p-toluenesulfonic acid": "[CH3]c1ccc(cc1)[SX4](=O)(=O)[#7]",
    "methanesulfonic acid": "[CH3][SX4](=O)(=O)[#7]",
}


@lru_cache(maxsize=1)
def _hydrolysis_queries() -> dict[str, Chem.Mol]:
    return {name: Chem.MolFromSmarts(q) for name, q in _HYDROLYSIS_ACIDS.items()}


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
def _by_product_table() -> dict[frozenset, list[list[Missing]]]:
    """What up to two by-products (each 1 to 3 times) add, keyed by element vector and charge:
    every combination with that sum, singles first, in the order of BY_PRODUCTS."""
    table: dict[frozenset, list[list[Missing]]] = {}
    singles = []
    for name, formula, vec, q in _by_product_vectors():
        for k in (1, 2, 3):
            singles.append(((name, formula, k), Counter({e: n * k for e, n in vec.items()}), q * k))
    for info, vec, q in singles:
        if info[0] in _IONS and info[2] > 1:
            continue
        table.setdefault(_key(vec) | {("__q", q)}, []).append([Missing(info[0], info[1], info[2], "product")])
    for (a, va, qa), (b, vb, qb) in itertools.combinations(singles, 2):
        if a[0] == b[0] or a[2] > 2 or b[2] > 2 or a[0] in _IONS or b[0] in _IONS:
            continue
        key = _key(va + vb) | {("__q", qa + qb)}
        table.setdefault(key, []).append([Missing(a[0], a[1], a[2], "product"), Missing(b[0], b[1], b[2], "product")])
    return table


@lru_cache(maxsize=16)
def _coefficient_sets(n: int) -> tuple[tuple[int, ...], ...]:
    """Coefficients 1-3 for each of up to six species (1 each beyond), smallest sums first."""
    ranges = [range(1, 4)] * n if n <= 6 else [range(1, 2)] * n
    return tuple(sorted(itertools.product(*ranges), key=sum))


# Hydrogen or a hydrogenation catalyst or hydride in the flask: where H2 and another reagent
# (water) both close the equation, H2 is the one meant (a benzyl group leaves as toluene under
# hydrogenolysis, as benzyl alcohol on hydrolysis; common practice).
_REDUCING = Chem.MolFromSmarts("[$([H][H]),$([#1-]),Pd,Pt,Ni,Rh,Ru,Ir,$([#5,#13,#14;!H0])]")
# halide ions: the leaving group of a substitution by an anion drawn without its counter-ion
# (cyanide, azide, a sulfinate); alone and once, never combined with other by-products
_IONS = frozenset({"chloride", "bromide", "iodide"})
def _reducing(comp: Component) -> bool:
    symbols = set(graph_of(comp).symbol)  # element symbols, remembered per component text
    if symbols & {"H", "Pd", "Pt", "Ni", "Rh", "Ru", "Ir"}:
        return comp.mol.HasSubstructMatch(_REDUCING)
    return bool(symbols & {"B", "Al", "Si"}) and comp.mol.HasSubstructMatch(_REDUCING)


# a benzyl group leaves as toluene only by hydrogenolysis
_HYDROGENOLYSIS_ONLY = frozenset({"toluene"})


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
    products = reaction.products
    if not products:
        return Balance(False, False, checked=False)
    # an agent that is the same molecule as a product (the acid of a salt written beside the
    # product, HCl that ends as the hydrochloride) enters the equation on the left, as the
    # source of that product
    reactants = list(reaction.reactants)
    for prod in products:
        same = next((c for c in reaction.agents if c.smiles == prod.smiles and c not in reactants), None)
        if same is not None:
            reactants.append(same)
    reducing = any(_reducing(c) for c in reaction.reactants + reaction.agents)
    key = (tuple(c.smiles for c in reactants), tuple(c.smiles for c in products), reducing)
    hit = _BALANCED.get(key)
    if hit is None:
        hit = _BALANCED.put(key, _balance(reactants, products, reducing))
    drawn_ok, ok, coeffs, missing, residual, charge = hit
    species = reactants + products
    return Balance(drawn_ok, ok, {c.index: k for c, k in zip(species, coeffs)}, list(missing), dict(residual), charge)


def _reagent_and_by_product(diff: Counter, q: int, cut, reducing: bool = False) -> list[Missing] | None:
    candidates = _reagent_candidates(_key(diff), q)
    if reducing:
        candidates = sorted(candidates, key=lambda c: c[0] != "H2")  # stable: H2 first, then as listed
    for name, formula, k, options in candidates:
        right = None
        for found in options:
            if any(m.name in _IONS for m in found):
                continue  # a halide ion leaves alone, from an anion that substitutes it
            if all(cut(m.name, "product", name == "H2O") for m in found):
                right = [Missing(m.name, m.formula, m.count, "product") for m in found]
                break
        # one by-product; two under hydrogenolysis (a Cbz group leaves as toluene and CO2)
        two = reducing and name == "H2" and k == 1 and any(m.name == "toluene" for m in right or ())
        if right and (len(right) == 1 or two) and cut(name, "reactant"):
            return [Missing(name, formula, k, "reactant"), *right]
    return None


@lru_cache(maxsize=4096)
def _reagent_candidates(diff: frozenset, q: int) -> tuple:
    """(reagent, formula, count, by-product options) whose arithmetic closes ``diff`` (reactants
    minus products, as ``_key`` gives it): a reagent in, then one or two by-products out. The
    structure checks are the caller's; the arithmetic depends on the difference only."""
    table = _by_product_table()
    base = dict(diff)
    out = []
    for k in (1, 2, 3):
        for name, formula, vec, rq in _by_product_vectors():
            if rq:
                continue
            rest = dict(base)
            for e, n in vec.items():
                rest[e] = rest.get(e, 0) + k * n
            if any(v < 0 for v in rest.values()):
                continue
            rest = Counter({e: v for e, v in rest.items() if v})
            if not rest:
                continue
            options = table.get(_key(rest) | {("__q", q)})
            if options:
                out.append((name, formula, k, tuple(tuple(found) for found in options)))
    return tuple(out)


_ACIDS = frozenset({
    "HCl", "HBr", "HI", "HF", "acetic acid", "trifluoroacetic acid", "p-toluenesulfonic acid",
    "methanesulfonic acid", "triflic acid", "H2SO4", "HNO3",
})


def _spectator_salt(reactants, vectors, charges, drawn: Counter, drawn_q: int, lookup) -> Missing | None:
    """A base drawn among the reactants that stays out of the products (triethylamine in
    ``Et3N.RCOCl.R'NH2>>RCONHR'``) leaves as its salt with the acid the reaction releases: the
    difference is then that reactant plus one acid."""
    for c, vec, q in zip(reactants, vectors, charges):
        if not any(a.GetAtomicNum() == 7 and a.GetFormalCharge() == 0 for a in c.mol.GetAtoms()):
            continue
        rest = Counter(drawn)
        rest.subtract(vec)
        rest = Counter({e: v for e, v in rest.items() if v})
        if not rest or any(v < 0 for v in rest.values()):
            continue
        found = lookup(rest, drawn_q - q, "product")
        if found and len(found) == 1 and found[0].name in _ACIDS and found[0].count == 1:
            acid = found[0]
            formula = rdMolDescriptors.CalcMolFormula(c.mol) + "·" + acid.formula
            return Missing(f"the {acid.name} salt of {c.label}", formula, 1, "product")
    return None


def _balance(reactants: list[Component], products: list[Component], reducing: bool = False) -> tuple:
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
    sources = {
        "product": tuple(c.mol for c in reactants),  # a left-out by-product comes from a reactant
        "reactant": tuple(c.mol for c in products),  # a left-out reagent ends up in a product
    }

    cuts: dict[tuple[str, str, bool], bool] = {}  # (by-product, side, by hydrolysis) -> can come from that side

    def cut(name: str, side: str, hydrolysis: bool = False) -> bool:
        key = (name, side, hydrolysis and name in _HYDROLYSIS_ACIDS)
        hit = cuts.get(key)
        if hit is None:
            if name in _HYDROGENOLYSIS_ONLY and not reducing:
                hit = False
            else:
                hit = _cut_from(name, sources[side], side)
            if not hit and key[2]:
                # the acid freed by hydrolysing an amide or sulfonamide: its OH comes from the water
                query = _hydrolysis_queries()[name]
                hit = any(m.HasSubstructMatch(query) for m in sources[side])
            cuts[key] = hit
        return hit

    water_drawn = any(c.smiles == "O" for c in reactants)  # a hydrolysis with its water written

    def lookup(vec: Counter, q: int, side: str) -> list[Missing] | None:
        for found in table.get(_key(vec) | {("__q", q)}, ()):
            if all(cut(m.name, side, water_drawn and side == "product") for m in found):
                return [Missing(m.name, m.formula, m.count, side) for m in found]
        return None

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
                # a reagent left out on the left and a by-product on the right (a hydrolysis:
                # water in, HCl out)
                found = _reagent_and_by_product(diff, q, cut, reducing)
            cand = None
            if found and extra and any(m.name in _IONS for m in found):
                found = None  # a halide ion only as drawn, never with coefficients
            if found:
                needed = sum(1 for m in found if m.side == "reactant")
                cand = (extra + len(found) + 0.5 * needed, len(found), coeffs, found)
        if cand and (best is None or cand[:2] < best[:2]):
            best = cand
    if best is None and _key(drawn):
        # nothing closes it with coefficients: a reagent in and a by-product out even where the
        # difference is all on one side (a reduction drawn without its H2: water out, H2 in)
        found = _reagent_and_by_product(drawn, drawn_q, cut, reducing)
        if found:
            best = (0, len(found), ones, found)
    if best is not None:
        return (drawn_ok, True, tuple(best[2]), tuple(best[3]), {}, 0)
    salt = _spectator_salt(reactants, vectors, charges, drawn, drawn_q, lookup)
    if salt is not None:
        return (drawn_ok, True, ones, (salt,), {}, 0)
    return (
        False,
        False,
        tuple(1 for _ in species),
        (),
        {e: n for e, n in sorted(drawn.items()) if n},
        drawn_q,
    )
