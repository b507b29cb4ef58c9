"""The stoichiometry table: moles, equivalents, limiting reagent, concentration, yield, metrics.

From the amounts as weighed and measured. Conventions (common practice):

* a component is a formula unit: a salt's molar mass includes every fragment, its moles are
  of the salt;
* the limiting reagent is the reactant with the fewest moles per stoichiometric coefficient
  (coefficients from the balanced equation when it balances, else 1), and the reference for
  equivalents, unless a component is stated as 1.0 equiv with its moles known (its amount, or
  another component's amount and stated equivalents): that one is the reference. A bare
  "1.0 equiv" with nothing to fix its moles is as much as the limiting reactant;
* equivalents are moles relative to the reference;
* concentration is the limiting reagent's moles over the total liquid volume;
* theoretical yield from the limiting reagent and the coefficients; percentage yield from an
  isolated product mass;
* atom economy (Trost) = M(product) x coefficient / sum of M(reactant) x coefficient;
  PMI = total mass in / product mass; E-factor (Sheldon) = (mass in - product mass) / product mass.
"""

from __future__ import annotations

from dataclasses import dataclass, field

from rdkit import Chem

from .amounts import Amount, parse_amount, validate_amounts
from .errors import AmountError
from .reading.reaction import Component, Reaction
from .units import fmt_mass, fmt_moles, fmt_volume

__all__ = ["Row", "Stoichiometry", "compute", "COLUMNS"]

COLUMNS = ["role", "formula", "mw", "mass_g", "volume_ml", "density_g_ml", "purity", "mmol", "equiv", "theoretical_g", "yield_pct"]


@dataclass
class Row:
    component: Component
    amount: Amount | None
    mmol: float | None = None
    mass_g: float | None = None  # mass of the component itself (pure)
    weighed_g: float | None = None  # what goes on the balance (solution or impure solid)
    volume_ml: float | None = None
    density: float | None = None
    density_source: str | None = None
    density_value: object = None  # the properties.Value the density came from, when looked up
    water_mmol: float | None = None  # water of hydration charged with a hydrate
    purity: float | None = None
    equiv: float | None = None
    theoretical_g: float | None = None
    yield_pct: float | None = None
    read_as: str | None = None
    notes: list[str] = field(default_factory=list)

    def values(self) -> dict:
        c = self.component
        return {
            "role": c.role,
            "formula": c.formula,
            "mw": _r(c.mw) if _mw_known(c) else None,
            "mass_g": _r(self.mass_g),
            "volume_ml": _r(self.volume_ml),
            "density_g_ml": _r(self.density),
            "purity": _r(self.purity),
            "mmol": _r(self.mmol),
            "equiv": _r(self.equiv),
            "theoretical_g": _r(self.theoretical_g),
            "yield_pct": _r(self.yield_pct),
        }


def _r(x):
    if x is None or x != x or x in (float("inf"), float("-inf")):
        return None  # never NaN or infinity in the payload
    return float(f"{x:.6g}")


@dataclass
class Stoichiometry:
    rows: list[Row]
    reference: Row | None
    limiting: Row | None
    coefficients: dict[int, int]
    concentration_m: float | None
    total_volume_ml: float | None
    atom_economy_pct: float | None
    pmi: float | None
    e_factor: float | None
    density_missing: list[Row] = field(default_factory=list)
    density_estimated: list[Row] = field(default_factory=list)
    mismatches: list[tuple[Row, float, str]] = field(default_factory=list)
    assumed: bool = False

    def row_for(self, index: int) -> Row | None:
        return next((r for r in self.rows if r.component.index == index), None)

    def to_dict(self) -> dict:
        return {
            "columns": [c for c in COLUMNS if c != "role"],
            "rows": [
                {
                    "component": r.component.index,
                    "text": r.component.text,
                    "values": {k: v for k, v in r.values().items() if k != "role"},
                    "read_as": r.read_as,
                }
                for r in self.rows
            ],
            "reference": self.reference.component.text if self.reference else None,
            "limiting": self.limiting.component.text if self.limiting else None,
            "concentration_m": _r(self.concentration_m),
            "total_volume_ml": _r(self.total_volume_ml),
        }

    def dataframe(self):
        import pandas as pd

        data = {r.component.text: {**r.values(), "read_as": r.read_as} for r in self.rows}
        df = pd.DataFrame.from_dict(data, orient="index")
        df.index.name = "component"
        return df


