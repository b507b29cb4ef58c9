"""Reading reactions: roles, salts, names, and a clear error for every bad input."""

import subprocess
import sys

import pytest

import chemcheck
from chemcheck import LimitError, ParseError, parse_reaction


def test_roles_and_agents_are_kept():
    r = parse_reaction("CCN.CC(=O)Cl>Et3N.DCM>CCNC(C)=O")
    assert [c.role for c in r.components] == ["reactant", "reactant", "agent", "agent", "product"]
    assert [c.text for c in r.components] == ["CCN", "CC(=O)Cl", "Et3N", "DCM", "CCNC(C)=O"]


def test_plain_molecule_list_is_reactants():
    r = parse_reaction("CCN.CCO")
    assert [c.role for c in r.components] == ["reactant", "reactant"]


@pytest.mark.parametrize(
    "text,expected",
    [
        ("[Na+].[O-]C(C)=O", ["[Na+].[O-]C(C)=O"]),
        ("CC[O-].[Na+]", ["CC[O-].[Na+]"]),
        ("[Al+3].[Cl-].[Cl-].[Cl-]", ["[Al+3].[Cl-].[Cl-].[Cl-]"]),
        ("CCN.[Na+].[Na+].[O-]C([O-])=O.CC", ["CCN", "[Na+].[Na+].[O-]C([O-])=O", "CC"]),
        ("C[N+](C)(C)C.[I-].CCO", ["C[N+](C)(C)C.[I-]", "CCO"]),
    ],
)
def test_fragments_whose_charges_cancel_form_one_component(text, expected):
    assert [c.text for c in parse_reaction(text).components] == expected


# Ions written apart, as patent records sort them (the salts are common practice: NaH and NH4Cl
# in DMF, LiAlH4 then NaOH work-up, NaBH4 with NH4Cl, HATU with NaHCO3, dppf-Fe with Cs2CO3).
@pytest.mark.parametrize(
    "text,expected",
    [
        (
            "[Na+].CCCCN.CC(=O)Cl.[Cl-]>>CCCCNC(C)=O",
            ["[Na+].[Cl-]", "CCCCN", "CC(=O)Cl", "CCCCNC(C)=O"],
        ),
        (
            "CCCCN.CC(=O)Cl>[Na+].ClCCl.[OH-]>CCCCNC(C)=O",
            ["CCCCN", "CC(=O)Cl", "[Na+].[OH-]", "ClCCl", "CCCCNC(C)=O"],
        ),
        ("CC>[H-].CN(C)C=O.[NH4+].[Na+].[Cl-]>CC", ["CC", "[H-].[Na+]", "CN(C)C=O", "[NH4+].[Cl-]", "CC"]),
        (
            "CC>[Al+3].[H-].[H-].[H-].[H-].[Li+].[Na+].[OH-]>CC",
            ["CC", "[Al+3].[H-].[H-].[H-].[H-].[Li+]", "[Na+].[OH-]", "CC"],
        ),
        ("CC>[BH4-].[NH4+].[Na+].[Cl-]>CC", ["CC", "[BH4-].[Na+]", "[NH4+].[Cl-]", "CC"]),
        (
            "CC>O=C([O-])[O-].[Cs+].[Cs+].[Fe+2].c1ccc(P(c2ccccc2)[c-]2cccc2)cc1.c1ccc(P(c2ccccc2)[c-]2cccc2)cc1>CC",
            [
                "CC",
                "O=C([O-])[O-].[Cs+].[Cs+]",
                "[Fe+2].c1ccc(P(c2ccccc2)[c-]2cccc2)cc1.c1ccc(P(c2ccccc2)[c-]2cccc2)cc1",
                "CC",
            ],
        ),
    ],
)
def test_ions_written_apart_pair_into_salts_without_swallowing_molecules(text, expected):
    r = parse_reaction(text)
    assert [c.text for c in r.components] == expected
    assert all(c.charge == 0 for c in r.components)


