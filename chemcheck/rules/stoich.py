"""Rules on the amounts: consistency of stated equivalents, missing densities."""

from __future__ import annotations

from . import Context, rule


@rule(id="amount-mismatch", title="Amount and stated equivalents disagree", severity="warning")
def amount_mismatch(ctx: Context):
    """Compare an amount with the equivalents written beside it.

    What it flags
        A component given as an amount with stated equivalents ("1.07 g, 1.2 equiv") whose
        moles, divided by the reference's, differ from the stated equivalents by more than 5 %.

    Why it matters
        The two numbers were written from two calculations and one of them is wrong: most often
        a salt weighed with the free base's molar mass, a density forgotten or wrong, a purity
        left out, or equivalents counted against a different reference. A reaction run with
        0.8 equiv of a reagent the plan says is 1.2 equiv does not behave as planned.

    Example
        Benzylamine hydrochloride weighed as 1.07 g "1.0 equiv" against 10 mmol of the acid
        chloride: 1.07 g is 7.45 mmol of the salt (M 143.6), not 10 mmol.

    Use instead
        Recompute the amount from the molar mass of what is actually weighed (the salt, the
        solution), its density and purity; or correct the stated equivalents.

    References
        Common practice of stoichiometry tables in laboratory notebooks; IUPAC Gold Book,
        "amount of substance".
    """
    st = ctx.stoichiometry
    if st is None:
        return
    r = amount_mismatch.rule
    ref = st.reference.component.label if st.reference else "the reference"
    for row, actual, cause in st.mismatches:
        a = row.amount
        yield r.finding(
            f"{row.component.label}: {a.text} is {row.mmol:.3g} mmol = {actual:.2f} equiv against "
            f"{ref}, not the {a.stated_equiv:g} equiv stated ({100 * (actual / a.stated_equiv - 1):+.0f} %).",
            fix=f"Likely cause: {cause}. For {a.stated_equiv:g} equiv use "
            f"{a.stated_equiv * st.reference.mmol:.3g} mmol ({a.stated_equiv * st.reference.mmol * row.component.mw / 1000:.3g} g of {row.component.formula})."
            if st.reference and st.reference.mmol
            else f"Likely cause: {cause}.",
        )


@rule(id="density-unknown", title="A volume is given but no density is known", severity="warning")
def density_unknown(ctx: Context):
    """Ask for the density when a volume cannot be turned into moles.

    What it flags
        A neat liquid given by volume whose density is neither written with the amount nor
        found in the property database, or a wt% solution given by volume without the
        solution's density.

    Why it matters
        Without the density the moles, the equivalents and everything computed from them
        (limiting reagent, yield, scale-up) are missing for that component.

    Example
        ``"2.0 mL"`` of a liquid the database does not know.

    Use instead
        Write the density with the volume (``"2.0 mL, 1.05 g/mL"``, from the bottle or the
        SDS), or weigh the liquid.

    References
        Common practice; densities at 25 °C from the `chemicals`/`thermo` databases
        (C. Bell et al., Caleb Bell and contributors).
    """
    st = ctx.stoichiometry
    if st is None:
        return
    r = density_unknown.rule
    for row in st.density_missing:
        what = "the solution's density" if row.amount and row.amount.mass_fraction else "its density"
        yield r.finding(
            f"{row.component.label}: {row.amount.text} is a volume, and {what} is not known, so its "
            "moles and equivalents are not computed.",
            fix=f"Add {what} to the amount, e.g. '{row.amount.text}, 1.00 g/mL' (from the label or the SDS), or give a mass.",
        )
