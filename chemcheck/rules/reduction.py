"""Changes drawn that the reagents listed cannot make: a reduction beyond the reductant, and a
sulfonamide from a sulfonic acid with nothing to activate it."""

from __future__ import annotations

from functools import lru_cache

from rdkit import Chem

from . import Context, rule
from ._support import changed_nitrogens
from .nitrogen import _activator


@lru_cache(maxsize=None)
def _q(smarts: str) -> Chem.Mol:
    patt = Chem.MolFromSmarts(smarts)
    if patt is None:
        raise ValueError(smarts)
    return patt


# --------------------------------------------------------------------------- reductions
# Borohydrides that reduce aldehydes, ketones and iminium ions but, used alone, not a nitro
# group, an amide or a nitrile (House, Modern Synthetic Reactions; Abdel-Magid et al. 1996 for
# NaBH(OAc)3; Lane 1975 for NaBH3CN): NaBH4, LiBH4 aside from esters, NaBH(OAc)3, NaBH3CN.
_MILD_BOROHYDRIDE = "[$([BH4-]),$([BH1-](O)(O)O),$([BH3-]C#N),$([BH2-](C#N)),$([BH3-]O)]"

# Anything that lets a borohydride (or the mixture) reduce more: hydrogen, a transition metal
# (Pd, Pt, Ni or Co boride, Cu, Fe, Zn, Sn, In, Ti, Rh, Ru, Ir), a stronger hydride (LiAlH4,
# DIBAL-H, borane, silanes), hydrazine, dithionite, sulfide, iodine (NaBH4/I2 makes borane),
# a strong Lewis acid (BF3, AlCl3 activate amides). Common practice.
_HELPERS = (
    ("hydrogen", "[#1][#1]"),
    ("a metal", "[Pd,Pt,Ni,Co,Cu,Fe,Zn,Sn,In,Ti,Rh,Ru,Ir,Sm,Mn,Cr,V,Mo,W,Ag,Au,Hg]"),
    ("an aluminium hydride", "[Al]"),
    ("borane", "[BX3;H1,H2,H3;+0,-0]"),
    ("borane", "[BH3;+0]"),
    ("a silane", "[Si;!H0]"),
    ("hydrazine", "[NX3;H2][NX3]"),
    ("dithionite or a sulfide", "[$([SX3](=O)[SX3]=O),$([S-2]),$([SH-]),$([SX2H2]),$([S-][S-])]"),
    ("iodine", "I[I,Cl]"),
    ("a Lewis acid", "[B](F)(F)F"),
    ("samarium or titanium reagent", "[Sm,Ti]"),
    # NaBH4 with a strong acid or TFA makes borane or an acyloxyborohydride that reduces amides
    # and nitriles (N. Umino, T. Iwakuma, N. Itoh, Tetrahedron Lett. 1976, 17, 763)
    ("a strong acid", "[$([Cl,Br,I;H1;X1;+0]),$([SX4](=O)(=O)[OX2H1]),$(C(=O)([OX2H1])C(F)(F)F)]"),
)

_NITRO_N = "[$([NX3+](=O)[O-]),$([NX3](=O)=O)]"


def _helpers(ctx: Context) -> list[str]:
    found = []
    for c in ctx.reaction.reactants + ctx.reaction.agents:
        for what, smarts in _HELPERS:
            if c.mol.HasSubstructMatch(_q(smarts)):
                found.append(what)
    return found


def _reductants(ctx: Context):
    return [
        c for c in ctx.reaction.reactants + ctx.reaction.agents
        if c.mol.HasSubstructMatch(_q(_MILD_BOROHYDRIDE))
    ]