def test_an_ion_with_no_counter_ion_on_its_side_stands_alone():
    r = parse_reaction("C[Mg+].CC=O>[Br-]>CC(C)O")
    assert [c.text for c in r.components] == ["C[Mg+]", "CC=O", "[Br-]", "CC(C)O"]


def test_join_names_a_salt_weighed_as_one_solid():
    plain = parse_reaction("Cl.NCc1ccccc1.CC(=O)Cl>>")
    assert len(plain.components) == 3
    joined = parse_reaction("Cl.NCc1ccccc1.CC(=O)Cl>>", join=["Cl.NCc1ccccc1"])
    assert [c.text for c in joined.components] == ["Cl.NCc1ccccc1", "CC(=O)Cl"]
    assert joined.components[0].formula == "C7H10ClN"


def test_cxsmiles_fragment_groups():
    r = parse_reaction("Cl.NCc1ccccc1.CC(=O)Cl>>CC(=O)NCc1ccccc1 |f:0.1|")
    assert [c.text for c in r.components] == ["Cl.NCc1ccccc1", "CC(=O)Cl", "CC(=O)NCc1ccccc1"]
    assert r.cx_fields == "f:0.1"


def test_atom_maps_are_kept_but_not_in_the_canonical_smiles():
    r = parse_reaction("[CH3:1][NH2:2].[CH3:3][C:4](=[O:5])Cl>>[CH3:1][NH:2][C:4]([CH3:3])=[O:5]")
    assert r.mapped
    assert r.components[0].smiles == "CN"
    assert r.components[0].mol.GetAtomWithIdx(1).GetAtomMapNum() == 2


@pytest.mark.parametrize(
    "name,smiles",
    [
        ("Et3N", "CCN(CC)CC"), ("DIPEA", "CCN(C(C)C)C(C)C"), ("DMAP", "CN(C)c1ccncc1"),
        ("pyridine", "c1ccncc1"), ("DCM", "ClCCl"), ("THF", "C1CCOC1"), ("DMF", "CN(C)C=O"),
        ("MeCN", "CC#N"), ("MeOH", "CO"), ("AlCl3", "[Cl][Al]([Cl])[Cl]"),
        ("FeCl3", "[Cl][Fe]([Cl])[Cl]"), ("TiCl4", "[Cl][Ti]([Cl])([Cl])[Cl]"), ("MeI", "CI"),
        ("Ag2O", "[Ag][O][Ag]"), ("TFA", "O=C(O)C(F)(F)F"), ("Boc2O", "CC(C)(C)OC(=O)OC(=O)OC(C)(C)C"),
        ("HCl in dioxane", "Cl"), ("BF3·OEt2", "CC[O+](CC)[B-](F)(F)F"), ("BF3.OEt2", "CC[O+](CC)[B-](F)(F)F"),
        ("EDC.HCl", "CCN=C=NCCCN(C)C.Cl"), ("BH3.THF", "[BH3-][O+]1CCCC1"),
        ("NaBH(OAc)3", "CC(=O)O[BH-](OC(C)=O)OC(C)=O.[Na+]"), ("hunig's base", "CCN(C(C)C)C(C)C"),
        ("KHSO4", "O=S(=O)([O-])O.[K+]"), ("sodium bisulfate", "O=S(=O)([O-])O.[Na+]"),
    ],
)
def test_common_reagent_names(name, smiles):
    [comp] = parse_reaction(name).components
    assert comp.smiles == smiles
    assert comp.source == "name table"
    assert comp.name


def test_dotted_names_stay_one_reagent_but_smiles_still_split():
    # "BF3.OEt2" is one reagent (the name has a dot); "C.O" is methane and water
    assert len(parse_reaction("BF3.OEt2.CCN").components) == 2
    assert len(parse_reaction("C.O").components) == 2


def test_smiles_wins_when_a_token_reads_as_both():
    # "CO" is methanol as SMILES (and would be carbon monoxide as a formula)
    comp = parse_reaction("CO").components[0]
    assert comp.source == "smiles" and comp.formula == "CH4O"


