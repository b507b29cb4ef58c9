"""Rules on the amounts: consistency of stated equivalents, missing or estimated densities,
water brought in by a hydrate."""

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


@rule(id="density-estimated", title="A volume is converted with an estimated density", severity="info")
def density_estimated(ctx: Context):
    """Say when a liquid measured by volume is converted with an estimated density.

    What it flags
        A neat liquid given by volume whose density is neither written with the amount nor
        held as a measured or experimentally fitted value (the curated table, or a fitted
        correlation in the property database), so it is estimated from critical constants.

    Why it matters
        Corresponding-states estimates are off by several per cent for polar, halogenated and
        heavy-atom liquids (methyl iodide comes out about 10 % light): the moles and the
        equivalents inherit that error.

    Example
        ``"1.0 mL"`` of a liquid reagent the property sources know only from its critical
        constants.

    Use instead
        Weigh the liquid, or write its density with the volume (``"1.0 mL, 1.12 g/mL"``, from
        the label or the SDS).

    References
        G. H. Thomson, K. R. Brobst, R. W. Hankinson, AIChE J. 1982, 28, 671 (COSTALD); CRC
        Handbook of Chemistry and Physics; common practice.
    """
    st = ctx.stoichiometry
    if st is None:
        return
    r = density_estimated.rule
    for row in st.density_estimated:
        v = row.density_value
        pm = f"±{100 * v.uncertainty:.0f} %" if v is not None else "a few per cent"
        yield r.finding(
            f"{row.component.label}: {row.amount.text} is converted with an estimated density of "
            f"{row.density:.3g} g/mL ({pm}), so its {row.mmol:.3g} mmol carry that uncertainty.",
            fix=f"Weigh it, or give the density with the volume, e.g. '{row.amount.text}, {row.density:.3g} g/mL' "
            "with the value from the label or the SDS.",
        )


@rule(id="hydrate-water-meets-moisture-sensitive-reagent", title="A hydrate brings water to a moisture-sensitive reagent", severity="warning")
def hydrate_water(ctx: Context):
    """Count the water of hydration against the reagents that water destroys.

    What it flags
        A component weighed as a hydrate (fragments of water written beside it, e.g.
        ``C1CNCCN1.O.O.O.O.O.O``) in a reaction with a moisture-sensitive reagent (acid
        chloride, chloroformate, anhydride, sulfonyl chloride, isocyanate, hydride, organometallic
        base and the like), when the water is at least 0.1 equivalent of that reagent.

    Why it matters
        Each mole of water of hydration hydrolyses or quenches about a mole of the reagent: six
        waters on piperazine hexahydrate consume six equivalents of an acid chloride before any
        amide forms, and the hydrolysis releases acid and heat.

    Example
        Piperazine hexahydrate (1.94 g, 10 mmol, with 60 mmol of water) and 22 mmol of acetyl
        chloride.

    Use instead
        Use the anhydrous material (or dry the hydrate), or choose conditions that tolerate water
        (Schotten-Baumann acylation in a two-phase mixture with excess reagent).

    References
        W. L. F. Armarego, *Purification of Laboratory Chemicals*, 8th ed., Butterworth-Heinemann,
        2017 (drying of reagents); common practice.
    """
    from ..stoichiometry import MOISTURE_SENSITIVE

    st = ctx.stoichiometry
    if st is None:
        return
    r = hydrate_water.rule
    sensitive = []
    for row in st.rows:
        if row.component.role == "product" or row.water_mmol:
            continue
        names = ctx.perception(row.component).group_names & MOISTURE_SENSITIVE
        if names:
            sensitive.append((row, sorted(names)))
    if not sensitive:
        return
    for row in st.rows:
        if not row.water_mmol:
            continue
        for other, names in sensitive:
            ratio = row.water_mmol / other.mmol if other.mmol else None
            if ratio is not None and ratio < 0.1:
                continue
            what = " and ".join(n.replace("_", " ") for n in names)
            against = f" ({ratio:.2g} equiv against it)" if ratio else ""
            yield r.finding(
                f"{row.component.label} is a hydrate: it brings {row.water_mmol:.3g} mmol of water{against} to "
                f"{other.component.label}, a moisture-sensitive {what}.",
                fix="Use the anhydrous material or dry it before use, or count the water as a reagent and add "
                "that much more of the moisture-sensitive one. Hydrolysis releases acid and heat: follow the SDS.",
            )
