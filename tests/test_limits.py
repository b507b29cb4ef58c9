"""Hard limits: large and odd inputs are answered or refused clearly, in a subprocess (so a
crash would show as a dead process), with a generous timeout as a guard against hangs.
The time each takes is measured by the benchmark, not asserted here."""

import json
import subprocess
import sys
import textwrap

import pytest

import chemcheck
from chemcheck import AmountError, LimitError
from chemcheck.display.threed import view3d


def _acene_smiles(n: int) -> str:
    """A linear acene of n fused benzene rings (naphthalene n=2, anthracene n=3, ...)."""
    def label(k: int) -> str:
        return str(k) if k < 10 else f"%{k}"

    s = "c1ccc" + label(2)
    s += "".join("cc" + label(k) for k in range(3, n + 1))
    s += "ccccc" + label(n)
    s += "".join("cc" + label(k) for k in range(n - 1, 1, -1))
    return s + "c1"


def run_script(code: str, timeout: int = 120):
    return subprocess.run([sys.executable, "-c", textwrap.dedent(code)], capture_output=True, text=True, timeout=timeout)


def test_a_2000_atom_molecule_is_answered():
    proc = run_script(
        """
        import chemcheck
        r = chemcheck.check("N" + "C" * 1998 + "N.CC(=O)Cl")
        print(len(r.components), r.components[0].mol.GetNumHeavyAtoms())
        """
    )
    assert proc.returncode == 0, proc.stderr
    assert proc.stdout.split() == ["2", "2000"]
    assert proc.stderr == ""


def test_beyond_the_atom_limit_is_refused():
    with pytest.raises(LimitError, match="the limit is 2000"):
        chemcheck.check("C" * 2100)


def test_a_100_component_reaction_is_answered_and_101_refused():
    report = chemcheck.check(".".join(["CCO"] * 100))
    assert len(report.components) == 100
    with pytest.raises(LimitError, match="limit is 100"):
        chemcheck.check(".".join(["CCO"] * 101))


def test_deeply_fused_rings():
    assert chemcheck.check(_acene_smiles(3)).components[0].formula == "C14H10"  # anthracene
    smi = _acene_smiles(40)
    report = chemcheck.check(smi + ".CC(=O)Cl>AlCl3>")
    assert report.components[0].mol.GetRingInfo().NumRings() == 40
    assert report.components[0].formula == "C162H84"  # C(4n+2)H(2n+4)


def test_huge_and_tiny_amounts():
    with pytest.raises(AmountError, match="implausibly large"):
        chemcheck.check("CCN", {"CCN": "1e30 g"})
    r = chemcheck.check("CCN", {"CCN": "1e-9 mg"})
    assert r.stoichiometry.rows[0].mmol > 0


def test_very_long_text_is_refused():
    with pytest.raises(LimitError, match="characters"):
        chemcheck.check("C" * 30_000)


def test_3d_is_bounded_and_falls_back():
    v = view3d("C" * 400, 0)  # above the embedding limit: 2D stands in
    assert v.molblock is None and v.svg


def test_odd_inputs_never_kill_the_process_or_reach_stderr():
    proc = run_script(
        """
        import chemcheck
        odd = ["", ">>", ">>>", "C" * 2100, "[Xx]", "[Na+]" * 50, "c1" * 200, "C1" * 30 + "C",
               "[C@@H]([C@@H])([C@@H])", "B1B2B3B1B23", "F[I](F)(F)(F)(F)(F)F", "[U+6]", "*", "[*:1]>>[*:1]",
               "C|f:0|", "CC |f:9|", "\\x00", "C" * 19_999]
        n = 0
        for t in odd:
            try:
                chemcheck.check(t)
            except chemcheck.ChemcheckError:
                pass
            n += 1
        print(n)
        """,
        timeout=600,
    )
    assert proc.returncode == 0, proc.stderr
    assert proc.stdout.strip() == "18"
    assert proc.stderr == ""


# --- the work budget (issue: every check answers within its budget) -------------------------
# These assert behaviour (the refusal, the info note, the number of structures built), never
# a time: the seconds are measured by the benchmark.


