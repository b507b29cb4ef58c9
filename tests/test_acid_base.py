"""Proton bookkeeping and workup pH (Henderson-Hasselbalch; common practice)."""

import pytest

from chemcheck.acid_base import Acceptor, distribute, max_conversion
from chemcheck.basicity.acids import acid_pka
from chemcheck.workup import advice_for, fraction_protonated, separations


def test_hcl_from_an_acylation_stops_it_at_half_conversion_without_base():
    # textbook: RNH2 + RCOCl -> amide + HCl; HCl protonates the second equivalent of amine
    amine = Acceptor("amine", 10.6, 1.0)
    assert max_conversion(amine, 1.0, [], released_pka=-6.0) == pytest.approx(0.5, abs=0.02)


def test_two_equivalents_of_amine_reach_full_conversion():
    assert max_conversion(Acceptor("amine", 10.6, 2.0), 1.0, [], released_pka=-6.0) > 0.95


def test_a_base_as_strong_as_the_amine_takes_the_acid():
    amine = Acceptor("amine", 10.6, 1.0)
    assert max_conversion(amine, 1.0, [Acceptor("Et3N", 10.75, 1.5)], released_pka=-6.0) > 0.95


def test_a_much_weaker_base_does_not_protect_an_alkylamine():
    amine = Acceptor("amine", 10.6, 1.0)
    x = max_conversion(amine, 1.0, [Acceptor("pyridine", 5.25, 2.0)], released_pka=-6.0)
    assert x == pytest.approx(0.5, abs=0.03)


def test_distribution_follows_the_pka_difference():
    d = distribute([Acceptor("a", 10.0, 1.0), Acceptor("b", 8.0, 1.0)], 1.0)
    # K = 10**2: about 91 % of the proton on a, 9 % on b
    assert d.protonated["a"] == pytest.approx(0.909, abs=0.01)


def test_acid_table():
    assert acid_pka("CC(=O)O").pka == pytest.approx(4.76)
    assert acid_pka("Cl").pka < 0
    assert acid_pka("O=C(O)C(F)(F)F").pka < 1


def test_henderson_hasselbalch():
    assert fraction_protonated(9.0, 9.0) == pytest.approx(0.5)
    assert fraction_protonated(9.0, 11.0) == pytest.approx(1 / 101)
    adv = advice_for(0, "benzylamine", 9.34)
    assert adv.extract_above_ph == pytest.approx(11.3, abs=0.05)
    assert adv.keep_in_water_below_ph == pytest.approx(7.3, abs=0.05)
    assert "organic layer" in adv.message


def test_separation_window():
    out = separations([("aniline", 4.6), ("triethylamine", 10.75)])
    assert len(out) == 1 and "pH 7.7" in out[0]
    assert separations([("a", 9.0), ("b", 10.0)]) == []


def test_report_carries_basicity_and_workup():
    import chemcheck

    d = chemcheck.check("CCCCCN.CC(=O)Cl>Et3N>CCCCCNC(C)=O").to_dict()
    kinds = {(b["component"], b["kind"]) for b in d["basicity"]}
    assert (0, "primary_amine") in kinds and (3, "amide") in kinds
    # components are named by compound number and what they are, not by SMILES
    assert any(w["message"].startswith("amine 1 ") for w in d["workup"])


def test_reaches_agrees_with_the_bisection():
    # one equilibrium at 90 % of the limit must give the same answer as the full bisection
    from chemcheck.acid_base import reaches

    cases = [
        (10.6, 1.0, 1.0, []),  # alkylamine + acid chloride, no base: stops near 50 %
        (10.6, 1.0, 1.0, [Acceptor("Et3N", 10.75, 1.2)]),
        (10.6, 1.0, 1.0, [Acceptor("pyridine", 5.2, 1.2)]),
        (4.6, 1.0, 1.0, [Acceptor("pyridine", 5.2, 0.5)]),
        (10.6, 2.0, 1.0, []),  # two equivalents of amine
    ]
    for pka, n_amine, n_e, others in cases:
        nuc = Acceptor("amine", pka, n_amine)
        x = max_conversion(nuc, n_e, others)
        limit = min(n_e, n_amine)
        assert reaches(nuc, n_e, others, 0.9) == (x * n_e / limit >= 0.9), (pka, n_amine, others)
