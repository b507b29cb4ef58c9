"""Atom mapping measured on real patent reactions (tests and benchmarks only).

The development set (``../shared/data/reactions/``: N. Schneider, N. Stiefl, G. A. Landrum,
J. Chem. Inf. Model. 2016, 56, 2336, built on D. M. Lowe's US patent extraction, CC0) carries
the source's atom maps. For every row, the reaction centre -- the set of bonds formed and
broken, each an element pair located on symmetry classes of product atoms (formed) or
reactant atoms (broken) -- is read from the source's maps and from a route's maps with the
same code (:func:`chemcheck.understand.reaction_centre`); the row agrees when the two sets are
equal. Rows ``A*`` (curated maps) and ``B*`` (automatic maps) are reported separately, and
rows ``A*`` per reaction class.

Routes measured inside chemcheck (run with the project's Python):

    python benchmarks/mapping_accuracy.py --route product   # map_reaction as shipped (cold cache)
    python benchmarks/mapping_accuracy.py --route noquick   # as shipped, without the quick route first
    python benchmarks/mapping_accuracy.py --route indigo    # the mapper alone, no fallback
    python benchmarks/mapping_accuracy.py --route indigo1   # the same, one reading of the atoms
    python benchmarks/mapping_accuracy.py --route mcs       # the common-substructure route

Other mappers are run in their own environment (needs only RDKit and the mapper), which writes
mapped reaction SMILES and the time per reaction; the file is then scored like the others:

    /path/to/venv/bin/python benchmarks/mapping_accuracy.py --emit rxnmapper --out m.csv
    python benchmarks/mapping_accuracy.py --route file:m.csv

``--limit N`` takes every k-th row to make N; ``--json PATH`` writes the figures.
"""

from __future__ import annotations

import argparse
import csv
import json
import statistics
import sys
import time
from collections import defaultdict
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
DATA = ROOT.parent / "shared" / "data" / "reactions"
MAPPED = DATA / "patent_reactions_dev_mapped.csv"
PLAIN = DATA / "patent_reactions_dev.csv"


def load(limit: int | None = None, b_limit: int | None = None) -> list[dict]:
    if not MAPPED.exists() or not PLAIN.exists():
        sys.exit(f"dataset not found: {DATA} (tests and benchmarks only; see its README)")
    with MAPPED.open() as fh:
        mapped = {r["id"]: r for r in csv.DictReader(fh)}
    rows = []
    with PLAIN.open() as fh:
        for r in csv.DictReader(fh):
            m = mapped.get(r["id"])
            if m is None:
                continue
            rows.append({**r, "mapped_reaction_smiles": m["mapped_reaction_smiles"]})
    if limit and limit < len(rows):
        rows = _spread(rows, limit)
    if b_limit is not None:
        a_rows = [r for r in rows if r["id"].startswith("A")]
        b_rows = [r for r in rows if r["id"].startswith("B")]
        rows = a_rows + _spread(b_rows, b_limit)
    return rows


def _spread(rows: list, n: int) -> list:
    """Every k-th row, to make n."""
    if n <= 0:
        return []
    if n >= len(rows):
        return rows
    step = len(rows) / n
    return [rows[int(i * step)] for i in range(n)]


# ------------------------------------------------------------------ emitters (other venvs)


def _emit_rxnmapper(rows, out):
    from rxnmapper import RXNMapper

    t0 = time.perf_counter()
    mapper = RXNMapper()
    print(f"model load {time.perf_counter() - t0:.1f} s", file=sys.stderr)
    for r in rows:
        lhs, agents, rhs = r["reaction_smiles"].split(">")
        left = ".".join(x for x in (lhs, agents) if x)
        t, c = time.perf_counter(), time.process_time()
        try:
            res = mapper.get_attention_guided_atom_maps([f"{left}>>{rhs}"], canonicalize_rxns=False)
            text = res[0]["mapped_rxn"]
        except Exception as exc:  # too long for the model, unreadable
            text = ""
            print(r["id"], type(exc).__name__, file=sys.stderr)
        out.writerow([r["id"], text, *_ms(t, c)])


def _emit_chython(rows, out):
    from chython import smiles

    t0 = time.perf_counter()
    smiles("CC(=O)Cl.NC>>CC(=O)NC").attention_mapping()  # loads the model once
    print(f"model load {time.perf_counter() - t0:.1f} s", file=sys.stderr)

    for r in rows:
        lhs, agents, rhs = r["reaction_smiles"].split(">")
        left = ".".join(x for x in (lhs, agents) if x)
        t, c = time.perf_counter(), time.process_time()
        try:
            rxn = smiles(f"{left}>>{rhs}")
            res = rxn.attention_mapping()
            text = format(rxn, "m") if res.changed else ""
        except Exception as exc:
            text = ""
            print(r["id"], type(exc).__name__, str(exc)[:80], file=sys.stderr)
        out.writerow([r["id"], text, *_ms(t, c)])


