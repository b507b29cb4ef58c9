"""Perception against named molecules (structures and classes are common practice).

Each nitrogen class has positives and look-alikes that must not match it; each reactive group
likewise.
"""

import pytest
from rdkit import Chem

from chemcheck.perceive import (
    GROUP_NAMES,
    NITROGEN_KINDS,
    is_hindered_base,
    nitrogen_sites,
    perceive,
    reactive_groups,
)
from chemcheck.perceive.catalog import GROUPS, NITROGEN_CLASSES, compiled


def kinds(smiles: str) -> list[str]:
    return [s.kind for s in nitrogen_sites(Chem.MolFromSmiles(smiles))]


def groups(smiles: str) -> set[str]:
    return {g.name for g in reactive_groups(Chem.MolFromSmiles(smiles))}


NITROGEN_CASES = {
    "primary_amine": (["NCCCC", "NCc1ccccc1", "NC1CCCCC1"], ["CNC", "Nc1ccccc1", "NC(C)=O"]),
    "secondary_amine": (["C1CCNCC1", "CCNCC", "C1COCCN1"], ["CCN(C)C", "CNc1ccccc1", "CNC(C)=O"]),
    "tertiary_amine": (["CCN(CC)CC", "CCN(C(C)C)C(C)C", "CN1CCOCC1"], ["CN(C)c1ccccc1", "CN(C)C=O", "C[N+](C)(C)C"]),
    "aryl_amine": (["Nc1ccccc1", "CNc1ccccc1", "CN(C)c1ccccc1"], ["CC(=O)Nc1ccccc1", "NCc1ccccc1", "c1ccncc1"]),
    "amide": (["CC(=O)Nc1ccccc1", "CN(C)C=O", "O=C1CCCN1"], ["CC(=O)OC", "CNC", "CS(=O)(=O)NC"]),
    "sulfonamide": (["Cc1ccc(cc1)S(N)(=O)=O", "CS(=O)(=O)NC"], ["CC(=O)NC", "CNC"]),
    "carbamate": (["CC(C)(C)OC(=O)NC", "O=C(NCc1ccccc1)OCc1ccccc1"], ["CC(=O)NC", "NC(N)=O"]),
    "imide": (["O=C1CCC(=O)N1", "O=C1NC(=O)c2ccccc12"], ["CC(=O)NC", "O=C1CCCN1"]),
    "urea": (["NC(N)=O", "CNC(=O)NC"], ["CC(=O)NC", "NC(N)=N"]),
    "pyridine_type": (["c1ccncc1", "Cc1cccc(C)n1", "c1ccc2ncccc2c1"], ["c1cc[nH]c1", "[O-][n+]1ccccc1", "c1cc[nH+]cc1"]),
    "pyrrole_type": (["c1cc[nH]c1", "c1ccc2[nH]ccc2c1", "Cn1ccnc1"], ["c1ccncc1", "C1CCNC1"]),
    "imine": (["CC=NC", "CC(C)=NCc1ccccc1"], ["CC=O", "CN=C=O", "CC(N)=N"]),
    "amidine": (["CC(N)=N", "C1CCC2=NCCCN2CC1"], ["CC(N)=O", "NC(N)=N"]),
    "guanidine": (["NC(N)=N", "CN(C)C(=N)N(C)C"], ["CC(N)=N", "NC(N)=O"]),
    "hydrazine": (["NN", "CNNC", "NNc1ccccc1"], ["NO", "CN"]),
    "hydroxylamine": (["NO", "CON", "CC=NO"], ["NN", "CO"]),
    "nitrile": (["CC#N", "N#Cc1ccccc1"], ["CN=C=O", "CN"]),
    "nitro": (["O=[N+]([O-])c1ccccc1", "C[N+](=O)[O-]"], ["O=NC", "CC#N"]),
    "n_oxide": (["[O-][n+]1ccccc1", "C[N+](C)(C)[O-]"], ["O=[N+]([O-])c1ccccc1", "c1ccncc1"]),
    "ammonium": (["[NH4+]", "C[NH3+]", "c1cc[nH+]cc1", "CC[NH+](CC)CC"], ["C[N+](C)(C)C", "CN"]),
    "quaternary_ammonium": (["C[N+](C)(C)C", "CCCC[N+](C)(C)C"], ["CC[NH+](CC)CC", "CN(C)C"]),
    "enamine": (["C1CCC(=C1)N1CCCC1", "CC=CN(C)C"], ["CC(=O)N(C)C", "CN(C)C"]),
    "azide": (["[N-]=[N+]=NC", "CN=[N+]=[N-]"], ["NN", "CC#N"]),
    "diazonium": (["N#[N+]c1ccccc1"], ["CC#N", "N#N"]),
    "ammonia": (["N"], ["CN"]),
    "amide_anion": (["CC(C)[N-]C(C)C"], ["CC(C)NC(C)C"]),
}


