"""Amount strings as chemists write them: ``"1.07 g"``, ``"2.75 mL, 4.0 M"``, ``"2.00 g, 95%"``.

Grammar: ``<number> <unit>`` then optional comma-separated qualifiers:

* a molarity ``4.0 M`` (or ``mM``; ``mol/L``): the volume is of a solution of that strength;
* a mass fraction ``40 wt%`` (or ``% w/w``): the mass or volume is of a solution;
* a density ``0.726 g/mL`` (or ``g/cm3``, ``kg/L``);
* a purity or assay ``95%`` (or ``95% purity``, ``assay 95%``);
* stated equivalents ``1.0 equiv`` beside an amount, for the consistency check.

Units are case-sensitive (``mM`` millimolar is not ``mm``): ``µg mg g kg``, ``µL uL mL L``,
``µmol umol mmol mol``, and ``equiv`` (``eq``, ``equiv.``, ``eq.``) as a ratio of the
chemcheck's own, not a pint unit. The micro sign (U+00B5) and the Greek mu (U+03BC) are both
accepted, everywhere. Digits are ASCII 0-9 (other scripts' digits are refused with a message).
Amounts below a physical minimum (1 pg, 1 pL, 1 fmol) are refused, so that no infinite or
undefined number reaches the results. Every value is echoed back as it was read.

``validate_amounts`` checks the keys and values of an amounts dict; ``add_amount`` adds one
key to a dict being built from lines of text (command line, cell magic) and refuses a second
amount for the same component text.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass

from ._memo import Memo
from .errors import AmountError

__all__ = ["Amount", "parse_amount", "validate_amounts", "add_amount"]

_NUMBER = r"[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?"
_HEAD = re.compile(rf"^\s*(?P<num>{_NUMBER})\s*(?P<unit>[^\s,]+(?:\s*%)?)?\s*$")
# The units accepted (case-sensitive) and their pint spelling; pint does the conversion.
# Units are looked up after the Greek mu (U+03BC) is written as the micro sign (U+00B5).
_MASS = {"mg": "milligram", "g": "gram", "kg": "kilogram", "µg": "microgram", "ug": "microgram"}
_VOLUME = {"µL": "microliter", "uL": "microliter", "mL": "milliliter", "L": "liter"}
_MOLES = {"µmol": "micromole", "umol": "micromole", "mmol": "millimole", "mol": "mole"}
_EQUIV = {"equiv", "eq", "equiv.", "eq.", "equivalents", "equivalent"}
_MOLARITY = {
    "M": "mole/liter", "mM": "millimole/liter", "µM": "micromole/liter", "uM": "micromole/liter",
    "mol/L": "mole/liter", "mmol/mL": "millimole/milliliter",
}
# Physical minimums (in g, mL, mmol): below them the number is a typing slip, and dividing by it
# would overflow to infinity.
_MINIMUM = {"mass": (1e-12, "1 pg"), "volume": (1e-9, "1 pL"), "amount": (1e-12, "1 fmol"),
            "equivalents": (1e-6, "0.000001 equiv"), "molarity": (1e-9, "1 nM"), "density": (0.05, "0.05 g/mL")}
_DENSITY = {"g/mL": "gram/milliliter", "g/cm3": "gram/centimeter**3", "g/cm^3": "gram/centimeter**3", "kg/L": "kilogram/liter", "g/L": "gram/liter"}


def _convert(value: float, unit: str, target: str) -> float:
    from .units import convert

    return convert(value, unit, target)


def _mu(text: str) -> str:
    return text.replace("\u03bc", "\u00b5")


def _ascii_digits(text: str, key, whole) -> None:
    for ch in text:
        if ch.isdigit() and ch not in "0123456789":
            raise AmountError(
                f"'{ch}' is not an ASCII digit: write the number with the digits 0-9",
                key=key, text=whole,
            )


def validate_amounts(amounts) -> dict[str, str] | None:
    """The amounts dict checked: ``None`` or a dict of component text (str) to amount (str).
    Raises :class:`AmountError` naming the bad key or value."""
    if amounts is None:
        return None
    if not isinstance(amounts, dict):
        raise AmountError(f"amounts must be a dict of component text to amount, not {type(amounts).__name__}")
    for key, value in amounts.items():
        if not isinstance(key, str):
            raise AmountError(
                f"a component must be given as its text in the reaction (a string), not {type(key).__name__} {key!r}"[:160],
                key=str(key)[:40],
            )
        if not key.strip():
            raise AmountError("an amount is given for an empty component name", key=key)
        if not isinstance(value, str):
            raise AmountError(
                f"an amount must be text like '1.2 mmol', not {type(value).__name__}", key=key[:80],
            )
    return amounts


def add_amount(amounts: dict[str, str], key: str, value: str, where: str | None = None) -> None:
    """Add ``key = value`` to ``amounts`` being built from lines of text; a second amount for
    the same component text is an :class:`AmountError` naming both."""
    key, value = key.strip(), value.strip()
    if key in amounts:
        at = f" ({where})" if where else ""
        raise AmountError(
            f"two amounts are given for this component: '{amounts[key]}' and '{value}'{at}; keep one",
            key=key, text=value,
        )
    amounts[key] = value


_HINTS = {
    "ml": "mL", "ul": "µL", "Ml": "mL", "MG": "mg", "G": "g", "MMOL": "mmol", "Mmol": "mmol",
    "mm": "mM (millimolar) or mmol", "gm": "g", "gr": "g", "l": "L", "mg.": "mg",
}


@dataclass(frozen=True)
class Amount:
    text: str
    kind: str  # "mass", "volume", "moles", "equiv"
    value: float  # in g, mL, mmol or equiv
    molarity: float | None = None  # mol/L of a solution
    mass_fraction: float | None = None  # 0-1
    density: float | None = None  # g/mL
    purity: float | None = None  # 0-1
    stated_equiv: float | None = None

    @property
    def is_solution(self) -> bool:
        return self.molarity is not None or self.mass_fraction is not None

    @property
    def quantity(self):
        """The amount as a pint quantity (g, mL or mmol); equivalents are a plain ratio."""
        from .units import Q_

        unit = {"mass": "gram", "volume": "milliliter", "moles": "millimole"}.get(self.kind)
        return self.value if unit is None else Q_(self.value, unit)

    def describe(self) -> str:
        unit = {"mass": "g", "volume": "mL", "moles": "mmol", "equiv": "equiv"}[self.kind]
        parts = [f"{_fmt(self.value)} {unit}"]
        if self.molarity is not None:
            parts.append(f"of a {_fmt(self.molarity)} M solution")
        if self.mass_fraction is not None:
            parts.append(f"of a {_fmt(100 * self.mass_fraction)} wt% solution")
        if self.density is not None:
            parts.append(f"density {_fmt(self.density)} g/mL")
        if self.purity is not None:
            parts.append(f"purity {_fmt(100 * self.purity)} %")
        if self.stated_equiv is not None:
            parts.append(f"stated {_fmt(self.stated_equiv)} equiv")
        return ", ".join(parts)


def _fmt(x: float) -> str:
    return f"{x:.4g}"


def _number(text: str, key: str, whole: str) -> float:
    if not re.fullmatch(_NUMBER, text.strip()):
        raise AmountError(f"'{text}' is not a number", key=key, text=whole)
    v = float(text)
    if not math.isfinite(v):
        raise AmountError("the number is not finite", key=key, text=whole)
    return v


_READ = Memo()


def parse_amount(text: str, key: str | None = None) -> Amount:
    """Read one amount string; raise :class:`AmountError` naming the component and the text.
    Amounts read before are remembered by their text (an Amount is immutable)."""
    if isinstance(text, str):
        hit = _READ.get(text)
        if hit is not None:
            return hit
    return _READ.put(text, _parse_amount(text, key))


def _parse_amount(text: str, key: str | None = None) -> Amount:
    if not isinstance(text, str):
        raise AmountError(f"an amount must be text like '1.2 mmol', not {type(text).__name__}", key=key)
    whole = text
    if len(text) > 200:
        raise AmountError("the amount is longer than 200 characters", key=key, text=text[:40] + "...")
    _ascii_digits(text, key, whole)
    parts = [_mu(p.strip()) for p in text.split(",")]
    if not parts[0]:
        raise AmountError("empty amount (write e.g. '1.2 mmol')", key=key, text=whole)
    head = _split_number_unit(parts[0], key, whole)
    num, unit = head
    kind, value = _head_kind(num, unit, key, whole)
    molarity = mass_fraction = density = purity = stated = None
    for q in parts[1:]:
        if not q:
            raise AmountError("empty qualifier (two commas?)", key=key, text=whole)
        qnum, qunit = _split_number_unit(q, key, whole, qualifier=True)
        u = qunit.replace(" ", "")
        if u in _MOLARITY:
            molarity = _positive(_convert(qnum, _MOLARITY[u], "mole/liter"), "molarity", key, whole)
        elif u in ("wt%", "%w/w", "w/w%", "%(w/w)", "wt.%"):
            mass_fraction = _fraction(qnum, "mass fraction", key, whole)
        elif u in _DENSITY:
            density = _positive(_convert(qnum, _DENSITY[u], "gram/milliliter"), "density", key, whole)
            if density > 25:
                raise AmountError(f"a density of {qnum} {qunit} is not plausible", key=key, text=whole)
        elif u in ("%", "%purity", "purity", "%assay", "assay"):
            purity = _fraction(qnum, "purity", key, whole)
        elif u in _EQUIV:
            stated = _positive(qnum, "equivalents", key, whole)
        else:
            raise AmountError(_unknown_unit(qunit, qualifier=True), key=key, text=whole)
    if kind == "equiv":
        if any(v is not None for v in (molarity, mass_fraction, density, purity)):
            raise AmountError("equivalents take no molarity, density or purity", key=key, text=whole)
        if stated is not None:
            raise AmountError("equivalents given twice", key=key, text=whole)
    if kind == "moles" and (molarity is not None or mass_fraction is not None):
        raise AmountError("an amount in mol needs no molarity or mass fraction", key=key, text=whole)
    if kind == "mass" and molarity is not None:
        raise AmountError("a molarity goes with a volume (e.g. '2.75 mL, 4.0 M'), not a mass", key=key, text=whole)
    if molarity is not None and mass_fraction is not None:
        raise AmountError("give a molarity or a mass fraction, not both", key=key, text=whole)
    return Amount(whole, kind, value, molarity, mass_fraction, density, purity, stated)


def _split_number_unit(part: str, key, whole, qualifier: bool = False) -> tuple[float, str]:
    m = re.match(rf"^\s*(?P<pre>[A-Za-z%][\w%]*\s+)?(?P<num>{_NUMBER})\s*(?P<unit>.*?)\s*$", part)
    if qualifier and m and m.group("pre") and m.group("pre").strip().lower() in ("assay", "purity"):
        return _number(m.group("num"), key, whole), "%"
    if not m or m.group("pre"):
        raise AmountError(
            f"'{part}' should start with a number and a unit (e.g. '1.2 mmol')", key=key, text=whole
        )
    num_text = m.group("num")
    rest = m.group("unit")
    if re.match(r"^\.\d", rest) or re.match(r"^\d", rest):
        raise AmountError(f"'{num_text}{rest}' is not a number", key=key, text=whole)
    value = _number(num_text, key, whole)
    unit = rest.strip()
    if qualifier and unit.lower().endswith("purity"):
        unit = "%" if unit.startswith("%") else unit
    if not unit:
        raise AmountError(f"'{part}' has no unit (mg, g, mL, mmol, equiv, ...)", key=key, text=whole)
    return value, unit


def _head_kind(num: float, unit: str, key, whole) -> tuple[str, float]:
    u = unit.strip()
    if u in _MASS:
        return "mass", _positive(_convert(num, _MASS[u], "gram"), "mass", key, whole)
    if u in _VOLUME:
        return "volume", _positive(_convert(num, _VOLUME[u], "milliliter"), "volume", key, whole)
    if u in _MOLES:
        return "moles", _positive(_convert(num, _MOLES[u], "millimole"), "amount", key, whole)
    if u in _EQUIV:
        return "equiv", _positive(num, "equivalents", key, whole)
    raise AmountError(_unknown_unit(u), key=key, text=whole)


def _unknown_unit(u: str, qualifier: bool = False) -> str:
    hint = _HINTS.get(u) or _HINTS.get(u.strip("."))
    allowed = (
        "M, mM, wt%, g/mL, a purity in %, or equiv" if qualifier else "µg, mg, g, kg, µL, mL, L, µmol, mmol, mol or equiv"
    )
    msg = f"unknown unit '{u}' (use {allowed}; units are case-sensitive)"
    if hint:
        msg += f"; did you mean {hint}?"
    return msg


def _positive(v: float, what: str, key, whole) -> float:
    if not math.isfinite(v):
        raise AmountError(f"the {what} is not a finite number", key=key, text=whole)
    if v <= 0:
        raise AmountError(f"the {what} must be positive", key=key, text=whole)
    if v > 1e9:
        raise AmountError(f"the {what} is implausibly large", key=key, text=whole)
    low = _MINIMUM.get(what)
    if low is not None and v < low[0] * (1 - 1e-9):  # the minimum itself is allowed
        raise AmountError(f"the {what} is below {low[1]}: too small to weigh or measure (a typing slip?)", key=key, text=whole)
    return v


def _fraction(v: float, what: str, key, whole) -> float:
    if not 0 < v <= 100:
        raise AmountError(f"the {what} must be between 0 and 100 %", key=key, text=whole)
    if v < 0.01:
        raise AmountError(f"the {what} is below 0.01 %: too small to be meant", key=key, text=whole)
    return v / 100.0
