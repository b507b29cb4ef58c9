"""The rule catalog is generated from the rules and complete."""

from chemcheck import docs
from chemcheck.rules import DOC_SECTIONS, registry


def test_every_rule_has_every_docs_section():
    assert docs.missing_sections() == {}
    for r in registry().values():
        for section in DOC_SECTIONS:
            assert r.docs[section].strip(), f"{r.id}: {section}"


def test_rule_ids_are_kebab_case_and_name_the_pattern():
    for rid in registry():
        assert rid == rid.lower() and "-" in rid and " " not in rid


def test_catalog_is_up_to_date():
    assert docs.target().read_text() == docs.render(), "run `python -m chemcheck.docs` and commit"


def test_a_rule_without_sections_is_caught(monkeypatch):
    from chemcheck import rules as rules_mod

    def bare(ctx):
        """Only a summary line."""
        return []

    fake = rules_mod.Rule(id="bare-rule", title="x", severity="info", check=bare, family="test")
    monkeypatch.setitem(rules_mod._REGISTRY, "bare-rule", fake)
    assert docs.missing_sections()["bare-rule"] == list(DOC_SECTIONS)
