"""The long fuzzing run (make fuzz): 200,000 generated inputs within a time bound.

Reaction strings, SMILES fragments, names and amount strings, damaged saved reports, careless
CSV rows, control characters and odd cell metadata, from a seeded generator; only chemcheck's own
errors may escape, error messages never carry control characters, and acknowledging never loses
metadata. Prints counts; exits non-zero on the first other error (``--keep-going``: lists every
distinct failure, then exits non-zero).
"""

from __future__ import annotations

import copy
import json
import random
import sys
import tempfile
import time
import unicodedata
from pathlib import Path

import chemcheck
from chemcheck import ChemcheckError
from chemcheck.amounts import parse_amount

ALPHABET = "CNOSPFIBrcnos()[]=#@+-.123456789%/\\H>"
PIECES = ["CCN", "CC(=O)Cl", "c1ccccc1", "[Na+]", "[O-]C(C)=O", "Cl", "N", "Et3N", "AlCl3", "DCM", "C(", "[nH]1cccc1", "BF3·OEt2", "C[N+](C)(C)C", "NCc1ccccc1", "xyz", "Cl22", "Nn11", "*", "[*+]"]
UNITS = ["g", "mg", "mL", "mmol", "equiv", "M", "wt%", "g/mL", "%", "mm", "", "kg", "µL", "μg"]
CONTROL = ["\x1b[31m", "\x1b]0;t\x07", "\r", "\n", "\x00", "\u202e", "\u2066", "\x9b", "\ufeff", "\x7f"]
CSV_PIECES = [",", '"', "\n", "\r\n", "CCN", "CC(=O)Cl>>CC", "{}", '{"CCN": "1 mmol"}', "[1]", '"x"', "3", "=1+1", "µ", "\x00", "é"]
KINDS = 8


def _odd_json(rnd: random.Random, depth: int = 0):
    r = rnd.random()
    if depth > 2 or r < 0.4:
        return rnd.choice([None, True, 0, -1, 1.5, "", "x", "error", [[-1, 0]], "10.6"])
    if r < 0.7:
        return [_odd_json(rnd, depth + 1) for _ in range(rnd.randint(0, 3))]
    return {rnd.choice(["acknowledgements", "finding", "who", "a", "rule"]): _odd_json(rnd, depth + 1) for _ in range(rnd.randint(0, 3))}


def _places(node, prefix=()):
    yield prefix
    if isinstance(node, dict):
        for k, v in node.items():
            yield from _places(v, (*prefix, k))
    elif isinstance(node, list):
        for i, v in enumerate(node[:3]):
            yield from _places(v, (*prefix, i))


def _damaged(rnd: random.Random, payload: dict):
    p = copy.deepcopy(payload)
    for _ in range(rnd.randint(1, 3)):
        places = [w for w in _places(p) if w]
        if not places or not isinstance(p, dict):
            break
        where = rnd.choice(places)
        node = p
        for part in where[:-1]:
            node = node[part]
        if isinstance(node, dict) and rnd.random() < 0.3:
            del node[where[-1]]
        else:
            node[where[-1]] = _odd_json(rnd)
    return p


