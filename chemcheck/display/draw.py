"""2D drawings with RDKit's MolDraw2DSVG, and the reaction scheme laid out from them.

Colours are chosen to read on light and dark backgrounds: the background is transparent,
carbon and bonds are mid grey, highlights are translucent severity colours.
"""

from __future__ import annotations

import re
from dataclasses import dataclass
from xml.sax.saxutils import escape

from rdkit import Chem
from rdkit.Chem import rdDepictor
from rdkit.Chem.Draw import rdMolDraw2D

from .. import _rdlog
from .._budget import MAX_DRAWN_ATOMS

__all__ = ["draw_component", "draw_scheme", "Scheme", "SEVERITY_RGBA"]

SEVERITY_RGBA = {
    "error": (0.86, 0.20, 0.18, 0.55),
    "warning": (0.96, 0.62, 0.07, 0.55),
    "info": (0.20, 0.50, 0.90, 0.45),
}
_GREY = (0.45, 0.45, 0.45)
_XML_HEAD = re.compile(r"<\?xml[^>]*\?>\s*")


@dataclass
class Drawn:
    svg: str
    width: int
    height: int
    atoms: list[tuple[float, float]]


def _size(mol: Chem.Mol) -> tuple[int, int]:
    n = max(mol.GetNumHeavyAtoms(), 1)
    side = int(min(360, max(110, 40 * n**0.55)))
    return side, int(side * 0.8)


def draw_component(
    mol: Chem.Mol,
    highlights: dict[int, tuple[float, float, float, float]] | None = None,
    *,
    size: tuple[int, int] | None = None,
    atom_indices: bool = False,
) -> Drawn:
    if mol.GetNumHeavyAtoms() > MAX_DRAWN_ATOMS:  # layout and drawing grow faster than linearly
        return _not_drawn(mol, size)
    highlights = highlights or {}
    work = Chem.Mol(mol)
    for a in work.GetAtoms():
        a.SetAtomMapNum(0)
    w, h = size or _size(work)
    with _rdlog.captured():
        try:
            rdDepictor.SetPreferCoordGen(False)
            rdDepictor.Compute2DCoords(work)
        except (RuntimeError, ValueError):
            pass
        d = rdMolDraw2D.MolDraw2DSVG(w, h)
        opts = d.drawOptions()
        opts.clearBackground = False
        opts.addAtomIndices = atom_indices
        opts.padding = 0.12
        opts.bondLineWidth = 2
        opts.updateAtomPalette({6: _GREY, 1: _GREY, 0: _GREY})
        opts.legendFontSize = 14
        try:
            rdMolDraw2D.PrepareAndDrawMolecule(
                d,
                work,
                highlightAtoms=list(highlights),
                highlightAtomColors=dict(highlights),
                highlightBonds=[
                    b.GetIdx()
                    for b in work.GetBonds()
                    if b.GetBeginAtomIdx() in highlights and b.GetEndAtomIdx() in highlights
                ],
                highlightBondColors={
                    b.GetIdx(): highlights[b.GetBeginAtomIdx()]
                    for b in work.GetBonds()
                    if b.GetBeginAtomIdx() in highlights and b.GetEndAtomIdx() in highlights
                },
            )
        except (RuntimeError, ValueError):
            d = rdMolDraw2D.MolDraw2DSVG(w, h)
            d.drawOptions().clearBackground = False
            d.drawOptions().prepareMolsBeforeDrawing = False
            d.DrawMolecule(work)
        d.FinishDrawing()
        atoms = []
        for i in range(work.GetNumAtoms()):
            p = d.GetDrawCoords(i)
            atoms.append((round(p.x, 1), round(p.y, 1)))
    return Drawn(_XML_HEAD.sub("", d.GetDrawingText()), w, h, atoms)


