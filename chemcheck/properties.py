"""Physical properties a chemist weighs by, each value with its source and uncertainty.

``properties(smiles_or_name)`` answers density (g/mL at 20 and 25 °C), liquid heat capacity
(J/(g·K), 25 °C), boiling, melting and flash point. Sources, in order of preference:

1. the package's curated table of liquids measured by volume (``data/liquids.csv``): handbook
   and supplier-label values, each marked with its source (and "from memory" where it is);
2. experimentally fitted correlations in the ``chemicals`` database (C. Bell and contributors),
   named by method: for liquid density the DIPPR-105 coefficients of Perry's Handbook (8th ed.,
   table 2-32), then the VDI Heat Atlas PPDS equation, then COSTALD with the characteristic
   volume fitted by Hankinson and Thomson (1979), then the Rackett equation with a fitted Z_RA;
   for liquid heat capacity the tabulated value at 298.15 K of Poling, Prausnitz and O'Connell
   (*The Properties of Gases and Liquids*, 5th ed.), then the correlations fitted to measured data
   by Zabransky et al. (1996), then the DIPPR-100 coefficients of Perry's Handbook;
3. estimates, marked as such with a wider uncertainty: COSTALD from the critical constants and
   acentric factor (corresponding states), and for heat capacity a typical organic-liquid value.

Compounds are found by InChIKey, never by SMILES string. The curated table is read without
loading the database, so the common liquids answer at once; the database is loaded (about 2 s)
only for a compound the table does not hold, and each answer is cached.
"""

from __future__ import annotations

import csv
import math
import warnings
from dataclasses import dataclass, field
from functools import lru_cache
from importlib import resources

__all__ = ["Value", "Properties", "properties", "properties_for_inchikey", "curated_table"]

# Relative uncertainties (fractions) by kind of source. The curated values are handbook or label
# figures (about 0.2 %); the fitted correlations reproduce their data to about 0.5-1 % near room
# temperature (Perry 8th ed. and VDI Heat Atlas quote 1 % or better for most liquids); the
# corresponding-states estimates scatter by several per cent for polar and halogenated liquids.
U_CURATED = 0.003
U_FITTED = 0.01
U_ESTIMATE = 0.04
U_CP_FITTED = 0.02
U_CP_ESTIMATE = 0.25

CP_TYPICAL = 1.8  # J/(g K), common practice for organic liquids (1.5-2.1)


@dataclass(frozen=True)
class Value:
    """One property value with its unit, where it comes from, and how far to trust it."""

    value: float
    unit: str
    source: str  # what the number rests on, in words
    method: str  # "curated", a named correlation, or "estimate: ..."
    uncertainty: float  # relative (0.01 = ±1 %)
    measured: bool  # a measured value or a fit to measured data; False for an estimate

    @property
    def estimated(self) -> bool:
        return not self.measured

    def to_dict(self) -> dict:
        return {
            "value": round(self.value, 6),
            "unit": self.unit,
            "source": self.source,
            "method": self.method,
            "uncertainty": self.uncertainty,
            "measured": self.measured,
        }

    def describe(self) -> str:
        pm = f"±{100 * self.uncertainty:.2g} %"
        return f"{self.value:.4g} {self.unit} ({self.source}, {pm})"


