"""Regiochemistry and product checks: eliminations, ring substitution, condensations and
N-acylation chemoselectivity. Each recognised class records its ranked predictions in the
report, also when no product is drawn."""

from __future__ import annotations

from types import SimpleNamespace

from rdkit import Chem

from .. import _rdlog
from ..regio import Candidate, Prediction, attach, canonical, elimination, rank_labels, same_compound, substitution
from ..basicity import _protonate
from . import Context, rule
from ..perceive import GroupMatch
from ._support import ACYLATING, changed_nitrogens, family_is, salt_info, understood

_SMALL_BASES = {"alkoxide", "hydroxide"}


def _predictions(ctx: Context) -> list[Prediction]:
    preds = getattr(ctx, "predictions", None)
    if preds is None:
        preds = []
        ctx.predictions = preds
    return preds


def _product_fragments(ctx: Context) -> list[tuple[object, str]]:
    """(product component, canonical isomeric SMILES) of every drawn product fragment."""
    got = getattr(ctx, "_product_fragments", None)
    if got is None:
        got = []
        for prod in ctx.reaction.products:
            for frag in Chem.GetMolFrags(prod.mol, asMols=True, sanitizeFrags=False):
                smi = canonical(frag, stereo=True)
                if smi:
                    got.append((prod, smi))
        ctx._product_fragments = got
    return got


def _drawn_match(ctx: Context, cands: list[Candidate]) -> tuple[Candidate | None, object]:
    for prod, smi in _product_fragments(ctx):
        for c in cands:
            if same_compound(c.smiles, smi, stereo=None):
                c.drawn = True
                return c, prod
    return None, None


def _verdict(rule_obj, pred: Prediction, what: str, atoms=()):
    """The finding for a drawn minor (warning) or impossible (error) product. Highlights the
    substrate atoms where the drawn and the expected changes happen, then ``atoms``."""
    cands = pred.candidates
    drawn = next((c for c in cands if c.drawn), None)
    if drawn is None or drawn.label == "major":
        return None
    major = [c for c in cands if c.label == "major"]
    atoms = list(dict.fromkeys([(pred.substrate, a) for a in drawn.atoms + major[0].atoms] + list(atoms)))
    expected = ", ".join(c.smiles for c in major)
    sev = "warning" if drawn.label == "minor" else "error"
    word = "a minor product" if drawn.label == "minor" else "not expected to form"
    return rule_obj.finding(
        f"The {what} drawn, {drawn.smiles}, is {word} in this {pred.reaction_class}: expected major "
        f"{expected} ({major[0].reason}). The drawn one: {drawn.reason}.",
        atoms=atoms,
        fix=f"Expect {expected} as the major product"
        + (f"; {drawn.smiles} forms as a minor product." if drawn.label == "minor" else ".")
        + (f" To make {drawn.smiles}: {drawn.route}." if drawn.route else ""),
        severity=sev,
    )


# --------------------------------------------------------------------------- eliminations
def _has_new_alkene(ctx: Context, substrate) -> bool:
    def n_alkene(m):
        return sum(1 for b in m.GetBonds() if b.GetBondType() == Chem.BondType.DOUBLE and b.GetBeginAtom().GetAtomicNum() == 6 and b.GetEndAtom().GetAtomicNum() == 6)

    return any(n_alkene(p.mol) > n_alkene(substrate.mol) for p in ctx.reaction.products)


def _quaternise(mol: Chem.Mol, n_idx: int) -> Chem.Mol | None:
    """The trimethylammonium (exhaustive methylation) of an amine nitrogen."""
    rw = Chem.RWMol(mol)
    n = rw.GetAtomWithIdx(n_idx)
    heavy = sum(1 for x in n.GetNeighbors() if x.GetAtomicNum() > 1)
    for _ in range(4 - heavy):
        c = rw.AddAtom(Chem.Atom(6))
        rw.AddBond(n_idx, c, Chem.BondType.SINGLE)
    n.SetFormalCharge(1)
    n.SetNumExplicitHs(0)
    n.SetNoImplicit(True)
    with _rdlog.captured():
        try:
            m = rw.GetMol()
            Chem.SanitizeMol(m)
            return m
        except Exception:
            return None


@rule(id="elimination-regiochemistry", title="Alkene drawn against the expected regiochemistry", severity="warning")
def elimination_regiochemistry(ctx: Context):
    """Predict the alkenes of an elimination and compare them with the one drawn.

    What it flags
        An E2 elimination (alkyl halide or sulfonate with an alkoxide, hydroxide or hindered
        base) or a Hofmann elimination (quaternary ammonium or sulfonium salt; an amine
        exhaustively methylated and treated with silver oxide) whose drawn alkene is not the
        expected major one: a warning for a minor product, an error for one that does not form.
        Every beta-hydrogen is enumerated and each alkene ranked.

    Why it matters
        The Hofmann rule (least substituted alkene) holds for trialkylammonium and sulfonium
        leaving groups and for hindered bases: the base reaches the most accessible beta-H past
        the bulky leaving group. Halides and sulfonates with small bases follow Zaitsev (most
        substituted alkene). A plan built on the wrong isomer fails at the next step.

    Example
        ``CCCC(C)[N+](C)(C)C.[OH-]>>CCCC(C)=C``... the Hofmann product is pent-1-ene, not
        pent-2-ene.

    Use instead
        Draw the alkene the conditions give; for the other isomer change the leaving group or the
        base (a hindered base for the less substituted alkene, a small one for the more
        substituted). In cyclohexanes keep the beta-H anti-periplanar to the leaving group.

    References
        J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 17.
        A. W. Hofmann, Ann. 1851, 78, 253; A. M. Saytzeff, Ann. 1875, 179, 296.
    """
    r = elimination_regiochemistry.rule
    rxn = ctx.reaction
    names = set()
    hindered = False
    for c in rxn.reactants + rxn.agents:
        p = ctx.perception(c)
        names |= set(p.group_names)
        if p.hindered_base and (p.has("alkoxide", "metal_amide") or any(s.kind == "amidine" for s in p.nitrogens)):
            hindered = True
    silver = "silver_oxide" in names
    methylating = any(
        any(g.name == "alkyl_halide" and c.mol.GetAtomWithIdx(g.centre).GetTotalNumHs() == 3 for g in ctx.perception(c).groups)
        for c in rxn.reactants + rxn.agents
    )
    small_base = bool(names & _SMALL_BASES) and not hindered
    for sub in rxn.reactants:
        p = ctx.perception(sub)
        mol = sub.mol
        mode = evidence = None
        if p.has("quaternary_ammonium", "sulfonium") and (names & {"hydroxide", "alkoxide"} or silver or rxn.products):
            mode, evidence = "hofmann", "quaternary ammonium or sulfonium leaving group (Hofmann rule)"
        elif silver and methylating:
            amine = [s for s in p.nitrogens if s.kind in ("primary_amine", "secondary_amine", "tertiary_amine")]
            if amine:
                q = _quaternise(mol, amine[0].atom_index)
                if q is not None:
                    mol = q
                    mode, evidence = "hofmann", "exhaustive methylation with methyl iodide, then silver oxide and heat (Hofmann elimination)"
        elif p.has("alkyl_halide", "alkyl_sulfonate") and (hindered or small_base):
            if rxn.products and not _has_new_alkene(ctx, sub):
                continue  # drawn as a substitution
            if hindered:
                mode, evidence = "hofmann", "hindered base: the least hindered beta-H is removed"
            else:
                mode, evidence = "zaitsev", "small base with a halide or sulfonate (Zaitsev rule)"
        if mode is None:
            continue
        cands = elimination.predict(mol, mode, evidence)
        if not cands:
            continue
        pred = Prediction("elimination", evidence, sub.index, cands)
        _predictions(ctx).append(pred)
        _drawn_match(ctx, cands)
        lg_atoms = [(sub.index, a.GetIdx()) for a in sub.mol.GetAtoms() if a.GetAtomicNum() in (17, 35, 53) or a.GetFormalCharge() > 0][:2]
        f = _verdict(r, pred, "alkene", lg_atoms)
        if f is not None:
            yield f


