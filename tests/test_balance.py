"""Equation balance and the unbalanced-equation rule.

The by-products are those of the textbook equations (common practice): an acylation with an
acid chloride releases HCl, with an anhydride a carboxylic acid; a Boc protection with Boc2O
releases CO2 and tert-butanol; an imine condensation releases water; an exhaustive methylation
with methyl iodide releases HI per methyl group.
"""

import pytest

import chemcheck
from chemcheck.balance import balance
from chemcheck.reaction import parse_reaction


def missing(text):
    b = balance(parse_reaction(text))
    return b, sorted((m.name, m.count, m.side) for m in b.missing)


@pytest.mark.parametrize(
    "reaction,expected",
    [
        ("CCCCN.CC(=O)Cl>>CCCCNC(C)=O", [("HCl", 1, "product")]),
        ("CCCCN.CC(=O)OC(C)=O>>CCCCNC(C)=O", [("acetic acid", 1, "product")]),
        ("CCCCN.CC(C)(C)OC(=O)OC(=O)OC(C)(C)C>>CCCCNC(=O)OC(C)(C)C", [("CO2", 1, "product"), ("tert-butanol", 1, "product")]),
        ("CCCCN.O=Cc1ccccc1>>CCCCN=Cc1ccccc1", [("H2O", 1, "product")]),
        ("CCCCN.Cc1ccc(cc1)S(Cl)(=O)=O>>CCCCNS(=O)(=O)c1ccc(C)cc1", [("HCl", 1, "product")]),
        ("CC(=O)Cl>>CC(=O)O", [("H2O", 1, "reactant"), ("HCl", 1, "product")]),
    ],
)
def test_missing_by_products_are_named(reaction, expected):
    b, got = missing(reaction)
    assert b.balanced and not b.drawn_balanced
    assert got == expected


def test_coefficients_close_an_exhaustive_methylation():
    # benzylamine + 2 MeI -> N,N-dimethylbenzylamine + 2 HI
    b, got = missing("NCc1ccccc1.CI>>CN(C)Cc1ccccc1")
    assert b.coefficients == {0: 1, 1: 2, 2: 1}
    assert got == [("HI", 2, "product")]


def test_two_equivalents_of_amine_balance_with_the_salt_drawn():
    b, got = missing("CCN.CC(=O)Cl>>CCNC(C)=O.CC[NH3+].[Cl-]")
    assert b.balanced and got == []
    assert b.coefficients[0] == 2


def test_balanced_as_drawn_is_silent():
    report = chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O.Cl")
    assert report.by_rule("unbalanced-equation") == []
    assert report.balance.drawn_balanced


def test_no_products_nothing_to_balance():
    report = chemcheck.check("CCN.CC(=O)Cl>Et3N>")
    assert report.by_rule("unbalanced-equation") == []
    assert report.balance.checked is False


def test_rule_names_hcl():
    report = chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O")
    [f] = report.by_rule("unbalanced-equation")
    assert f.severity == "info"
    assert f.message.startswith("HCl is not drawn")
    assert "add HCl to the products" in f.fix


def test_unexplained_difference_gives_the_elements():
    report = chemcheck.check("CCCCN.CC(=O)Cl>>c1ccccc1")
    [f] = report.by_rule("unbalanced-equation")
    assert "does not balance" in f.message
    assert "N +1" in f.message and "Cl +1" in f.message


def test_agents_do_not_count_in_the_balance():
    report = chemcheck.check("CCN.CC(=O)Cl>CCN(CC)CC.ClCCl>CCNC(C)=O")
    [f] = report.by_rule("unbalanced-equation")
    assert f.message.startswith("HCl is not drawn")
