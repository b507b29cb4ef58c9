"""The property layer: handbook densities and heat capacities, their sources, the curated table
used before the database, estimates marked as such; and the amounts' hostile-input cases.

Check values: densities at 25 °C as printed on suppliers' labels and in the CRC Handbook of
Chemistry and Physics, heat capacities from the CRC Handbook and Poling, Prausnitz and
O'Connell, *The Properties of Gases and Liquids* (5th ed.); written from memory and marked so.
The experimentally fitted correlations in the ``chemicals`` database (DIPPR-105 coefficients
of Perry's Handbook, 8th ed.; VDI Heat Atlas PPDS; Zabransky et al. 1996) are the outside
reference for the curated table as a whole.
"""

import csv
import json
import math
import subprocess
import sys
from importlib import resources
from pathlib import Path

import jsonschema
import pytest
from rdkit import Chem

import chemcheck
from chemcheck import AmountError
from chemcheck.properties import Properties, curated_table, properties_for_inchikey
from chemcheck.report import schema
from chemcheck.scale import scale

ROOT = Path(__file__).resolve().parent.parent


def key(smiles: str) -> str:
    return Chem.MolToInchiKey(Chem.MolFromSmiles(smiles))


def row(report, text):
    return next(r for r in report.stoichiometry.rows if r.component.text == text)


# density at 25 °C, g/mL; source beside each (label = supplier's label, "g/mL at 25 °C (lit.)")
HANDBOOK_D25 = [
    ("CI", 2.28, "methyl iodide, label (from memory); issue #21 quotes 2.28"),
    ("CN1CCOCC1", 0.92, "N-methylmorpholine, label (from memory)"),
    ("BrCc1ccccc1", 1.438, "benzyl bromide, label (from memory)"),
    ("CCCCBr", 1.276, "1-bromobutane, label (from memory)"),
    ("C1COCCN1", 0.996, "morpholine, label (from memory)"),
    ("NCc1ccccc1", 0.981, "benzylamine, label (from memory)"),
    ("CCOC(=O)Cl", 1.135, "ethyl chloroformate, label (from memory)"),
    ("O=C(Cl)c1ccccc1", 1.211, "benzoyl chloride, label (from memory)"),
    ("CC(=O)Cl", 1.104, "acetyl chloride, label (from memory); issue #21 quotes 1.104"),
    ("ClCCl", 1.325, "dichloromethane, label (from memory)"),
    ("CCN(CC)CC", 0.726, "triethylamine, label (from memory)"),
    ("CCN(C(C)C)C(C)C", 0.742, "N,N-diisopropylethylamine, label (from memory)"),
    ("CS(=O)(=O)Cl", 1.480, "methanesulfonyl chloride, label (from memory)"),
    ("O=C(Cl)C(=O)Cl", 1.478, "oxalyl chloride, label (from memory)"),
    ("O=S(Cl)Cl", 1.631, "thionyl chloride, label (from memory)"),
    ("CC(=O)OC(C)=O", 1.082, "acetic anhydride, label (from memory)"),
    ("OC(=O)C(F)(F)F", 1.489, "trifluoroacetic acid, label (from memory)"),
    ("C[Si](C)(C)Cl", 0.856, "chlorotrimethylsilane, label (from memory)"),
    ("C[Si](C)(C)N[Si](C)(C)C", 0.774, "hexamethyldisilazane, label (from memory)"),
    ("O=S(=O)(OS(=O)(=O)C(F)(F)F)C(F)(F)F", 1.677, "triflic anhydride, label (from memory)"),
    ("COS(=O)(=O)OC", 1.333, "dimethyl sulfate, label (from memory)"),
    ("CCOC(=O)CBr", 1.506, "ethyl bromoacetate, label (from memory)"),
    ("C=CCBr", 1.398, "allyl bromide, label (from memory)"),
    ("C1CCNCC1", 0.862, "piperidine, label (from memory)"),
    ("C1CCNC1", 0.852, "pyrrolidine, label (from memory)"),
    ("c1ccncc1", 0.978, "pyridine, label (from memory)"),
    ("C1CCC2=NCCCN2CC1", 1.018, "DBU, label (from memory)"),
    ("CN(C)C=O", 0.944, "DMF, label (from memory)"),
    ("CS(C)=O", 1.100, "DMSO, label (from memory)"),
    ("C1CCOC1", 0.889, "THF, label (from memory)"),
    ("CC#N", 0.786, "acetonitrile, label (from memory)"),
    ("CCOC(C)=O", 0.902, "ethyl acetate, label (from memory)"),
    ("Cc1ccccc1", 0.865, "toluene, label (from memory)"),
    ("CO", 0.791, "methanol, label (from memory)"),
    ("CC(=O)O", 1.049, "acetic acid, label (from memory)"),
    ("CN1CCCC1=O", 1.028, "NMP, label (from memory)"),
    ("C1COCCO1", 1.034, "1,4-dioxane, label (from memory)"),
    ("CC1CCCO1", 0.854, "2-methyltetrahydrofuran, label (from memory)"),
    ("ClC(Cl)Cl", 1.492, "chloroform, label (from memory)"),
    ("CC(C)(C)OC(=O)OC(=O)OC(C)(C)C", 0.95, "di-tert-butyl dicarbonate, label (from memory)"),
]


