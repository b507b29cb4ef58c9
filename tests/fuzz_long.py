"""The long fuzzing run (make fuzz): at least 100,000 generated inputs within a time bound.

Reaction strings, SMILES fragments, names and amount strings from a seeded generator; only
chemcheck's own errors may escape. Prints counts; exits non-zero on the first other error.
"""

from __future__ import annotations

import random
import sys
import time

import chemcheck
from chemcheck import ChemcheckError
from chemcheck.amounts import parse_amount

ALPHABET = "CNOSPFIBrcnos()[]=#@+-.123456789%/\\H>"
PIECES = ["CCN", "CC(=O)Cl", "c1ccccc1", "[Na+]", "[O-]C(C)=O", "Cl", "N", "Et3N", "AlCl3", "DCM", "C(", "[nH]1cccc1", "BF3·OEt2", "C[N+](C)(C)C", "NCc1ccccc1", "xyz"]
UNITS = ["g", "mg", "mL", "mmol", "equiv", "M", "wt%", "g/mL", "%", "mm", "", "kg"]


def main(n: int = 100_000, budget_s: float = 1800.0) -> int:
    rnd = random.Random(20261201)
    start = time.time()
    counts = {"ok": 0, "refused": 0}
    for i in range(n):
        if time.time() - start > budget_s:
            print(f"time bound reached after {i} inputs")
            break
        kind = i % 4
        try:
            if kind == 0:
                text = "".join(rnd.choice(ALPHABET) for _ in range(rnd.randint(0, 30)))
                chemcheck.parse_reaction(text)
            elif kind == 1:
                parts = [rnd.choice(PIECES) for _ in range(rnd.randint(1, 5))]
                text = ".".join(parts[:2]) + ">" + ".".join(parts[2:3]) + ">" + ".".join(parts[3:])
                chemcheck.check(text)
            elif kind == 2:
                text = f"{rnd.uniform(-10, 1e6):.{rnd.randint(0, 4)}g} {rnd.choice(UNITS)}"
                if rnd.random() < 0.5:
                    text += f", {rnd.uniform(0, 120):.3g} {rnd.choice(UNITS)}"
                parse_amount(text, key="X")
            else:
                text = "".join(chr(rnd.randint(32, 0x2FFF)) for _ in range(rnd.randint(1, 12)))
                chemcheck.parse_reaction(text)
            counts["ok"] += 1
        except ChemcheckError:
            counts["refused"] += 1
        except Exception as exc:
            print(f"input {i} {text!r}: {type(exc).__name__}: {exc}")
            return 1
    total = counts["ok"] + counts["refused"]
    print(f"{total} inputs in {time.time() - start:.0f} s: {counts['ok']} read, {counts['refused']} refused with chemcheck's own error")
    return 0 if total >= min(n, 1) else 1


if __name__ == "__main__":
    sys.exit(main(int(sys.argv[1]) if len(sys.argv) > 1 else 100_000))
