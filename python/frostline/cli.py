"""The ``frostline`` command line.

    frostline sample hexagon 40 40 40 --q 0.95 --seed 7 --picture hexagon.png --output hexagon.npz
    frostline sample path "4e 3ne 5nw 4w 3sw 5se" --picture region.svg
    frostline sample trapezoid 10 6 --notches 0 2 3 7 11 15
    frostline count path --file outline.txt
    frostline show hexagon.npz --picture again.pdf
    frostline demo

Ctrl-C stops a run cleanly (exit status 130) at the next check of the engine,
about every 10^8 site updates; nothing is written for an unfinished sample.
"""
from __future__ import annotations

import argparse
import sys
import time
import warnings
from pathlib import Path
from typing import Any, Dict, Optional, Sequence, Tuple

from ._version import __version__
from .errors import FrostlineWarning

EXAMPLES = """examples:
  frostline sample hexagon 40 40 40 --seed 1 --picture hexagon.png
  frostline sample hexagon 30 30 30 --q 0.93 --output weighted.npz
  frostline sample path "2(3e 2ne) 4nw 6w 4sw 4se" --picture staircase.pdf
  frostline sample trapezoid 12 6 --picture trapezoid.png
  frostline sample aztec 100 --picture aztec.png
  frostline sample aztec 60 --two-periodic 1 0.5 --method shuffling
  frostline sample square_ice 80 --picture ice.png --view vertices
  frostline sample square_ice 40 --weights 1 1 1.414 --picture matrix.pdf --view matrix
  frostline count hexagon 6 6 6
  frostline density aztec 30 --picture aztec-densities.png
  frostline compare --sizes 30 60 100 --prefix comparison
  frostline show weighted.npz --picture weighted.svg
  frostline demo --folder pictures

boundary paths: unit steps e, ne, nw, w, sw, se with counts, groups in
parentheses; the path must close without touching itself."""


#: options every shape gets from the command line itself; a lattice may not declare them
RESERVED_OPTIONS = ("--seed", "--method", "--picture", "--output", "--force", "--no-limits", "--size", "--store",
                    "--workers", "--scheduler", "--tile-counts", "--reducer", "--statistics", "-h", "--help")


def _shape_table() -> Dict[str, Tuple[str, Any]]:
    """Every CLI shape of every registered lattice: name -> (lattice, Shape).

    Read from the lattices' declarations, so an outside plugin's shapes appear
    here with no change to frostline. A shape name taken by two lattices keeps
    the first (by lattice name) and the other is skipped with a warning.
    """
    from .registry import specs

    table: Dict[str, Tuple[str, Any]] = {}
    for spec in specs():
        for shape in spec.shapes:
            clash = [a.flag for a in shape.arguments if a.flag in RESERVED_OPTIONS]
            if clash:
                warnings.warn(f"the shape {shape.name!r} of lattice {spec.name!r} declares {', '.join(clash)}, which "
                              "the command line reserves; skipped", FrostlineWarning, stacklevel=2)
                continue
            if shape.name in table:
                warnings.warn(f"the shape {shape.name!r} of lattice {spec.name!r} is already taken by lattice "
                              f"{table[shape.name][0]!r}; skipped", FrostlineWarning, stacklevel=2)
                continue
            table[shape.name] = (spec.name, shape)
    return table


def _add_ensemble_options(p: argparse.ArgumentParser) -> None:
    p.add_argument("--size", type=int, required=True, help="number of members")
    p.add_argument("--seed", type=int, required=True, help="non-negative int; member i comes from child i")
    p.add_argument("--store", type=Path, default=None,
                   help="zarr store to write members to; running the same command again resumes it")
    p.add_argument("--workers", type=int, default=None, help="local worker threads (default: all cores)")
    p.add_argument("--scheduler", default=None, help="address of a Dask scheduler (tcp://host:port) to run on")
    p.add_argument("--tile-counts", type=float, default=None, metavar="BIN",
                   help="also count the tiles of each class on a grid of square bins of this side (plane units)")
    p.add_argument("--reducer", action="append", default=[], metavar="NAME=MODULE:FUNCTION",
                   help="also sum FUNCTION(sample) (an integer array of one shape) over the members; repeatable")
    p.add_argument("--statistics", type=Path, default=None, metavar="FILE.npz",
                   help="write the mean and variance of the heights and every reduced sum to this .npz file")
    p.add_argument("--force", action="store_true", help="replace an existing --statistics file (kept otherwise)")


