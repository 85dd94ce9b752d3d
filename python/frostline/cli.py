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
import math
import sys
import time
from pathlib import Path
from typing import Optional, Sequence

from ._version import __version__

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


def _add_shapes(parent: argparse.ArgumentParser, sampling: bool) -> None:
    shapes = parent.add_subparsers(dest="shape", metavar="SHAPE", required=True)
    hexagon = shapes.add_parser("hexagon", help="the A, B, C hexagon (plane partitions in a box)",
                                description="Lozenge tilings of the A, B, C hexagon = plane partitions in an A x B x C box.")
    hexagon.add_argument("sides", type=int, nargs=3, metavar="SIDE",
                         help="three side lengths A B C: plane partitions in an A x B x C box")
    path = shapes.add_parser("path", help="the region inside a boundary path",
                             description="Lozenge tilings of the region inside a boundary path, e.g. "
                                         "\"4e 3ne 5nw 4w 3sw 5se\" (steps e, ne, nw, w, sw, se; counts; groups).")
    source = path.add_mutually_exclusive_group(required=True)
    source.add_argument("path", nargs="?", help="the boundary path, quoted")
    source.add_argument("--file", type=Path, help="read the boundary path from this text file")
    trapezoid = shapes.add_parser("trapezoid", help="a trapezoid with notches in its top row",
                                  description="A trapezoid widening upwards (BOTTOM e, HEIGHT ne, BOTTOM+HEIGHT w, "
                                              "HEIGHT se) with HEIGHT down triangles removed from its top row.")
    trapezoid.add_argument("bottom", type=int, help="length of the bottom side")
    trapezoid.add_argument("height", type=int, help="number of rows (and of notches)")
    trapezoid.add_argument("--notches", type=int, nargs="+", default=None,
                           help="positions 0 .. BOTTOM+HEIGHT-1 of the removed top triangles (default: spread evenly)")
    for p in (hexagon, path, trapezoid):
        p.add_argument("--q", type=float, default=1.0,
                       help="weight per unit cube (q ** volume); 1 is uniform (default)")
    aztec = shapes.add_parser("aztec", help="domino tilings of the Aztec diamond of order N",
                              description="Domino tilings of the Aztec diamond of order N (2N(N+1) cells).")
    aztec.add_argument("order", type=int, help="the order N")
    weights = aztec.add_mutually_exclusive_group()
    weights.add_argument("--vertical-weight", type=float, default=None, help="weight of every vertical domino")
    weights.add_argument("--two-periodic", type=float, nargs=2, default=None, metavar=("A", "B"),
                         help="two-periodic weights A and B (gas phase in the middle when A != B)")
    rectangle = shapes.add_parser("rectangle", help="domino tilings of a ROWS x COLUMNS rectangle")
    rectangle.add_argument("rows", type=int)
    rectangle.add_argument("columns", type=int)
    picture = shapes.add_parser("picture", help="domino tilings of a region drawn in a text file",
                                description="Domino tilings of a region drawn as text: '#' a cell, '.' none, "
                                            "one line per row.")
    picture.add_argument("file", type=Path, help="the text file with the drawing")
    ice = shapes.add_parser("square_ice", help="square ice (six-vertex model) with domain-wall boundary",
                            description="Square ice on N x N vertices with domain-wall boundary (alternating sign "
                                        "matrices when uniform); vertex weights A, B, C.")
    ice.add_argument("size", type=int, help="N, the order of the matrices")
    ice.add_argument("--weights", type=float, nargs=3, default=(1.0, 1.0, 1.0), metavar=("A", "B", "C"),
                     help="vertex weights a, b, c (exact sampling needs c >= max(a, b)); default 1 1 1")
    if sampling:
        ice.add_argument("--view", default="vertices", choices=["vertices", "matrix", "heights"],
                         help="what the picture shows (default: vertex types)")
    for p in (hexagon, path, trapezoid, aztec, rectangle, picture, ice):
        if sampling:
            p.add_argument("--seed", type=int, default=None,
                           help="non-negative int; the same seed gives the same sample (default: fresh, printed)")
            p.add_argument("--method", default="auto",
                           help="exact sampler: auto (default, the fastest), generic (reference engine), "
                                "box (hexagons), cftp or shuffling (dominoes)")
            p.add_argument("--picture", type=Path, default=None, help="write a picture (.png, .svg or .pdf)")
            p.add_argument("--output", type=Path, default=None,
                           help="write the sample to a .npz file (heights, tiles, metadata record)")


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
    count = commands.add_parser("count", help="print the exact number of tilings of a region")
    _add_shapes(count, sampling=False)
    density = commands.add_parser("density", help="draw the exact density of each tile class of a region",
                                  description="Exact placement probabilities (inverse Kasteleyn matrix) drawn as one "
                                              "panel per tile class; lozenge regions with q = 1 and domino regions.")
    _add_shapes(density, sampling=False)
    for p in density._subparsers._group_actions[0].choices.values():  # every shape takes --picture here
        p.add_argument("--picture", type=Path, required=True, help="the picture to write (.png, .svg or .pdf)")
    compare = commands.add_parser(
        "compare", help="frozen boundaries of lozenges, dominoes and square ice against theory",
        description="For a regular hexagon, an Aztec diamond and domain-wall square ice at each size: one exact "
                    "sample, its density map, its empirical frozen boundary and the published arctic curve; writes "
                    "PREFIX.png, PREFIX.pdf and PREFIX.csv (distances in scaled units).")
    compare.add_argument("--sizes", type=int, nargs="+", default=[30, 60, 100], help="sizes n (default 30 60 100)")
    compare.add_argument("--seed", type=int, default=2026)
    compare.add_argument("--prefix", type=Path, default=Path("frostline-compare"),
                         help="output files PREFIX.png, PREFIX.pdf, PREFIX.csv (default ./frostline-compare)")
    show = commands.add_parser("show", help="print the record of a saved sample and optionally draw it")
    show.add_argument("file", type=Path, help="a .npz file written by 'frostline sample ... --output'")
    show.add_argument("--picture", type=Path, default=None, help="write a picture (.png, .svg or .pdf)")
    demo = commands.add_parser("demo", help="sample the built-in demo and write its pictures",
                               description="Exact uniform and q-weighted samples of a hexagon, with pictures.")
    demo.add_argument("--size", type=int, default=40, help="side length of the regular hexagon (default 40)")
    demo.add_argument("--q", type=float, default=None,
                      help="weight of the second sample (default exp(-2/size): cubes pile into the far corner)")
    demo.add_argument("--seed", type=int, default=2026, help="seed (default 2026)")
    demo.add_argument("--folder", type=Path, default=Path("frostline-demo"),
                      help="where pictures go (default ./frostline-demo)")
    return parser


