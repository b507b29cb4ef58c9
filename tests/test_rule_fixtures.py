"""Every rule against its fixture file (tests/fixtures/rules/<rule-id>.toml), and every
ordinary reaction of clean_reactions.toml against every rule.

A fixture case lists a reaction and optional amounts. Flagged cases must raise the rule
(with the severity and message fragment given); clean cases must not (``at_most = "info"``
allows an info note). ``expect_flagged`` overrides the section for a documented edge case.
"""

import tomllib
from pathlib import Path

import pytest

import chemcheck
from chemcheck.rules import registry

FIXTURES = Path(__file__).parent / "fixtures" / "rules"
ORDER = {"info": 0, "warning": 1, "error": 2}


def _cases():
    for path in sorted(FIXTURES.glob("*.toml")):
        if path.name.startswith("clean_"):
            continue
        data = tomllib.loads(path.read_text())
        for section in ("flagged", "clean"):
            for i, case in enumerate(data.get(section, [])):
                yield pytest.param(data["rule"], section, case, id=f"{data['rule']}-{section}-{i}")


@pytest.mark.parametrize("rule_id,section,case", list(_cases()))
def test_rule_fixture(rule_id, section, case):
    report = chemcheck.check(case["reaction"], case.get("amounts"))
    found = report.by_rule(rule_id)
    flagged = case.get("expect_flagged", section == "flagged")
    if flagged:
        assert found, f"{rule_id} did not fire on {case['reaction']}"
        if "severity" in case:
            assert any(f.severity == case["severity"] for f in found), [(f.severity, f.message) for f in found]
        if "message" in case:
            assert any(case["message"] in f.message + " " + (f.fix or "") for f in found), [f.message for f in found]
        for f in found:
            assert f.fix, "every finding offers a fix"
            assert f.message[0].isupper() or f.message[0] in "[(" or not f.message[0].isalpha()
    else:
        limit = case.get("at_most")
        if limit is None:
            assert found == [], [f.message for f in found]
        else:
            assert all(ORDER[f.severity] <= ORDER[limit] for f in found), [(f.severity, f.message) for f in found]


def test_every_rule_family_rule_has_a_fixture_with_three_and_three():
    have = {}
    for path in FIXTURES.glob("*.toml"):
        if path.name.startswith("clean_"):
            continue
        data = tomllib.loads(path.read_text())
        flagged = [c for c in data.get("flagged", []) if c.get("expect_flagged", True)]
        clean = [c for c in data.get("clean", []) if not c.get("expect_flagged", False)]
        have[data["rule"]] = (len(flagged), len(clean))
    for rid, r in registry().items():
        if r.family in ("nitrogen", "regio"):
            assert rid in have, f"no fixture for {rid}"
            assert have[rid][0] >= 3 and have[rid][1] >= 3, (rid, have[rid])


def _clean():
    data = tomllib.loads((FIXTURES / "clean_reactions.toml").read_text())
    return [pytest.param(c, id=c["name"]) for c in data["reaction"]]


def test_clean_fixture_is_large_enough():
    assert len(_clean()) >= 20


@pytest.mark.parametrize("case", _clean())
def test_no_error_or_warning_on_ordinary_reactions(case):
    report = chemcheck.check(case["reaction"], case.get("amounts"))
    bad = [(f.rule, f.severity, f.message) for f in report.findings if f.severity in ("error", "warning")]
    assert bad == []


def _regio_clean():
    data = tomllib.loads((FIXTURES / "clean_regio.toml").read_text())
    return [pytest.param(c, id=c["name"]) for c in data["reaction"]]


def test_clean_regio_fixture_is_large_enough():
    assert len(_regio_clean()) >= 15


@pytest.mark.parametrize("case", _regio_clean())
def test_nothing_fires_on_ordinary_regiochemistry(case):
    report = chemcheck.check(case["reaction"], case.get("amounts"))
    regio = {"elimination-regiochemistry", "ring-substitution-regiochemistry", "ring-too-deactivated",
             "condensation-product-mismatch", "acylation-chemoselectivity"}
    bad = [(f.rule, f.severity, f.message) for f in report.findings if f.rule in regio or f.severity == "error"]
    assert bad == []
    assert report.to_dict().get("predictions"), "the class is recognised and predictions are made"