def match_amounts(reaction: Reaction, amounts: dict[str, str]) -> dict[int, str]:
    """Component index for each amounts key (the component's text as written)."""
    validate_amounts(amounts)
    out: dict[int, str] = {}
    first_key: dict[int, str] = {}
    for key, value in amounts.items():
        comp = reaction.find(key.strip())
        if comp is None:
            known = ", ".join(f"'{c.text}'" for c in reaction.components)
            raise AmountError(f"no component is written '{key}' in the reaction (components: {known})", key=key, text=str(value))
        if comp.index in out:
            raise AmountError(
                f"the component has two amounts: '{first_key[comp.index]}' = '{out[comp.index]}' and "
                f"'{key}' = '{value}'; keep one",
                key=key, text=str(value),
            )
        out[comp.index] = value
        first_key[comp.index] = key
    return out


_DUMMY = Chem.MolFromSmarts("[#0]")


def _mw_known(comp: Component) -> bool:
    """The molar mass means something: finite, positive, and no dummy atom (``*``) in it."""
    mw = comp.mw
    if not (mw == mw and 0 < mw < 1e7):
        return False
    return not comp.mol.HasSubstructMatch(_DUMMY)  # one search in C++, not a walk over atoms


def _props(comp: Component):
    """Properties of a component: the curated table first (no database load), then the
    database."""
    from .properties import properties_for_inchikey

    if not comp.inchikey:
        return None
    mw = comp.mw if _mw_known(comp) else None
    p = properties_for_inchikey(comp.inchikey, mw, database=False)
    # density and phase only: the heat-capacity tables stay unloaded
    return p if p is not None else properties_for_inchikey(comp.inchikey, mw, cp=False)


def _density(comp: Component, amount: Amount) -> tuple[float | None, str | None, object]:
    if amount.density is not None:
        return amount.density, "as given", None
    p = _props(comp)
    d = p.density_25 if p is not None else None
    if d is None or (not p.curated and p.phase not in ("l", None)):
        return None, None, None
    if d.measured:
        short = "curated table" if p.curated else d.method
        return d.value, f"{short}, 25 °C", d
    return d.value, f"estimated, ±{100 * d.uncertainty:.0f} %", d


def _is_solid(comp: Component) -> tuple[bool, float | None]:
    p = _props(comp)
    if p is not None and not p.curated and p.phase == "s":
        return True, p.melting_point.value if p.melting_point else None
    if len(comp.fragments) > 1 and comp.charge == 0 and any(a.GetFormalCharge() for a in comp.mol.GetAtoms()):
        return True, None  # a salt drawn as ions
    return False, None


# Groups that react with water (hydrolysis, or quenching): a hydrate's water consumes them.
MOISTURE_SENSITIVE = {
    "acid_halide", "chloroformate", "carbamoyl_chloride", "carbonyl_dihalide", "anhydride", "dicarbonate",
    "sulfonic_anhydride", "sulfonyl_halide", "inorganic_acid_chloride", "isocyanate", "carbodiimide",
    "hydride_ion", "metal_amide", "organometallic_base", "aluminium_hydride", "chlorosulfonic_acid",
    "sulfuryl_chloride",
}


def hydrate_finding(base: str, hydrate: str, comp: Component):
    """The note for an amount keyed by a hydrate of a component drawn anhydrous."""
    from .findings import Finding

    n = water_of_hydration(comp)
    return Finding(
        rule="weighed-as-hydrate",
        severity="info",
        title="Amount given for the hydrate of a component",
        message=f"The amount is given for {hydrate}, the hydrate of {base} as drawn in the reaction ({n} H2O): "
        f"the check reads the component as the hydrate ({comp.formula}, {comp.mw:.2f} g/mol), so the mass weighed "
        "converts to moles of the hydrate, and its water is counted beside it.",
        atoms=(),
        fix=f"Draw {hydrate} in the reaction, or give the amount of anhydrous {base}.",
    )


