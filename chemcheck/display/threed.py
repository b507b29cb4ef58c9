"""3D views of components: ETKDG embedding with a force-field clean-up, bounded in time.

The view is a MIME bundle: ``application/vnd.chemcheck.mol3d+json`` (a molfile with hydrogens
and the atoms to highlight), drawn by the extension with 3Dmol.js served from the
labextension's own static folder (no CDN), beside a 2D SVG and text that stand in wherever 3D
cannot run.
"""

from __future__ import annotations

from dataclasses import dataclass

from rdkit import Chem
from rdkit.Chem import AllChem, rdDistGeom

from .. import _rdlog
from ..errors import ChemcheckError
from .draw import SEVERITY_RGBA, draw_component

MOL3D_MIME = "application/vnd.chemcheck.mol3d+json"
EMBED_TIMEOUT_S = 5
MAX_EMBED_ATOMS = 300

__all__ = ["HIGHLIGHT_3D", "MOL3D_MIME", "View3D", "embed_3d", "view3d"]

# Halo colours of the 3D view, chosen far from every element colour 3Dmol.js draws (its Jmol,
# RasMol and default tables): deep pink and electric violet are at least 67 RGB units from the
# nearest (tests/test_display.py measures it). Notes are not highlighted in 3D.
HIGHLIGHT_3D = {"error": "#ff1493", "warning": "#5500ff"}


def embed_3d(mol: Chem.Mol, *, seed: int = 0xC0FFEE, timeout_s: int = EMBED_TIMEOUT_S) -> Chem.Mol | None:
    """A 3D conformer with explicit hydrogens, or None when embedding fails or times out."""
    if mol.GetNumHeavyAtoms() > MAX_EMBED_ATOMS:
        return None
    with _rdlog.captured():
        work = Chem.AddHs(Chem.Mol(mol))
        params = rdDistGeom.ETKDGv3()
        params.randomSeed = seed
        params.timeout = timeout_s
        params.maxIterations = 200
        if rdDistGeom.EmbedMolecule(work, params) != 0:
            params.useRandomCoords = True
            if rdDistGeom.EmbedMolecule(work, params) != 0:
                return None
        try:
            if AllChem.MMFFHasAllMoleculeParams(work):
                AllChem.MMFFOptimizeMolecule(work, maxIters=500)
            else:
                AllChem.UFFOptimizeMolecule(work, maxIters=500)
        except (RuntimeError, ValueError):
            pass
    return work


@dataclass
class View3D:
    label: str
    molblock: str | None
    highlights: list[dict]
    svg: str

    def payload(self) -> dict:
        return {"label": self.label, "molblock": self.molblock, "highlights": self.highlights}

    def _repr_mimebundle_(self, include=None, exclude=None):
        text = f"3D view of {self.label}" + ("" if self.molblock else " (3D embedding failed: 2D drawing shown)")
        bundle = {"text/plain": text, "image/svg+xml": self.svg}
        if self.molblock:
            bundle[MOL3D_MIME] = self.payload()
        return bundle


def view3d(report_or_smiles, component: int | str = 0) -> View3D:
    """A 3D view of one component of a report (by index or text), flagged atoms highlighted."""
    from ..engine import check
    from ..report import Report

    report = report_or_smiles if isinstance(report_or_smiles, Report) else check(report_or_smiles)
    comps = report.components
    if isinstance(component, str):
        comp = report.reaction.find(component)
        if comp is None:
            raise ChemcheckError(f"no component written '{component}'")
    else:
        if not 0 <= component < len(comps):
            raise ChemcheckError(f"component {component} out of range (0-{len(comps) - 1})")
        comp = comps[component]
    colours: dict[int, tuple] = {}
    severity: dict[int, str] = {}
    order = {"info": 0, "warning": 1, "error": 2}
    for f in sorted(report.findings, key=lambda f: order[f.severity]):
        for ci, ai in f.atoms:
            if ci == comp.index:
                colours[ai] = SEVERITY_RGBA[f.severity]
                severity[ai] = f.severity
    mol3d = embed_3d(comp.mol) if comp.sanitization == "full" else None
    highlights = [
        {"atom": ai, "color": HIGHLIGHT_3D[sev], "severity": sev} for ai, sev in severity.items() if sev in HIGHLIGHT_3D
    ]
    svg = draw_component(comp.mol, colours).svg
    block = Chem.MolToMolBlock(mol3d) if mol3d is not None else None
    return View3D(comp.label, block, highlights, svg)