# an activated ester or carbonate of N-hydroxysuccinimide, HOBt or a similar N-hydroxy compound
# (Fmoc-OSu, Boc-OSu, NHS esters): an acylating agent the catalog files as an ester
_ACTIVE_ESTER = Chem.MolFromSmarts("[CX3](=[OX1])[OX2][#7]")


def _leaving_rank(mol: Chem.Mol, centre: int, n: Chem.Atom) -> int:
    """How readily the bond from the acyl centre to ``n`` breaks: 0 a halide; 1 an oxygen that
    leads on to another acyl, sulfonyl or phosphoryl group or to nitrogen (the anhydride O of
    Ac2O and Boc2O, the N-oxy of an OSu or OBt ester); 2 an alkoxy or aryloxy oxygen, which stays
    (the tert-butoxy of Boc2O: Boc-NHR with t-BuOH and CO2, not t-BuOC(O)OC(O)-NHR)."""
    if n.GetAtomicNum() != 8:
        return 0
    for y in n.GetNeighbors():
        if y.GetIdx() == centre:
            continue
        if y.GetAtomicNum() == 7:
            return 1
        if y.GetAtomicNum() in (6, 15, 16) and any(
            b.GetBondType() == Chem.BondType.DOUBLE and b.GetOtherAtom(y).GetAtomicNum() in (8, 16)
            for b in y.GetBonds()
        ):
            return 1
    return 2


def _acyl_fragment(comp, group) -> tuple[Chem.Mol, int] | None:
    """The acyl (or sulfonyl) part of an acylating agent, without its leaving group, and the
    index of the atom that bonds to the nucleophile."""
    frag = Chem.RWMol(comp.mol)
    centre = group.centre
    leaving = sorted(
        (
            (_leaving_rank(frag, centre, n), n.GetIdx()) for n in frag.GetAtomWithIdx(centre).GetNeighbors()
            if n.GetAtomicNum() in (9, 17, 35, 53) or (n.GetAtomicNum() == 8 and n.GetDegree() == 2)
        ),
    )
    if not leaving or leaving[0][0] > 1:
        return None
    frag.RemoveBond(centre, leaving[0][1])
    with _rdlog.captured():
        m = frag.GetMol()
        m.UpdatePropertyCache(strict=False)
        pieces = Chem.GetMolFrags(m, asMols=False)
        keep = sorted([piece for piece in pieces if centre in piece][0])
        sub = Chem.RWMol(m)
        for idx in sorted(set(range(m.GetNumAtoms())) - set(keep), reverse=True):
            sub.RemoveAtom(idx)
        out = sub.GetMol()
        new_centre = keep.index(centre)
        out.GetAtomWithIdx(new_centre).SetNoImplicit(True)
    return out, new_centre


# --------------------------------------------------------------------------- ring substitution
def _ring_class(ctx: Context):
    """(class, electrophile SMILES rooted at the attaching atom, evidence, Lewis acid?) or None."""
    rxn = ctx.reaction
    comps = rxn.reactants + rxn.agents
    names = set()
    for c in comps:
        names |= set(ctx.perception(c).group_names)
    la = "lewis_acid" in names
    if names & {"nitrating_agent"} or ("nitrate_salt" in names and "sulfonic_acid" in names):
        return "nitration", "[N+](=O)[O-]", "nitrating agent (HNO3/H2SO4 or a nitronium source)", la, None
    for c in comps:
        p = ctx.perception(c)
        if la and p.has("acid_halide", "anhydride"):
            g = p.groups_named("acid_halide", "anhydride")[0]
            got = _acyl_fragment(c, g)
            if got is not None:
                acyl, centre = got
                with _rdlog.captured():
                    smi = Chem.MolToSmiles(acyl, rootedAtAtom=centre)
                return "Friedel-Crafts acylation", smi, f"acylating agent {c.label} with a Lewis acid", True, c
        if la and p.has("alkyl_halide") and c.role == "reactant":
            g = p.groups_named("alkyl_halide")[0]
            rw = Chem.RWMol(c.mol)
            rw.RemoveAtom(g.atoms[-1])
            with _rdlog.captured():
                alkane = rw.GetMol()
                centre = g.centre if g.centre < g.atoms[-1] else g.centre - 1
                alkane.GetAtomWithIdx(centre).SetNoImplicit(False)
                alkane.GetAtomWithIdx(centre).SetNumExplicitHs(0)
                try:
                    Chem.SanitizeMol(alkane)
                except Exception:
                    continue
            electros = substitution.alkyl_cations(alkane, centre)
            if not electros:
                continue
            note = (
                "; the carbocation rearranges (1,2-shift) before it attacks the ring"
                if len(electros) > 1 else ""
            )
            return (
                "Friedel-Crafts alkylation", electros,
                f"alkyl halide {c.label} with a Lewis acid{note}; the alkylated product is more reactive than the "
                "starting arene, so polyalkylation competes (use the arene in excess)", True, c,
            )
    if names & {"halogen", "n_halo"}:
        for c in comps:
            for g in ctx.perception(c).groups_named("halogen", "n_halo"):
                x = c.mol.GetAtomWithIdx(g.centre).GetSymbol()
                kind = {"Br": "bromination", "Cl": "chlorination", "I": "iodination"}[x]
                return kind, x, f"halogen source {c.label}" + (" with a Lewis acid" if la else ""), la, c
    sulfonation = _sulfonation(ctx, comps)
    if sulfonation is not None:
        electros, evidence, agent = sulfonation
        return "sulfonation", electros, evidence, la, agent
    return None


