"""Pitfalls that follow from what a nitrogen is: its lone pair, its basicity, its hydrogens."""

from __future__ import annotations

import math
from functools import lru_cache

from rdkit import Chem

from ..acid_base import Acceptor, max_conversion, reaches
from . import Context, rule
from ._support import (
    ACID_RELEASING,
    ACYLATING,
    ALKYLATING,
    LEWIS_BASIC_N,
    NUCLEOPHILIC_N,
    acid_written_beside,
    acids_brought_in,
    amount_stated,
    amount_mmol,
    amounts_given,
    bases_present,
    changed_nitrogens,
    understood,
    family_is,
    acid_protons_in_salt,
    electrophiles,
    nucleophile_sites,
    protonated_at,
    released_acid,
    salt_info,
)

SAFETY = "Check the SDS of each reagent, local regulations and your institution's safety review before running it."

_KIND_WORD = {
    "primary_amine": "primary amine", "secondary_amine": "secondary amine", "tertiary_amine": "tertiary amine",
    "aryl_amine": "aryl amine", "pyridine_type": "pyridine-type", "amidine": "amidine", "guanidine": "guanidine",
    "imine": "imine", "enamine": "enamine", "ammonia": "ammonia", "hydrazine": "hydrazine",
    "hydroxylamine": "hydroxylamine", "amide": "amide", "sulfonamide": "sulfonamide", "carbamate": "carbamate",
    "imide": "imide", "urea": "urea", "pyrrole_type": "pyrrole-type", "nitro": "nitro",
    "quaternary_ammonium": "quaternary ammonium",
}


def _word(kind: str) -> str:
    return _KIND_WORD.get(kind, kind.replace("_", " "))


def _pct(x: float) -> str:
    """A conversion as a chemist would quote it: to the nearest 5 %."""
    return f"about {5 * round(20 * x):.0f} %"


# --------------------------------------------------------------------------- Lewis acids
def _lewis_basic_carbonyls(ctx: Context, comp) -> int:
    p = ctx.perception(comp)
    n = 0
    for g in p.groups:
        if g.name in ("ketone", "ester", "aldehyde"):
            n += 1
    n += sum(1 for s in p.nitrogens if s.kind in ("amide", "carbamate", "urea", "imide"))
    return n


@rule(
    id="lewis-acid-quenched-by-amine",
    title="A basic nitrogen quenches the Lewis acid",
    severity="error",
    applies_to=("friedel_crafts", "ring_substitution"),
)
def lewis_acid_quenched_by_amine(ctx: Context):
    """Basic nitrogen meets a Lewis acid.

    What it flags
        A Lewis acid (Al, Fe, B, Ti, Sn, Zn halides or triflates, BF3 etherate, ...) in the same
        reaction as a basic nitrogen (alkylamine, aryl amine, pyridine-type or imidazole N,
        amidine) in the substrate, a reagent or an additive. As an info note (a warning when
        the amounts fall short) it also counts the Lewis acid that amide and ketone carbonyls
        and the product ketone of an acylation tie up.

    Why it matters
        The nitrogen's lone pair binds the Lewis acid before it can activate the electrophile.
        In Friedel–Crafts and other ring substitutions the N-bound complex also turns an
        activating amino group into a strongly deactivating one, so anilines do not undergo
        Friedel–Crafts reactions. Carbonyl groups bind AlCl3 too, which is why Friedel–Crafts
        acylations need more than one equivalent.

    Example
        ``Nc1ccccc1.CC(=O)Cl>AlCl3>CC(=O)c1ccc(N)cc1``: the aniline nitrogen takes the AlCl3.

    Use instead
        Protect the nitrogen as an amide (acetanilide from acetic anhydride), run the reaction,
        then hydrolyse the amide. Count one equivalent of Lewis acid for each Lewis-basic site
        plus one for the product ketone of an acylation. Leave amine bases out of Lewis-acid
        steps.

    References
        J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 21
        (electrophilic aromatic substitution; anilines and Friedel–Crafts).
        M. B. Smith, *March's Advanced Organic Chemistry*, 8th ed., Wiley 2020, ch. 11
        (Friedel–Crafts acylation: stoichiometric Lewis acid, complexation by the product).
    """
    r = lewis_acid_quenched_by_amine.rule
    rxn = ctx.reaction
    u = understood(ctx)
    if u is not None and u.family not in ("friedel_crafts", "ring_substitution"):
        # the Lewis acid has another job here (a catalyst, a water scavenger in an imine
        # formation, CeCl3 beside NaBH4, CuI in an N-arylation): nothing for an amine to quench
        return
    acids = []
    for comp in rxn.reactants + rxn.agents:
        if u is not None and u.role(comp) not in ("lewis_acid", None):
            continue
        for g in ctx.perception(comp).groups:
            if g.name == "lewis_acid":
                acids.append((comp, g))
    if not acids:
        return
    la_comp, la_group = acids[0]
    la_names = ", ".join(dict.fromkeys(c.label for c, _ in acids))
    acylation = any(
        ctx.perception(c).has("acid_halide", "anhydride") for c in rxn.reactants + rxn.agents if c.index != la_comp.index
    )
    ring_substitution = acylation or any(
        ctx.perception(c).has("acid_halide", "alkyl_halide", "halogen", "nitrating_agent", "anhydride")
        for c in rxn.reactants + rxn.agents
    )
    fired = False
    for comp in rxn.reactants + rxn.agents:
        if comp.index in {c.index for c, _ in acids}:
            continue
        if salt_info(ctx, comp)[0]:
            continue
        if u is not None and u.role(comp) in ("ligand", "workup", "solvent"):
            continue  # TMEDA on the organolithium of another step, an aqueous quench
        sites = [
            s for s in ctx.sites(comp)
            if s.kind in LEWIS_BASIC_N and s.pka is not None and s.pka >= -1.0
        ]
        if not sites:
            continue
        fired = True
        best = max(sites, key=lambda s: s.pka)
        where = "substrate" if comp.role == "reactant" else "additive"
        msg = (
            f"{la_names} will be taken up by the {_word(best.kind)} nitrogen of {comp.label} "
            f"(pKa {best.pka:.1f}, the {where}) before it can activate the reaction: the nitrogen's lone pair "
            "binds the Lewis acid."
        )
        aromatic_n = best.kind in ("aryl_amine",) or comp.mol.GetAtomWithIdx(best.atom_index).GetIsAromatic()
        if ring_substitution and comp.role == "reactant" and aromatic_n:
            msg += (
                " The N–Lewis acid complex also turns the nitrogen into a strongly deactivating group, so the ring "
                "substitution stalls."
            )
        if comp.role == "agent":
            fix = (
                f"Leave {comp.label} out of the Lewis-acid step (it is not needed to take up HCl in a "
                "Friedel–Crafts reaction), or use a Lewis acid the amine does not bind."
            )
        elif comp.mol.GetAtomWithIdx(best.atom_index).GetTotalNumHs() > 0:
            fix = (
                f"Protect the nitrogen of {comp.label} as an amide (e.g. the acetamide from Ac2O), run the "
                "reaction, then hydrolyse the amide."
            )
        else:
            # name the nitrogen: a substrate with a second, N-H amine (2-aminopyridine) would
            # otherwise read as if it had no N-H at all
            other_nh = any(
                s.atom_index != best.atom_index and comp.mol.GetAtomWithIdx(s.atom_index).GetTotalNumHs() > 0
                for s in sites
            )
            fix = (
                f"The {_word(best.kind)} nitrogen of {comp.label} carries no N–H, so it cannot be protected as an "
                "amide"
                + (" (protecting its N–H amine would leave this nitrogen free)" if other_nh else "")
                + ": run the Lewis-acid step before this nitrogen is introduced, or use a reaction that needs no "
                "Lewis acid (for a formyl group on an electron-rich aniline, the Vilsmeier–Haack reaction)."
            )
        need = len(sites) + _lewis_basic_carbonyls(ctx, comp) + (1 if acylation else 0)
        fix += f" Count at least {need} equiv of Lewis acid for this substrate ({len(sites)} basic N"
        fix += f", {_lewis_basic_carbonyls(ctx, comp)} carbonyl" if _lewis_basic_carbonyls(ctx, comp) else ""
        fix += ", 1 for the product ketone" if acylation else ""
        fix += ")"
        if amounts_given(ctx):
            have, assumed = amount_mmol(ctx, la_comp)
            ref = ctx.stoichiometry.reference
            if not assumed and ref is not None and ref.mmol:
                fix += f"; {have / ref.mmol:.2g} equiv present"
        fix += "."
        atoms = [(comp.index, s.atom_index) for s in sites] + [(la_comp.index, la_group.centre)]
        # an amine among the agents of a patent-style list may belong to another step of the
        # procedure: a warning; the substrate's own nitrogen is an error
        own = comp.role == "reactant" or u is None or u.role(comp) == "base"
        yield r.finding(msg, atoms=atoms, fix=fix, severity="error" if own else "warning")
    if fired or not acylation:
        return
    # no basic nitrogen: count what the carbonyls and the product ketone tie up
    for comp in rxn.reactants:
        if ctx.perception(comp).has("acid_halide", "anhydride"):
            continue
        carbonyls = _lewis_basic_carbonyls(ctx, comp)
        amide_n = [s for s in ctx.perception(comp).nitrogens if s.kind in ("amide", "carbamate", "urea", "imide")]
        if not carbonyls:
            continue
        need = carbonyls + 1
        have = None
        if amounts_given(ctx):
            mmol, assumed = amount_mmol(ctx, la_comp)
            sub, sub_assumed = amount_mmol(ctx, comp)
            if not assumed and not sub_assumed and sub:
                have = mmol / sub
        text = (
            f"The carbonyl{'s' if carbonyls > 1 else ''} of {comp.label} and the product ketone each bind "
            f"{la_comp.label}: a Friedel–Crafts acylation of this substrate needs at least {need} equiv"
        )
        severity = "info"
        if have is not None:
            text += f"; {have:.2g} equiv present"
            if have < need - 0.05:
                severity = "warning"
                text += f", so at most about {max(have - carbonyls, 0):.2g} equiv is free to activate the acylating agent"
        text += "."
        atoms = [(comp.index, s.atom_index) for s in amide_n] + [(la_comp.index, la_group.centre)]
        yield r.finding(
            text,
            atoms=atoms,
            fix=f"Use {need + 0.1:.1f}–{need + 0.5:.1f} equiv of {la_comp.label} relative to {comp.label}.",
            severity=severity,
        )


# --------------------------------------------------------------------------- acid scavenging
def _nucleophile(ctx: Context, electrophile):
    """The component whose nitrogen attacks the electrophile, and that nitrogen's site."""
    changed = {nb.reactant: nb for nb in changed_nitrogens(ctx)}
    cands = []
    for comp in ctx.reaction.reactants:
        if comp.index == electrophile.index:
            continue
        sites = nucleophile_sites(ctx, comp)
        if not sites:
            continue
        if changed and comp.index in changed:
            site = next((s for s in sites if s.atom_index == changed[comp.index].reactant_atom), sites[0])
            return comp, site
        cands.append((comp, max(sites, key=lambda s: s.pka)))
    if not cands:
        return None, None
    return max(cands, key=lambda cs: cs[1].pka)


# families whose centre releases an acid the amine can take
_ACID_FAMILIES = {"acylation", "sulfonylation", "alkylation", "urea", "protection"}


