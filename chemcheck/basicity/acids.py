"""Aqueous pKa of common acids (25 °C), for drawn acid-base reactions and proton bookkeeping.

Sources: [CRC] CRC Handbook of Chemistry and Physics, "Dissociation constants of inorganic
acids and bases" and "... of organic acids in aqueous solution"; strong-acid values (below 0)
are the usual estimates compiled there and by Perrin (they vary by source by a unit or more).
Values transcribed as recalled. Water is given on the a(H2O) = 1 convention (pKa 14.0 for
H2O -> OH-, 0.0 for H3O+).
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

from rdkit import Chem

from .. import _rdlog

CRC = "CRC Handbook (acid dissociation constants)"

# name, SMILES of the acid, pKa, SMILES of the conjugate base
ACIDS: tuple[tuple[str, str, float, str], ...] = (
    ("hydrogen iodide", "I", -10.0, "[I-]"),
    ("hydrogen bromide", "Br", -9.0, "[Br-]"),
    ("hydrogen chloride", "Cl", -6.0, "[Cl-]"),
    ("triflic acid", "OS(=O)(=O)C(F)(F)F", -14.0, "[O-]S(=O)(=O)C(F)(F)F"),
    ("perchloric acid", "OCl(=O)(=O)=O", -10.0, "[O-]Cl(=O)(=O)=O"),
    ("sulfuric acid", "OS(=O)(=O)O", -3.0, "[O-]S(=O)(=O)O"),
    ("hydrogen sulfate", "[O-]S(=O)(=O)O", 1.99, "[O-]S(=O)(=O)[O-]"),
    ("p-toluenesulfonic acid", "Cc1ccc(cc1)S(=O)(=O)O", -2.8, "Cc1ccc(cc1)S(=O)(=O)[O-]"),
    ("methanesulfonic acid", "CS(=O)(=O)O", -1.9, "CS(=O)(=O)[O-]"),
    ("nitric acid", "O[N+](=O)[O-]", -1.4, "[O-][N+](=O)[O-]"),
    ("trifluoroacetic acid", "OC(=O)C(F)(F)F", 0.23, "[O-]C(=O)C(F)(F)F"),
    ("hydronium", "[OH3+]", 0.0, "O"),
    ("phosphoric acid", "OP(=O)(O)O", 2.15, "[O-]P(=O)(O)O"),
    ("dihydrogen phosphate", "[O-]P(=O)(O)O", 7.20, "[O-]P(=O)([O-])O"),
    ("hydrogen phosphate", "[O-]P(=O)([O-])O", 12.35, "[O-]P(=O)([O-])[O-]"),
    ("hydrogen fluoride", "F", 3.17, "[F-]"),
    ("formic acid", "OC=O", 3.75, "[O-]C=O"),
    ("benzoic acid", "OC(=O)c1ccccc1", 4.20, "[O-]C(=O)c1ccccc1"),
    ("acetic acid", "CC(=O)O", 4.76, "CC(=O)[O-]"),
    ("propanoic acid", "CCC(=O)O", 4.87, "CCC(=O)[O-]"),
    ("carbonic acid", "OC(=O)O", 6.35, "OC(=O)[O-]"),
    ("hydrogen carbonate", "OC(=O)[O-]", 10.33, "[O-]C(=O)[O-]"),
    ("hydrogen sulfide", "S", 7.0, "[SH-]"),
    ("hydrogen cyanide", "C#N", 9.21, "[C-]#N"),
    ("phenol", "Oc1ccccc1", 9.99, "[O-]c1ccccc1"),
    ("p-nitrophenol", "Oc1ccc(cc1)[N+](=O)[O-]", 7.15, "[O-]c1ccc(cc1)[N+](=O)[O-]"),
    ("ammonium", "[NH4+]", 9.25, "N"),
    ("water", "O", 14.0, "[OH-]"),
    ("methanol", "CO", 15.5, "C[O-]"),
    ("ethanol", "CCO", 15.9, "CC[O-]"),
    ("tert-butanol", "CC(C)(C)O", 17.0, "CC(C)(C)[O-]"),
    ("dihydrogen", "[H][H]", 35.0, "[H-]"),
    ("diisopropylamine (N-H)", "CC(C)NC(C)C", 36.0, "CC(C)[N-]C(C)C"),
    ("hexamethyldisilazane (N-H)", "C[Si](C)(C)N[Si](C)(C)C", 26.0, "C[Si](C)(C)[N-][Si](C)(C)C"),
)


@dataclass(frozen=True)
class Acid:
    name: str
    pka: float
    source: str


@lru_cache(maxsize=1)
def _by_key() -> tuple[dict[str, Acid], dict[str, Acid]]:
    acids: dict[str, Acid] = {}
    bases: dict[str, Acid] = {}
    with _rdlog.captured():
        for name, acid, pka, base in ACIDS:
            a = Chem.MolFromSmiles(acid)
            b = Chem.MolFromSmiles(base)
            if a is not None:
                acids.setdefault(Chem.MolToSmiles(a), Acid(name, pka, CRC))
            if b is not None:
                bases.setdefault(Chem.MolToSmiles(b), Acid(name, pka, CRC))
    return acids, bases


def acid_pka(smiles: str) -> Acid | None:
    """pKa of a listed acid, by its canonical SMILES (one fragment)."""
    return _by_key()[0].get(smiles)


def conjugate_acid_pka(base_smiles: str) -> Acid | None:
    """pKa of the conjugate acid of a listed anionic or neutral base (hydroxide -> water)."""
    return _by_key()[1].get(base_smiles)