_SULFONIC = (("S(=O)(=O)O", 0.0, "sulfonic acid"),)
# what else an arene in sulfuric acid could be there for (esterification, hydrolysis, hydration)
_ACID_CATALYSED = ("alcohol", "carboxylic_acid", "ester", "aldehyde", "ketone", "acid_halide", "anhydride")
_ACID_CATALYSED_N = ("amide", "nitrile", "imide", "carbamate")
_ARYL_SULFONYL = Chem.MolFromSmarts("c[SX4](=[OX1])(=[OX1])[OX2H1,OX1-,Cl]")


def _aryl_sulfonyl_count(mol: Chem.Mol) -> int:
    return len(mol.GetSubstructMatches(_ARYL_SULFONYL))


def _sulfonation(ctx: Context, comps):
    """(electrophiles, evidence, agent component) of a sulfonation, or None.

    Recognised from a sulfonating agent (sulfur trioxide or oleum, an SO3-amine complex,
    chlorosulfonic acid), or from sulfuric acid when the drawn product gains an aryl sulfonic
    acid (or its salt or chloride), or when an arene meets sulfuric acid and nothing else."""
    rxn = ctx.reaction
    agent = next((c for c in comps if ctx.perception(c).has("sulfur_trioxide", "chlorosulfonic_acid")), None)
    if agent is not None:
        if ctx.perception(agent).has("chlorosulfonic_acid"):
            electros = [
                ("S(=O)(=O)Cl", 0.0, "chlorosulfonation (excess chlorosulfonic acid gives the sulfonyl chloride)"),
                ("S(=O)(=O)O", 0.0, "sulfonic acid (one equivalent of chlorosulfonic acid)"),
            ]
            return electros, f"chlorosulfonic acid {agent.label} (chlorosulfonation)", agent
        return list(_SULFONIC), f"sulfur trioxide source {agent.label} (sulfonation)", agent
    acid = next((c for c in comps if ctx.perception(c).has("sulfuric_acid")), None)
    if acid is None:
        return None
    before = sum(_aryl_sulfonyl_count(c.mol) for c in rxn.reactants)
    gained = rxn.products and any(_aryl_sulfonyl_count(p.mol) > before for p in rxn.products)
    others = [c for c in rxn.reactants if c.index != acid.index]
    alone = (
        not rxn.products and len(others) == 1
        and not ctx.perception(others[0]).has(*_ACID_CATALYSED)
        and not any(s.kind in _ACID_CATALYSED_N for s in ctx.perception(others[0]).nitrogens)
    )
    if gained or alone:
        why = "the drawn product gains an aryl sulfonic acid" if gained else "an arene in concentrated sulfuric acid and nothing else"
        return list(_SULFONIC), f"sulfuric acid {acid.label}: {why} (sulfonation)", acid
    return None


def _aromatic_substrate(ctx: Context, exclude):
    for c in ctx.reaction.reactants:
        if exclude is not None and c.index == exclude.index:
            continue
        if any(len(r) == 6 and all(c.mol.GetAtomWithIdx(i).GetIsAromatic() and c.mol.GetAtomWithIdx(i).GetAtomicNum() == 6 for i in r) for r in c.mol.GetRingInfo().AtomRings()):
            return c
    return None