@pytest.mark.parametrize("smiles,density,source", HANDBOOK_D25, ids=[s for _, _, s in HANDBOOK_D25])
def test_density_at_25_within_one_percent_of_the_handbook(smiles, density, source):
    p = chemcheck.properties(smiles)
    assert p.density_25 is not None, source
    assert p.density_25.value == pytest.approx(density, rel=0.01), source
    assert p.density_25.measured and p.density_25.source


# liquid heat capacity at 25 °C, J/(g K): CRC Handbook, "Heat capacity of liquids" (from memory)
HANDBOOK_CP = [
    ("ClCCl", 1.19, "dichloromethane, 102 J/(mol K) (CRC, from memory); issue #21 quotes 1.19"),
    ("O", 4.18, "water (CRC, from memory)"),
    ("CO", 2.53, "methanol, 81 J/(mol K) (CRC, from memory)"),
    ("CCO", 2.44, "ethanol, 112 J/(mol K) (CRC, from memory)"),
    ("CC(C)=O", 2.17, "acetone, 126 J/(mol K) (CRC, from memory)"),
    ("CC#N", 2.23, "acetonitrile, 91 J/(mol K) (CRC, from memory)"),
    ("ClC(Cl)Cl", 0.96, "chloroform, 114 J/(mol K) (CRC, from memory)"),
    ("C1CCOC1", 1.72, "THF, 124 J/(mol K) (CRC, from memory)"),
    ("Cc1ccccc1", 1.70, "toluene, 157 J/(mol K) (CRC, from memory)"),
    ("CCCCCC", 2.26, "hexane, 195 J/(mol K) (CRC, from memory)"),
    ("CCOC(C)=O", 1.94, "ethyl acetate, 170 J/(mol K) (CRC, from memory)"),
    ("CN(C)C=O", 2.06, "DMF, 151 J/(mol K) (CRC, from memory)"),
    ("CCOCC", 2.33, "diethyl ether, 172 J/(mol K) (CRC, from memory)"),
    ("c1ccccc1", 1.74, "benzene, 136 J/(mol K) (CRC, from memory)"),
    ("CC(=O)O", 2.05, "acetic acid, 123 J/(mol K) (CRC, from memory)"),
]


@pytest.mark.parametrize("smiles,cp,source", HANDBOOK_CP, ids=[s for _, _, s in HANDBOOK_CP])
def test_liquid_heat_capacity_within_five_percent_of_the_handbook(smiles, cp, source):
    p = chemcheck.properties(smiles)
    assert p.cp_liquid is not None and p.cp_liquid.unit == "J/(g·K)"
    assert p.cp_liquid.value == pytest.approx(cp, rel=0.05), source


@pytest.mark.parametrize("smiles,cp,source", HANDBOOK_CP[:8], ids=[s for _, _, s in HANDBOOK_CP[:8]])
def test_database_heat_capacity_agrees_with_the_handbook(smiles, cp, source):
    # the database's own value (Zabransky or Poling), not the curated one
    from chemcheck.properties import _cas_for, _cp_db

    cas, _, mw = _cas_for(key(smiles))
    v = _cp_db(cas, mw)
    assert v is not None and v.measured
    assert v.value == pytest.approx(cp, rel=0.05), (source, v.source)


def _curated_rows():
    text = resources.files("chemcheck").joinpath("data/liquids.csv").read_text(encoding="utf-8")
    return list(csv.DictReader(ln for ln in text.splitlines() if ln and not ln.startswith("#")))