@pytest.mark.parametrize("kind", sorted(NITROGEN_CASES))
def test_nitrogen_classes(kind):
    positives, lookalikes = NITROGEN_CASES[kind]
    for smi in positives:
        assert kind in kinds(smi), f"{smi} should have a {kind} nitrogen, got {kinds(smi)}"
    for smi in lookalikes:
        assert kind not in kinds(smi), f"{smi} should have no {kind} nitrogen, got {kinds(smi)}"


def test_every_nitrogen_kind_is_tested():
    untested = set(NITROGEN_KINDS) - set(NITROGEN_CASES) - {"other_nitrogen", "nitroso", "iminium", "isocyanate"}
    assert not untested


@pytest.mark.parametrize(
    "smiles,expected",
    [
        # molecules with two kinds of nitrogen: each atom gets its own class
        ("CN(C)c1ccncc1", ["aryl_amine", "pyridine_type"]),  # DMAP: the NMe2 sits on the ring
        ("c1c[nH]cn1", ["pyrrole_type", "pyridine_type"]),  # imidazole
        ("Nc1ccccn1", ["aryl_amine", "pyridine_type"]),  # 2-aminopyridine
        ("C1CNCCN1", ["secondary_amine", "secondary_amine"]),  # piperazine
        ("CC(=O)Nc1ccc(N)cc1", ["amide", "aryl_amine"]),  # 4-aminoacetanilide
    ],
)
def test_sites_of_multifunctional_molecules(smiles, expected):
    assert kinds(smiles) == expected


