"""Stoichiometry: hand-computed worked examples.

Molar masses from IUPAC standard atomic weights (conventional values: H 1.008, C 12.011,
N 14.007, O 15.999, S 32.06, Cl 35.45): the arithmetic is in the comments. Results to 0.5 %.
Physical data: CRC Handbook values written from memory and marked so.
"""

import pytest

import chemcheck
from chemcheck import AmountError
from chemcheck.amounts import parse_amount
from chemcheck.physprops import props_for
from chemcheck.scale import CAUTION, scale

REL = 5e-3

ACYLATION = "NCc1ccccc1.CC(=O)Cl>CCN(CC)CC.ClCCl>CC(=O)NCc1ccccc1"
ACYLATION_AMOUNTS = {
    "NCc1ccccc1": "1.07 g",  # benzylamine C7H9N = 7(12.011)+9(1.008)+14.007 = 107.156
    "CC(=O)Cl": "0.78 mL, 1.104 g/mL",  # acetyl chloride C2H3ClO = 78.494
    "CCN(CC)CC": "2.09 mL, 0.726 g/mL",  # triethylamine C6H15N = 101.193
    "ClCCl": "20 mL, 1.326 g/mL",
    "CC(=O)NCc1ccccc1": "1.20 g",  # N-benzylacetamide C9H11NO = 149.193
}


def row(report, text):
    return next(r for r in report.stoichiometry.rows if r.component.text == text)


def test_acylation_worked_example():
    r = chemcheck.check(ACYLATION, ACYLATION_AMOUNTS)
    amine = row(r, "NCc1ccccc1")
    # 1.07 g / 107.156 g/mol = 9.9855 mmol
    assert amine.mmol == pytest.approx(9.9855, rel=REL)
    acyl = row(r, "CC(=O)Cl")
    # 0.78 mL x 1.104 g/mL = 0.86112 g; / 78.494 = 10.970 mmol; / 9.9855 = 1.0986 equiv
    assert acyl.mmol == pytest.approx(10.970, rel=REL)
    assert acyl.equiv == pytest.approx(1.0986, rel=REL)
    base = row(r, "CCN(CC)CC")
    # 2.09 x 0.726 = 1.51734 g; / 101.193 = 14.995 mmol = 1.5017 equiv
    assert base.mmol == pytest.approx(14.995, rel=REL)
    assert base.equiv == pytest.approx(1.5017, rel=REL)
    product = row(r, "CC(=O)NCc1ccccc1")
    # theoretical 9.9855 mmol x 149.193 = 1.48977 g; yield 1.20 / 1.48977 = 80.55 %
    assert product.theoretical_g == pytest.approx(1.48977, rel=REL)
    assert product.yield_pct == pytest.approx(80.55, rel=REL)
    st = r.stoichiometry
    assert st.limiting.component.text == "NCc1ccccc1"
    # total liquid volume 0.78 + 2.09 + 20 = 22.87 mL; 9.9855 mmol / 22.87 mL = 0.43662 M
    assert st.concentration_m == pytest.approx(0.43662, rel=REL)
    # atom economy: 149.193 / (107.156 + 78.494) = 80.36 %
    assert st.atom_economy_pct == pytest.approx(80.36, rel=REL)
    # PMI: inputs 1.07 + 0.86112 + 1.51734 + 26.52 = 29.9685 g / 1.20 g = 24.97
    assert st.pmi == pytest.approx(24.97, rel=REL)
    assert st.e_factor == pytest.approx(23.97, rel=REL)


def test_table_is_a_dataframe_indexed_by_component_text():
    r = chemcheck.check(ACYLATION, ACYLATION_AMOUNTS)
    df = r.table
    assert list(df.index) == [c.text for c in r.components]
    for col in ("role", "formula", "mw", "mass_g", "volume_ml", "density_g_ml", "purity", "mmol", "equiv", "theoretical_g", "yield_pct"):
        assert col in df.columns
    assert df.loc["ClCCl", "equiv"] is None or df.loc["ClCCl", "equiv"] != df.loc["ClCCl", "equiv"]  # no equiv for the solvent