def _print_info(sample, out=None) -> None:
    out = out or sys.stdout
    info = sample.info.as_dict()
    region = sample.region.describe()
    rows = [("region", " ".join(f"{k}={v}" for k, v in region.items()))]
    rows += [(k.replace("_", " "), v) for k, v in info.items() if k != "seed"]
    rows.append(("seed entropy", info["seed"]["entropy"]))
    if info["seed"]["spawn_key"]:
        rows.append(("seed spawn key", info["seed"]["spawn_key"]))
    if info["site_updates"] and info["seconds"] > 0:
        rows.append(("site updates per second", f"{info['site_updates'] / info['seconds']:.3g}"))
    width = max(len(k) for k, _ in rows)
    for k, v in rows:
        if isinstance(v, float):
            v = f"{v:.4g}"
        print(f"  {k:<{width}}  {v}", file=out)


def _region(args):
    from . import domino, lozenge, square_ice

    if args.shape == "square_ice":
        return square_ice.domain_wall(args.size, *args.weights)
    if args.shape == "aztec":
        return domino.aztec_diamond(args.order, vertical_weight=args.vertical_weight,
                                    two_periodic_weights=tuple(args.two_periodic) if args.two_periodic else None)
    if args.shape == "rectangle":
        return domino.rectangle(args.rows, args.columns)
    if args.shape == "picture":
        return domino.from_picture(args.file.read_text())
    if args.shape == "hexagon":
        return lozenge.hexagon(*args.sides, q=args.q)
    if args.shape == "trapezoid":
        return lozenge.trapezoid(args.bottom, args.height, args.notches, q=args.q)
    text = args.path if args.file is None else args.file.read_text()
    return lozenge.from_boundary(" ".join(text.split()), q=args.q)


