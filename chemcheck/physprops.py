"""Physical data at 25 °C from the ``chemicals``/``thermo`` databases, looked up by InChIKey.

Never by SMILES string (aromatic forms are missed and some strings resolve to the wrong
compound). The first look-up loads the databases (about 2 s); results are cached.
"""

from __future__ import annotations

import warnings
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
    source: str = "thermo/chemicals database at 25 °C"


@lru_cache(maxsize=1024)
def props_for(inchikey: str) -> Props | None:
    if not inchikey:
        return None
    try:
        with warnings.catch_warnings():
            warnings.simplefilter("ignore")
            from thermo import Chemical

            c = Chemical("InChIKey=" + inchikey, T=298.15)
    except Exception:  # unknown compound, or a record the library cannot evaluate
        return None

    def num(x, scale=1.0, offset=0.0):
        try:
            v = float(x)
        except (TypeError, ValueError):
            return None
        return v * scale + offset if v == v else None

    return Props(
        name=getattr(c, "name", None),
        density_g_ml=num(getattr(c, "rho", None), 1e-3),
        phase=getattr(c, "phase", None),
        tm_c=num(getattr(c, "Tm", None), 1.0, -273.15),
        tb_c=num(getattr(c, "Tb", None), 1.0, -273.15),
        cp_j_gk=num(getattr(c, "Cpl", None), 1e-3),
    )
