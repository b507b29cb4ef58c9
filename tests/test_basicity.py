"""Basicity: pKa of nitrogen conjugate acids against outside references.

References:
* the IUPAC Digitized pKa Dataset (Zheng & Lafontant-Joseph, doi:10.5281/zenodo.7236452,
  digitized from Perrin 1965/1972; CC BY-NC, read from ../shared only, never shipped);
* values from the CRC Handbook table "Dissociation constants of organic bases in aqueous
  solution" and Perrin's compilation, written below from memory and marked so.
"""

import csv
import statistics

import pytest
from rdkit import Chem

from chemcheck.basicity import basic_sites, first_protonation
from chemcheck.basicity.reference import REFERENCE

# (name, SMILES, pKa, tolerance). From memory (CRC Handbook / Perrin compilation, 25 °C).
# Compounds also in chemcheck's reference table are checked tightly; the others exercise the
# class models and the anchoring.
COMMON_BASES = [
    ("triethylamine", "CCN(CC)CC", 10.75, 0.15),
    ("pyridine", "c1ccncc1", 5.23, 0.15),
    ("DMAP", "CN(C)c1ccncc1", 9.6, 0.2),
    ("2,6-lutidine", "Cc1cccc(C)n1", 6.7, 0.15),
    ("N-methylmorpholine", "CN1CCOCC1", 7.4, 0.15),
    ("morpholine", "C1COCCN1", 8.4, 0.2),
    ("piperidine", "C1CCNCC1", 11.1, 0.15),
    ("pyrrolidine", "C1CCNC1", 11.3, 0.15),
    ("imidazole", "c1c[nH]cn1", 6.95, 0.15),
    ("N-methylimidazole", "Cn1ccnc1", 7.0, 0.2),
    ("aniline", "Nc1ccccc1", 4.6, 0.1),
    ("N,N-dimethylaniline", "CN(C)c1ccccc1", 5.1, 0.15),
    ("benzylamine", "NCc1ccccc1", 9.3, 0.15),
    ("ammonia", "N", 9.25, 0.1),
    ("methylamine", "CN", 10.6, 0.15),
    ("dimethylamine", "CNC", 10.7, 0.15),
    ("trimethylamine", "CN(C)C", 9.8, 0.15),
    ("diethylamine", "CCNCC", 11.0, 0.15),
    ("diisopropylamine", "CC(C)NC(C)C", 11.05, 0.2),
    ("tert-butylamine", "CC(C)(C)N", 10.7, 0.15),
    ("ethanolamine", "NCCO", 9.5, 0.15),
    ("triethanolamine", "OCCN(CCO)CCO", 7.8, 0.15),
    ("TRIS", "NC(CO)(CO)CO", 8.1, 0.15),
    ("quinuclidine", "C1CN2CCC1CC2", 11.0, 0.2),
    ("DABCO (first)", "C1CN2CCN1CC2", 8.8, 0.2),
    ("quinoline", "c1ccc2ncccc2c1", 4.9, 0.15),
    ("isoquinoline", "c1ccc2cnccc2c1", 5.4, 0.15),
    ("p-toluidine", "Cc1ccc(N)cc1", 5.1, 0.15),
    ("p-anisidine", "COc1ccc(N)cc1", 5.3, 0.15),
    ("p-chloroaniline", "Nc1ccc(Cl)cc1", 4.0, 0.15),
    ("p-nitroaniline", "Nc1ccc(cc1)[N+](=O)[O-]", 1.0, 0.2),
    ("guanidine", "NC(N)=N", 13.6, 0.3),
    ("hydrazine", "NN", 8.1, 0.2),
    ("hydroxylamine", "NO", 6.0, 0.15),
    ("3,5-lutidine", "Cc1cncc(C)c1", 6.15, 0.15),
    ("3-methoxypyridine", "COc1cccnc1", 4.9, 0.15),
    ("4-tert-butylpyridine", "CC(C)(C)c1ccncc1", 6.0, 0.15),
    # modelled or anchored (not in the reference table): wider tolerance
    ("3,4-dimethylaniline", "Cc1ccc(N)cc1C", 5.2, 0.4),
    ("4-ethylaniline", "CCc1ccc(N)cc1", 5.0, 0.4),
    ("3-bromoaniline", "Nc1cccc(Br)c1", 3.5, 0.4),
    ("4-iodoaniline", "Nc1ccc(I)cc1", 3.8, 0.4),
    ("3-nitroaniline N-methyl", "CNc1cccc(c1)[N+](=O)[O-]", 2.5, 0.6),
    ("4-ethylpyridine", "CCc1ccncc1", 6.0, 0.4),
    ("N-ethylmorpholine", "CCN1CCOCC1", 7.7, 0.4),
    ("N,N-dimethylbenzylamine", "CN(C)Cc1ccccc1", 8.9, 0.5),
    ("N-methylbenzylamine", "CNCc1ccccc1", 9.6, 0.4),
    ("isobutylamine", "CC(C)CN", 10.4, 0.4),
    ("2-methoxyethylamine", "COCCN", 9.4, 0.5),
    ("N-methylpiperidine", "CN1CCCCC1", 10.1, 0.2),
    ("1-methylpyrrolidine", "CN1CCCC1", 10.3, 0.3),
]


@pytest.mark.parametrize("name,smiles,pka,tol", COMMON_BASES, ids=[b[0] for b in COMMON_BASES])
def test_common_bases(name, smiles, pka, tol):
    site, macro = first_protonation(smiles)
    assert site is not None
    assert macro == pytest.approx(pka, abs=tol)


def _dataset(path):
    with path.open() as fh:
        return {Chem.MolToInchiKey(Chem.MolFromSmiles(r["smiles"])): r for r in csv.DictReader(fh)}


def test_reference_table_agrees_with_the_iupac_digitization(pka_dataset_dir):
    """Our transcribed values against the independent digitization of the same compilation."""
    data = _dataset(pka_dataset_dir / "amine_pka_dev.csv")
    data.update(_dataset(pka_dataset_dir / "amine_pka_multisite_dev.csv"))
    diffs = []
    for name, smi, pka1, _pka2, _src, unc in REFERENCE:
        mol = Chem.MolFromSmiles(smi)
        for a in mol.GetAtoms():
            a.SetAtomMapNum(0)
        row = data.get(Chem.MolToInchiKey(mol))
        if row is None:
            continue
        diffs.append((abs(pka1 - float(row["pka"])), name, pka1, float(row["pka"]), unc))
    assert len(diffs) >= 30, "the table and the dataset should share many everyday bases"
    mae = statistics.fmean(d[0] for d in diffs)
    assert mae <= 0.15, sorted(diffs, reverse=True)[:5]
    # no single value off by more than its stated uncertainty plus 0.4
    bad = [d for d in diffs if d[0] > d[4] + 0.4]
    assert bad == []


def _ring_n_model(smiles):
    """The class model's value for the first aromatic N of a compound, without the reference
    table (for compounds that are themselves reference values)."""
    from chemcheck.basicity import model

    mol = Chem.MolFromSmiles(smiles)
    n = next(a.GetIdx() for a in mol.GetAtoms() if a.GetIsAromatic() and a.GetAtomicNum() == 7)
    return model.azine(mol, n)[0]


def _accuracy(path, cls=None):
    errs = []
    with path.open() as fh:
        for r in csv.DictReader(fh):
            if cls and r["site_class"] not in cls:
                continue
            _, macro = first_protonation(r["smiles"])
            errs.append(abs((macro if macro is not None else 0.0) - float(r["pka"])))
    return statistics.fmean(errs), len(errs)