def test_hydrochloride_salt_is_one_formula_unit():
    # benzylamine hydrochloride C7H10ClN = 107.156 + 36.458 = 143.614; 1.44 g -> 10.027 mmol
    r = chemcheck.check("Cl.NCc1ccccc1.CC(=O)Cl>>CC(=O)NCc1ccccc1", {"Cl.NCc1ccccc1": "1.44 g"})
    assert row(r, "Cl.NCc1ccccc1").mmol == pytest.approx(10.027, rel=REL)


def test_molar_solution():
    # 2.75 mL of 4.0 M HCl in dioxane = 11.0 mmol
    r = chemcheck.check("CCCCN.HCl in dioxane>>CCCC[NH3+].[Cl-]", {"HCl in dioxane": "2.75 mL, 4.0 M"})
    assert row(r, "HCl in dioxane").mmol == pytest.approx(11.0, rel=REL)


def test_mass_fraction_solution_with_density():
    # methylamine CH5N = 31.058; 10 mL x 0.90 g/mL = 9.0 g of 40 wt% = 3.6 g = 115.91 mmol
    r = chemcheck.check("CN.CC(=O)Cl>>CNC(C)=O", {"CN": "10 mL, 40 wt%, 0.90 g/mL"})
    assert row(r, "CN").mmol == pytest.approx(115.91, rel=REL)
    r = chemcheck.check("CN.CC(=O)Cl>>CNC(C)=O", {"CN": "9.0 g, 40 wt%"})
    assert row(r, "CN").mmol == pytest.approx(115.91, rel=REL)


def test_purity():
    # tosyl chloride C7H7ClO2S = 84.077 + 7.056 + 35.45 + 31.998 + 32.06 = 190.641
    # 2.00 g x 0.95 = 1.90 g -> 9.9664 mmol
    r = chemcheck.check("Cc1ccc(cc1)S(Cl)(=O)=O.CCN", {"Cc1ccc(cc1)S(Cl)(=O)=O": "2.00 g, 95%"})
    assert row(r, "Cc1ccc(cc1)S(Cl)(=O)=O").mmol == pytest.approx(9.9664, rel=REL)


def test_equivalents_relative_to_the_stated_reference():
    r = chemcheck.check("CCCCN.CC(=O)Cl>>CCCCNC(C)=O", {"CCCCN": "5.0 mmol, 1.0 equiv", "CC(=O)Cl": "1.2 equiv"})
    assert row(r, "CC(=O)Cl").mmol == pytest.approx(6.0, rel=REL)
    assert r.stoichiometry.reference.component.text == "CCCCN"


def test_a_bare_one_equivalent_of_base_is_relative_to_the_limiting_reactant():
    # common practice: "1.0 equiv Et3N" next to a weighed amine means as many moles as the
    # amine. Benzylamine hydrochloride C7H10ClN = 107.156 + 36.458 = 143.614 g/mol:
    # 1.44 g / 143.614 = 10.03 mmol, so 1.0 equiv Et3N = 10.03 mmol and 1.1 equiv AcCl = 11.03
    rep = chemcheck.check(
        "Cl.NCc1ccccc1.CC(=O)Cl>CCN(CC)CC.ClCCl>CC(=O)NCc1ccccc1",
        amounts={"Cl.NCc1ccccc1": "1.44 g", "CC(=O)Cl": "1.1 equiv", "CCN(CC)CC": "1.0 equiv"},
    )
    assert row(rep, "CCN(CC)CC").mmol == pytest.approx(10.03, rel=REL)
    assert row(rep, "CC(=O)Cl").mmol == pytest.approx(11.03, rel=REL)
    assert rep.stoichiometry.limiting.component.text == "Cl.NCc1ccccc1"
    # one equivalent of base frees the salt but leaves none for the HCl the acylation releases
    finding = next(f for f in rep.findings if f.rule == "amine-salt-not-freed")
    assert "1 equiv present" in finding.message


