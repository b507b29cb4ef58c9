"""The report payload: the contract names, the JSON Schema, the generated TypeScript types."""

import json

import jsonschema
import pytest

import chemcheck
from chemcheck import _schema_ts
from chemcheck.report import schema

REACTIONS = [
    "CCN.CC(=O)Cl>Et3N.DCM>CCNC(C)=O",
    "Cl.NCc1ccccc1.CC(=O)OC(C)=O>pyridine>CC(=O)NCc1ccccc1",
    "c1ccccc1.CC(=O)Cl>AlCl3>CC(=O)c1ccccc1",
    "F[I](F)(F)(F)(F)F.CCO",
    "C[N+](C)(C)CCCC.[OH-]>>C=CCC",
]


@pytest.mark.parametrize("reaction", REACTIONS)
def test_payload_validates_against_the_schema(reaction):
    payload = chemcheck.check(reaction).to_dict()
    jsonschema.Draft202012Validator(schema()).validate(payload)
    json.dumps(payload)  # plain JSON


@pytest.mark.parametrize("reaction", REACTIONS)
def test_bundle_payload_with_drawing_validates(reaction):
    bundle = chemcheck.check(reaction)._repr_mimebundle_()
    jsonschema.Draft202012Validator(schema()).validate(bundle[chemcheck.MIME_TYPE])
    drawing = bundle[chemcheck.MIME_TYPE]["drawing"]
    comps = chemcheck.check(reaction).components
    drawn = {c["component"] for c in drawing["components"]}
    # every reactant and product; agents only when small and not a solvent (drawn above the arrow)
    assert {c.index for c in comps if c.role != "agent"} <= drawn
    assert all(comps[i].role != "agent" or comps[i].kind != "solvent" for i in drawn)
    assert len(drawing["components"]) == len(drawn)


def test_contract_names():
    report = chemcheck.check("CCN.CC(=O)Cl>Et3N>CCNC(C)=O")
    assert [c.role for c in report.components] == ["reactant", "reactant", "agent", "product"]
    assert report.components[2].text == "Et3N"
    f = report.findings[0]
    for attr in ("rule", "severity", "message", "atoms", "fix"):
        assert hasattr(f, attr)
    d = report.to_dict()
    assert set(d) >= {"components", "findings", "version"}
    assert all("role" in c for c in d["components"])


def test_findings_are_frozen():
    f = chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O").findings[0]
    with pytest.raises(AttributeError):
        f.message = "changed"


def test_schema_rejects_a_broken_payload():
    payload = chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O").to_dict()
    payload["findings"][0]["severity"] = "fatal"
    with pytest.raises(jsonschema.ValidationError):
        jsonschema.validate(payload, schema())


def test_typescript_types_are_generated_from_the_schema():
    committed = _schema_ts.target().read_text()
    assert committed == _schema_ts.generate(), "run `python -m chemcheck._schema_ts` and commit"


def test_agent_kind_is_perceived():
    report = chemcheck.check("CCN.CC(=O)Cl>Et3N.DCM.AlCl3.NaBH4>CCNC(C)=O")
    kinds = {c.text: c.kind for c in report.components if c.role == "agent"}
    assert kinds == {"Et3N": "base", "DCM": "solvent", "AlCl3": "lewis_acid", "NaBH4": "reductant"}


def test_predictions_validate_and_name_the_class():
    report = chemcheck.check("COc1ccccc1.CC(=O)Cl>AlCl3>COc1cccc(C(C)=O)c1")
    payload = report._repr_mimebundle_()[chemcheck.MIME_TYPE]
    jsonschema.Draft202012Validator(schema()).validate(payload)
    [pred] = payload["predictions"]
    assert pred["reaction_class"] == "Friedel-Crafts acylation"
    assert pred["candidates"][0]["label"] == "major" and pred["candidates"][0]["smiles"] == "COc1ccc(C(C)=O)cc1"
    assert any(c["drawn"] for c in pred["candidates"])
    assert payload["classes"][0]["evidence"]


def test_predictions_are_made_without_a_drawn_product():
    payload = chemcheck.check("CCC(C)(Br)C.CC[O-].[Na+]>CCO>").to_dict()
    [pred] = payload["predictions"]
    assert pred["candidates"][0]["smiles"] == "CC=C(C)C"  # Zaitsev