# Regression guards just above the accuracy measured when the methods landed
# (docs/basicity.md). The basicity issue's goals are overall 0.5, anilines 0.3, pyridines 0.3;
# all are met (0.419, 0.291, 0.294), and the guards hold the last two at their goals.
@pytest.mark.parametrize(
    "classes,limit",
    [
        (None, 0.43),
        (("aniline_primary",), 0.25),
        (("aniline_primary", "aniline_secondary", "aniline_tertiary"), 0.30),
        (("azine_polyaza",), 0.585),
        (("other_heteroaromatic",), 0.50),
        (("aliphatic_primary", "aliphatic_secondary", "aliphatic_tertiary"), 0.40),
        (("pyridine",), 0.30),
        (("imidazole",), 0.44),
        (("amidine_guanidine",), 0.47),
    ],
)
def test_accuracy_on_the_iupac_dataset(pka_dataset_dir, classes, limit):
    mae, n = _accuracy(pka_dataset_dir / "amine_pka_dev.csv", classes)
    assert n > 20
    assert mae <= limit


def test_multisite_accuracy(pka_dataset_dir):
    mae, n = _accuracy(pka_dataset_dir / "amine_pka_multisite_dev.csv")
    assert n > 200 and mae <= 0.52


@pytest.mark.parametrize(
    "smiles",
    [
        "CC(=O)NC", "CS(=O)(=O)NC", "CC(C)(C)OC(=O)NC", "O=C1CCC(=O)N1", "NC(N)=O", "c1cc[nH]c1",
        "c1ccc2[nH]ccc2c1", "O=[N+]([O-])c1ccccc1", "CC#N", "[O-][n+]1ccccc1", "C[N+](C)(C)C",
        "CN(C)C=O", "O=C1CCCN1",
    ],
)
def test_non_basic_nitrogens_are_never_basic(smiles):
    for s in basic_sites(smiles):
        assert s.pka is None or s.pka < 1.0, (smiles, s)


@pytest.mark.parametrize(
    "smiles,site_smarts",
    [
        ("C1CNCCN1", "[NX3;H1]"),  # piperazine: either secondary N
        ("CN(C)c1ccncc1", "n"),  # DMAP: the ring N (the amidine-like resonance)
        ("Nc1ccccn1", "n"),  # 2-aminopyridine: the ring N
        ("c1ccc2[nH]cnc2c1", "[nX2]"),  # benzimidazole: the pyridine-type N
        ("CN1CCN(C)CC1", "[NX3]"),
        ("NCCc1c[nH]cn1", "[NH2]"),  # histamine: the side-chain amine first
        ("CN1CCC[C@H]1c1cccnc1", "[NX3;R;!a]"),  # nicotine: the pyrrolidine N
    ],
)
def test_first_proton_goes_to_the_right_atom(smiles, site_smarts):
    mol = Chem.MolFromSmiles(smiles)
    allowed = {m[0] for m in mol.GetSubstructMatches(Chem.MolFromSmarts(site_smarts))}
    site, _ = first_protonation(smiles)
    assert site.atom_index in allowed


def test_second_protonation_is_lowered():
    # piperazine 9.73 / 5.35 (CRC, from memory): the second proton goes on much less easily
    sites = basic_sites("C1CNCCN1")
    second = [s for s in sites if s.protonation_order == 2][0]
    assert second.stepwise_pka == pytest.approx(5.35 + 0.30, abs=0.6)  # micro = macro + log 2
    en = [s for s in basic_sites("NCCN") if s.protonation_order == 2][0]
    assert en.stepwise_pka < 8.0  # ethylenediamine pKa2 6.85 (CRC, from memory)


def test_salts_report_the_pka_of_their_n_h():
    [site] = basic_sites("[NH3+]Cc1ccccc1")
    assert site.kind == "ammonium" and site.pka == pytest.approx(9.3, abs=0.2)


def test_every_site_names_its_method_and_source():
    for s in basic_sites("CCN(CC)CCNc1ccc(cc1)C(=O)N"):
        assert s.method and s.source
        if s.pka is not None:
            assert s.uncertainty is not None and s.uncertainty > 0


def test_atom_indices_refer_to_the_molecule_as_given():
    # 4-aminobenzylamine written with the aryl N first: atom 0 is the aniline N, atom 6 the CH2-NH2
    sites = {s.atom_index: s.kind for s in basic_sites("Nc1ccc(CN)cc1")}
    assert sites == {0: "aryl_amine", 6: "primary_amine"}
    sites = {s.atom_index: s.kind for s in basic_sites("NCc1ccc(N)cc1")}
    assert sites == {0: "primary_amine", 6: "aryl_amine"}


# Ring systems and effects added with the fused-azine anchors (values from memory, Perrin's
# compilation and the CRC Handbook; the qualitative facts are textbook heterocyclic chemistry,
# J. A. Joule, K. Mills, Heterocyclic Chemistry, 5th ed., Wiley 2010).
def _first(smiles):
    site, macro = first_protonation(smiles)
    return site, macro


def test_purines_protonate_on_the_pyrimidine_ring():
    from rdkit import Chem

    for smiles in ("c1ncc2[nH]cnc2n1", "Nc1ncnc2[nH]cnc12", "Cn1cnc2cncnc21"):
        site, _ = _first(smiles)
        mol = Chem.MolFromSmiles(smiles)
        ring6 = [r for r in mol.GetRingInfo().AtomRings() if len(r) == 6][0]
        assert site.atom_index in ring6, smiles


def test_1h_1_2_4_triazole_is_a_weak_base():
    _, macro = _first("c1nc[nH]n1")  # 2.19 [P65], the 1H tautomer as usually drawn
    assert abs(macro - 2.19) <= 0.3


def test_4h_1_2_4_triazole_is_a_stronger_base_than_the_1h_tautomer():
    # 4-methyl-4H-1,2,4-triazole about 3.4 (from memory), above 1-methyl-1,2,4-triazole 3.2
    # (from memory) and 1H-1,2,4-triazole 2.19 [P65]: its basic N sits 1,3 to the pyrrole-type N
    # as in imidazole, with only the second ring N beside it
    site, four = _first("Cn1cnnc1")
    assert site.kind == "pyridine_type"
    assert abs(four - 3.4) <= 0.5
    _, one_h = _first("c1nc[nH]n1")
    assert four > one_h


def test_fused_ring_substituents_act_on_naphthylamines():
    _, parent = _first("Nc1cccc2ccccc12")  # 1-naphthylamine 3.92 (CRC)
    _, nitro = _first("Nc1cccc2c([N+](=O)[O-])cccc12")
    assert abs(parent - 3.92) <= 0.2
    assert nitro < parent - 0.5


def test_ortho_alkyl_twists_a_dimethylamino_group_and_raises_its_basicity():
    _, plain = _first("CN(C)c1ccccc1")  # N,N-dimethylaniline 5.07 (CRC)
    _, ortho = _first("CN(C)c1ccccc1C")  # N,N-dimethyl-o-toluidine 5.86 (CRC, from memory)
    assert ortho > plain + 0.4
    assert abs(ortho - 5.86) <= 0.5


def test_fused_azines_take_their_parent_values():
    # quinoxaline 0.60, phthalazine 3.47, 1,8-naphthyridine 3.39, 7-azaindole 4.59 [P65]
    for smiles, value in (("c1ccc2nccnc2c1", 0.60), ("c1ccc2cnncc2c1", 3.47), ("c1cnc2ncccc2c1", 3.39), ("c1cnc2[nH]ccc2c1", 4.59)):
        _, macro = _first(smiles)
        assert abs(macro - value) <= 0.35, (smiles, macro)


def test_flanking_groups_twist_a_dimethylamino_group_out_of_conjugation():
    # steric inhibition of resonance (Wepster): 3,5-dimethyl-4-(dimethylamino)pyridine is less
    # basic than DMAP (9.60, Perrin) although methyl groups alone raise pyridine basicity
    _, dmap = _first("CN(C)c1ccncc1")
    _, flanked = _first("Cc1cncc(C)c1N(C)C")
    _, lutidine = _first("Cc1cnccc1C")  # 3,4-lutidine 6.46 (CRC, from memory), above pyridine
    assert flanked < dmap
    assert lutidine > 5.25