def _add_shapes(parent: argparse.ArgumentParser, sampling: bool, picture_required: bool = False,
                ensemble: bool = False, counting: bool = False, predicting: bool = False) -> None:
    shapes = parent.add_subparsers(dest="shape", metavar="SHAPE", required=True)
    for name, (_, shape) in _shape_table().items():
        p = shapes.add_parser(name, help=shape.help, description=shape.description or shape.help)
        groups: Dict[str, Any] = {}
        for argument in shape.arguments:
            if argument.style is not None and not sampling:
                continue
            target: Any = p
            if argument.exclusive is not None:
                if argument.exclusive not in groups:
                    groups[argument.exclusive] = p.add_mutually_exclusive_group(
                        required=argument.exclusive in shape.required)
                target = groups[argument.exclusive]
            argument.add_to(target)
        if picture_required:
            p.add_argument("--picture", type=Path, required=True, help="the picture to write (.png, .svg or .pdf)")
        if ensemble:
            _add_ensemble_options(p)
        if predicting:
            p.add_argument("--resolution", type=int, default=None,
                           help="refine every cell this many times in each direction (lozenge regions; default 1)")
        if counting:
            p.add_argument("--no-limits", action="store_true",
                           help="lift the cost caps of exact counts (time and digits); Ctrl-C still stops it")
        if sampling:
            p.add_argument("--seed", type=int, default=None,
                           help="non-negative int; the same seed gives the same sample (default: fresh, printed)")
            own = [m for m in shape.method_choices if m not in ("auto", "cftp", "generic")]
            p.add_argument("--method", default="auto", choices=shape.method_choices,
                           help="exact sampler: auto (default: the region's fixed choice), cftp (coupling from the "
                                "past, fastest kernel), generic (reference engine)"
                                + (f", or this shape's own: {', '.join(own)}" if own else ""))
            p.add_argument("--picture", type=Path, default=None, help="write a picture (.png, .svg or .pdf)")
            p.add_argument("--output", type=Path, default=None,
                           help="write the sample to a .npz file (heights, tiles, metadata record)")
            p.add_argument("--force", action="store_true",
                           help="replace an existing --output file (kept otherwise)")


