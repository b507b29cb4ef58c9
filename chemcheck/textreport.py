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
    st = getattr(report, "stoichiometry", None)
    if st is not None:
        lines.append("stoichiometry:")
        lines.append(f"  {'component':24s} {'MW':>8s} {'mass g':>9s} {'mL':>8s} {'mmol':>9s} {'equiv':>6s}  read as")
        for r in st.rows:
            def f(x, w, d=4):
                if x is None:
                    return " " * (w - 1) + "-"
                return f"{x:{w}.0f}" if abs(x) >= 10**d else f"{x:{w}.{d}g}"  # 12480, never 1.248e+04
            lines.append(
                f"  {r.component.text[:24]:24s} {r.component.mw:8.2f} {f(r.mass_g, 9)} {f(r.volume_ml, 8)} "
                f"{f(r.mmol, 9)} {f(r.equiv, 6, 3)}  {r.read_as or ''}"
            )
            if r.theoretical_g is not None:
                y = f", yield {r.yield_pct:.1f} %" if r.yield_pct is not None else ""
                from .units import fmt_mass

                lines.append(f"  {'':24s} theoretical {fmt_mass(r.theoretical_g)}{y}")
        if st.limiting is not None:
            lines.append(f"  limiting reagent: {st.limiting.component.label}")
        if st.concentration_m:
            from .units import fmt_volume

            lines.append(f"  concentration: {st.concentration_m:.3g} M in {fmt_volume(st.total_volume_ml)}")
        if st.atom_economy_pct is not None:
            lines.append(f"  atom economy {st.atom_economy_pct:.1f} %" + (f", PMI {st.pmi:.1f}, E-factor {st.e_factor:.1f}" if st.pmi else ""))
    return "\n".join(lines)