def _unreachable_changes(ctx: Context):
    """(reactant, atom, what) for each nitro group drawn as an amine, amide drawn as an amine
    and nitrile drawn as an amine."""
    from ..changes import atom_correspondence

    rxn = ctx.reaction
    corr = atom_correspondence(rxn)
    for (ri, ra), (pi, pa) in corr.items():
        comp = rxn.components[ri]
        if comp.role != "reactant":
            continue
        ratom = comp.mol.GetAtomWithIdx(ra)
        patom = rxn.components[pi].mol.GetAtomWithIdx(pa)
        if ratom.GetAtomicNum() == 6 and patom.GetAtomicNum() == 6:
            # a nitrile carbon (its N may be left unmapped when the bond order changes) that
            # ends as a CH2 bound to an amine nitrogen
            nitrile_n = [
                b.GetOtherAtom(ratom) for b in ratom.GetBonds()
                if b.GetBondType() == Chem.BondType.TRIPLE and b.GetOtherAtom(ratom).GetAtomicNum() == 7
            ]
            if nitrile_n and not any(b.GetBondType() == Chem.BondType.TRIPLE for b in patom.GetBonds()) and any(
                y.GetAtomicNum() == 7 and not y.GetIsAromatic() and y.GetFormalCharge() == 0
                and not any(b.GetBondType() != Chem.BondType.SINGLE for b in y.GetBonds())
                for y in patom.GetNeighbors()
            ):
                yield comp, nitrile_n[0].GetIdx(), "a nitrile reduced to the amine"
            continue
        if ratom.GetAtomicNum() != 7 or patom.GetAtomicNum() != 7:
            continue
        p_o = sum(1 for x in patom.GetNeighbors() if x.GetAtomicNum() == 8)
        if comp.mol.GetAtomWithIdx(ra).GetFormalCharge() == 1 and any(
            m[0] == ra for m in comp.mol.GetSubstructMatches(_q(_NITRO_N))
        ):
            if p_o == 0 and patom.GetFormalCharge() == 0:
                yield comp, ra, "a nitro group reduced to the amine"
            continue
        if ratom.GetDegree() == 1 and any(b.GetBondType() == Chem.BondType.TRIPLE for b in ratom.GetBonds()):
            continue  # a nitrile: read from its carbon above
        # an amide N whose carbonyl carbon ends as a CH2 (amide to amine)
        for x in ratom.GetNeighbors():
            if x.GetAtomicNum() != 6 or not any(
                b.GetBondType() == Chem.BondType.DOUBLE and b.GetOtherAtom(x).GetAtomicNum() == 8 for b in x.GetBonds()
            ):
                continue
            if any(y.GetAtomicNum() in (7, 8) and y.GetIdx() != ra and not any(
                b.GetBondType() == Chem.BondType.DOUBLE for b in y.GetBonds()
            ) for y in x.GetNeighbors()):
                continue  # a carbamate or urea: a different reduction
            target = corr.get((ri, x.GetIdx()))
            if target is None or target[0] != pi:
                continue
            px = rxn.components[pi].mol.GetAtomWithIdx(target[1])
            still_bonded = rxn.components[pi].mol.GetBondBetweenAtoms(target[1], pa) is not None
            if px.GetAtomicNum() == 6 and still_bonded and not any(y.GetAtomicNum() == 8 for y in px.GetNeighbors()):
                yield comp, ra, "an amide reduced to the amine"
                break


