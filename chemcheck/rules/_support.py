"""What several rules need to know: nucleophiles, acid-releasing electrophiles, the bases
present with their strength and amount, and Lewis-basic sites."""

from __future__ import annotations

from dataclasses import dataclass

from ..acid_base import Acceptor
from ..reading.reaction import Component
from . import Context

# nitrogen kinds whose lone pair is free to attack an electrophile (with an N-H to lose,
# except tertiary amines in alkylation)
NUCLEOPHILIC_N = {"primary_amine", "secondary_amine", "ammonia", "aryl_amine", "hydrazine", "hydroxylamine"}
LEWIS_BASIC_N = NUCLEOPHILIC_N | {"tertiary_amine", "pyridine_type", "amidine", "guanidine", "imine", "enamine"}

# acid released per reacting group, and the pKa of that acid (CRC; see basicity/acids.py)
ACID_RELEASING = {
    "acid_halide": "HX",
    "chloroformate": "HX",
    "carbamoyl_chloride": "HX",
    "carbonyl_dihalide": "HX",
    "sulfonyl_halide": "HX",
    "inorganic_acid_chloride": "HX",
    "anhydride": "carboxylic acid",
    "sulfonic_anhydride": "sulfonic acid",
    "alkyl_halide": "HX",
    "alkyl_sulfonate": "sulfonic acid",
}
ACYLATING = {"acid_halide", "chloroformate", "carbamoyl_chloride", "carbonyl_dihalide", "sulfonyl_halide", "anhydride", "sulfonic_anhydride", "inorganic_acid_chloride"}
ALKYLATING = {"alkyl_halide", "alkyl_sulfonate"}
HX_PKA = {"Cl": -6.0, "Br": -9.0, "I": -10.0, "F": 3.17}
SULFONIC_PKA = -2.0

# bases that are not nitrogen: conjugate-acid pKa of each proton they take (CRC, Bordwell for
# the very strong ones; see basicity/acids.py)
INORGANIC_BASE_SITES = {
    # a carbonate takes two protons and a bicarbonate one, irreversibly where CO2 can escape
    # (as it does from an open flask or a biphasic wash): counted as a strong scavenger
    "carbonate": (12.0, 12.0),
    "hydroxide": (14.0,),
    "alkoxide": (16.0,),
    "phenoxide": (10.0,),
    "carboxylate": (4.76,),
    "phosphate_base": (12.35,),
    "hydride_ion": (35.0,),
    "metal_amide": (36.0,),
    "organometallic_base": (45.0,),
}


# The same bases as they stand in an aqueous wash, where CO2 does not escape: a carbonate takes
# its first proton at 10.33 and a bicarbonate its only one at 6.35 (CRC, from memory)
AQUEOUS_BASE_SITES = {
    **INORGANIC_BASE_SITES,
    "carbonate": (10.33, 6.35),
    "hydroxide": (14.0,),
}


@dataclass
class Base:
    component: Component
    label: str
    pka: float
    mmol: float
    atom: int | None
    assumed: bool
    shown_pka: float | None = None  # the pKa of the species that takes the proton, for messages

    @property
    def display_pka(self) -> float:
        return self.pka if self.shown_pka is None else self.shown_pka

    def acceptor(self) -> Acceptor:
        return Acceptor(f"{self.label}#{self.atom}", self.pka, self.mmol)


def amount_mmol(ctx: Context, comp: Component, nominal: float = 1.0) -> tuple[float, bool]:
    """Moles of a component from the amounts, else the assumed 1 equiv (nominal 1 mmol)."""
    st = ctx.stoichiometry
    if st is not None:
        row = st.row_for(comp.index)
        if row is not None and row.mmol is not None:
            return row.mmol, False
        if row is not None and row.equiv is not None:
            # equivalents stated with no absolute amount anywhere: relative to the nominal
            # 1 equiv assumed for the others (0.5 equiv of base is half of what is needed)
            ref = st.reference.mmol if st.reference is not None and st.reference.mmol else 1.0
            return row.equiv * ref * nominal, True
        if st.reference is not None and st.reference.mmol:
            return st.reference.mmol * nominal, True
    return nominal, True


def amount_stated(ctx: Context, comp: Component) -> bool:
    """Whether the chemist gave this component an amount (absolute or in equivalents)."""
    st = ctx.stoichiometry
    row = st.row_for(comp.index) if st is not None else None
    return row is not None and (row.mmol is not None or row.equiv is not None)


def amounts_given(ctx: Context) -> bool:
    return ctx.stoichiometry is not None


