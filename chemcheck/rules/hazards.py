"""Hazards that depend on more than one component: a reagent with the wrong solvent, and what
forms in the flask (diazonium salts, N-nitrosamines, organic azides, HN3, isocyanates, HCN)."""

from __future__ import annotations

from functools import lru_cache

from rdkit import Chem

from .._memo import Memo
from . import Context, rule
from .nitrogen import SAFETY

# --------------------------------------------------------------------------- structure queries


@lru_cache(maxsize=None)
def _q(smarts: str) -> Chem.Mol:
    patt = Chem.MolFromSmarts(smarts)
    if patt is None:  # a typo here is caught by the fixtures
        raise ValueError(smarts)
    return patt


# reagents that water and alcohols destroy at once, with hydrogen or an alkane and heat
_VIOLENT = (
    ("aluminium hydride", "[Al;!H0]"),  # LiAlH4, DIBAL-H, Red-Al
    ("metal hydride", "[#1-;X0]"),  # NaH, KH, CaH2 ([H-] as its own ion)
    ("organolithium or Grignard reagent", "[Li,Na,K,Mg,Zn]-[#6]"),
    ("organolithium or Grignard reagent", "[#6-;!$([#6-]#[#7]);!$([#6-]=*);!$([#6-]~[#7+,#8,#16])]"),
    # a metal amide: the anion of an amine or a silylamine (LDA, LiHMDS, NaNH2), not the anion
    # of an amide, imide, sulfonamide, azole or azide (those are weak bases)
    ("metal amide base", "[NX2-,NX1-;!$([#7-]~[#7]);!$([#7-]-[#6,#16,#15]=[#7,#8,#16]);!$([#7-]-a);!$([#7-]-[SX4])]"),
)
_RELEASED = {
    "aluminium hydride": "hydrogen", "metal hydride": "hydrogen",
    "organolithium or Grignard reagent": "the alkane or arene", "metal amide base": "the free amine",
}
_BOROHYDRIDE = "[BH4-]"
_BORIDE_METAL = "[Co,Ni,Cu]"
_METAL_NAMES = {"Co": "cobalt", "Ni": "nickel", "Cu": "copper"}
_WORKUP = (
    "[$([OX1H1-]),$([SX4](=O)(=O)([OX1-])[OX1-]),$([CX3](=O)([#6])[OX1-]),$([NX4H4+]),$([Cl-,Br-]),"
    "$([CX3](=O)([OX1-])[OX1-,OX2H1])]"
)
_ALCOHOL_SOLVENT = "[OX2H1][CX4]"
_METAL = "[Li,Na,K,Mg,Ca,Zn,Al,Cs]"


_HITS = Memo(16384)  # (text as written, canonical SMILES, SMARTS) -> first atoms of the matches


def _frag_has(comp, smarts: str) -> list[int]:
    """First atoms of the matches of ``smarts`` in ``comp``, remembered by the component's text
    as written (the same text gives the same atom order: solvents and reagents recur)."""
    key = (comp.text, comp.smiles, smarts)
    hit = _HITS.get(key)
    if hit is None:
        hit = _HITS.put(key, tuple(m[0] for m in comp.mol.GetSubstructMatches(_q(smarts))))
    return list(hit)


def _violent_reagent(comp) -> tuple[str, int] | None:
    mol = comp.mol
    has_metal = mol.HasSubstructMatch(_q(_METAL))
    for what, smarts in _VIOLENT:
        hits = _frag_has(comp, smarts)
        if not hits:
            continue
        if what in ("metal hydride", "metal amide base") and not has_metal:
            continue  # an ammonium amide or a bare anion drawn without its metal: leave it
        if what == "organolithium or Grignard reagent" and smarts.startswith("[#6-") and not has_metal:
            continue  # a carbanion drawn with an ammonium or phosphonium counter-ion (an ylide)
        return what, hits[0]
    return None