def test_substituents_on_the_benzo_ring_act_on_benzimidazoles():
    # 1-methylbenzimidazole 5.57 (Perrin, from memory); a nitro group on the benzo ring lowers it
    _, parent = _first("Cn1cnc2ccccc21")
    _, nitro = _first("Cn1cnc2ccc([N+](=O)[O-])cc21")
    assert nitro < parent - 1.0


def test_a_peri_group_crowds_the_quinoline_nitrogen():
    # 8-methylquinoline 4.60 against quinoline 4.90, and 2,8-dimethylquinoline below quinaldine
    # 5.83 (Perrin; the substituted values from memory): a methyl group raises pyridine basicity
    # everywhere else
    _, quinoline = _first("c1ccc2ncccc2c1")
    _, peri = _first("Cc1cccc2cccnc12")
    _, quinaldine = _first("Cc1ccc2ccccc2n1")
    _, both = _first("Cc1ccc2cccc(C)c2n1")
    assert peri < quinoline
    assert abs(peri - 4.60) <= 0.5
    assert both < quinaldine - 0.8


def test_a_donor_para_to_the_other_ring_nitrogen_adds_little():
    # 2,4-diaminopyrimidine 7.40, 4,6-diaminopyrimidine 5.8 (Perrin, from memory): additive
    # sums put both near 7.3
    _, d24 = _first("Nc1ccnc(N)n1")
    _, d46 = _first("Nc1cc(N)ncn1")
    assert abs(d24 - 7.40) <= 0.5
    assert abs(d46 - 5.8) <= 0.5
    assert d46 < d24 - 0.8


def test_para_acceptors_on_pyridines_act_by_their_field_effect():
    # the class model alone (these are also reference compounds): 4-acetylpyridine 3.51,
    # isonicotinamide 3.61, 4-cyanopyridine 1.90 (CRC, from memory); sigma_p puts them 0.5-1.4
    # units too low
    from chemcheck.basicity import model

    for smiles, value in (("CC(=O)c1ccncc1", 3.51), ("NC(=O)c1ccncc1", 3.61), ("N#Cc1ccncc1", 1.90)):
        mol = Chem.MolFromSmiles(smiles)
        n = next(a.GetIdx() for a in mol.GetAtoms() if a.GetIsAromatic() and a.GetAtomicNum() == 7)
        pka, _ = model.azine(mol, n)
        assert abs(pka - value) <= 0.6, (smiles, pka)


def test_a_pyridine_aldehyde_is_counted_as_its_hydrate():
    # pyridine-4-carboxaldehyde is largely hydrated in water; its measured pKa (4.7, Perrin,
    # from memory) lies well above that of 4-acetylpyridine (3.51), which is not
    _, aldehyde = _first("O=Cc1ccncc1")
    _, ketone = _first("CC(=O)c1ccncc1")
    assert aldehyde > ketone + 0.7


def test_substituents_next_to_the_basic_nitrogen_of_an_azole():
    # 3,5-dimethylpyrazole 4.1 against pyrazole 2.48 (Perrin, the first from memory)
    _, value = _first("Cc1cc(C)[nH]n1")
    assert abs(value - 4.1) <= 0.5
    # an electron-poor group on the pyrrole-type N lowers an imidazole: 1-benzylimidazole 6.7
    # (from memory) against 1-methylimidazole 7.06 (Perrin)
    _, benzyl = _first("c1ccc(Cn2ccnc2)cc1")
    assert 6.3 <= benzyl < 7.06


def test_ring_amidines():
    # 2-methyl-2-imidazoline (lysidine) about 11.0 and 2-phenyl-2-imidazoline about 9.9 (from
    # memory): five-membered cyclic amidines lie about a unit below their open-chain parents
    # (acetamidine 12.4, benzamidine 11.6, Perrin)
    for smiles, value in (("CC1=NCCN1", 11.0), ("c1ccc(C2=NCCN2)cc1", 9.9)):
        _, macro = _first(smiles)
        assert abs(macro - value) <= 0.6, (smiles, macro)


def test_covalent_hydration_sites_and_hydrate():
    from chemcheck.basicity import hydration

    def sites(smiles):
        return hydration.hydration_sites(Chem.MolFromSmiles(smiles))

    # C4 of quinazoline and of pteridine take water in the cation (Albert, Armarego & Spinner
    # 1961); quinoline, 4-methylquinazoline, a tetrahydroquinazoline and 2-chloroquinazoline do not
    assert len(sites("c1ccc2ncncc2c1")) == 1
    assert len(sites("c1cnc2ncncc2n1")) == 1
    for smiles in ("c1ccc2ncccc2c1", "Cc1ncnc2ccccc12", "c1ncc2c(n1)CCCC2", "Clc1ncc2ccccc2n1"):
        assert sites(smiles) == [], smiles
    # a C4 carrying a carbonyl, nitrile or CF3 group is electrophilic enough to take the OH (as
    # such groups favour the hydrates of ketones); an alkyl or aryl group at C4 blocks it
    for smiles in ("CCOC(=O)c1ncnc2ccccc12", "NC(=O)c1ncnc2ccccc12", "FC(F)(F)c1ncnc2ccccc12"):
        assert len(sites(smiles)) == 1, smiles
    for smiles in ("CCc1ncnc2ccccc12", "c1ccc(-c2ncnc3ccccc23)cc1"):
        assert sites(smiles) == [], smiles
    # an alkoxy, alkylthio or amino group at C2 leaves the site; the hydration constant, which
    # falls as the aromatic cation's pKa rises, decides how much the hydrate counts
    for smiles in ("COc1ncc2nccnc2n1", "CSc1ncc2nccnc2n1", "Nc1ncc2ccccc2n1"):
        assert len(sites(smiles)) == 1, smiles
    site, _ = _first("CSc1ncc2nccnc2n1")
    assert "hydrated" in site.method
    ester = hydration.hydrate(Chem.MolFromSmiles("CCOC(=O)c1ncnc2ccccc12"), sites("CCOC(=O)c1ncnc2ccccc12")[0])
    assert Chem.MolToSmiles(ester) == Chem.MolToSmiles(Chem.MolFromSmiles("CCOC(=O)C1(O)NC=Nc2ccccc21"))
    mol = Chem.MolFromSmiles("c1ccc2ncncc2c1")
    hydrated = hydration.hydrate(mol, sites("c1ccc2ncncc2c1")[0])
    assert Chem.MolToSmiles(hydrated) == Chem.MolToSmiles(Chem.MolFromSmiles("OC1NC=Nc2ccccc21"))


def test_covalent_hydration_raises_the_measured_basicity():
    # pteridine 4.05 (Albert, from memory) although its aromatic cation is a far weaker base;
    # 4-methylquinazoline, which cannot hydrate at C4, 2.52 (from memory) below quinazoline 3.51
    site, pteridine = _first("c1cnc2ncncc2n1")
    assert "hydrated" in site.method
    assert pteridine >= 2.0
    site, methyl = _first("Cc1ncnc2ccccc12")
    assert "hydrated" not in site.method
    assert methyl < 3.51
    assert abs(methyl - 2.52) <= 0.6


def test_heteroatoms_on_the_amidine_carbon():
    # O-methylisourea 9.7 and S-methylisothiourea 9.8 (from memory), below acetamidine 12.4
    for smiles, value in (("COC(=N)N", 9.7), ("CSC(=N)N", 9.8)):
        _, macro = _first(smiles)
        assert abs(macro - value) <= 1.0, (smiles, macro)


def test_a_counter_ion_or_second_component_keeps_the_reference_value():
    # pyridine 5.25 (CRC) in a mixture with acetic acid, quinazoline 3.51 (Perrin) as its salt
    pyridine = [s for s in basic_sites("c1ccncc1.CC(=O)O") if s.pka is not None]
    assert [s.method for s in pyridine] == ["reference value"]
    assert pyridine[0].pka == 5.25
    salt = max((s for s in basic_sites("c1ccc2nc[nH+]cc2c1.[Cl-]") if s.pka is not None), key=lambda s: s.pka)
    assert salt.kind == "ammonium" and salt.pka == 3.51