@rule(id="ring-substitution-regiochemistry", title="Ring substitution drawn at an unexpected position", severity="warning", applies_to=("friedel_crafts", "ring_substitution"))
def ring_substitution_regiochemistry(ctx: Context):
    """Predict the position of an electrophilic aromatic substitution and compare.

    What it flags
        A nitration, halogenation, sulfonation or Friedel–Crafts acylation or alkylation whose
        drawn product carries the new group at a position the ring's substituents do not favour:
        a warning for a minor isomer, an error for one that does not form. Friedel–Crafts
        alkylations are predicted with the carbocation rearranged by 1,2-hydride or methyl shifts
        (n-propyl to isopropyl, neopentyl to tert-pentyl). Sulfonation is recognised from sulfur
        trioxide, oleum, SO3–amine complexes and chlorosulfonic acid, or from sulfuric acid when
        the product gains an aryl sulfonic acid. Also anilines in strongly acidic media (the anilinium ion directs meta and the ring is oxidised) and free
        anilines with bromine (all three ortho/para positions react).

    Why it matters
        Activating groups direct ortho/para, deactivating ones meta; with several substituents
        the strongest activator wins, and bulky electrophiles (acylium ions) prefer para. A
        protonated aniline is a meta director on a deactivated ring, and nitric acid oxidises
        free anilines.

    Example
        ``COc1ccccc1.CC(=O)Cl>AlCl3>COc1cccc(C(C)=O)c1``: the meta isomer drawn; the para
        isomer is the major product.

    Use instead
        Draw the major isomer; for a meta product on an activated ring change the route (a meta
        director first, then interconvert). Nitrate or sulfonate anilines as their acetanilides,
        then hydrolyse.

    References
        J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 21-22.
        M. B. Smith, *March's Advanced Organic Chemistry*, 8th ed., Wiley 2020, ch. 11.
    """
    r = ring_substitution_regiochemistry.rule
    if not family_is(ctx, "friedel_crafts", "ring_substitution"):
        return  # the centre shows no substitution on a ring (an organozinc addition, a coupling)
    info = _ring_class(ctx)
    if info is None:
        return
    klass, electro, evidence, la, elec_comp = info
    sub = _aromatic_substrate(ctx, elec_comp)
    if sub is None:
        return
    mol = sub.mol
    free_anilines = [s for s in ctx.sites(sub) if s.kind == "aryl_amine" and s.pka is not None]
    acidic = klass in ("nitration", "sulfonation")
    if free_anilines and acidic:
        n = free_anilines[0]
        mol = _protonate(mol, n.atom_index)
        has_nh = sub.mol.GetAtomWithIdx(n.atom_index).GetTotalNumHs() > 0
        yield r.finding(
            f"In {klass.split()[0]} conditions the strong acid protonates the aniline nitrogen of {sub.label} "
            f"(pKa of its conjugate acid {n.pka:.1f}): the anilinium ion directs meta on a deactivated ring"
            + (", and nitric acid also oxidises free anilines to tars." if klass == "nitration" else "."),
            atoms=[(sub.index, n.atom_index)],
            fix=(
                f"Protect the amine as its acetamide (Ac2O), run the {klass}, then hydrolyse the amide "
                "(the acetamide directs ortho/para, mainly para)."
                if has_nh
                else "This nitrogen carries no N–H and cannot be protected as an amide: in strong acid expect "
                "mainly the meta product; for the ortho or para isomer, introduce the amino group after the "
                f"{klass} (for example by substitution of a para-fluoro group)."
            ),
        )
    if free_anilines and klass == "bromination" and not la:
        yield r.finding(
            f"{sub.label} is a free aniline: with bromine every free ortho and para position reacts "
            "(2,4,6-tribromination) without a catalyst.",
            atoms=[(sub.index, free_anilines[0].atom_index)],
            fix="For one bromine use the acetanilide (then hydrolyse), or NBS at low temperature.",
            severity="warning",
        )
    bulky = klass.startswith("Friedel-Crafts") or klass == "sulfonation"  # acylium, SO3: para
    cands = substitution.predict(mol, electro, klass, bulky)
    if not cands:
        return
    pred = Prediction(klass, evidence, sub.index, cands)
    _predictions(ctx).append(pred)
    drawn, prod = _drawn_match(ctx, cands)
    if mol is not sub.mol:
        # on the anilinium the outcome is a meta/para mixture with oxidation: the warning above
        # says what matters, an isomer verdict would mislead
        for c in cands:
            if c.label == "minor" and "para" in c.reason:
                c.label = "major"
        return
    f = _verdict(r, pred, "isomer")
    if f is not None:
        yield f


def _has_lewis_acid(ctx: Context) -> bool:
    rxn = ctx.reaction
    return any(g.name == "lewis_acid" for c in rxn.reactants + rxn.agents for g in ctx.perception(c).groups)


@rule(id="ring-too-deactivated", title="The ring is too deactivated for the substitution", severity="error", applies_to=("friedel_crafts", "ring_substitution"))
def ring_too_deactivated(ctx: Context):
    """Friedel–Crafts reactions on rings that carry strongly deactivating groups.

    What it flags
        A Friedel–Crafts acylation or alkylation whose aromatic substrate carries a nitro, cyano,
        carbonyl, sulfonyl, trifluoromethyl or ammonium group (and no activating group), or a
        basic nitrogen that the Lewis acid turns into a deactivating N–Lewis acid complex.

    Why it matters
        Friedel–Crafts electrophiles are weak; rings less reactive than a halobenzene do not
        react, and nitrobenzene is even used as a Friedel–Crafts solvent for that reason.

    Example
        ``O=[N+]([O-])c1ccccc1.CC(=O)Cl>AlCl3>``: nitrobenzene is not acylated.

    Use instead
        Acylate before introducing the deactivating group, or use a route that does not need
        electrophilic substitution on the deactivated ring (cross-coupling, nucleophilic
        aromatic substitution).

    References
        G. A. Olah, *Friedel–Crafts and Related Reactions*, Wiley 1963-65. J. Clayden,
        N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 21.
    """
    r = ring_too_deactivated.rule
    if not family_is(ctx, "friedel_crafts", "ring_substitution"):
        return  # the centre shows no substitution on a ring (an organozinc addition, a coupling)
    info = _ring_class(ctx)
    if info is None or not info[0].startswith("Friedel-Crafts"):
        return
    sub = _aromatic_substrate(ctx, info[4])
    if sub is None:
        return
    groups = substitution.deactivation(sub.mol)
    basic_ar_n = [s for s in ctx.sites(sub) if s.kind in ("aryl_amine",) and s.pka is not None and not salt_info(ctx, sub)[0]]
    if groups:
        names = ", ".join(sorted({n for _, n in groups}))
        yield r.finding(
            f"{sub.label} carries {names}: the ring is too deactivated for a Friedel–Crafts reaction, which is "
            "expected to give no product.",
            atoms=[(sub.index, idx) for idx, _ in groups],
            fix="Run the Friedel–Crafts step before introducing the deactivating group, or choose another route "
            "(cross-coupling, nucleophilic aromatic substitution).",
        )
    elif basic_ar_n and not _has_lewis_acid(ctx):
        # with a Lewis acid present, lewis-acid-quenched-by-amine gives both reasons (the
        # acid taken up, the complexed ring deactivated) in one finding; here the promoter is
        # a strong protic acid, which protonates the nitrogen to the same effect
        if sub.mol.GetAtomWithIdx(basic_ar_n[0].atom_index).GetTotalNumHs() > 0:
            fix = "Acylate the nitrogen first (the acetanilide is acylated para to the NHAc), then hydrolyse the amide."
        else:
            fix = (
                "This nitrogen carries no N–H and cannot be acylated: run the Friedel–Crafts step before the "
                "amine is made, or use a reaction that needs no Lewis acid (for a formyl group, the "
                "Vilsmeier–Haack reaction)."
            )
        yield r.finding(
            f"The amino nitrogen of {sub.label} is protonated by the acid that promotes the reaction; the "
            "ammonium group is strongly deactivating, so the ring does not undergo the Friedel–Crafts reaction.",
            atoms=[(sub.index, basic_ar_n[0].atom_index)],
            fix=fix,
        )