def _volume_to_measure(row: Row) -> None:
    """A neat liquid of the curated table given in mmol or equiv: the volume to measure, in the
    "read as" text (the curated table only, so that this never loads the property database)."""
    from .properties import properties_for_inchikey

    a = row.amount
    if a is None or a.kind not in ("moles", "equiv") or row.mass_g is None or row.component.role == "product":
        return
    p = properties_for_inchikey(row.component.inchikey, database=False) if row.component.inchikey else None
    if p is None or p.density_25 is None or p.phase == "s":
        return
    v = row.mass_g / p.density_25.value
    row.read_as = (row.read_as or "") + f" = {fmt_volume(v)} at {p.density_25.value:.4g} g/mL (curated table, 25 °C)"


def water_of_hydration(comp: Component) -> int:
    """How many water fragments a component carries beside its other fragments (a hydrate
    written ``C1CNCCN1.O.O.O.O.O.O``); 0 for anything else, and for water itself."""
    from rdkit import Chem

    if len(comp.fragments) < 2:
        return 0
    frags = Chem.GetMolFrags(comp.mol, asMols=True, sanitizeFrags=False)
    n = sum(1 for f in frags if f.GetNumAtoms() == 1 and f.GetAtomWithIdx(0).GetAtomicNum() == 8
            and f.GetAtomWithIdx(0).GetTotalNumHs() == 2 and f.GetAtomWithIdx(0).GetFormalCharge() == 0)
    return n if n < len(frags) else 0


def _read(row: Row) -> None:
    """Moles and masses of one component from its amount (not equivalents)."""
    a = row.amount
    c = row.component
    known = _mw_known(c)
    mw = c.mw if known else None
    if not known and a.kind in ("mass", "volume") and a.molarity is None:
        raise AmountError(
            f"{c.label} has no molar mass (it contains a dummy atom '*' or is not a complete structure): "
            "a mass or volume cannot be turned into moles; give the amount in mmol or equiv",
            key=c.text, text=a.text,
        )
    purity = a.purity if a.purity is not None else 1.0
    row.purity = a.purity
    if a.kind == "moles":
        row.mmol = a.value
        row.mass_g = a.value * mw / 1000 if known else None
        row.read_as = fmt_moles(a.value) + (f" = {fmt_mass(row.mass_g)}" if row.mass_g is not None else "")
    elif a.kind == "mass":
        frac = a.mass_fraction if a.mass_fraction is not None else 1.0
        row.weighed_g = a.value
        row.mass_g = a.value * frac * purity
        row.mmol = row.mass_g / mw * 1000
        if a.mass_fraction is not None and a.density is not None:
            row.volume_ml = a.value / a.density
            row.density = a.density
        what = fmt_mass(a.value) + (f" of a {100 * frac:.3g} wt% solution" if a.mass_fraction else "")
        what += f" at {100 * purity:.3g} % purity" if a.purity is not None else ""
        if a.mass_fraction is None and a.purity is None:
            row.read_as = f"{what} = {fmt_moles(row.mmol)}"
        else:
            row.read_as = f"{what} = {fmt_mass(row.mass_g)} of {c.formula} = {fmt_moles(row.mmol)}"
    elif a.kind == "volume":
        row.volume_ml = a.value
        if a.molarity is not None:
            row.mmol = a.value * a.molarity * purity
            row.mass_g = row.mmol * mw / 1000 if known else None
            row.read_as = f"{fmt_volume(a.value)} of {a.molarity:.4g} M = {fmt_moles(row.mmol)}"
            row.density = a.density
        else:
            density, source, value = _density(c, a)
            if a.mass_fraction is None:
                solid, tm = _is_solid(c)
                if solid and a.density is None:
                    extra = f" (m.p. {tm:.0f} °C)" if tm is not None else ""
                    raise AmountError(
                        f"{c.label} is a solid at 25 °C{extra}: give a mass, or the molarity of a solution",
                        key=c.text, text=a.text,
                    )
            if density is None:
                row.density = None
                row.read_as = f"{fmt_volume(a.value)} (density unknown: moles not computed)"
                row.notes.append("density unknown")
                return
            row.density, row.density_source, row.density_value = density, source, value
            weighed = a.value * density
            frac = a.mass_fraction if a.mass_fraction is not None else 1.0
            if a.mass_fraction is not None and a.density is None:
                row.notes.append("density unknown")
                row.read_as = f"{fmt_volume(a.value)} of a {100 * frac:.3g} wt% solution (its density is needed)"
                row.density = None
                return
            row.weighed_g = weighed
            row.mass_g = weighed * frac * purity
            row.mmol = row.mass_g / mw * 1000
            row.read_as = (
                f"{fmt_volume(a.value)} × {density:.4g} g/mL ({source}) = {fmt_mass(weighed)}"
                + (f" of a {100 * frac:.3g} wt% solution" if a.mass_fraction is not None else "")
                + f" = {fmt_moles(row.mmol)}"
            )
            if value is not None and not value.measured:
                row.notes.append("density estimated")
                row.read_as += f"; density estimated, ±{100 * value.uncertainty:.0f} %: weigh it or give the density"