def test_crowded_ammonium_ions_are_less_solvated():
    # 2,2,6,6-tetramethylpiperidine 11.07 (from memory), about as basic as piperidine 11.12
    # (CRC); the alkyl sigma* alone would put it near 12.4
    _, tmp = _first("CC1(C)CCCC(C)(C)N1")
    assert tmp <= 11.8


def test_alpha_branching_does_not_raise_a_primary_amine():
    # sec-butylamine 10.56 and n-butylamine 10.64 (CRC, from memory): in water branching at
    # the alpha carbon adds nothing; the alkyl sigma* alone would put 3-pentylamine near 11.0
    _, sec_butyl = _first("CCC(C)N")
    _, pentyl3 = _first("CCC(N)CC")
    assert abs(sec_butyl - 10.56) <= 0.3
    assert pentyl3 <= 10.85


# One effect of the additive model each, against a textbook value (all from memory):
# (effect, SMILES, value, tolerance, source and what the sums without the effect gave)
_TEXTBOOK_EFFECTS = [
    ("pyridazine ring N conjugation", "Nc1cccnn1", 5.19, 0.5,
     "3-aminopyridazine (Albert, Goldacre & Phillips, J. Chem. Soc. 1948); sigma_m alone about 3.3"),
    ("alkylthio para to a pyridine N", "CSc1ccncc1", 5.94, 0.4,
     "4-(methylthio)pyridine; sigma_p 0.00 gives pyridine's 5.25"),
    ("alkoxy between two ring N", "COc1ncccn1", 1.0, 0.5,
     "2-methoxypyrimidine; the 2-methoxypyridine increment (-1.97) puts it near -0.7"),
    ("no resonance across a fusion bond", "Nc1cccc2ncccc12", 5.46, 0.4,
     "5-aminoquinoline (Albert); sigma_p puts it near 6.9"),
    ("resonance along the periphery", "Nc1ccc2cccnc2c1", 6.65, 0.4, "7-aminoquinoline (Albert)"),
    ("fused azole N-H as a donor", "c1cc2[nH]cnc2cn1", 6.10, 0.5,
     "imidazo[4,5-c]pyridine (Mason); taken as an acylamino group it came out near 4"),
    ("withdrawing groups on an amine", "NCCCl", 8.79, 0.3,
     "2-chloroethylamine (CRC); the tabulated sigma* leave it 0.4 too basic"),
    ("withdrawing groups on an amine", "N#CCN", 5.34, 0.4,
     "aminoacetonitrile (Perrin, Dempsey & Serjeant); the tabulated sigma* leave it 0.9 too basic"),
]


@pytest.mark.parametrize("effect,smiles,value,tol,source", _TEXTBOOK_EFFECTS)
def test_model_effects_against_textbook_values(effect, smiles, value, tol, source):
    _, predicted = _first(smiles)
    assert abs(predicted - value) <= tol, f"{effect}: {predicted} against {value} ({source})"


def test_resonance_does_not_cross_the_fusion_bond():
    # 5- and 7-aminoquinoline (values in _TEXTBOOK_EFFECTS): both positions are an odd number of
    # bonds from N1, but only C7 is conjugated with it along the periphery
    _, five = _first("Nc1cccc2ncccc12")
    _, seven = _first("Nc1ccc2cccnc2c1")
    assert seven > five + 0.8


def test_alkyl_groups_beyond_the_alpha_carbon_add_little():
    # common practice: n-propyl-, n-butyl- and n-hexylamine all lie within 0.1 of ethylamine
    # (10.57-10.65, CRC, from memory); alkyl sigma* summed along a ring both ways round put
    # 3,3,5,5-tetramethylpiperidine 0.6 above piperidine (11.12)
    _, piperidine = _first("C1CCNCC1")
    _, tetramethyl = _first("CC1(C)CNCC(C)(C)C1")
    assert abs(tetramethyl - piperidine) <= 0.3


def test_a_sulfinyl_group_withdraws_less_than_a_sulfonyl_group():
    # sigma_m 0.52 against 0.60 for methylsulfinyl and methylsulfonyl (Hansch, Leo & Taft 1991,
    # as recalled): the sulfoxide is no longer taken for the sulfone
    _, sulfinyl = _first("CS(=O)c1cccnc1")
    _, sulfonyl = _first("CS(=O)(=O)c1cccnc1")
    assert sulfinyl > sulfonyl + 0.3


def test_an_amino_group_at_c2_levels_the_effect_of_a_fused_ring():
    # 2-aminobenzimidazole about 7.5 against benzimidazole 5.53, 2-aminoimidazole about 8.5
    # against imidazole 6.95 (from memory; P65 for the parents): the guanidinium-like cation carries its
    # charge largely outside the ring, and the benzo ring costs less than in the parents
    _, amino_benzo = _first("Nc1nc2ccccc2[nH]1")
    _, benzo = _first("c1nc2ccccc2[nH]1")
    _, amino = _first("Nc1ncc[nH]1")
    _, parent = _first("c1nc[nH]c1")
    assert abs(amino_benzo - 7.5) <= 0.5
    assert amino - amino_benzo < parent - benzo - 0.3


def test_an_amino_group_beside_the_n_of_a_quinoline_turns_the_benzo_ring_into_a_help():
    # 2-aminoquinoline 7.34 above 2-aminopyridine 6.86, while quinoline 4.90 lies below
    # pyridine 5.25 (CRC, from memory)
    _, amino_quinoline = _first("Nc1ccc2ccccc2n1")
    _, amino_pyridine = _first("Nc1ccccn1")
    _, quinoline = _first("c1ccc2ncccc2c1")
    assert abs(amino_quinoline - 7.34) <= 0.3
    assert amino_quinoline > amino_pyridine > quinoline


def test_an_acyloxy_group_withdraws_more_than_a_hydroxy_group():
    # field constants F: OAc 0.41 against OH 0.33 and OMe 0.29 [HLT, from memory]; the ester of
    # an amino alcohol is the weaker base
    _, ester = _first("CC(=O)OCCN(C)C")
    _, alcohol = _first("OCCN(C)C")  # 2-dimethylaminoethanol 9.23 (CRC, from memory)
    _, ether = _first("COCCN(C)C")
    assert abs(alcohol - 9.23) <= 0.4
    assert ester < alcohol - 0.4
    assert ester < ether


def test_larger_n_alkyl_groups_turn_a_dialkylamino_group_out_of_the_ring():
    # N,N-dimethylaniline 5.07 and N,N-diethylaniline 6.57 (CRC): the mixed N-ethyl-N-methyl
    # aniline lies between them, and an N-tert-butyl group raises the basicity further
    _, dma = _first("CN(C)c1ccccc1")
    _, mixed = _first("CCN(C)c1ccccc1")
    _, dea = _first("CCN(CC)c1ccccc1")
    _, tbu = _first("CN(c1ccccc1)C(C)(C)C")
    assert dma + 0.3 < mixed < dea - 0.3
    assert tbu > mixed + 0.5


def test_a_para_nitro_group_on_a_pyridine_acts_by_its_field_effect():
    # 4-nitropyridine 1.61 (CRC, from memory); the field constant F 0.65 of the nitro group
    # [HLT] fits it, sigma_m 0.71 puts it half a unit too low
    from chemcheck.basicity import model

    mol = Chem.MolFromSmiles("O=[N+]([O-])c1ccncc1")
    pka, _ = model.azine(mol, 6)
    assert abs(pka - 1.61) <= 0.3


