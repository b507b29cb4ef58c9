"""The chemcheck benchmark: ratios against bare RDKit in one run (make bench).

Measures, over a generated corpus (benchmarks/corpus.py):
* bare RDKit: parsing and sanitizing every fragment of each reaction (names resolved first);
* ``check()`` without drawing: median and p95 per reaction, as a ratio to bare parsing;
* ``check()`` with the SVG scheme (the notebook bundle), for six-component reactions;
* batch throughput (reactions per second, one process) and peak memory;
* ``import chemcheck`` against ``import rdkit.Chem``.
* hostile inputs within the documented limits (``benchmarks/limits.py``), each in a fresh
  process: seconds and peak memory to answer or refuse;
* the same on real patent reactions when the development set is present (``benchmarks/real.py``):
  check/bare interleaved, cold-cache throughput in a fresh process, the cost of each stage.
Writes benchmarks/results/bench.json. It reports; it never fails.
"""

from __future__ import annotations

import json
import os
import re
import resource
import statistics
import subprocess
import sys
import time
from pathlib import Path

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE))

GOALS = {
    "check_over_bare_median": 15.0,
    "real_check_over_bare_median": 15.0,
    "real_check_ms_p95": 40.0,
    "real_reactions_per_second_cold": 100.0,
    "six_component_with_drawing_ms_median": 60.0,
    "reactions_per_second_no_drawing": 100.0,
    "import_overhead_s": 0.3,
}


def _pct(values, q):
    values = sorted(values)
    k = max(0, min(len(values) - 1, int(round(q * (len(values) - 1)))))
    return values[k]


def _import_time(stmt: str, repeats: int = 5) -> float:
    best = float("inf")
    for _ in range(repeats):
        t = time.perf_counter()
        subprocess.run([sys.executable, "-c", stmt], check=True)
        best = min(best, time.perf_counter() - t)
    return best