def _grid_smiles(width: int, height: int) -> str:
    """A square grid of carbons, every cell a fused four-membered ring: (w-1)(h-1) rings."""
    from rdkit import Chem

    rw = Chem.RWMol()
    idx = {(i, j): rw.AddAtom(Chem.Atom(6)) for i in range(height) for j in range(width)}
    for i in range(height):
        for j in range(width):
            if j + 1 < width:
                rw.AddBond(idx[i, j], idx[i, j + 1], Chem.BondType.SINGLE)
            if i + 1 < height:
                rw.AddBond(idx[i, j], idx[i + 1, j], Chem.BondType.SINGLE)
    mol = rw.GetMol()
    mol.UpdatePropertyCache()
    return Chem.MolToSmiles(mol)


def test_too_many_rings_are_refused_before_ring_perception():
    from chemcheck._budget import MAX_RINGS

    smi = _grid_smiles(24, 24)  # 23 x 23 = 529 rings
    with pytest.raises(LimitError, match=f"529 rings; the limit is {MAX_RINGS}"):
        chemcheck.check(smi + ".CC(=O)Cl")
    report = chemcheck.check(_grid_smiles(20, 20))  # 361 rings: answered
    assert report.components[0].mol.GetRingInfo().NumRings() == 361


@pytest.fixture
def no_deadline(monkeypatch):
    """The caps alone: a slow or busy machine must not change what these tests see."""
    import chemcheck._budget as budget

    monkeypatch.setattr(budget, "DEADLINE_S", 600.0)


def test_a_large_polyamine_skips_its_basicity_and_map_and_says_so(no_deadline):
    # 665 secondary and 2 primary amines in 1,995 heavy atoms, with acetyl chloride
    amine = "NC" + "CNC" * 664 + "N"
    report = chemcheck.check(amine + ".CC(=O)Cl>>CC(=O)" + amine)
    note = report.by_rule("check-budget-reached")
    assert len(note) == 1 and note[0].severity == "info"
    assert "the basicity of" in note[0].message and "666 nitrogens" in note[0].message
    assert "the atom map" in note[0].message and "limit of 300" in note[0].message
    assert not [row for row in report.extra["basicity"] if row["component"] == 0]
    assert report.extra["understanding"]["mapping"]["source"] == "none"


def test_a_drug_sized_reaction_is_mapped():
    report = chemcheck.check("NCCc1ccc(O)c(O)c1.CC(=O)Cl>CCN(CC)CC>CC(=O)NCCc1ccc(O)c(O)c1")
    assert report.extra["understanding"]["mapping"]["source"] not in ("none",)


def test_a_drug_sized_amine_keeps_its_basicity_and_no_note():
    report = chemcheck.check("NCCc1ccc(O)c(O)c1.CC(=O)Cl>CCN(CC)CC>CC(=O)NCCc1ccc(O)c(O)c1")  # dopamine
    assert not report.by_rule("check-budget-reached")
    assert any(row["component"] == 0 and row["pka"] for row in report.extra["basicity"])


def _count_attach(monkeypatch):
    import chemcheck.rules.regio as regio_rules

    built = []
    real = regio_rules.attach

    def counting(*args, **kwargs):
        built.append(args[1])
        return real(*args, **kwargs)

    monkeypatch.setattr(regio_rules, "attach", counting)
    return built


def test_equivalent_amines_give_one_predicted_product(monkeypatch, no_deadline):
    # tris(2-aminoethyl)amine: three equivalent primary amines, one mono-acetyl product
    built = _count_attach(monkeypatch)
    report = chemcheck.check("NCCN(CCN)CCN.CC(=O)Cl>CCN(CC)CC>CC(=O)NCCN(CCN)CCN")
    assert len(built) == 1
    pred = [p for p in report.extra.get("predictions", []) if "chemoselectivity" in p["reaction_class"]]
    assert len(pred) == 1 and len(pred[0]["candidates"]) == 1


def test_the_chemoselectivity_enumeration_is_capped(monkeypatch, no_deadline):
    from rdkit import Chem

    from chemcheck._budget import candidate_cap

    # a comb of 20 distinct primary amines (each on a chain of its own length) on one backbone,
    # drawn acetylated on the first
    arms = [f"C(C{'C' * k}N)" for k in range(20)]
    comb = "C" + "".join(arms) + "C"
    product = "C" + "C(CNC(C)=O)" + "".join(arms[1:]) + "C"
    built = _count_attach(monkeypatch)
    report = chemcheck.check(f"{comb}.CC(=O)Cl>CCN(CC)CC>{product}")
    cap = candidate_cap(Chem.MolFromSmiles(comb).GetNumHeavyAtoms())
    assert cap < 20
    assert len(built) == cap
    note = report.by_rule("check-budget-reached")
    assert len(note) == 1 and f"at {20 - cap} of the 20 distinct sites" in note[0].message