def _acid_events(ctx: Context):
    """(electrophile, its atoms to show, nucleophile, its site, acid name, acid pKa, acid per
    nucleophile) for each acid-releasing N-acylation or N-alkylation. With products drawn, read
    from the reaction's class and centre (the bond that breaks is the one that releases the
    acid: a C-Cl that survives into the product releases nothing); without, from the groups."""
    u = understood(ctx)
    comps = ctx.reaction.components
    if u is None:
        for elec, groups in electrophiles(ctx, set(ACID_RELEASING)):
            nuc, site = _nucleophile(ctx, elec)
            if nuc is None:
                continue
            name, pka = released_acid(groups)
            per = 2.0 if groups[0].name == "carbonyl_dihalide" else 1.0
            atoms = [(elec.index, groups[0].atoms[-1]), (elec.index, groups[0].centre)]
            yield elec, atoms, nuc, site, name, pka, per, 1.0
        return
    if u.family not in _ACID_FAMILIES or u.nucleophile is None or u.electrophile is None:
        return
    acid = u.released_acid(ctx.reaction)
    if acid is None:
        return
    nuc, elec = comps[u.nucleophile[0]], comps[u.electrophile[0]]
    if nuc.index == elec.index or nuc.role == "product" or elec.role == "product":
        return
    site = next((x for x in nucleophile_sites(ctx, nuc) if x.atom_index == u.nucleophile[1]), None)
    if site is None:
        return
    if any(a == u.nucleophile and d > 0 for a, d in u.centre.charge_changes):
        return  # drawn as the ammonium salt: the acid stays on the product
    # acid per nucleophile: the balanced equation's coefficients (a bis-acylation takes two
    # acid chlorides per diamine and releases two HCl), else the bonds of the centre
    b = ctx.balance
    k = 1.0  # electrophile molecules per nucleophile molecule
    if b.balanced and b.coefficients.get(nuc.index) and b.coefficients.get(elec.index):
        k = b.coefficients[elec.index] / b.coefficients[nuc.index]
    if u.class_id == "urea.carbonyl_transfer":
        k = min(k, 0.5)  # phosgene or triphosgene: two amines and two HCl per carbonyl
    # ``per``: acid released and nucleophiles consumed per electrophile (2 for phosgene);
    # a nucleophile that takes several electrophiles counts as that many reacting N
    per, sites_per_molecule = (1.0 / k, 1.0) if k < 1 else (1.0, k)
    atoms = [u.electrophile]
    leaving = u.leaving_atom()
    if leaving is not None and leaving[0] == elec.index:
        atoms.insert(0, leaving)
    yield elec, atoms, nuc, site, acid[0], acid[1], per, sites_per_molecule


def _base_advice(pka_nuc: float) -> str:
    if pka_nuc < 6.5:
        return "pyridine (pKa 5.2), Et3N or aqueous NaHCO3"
    return "Et3N (pKa 10.7) or DIPEA, or aqueous NaOH or K2CO3 in a biphasic (Schotten–Baumann) set-up"


@rule(
    id="acid-scavenger-short",
    title="Too little base for the acid the reaction releases",
    severity="error",
    applies_to=("acylation", "sulfonylation", "alkylation", "urea", "protection"),
)
def acid_scavenger_short(ctx: Context):
    """Count the protons an N-acylation or N-alkylation releases against the bases present.

    What it flags
        An acylation (acid chloride, sulfonyl chloride, chloroformate, carbamoyl chloride,
        anhydride) or N-alkylation (alkyl halide or sulfonate) of an amine in which the acid
        released (HX, a sulfonic or carboxylic acid), plus any acid brought in, is more than the
        bases present can take up, so that part of the amine ends up as its unreactive salt.
        The proton bookkeeping of ``chemcheck.acid_base`` gives the largest conversion reachable.
        An amino acid counts with its own proton: in water its acid group has protonated its
        amine (a zwitterion), and a base must free the amine first. Without amounts one
        equivalent of each reactant and agent is assumed (and the finding is a warning).

    Why it matters
        Each turnover releases one equivalent of acid. Without another base it protonates the
        starting amine, which then cannot react: with one equivalent of amine the reaction stops
        at 50 %. A base weaker than the amine (pyridine against an alkylamine) takes the acid only
        as far as the equilibrium allows. Carboxylic acids from anhydrides are weaker than HCl,
        but still protonate alkylamines almost completely.

    Example
        ``CCCCN.CC(=O)Cl>>CCCCNC(C)=O`` with one equivalent of each: at most 50 %.

    Use instead
        Add at least one equivalent of a base at least as strong as the amine (Et3N, DIPEA), or
        use two equivalents of the amine, or run under Schotten–Baumann conditions with aqueous
        NaOH or carbonate.

    References
        J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 10
        (nucleophilic substitution at the carbonyl group; amide formation from acid chlorides).
        C. A. G. N. Montalbetti, V. Falque, Tetrahedron 2005, 61, 10827 (amide bond formation).
    """
    r = acid_scavenger_short.rule
    for elec, elec_atoms, nuc, site, acid_name, acid_pka, per, sites_per_molecule in _acid_events(ctx):
        if salt_info(ctx, nuc)[0] or acid_written_beside(ctx, nuc) is not None:
            continue  # amine-salt-not-freed covers a salt used as the nucleophile
        n_nuc, a1 = amount_mmol(ctx, nuc)
        n_nuc *= sites_per_molecule  # a diamine acylated twice: two reacting N per molecule
        n_e, a2 = amount_mmol(ctx, elec)
        # an amount not given follows the balanced equation, not a flat 1 equiv: the drawn
        # bis-amide takes two acid chlorides per diamine, phosgene two amines
        if a2 and not a1 and sites_per_molecule > 1:
            n_e = n_nuc
        elif a2 and a1:
            n_e = n_nuc / per
        bases = bases_present(ctx, {nuc.index, elec.index})
        brought = acids_brought_in(ctx, {nuc.index, elec.index} | _acyl_sources(ctx, nuc))
        protons = sum(m for _, _, m in brought)
        # an amino acid brings its own proton: its acid group has protonated its amine
        # (a zwitterion), and a base must take that proton before the amine can react
        internal = n_nuc if "zwitterion" in (site.method or "") else 0.0
        protons += internal
        assumed = a1 or a2 or any(b.assumed for b in bases)
        balance_args = dict(
            acid_per_turnover=per, released_pka=acid_pka, protons_present=protons, nucleophile_per_turnover=per
        )
        taken = protonated_at(ctx, nuc, site)  # where the released acid puts its proton
        nucleophile = Acceptor("nucleophile", taken.pka, n_nuc)
        acceptors = [b.acceptor() for b in bases]
        # The acylation or alkylation is irreversible: a base weaker than the amine, present in
        # enough equivalents to hold all the acid, still takes the reaction to completion (the
        # small free-amine fraction keeps reacting; pyridine is also a nucleophilic catalyst).
        # The ceiling applies only when the acid has no base to go to but the nucleophile.
        holders = [b for b in bases if b.pka >= acid_pka + 2.0]
        capacity = sum(b.mmol for b in holders)
        needed = per * min(n_e, n_nuc / per) + protons
        # a strong enough base listed without an amount: the patent or plan does not say how
        # much, and 1 equiv assumed against 2 HCl would be a guess dressed as a finding
        unknown_holder = any(not amount_stated(ctx, b.component) for b in holders)
        if holders and (capacity >= 0.9 * needed or unknown_holder):
            strongest = max(holders, key=lambda b: b.pka)
            if strongest.pka < taken.pka - 1.5 and not assumed:
                yield r.finding(
                    f"The base {strongest.label} (conjugate-acid pKa {strongest.display_pka:.1f}) is weaker than {nuc.label} "
                    f"(pKa {taken.pka:.1f}): it holds the {acid_name} released, but most of the amine not yet "
                    "reacted sits as its salt, so the reaction may be slower than with Et3N or DIPEA. It still goes "
                    "to completion: the bond-forming step is irreversible.",
                    atoms=[(nuc.index, site.atom_index), *elec_atoms],
                    fix=f"For a faster reaction use 1.1–1.5 equiv of Et3N or DIPEA; {strongest.label} in excess also works.",
                    severity="info",
                )
            continue
        if reaches(nucleophile, n_e, acceptors, 0.9, **balance_args):
            continue  # 90 % of the stoichiometric limit is reached: nothing to report
        x = max_conversion(nucleophile, n_e, acceptors, **balance_args)
        limit = min(n_e, n_nuc / per)
        reach = x * n_e / limit if limit > 0 else 1.0
        if reach >= 0.9:
            continue
        parts = [
            f"At most {_pct(min(reach, 1.0))} conversion: the {acid_name} released by {elec.label} protonates the "
            f"remaining {nuc.label} (pKa {taken.pka:.1f}"
            + (f", at its {_word(taken.kind)} N" if taken is not site else "")
            + "), which then cannot react."
        ]
        if internal:
            parts.append(
                f"{nuc.label} is an amino acid: its own acid group protonates its amine (a zwitterion), so one "
                "equivalent of base goes to freeing the amine before any takes up the released acid."
            )
        if acid_pka > 0:
            k = taken.pka - acid_pka
            parts.append(
                f"{acid_name[0].upper() + acid_name[1:]} (pKa {acid_pka:.1f}) is weaker than HCl but still protonates "
                f"the amine: K ≈ 10^{k:.1f}."
            )
        if bases:
            # in the chemist's equivalents: relative to the reference row of the table
            st = ctx.stoichiometry
            ref = st.reference.mmol if st is not None and st.reference is not None and st.reference.mmol else n_e
            strongest = max(bases, key=lambda b: b.pka)
            eq = sum(b.mmol for b in bases if b.atom == strongest.atom and b.component.index == strongest.component.index) / ref
            if strongest.pka < taken.pka - 1.5:
                parts.append(
                    f"The strongest base present, {strongest.label} (conjugate-acid pKa {strongest.display_pka:.1f}), "
                    "is too weak to take the "
                    f"proton from the protonated {nuc.label}."
                )
            else:
                parts.append(f"The base present, {strongest.label}, is {eq:.2g} equiv: not enough.")
        else:
            parts.append("No other base is present.")
        if brought:
            parts.append("Acid brought in: " + ", ".join(f"{c.label}" for c, _, _ in brought) + ".")
        if assumed:
            parts.append("(Amounts not given for every component: 1 equiv assumed.)")
        need = per + protons / max(n_e, 1e-9)
        fix = (
            f"Add at least {need + 0.1:.1f} equiv of a base at least as strong as {nuc.label}, such as "
            f"{_base_advice(taken.pka)}"
            # more of an amino acid brings more of its own protons: no help
            # (a diamine acylated on both N has no spare N to give: the base is the fix)
            + ("." if internal or sites_per_molecule > 1 else f"; or use {2 * per:.0f} equiv of {nuc.label}.")
        )
        atoms = [(nuc.index, site.atom_index), *elec_atoms]
        yield r.finding(" ".join(parts), atoms=atoms, fix=fix, severity="warning" if assumed else "error")


# --------------------------------------------------------------------------- amine salts
_SALT_NAMES = (
    ("hydrogen_halide", {"Cl": "hydrochloride", "Br": "hydrobromide", "I": "hydroiodide"}),
    ("perfluoro_acid", "trifluoroacetate"),
    ("sulfonic_acid", "sulfonate salt"),
)