def test_the_curated_table_is_keyed_by_the_inchikey_of_its_structure():
    rows = _curated_rows()
    assert len(rows) >= 150
    keys = [r["inchikey"] for r in rows]
    assert len(set(keys)) == len(keys)
    for r in rows:
        assert key(r["smiles"]) == r["inchikey"], r["name"]
        assert r["density_25"] and r["source_25"], r["name"]
        assert 0.5 < float(r["density_25"]) < 3.5, r["name"]
        # 20 °C is never lighter than 25 °C by more than rounding
        assert float(r["density_20"]) >= float(r["density_25"]) - 0.002, r["name"]
        # every source says where the figure comes from, and whether it was recalled
        for col in ("source_20", "source_25", "phys_source"):
            assert r[col], (r["name"], col)
        assert "from memory" in r["source_25"] or "from the 20 °C" in r["source_25"], r["name"]


def test_the_curated_table_agrees_with_the_fitted_correlations():
    # outside reference: the experimentally fitted correlations of the chemicals database
    # (DIPPR-105 of Perry's Handbook, VDI PPDS) quote about 1 % near room temperature
    from chemcheck.properties import _from_database

    compared = 0
    for r in _curated_rows():
        db = _from_database(r["inchikey"], None)
        if db is None or db.density_25 is None or not db.density_25.measured:
            continue
        compared += 1
        assert float(r["density_25"]) == pytest.approx(db.density_25.value, rel=0.015), (r["name"], db.density_25.source)
    assert compared >= 60


def test_every_curated_value_wins_over_the_database():
    table = curated_table()
    for inchikey, r in table.items():
        p = properties_for_inchikey(inchikey)
        assert p.curated, r.name
        assert p.density_25.value == r.d25 and p.density_25.method == "curated", r.name
        assert p.density_20.value == r.d20 and p.density_20.method == "curated", r.name
        if r.cp is not None:
            assert p.cp_liquid.value == r.cp and p.cp_liquid.method == "curated", r.name
        for attr, v in (("boiling_point", r.bp), ("melting_point", r.mp), ("flash_point", r.flash)):
            if v is not None:
                assert getattr(p, attr).value == v and getattr(p, attr).method == "curated", (r.name, attr)


def test_the_stoichiometry_reads_the_curated_density():
    # methyl iodide: 1.00 mL x 2.28 g/mL (label) = 2.28 g = 16.06 mmol (CH3I 141.939 g/mol)
    r = chemcheck.check("C1CCNCC1.CI>>CN1CCCCC1", {"CI": "1.00 mL", "C1CCNCC1": "10 mmol"})
    mei = row(r, "CI")
    assert mei.density == curated_table()[key("CI")].d25
    assert mei.mmol == pytest.approx(1000 * mei.density / 141.939, rel=1e-3)
    assert "curated table, 25 °C" in mei.read_as and "estimated" not in mei.read_as


def test_an_estimated_density_says_so():
    # decanoyl chloride is in neither the curated table nor the fitted tables
    p = chemcheck.properties("CCCCCCCCCC(=O)Cl")
    assert p.density_25 is not None and not p.density_25.measured
    assert p.density_25.uncertainty >= 0.03 and "estimated" in p.density_25.source
    r = chemcheck.check("NCc1ccccc1.CCCCCCCCCC(=O)Cl>>CCCCCCCCCC(=O)NCc1ccccc1",
                        {"CCCCCCCCCC(=O)Cl": "1.0 mL", "NCc1ccccc1": "5 mmol"})
    acyl = row(r, "CCCCCCCCCC(=O)Cl")
    assert "density estimated, ±4 %: weigh it or give the density" in acyl.read_as
    assert r.by_rule("density-estimated")
    assert "estimated" in r.to_text()


def test_properties_by_name_and_its_payload():
    p = chemcheck.properties("dichloromethane")
    assert isinstance(p, Properties) and p.phase == "l"
    assert p.boiling_point.value == pytest.approx(39.6, abs=0.5)  # CRC, from memory
    d = p.to_dict()
    json.dumps(d, allow_nan=False)
    for k in ("density_20", "density_25", "cp_liquid", "boiling_point", "melting_point"):
        assert d[k]["source"] and d[k]["uncertainty"] is not None
    with pytest.raises(chemcheck.ParseError):
        chemcheck.properties("not a chemical at all")


