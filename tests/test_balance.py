"""Equation balance and the unbalanced-equation rule.

The by-products are those of the textbook equations (common practice): an acylation with an
acid chloride releases HCl, with an anhydride a carboxylic acid; a Boc protection with Boc2O
releases CO2 and tert-butanol; an imine condensation releases water; an exhaustive methylation
with methyl iodide releases HI per methyl group.
"""

import pytest

import chemcheck
from chemcheck.balance import balance
from chemcheck.reading.reaction import parse_reaction


def missing(text):
    b = balance(parse_reaction(text))
    return b, sorted((m.name, m.count, m.side) for m in b.missing)


@pytest.mark.parametrize(
    "reaction,expected",
    [
        ("CCCCN.CC(=O)Cl>>CCCCNC(C)=O", [("HCl", 1, "product")]),
        ("CCCCN.CC(=O)OC(C)=O>>CCCCNC(C)=O", [("acetic acid", 1, "product")]),
        ("CCCCN.CC(C)(C)OC(=O)OC(=O)OC(C)(C)C>>CCCCNC(=O)OC(C)(C)C", [("CO2", 1, "product"), ("tert-butanol", 1, "product")]),
        ("CCCCN.O=Cc1ccccc1>>CCCCN=Cc1ccccc1", [("H2O", 1, "product")]),
        ("CCCCN.Cc1ccc(cc1)S(Cl)(=O)=O>>CCCCNS(=O)(=O)c1ccc(C)cc1", [("HCl", 1, "product")]),
        ("CC(=O)Cl>>CC(=O)O", [("H2O", 1, "reactant"), ("HCl", 1, "product")]),
        # an SN2 by cyanide drawn without its counter-ion releases bromide; a trimethylsilyl
        # ether hydrolysed gives the alcohol and trimethylsilanol (common practice)
        ("CCCCBr.[C-]#N>>CCCCC#N", [("bromide", 1, "product")]),
        ("C[Si](C)(C)OCCCC>>OCCCC", [("H2O", 1, "reactant"), ("trimethylsilanol", 1, "product")]),
        # an acetanilide hydrolysed in aqueous acid: the aniline and acetic acid, the OH of the
        # acid from the water (common practice)
        ("CC(=O)Nc1ccccc1>O.Cl>Nc1ccccc1", [("H2O", 1, "reactant"), ("acetic acid", 1, "product")]),
        ("CC(=O)Nc1ccccc1.O>Cl>Nc1ccccc1", [("acetic acid", 1, "product")]),
        # Michaelis-Arbuzov: triethyl phosphite and benzyl bromide give the phosphonate and ethyl
        # bromide (A. K. Bhattacharya, G. Thyagarajan, Chem. Rev. 1981, 81, 415; from memory)
        ("CCOP(OCC)OCC.BrCc1ccccc1>>CCOP(=O)(Cc1ccccc1)OCC", [("ethyl bromide", 1, "product")]),
        # an N-oxidation with mCPBA leaves 3-chlorobenzoic acid; a Corey-Chaykovsky epoxidation
        # with trimethylsulfoxonium leaves DMSO, its proton taken by the base (E. J. Corey,
        # M. Chaykovsky, J. Am. Chem. Soc. 1965, 87, 1353; from memory)
        ("CN1CCCCC1.O=C(OO)c1cccc(Cl)c1>ClCCl>C[N+]1([O-])CCCCC1", [("3-chlorobenzoic acid", 1, "product")]),
        (
            "C[S+](C)(C)=O.O=C1CCCCC1>CS(C)=O.[H-].[Na+]>C1CCC2(CC1)CO2",
            [("DMSO (and the proton the base takes)", 1, "product")],
        ),
    ],
)
def test_missing_by_products_are_named(reaction, expected):
    b, got = missing(reaction)
    assert b.balanced and not b.drawn_balanced
    assert got == expected


def test_coefficients_close_an_exhaustive_methylation():
    # benzylamine + 2 MeI -> N,N-dimethylbenzylamine + 2 HI
    b, got = missing("NCc1ccccc1.CI>>CN(C)Cc1ccccc1")
    assert b.coefficients == {0: 1, 1: 2, 2: 1}
    assert got == [("HI", 2, "product")]


def test_two_equivalents_of_amine_balance_with_the_salt_drawn():
    b, got = missing("CCN.CC(=O)Cl>>CCNC(C)=O.CC[NH3+].[Cl-]")
    assert b.balanced and got == []
    assert b.coefficients[0] == 2


def test_balanced_as_drawn_is_silent():
    report = chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O.Cl")
    assert report.by_rule("unbalanced-equation") == []
    assert report.balance.drawn_balanced


def test_no_products_nothing_to_balance():
    report = chemcheck.check("CCN.CC(=O)Cl>Et3N>")
    assert report.by_rule("unbalanced-equation") == []
    assert report.balance.checked is False


def test_rule_names_hcl():
    report = chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O")
    [f] = report.by_rule("unbalanced-equation")
    assert f.severity == "info"
    assert f.message.startswith("HCl is not drawn")
    assert "add HCl to the products" in f.fix


