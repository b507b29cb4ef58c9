"""The package's one pint unit registry, made on first use (creating it costs about 1 s), and
amounts written in the unit a chemist would read them in (mg to kg, µL to L, µmol to mol)."""

from __future__ import annotations

from functools import lru_cache

__all__ = ["ureg", "Q_", "fmt_mass", "fmt_volume", "fmt_moles", "convert"]


@lru_cache(maxsize=1)
def ureg():
    import pint

    return pint.UnitRegistry()


def Q_(value, unit):
    return ureg().Quantity(value, unit)


# The amounts' units are plain decimal multiples: converted here without building the pint
# registry, so that a first check with amounts does not wait for it.
_EXPONENT = {
    "microgram": -6, "milligram": -3, "gram": 0, "kilogram": 3,
    "microliter": -3, "milliliter": 0, "liter": 3,
    "micromole": -3, "millimole": 0, "mole": 3,
    "mole/liter": 0, "millimole/liter": -3, "micromole/liter": -6, "millimole/milliliter": 0,
    "gram/milliliter": 0, "gram/centimeter**3": 0, "kilogram/liter": 0, "gram/liter": -3,
}


def convert(value: float, unit: str, target: str) -> float:
    """``value`` in ``unit`` expressed in ``target`` (units of one kind, as the amounts use them)."""
    if unit in _EXPONENT and target in _EXPONENT:
        e = _EXPONENT[unit] - _EXPONENT[target]
        return value * 10**e if e >= 0 else value / 10**-e  # exact for decimal inputs
    return float(Q_(value, unit).to(target).magnitude)


def _fmt(x: float, unit: str) -> str:
    return f"{x:.4g} {unit}"


def fmt_mass(g: float) -> str:
    """A mass in g written in µg, mg, g or kg."""
    a = abs(g)
    if a >= 1000:
        return _fmt(g / 1000, "kg")
    if a >= 1 or a == 0:
        return _fmt(g, "g")
    if a >= 1e-3:
        return _fmt(g * 1000, "mg")
    return _fmt(g * 1e6, "µg")


def fmt_volume(ml: float) -> str:
    """A volume in mL written in µL, mL or L."""
    a = abs(ml)
    if a >= 1000:
        return _fmt(ml / 1000, "L")
    if a >= 0.1 or a == 0:
        return _fmt(ml, "mL")
    return _fmt(ml * 1000, "µL")


def fmt_moles(mmol: float) -> str:
    """An amount of substance in mmol written in µmol, mmol or mol."""
    a = abs(mmol)
    if a >= 1000:
        return _fmt(mmol / 1000, "mol")
    if a >= 0.1 or a == 0:
        return _fmt(mmol, "mmol")
    return _fmt(mmol * 1000, "µmol")
