"""2D drawings with RDKit's MolDraw2DSVG, and the reaction scheme laid out from them.

Every molecule of a scheme is drawn at one bond length, so sizes compare. Colours read on light
and dark backgrounds: the background is transparent and every element colour has a contrast of
at least 4:1 against white and against JupyterLab's dark page (#111111), by the WCAG 2.1
relative-luminance formula. Highlights are soft halos drawn *under* the molecule, so element
labels stay on top and readable.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field
from xml.sax.saxutils import escape

from rdkit import Chem
from rdkit.Chem import rdDepictor
from rdkit.Chem.Draw import rdMolDraw2D

from .. import _rdlog
from .._budget import MAX_DRAWN_ATOMS

__all__ = ["BOND_PX", "PALETTE", "SEVERITY_RGBA", "Scheme", "draw_component", "draw_scheme"]

SEVERITY_RGBA = {
    "error": (0.86, 0.20, 0.18, 0.30),
    "warning": (0.96, 0.62, 0.07, 0.34),
    "info": (0.20, 0.50, 0.90, 0.28),
}
BOND_PX = 26  # one bond length, in px, for every molecule of a scheme
GREY = "#7c7c7c"
CENTRE = "#009688"  # bonds formed: teal, no severity and no element uses it
# element colours, mid-luminance so that they read on white and on a dark page
PALETTE = {
    0: "#7c7c7c",
    1: "#7c7c7c",
    6: "#7c7c7c",
    7: "#4f6fe8",
    8: "#d9453d",
    9: "#2f9b2f",
    17: "#2f9b2f",
    15: "#b8651e",
    16: "#a07800",
    35: "#b8651e",
    53: "#b865c8",
    5: "#b8651e",
    11: "#b865c8",
    13: "#b865c8",
    14: "#a07800",
}
_XML_HEAD = re.compile(r"<\?xml[^>]*\?>\s*")
_LABEL_PATH = re.compile(r"<path class='atom-(\d+)' d='([^']*)'", re.DOTALL)
_NUM = re.compile(r"-?\d+(?:\.\d+)?")


def _rgb(hex_colour: str) -> tuple[float, float, float]:
    return tuple(int(hex_colour[i : i + 2], 16) / 255 for i in (1, 3, 5))  # type: ignore[return-value]


def _hex(rgba) -> str:
    r, g, b = (int(255 * c) for c in rgba[:3])
    return f"#{r:02X}{g:02X}{b:02X}"


@dataclass
class Drawn:
    svg: str
    width: int
    height: int
    atoms: list[tuple[float, float]]
    label_boxes: list[tuple[float, float, float, float] | None] = field(default_factory=list)


def _label_boxes(svg: str, n: int) -> list[tuple[float, float, float, float] | None]:
    """The box around each atom's element label (from the glyph outlines RDKit writes)."""
    xs: dict[int, list[float]] = {}
    ys: dict[int, list[float]] = {}
    for m in _LABEL_PATH.finditer(svg):
        i = int(m.group(1))
        nums = [float(v) for v in _NUM.findall(m.group(2))]
        xs.setdefault(i, []).extend(nums[0::2])
        ys.setdefault(i, []).extend(nums[1::2])
    out: list[tuple[float, float, float, float] | None] = []
    for i in range(n):
        if i in xs and xs[i] and ys[i]:
            x0, x1, y0, y1 = min(xs[i]), max(xs[i]), min(ys[i]), max(ys[i])
            out.append((round(x0, 1), round(y0, 1), round(x1 - x0, 1), round(y1 - y0, 1)))
        else:
            out.append(None)
    return out


def halo_radius(xy: tuple[float, float], box, bond_px: float = BOND_PX) -> float:
    """A radius that clears the whole label box, and at least 0.45 of a bond."""
    r = 0.45 * bond_px
    if box is not None:
        x, y, w, h = box
        for cx, cy in ((x, y), (x + w, y), (x, y + h), (x + w, y + h)):
            r = max(r, ((cx - xy[0]) ** 2 + (cy - xy[1]) ** 2) ** 0.5 + 2)
    return round(r, 1)


