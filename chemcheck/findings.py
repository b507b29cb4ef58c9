"""Findings: what a rule says about a reaction."""

from __future__ import annotations

from dataclasses import dataclass
from typing import Literal

__all__ = ["Finding", "Severity", "SEVERITIES"]

Severity = Literal["error", "warning", "info"]
SEVERITIES: tuple[Severity, ...] = ("error", "warning", "info")


@dataclass(frozen=True)
class Finding:
    """One pitfall found in a reaction.

    ``atoms`` are (component index, atom index) pairs, both 0-based, pointing at the atoms the
    finding is about (the nitrogen and its partner, the missing by-product's atoms, ...).
    """

    rule: str
    severity: Severity
    message: str
    atoms: tuple[tuple[int, int], ...] = ()
    fix: str | None = None
    references: tuple[str, ...] = ()
    title: str = ""

    def to_dict(self) -> dict:
        return {
            "rule": self.rule,
            "severity": self.severity,
            "title": self.title,
            "message": self.message,
            "atoms": [list(a) for a in self.atoms],
            "fix": self.fix,
            "references": list(self.references),
        }