def test_unexplained_difference_gives_the_elements():
    report = chemcheck.check("CCCCN.CC(=O)Cl>>c1ccccc1")
    [f] = report.by_rule("unbalanced-equation")
    assert "does not balance" in f.message
    assert "N +1" in f.message and "Cl +1" in f.message


def test_agents_do_not_count_in_the_balance():
    report = chemcheck.check("CCN.CC(=O)Cl>CCN(CC)CC.ClCCl>CCNC(C)=O")
    [f] = report.by_rule("unbalanced-equation")
    assert f.message.startswith("HCl is not drawn")


@pytest.mark.parametrize(
    "reaction,expected",
    [
        # aminolysis of a methyl ester releases methanol (common practice)
        ("NCc1ccccc1.COC(=O)c1ccccc1>>O=C(NCc1ccccc1)c1ccccc1", [("methanol", 1, "product")]),
        # acidic removal of a Boc group: CO2 and isobutylene (Greene's Protective Groups, 5th ed.)
        ("CC(C)(C)OC(=O)NCCc1ccccc1>>NCCc1ccccc1", [("CO2", 1, "product"), ("isobutylene", 1, "product")]),
        # methanolysis of an acid chloride: the methanol ends up in the ester (common practice)
        ("CC(=O)Cl>>CC(=O)OC", [("HCl", 1, "product"), ("methanol", 1, "reactant")]),
    ],
)
def test_organic_by_products_come_from_the_other_side(reaction, expected):
    b, got = missing(reaction)
    assert b.balanced
    assert got == expected


def test_a_product_one_carbon_short_is_not_balanced_with_invented_methanol():
    # benzylamine + benzaldehyde drawn as the N-phenyl imine: a CH2 has gone missing, and no
    # reactant holds a C-O single bond that could leave as methanol
    b, got = missing("NCc1ccccc1.O=Cc1ccccc1>>C(=Nc1ccccc1)c1ccccc1")
    assert not b.balanced and got == []
    assert b.residual == {"C": 1, "H": 4, "O": 1}
    report = chemcheck.check("NCc1ccccc1.O=Cc1ccccc1>>C(=Nc1ccccc1)c1ccccc1")
    [f] = report.by_rule("unbalanced-equation")
    assert "does not balance" in f.message and "methanol" not in f.message


def test_hydrogen_and_carbon_monoxide_need_a_source():
    # an aldehyde has no hydride and no oxalyl or formyl-X unit: "CO and 2 H2" is not offered
    b, got = missing("NCc1ccccc1.O=Cc1ccccc1>>NCc1ccccc1")
    assert all(name not in ("H2", "CO") for name, _, _ in got)
    # sodium hydride deprotonating an amine does release H2
    b, got = missing("CCN.[Na+].[H-]>>CC[NH-].[Na+]")
    assert got == [("H2", 1, "product")]


def test_a_base_among_the_reactants_leaves_as_its_salt():
    # Et3N written as a reactant takes up the HCl of the sulfonylation (common practice)
    b, got = missing("CCN(CC)CC.Cc1ccc(S(=O)(=O)Cl)cc1.NCCc1ccccc1>>Cc1ccc(cc1)S(=O)(=O)NCCc1ccccc1")
    assert b.balanced
    assert got == [("the HCl salt of triethylamine (1)", 1, "product")]
    assert b.missing[0].formula == "C6H15N·HCl"


def test_a_reduction_needs_hydrogen_and_releases_water():
    # reductive amination: ketone + amine + H2 -> amine + H2O; nitro to amine: ArNO2 + 3 H2 ->
    # ArNH2 + 2 H2O (textbook equations, common practice)
    b, got = missing("Nc1ccccc1.O=C1CCCCC1>[Na+].[BH3-]C#N>C1CCC(Nc2ccccc2)CC1")
    assert got == [("H2", 1, "reactant"), ("H2O", 1, "product")]
    b, got = missing("O=[N+]([O-])c1ccc(C)cc1>[Pd]>Nc1ccc(C)cc1")
    assert got == [("H2", 3, "reactant"), ("H2O", 2, "product")]
    report = chemcheck.check("Nc1ccccc1.O=C1CCCCC1>>C1CCC(Nc2ccccc2)CC1")
    [f] = report.by_rule("unbalanced-equation")
    assert "H2 (or its equivalent from a reductant) is needed on the reactant side" in f.message
    # with the reductant written among the agents the note names only the water left out
    report = chemcheck.check("Nc1ccccc1.O=C1CCCCC1>[Na+].[BH3-]C#N>C1CCC(Nc2ccccc2)CC1")
    [f] = report.by_rule("unbalanced-equation")
    assert "H2 " not in f.message and "H2O is not drawn among the products" in f.message
    # and a hydrogenation over Pd with H2 written and nothing left out gives no note at all
    report = chemcheck.check("COC(=O)/C=C/c1ccccc1>[H][H].[Pd].CO>COC(=O)CCc1ccccc1")
    assert not report.by_rule("unbalanced-equation")