def test_amount_mismatch_names_the_salt():
    # the salt weighed as 1.07 g is 1.07/143.614 = 7.4505 mmol = 0.745 equiv, not 1.0;
    # with the free base's molar mass (107.156) the same mass would be 9.9855 mmol = 0.9986 equiv
    r = chemcheck.check(
        "CC(=O)Cl.Cl.NCc1ccccc1>>CC(=O)NCc1ccccc1",
        {"CC(=O)Cl": "10.0 mmol, 1.0 equiv", "Cl.NCc1ccccc1": "1.07 g, 1.0 equiv"},
    )
    [f] = r.by_rule("amount-mismatch")
    assert f.severity == "warning"
    assert "0.75 equiv" in f.message and "1 equiv stated" in f.message
    assert "free base" in f.fix


def test_no_mismatch_within_five_percent():
    r = chemcheck.check(
        "CCCCN.CC(=O)Cl>>CCCCNC(C)=O",
        {"CCCCN": "10.0 mmol, 1.0 equiv", "CC(=O)Cl": "0.82 g, 1.05 equiv"},  # 10.45 mmol = 1.045 equiv
    )
    assert r.by_rule("amount-mismatch") == []


def test_density_from_the_curated_table_the_database_and_when_unknown():
    r = chemcheck.check("CCCCN.CC(=O)Cl>>CCCCNC(C)=O", {"CC(=O)Cl": "0.78 mL"})
    acyl = row(r, "CC(=O)Cl")
    assert acyl.density_source == "curated table, 25 °C" and acyl.mmol is not None
    # 1-octanol is not in the curated table: the DIPPR-105 fit of Perry's Handbook answers
    r = chemcheck.check("CCCCN.CCCCCCCCO", {"CCCCCCCCO": "1.0 mL"})
    octanol = row(r, "CCCCCCCCO")
    assert octanol.density_source == "DIPPR-105 (Perry 8th ed.), 25 °C"
    assert "estimated" not in octanol.read_as
    # a compound the database does not know (a made-up ester of our own)
    odd = "CCCCCCCCCCCCC(=O)OCC1CCC(CC1)C(C)(C)C"
    r = chemcheck.check(f"CCCCN.{odd}", {odd: "2.0 mL"})
    [f] = r.by_rule("density-unknown")
    assert "density" in f.fix


def test_volume_of_a_solid_is_refused():
    with pytest.raises(AmountError, match="solid at 25 °C"):
        chemcheck.check("CC(=O)Nc1ccccc1.CCN", {"CC(=O)Nc1ccccc1": "2 mL"})


@pytest.mark.parametrize(
    "text,fragment",
    [
        ("-1 g", "positive"), ("0 mmol", "positive"), ("1.2.3 g", "not a number"), ("5 gm", "unknown unit"),
        ("3 ml", "did you mean mL"), ("2 mm", "millimolar"), ("", "empty"), ("1 g, 4 M", "goes with a volume"),
        ("abc", "start with a number"), ("1 g, 150%", "between 0 and 100"), ("1 g,,", "empty qualifier"),
        ("1.5 equiv, 95%", "equivalents take no"), ("10 mL, 40 wt%, 99 g/mL", "not plausible"),
    ],
)
def test_bad_amounts(text, fragment):
    with pytest.raises(AmountError, match=fragment) as info:
        parse_amount(text, key="CCN")
    assert "'CCN'" in str(info.value)


def test_unknown_amount_key_names_the_components():
    with pytest.raises(AmountError, match="no component is written 'CCO'"):
        chemcheck.check("CCN.CC(=O)Cl", {"CCO": "1 g"})


def test_units_are_case_sensitive_and_go_through_pint():
    assert parse_amount("250 µL").value == pytest.approx(0.25)
    assert parse_amount("2 mL, 500 mM").molarity == pytest.approx(0.5)
    assert str(parse_amount("1.5 kg").quantity.units) == "gram"


@pytest.mark.parametrize(
    "smiles,density,bp",
    [
        # CRC Handbook (from memory); densities at 20-25 °C, so 2 % tolerance
        ("O", 0.997, 100.0),
        ("ClCCl", 1.326, 39.6),
        ("C1CCOC1", 0.889, 66.0),
        ("CCN(CC)CC", 0.726, 89.5),
        ("Cc1ccccc1", 0.867, 110.6),
        ("CC#N", 0.786, 81.6),
        ("CN(C)C=O", 0.944, 153.0),
        ("CO", 0.791, 64.7),
        ("c1ccncc1", 0.982, 115.2),
        ("CCOC(C)=O", 0.900, 77.1),
    ],
)
def test_solvent_data_against_handbook(smiles, density, bp):
    from rdkit import Chem

    p = props_for(Chem.MolToInchiKey(Chem.MolFromSmiles(smiles)))
    assert p.density_g_ml == pytest.approx(density, rel=0.02)
    assert p.tb_c == pytest.approx(bp, abs=1.5)


