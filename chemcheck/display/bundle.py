"""The MIME bundle of a report: the custom type beside a static HTML, SVG and text fallback."""

from __future__ import annotations

from ..report import MIME_TYPE
from .draw import draw_scheme
from .html import render_html

__all__ = ["mimebundle", "payload_with_drawing"]


def payload_with_drawing(report) -> tuple[dict, str | None]:
    payload = report.to_dict()
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