def draw_component(
    mol: Chem.Mol,
    highlights: dict[int, tuple[float, float, float, float]] | None = None,
    *,
    size: tuple[int, int] | None = None,
    atom_indices: bool = False,
    bond_px: float = BOND_PX,
    bold_bonds: list[tuple[int, int]] | None = None,
) -> Drawn:
    """One molecule: at ``bond_px`` per bond on a canvas that fits it, or fitted into ``size``."""
    if mol.GetNumHeavyAtoms() > MAX_DRAWN_ATOMS:  # layout and drawing grow faster than linearly
        return _not_drawn(mol, size)
    highlights = highlights or {}
    work = Chem.Mol(mol)
    for a in work.GetAtoms():
        a.SetAtomMapNum(0)
    with _rdlog.captured():
        try:
            rdDepictor.SetPreferCoordGen(False)
            rdDepictor.Compute2DCoords(work)
        except (RuntimeError, ValueError):
            pass

        def setup(d):
            opts = d.drawOptions()
            opts.clearBackground = False
            opts.addAtomIndices = atom_indices
            opts.padding = 0.08 if size is None else 0.12
            opts.bondLineWidth = 2
            opts.setAtomPalette({k: _rgb(v) for k, v in PALETTE.items()})
            opts.legendFontSize = 14
            if size is None:
                opts.fixedBondLength = bond_px
            return opts

        d = rdMolDraw2D.MolDraw2DSVG(*(size or (-1, -1)))
        setup(d)
        try:
            rdMolDraw2D.PrepareAndDrawMolecule(d, work)
        except (RuntimeError, ValueError):
            d = rdMolDraw2D.MolDraw2DSVG(*(size or (-1, -1)))
            setup(d).prepareMolsBeforeDrawing = False
            d.DrawMolecule(work)
        d.FinishDrawing()
        atoms = []
        for i in range(work.GetNumAtoms()):
            p = d.GetDrawCoords(i)
            atoms.append((round(p.x, 1), round(p.y, 1)))
        w, h = d.Width(), d.Height()
    svg = _XML_HEAD.sub("", d.GetDrawingText())
    boxes = _label_boxes(svg, len(atoms))
    under: list[str] = []
    scale = bond_px
    if len(atoms) > 1 and work.GetNumBonds():
        b = work.GetBondWithIdx(0)
        (x0, y0), (x1, y1) = atoms[b.GetBeginAtomIdx()], atoms[b.GetEndAtomIdx()]
        scale = max(((x1 - x0) ** 2 + (y1 - y0) ** 2) ** 0.5, 8.0)
    for i, j in bold_bonds or []:
        if i < len(atoms) and j < len(atoms):
            (x0, y0), (x1, y1) = atoms[i], atoms[j]
            # stop short of element labels so that the mark never covers one
            length = max(((x1 - x0) ** 2 + (y1 - y0) ** 2) ** 0.5, 1e-6)
            cut0 = (
                min(0.4, (halo_radius(atoms[i], boxes[i], scale) - 2) / length) if boxes[i] else 0.0
            )
            cut1 = (
                min(0.4, (halo_radius(atoms[j], boxes[j], scale) - 2) / length) if boxes[j] else 0.0
            )
            x0, y0, x1, y1 = (
                round(x0 + (x1 - x0) * cut0, 1),
                round(y0 + (y1 - y0) * cut0, 1),
                round(x1 - (x1 - x0) * cut1, 1),
                round(y1 - (y1 - y0) * cut1, 1),
            )
            under.append(
                f'<line class="cc-centre" x1="{x0}" y1="{y0}" x2="{x1}" y2="{y1}" stroke="{CENTRE}" '
                f'stroke-opacity="0.45" stroke-width="{0.4 * scale:.1f}" stroke-linecap="round"/>'
            )
    for i, rgba in highlights.items():
        if i >= len(atoms):
            continue
        r = halo_radius(atoms[i], boxes[i], scale)
        if boxes[i] is None:  # an unlabelled carbon: a soft disc
            under.append(
                f'<circle class="cc-halo" cx="{atoms[i][0]}" cy="{atoms[i][1]}" r="{r}" '
                f'fill="{_hex(rgba)}" fill-opacity="{rgba[3]:.2f}"/>'
            )
        else:  # a labelled atom: a soft ring round the label, which stays on the page colour
            width = max(0.22 * scale, 4.0)
            under.append(
                f'<circle class="cc-halo" cx="{atoms[i][0]}" cy="{atoms[i][1]}" r="{r + width / 2:.1f}" '
                f'fill="none" stroke="{_hex(rgba)}" stroke-opacity="{min(1.0, 2 * rgba[3]):.2f}" '
                f'stroke-width="{width:.1f}"/>'
            )
    if under:
        marker = "<!-- END OF HEADER -->"
        k = svg.find(marker)
        at = k + len(marker) if k >= 0 else svg.find(">") + 1
        svg = svg[:at] + "".join(under) + svg[at:]
    return Drawn(svg, int(w), int(h), atoms, boxes)


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
    number: str = ""


@dataclass
class Scheme:
    svg: str
    width: int
    height: int
    placed: list[Placed]
    by_products: list[str] = field(default_factory=list)
    centre: list[list[list[float]]] = field(default_factory=list)


