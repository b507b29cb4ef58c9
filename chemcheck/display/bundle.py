"""The MIME bundle of a report: the custom type beside a static HTML, SVG and text fallback."""

from __future__ import annotations

from ..report import MIME_TYPE
from .draw import draw_component, draw_scheme
from .html import render_html

__all__ = ["mimebundle", "payload_with_drawing"]


MAX_CANDIDATE_DRAWINGS = 4  # per predicted class: the major and the leading minor products
CANDIDATE_SIZE = (170, 130)


def _draw_candidates(payload: dict) -> None:
    """An SVG beside each leading candidate of the predicted products (major and minor)."""
    from rdkit import Chem

    from .. import _rdlog

    for pred in payload.get("predictions") or []:
        drawn = 0
        for cand in pred["candidates"]:
            if cand["label"] == "none" or drawn >= MAX_CANDIDATE_DRAWINGS:
                continue
            with _rdlog.captured():
                mol = Chem.MolFromSmiles(cand["smiles"])
            if mol is None:
                continue
            try:
                cand["svg"] = draw_component(mol, size=CANDIDATE_SIZE).svg
            except Exception:  # a drawing must never cost the user the report
                continue
            drawn += 1


def _labels(report) -> list[dict]:
    """Compound numbers, labels and element symbols for the renderers (display only)."""
    from .present import compounds

    payload_comps = {"components": [], "labels": []}
    for c in report.components:
        p = report.perceptions.get(c.index)
        payload_comps["components"].append(
            {
                "index": c.index,
                "role": c.role,
                "text": c.text,
                "smiles": c.smiles,
                "name": c.name,
                "kind": c.kind,
                "number": getattr(c, "number", None),
                "nitrogens": [{"kind": s.kind} for s in (p.nitrogens if p else ())],
            }
        )
    numbered = compounds(payload_comps)
    out = []
    for c in report.components:
        entry = numbered[c.index]
        # the check's own label once it names compounds by number ("benzylamine (1)", "amine 1")
        own = getattr(c, "label", "") or ""
        number = getattr(c, "number", None) or entry.number
        label = own if own.endswith((f"({number})", f" {number}")) else entry.label
        out.append(
            {
                "component": c.index,
                "number": entry.number,
                "label": label,
                "elements": [a.GetSymbol() for a in c.mol.GetAtoms()],
            }
        )
    return out


def payload_with_drawing(report) -> tuple[dict, str | None]:
    payload = report.to_dict()
    try:
        payload["labels"] = _labels(report)
    except Exception:  # labels must never cost the user the report
        pass
    _draw_candidates(payload)
    numbers = {e["component"]: e["number"] for e in payload.get("labels") or []}
    try:
        scheme = draw_scheme(report, numbers=numbers)
    except Exception:  # drawing must never cost the user the report
        return payload, None
    payload["drawing"] = {
        "scheme_svg": scheme.svg,
        "width": scheme.width,
        "height": scheme.height,
        "components": [
            {
                "component": p.component,
                "x": p.x,
                "y": p.y,
                "width": p.drawn.width,
                "height": p.drawn.height,
                "atoms": [[round(p.x + ax, 1), round(p.y + ay, 1)] for ax, ay in p.drawn.atoms],
                "number": p.number,
                "label_box": [
                    None if b is None else [round(p.x + b[0], 1), round(p.y + b[1], 1), b[2], b[3]]
                    for b in p.drawn.label_boxes
                ],
            }
            for p in scheme.placed
        ],
        "by_products": scheme.by_products,
        "centre": scheme.centre,
    }
    return payload, scheme.svg


def mimebundle(report) -> dict:
    payload, svg = payload_with_drawing(report)
    bundle = {
        MIME_TYPE: payload,
        "text/html": render_html(payload, svg),
        "text/plain": report.to_text(),
    }
    if svg:
        bundle["image/svg+xml"] = svg
    return bundle