def _salt_name(ctx: Context, comp) -> str:
    p = ctx.perception(comp)
    for a in comp.mol.GetAtoms():
        if a.GetFormalCharge() < 0 and a.GetDegree() == 0:
            return {"Cl": "hydrochloride", "Br": "hydrobromide", "I": "hydroiodide"}.get(a.GetSymbol(), "salt")
    if p.has("hydrogen_halide"):
        g = [g for g in p.groups if g.name == "hydrogen_halide"][0]
        return {"Cl": "hydrochloride", "Br": "hydrobromide", "I": "hydroiodide"}.get(comp.mol.GetAtomWithIdx(g.centre).GetSymbol(), "salt")
    if p.has("perfluoro_acid") or any(a.GetSymbol() == "F" for a in comp.mol.GetAtoms()):
        return "trifluoroacetate" if p.has("perfluoro_acid", "carboxylate") else "salt"
    if p.has("sulfonic_acid") or any(a.GetSymbol() == "S" for a in comp.mol.GetAtoms()):
        smi = comp.smiles
        if "c1ccc(C)cc1" in smi or "Cc1ccc" in smi:
            return "tosylate"
        if "CS(=O)(=O)" in smi:
            return "mesylate"
        return "sulfate"
    return "salt"


@rule(
    id="amine-salt-not-freed",
    title="An amine salt is used without a base to free it",
    severity="error",
    applies_to=("acylation", "sulfonylation", "alkylation", "urea", "protection", "condensation", "reductive_amination", "snar", "metal_n_arylation", "quaternisation"),
)
def amine_salt_not_freed(ctx: Context):
    """An amine weighed as its salt is the nucleophile, with too little base to free it.

    What it flags
        A reactant that is an amine salt (hydrochloride, hydrobromide, trifluoroacetate, sulfate,
        tosylate, mesylate, or a drawn ammonium ion) used as the nucleophile with an
        electrophile, without at least one extra equivalent of a base strong enough to take its
        proton, on top of what the reaction's own acid needs.

    Why it matters
        A protonated nitrogen has no lone pair: it does not attack acid chlorides, alkyl halides
        or carbonyls. Each equivalent of salt needs one equivalent of base just to become the
        free amine; an acylation then needs a second for the HCl it releases.

    Example
        ``Cl.NCc1ccccc1`` (benzylamine hydrochloride) with acetyl chloride and 1 equiv of Et3N:
        one equivalent frees the amine, none is left for the HCl formed.

    Use instead
        Add one more equivalent of Et3N or DIPEA (two in all for an acylation, one for a
        condensation), or free-base the salt first (aqueous NaOH or K2CO3, extract, dry).

    References
        P. Wipf, "Handbook of reagents: amine salts" (common practice); J. Clayden, N. Greeves,
        S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 8 (acidity, basicity and pKa).
    """
    r = amine_salt_not_freed.rule
    rxn = ctx.reaction
    u = understood(ctx)
    for comp in rxn.reactants + (rxn.agents if u is not None else []):
        is_salt, sites = salt_info(ctx, comp)
        beside = None
        if (
            not is_salt and u is not None and u.family != "reductive_amination"
            and u.nucleophile is not None and u.nucleophile[0] == comp.index
        ):
            beside = acid_written_beside(ctx, comp)
            if beside is not None:
                is_salt, sites = True, [s for s in nucleophile_sites(ctx, comp) if s.atom_index == u.nucleophile[1]]
        if not is_salt or not sites:
            continue
        if u is not None:
            # with products drawn: only the salt whose nitrogen the centre says reacts (NH4Cl
            # or brine among the agents is work-up or an ammonia source, not a salt to free)
            if u.nucleophile is None or u.nucleophile[0] != comp.index or u.family in ("acid_base", "deprotection", "other"):
                continue
            if u.family == "reductive_amination":
                yield r.finding(
                    f"{comp.label} is an amine salt in a reductive amination: the salt buffers the imine formation and "
                    "no acid is released, so no extra base is needed (a little AcOH or NaOAc is common).",
                    atoms=[(comp.index, x.atom_index) for x in sites],
                    fix="Nothing to add; if the imine forms slowly, add 1 equiv of Et3N or NaOAc.",
                    severity="info",
                )
                continue
        others = [c for c in rxn.reactants + rxn.agents if c.index != comp.index]
        acyl = [c for c in others if ctx.perception(c).has(*ACYLATING)]
        alkyl = [c for c in others if ctx.perception(c).has(*ALKYLATING)]
        carbonyl = [c for c in others if ctx.perception(c).has("aldehyde", "ketone", "isocyanate", "dicarbonate")]
        if not (acyl or alkyl or carbonyl):
            continue
        pka = max(s.pka for s in sites)
        acid_need = 1.0 if (acyl or alkyl) else 0.0
        if u is not None:
            acid_need = 1.0 if u.released_acid(rxn) is not None else 0.0
        elec = (acyl or alkyl or carbonyl)[0]
        n_salt, a1 = amount_mmol(ctx, comp)
        exclude = {comp.index, elec.index}
        bases = bases_present(ctx, exclude)
        strong = [b for b in bases if b.pka >= pka - 1.0]
        weak = [b for b in bases if b.pka < pka - 1.0]
        have = sum(b.mmol for b in strong) / n_salt if n_salt else 0.0
        if any(not amount_stated(ctx, b.component) for b in strong):
            continue  # a strong enough base listed without an amount: how much is not known
        # a dihydrochloride brings two protons; an acid written beside the amine, one
        need = (1 if beside is not None else acid_protons_in_salt(comp)) + acid_need
        if have + 0.05 >= need:
            continue
        assumed = a1 or any(b.assumed for b in bases)
        atoms = [(comp.index, s.atom_index) for s in sites]
        if beside is None and len(Chem.GetMolFrags(comp.mol)) == 1 and not any(a.GetFormalCharge() for a in comp.mol.GetAtoms()):
            # the acid is on the amine's own molecule (an aminosulfonic acid): an inner salt
            # whose share of free amine depends on the pH; patents often leave the pH
            # adjustment out of the reagent list
            yield r.finding(
                f"{comp.label} carries an acid group on the same molecule as its amine (pKa {pka:.1f}): in solution "
                "it is largely an inner salt (zwitterion), its nitrogen protonated, and the free amine it needs to "
                f"react is formed only as a base takes that proton; {have:.2g} equiv of a strong enough base present."
                + (" (Amounts not given for every component: 1 equiv assumed.)" if assumed else ""),
                atoms=atoms,
                fix=f"Dissolve {comp.label} as its sodium salt (1 equiv of NaHCO3 or Na2CO3 per acid group) and keep "
                "the pH near 7–8 while the electrophile is added.",
                severity="warning",
            )
            continue
        salt = _salt_name(ctx, beside or comp)
        msg = (
            (f"{comp.label} is written with {beside.label} beside it, as its {salt} (pKa {pka:.1f}): " if beside is not None
             else f"{comp.label} is the {salt} of an amine (pKa {pka:.1f}): ")
            + "its nitrogen carries a proton and cannot react "
            f"until a base takes it off. It needs {need:g} equiv of a base with a conjugate-acid pKa of about {pka - 1:.0f} "
            f"or more ({need - acid_need:g} to free the amine"
            + (", 1 for the acid the reaction releases" if acid_need else "")
            + f"); {have:.2g} equiv present."
        )
        if weak:
            w = max(weak, key=lambda b: b.pka)
            msg += f" {w.label} (pKa {w.display_pka:.1f}) is too weak to free it."
        if assumed:
            msg += " (Amounts not given for every component: 1 equiv assumed.)"
        yield r.finding(
            msg,
            atoms=atoms,
            fix=f"Add {need - have:.1f} more equiv of Et3N or DIPEA, or free-base {comp.label} first "
            "(aqueous NaOH or K2CO3, extract into an organic solvent, dry).",
            severity="warning" if assumed and strong else "error",
        )


# --------------------------------------------------------------------------- impossible bonds
# N-H acidity on the DMSO scale, where deprotonations for N-alkylation and N-acylation are run
# (F. G. Bordwell, Acc. Chem. Res. 1988, 21, 456, and the Bordwell pKa table: acetamide 25.5,
# benzamide 23.3, acetanilide 21.5, methyl carbamate 24.8, urea 26.9, benzenesulfonamide 16.1,
# phthalimide 13.4, succinimide 14.7, pyrrole 23.0, indole 21.0, carbazole 19.9; the lactam
# 2-pyrrolidinone 24.2 from memory)
_NH_DMSO = {"sulfonamide": 16.1, "imide": 14.0, "amide": 24.0, "carbamate": 24.8, "urea": 26.9}
_PYRROLE_DMSO = {0: ("pyrrole", 23.0), 1: ("indole", 21.0), 2: ("carbazole", 19.9)}
# the conjugate acids of the bases, on the same scale (Bordwell table: Et3NH+ 9.0, pyridinium
# 3.4, acetic acid 12.3, phenol 18.0, water 31.4, tert-butanol 32.2, diisopropylamine 36,
# hexamethyldisilazane 26 (from memory), H2 taken as 35; DBU-H+ 13.9 and TMG-H+ 13.2 from memory)
_AMINE_BASE_DMSO = {"tertiary_amine": 9.0, "secondary_amine": 10.5, "primary_amine": 11.0, "pyridine_type": 3.4, "amidine": 13.9, "guanidine": 13.2}
_GROUP_BASE_DMSO = {
    "hydride_ion": 35.0, "metal_amide": 36.0, "organometallic_base": 45.0, "alkoxide": 32.2,
    "hydroxide": 31.4, "phenoxide": 18.0, "carboxylate": 12.3,
}
# Carbonates and phosphates have no meaningful DMSO pKa (they act as suspended solids); in DMF,
# DMSO, MeCN or acetone, K2CO3 and Cs2CO3 N-alkylate sulfonamides, imides, carbazoles and indoles
# (common practice), not amides or carbamates: taken as reaching N-H acids up to pKa 21.
_CARBONATE_REACH = 21.0


def _strongest_base_dmso(ctx: Context) -> tuple[float, str] | None:
    """(DMSO-scale strength, the base's label) of the strongest base among reactants and agents."""
    best: tuple[float, str] | None = None
    for comp in ctx.reaction.reactants + ctx.reaction.agents:
        p = ctx.perception(comp)
        if salt_info(ctx, comp)[0]:
            continue
        values = [_GROUP_BASE_DMSO[g.name] for g in p.groups if g.name in _GROUP_BASE_DMSO]
        if comp.mol.GetNumAtoms() == 1 and comp.mol.GetAtomWithIdx(0).GetSymbol() in ("Li", "Na", "K", "Cs"):
            values.append(35.0)  # an alkali metal (or its N-H salt recorded as the metal) takes the proton
        if p.has("carbonate", "phosphate_base"):
            values.append(_CARBONATE_REACH)
        if not p.has(*ACYLATING, "alkyl_halide", "alkyl_sulfonate"):
            values += [_AMINE_BASE_DMSO[s.kind] for s in p.nitrogens if s.kind in _AMINE_BASE_DMSO]
        for v in values:
            if best is None or v > best[0]:
                best = (v, comp.label)
    return best