def _not_drawn(mol: Chem.Mol, size: tuple[int, int] | None) -> Drawn:
    """A box with the formula in place of a structure too large to draw within the budget."""
    from rdkit.Chem.rdMolDescriptors import CalcMolFormula

    w, h = size or (220, 80)
    with _rdlog.captured():
        try:
            formula = CalcMolFormula(mol)
        except (RuntimeError, ValueError):
            formula = "structure"
    text = f"{formula}: {mol.GetNumHeavyAtoms()} heavy atoms, not drawn (limit {MAX_DRAWN_ATOMS})"
    svg = (
        f'<svg xmlns="http://www.w3.org/2000/svg" width="{w}" height="{h}" viewBox="0 0 {w} {h}">'
        f'<rect x="1" y="1" width="{w - 2}" height="{h - 2}" fill="none" stroke="#737373" stroke-dasharray="4 3"/>'
        f'<text x="{w / 2:.0f}" y="{h / 2:.0f}" font-size="10" text-anchor="middle" fill="#737373">{escape(text)}</text>'
        "</svg>"
    )
    return Drawn(svg, w, h, [(w / 2, h / 2)] * mol.GetNumAtoms())


@dataclass
class Placed:
    component: int
    drawn: Drawn
    x: float
    y: float


@dataclass
class Scheme:
    svg: str
    width: int
    height: int
    placed: list[Placed]


def _label(c) -> str:
    return c.name or c.text


def _nest(drawn: Drawn, x: float, y: float) -> str:
    body = drawn.svg
    body = re.sub(r"^<svg\b", f'<svg x="{x:.1f}" y="{y:.1f}"', body, count=1)
    return body


def draw_scheme(report, highlight: bool = True) -> Scheme:
    """Reactants + reactants → (agents as text over the arrow) → products."""
    colours: dict[int, dict[int, tuple]] = {}
    if highlight:
        order = {"info": 0, "warning": 1, "error": 2}
        for f in sorted(report.findings, key=lambda f: order[f.severity]):
            for ci, ai in f.atoms:
                colours.setdefault(ci, {})[ai] = SEVERITY_RGBA[f.severity]
    reactants, agents, products = report.reaction.reactants, report.reaction.agents, report.reaction.products
    drawn = {c.index: draw_component(c.mol, colours.get(c.index)) for c in reactants + products}
    gap = 24
    height = max([drawn[i].height for i in drawn] + [120])
    parts: list[str] = []
    placed: list[Placed] = []
    x = 8.0

    def text(tx: float, ty: float, s: str, size: int = 22, anchor: str = "middle") -> str:
        return (
            f'<text x="{tx:.1f}" y="{ty:.1f}" font-family="sans-serif" font-size="{size}" '
            f'fill="#808080" text-anchor="{anchor}">{escape(s)}</text>'
        )

    def put(comps):
        nonlocal x
        for k, c in enumerate(comps):
            if k:
                parts.append(text(x + gap / 2, height / 2 + 8, "+"))
                x += gap
            d = drawn[c.index]
            y = (height - d.height) / 2
            parts.append(_nest(d, x, y))
            placed.append(Placed(c.index, d, x, y))
            x += d.width

    put(reactants)
    labels = [_label(a) for a in agents]
    label_width = max([len(s) * 8.5 for s in labels] + [60])
    arrow = max(90.0, min(label_width + 20, 260.0))
    x += 10
    mid = height / 2
    parts.append(
        f'<line x1="{x:.1f}" y1="{mid:.1f}" x2="{x + arrow - 10:.1f}" y2="{mid:.1f}" '
        f'stroke="#808080" stroke-width="2"/>'
        f'<polygon points="{x + arrow:.1f},{mid:.1f} {x + arrow - 12:.1f},{mid - 6:.1f} '
        f'{x + arrow - 12:.1f},{mid + 6:.1f}" fill="#808080"/>'
    )
    for k, s in enumerate(labels[:6]):
        if len(s) > 30:
            s = s[:29] + "…"
        parts.append(text(x + arrow / 2, mid - 10 - 16 * (len(labels[:6]) - 1 - k), s, size=13))
    if len(labels) > 6:
        parts.append(text(x + arrow / 2, mid + 22, f"+{len(labels) - 6} more", size=12))
    x += arrow + 10
    if products:
        put(products)
    else:
        parts.append(text(x + 20, mid + 8, "?", size=26))
        x += 40
    width = int(x + 8)
    svg = (
        f'<svg xmlns="http://www.w3.org/2000/svg" xmlns:rdkit="http://www.rdkit.org/xml" '
        f'xmlns:xlink="http://www.w3.org/1999/xlink" version="1.1" width="{width}" height="{height}" '
        f'viewBox="0 0 {width} {height}"><title>{escape(report.reaction.text[:200])}</title>'
        + "".join(parts)
        + "</svg>"
    )
    return Scheme(svg, width, int(height), placed)