def _emit_indigo(rows, out):
    from indigo import Indigo

    ind = Indigo()
    ind.setOption("aam-timeout", 2000)
    for r in rows:
        lhs, agents, rhs = r["reaction_smiles"].split(">")
        t, c = time.perf_counter(), time.process_time()
        try:
            rx = ind.loadReaction(f"{lhs}>>{rhs}")
            rx.automap("discard")
            text = rx.smiles()
        except Exception as exc:
            text = ""
            print(r["id"], type(exc).__name__, file=sys.stderr)
        out.writerow([r["id"], text, *_ms(t, c)])


def _ms(t: float, c: float) -> list[str]:
    """Wall-clock and CPU milliseconds since (t, c): on a shared machine the CPU time is the
    figure that does not depend on the neighbours' load."""
    return [f"{(time.perf_counter() - t) * 1000:.2f}", f"{(time.process_time() - c) * 1000:.2f}"]


EMITTERS = {"rxnmapper": _emit_rxnmapper, "chython": _emit_chython, "indigo": _emit_indigo}


# ------------------------------------------------------------------ scoring (chemcheck)


def _atom_keys(rxn):
    """(component, atom) -> (canonical SMILES of the component, symmetry class of the atom)."""
    from rdkit import Chem

    keys = {}
    for c in rxn.components:
        bare = Chem.Mol(c.mol)
        for a in bare.GetAtoms():
            a.SetAtomMapNum(0)
        try:
            smi = Chem.MolToSmiles(bare)
            ranks = list(Chem.CanonicalRankAtoms(bare, breakTies=False))
        except RuntimeError:
            continue
        for i, rank in enumerate(ranks):
            keys[(c.index, i)] = (smi, rank)
    return keys


def mapped_locations(rxn, amap) -> set:
    """Locations of the atoms a map covers, on both sides."""
    keys = _atom_keys(rxn)
    out = set()
    for p, o in amap.pairs:
        out.add(keys.get(p))
        out.add(keys.get(o))
    out.discard(None)
    return out


def centre_key(rxn, amap, within: set | None = None) -> frozenset:
    """Bonds formed and broken, each as (kind, elements, the two atoms' locations); with
    ``within``, only bonds whose two atoms lie in those locations."""
    from chemcheck.understand import reaction_centre

    centre = reaction_centre(rxn, amap)
    keys = _atom_keys(rxn)
    out = set()
    for ch in centre.changes:
        if ch.kind == "formed":
            pair = ch.atoms_after
        elif ch.kind == "broken":
            pair = ch.atoms_before
        else:
            continue
        loc = frozenset(keys.get(a) for a in pair)
        if within is not None and not loc <= within:
            continue
        out.add((ch.kind, ch.elements, loc))
    return frozenset(out)


def _route_map(route: str, rxn, timeout_s: float):
    from chemcheck.understand import mapping

    if route == "product":
        return mapping.map_reaction(rxn, timeout_s=timeout_s)
    if route == "noquick":  # as shipped, without the quick common-substructure route first
        mapping.QUICK = False
        try:
            return mapping.map_reaction(rxn, timeout_s=timeout_s)
        finally:
            mapping.QUICK = True
    if route in ("indigo", "indigo1"):
        try:
            pairs = mapping._indigo_map(rxn, timeout_s, variants=1 if route == "indigo1" else mapping.VARIANTS)
        except (mapping.MapperFailed, mapping.MapperUnavailable):
            pairs = []
        return mapping._result(rxn, "indigo", pairs, None)
    if route == "mcs":
        return mapping._result(rxn, "mcs", mapping._mcs_pairs(rxn), None)
    raise SystemExit(f"unknown route {route}")