@dataclass(frozen=True)
class Properties:
    """What is known of one compound. Values absent from every source are ``None``."""

    inchikey: str
    name: str | None = None
    density_20: Value | None = None  # g/mL at 20 °C (liquid)
    density_25: Value | None = None  # g/mL at 25 °C (liquid)
    cp_liquid: Value | None = None  # J/(g K) at 25 °C
    boiling_point: Value | None = None  # °C at 1 atm
    melting_point: Value | None = None  # °C
    flash_point: Value | None = None  # °C, closed cup where the source says
    curated: bool = False
    notes: tuple[str, ...] = field(default=())

    @property
    def phase(self) -> str | None:
        """``"s"``, ``"l"`` or ``"g"`` at 25 °C and 1 atm, from the melting and boiling points."""
        tm = self.melting_point.value if self.melting_point else None
        tb = self.boiling_point.value if self.boiling_point else None
        if tm is not None and tm > 25.0:
            return "s"
        if tb is not None and tb < 25.0:
            return "g"
        if tm is not None or tb is not None or self.density_25 is not None:
            return "l"
        return None

    def density(self, t_c: float = 25.0) -> Value | None:
        """The liquid density at ``t_c`` (°C): the value at 20 or 25 °C, else the line through
        both (or, with only one, a typical expansion of 0.12 %/K). Meant for 0-50 °C."""
        d20, d25 = self.density_20, self.density_25
        for t, d in ((20.0, d20), (25.0, d25)):
            if d is not None and abs(t_c - t) < 1e-9:
                return d
        if d20 is None and d25 is None:
            return None
        if d20 is not None and d25 is not None:
            slope = (d25.value - d20.value) / 5.0
            base, t0 = d25, 25.0
        else:
            base, t0 = (d25, 25.0) if d25 is not None else (d20, 20.0)
            slope = -0.0012 * base.value
        v = base.value + slope * (t_c - t0)
        return Value(v, "g/mL", f"{base.source}; carried to {t_c:g} °C", base.method, base.uncertainty, base.measured)

    def to_dict(self) -> dict:
        def d(v):
            return None if v is None else v.to_dict()

        return {
            "inchikey": self.inchikey,
            "name": self.name,
            "phase": self.phase,
            "density_20": d(self.density_20),
            "density_25": d(self.density_25),
            "cp_liquid": d(self.cp_liquid),
            "boiling_point": d(self.boiling_point),
            "melting_point": d(self.melting_point),
            "flash_point": d(self.flash_point),
            "curated": self.curated,
            "notes": list(self.notes),
        }


# --------------------------------------------------------------------------------------------
# the curated table


@dataclass(frozen=True)
class _Row:
    inchikey: str
    name: str
    smiles: str
    d20: float | None
    d25: float | None
    source_20: str
    source_25: str
    check: str
    cp: float | None
    cp_source: str
    bp: float | None
    mp: float | None
    flash: float | None
    phys_source: str


def _f(text: str) -> float | None:
    text = (text or "").strip()
    return float(text) if text else None


@lru_cache(maxsize=1)
def curated_table() -> dict[str, _Row]:
    """The curated liquids, keyed by InChIKey (read from ``data/liquids.csv``)."""
    out: dict[str, _Row] = {}
    text = resources.files("chemcheck").joinpath("data/liquids.csv").read_text(encoding="utf-8")
    lines = [ln for ln in text.splitlines() if ln and not ln.startswith("#")]
    for rec in csv.DictReader(lines):
        row = _Row(
            inchikey=rec["inchikey"].strip(),
            name=rec["name"].strip(),
            smiles=rec["smiles"].strip(),
            d20=_f(rec["density_20"]),
            d25=_f(rec["density_25"]),
            source_20=rec["source_20"].strip(),
            source_25=rec["source_25"].strip(),
            check=rec["check"].strip(),
            cp=_f(rec["cp_25"]),
            cp_source=rec["cp_source"].strip(),
            bp=_f(rec["bp_c"]),
            mp=_f(rec["mp_c"]),
            flash=_f(rec["flash_c"]),
            phys_source=rec["phys_source"].strip(),
        )
        out[row.inchikey] = row
    return out