def test_a_donor_meta_to_the_n_adds_little_beside_an_amino_group_conjugated_with_it():
    # 3,4-diaminopyridine 9.08 against 4-aminopyridine 9.17, 2,5-diaminopyridine 6.48 against
    # 2-aminopyridine 6.86 (from memory), while 3-aminopyridine (6.04) lies 0.8 above pyridine
    _, d34 = _first("Nc1ccncc1N")
    _, d25 = _first("Nc1ccc(N)nc1")
    _, amino3 = _first("Nc1cccnc1")
    assert abs(d34 - 9.08) <= 0.3
    assert abs(d25 - 6.48) <= 0.4
    assert abs(amino3 - 6.04) <= 0.2


def test_an_amino_group_in_a_vinylogous_amide_gives_less_to_the_ring_n(monkeypatch):
    # 4-amino-1-methyl-6-pyrimidinone: the amino lone pair is shared with the C6=O through C5
    # (N-C=C-C=O), so it raises the basicity of N3 less than the same amino group would
    from chemcheck.basicity import constants as K
    from chemcheck.basicity import model

    mol = Chem.MolFromSmiles("Cn1cnc(N)cc1=O")
    with_loss, _ = model.azine(mol, 3)
    monkeypatch.setattr(K, "DONOR_CROSS_OXO", 0.0)
    without, _ = model.azine(mol, 3)
    assert with_loss < without - 0.5


def test_peri_groups_on_both_sides_squeeze_the_n_h_of_an_acridinium_ion():
    # as for 2,8-dimethylquinoline (4.1) against 8-methylquinoline (4.6) (from memory): a
    # second peri methyl lowers 4-methylacridine further, where a methyl group far from the N
    # would raise it
    _, one = _first("Cc1cccc2cc3ccccc3nc12")
    _, two = _first("Cc1cccc2cc3cccc(C)c3nc12")
    assert two < one - 0.3


def test_fluorinated_sulfur_groups_withdraw_far_more_than_their_alkyl_analogues():
    # sigma_m / sigma_p- of SCF3 0.40 / 0.57 and SO2CF3 0.83 / 1.63 against SMe 0.15 / 0.06 and
    # SO2Me 0.60 / 1.13 [HLT, from memory]; 4-(methylthio)aniline 4.35 (from memory): the SMe
    # group, a weak pi-acceptor towards the aniline N, takes its sigma_p-
    _, sme = _first("CSc1ccc(N)cc1")
    _, sme_meta = _first("CSc1cccc(N)c1")
    _, scf3_meta = _first("Nc1cccc(SC(F)(F)F)c1")
    _, so2me = _first("CS(=O)(=O)c1ccc(N)cc1")
    _, so2cf3 = _first("Nc1ccc(S(=O)(=O)C(F)(F)F)cc1")
    assert abs(sme - 4.35) <= 0.15
    assert scf3_meta < sme_meta - 0.5
    assert so2cf3 < so2me - 1.0


def test_a_dihalomethyl_group_withdraws_between_a_halomethyl_and_a_trihalomethyl_group():
    # sigma_m CH2Cl 0.11, CHF2 0.29, CHCl2 0.31, CF3 0.43 [HLT, from memory]; CHF2 used to be read
    # as CF3 and CHCl2 as CH2Cl
    values = [_first(f"{g}c1cccnc1")[1] for g in ("FC", "FC(F)", "ClC(Cl)", "FC(F)(F)")]
    assert values[0] > values[1] + 0.7
    assert values[3] < values[1] - 0.5
    assert abs(values[1] - values[2]) < 0.3


def test_the_group_on_the_ring_n_of_a_cyclic_amidine_counts_through_its_sigma_star():
    # 2-imino-1-methylpyrimidine against its 1-benzyl and 1-propargyl analogues: sigma* of
    # CH2Ph 0.215 and CH2C#CH about 0.64 [PDS Taft table] lower the amidine's basicity, as
    # they do on the N of an open-chain amidine
    _, methyl = _first("Cn1cccnc1=N")
    _, benzyl = _first("N=c1ncccn1Cc1ccccc1")
    _, propargyl = _first("C#CCn1cccnc1=N")
    assert methyl - 0.8 < benzyl < methyl - 0.2
    assert propargyl < benzyl - 0.5


def test_the_ring_n_of_a_picolyl_group_acts_through_the_benzylamine_hammett_terms():
    # 2-picolylamine 8.79 against benzylamine 9.34 (CRC, from memory); the ring N acts as a
    # substituent with its sigma (meta 0.65, para 0.78) through rho 1.06 of benzylammonium ions
    # [PDS], so the 4-picolyl group pulls more than the 3-picolyl group
    _, benzyl = _first("NCc1ccccc1")
    _, pic2 = _first("NCc1ccccn1")
    _, pic3 = _first("NCc1cccnc1")
    _, pic4 = _first("NCc1ccncc1")
    assert abs(pic2 - 8.79) <= 0.2
    assert pic4 < pic3 < benzyl - 0.4


def test_an_ortho_group_twists_an_nn_dimethylamino_group_and_acts_by_its_field_effect():
    # methyl anthranilate 2.23 against aniline 4.60 (from memory): the ortho ester holds the
    # N-H in a hydrogen bond and takes the lone pair. Beside an NMe2 group it has no N-H to hold
    # and turns the NMe2 out of the ring plane (Wepster), so it costs far less (as the ortho
    # methyl group of N,N-dimethyl-o-toluidine, 5.86, raises N,N-dimethylaniline, 5.07, CRC)
    _, dma = _first("CN(C)c1ccccc1")
    _, ester = _first("COC(=O)c1ccccc1N(C)C")
    _, anthranilate = _first("COC(=O)c1ccccc1N")
    assert dma - ester < 1.0
    assert anthranilate < ester - 1.5


def test_a_nitro_group_beside_the_basic_n_of_an_imidazole_is_in_push_pull_with_the_ring_nh():
    # 4(5)-nitroimidazole about -0.05, metronidazole (a 5-nitroimidazole) 2.55 (from memory):
    # the 4-nitro group is conjugated with the pyrrole-type N through C5=C4 and takes sigma_p-
    _, nitro4 = _first("[O-][N+](=O)c1c[nH]cn1")
    _, metronidazole = _first("Cc1ncc([N+](=O)[O-])n1CCO")
    assert abs(nitro4 - (-0.05)) <= 0.8
    assert abs(metronidazole - 2.55) <= 0.4


def test_larger_alkyl_groups_beside_the_basic_n_of_a_pyrazole_gain_nothing():
    # 1-methylpyrazole 2.06 (Perrin, as recalled); the N-H of the pyrazolium ion sits next to
    # the N-alkyl group, and a bulkier group hinders its solvation as much as its sigma* helps
    _, methyl = _first("Cn1cccn1")
    _, ethyl = _first("CCn1cccn1")
    _, tbu = _first("CC(C)(C)n1cccn1")
    _, ester = _first("CCOC(=O)Cn1cccn1")
    assert methyl == pytest.approx(2.06, abs=0.01)
    assert abs(ethyl - methyl) <= 0.3 and abs(tbu - methyl) <= 0.3
    assert ester < methyl - 0.5


@pytest.mark.parametrize(
    "tautomers",
    [
        ("CC(=O)N=C(N)N", "CC(=O)NC(=N)N"),  # acetylguanidine
        ("CN1CC(=O)N=C1N", "CN1CC(=O)NC1=N"),  # creatinine, as usually drawn and as the imine
        ("CC(=O)N=C(C)N", "CC(=O)NC(C)=N"),  # N-acetylacetamidine
    ],
)
def test_an_acylated_amidine_is_basic_however_its_tautomer_is_drawn(tautomers):
    # with the acyl group on the =N the unit used to be reported as not basic at all
    values = [_first(t)[1] for t in tautomers]
    assert all(v is not None and v > 4.0 for v in values), values
    assert abs(values[0] - values[1]) <= 0.3


