"""Generate ``docs/rules.md``, the rule catalog, from the rules' own documentation sections.

``python -m chemcheck.docs`` rewrites the file; a test fails when it is out of date or when a
registered rule lacks a section.
"""

from __future__ import annotations

import sys
import textwrap
from pathlib import Path

from .rules import DOC_SECTIONS, registry

HEADER = """# Rule catalog

Generated from the rules themselves by `python -m chemcheck.docs`; edit the rule's docstring,
not this file. Severity is the default; a rule may lower or raise it for one finding (and says
so in the message).

"""


def missing_sections() -> dict[str, list[str]]:
    out = {}
    for rid, r in registry().items():
        docs = r.docs
        lacking = [s for s in DOC_SECTIONS if not docs.get(s)]
        if lacking:
            out[rid] = lacking
    return out


def render() -> str:
    parts = [HEADER]
    rules = sorted(registry().values(), key=lambda r: (r.family, r.id))
    parts.append("| id | severity | family | title |\n|---|---|---|---|\n")
    for r in rules:
        parts.append(f"| [`{r.id}`](#{r.id}) | {r.severity} | {r.family} | {r.title} |\n")
    for r in rules:
        parts.append(f"\n## {r.id}\n\n**{r.title}** — default severity: {r.severity}.\n")
        if r.applies_to:
            fams = ", ".join(f"`{f}`" for f in r.applies_to)
            parts.append(
                f"\nReads the reaction's understanding: with products drawn, it applies to the class families {fams} "
                "(see [understanding.md](understanding.md)); with no product drawn it reads the components.\n"
            )
        docs = r.docs
        for section in DOC_SECTIONS:
            body = textwrap.dedent(docs.get(section, "")).strip()
            if section == "References":
                lines = [ln.strip() for ln in body.splitlines() if ln.strip()]
                body = "\n".join(f"- {ln.lstrip('-* ')}" for ln in lines)
            parts.append(f"\n### {section}\n\n{body}\n")
    return "".join(parts)


def target() -> Path:
    return Path(__file__).resolve().parent.parent / "docs" / "rules.md"


if __name__ == "__main__":
    path = Path(sys.argv[1]) if len(sys.argv) > 1 else target()
    lacking = missing_sections()
    if lacking:
        for rid, secs in lacking.items():
            print(f"rule {rid} lacks: {', '.join(secs)}", file=sys.stderr)
        sys.exit(1)
    path.write_text(render())
    print(f"wrote {path}")
