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
