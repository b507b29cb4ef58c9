"""Accuracy of chemcheck's pKa against the IUPAC digitized pKa dataset (tests and benchmarks only).

The dataset (CC BY-NC 4.0) is read from ../shared/data/pka/ and is never shipped with or read
by the package. Prints MAE, RMSE and worst error overall and per class; writes JSON with
--json PATH.

    python benchmarks/pka_accuracy.py [--json results.json] [--worst 20]
"""

from __future__ import annotations

import argparse
import csv
import json
import math
import statistics
import sys
from collections import defaultdict
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
DATA = ROOT.parent / "shared" / "data" / "pka"


def load(name: str) -> list[dict]:
    path = DATA / name
    if not path.exists():
        sys.exit(f"dataset not found: {path}")
    with path.open() as fh:
        return list(csv.DictReader(fh))


def predict(smiles: str) -> float | None:
    from chemcheck.basicity import first_protonation
    from chemcheck.errors import ChemcheckError

    try:
        _, macro = first_protonation(smiles)
    except ChemcheckError:
        return None
    return macro


def evaluate(rows: list[dict], class_key=lambda r: r["site_class"]):
    errors = defaultdict(list)
    worst = []
    missing = 0
    for r in rows:
        exp = float(r["pka"])
        pred = predict(r["smiles"])
        if pred is None:
            missing += 1
            pred = 0.0  # counted as predicting "not basic"
        err = pred - exp
        cls = class_key(r)
        errors[cls].append(err)
        errors["all"].append(err)
        for family in ("aniline", "aliphatic"):  # the classes: anilines, aliphatic amines
            if cls.startswith(family + "_"):
                errors[family + " (all)"].append(err)
        worst.append((abs(err), r["smiles"], exp, pred, class_key(r)))
    summary = {}
    for cls, errs in sorted(errors.items(), key=lambda kv: -len(kv[1])):
        summary[cls] = {
            "n": len(errs),
            "mae": round(statistics.fmean(abs(e) for e in errs), 3),
            "rmse": round(math.sqrt(statistics.fmean(e * e for e in errs)), 3),
            "bias": round(statistics.fmean(errs), 3),
            "worst": round(max(abs(e) for e in errs), 2),
        }
    worst.sort(reverse=True)
    return summary, worst, missing


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--json")
    ap.add_argument("--worst", type=int, default=0)
    ap.add_argument("--class", dest="cls")
    args = ap.parse_args()
    single = load("amine_pka_dev.csv")
    multi = load("amine_pka_multisite_dev.csv")
    if args.cls:
        single = [r for r in single if r["site_class"] == args.cls]
        multi = [r for r in multi if args.cls in r["site_class"]]
    s1, w1, m1 = evaluate(single)
    s2, w2, m2 = evaluate(multi, lambda r: "multisite")
    out = {"single_site": s1, "multi_site": s2, "no_prediction": m1 + m2}
    for name, table in (("single-site", s1), ("multi-site", s2)):
        print(f"{name}:")
        for cls, v in table.items():
            print(f"  {cls:24s} n={v['n']:5d}  MAE {v['mae']:.2f}  RMSE {v['rmse']:.2f}  bias {v['bias']:+.2f}  worst {v['worst']:.1f}")
    print(f"no prediction: {m1 + m2}")
    for e, smi, exp, pred, cls in (w1 + w2)[: args.worst]:
        print(f"  {e:5.2f}  exp {exp:6.2f} pred {pred:6.2f}  {cls:20s} {smi}")
    if args.json:
        Path(args.json).write_text(json.dumps(out, indent=2))


if __name__ == "__main__":
    main()
