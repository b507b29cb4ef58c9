"""``check()``: read a reaction, perceive every component, run every rule, build the report."""

from __future__ import annotations

import os

from rdkit import Chem

from .errors import ChemcheckError
from .findings import Finding
from .reading.reaction import Reaction, parse_reaction
from .report import Perceptions, Report
from ._budget import MAPPING_CAP_MARK, Budget, budget_of
from .rules import Context, registry

__all__ = ["check"]

_SEVERITY_ORDER = {"error": 0, "warning": 1, "info": 2}


def _join_keys(amounts: dict[str, str] | None) -> list[str]:
    return [k for k in (amounts or {}) if "." in k]


def _weighed_as_salt(text: str, rxn: Reaction, keys: list[str]) -> tuple[str, list[tuple[str, str]]]:
    """Amounts keyed by a salt (``Cl.NCc1ccccc1``) of a free base drawn alone in the reaction
    (``NCc1ccccc1``): the chemist weighed the salt. The reaction text with that component
    written as the salt, and the (base, salt) pairs rewritten."""
    from rdkit import Chem

    from . import _rdlog
    from .perceive import perceive

    acids = {"hydrogen_halide", "sulfonic_acid", "perfluoro_acid", "carboxylic_acid", "nitric_acid", "sulfuric_acid"}
    edits: list[tuple[int, int, str, str]] = []
    for key in keys:
        if rxn.find(key) is not None:
            continue
        parts = key.split(".")
        if any(p != p.strip() or not p for p in parts):
            continue  # written with spaces: left to the amounts' own error
        for comp in rxn.reactants + rxn.agents:
            if comp.text not in parts or "." in comp.text:
                continue
            others = [p for p in parts if p != comp.text]
            ok = bool(others)
            for other in others:
                if other == "O":  # water of a hydrate, keyed like a salt
                    continue
                with _rdlog.captured():
                    mol = Chem.MolFromSmiles(other)
                if mol is None or not (perceive(mol).group_names & acids or Chem.GetFormalCharge(mol) < 0):
                    ok = False
            if ok and any(a.GetAtomicNum() == 7 for a in comp.mol.GetAtoms()):
                edits.append((comp.span[0], comp.span[1], comp.text, key))
                break
    pairs = []
    for start, end, base, salt in sorted(edits, reverse=True):
        if text[start:end] != base:
            continue
        text = text[:start] + salt + text[end:]
        pairs.append((base, salt))
    return text, pairs[::-1]