def _from_curated(row: _Row, db: Properties | None) -> Properties:
    """A curated row, with gaps filled from the database (never overriding the table)."""
    d20 = Value(row.d20, "g/mL", row.source_20, "curated", U_CURATED, True) if row.d20 else None
    d25 = Value(row.d25, "g/mL", row.source_25, "curated", U_CURATED, True) if row.d25 else None
    if d25 is None and d20 is not None:
        d25 = _converted(d20, 25.0, db.density_25 if db else None, db.density_20 if db else None)
    if d20 is None and d25 is not None:
        d20 = _converted(d25, 20.0, db.density_20 if db else None, db.density_25 if db else None)
    cp = Value(row.cp, "J/(g·K)", row.cp_source, "curated", U_CP_FITTED, True) if row.cp else None
    ps = row.phys_source

    def pt(v):
        return None if v is None else Value(v, "°C", ps, "curated", 0.0, True)

    return Properties(
        inchikey=row.inchikey,
        name=row.name,
        density_20=d20,
        density_25=d25,
        cp_liquid=cp or (db.cp_liquid if db else None),
        boiling_point=pt(row.bp) or (db.boiling_point if db else None),
        melting_point=pt(row.mp) or (db.melting_point if db else None),
        flash_point=pt(row.flash) or (db.flash_point if db else None),
        curated=True,
    )


def _converted(known: Value, t_c: float, db_target: Value | None, db_known: Value | None) -> Value:
    """A curated density carried to the other temperature with the database's slope (or a
    typical expansion of 0.12 %/K when the database has none)."""
    t_known = 25.0 if t_c == 20.0 else 20.0
    if db_target is not None and db_known is not None and db_known.measured:
        v = known.value * db_target.value / db_known.value
        how = f"{known.source}, carried to {t_c:g} °C with the {db_known.method} slope"
    else:
        v = known.value * (1 - 0.0012 * (t_c - t_known))
        how = f"{known.source}, carried to {t_c:g} °C with a typical expansion of 0.12 %/K"
    return Value(v, "g/mL", how, "curated", max(known.uncertainty, 0.004), True)


# --------------------------------------------------------------------------------------------
# the chemicals database


def _num(x) -> float | None:
    try:
        v = float(x)
    except (TypeError, ValueError):
        return None
    return v if math.isfinite(v) else None


@lru_cache(maxsize=2048)
def _cas_for(inchikey: str) -> tuple[str, str | None, float | None] | None:
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        try:
            from chemicals.identifiers import search_chemical

            meta = search_chemical("InChIKey=" + inchikey)
        except Exception:  # not in the database (ValueError), or a record it cannot read
            return None
    cas = getattr(meta, "CASs", None)
    if not cas:
        return None
    return cas, getattr(meta, "common_name", None), _num(getattr(meta, "MW", None))


@lru_cache(maxsize=1)
def _rho_tables():
    import chemicals.volume as vol

    vol._load_rho_data()
    return vol


@lru_cache(maxsize=1)
def _cp_tables():
    import chemicals.heat_capacity as hc

    hc._load_Cp_data()
    return hc


