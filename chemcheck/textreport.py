"""The compact plain-text report: the verdict, the findings, safety, then the table."""

from __future__ import annotations

from .display import present as P

_WORD = {"error": "ERROR", "warning": "WARNING", "info": "NOTE"}


def render_text(report) -> str:
    payload = report.to_dict()
    try:
        from .display.bundle import _labels

        payload["labels"] = _labels(report)
    except Exception:  # the text must never fail for want of labels
        pass
    return render_payload_text(payload, report.reaction.text)


def render_payload_text(payload: dict, reaction: str | None = None) -> str:
    comps = P.compounds(payload)
    s = P.sort_findings(payload)
    reaction = reaction or (payload.get("input") or {}).get("reaction") or ""
    lines = [P.verdict(payload, s), f"reaction: {reaction}"]
    if s.by_products:
        lines.append("by-products not drawn: " + ", ".join(m["name"] for m in s.by_products))
    for f in s.shown:
        lines.append(f"{_WORD[f['severity']]} [{f['rule']}] {f['message']}")
        place = P.where(f, comps)
        if place:
            lines.append(f"    at {place}")
        fix = P.fix_text(f)
        if fix:
            lines.append(f"    fix: {fix}")
    for f in s.balance_notes:
        lines.append(f"NOTE [{f['rule']}] {f['message']}")
    if s.safety:
        lines.append("safety:")
        lines.extend(f"  - {x}" for x in s.safety)
        if s.safety_sentence:
            lines.append(f"  {s.safety_sentence}")
    lines.append("components:")
    for x in payload.get("components") or []:
        c = comps[x["index"]]
        role = x.get("role_in_reaction") or x.get("kind") or x["role"]
        mw = "" if x.get("mw") is None else f"  {x['mw']:.2f} g/mol"
        lines.append(f"  {c.number:>2}  {c.label}: {role}, {x['text']}  {x['formula']}{mw}")
    st = P.stoich_table(payload)
    if st is not None:
        lines.append("stoichiometry:")
        name_w = min(max(len(c.label) for c in st.compounds), 28)
        widths = [max(len(col.header), *(len(v) for v in col.cells)) for col in st.columns]
        lines.append(
            "  "
            + f"{'Compound':{name_w}s}  "
            + "  ".join(f"{col.header:>{w}s}" for col, w in zip(st.columns, widths))
        )
        for k, comp in enumerate(st.compounds):
            cells = "  ".join(f"{col.cells[k]:>{w}s}" for col, w in zip(st.columns, widths))
            lines.append(f"  {comp.label[:name_w]:{name_w}s}  {cells}")
            if st.read_as[k]:
                lines.append(f"  {'':{name_w}s}  read as {st.read_as[k]}")
        if st.limiting:
            lines.append(f"  limiting reagent: {st.limiting}")
        if st.concentration:
            lines.append(f"  concentration: {st.concentration}")
        metrics = payload.get("metrics") or {}
        if metrics.get("atom_economy_pct") is not None:
            extra = ""
            if metrics.get("pmi") is not None:
                extra = f", PMI {metrics['pmi']:.1f}, E-factor {metrics.get('e_factor') or 0:.1f}"
            lines.append(f"  atom economy {metrics['atom_economy_pct']:.1f} %{extra}")
    scale = payload.get("scale")
    if scale and scale.get("cautions"):
        lines.append("scale-up cautions:")
        lines.extend(f"  - {c}" for c in scale["cautions"])
    return "\n".join(lines)
