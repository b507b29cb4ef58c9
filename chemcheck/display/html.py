"""The static HTML report: no scripts, no style sheets, every user string escaped.

It must read in an untrusted notebook, in an nbconvert export, and in a viewer that knows
nothing of chemcheck. Structure carries the meaning (headings, lists, tables, severity words);
a few inline colours (severity badges and borders, greyed by-products) add to it. Sections the
chemist opens on demand are ``<details>`` elements, closed by default, which work without script.

Built from the JSON payload alone, so a recorded report can be rendered again later with the
acknowledgements stored in the notebook (see :mod:`chemcheck.export`).
"""

from __future__ import annotations

import base64
from datetime import datetime
from html import escape

from . import present as P

__all__ = ["SEVERITY_STYLE", "readable_time", "render_html"]

# Filled badges: white text on red and blue, black text on amber; each pair above 4.5:1
# (WCAG 2.1 relative luminance), and the badge reads the same on light and dark pages.
SEVERITY_STYLE = {
    "error": ("#c62828", "#ffffff"),
    "warning": ("#f9a825", "#000000"),
    "info": ("#1565c0", "#ffffff"),
}
_MUTED = "opacity:0.8"


def _img(svg: str, alt: str) -> str:
    data = base64.b64encode(svg.encode("utf-8")).decode("ascii")
    return f'<img src="data:image/svg+xml;base64,{data}" alt="{escape(alt)}" style="max-width:100%;height:auto">'


def _badge(sev: str) -> str:
    bg, fg = SEVERITY_STYLE[sev]
    return (
        f'<span class="cc-badge cc-badge-{sev}" style="background-color:{bg};color:{fg};'
        f'padding:0 5px;border-radius:3px;font-weight:bold">{P.SEVERITY_WORD[sev]}</span>'
    )


_NUM_TD = "text-align:right;white-space:nowrap;padding:2px 6px"
_TXT_TD = "text-align:left;padding:2px 6px"


def _table(
    headers: list[tuple[str, bool]],
    rows: list[list[tuple[str, bool]]],
    titles: list[str] | None = None,
) -> str:
    """A table whose numeric columns are right-aligned and never wrap (the block scrolls)."""
    head = "".join(
        f'<th style="{_NUM_TD if num else _TXT_TD};white-space:nowrap">{escape(h)}</th>'
        for h, num in headers
    )
    body = []
    for k, r in enumerate(rows):
        title = f' title="{escape(titles[k])}"' if titles and titles[k] else ""
        cells = "".join(
            f'<td style="{_NUM_TD if num else _TXT_TD}">{escape(v)}</td>' for v, num in r
        )
        body.append(f"<tr{title}>{cells}</tr>")
    return (
        '<div style="overflow-x:auto;max-width:100%">'
        f'<table class="cc-table"><thead><tr>{head}</tr></thead><tbody>{"".join(body)}</tbody></table></div>'
    )


def readable_time(iso: str) -> str:
    """An ISO timestamp as "4 Dec 2026, 18:40 UTC" (static pages cannot know the reader's zone)."""
    try:
        t = datetime.fromisoformat(iso.replace("Z", "+00:00"))
    except (ValueError, AttributeError):
        return iso or ""
    if t.tzinfo is not None:
        from datetime import timezone

        t = t.astimezone(timezone.utc)
        return f"{t.day} {t:%b %Y, %H:%M} UTC"
    return f"{t.day} {t:%b %Y, %H:%M}"


def _ack_line(ack: dict) -> str:
    who = ack.get("who") or "a reviewer"
    when = readable_time(ack.get("when") or "")
    note = f": {ack['note']}" if ack.get("note") else ""
    return f"Acknowledged by {who}{', ' + when if when else ''}{note}"


def _details(title: str, body: str, cls: str) -> str:
    return f'<details class="{cls}"><summary><strong>{escape(title)}</strong></summary>{body}</details>'


