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


def payload_with_drawing(report) -> tuple[dict, str | None]:
    payload = report.to_dict()
    _draw_candidates(payload)
    try:
        scheme = draw_scheme(report)
    except Exception:  # drawing must never cost the user the report
        return payload, None
    payload["drawing"] = {
        "scheme_svg": scheme.svg,
        "width": scheme.width,
        "height": scheme.height,
        "components": [
            {
                "component": p.component,
                "svg": p.drawn.svg,
                "x": p.x,
                "y": p.y,
                "width": p.drawn.width,
                "height": p.drawn.height,
                "atoms": [[p.x + ax, p.y + ay] for ax, ay in p.drawn.atoms],
            }
            for p in scheme.placed
        ],
    }
    return payload, scheme.svg


def mimebundle(report) -> dict:
    payload, svg = payload_with_drawing(report)
    bundle = {
        MIME_TYPE: payload,
        "text/html": render_html(report, payload, svg),
        "text/plain": report.to_text(),
    }
    if svg:
        bundle["image/svg+xml"] = svg
    return bundle