def _density_db(cas: str, mw: float, t_k: float, tm_k: float | None) -> Value | None:
    """Liquid density (g/mL) at ``t_k`` from the best method the database has for ``cas``."""
    from chemicals import acentric, critical
    from chemicals.dippr import EQ105

    vol = _rho_tables()
    t_c = t_k - 273.15
    tc = _num(critical.Tc(cas))

    def ok(lo, hi):
        return (lo is None or t_k >= lo - 1e-9) and (hi is None or t_k <= hi)

    if cas in vol.rho_data_Perry_8E_105_l.index:
        _, c1, c2, c3, c4, tmin, tmax = vol.rho_data_Perry_8E_105_l.loc[cas].tolist()
        if ok(tmin, tmax):
            rho = EQ105(t_k, c1, c2, c3, c4) * mw / 1e6  # mol/m3 -> g/mL
            return Value(rho, "g/mL", f"DIPPR-105 fit of measured data (Perry's Handbook 8th ed.), {t_c:g} °C",
                         "DIPPR-105 (Perry 8th ed.)", U_FITTED, True)
    if cas in vol.rho_data_VDI_PPDS_2.index:
        _, mw_v, tc_v, rhoc, a, b, c, d = vol.rho_data_VDI_PPDS_2.loc[cas].tolist()
        if 0.3 * tc_v <= t_k < tc_v:
            vm = vol.volume_VDI_PPDS(t_k, tc_v, rhoc, a, b, c, d, mw_v)
            return Value(mw / vm / 1e6, "g/mL", f"PPDS fit of measured data (VDI Heat Atlas), {t_c:g} °C",
                         "VDI PPDS", U_FITTED, True)
    if tc and t_k < tc and cas in vol.rho_data_COSTALD.index:
        vchar = _num(vol.rho_data_COSTALD.at[cas, "Vchar"])
        w = _num(vol.rho_data_COSTALD.at[cas, "omega_SRK"])
        if vchar and w is not None:
            vm = vol.COSTALD(t_k, tc, vchar, w)
            return Value(mw / vm / 1e6, "g/mL",
                         f"COSTALD with a characteristic volume fitted to measured densities (Hankinson and Thomson 1979), {t_c:g} °C",
                         "COSTALD (fitted)", 0.015, True)
    # estimates: corresponding states from critical constants
    vc = _num(critical.Vc(cas))
    w = _num(acentric.omega(cas))
    if tc and vc and w is not None and t_k < 0.95 * tc:
        vm = vol.COSTALD(t_k, tc, vc, w)
        return Value(mw / vm / 1e6, "g/mL",
                     f"estimated by COSTALD from critical constants (corresponding states), {t_c:g} °C",
                     "estimate: COSTALD (critical constants)", U_ESTIMATE, False)
    return None


# Liquids whose heat capacity is above 3.3 J/(g K): water, ammonia, hydrazine. For anything
# else a larger tabulated value is a transcription slip in the source (n-butylamine is listed
# at 294 J/(mol K) where measurements give about 190), and the next source is asked.
_HIGH_CP = {"7732-18-5", "7664-41-7", "302-01-2"}


def _cp_db(cas: str, mw: float) -> Value | None:
    top = 5.0 if cas in _HIGH_CP else 3.3
    return next((v for v in _cp_candidates(cas, mw) if 0.3 < v.value < top), None)


def _cp_candidates(cas: str, mw: float):
    hc = _cp_tables()
    t = 298.15
    for d in (hc.zabransky_dict_const_p, hc.zabransky_dict_sat_p, hc.zabransky_dict_iso_p):
        z = d.get(cas)
        if z is not None:
            try:
                with warnings.catch_warnings():
                    warnings.simplefilter("ignore")
                    v = _num(z.force_calculate(t))
            except Exception:
                v = None
            if v and getattr(z, "Tmin", 0) - 30 <= t <= getattr(z, "Tmax", 1e9) + 30:
                yield Value(v / mw, "J/(g·K)", "fit of measured data (Zabransky et al. 1996)",
                        "Zabransky", U_CP_FITTED, True)
    if cas in hc.Cp_data_Poling.index:
        v = _num(hc.Cp_data_Poling.at[cas, "Cpl"])
        if v:
            yield Value(v / mw, "J/(g·K)", "tabulated at 25 °C (Poling, Prausnitz and O'Connell, 5th ed.)",
                        "Poling table", U_CP_FITTED, True)
    if cas in hc.Cp_data_Perry_Table_153_100.index:
        r = hc.Cp_data_Perry_Table_153_100.loc[cas]
        if r["Tmin"] <= t <= r["Tmax"]:
            v = r["A"] + r["B"] * t + r["C"] * t**2 + r["D"] * t**3 + r["E"] * t**4  # J/(kmol K)
            if v > 0:
                yield Value(v / 1000 / mw, "J/(g·K)", "DIPPR-100 fit of measured data (Perry's Handbook 8th ed.)",
                            "DIPPR-100 (Perry 8th ed.)", U_CP_FITTED, True)