def check(reaction: str | Reaction, amounts: dict[str, str] | None = None) -> Report:
    """Check a reaction for known failure modes.

    ``reaction`` is reaction SMILES (names allowed in place of SMILES) or a parsed
    :class:`~chemcheck.reading.reaction.Reaction`; ``amounts`` maps a component's text as written to
    an amount string. Raises :class:`~chemcheck.errors.ChemcheckError` subclasses on bad input.
    """
    from .amounts import validate_amounts

    amounts = validate_amounts(amounts)
    salts: list[tuple[str, str]] = []
    if isinstance(reaction, Reaction):
        rxn = reaction
    else:
        rxn = parse_reaction(reaction, join=_join_keys(amounts))
        text, salts = _weighed_as_salt(reaction, rxn, _join_keys(amounts))
        if salts:
            rxn = parse_reaction(text, join=_join_keys(amounts))
    ctx = Context(rxn, amounts)
    budget = budget_of(ctx)
    for comp in rxn.components:
        comp.kind = ctx.perception(comp).kind if comp.role == "agent" else None
        if not comp.name:
            comp.word = "product" if comp.role == "product" else _word_for(ctx.perception(comp), comp.role, comp.mol)
    stoich = ctx.stoichiometry  # amount errors are raised here, before any rule runs
    findings: list[Finding] = []
    for comp in rxn.components:
        if comp.sanitization == "partial":
            findings.append(
                Finding(
                    rule="partial-sanitization",
                    severity="info",
                    title="Structure read without valence checks",
                    message=f"{comp.label} was read without RDKit's valence checks ({'; '.join(comp.notes)}); "
                    "its formula and mass are as drawn.",
                    atoms=(),
                    fix="Check the drawing of this metal or hypervalent species.",
                )
            )
    for base, salt in salts:
        comp = rxn.find(salt)
        if comp is None:
            continue
        if set(salt.split(".")) - {base} == {"O"}:
            from .stoichiometry import hydrate_finding

            findings.append(hydrate_finding(base, salt, comp))
            continue
        findings.append(
            Finding(
                rule="weighed-as-salt",
                severity="info",
                title="Amount given for the salt of a component",
                message=f"The amount is given for {salt}, the salt of {base} as drawn in the reaction: the check "
                f"reads the component as that salt ({comp.formula}, {comp.mw:.2f} g/mol), which converts the mass "
                "weighed and needs a base to free the amine.",
                atoms=(),
                fix=f"Draw {salt} in the reaction, or give the amount of the free base {base}.",
            )
        )
    if rxn.products:
        u = ctx.understanding
        if u.amap.set_aside:
            findings.append(
                Finding(
                    rule="atom-maps-set-aside",
                    severity="info",
                    title="The atom maps written were not used",
                    message=f"The checks read a computed atom map: {u.amap.set_aside}.",
                    atoms=(),
                    fix="Check the atom map numbers in the reaction SMILES (automatic extraction sometimes maps a "
                    "solvent's or base's atoms into the product), or remove them.",
                )
            )
        elif u.amap.note or u.amap.coverage < 0.5:
            findings.append(
                Finding(
                    rule="reaction-not-mapped",
                    severity="info",
                    title="The reaction's atoms could not be followed",
                    message="Which atom of the reactants becomes which atom of the products could not be worked out"
                    + (f" ({u.amap.note})" if u.amap.note else f" (only {100 * u.amap.coverage:.0f} % of the product atoms)")
                    + ": the checks that need the reaction class were made only where they could be.",
                    atoms=(),
                    fix="Write atom maps in the reaction SMILES, or check that every reactant is drawn.",
                )
            )
    strict = bool(os.environ.get("CHEMCHECK_STRICT"))
    rules = list(registry().values())
    budget.start_rules()
    for k, r in enumerate(rules):
        if budget.expired():  # the rules not started by the deadline are named, not run
            left = [x.id for x in rules[k:]]
            budget.skip(f"{len(left)} rule{'s' if len(left) > 1 else ''} not started within {budget.deadline_s:g} s of computing time ({', '.join(left)})")
            break
        try:
            findings.extend(r.check(ctx) or ())
        except ChemcheckError:
            raise
        except Exception as exc:  # one rule's fault must not cost the chemist the whole check
            if strict:
                raise
            findings.append(
                Finding(
                    rule="rule-failed",
                    severity="info",
                    title="A rule could not run",
                    message=f"The rule {r.id} could not run on this reaction ({type(exc).__name__}); its pitfall was not checked.",
                    fix="Please report this reaction to the chemcheck developers.",
                )
            )
    amap = ctx.understanding.amap
    if amap.source == "none" and amap.note and MAPPING_CAP_MARK in amap.note:
        budget.skip(f"the atom map ({amap.note})")
    if budget.skipped:
        findings.append(_budget_finding(budget))
    findings.sort(key=lambda f: _SEVERITY_ORDER[f.severity])
    known = ctx.perceived()  # a product's perception, which no rule reads, on first use
    report = Report(
        reaction=rxn,
        findings=findings,
        amounts=dict(amounts or {}),
        perceptions=Perceptions(
            known, {c.index: (lambda c=c: ctx.perception(c)) for c in rxn.components if c.index not in known}
        ),
        balance=ctx.balance,
    )
    report.extra.defer(("basicity", "workup", "separations"), lambda: _deferred_sections(ctx, budget, report))
    report.extra["understanding"] = ctx.understanding.to_dict()
    report.roles = dict(ctx.understanding.roles)
    preds = getattr(ctx, "predictions", None) or []
    if preds:
        report.extra["predictions"] = [p.to_dict() for p in preds]
        report.extra["classes"] = [{"name": p.reaction_class, "evidence": p.evidence} for p in preds]
    if stoich is not None:
        report.stoichiometry = stoich
        report.extra["table"] = stoich.to_dict()
        report.extra["metrics"] = {
            "atom_economy_pct": None if stoich.atom_economy_pct is None else round(stoich.atom_economy_pct, 2),
            "pmi": None if stoich.pmi is None else round(stoich.pmi, 2),
            "e_factor": None if stoich.e_factor is None else round(stoich.e_factor, 2),
        }
    for stage in ctx.sections:
        report.extra.update(stage)
    return report