def render_html(
    payload: dict, scheme_svg: str | None = None, acknowledgements: list[dict] | None = None
) -> str:
    """The whole static report; ``acknowledgements`` as stored in the cell metadata."""
    from ..review import finding_key

    comps = P.compounds(payload)
    s = P.sort_findings(payload)
    acks = {a.get("finding"): a for a in acknowledgements or [] if isinstance(a, dict)}
    reaction = (payload.get("input") or {}).get("reaction") or ""
    if scheme_svg is None:
        scheme_svg = (payload.get("drawing") or {}).get("scheme_svg")
    out = ['<div class="chemcheck-static-report">']
    worst = next(
        (sev for sev in P.SEVERITY_ORDER if any(f["severity"] == sev for f in s.shown)), None
    )
    border = SEVERITY_STYLE[worst][0] if worst in ("error", "warning") else "#888888"
    out.append(
        f'<p class="cc-verdict" style="border-left:4px solid {border};padding-left:8px">'
        f"<strong>{escape(P.verdict(payload, s))}</strong></p>"
    )
    out.append(f'<p style="{_MUTED}"><code>{escape(reaction)}</code></p>')
    if scheme_svg:
        out.append(f"<p>{_img(scheme_svg, 'reaction scheme: ' + reaction)}</p>")
        if (payload.get("drawing") or {}).get("centre"):
            out.append(
                f'<p style="{_MUTED}">The bond formed in the reaction is marked in teal.</p>'
            )
    if s.shown:
        out.append('<h4>Findings</h4><ul style="list-style:none;padding-left:0">')
        for f in s.shown:
            sev = f["severity"]
            key = finding_key(f["rule"], f["message"], f.get("atoms") or [])
            ack = acks.get(key)
            place = P.where(f, comps)
            bits = [_badge(sev), f" {escape(f.get('title') or f['rule'])} "]
            bits.append(f'<code style="{_MUTED}">{escape(f["rule"])}</code>')
            bits.append(f"<br>{escape(f['message'])}")
            if place:
                bits.append(f'<br><span style="{_MUTED}">At {escape(place)}</span>')
            fix = P.fix_text(f)
            if fix:
                bits.append(f"<br><em>Fix:</em> {escape(fix)}")
            if ack:
                bits.append(
                    f'<br><span class="cc-ack-note" style="font-style:italic">✓ {escape(_ack_line(ack))}</span>'
                )
            elif sev in P.ACKNOWLEDGEABLE and acknowledgements is not None:
                bits.append(f'<br><span style="{_MUTED}">Not acknowledged</span>')
            style = f"border-left:4px {'dashed' if ack else 'solid'} {SEVERITY_STYLE[sev][0]};padding:2px 8px;margin:4px 0"
            out.append(
                f'<li class="cc-finding cc-{sev}{" cc-acknowledged" if ack else ""}" style="{style}">{"".join(bits)}</li>'
            )
        out.append("</ul>")
    else:
        out.append("<p>No findings.</p>")
    if s.safety:
        out.append('<h4>Safety</h4><ul class="cc-safety">')
        out.extend(f"<li>{escape(line)}</li>" for line in s.safety)
        out.append("</ul>")
        if s.safety_sentence:
            out.append(f"<p><strong>{escape(s.safety_sentence)}</strong></p>")
    out.extend(_stoichiometry(payload))
    scale = payload.get("scale")
    if scale and scale.get("cautions"):
        out.append(
            f"<h4>Scale-up ×{escape(P.fmt_number(scale.get('factor') or 0))}: cautions</h4><ul>"
        )
        out.extend(f"<li>{escape(c)}</li>" for c in scale["cautions"])
        out.append("</ul>")
    out.extend(_closed_sections(payload, comps, s))
    out.append("</div>")
    return "".join(out)


def _stoichiometry(payload: dict) -> list[str]:
    st = P.stoich_table(payload)
    if st is None:
        return []
    out = ["<h4>Stoichiometry</h4>"]
    headers = [("Compound", False)] + [(c.header, c.numeric) for c in st.columns]
    rows = []
    for k, comp in enumerate(st.compounds):
        rows.append([(comp.label, False)] + [(c.cells[k], c.numeric) for c in st.columns])
    out.append(
        _table(
            headers,
            rows,
            [f"{c.smiles}: {r}" if r else c.smiles for c, r in zip(st.compounds, st.read_as)],
        )
    )
    lines = []
    if st.limiting:
        lines.append(f"Limiting reagent: {st.limiting}")
    if st.concentration:
        lines.append(f"Concentration: {st.concentration}")
    metrics = payload.get("metrics") or {}
    green = []
    if metrics.get("atom_economy_pct") is not None:
        green.append(f"atom economy {metrics['atom_economy_pct']:.1f} %")
    if metrics.get("pmi") is not None:
        green.append(f"PMI {metrics['pmi']:.1f}")
    if metrics.get("e_factor") is not None:
        green.append(f"E-factor {metrics['e_factor']:.1f}")
    if green:
        lines.append("Green metrics: " + ", ".join(green))
    if lines:
        out.append("<p>" + "<br>".join(escape(x) for x in lines) + "</p>")
    read = [(c.label, r) for c, r in zip(st.compounds, st.read_as) if r]
    if read:
        body = (
            "<ul>"
            + "".join(f"<li>{escape(label)}: {escape(r)}</li>" for label, r in read)
            + "</ul>"
        )
        out.append(_details("How the amounts were read", body, "cc-read-as"))
    return out