def score(rows, route: str, timeout_s: float = 0.5, show_misses: int = 0) -> dict:
    from chemcheck.errors import ChemcheckError
    from chemcheck.reading.reaction import parse_reaction
    from chemcheck.understand import map_reaction
    from chemcheck.understand.mapping import clear_cache

    external = {}
    if route.startswith("file:"):
        with open(route[5:]) as fh:
            for rid, text, ms, *cpu in csv.reader(fh):
                external[rid] = (text, float(ms), float(cpu[0]) if cpu else float("nan"))
    groups: dict[str, list[bool]] = defaultdict(list)
    coverage: list[float] = []
    cost_ms: list[float] = []
    cpu_ms: list[float] = []
    sources: dict[str, int] = defaultdict(int)
    misses = []
    skipped = 0
    if external:
        rows = [r for r in rows if r["id"] in external]  # the rows the other environment mapped
    for r in rows:
        try:
            ref_rxn = parse_reaction(r["mapped_reaction_smiles"])
            ref_map = map_reaction(ref_rxn)
            # a source map that leaves product atoms open is compared on its mapped atoms only
            within = mapped_locations(ref_rxn, ref_map) if ref_map.coverage < 0.999 else None
            ref = centre_key(ref_rxn, ref_map, within)
        except ChemcheckError:
            skipped += 1
            continue
        if route.startswith("file:"):
            text, ms, cpu = external[r["id"]]
            try:
                rxn = parse_reaction(text) if text else None
            except ChemcheckError:
                rxn = None
            if rxn is None or not rxn.mapped:
                got, cov = frozenset(), 0.0
                sources["failed"] += 1
            else:
                amap = map_reaction(rxn)
                got, cov = centre_key(rxn, amap, within), amap.coverage
                sources["given"] += 1
        else:
            try:
                rxn = parse_reaction(r["reaction_smiles"])
            except ChemcheckError:
                skipped += 1
                continue
            clear_cache()
            rxn.__dict__.pop("_correspondence", None)
            t, c = time.perf_counter(), time.process_time()
            amap = _route_map(route, rxn, timeout_s)
            ms, cpu = (time.perf_counter() - t) * 1000, (time.process_time() - c) * 1000
            got, cov = centre_key(rxn, amap, within), amap.coverage
            sources[amap.source] += 1
        ok = got == ref
        part = r["id"][0]
        groups[part].append(ok)
        if ref_map.coverage >= 0.999:  # the source maps every product heavy atom
            groups[f"{part} complete"].append(ok)
        if part == "A":
            groups[f"A class {r['reaction_class']}"].append(ok)
        coverage.append(cov)
        cost_ms.append(ms)
        cpu_ms.append(cpu)
        if not ok and len(misses) < show_misses:
            misses.append((r["id"], sorted(map(str, ref - got)), sorted(map(str, got - ref))))
    cost_sorted = sorted(cost_ms)
    cpu_sorted = sorted(x for x in cpu_ms if x == x)
    res = {
        "route": route,
        "rows": len(coverage),
        "skipped": skipped,
        "agreement": {k: (sum(v) / len(v), len(v)) for k, v in sorted(groups.items(), key=_class_order)},
        "coverage_mean": statistics.fmean(coverage) if coverage else 0.0,
        "coverage_full": sum(1 for c in coverage if c >= 0.999) / len(coverage) if coverage else 0.0,
        "ms_median": statistics.median(cost_ms) if cost_ms else 0.0,
        "ms_p95": cost_sorted[int(0.95 * (len(cost_sorted) - 1))] if cost_sorted else 0.0,
        "cpu_ms_median": statistics.median(cpu_sorted) if cpu_sorted else None,
        "cpu_ms_p95": cpu_sorted[int(0.95 * (len(cpu_sorted) - 1))] if cpu_sorted else None,
        "sources": dict(sources),
        "misses": misses,
    }
    return res


def _class_order(item):
    k = item[0]
    if k.startswith("A class "):
        return (1, int(k.split()[-1]))
    return (0, k)


def report(res: dict) -> str:
    lines = [f"route {res['route']}: {res['rows']} rows ({res['skipped']} unreadable skipped)"]
    for k, (frac, n) in res["agreement"].items():
        lines.append(f"  {k:<12} centre agreement {frac * 100:5.1f} %  (n={n})")
    lines.append(
        f"  coverage mean {res['coverage_mean'] * 100:.1f} %, full on {res['coverage_full'] * 100:.1f} % of rows"
    )
    lines.append(f"  wall time per reaction: median {res['ms_median']:.1f} ms, p95 {res['ms_p95']:.1f} ms")
    if res["cpu_ms_median"] is not None:
        lines.append(
            f"  CPU time per reaction: median {res['cpu_ms_median']:.1f} ms, p95 {res['cpu_ms_p95']:.1f} ms"
        )
    lines.append(f"  sources {res['sources']}")
    for rid, missing, extra in res["misses"]:
        lines.append(f"  miss {rid}: source only {missing}; route only {extra}")
    return "\n".join(lines)


def main(argv=None) -> int:
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--route", default="product")
    ap.add_argument("--emit", choices=sorted(EMITTERS))
    ap.add_argument("--out")
    ap.add_argument("--limit", type=int)
    ap.add_argument("--b-limit", type=int, help="all A rows, and this many B rows spread evenly")
    ap.add_argument("--timeout", type=float, default=0.5)
    ap.add_argument("--misses", type=int, default=0)
    ap.add_argument("--json")
    args = ap.parse_args(argv)
    rows = load(args.limit, args.b_limit)
    if args.emit:
        with open(args.out or f"mapped_{args.emit}.csv", "w", newline="") as fh:
            EMITTERS[args.emit](rows, csv.writer(fh))
        return 0
    sys.path.insert(0, str(ROOT))
    res = score(rows, args.route, args.timeout, args.misses)
    print(report(res))
    if args.json:
        Path(args.json).write_text(json.dumps(res, indent=2))
    return 0


if __name__ == "__main__":
    sys.exit(main())