def _one(kind: int, rnd: random.Random, state: dict) -> str:
    """Run one generated input; return its description (for the failure report)."""
    if kind == 0:
        text = state["last"] = "".join(rnd.choice(ALPHABET) for _ in range(rnd.randint(0, 30)))
        chemcheck.parse_reaction(text)
    elif kind == 1:
        parts = [rnd.choice(PIECES) for _ in range(rnd.randint(1, 5))]
        text = ".".join(parts[:2]) + ">" + ".".join(parts[2:3]) + ">" + ".".join(parts[3:])
        amounts = {rnd.choice(parts): f"{rnd.choice(['1', '1e-300', '0', '-2', '1e300', 'nan'])} {rnd.choice(UNITS)}"} if rnd.random() < 0.3 else None
        state["last"] = f"{text!r} with amounts {amounts}"
        chemcheck.check(text, amounts)
    elif kind == 2:
        text = f"{rnd.uniform(-10, 1e6):.{rnd.randint(0, 4)}g} {rnd.choice(UNITS)}"
        if rnd.random() < 0.5:
            text += f", {rnd.uniform(0, 120):.3g} {rnd.choice(UNITS)}"
        state["last"] = text
        parse_amount(text, key="X")
    elif kind == 3:
        text = state["last"] = "".join(chr(rnd.randint(32, 0x2FFF)) for _ in range(rnd.randint(1, 12)))
        chemcheck.parse_reaction(text)
    elif kind == 4:  # a damaged saved report, reviewed from a notebook file
        from chemcheck.review import review_notebook

        payload = _damaged(rnd, state["payload"])
        nb = {"nbformat": 4, "nbformat_minor": 5, "metadata": {}, "cells": [
            {"cell_type": "code", "id": "a", "source": "", "execution_count": None, "metadata": {"chemcheck": _odd_json(rnd)},
             "outputs": [{"output_type": "display_data", "metadata": {}, "data": {chemcheck.MIME_TYPE: payload}}]}]}
        text = state["last"] = json.dumps(payload)[:300]
        state["nb"].write_text(json.dumps(nb))
        for r in review_notebook(state["nb"], recheck=rnd.random() < 0.05).reports:
            r.to_dict()
            r.open_findings("warning")
    elif kind == 5:  # a careless CSV file
        from chemcheck.batch import check_record, read_records

        text = state["last"] = "reaction,amounts,name\n" + "".join(rnd.choice(CSV_PIECES) for _ in range(rnd.randint(0, 25)))
        state["csv"].write_bytes(text.encode(rnd.choice(["utf-8", "utf-8-sig", "cp1252"]), "replace"))
        for rec in list(read_records(state["csv"], []))[:3]:
            if rnd.random() < 0.1:
                check_record(rec)
    elif kind == 6:  # control characters: refused or read, never echoed raw
        text = state["last"] = rnd.choice(PIECES) + "".join(rnd.choice(CONTROL + list("CN.>")) for _ in range(rnd.randint(1, 6)))
        try:
            chemcheck.check(text, {text: "1 mmol" + rnd.choice(CONTROL)} if rnd.random() < 0.3 else None)
        except ChemcheckError as exc:
            msg = str(exc)
            bad = [c for c in msg if unicodedata.category(c) in ("Cc", "Cf")]
            if bad:
                raise AssertionError(f"control character {bad[0]!r} in the message {msg!r}") from None
            raise
    else:  # acknowledging odd metadata
        from chemcheck.review import add_acknowledgement, read_acknowledgements

        meta = {"chemcheck": _odd_json(rnd), "other": _odd_json(rnd)}
        text = state["last"] = json.dumps(meta)[:300]
        before = copy.deepcopy(meta)
        ack = {"finding": "r#1", "rule": "r", "who": "A. Reviewer", "when": "t", "note": ""}
        after = add_acknowledgement(meta, ack)
        if meta != before or after["other"] != before["other"] or read_acknowledgements(after)[-1] != ack:
            raise AssertionError(f"metadata changed or acknowledgement lost: {text}")
    return text


def main(n: int = 200_000, budget_s: float = 3600.0, keep_going: bool = False) -> int:
    rnd = random.Random(20261201)
    start = time.time()
    counts = {"ok": 0, "refused": 0}
    failures: dict[str, str] = {}
    with tempfile.TemporaryDirectory(prefix="chemcheck-fuzz-") as tmp:
        state = {
            "payload": json.loads(json.dumps(chemcheck.check("CCCCN.CC(=O)Cl>>CCCCNC(C)=O").to_dict())),
            "nb": Path(tmp) / "x.ipynb",
            "csv": Path(tmp) / "x.csv",
        }
        for i in range(n):
            if time.time() - start > budget_s:
                print(f"time bound reached after {i} inputs")
                break
            state_rnd = random.Random(rnd.random())
            state["last"] = None
            try:
                _one(i % KINDS, state_rnd, state)
                counts["ok"] += 1
            except ChemcheckError:
                counts["refused"] += 1
            except Exception as exc:
                kind_text = f"kind {i % KINDS}, input {state.get('last')!r}"
                sig = f"{type(exc).__name__}: {str(exc)[:120]}"
                if sig not in failures:
                    failures[sig] = kind_text
                    print(f"input {i} ({kind_text}): {sig}")
                if not keep_going:
                    return 1
    total = counts["ok"] + counts["refused"]
    print(f"{total} inputs in {time.time() - start:.0f} s: {counts['ok']} read, {counts['refused']} refused with chemcheck's own error; {len(failures)} distinct other failure(s)")
    return 1 if failures or total < min(n, 1) else 0


if __name__ == "__main__":
    args = [a for a in sys.argv[1:] if not a.startswith("--")]
    sys.exit(main(int(args[0]) if args else 200_000, keep_going="--keep-going" in sys.argv))