def compute(reaction: Reaction, amounts: dict[str, str], coefficients: dict[int, int] | None) -> Stoichiometry:
    keyed = match_amounts(reaction, amounts)
    rows: list[Row] = []
    for comp in reaction.components:
        text = keyed.get(comp.index)
        amount = parse_amount(text, key=comp.text) if text is not None else None
        rows.append(Row(comp, amount))
    coeff = {c.index: 1 for c in reaction.components}
    if coefficients:
        coeff.update(coefficients)
    # absolute amounts first
    for row in rows:
        if row.amount is not None and row.amount.kind != "equiv":
            _read(row)
    # the reference: a component stated as 1.0 equiv, else the limiting reactant
    stated_one = [
        r for r in rows
        if r.amount is not None
        and ((r.amount.kind == "equiv" and abs(r.amount.value - 1.0) < 1e-9) or (r.amount.stated_equiv is not None and abs(r.amount.stated_equiv - 1.0) < 1e-9))
        and r.component.role != "product"
    ]
    reactants_with = [r for r in rows if r.component.role == "reactant" and r.mmol is not None]
    limiting = min(reactants_with, key=lambda r: r.mmol / coeff[r.component.index], default=None)
    # a component stated only as "1.0 equiv" is the reference when another component's amount
    # and stated equivalents fix its moles; otherwise "1.0 equiv" means as much as the limiting
    # reactant, like every other bare equivalent
    scale = next(
        (r.mmol / r.amount.stated_equiv for r in rows
         if r.mmol is not None and r.amount is not None and r.amount.stated_equiv),
        None,
    )
    stated_one = [r for r in stated_one if r.mmol is not None or scale is not None]
    reference = stated_one[0] if stated_one else limiting
    ref_mmol = reference.mmol if reference is not None else None
    if reference is not None and ref_mmol is None:
        # the reference is stated only in equivalents: scale from another component that has
        # both an amount and stated equivalents
        ref_mmol = scale
        if ref_mmol is not None:
            reference.mmol = ref_mmol
            reference.mass_g = ref_mmol * reference.component.mw / 1000 if _mw_known(reference.component) else None
            reference.read_as = f"1.0 equiv = {fmt_moles(ref_mmol)}"
    for row in rows:
        a = row.amount
        if a is not None and a.kind == "equiv":
            row.equiv = a.value
            if ref_mmol is not None:
                row.mmol = a.value * ref_mmol
                row.mass_g = row.mmol * row.component.mw / 1000 if _mw_known(row.component) else None
                row.read_as = f"{a.value:.4g} equiv = {fmt_moles(row.mmol)}"
                if row.mass_g is not None:
                    row.read_as += f" = {fmt_mass(row.mass_g)}"
            else:
                row.read_as = f"{a.value:.4g} equiv"
        elif row.mmol is not None and ref_mmol and row.component.kind != "solvent":
            row.equiv = row.mmol / ref_mmol
    for row in rows:
        _volume_to_measure(row)
        n = water_of_hydration(row.component)
        if n and row.mmol is not None:
            row.water_mmol = n * row.mmol
            if row.read_as:
                row.read_as += f" (with {fmt_moles(row.water_mmol)} of water of hydration, {fmt_mass(row.water_mmol * 18.015 / 1000)})"
    if limiting is None:
        cands = [r for r in rows if r.component.role == "reactant" and r.mmol is not None]
        limiting = min(cands, key=lambda r: r.mmol / coeff[r.component.index], default=None)
    # products: theoretical yield, and the yield of an isolated mass
    for row in rows:
        if row.component.role != "product" or limiting is None or limiting.mmol is None:
            continue
        if not _mw_known(row.component):
            continue
        k = coeff.get(row.component.index, 1) / coeff.get(limiting.component.index, 1)
        row.theoretical_g = limiting.mmol * k * row.component.mw / 1000
        if row.amount is not None and row.mass_g is not None and row.amount.kind in ("mass", "moles") and row.theoretical_g > 0:
            row.yield_pct = 100 * row.mass_g / row.theoretical_g
            row.equiv = None
    # concentration of the limiting reagent in the liquid volume
    volumes = [r.volume_ml for r in rows if r.volume_ml and r.component.role != "product"]
    total_v = sum(volumes) if volumes else None
    conc = limiting.mmol / total_v if (limiting is not None and limiting.mmol and total_v) else None
    # consistency of stated equivalents
    mismatches = []
    for row in rows:
        a = row.amount
        if a is None or a.stated_equiv is None or row.mmol is None or not ref_mmol or row is reference:
            continue
        actual = row.mmol / ref_mmol
        if abs(actual - a.stated_equiv) / a.stated_equiv > 0.05:
            mismatches.append((row, actual, _likely_cause(row, a, ref_mmol)))
    ae = _atom_economy(reaction, coeff)
    pmi = e_factor = None
    products_isolated = [r for r in rows if r.component.role == "product" and r.yield_pct is not None]
    if products_isolated:
        product_mass = sum(r.mass_g for r in products_isolated)
        inputs = 0.0
        for r in rows:
            if r.component.role == "product":
                continue
            if r.weighed_g is not None:
                inputs += r.weighed_g
            elif r.mass_g is not None:
                inputs += r.mass_g
        if product_mass > 0 and inputs > 0:
            pmi = inputs / product_mass
            e_factor = (inputs - product_mass) / product_mass
    return Stoichiometry(
        rows=rows,
        reference=reference,
        limiting=limiting,
        coefficients=coeff,
        concentration_m=conc,
        total_volume_ml=total_v,
        atom_economy_pct=ae,
        pmi=pmi,
        e_factor=e_factor,
        density_missing=[r for r in rows if "density unknown" in r.notes],
        density_estimated=[r for r in rows if "density estimated" in r.notes],
        mismatches=mismatches,
    )


