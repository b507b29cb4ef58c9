"""Subcommands beyond ``check``; each registers itself with :func:`chemcheck.cli.command`."""

from __future__ import annotations

import json

from .cli import command


@command
def _pka(sub) -> None:
    p = sub.add_parser("pka", help="pKa of each nitrogen's conjugate acid (water, 25 °C)")
    p.add_argument("smiles", help="a molecule as SMILES or a reagent name")
    p.add_argument("--json", action="store_true", help="print the sites as JSON")
    p.set_defaults(func=_run_pka)


def _run_pka(args) -> int:
    from .basicity import basic_sites, first_protonation
    from .reaction import parse_reaction

    rxn = parse_reaction(args.smiles)
    rows = []
    for comp in rxn.components:
        for s in basic_sites(comp.mol):
            rows.append({"component": comp.text, "atom": s.atom_index + 1, "kind": s.kind, "pka": s.pka,
                         "uncertainty": s.uncertainty, "order": s.protonation_order,
                         "stepwise_pka": s.stepwise_pka, "method": s.method, "source": s.source})
    if args.json:
        print(json.dumps(rows, indent=2))
        return 0
    if not rows:
        print("no nitrogen")
        return 0
    print(f"{'component':18s} {'atom':>4s}  {'kind':20s} {'pKa':>6s} {'±':>4s} {'step':>5s}  method; source")
    for r in rows:
        pka = "—" if r["pka"] is None else f"{r['pka']:.2f}"
        unc = "" if r["uncertainty"] is None else f"{r['uncertainty']:.1f}"
        step = "" if r["order"] is None else f"{r['order']}:{r['stepwise_pka']:.1f}"
        print(f"{r['component'][:18]:18s} {r['atom']:4d}  {r['kind']:20s} {pka:>6s} {unc:>4s} {step:>5s}  {r['method']}; {r['source']}")
    for comp in rxn.components:
        site, macro = first_protonation(comp.mol)
        if site is not None:
            print(f"{comp.text}: first proton on atom {site.atom_index + 1} ({site.kind}); pKa1 {macro:.2f}")
    return 0
