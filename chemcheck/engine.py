"""``check()``: read a reaction, perceive every component, run every rule, build the report."""

from __future__ import annotations

from .findings import Finding
from .reaction import Reaction, parse_reaction
from .report import Report
from .rules import Context, registry

__all__ = ["check"]

_SEVERITY_ORDER = {"error": 0, "warning": 1, "info": 2}


def _join_keys(amounts: dict[str, str] | None) -> list[str]:
    return [k for k in (amounts or {}) if "." in k]


def check(reaction: str | Reaction, amounts: dict[str, str] | None = None) -> Report:
    """Check a reaction for known failure modes.

    ``reaction`` is reaction SMILES (names allowed in place of SMILES) or a parsed
    :class:`~chemcheck.reaction.Reaction`; ``amounts`` maps a component's text as written to
    an amount string. Raises :class:`~chemcheck.errors.ChemcheckError` subclasses on bad input.
    """
    if amounts is not None and not isinstance(amounts, dict):
        from .errors import AmountError

        raise AmountError(f"amounts must be a dict of component text to amount, not {type(amounts).__name__}")
    rxn = reaction if isinstance(reaction, Reaction) else parse_reaction(reaction, join=_join_keys(amounts))
    ctx = Context(rxn, amounts)
    findings: list[Finding] = []
    for comp in rxn.components:
        p = ctx.perception(comp)
        comp.kind = p.kind if comp.role == "agent" else None
        if comp.sanitization == "partial":
            findings.append(
                Finding(
                    rule="partial-sanitization",
                    severity="info",
                    title="Structure read without valence checks",
                    message=f"{comp.label} was read without RDKit's valence checks ({'; '.join(comp.notes)}); "
                    "its formula and mass are as drawn.",
                    atoms=(),
                    fix="Check the drawing of this metal or hypervalent species.",
                )
            )
    for r in registry().values():
        findings.extend(r.check(ctx) or ())
    findings.sort(key=lambda f: _SEVERITY_ORDER[f.severity])
    return Report(
        reaction=rxn,
        findings=findings,
        amounts=dict(amounts or {}),
        perceptions={c.index: ctx.perception(c) for c in rxn.components},
        balance=ctx.balance,
    )