def test_a_failing_rule_becomes_a_note_not_a_crash(monkeypatch):
    from chemcheck import rules as rules_mod

    def broken(ctx):
        """Broken."""
        raise ZeroDivisionError("boom")
        yield

    fake = rules_mod.Rule(id="broken-rule", title="x", severity="info", check=broken, family="test")
    monkeypatch.setitem(rules_mod._REGISTRY, "broken-rule", fake)
    monkeypatch.delenv("CHEMCHECK_STRICT", raising=False)
    report = chemcheck.check("CCN")
    [f] = report.by_rule("rule-failed")
    assert "broken-rule" in f.message and f.severity == "info"


def test_free_aniline_with_alcl3_is_one_error_with_both_reasons():
    # textbook pitfall (Clayden, Greeves & Warren, Organic Chemistry, 2nd ed., ch. 21): anilines
    # do not undergo Friedel–Crafts reactions; the AlCl3 is taken up AND the complexed ring is
    # deactivated. One pitfall, one finding.
    report = chemcheck.check("Nc1ccccc1.CC(=O)Cl>Cl[Al](Cl)Cl>CC(=O)c1ccc(N)cc1")
    errors = [f for f in report.findings if f.severity == "error"]
    assert [f.rule for f in errors] == ["lewis-acid-quenched-by-amine"]
    assert "taken up" in errors[0].message and "deactivating" in errors[0].message


@pytest.mark.parametrize(
    "reaction,label",
    [
        # IUPAC parent names of the ring systems (common practice)
        ("Cc1ccc2[nH]ccc2c1.CC(=O)Cl>Cl[Al](Cl)Cl>", "indole 1"),
        ("Cc1cccc(O)c1.CC(=O)Cl>>", "phenol 1"),
        ("Cc1ccncc1C.CI>>", "pyridine 1"),
        # a sulfonic acid is named by its acid, before the ketone or ring it carries
        # (camphorsulfonic acid; dodecylbenzenesulfonic acid; common practice)
        ("CC1(C)C2CCC1(CS(=O)(=O)O)C(=O)C2.CCN>>", "sulfonic acid 1"),
        ("CCCCCCCCCCCCc1ccccc1S(=O)(=O)O.O=P(Cl)(Cl)Cl>>", "sulfonic acid 1"),
        # the reacting group names the compound: an organic azide, a hydrazine (the nucleophile
        # of tert-butyl carbazate, not its carbamate); common practice
        ("[N-]=[N+]=NCc1ccccc1.C#Cc1ccccc1>>", "azide 1"),
        ("CC(C)(C)OC(=O)NN.O=C1CCCCC1>>", "hydrazine 1"),
        ("O=C(OOC(=O)c1ccccc1)c1ccccc1.Cc1ccccc1>>", "peroxide 1"),
    ],
)
def test_an_unnamed_compound_is_named_by_its_ring_system_or_group(reaction, label):
    report = chemcheck.check(reaction)
    assert report.reaction.components[0].label == label


def test_the_basicity_sections_are_worked_out_when_first_read():
    # no rule needs the products' basicity: check() leaves it to the first reader
    report = chemcheck.check("CCCCCN.CC(=O)Cl>CCN(CC)CC>CCCCCNC(C)=O")
    assert "basicity" not in dict.keys(report.extra)
    rows = report.extra["basicity"]
    assert any(r["component"] == 3 and r["kind"] == "amide" for r in rows)  # the product's N
    assert report.to_dict()["basicity"] == rows and "workup" in report.to_dict()


def test_a_products_perception_is_there_when_read():
    # no rule reads the product's perception, so it is worked out on first use; reading it
    # must give the same as perceiving the product directly (an amide, common practice)
    from chemcheck.perceive import perceive

    report = chemcheck.check("CCN.CC(=O)Cl>CCN(CC)CC>CCNC(C)=O")
    product = report.reaction.products[0]
    assert product.index in report.perceptions and len(report.perceptions) == len(report.reaction.components)
    got = report.perceptions.get(product.index)
    assert got is not None and got.nitrogens == perceive(product.mol).nitrogens
    assert [s.kind for s in got.nitrogens] == ["amide"]
    assert set(dict(report.perceptions.items())) == {c.index for c in report.reaction.components}
