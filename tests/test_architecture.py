"""The core is pure: parsing, perception, rules and stoichiometry import no UI or drawing code."""

import ast
from pathlib import Path

PKG = Path(__file__).resolve().parent.parent / "chemcheck"
UI = ("IPython", "ipywidgets", "py3Dmol", "rdkit.Chem.Draw", "rdkit.Chem.rdDepictor", "matplotlib")
EDGE = {"display", "cli.py", "_cli_commands.py", "__main__.py", "magic.py"}


def _imports(path: Path):
    tree = ast.parse(path.read_text())
    for node in ast.walk(tree):
        if isinstance(node, ast.Import):
            for a in node.names:
                yield a.name
        elif isinstance(node, ast.ImportFrom) and node.module and node.level == 0:
            yield node.module
            for a in node.names:
                yield f"{node.module}.{a.name}"


def test_core_modules_import_no_ui():
    offenders = []
    for path in PKG.rglob("*.py"):
        rel = path.relative_to(PKG)
        if rel.parts[0] in EDGE or "labextension" in rel.parts:
            continue
        for name in _imports(path):
            if name.startswith(UI):
                offenders.append(f"{rel}: {name}")
    assert offenders == []


def test_the_package_never_reads_the_pka_dataset():
    for path in PKG.rglob("*"):
        if path.is_file() and path.suffix in {".py", ".json", ".csv", ".toml"}:
            assert "amine_pka" not in path.read_text(errors="ignore"), path
