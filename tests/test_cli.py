"""The command line: exit codes, one-line errors, JSON output."""

import json
import subprocess
import sys

import pytest


def run(*args, timeout=120):
    return subprocess.run(
        [sys.executable, "-m", "chemcheck", *args], capture_output=True, text=True, timeout=timeout
    )


def test_check_json_contract():
    proc = run("check", "--json", "CCN.CC(=O)Cl>Et3N>CCNC(C)=O")
    assert proc.returncode == 0, proc.stderr
    data = json.loads(proc.stdout)
    assert [c["role"] for c in data["components"]] == ["reactant", "reactant", "agent", "product"]
    assert data["findings"][0]["rule"] == "unbalanced-equation"


def test_check_text():
    proc = run("check", "CCN.CC(=O)Cl>>CCNC(C)=O")
    assert proc.returncode == 0
    assert "NOTE [unbalanced-equation] HCl is not drawn" in proc.stdout


@pytest.mark.parametrize(
    "reaction,expected",
    [
        ("CCN.NCc1ccccc>>C", "component 2 'NCc1ccccc': ring closure 1 not closed at position 4"),
        (">>", "the reaction has no molecules"),
        ("", "the reaction is empty"),
        ("CCN.unobtainium>>C", "component 2 'unobtainium': neither valid SMILES nor a known reagent name"),
    ],
)
def test_bad_input_exits_2_with_one_line(reaction, expected):
    proc = run("check", reaction)
    assert proc.returncode == 2
    lines = proc.stderr.strip().splitlines()
    assert len(lines) == 1, proc.stderr
    assert expected in lines[0]
    assert "Traceback" not in proc.stderr


def test_bad_amount_option():
    proc = run("check", "CCN", "--amount", "no-equals-sign")
    assert proc.returncode == 2
    assert "KEY=VALUE" in proc.stderr


def test_fail_on():
    # one equivalent of amine and no base: a warning (acid-scavenger-short, amounts assumed)
    assert run("check", "CCN.CC(=O)Cl>>CCNC(C)=O", "--fail-on", "warning").returncode == 1
    assert run("check", "CCN.CC(=O)Cl>>CCNC(C)=O", "--fail-on", "error").returncode == 0
    assert run("check", "CCN.CC(=O)Cl>Et3N>CCNC(C)=O", "--fail-on", "warning").returncode == 0


def test_pka_command():
    proc = run("pka", "CN(C)c1ccncc1")
    assert proc.returncode == 0
    assert "pyridine_type" in proc.stdout and "first proton on atom 7" in proc.stdout
    data = json.loads(run("pka", "--json", "C1CNCCN1").stdout)
    assert {d["kind"] for d in data} == {"secondary_amine"}


def test_scale_command():
    proc = run(
        "scale", "NCc1ccccc1.CC(=O)Cl>Et3N.DCM>CC(=O)NCc1ccccc1",
        "-a", "NCc1ccccc1=1.07 g", "-a", "CC(=O)Cl=0.78 mL", "-a", "Et3N=2.09 mL", "-a", "DCM=10 mL",
        "--factor", "10",
    )
    assert proc.returncode == 0, proc.stderr
    assert "10.7 g" in proc.stdout and "calorimetry" in proc.stdout


def test_smiles_keys_with_equals_signs():
    proc = run("check", "CCN.CC(=O)Cl>Et3N>CCNC(C)=O", "--amount", "CC(=O)Cl=1.0 mmol", "--json")
    assert proc.returncode == 0, proc.stderr
    assert json.loads(proc.stdout)["input"]["amounts"] == {"CC(=O)Cl": "1.0 mmol"}


def test_console_script_entry_point_is_declared():
    from importlib.metadata import entry_points

    eps = {e.name: e.value for e in entry_points(group="console_scripts")}
    assert eps.get("chemcheck") == "chemcheck.cli:main"


# --- output that is what it claims -------------------------------------------------------------


def test_json_writer_is_strict():
    from chemcheck.cli import dumps

    text = dumps({"a": float("inf"), "b": [float("nan"), 1.5], "c": (float("-inf"),)})
    assert json.loads(text) == {"a": None, "b": [None, 1.5], "c": [None]}


def test_json_output_never_holds_nan_or_infinity():
    # absurd amounts (issue: 1e-300 g was accepted and gave Infinity); whatever the amounts module
    # answers, the output is valid strict JSON or a one-line refusal
    proc = run("check", "--json", "CCN.CC(=O)Cl>Et3N>CCNC(C)=O", "-a", "CCN=1e-300 g", "-a", "CC(=O)Cl=1e300 g")
    if proc.returncode == 0:
        def refuse(name):
            raise AssertionError(f"{name} in --json output")

        json.loads(proc.stdout, parse_constant=refuse)
    else:
        assert proc.returncode == 2 and "Traceback" not in proc.stderr


def test_error_messages_never_echo_control_characters():
    proc = run("check", "CCN.\x1b[2J\x1b[32mall clear\x07>>C")
    assert proc.returncode == 2
    assert "\x1b" not in proc.stderr and "\x07" not in proc.stderr
    assert "\\x1b[32mall clear" in proc.stderr
    from chemcheck import ParseError

    assert str(ParseError("bad", text="a\u202eb\r")) == "'a\\u202eb\\x0d': bad"


@pytest.mark.parametrize(
    "smiles,position",
    # the same ring-closure digit twice on one atom would bond it to itself: the second digit
    [("Cl22", 4), ("Nn11", 4), ("C1CC1Cl22", 9), ("C%11%11", 6)],
)
def test_repeated_ring_closure_digit_has_a_position(smiles, position):
    from chemcheck import ParseError, parse_reaction

    with pytest.raises(ParseError) as info:
        parse_reaction(smiles)
    assert info.value.position == position
    assert "opened and closed on the same atom" in str(info.value)


def test_rdkit_log_never_reaches_stderr():
    # RDKit calls in other threads, drawing and the user's own calls after import: all quiet
    code = (
        "import threading, chemcheck\n"
        "from rdkit import Chem\n"
        "Chem.MolFromSmiles('C1CC')\n"
        "t = threading.Thread(target=lambda: Chem.MolFromSmiles('c1cc')); t.start(); t.join()\n"
        "for s in ('C1CC>>C', 'Cl22', '[*+]N>>C', 'c1cccc1N'):\n"
        "    try:\n"
        "        chemcheck.check(s)\n"
        "    except chemcheck.ChemcheckError:\n"
        "        pass\n"
        "print('done')\n"
    )
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=120)
    assert proc.stdout.strip() == "done"
    assert proc.stderr == ""
