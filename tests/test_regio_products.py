"""Product predictions: anti-periplanar E2 with drawn stereochemistry (Clayden, Greeves, Warren, Organic Chemistry,
2nd ed., OUP 2012, ch. 17): cyclohexanes need the beta-H trans-diaxial to the leaving group;
open-chain E2 with both carbons configured is stereospecific.

The relative configurations of the test SMILES are checked here by symmetry, independently of
the product code: a trans-1,2-disubstituted cyclohexane with two equal groups is chiral, the
cis isomer is meso; meso-1,2-dibromo-1,2-diphenylethane is its own mirror image.
"""

from rdkit import Chem

import chemcheck
from chemcheck.regio import elimination, same_compound

TRANS = "C[C@@H]1CCCC[C@H]1Br"
CIS = "C[C@H]1CCCC[C@H]1Br"
MESO_DIBROMIDE = "Br[C@@H](c1ccccc1)[C@H](Br)c1ccccc1"


def _mirror(smiles: str) -> str:
    return smiles.replace("@@", "!").replace("@", "@@").replace("!", "@")


def _achiral(smiles: str) -> bool:
    return Chem.CanonSmiles(smiles) == Chem.CanonSmiles(_mirror(smiles))


def test_test_substrates_have_the_configuration_named():
    assert not _achiral(TRANS.replace("Br", "C"))  # trans-1,2-dimethyl: chiral
    assert _achiral(CIS.replace("Br", "C"))  # cis-1,2-dimethyl: meso
    assert _achiral(MESO_DIBROMIDE)


def _labels(smiles, mode="zaitsev"):
    return {c.smiles: c.label for c in elimination.predict(Chem.MolFromSmiles(smiles), mode, "test")}


def test_trans_cyclohexyl_halide_cannot_give_the_zaitsev_alkene():
    labels = _labels(TRANS)
    assert labels["CC1=CCCCC1"] == "none"
    assert labels["CC1C=CCCC1"] == "major"


def test_cis_cyclohexyl_halide_follows_zaitsev():
    labels = _labels(CIS)
    assert labels["CC1=CCCCC1"] == "major"
    assert labels["CC1C=CCCC1"] == "minor"


def test_undrawn_configuration_falls_back_to_zaitsev_with_the_note():
    cands = elimination.predict(Chem.MolFromSmiles("CC1CCCCC1Br"), "zaitsev", "test")
    assert cands[0].smiles == "CC1=CCCCC1"
    assert "anti-periplanar" in cands[0].reason


def test_hofmann_in_a_cyclohexane_also_needs_a_trans_beta_h():
    # the trimethylammonium analogue of the trans substrate: the ring CH2 side is the only E2 path
    labels = _labels(TRANS.replace("Br", "[N+](C)(C)C"), "hofmann")
    assert labels["CC1=CCCCC1"] == "none"


def test_meso_dibromide_gives_the_alkene_with_cis_phenyls():
    # Newman projection (worked by hand): with H on C2 anti to Br on C1 the two phenyls are
    # gauche, so they end up cis: Br trans to the phenyl across the C=C, the (E)-bromoalkene
    cands = elimination.predict(Chem.MolFromSmiles(MESO_DIBROMIDE), "zaitsev", "test")
    major = [c for c in cands if c.label == "major"]
    assert len(major) == 1
    assert same_compound(major[0].smiles, "Br/C(=C/c1ccccc1)c1ccccc1", stereo=True)
    none = [c for c in cands if c.label == "none"]
    assert any(same_compound(c.smiles, "Br/C(=C\\c1ccccc1)c1ccccc1", stereo=True) for c in none)


def test_chiral_dibromide_gives_the_other_geometry():
    # the (R,R)/(S,S) diastereomer: phenyls anti in the reacting conformer -> trans phenyls
    cands = elimination.predict(Chem.MolFromSmiles(MESO_DIBROMIDE.replace("[C@H]", "[C@@H]")), "zaitsev", "test")
    major = [c for c in cands if c.label == "major"]
    assert same_compound(major[0].smiles, "Br/C(=C\\c1ccccc1)c1ccccc1", stereo=True)


def test_product_drawn_without_geometry_is_not_flagged():
    r = chemcheck.check(MESO_DIBROMIDE + ".[K+].[OH-]>CCO>BrC(=Cc1ccccc1)c1ccccc1")
    assert r.by_rule("elimination-regiochemistry") == []