def test_rules_not_started_by_the_deadline_are_named(monkeypatch):
    import chemcheck._budget as budget

    monkeypatch.setattr(budget, "DEADLINE_S", -1.0)  # already past: no rule starts
    report = chemcheck.check("CCCCN.CC(=O)Cl>>CCCCNC(C)=O")
    assert not report.by_rule("acid-scavenger-short")  # flagged with a budget (fixture case)
    note = report.by_rule("check-budget-reached")
    assert len(note) == 1 and "acid-scavenger-short" in note[0].message and "not started" in note[0].message
    monkeypatch.setattr(budget, "DEADLINE_S", 1.5)
    assert chemcheck.check("CCCCN.CC(=O)Cl>>CCCCNC(C)=O").by_rule("acid-scavenger-short")


def test_a_basicity_model_failure_becomes_a_note(monkeypatch):
    import chemcheck.basicity as basicity

    def broken(mol, **kwargs):
        raise StopIteration

    monkeypatch.setattr(basicity, "basic_sites", broken)
    monkeypatch.delenv("CHEMCHECK_STRICT")
    report = chemcheck.check("CCCCN.CC(=O)Cl>>CCCCNC(C)=O")
    note = report.by_rule("check-budget-reached")
    assert len(note) == 1 and "could not read its structure" in note[0].message
    monkeypatch.setenv("CHEMCHECK_STRICT", "1")
    with pytest.raises((StopIteration, RuntimeError)):  # inside a rule generator: RuntimeError
        chemcheck.check("CCCN.CC(=O)Cl>>CCCNC(C)=O")


def test_3d_past_its_deadline_falls_back_with_a_note(monkeypatch):
    import chemcheck.display.threed as threed

    monkeypatch.setattr(threed, "EMBED_DEADLINE_S", 0.0)
    v = view3d("CCOC(=O)c1ccccc1N", 0)
    assert v.molblock is None and v.svg.startswith("<")
    assert "did not finish within 0 s" in v._repr_mimebundle_()["text/plain"]


def test_3d_embeds_in_the_worker():
    v = view3d("CCOC(=O)c1ccccc1N", 0)  # ethyl anthranilate: 12 heavy atoms, 11 H
    assert v.molblock is not None and v.note is None
    assert v.molblock.count(" H ") == 11


def test_3d_of_a_dummy_atom_is_a_2d_drawing_with_a_note():
    v = view3d("[*+]N", 0)
    assert v.molblock is None and "dummy atom" in v._repr_mimebundle_()["text/plain"]


def test_a_structure_above_the_drawing_limit_is_shown_as_its_formula():
    import xml.etree.ElementTree as ET

    from chemcheck._budget import MAX_DRAWN_ATOMS
    from chemcheck.display.bundle import mimebundle

    report = chemcheck.check("N" * 400 + ".CC(=O)Cl")  # a chain of 400 hydrazine N: H402N400 (Hill order)
    bundle = mimebundle(report)
    assert f"H402N400: 400 heavy atoms, not drawn (limit {MAX_DRAWN_ATOMS})" in bundle["image/svg+xml"]
    ET.fromstring(bundle["image/svg+xml"])  # still one well-formed SVG


def test_the_first_check_of_a_fresh_process_runs_every_rule():
    # loading the tables, the property database and the mapper in a fresh kernel is not rule
    # time: the first check with amounts must not skip rules to meet the deadline
    import subprocess
    import sys

    code = (
        "import chemcheck, json;"
        "r = chemcheck.check('NCc1ccccc1.CCCCCCCCCC(=O)Cl>CCN(CC)CC>CCCCCCCCCC(=O)NCc1ccccc1',"
        " {'NCc1ccccc1': '5.0 mmol', 'CCCCCCCCCC(=O)Cl': '1.1 mL'});"
        "print(json.dumps([f.rule for f in r.findings]))"
    )
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=300, check=True)
    rules = json.loads(out.stdout.strip().splitlines()[-1])
    assert "check-budget-reached" not in rules
    assert "density-estimated" in rules