def test_an_exhaustive_methylation_to_the_quaternary_salt_takes_three_methyl_iodide():
    # RNH2 + 3 MeI -> RNMe3+ I- + 2 HI (the first step of a Hofmann elimination, textbook
    # equation): coefficients, not an invented reagent on the left
    b, got = missing("CC(CCC)N.CI>>C[N+](C)(C)C(C)CCC.[I-]")
    assert b.coefficients[1] == 3
    assert got == [("HI", 2, "product")]


@pytest.mark.parametrize(
    "reaction,expected",
    [
        # hydrogenolysis of a Cbz group: the amine, CO2 and toluene (P. G. M. Wuts, Greene's
        # Protective Groups in Organic Synthesis, 5th ed., Wiley 2014, benzyl carbamate)
        # (the H2 written among the agents is the reagent the equation needs)
        (
            "O=C(OCc1ccccc1)NCCc1ccccc1>[H][H].[Pd].CO>NCCc1ccccc1",
            [("CO2", 1, "product"), ("H2", 1, "reactant"), ("toluene", 1, "product")],
        ),
        # of a benzyl ether with palladium, H2 not written: the phenol and toluene, H2 needed
        # (same source, benzyl ether)
        ("COc1ccc(OCc2ccccc2)cc1>[Pd].CO>COc1ccc(O)cc1", [("H2", 1, "reactant"), ("toluene", 1, "product")]),
    ],
)
def test_a_benzyl_group_leaves_as_toluene_under_hydrogenolysis(reaction, expected):
    b, got = missing(reaction)
    assert b.balanced
    assert got == expected


def test_toluene_is_not_offered_without_a_reductant():
    # the same ether cleaved without hydrogen or a hydrogenation catalyst: toluene would need H2
    # that nothing in the flask supplies
    _, got = missing("COc1ccc(OCc2ccccc2)cc1>ClCCl>COc1ccc(O)cc1")
    assert ("toluene", 1, "product") not in got


def _balance_notes(text):
    return [f.message for f in chemcheck.check(text).by_rule("unbalanced-equation")]


@pytest.mark.parametrize(
    "reaction",
    [
        # a Grignard addition drawn as the organomagnesium cation with bromide among the agents,
        # quenched with aqueous NH4Cl: Mg and Br leave as salts, the water gives the OH its H
        # (common practice)
        "CC(=O)c1ccccc1.[CH3][Mg+]>C1CCOC1.[Br-].[NH4+].[Cl-]>CC(C)(O)c1ccccc1",
        # Suzuki couplings: the boron leaves as borate with the halide (N. Miyaura, A. Suzuki,
        # Chem. Rev. 1995, 95, 2457), and a pinacol boronate's pinacol with it
        "OB(O)c1ccccc1.Brc1ccc(C)cc1>[Pd].O=C([O-])[O-].[K+].[K+]>Cc1ccc(-c2ccccc2)cc1",
        "CC1(C)OB(c2ccccc2)OC1(C)C.Brc1ccc(C)cc1>[Pd].O=C([O-])[O-].[K+].[K+]>Cc1ccc(-c2ccccc2)cc1",
        # oxidations with the oxidant among the agents: Swern (K. Omura, D. Swern, Tetrahedron
        # 1978, 34, 1651) and Dess-Martin (D. B. Dess, J. C. Martin, J. Org. Chem. 1983, 48, 4155)
        "OC1CCCCC1>CS(C)=O.O=C(Cl)C(=O)Cl.CCN(CC)CC>O=C1CCCCC1",
        "OC1CCCCC1>CC(=O)OI1(OC(C)=O)(OC(C)=O)OC(=O)c2ccccc21>O=C1CCCCC1",
    ],
)
def test_what_the_agents_supply_or_the_workup_takes_is_not_asked_for(reaction):
    assert _balance_notes(reaction) == []


def test_a_coupling_product_drawn_a_carbon_short_is_still_named():
    # the organic part does not balance: the remainder is not only salts
    [note] = _balance_notes("OB(O)c1ccccc1.Brc1ccc(C)cc1>[Pd].O=C([O-])[O-].[K+].[K+]>c1ccc(-c2ccccc2)cc1")
    assert "C +1" in note and "B +1" in note


def test_an_oxidation_without_an_oxidant_is_named():
    [note] = _balance_notes("OC1CCCCC1>ClCCl>O=C1CCCCC1")
    assert note.endswith("is H +2.")


def test_a_halide_ion_is_not_offered_beside_another_reagent():
    # thiocyanate adding to an amine gains a proton from the medium: not "HCl in, chloride out"
    b, got = missing("N#C[S-].Nc1ccccc1>>NC(=S)Nc1ccccc1")
    assert not b.balanced and got == []


def test_an_alkyl_halide_is_named_only_from_a_phosphite():
    # methyl iodide and an amine: HI leaves, not a made-up methyl iodide by-product
    _, got = missing("CN.CI>>CNC")
    assert got == [("HI", 1, "product")]