def _atom_economy(reaction: Reaction, coeff: dict[int, int]) -> float | None:
    products = reaction.products
    reactants = reaction.reactants
    if not products or not reactants or not all(_mw_known(c) for c in products + reactants):
        return None
    main = max(products, key=lambda c: c.mw)
    denom = sum(c.mw * coeff.get(c.index, 1) for c in reactants)
    if denom <= 0:
        return None
    return 100 * main.mw * coeff.get(main.index, 1) / denom


def _likely_cause(row: Row, a: Amount, ref_mmol: float) -> str:
    """Why an amount and its stated equivalents disagree: the usual suspects, tested."""
    c = row.component
    target = a.stated_equiv * ref_mmol
    causes = []
    # salt weighed, free-base molar mass used in the plan (or the reverse)
    from rdkit import Chem
    from rdkit.Chem import rdMolDescriptors

    frags = Chem.GetMolFrags(c.mol, asMols=True)
    if len(frags) > 1 and row.mass_g is not None:
        biggest = max(frags, key=lambda m: m.GetNumHeavyAtoms())
        alt = row.mass_g / rdMolDescriptors._CalcMolWt(biggest) * 1000
        if abs(alt - target) / target <= 0.05:
            causes.append("the planned amount used the free base's molar mass, but this is the salt")
    if row.mass_g is not None:
        for acid, m in (("hydrochloride", 36.461), ("hydrobromide", 80.912), ("trifluoroacetate", 114.02)):
            alt = row.mass_g / (c.mw + m) * 1000
            if abs(alt - target) / target <= 0.05:
                causes.append(f"the material may be the {acid} salt (molar mass {c.mw + m:.1f})")
    if a.kind == "volume" and row.density and a.molarity is None:
        implied = target * c.mw / 1000 / a.value
        causes.append(f"the density used ({row.density:.3g} g/mL) would have to be {implied:.3g} g/mL")
    if a.purity is None and row.mmol and target < row.mmol:
        pur = target / row.mmol
        if 0.5 <= pur < 0.99:
            causes.append(f"a purity of about {100 * pur:.0f} % would explain it")
    if not causes:
        causes.append("check the reference component and the arithmetic")
    return "; ".join(causes)