# --------------------------------------------------------------------------- Friedel–Crafts without a catalyst
# Strong protic acids that promote Friedel–Crafts acylation in place of a Lewis acid (triflic
# acid, polyphosphoric acid, Eaton's reagent, HF, sulfuric acid): a P-O-P anhydride, a sulfonic
# acid, HF or a perfluoroalkanesulfonic acid among the components.
_FC_ACIDS = tuple(
    Chem.MolFromSmarts(sm)
    for sm in (
        "[PX4](=O)[OX2][PX4]=O",  # PPA, P4O10 (Eaton's reagent with MsOH)
        "[SX4](=O)(=O)[OX2H1]",  # triflic, methanesulfonic, sulfuric acid
        "[FH1]",  # HF
    )
)
# pi-excessive heteroarenes that are acylated without a catalyst (pyrroles, indoles: an
# NH or N-alkyl five-membered ring N with its lone pair in the ring)
_ARYL_KETONE = Chem.MolFromSmarts("[a][CX3](=[OX1])")
_IMINE_OR_ENAMINE = Chem.MolFromSmarts("[$([CX3]=[NX2]),$([CX3]([NX3])=[CX3])]")
_PI_EXCESSIVE = Chem.MolFromSmarts("[nX3;r5;!$(n-[CX3]=O);!$(n-S(=O)=O)]")


@rule(id="ring-acylation-without-lewis-acid", title="Ring acylation drawn with nothing to promote it", severity="warning", applies_to=("friedel_crafts", "ring_substitution"))
def ring_acylation_without_lewis_acid(ctx: Context):
    """A Friedel–Crafts acylation drawn without a Lewis acid or a strong acid.

    What it flags
        An aromatic carbon of a reactant drawn bonded to the acyl carbon of an acid halide or
        anhydride, while no Lewis acid (AlCl3, FeCl3, BF3, SnCl4, ZnCl2, TiCl4, metal
        triflates, ...) and no strong protic acid that promotes the reaction (triflic,
        methanesulfonic or sulfuric acid, polyphosphoric acid, HF) is present. Pyrroles and
        indoles, which are acylated without a catalyst, are left out.

    Why it matters
        An acid chloride or anhydride is not electrophilic enough to attack a benzene ring: the
        acylium ion that does forms only with a Lewis acid (usually at least one equivalent,
        since the product ketone binds it) or a superacid. With an amine or alcohol present
        the acylating agent goes to N or O instead; with pyridines it gives an N-acylpyridinium
        salt.

    Example
        ``COc1ccccc1.CC(=O)Cl>ClCCl>COc1ccc(C(C)=O)cc1``: no catalyst, no ketone.

    Use instead
        Add the Lewis acid (AlCl3, 1.1 equiv or more for acylation; FeCl3, ZnCl2 or a metal
        triflate for activated rings), or run it in a strong acid (polyphosphoric acid,
        Eaton's reagent, triflic acid). Write the promoter among the agents so the check
        sees it.

    References
        G. A. Olah, *Friedel–Crafts and Related Reactions*, Wiley 1963-65. J. Clayden,
        N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 21.
    """
    r = ring_acylation_without_lewis_acid.rule
    if not family_is(ctx, "friedel_crafts", "ring_substitution"):
        return  # the centre shows no substitution on a ring (an organozinc addition, a coupling)
    rxn = ctx.reaction
    if not rxn.products:
        return
    comps = rxn.reactants + rxn.agents
    if any(ctx.perception(c).has("lewis_acid") for c in comps):
        return
    if any(c.mol.HasSubstructMatch(q) for c in comps for q in _FC_ACIDS):
        return
    acyl = [(c, g) for c in rxn.reactants for g in ctx.perception(c).groups_named("acid_halide", "anhydride")]
    if not acyl:
        return
    # only where the products hold more aryl ketones than the reactants (a cheap test first)
    def aryl_ketones(comps):
        return sum(len(c.mol.GetSubstructMatches(_ARYL_KETONE)) for c in comps)

    if aryl_ketones(rxn.products) <= aryl_ketones(rxn.reactants):
        return
    from ..changes import atom_correspondence, new_bonds_at

    back = {v: k for k, v in atom_correspondence(rxn).items()}
    centres = {(c.index, g.centre) for c, g in acyl}
    for nb in new_bonds_at(rxn, 6):
        sub = rxn.components[nb.reactant]
        ratom = sub.mol.GetAtomWithIdx(nb.reactant_atom)
        if not ratom.GetIsAromatic() or (sub.index, nb.reactant_atom) in centres:
            continue
        product = rxn.components[nb.product]
        partner = next(
            (back.get((product.index, p)) for p in nb.partners if back.get((product.index, p)) in centres), None
        )
        if partner is None:
            # the acyl group left unmapped (two acetyl groups in play): a new C=O carbon on the ring
            carbonyl = any(
                product.mol.GetAtomWithIdx(p).GetAtomicNum() == 6
                and back.get((product.index, p)) is None
                and any(
                    b.GetBondType() == Chem.BondType.DOUBLE and b.GetOtherAtom(product.mol.GetAtomWithIdx(p)).GetAtomicNum() == 8
                    for b in product.mol.GetAtomWithIdx(p).GetBonds()
                )
                for p in nb.partners
            )
            if not carbonyl:
                continue
            partner = (acyl[0][0].index, acyl[0][1].centre)
        if sub.mol.HasSubstructMatch(_PI_EXCESSIVE):
            continue  # pyrroles and indoles: acylated without a catalyst
        agent = rxn.components[partner[0]]
        azine = any(s_.kind == "pyridine_type" for s_ in ctx.sites(sub))
        yield r.finding(
            f"{sub.label} is drawn acylated on its ring by {agent.label}, but no Lewis acid or strong acid is "
            "present: without one no acylium ion forms and the ring does not react."
            + (
                " Its ring N takes the acylating agent instead (an N-acylpyridinium salt); even with a Lewis acid "
                "an electron-poor azine ring is not acylated on carbon."
                if azine else ""
            ),
            atoms=[(sub.index, nb.reactant_atom), (agent.index, partner[1])],
            fix="Add a Lewis acid (AlCl3, at least 1.1 equiv for an acylation; FeCl3, ZnCl2 or a metal triflate for "
            "an activated ring) or run it in polyphosphoric acid, Eaton's reagent or triflic acid, and write it among "
            "the agents.",
        )
        return