def _parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="frostline",
        description="Exact samples of random tilings by monotone coupling from the past.",
        epilog=EXAMPLES, formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("--version", action="version", version=f"frostline {__version__}")
    commands = parser.add_subparsers(dest="command", metavar="COMMAND", required=True)
    sample = commands.add_parser("sample", help="draw one exact sample of a region",
                                 description="Draw one exact sample; print its diagnostics; draw it or save it.")
    _add_shapes(sample, sampling=True)
    ensemble = commands.add_parser(
        "ensemble", help="draw many exact samples of a region into a resumable store, with statistics",
        description="Member i is the exact sample from child i of the seed; with --store the members go to a "
                    "zarr store (resumable: run the same command again), and the mean and variance of the heights "
                    "are printed at the end.")
    _add_shapes(ensemble, sampling=False, ensemble=True)
    count = commands.add_parser("count", help="print the exact number of tilings of a region",
                                description="Exact counts refuse, with their estimate, what would take more than "
                                            "a minute or print more than a million digits; --no-limits lifts both.")
    _add_shapes(count, sampling=False, counting=True)
    density = commands.add_parser("density", help="draw the exact density of each tile class of a region",
                                  description="Exact placement probabilities (inverse Kasteleyn matrix) drawn as one "
                                              "panel per tile class; lozenge regions (any q) and domino regions.")
    _add_shapes(density, sampling=False, picture_required=True)
    predict = commands.add_parser(
        "predict", help="draw the limit shape the variational principle predicts for a region",
        description="Solve the variational principle (entropy of Cohn, Kenyon and Propp; q ** volume as a linear "
                    "term) for the region: print log Z's continuum estimate and the solver's report, and draw the "
                    "predicted density of each tile class with the predicted frozen boundary. Lozenge regions "
                    "(any q) and uniform domino regions.")
    _add_shapes(predict, sampling=False, picture_required=True, predicting=True)
    compare = commands.add_parser(
        "compare", help="frozen boundaries of every lattice's comparison family against theory",
        description="For the comparison family each lattice declares (built in: a regular hexagon, an Aztec "
                    "diamond and domain-wall square ice) at each size: one exact "
                    "sample, its density map, its empirical frozen boundary and the published arctic curve; writes "
                    "PREFIX.png, PREFIX.pdf and PREFIX.csv (distances in scaled units).")
    compare.add_argument("--sizes", type=int, nargs="+", default=[30, 60, 100], help="sizes n (default 30 60 100)")
    compare.add_argument("--seed", type=int, default=2026, help="seed of every sample (default 2026)")
    compare.add_argument("--prefix", type=Path, default=Path("frostline-compare"),
                         help="output files PREFIX.png, PREFIX.pdf, PREFIX.csv (default ./frostline-compare)")
    show = commands.add_parser("show", help="print the record of a saved sample and optionally draw it")
    show.add_argument("file", type=Path, help="a .npz file written by 'frostline sample ... --output', or an "
                                              "ensemble store written by 'frostline ensemble ... --store'")
    show.add_argument("--picture", type=Path, default=None, help="write a picture (.png, .svg or .pdf)")
    demo = commands.add_parser("demo", help="sample the built-in demo and write its pictures",
                               description="Exact uniform and q-weighted samples of a hexagon, with pictures.")
    demo.add_argument("--size", type=int, default=40, help="side length of the regular hexagon (default 40)")
    demo.add_argument("--q", type=float, default=None,
                      help="weight of the second sample (default exp(-2/size): cubes pile into the far corner)")
    demo.add_argument("--seed", type=int, default=2026, help="seed (default 2026)")
    demo.add_argument("--folder", type=Path, default=Path("frostline-demo"),
                      help="where pictures go (default ./frostline-demo)")
    commands.add_parser("lattices", help="list the registered lattices with their shapes",
                        description="Every lattice frostline finds (built in and installed plugins), its shapes, "
                                    "closed forms and theory curves.")
    return parser


def _print_info(sample, out=None, extra: Sequence[Tuple[str, Any]] = ()) -> None:
    """The sample's region, method, report and seed as an aligned table; ``extra`` (label, value) rows last."""
    out = out or sys.stdout
    info = sample.info.as_dict()
    region = sample.region.describe()
    rows = [("region", " ".join(f"{k}={v}" for k, v in region.items()))]
    rows += [(k, info[k]) for k in ("method", "kernel", "seconds", "version")]
    rows += [(k.replace("_", " "), v) for k, v in info["report"].items()]
    rows.append(("seed entropy", info["seed"]["entropy"]))
    if info["seed"]["spawn_key"]:
        rows.append(("seed spawn key", info["seed"]["spawn_key"]))
    updates = info["report"].get("site_updates", 0)
    if updates and info["seconds"] > 0:
        rows.append(("site updates per second", f"{updates / info['seconds']:.3g}"))
    rows += list(extra)
    width = max(len(k) for k, _ in rows)
    for k, v in rows:
        if isinstance(v, float):
            v = f"{v:.4g}"
        print(f"  {k:<{width}}  {v}", file=out)


def _region(args):
    _, shape = _shape_table()[args.shape]
    values = {a.name: getattr(args, a.name) for a in shape.arguments if a.style is None}
    return shape.build(**{k: v for k, v in values.items() if v is not None})


def _style(args) -> dict:
    _, shape = _shape_table()[args.shape]
    return {a.style: getattr(args, a.name) for a in shape.arguments if a.style and hasattr(args, a.name)}


