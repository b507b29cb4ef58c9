"""The report of one check, and its JSON payload (schema ``schema/report.schema.json``)."""

from __future__ import annotations

import json
from dataclasses import dataclass, field
from importlib import resources
from typing import Any

from ._version import __version__
from .findings import SEVERITIES, Finding
from .reading.reaction import Component, Reaction

__all__ = ["Report", "MIME_TYPE", "SCHEMA_VERSION", "schema"]

MIME_TYPE = "application/vnd.chemcheck.report+json"
SCHEMA_VERSION = "1"


class Sections(dict):
    """The report's sections by payload key; some are worked out only when first read (the
    basicity table and workup advice of every component, products included, which no rule
    needs): a key of ``deferred`` that is read, or ``resolve()``, computes them all."""

    def __init__(self, *args, **kw) -> None:
        super().__init__(*args, **kw)
        self._deferred: tuple[tuple[str, ...], Any] | None = None

    def defer(self, keys: tuple[str, ...], compute) -> None:
        self._deferred = (tuple(keys), compute)

    def resolve(self) -> None:
        if self._deferred is not None:
            _keys, compute = self._deferred
            self._deferred = None
            for k, v in compute().items():
                self.setdefault(k, v)

    def __missing__(self, key):
        if self._deferred is not None and key in self._deferred[0]:
            self.resolve()
            return self[key]
        raise KeyError(key)


class Perceptions(dict):
    """Each component's perception by index; those no rule asked for (the products') are
    worked out when first read."""

    def __init__(self, known: dict, pending: dict) -> None:
        super().__init__(known)
        self._pending = dict(pending)  # index -> callable giving the perception

    def __missing__(self, key):
        compute = self._pending.pop(key, None)
        if compute is None:
            raise KeyError(key)
        self[key] = value = compute()
        return value

    def get(self, key, default=None):
        try:
            return self[key]
        except KeyError:
            return default

    def __contains__(self, key) -> bool:
        return dict.__contains__(self, key) or key in self._pending

    def _resolve(self) -> None:
        for key in list(self._pending):
            self[key]

    def __iter__(self):
        self._resolve()
        return super().__iter__()

    def __len__(self) -> int:
        return dict.__len__(self) + len(self._pending)

    def keys(self):
        self._resolve()
        return super().keys()

    def values(self):
        self._resolve()
        return super().values()

    def items(self):
        self._resolve()
        return super().items()


def schema() -> dict:
    return json.loads(resources.files("chemcheck").joinpath("schema/report.schema.json").read_text())


@dataclass(eq=False)
class Report:
    reaction: Reaction
    findings: list[Finding]
    amounts: dict[str, str] = field(default_factory=dict)
    perceptions: dict[int, Any] = field(default_factory=dict)
    balance: Any = None
    extra: dict[str, Any] = field(default_factory=Sections)  # sections added by later stages
    stoichiometry: Any = None
    roles: dict[int, str] = field(default_factory=dict)  # each component's role in this reaction

    @property
    def table(self):
        """The stoichiometry table as a pandas DataFrame (index: component as written)."""
        if self.stoichiometry is None:
            return None
        return self.stoichiometry.dataframe()

    @property
    def components(self) -> list[Component]:
        return self.reaction.components

    def counts(self) -> dict[str, int]:
        return {s: sum(1 for f in self.findings if f.severity == s) for s in SEVERITIES}

    def by_rule(self, rule_id: str) -> list[Finding]:
        return [f for f in self.findings if f.rule == rule_id]

    @property
    def ok(self) -> bool:
        """No error and no warning."""
        c = self.counts()
        return c["error"] == 0 and c["warning"] == 0

    def _component_dict(self, c: Component) -> dict:
        p = self.perceptions.get(c.index)
        return {
            "index": c.index,
            "number": c.number,
            "role": c.role,
            "role_in_reaction": self.roles.get(c.index),
            "text": c.text,
            "smiles": c.smiles,
            "formula": c.formula,
            "mw": None if c.mw != c.mw else round(c.mw, 4),
            "inchikey": c.inchikey,
            "name": c.name,
            "source": c.source,
            "kind": c.kind,
            "charge": c.charge,
            "sanitization": c.sanitization,
            "fragments": list(c.fragments),
            "nitrogens": [
                {"atom": s.atom_index, "kind": s.kind, "basic": s.basic, "hydrogens": s.hydrogens}
                for s in (p.nitrogens if p else ())
            ],
            "groups": [
                {"name": g.name, "atoms": list(g.atoms), "detail": g.detail} for g in (p.groups if p else ())
            ],
        }

    def to_dict(self) -> dict:
        out = {
            "schema": "chemcheck.report",
            "version": SCHEMA_VERSION,
            "chemcheck_version": __version__,
            "input": {"reaction": self.reaction.text, "amounts": dict(self.amounts)},
            "components": [self._component_dict(c) for c in self.components],
            "findings": [f.to_dict() for f in self.findings],
            "counts": self.counts(),
            "balance": self.balance.to_dict() if self.balance is not None else None,
        }
        if isinstance(self.extra, Sections):
            self.extra.resolve()
        out.update(self.extra)
        return out

    def to_json(self, **kw) -> str:
        return json.dumps(self.to_dict(), **kw)

    def to_text(self) -> str:
        from .textreport import render_text

        return render_text(self)

    def __str__(self) -> str:
        return self.to_text()

    def __repr__(self) -> str:
        c = self.counts()
        return (
            f"<Report {self.reaction.text!r}: {c['error']} error(s), {c['warning']} warning(s), "
            f"{c['info']} note(s)>"
        )

    def _repr_mimebundle_(self, include=None, exclude=None):
        from .display.bundle import mimebundle

        return mimebundle(self)