def test_scale_up_keeps_equivalents_and_warns():
    r = chemcheck.check(ACYLATION, ACYLATION_AMOUNTS)
    big = scale(r, 50, vessel_ml=1000)
    assert big.amounts["NCc1ccccc1"] == "53.5 g"
    assert big.amounts["CC(=O)Cl"].startswith("39 mL")
    assert row(big, "CC(=O)Cl").equiv == pytest.approx(row(r, "CC(=O)Cl").equiv, rel=1e-6)
    ids = {f.rule for f in big.findings}
    assert "vessel-overfilled" in ids  # (0.78+2.09+20) x 50 = 1143.5 mL in a 1000 mL vessel
    assert CAUTION in big.extra["scale"]["cautions"]


def test_adiabatic_rise_hand_calculation():
    # 10 mmol butylamine neutralised by 10 mmol HCl in 100 g water, dH = -55 kJ/mol (given):
    # q = 55 000 J/mol x 0.010 mol = 550 J; m = 100 + 0.731 + 0.365 = 101.10 g;
    # cp about 4.15 J/(g K) (water 4.18, CRC, from memory) -> dT_ad = 550 / (101.10 x 4.15) = 1.31 K
    r = chemcheck.check("CCCCN.Cl>O>CCCC[NH3+].[Cl-]", {"CCCCN": "10 mmol", "Cl": "10 mmol", "O": "100 g"})
    big = scale(r, 1.0, dh_kj_mol=-55.0)
    t = big.extra["scale"]["thermal"]
    assert t["dT_ad_K"] == pytest.approx(1.31, abs=0.1)
    assert t["reaches_boiling"] == "no" and big.scale_info.thermal["reaches_boiling"] is False


def test_scale_needs_amounts_and_one_target():
    r = chemcheck.check(ACYLATION)
    with pytest.raises(chemcheck.ChemcheckError, match="needs amounts"):
        scale(r, 2)
    r = chemcheck.check(ACYLATION, ACYLATION_AMOUNTS)
    with pytest.raises(chemcheck.ChemcheckError, match="exactly one"):
        scale(r, 2, target_mmol=5)
    assert scale(r, target_mmol=20.0).stoichiometry.limiting.mmol == pytest.approx(20.0, rel=REL)


def test_an_amount_keyed_by_the_salt_of_a_drawn_free_base_reads_the_salt():
    # the chemist drew benzylamine but weighed its hydrochloride: 1.44 g of C7H10ClN
    # (143.62 g/mol, IUPAC standard atomic weights) is 10.03 mmol, not the 13.4 mmol that the
    # free base's 107.15 g/mol would give; and the salt needs a base to free the amine
    report = chemcheck.check(
        "NCc1ccccc1.O=Cc1ccccc1>>C(=NCc1ccccc1)c1ccccc1",
        amounts={"Cl.NCc1ccccc1": "1.44 g", "O=Cc1ccccc1": "1.0 equiv"},
    )
    row = report.stoichiometry.rows[0]
    assert row.component.text == "Cl.NCc1ccccc1"
    assert abs(row.mmol - 1440 / 143.62) < 0.01
    [note] = report.by_rule("weighed-as-salt")
    assert "Cl.NCc1ccccc1" in note.message and "NCc1ccccc1" in note.message
    assert report.by_rule("amine-salt-not-freed")


def test_an_amount_keyed_by_an_unrelated_mixture_is_still_an_error():
    with pytest.raises(AmountError):
        chemcheck.check("NCc1ccccc1.O=Cc1ccccc1>>C(=NCc1ccccc1)c1ccccc1", amounts={"CCO.NCc1ccccc1": "1.44 g"})