def _nh_acidity(mol, idx: int, kind: str) -> tuple[str, float] | None:
    """(what the N-H is, its DMSO pKa), or None for an azole N-H that reacts as a neutral
    nucleophile through its other ring N (imidazoles, pyrazoles, triazoles)."""
    if kind == "pyrrole_type":
        atom = mol.GetAtomWithIdx(idx)
        info = mol.GetRingInfo()
        ring = next((r for r in info.AtomRings() if idx in r and len(r) == 5), None)
        if ring is None:
            return None
        if any(mol.GetAtomWithIdx(i).GetAtomicNum() == 7 and i != idx for i in ring):
            return None
        fused = sum(
            1 for r in info.AtomRings()
            if len(r) == 6 and len(set(r) & set(ring)) == 2 and all(mol.GetAtomWithIdx(i).GetIsAromatic() for i in r)
        )
        if any(n.GetAtomicNum() == 6 and not n.GetIsAromatic() for n in atom.GetNeighbors()):
            return None
        return _PYRROLE_DMSO[min(fused, 2)]
    if kind in _NH_DMSO:
        return kind, _NH_DMSO[kind]
    return None


# the classes whose N-H reaction needs the N deprotonated first
_DEPROTONATION_CLASSES = {
    "alkylation.halide", "acylation.acid_halide", "acylation.anhydride", "acylation.chloroformate",
    "sulfonylation.sulfonyl_halide", "sulfonylation.anhydride", "protection.boc", "protection.cbz", "protection.fmoc",
}


@rule(id="nitrogen-cannot-react-as-drawn", title="A nitrogen is drawn forming a bond it cannot form", severity="error")
def nitrogen_cannot_react_as_drawn(ctx: Context):
    """Compare each nitrogen of the reactants with the same nitrogen in the product.

    What it flags
        A product with a new bond to a nitrogen that cannot form it under the conditions drawn:
        a tertiary amine drawn as a neutral amide or sulfonamide, a quaternary ammonium that
        gains a bond, an amide, carbamate or sulfonamide nitrogen acylated or alkylated without
        a base strong enough for its N–H, a pyrrole- or indole-type nitrogen as nucleophile under
        neutral conditions, a nitro nitrogen. With atom maps the same atoms are compared; without
        them each reactant is mapped onto the product by their maximum common substructure
        (``chemcheck.changes``).

    Why it matters
        A neutral amide nitrogen has three bonds: a tertiary amine can only become one by
        losing an alkyl group. Amide and carbamate N–H are weak acids (pKa about 17 in water)
        and their lone pair is tied up by the carbonyl, so they need deprotonation before they
        alkylate. Pyrrole and indole nitrogens keep their lone pair in the aromatic ring.

    Example
        ``CCN(CC)CC.CC(=O)Cl>>CCN(CC)C(C)=O``: triethylamine has no N–H to lose.

    Use instead
        Use the secondary amine for a tertiary amide. Deprotonate amides, carbamates, indoles and
        pyrroles first (NaH, KOtBu, KOH in DMSO; Cs2CO3 in DMF for indoles and sulfonamides).

    References
        J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 8 and 29
        (pKa of N–H acids; aromatic heterocycles). F. G. Bordwell, Acc. Chem. Res. 1988, 21, 456
        (acidities in DMSO).
    """
    r = nitrogen_cannot_react_as_drawn.rule
    comps = ctx.reaction.components
    u = understood(ctx)
    dmap_acyl = any(
        any(s.kind == "pyridine_type" for s in ctx.perception(c).nitrogens) and c.kind == "catalyst"
        for c in ctx.reaction.agents
    ) and any(ctx.perception(c).has("dicarbonate", "anhydride") for c in ctx.reaction.reactants)
    for nb in changed_nitrogens(ctx):
        before, after = nb.kind_before, nb.kind_after
        rc, pc = comps[nb.reactant], comps[nb.product]
        atoms = [(rc.index, nb.reactant_atom), (pc.index, nb.product_atom)] + [(pc.index, a) for a in nb.partners]
        if before == "ammonium":
            continue  # a salt: amine-salt-not-freed speaks of it
        if before == "tertiary_amine" and after in ("amide", "sulfonamide", "carbamate", "urea") and nb.charge_after == 0:
            yield r.finding(
                f"The tertiary amine nitrogen of {rc.label} is drawn as a neutral {after} in {pc.label}, but it has no "
                "N–H to lose: it can at most form a charged acylammonium salt (which hydrolyses on workup).",
                atoms=atoms,
                fix="Start from the secondary amine for a tertiary amide or sulfonamide, or draw the product of the "
                "amine that actually has an N–H.",
            )
        elif before == "quaternary_ammonium":
            yield r.finding(
                f"The quaternary ammonium nitrogen of {rc.label} has no lone pair and no N–H; it cannot form the new "
                f"bond drawn in {pc.label}.",
                atoms=atoms,
                fix="Quaternary ammonium salts react at carbon (Hofmann elimination, substitution), not at nitrogen.",
            )
        elif before == "nitro":
            yield r.finding(
                f"The nitro nitrogen of {rc.label} is drawn forming a new bond in {pc.label}; nitro groups are not "
                "nucleophilic.",
                atoms=atoms,
                fix="Reduce the nitro group to the amine first (H2/Pd-C, Fe/HCl, SnCl2), then form the bond.",
            )
        elif before in ("sulfonamide", "imide", "amide", "carbamate", "urea", "pyrrole_type") and nb.heavy_after > nb.heavy_before:
            has_h = rc.mol.GetAtomWithIdx(nb.reactant_atom).GetTotalNumHs() > 0
            if not has_h:
                if u is not None and not u.known:
                    continue
                yield r.finding(
                    f"The {_word(before)} nitrogen of {rc.label} has no N–H and no free lone pair: it cannot gain the "
                    f"bond drawn in {pc.label}.",
                    atoms=atoms,
                    fix="Check the product: another atom is the one that reacts.",
                )
                continue
            if u is not None and u.class_id not in _DEPROTONATION_CLASSES:
                continue  # a catalysed N-arylation, an isocyanate addition, a cyclisation: no base needed
            if dmap_acyl and before in ("amide", "carbamate", "imide", "sulfonamide", "pyrrole_type"):
                continue  # DMAP-catalysed acylation (N-Boc of amides and carbamates) is fine
            acidity = _nh_acidity(rc.mol, nb.reactant_atom, before)
            if acidity is None:
                continue
            what, nh_pka = acidity
            base = _strongest_base_dmso(ctx)
            # an irreversible alkylation or acylation pulls a small equilibrium fraction of the
            # anion through: a base within about 2 units of the N-H is enough (common practice)
            if base is not None and base[0] >= nh_pka - 2.0:
                continue
            base_text = (
                f"the strongest base present, {base[1]}, has a conjugate acid of pKa about {base[0]:.0f}"
                if base is not None else "no base is present"
            )
            yield r.finding(
                f"The {what} N–H of {rc.label} (pKa about {nh_pka:.0f} in DMSO) is drawn reacting in {pc.label}, but "
                f"{base_text} on the same scale: without deprotonation this nitrogen is not nucleophilic.",
                atoms=atoms,
                fix="Deprotonate first: NaH or KOtBu in DMF or THF (amides, carbamates, pyrroles), Cs2CO3 or K2CO3 "
                "in DMF (sulfonamides, imides, indoles, carbazoles). DMSO-scale values: F. G. Bordwell, "
                "Acc. Chem. Res. 1988, 21, 456.",
            )


# --------------------------------------------------------------------------- over-alkylation
def _is_methylating(ctx: Context, comp) -> bool:
    for g in ctx.perception(comp).groups:
        if g.name in ALKYLATING:
            c = comp.mol.GetAtomWithIdx(g.centre)
            if c.GetTotalNumHs() == 3:
                return True
    return False


def _is_activated_alkyl(ctx: Context, comp) -> bool:
    for g in ctx.perception(comp).groups:
        if g.name in ALKYLATING:
            c = comp.mol.GetAtomWithIdx(g.centre)
            for n in c.GetNeighbors():
                if n.GetIsAromatic() or any(b.GetBondTypeAsDouble() == 2 for b in n.GetBonds()):
                    return True
    return False


@rule(id="overalkylation-risk", title="Direct N-alkylation gives mixtures", severity="warning", applies_to=("alkylation",))
def overalkylation_risk(ctx: Context):
    """A primary or secondary amine with an alkyl halide or sulfonate, drawn as one alkylation.

    What it flags
        A primary amine (or ammonia) and an alkylating agent drawn as, or expected to give, a
        single alkylation; a secondary amine likewise when the agent is a methylating, benzylic
        or allylic one or is in excess. Not when the amine is in large excess (3 equiv or more)
        or when the drawn product is the exhaustively alkylated ammonium salt.

    Why it matters
        Each alkyl group makes the nitrogen more electron-rich: the secondary amine formed is at
        least as nucleophilic as the primary amine it came from, so the alkyl halide is shared
        between them and a mixture of mono-, di- and trialkylated amines and the quaternary salt
        results. With an excess of a methylating agent the quaternary ammonium salt is the
        expected product (exhaustive methylation).

    Example
        ``CCCCN.BrCc1ccccc1>>CCCCNCc1ccccc1``.

    Use instead
        Reductive amination (the aldehyde or ketone with NaBH(OAc)3 or NaBH3CN), a large excess of
        the amine (5 equiv or more), or a protecting-group route (a sulfonamide or a Boc
        carbamate, alkylated after deprotonation, then deprotected).

    References
        J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 15
        (nucleophilic substitution; alkylation of amines). A. F. Abdel-Magid et al., J. Org.
        Chem. 1996, 61, 3849 (reductive amination with sodium triacetoxyborohydride).
    """
    r = overalkylation_risk.rule
    rxn = ctx.reaction
    u = understood(ctx)
    if u is not None and (u.class_id != "alkylation.halide" or u.nucleophile is None or u.electrophile is None):
        return  # the drawn reaction is not an SN2 N-alkylation (a urea from a haloalkyl isocyanate keeps its C-Cl)
    for elec, groups in electrophiles(ctx, ALKYLATING):
        if u is not None and elec.index != u.electrophile[0]:
            continue
        for comp in rxn.reactants:
            if comp.index == elec.index or salt_info(ctx, comp)[0]:
                continue
            if u is not None and comp.index != u.nucleophile[0]:
                continue
            sites = [s for s in ctx.sites(comp) if s.kind in ("primary_amine", "ammonia", "secondary_amine", "aryl_amine") and s.pka is not None]
            if u is not None:
                sites = [s for s in sites if s.atom_index == u.nucleophile[1]]
            if not sites:
                continue
            site = max(sites, key=lambda s: s.pka)
            atom = comp.mol.GetAtomWithIdx(site.atom_index)
            h = atom.GetTotalNumHs()
            if h == 0:
                continue
            n_amine, a1 = amount_mmol(ctx, comp)
            n_e, a2 = amount_mmol(ctx, elec)
            ratio = n_e / n_amine if n_amine else 1.0
            if not a1 and not a2 and n_amine >= 3 * n_e:
                continue
            secondary = h == 1 and site.kind != "ammonia"
            methyl = _is_methylating(ctx, elec)
            if secondary and not (methyl or _is_activated_alkyl(ctx, elec) or ratio >= 1.5):
                continue
            changed = [nb for nb in changed_nitrogens(ctx) if nb.reactant == comp.index and nb.reactant_atom == site.atom_index]
            if changed:
                nb = changed[0]
                added = nb.heavy_after - nb.heavy_before
                if nb.kind_after == "quaternary_ammonium" or (added >= h + (0 if site.kind == "ammonia" else 1) - 0):
                    if nb.kind_after == "quaternary_ammonium":
                        continue  # exhaustive alkylation drawn: intended
                if added > 1:
                    continue
            msg = (
                f"{comp.label} is alkylated by {elec.label}, but the {'tertiary' if secondary else 'secondary'} amine "
                f"formed is at least as nucleophilic as the starting {_word(site.kind)}, so the alkylating agent is "
                "shared between them: expect a mixture of mono- and polyalkylated amines and the quaternary salt."
            )
            if methyl and ratio >= 2:
                msg += (
                    f" With {ratio:.2g} equiv of the methylating agent the quaternary ammonium salt is the expected "
                    "product (exhaustive methylation)."
                )
            atoms = [(comp.index, site.atom_index), (elec.index, groups[0].centre)]
            # a secondary amine taken to the tertiary amine with about one equivalent: the
            # quaternary salt is the only over-alkylation, slower and often minor (an info note)
            yield r.finding(
                msg,
                atoms=atoms,
                fix="For one alkyl group use reductive amination (the aldehyde or ketone with NaBH(OAc)3), a large "
                "excess of the amine (5 equiv or more), or a protecting-group route (sulfonamide or Boc, alkylate, "
                "deprotect).",
                severity="info" if secondary and ratio < 1.5 else None,
            )


