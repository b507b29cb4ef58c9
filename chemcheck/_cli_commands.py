"""Subcommands beyond ``check``; each registers itself with :func:`chemcheck.cli.command`."""

from __future__ import annotations

from .cli import command, dumps, printable_lines


@command
def _pka(sub) -> None:
    p = sub.add_parser("pka", help="pKa of each nitrogen's conjugate acid (water, 25 °C)")
    p.add_argument("smiles", help="a molecule as SMILES or a reagent name")
    p.add_argument("--json", action="store_true", help="print the sites as JSON")
    p.set_defaults(func=_run_pka)


def _run_pka(args) -> int:
    from .basicity import basic_sites, first_protonation
    from .reading.reaction import parse_reaction

    rxn = parse_reaction(args.smiles)
    rows = []
    for comp in rxn.components:
        for s in basic_sites(comp.mol):
            rows.append({"component": comp.text, "atom": s.atom_index + 1, "kind": s.kind, "pka": s.pka,
                         "uncertainty": s.uncertainty, "order": s.protonation_order,
                         "stepwise_pka": s.stepwise_pka, "method": s.method, "source": s.source})
    if args.json:
        print(dumps(rows, indent=2))
        return 0
    if not rows:
        print("no nitrogen")
        return 0
    print(f"{'component':18s} {'atom':>4s}  {'kind':20s} {'pKa':>6s} {'±':>4s} {'step':>5s}  method; source (atom numbers from 1)")
    for r in rows:
        pka = "—" if r["pka"] is None else f"{r['pka']:.2f}"
        unc = "" if r["uncertainty"] is None else f"{r['uncertainty']:.1f}"
        step = "" if r["order"] is None else f"{r['order']}:{r['stepwise_pka']:.1f}"
        print(printable_lines(f"{r['component'][:18]:18s} {r['atom']:4d}  {r['kind']:20s} {pka:>6s} {unc:>4s} {step:>5s}  {r['method']}; {r['source']}"))
    for comp in rxn.components:
        site, macro = first_protonation(comp.mol)
        if site is not None:
            print(printable_lines(f"{comp.text}: first proton on atom {site.atom_index + 1} ({site.kind}); pKa1 {macro:.2f}"))
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
        print(dumps(new.to_dict(), indent=2))
        return 0
    print(printable_lines(new.to_text()))
    info = new.extra["scale"]
    print(f"scale factor {info['factor']:.4g}")
    for k, v in new.amounts.items():
        print(printable_lines(f"  {k}: {report.amounts[k]}  ->  {v}"))
    for c in info["cautions"]:
        print(f"  caution: {c}")
    return 0


@command
def _review(sub) -> None:
    p = sub.add_parser(
        "review", help="review the checks recorded in notebooks (for a group's CI)",
        description="Exit status: 0 all clear; 1 an unacknowledged finding at --fail-on level or above "
        "remains; 2 a notebook could not be read (the others are still reviewed and reported).",
    )
    p.add_argument("notebooks", nargs="+", help="notebook files (.ipynb) or folders")
    p.add_argument("--json", action="store_true", help="print the review as JSON")
    p.add_argument("--fail-on", choices=["error", "warning"], default=None,
                   help="exit 1 when an unacknowledged finding at this level or above remains")
    p.add_argument("--no-recheck", action="store_true", help="use the recorded findings, do not re-check")
    p.add_argument("--reviewers", metavar="FILE",
                   help="accept only acknowledgements by the people listed in FILE (one name a line, 'Name <email>' allowed)")
    p.add_argument("--timeout", type=float, default=None, metavar="SECONDS",
                   help="seconds allowed per re-check; a slower one keeps the recorded findings and says so")
    p.add_argument("--verify-git", action="store_true",
                   help="accept only acknowledgements added in a git commit whose author is the named reviewer")
    p.set_defaults(func=_run_review)


def _expand(paths):
    from pathlib import Path

    out = []
    for p in paths:
        path = Path(p)
        if path.is_dir():
            out.extend(sorted(x for x in path.rglob("*.ipynb") if ".ipynb_checkpoints" not in x.parts))
        else:
            out.append(path)
    return out


def _progress(items, label: str):
    """tqdm over ``items`` on stderr, only when stderr is a terminal and there is more than one."""
    import sys

    from tqdm import tqdm

    return tqdm(items, desc=label, unit="notebook", file=sys.stderr, disable=len(items) < 2 or not sys.stderr.isatty())