def salt_info(ctx: Context, comp: Component) -> tuple[bool, list]:
    """(is an amine salt, the free-base sites) for a component."""
    p = ctx.perception(comp)
    strong_acid = p.has("hydrogen_halide", "sulfonic_acid", "perfluoro_acid")
    if not strong_acid and not any(s.kind == "ammonium" for s in p.nitrogens):
        return False, []  # neither an N-H+ nor a strong acid beside an amine: no pKa needed
    sites = ctx.sites(comp)
    ammonium = [s for s in sites if s.kind == "ammonium" and s.pka is not None]
    if ammonium:
        return True, ammonium
    if strong_acid and any(
        s.kind in NUCLEOPHILIC_N | {"tertiary_amine"} for s in sites
    ):
        return True, [s for s in sites if s.pka is not None]
    return False, []


def acid_written_beside(ctx: Context, comp: Component) -> Component | None:
    """A strong acid (HCl, HBr, TFA, a sulfonic acid) written as its own reactant right next to
    this amine reactant: its salt, as notebooks and patents write it (``Cl.NCc1ccccc1``) when
    the fragments are not grouped."""
    if comp.role != "reactant":
        return None
    for other in ctx.reaction.reactants:
        if abs(other.index - comp.index) != 1 or other.mol.GetNumHeavyAtoms() > 12:
            continue
        p = ctx.perception(other)
        if p.has("hydrogen_halide", "perfluoro_acid", "sulfonic_acid") and not p.basic_nitrogens:
            return other
    return None


def nucleophile_sites(ctx: Context, comp: Component, kinds=NUCLEOPHILIC_N):
    sites = [s for s in ctx.sites(comp) if s.pka is not None]
    out = []
    for s in sites:
        kind = s.kind
        if kind == "ammonium":
            # a salt: its free base's class
            kind = _free_kind(ctx, comp, s.atom_index)
        if kind in kinds:
            out.append(s)
    return out


def protonated_at(ctx: Context, comp: Component, site):
    """The site whose protonation takes ``site`` out of the reaction: ``site`` itself, or a more
    basic ring N of the aromatic ring system that carries it (an aminopyridine or aminopyridazine
    protonates on the ring N, and its cation's amino group no longer reacts). A basic site
    elsewhere in the molecule does not count: the nucleophile stays free beside it."""
    mol = comp.mol
    n = mol.GetAtomWithIdx(site.atom_index)
    info = mol.GetRingInfo()
    system: set[int] = set()
    for x in n.GetNeighbors():
        if not x.GetIsAromatic():
            continue
        frontier = {x.GetIdx()}
        while frontier:
            system |= frontier
            frontier = {
                j for r in info.AtomRings() if frontier & set(r) and all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in r)
                for j in r
            } - system
    best = site
    for s in ctx.sites(comp):
        if s.atom_index in system and s.pka is not None and s.kind != "ammonium" and s.pka > best.pka:
            best = s
    return best


def _free_kind(ctx: Context, comp: Component, idx: int) -> str:
    from ..basicity import _deprotonate
    from ..perceive import nitrogen_sites

    free = _deprotonate(comp.mol, idx)
    return {x.atom_index: x.kind for x in nitrogen_sites(free)}.get(idx, "")


def bases_present(ctx: Context, exclude: set[int], *, aqueous: bool = False) -> list[Base]:
    """Every proton acceptor among the reactants and agents outside ``exclude``; with
    ``aqueous``, the inorganic bases at their aqueous pKa (AQUEOUS_BASE_SITES)."""
    table = AQUEOUS_BASE_SITES if aqueous else INORGANIC_BASE_SITES
    out: list[Base] = []
    for comp in ctx.reaction.components:
        if comp.role == "product" or comp.index in exclude:
            continue
        if comp.kind == "solvent" and comp.kind_hint == "solvent" and not ctx.sites(comp):
            continue
        mmol, assumed = amount_mmol(ctx, comp)
        p = ctx.perception(comp)
        is_salt, _ = salt_info(ctx, comp)
        for s in ctx.sites(comp):
            if s.pka is None or s.kind == "ammonium" or s.kind == "amide_anion":
                continue
            if is_salt:
                continue
            out.append(Base(comp, comp.label, s.pka, mmol, s.atom_index, assumed))
        for g in p.groups:
            sites = table.get(g.name)
            if not sites:
                continue
            if g.name == "carboxylate" and p.has("carboxylic_acid"):
                continue
            if g.name == "carbonate" and comp.mol.GetAtomWithIdx(g.centre).GetTotalNumHs() == 0 and any(
                n.GetTotalNumHs() for n in comp.mol.GetAtomWithIdx(g.centre).GetNeighbors()
            ):
                sites = sites[-1:]  # bicarbonate: one proton, the carbonate's second
            shown = AQUEOUS_BASE_SITES.get(g.name, sites)
            if len(shown) != len(sites):
                shown = shown[-len(sites):]
            for pka, seen in zip(sites, shown):
                out.append(Base(comp, comp.label, pka, mmol, g.centre, assumed, seen))
    return out