def _protic_solvent(comp) -> str | None:
    """'water' or 'alcohol' for a small protic molecule used as a solvent (water, MeOH, EtOH,
    iPrOH, tBuOH, ethylene glycol); None otherwise."""
    mol = comp.mol
    if mol.GetNumAtoms() == 1 and mol.GetAtomWithIdx(0).GetAtomicNum() == 8 and mol.GetAtomWithIdx(0).GetFormalCharge() == 0:
        return "water"
    if mol.GetNumHeavyAtoms() > 6 or any(a.GetAtomicNum() not in (6, 8) or a.GetFormalCharge() for a in mol.GetAtoms()):
        return None
    if mol.HasSubstructMatch(_q(_ALCOHOL_SOLVENT)) and not mol.HasSubstructMatch(_q("[CX3]=O")):
        return "alcohol"
    return None


def _aprotic_solvent(comp) -> bool:
    """A small neutral molecule without O-H or N-H and without reactive groups: an ether,
    hydrocarbon, chlorinated solvent, nitrile, amide or sulfoxide (THF, toluene, DMF, DMSO)."""
    mol = comp.mol
    if Chem.GetFormalCharge(mol) or mol.GetNumHeavyAtoms() > 12 or mol.GetNumHeavyAtoms() < 2:
        return False
    if any(a.GetAtomicNum() not in (1, 6, 7, 8, 16, 17) or a.GetFormalCharge() for a in mol.GetAtoms()):
        return False
    if any(a.GetTotalNumHs() and a.GetAtomicNum() in (7, 8, 16) for a in mol.GetAtoms()):
        return False
    return not mol.HasSubstructMatch(_q("[CX3](=O)[Cl,Br,OX2][#6,#1]")) or mol.HasSubstructMatch(_q("C(=O)(O[CX4])[CX4]"))


