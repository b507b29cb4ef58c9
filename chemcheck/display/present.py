"""How a report reads to a chemist: compound numbers and labels, which findings are shown where,
the verdict line, and the stoichiometry table with human headers and units that fit the scale.

Pure functions of the JSON payload (no RDKit, no IPython), shared by the static HTML and the
plain-text report; ``extension/src/render.ts`` implements the same choices for the live view.
``report.table`` (the DataFrame) is untouched: these are display strings only.
"""

from __future__ import annotations

import math
import re
from dataclasses import dataclass, field

__all__ = [
    "ACKNOWLEDGEABLE",
    "Compound",
    "Sorted",
    "StoichTable",
    "compounds",
    "fmt_number",
    "plural",
    "sort_findings",
    "stoich_table",
    "verdict",
    "where",
]

SEVERITY_ORDER = ("error", "warning", "info")
SEVERITY_WORD = {"error": "Error", "warning": "Warning", "info": "Note"}
# Notes are information: only warnings and errors are acknowledged in a review.
ACKNOWLEDGEABLE = ("error", "warning")
# Findings of these rules are gathered in the Safety section instead of the findings list.
SAFETY_RULES = ("hazard-caution",)
_AGENT_LETTERS = "abcdefghijklmnopqrstuvwxyz"


def plural(n: int, word: str) -> str:
    return f"{n} {word}" if n == 1 else f"{n} {word}s"


@dataclass
class Compound:
    index: int
    number: str
    label: str
    role: str
    smiles: str
    elements: list[str] = field(default_factory=list)


def _noun(comp: dict) -> str:
    if comp.get("role") == "agent" and comp.get("kind"):
        return str(comp["kind"])
    kinds = [n.get("kind") or "" for n in comp.get("nitrogens") or []]
    if any(k.endswith("amine") and "aromatic" not in k for k in kinds):
        return "amine"
    return "compound"


