"""Does the variational principle predict the shape of regions nobody has a formula for?

A scenario of our own: two notched regions with no published limit shape,
one of lozenges (an octagon with a re-entrant corner) and one of dominoes (an
Aztec diamond with a rectangular bite out of its left side). For each we
solve the variational principle (``region.limit_shape()``), draw an exact
ensemble, and compare: the largest difference between predicted and mean
heights (scaled units), and the predicted frozen boundary drawn over the
ensemble's mean density of the most frequent tile class.

Run:  python examples/notched_limit_shapes.py [--size 8] [--samples 200] [--picture notched.png]
"""
from __future__ import annotations

import argparse
import time

import numpy as np

import frostline as fl
from frostline.analysis import density_grid
from frostline.toolkit import palette


def notched_octagon(k: int):
    """A lattice octagon with one clockwise turn, sides scaled by k."""
    return fl.lozenge.polygon([k * v for v in (1, 1, 1, 2, 2, 1, 3, 3)],
                              ["e", "ne", "nw", "ne", "nw", "w", "sw", "se"])


def bitten_aztec(n: int):
    """The order-n Aztec diamond without a 2(n//4) x (n//2) block at its left corner."""
    mask = fl.domino.aztec_mask(n)
    mask[n - n // 4:n + n // 4, :n // 2] = False
    return fl.domino.from_mask(mask)


def study(name: str, region, samples: int, seed: int, height_step: int):
    started = time.perf_counter()
    shape = region.limit_shape()
    solved = time.perf_counter() - started
    started = time.perf_counter()
    ensemble = region.samples(samples, seed=seed)
    sampled = time.perf_counter() - started
    mean = np.mean([s.heights for s in ensemble], axis=0)
    inside = ~np.isnan(shape.heights)
    gap = float(np.max(np.abs(shape.heights - mean)[inside])) / height_step / region.scale
    print(f"{name:>22}: solve {solved:6.2f} s ({shape.report.iterations} Newton steps), "
          f"{samples} samples {sampled:6.2f} s, largest |prediction - mean| = {gap:.4f} scaled units, "
          f"log Z ~ {shape.log_partition_function:.2f}")
    return shape, ensemble


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--size", type=int, default=8, help="scale k of the octagon; the diamond has order 4k")
    p.add_argument("--samples", type=int, default=200)
    p.add_argument("--seed", type=int, default=2026)
    p.add_argument("--picture", default="notched-limit-shapes.png")
    args = p.parse_args()
    lozenge = notched_octagon(args.size)
    domino = bitten_aztec(4 * args.size)
    cases = [("lozenge octagon", lozenge, 3), ("domino bitten diamond", domino, 4)]

    import matplotlib.pyplot as plt

    fig, axes = plt.subplots(1, 2, figsize=(10, 5))
    for ax, (name, region, step) in zip(axes, cases):
        shape, ensemble = study(name, region, args.samples, args.seed, step)
        # pooled class fractions of the ensemble; light where one class dominates (frozen)
        grid = density_grid(ensemble, bin_size=1.0, smoothing=1.0)
        largest = np.where(grid.counts > 0, np.nan_to_num(grid.fractions, nan=0.0).max(axis=0), np.nan)
        extent = (grid.x[0] / region.scale, grid.x[-1] / region.scale, grid.y[0] / region.scale,
                  grid.y[-1] / region.scale)
        ax.imshow(np.ma.masked_invalid(largest).T, origin="lower", extent=extent, cmap="bone", vmin=0.25, vmax=1.0)
        for line in shape.frozen_boundary:
            ax.plot(line[:, 0], line[:, 1], color=palette.PREDICTED, lw=1.2)
        ax.set_title(f"{name}\nlargest class fraction, {len(ensemble)} exact samples (light = frozen)\n"
                     "yellow: predicted frozen boundary",
                     fontsize=9)
        ax.set_aspect("equal")
        ax.set_axis_off()
    fig.savefig(args.picture, dpi=150, bbox_inches="tight")
    print(f"wrote {args.picture}")


if __name__ == "__main__":
    main()