@rule(id="reactive-reagent-in-protic-solvent", title="A hydride or strong base in water or an alcohol", severity="warning")
def reactive_reagent_in_protic_solvent(ctx: Context):
    """A reagent that water and alcohols destroy, with water or an alcohol as the solvent.

    What it flags
        LiAlH4, DIBAL-H and other aluminium hydrides, NaH, KH and CaH2, organolithiums and
        Grignard reagents, and metal amide bases (LDA, LiHMDS, NaNH2) listed with water, methanol,
        ethanol or another small alcohol and no aprotic solvent (a warning: the reagent is
        destroyed, with hydrogen or an alkane and heat). When an aprotic solvent is also listed,
        the water or alcohol is read as the quench and nothing is said. Sodium borohydride in
        methanol, ethanol or water is normal practice and gets an info note on the hydrogen it
        slowly releases (when no aprotic solvent is listed).

    Why it matters
        These reagents react with O-H bonds faster than with the substrate: LiAlH4 and NaH
        release hydrogen violently (fire, pressure), n-BuLi and Grignard reagents are protonated
        to the alkane at once. Nothing is left for the intended step, and the exotherm and gas are
        a hazard in their own right.

    Example
        ``CCOC(=O)c1ccccc1>[Li+].[AlH4-].CCO>OCc1ccccc1``: LiAlH4 in ethanol.

    Use instead
        Use a dry ether (THF, Et2O) or hydrocarbon for LiAlH4, NaH, organolithiums and metal
        amides, under nitrogen or argon; add water or an alcohol only at the end, slowly and
        cold, to quench. For an ester or ketone reduction in an alcohol use NaBH4 (or LiBH4).

    References
        *Prudent Practices in the Laboratory*, National Research Council, 2011, ch. 6. Bretherick's
        *Handbook of Reactive Chemical Hazards*, 8th ed., 2017 (lithium tetrahydroaluminate,
        sodium hydride, butyllithium). M. Schlosser (ed.), *Organometallics in Synthesis*, 3rd
        ed., Wiley 2013.
    """
    r = reactive_reagent_in_protic_solvent.rule
    rxn = ctx.reaction
    pool = rxn.reactants + rxn.agents
    protic = [(c, _protic_solvent(c)) for c in rxn.agents]
    protic = [(c, w) for c, w in protic if w]
    if not protic:
        return
    aprotic = [c for c in rxn.agents if _aprotic_solvent(c)]
    # water beside work-up salts (Rochelle salt, NaOH, Na2SO4, NH4Cl, carbonates) is the quench
    workup = any(_frag_has(c, _WORKUP) for c in rxn.agents)
    only_water = all(w == "water" for _, w in protic)
    # one name per substance: the waters of a hydrate written as separate fragments are one water
    first_label: dict[str, str] = {}
    for c, _ in protic:
        first_label.setdefault(c.smiles, c.label)
    labels = list(first_label.values())
    words = labels[0] if len(labels) == 1 else ", ".join(labels[:-1]) + " and " + labels[-1]
    violent = [(c, _violent_reagent(c)) for c in pool]
    violent = [(c, hit) for c, hit in violent if hit is not None]
    if violent and not aprotic and not (only_water and workup):
        names = " and ".join(dict.fromkeys(c.label for c, _ in violent))
        kinds = " or ".join(dict.fromkeys(hit[0] for _, hit in violent))
        released = " or ".join(dict.fromkeys(_RELEASED[hit[0]] for _, hit in violent))
        yield r.finding(
            f"{names} {'is' if len(violent) == 1 else 'are'} listed with {words} as the only solvent: water "
            f"and alcohols destroy {'an' if kinds[0] in 'aeiou' else 'a'} {kinds} at once, releasing {released} "
            "and heat, before the substrate can react. " + SAFETY,
            atoms=[(c.index, hit[1]) for c, hit in violent],
            fix="Run it in a dry ether (THF, Et2O) or hydrocarbon under nitrogen or argon and add water or the "
            "alcohol only to quench, slowly and cold, at the end.",
        )
    for comp in pool:
        if any(comp is c for c, _ in violent):
            continue
        bh4 = _frag_has(comp, _BOROHYDRIDE)
        if bh4 and not aprotic and any(w in ("alcohol", "water") for _, w in protic):
            others = [c for c in pool if c is not comp]
            metal = _any(others, _BORIDE_METAL)
            acid = _any(others, _ACIDS[0][1]) or _any(others, _ACIDS[1][1])
            if metal or acid:
                # the boride formed from a cobalt, nickel or copper salt catalyses the hydrolysis of
                # the borohydride; an acid protonates it (both: fast hydrogen evolution, common practice)
                if metal:
                    element = _METAL_NAMES[metal[0].mol.GetAtomWithIdx(metal[1]).GetSymbol()]
                    salt = metal[0].label if element in metal[0].label else f"the {element} salt ({metal[0].label})"
                    why = f"{salt} gives a black boride that makes the borohydride react fast with the solvent"
                else:
                    why = f"{acid[0].label}, an acid, protonates the borohydride"
                yield r.finding(
                    f"{comp.label} with {words}: {why}, releasing hydrogen quickly with heat and foaming. " + SAFETY,
                    atoms=[(comp.index, bh4[0])],
                    fix="Add the borohydride in small portions at 0 °C with good venting and room for foam, and "
                    "allow for the reagent lost to the solvent.",
                    severity="info",
                )
                continue
            yield r.finding(
                f"{comp.label} with {words}: normal practice. The borohydride decomposes slowly in the solvent, "
                "releasing hydrogen; add it in portions, cold, in a vented vessel, and use a small excess. " + SAFETY,
                atoms=[(comp.index, bh4[0])],
                fix="Add the borohydride portionwise at 0 °C with venting; allow for some loss to the solvent.",
                severity="info",
            )


