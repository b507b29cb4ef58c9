"""Hard limits: large and odd inputs are answered or refused clearly, in a subprocess (so a
crash would show as a dead process), with a generous timeout as a guard against hangs.
The time each takes is measured by the benchmark, not asserted here."""

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