# --------------------------------------------------------------------------- proton transfer
def _parent_key(mol):
    from rdkit import Chem
    from rdkit.Chem.MolStandardize import rdMolStandardize

    from .. import _rdlog

    with _rdlog.captured():
        try:
            neutral = rdMolStandardize.Uncharger().uncharge(Chem.Mol(mol))
            return Chem.MolToInchiKey(neutral)[:14]
        except Exception:
            return None


def _fragments(comp):
    from rdkit import Chem

    return list(Chem.GetMolFrags(comp.mol, asMols=True, sanitizeFrags=True))


def _h_count(mol) -> int:
    return sum(a.GetTotalNumHs() for a in mol.GetAtoms())


def _acid_pka_of(ctx, frag):
    """pKa of a fragment acting as an acid (HA)."""
    from rdkit import Chem

    from ..basicity import basic_sites
    from ..basicity.acids import acid_pka
    from ..perceive import reactive_groups

    smi = Chem.MolToSmiles(frag)
    a = acid_pka(smi)
    if a is not None:
        return a.pka, a.name
    sites = [s for s in basic_sites(frag) if s.kind == "ammonium" and s.pka is not None]
    if sites:
        return max(s.pka for s in sites), "the ammonium ion"
    names = {g.name for g in reactive_groups(frag)}
    if "sulfonic_acid" in names:
        return -2.0, "a sulfonic acid"
    if "perfluoro_acid" in names:
        return 0.5, "a perfluorinated acid"
    if "carboxylic_acid" in names:
        return 4.5, "a carboxylic acid (typical value)"
    if "phenol" in names:
        return 10.0, "a phenol (typical value)"
    if "alcohol" in names:
        return 16.0, "an alcohol (typical value)"
    return None, None


def _base_pka_of(frag):
    """pKa of the conjugate acid of a fragment acting as a base (B)."""
    from rdkit import Chem

    from ..basicity import basic_sites
    from ..basicity.acids import conjugate_acid_pka
    from ..perceive import reactive_groups

    smi = Chem.MolToSmiles(frag)
    c = conjugate_acid_pka(smi)
    if c is not None:
        return c.pka
    sites = [s for s in basic_sites(frag) if s.pka is not None and s.kind != "ammonium"]
    if sites:
        return max(s.pka for s in sites)
    names = {g.name for g in reactive_groups(frag)}
    if "carboxylate" in names:
        return 4.5
    if "phenoxide" in names:
        return 10.0
    if "alkoxide" in names:
        return 16.0
    return None


@rule(id="uphill-proton-transfer", title="A drawn proton transfer runs uphill", severity="warning", applies_to=("acid_base", "other"))
def uphill_proton_transfer(ctx: Context):
    """An acid–base reaction drawn in the direction its equilibrium does not favour.

    What it flags
        A drawn reaction whose only change is a proton moving from an acid HA to a base B,
        with K = 10^(pKa(BH+) − pKa(HA)) below 0.1 (water-scale pKa values). Favourable
        transfers pass silently. A free-basing drawn with only the free amine as product (an
        amine salt, or an amine with a strong acid, and a base among the reagents) is judged
        the same way, with the base's aqueous pKa (a bicarbonate takes its proton at 6.35, a
        carbonate at 10.33).

    Why it matters
        A proton goes to the stronger base. Drawing it the other way (freeing an alkylamine
        from its salt with sodium bicarbonate, protonating pyridine with a phenol) describes a
        step that mostly does not happen: the salt is not formed or the amine is not freed.

    Example
        ``CCCC[NH3+].[Cl-].[Na+].OC([O-])=O>>CCCCN.[Na+].[Cl-].OC(O)=O``:
        K = 10^(6.35 − 10.6) ≈ 6e-5.

    Use instead
        Choose a base whose conjugate acid has a higher pKa than the acid (NaOH, K2CO3 to free an
        alkylamine), or a stronger acid to form the salt.

    References
        Henderson–Hasselbalch and the pKa rule for proton transfers: J. Clayden, N. Greeves,
        S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 8. pKa values: CRC Handbook.
    """
    r = uphill_proton_transfer.rule
    rxn = ctx.reaction
    u = understood(ctx)
    if u is not None and u.known and u.family != "acid_base":
        return  # a proton transfer coupled to an irreversible bond-forming step is not uphill
    if not rxn.products:
        return
    freed = _free_basing(ctx)
    if freed is not None:
        yield freed
        return
    spectators = {"[Na+]", "[K+]", "[Li+]", "[Cs+]", "[Cl-]", "[Br-]", "[I-]"}
    from collections import Counter

    from rdkit import Chem

    from ..balance import counts_of

    def heavy(comps):
        total: Counter = Counter()
        for c in comps:
            total.update(counts_of(c))
        total.pop("H", None)
        return +total

    if heavy(rxn.reactants) != heavy(rxn.products):
        return  # heavy atoms changed: more than a proton moved

    def frags(comps):
        out = []
        for c in comps:
            if c.sanitization != "full":
                return None
            for f in _fragments(c):
                smi = Chem.MolToSmiles(f)
                if smi in spectators:
                    continue
                out.append((c, f, _parent_key(f)))
        return out

    left = frags(rxn.reactants)
    right = frags(rxn.products)
    if not left or not right:
        return
    if sorted(k for _, _, k in left) != sorted(k for _, _, k in right):
        return
    acid = base = None
    for c, f, k in left:
        match = next((pf for _, pf, pk in right if pk == k), None)
        if match is None:
            continue
        dh = _h_count(match) - _h_count(f)
        if dh < 0 and acid is None:
            acid = (c, f)
        elif dh > 0 and base is None:
            base = (c, f)
    if acid is None or base is None:
        return
    pka_ha, acid_name = _acid_pka_of(ctx, acid[1])
    pka_bh = _base_pka_of(base[1])
    if pka_ha is None or pka_bh is None:
        return
    k = 10 ** (pka_bh - pka_ha)
    if k >= 0.1:
        return
    yield r.finding(
        f"The proton transfer drawn runs uphill: {acid[0].label} (pKa {pka_ha:.1f}) is a weaker acid than the "
        f"conjugate acid of {base[0].label} (pKa {pka_bh:.1f}), so K = 10^({pka_bh:.1f} − {pka_ha:.1f}) = {k:.1e}; "
        "at equilibrium the starting materials dominate.",
        atoms=[],
        fix=f"Use a base whose conjugate acid has a pKa above {pka_ha + 1:.0f} (for example NaOH, pKa 14, or "
        f"K2CO3, pKa 10.3), or a stronger acid.",
    )


def _freed_pct(log_k: float) -> str:
    """Share of the amine freed when its salt and one equivalent of base reach equilibrium:
    x^2 / (1 - x)^2 = K."""
    root = 10 ** (log_k / 2)
    x = 100 * root / (1 + root)
    return f"{x:.0f} %" if x >= 1 else "1 % or less"


def _free_basing(ctx: Context):
    """A free-basing drawn as salt (or amine and strong acid) + base >> free amine, with a base
    too weak to take the proton: the finding, or None."""
    from rdkit.Chem.MolStandardize import rdMolStandardize

    from .. import _rdlog
    from ..perceive import canonical_key

    rxn = ctx.reaction
    r = uphill_proton_transfer.rule
    products = [c for c in rxn.products if Chem.GetFormalCharge(c.mol) == 0 and "." not in c.smiles]
    if not products:
        return None
    keys = {canonical_key(c.mol)[0] for c in products if canonical_key(c.mol)}
    strong_acid = [c for c in rxn.reactants + rxn.agents if ctx.perception(c).has("hydrogen_halide", "sulfonic_acid", "perfluoro_acid")]
    for comp in rxn.reactants:
        is_salt, sites = salt_info(ctx, comp)
        if is_salt:
            frags = [f for f in _fragments(comp) if any(a.GetAtomicNum() == 7 for a in f.GetAtoms())]
            with _rdlog.captured():
                free = [Chem.MolToSmiles(rdMolStandardize.Uncharger().uncharge(Chem.Mol(f))) for f in frags]
            if not any(Chem.CanonSmiles(x) in keys for x in free):
                continue
            exclude = {comp.index}
        elif strong_acid and comp.smiles in keys and comp not in strong_acid:
            sites = [s_ for s_ in ctx.sites(comp) if s_.pka is not None and s_.kind != "ammonium"]
            exclude = {comp.index} | {c.index for c in strong_acid}
        else:
            continue
        if not sites:
            continue
        pka_bh = max(s_.pka for s_ in sites)
        bases = bases_present(ctx, exclude, aqueous=True)
        if not bases:
            return None  # amine-salt-not-freed and the balance speak for a missing base
        strongest = max(bases, key=lambda b: b.pka)
        base, pka_b = strongest.component, strongest.pka
        k = pka_b - pka_bh
        if k >= -1.0:
            return None
        return r.finding(
            f"The free amine is drawn from {comp.label}, but the strongest base present, {base.label}, whose "
            f"conjugate acid has pKa {pka_b:.2f}, is weaker than the amine (pKa {pka_bh:.1f}): K = 10^({pka_b:.2f} − "
            f"{pka_bh:.1f}) ≈ 10^{k:.1f}, so the amine stays protonated: with one equivalent in water only about "
            f"{_freed_pct(k)} of it is freed at equilibrium, and a wash at the pH that base gives leaves most of it "
            "in the water.",
            atoms=[(comp.index, sites[0].atom_index)] if sites[0].atom_index is not None else [],
            fix=f"Free the amine with a base whose conjugate acid has a pKa above {pka_bh + 1:.0f} (aqueous NaOH, "
            "pKa 14, or K2CO3, 10.3), then extract it into an organic solvent at a pH of at least "
            f"{pka_bh + 2:.0f}.",
        )
    return None