# --------------------------------------------------------------------------- condensations
def _condensation_candidates(carbonyl, amine_comp, n_idx: int, kind: str) -> list[Candidate]:
    from rdkit.Chem import rdChemReactions

    out = []
    with _rdlog.captured():
        if kind in ("primary_amine", "ammonia", "aryl_amine"):
            rxn = rdChemReactions.ReactionFromSmarts("[C:1]=[O].[NX3;H2,H3;+0:2]>>[C:1]=[N:2]")
            label, why = "imine", "a primary amine (or ammonia) condenses to the imine, with loss of water"
        elif kind == "secondary_amine":
            rxn = rdChemReactions.ReactionFromSmarts("[C:1](=[O])[C;!H0:3].[NX3;H1;+0:2]>>[C:1](-[N:2])=[C:3]")
            label, why = "enamine", "a secondary amine cannot form a neutral imine: the enamine forms"
        else:
            return []
        ps = rxn.RunReactants((carbonyl.mol, amine_comp.mol))
        for prods in ps:
            m = prods[0]
            try:
                Chem.SanitizeMol(m)
            except Exception:
                continue
            smi = canonical(m)
            if not smi:
                continue
            score = 0.0
            reason = why
            if label == "enamine":
                # the C=C forms on the less substituted alpha carbon (A(1,3) strain with the N-alkyls)
                dbl = [b for b in m.GetBonds() if b.GetBondType() == Chem.BondType.DOUBLE and b.GetBeginAtom().GetAtomicNum() == 6 and b.GetEndAtom().GetAtomicNum() == 6 and any(x.GetAtomicNum() == 7 for x in (b.GetBeginAtom(), b.GetEndAtom()) for x in x.GetNeighbors())]
                if dbl:
                    b = dbl[0]
                    far = b.GetEndAtom() if any(x.GetAtomicNum() == 7 for x in b.GetBeginAtom().GetNeighbors()) else b.GetBeginAtom()
                    subs = sum(1 for x in far.GetNeighbors() if x.GetAtomicNum() == 6) - 1
                    score = -subs
                    reason = f"{why}; on the less substituted side (A(1,3) strain with the N-alkyl groups)" if subs == 0 else f"{why}; the more substituted enamine is disfavoured by A(1,3) strain"
            out.append(Candidate(smi, 0, "", reason, score))
    return rank_labels(out, minor_gap=0.5, none_gap=5.0)


def _adds_up_less_water(carbonyl, amine, products) -> bool:
    """Some product has the atoms of the carbonyl and the amine less one water (or is their
    iminium salt, less water and hydroxide)."""
    from collections import Counter

    def counts(mol):
        c: Counter[str] = Counter()
        for a in mol.GetAtoms():
            c[a.GetSymbol()] += 1
            c["H"] += a.GetTotalNumHs()
        return c

    want = counts(carbonyl.mol) + counts(amine.mol)
    want.subtract({"H": 2, "O": 1})
    want = +want
    for p in products:
        got = counts(p.mol)
        if got == want:
            return True
        iminium = Counter(want)
        iminium.subtract({"H": 0})
        if p.charge > 0 and got - Counter({"H": 1}) == +iminium:
            return True
    return False