def compounds(payload: dict) -> dict[int, Compound]:
    """Number and label of every component: "1", "2" … for reactants and products in order,
    "a", "b" … for agents; the label is "name (1)" when a name is known, else "amine 1".

    Numbers and labels already in the payload (set by the check) win over these defaults."""
    extra = {e["component"]: e for e in payload.get("labels") or []}
    out: dict[int, Compound] = {}
    n_main = n_agent = 0
    for comp in payload.get("components") or []:
        i = comp["index"]
        if comp["role"] == "agent":
            default = _AGENT_LETTERS[n_agent % 26] * (1 + n_agent // 26)
            n_agent += 1
        else:
            n_main += 1
            default = str(n_main)
        e = extra.get(i, {})
        number = str(comp.get("number") or e.get("number") or default)
        name = comp.get("name")
        label = e.get("label")
        if not label:
            label = f"{name} ({number})" if name else f"{_noun(comp)} {number}"
        out[i] = Compound(
            i,
            number,
            label,
            comp["role"],
            comp.get("smiles") or comp.get("text", ""),
            list(e.get("elements") or []),
        )
    return out


def where(finding: dict, comps: dict[int, Compound]) -> str:
    """The flagged atoms in words: "N of benzylamine (1); Cl of acid chloride 2"."""
    parts: list[str] = []
    by_comp: dict[int, list[int]] = {}
    for ci, ai in finding.get("atoms") or []:
        by_comp.setdefault(ci, []).append(ai)
    for ci, atoms in by_comp.items():
        c = comps.get(ci)
        if c is None:
            continue
        symbols = [c.elements[a] if a < len(c.elements) else f"atom {a + 1}" for a in atoms]
        names = (
            ", ".join(dict.fromkeys(symbols))
            if len(set(symbols)) < len(symbols)
            else ", ".join(symbols)
        )
        parts.append(f"{names} of {c.label}")
    return "; ".join(parts)


def _norm(s: str) -> str:
    return re.sub(r"\W+", " ", s).strip().casefold()


def fix_text(finding: dict) -> str | None:
    """The fix, unless the message already says it (a fix never repeats the message)."""
    fix = finding.get("fix")
    if not fix:
        return None
    if _norm(fix) and _norm(fix) in _norm(finding.get("message") or ""):
        return None
    return fix


def _strip_sentence(message: str, sentence: str) -> str:
    m = message.rstrip()
    s = sentence.strip()
    if s and m.endswith(s):
        return m[: -len(s)].rstrip()
    return m


@dataclass
class Sorted:
    shown: list[dict]  # the findings list, errors first
    safety: list[str]  # one line per hazard class, the deferral sentence stripped
    safety_sentence: str | None  # the SDS / local rules / safety review sentence, said once
    by_products: list[dict]  # missing from the equation: drawn greyed in the scheme
    balance_notes: list[dict]  # the findings folded into the Balance section


def sort_findings(payload: dict) -> Sorted:
    balance = payload.get("balance") or {}
    missing = [m for m in balance.get("missing") or [] if m.get("side") == "product"]
    shown: list[dict] = []
    safety: list[str] = []
    sentence: str | None = None
    folded: list[dict] = []
    for sev in SEVERITY_ORDER:
        for f in payload.get("findings") or []:
            if f["severity"] != sev:
                continue
            if f["rule"] in SAFETY_RULES and sev == "info":
                fix = f.get("fix") or ""
                safety.append(_strip_sentence(f["message"], fix))
                sentence = sentence or fix or None
            elif f["rule"] == "unbalanced-equation" and sev == "info" and missing:
                folded.append(f)  # the scheme shows the by-products ("+ HCl") instead
            else:
                shown.append(f)
    return Sorted(shown, safety, sentence, missing, folded)


def _class_name(payload: dict) -> str | None:
    understood = ((payload.get("understanding") or {}).get("class") or {}).get("name")
    if understood:
        return str(understood)
    rc = payload.get("reaction_class")
    if isinstance(rc, dict):
        rc = rc.get("name")
    if rc:
        return str(rc)
    classes = payload.get("classes") or []
    if classes and classes[0].get("name"):
        return str(classes[0]["name"])
    return None


def verdict(payload: dict, sorted_: Sorted | None = None) -> str:
    """The header line: counts, then the reaction class and the limiting reagent where known."""
    s = sorted_ or sort_findings(payload)
    n = {sev: sum(1 for f in s.shown if f["severity"] == sev) for sev in SEVERITY_ORDER}
    if n["error"] == n["warning"] == 0:
        head = "No errors or warnings"
    else:
        head = ", ".join(
            plural(n[k], w) for k, w in (("error", "error"), ("warning", "warning")) if n[k]
        )
    parts = [head]
    if n["info"]:
        parts[0] += f", {plural(n['info'], 'note')}"
    if s.safety:
        parts.append(f"safety: {plural(len(s.safety), 'caution')}")
    cls = _class_name(payload)
    if cls:
        parts.append(cls)
    lim = limiting_label(payload)
    if lim:
        parts.append(f"limiting reagent {lim}")
    return " · ".join(parts)


def limiting_label(payload: dict) -> str | None:
    t = payload.get("table") or {}
    lim = t.get("limiting")
    if not lim:
        return None
    comps = compounds(payload)
    for row in t.get("rows") or []:
        if row.get("text") == lim and row["component"] in comps:
            return comps[row["component"]].label
    for comp in payload.get("components") or []:
        if lim in (comp.get("text"), comp.get("smiles")) and comp["index"] in comps:
            return comps[comp["index"]].label
    return lim


# -- numbers ---------------------------------------------------------------------------------


def fmt_number(v: float, sig: int = 3) -> str:
    """Sensible significant figures without exponents: 1.25, 10.99 → 11.0, 310.4 → 310."""
    if not math.isfinite(v):
        return ""
    a = abs(v)
    if a == 0:
        return "0"
    if a >= 10 ** (sig - 1):
        return f"{v:.0f}"
    digits = sig - 1 - int(_floor_log10(a))
    return f"{v:.{max(digits, 0)}f}"


def _floor_log10(a: float) -> int:
    return math.floor(math.log10(a))


# unit families: (unit, factor from the column's base unit), smallest first
_MASS = (("mg", 1e3), ("g", 1.0), ("kg", 1e-3))  # base g
_VOLUME = (("µL", 1e3), ("mL", 1.0), ("L", 1e-3))  # base mL
_AMOUNT = (("µmol", 1e3), ("mmol", 1.0), ("mol", 1e-3))  # base mmol


def _fit(value_base: float, family) -> tuple[str, float]:
    """The unit in which the value reads between 1 and 1000 (or the nearest end)."""
    a = abs(value_base)
    choice = family[0]
    for unit, factor in family:
        if a * factor >= 1:
            choice = (unit, factor)
    return choice


@dataclass
class Column:
    key: str
    header: str
    cells: list[str]
    numeric: bool = True


@dataclass
class StoichTable:
    columns: list[Column]
    compounds: list[Compound]
    read_as: list[str]
    limiting: str | None
    concentration: str | None


def _scaled_column(
    key: str, quantity: str, family, values: list[float | None], reference: list[bool]
) -> Column:
    ref = sorted(abs(v) for v, r in zip(values, reference) if v is not None and r) or sorted(
        abs(v) for v in values if v is not None
    )
    mid = ref[len(ref) // 2] if ref else 1.0
    unit, factor = _fit(mid, family)
    cells = []
    for v in values:
        if v is None:
            cells.append("")
            continue
        x = v * factor
        if x != 0 and (abs(x) >= 10000 or abs(x) < 0.1):
            own, own_factor = _fit(v, family)  # out of the column's scale: the cell says its unit
            cells.append(f"{fmt_number(v * own_factor)} {own}")
        else:
            cells.append(fmt_number(x))
    return Column(key, f"{quantity} ({unit})", cells)


def _equiv(v: float) -> str:
    s = f"{v:.2f}".rstrip("0")
    return s + "0" if s.endswith(".") else s


# what a chemist reads first: equivalents and amounts, then what goes on the balance
_ORDER = ("mw", "equiv", "mmol", "mass_g", "volume_ml", "purity", "theoretical_g", "yield_pct")
_NOT_SHOWN = ("formula", "role", "density_g_ml")


def _column_order(columns: list[str]) -> list[str]:
    known = [k for k in _ORDER if k in columns]
    return known + [k for k in columns if k not in known]


def stoich_table(payload: dict) -> StoichTable | None:
    t = payload.get("table")
    if not t or not t.get("rows"):
        return None
    comps = compounds(payload)
    rows = t["rows"]
    vals = [r.get("values") or {} for r in rows]
    # the scale is set by what is weighed for the reaction (rows with equivalents), not solvents
    reference = [v.get("equiv") is not None for v in vals]
    cols: list[Column] = []

    def col(key: str) -> list:
        return [v.get(key) for v in vals]

    for key in _column_order(t.get("columns") or []):
        data = col(key)
        if all(x is None or x == "" for x in data) or key in _NOT_SHOWN:
            continue  # empty columns hidden; formula and density are in the components and read-as
        if key == "mw":
            cols.append(Column(key, "M (g/mol)", ["" if x is None else f"{x:.2f}" for x in data]))
        elif key == "mass_g":
            cols.append(_scaled_column(key, "Mass", _MASS, data, reference))
        elif key == "volume_ml":
            cols.append(_scaled_column(key, "Volume", _VOLUME, data, reference))
        elif key == "mmol":
            cols.append(_scaled_column(key, "Amount", _AMOUNT, data, reference))
        elif key == "theoretical_g":
            cols.append(
                _scaled_column(key, "Theoretical", _MASS, data, [x is not None for x in data])
            )
        elif key == "density_g_ml":
            cols.append(
                Column(key, "Density (g/mL)", ["" if x is None else f"{x:.3f}" for x in data])
            )
        elif key == "purity":
            cols.append(
                Column(key, "Purity (%)", ["" if x is None else fmt_number(100 * x) for x in data])
            )
        elif key == "equiv":
            cols.append(Column(key, "Equiv", ["" if x is None else _equiv(x) for x in data]))
        elif key == "yield_pct":
            cols.append(Column(key, "Yield (%)", ["" if x is None else f"{x:.1f}" for x in data]))
        else:
            numeric = all(isinstance(x, (int, float)) for x in data if x is not None)
            cells = [
                "" if x is None else (fmt_number(x) if isinstance(x, float) else str(x))
                for x in data
            ]
            cols.append(Column(key, key.replace("_", " ").capitalize(), cells, numeric))
    conc = None
    if t.get("concentration_m"):
        conc = f"{fmt_number(t['concentration_m'])} M"
        if t.get("total_volume_ml"):
            ml = t["total_volume_ml"]
            unit, factor = _fit(ml, _VOLUME)
            conc += f" in {fmt_number(ml * factor)} {unit}"
    return StoichTable(
        cols,
        [
            comps.get(r["component"])
            or Compound(r["component"], "?", r.get("text", ""), "", r.get("text", ""))
            for r in rows
        ],
        [r.get("read_as") or "" for r in rows],
        limiting_label(payload),
        conc,
    )