def test_database_fallback_for_names_outside_the_table():
    comp = parse_reaction("cyclopentylamine").components[0]
    assert comp.source == "chemicals database"
    assert comp.smiles == "NC1CCCC1"


def test_metal_species_are_read_with_partial_sanitization_and_a_note():
    report = chemcheck.check("F[I](F)(F)(F)(F)F.CC")
    comp = report.components[0]
    assert comp.sanitization == "partial"
    notes = [f for f in report.findings if f.rule == "partial-sanitization"]
    assert notes and notes[0].severity == "info"


@pytest.mark.parametrize(
    "text,component,position,fragment",
    [
        ("CCN.NCc1ccccc", 2, 4, "ring closure 1 not closed"),
        ("CCN.NCc1cccc1", 2, 3, "aromatic ring"),
        ("C(C>>C", 1, 2, "'(' is not closed"),
        ("[Na>>C", 1, 1, "'[' is not closed"),
        ("CC.C[N](C)(C)(C)C", 2, 2, "more bonds"),
        ("CC..CC", 2, None, "empty component"),
        ("CCN.xyzzy>>C", 2, None, "neither valid SMILES nor a known reagent name"),
        ("CCN.acetyl chlorde>>C", 2, None, "not a known reagent name"),
    ],
)
def test_bad_components_name_the_component_and_position(text, component, position, fragment):
    with pytest.raises(ParseError) as info:
        parse_reaction(text)
    err = info.value
    assert err.component == component
    assert err.position == position
    assert fragment in str(err)
    assert str(err).startswith(f"component {component} '")


@pytest.mark.parametrize(
    "text,fragment",
    [("", "empty"), ("   ", "empty"), (">>", "no molecules"), ("C>C", "two '>'"), (">C>CC", "no reactants")],
)
def test_bad_reactions(text, fragment):
    with pytest.raises(ParseError, match=fragment):
        parse_reaction(text)


def test_thousand_components_are_refused_clearly():
    text = ".".join(["C"] * 1000)
    with pytest.raises(LimitError, match="limit is 100"):
        parse_reaction(text)


def test_non_text_input():
    with pytest.raises(ParseError, match="must be text"):
        parse_reaction(None)  # type: ignore[arg-type]


def test_rdkit_log_never_reaches_stderr():
    code = (
        "import chemcheck\n"
        "for t in ['NCc1cccc1>>C', 'C(C', 'xyz', 'C[N](C)(C)(C)C', 'BF3·OEt2.Et3N']:\n"
        "    try: chemcheck.check(t)\n"
        "    except chemcheck.ChemcheckError: pass\n"
    )
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=120)
    assert proc.returncode == 0, proc.stderr
    assert proc.stderr == ""


def test_non_ascii_text_is_refused_with_the_character_and_position():
    # found by fuzzing: RDKit's log cut a multibyte character in half and raised SystemError
    with pytest.raises(chemcheck.ParseError) as exc:
        chemcheck.check("CCN.CC\u00e9N>>CCN")
    assert exc.value.component == 2 and exc.value.position == 3
    assert "\u00e9" in str(exc.value)
    with pytest.raises(chemcheck.ParseError):
        chemcheck.check("\u00c2\u00e8\u00a58\U00038d7a\u00bd\x8f")


def test_an_acidic_quench_salt_drawn_as_ions_gets_its_name():
    # potassium hydrogen sulfate, KHSO4, 136.17 g/mol (CRC Handbook of Chemistry and Physics;
    # from memory), written as its ions among a patent reaction's agents
    r = parse_reaction("CCN.CC(=O)Cl>O=S(=O)([O-])O.[K+]>CCNC(C)=O")
    [salt] = [c for c in r.components if c.role == "agent"]
    assert salt.name == "potassium hydrogen sulfate"
    assert abs(salt.mw - 136.17) < 0.02