# --------------------------------------------------------------------------- solvolysis
_SOLVOLYSIS_GROUPS = {
    "acid_halide": "acid chloride", "anhydride": "anhydride", "sulfonyl_halide": "sulfonyl chloride",
    "chloroformate": "chloroformate", "isocyanate": "isocyanate", "carbamoyl_chloride": "carbamoyl chloride",
    "carbonyl_dihalide": "phosgene-type reagent", "sulfonic_anhydride": "sulfonic anhydride",
    "inorganic_acid_chloride": "acid chloride",
}
_WATER_REACTIVE_LA = {"Al", "Ti", "Sn", "B", "Si", "Fe", "Zr", "Hf", "Sc", "Bi", "Ga", "In"}


def _water_reactive(comp, g) -> bool:
    """A Lewis acid that water destroys: halides and alkoxides of the metals above, and any
    silyl reagent; not the metal triflates (Sc, Bi, In), which are used in water (common
    practice: S. Kobayashi's water-compatible Lewis acids)."""
    if g.detail not in _WATER_REACTIVE_LA or _tin_ii(comp, g):
        return False
    if g.detail == "Fe":
        # iron(III) halides fume and hydrolyse violently; iron(II) (FeCl2, the iron of a
        # ferrocene ligand written as ions) does not (common practice)
        metal = comp.mol.GetAtomWithIdx(g.centre)
        if metal.GetDegree() + metal.GetFormalCharge() < 3:
            return False
    if g.detail == "Si":
        return True
    metal = comp.mol.GetAtomWithIdx(g.centre)
    ligands = [x for x in metal.GetNeighbors()]
    triflate = [
        x for x in ligands
        if x.GetAtomicNum() == 8 and any(y.GetAtomicNum() == 16 for y in x.GetNeighbors() if y.GetIdx() != metal.GetIdx())
    ]
    return not ligands or len(triflate) < len(ligands)


_SOLVOLYSIS_FAMILIES = {"acylation", "sulfonylation", "urea", "protection"}
# pyridine and the picolines and lutidines: bases that are often the solvent too (common practice)
_PYRIDINE_SOLVENT = Chem.MolFromSmarts("[nX2;r6;!$(n[#7])]1ccccc1")


def _solvolysis_understood(ctx: Context, r, u, reactive):
    """reagent-solvolysis with the reaction understood: only the electrophile the centre says
    reacts (or the ring-substitution Lewis acid), only a protic component that is the reaction's
    solvent (not its work-up), and only where it can compete: an amine outcompetes water and
    alcohols for an acid chloride, anhydride or isocyanate by orders of magnitude (aminolysis
    against alcoholysis: common practice, Schotten–Baumann), a weak N-nucleophile does not."""
    comps = ctx.reaction.components
    solvents = [comps[i] for i in u.components_with_role("solvent")]
    protic = [c for c in solvents if ctx.perception(c).has("water", "alcohol")]
    water = [c for c in ctx.reaction.agents if ctx.perception(c).has("water")]
    aqueous_base = any(
        ctx.perception(c).has("hydroxide", "carbonate") for c in ctx.reaction.reactants + ctx.reaction.agents
    )
    reactive_index = {comp.index for comp, _, _ in reactive}
    if u.family in ("acylation", "sulfonylation") and water and aqueous_base and u.electrophile is not None:
        elec = comps[u.electrophile[0]]
        if elec.index not in reactive_index or not u.nucleophile:
            return  # a carboxylic acid coupled (its agent is the acylating one), or nothing to name
        nuc = comps[u.nucleophile[0]]
        site = next((x for x in ctx.sites(nuc) if x.atom_index == u.nucleophile[1]), None)
        if site is None or site.pka is None or site.pka < 0.0:
            return  # not an amine (an indole or amide N-H under phase-transfer conditions)
        yield r.finding(
            f"Schotten–Baumann conditions: {elec.label} with {nuc.label} and aqueous base. The amine outcompetes "
            "water when the electrophile is added slowly, cold and with vigorous stirring; some hydrolysis is "
            "expected, so use a small excess of it.",
            atoms=[u.electrophile],
            fix=f"Add {elec.label} slowly to the cooled, well-stirred two-phase mixture; use 1.1–1.5 equiv.",
            severity="info",
        )
        return
    if not protic or len(protic) < len(solvents):
        return  # an aprotic solvent is the reaction's: water or alcohol is co-solvent or work-up
    from .hazards import _aprotic_solvent

    elec_index = u.electrophile[0] if u.electrophile else None
    for c in ctx.reaction.agents:
        if c in protic or c.index == elec_index:
            continue
        pyridine_like = c.mol.HasSubstructMatch(_PYRIDINE_SOLVENT)
        if (pyridine_like or u.role(c) != "base") and (_aprotic_solvent(c) or ctx.perception(c).has("anhydride")):
            # a liquid that serves as the solvent under another role (pyridine as the base,
            # acetic anhydride as the dehydrating agent): the water or alcohol is the work-up
            return
    for comp, g, what in reactive:
        pc = protic[0]
        word = "water" if ctx.perception(pc).has("water") else "the alcohol"
        if what == "water-reactive Lewis acid":
            if u.role(comp) != "lewis_acid":
                continue
            yield r.finding(
                f"{comp.label} reacts with the solvent {pc.label}: {word} destroys the Lewis acid (exothermically, "
                "releasing acid) before it can act.",
                atoms=[(comp.index, g.centre)],
                fix="Use a dry aprotic solvent (DCM, 1,2-dichloroethane, nitrobenzene, CS2) and dry reagents.",
            )
            continue
        if u.family not in _SOLVOLYSIS_FAMILIES or u.electrophile is None or u.electrophile[0] != comp.index:
            continue
        nuc = comps[u.nucleophile[0]] if u.nucleophile else None
        site = None
        if nuc is not None:
            site = next((x for x in ctx.sites(nuc) if x.atom_index == u.nucleophile[1]), None)
        # anilines, even electron-poor ones, outcompete water and alcohols (Mayr nucleophilicity
        # N about 9-13 against 5-7); amide, sulfonamide and carbamate N-H do not
        strong = site is not None and site.pka is not None and site.pka >= 0.0
        target = nuc.label if nuc is not None else "the intended nucleophile"
        if strong:
            # the amine wins; some of the electrophile is lost to the solvent
            yield r.finding(
                f"{comp.label} in {pc.label}: {target} reacts much faster than {word}, but some of the {what} is "
                "lost to the solvent.",
                atoms=[(comp.index, g.centre)],
                fix=f"Use a small excess of {comp.label} (1.1–1.5 equiv), or a dry aprotic solvent.",
                severity="info",
            )
            continue
        yield r.finding(
            f"{comp.label} is an {what} and the solvent is {pc.label}: {word} competes with {target}, a weak "
            f"nitrogen nucleophile, and consumes the {what}"
            + (", releasing acid." if what != "isocyanate" else " (a carbamate or, with water, an amine and CO2)."),
            atoms=[(comp.index, g.centre), u.nucleophile] if u.nucleophile else [(comp.index, g.centre)],
            fix="Use a dry aprotic solvent (DCM, THF, MeCN, toluene) and dry reagents.",
        )


@rule(
    id="reagent-solvolysis",
    title="A protic solvent or reagent destroys the electrophile",
    severity="warning",
    applies_to=("acylation", "sulfonylation", "urea", "protection", "friedel_crafts", "ring_substitution"),
)
def reagent_solvolysis(ctx: Context):
    """Acylating agents and water-reactive Lewis acids together with water or an alcohol.

    What it flags
        An acid chloride, anhydride, sulfonyl chloride, chloroformate, isocyanate or
        water-reactive Lewis acid in the same reaction as water or an alcohol that is not the
        intended nucleophile. A biphasic aqueous-base procedure of the Schotten–Baumann type
        (an acylating agent, an amine and aqueous hydroxide or carbonate) is a legitimate
        exception and gets an info note instead.

    Why it matters
        Water and alcohols attack the same carbonyl (or the Lewis acid) that the amine should:
        the reagent is consumed, HCl or a carboxylic acid is released, and esters or acids form as
        by-products. Lewis acids such as AlCl3 and TiCl4 react violently with water, releasing HCl.

    Example
        ``CCCCN.CC(=O)Cl>CCN(CC)CC.CO>CCCCNC(C)=O``: methanol competes with the amine.

    Use instead
        Use a dry aprotic solvent (DCM, THF, MeCN, toluene), dry the reagents, and add the
        electrophile to the amine and the base. For an aqueous route use Schotten–Baumann
        conditions: the acid chloride in DCM or ether, aqueous NaOH or Na2CO3, cold, vigorous
        stirring, slow addition.

    References
        C. Schotten, Ber. 1884, 17, 2544; E. Baumann, Ber. 1886, 19, 3218. W. L. F. Armarego,
        *Purification of Laboratory Chemicals*, 8th ed., 2017 (drying of solvents).
    """
    r = reagent_solvolysis.rule
    rxn = ctx.reaction
    reactive = []
    for comp in rxn.reactants + rxn.agents:
        p = ctx.perception(comp)
        for g in p.groups:
            if g.name in _SOLVOLYSIS_GROUPS:
                reactive.append((comp, g, _SOLVOLYSIS_GROUPS[g.name]))
                break
            if g.name == "lewis_acid" and _water_reactive(comp, g):
                reactive.append((comp, g, "water-reactive Lewis acid"))
                break
    if not reactive:
        return
    u = understood(ctx)
    if u is not None:
        yield from _solvolysis_understood(ctx, r, u, reactive)
        return
    amine_nuc = [c for c in rxn.reactants if nucleophile_sites(ctx, c)]
    protic = []
    for comp in rxn.reactants + rxn.agents:
        p = ctx.perception(comp)
        if not p.has("water", "alcohol"):
            continue
        if comp.role == "reactant" and (nucleophile_sites(ctx, comp) or not amine_nuc):
            continue  # the alcohol (or amino alcohol) is the intended nucleophile
        protic.append(comp)
    if not protic:
        return
    inorganic_base = any(
        ctx.perception(c).has("hydroxide", "carbonate") for c in rxn.reactants + rxn.agents
    )
    for comp, g, what in reactive:
        for pc in protic:
            water = ctx.perception(pc).has("water")
            if what != "water-reactive Lewis acid" and what != "isocyanate" and water and inorganic_base and amine_nuc:
                yield r.finding(
                    f"Schotten–Baumann conditions: {comp.label} with {amine_nuc[0].label} and aqueous base. The amine "
                    f"outcompetes water for the {what} when it is added slowly, cold and with vigorous stirring; some "
                    "hydrolysis is expected, so use a small excess of it.",
                    atoms=[(comp.index, g.centre)],
                    fix=f"Add {comp.label} slowly to the cooled, well-stirred two-phase mixture; use 1.1–1.5 equiv.",
                    severity="info",
                )
                continue
            word = "water" if water else "the alcohol"
            if what in ("anhydride",) and amine_nuc:
                yield r.finding(
                    f"{comp.label} with {pc.label}: anhydrides react with {word} only slowly, and "
                    f"{amine_nuc[0].label} outcompetes it; expect a little hydrolysis and use a small excess.",
                    atoms=[(comp.index, g.centre)],
                    fix=f"Use 1.1–1.5 equiv of {comp.label}, or a dry aprotic solvent.",
                    severity="info",
                )
                continue
            if what == "water-reactive Lewis acid":
                msg = (
                    f"{comp.label} reacts with {pc.label}: {word} destroys the Lewis acid (exothermically, "
                    "releasing HCl or HF) before it can act."
                )
            else:
                target = amine_nuc[0].label if amine_nuc else "the intended nucleophile"
                msg = (
                    f"{comp.label} is an {what} and reacts with {pc.label}: {word} competes with {target} "
                    f"and consumes the {what}"
                    + (", releasing acid." if what != "isocyanate" else " (a carbamate or, with water, an amine and CO2).")
                )
            yield r.finding(
                msg,
                atoms=[(comp.index, g.centre)] + [(pc.index, a.GetIdx()) for a in pc.mol.GetAtoms() if a.GetAtomicNum() == 8][:1],
                fix="Use a dry aprotic solvent (DCM, THF, MeCN, toluene) and dry reagents; for an aqueous acylation "
                "use Schotten–Baumann conditions (aqueous NaOH or Na2CO3, cold, vigorous stirring).",
            )