def _check_outputs(picture: Optional[Path], output: Optional[Path], force: bool = False) -> None:
    """Refuse unusable output paths before a long run, not after it."""
    from .plot import FORMATS

    if picture is not None:
        import importlib.util

        if importlib.util.find_spec("matplotlib") is None:
            raise ValueError("pictures need matplotlib: pip install 'frostline[plot]' (nothing was sampled)")
        if picture.suffix.lower() not in FORMATS:
            raise ValueError(f"picture format {picture.suffix or '(none)'!r} is not supported; use one of "
                             f"{', '.join(FORMATS)}")
    if output is not None and output.suffix != ".npz":
        raise ValueError(f"sample files end in .npz, got {output.name!r}")
    if output is not None and output.exists() and not force:
        raise ValueError(f"{output} exists; pass --force to replace it")
    for path in (picture, output):
        if path is not None and not path.resolve().parent.is_dir():
            raise ValueError(f"the folder of {path} does not exist")


def _sample(args) -> int:
    from .progress import StderrProgress

    _check_outputs(args.picture, args.output, args.force)
    progress = StderrProgress("building the region")
    region = _region(args)
    progress.note("coupling from the past")
    started = time.perf_counter()
    sample = region.sample(seed=args.seed, method=args.method, progress=progress)
    progress.finish()
    print(f"exact sample of {region.summary()} in {time.perf_counter() - started:.3g} s")
    _print_info(sample)
    _write(sample, args.picture, getattr(args, "output", None), _style(args), args.force)
    return 0


def _write(sample, picture: Optional[Path], output: Optional[Path], style: Optional[dict] = None,
           force: bool = False) -> None:
    if output is not None:
        from .io import save

        print(f"sample written to {save(sample, output, overwrite=force)}")
    if picture is not None:
        from . import plot

        style = dict(style or {})
        style.setdefault("title", f"{sample.region.summary()}; seed {sample.info.seed.entropy}")
        plot.save(sample, picture, **style)
        print(f"picture written to {picture}")


def _ensemble(args) -> int:
    import numpy as np

    from .ensemble import ensemble, print_progress

    region = _region(args)
    client = None
    if args.scheduler is not None:
        try:
            from distributed import Client
        except ImportError as exc:
            raise ValueError("--scheduler needs dask.distributed: pip install 'frostline[cluster]'") from exc
        client = Client(args.scheduler)
    reducers = _reducers(region, args.tile_counts, args.reducer)
    if args.statistics is not None and args.statistics.exists() and not args.force:
        raise ValueError(f"{args.statistics} exists; pass --force to replace it")
    started = time.perf_counter()
    try:
        e = ensemble(region, args.size, seed=args.seed, store=args.store, workers=args.workers, client=client,
                     progress=print_progress(), reducers=reducers or None)
    finally:
        if client is not None:
            client.close()
    mean = e.mean_heights
    print(f"ensemble of {e.size} exact samples of {region.summary()} in {time.perf_counter() - started:.3g} s")
    if args.store is not None:
        print(f"  store           {args.store}")
    print(f"  mean height     {float(np.nanmean(mean)):.6g} (over the points)")
    if e.size > 1:
        print(f"  mean variance   {float(np.nanmean(e.var_heights)):.6g} (over the points)")
    for name, total in e.reduced.items():
        print(f"  {name:<15} summed over the members: shape {total.shape}, total {int(total.sum())}")
    if args.statistics is not None:
        arrays: Dict[str, Any] = {"mean_heights": mean, "size": np.array(e.size), "seed": np.array(args.seed)}
        if e.size > 1:
            arrays["var_heights"] = e.var_heights
        arrays.update({f"reduced_{name}": total for name, total in e.reduced.items()})
        with open(args.statistics, "wb") as handle:
            np.savez(handle, **arrays)
        print(f"  statistics      {args.statistics} ({', '.join(sorted(arrays))})")
    return 0