@rule(id="reduction-beyond-reductant", title="A reduction drawn that the reductant cannot make", severity="error")
def reduction_beyond_reductant(ctx: Context):
    """A nitro group, amide or nitrile drawn reduced to an amine with only a mild borohydride.

    What it flags
        A product in which a nitro group, an amide or a nitrile of a reactant has become an
        amine, while the only reductant listed is NaBH4, LiBH4, NaBH(OAc)3 or NaBH3CN, with no
        hydrogen, no transition metal (Pd, Pt, Ni or Co salts that make a boride, Fe, Zn, Sn),
        no stronger hydride (LiAlH4, borane, a silane), no hydrazine, dithionite, iodine, BF3
        or strong acid (NaBH4 with TFA or H2SO4 makes borane or an acyloxyborohydride) to make
        the mixture stronger.

    Why it matters
        These borohydrides reduce aldehydes, ketones, imines and iminium ions; NaBH(OAc)3 and
        NaBH3CN are chosen for reductive amination precisely because they leave almost
        everything else alone. A nitroarene, an amide or a nitrile comes through unchanged: the
        product drawn is not formed. A nitrobenzene drawn as an N-benzylaniline with
        NaBH(OAc)3 and benzaldehyde needs the aniline first.

    Example
        ``O=[N+]([O-])c1ccccc1.O=Cc1ccccc1>CC(=O)O[BH-](OC(C)=O)OC(C)=O.[Na+]>c1ccc(CNc2ccccc2)cc1``.

    Use instead
        Reduce the nitro group first (H2 with Pd/C; Fe or Zn with NH4Cl or AcOH; SnCl2; or
        NaBH4 with NiCl2 or CoCl2), then run the reductive amination. Reduce an amide with
        LiAlH4 or borane (BH3·THF, BH3·SMe2), a nitrile with LiAlH4, borane, H2 with Raney
        nickel, or NaBH4 with CoCl2.

    References
        A. F. Abdel-Magid, K. G. Carson, B. D. Harris, C. A. Maryanoff, R. D. Shah, *J. Org.
        Chem.* 1996, 61, 3849 (NaBH(OAc)3: scope and the groups it leaves alone). R. F. Borch,
        M. D. Bernstein, H. D. Durst, *J. Am. Chem. Soc.* 1971, 93, 2897 (NaBH3CN). J. Seyden-
        Penne, *Reductions by the Alumino- and Borohydrides in Organic Synthesis*, 2nd ed.,
        Wiley 1997. H. O. House, *Modern Synthetic Reactions*, 2nd ed., 1972, ch. 2.
    """
    r = reduction_beyond_reductant.rule
    rxn = ctx.reaction
    if not rxn.products:
        return
    reductants = _reductants(ctx)
    if not reductants or _helpers(ctx):
        return
    names = ", ".join(dict.fromkeys(c.label for c in reductants))
    said = set()
    for comp, atom, what in _unreachable_changes(ctx):
        if what in said:
            continue
        said.add(what)
        yield r.finding(
            f"{comp.label} is drawn with {what}, but the only reductant here is {names}: it reduces aldehydes, "
            "ketones and imines, not this group, which comes through unchanged.",
            atoms=[(comp.index, atom)],
            fix={
                "a nitro group reduced to the amine": "Reduce the nitro group first (H2 with Pd/C; Fe or Zn with "
                "NH4Cl or AcOH; SnCl2; or NaBH4 with NiCl2), then run the reductive amination on the aniline.",
                "an amide reduced to the amine": "Use LiAlH4 or borane (BH3·THF, BH3·SMe2) for the amide.",
                "a nitrile reduced to the amine": "Use LiAlH4, borane, H2 with Raney nickel, or NaBH4 with CoCl2 for "
                "the nitrile.",
            }[what],
        )


# --------------------------------------------------------------------------- sulfonamides
_SULFONIC = "[SX4](=[OX1])(=[OX1])([#6])[OX2H1,OX1-]"
# what turns a sulfonic acid or its salt into a sulfonylating agent: the sulfonyl chloride
# formers (SOCl2, POCl3, PCl5, oxalyl chloride, cyanuric chloride, chlorosulfonic acid), PPh3
# with a halogen source, triphosgene; common practice (see the rule's references)
_SULFONYL_ACTIVATORS = (
    "[S,P;!$([S,P]-[#6])]([Cl,Br])",  # SOCl2, POCl3, PCl5, ClSO3H
    "[CX3](=[OX1])([Cl,Br])",  # oxalyl chloride, phosgene, an acid chloride
    "c1(Cl)nc(Cl)nc(Cl)n1",  # cyanuric chloride
    "[PX3](c)(c)c",  # PPh3 (with CCl4, NCS or Br2)
    "[CX4](Cl)(Cl)(Cl)O",  # triphosgene, diphosgene
    "[SX4](=O)(=O)(F)",  # a sulfonyl fluoride already (SuFEx) or SO2F2
    "[Cl,Br]-[#7]",  # NCS, NBS with PPh3
)


