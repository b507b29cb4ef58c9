"""The static HTML report: no scripts, no style sheets, every user string escaped.

It must read in an untrusted notebook (styles and scripts stripped), in an nbconvert export,
and in a viewer that knows nothing of chemcheck. Structure carries the meaning: headings,
lists, tables and severity words.
"""

from __future__ import annotations

import base64
from html import escape

from ..findings import SEVERITIES

_WORD = {"error": "Error", "warning": "Warning", "info": "Note"}


def _img(svg: str, alt: str) -> str:
    data = base64.b64encode(svg.encode("utf-8")).decode("ascii")
    return f'<img src="data:image/svg+xml;base64,{data}" alt="{escape(alt)}">'


def _table(columns: list[str], rows: list[list[str]]) -> str:
    head = "".join(f"<th>{escape(c)}</th>" for c in columns)
    body = "".join("<tr>" + "".join(f"<td>{escape(str(v))}</td>" for v in r) + "</tr>" for r in rows)
    return f"<table><thead><tr>{head}</tr></thead><tbody>{body}</tbody></table>"


def render_html(report, payload: dict, scheme_svg: str | None) -> str:
    comps = report.components
    c = report.counts()
    out = ['<div class="chemcheck-static-report">']
    out.append(f"<h3>chemcheck: {escape(report.reaction.text)}</h3>")
    out.append(
        f"<p><strong>{c['error']} error(s), {c['warning']} warning(s), {c['info']} note(s)</strong></p>"
    )
    if scheme_svg:
        out.append(f"<p>{_img(scheme_svg, 'reaction scheme: ' + report.reaction.text)}</p>")
    out.append("<h4>Findings</h4>")
    if report.findings:
        out.append("<ol>")
        for sev in SEVERITIES:
            for f in report.findings:
                if f.severity != sev:
                    continue
                atoms = ""
                if f.atoms:
                    where = ", ".join(
                        f"{comps[ci].text} atom {ai + 1}" for ci, ai in f.atoms if ci < len(comps)
                    )
                    atoms = f"<br><em>Atoms:</em> {escape(where)}"
                fix = f"<br><em>Fix:</em> {escape(f.fix)}" if f.fix else ""
                out.append(
                    f"<li><strong>{_WORD[sev]}</strong> <code>{escape(f.rule)}</code>: "
                    f"{escape(f.message)}{atoms}{fix}</li>"
                )
        out.append("</ol>")
    else:
        out.append("<p>No findings.</p>")
    out.append("<h4>Components</h4>")
    out.append(
        _table(
            ["#", "role", "as written", "name", "formula", "M (g/mol)", "kind"],
            [
                [
                    str(x.index + 1),
                    x.role,
                    x.text,
                    x.name or "",
                    x.formula,
                    f"{x.mw:.2f}" if x.mw == x.mw else "",
                    x.kind or "",
                ]
                for x in comps
            ],
        )
    )
    for section in html_sections(payload):
        out.append(section)
    out.append("</div>")
    return "".join(out)


def html_sections(payload: dict) -> list[str]:
    """Optional sections present in the payload: stoichiometry, basicity, workup, predictions."""
    out: list[str] = []
    table = payload.get("table")
    if table and table.get("rows"):
        cols = table["columns"]
        out.append("<h4>Stoichiometry</h4>")
        out.append(
            _table(
                ["component", *cols, "read as"],
                [
                    [r["text"], *[_fmt(r["values"].get(k)) for k in cols], r.get("read_as") or ""]
                    for r in table["rows"]
                ],
            )
        )
        if table.get("limiting"):
            out.append(f"<p>Limiting reagent: {escape(table['limiting'])}</p>")
    metrics = payload.get("metrics")
    if metrics:
        items = []
        if metrics.get("atom_economy_pct") is not None:
            items.append(f"atom economy {metrics['atom_economy_pct']:.1f} %")
        if metrics.get("pmi") is not None:
            items.append(f"PMI {metrics['pmi']:.1f}")
        if metrics.get("e_factor") is not None:
            items.append(f"E-factor {metrics['e_factor']:.1f}")
        if items:
            out.append(f"<p>Green metrics: {escape(', '.join(items))}</p>")
    sites = payload.get("basicity")
    if sites:
        out.append("<h4>Basicity (pKa of the conjugate acid, water, 25 °C)</h4>")
        comps = payload["components"]
        out.append(
            _table(
                ["component", "atom", "kind", "pKa", "±", "method"],
                [
                    [
                        comps[s["component"]]["text"],
                        str(s["atom"] + 1),
                        s["kind"],
                        "" if s["pka"] is None else f"{s['pka']:.1f}",
                        "" if s["uncertainty"] is None else f"{s['uncertainty']:.1f}",
                        s["method"],
                    ]
                    for s in sites
                ],
            )
        )
    workup = payload.get("workup")
    if workup:
        out.append("<h4>Workup</h4><ul>")
        out.extend(f"<li>{escape(w['message'])}</li>" for w in workup)
        out.extend(f"<li>{escape(t)}</li>" for t in payload.get("separations") or [])
        out.append("</ul>")
    preds = payload.get("predictions")
    if preds:
        out.append("<h4>Expected products</h4><ul>")
        for p in preds:
            for cand in p["candidates"]:
                picture = f" {_img(cand['svg'], cand['smiles'])}" if cand.get("svg") else ""
                out.append(
                    f"<li>{escape(p['reaction_class'])}: <strong>{escape(cand['label'])}</strong> "
                    f"<code>{escape(cand['smiles'])}</code> — {escape(cand['reason'])}{picture}</li>"
                )
        out.append("</ul>")
    scale = payload.get("scale")
    if scale:
        out.append("<h4>Scale-up cautions</h4><ul>")
        out.extend(f"<li>{escape(c)}</li>" for c in scale.get("cautions", []))
        out.append("</ul>")
    return out


def _fmt(v) -> str:
    if v is None:
        return ""
    if isinstance(v, float):
        if v != v:
            return ""
        return f"{v:.4g}" if abs(v) < 1e5 else f"{v:.3e}"
    return str(v)
