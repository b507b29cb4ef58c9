"""The hazard notes name what each reagent actually releases or forms (issue: reagent-specific
hazard text). Sources beside each case."""

import chemcheck


def _notes(rxn: str, rule: str = "hazard-caution") -> list[str]:
    return [f.message for f in chemcheck.check(rxn).by_rule(rule)]


def test_iron_bromide_releases_hbr_not_hcl_or_hf():
    # FeBr3 + H2O -> HBr (Bretherick's Handbook, 8th ed., iron(III) bromide)
    notes = " ".join(_notes("c1ccccc1.BrBr>Br[Fe](Br)Br>Brc1ccccc1"))
    assert "HBr" in notes and "HCl or HF" not in notes


def test_the_phosgene_sentence_only_for_phosgene_type_reagents():
    acetyl = " ".join(_notes("NCc1ccccc1.CC(=O)Cl>CCN(CC)CC>CC(=O)NCc1ccccc1"))
    assert "acetyl chloride" in acetyl and "hosgene" not in acetyl
    diphosgene = " ".join(_notes("Nc1ccccc1.O=C(Cl)OC(Cl)(Cl)Cl>CCN(CC)CC>O=C=Nc1ccccc1"))
    assert "phosgene" in diphosgene


def test_tin_ii_chloride_is_not_a_water_reactive_lewis_acid():
    # SnCl2 reductions of nitroarenes run in ethanol (Bellamy & Ou, Tetrahedron Lett. 1984, 25, 839)
    report = chemcheck.check("O=[N+]([O-])c1ccccc1>Cl[Sn]Cl.CCO>Nc1ccccc1")
    assert not [f for f in report.findings if "Water-reactive Lewis acid" in f.message]
    assert not report.by_rule("reagent-solvolysis")
    # tin(IV) chloride is (Bretherick, tin(IV) chloride)
    sn4 = " ".join(_notes("c1ccccc1.CC(=O)Cl>Cl[Sn](Cl)(Cl)Cl>CC(=O)c1ccccc1"))
    assert "Water-reactive Lewis acid" in sn4


def test_cyanoborohydride_note_names_hcn_and_plain_hydrides_do_not():
    cyano = " ".join(_notes("O=Cc1ccccc1.C1CCNCC1>[Na+].[BH3-]C#N.CO>C(c1ccccc1)N1CCCCC1"))
    assert "HCN" in cyano
    plain = " ".join(_notes("O=C1CCCCC1>[BH4-].[Na+].CO>OC1CCCCC1"))
    assert "Hydride reagent" in plain and "HCN" not in plain


def test_a_label_that_already_says_the_hazard_class_is_not_repeated():
    # an unnamed aryl isocyanate is labelled "isocyanate 1" under the scheme
    notes = _notes("O=C=Nc1cccnc1.CNc1ccccc1>>CN(C(=O)Nc1cccnc1)c1ccccc1")
    assert [n for n in notes if n.startswith("Isocyanate 1: toxic by inhalation")]
    assert not [n for n in notes if "Isocyanate (isocyanate" in n]
    # a named reagent keeps the class before its name
    named = " ".join(_notes("NCc1ccccc1.CC(=O)Cl>CCN(CC)CC>CC(=O)NCc1ccccc1"))
    assert "Acid chloride or similar (acetyl chloride (2))" in named



def test_a_cyanide_salt_is_kept_basic_and_cyanoborohydride_buffered():
    # HCN, pKa 9.2 (CRC Handbook of Chemistry and Physics; from memory), is most of the cyanide
    # below pH 9: a cyanide salt is kept basic, a cyanoborohydride reduction runs at pH 5-7
    # with acetic acid (Borch, Bernstein & Durst, J. Am. Chem. Soc. 1971, 93, 2897)
    [salt] = chemcheck.check("CCCCBr.[C-]#N.[Na+]>CS(C)=O.OS(=O)(=O)O>CCCCC#N").by_rule("hazardous-species-formed")
    assert "basic" in salt.fix and "pH 5" not in salt.fix and salt.severity == "warning"
    [boro] = chemcheck.check("O=Cc1ccccc1.C1CCNCC1>[Na+].[BH3-]C#N.CO.CC(=O)O>C(c1ccccc1)N1CCCCC1").by_rule(
        "hazardous-species-formed"
    )
    assert "pH 5" in boro.fix and boro.severity == "info"