def main(n: int = 1200) -> dict:
    import corpus
    from rdkit import Chem, RDLogger

    RDLogger.DisableLog("rdApp.*")
    import chemcheck
    from chemcheck.display.bundle import mimebundle
    from chemcheck.reading.names import lookup_name

    reactions = corpus.generate(n)

    def fragments(text):
        out = []
        for tok in re.split(r"[.>]", text):
            if not tok:
                continue
            m = Chem.MolFromSmiles(tok)
            if m is None:
                hit = lookup_name(tok)
                tok = hit.smiles if hit else tok
            out.append(tok)
        return out

    resolved = [fragments(r["reaction"]) for r in reactions]
    # warm-up (catalog compilation, reference tables, name table)
    for r in reactions[:30]:
        chemcheck.check(r["reaction"], r["amounts"])

    def bare_loop():
        out = []
        for frags in resolved:
            t = time.perf_counter()
            for s in frags:
                Chem.MolFromSmiles(s)
            out.append(time.perf_counter() - t)
        return out

    # The ratio's baseline is bare parsing in a tight loop (hot caches: the conservative
    # choice), measured before and after the checks and averaged, so that a drift in the
    # machine's speed during the run cancels. Bare parsing interleaved with the checks
    # (each reaction parsed, then checked) is reported beside it.
    bare_before = bare_loop()
    rss0 = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    bare_interleaved = []
    per = []
    errors = 0
    t_checks = 0.0
    for r, frags in zip(reactions, resolved):
        t = time.perf_counter()
        for s in frags:
            Chem.MolFromSmiles(s)
        bare_interleaved.append(time.perf_counter() - t)
        t = time.perf_counter()
        try:
            chemcheck.check(r["reaction"], r["amounts"])
        except chemcheck.ChemcheckError:
            errors += 1
        per.append(time.perf_counter() - t)
        t_checks += per[-1]
    t_all = t_checks
    rss1 = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    bare_after = bare_loop()
    bare = [(a + b) / 2 for a, b in zip(bare_before, bare_after)]

    ratios = [c / b for c, b in zip(per, bare) if b > 0]
    six = [r for r, f in zip(reactions, resolved) if len(f) >= 5][:150]
    drawn = []
    for r in six:
        t = time.perf_counter()
        report = chemcheck.check(r["reaction"], r["amounts"])
        mimebundle(report)
        drawn.append(time.perf_counter() - t)

    # hard limits: each answered or refused (the bound is 2 s)
    limits = {}
    big = "N" + "C" * 1998 + "N.CC(=O)Cl"
    many = ".".join(["CCO"] * 100)
    fused = "c1ccc2" + "".join(f"cc{k if k < 10 else '%' + str(k)}" for k in range(3, 41)) + "ccccc%40" + "".join(f"cc{k if k < 10 else '%' + str(k)}" for k in range(39, 1, -1)) + "c1"
    for label, text, amounts in (
        ("2000_atom_molecule_s", big, None),
        ("100_component_reaction_s", many, None),
        ("40_fused_rings_s", fused + ".CC(=O)Cl>AlCl3>", None),
        ("huge_amount_refused_s", "CCN", {"CCN": "1e30 g"}),
        ("too_many_components_refused_s", ".".join(["C"] * 1000), None),
    ):
        t = time.perf_counter()
        try:
            chemcheck.check(text, amounts)
        except chemcheck.ChemcheckError:
            pass
        limits[label] = round(time.perf_counter() - t, 3)

    imp_rdkit = _import_time("import rdkit.Chem")
    imp_cc = _import_time("import chemcheck")
    result = {
        "reactions": len(reactions),
        "check_errors": errors,
        "bare_rdkit_ms_median": round(1000 * statistics.median(bare), 4),
        "bare_rdkit_interleaved_ms_median": round(1000 * statistics.median(bare_interleaved), 4),
        "check_ms_median": round(1000 * statistics.median(per), 3),
        "check_ms_p95": round(1000 * _pct(per, 0.95), 3),
        "check_over_bare_median": round(statistics.median(ratios), 1),
        "check_over_bare_p95": round(_pct(ratios, 0.95), 1),
        "check_over_bare_interleaved_median": round(
            statistics.median([c / b for c, b in zip(per, bare_interleaved) if b > 0]), 1
        ),
        "six_component_with_drawing_ms_median": round(1000 * statistics.median(drawn), 2) if drawn else None,
        "six_component_with_drawing_ms_p95": round(1000 * _pct(drawn, 0.95), 2) if drawn else None,
        "reactions_per_second_no_drawing": round(len(reactions) / t_all, 1),
        "peak_rss_mb": round(rss1 / 1024, 1),
        "rss_growth_during_checks_mb": round((rss1 - rss0) / 1024, 1),
        "import_rdkit_s": round(imp_rdkit, 3),
        "import_chemcheck_s": round(imp_cc, 3),
        "import_overhead_s": round(imp_cc - imp_rdkit, 3),
        "limits": limits,
        "hostile": _hostile(),
        "real": _real(),
        "cpu": os.cpu_count(),
        "goals": GOALS,
    }
    return result


def _hostile() -> dict:
    """Hostile inputs of the work budget, each in a fresh process (benchmarks/limits.py)."""
    import limits as hostile

    return hostile.main()


def _real() -> dict | None:
    """The real development set (None when absent), in the same run."""
    import real

    return real.main()


if __name__ == "__main__":
    res = main(int(sys.argv[1]) if len(sys.argv) > 1 else 1200)
    out = HERE / "results"
    out.mkdir(exist_ok=True)
    (out / "bench.json").write_text(json.dumps(res, indent=2))
    flat = dict(res)
    for k, v in (res.get("real") or {}).items():
        flat["real_" + (k if k != "cold" else "reactions_per_second_cold")] = (
            v["reactions_per_second_cold"] if k == "cold" else v
        )
    flat.pop("real", None)
    for k, v in flat.items():
        if k != "goals":
            goal = GOALS.get(k)
            mark = "" if goal is None else ("  (goal ≤ %s)" % goal if "per_second" not in k else "  (goal ≥ %s)" % goal)
            print(f"{k:40s} {v}{mark}")
