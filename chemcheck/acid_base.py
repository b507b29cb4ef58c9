"""Proton bookkeeping: where the protons go between the acids and bases of a reaction.

Model: every proton acceptor j (a basic site, or the conjugate base of an acid) has a pKa_j
(of its conjugate acid) and an amount n_j. At equilibrium all of them see one common proton
activity, written here as an effective pH: the protonated fraction of j is
1 / (1 + 10**(pH - pKa_j)), and the sum of protonated amounts equals the protons present.
The effective pH is found by Newton's method inside a bisection bracket.

This is the aqueous picture (pKa values on the water scale). In organic solvents ion pairing
and the solvent's own scale shift every value; relative order is kept for similar charge
types, so the result says which base ends up protonated and roughly how much, not exact
concentrations. Differences of less than about 2 units should be read as "shared".
"""

from __future__ import annotations

import math
from dataclasses import dataclass

__all__ = ["Acceptor", "Distribution", "distribute", "max_conversion", "reaches", "free_fraction"]


@dataclass(frozen=True)
class Acceptor:
    label: str
    pka: float  # of the conjugate acid
    mmol: float  # amount of sites


@dataclass(frozen=True)
class Distribution:
    ph: float
    protonated: dict[str, float]  # label -> mmol protonated

    def fraction(self, label: str, total: float) -> float:
        return self.protonated.get(label, 0.0) / total if total > 0 else 0.0


def _protonated(acceptors: list[Acceptor], ph: float) -> float:
    return sum(a.mmol / (1.0 + 10.0 ** (ph - a.pka)) for a in acceptors)


_LN10 = math.log(10.0)


def _solve_ph(pkas: list[float], amounts: list[float], protons: float) -> float:
    """The pH at which the protonated amounts add up to ``protons`` (0 < protons < capacity).

    Newton's method on the monotone function, kept inside a shrinking bracket (a bisection
    step whenever Newton would leave it), to 1e-9 pH units."""
    lo, hi = min(pkas) - 30.0, max(pkas) + 30.0
    x = sum(p * n for p, n in zip(pkas, amounts)) / sum(amounts)
    for _ in range(100):
        f = -protons
        d = 0.0
        for p, n in zip(pkas, amounts):
            e = x - p
            if e > 300.0:
                continue  # 10**e overflows; that acceptor is not protonated
            t = 10.0 ** e
            u = 1.0 / (1.0 + t)
            f += n * u
            d += n * t * u * u
        if f > 0:
            lo = x
        else:
            hi = x
        step = f / (_LN10 * d) if d > 0 else float("inf")
        nx = x + step  # f decreases with pH: f' = -ln10 * d
        if not (lo < nx < hi):
            nx = (lo + hi) / 2
        if abs(nx - x) < 1e-9 or hi - lo < 1e-9:
            return nx
        x = nx
    return x


def distribute(acceptors: list[Acceptor], protons_mmol: float) -> Distribution:
    """Share ``protons_mmol`` among the acceptors at equilibrium."""
    acceptors = [a for a in acceptors if a.mmol > 0]
    capacity = sum(a.mmol for a in acceptors)
    if protons_mmol <= 0 or not acceptors:
        return Distribution(float("inf"), {a.label: 0.0 for a in acceptors})
    if protons_mmol >= capacity:
        # more protons than acceptors: everything protonated, the excess stays as free acid
        return Distribution(float("-inf"), {a.label: a.mmol for a in acceptors})
    ph = _solve_ph([a.pka for a in acceptors], [a.mmol for a in acceptors], protons_mmol)
    out: dict[str, float] = {}
    for a in acceptors:
        e = ph - a.pka
        out[a.label] = out.get(a.label, 0.0) + (0.0 if e > 300.0 else a.mmol / (1.0 + 10.0**e))
    return Distribution(ph, out)


def free_fraction(nucleophile: Acceptor, others: list[Acceptor], protons_mmol: float) -> float:
    d = distribute([nucleophile, *others], protons_mmol)
    return 1.0 - d.fraction(nucleophile.label, nucleophile.mmol)


def _progress_test(
    nucleophile: Acceptor,
    electrophile_mmol: float,
    others: list[Acceptor],
    acid_per_turnover: float,
    released_pka: float | None,
    protons_present: float,
    nucleophile_per_turnover: float,
    threshold: float,
):
    """going(x): whether the reaction still runs at conversion x; and the largest x possible."""
    n0 = nucleophile.mmol
    e = electrophile_mmol

    def free_at(x: float) -> float:
        remaining = n0 - x * e * nucleophile_per_turnover
        if remaining <= 0:
            return 0.0
        acc = [Acceptor(nucleophile.label, nucleophile.pka, remaining), *others]
        if released_pka is not None:
            acc.append(Acceptor("released acid's conjugate base", released_pka, x * e * acid_per_turnover))
        d = distribute(acc, x * e * acid_per_turnover + protons_present)
        return remaining - d.protonated.get(nucleophile.label, 0.0)

    def going(x: float) -> bool:
        remaining = n0 - x * e * nucleophile_per_turnover
        if remaining <= 1e-12 * max(n0, 1e-12):
            return False
        return free_at(x) > threshold * remaining

    x_end = min(1.0, n0 / (e * nucleophile_per_turnover)) if e > 0 else 1.0
    return going, x_end


def max_conversion(
    nucleophile: Acceptor,
    electrophile_mmol: float,
    others: list[Acceptor],
    acid_per_turnover: float = 1.0,
    released_pka: float | None = None,
    protons_present: float = 0.0,
    nucleophile_per_turnover: float = 1.0,
    threshold: float = 0.01,
) -> float:
    """The largest conversion (0-1, of the electrophile) reachable before the nucleophile is
    used up as its salt by the acid the reaction releases.

    At conversion x the reaction has consumed x*E*nucleophile_per_turnover of the nucleophile
    and released x*E*acid_per_turnover protons (plus ``protons_present`` brought in); the
    released acid's own conjugate base (pKa ``released_pka``, e.g. acetate) competes for them.
    The reaction stops when the free (unprotonated) share of the nucleophile still present
    falls below ``threshold``: a weak acid that leaves a few percent free only slows the
    reaction, while HCl against an alkylamine leaves essentially none.
    """
    going, x_end = _progress_test(
        nucleophile, electrophile_mmol, others, acid_per_turnover, released_pka, protons_present,
        nucleophile_per_turnover, threshold,
    )
    if going(x_end * (1 - 1e-6)):
        return 1.0
    lo, hi = 0.0, x_end
    if not going(0.0):
        return 0.0
    for _ in range(13):  # conversion to about 1e-4 (reported in whole percent)
        mid = (lo + hi) / 2
        if going(mid):
            lo = mid
        else:
            hi = mid
    return lo


def reaches(
    nucleophile: Acceptor,
    electrophile_mmol: float,
    others: list[Acceptor],
    fraction: float,
    acid_per_turnover: float = 1.0,
    released_pka: float | None = None,
    protons_present: float = 0.0,
    nucleophile_per_turnover: float = 1.0,
    threshold: float = 0.01,
) -> bool:
    """Whether the reaction still runs at ``fraction`` of its stoichiometric limit (the
    question ``max_conversion`` answers, tested at one point: one equilibrium instead of a
    bisection)."""
    going, x_end = _progress_test(
        nucleophile, electrophile_mmol, others, acid_per_turnover, released_pka, protons_present,
        nucleophile_per_turnover, threshold,
    )
    return going(x_end * fraction)
