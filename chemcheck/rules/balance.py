"""Rules on the drawn equation as a whole."""

from __future__ import annotations

from rdkit import Chem

from ..balance import Missing
from . import Context, rule


def _name(m: Missing) -> str:
    # a reduction drawn without its reductant: H2, or the hydride of a borohydride or a metal
    return "H2 (or its equivalent from a reductant)" if m.name == "H2" and m.side == "reactant" else m.name


def _names(items: list[Missing]) -> str:
    parts = [f"{m.count} {_name(m)}" if m.count > 1 else _name(m) for m in items]
    return parts[0] if len(parts) == 1 else ", ".join(parts[:-1]) + " and " + parts[-1]


def _verb(items: list[Missing]) -> str:
    return "is" if len(items) == 1 and items[0].count == 1 else "are"


_REDUCTANT_GROUPS = ("dihydrogen", "boron_hydride", "aluminium_hydride")
_AL_B = Chem.MolFromSmarts("[Al,B]")


def _among_agents(ctx: Context, missing) -> bool:
    """A reagent the balance needs on the left that the agents supply: the same formula, or
    for H2 any reductant among them (H2 over Pd, NaBH4, LiAlH4)."""
    for comp in ctx.reaction.agents:
        if comp.formula == missing.formula:
            return True
        if missing.formula == "H2" and ctx.perception(comp).has(*_REDUCTANT_GROUPS):
            return True
        if missing.formula == "H2" and ctx.perception(comp).has("hydride_ion") and comp.mol.HasSubstructMatch(_AL_B):
            return True  # LiAlH4 or NaBH4 written as separate ions
    return False


# Oxidants that take up the hydrogen an oxidation removes (their reduced forms are not drawn in
# a scheme): peroxides, peracids, Oxone and O2; hypervalent iodine (Dess-Martin periodinane,
# IBX, periodate); metal-oxo oxidants (permanganate, chromium(VI), MnO2, TPAP, OsO4, SeO2);
# amine N-oxides (NMO); hypochlorite and chlorite; nitroxyl radicals (TEMPO); quinones (DDQ,
# chloranil); cerium(IV). Common practice (M. B. Smith, March's Advanced Organic Chemistry,
# 8th ed., Wiley 2020, ch. 19).
_OXIDANTS = tuple(
    Chem.MolFromSmarts(s)
    for s in (
        "[#8]~[#8]",
        "[#53;X2,X3,X4,X5,X6]",
        "[Mn,Cr,Os,Ru,Se,Re,V]~[OX1,OX1-]",
        "[NX4+][OX1-]",
        "[Cl,Br;X1,X2,X3]~[OX1-,OX2H1,OX1]",
        "[OX1;H0;+0;v1]-[NX3]",
        "O=C1C=CC(=O)C=C1",
        "[Ce]",
    )
)
# dimethyl sulfoxide with an activator (Swern, Parikh-Doering, Pfitzner-Moffatt, Albright-
# Goldman): oxalyl chloride, TFAA, SO3-pyridine, a carbodiimide, acetic anhydride
_DMSO = Chem.MolFromSmarts("[CH3][SX3](=O)[CH3]")
_DMSO_ACTIVATORS = tuple(
    Chem.MolFromSmarts(s)
    for s in (
        "O=C(Cl)C(=O)Cl", "O=C(OC(=O)C(F)(F)F)C(F)(F)F", "[SX4](=O)(=O)[n+,N+]", "O=S(=O)=O",
        "N=C=N", "[CH3]C(=O)OC(=O)[CH3]",
    )
)


def _oxidant_present(ctx: Context) -> bool:
    comps = ctx.reaction.reactants + ctx.reaction.agents
    if any(c.mol.HasSubstructMatch(q) for c in comps for q in _OXIDANTS):
        return True
    return any(c.mol.HasSubstructMatch(_DMSO) for c in comps) and any(
        c.mol.HasSubstructMatch(q) for c in comps for q in _DMSO_ACTIVATORS
    )


# what leaves as inorganic salts at the work-up: the metal of an organometallic reagent, the
# boron of a boronic acid (as borate), halides; water and protons of the quench make up H and O
_INORGANIC = frozenset({"Li", "Na", "K", "Cs", "Mg", "Zn", "Cu", "Al", "B", "Sn", "F", "Cl", "Br", "I"})
_LEAVING_METALS = frozenset({"Li", "Na", "K", "Cs", "Mg", "Zn", "Cu", "Al", "B", "Sn"})
_PINACOL_BORONATE = Chem.MolFromSmarts("B1OC(C)(C)C(C)(C)O1")


