"""Workup advice from basicity: where each amine goes at a given pH.

Henderson-Hasselbalch: fraction protonated = 1 / (1 + 10**(pH - pKa)). The common rule of
thumb (common practice): at pH >= pKa + 2 an amine is >= 99 % free base and extracts into the
organic layer; at pH <= pKa - 2 it is >= 99 % protonated and stays in water. Two amines whose
pKa differ by 3 or more can be separated by a pH set between them.
"""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["fraction_protonated", "Advice", "advice_for", "separations"]

PH_POINTS = (1, 4, 7, 10, 13)


def fraction_protonated(pka: float, ph: float) -> float:
    return 1.0 / (1.0 + 10.0 ** (ph - pka))


@dataclass(frozen=True)
class Advice:
    component: int
    label: str
    pka: float
    extract_above_ph: float
    keep_in_water_below_ph: float
    protonated_at: dict[str, float]
    message: str

    def to_dict(self) -> dict:
        return {
            "component": self.component,
            "pka": self.pka,
            "extract_above_ph": self.extract_above_ph,
            "keep_in_water_below_ph": self.keep_in_water_below_ph,
            "protonated_at": self.protonated_at,
            "message": self.message,
        }


def advice_for(component: int, label: str, pka: float) -> Advice:
    up = round(pka + 2, 1)
    down = round(pka - 2, 1)
    at = {f"pH {p}": round(fraction_protonated(pka, p), 4) for p in PH_POINTS}
    if pka < 2:
        msg = (
            f"{label} (pKa {pka:.1f}) is barely basic: it stays in the organic layer except "
            "from strongly acidic water."
        )
    else:
        down_text = (
            f"keep it in water at pH {down:.1f} or below"
            if down >= 0
            else "only very strong acid keeps it in water"
        )
        up_text = f"pH {up:.1f} or above" if up <= 14 else "pH 14 (it stays partly protonated)"
        msg = (
            f"{label} (pKa {pka:.1f}): extract it into the organic layer from water at {up_text}; "
            f"{down_text}. At pH 7 it is {100 * fraction_protonated(pka, 7):.0f} % protonated."
        )
    return Advice(component, label, round(pka, 2), up, down, at, msg)


def separations(items: list[tuple[str, float]]) -> list[str]:
    """Pairs of amines that a pH window separates (pKa difference of 3 or more)."""
    out = []
    items = sorted(items, key=lambda t: t[1])
    for i, (la, pa) in enumerate(items):
        for lb, pb in items[i + 1 :]:
            if pb - pa >= 3:
                ph = (pa + pb) / 2
                out.append(
                    f"{la} (pKa {pa:.1f}) and {lb} (pKa {pb:.1f}) separate at about pH {ph:.1f}: "
                    f"{la} goes into the organic layer, {lb} stays in water as its salt."
                )
    return out
