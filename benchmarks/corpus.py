"""A corpus of reactions for the benchmark, made here from RDKit reaction templates over small
sets of building blocks (our own choice; no external data): acylations with and without base,
N-alkylations, condensations, ring substitutions and eliminations, with amounts."""

from __future__ import annotations

import itertools
import random

from rdkit import Chem, RDLogger
from rdkit.Chem import rdChemReactions

RDLogger.DisableLog("rdApp.*")

AMINES = ["CCCCN", "NCc1ccccc1", "C1CCNCC1", "C1COCCN1", "Nc1ccccc1", "Nc1ccc(C)cc1", "CNCc1ccccc1", "NC1CCCCC1", "NCCOC", "Nc1ccc(Cl)cc1", "NCc1ccco1", "CC(C)N"]
ACID_CHLORIDES = ["CC(=O)Cl", "O=C(Cl)c1ccccc1", "O=C(Cl)c1ccco1", "CCC(=O)Cl", "O=C(Cl)C1CC1", "Cc1ccc(cc1)S(Cl)(=O)=O", "CS(Cl)(=O)=O"]
ANHYDRIDES = ["CC(=O)OC(C)=O", "CC(C)(C)OC(=O)OC(=O)OC(C)(C)C"]
HALIDES = ["BrCc1ccccc1", "CI", "CCCCBr", "BrCC=C", "ClCc1ccc(Cl)cc1"]
CARBONYLS = ["O=Cc1ccccc1", "O=C1CCCCC1", "CC(C)=O", "O=Cc1ccco1", "CC1CCCCC1=O", "CCC=O"]
ARENES = ["COc1ccccc1", "Cc1ccccc1", "CC(=O)Nc1ccccc1", "c1ccccc1", "Clc1ccccc1", "O=[N+]([O-])c1ccccc1", "Nc1ccccc1"]
ELIM = ["CCC(C)(Br)C", "CCCC(C)Br", "CCC(C)OS(=O)(=O)c1ccc(C)cc1", "CCCC(C)[N+](C)(C)C.[I-]", "BrC1CCCCC1C"]
BASES = ["Et3N", "DIPEA", "pyridine", "K2CO3", ""]
SOLVENTS = ["DCM", "THF", "MeCN", "DMF"]

TEMPLATES = {
    "acylation": "[N;!H0;+0:1].[C:2](=[O:3])[Cl,Br]>>[N:1][C:2]=[O:3]",
    "sulfonylation": "[N;!H0;+0:1].[S:2](=[O:3])(=[O:4])[Cl]>>[N:1][S:2](=[O:3])=[O:4]",
    "anhydride": "[N;!H0;+0:1].[C:2](=[O:3])O[C:4]=[O:5]>>[N:1][C:2]=[O:3]",
    "alkylation": "[N;!H0;+0:1].[CX4:2][Br,I,Cl]>>[N:1][C:2]",
    "imine": "[N;H2;+0:1].[C:2]=[O]>>[N:1]=[C:2]",
    "enamine": "[N;H1;+0:1].[C:2](=[O])[C;!H0:3]>>[N:1][C:2]=[C:3]",
    "nitration": "[cH:1]>>[c:1][N+](=O)[O-]",
    "acylation_fc": "[cH:1].[C:2](=[O:3])Cl>>[c:1][C:2]=[O:3]",
}


def _run(template: str, reactants: list[str]) -> str | None:
    rxn = rdChemReactions.ReactionFromSmarts(template)
    mols = [Chem.MolFromSmiles(s) for s in reactants]
    if any(m is None for m in mols):
        return None
    try:
        products = rxn.RunReactants(tuple(mols))
    except Exception:
        return None
    for ps in products:
        p = ps[0]
        try:
            Chem.SanitizeMol(p)
            return Chem.MolToSmiles(p)
        except Exception:
            continue
    return None


def generate(n: int = 1200, seed: int = 7) -> list[dict]:
    rnd = random.Random(seed)
    out: list[dict] = []

    def add(kind, reactants, agents, product, amounts):
        text = ".".join(reactants) + ">" + ".".join(a for a in agents if a) + ">" + (product or "")
        out.append({"kind": kind, "reaction": text, "amounts": amounts})

    pairs = list(itertools.product(AMINES, ACID_CHLORIDES))
    while len(out) < n:
        kind = rnd.choice(["acylation", "acylation", "anhydride", "alkylation", "condensation", "ring", "elimination"])
        base = rnd.choice(BASES)
        solvent = rnd.choice(SOLVENTS)
        if kind == "acylation":
            a, e = rnd.choice(pairs)
            t = "sulfonylation" if "S(Cl)" in e else "acylation"
            p = _run(TEMPLATES[t], [a, e])
            amounts = {a: f"{rnd.choice([1, 2, 5, 10])} mmol", e: f"{rnd.choice([1.0, 1.1, 1.2])} equiv"}
            if base:
                amounts[base] = f"{rnd.choice([0.5, 1.0, 1.5, 2.0])} equiv"
            add(kind, [a, e], [base, solvent], p, amounts)
        elif kind == "anhydride":
            a, e = rnd.choice(AMINES), rnd.choice(ANHYDRIDES)
            p = _run(TEMPLATES["anhydride"], [a, e])
            add(kind, [a, e], [base, solvent], p, {a: "5 mmol", e: "1.2 equiv"})
        elif kind == "alkylation":
            a, e = rnd.choice(AMINES), rnd.choice(HALIDES)
            p = _run(TEMPLATES["alkylation"], [a, e])
            add(kind, [a, e], [rnd.choice(["K2CO3", "Et3N", ""]), solvent], p, {a: "2.0 mmol", e: f"{rnd.choice([1.0, 2.5])} equiv"})
        elif kind == "condensation":
            a, c = rnd.choice(AMINES), rnd.choice(CARBONYLS)
            p = _run(TEMPLATES["imine"], [a, c]) or _run(TEMPLATES["enamine"], [a, c])
            agents = [rnd.choice(["", "NaBH(OAc)3"]), rnd.choice(["MeOH", "DCE", "THF"])]
            add(kind, [c, a], agents, p, {c: "3 mmol", a: "1.1 equiv"})
        elif kind == "ring":
            ar = rnd.choice(ARENES)
            if rnd.random() < 0.5:
                p = _run(TEMPLATES["nitration"], [ar])
                add(kind, [ar, "O[N+](=O)[O-]"], ["OS(=O)(=O)O"], p, {ar: "10 mmol", "O[N+](=O)[O-]": "1.1 equiv"})
            else:
                e = rnd.choice(["CC(=O)Cl", "CCC(=O)Cl"])
                p = _run(TEMPLATES["acylation_fc"], [ar, e])
                add(kind, [ar, e], ["AlCl3", "DCM"], p, {ar: "10 mmol", e: "1.1 equiv", "AlCl3": f"{rnd.choice([1.2, 2.5])} equiv"})
        else:
            s = rnd.choice(ELIM)
            b = rnd.choice(["[Na+].CC[O-]", "[K+].CC(C)(C)[O-]", "[Na+].[OH-]"])
            add(kind, [s, b], ["EtOH"], None, {s: "4 mmol"})
    return out[:n]


if __name__ == "__main__":
    import json
    import sys

    json.dump(generate(int(sys.argv[1]) if len(sys.argv) > 1 else 1200), sys.stdout, indent=1)
