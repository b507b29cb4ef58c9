"""Generate the TypeScript types of the payload from the JSON Schema.

``python -m chemcheck._schema_ts`` rewrites ``extension/src/payload.ts``; a test fails when the
committed file differs from what the schema gives, so the two sides cannot drift apart.
"""

from __future__ import annotations

import json
import sys
from pathlib import Path

from .report import schema

HEADER = (
    "// Generated from chemcheck/schema/report.schema.json by `python -m chemcheck._schema_ts`.\n"
    "// Do not edit by hand: change the schema and regenerate.\n\n"
)

_PRIM = {"string": "string", "integer": "number", "number": "number", "boolean": "boolean", "null": "null"}


def _ts(node: dict) -> str:
    if "$ref" in node:
        return node["$ref"].rsplit("/", 1)[-1]
    if "const" in node:
        return json.dumps(node["const"])
    if "enum" in node:
        return " | ".join(json.dumps(v) for v in node["enum"])
    if "anyOf" in node:
        return " | ".join(_ts(n) for n in node["anyOf"])
    t = node.get("type")
    if isinstance(t, list):
        return " | ".join(_ts({**node, "type": x}) for x in t)
    if t == "array":
        items = node.get("items", {})
        inner = _ts(items)
        if node.get("minItems") == 2 and node.get("maxItems") == 2:
            return f"[{inner}, {inner}]"
        return f"Array<{inner}>"
    if t == "object":
        if "properties" in node:
            return _interface_body(node)
        extra = node.get("additionalProperties")
        return f"Record<string, {_ts(extra) if isinstance(extra, dict) else 'unknown'}>"
    if t in _PRIM:
        return _PRIM[t]
    return "unknown"


def _interface_body(node: dict, indent: str = "  ") -> str:
    required = set(node.get("required", []))
    lines = ["{"]
    for name, prop in node["properties"].items():
        opt = "" if name in required else "?"
        if "description" in prop:
            lines.append(f"{indent}/** {prop['description']} */")
        lines.append(f"{indent}{name}{opt}: {_ts(prop)};")
    lines.append("}")
    return "\n".join(lines)


_NOT_FOR_VALIDATION = ("description", "title", "$id", "$schema", "$comment", "examples")


def _for_validation(node):
    """The schema without its prose: what extension/src/validate.ts checks payloads against."""
    if isinstance(node, dict):
        return {
            k: _for_validation(v) if k not in ("properties", "$defs")
            else {name: _for_validation(sub) for name, sub in v.items()}
            for k, v in node.items()
            if k not in _NOT_FOR_VALIDATION
        }
    if isinstance(node, list):
        return [_for_validation(x) for x in node]
    return node


def generate() -> str:
    s = schema()
    out = [HEADER]
    out.append(f"export const SCHEMA_VERSION = {json.dumps(s['properties']['version']['const'])};\n\n")
    out.append(f"/** {s['description']} */\n")
    out.append(f"export interface {s['title']} {_interface_body(s)}\n")
    for name, node in s["$defs"].items():
        out.append("\n")
        if node.get("type") == "object" and "properties" in node:
            out.append(f"export interface {name} {_interface_body(node)}\n")
        else:
            out.append(f"export type {name} = {_ts(node)};\n")
    out.append(
        "\n/** The schema itself, without its prose, for the runtime check in validate.ts. */\n"
        f"export const REPORT_SCHEMA: unknown = {json.dumps(_for_validation(s), separators=(',', ':'), sort_keys=False)};\n"
    )
    return "".join(out)


def target() -> Path:
    return Path(__file__).resolve().parent.parent / "extension" / "src" / "payload.ts"


if __name__ == "__main__":
    path = Path(sys.argv[1]) if len(sys.argv) > 1 else target()
    path.write_text(generate())
    print(f"wrote {path}")
