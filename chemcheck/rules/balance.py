"""Rules on the drawn equation as a whole."""

from __future__ import annotations

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


def _among_agents(ctx: Context, missing) -> bool:
    """A reagent the balance needs on the left that the agents supply: the same formula, or
    for H2 any reductant among them (H2 over Pd, NaBH4, LiAlH4)."""
    for comp in ctx.reaction.agents:
        if comp.formula == missing.formula:
            return True
        if missing.formula == "H2" and ctx.perception(comp).has(*_REDUCTANT_GROUPS):
            return True
    return False


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
        reagent the agents supply (H2 over Pd, or a borohydride for H2) is not asked for, and an
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
