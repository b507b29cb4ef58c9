"""Molar masses against an independent calculation from IUPAC standard atomic weights.

Reference: the `periodictable` package (NIST/IUPAC standard atomic weights), which computes the
mass from the formula alone; chemcheck's comes from RDKit's atom table through the parsed
structure. Structures of the named compounds are common practice.
"""

import periodictable
import pytest

import chemcheck

NAMED = [
    ("triethylamine", "CCN(CC)CC", "C6H15N"),
    ("N,N-diisopropylethylamine", "CCN(C(C)C)C(C)C", "C8H19N"),
    ("pyridine", "c1ccncc1", "C5H5N"),
    ("4-(dimethylamino)pyridine", "CN(C)c1ccncc1", "C7H10N2"),
    ("acetyl chloride", "CC(Cl)=O", "C2H3ClO"),
    ("acetic anhydride", "CC(=O)OC(C)=O", "C4H6O3"),
    ("p-toluenesulfonyl chloride", "Cc1ccc(cc1)S(Cl)(=O)=O", "C7H7ClO2S"),
    ("benzylamine hydrochloride", "Cl.NCc1ccccc1", "C7H10ClN"),
    ("aluminium chloride", "Cl[Al](Cl)Cl", "AlCl3"),
    ("sodium triacetoxyborohydride", "[Na+].CC(=O)O[BH-](OC(C)=O)OC(C)=O", "C6H10BNaO6"),
    ("di-tert-butyl dicarbonate", "CC(C)(C)OC(=O)OC(=O)OC(C)(C)C", "C10H18O5"),
    ("acetanilide", "CC(=O)Nc1ccccc1", "C8H9NO"),
    ("potassium carbonate", "[K+].[K+].[O-]C([O-])=O", "CK2O3"),
    ("tetramethylammonium iodide", "C[N+](C)(C)C.[I-]", "C4H12IN"),
]


def _reference_mass(formula: str) -> float:
    return periodictable.formula(formula).mass


@pytest.mark.parametrize("name,smiles,formula", NAMED, ids=[n for n, _, _ in NAMED])
def test_molar_mass_matches_standard_atomic_weights(name, smiles, formula):
    amounts = {smiles: "1 mmol"} if "." in smiles else None
    report = chemcheck.check(smiles, amounts)
    assert len(report.components) == 1, "a salt is one component"
    comp = report.components[0]
    assert comp.formula.replace("+", "").replace("-", "") == formula
    assert comp.mw == pytest.approx(_reference_mass(formula), rel=2e-4)


def test_benzylamine_hydrochloride_worked_value():
    # RECIPES.md: Cl.NCc1ccccc1 -> C7H10ClN, 143.617 (checked with RDKit on this machine);
    # periodictable gives the same within 0.01 g/mol.
    report = chemcheck.check("Cl.NCc1ccccc1", {"Cl.NCc1ccccc1": "1 g"})
    assert report.components[0].mw == pytest.approx(143.617, abs=0.005)


def test_names_resolve_to_the_same_mass_as_smiles():
    by_name = chemcheck.check("Et3N").components[0]
    by_smiles = chemcheck.check("CCN(CC)CC").components[0]
    assert by_name.mw == by_smiles.mw
    assert by_name.inchikey == by_smiles.inchikey
    assert by_name.source == "name table" and by_smiles.source == "smiles"
    assert by_smiles.name == "triethylamine"  # resolved through the InChIKey
