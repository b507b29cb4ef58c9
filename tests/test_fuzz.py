"""Fuzzing (short run; `make fuzz` runs the long one): whatever the input, only the package's
own errors escape, and every error names the field and the position."""

import json

from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

import chemcheck
from chemcheck import AmountError, ChemcheckError, ParseError
from chemcheck.amounts import parse_amount

SMILES_ALPHABET = "CNOSPFIBrcnos()[]=#@+-.123456789%/\\HlaK ·>"
NAMES = ["Et3N", "DCM", "AlCl3", "pyridine", "HCl in dioxane", "BF3·OEt2", "NaBH(OAc)3", "xyz", "Ag2O", "MeI"]
FRAGMENTS = ["CCN", "CC(=O)Cl", "c1ccccc1", "[Na+]", "[O-]C(C)=O", "Cl", "N", "C(", "c1ccc", "[nH]1cccc1", "C[N+](C)(C)C", "F[I](F)F"]
FAST = settings(max_examples=150, deadline=None, suppress_health_check=[HealthCheck.too_slow])


def _check_ok(text, amounts=None):
    try:
        report = chemcheck.check(text, amounts)
    except ParseError as exc:
        msg = str(exc)
        assert msg and ("component" in msg or "'" in msg or "reaction" in msg), msg
        return
    except AmountError as exc:
        assert "amount" in str(exc)
        return
    except ChemcheckError:
        return
    report.to_dict()


@FAST
@given(st.text(alphabet=SMILES_ALPHABET, max_size=40))
def test_random_reaction_text(text):
    _check_ok(text)


@FAST
@given(st.lists(st.sampled_from(FRAGMENTS + NAMES), min_size=1, max_size=6), st.integers(0, 3))
def test_random_assemblies(parts, arrows):
    text = ".".join(parts)
    if arrows:
        cut = len(parts) // 2
        text = ".".join(parts[:cut]) + ">" * min(arrows, 2) + ".".join(parts[cut:])
    _check_ok(text)


@FAST
@given(st.text(max_size=30))
def test_random_names(name):
    _check_ok(name)


UNITS = ["g", "mg", "mL", "uL", "mmol", "equiv", "M", "wt%", "g/mL", "%", "kg", "L", "mm", "ml", ""]


@FAST
@given(st.lists(st.tuples(st.floats(allow_nan=True, allow_infinity=True), st.sampled_from(UNITS)), min_size=1, max_size=3), st.text(max_size=8))
def test_random_amounts(parts, junk):
    text = ", ".join(f"{v} {u}" for v, u in parts) + junk
    try:
        parse_amount(text, key="CCN")
    except AmountError as exc:
        assert "amount for 'CCN'" in str(exc)
    try:
        chemcheck.check("CCN.CC(=O)Cl>>CCNC(C)=O", {"CCN": text})
    except AmountError:
        pass


@FAST
@given(st.one_of(st.binary(max_size=200), st.text(max_size=200), st.recursive(st.none() | st.integers() | st.text(max_size=5), lambda c: st.lists(c, max_size=3) | st.dictionaries(st.text(max_size=5), c, max_size=3), max_leaves=10)))
def test_random_notebook_files(tmp_path_factory, content):
    from chemcheck.review import NotebookError, review_notebook

    path = tmp_path_factory.mktemp("nb") / "x.ipynb"
    if isinstance(content, bytes):
        path.write_bytes(content)
    elif isinstance(content, str):
        path.write_text(content)
    else:
        path.write_text(json.dumps({"nbformat": 4, "nbformat_minor": 5, "metadata": {}, "cells": content}))
    try:
        review_notebook(path)
    except NotebookError as exc:
        assert "x.ipynb" in str(exc)


# --- hostile saved notebooks, careless CSV files, control characters, odd metadata --------------

JSON_VALUES = st.recursive(
    st.none() | st.booleans() | st.integers(-3, 3) | st.floats(allow_nan=False, allow_infinity=False) | st.text(max_size=6),
    lambda c: st.lists(c, max_size=3) | st.dictionaries(st.text(max_size=5), c, max_size=3),
    max_leaves=8,
)
_PAYLOAD = None


def _payload():
    global _PAYLOAD
    if _PAYLOAD is None:
        _PAYLOAD = json.loads(json.dumps(chemcheck.check("CCCCN.CC(=O)Cl>>CCCCNC(C)=O").to_dict()))
    return json.loads(json.dumps(_PAYLOAD))


def _paths(node, prefix=()):
    yield prefix
    if isinstance(node, dict):
        for k, v in node.items():
            yield from _paths(v, (*prefix, k))
    elif isinstance(node, list):
        for i, v in enumerate(node[:3]):
            yield from _paths(v, (*prefix, i))


