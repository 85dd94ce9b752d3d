"""The ``frostline`` command line.

    frostline sample hexagon 40 40 40 --q 0.95 --seed 7 --picture hexagon.png
    frostline count hexagon 6 6 6
    frostline demo

Ctrl-C stops a run cleanly (exit status 130) at the next check of the engine,
which happens about every 10^8 site updates.
"""
from __future__ import annotations

import argparse
import math
import sys
import time
from pathlib import Path
from typing import List, Optional, Sequence

from ._version import __version__


def _add_hexagon(sub: argparse._SubParsersAction, help_text: str) -> argparse.ArgumentParser:
    p = sub.add_parser("hexagon", help=help_text, description=help_text)
    p.add_argument("sides", type=int, nargs=3, metavar="SIDE",
                   help="three side lengths A B C: plane partitions in an A x B x C box")
    p.add_argument("--q", type=float, default=1.0,
                   help="weight per unit cube (q ** volume); 1 is uniform (default)")
    return p


def _parser() -> argparse.ArgumentParser:
    parser = argparse.ArgumentParser(
        prog="frostline",
        description="Exact samples of random tilings by monotone coupling from the past.",
        epilog="Examples:\n  frostline sample hexagon 40 40 40 --seed 1 --picture hexagon.png\n"
               "  frostline sample hexagon 30 30 30 --q 0.93 --picture weighted.svg\n"
               "  frostline count hexagon 6 6 6\n  frostline demo --folder pictures",
        formatter_class=argparse.RawDescriptionHelpFormatter,
    )
    parser.add_argument("--version", action="version", version=f"frostline {__version__}")
    commands = parser.add_subparsers(dest="command", metavar="COMMAND", required=True)

    sample = commands.add_parser("sample", help="draw one exact sample of a region",
                                 description="Draw one exact sample; print its diagnostics; optionally draw it.")
    shapes = sample.add_subparsers(dest="shape", metavar="SHAPE", required=True)
    p = _add_hexagon(shapes, "lozenge tilings of the A, B, C hexagon")
    p.add_argument("--seed", type=int, default=None,
                   help="non-negative int; the same seed gives the same sample (default: fresh entropy, printed)")
    p.add_argument("--method", default="auto", choices=["auto", "box", "generic"],
                   help="sampler kernel; all give the identical sample (default: auto, the fastest)")
    p.add_argument("--picture", type=Path, default=None,
                   help="write a picture to this file (.png, .svg or .pdf)")

    count = commands.add_parser("count", help="print the exact number of configurations of a region")
    _add_hexagon(count.add_subparsers(dest="shape", metavar="SHAPE", required=True),
                 "plane partitions in the A x B x C box (MacMahon's formula)")

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
    from .lozenge import hexagon

    return hexagon(*args.sides, q=args.q)


def _sample(args) -> int:
    region = _region(args)
    started = time.perf_counter()
    sample = region.sample(seed=args.seed, method=args.method)
    print(f"exact sample of {region!r} in {time.perf_counter() - started:.3g} s")
    _print_info(sample)
    if args.picture is not None:
        from . import plot

        plot.save(sample, args.picture)
        print(f"picture written to {args.picture}")
    return 0


def _count(args) -> int:
    print(_region(args).count())
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
    handlers = {"sample": _sample, "count": _count, "demo": _demo}
    try:
        return handlers[args.command](args)
    except KeyboardInterrupt:
        print("\nfrostline: interrupted; nothing was written for the unfinished sample", file=sys.stderr)
        return 130
    except (ValueError, TypeError) as exc:
        print(f"frostline: error: {exc}", file=sys.stderr)
        return 2


if __name__ == "__main__":  # pragma: no cover
    sys.exit(main())