# what an unnamed component is, by its first reactive group or nitrogen, in the words of a
# scheme's caption (the order puts the group a chemist would name first)
_GROUP_WORDS = (
    ("acid_halide", "acid chloride"), ("sulfonyl_halide", "sulfonyl chloride"), ("chloroformate", "chloroformate"),
    ("anhydride", "anhydride"), ("isocyanate", "isocyanate"), ("isothiocyanate", "isothiocyanate"),
    ("sulfonic_acid", "sulfonic acid"), ("azide", "azide"), ("peroxide", "peroxide"),
    ("aldehyde", "aldehyde"), ("ketone", "ketone"), ("carboxylic_acid", "acid"), ("alkyl_halide", "alkyl halide"),
    ("alkyl_sulfonate", "alkyl sulfonate"), ("quaternary_ammonium", "ammonium salt"), ("nitro", "nitro compound"),
    ("aryl_halide", "aryl halide"), ("ester", "ester"),
)
_N_WORDS = {
    "primary_amine": "amine", "secondary_amine": "amine", "tertiary_amine": "amine", "aryl_amine": "aniline",
    "amide": "amide", "sulfonamide": "sulfonamide", "carbamate": "carbamate", "urea": "urea",
    "hydrazine": "hydrazine",
}


# the ring system or group that names an unnamed compound when no reacting group does, most
# specific first ("indole 1", "phenol 2"): the IUPAC parent names of the ring systems
_RING_WORDS = tuple(
    (Chem.MolFromSmarts(sm), word)
    for sm, word in (
        ("[C-]#N", "cyanide"),
        ("[#1-,$([B-,Al-;!H0])]", "hydride"),
        ("[Li+,Na+,K+,Rb+,Cs+,Mg+2,Ca+2,Zn+2,Ba+2]", "metal ion"),
        ("[Pd,Pt,Ni,Cu,Fe,Co,Rh,Ru,Ir,Mn,Cr,Ti,Zr,Sn,Ag,Au,Os,Mo,W,V,Ce,In,Bi,Hg]", "metal compound"),
        ("[N-]=[N+]=[N-]", "azide"),
        ("[O-][N]=O", "nitrite"),
        ("[OH-]", "hydroxide"),
        ("[O-][CX4]", "alkoxide"),
        ("c1ccc2[nX3]ccc2c1", "indole"),
        ("c1ccc2ncccc2c1", "quinoline"),
        ("c1ccc2cnccc2c1", "isoquinoline"),
        ("c1ccc2[nX3]cnc2c1", "benzimidazole"),
        ("c1ncc[nX3]1", "imidazole"),
        ("c1cn[nX3]c1", "pyrazole"),
        ("[#6]1:[#7]:[#7]:[#7]:[#6,#7]:1", "triazole"),
        ("c1cscn1", "thiazole"),
        ("c1cocn1", "oxazole"),
        ("c1cc[nX3]c1", "pyrrole"),
        ("c1cncnc1", "pyrimidine"),
        ("c1cnccn1", "pyrazine"),
        ("c1ccncc1", "pyridine"),
        ("c1ccsc1", "thiophene"),
        ("c1ccoc1", "furan"),
        ("c[OX2H1]", "phenol"),
        ("[CX4][OX2H1]", "alcohol"),
        ("[SX2H1]", "thiol"),
        ("[CX3]=[CX3]", "alkene"),
        ("[CX2]#[CX2]", "alkyne"),
        ("c1ccccc1", "arene"),
    )
)