def test_fischer_esterification_is_not_taken_for_a_sulfonation():
    r = chemcheck.check("OC(=O)c1ccccc1.CO>OS(=O)(=O)O>COC(=O)c1ccccc1")
    assert not r.to_dict().get("predictions")


# Friedel-Crafts carbocations (Clayden ch. 21; Olah, Friedel-Crafts and Related Reactions;
# common practice): which alkyl group the arene receives from each alkyl halide skeleton.
def test_primary_propyl_rearranges_to_isopropyl():
    from chemcheck.regio.substitution import alkyl_cations

    groups = alkyl_cations(Chem.MolFromSmiles("CCC"), 0)
    assert "hydride shift" in groups[0][2] and groups[0][1] > groups[1][1]
    m = Chem.MolFromSmiles(groups[0][0])  # rooted at the bonding atom: isopropyl, two carbons on it
    assert sum(1 for n in m.GetAtomWithIdx(0).GetNeighbors() if n.GetAtomicNum() == 6) == 2


def test_neopentyl_gives_a_tertiary_centre_by_a_methyl_shift():
    from chemcheck.regio.substitution import alkyl_cations

    groups = alkyl_cations(Chem.MolFromSmiles("CC(C)(C)C"), 0)
    assert "methyl shift" in groups[0][2]
    # the bonding atom of the rearranged group carries three carbons (tert-pentyl)
    m = Chem.MolFromSmiles(groups[0][0])
    assert sum(1 for n in m.GetAtomWithIdx(0).GetNeighbors() if n.GetAtomicNum() == 6) == 3


def test_methyl_ethyl_and_benzyl_do_not_rearrange():
    from chemcheck.regio.substitution import alkyl_cations

    for smi in ("C", "CC", "Cc1ccccc1"):
        assert len(alkyl_cations(Chem.MolFromSmiles(smi), 0)) == 1, smi


def test_isomer_findings_highlight_the_drawn_and_the_expected_positions():
    # anisole (atoms: C0 O1 c2..c7); meta acylation drawn, para expected
    r = chemcheck.check("COc1ccccc1.CC(=O)Cl>AlCl3>COc1cccc(C(C)=O)c1")
    f = r.by_rule("ring-substitution-regiochemistry")[0]
    atoms = {a for c, a in f.atoms if c == 0}
    para, meta = 5, {4, 6}
    assert para in atoms and atoms & meta


def test_alkene_findings_highlight_the_carbons_that_lose_h_and_the_leaving_group():
    r = chemcheck.check("CCCC(C)[N+](C)(C)C.[OH-]>>CC=CCC")
    f = r.by_rule("elimination-regiochemistry")[0]
    atoms = {a for c, a in f.atoms if c == 0}
    assert {2, 3, 4, 5} <= atoms  # beta C2 (drawn), alpha C3, beta C4 (methyl, expected), N5


def test_an_amide_in_sulfuric_acid_is_not_predicted_to_be_sulfonated():
    # an anilide or nitrile in sulfuric acid with nothing else is there for hydrolysis
    for text in ("CC(=O)Nc1ccccc1>OS(=O)(=O)O>", "N#Cc1ccccc1>OS(=O)(=O)O>"):
        assert not chemcheck.check(text).to_dict().get("predictions"), text
    assert chemcheck.check("Cc1ccccc1>OS(=O)(=O)O>").to_dict().get("predictions")


def test_the_fix_says_how_to_make_the_product_drawn():
    # the n-propylarene is made by acylation then reduction (Clayden ch. 21, common practice)
    f = chemcheck.check("c1ccccc1.CCCCl>AlCl3>CCCc1ccccc1").by_rule("ring-substitution-regiochemistry")[0]
    assert "acylation" in f.fix and "Wolff-Kishner" in f.fix
    f = chemcheck.check(TRANS + ".CC[O-].[Na+]>CCO>CC1=CCCCC1").by_rule("elimination-regiochemistry")[0]
    assert "diastereomer" in f.fix and "trisubstituted" in f.message