@lru_cache(maxsize=2048)
def _from_database(inchikey: str, mw_hint: float | None = None, cp: bool = True) -> Properties | None:
    hit = _cas_for(inchikey)
    if hit is None:
        return None
    cas, name, mw = hit
    mw = mw or mw_hint
    if not mw:
        return None
    with warnings.catch_warnings():
        warnings.simplefilter("ignore")
        from chemicals import phase_change, safety

        def pt(fn, what):
            try:
                method = None
                methods = getattr(phase_change if what != "flash" else safety, fn.__name__ + "_methods")(cas)
                method = methods[0] if methods else None
                v = _num(fn(cas))
            except Exception:
                return None
            if v is None:
                return None
            measured = method not in ("JOBACK",)
            src = f"chemicals database ({method})" if method else "chemicals database"
            return Value(v - 273.15, "°C", src if measured else f"estimated ({method})", method or "database",
                         0.0 if measured else 0.05, measured)

        tb = pt(phase_change.Tb, "tb")
        tm = pt(phase_change.Tm, "tm")
        fp = pt(safety.T_flash, "flash")
        tm_k = tm.value + 273.15 if tm else None
        try:
            d20 = _density_db(cas, mw, 293.15, tm_k)
            d25 = _density_db(cas, mw, 298.15, tm_k)
        except Exception:  # a record the library cannot evaluate
            d20 = d25 = None
        try:
            heat = _cp_db(cas, mw) if cp else None
        except Exception:
            heat = None
    return Properties(inchikey=inchikey, name=name, density_20=d20, density_25=d25, cp_liquid=heat,
                      boiling_point=tb, melting_point=tm, flash_point=fp)


# --------------------------------------------------------------------------------------------
# the entry points


@lru_cache(maxsize=2048)
def properties_for_inchikey(
    inchikey: str, mw: float | None = None, *, database: bool = True, cp: bool = True
) -> Properties | None:
    """Properties of the compound with this InChIKey; the curated table first (it answers
    without loading the database for anything it holds but a missing value), then the
    database. ``None`` when no source knows the compound. ``cp=False`` leaves the heat
    capacity out (its tables are not loaded) when only the density and phase are wanted."""
    if not inchikey:
        return None
    row = curated_table().get(inchikey)
    if row is not None:
        need_db = database and ((cp and row.cp is None) or row.bp is None or row.mp is None or row.flash is None)
        return _from_curated(row, _from_database(inchikey, mw, cp) if need_db else None)
    if not database:
        return None
    return _from_database(inchikey, mw, cp)


def properties(smiles_or_name: str) -> Properties:
    """Density, liquid heat capacity, boiling, melting and flash point of one compound, each
    with its source and uncertainty.

    ``smiles_or_name`` is a SMILES string or a reagent name (the package's name table, then
    exact names and synonyms in the ``chemicals`` database). Raises
    :class:`~chemcheck.errors.ParseError` when it is neither; a compound no source knows gives
    a :class:`Properties` with every value ``None``.
    """
    from .errors import ParseError

    if not isinstance(smiles_or_name, str) or not smiles_or_name.strip():
        raise ParseError("give a SMILES string or a reagent name", text=str(smiles_or_name)[:80])
    text = smiles_or_name.strip()
    from rdkit import Chem
    from rdkit.Chem import Descriptors

    from . import _rdlog
    from .reading.names import lookup_name

    with _rdlog.captured():
        mol = Chem.MolFromSmiles(text)
    name = None
    if mol is None:
        hit = lookup_name(text)
        if hit is None:
            raise ParseError("neither a SMILES string nor a known reagent name", text=text[:80])
        name = hit.name
        with _rdlog.captured():
            mol = Chem.MolFromSmiles(hit.smiles)
        if mol is None:
            raise ParseError("the name's structure could not be read", text=text[:80])
    with _rdlog.captured():
        key = Chem.MolToInchiKey(mol)
    if not key:
        raise ParseError("no InChIKey for this structure", text=text[:80])
    p = properties_for_inchikey(key, Descriptors.MolWt(mol))
    if p is None:
        return Properties(inchikey=key, name=name, notes=("no source has data for this compound",))
    if name and not p.name:
        p = Properties(**{**p.__dict__, "name": name})
    return p