@rule(id="sulfonamide-from-unactivated-acid", title="Sulfonamide drawn from a sulfonic acid with nothing to activate it", severity="error")
def sulfonamide_from_unactivated_acid(ctx: Context):
    """A sulfonic acid (or its salt) and an amine drawn going to the sulfonamide with no
    activation.

    What it flags
        A reaction in which an amine's nitrogen is drawn as a sulfonamide and the sulfonyl group
        comes from a sulfonic acid or sulfonate salt, while no reactant or agent can turn it into
        a sulfonylating agent: no SOCl2, POCl3, PCl5, chlorosulfonic acid, oxalyl chloride,
        cyanuric chloride, triphosgene, PPh3 with a halogen source, or coupling agent. The
        sulfonyl analogue of ``amide-from-unactivated-acid``.

    Why it matters
        A sulfonic acid (pKa about −2) protonates the amine completely: the ammonium sulfonate
        salt forms and stays. A sulfonate is an even poorer electrophile than a carboxylate, and
        unlike an ammonium carboxylate the salt does not lose water to the sulfonamide on
        heating. Sulfonamides are made from sulfonyl chlorides (or fluorides).

    Example
        ``Cc1ccc(S(=O)(=O)O)cc1.NCc1ccccc1>>Cc1ccc(S(=O)(=O)NCc1ccccc1)cc1``: benzylammonium
        tosylate, not the sulfonamide.

    Use instead
        Make the sulfonyl chloride first (SOCl2 with a drop of DMF, PCl5 or POCl3; cyanuric
        chloride for the sodium salt), then add the amine with a base (Et3N, pyridine); or use
        the sulfonyl chloride or fluoride directly.

    References
        March's *Advanced Organic Chemistry*, 7th ed., Wiley 2013, 16-99 and 16-100 (sulfonyl
        halides from sulfonic acids; sulfonamides from sulfonyl halides). L. De Luca, G.
        Giacomelli, *J. Org. Chem.* 2008, 73, 3967 (sulfonamides from sulfonic acids through
        cyanuric chloride activation).
    """
    r = sulfonamide_from_unactivated_acid.rule
    rxn = ctx.reaction
    if not rxn.products:
        return
    acids = [c for c in rxn.reactants if c.mol.HasSubstructMatch(_q(_SULFONIC))]
    if not acids:
        return
    pool = rxn.reactants + rxn.agents
    if any(c.mol.HasSubstructMatch(_q(s)) for c in pool if c not in acids for s in _SULFONYL_ACTIVATORS):
        return
    if any(_activator(ctx, c) == "coupling agent" for c in pool if c not in acids):
        return
    from ..changes import atom_correspondence

    back = {v: k for k, v in atom_correspondence(rxn).items()}
    for nb in changed_nitrogens(ctx):
        if nb.kind_after != "sulfonamide" or nb.kind_before == "sulfonamide":
            continue
        amine = rxn.components[nb.reactant]
        if amine in acids:
            continue  # a sultam from an aminosulfonic acid: a different question
        product = rxn.components[nb.product]
        n = product.mol.GetAtomWithIdx(nb.product_atom)
        for x in n.GetNeighbors():
            if x.GetAtomicNum() != 16:
                continue
            origin = back.get((product.index, x.GetIdx()))
            acid = next((c for c in acids if origin is not None and c.index == origin[0]), None)
            if acid is None:
                continue
            yield r.finding(
                f"{amine.label} is drawn sulfonylated by the sulfonic acid {acid.label}, but nothing here activates "
                "it: the sulfonic acid (pKa about −2) protonates the amine, and the ammonium sulfonate salt does not "
                "give the sulfonamide, even on heating.",
                atoms=[(amine.index, nb.reactant_atom), (acid.index, origin[1])],
                fix="Make the sulfonyl chloride first (SOCl2 with a drop of DMF, PCl5, POCl3, or cyanuric chloride "
                "for the sodium salt), then add the amine with Et3N or pyridine; or start from the sulfonyl chloride.",
            )
            return