def _left_at_workup(ctx: Context, residual: dict[str, int]) -> bool:
    """The organic part balances and what is left over is a metal or boron and its halide (with
    water or protons): a Grignard or organolithium addition quenched with water, a boronic acid
    or pinacol boronate coupled (the pinacol leaves with the boron)."""
    rest = {e: n for e, n in residual.items() if n}
    pinacols = sum(len(c.mol.GetSubstructMatches(_PINACOL_BORONATE)) for c in ctx.reaction.reactants)
    if pinacols and rest.get("B", 0) > 0 and rest.get("C", 0) > 0:
        k = rest["C"] // 6
        if rest["C"] % 6 or k > min(pinacols, rest["B"]):
            return False
        for e, n in (("C", 6), ("H", 14), ("O", 2)):
            rest[e] = rest.get(e, 0) - k * n
        rest = {e: n for e, n in rest.items() if n}
    leaving = {e: n for e, n in rest.items() if e not in ("H", "O")}
    return (
        bool(leaving)
        and set(leaving) <= _INORGANIC
        and all(n > 0 for n in leaving.values())
        and bool(set(leaving) & _LEAVING_METALS)
    )


@rule(id="unbalanced-equation", title="Equation does not balance as drawn", severity="info")
def unbalanced_equation(ctx: Context):
    """Compare the elements and charge of the reactants with those of the products.

    What it flags
        A drawn equation whose elements or charge differ between the two sides. When one or
        two common small molecules close the gap (HCl from an acylation, water from a
        condensation, CO2 and tert-butanol from a Boc protection, H2 in and water out of a
        reductive amination, toluene (and CO2 from a Cbz group) from a benzyl group removed
        over a hydrogenation catalyst, the salt of a base written among the reactants), it
        names them;
        otherwise it gives the element difference. An organic by-product is named only when
        a reactant holds it (methanol from a methyl ester, not from nowhere), so a product
        drawn a carbon short shows as a difference rather than as a made-up by-product. A
        reagent the agents supply (H2 over Pd, or a borohydride for H2; an oxidant for the
        hydrogen an oxidation removes) is not asked for, nor are the inorganic salts left at
        the work-up (the magnesium or lithium of an organometallic addition, the boron of a
        boronic acid or pinacol boronate with the halide of a coupling), and an
        agent that is the same molecule as a product (the TFA of a salt written beside the
        product, HCl that ends as the hydrochloride) enters the equation as its source.

    Why it matters
        The by-product that is not drawn is often the one that matters: the HCl of an
        acylation protonates the amine, the water of an imine condensation reverses it.
        Balancing also gives the stoichiometric coefficients that the limiting reagent and the
        atom economy are computed from.

    Example
        ``CCN.CC(=O)Cl>>CCNC(C)=O``: HCl is not drawn.

    Use instead
        Draw the by-product, or leave it out knowingly: this is an info note, not an error.
        An unexplained difference usually means a wrong product or a missing reagent.

    References
        IUPAC Gold Book, "stoichiometric number" (common practice of balancing equations).
    """
    b = ctx.balance
    if not b.checked or b.drawn_balanced:
        return
    r = unbalanced_equation.rule
    products = ctx.reaction.products
    reactants = ctx.reaction.reactants
    if b.balanced:
        left = [m for m in b.missing if m.side == "product"]
        needed = [m for m in b.missing if m.side == "reactant" and not _among_agents(ctx, m)]
        if not left and not needed and all(k == 1 for k in b.coefficients.values()):
            return  # what the reactants lack is written among the agents (H2 over Pd, water)
        coeff = {i: k for i, k in b.coefficients.items() if k != 1}
        parts, fixes = [], []
        if left:
            parts.append(f"{_names(left)} {_verb(left)} not drawn among the products")
            fixes.append(f"add {_names(left)} to the products")
        if needed:
            parts.append(f"{_names(needed)} {_verb(needed)} needed on the reactant side")
            fixes.append(f"add {_names(needed)} to the reactants")
        if coeff:
            comps = ctx.reaction.components
            text = ", ".join(f"{k} × {comps[i].label}" for i, k in sorted(coeff.items()))
            parts.append(f"it balances with the coefficients {text}")
            fixes.append(f"use the coefficients {text}")
        message = "; ".join(parts)
        message = message[0].upper() + message[1:] + "."
        fix = "To balance the equation, " + " and ".join(fixes) + "."
        yield r.finding(message, fix=fix)
        return
    hydrogen_only = {e: n for e, n in b.residual.items() if n} == {"H": b.residual.get("H", 0)}
    if hydrogen_only and b.residual["H"] > 0 and b.residual["H"] % 2 == 0 and not b.charge_difference:
        if _oxidant_present(ctx):
            return  # an oxidation: the oxidant among the agents takes up the hydrogen
    if _left_at_workup(ctx, b.residual):
        return  # the metal or boron and its halide leave as salts at the work-up
    diff = ", ".join(f"{el} {'+' if n > 0 else ''}{n}" for el, n in b.residual.items())
    message = (
        f"The equation does not balance: reactants minus products is {diff or 'none'}"
        + (f", charge {b.charge_difference:+d}" if b.charge_difference else "")
        + "."
    )
    yield r.finding(
        message,
        fix="Check the product drawn and whether a reagent is missing from the reactants"
        + (f" ({len(reactants)} drawn)." if reactants else "."),
    )
