"""Reaction understanding: which atom goes where (atom maps) and what changes (the centre)."""

from .centre import BondChange, Centre, reaction_centre
from .mapping import AtomMap, map_reaction

__all__ = ["AtomMap", "map_reaction", "BondChange", "Centre", "reaction_centre"]