GROUP_CASES = {
    "acid_halide": (["CC(Cl)=O", "O=C(Cl)c1ccccc1", "ClC(=O)C(Cl)=O"], ["CCOC(Cl)=O", "CN(C)C(Cl)=O", "CC(=O)OC"]),
    "chloroformate": (["CCOC(Cl)=O", "O=C(Cl)OCc1ccccc1"], ["CC(Cl)=O", "CN(C)C(Cl)=O"]),
    "carbamoyl_chloride": (["CN(C)C(Cl)=O"], ["CC(Cl)=O", "CCOC(Cl)=O"]),
    "anhydride": (["CC(=O)OC(C)=O", "O=C1CCC(=O)O1"], ["CC(=O)OC", "CC(C)(C)OC(=O)OC(=O)OC(C)(C)C"]),
    "dicarbonate": (["CC(C)(C)OC(=O)OC(=O)OC(C)(C)C"], ["CC(=O)OC(C)=O"]),
    "sulfonyl_halide": (["Cc1ccc(cc1)S(Cl)(=O)=O", "CS(Cl)(=O)=O"], ["CS(=O)(=O)NC", "CS(=O)(=O)O"]),
    "isocyanate": (["CN=C=O", "O=C=Nc1ccccc1"], ["CC#N", "CN=C=S"]),
    "alkyl_halide": (["CI", "BrCc1ccccc1", "CCCCBr"], ["ClCCl", "ClC(Cl)Cl", "Brc1ccccc1", "CC(Cl)=O"]),
    "alkyl_sulfonate": (["COS(=O)(=O)OC", "COS(=O)(=O)C(F)(F)F", "CCOS(=O)(=O)c1ccc(C)cc1"], ["CS(=O)(=O)O", "CS(Cl)(=O)=O"]),
    "aryl_halide": (["Brc1ccccc1", "Clc1ccncc1"], ["BrCc1ccccc1", "CCl"]),
    "aldehyde": (["CC=O", "O=Cc1ccccc1", "C=O"], ["CC(C)=O", "OC=O", "CN(C)C=O"]),
    "ketone": (["CC(C)=O", "O=C1CCCCC1", "CC(=O)c1ccccc1"], ["CC=O", "CC(=O)OC", "CC(N)=O"]),
    "ester": (["CC(=O)OC", "CCOC(=O)c1ccccc1"], ["CC(=O)OC(C)=O", "CC(=O)O", "CC(C)=O"]),
    "carboxylic_acid": (["CC(=O)O", "OC(=O)C(F)(F)F"], ["CC(=O)OC", "CC(=O)[O-]"]),
    "alcohol": (["CCO", "CC(C)(C)O"], ["Oc1ccccc1", "CC(=O)O", "O"]),
    "phenol": (["Oc1ccccc1"], ["OCc1ccccc1", "COc1ccccc1"]),
    "water": (["O"], ["CO"]),
    "hydrogen_halide": (["Cl", "Br", "I"], ["[Cl-]", "CCl", "ClCl"]),
    "sulfonic_acid": (["CS(=O)(=O)O", "OS(=O)(=O)O", "Cc1ccc(cc1)S(=O)(=O)O"], ["CS(=O)(=O)OC", "CS(Cl)(=O)=O"]),
    "alkoxide": (["[K+].CC(C)(C)[O-]", "C[O-].[Na+]"], ["CC(C)(C)O", "CC(=O)[O-]"]),
    "hydroxide": (["[Na+].[OH-]"], ["O", "CO"]),
    "carbonate": (["[K+].[K+].[O-]C([O-])=O", "[Na+].OC([O-])=O"], ["COC(=O)OC", "CC(=O)[O-]"]),
    "hydride_ion": (["[Na+].[H-]"], ["[H][H]", "[Na+].[BH4-]"]),
    "boron_hydride": (["[Na+].[BH4-]", "[Na+].CC(=O)O[BH-](OC(C)=O)OC(C)=O", "[Na+].[BH3-]C#N"], ["FB(F)F", "OB(O)c1ccccc1"]),
    "aluminium_hydride": (["[Li+].[AlH4-]", "CC(C)C[AlH]CC(C)C"], ["Cl[Al](Cl)Cl"]),
    "nitrating_agent": (["O[N+](=O)[O-]", "O=[N+]=O", "CC(=O)O[N+](=O)[O-]"], ["O=[N+]([O-])c1ccccc1", "[K+].[O-][N+]([O-])=O"]),
    "halogen": (["BrBr", "ClCl", "ICl"], ["Br", "CBr"]),
    "sulfur_trioxide": (["O=S(=O)=O", "[O-]S(=O)(=O)[n+]1ccccc1", "C[N+](C)(C)S(=O)(=O)[O-]"], ["OS(=O)(=O)O", "O=S=O", "CS(C)(=O)=O"]),
    "chlorosulfonic_acid": (["OS(=O)(=O)Cl"], ["CS(Cl)(=O)=O", "OS(=O)(=O)O"]),
    "sulfuric_acid": (["OS(=O)(=O)O"], ["CS(=O)(=O)O", "COS(=O)(=O)O", "OS(=O)(=O)Cl"]),
    "n_halo": (["BrN1C(=O)CCC1=O", "ClN1C(=O)CCC1=O"], ["O=C1CCC(=O)N1", "BrCC"]),
    "diazonium": (["N#[N+]c1ccccc1"], ["CC#N"]),
    "azide": (["[Na+].[N-]=[N+]=[N-]", "CN=[N+]=[N-]"], ["NN"]),
    "peroxide": (["OO", "OOC(=O)c1cccc(Cl)c1"], ["COC", "O"]),
    "quaternary_ammonium": (["C[N+](C)(C)C.[I-]"], ["C[NH3+].[Cl-]", "CN(C)C"]),
    "lewis_acid": (
        ["Cl[Al](Cl)Cl", "Cl[Fe](Cl)Cl", "F[B-](F)(F)[O+](CC)CC", "FB(F)F", "Cl[Ti](Cl)(Cl)Cl",
         "Cl[Sn](Cl)(Cl)Cl", "Cl[Zn]Cl", "FC(F)(F)S(=O)(=O)O[Zn]OS(=O)(=O)C(F)(F)F", "[Al+3].[Cl-].[Cl-].[Cl-]",
         "C[Si](C)(C)OS(=O)(=O)C(F)(F)F", "CC(C)O[Ti](OC(C)C)(OC(C)C)OC(C)C"],
        ["[Na+].[BH4-]", "[Na+].F[B-](F)(F)F", "OB(O)c1ccccc1", "[Li+].[AlH4-]", "[Zn]", "C[Si](C)(C)Cl", "[Na+].[Cl-]"],
    ),
    "silver_oxide": (["[Ag]O[Ag]", "[Ag+].[Ag+].[O-2]"], ["[Ag+].[O-][N+](=O)[O-]", "[Ag]Cl"]),
}