@rule(id="condensation-product-mismatch", title="Condensation product does not fit the amine", severity="error")
def condensation_product_mismatch(ctx: Context):
    """Aldehydes and ketones with amines: imine, enamine or iminium, by the class of the amine.

    What it flags
        An imine drawn from a secondary amine or any condensation product drawn from a tertiary
        amine (errors: they cannot form); an enamine drawn from a primary amine where the imine is
        the expected product, an enamine drawn on the more substituted side of a ketone, or an
        imine or enamine whose atoms the two reactants cannot supply (a carbon lost, another
        amine's N-substituent) (warnings).

    Why it matters
        Condensation needs two N–H bonds for a neutral imine. A secondary amine stops at the
        iminium ion, which loses an alpha proton to give the enamine (on the less substituted side
        for 2-substituted cyclohexanones, because of A(1,3) strain), or stays an iminium when
        there is no alpha-H. Tertiary amines do not condense.

    Example
        ``O=C1CCCCC1.C1CCNC1>>C1CCC(=NC2CCCC2)CC1``... drawn as an imine from pyrrolidine.

    Use instead
        Draw the enamine for secondary amines, the imine for primary amines; with a reductant
        the product is the amine (reductive amination).

    References
        G. Stork et al., J. Am. Chem. Soc. 1963, 85, 207 (enamines). J. Clayden, N. Greeves,
        S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 11 and 26.
    """
    r = condensation_product_mismatch.rule
    rxn = ctx.reaction
    if any(ctx.perception(c).has(*ACYLATING, "boron_hydride", "aluminium_hydride", "dihydrogen") for c in rxn.reactants + rxn.agents):
        return  # acylation or reductive amination: not a plain condensation
    carbonyls = [c for c in rxn.reactants if ctx.perception(c).has("aldehyde", "ketone")]
    if not carbonyls:
        return
    amines = [
        (c, s) for c in rxn.reactants for s in ctx.sites(c)
        if s.kind in ("primary_amine", "secondary_amine", "tertiary_amine", "ammonia", "aryl_amine") and not salt_info(ctx, c)[0]
    ]
    if not carbonyls or not amines:
        return
    carbonyl = carbonyls[0]
    amine_comp, site = max(amines, key=lambda cs: (cs[1].kind != "tertiary_amine", cs[1].pka or 0))
    if amine_comp.index == carbonyl.index:
        return
    cands = _condensation_candidates(carbonyl, amine_comp, site.atom_index, site.kind)
    klass = {"secondary_amine": "enamine formation"}.get(site.kind, "imine formation")
    if site.kind == "tertiary_amine":
        klass = "condensation (none expected)"
    _predictions(ctx).append(Prediction(klass, f"{carbonyl.label} with {amine_comp.label}", carbonyl.index, cands))
    if not rxn.products:
        return
    drawn, _ = _drawn_match(ctx, cands)
    changed = [nb for nb in changed_nitrogens(ctx) if nb.reactant == amine_comp.index]
    atoms = [(amine_comp.index, site.atom_index)]
    u = understood(ctx)
    if u is not None and u.amap.coverage >= 0.9 and drawn is None:
        # the atom map says which atoms bond: when no new bond reaches this nitrogen, the
        # product comes from another centre (a thiourea's S and N in a Hantzsch thiazole
        # synthesis beside a tertiary amine that only rides along)
        n_atom = atoms[0]
        if not any(n_atom in ch.atoms_before for ch in u.centre.formed() if ch.atoms_before):
            return
    if site.kind == "tertiary_amine" and changed:
        yield r.finding(
            f"{amine_comp.label} is a tertiary amine: it has no N–H and does not condense with {carbonyl.label}.",
            atoms=atoms,
            fix="Use a primary amine (imine) or a secondary amine (enamine), or a different bond-forming step.",
        )
        return
    if drawn is not None:
        if drawn.label != "major":
            yield r.finding(
                f"The enamine drawn is the more substituted one; the less substituted enamine "
                f"{cands[0].smiles} is expected ({cands[0].reason}).",
                atoms=atoms,
                fix=f"Expect {cands[0].smiles}.",
                severity="warning",
            )
        return
    if not changed or not _adds_up_less_water(carbonyl, amine_comp, rxn.products):
        if cands and site.kind in ("primary_amine", "ammonia", "aryl_amine", "secondary_amine") and not ctx.balance.balanced:
            # a condensation product drawn whose atoms the reactants cannot supply (a CH2 lost,
            # the wrong amine's N-substituent): name the product these reactants give
            drawn_cn = [
                c for c in rxn.products
                if c.mol.HasSubstructMatch(_IMINE_OR_ENAMINE) and c.index not in {x.index for x in rxn.reactants}
            ]
            if drawn_cn:
                yield r.finding(
                    f"The product drawn, {drawn_cn[0].label}, is not what {carbonyl.label} and {amine_comp.label} give: "
                    f"its atoms do not add up to theirs less water. Expected {cands[0].smiles} ({cands[0].reason}).",
                    atoms=atoms,
                    fix=f"Draw {cands[0].smiles}, or add the reagent that the drawn product needs.",
                    severity="warning",
                )
        return
    prod = ctx.reaction.components[changed[0].product]
    pn = prod.mol.GetAtomWithIdx(changed[0].product_atom)
    imine_drawn = any(b.GetBondType() == Chem.BondType.DOUBLE and b.GetOtherAtom(pn).GetAtomicNum() == 6 for b in pn.GetBonds())
    enamine_drawn = not imine_drawn and any(
        any(b.GetBondType() == Chem.BondType.DOUBLE and b.GetOtherAtom(x).GetAtomicNum() == 6 for b in x.GetBonds())
        for x in pn.GetNeighbors() if x.GetAtomicNum() == 6
    )
    expected = cands[0].smiles if cands else None
    if site.kind == "secondary_amine" and imine_drawn and pn.GetFormalCharge() == 0:
        yield r.finding(
            f"A neutral imine is drawn from the secondary amine {amine_comp.label}, but it has only one N–H: it gives "
            + ("the enamine" if expected else "an iminium ion (no alpha-H)")
            + ".",
            atoms=atoms,
            fix=f"Expect the enamine {expected}." if expected else "Draw the iminium salt, or use a primary amine for the imine.",
        )
    elif site.kind in ("primary_amine", "ammonia", "aryl_amine") and enamine_drawn:
        yield r.finding(
            f"An enamine is drawn from the primary amine {amine_comp.label}; the imine {expected} is the expected product "
            "(the imine–enamine equilibrium lies on the imine side).",
            atoms=atoms,
            fix=f"Expect {expected}." if expected else "Expect the imine.",
            severity="warning",
        )


# --------------------------------------------------------------------------- chemoselectivity
def _site_score(mol, site) -> float:
    atom = mol.GetAtomWithIdx(site.atom_index)
    score = site.pka or 0.0
    heavy = [x for x in atom.GetNeighbors() if x.GetAtomicNum() > 1]
    if len(heavy) >= 2:
        score -= 0.7  # secondary: more hindered
    if any(sum(1 for y in x.GetNeighbors() if y.GetAtomicNum() > 1) >= 3 for x in heavy if not x.GetIsAromatic()):
        score -= 1.0  # on a branched carbon
    return score


def _selectivity_sites(ctx: Context, sub, sites, oxygens) -> list[tuple[int, float, str]]:
    """The sites worth a predicted product, best first, within the work budget: one per set of
    symmetry-equivalent atoms (they give the same compound), then at most as many as the cap
    for the substrate's size allows; the sites left out are named in the budget."""
    from .._budget import budget_of, candidate_cap

    mol = sub.mol
    out = [
        (s_.atom_index, _site_score(mol, s_), f"acylation at the {s_.kind.replace('_', ' ')} N (pKa {s_.pka:.1f})")
        for s_ in sites
    ]
    for o in oxygens:
        phenol = any(x.GetIsAromatic() for x in mol.GetAtomWithIdx(o).GetNeighbors())
        out.append((o, -2.0 if phenol else -3.0, f"acylation at the {'phenol' if phenol else 'alcohol'} O"))
    stereo = any(a.GetChiralTag() != Chem.ChiralType.CHI_UNSPECIFIED for a in mol.GetAtoms()) or any(
        b.GetStereo() != Chem.BondStereo.STEREONONE for b in mol.GetBonds()
    )
    if len(out) > 2 and not stereo:  # with stereo marks, equivalent sites may give stereoisomers
        ranks = list(Chem.CanonicalRankAtoms(mol, breakTies=False))
        seen: set[int] = set()
        unique = []
        for item in out:
            if ranks[item[0]] not in seen:
                seen.add(ranks[item[0]])
                unique.append(item)
        out = unique
    out.sort(key=lambda item: -item[1])  # stable: the order among equal scores is kept
    cap = candidate_cap(mol.GetNumHeavyAtoms())
    if len(out) > cap:
        budget_of(ctx).skip(
            f"the products of acylation at {len(out) - cap} of the {len(out)} distinct sites of {sub.label} "
            f"(the {cap} most nucleophilic were compared)"
        )
        out = out[:cap]
    return out


