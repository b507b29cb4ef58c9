"""The work budget of one check: caps per stage that scale with the input, and a deadline.

Within the documented limits (reaction text, components, heavy atoms, rings) every check
answers in about 2 s. Work that would grow beyond the caps below is skipped, and the check says
so in an info finding (``check-budget-reached``) naming what was skipped; inputs beyond the
limits are refused with :class:`~chemcheck.errors.LimitError` before any work starts.

The caps count work, not seconds (so that the answer does not depend on the machine's load):
the deadline is the one guard in time, checked between rules.
"""

from __future__ import annotations

import time
from dataclasses import dataclass, field

__all__ = [
    "Budget",
    "budget_of",
    "MAX_RINGS",
    "BASICITY_WORK",
    "CANDIDATE_WORK",
    "MAX_CANDIDATES",
    "MAX_DRAWN_ATOMS",
    "MAX_MAPPED_ATOMS",
    "DEADLINE_S",
]

# Ring closures (bonds - atoms + fragments) of one component. RDKit's ring perception grows
# much faster than linearly on densely fused graphs: a 30x30 grid of fused four-membered rings
# (841 rings) sanitizes in 0.3 s, a 40x50 grid (1911 rings) takes 3 s and 400 MB.
MAX_RINGS = 500

# Basicity of one component: nitrogens x heavy atoms (each nitrogen is matched against the
# reference compounds over the whole molecule). 100,000 is 50 nitrogens in a 2,000-atom
# molecule or 250 in a 400-atom one; drug-like molecules use a few hundred.
BASICITY_WORK = 100_000

# Predicted products built by one enumeration (sites of one substrate): each is a copy of the
# substrate with a canonical SMILES and an InChIKey, so the cap is on their total heavy atoms,
# and on their number.
CANDIDATE_WORK = 4_000
MAX_CANDIDATES = 16

# Heavy atoms of the reactants and products handed to the atom mapper: its clean-up after the
# mapping library compares reaction centres per heteroatom (about 0.9 s at 300 atoms, 3 s at
# 600, minutes at 4,000); above the cap the reaction is read without an atom map.
MAX_MAPPED_ATOMS = 300
MAPPING_CAP_MARK = "above the atom mapper's limit"


def mapping_cap_note(heavy_atoms: int) -> str:
    return f"the reactants and products have {heavy_atoms} heavy atoms, {MAPPING_CAP_MARK} of {MAX_MAPPED_ATOMS}"


# Heavy atoms of one drawn structure: 2D layout and drawing grow faster than linearly (a chain
# of 400 hydrazine N takes 3 s); a larger one is shown as its formula in a box.
MAX_DRAWN_ATOMS = 250

# Total time for the rules of one check; the rules not started by then are skipped and named.
# Counted in CPU time of this process from the first rule, so that neither a loaded machine nor
# the one-time loading of a fresh kernel before the rules (the property database, the mapper)
# costs the chemist a rule; the caps above are what keep large inputs in bounds. (The rules of
# a first check with amounts in a fresh process take about 0.1 s of CPU.)
DEADLINE_S = 1.5


def candidate_cap(heavy_atoms: int) -> int:
    """How many predicted products one enumeration may build for a substrate of this size."""
    return max(2, min(MAX_CANDIDATES, CANDIDATE_WORK // max(heavy_atoms, 1)))


@dataclass
class Budget:
    """Work budget of one check: what was skipped, and the deadline of the rules."""

    deadline_s: float = field(default_factory=lambda: DEADLINE_S)
    start: float | None = None
    skipped: list[str] = field(default_factory=list)

    def start_rules(self) -> None:
        """Start the deadline's clock (CPU time): called when the first rule starts."""
        self.start = time.process_time()

    def expired(self) -> bool:
        return self.start is not None and time.process_time() - self.start > self.deadline_s

    def skip(self, what: str) -> None:
        """Record a piece of work left out (a phrase that completes "the check skipped ...")."""
        if what not in self.skipped:
            self.skipped.append(what)


def budget_of(ctx) -> Budget:
    """The budget of a check's context (one is made on first use)."""
    b = ctx.__dict__.get("budget")
    if b is None:
        b = ctx.__dict__["budget"] = Budget()
    return b