@pytest.mark.parametrize("name", sorted(GROUP_CASES))
def test_reactive_groups(name):
    positives, lookalikes = GROUP_CASES[name]
    for smi in positives:
        assert name in groups(smi), f"{smi} should carry {name}, got {groups(smi)}"
    for smi in lookalikes:
        assert name not in groups(smi), f"{smi} should not carry {name}, got {groups(smi)}"


def test_ketone_alpha_hydrogens_are_counted():
    ketone = [g for g in reactive_groups(Chem.MolFromSmiles("CC(=O)C(C)(C)C")) if g.name == "ketone"][0]
    assert ketone.detail == "3 alpha-H"


def test_leaving_group_is_recorded():
    halide = [g for g in reactive_groups(Chem.MolFromSmiles("CCCCBr")) if g.name == "alkyl_halide"][0]
    assert halide.detail == "Br"


@pytest.mark.parametrize(
    "smiles,hindered",
    [
        ("CCN(C(C)C)C(C)C", True),  # DIPEA
        ("Cc1cccc(C)n1", True),  # 2,6-lutidine
        ("[K+].CC(C)(C)[O-]", True),  # potassium tert-butoxide
        ("[Li+].CC(C)[N-]C(C)C", True),  # LDA
        ("C1CCC2=NCCCN2CC1", True),  # DBU
        ("CCN(CC)CC", False),  # triethylamine
        ("c1ccncc1", False),
        ("[Na+].CC[O-]", False),  # sodium ethoxide
    ],
)
def test_hindered_bases(smiles, hindered):
    assert is_hindered_base(Chem.MolFromSmiles(smiles)) is hindered


@pytest.mark.parametrize(
    "smiles,kind",
    [
        ("CCN(CC)CC", "base"), ("[K+].[K+].[O-]C([O-])=O", "base"), ("[Na+].[H-]", "base"),
        ("Cl[Al](Cl)Cl", "lewis_acid"), ("[Na+].[BH4-]", "reductant"), ("Cl", "acid"),
        ("OC(=O)C(F)(F)F", "acid"), ("OO", "oxidant"), ("CC(Cl)=O", "other"),
    ],
)
def test_agent_kinds(smiles, kind):
    assert perceive(Chem.MolFromSmiles(smiles)).kind == kind


def test_agent_kind_hints_from_the_name_table():
    assert perceive(Chem.MolFromSmiles("ClCCl"), "solvent").kind == "solvent"
    assert perceive(Chem.MolFromSmiles("CN(C)c1ccncc1"), "catalyst").kind == "catalyst"


def test_catalog_patterns_compile_and_names_are_unique():
    for cls in NITROGEN_CLASSES:
        for s in cls.smarts:
            assert compiled(s).GetNumAtoms() > 0
    for g in GROUPS:
        assert compiled(g.smarts).GetNumAtoms() > 0
    assert len(set(GROUP_NAMES)) == len(GROUP_NAMES)


def test_a_base_among_the_reactants_is_not_mapped_onto_the_product():
    # the N-CH2-CH3 of triethylamine fits the N-CH2-CH2 of the sulfonamide too; the amine that
    # carries the whole of that part holds those product atoms
    from chemcheck.changes import new_bonds_at_nitrogen
    from chemcheck.reading.reaction import parse_reaction

    rxn = parse_reaction("CCN(CC)CC.Cc1ccc(S(=O)(=O)Cl)cc1.NCCc1ccccc1>>Cc1ccc(cc1)S(=O)(=O)NCCc1ccccc1")
    [nb] = new_bonds_at_nitrogen(rxn)
    assert nb.reactant == 2 and nb.kind_before == "primary_amine" and nb.kind_after == "sulfonamide"