SMALL_AGENT_ATOMS = 12  # agents up to this many heavy atoms are drawn above the arrow
_TEXT_AGENT_KINDS = ("solvent",)


def _agent_name(c) -> str:
    return c.name or c.text


def _centre_bonds(report) -> list[tuple[tuple[int, int], tuple[int, int]]]:
    """Bonds formed, as (component, atom) pairs: in the products where the map places them."""
    centre = (report.extra.get("understanding") or {}).get("centre") or {}
    raw = (
        centre.get("formed_in_products")
        or centre.get("formed")
        or getattr(report, "centre", None)
        or []
    )
    out = []
    for bond in raw:
        try:
            (c1, a1), (c2, a2) = bond
            out.append(((int(c1), int(a1)), (int(c2), int(a2))))
        except (TypeError, ValueError):
            continue
    return out


def _scheme_coefficients(balance) -> dict[int, int]:
    """The stoichiometric coefficients other than 1 that balance the equation, by component
    index, when the drawn equation does not balance as it stands."""
    if balance is None or not getattr(balance, "balanced", False) or getattr(balance, "drawn_balanced", True):
        return {}
    out: dict[int, int] = {}
    for i, k in (getattr(balance, "coefficients", None) or {}).items():
        try:
            i, k = int(i), int(k)
        except (TypeError, ValueError):
            continue
        if k > 1:
            out[i] = k
    return out


