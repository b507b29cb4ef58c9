"""The benchmark on real patent reactions (the development set in ../shared, skipped when absent).

Times are CPU time of this process (``time.process_time``): on the shared development machine
wall time measures the other processes as much as this one; the wall-clock median is shown
beside it.

* check/bare per reaction: each reaction parsed bare (RDKit parse and sanitize of every
  fragment of the same reaction text), then checked, interleaved, in one process: median and
  p95 of the ratio and of the check time;
* unique-reaction throughput with cold caches: a fresh process checks reactions it has never
  seen (no warm-up, no repeats), reactions per second on one core;
* the cost of each stage (parse, mapping, perception, basicity, rules, report, other), from a
  profile of the checks: every function's own time goes to the stage of the chemcheck file that
  runs it (time in RDKit and the standard library goes to the chemcheck caller), so that the
  next bottleneck is visible.

The data are read from ``/work/shared/data/reactions`` (or ``CHEMCHECK_REACTIONS``) and never
copied into the repository.
"""

from __future__ import annotations

import cProfile
import csv
import os
import pstats
import statistics
import subprocess
import sys
import time
from pathlib import Path

DATA = Path(os.environ.get("CHEMCHECK_REACTIONS", "/work/shared/data/reactions")) / "patent_reactions_dev.csv"

# stage of each chemcheck source file (first matching prefix, paths relative to the package)
STAGES = (
    ("reading/", "parse"),
    ("_rdlog.py", "parse"), ("data/", "parse"),
    ("understand/", "mapping"), ("changes.py", "mapping"),
    ("perceive/", "perception"),
    ("basicity/", "basicity"), ("engine.py:_basicity_sections", "basicity"), ("workup.py", "basicity"),
    ("rules/", "rules"), ("regio/", "rules"), ("balance.py", "rules"), ("acid_base.py", "rules"),
    ("stoichiometry.py", "rules"), ("amounts.py", "rules"), ("units.py", "rules"), ("scale.py", "rules"),
    ("physprops.py", "rules"),
    ("report.py", "report"), ("findings.py", "report"), ("textreport.py", "report"), ("schema/", "report"),
)


def _pct(values, q):
    values = sorted(values)
    k = max(0, min(len(values) - 1, int(round(q * (len(values) - 1)))))
    return values[k]


def load(limit: int | None = None) -> list[str]:
    if not DATA.exists():
        return []
    with DATA.open(newline="") as fh:
        rows = [r["reaction_smiles"] for r in csv.DictReader(fh)]
    return rows[:limit] if limit else rows


def _fragments(text: str) -> list[str]:
    return [t for part in text.split(">") for t in part.split(".") if t]


def interleaved(reactions: list[str]) -> dict:
    """check/bare per reaction, each reaction parsed bare then checked, in this process."""
    from rdkit import Chem, RDLogger

    import chemcheck

    RDLogger.DisableLog("rdApp.*")  # bare parsing of odd fragments logs; the check captures its own
    frags = [_fragments(r) for r in reactions]
    for r in reactions[:20]:  # warm-up: catalog compilation, reference tables, name table
        try:
            chemcheck.check(r)
        except Exception:
            pass
    bare, per, wall, failed, crashed = [], [], [], 0, 0
    clock = time.process_time  # CPU time: on a shared machine wall time measures the neighbours
    for text, fr in zip(reactions, frags):
        RDLogger.DisableLog("rdApp.*")  # the check restores RDKit's log after each run
        t = clock()
        for s in fr:
            Chem.MolFromSmiles(s)
        bare.append(clock() - t)
        w, t = time.perf_counter(), clock()
        try:
            chemcheck.check(text)
        except chemcheck.ChemcheckError:
            failed += 1
        except Exception:  # an internal error: counted, reported, never hidden
            crashed += 1
        per.append(clock() - t)
        wall.append(time.perf_counter() - w)
    ratios = [c / b for c, b in zip(per, bare) if b > 0]
    return {
        "reactions": len(reactions),
        "refused": failed,
        "internal_errors": crashed,
        "bare_ms_median": round(1000 * statistics.median(bare), 3),
        "check_ms_median": round(1000 * statistics.median(per), 2),
        "check_ms_p95": round(1000 * _pct(per, 0.95), 2),
        "check_ms_max": round(1000 * max(per), 1),
        "check_wall_ms_median": round(1000 * statistics.median(wall), 2),
        "check_over_bare_median": round(statistics.median(ratios), 1),
        "check_over_bare_p95": round(_pct(ratios, 0.95), 1),
    }