def _closed_sections(payload: dict, comps: dict[int, P.Compound], s: P.Sorted) -> list[str]:
    out: list[str] = []
    sites = payload.get("basicity")
    if sites:
        rows = []
        for b in sites:
            c = comps.get(b["component"])
            el = c.elements[b["atom"]] if c and b["atom"] < len(c.elements) else "atom"
            rows.append(
                [
                    (c.label if c else str(b["component"]), False),
                    (f"{el} {b['atom'] + 1}", False),
                    (b["kind"].replace("_", " "), False),
                    ("" if b["pka"] is None else f"{b['pka']:.1f}", True),
                    ("" if b["uncertainty"] is None else f"±{b['uncertainty']:.1f}", True),
                    (b["method"], False),
                ]
            )
        table = _table(
            [
                ("Compound", False),
                ("Atom", False),
                ("Nitrogen", False),
                ("pKa (BH⁺)", True),
                ("Uncertainty", True),
                ("Method", False),
            ],
            rows,
        )
        out.append(
            _details("Basicity (pKa of the conjugate acid, water, 25 °C)", table, "cc-basicity")
        )
    workup = payload.get("workup")
    if workup:
        body = "<ul>" + "".join(f"<li>{escape(w['message'])}</li>" for w in workup)
        body += "".join(f"<li>{escape(t)}</li>" for t in payload.get("separations") or []) + "</ul>"
        out.append(_details("Workup", body, "cc-workup"))
    preds = payload.get("predictions")
    if preds:
        items = []
        for p in preds:
            for cand in p["candidates"]:
                picture = f"<br>{_img(cand['svg'], cand['smiles'])}" if cand.get("svg") else ""
                items.append(
                    f"<li>{escape(p['reaction_class'])}: <strong>{escape(cand['label'])}</strong> "
                    f"<code>{escape(cand['smiles'])}</code> — {escape(cand['reason'])}{picture}</li>"
                )
        out.append(
            _details("Expected products", "<ul>" + "".join(items) + "</ul>", "cc-predictions")
        )
    rows = []
    for x in payload.get("components") or []:
        c = comps[x["index"]]
        rows.append(
            [
                (c.number, False),
                (c.label, False),
                (x.get("role_in_reaction") or x.get("kind") or x["role"], False),
                (x["text"], False),
                (x["formula"], False),
                ("" if x.get("mw") is None else f"{x['mw']:.2f}", True),
            ]
        )
    out.append(
        _details(
            "Components",
            _table(
                [
                    ("No.", False),
                    ("Compound", False),
                    ("Role", False),
                    ("As written", False),
                    ("Formula", False),
                    ("M (g/mol)", True),
                ],
                rows,
            ),
            "cc-components",
        )
    )
    balance = payload.get("balance") or {}
    if balance.get("checked"):
        lines = []
        if s.by_products:
            names = ", ".join(
                f"{m['count']} {m['name']}" if m.get("count", 1) != 1 else m["name"]
                for m in s.by_products
            )
            lines.append(
                f"By-products not drawn in the equation (shown greyed in the scheme): {names}."
            )
        lines.extend(f["message"] for f in s.balance_notes)
        if balance.get("drawn_balanced"):
            lines.append("The equation balances as drawn.")
        elif balance.get("balanced"):
            coeffs = balance.get("coefficients") or {}
            if coeffs:
                lines.append(
                    "Balanced with coefficients: "
                    + ", ".join(
                        f"{v} × {comps[int(k)].label}" for k, v in coeffs.items() if int(k) in comps
                    )
                    + "."
                )
        else:
            lines.append("The equation could not be balanced with the components given.")
        body = "<ul>" + "".join(f"<li>{escape(x)}</li>" for x in dict.fromkeys(lines)) + "</ul>"
        out.append(_details("Balance", body, "cc-balance"))
    return out