def draw_scheme(report, highlight: bool = True, numbers: dict[int, str] | None = None) -> Scheme:
    """Reactants + reactants → products (+ greyed by-products), small agents drawn above the
    arrow and solvents named below it; each structure's compound number in bold beneath it."""
    colours: dict[int, dict[int, tuple]] = {}
    if highlight:
        order = {"info": 0, "warning": 1, "error": 2}
        for f in sorted(report.findings, key=lambda f: order[f.severity]):
            for ci, ai in f.atoms:
                colours.setdefault(ci, {})[ai] = SEVERITY_RGBA[f.severity]
    numbers = numbers or {}
    centre = _centre_bonds(report)
    bold: dict[int, list[tuple[int, int]]] = {}
    for (c1, a1), (c2, a2) in centre:
        if c1 == c2:
            bold.setdefault(c1, []).append((a1, a2))
    reactants, agents, products = (
        report.reaction.reactants,
        report.reaction.agents,
        report.reaction.products,
    )
    drawn_agents = [
        a
        for a in agents
        if a.mol.GetNumHeavyAtoms() <= SMALL_AGENT_ATOMS
        and (a.kind or "") not in _TEXT_AGENT_KINDS
        and a.mol.GetNumAtoms() > 0
    ][:3]
    named_agents = [a for a in agents if a not in drawn_agents]
    drawn = {
        c.index: draw_component(c.mol, colours.get(c.index), bold_bonds=bold.get(c.index))
        for c in reactants + products + drawn_agents
    }
    gap = 26
    main_h = max([drawn[c.index].height for c in reactants + products] + [90])
    agent_h = max([drawn[c.index].height for c in drawn_agents] + [0])
    names = []
    for a in named_agents:
        s = _agent_name(a)
        if len(s) > 28:
            s = s[:27] + "…"
        num = numbers.get(a.index)
        names.append(f"{s} ({num})" if num else s)
    shown_names = names[:5] + ([f"+{len(names) - 5} more"] if len(names) > 5 else [])
    above = agent_h + 18 if drawn_agents else 0  # agent drawings and their letters
    below = 18 * len(shown_names) + 6
    half = max(main_h / 2, above + 8, below)
    top = 4.0
    mid = top + half
    height_structures = top + 2 * half
    num_y = min(height_structures, mid + main_h / 2) + 16
    height = max(num_y + 6, height_structures)
    parts: list[str] = []
    placed: list[Placed] = []
    x = 8.0

    def text(
        tx: float,
        ty: float,
        s: str,
        size: int = 22,
        anchor: str = "middle",
        weight: str = "normal",
        fill: str = GREY,
        cls: str = "",
    ) -> str:
        c = f' class="{cls}"' if cls else ""
        return (
            f'<text{c} x="{tx:.1f}" y="{ty:.1f}" font-family="sans-serif" font-size="{size}" '
            f'font-weight="{weight}" fill="{fill}" text-anchor="{anchor}">{escape(s)}</text>'
        )

    balance = getattr(report, "balance", None)
    coefficients = _scheme_coefficients(balance)

    def put(comps):
        nonlocal x
        for k, c in enumerate(comps):
            if k:
                parts.append(text(x + gap / 2, mid + 8, "+"))
                x += gap
            n = coefficients.get(c.index)
            if n:
                # the coefficient the balance needs, greyed like the by-products it brings
                parts.append(text(x + 4, mid + 8, str(n), size=20, anchor="start", cls="cc-coefficient"))
                x += 14 + 11 * len(str(n))
            d = drawn[c.index]
            y = mid - d.height / 2
            parts.append(_nest(d, x, y))
            placed.append(Placed(c.index, d, x, y, numbers.get(c.index, "")))
            if numbers.get(c.index):
                parts.append(
                    text(
                        x + d.width / 2,
                        num_y,
                        numbers[c.index],
                        size=16,
                        weight="bold",
                        cls="cc-number",
                    )
                )
            x += d.width

    put(reactants)
    agents_w = sum(drawn[a.index].width for a in drawn_agents) + 10 * max(len(drawn_agents) - 1, 0)
    label_w = max([len(s) * 7.5 for s in shown_names] + [60])
    arrow = max(90.0, min(max(label_w, agents_w) + 24, 420.0))
    x += 10
    ax = x + (arrow - agents_w) / 2
    for a in drawn_agents:
        d = drawn[a.index]
        y = mid - 18 - d.height
        parts.append(_nest(d, ax, y))
        placed.append(Placed(a.index, d, ax, y, numbers.get(a.index, "")))
        if numbers.get(a.index):
            parts.append(
                text(
                    ax + d.width / 2,
                    mid - 6,
                    numbers[a.index],
                    size=13,
                    weight="bold",
                    cls="cc-number",
                )
            )
        ax += d.width + 10
    parts.append(
        f'<line x1="{x:.1f}" y1="{mid:.1f}" x2="{x + arrow - 10:.1f}" y2="{mid:.1f}" '
        f'stroke="{GREY}" stroke-width="2"/>'
        f'<polygon points="{x + arrow:.1f},{mid:.1f} {x + arrow - 12:.1f},{mid - 6:.1f} '
        f'{x + arrow - 12:.1f},{mid + 6:.1f}" fill="{GREY}"/>'
    )
    for k, s in enumerate(shown_names):
        parts.append(text(x + arrow / 2, mid + 18 + 18 * k, s, size=13))
    x += arrow + 10
    if products:
        put(products)
    else:
        parts.append(text(x + 20, mid + 8, "?", size=26))
        x += 40
    by_products = []
    for m in getattr(balance, "missing", None) or []:
        side = m.get("side") if isinstance(m, dict) else getattr(m, "side", None)
        if side != "product":
            continue
        name = m.get("name") if isinstance(m, dict) else getattr(m, "name", "")
        count = (m.get("count") if isinstance(m, dict) else getattr(m, "count", 1)) or 1
        by_products.append(f"{count} {name}" if count != 1 else str(name))
    for s in by_products[:4]:
        label = f"+ {s}"
        parts.append(
            text(
                x + 8, mid + 7, label, size=18, anchor="start", fill=GREY, cls="cc-by-product"
            ).replace("<text ", '<text fill-opacity="0.75" font-style="italic" ', 1)
        )
        x += 16 + 10.5 * len(label)
    # bonds formed between atoms of different components: a teal ring on each end
    pos = {p.component: p for p in placed}
    centre_segments: list[list[list[float]]] = []
    for (c1, a1), (c2, a2) in centre:
        ends = []
        for c, a in ((c1, a1), (c2, a2)):
            p = pos.get(c)
            if p is None or a >= len(p.drawn.atoms):
                break
            ends.append([round(p.x + p.drawn.atoms[a][0], 1), round(p.y + p.drawn.atoms[a][1], 1)])
        if len(ends) != 2:
            continue
        centre_segments.append(ends)
        if c1 != c2:
            for ex, ey in ends:
                parts.append(
                    f'<circle class="cc-centre" cx="{ex}" cy="{ey}" r="{0.55 * BOND_PX:.1f}" fill="none" '
                    f'stroke="{CENTRE}" stroke-width="2" stroke-dasharray="4 3"/>'
                )
    width = int(x + 8)
    svg = (
        f'<svg xmlns="http://www.w3.org/2000/svg" xmlns:rdkit="http://www.rdkit.org/xml" '
        f'xmlns:xlink="http://www.w3.org/1999/xlink" version="1.1" width="{width}" height="{int(height)}" '
        f'viewBox="0 0 {width} {int(height)}"><title>{escape(report.reaction.text[:200])}</title>'
        + "".join(parts)
        + "</svg>"
    )
    return Scheme(svg, width, int(height), placed, by_products, centre_segments)


def _nest(drawn: Drawn, x: float, y: float) -> str:
    return re.sub(r"^<svg\b", f'<svg x="{x:.1f}" y="{y:.1f}"', drawn.svg, count=1)