def _stage_of(filename: str, funcname: str) -> str | None:
    norm = filename.replace(os.sep, "/")
    if "/chemcheck/" not in norm:
        return None
    rel = norm.rsplit("/chemcheck/", 1)[1]
    for prefix, stage in STAGES:
        if ":" in prefix:
            f, fn = prefix.split(":")
            if rel == f and funcname == fn:
                return stage
            continue
        if rel.startswith(prefix):
            return stage
    return "other"


def stages(reactions: list[str]) -> dict:
    """Share of the check time spent in each stage, from a profile of ``check()`` over the set."""
    import chemcheck

    prof = cProfile.Profile(time.process_time)  # CPU time, as the other figures
    prof.enable()
    for r in reactions:
        try:
            chemcheck.check(r)
        except Exception:
            pass
    prof.disable()
    raw = pstats.Stats(prof).stats  # func -> (cc, nc, tt, ct, callers)
    memo: dict = {}

    def owner_shares(func, depth=0) -> dict[str, float]:
        """Fractions of this function's own time owed to each stage."""
        if func in memo:
            return memo[func]
        stage = _stage_of(func[0], func[2])
        if stage is not None:
            memo[func] = {stage: 1.0}
            return memo[func]
        callers = raw.get(func, (0, 0, 0, 0, {}))[4]
        total = sum(v[2] for v in callers.values())
        out: dict[str, float] = {}
        memo[func] = {"other": 1.0}  # guards recursion
        if total > 0 and depth < 30:
            for caller, v in callers.items():
                for st, share in owner_shares(caller, depth + 1).items():
                    out[st] = out.get(st, 0.0) + share * v[2] / total
        memo[func] = out or {"other": 1.0}
        return memo[func]

    acc: dict[str, float] = {}
    for func, (_cc, _nc, tt, _ct, _callers) in raw.items():
        for st, share in owner_shares(func).items():
            acc[st] = acc.get(st, 0.0) + tt * share
    total = sum(acc.values()) or 1.0
    return {k: round(100 * v / total, 1) for k, v in sorted(acc.items(), key=lambda kv: -kv[1])}


_FRESH = """
import sys, time, json
sys.path.insert(0, {here!r})
import real
import chemcheck
rx = real.load()[{start}:{stop}]
if {profile!r}:
    print(json.dumps(real.stages(rx)))
else:
    t = time.process_time()
    for r in rx:
        try:
            chemcheck.check(r)
        except Exception:
            pass
    print(json.dumps({{"n": len(rx), "s": time.process_time() - t}}))
"""


def _fresh(start: int, stop: int, profile: bool):
    import json

    here = str(Path(__file__).resolve().parent)
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join([str(Path(here).parent), env.get("PYTHONPATH", "")])
    proc = subprocess.run(
        [sys.executable, "-c", _FRESH.format(here=here, start=start, stop=stop, profile=profile)],
        capture_output=True, text=True, env=env, check=True,
    )
    return json.loads(proc.stdout.strip().splitlines()[-1])


def cold_throughput(start: int, stop: int) -> dict:
    """Reactions per CPU-second in a fresh process over reactions it has never seen (no
    warm-up: the first check's one-time loading counts, as it does for a batch)."""
    got = _fresh(start, stop, False)
    return {"reactions": got["n"], "reactions_per_second_cold": round(got["n"] / got["s"], 1)}


def cold_stages(start: int, stop: int) -> dict:
    """Stage shares of fresh checks in a fresh process (the profile's own overhead weighs on
    Python-heavy stages; read the shares as an order, not as exact fractions)."""
    return _fresh(start, stop, True)


def main(n: int | None = None) -> dict | None:
    reactions = load()
    if not reactions:
        return None
    if n:
        reactions = reactions[:n]
    half = len(reactions) // 2
    # the cold run first, on reactions the main process checks later (each process is fresh)
    cold = cold_throughput(half, len(reactions))
    shares = cold_stages(0, min(400, half))
    inter = interleaved(reactions)
    return {**inter, "cold": cold, "stage_percent": shares}


if __name__ == "__main__":
    import json

    print(json.dumps(main(int(sys.argv[1]) if len(sys.argv) > 1 else None), indent=2))