def _reducers(region, tile_bin, specs) -> dict:
    """The reducers the options ask for: tile counts on a grid, and NAME=MODULE:FUNCTION imports."""
    import importlib

    out = {}
    if tile_bin is not None:
        from .analysis import tile_counts

        out["tile_counts"] = tile_counts(region, tile_bin)
    for spec in specs:
        name, _, target = spec.partition("=")
        module, _, function = target.partition(":")
        if not name or not module or not function:
            raise ValueError(f"--reducer needs NAME=MODULE:FUNCTION (for example counts=mystudy:vertical_count), "
                             f"got {spec!r}")
        if name in out:
            raise ValueError(f"two reducers are called {name!r}; give each its own name")
        try:
            found = getattr(importlib.import_module(module), function)
        except (ImportError, AttributeError) as exc:
            raise ValueError(f"--reducer {spec}: cannot find {function} in module {module} ({exc}); the module "
                             "must be importable (on PYTHONPATH or installed)") from None
        if not callable(found):
            raise ValueError(f"--reducer {spec}: {module}.{function} is not a function")
        out[name] = found
    return out


def _is_weighted(region) -> bool:
    """Whether the region's declared weight keys hold anything but the uniform value."""
    from .registry import lattices, spec

    if region.lattice not in lattices():
        return False
    described = region.describe()
    for key in spec(region.lattice).weight_keys:
        value = described.get(key)
        if value is None or value is False:
            continue
        values = value if isinstance(value, (list, tuple)) else [value]
        if any(v is True or (isinstance(v, (int, float)) and float(v) != 1.0) for v in values):
            return True
    return False


def _count(args) -> int:
    from .progress import StderrProgress, exact_progress

    if hasattr(sys, "set_int_max_str_digits"):
        sys.set_int_max_str_digits(0)  # counts can have millions of digits
    progress = StderrProgress("counting")
    try:
        with exact_progress(progress.exact):
            return _count_region(args)
    finally:
        progress.finish()


def _count_region(args) -> int:
    region = _region(args)
    if _is_weighted(region):  # the count of a weighted region would silently ignore the weights
        print(f"partition function (weighted sum over configurations): {region.partition_function()}")
        return 0
    if args.no_limits:  # only the caps this lattice's count() takes
        import inspect

        accepted = inspect.signature(region.count).parameters
        print(region.count(**{k: None for k in ("budget", "max_digits") if k in accepted}))
    else:
        try:
            print(region.count())
        except ValueError as exc:
            if "budget=None" in str(exc) or "max_digits=None" in str(exc):
                raise ValueError(f"{exc} (command line: --no-limits)") from None
            raise
    return 0


def _density(args) -> int:
    from . import plot
    from .exact.local_statistics import placement_probabilities

    _check_outputs(args.picture, None)
    region = _region(args)
    started = time.perf_counter()
    print(f"  exact placement probabilities of {region.summary()}", file=sys.stderr, flush=True)
    from .progress import StderrProgress, exact_progress

    progress = StderrProgress("exact densities")
    try:
        with exact_progress(progress.exact):
            tiles, probabilities = placement_probabilities(region)
    finally:
        progress.finish()
    print(f"  done in {time.perf_counter() - started:.1f} s", file=sys.stderr)
    classes = region.classify(tiles)
    names = region.tile_classes
    densities = {name: (region.tile_centres(tiles[classes == k]), probabilities[classes == k])
                 for k, name in enumerate(names)}
    outlines = {name: region.tile_outlines(tiles[classes == k]) for k, name in enumerate(names)}
    plot.save_densities(densities, args.picture, title=region.summary(), outlines=outlines,
                        labels=getattr(region, "tile_class_labels", None))
    print(f"exact densities of {region.summary()} written to {args.picture}")
    return 0


def _predict(args) -> int:
    from . import plot

    _check_outputs(args.picture, None)
    region = _region(args)
    started = time.perf_counter()

    def report(iteration: int, decrement: float, value: float) -> None:
        print(f"\r  Newton step {iteration}: functional {value:.6f}, decrement {decrement:.1e} "
              f"({time.perf_counter() - started:.1f} s)", end="", file=sys.stderr, flush=True)

    shape = region.limit_shape(args.resolution, progress=report)
    print(file=sys.stderr)
    print(f"{region.summary()}: log Z ~ {shape.log_partition_function:.6f} (continuum estimate); {shape.report}")
    curves = [line * shape.scale for line in shape.frozen_boundary]
    outlines = {name: region.tile_outlines(tiles) for name, tiles in shape.tiles.items()}
    plot.save_densities(shape.densities, args.picture, curves=curves, outlines=outlines,
                        title=f"predicted densities, {region.summary()}",
                        labels=getattr(region, "tile_class_labels", None))
    print(f"predicted densities and frozen boundary written to {args.picture}")
    return 0


