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


def _amount_args(p) -> None:
    p.add_argument("reaction")
    p.add_argument("--amount", "-a", action="append", default=[], metavar="KEY=VALUE",
                   help="amount of a component as written, e.g. 'CCN=1.2 mmol' (repeat for each)")


@command
def _scale(sub) -> None:
    p = sub.add_parser("scale", help="scale a reaction: amounts, vessel fill and a thermal screen")
    _amount_args(p)
    g = p.add_mutually_exclusive_group(required=True)
    g.add_argument("--factor", type=float, help="multiply every amount by this factor")
    g.add_argument("--target-mmol", type=float, help="mmol of the limiting reagent wanted")
    g.add_argument("--target-product-g", type=float, help="theoretical product mass wanted (g)")
    p.add_argument("--vessel-ml", type=float, help="volume of the vessel (mL), to check the fill")
    p.add_argument("--start-c", type=float, default=20.0, help="starting temperature (°C), default 20")
    p.add_argument("--dh-kj-mol", type=float, help="reaction enthalpy per mol of limiting reagent (kJ/mol), if known")
    p.add_argument("--json", action="store_true")
    p.set_defaults(func=_run_scale)


def _run_scale(args) -> int:
    from . import check
    from .cli import _amounts
    from .scale import scale

    amounts = _amounts(args.amount)
    if not amounts:
        from .errors import ChemcheckError

        raise ChemcheckError("scale needs the amounts: --amount 'KEY=VALUE' for each component")
    report = check(args.reaction, amounts)
    new = scale(report, args.factor, target_mmol=args.target_mmol, target_product_g=args.target_product_g,
                vessel_ml=args.vessel_ml, start_c=args.start_c, dh_kj_mol=args.dh_kj_mol)
    if args.json:
        print(json.dumps(new.to_dict(), indent=2))
        return 0
    print(new.to_text())
    info = new.extra["scale"]
    print(f"scale factor {info['factor']:.4g}")
    for k, v in new.amounts.items():
        print(f"  {k}: {report.amounts[k]}  ->  {v}")
    for c in info["cautions"]:
        print(f"  caution: {c}")
    return 0
