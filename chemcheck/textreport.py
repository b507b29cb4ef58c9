"""The compact plain-text report: findings first, then the components."""

from __future__ import annotations

from .findings import SEVERITIES

_WORD = {"error": "ERROR", "warning": "WARNING", "info": "NOTE"}


def render_text(report) -> str:
    lines = [f"chemcheck: {report.reaction.text}"]
    c = report.counts()
    lines.append(f"{c['error']} error(s), {c['warning']} warning(s), {c['info']} note(s)")
    comps = report.components
    for sev in SEVERITIES:
        for f in report.findings:
            if f.severity != sev:
                continue
            lines.append(f"{_WORD[sev]} [{f.rule}] {f.message}")
            if f.atoms:
                where = ", ".join(
                    f"{comps[ci].text} atom {ai + 1} ({comps[ci].mol.GetAtomWithIdx(ai).GetSymbol()})"
                    for ci, ai in f.atoms
                    if ci < len(comps) and ai < comps[ci].mol.GetNumAtoms()
                )
                lines.append(f"    atoms: {where}")
            if f.fix:
                lines.append(f"    fix: {f.fix}")
    lines.append("components:")
    for comp in comps:
        name = f" ({comp.name})" if comp.name and comp.name != comp.text else ""
        kind = f", {comp.kind}" if comp.kind else ""
        lines.append(f"  {comp.index + 1}. {comp.role}{kind}: {comp.text}{name}  {comp.formula}  {comp.mw:.2f} g/mol")
    for extra in getattr(report, "text_sections", lambda: [])():
        lines.extend(extra)
    return "\n".join(lines)