# the acylating and sulfonylating groups name their compound before any amine it carries
_ACYL_WORDS = {"acid_halide", "sulfonyl_halide", "chloroformate", "anhydride", "isocyanate", "isothiocyanate"}
_AMINE_KINDS = ("primary_amine", "secondary_amine", "aryl_amine", "tertiary_amine", "hydrazine")


def _word_for(perception, role: str, mol=None) -> str:
    if role == "product":
        return "product"
    names = perception.group_names
    for group, word in _GROUP_WORDS:
        if group in _ACYL_WORDS and group in names:
            return word
    # then the amine: in amine chemistry the nitrogen is what the compound is there for (an
    # amino ketone reads "amine 1", not "ketone 1", when its N is acylated)
    kinds = {site.kind for site in perception.nitrogens}
    for kind in _AMINE_KINDS:
        if kind in kinds:
            return _N_WORDS[kind]
    for group, word in _GROUP_WORDS:
        if group in names and not (group in ("ester", "aryl_halide") and perception.basic_nitrogens):
            return word
    for site in perception.nitrogens:
        if site.kind in _N_WORDS:
            return _N_WORDS[site.kind]
    if mol is not None and mol.GetNumAtoms():
        for patt, word in _RING_WORDS:
            if mol.HasSubstructMatch(patt):
                return word
    return "compound"


def _budget_finding(budget: Budget) -> Finding:
    """The info note naming the work the check left out to answer within its budget."""
    return Finding(
        rule="check-budget-reached",
        severity="info",
        title="Part of the check was not done",
        message="To answer within its work budget, the check left out: " + "; ".join(budget.skipped) + ". "
        "Findings that depend on these parts may be missing.",
        atoms=(),
        fix="Check the parts named by hand, or split the structure into smaller pieces (a repeat unit, "
        "the reacting fragment) and check those.",
    )


def _deferred_sections(ctx: Context, budget: Budget, report: Report) -> dict:
    """The basicity and workup sections, worked out when the report is first shown or
    serialised; work they skip within the budget is added to the report's budget note."""
    before = list(budget.skipped)
    sections = _basicity_sections(ctx)
    if budget.skipped != before:
        report.findings[:] = [f for f in report.findings if f.rule != "check-budget-reached"]
        report.findings.append(_budget_finding(budget))
    return sections


def _basicity_sections(ctx: Context) -> dict:
    """The basicity table of every component and the workup advice for the amines."""
    from .workup import advice_for, separations

    table = []
    workup = []
    amines = []
    for comp in ctx.reaction.components:
        sites = ctx.sites(comp)
        for s in sites:
            table.append(
                {
                    "component": comp.index,
                    "atom": s.atom_index,
                    "kind": s.kind,
                    "pka": s.pka,
                    "method": s.method,
                    "source": s.source,
                    "uncertainty": s.uncertainty,
                    "protonation_order": s.protonation_order,
                }
            )
        if comp.role == "agent" and comp.kind == "solvent":
            continue
        best = max(
            (s for s in sites if s.pka is not None and s.kind not in ("amide_anion",) and 1.0 <= s.pka <= 14.0),
            key=lambda s: s.pka,
            default=None,
        )
        if best is not None and comp.role in ("reactant", "product"):
            workup.append(advice_for(comp.index, comp.label, best.pka).to_dict())
            amines.append((comp.label, best.pka))
    return {"basicity": table, "workup": workup, "separations": separations(amines)}