def test_a_reactant_that_loses_a_conflict_is_placed_again_on_free_atoms():
    # acetic anhydride's acetyl fits the acetamide of the substrate as well as the new ketone;
    # the acetanilide holds its own acetyl, so the anhydride maps onto the ketone
    from chemcheck.changes import atom_correspondence
    from chemcheck.reading.reaction import parse_reaction

    rxn = parse_reaction("CC(=O)Nc1ccccc1.CC(=O)OC(C)=O>>CC(=O)Nc1ccc(C(C)=O)cc1")
    corr = atom_correspondence(rxn)
    product = rxn.components[2].mol
    anhydride_atoms = {pa for (ri, _ra), (_pi, pa) in corr.items() if ri == 1}
    substrate_atoms = {pa for (ri, _ra), (_pi, pa) in corr.items() if ri == 0}
    assert anhydride_atoms and not anhydride_atoms & substrate_atoms
    # the ketone carbon (bonded to a ring carbon and to O) comes from the anhydride
    ketone_c = [
        a.GetIdx() for a in product.GetAtoms()
        if a.GetAtomicNum() == 6 and any(n.GetIsAromatic() for n in a.GetNeighbors())
        and any(n.GetAtomicNum() == 8 for n in a.GetNeighbors())
    ]
    assert ketone_c and ketone_c[0] in anhydride_atoms


def test_a_remembered_placement_follows_each_drawing_of_the_same_molecules():
    # placements are remembered by canonical SMILES: the second reaction draws the same amine,
    # acid chloride and amide with other atom orders, and must get its own atoms back
    # (every pair of corresponding atoms of one element; the amine N onto the amide N)
    from chemcheck.changes import atom_correspondence, new_bonds_at_nitrogen
    from chemcheck.reading.reaction import parse_reaction

    for text in (
        "c1ccc(CCN)cc1.ClC(C)=O>>c1ccccc1CCNC(C)=O",
        "NCCc1ccccc1.CC(=O)Cl>>CC(=O)NCCc1ccccc1",
        "C(N)Cc1ccccc1.O=C(Cl)C>>O=C(C)NCCc1ccccc1",
    ):
        rxn = parse_reaction(text)
        corr = atom_correspondence(rxn)
        assert len(corr) >= 12, text  # 9 heavy atoms of the amine, 3 of the acetyl
        for (ri, ra), (pi, pa) in corr.items():
            a = rxn.components[ri].mol.GetAtomWithIdx(ra)
            b = rxn.components[pi].mol.GetAtomWithIdx(pa)
            assert a.GetSymbol() == b.GetSymbol(), text
        amine_n = next(a.GetIdx() for a in rxn.components[0].mol.GetAtoms() if a.GetSymbol() == "N")
        product_n = next(a.GetIdx() for a in rxn.components[2].mol.GetAtoms() if a.GetSymbol() == "N")
        assert corr[(0, amine_n)] == (2, product_n), text
        [nb] = new_bonds_at_nitrogen(rxn)
        assert nb.reactant == 0 and nb.kind_before == "primary_amine", text


@pytest.mark.parametrize(
    "name",
    ["HATU", "HBTU", "TBTU", "COMU", "PyBOP", "T3P", "CDI", "DMTMM", "DIC", "EDC·HCl", "DCC"],
)
def test_amide_coupling_agents_are_perceived_as_such(name):
    # structures of the common coupling agents (Montalbetti & Falque, Tetrahedron 2005, 61,
    # 10827): an agent of this kind, not a base, whatever nitrogens it carries
    from chemcheck.reading.reaction import parse_reaction

    rxn = parse_reaction(f"OC(=O)c1ccccc1.NCc1ccccc1>{name}>O=C(NCc1ccccc1)c1ccccc1")
    agent = rxn.agents[0]
    p = perceive(agent.mol)
    assert p.has("coupling_agent", "carbodiimide")
    assert p.kind == "coupling_agent"