# --------------------------------------------------------------------------- hazards
_HAZARDS = (
    (
        "alkylating",
        "Alkylating agent ({names}): methyl iodide, dimethyl sulfate, methyl triflate and benzyl halides are toxic, "
        "probable carcinogens and (benzyl halides) lachrymators; handle them in a fume hood with suitable gloves and "
        "quench the excess (e.g. with aqueous ammonia or an amine).",
    ),
    (
        "acid_chloride",
        "Acid chloride or similar ({names}): corrosive, reacts with moisture and with amines releasing {gas}; the "
        "reaction with an amine is strongly exothermic, so add it slowly with cooling.",
    ),
    (
        "phosgene",
        "Phosgene or a phosgene precursor ({names}): phosgene is a highly toxic gas, and diphosgene and "
        "triphosgene release it on warming, with moisture and with nucleophiles; work in a well-ventilated fume "
        "hood with a phosgene indicator, and quench the excess with aqueous ammonia or base.",
    ),
    (
        "lewis_acid",
        "Water-reactive Lewis acid ({names}): reacts violently with water and moist air, releasing {gas}; weigh "
        "it dry, add it in portions, and quench slowly into ice.",
    ),
    (
        "sulfonating",
        "Sulfonating agent ({names}): sulfur trioxide, oleum and chlorosulfonic acid are highly corrosive and react "
        "violently with water (sulfuric acid mist; HCl gas from chlorosulfonic acid); keep everything dry, add the "
        "agent slowly to the cooled substrate, and quench by slow addition onto ice.",
    ),
    (
        "diazonium",
        "Diazonium salt ({names}): keep it cold (0–5 °C), use it in solution straight away and never isolate it dry; "
        "dry diazonium salts can detonate.",
    ),
    (
        "azide",
        "Azide ({names}): sodium azide is highly toxic; azides with acid give toxic, explosive HN3, with heavy "
        "metals and with dichloromethane explosive compounds; low-molecular-weight organic azides are explosive.",
    ),
    (
        "strong_acid",
        "Strong acid ({names}): corrosive; mixing with amines and bases is exothermic; add the acid to the other "
        "components slowly with cooling.",
    ),
    (
        "nitrating",
        "Nitrating agent ({names}): nitrations are strongly exothermic and can run away; control the temperature "
        "and the addition rate, and keep the agent away from organic solvents and reductants.",
    ),
    (
        "peroxide",
        "Peroxide ({names}): peroxides and peracids decompose exothermically, faster when heated or in contact "
        "with metals, acids or bases, and can detonate when concentrated; never concentrate a mixture that still "
        "holds peroxide: test for it (starch–iodide paper) and quench the excess (aqueous sodium sulfite or "
        "thiosulfate) before the work-up.",
    ),
    (
        "metal_oxidant",
        "Strong oxidant ({names}): keep it away from organic solvents and reductants (dry residues can ignite) "
        "and add it in portions with temperature control; chromium(VI) compounds are carcinogens and osmium "
        "tetroxide is volatile and highly toxic.",
    ),
    (
        "hydride",
        "Hydride reagent ({names}): reacts with water and acids releasing hydrogen (flammable); quench slowly "
        "under a fume hood.",
    ),
    (
        "isocyanate",
        "Isocyanate ({names}): toxic by inhalation and a respiratory sensitiser (asthma after one exposure); "
        "handle it in a fume hood with suitable gloves and quench the excess with an alcohol or aqueous amine.",
    ),
    (
        "cyanoborohydride",
        "Cyanoborohydride ({names}): releases hydrogen with water and acids and hydrogen cyanide (HCN) with acid; "
        "use it in a fume hood and treat the aqueous waste with basic bleach.",
    ),
)

# the hydrogen halide a reagent releases with water or an amine, by the halogens it carries
_HALIDE_GAS = {9: "HF", 17: "HCl", 35: "HBr", 53: "HI"}
_PHOSGENE_TYPE = Chem.MolFromSmarts(
    "[$([CX3](=O)([Cl,Br])[Cl,Br]),$([CX3](=O)(Cl)OC(Cl)(Cl)Cl),$([CX3](=O)(OC(Cl)(Cl)Cl)OC(Cl)(Cl)Cl)]"
)
_CYANOBOROHYDRIDE = Chem.MolFromSmarts("[B]C#N")


def _gas(comps) -> str:
    """'HCl', 'HBr', 'HCl or HF', ... from the halogens of the components (HCl when none)."""
    gases = dict.fromkeys(
        _HALIDE_GAS[a.GetAtomicNum()] for c in comps for a in c.mol.GetAtoms() if a.GetAtomicNum() in _HALIDE_GAS
    )
    return " or ".join(gases) or "HCl"


def _tin_ii(comp, g) -> bool:
    """Tin(II) chloride: a mild reductant, handled in ethanol, ethyl acetate or aqueous acid, not a
    Lewis acid that water destroys (SnCl4 is; common practice)."""
    metal = comp.mol.GetAtomWithIdx(g.centre)
    return g.detail == "Sn" and metal.GetDegree() + metal.GetFormalCharge() == 2


_ACIDIC_P_ANHYDRIDE = Chem.MolFromSmarts("[OX2H1][PX4](=O)[OX2][PX4]=O")


_STRONG_ACID_WITH_BASE = (
    "Strong acid ({names}), listed with a base: most likely the salt of an amine or neutralised in the flask; "
    "as the free acid, as at an acidic work-up, it is corrosive and mixing it with amines and bases is exothermic."
)


def _acid_beside_a_base(ctx: Context, acids) -> bool:
    """Hydrogen halides written beside a base among the agents (Et3N, a carbonate, hydroxide):
    in reaction records that is mostly the hydrochloride of the amine, freed by the base."""
    if not all(ctx.perception(c).has("hydrogen_halide") for c in acids):
        return False
    return any(ctx.perception(a).kind == "base" for a in ctx.reaction.agents if all(a is not c for c in acids))


# reactive groups whose hazard class needs no further test
_PLAIN_HAZARD_CLASS = {
    "sulfur_trioxide": "sulfonating", "chlorosulfonic_acid": "sulfonating", "diazonium": "diazonium",
    "isocyanate": "isocyanate", "azide": "azide", "peroxide": "peroxide", "metal_oxo_oxidant": "metal_oxidant",
    "nitrating_agent": "nitrating",
}


def _hazard_classes(ctx: Context, comp) -> set[str]:
    p = ctx.perception(comp)
    out = set()
    in_salt = salt_info(ctx, comp)[0]  # the HCl of an amine hydrochloride is not a free strong acid
    for g in p.groups:
        if g.name in ALKYLATING:
            c = comp.mol.GetAtomWithIdx(g.centre)
            if c.GetTotalNumHs() == 3 or _is_activated_alkyl(ctx, comp) or g.name == "alkyl_sulfonate":
                out.add("alkylating")
        elif g.name in ("acid_halide", "sulfonyl_halide", "chloroformate", "carbamoyl_chloride", "carbonyl_dihalide", "inorganic_acid_chloride", "sulfonic_anhydride"):
            out.add("phosgene" if comp.mol.HasSubstructMatch(_PHOSGENE_TYPE) else "acid_chloride")
        elif g.name == "lewis_acid" and _water_reactive(comp, g) and not _tin_ii(comp, g):
            out.add("lewis_acid")
        elif g.name in _PLAIN_HAZARD_CLASS:
            out.add(_PLAIN_HAZARD_CLASS[g.name])
        elif g.name in ("hydrogen_halide", "sulfonic_acid", "perfluoro_acid", "nitric_acid") and not in_salt:
            out.add("strong_acid")
        elif g.name in ("boron_hydride", "aluminium_hydride", "hydride_ion"):
            out.add("cyanoborohydride" if comp.mol.HasSubstructMatch(_CYANOBOROHYDRIDE) else "hydride")
    if comp.mol.HasSubstructMatch(_PHOSGENE_TYPE):  # triphosgene is a carbonate to the catalog
        out.discard("acid_chloride")
        out.add("phosgene")
    if not in_salt and comp.mol.HasSubstructMatch(_ACIDIC_P_ANHYDRIDE):
        out.add("strong_acid")  # polyphosphoric acid, Eaton's reagent: corrosive, hot and viscous
    if "sulfonating" in out:
        out -= {"acid_chloride", "strong_acid"}  # the sulfonating-agent caution covers both
    return out


# --------------------------------------------------------------------------- amides from free acids
# Besides the coupling agents of the catalog: reagents that turn a carboxylic acid into an
# acid halide or a mixed anhydride, and catalysts of the direct amidation, by structure (the
# classes of the reviews cited in the rule's docstring).
_ACTIVATORS: tuple[tuple[str, str], ...] = (
    ("inorganic acid halide", "[S,P;!$([S,P]-[#6])]([Cl,Br])"),  # SOCl2, POCl3, PCl5
    ("acid halide", "[CX3](=[OX1])[Cl,Br,F]"),  # oxalyl chloride, a chloroformate (mixed anhydride)
    ("sulfonyl halide", "[SX4](=[OX1])(=[OX1])[Cl,F]"),  # MsCl, TsCl (mixed anhydride)
    ("anhydride", "[CX3,SX4](=[OX1])[OX2][CX3,SX4]=[OX1]"),  # Boc2O, Piv2O (mixed anhydride)
    ("boron acid catalyst", "[BX3]([OX2])[OX2]"),  # boric and boronic acids, borate esters
    ("group 4 metal catalyst", "[Ti,Zr,Hf]"),  # Ti(OiPr)4, ZrCl4
    ("silane or silyl reagent", "[Si]([Cl,$([OX2][CX3]=O),$([NX3])])"),  # chlorosilanes, silyl esters
)


_FORMYL = Chem.MolFromSmarts("[CX3H1](=[OX1])[OX2H1,OX1-]")


@lru_cache(maxsize=1)
def _activator_queries() -> tuple[tuple[str, Chem.Mol], ...]:
    return tuple((name, Chem.MolFromSmarts(sm)) for name, sm in _ACTIVATORS)


def _activator(ctx: Context, comp) -> str | None:
    """What activates a carboxylic acid here: a coupling agent (perceived), an acid-halide
    former, a mixed-anhydride reagent or a direct-amidation catalyst."""
    if ctx.perception(comp).has("coupling_agent", "carbodiimide"):
        return "coupling agent"
    for name, q in _activator_queries():
        if comp.mol.HasSubstructMatch(q):
            return name
    return None