# --------------------------------------------------------------------------- formed in the flask
_NITROSATING = (
    "[OX1-][NX2;+0]=[OX1]",  # nitrite salts (not a nitro group: its N is charged and has three bonds)
    "[#6][OX2][NX2;+0]=[OX1]",  # alkyl nitrites (tBuONO, isoamyl nitrite)
    "[$([NX2+]=[OX1]),$([NX1]#[OX1+]),$([NX1+]#[OX1])]",  # nitrosonium salts (NOBF4)
    "[Cl,Br][NX2;+0]=[OX1]",  # nitrosyl halides
    "[OX2H1][NX2;+0]=[OX1]",  # nitrous acid
)
_ACIDS = (
    ("a strong acid", "[$([Cl,Br,I;H1;X1;+0]),$([SX4](=O)(=O)[OX2H1]),$(C(=O)([OX2H1])C(F)(F)F),$([NX3+](=O)([O-])[OH])]"),
    ("a carboxylic acid", "[CX3](=[OX1])([#6,#1])[OX2H1]"),  # not bicarbonate
    ("an ammonium salt", "[#7+;!H0;!$([#7]~[OX1-])]"),
)
_AZIDE_ION = "[N-]=[N+]=[N-]"
# a base in the same list (carbonate, bicarbonate, hydroxide, phosphate): a strong acid listed
# with it is the work-up or is neutralised, not free acid standing over the azide or cyanide
_BASE = "[$([CX3](=O)([OX1-])[OX1-,OX2H1]),$([OX1H1-]),$([PX4](=O)[OX1-])]"
_ORGANIC_AZIDE = "[#6,Si,P,S][NX2]=[NX2+]=[NX1-]"
_SILYL_AZIDE = "[Si][NX2]=[NX2+]=[NX1-]"
_CYANIDE = "[C-]#N"
_CYANOBOROHYDRIDE = "[B-,B]C#N"
_SILYL_CYANIDE = "[Si]C#N"
_DIAZONIUM = "[NX2+]#[NX1]"
_NITROSAMINE = "[NX3]([#6])([#6])N=O"
_ISOCYANATE = "[NX2]=[CX2]=[OX1]"
_ACYL_AZIDE = "[CX3,PX4](=O)[NX2]=[NX2+]=[NX1-]"
_PHOSGENE = "[$([CX3](=O)(Cl)Cl),$([CX3](=O)(Cl)OC(Cl)(Cl)Cl),$([CX3](=O)(OC(Cl)(Cl)Cl)OC(Cl)(Cl)Cl)]"
_PRIMARY_ARYL_AMINE = "[NX3H2;+0]c"
_SECONDARY_OR_TERTIARY = (
    "[$([NX3;H0,H1;+0]),$([NX4+;H1,H2])"  # the free amine or its salt
    ";!$(N-[C,S,P]=[O,S,N]);!$(N-a);!$(N~[#7,#8])]([CX4])[CX4]"
)
_SECONDARY_ARYL = "[NX3H1;+0]([CX4])c"


def _any(comps, smarts: str):
    for c in comps:
        hits = _frag_has(c, smarts)
        if hits:
            return c, hits[0]
    return None


def _acid(comps):
    for word, smarts in _ACIDS:
        hit = _any(comps, smarts)
        if hit is not None:
            return word, hit
    return None


def _azide_ratio(mol: Chem.Mol) -> tuple[int, int, int]:
    c = sum(1 for a in mol.GetAtoms() if a.GetAtomicNum() == 6)
    o = sum(1 for a in mol.GetAtoms() if a.GetAtomicNum() == 8)
    n = sum(1 for a in mol.GetAtoms() if a.GetAtomicNum() == 7)
    return c, o, n