def test_acyl_and_sulfonyl_guanidines():
    # acetylguanidine 8.3 (from memory); a sulfonylguanidine is not protonated in water above
    # pH 1, so sulfaguanidine takes its first proton on the aniline N (sulfanilamide about 2)
    site, acetyl = _first("CC(=O)N=C(N)N")
    assert site.kind == "guanidine" and abs(acetyl - 8.3) <= 0.6
    site, sulfa = _first("NC(N)=NS(=O)(=O)c1ccc(N)cc1")
    assert site.kind == "aryl_amine" and sulfa < 3.0
    guanidine_sites = [s for s in basic_sites("CS(=O)(=O)N=C(N)N") if s.kind == "guanidine" and s.pka is not None]
    assert guanidine_sites and all(s.pka < 1.0 for s in guanidine_sites)


@pytest.mark.parametrize(
    "amino,imino",
    [
        ("Nc1ccccn1", "N=c1cccc[nH]1"),  # 2-aminopyridine
        ("Nc1ccncc1", "N=c1cc[nH]cc1"),  # 4-aminopyridine
        ("Nc1cc[nH]c(=O)n1", "N=c1cc[nH]c(=O)[nH]1"),  # cytosine
        ("Nc1nccs1", "N=c1[nH]ccs1"),  # 2-aminothiazole
        ("CC(=O)Nc1ccccn1", "CC(=O)N=c1cccc[nH]1"),  # 2-acetamidopyridine
    ],
)
def test_an_imino_tautomer_gets_the_value_of_its_amino_form(amino, imino):
    # both tautomers give the same cation, and the amino form dominates in water (Katritzky);
    # read as drawn, the imino form looked like a cyclic amidine (pKa about 13)
    site_a, a = _first(amino)
    site_i, i = _first(imino)
    assert i == pytest.approx(a, abs=0.01)
    assert site_i.atom_index == site_a.atom_index or "tautomer" in site_i.method


def test_a_fixed_imine_and_the_pyridones():
    # 1-methyl-2-iminopyridine 13.0 (from memory) keeps its value: no N-H to move. 4-Pyridone
    # 3.27 and 2-pyridone 0.75 (Albert, from memory) get one value however they are drawn
    _, fixed = _first("CN1C=CC=CC1=N")
    assert fixed > 12.0
    _, pyridone4 = _first("O=c1cc[nH]cc1")
    _, hydroxy4 = _first("Oc1ccncc1")
    assert pyridone4 == pytest.approx(hydroxy4, abs=0.01)
    assert abs(pyridone4 - 3.27) <= 0.3
    _, pyridone2 = _first("O=c1cccc[nH]1")
    _, hydroxy2 = _first("Oc1ccccn1")
    assert pyridone2 == pytest.approx(hydroxy2, abs=0.01) and pyridone2 < 1.0


def test_purinones_take_their_reference_values():
    # hypoxanthine 1.98, guanine 3.3 and caffeine 0.6 (N7; Perrin and CRC, as recalled): the
    # class model puts the N7 of a 6-oxopurine one to three units too low
    for smiles, value in (
        ("O=c1[nH]cnc2[nH]cnc12", 1.98), ("Nc1nc2[nH]cnc2c(=O)[nH]1", 3.3),
        ("Cn1cnc2c1c(=O)n(C)c(=O)n2C", 0.6), ("CN1C(=O)N(C)c2ncn(C)c2C1=O", 0.6),
    ):
        site, macro = _first(smiles)
        assert site.method == "reference value", smiles
        assert abs(macro - value) <= 0.31, smiles


@pytest.mark.parametrize(
    "smiles,value,tolerance",
    [
        ("NCC(=O)O", 9.78, 0.3),  # glycine (CRC, from memory)
        ("CC(N)C(=O)O", 9.87, 0.3),  # alanine
        ("NCCC(=O)O", 10.24, 0.3),  # beta-alanine
        ("NCCCC(=O)O", 10.56, 0.3),  # 4-aminobutanoic acid
        ("NCCS(=O)(=O)O", 9.06, 0.4),  # taurine
        ("Nc1ccc(C(=O)O)cc1", 2.4, 0.3),  # 4-aminobenzoic acid: a weak base keeps the neutral COOH
    ],
)
def test_an_amino_acid_is_read_as_its_zwitterion(smiles, value, tolerance):
    # drawn neutral, glycine's amine beside a COOH came out at 7.3; in water the carboxylic acid
    # has given its proton to the amine
    site, macro = _first(smiles)
    assert abs(macro - value) <= tolerance, (smiles, macro)
    if value > 5:
        assert "zwitterion" in site.method


def test_proton_sponge_is_a_strong_base():
    # 1,8-bis(dimethylamino)naphthalene 12.1 (Alder et al. 1968, as recalled): read as an
    # N,N-dimethylaniline it would come out near 5
    site, macro = _first("CN(C)c1cccc2cccc(N(C)C)c12")
    assert macro > 11.5 and site.method == "reference value"


def test_a_cyano_group_on_a_guanidine_n_removes_its_basicity():
    # cyanoguanidine about 0 (from memory); cimetidine 6.8 (from memory) takes its proton on the
    # imidazole, not on its cyanoguanidine
    _, cyano = _first("N#CN=C(N)N")
    assert cyano < 1.0
    site, cimetidine = _first("CN=C(NC#N)NCCSCc1[nH]cnc1C")
    assert site.kind == "pyridine_type" and abs(cimetidine - 6.8) <= 0.4


def test_the_ring_o_or_s_of_a_furfuryl_or_thenyl_group_withdraws():
    # furfurylamine 8.89 against benzylamine 9.34 (from memory)
    _, furfuryl = _first("NCc1ccco1")
    assert abs(furfuryl - 8.89) <= 0.3


def test_an_electron_withdrawing_group_on_an_imine_n_lowers_it():
    # diazepam 3.4 (from memory): its imine N carries the CH2-C(=O) of the lactam; an N-ethyl
    # benzaldimine keeps the class value
    _, diazepam = _first("CN1C(=O)CN=C(c2ccccc2)c2cc(Cl)ccc21")
    _, plain = _first("CCN=Cc1ccccc1")
    assert diazepam < plain - 1.0


def test_a_ring_substituent_on_both_paths_from_the_n_counts_once():
    # cocaine 8.6 (from memory): its 3-benzoyloxy group lies on both ring paths from the tropane
    # N; summed along each path, the ester's pull came out twice and cocaine at 7.7
    _, cocaine = _first("COC(=O)[C@H]1[C@@H](OC(=O)c2ccccc2)C[C@@H]2CC[C@H]1N2C")
    assert abs(cocaine - 8.6) <= 0.3


def test_the_salt_of_an_amino_acid_reports_the_n_h_of_its_zwitterion():
    # glycine hydrochloride and the drawn zwitterion: the ammonium's pKa is glycine's 9.78 (CRC,
    # from memory), not that of an amine beside a neutral COOH
    for smiles in ("OC(=O)C[NH3+].[Cl-]", "[NH3+]CC(=O)[O-]"):
        [site] = [s for s in basic_sites(smiles) if s.kind == "ammonium"]
        assert abs(site.pka - 9.78) <= 0.3, smiles


def test_an_acylated_n_withdraws_more_than_an_alkylated_one():
    # 1-acetylpiperazine 7.94 against N-methylpiperazine 9.0 (from memory)
    _, acetyl = _first("CC(=O)N1CCNCC1")
    _, methyl = _first("CN1CCNCC1")
    assert abs(acetyl - 7.94) <= 0.3
    assert acetyl < methyl - 0.8


