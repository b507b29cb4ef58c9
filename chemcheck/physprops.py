"""Physical data at 25 °C in the shape the older callers used, from :mod:`chemcheck.properties`.

Looked up by InChIKey, never by SMILES string. The curated table answers the common liquids
without loading the ``chemicals`` database; anything else loads it on first use.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache

__all__ = ["Props", "props_for"]


@dataclass(frozen=True)
class Props:
    name: str | None
    density_g_ml: float | None
    phase: str | None  # "s", "l", "g" at 25 °C
    tm_c: float | None
    tb_c: float | None
    cp_j_gk: float | None  # liquid heat capacity
    source: str = "curated table or chemicals database, 25 °C"
    density_estimated: bool = False
    cp_source: str | None = None


@lru_cache(maxsize=1024)
def props_for(inchikey: str) -> Props | None:
    from .properties import properties_for_inchikey

    p = properties_for_inchikey(inchikey, database=False) or properties_for_inchikey(inchikey)
    if p is None:
        return None
    d = p.density_25
    return Props(
        name=p.name,
        density_g_ml=d.value if d else None,
        phase=p.phase,
        tm_c=p.melting_point.value if p.melting_point else None,
        tb_c=p.boiling_point.value if p.boiling_point else None,
        cp_j_gk=p.cp_liquid.value if p.cp_liquid else None,
        source=d.source if d else "no density known",
        density_estimated=bool(d and not d.measured),
        cp_source=p.cp_liquid.source if p.cp_liquid else None,
    )