def test_database_density_names_its_fitted_method():
    # 1-octanol is not curated: DIPPR-105 of Perry's 8th ed.; 0.822 g/mL at 25 °C (CRC, from memory)
    p = chemcheck.properties("CCCCCCCCO")
    assert not p.curated and p.density_25.measured
    assert p.density_25.method == "DIPPR-105 (Perry 8th ed.)"
    assert p.density_25.value == pytest.approx(0.822, rel=0.01)


def test_the_property_database_is_not_loaded_for_curated_liquids():
    code = (
        "import sys, chemcheck\n"
        "r = chemcheck.check('NCc1ccccc1.CC(=O)Cl>CCN(CC)CC.ClCCl>CC(=O)NCc1ccccc1',"
        " {'NCc1ccccc1': '1.07 g', 'CC(=O)Cl': '0.78 mL', 'CCN(CC)CC': '2.09 mL', 'ClCCl': '20 mL'})\n"
        "assert r.stoichiometry.rows[1].mmol\n"
        "print(sorted(m for m in ('chemicals.identifiers', 'chemicals.volume', 'thermo', 'pint') if m in sys.modules))\n"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, cwd=ROOT, timeout=120,
                         env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert out.returncode == 0, out.stderr
    assert out.stdout.strip() == "[]"


# ---- hydrates ---------------------------------------------------------------------------


def test_a_hydrate_keyed_like_a_salt_is_read_as_the_hydrate():
    # piperazine hexahydrate C4H10N2.6H2O = 86.138 + 6 x 18.015 = 194.23 g/mol (IUPAC weights):
    # 1.94 g = 9.988 mmol, with 59.93 mmol of water
    r = chemcheck.check("C1CNCCN1.O=Cc1ccccc1>>c1ccc(CN2CCNCC2)cc1",
                        {"C1CNCCN1.O.O.O.O.O.O": "1.94 g", "O=Cc1ccccc1": "1.0 equiv"})
    pip = row(r, "C1CNCCN1.O.O.O.O.O.O")
    assert pip.mmol == pytest.approx(1940 / 194.23, rel=2e-3)
    assert pip.water_mmol == pytest.approx(6 * 1940 / 194.23, rel=2e-3)
    [note] = r.by_rule("weighed-as-hydrate")
    assert "hydrate" in note.message and not r.by_rule("weighed-as-salt")
    assert not r.by_rule("hydrate-water-meets-moisture-sensitive-reagent")


def test_water_of_hydration_counts_against_an_acid_chloride():
    r = chemcheck.check("C1CNCCN1.CC(=O)Cl>CCN(CC)CC>CC(=O)N1CCN(C(C)=O)CC1",
                        {"C1CNCCN1.O.O.O.O.O.O": "1.94 g", "CC(=O)Cl": "22 mmol"})
    [f] = r.by_rule("hydrate-water-meets-moisture-sensitive-reagent")
    assert "59.9 mmol of water" in f.message and "2.7 equiv" in f.message


# ---- scale-up -----------------------------------------------------------------------------

ACYLATION = "NCc1ccccc1.CC(=O)Cl>CCN(CC)CC.ClCCl>CC(=O)NCc1ccccc1"


def test_the_scaled_report_keeps_its_input_and_validates():
    r = chemcheck.check(ACYLATION, {"NCc1ccccc1": "1.07 g", "CC(=O)Cl": "0.78 mL", "CCN(CC)CC": "2.09 mL", "ClCCl": "20 mL"})
    big = scale(r, 10, vessel_ml=500)
    d = big.to_dict()
    assert d["input"]["reaction"] == ACYLATION
    assert d["input"]["amounts"]["NCc1ccccc1"] == "10.7 g"
    assert d["input"]["scale"]["factor"] == 10
    jsonschema.Draft202012Validator(schema()).validate(d)
    json.dumps(d, allow_nan=False)
    # the verdict line comes first; the reaction is named on the lines under it
    assert any(line.endswith(ACYLATION) for line in big.to_text().splitlines()[:3])


def test_scaled_amounts_are_in_litres_and_kilograms():
    r = chemcheck.check(ACYLATION, {"NCc1ccccc1": "1.07 g", "CC(=O)Cl": "10 mmol", "ClCCl": "20 mL"})
    big = scale(r, 1000)
    assert big.amounts == {"NCc1ccccc1": "1.07 kg", "CC(=O)Cl": "10 mol", "ClCCl": "20 L"}
    assert "e+" not in " ".join(row(big, t).read_as for t in ("NCc1ccccc1", "CC(=O)Cl", "ClCCl"))
    assert "kg" in row(big, "NCc1ccccc1").read_as and "mol" in row(big, "CC(=O)Cl").read_as
    assert "e+0" not in big.to_text() and ("in 20 L" in big.to_text() or "in 20.0 L" in big.to_text())


def test_vessel_fill_counts_every_charge():
    # 20 mL DCM measured; acetyl chloride 11 mmol = 0.8634 g / 1.104 g/mL = 0.782 mL (curated
    # density); triethylamine 15 mmol = 1.518 g / 0.726 = 2.091 mL; benzylamine 1.07 g / 0.981 =
    # 1.091 mL; N-(4-chlorophenyl)... no: a solid, 2-naphthol 1.44 g at an assumed 1.3 g/mL = 1.108 mL
    r = chemcheck.check(
        "NCc1ccccc1.CC(=O)Cl.Oc1ccc2ccccc2c1>CCN(CC)CC.ClCCl>CC(=O)NCc1ccccc1",
        {"NCc1ccccc1": "1.07 g", "CC(=O)Cl": "11 mmol", "CCN(CC)CC": "15 mmol", "ClCCl": "20 mL",
         "Oc1ccc2ccccc2c1": "1.44 g"},
    )
    big = scale(r, 40, vessel_ml=2000)
    expected = 40 * (20 + 0.782 + 2.091 + 1.091 + 1.44 / 1.3)
    assert big.scale_info.fill_fraction == pytest.approx(expected / 2000, abs=0.003)
    text = " ".join(big.scale_info.cautions)
    assert "assumed 1.3 g/mL" in text and "from their density" in text


def test_thermal_screen_uses_the_handbook_heat_capacity_of_dcm():
    # 10 mmol acylation in 20 mL DCM (26.5 g): cp of the batch close to DCM's 1.19 J/(g K)
    r = chemcheck.check(ACYLATION, {"NCc1ccccc1": "1.07 g", "CC(=O)Cl": "0.78 mL", "CCN(CC)CC": "2.09 mL", "ClCCl": "20 mL"})
    t = scale(r, 1, dh_kj_mol=-150.0).scale_info.thermal
    assert 1.1 < t["cp_j_gk"] < 1.4
    assert t["solvent_bp_c"] == pytest.approx(39.6, abs=0.5)


# ---- hostile and careless amounts (#24) ---------------------------------------------------


@pytest.mark.parametrize("amounts", [{1: "1 mmol"}, {"CCN": 1}, {"CCN": None}, {None: "1 g"}, {"": "1 g"}])
def test_bad_keys_and_values_are_amount_errors(amounts):
    with pytest.raises(AmountError):
        chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O", amounts)


@pytest.mark.parametrize("text,grams", [("5 µg", 5e-6), ("5 μg", 5e-6), ("5 ug", 5e-6)])
def test_micro_sign_and_greek_mu_for_mass(text, grams):
    from chemcheck.amounts import parse_amount

    assert parse_amount(text).value == pytest.approx(grams)


@pytest.mark.parametrize("text,value", [("20 µL", 0.02), ("20 μL", 0.02), ("3 µmol", 0.003), ("3 μmol", 0.003)])
def test_micro_sign_and_greek_mu_for_volume_and_moles(text, value):
    from chemcheck.amounts import parse_amount

    assert parse_amount(text).value == pytest.approx(value)


@pytest.mark.parametrize("text", ["١٠ mmol", "１ g", "2.٥ mL", "²3 g"])
def test_non_ascii_digits_are_refused(text):
    from chemcheck.amounts import parse_amount

    with pytest.raises(AmountError, match="ASCII digit"):
        parse_amount(text)


@pytest.mark.parametrize("text", ["1e-300 g", "1e-15 mL", "1e-20 mmol", "1e-13 g", "1 g, 1e-9 %", "1 mL, 1e-30 M", "1 mL, 1e-300 g/mL"])
def test_amounts_below_a_physical_minimum_are_refused(text):
    from chemcheck.amounts import parse_amount

    with pytest.raises(AmountError):
        parse_amount(text)


def test_no_infinity_or_nan_reaches_json():
    r = chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O", {"CCN": "0.000000001 mg", "CC(=O)Cl": "1e6 equiv"})
    text = r.to_json(allow_nan=False)
    assert "Infinity" not in text and "NaN" not in text


def test_dummy_atoms_never_divide_by_zero():
    with pytest.raises(AmountError, match="dummy atom"):
        chemcheck.check("CCN.*>>", {"*": "1 g"})
    r = chemcheck.check("CCN.*>>", {"*": "1 mmol", "CCN": "1 mmol"})
    json.dumps(r.to_dict(), allow_nan=False)


def test_duplicate_keys_on_the_command_line_name_both():
    from chemcheck.cli import _amounts

    with pytest.raises(AmountError, match="'1 g' and '2 g'"):
        _amounts(["CCN=1 g", "CCN=2 g"])
    out = subprocess.run([sys.executable, "-m", "chemcheck", "check", "CCN.CC(=O)Cl>>CCNC(C)=O",
                          "-a", "CCN=1 mmol", "-a", "CCN=2 mmol"], capture_output=True, text=True, cwd=ROOT,
                         timeout=120, env={"PYTHONPATH": str(ROOT), "PATH": "/usr/bin:/bin"})
    assert out.returncode == 2 and "'1 mmol' and '2 mmol'" in out.stderr and "Traceback" not in out.stderr


def test_duplicate_keys_in_the_magic_name_both():
    from chemcheck.magic import parse_cell

    with pytest.raises(AmountError, match="'1 mmol' and '1.2 mmol'"):
        parse_cell("CCN.CC(=O)Cl>>CCNC(C)=O\nCCN = 1 mmol\nCCN = 1.2 mmol\n")


def test_two_keys_for_one_component_name_both():
    with pytest.raises(AmountError, match="two amounts"):
        chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O", {"CCN": "1 mmol", " CCN ": "2 mmol"})


def test_database_names_only_when_exact():
    from chemcheck.reading.names import lookup_name

    assert lookup_name("dna") is None  # the database lists 'dna' for a naphthoic acid
    hit = lookup_name("cyclopentylamine")
    assert hit is not None and hit.source == "chemicals database" and Chem.MolToSmiles(
        Chem.MolFromSmiles(hit.smiles)) == "NC1CCCC1"
    with pytest.raises(chemcheck.ParseError):
        chemcheck.check("dna.CC(=O)Cl>>")


def test_values_are_finite():
    for inchikey in list(curated_table())[:40]:
        p = properties_for_inchikey(inchikey)
        for v in (p.density_20, p.density_25, p.cp_liquid):
            assert v is None or math.isfinite(v.value)


def test_review_checks_a_scaled_report_again_with_its_scale(tmp_path):
    import nbformat

    from chemcheck.report import MIME_TYPE
    from chemcheck.review import review_notebook

    r = chemcheck.check(ACYLATION, {"NCc1ccccc1": "1.07 g", "CC(=O)Cl": "0.78 mL", "CCN(CC)CC": "2.09 mL", "ClCCl": "20 mL"})
    big = scale(r, 40, vessel_ml=1000)
    assert big.by_rule("vessel-overfilled")
    nb = nbformat.v4.new_notebook()
    cell = nbformat.v4.new_code_cell("chemcheck.scale(r, 40, vessel_ml=1000)")
    cell.outputs = [nbformat.v4.new_output("display_data", data={MIME_TYPE: big.to_dict()})]
    nb.cells.append(cell)
    path = tmp_path / "scaled.ipynb"
    nbformat.write(nb, str(path))
    [rr] = review_notebook(path).reports
    assert rr.recheck_error is None and rr.current is not None
    assert rr.new == [] and rr.gone == [], ([f["rule"] for f in rr.new], [f["rule"] for f in rr.gone])


def test_a_curated_liquid_given_in_equivalents_shows_the_volume_to_measure():
    # 1.1 equiv of acetyl chloride against 10 mmol: 11 mmol x 78.49 g/mol = 0.8634 g;
    # / 1.104 g/mL (label, from memory) = 0.7821 mL
    r = chemcheck.check(ACYLATION, {"NCc1ccccc1": "10 mmol", "CC(=O)Cl": "1.1 equiv"})
    assert "= 0.7821 mL at 1.104 g/mL" in row(r, "CC(=O)Cl").read_as
    # a solid given in mmol gets no volume
    r = chemcheck.check("Oc1ccc2ccccc2c1.CC(=O)Cl>>CC(=O)Oc1ccc2ccccc2c1", {"Oc1ccc2ccccc2c1": "10 mmol"})
    assert "mL" not in row(r, "Oc1ccc2ccccc2c1").read_as