def test_a_twisted_para_nitro_group_on_a_pyridine_withdraws_no_more_than_a_planar_one():
    # Para to a pyridine-type N a nitro group acts by its field effect alone (its resonance
    # cannot reach the in-plane lone pair); methyl groups beside it twist it out of the ring
    # plane, which takes no resonance away that was counted, so they only add their own small
    # donation: 3-methyl- and 3,5-dimethyl-4-nitropyridine are stronger bases than
    # 4-nitropyridine (Perrin 1965, from memory: about 2.2 and 2.5 against 1.6)
    base = first_protonation("O=[N+]([O-])c1ccncc1")[1]
    one = first_protonation("Cc1cnccc1[N+](=O)[O-]")[1]
    two = first_protonation("Cc1cncc(C)c1[N+](=O)[O-]")[1]
    assert base < one < two
    assert two - base >= 0.6


def test_a_polar_group_further_out_on_an_alkyl_chain_still_withdraws():
    # Taft and Lewis (J. Am. Chem. Soc. 1958, 80, 2436): sigma_I(X) = 0.45 sigma*(CH2X), with
    # the attenuation of 0.4 per carbon; an OH two carbons out on a pyridine's alkyl group
    # lowers its pKa by a few tenths (pyridine-2-ethanol against 2-ethylpyridine, about 5.3
    # against 5.9, Perrin 1965, from memory), one carbon further out by less
    ethyl = first_protonation("CCc1ccncc1")[1]
    hydroxyethyl = first_protonation("OCCc1ccncc1")[1]
    hydroxypropyl = first_protonation("OCCCc1ccncc1")[1]
    assert 0.1 <= ethyl - hydroxyethyl <= 0.5
    assert 0.0 < ethyl - hydroxypropyl < ethyl - hydroxyethyl
    # the same on an azole carbon: N-acetylhistamine below 4-ethylimidazole (about 7.0 against
    # 7.5, Perrin 1965, from memory)
    assert first_protonation("CC(=O)NCCc1c[nH]cn1")[1] < first_protonation("CCc1c[nH]cn1")[1] - 0.2
    # a plain alkyl chain adds nothing: butyl like ethyl (CRC, from memory: 6.02 against 6.02)
    assert abs(first_protonation("CCCCc1ccncc1")[1] - ethyl) < 0.05


def test_the_group_on_a_ring_n_of_a_pyrimidinone_acts_through_its_sigma_star():
    # as on the pyrrole-type N of an azole: a larger alkyl group gives a little more, an
    # electron-withdrawing one takes basicity away (Taft sigma*: n-Bu -0.13, CH2CF3 +0.92,
    # Perrin, Dempsey & Serjeant 1981, from memory)
    methyl = first_protonation("Cn1cccnc1=O")[1]
    butyl = first_protonation("CCCCn1cccnc1=O")[1]
    trifluoroethyl = first_protonation("FC(F)(F)Cn1cccnc1=O")[1]
    assert 0.1 <= butyl - methyl <= 0.4
    assert methyl - trifluoroethyl >= 1.5


def test_an_electron_withdrawing_group_on_a_conjugated_amino_n_lowers_the_pka():
    # the cation of a 2-aminopyrimidine is amidinium-like, part of its charge on the amino N,
    # so a withdrawing group there (CH2OMe, sigma* 0.52; CH2C#CH, 0.81, Perrin, Dempsey &
    # Serjeant 1981, from memory) costs some basicity, while a methyl group costs none
    methyl = first_protonation("CNc1ncccn1")[1]
    methoxymethyl = first_protonation("COCNc1ncccn1")[1]
    propargyl = first_protonation("C#CCNc1ncccn1")[1]
    assert 0.3 <= methyl - methoxymethyl <= 1.0
    assert methyl - propargyl > methyl - methoxymethyl


def test_a_saturated_ring_fused_on_an_azole_is_two_alkyl_groups_not_a_benzo_ring():
    # benzimidazole 5.53 lies below imidazole 6.95 (Perrin 1965); the 4,5,6,7-tetrahydro
    # compound carries two alkyl groups instead and lies above it, as 4,5-dimethylimidazole
    # does (common practice: alkyl groups raise azole basicity)
    imidazole = first_protonation("c1c[nH]cn1")[1]
    assert first_protonation("c1nc2c([nH]1)CCCC2")[1] > imidazole
    assert first_protonation("c1ccc2[nH]cnc2c1")[1] < imidazole
    assert first_protonation("c1n[nH]c2c1CCCC2")[1] > first_protonation("c1cc[nH]n1")[1]


def test_a_donor_across_the_ring_n_r_of_a_pyrazole_conjugates_with_the_cation():
    # the 1-methylpyrazolium ion has a resonance form Me-N1(+)=C5: an amino group on C5 makes
    # it amidinium-like and raises the pKa well above that of 1-methylpyrazole (2.06, Perrin
    # 1965, from memory), more than an amino group on C4, which conjugates with neither N
    # (J. A. Joule, K. Mills, Heterocyclic Chemistry, 5th ed., Wiley 2010, ch. 22: aminoazoles)
    parent = first_protonation("Cn1cccn1")[1]
    c5 = first_protonation("Cn1nccc1N")[1]
    c4 = first_protonation("Cn1cc(N)cn1")[1]
    assert c5 - parent >= 2.0
    assert c5 > c4


def test_a_peri_oxygen_takes_the_n_h_of_the_cation_instead_of_crowding_it():
    # 8-hydroxyquinoline (oxine) 4.91 is as basic as quinoline 4.90, while 8-methylquinoline is
    # weaker (4.6) (Albert; Perrin 1965, from memory)
    quinoline = first_protonation("c1ccc2ncccc2c1")[1]
    assert abs(first_protonation("Oc1cccc2cccnc12")[1] - 4.91) <= 0.5
    assert first_protonation("Cc1cccc2cccnc12")[1] < quinoline


def test_a_peri_amino_group_holds_the_ring_n_in_a_hydrogen_bond():
    # 8-aminoquinoline 3.99 lies about 0.9 below quinoline 4.90 (Albert, from memory): more than
    # the crowding of a peri methyl group, as its N-H binds the ring N's lone pair in the base.
    # 8-aminoquinoline is also in the reference table, so the class model is asked directly.
    quinoline = _ring_n_model("c1ccc2ncccc2c1")
    assert abs(_ring_n_model("Nc1cccc2cccnc12") - quinoline - (3.99 - 4.90)) <= 0.3
    assert _ring_n_model("Nc1cccc2cccnc12") < _ring_n_model("Cc1cccc2cccnc12")


def test_a_donor_para_to_the_ring_n_r_of_a_cyclic_amidine_conjugates_with_the_cation():
    # 1-methyl-2-iminopyrimidine protonates to a 2-amino-1-methylpyrimidinium ion whose ring
    # N1 carries part of the charge; a dimethylamino group para to N1 conjugates with it (a
    # vinylogous guanidinium) and raises the pKa by well over a unit, far more than a methyl
    # group in the same place (J. A. Joule, K. Mills, Heterocyclic Chemistry, 5th ed., Wiley
    # 2010, ch. 11: amino- and iminopyrimidines)
    parent = first_protonation("Cn1cccnc1=N")[1]
    amino = first_protonation("CN(C)c1ccn(C)c(=N)n1")[1]
    methyl = first_protonation("Cc1ccn(C)c(=N)n1")[1]
    assert amino - parent >= 1.5
    assert amino - parent > 3 * (methyl - parent)


def test_an_aldehyde_or_amino_reference_anchors_only_its_own_kind_of_group():
    # pyridine-3-carbaldehyde's measured 3.80 (CRC, from memory) includes its hydrate and must
    # not anchor the ester that the substructure match also finds; 8-aminoquinoline must not
    # anchor 8-nitroquinoline (a nitro N is not an amino N). Methyl nicotinate lies close to
    # ethyl nicotinate (3.35, CRC, from memory); a nitro group in the benzo ring takes quinoline
    # (4.90, CRC) down by about two units (the nitroquinolines, Albert, from memory).
    ester = [s for s in basic_sites("COC(=O)c1cccnc1") if s.kind == "pyridine_type"][0]
    assert "carbaldehyde" not in ester.method
    assert abs(ester.pka - 3.35) <= 0.35
    # the methyl C of 4-picoline is not the carbonyl C of an ester either: methyl
    # isonicotinate 3.26 (CRC, from memory)
    isonicotinate = [s for s in basic_sites("COC(=O)c1ccncc1") if s.kind == "pyridine_type"][0]
    assert "4-methylpyridine" not in isonicotinate.method
    assert abs(isonicotinate.pka - 3.26) <= 0.3
    nitro = [s for s in basic_sites("O=[N+]([O-])c1cccc2cccnc12") if s.kind == "pyridine_type"][0]
    assert "8-aminoquinoline" not in nitro.method
    assert 1.5 <= 4.90 - nitro.pka <= 3.0