def _closes_lactam(mol, nb) -> bool:
    """The new bond of ``nb`` to a carbonyl carbon lies in a ring of five to seven atoms of the
    product."""
    for partner in nb.partners:
        bond = mol.GetBondBetweenAtoms(nb.product_atom, partner)
        if bond is None or not any(bond.IsInRingSize(k) for k in (5, 6, 7)):
            continue
        carbon = mol.GetAtomWithIdx(partner)
        if any(
            o.GetAtomicNum() == 8 and mol.GetBondBetweenAtoms(partner, o.GetIdx()).GetBondType() == Chem.BondType.DOUBLE
            for o in carbon.GetNeighbors()
        ):
            return True
    return False


@rule(id="amide-from-unactivated-acid", title="Amide drawn from a carboxylic acid with nothing to activate it", severity="warning")
def amide_from_unactivated_acid(ctx: Context):
    """A carboxylic acid and an amine drawn going to the amide with no coupling agent.

    What it flags
        A reaction in which an amine's nitrogen is drawn as an amide and the acyl group comes
        from a free carboxylic acid (or its carboxylate salt), while no reactant or agent can
        activate that acid: no carbodiimide, uronium, aminium or phosphonium salt, phosphonic
        anhydride, carbonyl azole, chlorotriazine, 2-halopyridinium salt, acid halide, inorganic
        acid chloride, sulfonyl chloride or anhydride (mixed anhydride methods), and no boron,
        titanium or zirconium catalyst. Formic acid is left out: it formylates amines on warming
        by itself.

    Why it matters
        An amine and a carboxylic acid first exchange a proton: the ammonium carboxylate salt
        forms at once (K = 10^(pKa(BH+) − pKa(acid)), about 10^5 for an alkylamine and a
        carboxylic acid), and a carboxylate is no acylating agent. Without activation the amide
        forms only when the salt is heated above about 160 °C with loss of water, conditions few
        substrates survive. Anilines are protonated less, but the acid is still not electrophilic
        enough.

    Example
        ``CC(=O)O.NCc1ccccc1>>CC(=O)NCc1ccccc1``: benzylammonium acetate, not the amide.

    Use instead
        Activate the acid: a carbodiimide (EDC·HCl with HOBt or Oxyma), a uronium or
        phosphonium reagent (HATU, PyBOP) with DIPEA, CDI or T3P; or make the acid chloride
        first (SOCl2, or oxalyl chloride with a drop of DMF). Write the coupling agent among the
        agents so the check sees it. A thermal or catalytic direct amidation is a deliberate
        choice: then the warning can be acknowledged.

    References
        C. A. G. N. Montalbetti, V. Falque, Tetrahedron 2005, 61, 10827 (amide bond formation
        and peptide coupling). E. Valeur, M. Bradley, Chem. Soc. Rev. 2009, 38, 606 (amide bond
        formation: beyond the myth of coupling reagents). H. Charville, D. Jackson, G. Hodges,
        A. Whiting, Chem. Commun. 2010, 46, 1813 (catalytic and thermal direct amidation).
    """
    r = amide_from_unactivated_acid.rule
    rxn = ctx.reaction
    if not rxn.products:
        return
    # formic acid formylates amines on warming by itself (a mixed anhydride is not needed)
    acids = [
        c for c in rxn.reactants
        if ctx.perception(c).has("carboxylic_acid", "carboxylate") and not c.mol.HasSubstructMatch(_FORMYL)
    ]
    if not acids:
        return
    if any(_activator(ctx, c) for c in rxn.reactants + rxn.agents if c not in acids):
        return
    for nb in changed_nitrogens(ctx):
        if nb.kind_after != "amide" or nb.kind_before == "amide":
            continue
        amine = rxn.components[nb.reactant]
        if amine in acids:
            continue  # the same molecule (a lactam from an amino acid): ring closure, not counted here
        product = rxn.components[nb.product]
        source = _acyl_source(ctx, product, nb, acids)
        if source is None:
            continue
        if _closes_lactam(product.mol, nb):
            # the amide bond closes a five- to seven-membered ring: the amine is first joined to
            # the acid by another new bond (an aza-Michael addition to itaconic acid, an
            # alkylation), and the lactam then closes intramolecularly on warming
            continue
        acid, acid_atom = source
        site = next((s for s in ctx.sites(amine) if s.atom_index == nb.reactant_atom), None)
        pka = site.pka if site is not None and site.pka is not None else None
        acid_pka = 4.8  # a typical carboxylic acid (acetic acid 4.76, CRC)
        if pka is not None and pka > acid_pka + 2:
            salt = (
                f"they exchange a proton at once (K ≈ 10^{pka - acid_pka:.0f}): the ammonium carboxylate salt forms, "
                "and a carboxylate does not acylate an amine."
            )
        else:
            salt = "the acid is not electrophilic enough to acylate the amine, even where it protonates it only in part."
        additive = next((c for c in rxn.agents if c.mol.HasSubstructMatch(_COUPLING_ADDITIVE)), None)
        if additive is not None:
            # HOBt, HOAt, HOSu or Oxyma are used only beside a coupling agent: the record has left
            # the coupling agent out, which a chemist reads as an omission, not a failed reaction
            dce = next((c for c in rxn.agents if c.smiles == "ClCCCl"), None)
            yield r.finding(
                f"{amine.label} is drawn acylated by {_acid_words(acid)} with {additive.label}, an additive "
                "used beside a coupling agent, but no coupling agent is written: the record seems to leave it out"
                + (
                    f" ({dce.label} is listed: the abbreviation EDC, used for both 1,2-dichloroethane and the "
                    "carbodiimide coupling agent, may have been read as the solvent)."
                    if dce is not None
                    else "."
                ),
                atoms=[(amine.index, nb.reactant_atom), (acid.index, acid_atom)],
                fix="Write the coupling agent (EDC·HCl, DIC, HATU, …) among the agents so the check can count it.",
                severity="info",
            )
            return
        yield r.finding(
            f"{amine.label} is drawn acylated by {_acid_words(acid)}, but nothing here activates the "
            f"acid: {salt} Without a coupling agent the amide forms only on heating the salt above about 160 °C.",
            atoms=[(amine.index, nb.reactant_atom), (acid.index, acid_atom)],
            fix="Add a coupling agent (EDC·HCl with HOBt or Oxyma, HATU or PyBOP with DIPEA, CDI or T3P) to the "
            "agents, or make the acid chloride first (SOCl2, or oxalyl chloride with a drop of DMF).",
        )
        return


def _acid_words(acid) -> str:
    """'the carboxylic acid 1' for an unnamed acid (labelled 'acid 1'), the name for a named one."""
    label = acid.label
    if label.startswith("acid "):
        return "the carboxylic " + label
    return label if "acid" in label else f"the carboxylic acid {label}"


# N-hydroxy coupling additives: HOBt, HOAt, HOSu, HOPO, Oxyma (Montalbetti & Falque 2005)
_COUPLING_ADDITIVE = Chem.MolFromSmarts("[OX2H1,OX1-][$([nX3]1nnc2c1cccc2),$([nX3]1nnc2c1nccc2),$([nX3]1nnc2c1cccn2),$(N1C(=O)CCC1=O),$(N=C(C#N)C(=O)O)]")


def _acyl_sources(ctx: Context, nuc) -> set[int]:
    """Carboxylic acids whose acyl group the nucleophile's new amide carries (an acid activated
    in situ by a chloroformate, SOCl2 or a sulfonyl chloride): their proton is the one the
    activator releases as HX, not a second one brought in."""
    rxn = ctx.reaction
    acids = [c for c in rxn.reactants if ctx.perception(c).has("carboxylic_acid")]
    if not acids or not rxn.products:
        return set()
    out = set()
    for nb in changed_nitrogens(ctx):
        if nb.reactant != nuc.index or nb.kind_after != "amide":
            continue
        found = _acyl_source(ctx, rxn.components[nb.product], nb, acids)
        if found is not None:
            out.add(found[0].index)
    return out


def _acyl_source(ctx: Context, product, nb, acids):
    """The acid (and its carboxyl carbon) whose acyl group the new amide N carries: the product
    atom bound to the N that maps back to an acid's carboxyl carbon."""
    from ..changes import atom_correspondence

    back = {v: k for k, v in atom_correspondence(ctx.reaction).items()}
    n = product.mol.GetAtomWithIdx(nb.product_atom)
    for x in n.GetNeighbors():
        origin = back.get((product.index, x.GetIdx()))
        if origin is None:
            continue
        comp_idx, atom_idx = origin
        for acid in acids:
            if acid.index != comp_idx:
                continue
            for g in ctx.perception(acid).groups_named("carboxylic_acid", "carboxylate"):
                if g.centre == atom_idx:
                    return acid, atom_idx
    return None


@rule(id="hazard-caution", title="Hazardous reagent: usual cautions", severity="info")
def hazard_caution(ctx: Context):
    """One caution per class of hazardous reagent present.

    What it flags
        Alkylating agents (methyl iodide, dimethyl sulfate, methyl triflate, benzyl halides),
        acid chlorides and the hydrogen halide they release (and the exotherm of their reaction
        with amines), phosgene, diphosgene and triphosgene, water-reactive Lewis acids (with the
        hydrogen halide each releases: HBr from FeBr3, HCl from AlCl3; not tin(II) chloride, a
        mild reductant), diazonium salts, azides, strong acids, nitrating agents, peroxides and
        peracids (test for and quench the excess), metal-oxo oxidants (chromium(VI), OsO4),
        hydride reagents, cyanoborohydride (HCN with acid) and isocyanates. One note per class,
        naming the components. What forms in the flask is the subject of ``hazardous-species-formed``.

    Why it matters
        These are the reagents behind most bench incidents in amine chemistry: exposure to
        alkylating agents, runaway acylations, violent quenches, and detonations of diazonium
        salts and azides.

    Example
        ``CCCCN.CI>>CCCCNC``: methyl iodide is a toxic alkylating agent.

    Use instead
        Follow the usual precautions in the note; every note ends by deferring to the SDS, local
        regulations and the institution's safety review.

    References
        *Prudent Practices in the Laboratory*, National Research Council, 2011. Bretherick's
        *Handbook of Reactive Chemical Hazards*, 8th ed., 2017.
    """
    r = hazard_caution.rule
    found: dict[str, list] = {}
    for comp in ctx.reaction.reactants + ctx.reaction.agents:
        for cls in _hazard_classes(ctx, comp):
            found.setdefault(cls, []).append(comp)
    for cls, text in _HAZARDS:
        comps = found.get(cls)
        if not comps:
            continue
        if cls == "strong_acid" and _acid_beside_a_base(ctx, comps):
            text = _STRONG_ACID_WITH_BASE
        labels = list(dict.fromkeys(c.label for c in comps))
        names = ", ".join(labels)
        heading, _, rest = text.partition(" ({names})")
        if rest and all(x.casefold().startswith(heading.casefold() + " ") for x in labels):
            # the labels already say what it is ("isocyanate 1"): not "Isocyanate (isocyanate 1)"
            text = "{cap}" + rest
        message = text.format(names=names, cap=names[:1].upper() + names[1:], gas=_gas(comps))
        yield r.finding(message + " " + SAFETY, atoms=[], fix=SAFETY)