@rule(id="acylation-chemoselectivity", title="Acylation drawn at the less nucleophilic site", severity="warning")
def acylation_chemoselectivity(ctx: Context):
    """With several nucleophilic sites in one molecule, nitrogen and the more nucleophilic amine
    react first.

    What it flags
        An acylation (acid chloride, anhydride, sulfonyl chloride, chloroformate, dicarbonate) of
        a substrate with an amine and an alcohol or phenol, or with several amines, drawn on the
        less nucleophilic site: an O-acylation while a free amine is present, an aryl amine
        acylated before an alkylamine, a hindered amine before an unhindered one. Not under
        strongly acidic conditions, where the amine is protonated and O-acylation is the intent.

    Why it matters
        Amines are far more nucleophilic than alcohols and phenols, alkylamines (pKa about 10)
        more than anilines (pKa about 4.6), and unhindered amines more than hindered ones: with one
        equivalent of acylating agent the product is the N-acyl (alkyl) derivative.

    Example
        ``NCCO.CC(=O)Cl>Et3N>CC(=O)OCCN``: the ester drawn, the amide expected.

    Use instead
        Draw the N-acylated product, or protect the amine (Boc, or as its salt under acidic
        conditions) when the other site is to be acylated.

    References
        J. Clayden, N. Greeves, S. Warren, *Organic Chemistry*, 2nd ed., OUP 2012, ch. 23
        (chemoselectivity). P. G. M. Wuts, *Greene's Protective Groups in Organic Synthesis*,
        5th ed., Wiley 2014.
    """
    r = acylation_chemoselectivity.rule
    rxn = ctx.reaction
    if not rxn.products:
        return
    acyl = [c for c in rxn.reactants if ctx.perception(c).has(*ACYLATING, "dicarbonate")]
    active = [c for c in rxn.reactants if c not in acyl and c.mol.HasSubstructMatch(_ACTIVE_ESTER)]
    acyl += active
    if not acyl:
        return
    if any(ctx.perception(c).has("hydrogen_halide", "sulfonic_acid", "perfluoro_acid") for c in rxn.reactants + rxn.agents):
        return
    from ..changes import new_bonds_at

    n_changes = changed_nitrogens(ctx)
    o_changes = new_bonds_at(rxn, 8)
    agent = acyl[0]
    groups = ctx.perception(agent).groups_named(*ACYLATING, "dicarbonate")
    if not groups and agent in active:
        centre = agent.mol.GetSubstructMatch(_ACTIVE_ESTER)[0]
        groups = [GroupMatch("active_ester", (centre,), "")]
    frag = _acyl_fragment(agent, groups[0]) if groups else None
    for sub in rxn.reactants:
        if sub.index in {a.index for a in acyl} or salt_info(ctx, sub)[0]:
            continue
        sites = [s for s in ctx.sites(sub) if s.kind in ("primary_amine", "secondary_amine", "aryl_amine", "ammonia") and s.pka is not None]
        if not sites:
            continue
        best = max(sites, key=lambda s: _site_score(sub.mol, s))
        oxygens = [
            a.GetIdx() for a in sub.mol.GetAtoms()
            if a.GetAtomicNum() == 8 and a.GetTotalNumHs() == 1 and a.GetDegree() == 1
        ]
        if frag is not None and (len(sites) > 1 or oxygens):
            cands = []
            for atom, score, reason in _selectivity_sites(ctx, sub, sites, oxygens):
                smi = attach(sub.mol, atom, *frag)
                if smi:
                    cands.append(Candidate(smi, 0, "", reason, score, atoms=(atom,)))
            ranked = rank_labels(cands, minor_gap=1.0, none_gap=6.0)
            drawn_cand = None
            if ranked:
                drawn_cand, _ = _drawn_match(ctx, ranked)
                _predictions(ctx).append(Prediction("N-acylation (chemoselectivity)", f"{agent.label} with {sub.label}", sub.index, ranked))
        else:
            drawn_cand = None
        drawn_n = [nb for nb in n_changes if nb.reactant == sub.index]
        drawn_o = [ob for ob in o_changes if ob.reactant == sub.index and sub.mol.GetAtomWithIdx(ob.reactant_atom).GetTotalNumHs() > 0]
        if (
            not drawn_n and not drawn_o and drawn_cand is not None and drawn_cand.atoms
            and sub.mol.GetAtomWithIdx(drawn_cand.atoms[0]).GetAtomicNum() == 8
        ):
            # the atom mapping gave the new C-O bond to the reagent's own oxygen (Boc2O, OSu
            # carbonates); the drawn product is still the O-acyl candidate
            drawn_o = [SimpleNamespace(reactant=sub.index, reactant_atom=drawn_cand.atoms[0])]
        if drawn_o and not drawn_n:
            o = sub.mol.GetAtomWithIdx(drawn_o[0].reactant_atom)
            what = "phenol" if any(x.GetIsAromatic() for x in o.GetNeighbors()) else "alcohol"
            yield r.finding(
                f"{sub.label} is drawn acylated on its {what} oxygen, but its {best.kind.replace('_', ' ')} nitrogen "
                f"(pKa {best.pka:.1f}) is far more nucleophilic: the N-acyl product is expected.",
                atoms=[(sub.index, best.atom_index), (sub.index, drawn_o[0].reactant_atom)],
                fix="Draw the amide (N-acylation); to acylate the oxygen, protect the amine first (Boc) or run under "
                "acidic conditions with the amine protonated.",
            )
            continue
        if drawn_n:
            hit = drawn_n[0]
            drawn_site = next((s for s in sites if s.atom_index == hit.reactant_atom), None)
            if drawn_site is None or drawn_site.atom_index == best.atom_index:
                continue
            if _site_score(sub.mol, drawn_site) < _site_score(sub.mol, best) - 1.0:
                yield r.finding(
                    f"{sub.label} is drawn acylated on its {drawn_site.kind.replace('_', ' ')} nitrogen (pKa "
                    f"{drawn_site.pka:.1f}), but its {best.kind.replace('_', ' ')} nitrogen (pKa {best.pka:.1f}) is "
                    "more nucleophilic and reacts first.",
                    atoms=[(sub.index, best.atom_index), (sub.index, drawn_site.atom_index)],
                    fix="Draw the product acylated on the more nucleophilic nitrogen, or protect it first to acylate "
                    "the other.",
                )