def test_a_peroxide_gets_peroxide_advice_not_nitration_advice():
    # peracids: test for and quench the excess before concentrating (Prudent Practices in the
    # Laboratory, National Research Council, 2011)
    notes = " ".join(_notes("CSc1ccccc1>OOC(=O)c1cccc(Cl)c1.ClCCl>CS(=O)(=O)c1ccccc1"))
    assert "Peroxide" in notes and "quench" in notes and "nitration" not in notes


def test_borohydride_with_a_cobalt_salt_is_not_called_slow():
    # the cobalt boride formed catalyses the hydrolysis of NaBH4 (T. Satoh, S. Suzuki, Tetrahedron
    # Lett. 1969, 10, 4555; from memory)
    [note] = _notes("N#CCc1ccccc1>[Na+].[BH4-].[Co+2].[Cl-].[Cl-].CO>NCCc1ccccc1", "reactive-reagent-in-protic-solvent")
    assert "cobalt" in note and "quickly" in note and "slowly" not in note
    [plain] = _notes("CC(=O)c1ccccc1>[BH4-].[Na+].CO>CC(O)c1ccccc1", "reactive-reagent-in-protic-solvent")
    assert "slowly" in plain


def test_lithium_aluminium_hydride_written_as_ions_is_named_and_supplies_the_hydrogen():
    report = chemcheck.check("CCOC(=O)c1ccccc1>[H-].[H-].[H-].[H-].[Li+].[Al+3].C1CCOC1>OCc1ccccc1")
    assert any(c.label.startswith("lithium aluminium hydride") for c in report.reaction.components)
    assert not [f for f in report.by_rule("unbalanced-equation") if "H2" in f.message]


def test_an_unnamed_acid_is_not_called_the_carboxylic_acid_acid():
    # HOBt with no coupling agent and 1,2-dichloroethane listed: "EDC" read as the solvent
    [f] = chemcheck.check(
        "OC(=O)c1ccc(C)cc1C.NCc1ccccc1>On1nnc2ccccc21.ClCCCl.CN(C)C=O>O=C(NCc1ccccc1)c1ccc(C)cc1C"
    ).by_rule("amide-from-unactivated-acid")
    assert "acid acid" not in f.message and "EDC" in f.message


def test_hydrogen_chloride_beside_a_base_is_read_as_the_amine_salt():
    # an amine hydrochloride freed with triethylamine (common practice) against HCl in dioxane
    # removing a Boc group, where it is the free strong acid
    salt = " ".join(_notes("NCc1ccccc1.Cl.CC(=O)Cl>CCN(CC)CC>CC(=O)NCc1ccccc1"))
    assert "listed with a base" in salt
    free = " ".join(_notes("CC(C)(C)OC(=O)NCc1ccccc1>Cl.C1COCCO1>NCc1ccccc1"))
    assert "Strong acid (hydrogen chloride (a)): corrosive" in free and "listed with a base" not in free


def test_iron_ii_is_not_a_water_reactive_lewis_acid():
    # iron(III) chloride fumes and hydrolyses violently (Bretherick, iron(III) chloride); the
    # iron(II) of a ferrocene ligand written as ions does not
    assert "Water-reactive Lewis acid" in " ".join(_notes("c1ccccc1.ClCl>Cl[Fe](Cl)Cl>Clc1ccccc1"))
    fe2 = _notes("Brc1ccccc1.OB(O)c1ccccc1>[Fe+2].[Cl-].[Cl-].[Pd]>c1ccc(-c2ccccc2)cc1")
    assert not [n for n in fe2 if "Water-reactive Lewis acid" in n]