def acids_brought_in(ctx: Context, exclude: set[int]) -> list[tuple[Component, float, float]]:
    """(component, pKa, mmol of protons) for acidic reagents: free acids and amine salts."""
    out = []
    for comp in ctx.reaction.components:
        if comp.role == "product" or comp.index in exclude:
            continue
        p = ctx.perception(comp)
        mmol, _ = amount_mmol(ctx, comp)
        is_salt, sites = salt_info(ctx, comp)
        if is_salt:
            out.append((comp, max(s.pka for s in sites), mmol))
            continue
        if p.has("perfluoro_acid") and not p.has("hydrogen_halide", "sulfonic_acid"):
            out.append((comp, 0.3, mmol))  # trifluoroacetic acid, pKa 0.2-0.5 (CRC)
        elif p.has("hydrogen_halide", "sulfonic_acid", "perfluoro_acid", "nitric_acid"):
            out.append((comp, -2.0, mmol))
        elif p.has("carboxylic_acid") and not p.has("carbonate") and comp.kind in ("acid", None, "other"):
            out.append((comp, 4.76, mmol))
    return out


def released_acid(groups) -> tuple[str, float]:
    """Name and pKa of the acid a reacting electrophile group releases."""
    g = groups[0]
    kind = ACID_RELEASING[g.name]
    if kind == "HX":
        x = g.detail or "Cl"
        if x not in HX_PKA:
            x = "Cl"
        return f"H{x}", HX_PKA[x]
    if kind == "carboxylic acid":
        return "carboxylic acid", 4.76
    return "sulfonic acid", SULFONIC_PKA


def electrophiles(ctx: Context, names=None) -> list[tuple[Component, list]]:
    names = names or set(ACID_RELEASING)
    out = []
    for comp in ctx.reaction.reactants + [a for a in ctx.reaction.agents if a.kind == "other"]:
        gs = [g for g in ctx.perception(comp).groups if g.name in names]
        if gs:
            out.append((comp, gs))
    return out


def changed_nitrogens(ctx: Context):
    """New bonds at nitrogens between reactants and products, read from the reaction's atom map
    (cached on the context)."""
    cached = getattr(ctx, "_new_n_bonds", None)
    if cached is None:
        from ..changes import new_bonds_at_nitrogen, new_bonds_from_map

        cached = []
        if ctx.reaction.products:
            amap = ctx.understanding.amap
            cached = new_bonds_from_map(ctx.reaction, amap)
            if amap.coverage < 1.0:
                # product atoms the map left open (a reaction drawn that cannot happen maps
                # only in part): the common-substructure route speaks for those
                cached += [
                    nb for nb in new_bonds_at_nitrogen(ctx.reaction)
                    if amap.origin(nb.product, nb.product_atom) is None
                ]
        ctx._new_n_bonds = cached
    return cached


def understood(ctx: Context):
    """The reaction's understanding when products are drawn (the centre needs them), else None:
    rules then fall back on what each component can do."""
    if not ctx.reaction.products:
        return None
    return ctx.understanding


def family_is(ctx: Context, *families: str) -> bool:
    """True when products are drawn and the reaction's class is of one of ``families``; also
    True when no product is drawn (nothing to contradict the rule's own reading)."""
    u = understood(ctx)
    return u is None or u.family in families


def acid_protons_in_salt(comp: Component) -> int:
    """How many protons an amine salt brings: 2 for a dihydrochloride, 1 for a hydrochloride
    (strong-acid fragments written beside the amine, or ammonium N-H+ centres when drawn as
    ions)."""
    from rdkit import Chem

    frags = Chem.GetMolFrags(comp.mol, asMols=False)
    n = 0
    for idx in frags:
        if len(idx) == 1:
            atom = comp.mol.GetAtomWithIdx(idx[0])
            if atom.GetSymbol() in ("Cl", "Br", "I") and atom.GetTotalNumHs() == 1:
                n += 1
    if n == 0:
        n = sum(1 for a in comp.mol.GetAtoms() if a.GetAtomicNum() == 7 and a.GetFormalCharge() > 0 and a.GetTotalNumHs() > 0)
    return max(n, 1)
