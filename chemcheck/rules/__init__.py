"""The rule registry.

A rule is data (id, title, default severity, documentation) plus one pure check function that
takes a :class:`Context` and yields findings. The documentation is the check function's
docstring, in five sections headed ``What it flags``, ``Why it matters``, ``Example``,
``Use instead`` and ``References``; ``docs/rules.md`` is generated from them.

Add a rule: write a function in the module of its family, decorate it with ``@rule(...)``,
and import the module in ``_load()`` below.
"""

from __future__ import annotations

import inspect
import re
import textwrap
from collections.abc import Callable, Iterable
from dataclasses import dataclass
from functools import cached_property, lru_cache

from ..errors import ChemcheckError
from ..findings import Finding, Severity
from ..perceive import Perception, perceive
from ..reading.reaction import Component, Reaction

__all__ = ["Rule", "Context", "rule", "registry", "DOC_SECTIONS"]

DOC_SECTIONS = ("What it flags", "Why it matters", "Example", "Use instead", "References")
_ID = re.compile(r"^[a-z]+(-[a-z0-9]+)+$")


class Context:
    """What rules read: the reaction, each component's perception, and later the amounts."""

    def __init__(self, reaction: Reaction, amounts: dict[str, str] | None = None) -> None:
        self.reaction = reaction
        self.amounts = dict(amounts or {})
        self._perception: dict[int, Perception] = {}
        self._sites: dict[int, list] = {}
        self.sections: list[dict] = []  # report sections added by stages (stoichiometry, ...)

    def perception(self, component: Component) -> Perception:
        p = self._perception.get(component.index)
        if p is None:
            p = perceive(component.mol, component.kind_hint)
            self._perception[component.index] = p
        return p

    def perceived(self) -> dict[int, Perception]:
        """The perceptions worked out so far, by component index."""
        return dict(self._perception)

    def sites(self, component: Component) -> list:
        """The basicity sites of a component (pKa of each nitrogen's conjugate acid)."""
        s = self._sites.get(component.index)
        if s is None:
            s = self._sites[component.index] = self._basic_sites(component)
        return s

    def _basic_sites(self, component: Component) -> list:
        """Within the work budget (nitrogens x heavy atoms); beyond it, or when the model
        cannot read the structure, no sites, and the budget names what was skipped."""
        from .._budget import BASICITY_WORK, budget_of
        from ..basicity import basic_sites

        if component.sanitization != "full":
            return []
        mol = component.mol
        nitrogens = sum(1 for a in mol.GetAtoms() if a.GetAtomicNum() == 7)
        if not nitrogens:  # one site per nitrogen: none to compute
            return []
        if nitrogens * mol.GetNumHeavyAtoms() > BASICITY_WORK:
            budget_of(self).skip(
                f"the basicity of {component.label} ({nitrogens} nitrogens in {mol.GetNumHeavyAtoms()} heavy atoms)"
            )
            return []
        try:
            return basic_sites(mol)
        except ChemcheckError:
            raise
        except (ArithmeticError, LookupError, StopIteration, ValueError, RuntimeError):
            # a structure the basicity model cannot read (an internal error, not the user's):
            # the rest of the check goes on without its values, and says so
            import os

            if os.environ.get("CHEMCHECK_STRICT"):
                raise
            budget_of(self).skip(f"the basicity of {component.label} (the model could not read its structure)")
            return []

    @cached_property
    def stoichiometry(self):
        """The stoichiometry table when amounts were given (None otherwise)."""
        if not self.amounts:
            return None
        from ..stoichiometry import compute

        b = self.balance
        return compute(self.reaction, self.amounts, b.coefficients if b.balanced else None)

    @cached_property
    def understanding(self):
        """What happens in the reaction: atom map, centre, class and each agent's role."""
        from ..understand.model import understand

        return understand(self.reaction, self.perception)

    def role(self, component: Component) -> str | None:
        """The component's role in this reaction (``reactant``, ``base``, ``solvent``, ...)."""
        return self.understanding.role(component)

    @cached_property
    def balance(self):
        from ..balance import balance

        return balance(self.reaction)


CheckFn = Callable[[Context], Iterable[Finding]]


@dataclass(frozen=True)
class Rule:
    id: str
    title: str
    severity: Severity
    check: CheckFn
    family: str
    # the reaction-class families the rule reads when products are drawn (empty: every reaction);
    # with products drawn and another class, a rule that needs one stays silent
    applies_to: tuple[str, ...] = ()

    @property
    def docs(self) -> dict[str, str]:
        return dict(_docs_of(self.check))

    def finding(
        self,
        message: str,
        *,
        atoms: Iterable[tuple[int, int]] = (),
        fix: str | None = None,
        severity: Severity | None = None,
        references: Iterable[str] = (),
    ) -> Finding:
        return Finding(
            rule=self.id,
            severity=severity or self.severity,
            message=sentence_case(message),
            atoms=tuple(dict.fromkeys((int(c), int(a)) for c, a in atoms)),
            fix=sentence_case(fix) if fix else fix,
            references=tuple(references) or self.references,
            title=self.title,
        )

    @property
    def references(self) -> tuple[str, ...]:
        return _references_of(self.check)


def sentence_case(text: str) -> str:
    """A message that opens with a compound's label ("amine 1 is ...") starts with a capital, as
    a sentence does; a label whose second letter is a capital (nBuLi, pH) is left as written."""
    if text and text[0].islower() and not (len(text) > 1 and text[1].isupper()):
        return text[0].upper() + text[1:]
    return text


_REGISTRY: dict[str, Rule] = {}


def rule(*, id: str, title: str, severity: Severity, applies_to: tuple[str, ...] = ()) -> Callable[[CheckFn], CheckFn]:
    if not _ID.match(id):
        raise ValueError(f"rule id must be kebab-case naming the flagged pattern: {id!r}")

    def register(fn: CheckFn) -> CheckFn:
        if id in _REGISTRY:
            raise ValueError(f"rule {id!r} registered twice")
        family = fn.__module__.rsplit(".", 1)[-1]
        r = Rule(id=id, title=title, severity=severity, check=fn, family=family, applies_to=tuple(applies_to))
        _REGISTRY[id] = r
        fn.rule = r  # type: ignore[attr-defined]
        return fn

    return register


@lru_cache(maxsize=None)
def _docs_of(fn: CheckFn) -> tuple[tuple[str, str], ...]:
    return tuple(parse_doc_sections(inspect.getdoc(fn) or "").items())


@lru_cache(maxsize=None)
def _references_of(fn: CheckFn) -> tuple[str, ...]:
    text = dict(_docs_of(fn)).get("References", "")
    return tuple(line.lstrip("-* ").strip() for line in text.splitlines() if line.strip())


def parse_doc_sections(doc: str) -> dict[str, str]:
    sections: dict[str, list[str]] = {}
    current: str | None = None
    for line in doc.splitlines():
        head = line.strip().rstrip(":")
        if head in DOC_SECTIONS:
            current = head
            sections[current] = []
        elif current is not None:
            sections[current].append(line)
    return {k: textwrap.dedent("\n".join(v)).strip() for k, v in sections.items()}


def _load() -> None:
    from . import balance, hazards, nitrogen, reduction, regio, stoich  # noqa: F401


def registry() -> dict[str, Rule]:
    if not _REGISTRY:
        _load()
    return dict(_REGISTRY)