@rule(id="hazardous-species-formed", title="A hazardous species forms in the flask", severity="info")
def hazardous_species_formed(ctx: Context):
    """Hazards of what forms in the flask, not only of what is added.

    What it flags
        Diazonium salts formed from an aryl amine and a nitrosating agent; N-nitrosamines from a
        nitrosating agent (nitrite, alkyl nitrite, NO+) and a secondary or tertiary amine (a
        warning when the nitrosamine is not the product drawn); organic azides, with the
        carbon-and-oxygen to nitrogen ratio; hydrazoic acid (HN3) from an azide salt with an
        acid (a warning with a strong or carboxylic acid, an info note with an ammonium salt,
        as in tetrazole syntheses); diazidomethane from an azide salt listed with dichloromethane
        (a warning); isocyanates drawn, or formed from an acyl azide or DPPA
        (Curtius) or a phosgene-type reagent and an amine; HCN from a cyanide salt or
        cyanoborohydride with an acid (a warning with a strong acid, an info note with acetic
        acid, the usual buffer of a reductive amination).

    Why it matters
        Dry diazonium salts detonate; N-nitrosamines are potent carcinogens and a regulated
        impurity in medicines; small organic azides and HN3 are explosive and HN3 is as toxic as
        HCN and volatile (bp 37 °C); isocyanates are toxic by inhalation and respiratory
        sensitisers; HCN is a fast-acting poison. None of these is in the bottle that was
        weighed, so the reagent SDS alone does not warn of them.

    Example
        ``C1CCNCC1.Nc1ccccc1.[Na+].[O-]N=O.Cl>>N#[N+]c1ccccc1.[Cl-]``: piperidine and nitrite give
        N-nitrosopiperidine alongside the diazotisation.

    Use instead
        Keep diazonium salts cold and in solution and use them at once. Keep nitrosating agents
        away from secondary and tertiary amines (or quench the excess nitrite with sulfamic acid
        or urea before they meet). Keep (number of C + O) / number of N at 3 or more for an
        organic azide you isolate, and work behind a shield on a small scale; never acidify azide
        salts or let them meet dichloromethane or heavy metals. Handle isocyanates, cyanides and
        cyanoborohydride in a fume hood and quench cyanide waste with basic bleach.

    References
        *Prudent Practices in the Laboratory*, National Research Council, 2011. Bretherick's
        *Handbook of Reactive Chemical Hazards*, 8th ed., 2017. S. Bräse, C. Gil, K. Knepper,
        V. Zimmermann, *Angew. Chem. Int. Ed.* 2005, 44, 5188 (organic azides; the (C+O)/N
        rule). European Medicines Agency, *Nitrosamine impurities in human medicinal products*,
        EMA/369136/2020. HCN from cyanoborohydride: R. F. Borch, M. D. Bernstein, H. D. Durst, *J. Am. Chem. Soc.* 1971, 93, 2897.
    """
    r = hazardous_species_formed.rule
    rxn = ctx.reaction
    pool = rxn.reactants + rxn.agents
    products = rxn.products
    said: set[str] = set()

    nitros = None
    for smarts in _NITROSATING:
        nitros = _any(pool, smarts)
        if nitros:
            break

    # diazonium salts formed from an aryl amine (one added is covered by hazard-caution)
    formed_diazonium = _any(products, _DIAZONIUM) if not _any(pool, _DIAZONIUM) else None
    aryl_nh2 = _any(rxn.reactants, _PRIMARY_ARYL_AMINE)
    alkyl_nitrite = _any(pool, _NITROSATING[1]) is not None  # tBuONO diazotises without acid
    if formed_diazonium or (nitros and aryl_nh2 and (_acid(pool) or alkyl_nitrite)):
        comp, atom = aryl_nh2 or formed_diazonium
        yield r.finding(
            f"A diazonium salt forms from {comp.label}: keep it at 0–5 °C, use it in solution straight away and "
            "never isolate it dry (dry diazonium salts can detonate); destroy any excess before work-up. " + SAFETY,
            atoms=[(comp.index, atom)],
            fix="Keep the diazotisation at 0–5 °C, use the solution at once, and quench excess nitrous acid "
            "(sulfamic acid or urea).",
        )
        said.add("diazonium")

    # N-nitrosamines from a nitrosating agent and a secondary or tertiary amine
    if nitros:
        amine = _any(pool, _SECONDARY_OR_TERTIARY) or _any(pool, _SECONDARY_ARYL)
        drawn = _any(products, _NITROSAMINE)
        if amine or drawn:
            comp, atom = (amine or drawn)
            intended = drawn is not None
            yield r.finding(
                (f"An N-nitrosamine is the product: N-nitrosamines are potent carcinogens. "
                 if intended else
                 f"{nitros[0].label} with {comp.label}: a nitrosating agent and a secondary or tertiary amine "
                 "give an N-nitrosamine, a potent carcinogen, alongside the intended reaction. ")
                + "Handle it as a carcinogen (closed handling, dedicated waste) and destroy the excess nitrosating "
                "agent before work-up. " + SAFETY,
                atoms=[(comp.index, atom)],
                fix="Keep nitrite and other nitrosating agents away from secondary and tertiary amines; quench excess "
                "nitrite with sulfamic acid or urea; test the product for nitrosamine impurities.",
                severity="info" if intended else "warning",
            )

    # organic azides drawn (formed, or used) with the (C + O) / N rule of thumb
    for comp in products + pool:
        hits = _frag_has(comp, _ORGANIC_AZIDE)
        if not hits or _frag_has(comp, _SILYL_AZIDE) or "azide" in said:
            continue
        c, o, n = _azide_ratio(comp.mol)
        ratio = (c + o) / n if n else float("inf")
        if ratio >= 3 and comp.role != "product":
            continue  # a stable azide reagent (DPPA, benzyl azide): the hazard-caution note covers it
        if ratio < 1:
            verdict, sev = (
                ": below 1, never to be isolated; make and use it in solution only (rule of thumb). ", "warning")
        elif ratio < 3:
            verdict, sev = (
                ": between 1 and 3, it can be made and isolated but is stored cold, in solution (at most about "
                "1 M) and in small amounts (rule of thumb). ", "info")
        else:
            verdict, sev = (": 3 or more, it can usually be isolated and stored (rule of thumb). ", "info")
        yield r.finding(
            f"{comp.label} is an organic azide with (C + O)/N = {ratio:.1f}" + verdict
            + "Organic azides can decompose explosively on heating, shock or with acid; keep them cool and away "
            "from heavy metals and dichloromethane. " + SAFETY,
            atoms=[(comp.index, hits[0])],
            fix="Keep the azide in solution and the scale small, work behind a shield, and do not distil or "
            "concentrate it to dryness" + ("; carry it on without isolation." if ratio < 3 else "."),
            severity=sev,
        )
        said.add("azide")

    # HN3 from an azide salt (or silyl azide) with an acid
    azide = _any(pool, _AZIDE_ION) or _any(pool, _SILYL_AZIDE)
    acid = _acid(pool)
    based = _any(pool, _BASE) is not None
    if azide and acid:
        word, (acomp, _) = acid
        strong = word == "a strong acid" and not based
        yield r.finding(
            f"{azide[0].label} with {acomp.label} ({word}): hydrazoic acid (HN3) forms, toxic, volatile "
            "(bp 37 °C) and explosive; it collects in the headspace and condensers. " + SAFETY,
            atoms=[(azide[0].index, azide[1])],
            fix="Keep azide mixtures neutral or basic where the route allows, vent through a basic scrubber, keep the "
            "scale small, and never concentrate an acidic azide solution.",
            severity="warning" if strong else "info",
        )

    # diazidomethane from an azide salt and dichloromethane (Bretherick's Handbook, sodium azide;
    # R. E. Conrow, W. D. Dean, Org. Process Res. Dev. 2008, 12, 1285, from memory): also when the
    # dichloromethane is a previous step's solvent or the extraction solvent
    dcm = next((c for c in pool if c.smiles == "ClCCl"), None)
    ionic_azide = _any(pool, _AZIDE_ION)
    if ionic_azide and dcm is not None:
        yield r.finding(
            f"{ionic_azide[0].label} with {dcm.label}: azide ion and dichloromethane form diazidomethane, a "
            "highly explosive liquid that concentrates in the organic phase and on evaporation. " + SAFETY,
            atoms=[(ionic_azide[0].index, ionic_azide[1])],
            fix="Keep dichloromethane away from azide salts: remove it completely before the azide step, and "
            "extract azide-containing mixtures with another solvent (ethyl acetate, MTBE, toluene).",
            severity="warning",
        )

    # isocyanates: drawn, or formed (Curtius, phosgene-type reagent with an amine)
    # an isocyanate added as a reagent is the subject of hazard-caution; here: drawn as a product,
    # or formed on the way (Curtius, phosgene-type reagent with an amine)
    iso = _any(products, _ISOCYANATE) if _any(pool, _ISOCYANATE) is None else None
    why = None
    if iso is None and _any(pool, _ISOCYANATE) is None:
        acyl_azide = _any(pool, _ACYL_AZIDE)
        phosgene = _any(pool, _PHOSGENE)
        if acyl_azide:
            iso, why = acyl_azide, "the acyl azide rearranges to an isocyanate (Curtius)"
        elif phosgene and _any(pool, "[NX3;H2,H1;+0;!$(N-[C,S]=[O,S])]"):
            iso, why = phosgene, "a phosgene-type reagent and an amine give an isocyanate or carbamoyl chloride"
    if iso is not None:
        comp, atom = iso
        yield r.finding(
            (f"{comp.label}: {why}. " if why else f"{comp.label} is an isocyanate. ")
            + "Isocyanates are toxic by inhalation and respiratory sensitisers; handle them in a fume hood and "
            "quench the excess (an alcohol or aqueous amine). " + SAFETY,
            atoms=[(comp.index, atom)],
            fix="Work in a fume hood with suitable gloves, keep the isocyanate in solution, and quench the excess "
            "before work-up.",
        )

    # HCN from a cyanide salt or cyanoborohydride with an acid
    cyan = _any(pool, _CYANOBOROHYDRIDE) or _any(pool, _CYANIDE) or _any(pool, _SILYL_CYANIDE)
    if cyan:
        acid = _acid([c for c in pool if c.index != cyan[0].index])
        if acid:
            word, (acomp, _) = acid
            borohydride = bool(_frag_has(cyan[0], _CYANOBOROHYDRIDE))
            # acetic acid buffers a cyanoborohydride reduction at pH 5-7; an ammonium salt or an
            # acid beside a base in the list leaves a cyanide solution near or above pH 9
            mild = (borohydride and word != "a strong acid") or word == "an ammonium salt" or based
            if borohydride:
                how = " in small amounts at the pH of a reductive amination (about 5–7)" if mild else ""
                fix = (
                    "Keep the mixture at pH 5 or above (acetic acid, not a strong acid), work in a fume hood, and "
                    "treat cyanide-containing waste with basic hypochlorite; NaBH(OAc)3 avoids cyanide altogether."
                )
            else:
                # a cyanide salt: HCN (pKa 9.2, CRC Handbook; from memory) is most of the cyanide at
                # any pH below about 9, so a weak acid releases it too; only a basic solution holds it
                if word == "an ammonium salt":
                    how = " (an ammonium salt is a weak acid: a little at first, more as the mixture warms)"
                elif based:
                    how = " wherever the acid outweighs the base listed with it, and in quantity at an acidic work-up"
                else:
                    how = ""
                fix = (
                    "Keep cyanide solutions basic (pH above 10–11) and add acid only after the cyanide is consumed "
                    "or destroyed; in a Sandmeyer cyanation neutralise the diazonium solution before it meets the "
                    "cyanide; work in a fume hood and treat cyanide-containing waste with basic hypochlorite."
                )
            yield r.finding(
                f"{cyan[0].label} with {acomp.label} ({word}): hydrogen cyanide (HCN) is released{how}. "
                "HCN is a fast-acting poison; work in a fume hood and quench the aqueous waste with basic bleach. "
                + SAFETY,
                atoms=[(cyan[0].index, cyan[1])],
                fix=fix,
                severity="info" if mild else "warning",
            )