def _run_review(args) -> int:
    import sys

    from .errors import ChemcheckError
    from .review import NotebookReview, read_reviewers, reviewer_name, review_notebook

    if args.timeout is not None and not args.timeout > 0:
        raise ChemcheckError(f"--timeout must be a positive number of seconds, got {args.timeout:g}")
    files = _expand(args.notebooks)
    level = args.fail_on or "warning"
    reviewers = read_reviewers(args.reviewers) if args.reviewers else None
    results: list[NotebookReview] = []
    for path in _progress(files, "review"):
        try:
            results.append(review_notebook(path, recheck=not args.no_recheck, reviewers=reviewers,
                                           verify_git=args.verify_git, timeout=args.timeout))
        except ChemcheckError as exc:
            results.append(NotebookReview(str(path), [], error=str(exc)))
    unreadable = [nb for nb in results if nb.error]
    failing = sum(len(nb.open_findings(level)) for nb in results) if args.fail_on else 0
    if args.json:
        print(dumps([r.to_dict(level) for r in results], indent=2))
    else:
        out = []
        for nb in results:
            if nb.error:
                out.append(f"{nb.path}: could not be read: {nb.error}")
                continue
            head = f"{nb.path}: {len(nb.reports)} report(s)"
            out.append(head + (" (no recorded checks)" if not nb.reports else ""))
            for r in nb.reports:
                counts = {s: sum(1 for f in r.findings if f["severity"] == s) for s in ("error", "warning", "info")}
                other = len(r.findings) - sum(counts.values())
                acked = sum(1 for f in r.findings if r.acknowledged(f))
                out.append(f"  cell {r.cell + 1}: {r.reaction or '(no reaction recorded)'}")
                out.append(f"    {counts['error']} error(s), {counts['warning']} warning(s), {counts['info']} note(s)"
                           + (f", {other} of unknown severity" if other else "") + f"; {acked} acknowledged")
                if r.recheck_error:
                    out.append(f"    re-check failed: {r.recheck_error}")
                for f in r.new:
                    out.append(f"    new since recorded: [{f['severity']}] {f['rule']}: {f['message']}")
                for f in r.gone:
                    out.append(f"    no longer found: [{f['severity']}] {f['rule']}")
                for a, why in r.rejected:
                    out.append(f"    acknowledgement not accepted ({a.get('rule', a['finding'])}, by '{reviewer_name(a.get('who'))}'): {why}")
                for f in r.open_findings(level):
                    out.append(f"    open {f['severity']}: {f['rule']}: {f['message']}")
        # every recorded string is escaped: a notebook cannot move the cursor or recolour the terminal
        print(printable_lines("\n".join(out)))
    for nb in unreadable:
        print(f"chemcheck: {printable_lines(nb.error)}", file=sys.stderr)
    if args.fail_on and failing:
        print(f"chemcheck review: {failing} unacknowledged finding(s) at {args.fail_on} level or above", file=sys.stderr)
        return 1
    if unreadable:
        print(f"chemcheck review: {len(unreadable)} of {len(results)} notebook(s) could not be read", file=sys.stderr)
        return 2
    return 0


@command
def _batch(sub) -> None:
    p = sub.add_parser(
        "batch", help="check every reaction of a CSV/SMILES file or a folder of notebooks",
        description="Exit status: 0 all rows checked; 1 a finding at --fail-on level or above; 2 some rows "
        "could not be checked (the table is written, with the reason in the 'error' column).",
    )
    p.add_argument("source", help="a .csv (column 'reaction'), a .smi file, or a folder of notebooks")
    p.add_argument("--out", "-o", default="chemcheck-findings.csv", help="output table: .csv, .json or .parquet")
    p.add_argument("--workers", "-j", type=int, default=None, help="processes (default: the CPU count)")
    p.add_argument("--timeout", type=float, default=None, metavar="SECONDS",
                   help="seconds allowed per reaction; a slower one gets an error row (local workers only)")
    p.add_argument("--scheduler", metavar="ADDRESS",
                   help="run on an existing Dask cluster, e.g. tcp://10.0.0.5:8786 (needs chemcheck[dask])")
    p.add_argument("--fail-on", choices=["error", "warning"], help="exit 1 when a finding at this level or above is present")
    p.set_defaults(func=_run_batch)


def _run_batch(args) -> int:
    import sys

    from .batch import check_bag, read_records, run_batch, write_table
    from .errors import ChemcheckError

    if args.timeout is not None and not args.timeout > 0:
        raise ChemcheckError(f"--timeout must be a positive number of seconds, got {args.timeout:g}")
    notes: list[str] = []
    records = list(read_records(args.source, notes))
    for note in notes:
        print(f"chemcheck: note: {printable_lines(note)}", file=sys.stderr)
    if args.scheduler:
        if args.timeout:
            print("chemcheck: note: --timeout is not applied on a Dask cluster (use the cluster's own limits)", file=sys.stderr)
        rows = check_bag(records, npartitions=max(1, min(len(records), 64)), scheduler=args.scheduler, progress=True)
    else:
        rows = run_batch(records, workers=args.workers, timeout=args.timeout)
    out = write_table(rows, args.out)
    n_err = sum(1 for r in rows if r["severity"] == "error")
    n_warn = sum(1 for r in rows if r["severity"] == "warning")
    failed = [r for r in rows if r["error"]]
    print(f"{len(records)} reaction(s): {n_err} error(s), {n_warn} warning(s); {len(failed)} could not be checked; table in {out}")
    for r in failed[:5]:
        print(printable_lines(f"  not checked: {r['source']} {r['item']}: {r['error']}"), file=sys.stderr)
    if len(failed) > 5:
        print(f"  ... and {len(failed) - 5} more (see the 'error' column)", file=sys.stderr)
    if args.fail_on:
        levels = ("error",) if args.fail_on == "error" else ("error", "warning")
        if any(r["severity"] in levels for r in rows):
            print(f"chemcheck batch: findings at {args.fail_on} level or above", file=sys.stderr)
            return 1
    return 2 if failed else 0


from .export import add_export_command  # noqa: E402  (display code owns the export)

command(add_export_command)  # chemcheck export NOTEBOOK
