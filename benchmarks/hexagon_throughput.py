"""Exact samples of the n x n x n hexagon: fast box kernel vs generic engine vs a plain numpy chain.

Prints one table per run (ratios within one run are what count; these machines
are noisy). For each n: the start time T reached by coupling from the past,
site updates, seconds per exact sample and site updates per second, for

- box      the fast plane-partition kernel (frostline, method="box")
- generic  the lattice-free reference engine (method="generic"; same sample)
- numpy    a checkerboard heat-bath chain as a user would write it in numpy,
           run for the same number of site updates (capped by --numpy-seconds;
           beyond the cap the seconds column is extrapolated and marked "~").

Usage: python benchmarks/hexagon_throughput.py [--sizes 20 50 100] [--large] [--seed 1]
"""
from __future__ import annotations

import argparse
import time

import numpy as np

import frostline as fl


def numpy_checkerboard_chain(n: int, updates: int, seconds_cap: float, seed: int):
    """Heat-bath sweeps of plane partitions in an n^3 box with numpy; returns (updates done, seconds)."""
    rng = np.random.default_rng(seed)
    h = np.zeros((n + 2, n + 2), dtype=np.int64)
    h[0, :] = n
    h[:, 0] = n
    r, s = np.meshgrid(np.arange(n), np.arange(n), indexing="ij")
    masks = [((r + s) % 2 == p) for p in (0, 1)]
    done = 0
    start = time.perf_counter()
    while done < updates and time.perf_counter() - start < seconds_cap:
        for mask in masks:
            inner = h[1:-1, 1:-1]
            hi = np.minimum(h[:-2, 1:-1], h[1:-1, :-2])
            lo = np.maximum(h[2:, 1:-1], h[1:-1, 2:])
            draw = rng.integers(lo[mask], hi[mask] + 1)
            inner[mask] = draw
        done += n * n
    return done, time.perf_counter() - start


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--sizes", type=int, nargs="+", default=[20, 50, 100])
    p.add_argument("--large", action="store_true", help="also n = 200 (about a minute for the box kernel)")
    p.add_argument("--seed", type=int, default=1)
    p.add_argument("--numpy-seconds", type=float, default=20.0)
    args = p.parse_args()
    sizes = args.sizes + ([200] if args.large else [])

    header = f"{'n':>5} {'path':>8} {'T':>7} {'site updates':>14} {'s/sample':>10} {'updates/s':>10} {'vs numpy':>9}"
    print(header)
    print("-" * len(header))
    for n in sizes:
        region = fl.lozenge.hexagon(n, n, n)
        rows = []
        for method in ("box", "generic"):
            info = region.sample(seed=args.seed, method=method).info
            rows.append((method, info.start_time, info.site_updates, info.seconds))
        target = rows[0][2]
        done, secs = numpy_checkerboard_chain(n, target, args.numpy_seconds, args.seed)
        numpy_rate = done / secs
        for method, T, updates, secs_ in rows:
            rate = updates / secs_
            print(f"{n:>5} {method:>8} {T:>7} {updates:>14,} {secs_:>10.3f} {rate:>10.3g} {rate / numpy_rate:>8.1f}x")
        extrapolated = done < target
        secs_numpy = target / numpy_rate
        mark = "~" if extrapolated else " "
        print(f"{n:>5} {'numpy':>8} {'-':>7} {target:>14,} {mark}{secs_numpy:>9.3f} {numpy_rate:>10.3g} {1.0:>8.1f}x")
    print("\nT: start time (sweeps) of the coalescing epoch; numpy runs the box kernel's number of updates")
    print("(~: capped at --numpy-seconds and extrapolated at the measured rate). One thread, portable build.")


if __name__ == "__main__":
    main()
