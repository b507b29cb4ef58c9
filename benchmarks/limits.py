"""Hostile inputs inside (or just beyond) the documented limits, each in a fresh process: the
time to answer or refuse, and the process's peak memory above a bare ``import chemcheck``.

The goal (work budget): every input within the limits answers in <= 2 s and <= 500 MB, and
``view3d`` in <= 5 s. These are benchmark figures; the tests assert the behaviour (the note,
the refusal, the number of structures built), never the seconds.
"""

from __future__ import annotations

import json
import os
import subprocess
import sys
import textwrap
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent

_POLYAMINE = "NC" + "CNC" * 664 + "N"  # 1,995 heavy atoms, 666 nitrogens

CASES = {
    "polyamine_2000_atoms_acetyl_chloride": ("check", f"{_POLYAMINE}.CC(=O)Cl>>CC(=O){_POLYAMINE}"),
    "hydrazine_chain_2000_N_acetyl_chloride": ("check", "N" * 1997 + ".CC(=O)Cl>>CC(=O)" + "N" * 1997),
    "hydrazine_chain_2000_N_with_drawing": ("bundle", "N" * 1997 + ".CC(=O)Cl>>CC(=O)" + "N" * 1997),
    "grid_40x50_fused_rings": ("check", "GRID"),
    "view3d_chain_of_290_carbons": ("view3d", "C" * 290),
    "view3d_dummy_atom": ("view3d", "[*+]N"),
}

_SCRIPT = """
import json, resource, sys, time
import chemcheck
from rdkit import Chem
mode, text = sys.argv[1], sys.argv[2]
if text == "GRID":
    rw = Chem.RWMol()
    idx = {(i, j): rw.AddAtom(Chem.Atom(6)) for i in range(50) for j in range(40)}
    for i in range(50):
        for j in range(40):
            if j + 1 < 40: rw.AddBond(idx[i, j], idx[i, j + 1], Chem.BondType.SINGLE)
            if i + 1 < 50: rw.AddBond(idx[i, j], idx[i + 1, j], Chem.BondType.SINGLE)
    m = rw.GetMol(); m.UpdatePropertyCache()
    text = Chem.MolToSmiles(m, canonical=False) + ".CC(=O)Cl"
rss0 = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
t = time.perf_counter()
outcome = "answered"
try:
    if mode == "view3d":
        v = chemcheck.view3d(text, 0)
        outcome = "3D" if v.molblock else "2D: " + (v.note or "")
    else:
        r = chemcheck.check(text)
        if mode == "bundle":
            from chemcheck.display.bundle import mimebundle
            mimebundle(r)
        notes = [f.message for f in r.findings if f.rule == "check-budget-reached"]
        outcome = "answered" + (" with a budget note" if notes else "")
except chemcheck.ChemcheckError as exc:
    outcome = type(exc).__name__ + ": " + str(exc)[-60:]
dt = time.perf_counter() - t
rss1 = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
print(json.dumps({"s": round(dt, 2), "peak_mb_above_import": round((rss1 - rss0) / 1024, 1), "outcome": outcome}))
"""


def run_case(mode: str, text: str, timeout: float = 600) -> dict:
    env = dict(os.environ)
    env["PYTHONPATH"] = os.pathsep.join([str(ROOT), env.get("PYTHONPATH", "")])
    try:
        proc = subprocess.run(
            [sys.executable, "-c", textwrap.dedent(_SCRIPT), mode, text],
            capture_output=True, text=True, env=env, timeout=timeout,
        )
    except subprocess.TimeoutExpired:
        return {"s": None, "outcome": f"no answer within {timeout:g} s"}
    if proc.returncode != 0:
        return {"s": None, "outcome": f"exit {proc.returncode}: {proc.stderr.strip()[-200:]}"}
    return json.loads(proc.stdout.strip().splitlines()[-1])


def main() -> dict:
    return {name: run_case(mode, text) for name, (mode, text) in CASES.items()}


if __name__ == "__main__":
    print(json.dumps(main(), indent=2))
