"""Scale-up: every amount scaled with the equivalents kept, the vessel fill, and a thermal screen.

Thermal screen (method as in F. Stoessel, *Thermal Safety of Chemical Processes*, Wiley-VCH,
2008, ch. 2-3): the adiabatic temperature rise of the batch if all of the reaction heat stays in
it, dT_ad = (-dH_r x n) / (m x cp), with n the moles of the limiting reagent, m the whole
reaction mass and cp its specific heat capacity; the maximum temperature of the synthesis
reaction is then T0 + dT_ad (no accumulation allowance, i.e. a batch with everything charged).
When that reaches the solvent's boiling point the batch can boil over or pressurise.

The reaction enthalpy is the user's value when given, else an estimate from the enthalpies of
formation in the `chemicals` database when every species has one, else a class value. Every
value is labelled an estimate. None of this replaces calorimetry (DSC, reaction calorimetry)
and the site's process-safety review; local regulations and the SDS govern.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

from .errors import ChemcheckError

__all__ = ["scale", "recheck", "CAUTION", "CLASS_ENTHALPY"]

CAUTION = (
    "Scale-up estimates are a screen, not a safety assessment: they do not replace calorimetry "
    "(DSC, reaction calorimetry) or your site's process-safety review. Follow the SDS of every "
    "reagent, local regulations and your institution's safety rules."
)

# Order-of-magnitude reaction enthalpies (kJ per mol of limiting reagent). Nitration,
# sulfonation, neutralisation, diazotisation and amination: typical values tabulated by
# Stoessel (2008), recalled; the others are our estimates for the class, chosen on the
# cautious (more exothermic) side.
CLASS_ENTHALPY: dict[str, tuple[float, str]] = {
    "acylation": (-150.0, "estimate for amine + acid chloride, including the base taking up HCl"),
    "sulfonylation": (-150.0, "estimate, as for acylation with an acid chloride"),
    "anhydride acylation": (-90.0, "estimate for amine + anhydride"),
    "N-alkylation": (-100.0, "estimate for amine + alkyl halide, including the base taking up HX"),
    "condensation": (-30.0, "estimate for imine formation"),
    "reduction": (-150.0, "estimate for hydride reduction of an iminium"),
    "nitration": (-145.0, "Stoessel 2008, typical value for aromatic nitration"),
    "sulfonation": (-150.0, "Stoessel 2008, typical value"),
    "neutralisation": (-55.0, "Stoessel 2008, strong acid with a strong base"),
    "diazotisation": (-65.0, "Stoessel 2008, typical value"),
    "Friedel-Crafts": (-120.0, "estimate, including complexation of the Lewis acid"),
    "unknown": (-100.0, "generic estimate when the reaction class is not recognised"),
}

_CP_DEFAULT = 1.8  # J/(g K), organic liquids (common practice 1.5-2.1)
# Vessel fill: a solid charge takes up about its mass over its crystal density; organic solids
# are mostly 1.1-1.5 g/mL (common practice), so 1.3 g/mL is assumed when nothing better is known.
_SOLID_DENSITY = 1.3
_FILL_MAX = 0.5  # common practice: no more than half full, leaving room to stir, foam and reflux
_FILL_LIMIT = 0.75


@dataclass
class ScaleInfo:
    factor: float
    vessel_ml: float | None
    fill_fraction: float | None
    thermal: dict | None
    cautions: list[str]

    def to_dict(self) -> dict:
        thermal = None
        if self.thermal is not None:
            # the payload's thermal values are numbers or words
            thermal = {k: ("yes" if v else "no") if isinstance(v, bool) else v for k, v in self.thermal.items()}
        return {
            "factor": self.factor,
            "vessel_ml": self.vessel_ml,
            "fill_fraction": self.fill_fraction,
            "thermal": thermal,
            "cautions": self.cautions,
        }


_NUM = re.compile(r"^\s*([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)$")


def _scale_amount(text: str, factor: float) -> str:
    """Scale the head amount of an amount string, written in a unit a chemist reads at that
    scale (kg and L rather than 1.94e+04 mmol); equivalents and qualifiers stay."""
    from .amounts import parse_amount
    from .units import fmt_mass, fmt_moles, fmt_volume

    head, sep, rest = text.partition(",")
    m = _NUM.match(head)
    if not m:
        return text
    try:
        a = parse_amount(head.strip())
    except ChemcheckError:
        return text
    if a.kind == "equiv":
        return text
    fmt = {"mass": fmt_mass, "volume": fmt_volume, "moles": fmt_moles}[a.kind]
    return fmt(a.value * factor) + (sep + rest if sep else "")


def charge_volumes(st) -> tuple[float, list[str]]:
    """Every charge's volume in mL (the vessel fill) and how each was counted: volumes as
    measured; neat liquids given by mass, mmol or equiv from their density; solids at an
    assumed density."""
    from .stoichiometry import _props
    from .units import fmt_volume

    total = 0.0
    solids = liquids = 0.0
    notes: list[str] = []
    for r in st.rows:
        if r.component.role == "product":
            continue
        if r.volume_ml:
            total += r.volume_ml
            continue
        m = r.weighed_g if r.weighed_g is not None else r.mass_g
        if not m:
            continue
        p = _props(r.component)
        d = p.density_25 if p is not None else None
        liquid = p is not None and (p.curated or p.phase == "l") and d is not None
        if liquid:
            total += m / d.value
            liquids += m / d.value
        else:
            total += m / _SOLID_DENSITY
            solids += m / _SOLID_DENSITY
    if liquids:
        notes.append(f"neat liquids given by mass or amount counted from their density: {fmt_volume(liquids)}")
    if solids:
        notes.append(f"solids counted at an assumed {_SOLID_DENSITY} g/mL, typical of organic solids: {fmt_volume(solids)}")
    return total, notes


def _reaction_class(report) -> str:
    names = set()
    for c in report.components:
        p = report.perceptions.get(c.index)
        if p is not None:
            names |= set(p.group_names)
    basic_n = any(
        s.basic for c in report.reaction.reactants for s in (report.perceptions[c.index].nitrogens if c.index in report.perceptions else ())
    )
    if names & {"nitrating_agent"}:
        return "nitration"
    if "lewis_acid" in names and names & {"acid_halide", "anhydride"}:
        return "Friedel-Crafts"
    if names & {"acid_halide", "chloroformate", "carbamoyl_chloride"}:
        return "acylation"
    if names & {"sulfonyl_halide"}:
        return "sulfonylation"
    if names & {"anhydride", "dicarbonate"}:
        return "anhydride acylation"
    if names & {"alkyl_halide", "alkyl_sulfonate"} and basic_n:
        return "N-alkylation"
    if names & {"boron_hydride", "aluminium_hydride"}:
        return "reduction"
    if names & {"aldehyde", "ketone"} and basic_n:
        return "condensation"
    if names & {"hydrogen_halide", "sulfonic_acid", "perfluoro_acid"} and basic_n:
        return "neutralisation"
    return "unknown"


def _enthalpy_from_formation(report) -> float | None:
    """dH_r (kJ/mol) from enthalpies of formation when the database has every species."""
    try:
        from chemicals import Hfl, Hfg
        from chemicals.identifiers import search_chemical
    except ImportError:
        return None
    b = report.balance
    if b is None or not b.balanced or b.missing:
        return None
    total = 0.0
    for c in report.reaction.reactants + report.reaction.products:
        try:
            cas = search_chemical("InChIKey=" + c.inchikey).CASs
        except Exception:
            return None
        hf = Hfl(cas)
        if hf is None:
            hf = Hfg(cas)
        if hf is None:
            return None
        k = b.coefficients.get(c.index, 1)
        total += (k if c.role == "product" else -k) * hf / 1000.0
    return total


def scale(
    report,
    factor: float | None = None,
    *,
    target_mmol: float | None = None,
    target_product_g: float | None = None,
    vessel_ml: float | None = None,
    start_c: float = 20.0,
    dh_kj_mol: float | None = None,
):
    """The same reaction at another scale: a new :class:`~chemcheck.report.Report`.

    Give one of ``factor``, ``target_mmol`` (of the limiting reagent) or ``target_product_g``
    (theoretical product mass). ``vessel_ml`` checks the fill; ``dh_kj_mol`` (per mol of
    limiting reagent, negative when exothermic) overrides the enthalpy estimate.
    """
    from .engine import check

    given = [x is not None for x in (factor, target_mmol, target_product_g)]
    if sum(given) != 1:
        raise ChemcheckError("give exactly one of factor, target_mmol or target_product_g")
    st = report.stoichiometry
    if st is None:
        raise ChemcheckError("scale-up needs amounts: check the reaction with amounts first")
    if factor is None:
        lim = st.limiting
        if lim is None or lim.mmol is None:
            raise ChemcheckError("no limiting reagent with a known amount to scale from")
        if target_mmol is not None:
            factor = target_mmol / lim.mmol
        else:
            prods = [r for r in st.rows if r.component.role == "product" and r.theoretical_g]
            if not prods:
                raise ChemcheckError("no product with a theoretical yield to scale to")
            factor = target_product_g / prods[0].theoretical_g
    if not (factor > 0) or factor > 1e6:
        raise ChemcheckError(f"scale factor must be positive and at most 10^6, got {factor}")
    amounts = {k: _scale_amount(v, factor) for k, v in report.amounts.items()}
    new = check(report.reaction.text, amounts)
    from .units import fmt_volume
    nst = new.stoichiometry
    cautions: list[str] = []
    findings = list(new.findings)
    from .findings import Finding

    fill = None
    total_v, fill_notes = charge_volumes(nst) if nst else (None, [])
    if vessel_ml is not None:
        if not (vessel_ml > 0) or vessel_ml > 1e9:
            raise ChemcheckError("vessel volume must be positive (in mL) and at most 10^9 mL")
        if total_v:
            fill = total_v / vessel_ml
            if fill > _FILL_MAX:
                sev = "error" if fill > 1 else "warning"
                findings.append(
                    Finding(
                        rule="vessel-overfilled",
                        severity=sev,
                        title="Vessel filled beyond common practice",
                        message=f"The charges come to {fmt_volume(total_v)}, {100 * fill:.0f} % of the {fmt_volume(vessel_ml)} vessel"
                        + (f" ({'; '.join(fill_notes)})" if fill_notes else "")
                        + (" — more than it holds." if fill > 1 else f"; common practice is to fill no more than {100 * _FILL_MAX:.0f} % (room to stir, for foaming, reflux and additions)."),
                        fix=f"Use a vessel of at least {fmt_volume(total_v / _FILL_MAX)}, or run more concentrated only after checking the heat release and solubility.",
                    )
                )
    thermal = _thermal(new, start_c, dh_kj_mol)
    if thermal is not None:
        if thermal.get("reaches_boiling"):
            findings.append(
                Finding(
                    rule="adiabatic-rise-reaches-boiling",
                    severity="warning",
                    title="Adiabatic temperature rise reaches the boiling point",
                    message=(
                        f"If all of the reaction heat stays in the batch it warms by about {thermal['dT_ad_K']:.0f} K, "
                        f"from {start_c:g} °C to {thermal['mtsr_c']:.0f} °C, past the boiling point of "
                        f"{thermal['solvent']} ({thermal['solvent_bp_c']:.0f} °C); reaction enthalpy "
                        f"{thermal['dh_kj_mol']:.0f} kJ/mol ({thermal['dh_source']})."
                    ),
                    fix="Add the reactive reagent slowly with cooling (dosing-controlled), dilute, or measure "
                    "the heat release by calorimetry before scaling up. " + CAUTION,
                )
            )
        cautions.append(
            f"Estimated adiabatic temperature rise {thermal['dT_ad_K']:.0f} K (reaction enthalpy "
            f"{thermal['dh_kj_mol']:.0f} kJ/mol, {thermal['dh_source']}; heat capacity {thermal['cp_j_gk']:.2f} J/(g K), "
            f"{thermal['cp_source']}): an estimate only."
        )
    if fill is not None:
        cautions.append(
            f"Vessel fill {100 * fill:.0f} %: {fmt_volume(total_v)} of charges in {fmt_volume(vessel_ml)}"
            + (f" ({'; '.join(fill_notes)})." if fill_notes else ".")
        )
    if nst and nst.concentration_m:
        cautions.append(f"Concentration of the limiting reagent {nst.concentration_m:.3g} M (unchanged by the factor).")
    if factor >= 10:
        cautions.append(
            "Heat removal does not scale with volume: a larger vessel has less cooling surface per litre, "
            "so additions that were fast on the small scale should be dosed."
        )
    cautions.append(CAUTION)
    new.findings = sorted(findings, key=lambda f: {"error": 0, "warning": 1, "info": 2}[f.severity])
    info = ScaleInfo(factor, vessel_ml, None if fill is None else round(fill, 3), thermal, cautions)
    new.scale_info = info
    new.extra["scale"] = info.to_dict()
    new.extra["input"] = {
        "reaction": new.reaction.text,
        "amounts": dict(new.amounts),
        "scale": {"factor": factor, "vessel_ml": vessel_ml, "start_c": start_c, "dh_kj_mol": dh_kj_mol},
    }
    return new


def recheck(reaction: str, amounts: dict[str, str] | None, scale_input: dict | None = None):
    """Check a recorded input again: a scaled report's input holds the scaled amounts and its
    scale settings, so the vessel and thermal findings are made again at factor 1."""
    from .engine import check

    report = check(reaction, amounts or None)
    if not isinstance(scale_input, dict) or not amounts:
        return report

    def num(key, default=None):
        v = scale_input.get(key, default)
        return float(v) if isinstance(v, (int, float)) and not isinstance(v, bool) and math.isfinite(v) else default

    return scale(report, 1.0, vessel_ml=num("vessel_ml"), start_c=num("start_c", 20.0), dh_kj_mol=num("dh_kj_mol"))


def _full_props(comp):
    from .properties import properties_for_inchikey
    from .stoichiometry import _mw_known

    if not comp.inchikey:
        return None
    return properties_for_inchikey(comp.inchikey, comp.mw if _mw_known(comp) else None)


def _thermal(report, start_c: float, dh_kj_mol: float | None) -> dict | None:
    st = report.stoichiometry
    if st is None or st.limiting is None or st.limiting.mmol is None:
        return None
    if dh_kj_mol is not None:
        dh, src = dh_kj_mol, "as given"
    else:
        est = _enthalpy_from_formation(report)
        if est is not None:
            k = st.coefficients.get(st.limiting.component.index, 1)
            dh, src = est / k, "estimated from enthalpies of formation (chemicals database)"
        else:
            cls = _reaction_class(report)
            dh, note = CLASS_ENTHALPY[cls]
            src = f"class value for {cls}: {note}"
    mass = 0.0
    for r in st.rows:
        if r.component.role == "product":
            continue
        m = r.weighed_g if r.weighed_g is not None else r.mass_g
        if m:
            mass += m
    if mass <= 0:
        return None
    from .stoichiometry import _props

    solvent = None
    for r in sorted(st.rows, key=lambda r: -(r.volume_ml or 0)):
        if r.volume_ml and r.component.role == "agent":
            p = _props(r.component)
            if p is not None:
                solvent = (r.component.label, p)
                break
    # mass-weighted heat capacity of the batch; components without data count at the default
    weighted = 0.0
    known = 0.0
    estimated = False
    for r in st.rows:
        if r.component.role == "product":
            continue
        m = r.weighed_g if r.weighed_g is not None else r.mass_g
        if not m:
            continue
        # the thermal screen may load the database: a curated row without a heat capacity
        # takes the database's value
        p = _full_props(r.component)
        v = p.cp_liquid if p is not None else None
        c = v.value if (v is not None and 0.3 < v.value < 5.0) else None
        weighted += m * (c if c else _CP_DEFAULT)
        known += m if c else 0.0
        estimated = estimated or bool(v is not None and not v.measured)
    cp = weighted / mass
    cp_source = (
        f"mass-weighted over the batch: handbook or fitted values for {100 * known / mass:.0f} % of the mass, "
        f"{_CP_DEFAULT} J/(g K) (typical organic liquid) for the rest"
        if known
        else "typical organic liquid (common practice)"
    )
    dT = (-dh * 1000.0 * st.limiting.mmol / 1000.0) / (mass * cp)
    bp = solvent[1].boiling_point.value if solvent and solvent[1].boiling_point else None
    out = {
        "dh_kj_mol": round(dh, 1),
        "dh_source": src,
        "dT_ad_K": round(dT, 1),
        "mtsr_c": round(start_c + dT, 1),
        "cp_j_gk": round(cp, 3),
        "cp_source": cp_source,
        "mass_g": round(mass, 3),
        "solvent": solvent[0] if solvent else None,
        "solvent_bp_c": round(bp, 1) if bp is not None else None,
        "reaches_boiling": bool(bp is not None and start_c + dT >= bp),
    }
    return out