def test_an_anilino_group_gives_less_than_an_alkylamino_group():
    # sigma_p of NHPh -0.56 against NHMe -0.70 (Hansch, Leo & Taft, Chem. Rev. 1991, 91, 165,
    # from memory): with the pyridine rho of 5.9, 4-anilinopyridine lies most of a unit below
    # 4-(methylamino)pyridine (9.65, Perrin's compilation as digitized by IUPAC); by the same constants an
    # N-phenyl melamine lies below melamine
    anilino = first_protonation("c1ccc(Nc2ccncc2)cc1")[1]
    methylamino = first_protonation("CNc1ccncc1")[1]
    assert abs(methylamino - 9.65) <= 0.2
    assert 0.5 <= methylamino - anilino <= 1.5
    assert first_protonation("Nc1nc(N)nc(Nc2ccccc2)n1")[1] < first_protonation("Nc1nc(N)nc(N)n1")[1]


def test_an_amino_group_para_to_the_ring_n_damps_the_alkyl_groups_beside_it():
    # 2-amino-6-methylpyridine 7.41 against 2-aminopyridine 6.86 (from memory): a methyl group
    # beside the N adds about 0.55 here, less than the 0.72 of 2-picoline against pyridine
    # (5.97 and 5.25, CRC)
    amino = first_protonation("Nc1ccccn1")[1]
    methyl = first_protonation("Cc1cccc(N)n1")[1]
    assert abs(methyl - 7.41) <= 0.3
    assert methyl - amino < 0.72


def test_a_donor_at_c3_of_a_quinoline_gives_little_to_the_ring_n():
    # 3-aminoquinoline 4.91 is as basic as quinoline 4.90, while 3-aminopyridine (6.03) lies 0.8
    # above pyridine (5.25) (Albert; CRC; from memory): the amino group's para atom is C8a and
    # its lone pair goes into the benzo ring
    amino = first_protonation("Nc1cnc2ccccc2c1")[1]
    assert abs(amino - 4.91) <= 0.35
    assert amino - first_protonation("c1ccc2ncccc2c1")[1] < first_protonation("Nc1cccnc1")[1] - 5.25 - 0.3


def test_isoquinoline_amines_follow_the_bond_orders_of_the_ring():
    # 1-aminoisoquinoline 7.62, isoquinoline 5.42, 3-aminoisoquinoline 5.05 (Albert, from
    # memory): the amino group beside N2 raises the pKa across the C1-N2 bond of high
    # double-bond character and hardly at all across the weak N2-C3 bond
    one = first_protonation("Nc1nccc2ccccc12")[1]
    three = first_protonation("Nc1cc2ccccc2cn1")[1]
    assert abs(one - 7.62) <= 0.4
    assert abs(three - 5.05) <= 0.4
    assert one - three >= 2.0


def test_a_second_withdrawing_group_beside_the_ring_n_adds_less():
    # 2,6-dichloropyridine -2.86 against 2-chloropyridine 0.72 and pyridine 5.25 (CRC, from
    # memory): the second Cl costs 3.6, the first 4.5. Both are in the reference table, so the
    # class model is asked directly.
    one, two = _ring_n_model("Clc1ccccn1"), _ring_n_model("Clc1cccc(Cl)n1")
    assert abs(two - (-2.86)) <= 0.4
    assert one - two < _ring_n_model("c1ccncc1") - one


def test_a_hydroxyethyl_group_beside_the_ring_n_holds_its_lone_pair():
    # the O-H of 2-(2-hydroxyethyl)pyridine binds the ring N of the free base in a six-membered
    # ring, so it lies further below 2-ethylpyridine (5.89, CRC) than the 4-isomer lies below
    # 4-ethylpyridine (6.02, CRC) (intramolecular hydrogen bond; common practice)
    ortho = first_protonation("CCc1ccccn1")[1] - first_protonation("OCCc1ccccn1")[1]
    para = first_protonation("CCc1ccncc1")[1] - first_protonation("OCCc1ccncc1")[1]
    assert ortho > para + 0.2


def test_the_groups_beyond_the_first_heteroatom_of_a_ch2x_chain_still_pull():
    # two phenyl groups on the carbinol carbon of 2-pyridylmethanol add their inductive pull
    # (Taft sigma* of phenyl 0.6; Perrin, Dempsey & Serjeant 1981): the diphenyl carbinol is
    # the weaker base, and a methoxymethyl group (nothing beyond its O) is not changed by it
    plain = first_protonation("OCc1ccccn1")[1]
    diphenyl = first_protonation("OC(c1ccccc1)(c1ccccc1)c1ccccn1")[1]
    assert diphenyl < plain - 0.3


def test_a_nitro_group_beside_an_alkylamino_group_turns_its_alkyl_towards_the_ring_n():
    # in a 2-(alkylamino)-3-nitropyridine the N-H is held by the nitro group, so the alkyl group
    # faces the ring N (intramolecular hydrogen bond; common practice): N-methylation costs
    # more basicity there than in the 5-nitro isomer, where the group can turn its N-H to the N
    locked = first_protonation("CNc1ncccc1[N+](=O)[O-]")[1] - first_protonation("Nc1ncccc1[N+](=O)[O-]")[1]
    free = first_protonation("CNc1ccc([N+](=O)[O-])cn1")[1] - first_protonation("Nc1ccc([N+](=O)[O-])cn1")[1]
    assert locked < free - 0.3


def test_a_methoxy_group_adds_less_to_an_aminopyridine_than_to_pyridine():
    # pi-donors conjugated with the same cationic centre saturate (the amino group already holds
    # the charge of the 2-aminopyridinium ion; common practice): 4-methoxypyridine lies 1.22
    # above pyridine (6.47 and 5.25, CRC), the 4-methoxy group of 2-amino-4-methoxypyridine adds
    # less to 2-aminopyridine (6.86, CRC)
    gain_plain = first_protonation("COc1ccncc1")[1] - first_protonation("c1ccncc1")[1]
    gain_amino = first_protonation("COc1ccnc(N)c1")[1] - first_protonation("Nc1ccccn1")[1]
    assert gain_amino < gain_plain - 0.2


def test_an_ortho_nitro_group_holds_the_n_h_of_an_n_alkylaniline():
    # N-methylation raises aniline by 0.25 (N-methylaniline 4.85 against 4.60, CRC); in
    # 2-nitroaniline the N-H bonded to the nitro group keeps the NHMe group planar and
    # conjugated, and N-methylation gains nothing (intramolecular hydrogen bond; common practice)
    gain = first_protonation("CNc1ccccc1[N+](=O)[O-]")[1] - first_protonation("Nc1ccccc1[N+](=O)[O-]")[1]
    assert gain < 0.05


def test_an_amino_group_at_c6_of_a_quinoline_gives_to_the_carbon_beside_the_n():
    # 6-aminoquinoline 5.63, 5-aminoquinoline 5.46, quinoline 4.90 (Albert, from memory): C6 is
    # para to C8a, which shares the cation's charge
    six = first_protonation("Nc1ccc2ncccc2c1")[1]
    assert abs(six - 5.63) <= 0.3
    assert six > first_protonation("Nc1cccc2ncccc12")[1]