def _damage(payload, where, value):
    """Replace (or delete, when value is the string '<del>') the field at ``where``."""
    if not where:
        return value
    node = payload
    for part in where[:-1]:
        node = node[part]
    if value == "<del>" and isinstance(node, dict):
        del node[where[-1]]
    else:
        node[where[-1]] = value
    return payload


@FAST
@given(st.data())
def test_damaged_saved_reports(tmp_path_factory, data):
    from chemcheck.cli import main
    from chemcheck.review import review_notebook

    payload = _payload()
    paths = list(_paths(payload))
    for _ in range(data.draw(st.integers(1, 3))):
        where = data.draw(st.sampled_from(paths))
        try:
            payload = _damage(payload, where, data.draw(JSON_VALUES | st.just("<del>")))
        except (KeyError, IndexError, TypeError):
            pass  # an earlier change removed the place
        paths = list(_paths(payload)) if isinstance(payload, (dict, list)) else [()]
    meta = data.draw(JSON_VALUES)
    nb = {"nbformat": 4, "nbformat_minor": 5, "metadata": {}, "cells": [
        {"cell_type": "code", "id": "a", "source": "", "execution_count": None, "metadata": {"chemcheck": meta},
         "outputs": [{"output_type": "display_data", "metadata": {}, "data": {chemcheck.MIME_TYPE: payload}}]}]}
    path = tmp_path_factory.mktemp("nb") / "x.ipynb"
    path.write_text(json.dumps(nb))
    review_notebook(path, recheck=False)
    assert main(["review", "--no-recheck", str(path)]) in (0, 2)
    assert main(["review", "--no-recheck", "--json", "--fail-on", "warning", str(path)]) in (0, 1, 2)


CSV_PIECES = ["reaction", "amounts", "name", "amount:CCN", ",", '"', "\n", "\r\n", "\ufeff", "CCN", "CC(=O)Cl>>CC",
              "{}", '{"CCN": "1 mmol"}', "[1]", "3", "=HYPERLINK(1)", "µ", "\x00", "\x1b[31m", " ", "\u202e"]


@FAST
@given(st.lists(st.sampled_from(CSV_PIECES), max_size=30), st.sampled_from(["utf-8", "utf-8-sig", "cp1252", "utf-16"]))
def test_careless_csv_files(tmp_path_factory, pieces, encoding):
    from chemcheck.batch import escape_cell, read_records

    text = "reaction,amounts,name\n" + "".join(pieces)
    path = tmp_path_factory.mktemp("csv") / "x.csv"
    try:
        path.write_bytes(text.encode(encoding))
    except UnicodeEncodeError:
        path.write_bytes(text.encode("utf-8"))
    try:
        records = list(read_records(path, []))
    except ChemcheckError:
        return  # a file refused as a whole (no 'reaction' column): a clear error
    for r in records:
        assert isinstance(r["reaction"], str)
        assert r.get("error") or isinstance(r["amounts"], dict)
        for v in r.values():
            if isinstance(v, str) and v and v[0] in "=+-@":
                assert escape_cell(v).startswith("'")


@FAST
@given(st.text(alphabet=st.characters(codec="utf-8", categories=["Cc", "Cf", "Lu", "Nd", "Po"]), max_size=20))
def test_errors_never_echo_control_characters(text):
    import unicodedata

    try:
        chemcheck.check("CCN." + text + ">>C", {text: "1 " + text} if text else None)
    except ChemcheckError as exc:
        msg = str(exc)
        assert not any(unicodedata.category(ch) == "Cc" or ch in "\u202e\u202d\u2066\u2067\u2068\u2069\u200f\u200e" for ch in msg), msg


@FAST
@given(JSON_VALUES)
def test_acknowledging_never_loses_metadata(meta):
    from chemcheck.review import add_acknowledgement, read_acknowledgements

    cell_meta = {"chemcheck": meta, "other": meta}
    ack = {"finding": "r#1", "rule": "r", "who": "A. Reviewer", "when": "t", "note": ""}
    try:
        after = add_acknowledgement(cell_meta, ack)
    except ChemcheckError:
        return  # both keys hold something else: refused, nothing written
    assert after["other"] == meta
    if meta is not None and after["chemcheck"] != meta:  # only a list of acknowledgements grew (null holds nothing)
        assert {k: v for k, v in after["chemcheck"].items() if k != "acknowledgements"} == {k: v for k, v in meta.items() if k != "acknowledgements"}
    assert read_acknowledgements(after)[-1] == ack
