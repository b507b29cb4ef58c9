"""Names in place of SMILES: the package's own table first, then the ``chemicals`` database.

Structures are never looked up by SMILES string (aromatic forms are missed and some strings
resolve to the wrong compound); a SMILES that parses is taken as written.
"""

from __future__ import annotations

import unicodedata
from dataclasses import dataclass
from functools import lru_cache

from ..data.reagents import REAGENTS

__all__ = ["NameHit", "lookup_name", "name_for_smiles", "kind_for_smiles", "name_for_inchikey", "kind_for_inchikey", "normalise"]

_DROP = str.maketrans("", "", " \t·•∙.-_(),'’/")
_SUBSCRIPTS = str.maketrans("₀₁₂₃₄₅₆₇₈₉", "0123456789")


def normalise(name: str) -> str:
    text = unicodedata.normalize("NFKD", name.translate(_SUBSCRIPTS))
    text = "".join(ch for ch in text if not unicodedata.combining(ch))
    return text.casefold().translate(_DROP)


@dataclass(frozen=True)
class NameHit:
    name: str  # the name shown
    smiles: str
    kind: str | None
    source: str  # "name table" or "chemicals database" (an exact name or listed synonym there)


@lru_cache(maxsize=1)
def _table() -> dict[str, NameHit]:
    table: dict[str, NameHit] = {}
    for names, smiles, kind in REAGENTS:
        hit = NameHit(names[0], smiles, kind, "name table")
        for n in names:
            table.setdefault(normalise(n), hit)
    return table


@lru_cache(maxsize=1)
def _by_inchikey() -> dict[str, tuple[str, str]]:
    from rdkit import Chem

    from .. import _rdlog

    out: dict[str, tuple[str, str]] = {}
    with _rdlog.captured():
        for names, smiles, kind in REAGENTS:
            mol = Chem.MolFromSmiles(smiles)
            if mol is None:
                continue
            key = Chem.MolToInchiKey(mol)
            if key:
                out.setdefault(key, (names[0], kind))
    return out


@lru_cache(maxsize=1)
def _by_smiles() -> dict[str, tuple[str, str]]:
    from rdkit import Chem

    from .. import _rdlog

    out: dict[str, tuple[str, str]] = {}
    with _rdlog.captured():
        for names, smiles, kind in REAGENTS:
            mol = Chem.MolFromSmiles(smiles)
            if mol is not None:
                out.setdefault(Chem.MolToSmiles(mol), (names[0], kind))
    return out


def name_for_smiles(canonical_smiles: str) -> str | None:
    """The table name of a structure, by its RDKit canonical SMILES (same structure, same string)."""
    hit = _by_smiles().get(canonical_smiles)
    return hit[0] if hit else None


def kind_for_smiles(canonical_smiles: str) -> str | None:
    hit = _by_smiles().get(canonical_smiles)
    return hit[1] if hit else None


def name_for_inchikey(inchikey: str) -> str | None:
    hit = _by_inchikey().get(inchikey)
    return hit[0] if hit else None


def kind_for_inchikey(inchikey: str) -> str | None:
    hit = _by_inchikey().get(inchikey)
    return hit[1] if hit else None


@lru_cache(maxsize=512)
def lookup_name(text: str, database: bool = True) -> NameHit | None:
    """The structure for a reagent name, or ``None`` when no source knows it.

    ``database=False`` consults only the package's own table (for tokens that look like
    mistyped SMILES, which the database would otherwise answer with a guess).
    """
    key = normalise(text)
    if not key:
        return None
    hit = _table().get(key)
    if hit is not None or not database:
        return hit
    return _chemicals_lookup(text)


def _chemicals_lookup(text: str) -> NameHit | None:
    """A name the ``chemicals`` database holds exactly: its common name, its IUPAC name, or one
    of its listed synonyms. The database's own search also answers formulas, CAS numbers,
    element symbols and short abbreviations (``dna`` is listed for a naphthoic acid), so the
    hit is kept only when the text is one of its names, and abbreviations of fewer than five
    characters are not trusted."""
    text = text.strip()
    if len(text) < 3 or not any(ch.isalpha() for ch in text):
        return None
    try:
        from chemicals.identifiers import search_chemical
    except ImportError:  # pragma: no cover - chemicals is a dependency
        return None
    try:
        meta = search_chemical(text)
    except Exception:  # the database raises ValueError, and KeyError on some inputs
        return None
    smiles = getattr(meta, "smiles", None)
    if not smiles:
        return None
    wanted = text.casefold()
    common = (getattr(meta, "common_name", None) or "").casefold()
    iupac = (getattr(meta, "iupac_name", None) or "").casefold()
    synonyms = [str(s).casefold() for s in (getattr(meta, "synonyms", None) or ())]
    if wanted not in (common, iupac) and not (wanted in synonyms and len(wanted) >= 5):
        return None
    return NameHit(getattr(meta, "common_name", None) or text, smiles, None, "chemicals database")
