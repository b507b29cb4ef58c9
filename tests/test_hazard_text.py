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