def _compare(args) -> int:
    from . import plot
    from .analysis.compare import compare, figure, table
    from .registry import specs

    if any(n < 4 for n in args.sizes):
        raise ValueError("sizes must be at least 4")
    if not args.prefix.resolve().parent.is_dir():
        raise ValueError(f"the folder of {args.prefix} does not exist")
    cases = [spec.comparison for spec in specs() if spec.comparison is not None]
    started = time.perf_counter()
    rows = compare(cases, args.sizes, seed=args.seed,
                   progress=lambda s: print(f"  {s} ({time.perf_counter() - started:.0f} s)", file=sys.stderr))
    text = table(rows)
    print(text, end="")
    plt = plot._pyplot()
    fig = figure(rows, args.sizes)
    for ext in (".png", ".pdf"):
        fig.savefig(str(args.prefix) + ext, dpi=150, bbox_inches="tight")
    plt.close(fig)
    Path(str(args.prefix) + ".csv").write_text(text)
    print(f"wrote {args.prefix}.png, {args.prefix}.pdf and {args.prefix}.csv")
    return 0


def _show(args) -> int:
    from .io import load

    if args.file.is_dir():  # an ensemble store
        from .ensemble import store_summary

        summary = store_summary(args.file)
        print(f"{args.file}: ensemble store of {summary['size']} members, {summary['done']} done")
        for key in ("region", "seed", "method", "frostline_version", "mean_height"):
            print(f"  {key.replace('_', ' '):<17} {summary[key]}")
        return 0
    _check_outputs(args.picture, None)
    sample = load(args.file)
    print(f"{args.file}: {sample.region.summary()}")
    _print_info(sample)
    _write(sample, args.picture, None)
    return 0


def _demo(args) -> int:
    from . import plot
    from .registry import specs

    args.folder.mkdir(parents=True, exist_ok=True)
    for spec in specs():
        if spec.demo is None:
            continue
        for label, region, title, note in spec.demo(args.size, args.q):
            print(f"\n{label}: {region.summary()}")
            sample = region.sample(seed=args.seed)
            path = plot.save(sample, args.folder / f"{label}.png", title=title)
            _print_info(sample, extra=([note(sample)] if note is not None else []) + [("picture", path)])
    return 0


def _lattices(args) -> int:
    from .registry import specs

    for spec in specs():
        print(f"{spec.name}: {spec.summary}")
        for shape in spec.shapes:
            arguments = " ".join(a.name.upper() if a.flag is None else f"[{a.flag} {a.name.upper()}]"
                                 for a in shape.arguments)
            print(f"  shape {shape.name} {arguments}".rstrip() + f"  -- {shape.help}")
        if spec.closed_forms:
            print(f"  closed forms: {', '.join(spec.closed_forms)}")
        for curve in spec.theory_curves:
            print(f"  theory curve: {curve}")
    return 0


def main(argv: Optional[Sequence[str]] = None) -> int:
    """Entry point of the ``frostline`` command; returns the exit status."""
    args = _parser().parse_args(list(argv) if argv is not None else None)
    handlers = {"sample": _sample, "ensemble": _ensemble, "count": _count, "density": _density, "predict": _predict, "compare": _compare, "show": _show,
                "demo": _demo, "lattices": _lattices}
    try:
        return handlers[args.command](args)
    except KeyboardInterrupt:
        print("\nfrostline: interrupted; nothing was written for the unfinished sample", file=sys.stderr)
        return 130
    except (ValueError, TypeError, OSError) as exc:
        print(f"frostline: error: {exc}", file=sys.stderr)
        return 2


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