def _check_outputs(picture: Optional[Path], output: Optional[Path]) -> None:
    """Refuse unusable output paths before a long run, not after it."""
    from .plot import FORMATS

    if picture is not None:
        if picture.suffix.lower() not in FORMATS:
            raise ValueError(f"picture format {picture.suffix or '(none)'!r} is not supported; use one of "
                             f"{', '.join(FORMATS)}")
    if output is not None and output.suffix != ".npz":
        raise ValueError(f"sample files end in .npz, got {output.name!r}")
    for path in (picture, output):
        if path is not None and not path.resolve().parent.is_dir():
            raise ValueError(f"the folder of {path} does not exist")


def _sample(args) -> int:
    from .progress import StderrProgress

    _check_outputs(args.picture, args.output)
    progress = StderrProgress("building the region")
    region = _region(args)
    progress.note("coupling from the past")
    started = time.perf_counter()
    sample = region.sample(seed=args.seed, method=args.method, progress=progress)
    progress.finish()
    print(f"exact sample of {region!r} in {time.perf_counter() - started:.3g} s")
    _print_info(sample)
    style = {"kind": args.view} if getattr(args, "view", None) else {}
    _write(sample, args.picture, getattr(args, "output", None), style)
    return 0


def _write(sample, picture: Optional[Path], output: Optional[Path], style: Optional[dict] = None) -> None:
    if output is not None:
        from .io import save

        print(f"sample written to {save(sample, output)}")
    if picture is not None:
        from . import plot

        plot.save(sample, picture, **(style or {}))
        print(f"picture written to {picture}")


def _count(args) -> int:
    if hasattr(sys, "set_int_max_str_digits"):
        sys.set_int_max_str_digits(0)  # counts can have millions of digits
    print(_region(args).count())
    return 0


def _density(args) -> int:
    from . import plot
    from .exact import class_densities

    _check_outputs(args.picture, None)
    region = _region(args)
    densities = class_densities(region)
    plot.save_densities(densities, args.picture, title=repr(region))
    print(f"exact densities of {region!r} written to {args.picture}")
    return 0


def _compare(args) -> int:
    from . import domino, lozenge, plot, square_ice
    from .analysis.compare import compare, figure, table

    if any(n < 4 for n in args.sizes):
        raise ValueError("sizes must be at least 4")
    if not args.prefix.resolve().parent.is_dir():
        raise ValueError(f"the folder of {args.prefix} does not exist")
    cases = [("lozenge hexagon", lambda n: lozenge.hexagon(n, n, n)),
             ("domino Aztec diamond", lambda n: domino.aztec_diamond(n)),
             ("square ice, domain wall", lambda n: square_ice.domain_wall(n))]
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

    _check_outputs(args.picture, None)
    sample = load(args.file)
    print(f"{args.file}: {sample.region!r}")
    _print_info(sample)
    _write(sample, args.picture, None)
    return 0


def _demo(args) -> int:
    from . import plot
    from .lozenge import hexagon

    n = args.size
    q = args.q if args.q is not None else math.exp(-2.0 / max(n, 1))
    args.folder.mkdir(parents=True, exist_ok=True)
    for label, region in (("uniform", hexagon(n, n, n)), ("weighted", hexagon(n, n, n, q=q))):
        print(f"\n{label}: {region!r}")
        sample = region.sample(seed=args.seed)
        _print_info(sample)
        volume = int(sample.heights.sum())
        print(f"  volume (cubes)  {volume} of {n ** 3} (uniform limit shape: half the box)")
        path = plot.save(sample, args.folder / f"hexagon-{label}.png", title=f"{label}, {n}x{n}x{n}"
                         + (f", q = {q:.4g}" if label == "weighted" else ""))
        print(f"  picture         {path}")
    return 0


def main(argv: Optional[Sequence[str]] = None) -> int:
    """Entry point of the ``frostline`` command; returns the exit status."""
    args = _parser().parse_args(list(argv) if argv is not None else None)
    handlers = {"sample": _sample, "count": _count, "density": _density, "compare": _compare, "show": _show,
                "demo": _demo}
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
