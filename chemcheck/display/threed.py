"""3D views of components: ETKDG embedding with a force-field clean-up, bounded in time.

Embedding runs in a worker process with a deadline (ETKDG can run for minutes on odd
structures, and RDKit cannot be interrupted from Python): past it, or when embedding fails, the
2D drawing stands in with a note saying why.

The view is a MIME bundle: ``application/vnd.chemcheck.mol3d+json`` (a molfile with hydrogens
and the atoms to highlight), drawn by the extension with 3Dmol.js served from the
labextension's own static folder (no CDN), beside a 2D SVG and text that stand in wherever 3D
cannot run.
"""

from __future__ import annotations

import multiprocessing
import os
import sys
from dataclasses import dataclass

from rdkit import Chem
from rdkit.Chem import AllChem, rdDistGeom

from .. import _rdlog
from ..errors import ChemcheckError
from .draw import SEVERITY_RGBA, draw_component

MOL3D_MIME = "application/vnd.chemcheck.mol3d+json"
EMBED_TIMEOUT_S = 3  # ETKDG's own timeout, per attempt
MAX_EMBED_ATOMS = 300
# Wall-clock deadline of the embedding worker: the view answers within about 5 s (check, 2D
# drawing, embedding), whatever the embedding does; past it the worker is stopped and the 2D
# drawing stands in, with a note.
EMBED_DEADLINE_S = 4.0

__all__ = ["HIGHLIGHT_3D", "MOL3D_MIME", "View3D", "embed_3d", "embed_in_worker", "view3d"]

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


def _worker(conn, molblock: str, timeout_s: int) -> None:
    """In the worker process: embed and send back a molfile, or an error text."""
    try:
        with _rdlog.captured():
            mol = Chem.MolFromMolBlock(molblock, removeHs=False, sanitize=True)
        if mol is None:
            conn.send(("error", "the structure could not be read back"))
            return
        work = embed_3d(mol, timeout_s=timeout_s)
        conn.send(("ok", Chem.MolToMolBlock(work)) if work is not None else ("error", "no 3D conformer was found"))
    except Exception as exc:  # reported to the parent as a note, never a traceback
        conn.send(("error", f"embedding failed ({type(exc).__name__})"))
    finally:
        conn.close()


def _context():
    # fork starts in milliseconds with RDKit already loaded; where it is unavailable (Windows)
    # or unsafe by default (macOS), spawn
    if sys.platform.startswith("linux") and "fork" in multiprocessing.get_all_start_methods():
        return multiprocessing.get_context("fork")
    return multiprocessing.get_context("spawn")


def embed_in_worker(mol: Chem.Mol, *, deadline_s: float | None = None) -> tuple[Chem.Mol | None, str | None]:
    """A 3D conformer computed in a worker process stopped at the deadline: (molecule, None),
    or (None, why) when embedding failed, was refused or ran out of time."""
    deadline = EMBED_DEADLINE_S if deadline_s is None else deadline_s
    if mol.GetNumHeavyAtoms() > MAX_EMBED_ATOMS:
        return None, f"{mol.GetNumHeavyAtoms()} heavy atoms, above the 3D limit of {MAX_EMBED_ATOMS}"
    if any(a.GetAtomicNum() == 0 for a in mol.GetAtoms()):
        return None, "a dummy atom (*) has no 3D geometry"
    with _rdlog.captured():
        block = Chem.MolToMolBlock(mol)
    ctx = _context()
    parent, child = ctx.Pipe(duplex=False)
    proc = ctx.Process(target=_worker, args=(child, block, EMBED_TIMEOUT_S), daemon=True)
    try:
        proc.start()
    except OSError:
        return None, "no worker process could be started for the embedding"
    child.close()
    try:
        got = parent.recv() if parent.poll(max(deadline, 0.0)) else None
    except (EOFError, OSError):
        got = ("error", "the embedding worker stopped")
    finally:
        if proc.is_alive():
            proc.terminate()
        proc.join(1.0)
        if proc.is_alive() and hasattr(proc, "kill"):
            proc.kill()
            proc.join(1.0)
        parent.close()
    if got is None:
        return None, f"3D embedding did not finish within {deadline:g} s"
    status, payload = got
    if status != "ok":
        return None, payload
    with _rdlog.captured():
        out = Chem.MolFromMolBlock(payload, removeHs=False)
    return (out, None) if out is not None else (None, "the embedded structure could not be read back")


@dataclass
class View3D:
    label: str
    molblock: str | None
    highlights: list[dict]
    svg: str
    note: str | None = None  # why the 2D drawing stands in

    def payload(self) -> dict:
        return {"label": self.label, "molblock": self.molblock, "highlights": self.highlights}

    def _repr_mimebundle_(self, include=None, exclude=None):
        why = f": {self.note}" if self.note else ""
        text = f"3D view of {self.label}" + ("" if self.molblock else f" (3D embedding failed{why}; 2D drawing shown)")
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
    if comp.sanitization == "full":
        mol3d, note = embed_in_worker(comp.mol)
    else:
        mol3d, note = None, "the structure was read without valence checks"
    highlights = [
        {"atom": ai, "color": HIGHLIGHT_3D[sev], "severity": sev} for ai, sev in severity.items() if sev in HIGHLIGHT_3D
    ]
    svg = draw_component(comp.mol, colours).svg
    block = Chem.MolToMolBlock(mol3d) if mol3d is not None else None
    return View3D(comp.label, block, highlights, svg, note)
