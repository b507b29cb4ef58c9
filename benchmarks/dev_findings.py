"""What chemcheck says on the real patent reactions of the development set.

    python benchmarks/dev_findings.py [--limit N] [--jsonl OUT]

Reads ../shared/data/reactions (skips when absent): every reaction is checked with and without
the source's atom maps. Prints the share of reactions with an error or a warning, the findings
per rule, the exceptions (there must be none), how often the verdict (the warning and error
findings) changes when the maps are removed, and the reaction classes assigned, by the source's
class where it gives one. ``--jsonl`` writes every finding for reading samples as a chemist.
"""

from __future__ import annotations

import argparse
import collections
import csv
import json
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT))
DEV = ROOT.parent / "shared" / "data" / "reactions"


def verdict(report) -> tuple:
    return tuple(sorted((f.rule, f.severity) for f in report.findings if f.severity != "info"))


def main() -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--limit", type=int, default=0)
    ap.add_argument("--jsonl", type=Path)
    args = ap.parse_args()
    if not (DEV / "patent_reactions_dev.csv").exists():
        print(f"development set not found at {DEV}: skipped")
        return 0
    import chemcheck
    from chemcheck.errors import ChemcheckError

    plain = list(csv.DictReader(open(DEV / "patent_reactions_dev.csv")))
    mapped = {r["id"]: r["mapped_reaction_smiles"] for r in csv.DictReader(open(DEV / "patent_reactions_dev_mapped.csv"))}
    if args.limit:
        plain = plain[: args.limit]
    out = open(args.jsonl, "w") if args.jsonl else None
    rows_err = rows_warn = refused = same = compared = 0
    exceptions: collections.Counter = collections.Counter()
    per_rule: collections.Counter = collections.Counter()
    classes: dict[str, collections.Counter] = collections.defaultdict(collections.Counter)
    t0 = time.perf_counter()
    for row in plain:
        try:
            rep = chemcheck.check(row["reaction_smiles"])
        except ChemcheckError as exc:
            refused += 1
            if out:
                out.write(json.dumps({"id": row["id"], "refused": str(exc)}) + "\n")
            continue
        except Exception as exc:  # counted: the goal is none
            exceptions[type(exc).__name__] += 1
            continue
        sev = {f.severity for f in rep.findings}
        rows_err += "error" in sev
        rows_warn += "warning" in sev
        for f in rep.findings:
            if f.severity != "info":
                per_rule[(f.rule, f.severity)] += 1
        u = rep.to_dict().get("understanding", {})
        classes[row["reaction_class"] or "-"][u.get("class", {}).get("id", "?")] += 1
        v_mapped = None
        try:
            rep_m = chemcheck.check(mapped[row["id"]])
            compared += 1
            same += verdict(rep) == verdict(rep_m)
            v_mapped = [[f.rule, f.severity, f.message] for f in rep_m.findings if f.severity != "info"]
        except Exception:
            pass
        if out:
            out.write(
                json.dumps(
                    {
                        "id": row["id"],
                        "reaction": row["reaction_smiles"],
                        "class": u.get("class", {}).get("id"),
                        "findings": [[f.rule, f.severity, f.message, f.fix] for f in rep.findings],
                        "with_source_maps": v_mapped,
                    }
                )
                + "\n"
            )
    n = len(plain)
    checked = n - refused - sum(exceptions.values())
    print(f"{n} reactions in {time.perf_counter() - t0:.0f} s; refused with a clear error: {refused}; exceptions: {dict(exceptions)}")
    print(f"reactions with an error: {rows_err} ({100 * rows_err / max(checked, 1):.1f} %)")
    print(f"reactions with a warning: {rows_warn} ({100 * rows_warn / max(checked, 1):.1f} %)")
    print(f"same verdict with and without the source's atom maps: {same}/{compared} ({100 * same / max(compared, 1):.1f} %)")
    print("findings per rule (warning and error):")
    for (rule, sev), k in per_rule.most_common():
        print(f"  {k:4d}  {rule} ({sev})")
    print("classes assigned, by the source's class (1 alkylation/arylation, 2 acylation, 5 protection, 6 deprotection, 7 reduction, 10 FGA):")
    for src in sorted(classes):
        top = ", ".join(f"{c} {k}" for c, k in classes[src].most_common(6))
        print(f"  {src}: {top}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