# Protecting-group products (Wuts, Greene's Protective Groups in Organic Synthesis, 5th ed.,
# Wiley 2014, ch. 7): the reagent gives its carbamate or amide and leaves t-BuOH + CO2 (Boc2O),
# HCl (Cbz-Cl, Fmoc-Cl), HOSu (Fmoc-OSu) or AcOH (Ac2O).
PG_CASES = [
    ("NCCO.CC(C)(C)OC(=O)OC(=O)OC(C)(C)C>C1CCOC1>CC(C)(C)OC(=O)NCCO", "CC(C)(C)OC(=O)NCCO", ("CO2", "tert-butanol")),
    ("NCCO.O=C(Cl)OCc1ccccc1>CCN(CC)CC>O=C(NCCO)OCc1ccccc1", "O=C(NCCO)OCc1ccccc1", ("HCl",)),
    ("NCCO.O=C(Cl)OCC1c2ccccc2-c2ccccc12>CCN(CC)CC>O=C(NCCO)OCC1c2ccccc2-c2ccccc12",
     "O=C(NCCO)OCC1c2ccccc2-c2ccccc12", ("HCl",)),
    ("NCCO.O=C(OCC1c2ccccc2-c2ccccc12)ON1C(=O)CCC1=O>CCN(CC)CC>O=C(NCCO)OCC1c2ccccc2-c2ccccc12",
     "O=C(NCCO)OCC1c2ccccc2-c2ccccc12", ("N-hydroxysuccinimide",)),
    ("NCCO.CC(=O)OC(C)=O>CCN(CC)CC>CC(=O)NCCO", "CC(=O)NCCO", ("Acetic acid",)),
]


def test_protecting_group_products_and_their_by_products():
    for rxn, expected, by_products in PG_CASES:
        report = chemcheck.check(rxn)
        preds = report.to_dict().get("predictions") or []
        major = [c["smiles"] for p in preds for c in p["candidates"] if c["label"] == "major"]
        assert any(same_compound(m, expected) for m in major), (rxn, major)
        notes = " ".join(f.message for f in report.by_rule("unbalanced-equation"))
        for bp in by_products:
            assert bp in notes, (rxn, notes)
        assert "HNO3" not in notes


def test_a_reduced_nitro_group_is_not_balanced_by_nitric_acid():
    # nitrobenzene drawn as N-benzylaniline: the lost oxygens are reduced off, not HNO3
    report = chemcheck.check(
        "O=[N+]([O-])c1ccccc1.O=Cc1ccccc1>CC(=O)O[BH-](OC(C)=O)OC(C)=O.[Na+].ClCCCl>c1ccc(CNc2ccccc2)cc1"
    )
    assert "HNO3" not in " ".join(f.message for f in report.findings)
    # nitration still balances with water (March's Advanced Organic Chemistry, 7th ed., 11-2)
    nitration = chemcheck.check("c1ccccc1.O[N+](=O)[O-]>OS(=O)(=O)O>O=[N+]([O-])c1ccccc1")
    assert "H2O" in " ".join(f.message for f in nitration.by_rule("unbalanced-equation"))


def test_hofmann_reasons_do_not_contradict_themselves():
    # 2-bromo-2-methylbutane with KOtBu: the CH3 hydrogens are the accessible ones (Hofmann
    # product 2-methylbut-1-ene major; Clayden, Greeves, Warren, 2nd ed., ch. 17). The more
    # substituted alkene comes from the hindered CH2 and must not be called "most accessible".
    cands = elimination.predict(Chem.MolFromSmiles("CCC(C)(C)Br"), "hofmann", "hindered base")
    by = {c.smiles: c for c in cands}
    assert by["C=C(C)CC"].label == "major" and "most accessible" in by["C=C(C)CC"].reason
    assert "most accessible" not in by["CC=C(C)C"].reason
    assert "more hindered" in by["CC=C(C)C"].reason


def test_a_fused_triazole_nitrogen_is_not_read_as_an_amino_donor():
    # the N1 lone pair of a benzotriazole belongs to the pi-deficient triazole sextet (Joule &
    # Mills, Heterocyclic Chemistry, 5th ed., ch. 25; from memory), unlike the N of an indole
    from rdkit import Chem

    from chemcheck.regio.substitution import _benzene_rings, ring_substituents

    for smiles, expected in (("Cn1nnc2ccccc21", "fused"), ("Cn1ccc2ccccc21", "strong_op")):
        mol = Chem.MolFromSmiles(smiles)
        (ring,) = _benzene_rings(mol)
        classes = {cls for _, cls, _, x in ring_substituents(mol, ring) if mol.GetAtomWithIdx(x).GetSymbol() == "N"}
        assert classes == {expected}, (smiles, classes)
