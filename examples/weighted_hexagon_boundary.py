"""How does the frozen boundary of a q-weighted hexagon move as q changes?

A scenario of our own: plane partitions in an n x n x n box with weight
q ** volume, q = exp(-gamma / n). For gamma = 0 the frozen boundary is the
inscribed ellipse (Cohn, Larsen, Propp 1998); as gamma grows the cubes drain
towards the far corner and the liquid region shrinks and moves. We measure, for
several gamma, the mean volume fraction, the area of the liquid region (scaled
by n^2) from an ensemble's density map, and the distance of its frozen boundary
from the gamma = 0 ellipse; and draw the boundaries on one picture.

Run:  python examples/weighted_hexagon_boundary.py [--size 60] [--samples 8]
"""
from __future__ import annotations

import argparse
import math

import numpy as np

import frostline as fl
from frostline.analysis import curve_distance, density_grid, frozen_boundary, frozen_mask
from frostline.toolkit import palette


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--size", type=int, default=60)
    p.add_argument("--samples", type=int, default=8)
    p.add_argument("--picture", default="weighted-hexagon-boundaries.png")
    args = p.parse_args()
    n = args.size
    ellipse = fl.lozenge.hexagon(n, n, n).arctic_curve() / n

    import matplotlib.pyplot as plt

    fig, ax = plt.subplots(figsize=(6, 6))
    print(f"{'gamma':>6} {'q':>8} {'volume/n^3':>11} {'liquid area/n^2':>16} {'distance to ellipse':>20}")
    for gamma, colour in zip((0.0, 1.0, 2.0, 4.0), palette.SERIES):
        q = math.exp(-gamma / n)
        region = fl.lozenge.hexagon(n, n, n, q=q)
        ensemble = region.samples(args.samples, seed=11)
        volume = np.mean([s.heights.sum() for s in ensemble]) / n ** 3
        grid = density_grid(ensemble, bin_size=0.5, smoothing=1.5)
        liquid = (~frozen_mask(grid, 0.1)).sum() * 0.25 / n ** 2
        boundary = frozen_boundary(grid, 0.1, scale=n)
        print(f"{gamma:>6.1f} {q:>8.5f} {volume:>11.4f} {liquid:>16.3f} {curve_distance(boundary, ellipse):>20.3f}")
        for k, line in enumerate(boundary):
            ax.plot(line[:, 0], line[:, 1], color=colour, lw=1, label=f"gamma = {gamma:g}" if k == 0 else None)
    closed = np.vstack([ellipse, ellipse[:1]])
    ax.plot(closed[:, 0], closed[:, 1], "k--", lw=0.8, label="inscribed ellipse")
    corners = fl.lozenge.plane_points(fl.lozenge.hexagon(n, n, n).corners) / n
    ax.fill(corners[:, 0], corners[:, 1], fill=False, color="0.4", lw=0.8)
    ax.set_aspect("equal")
    ax.set_axis_off()
    ax.legend(loc="lower right", fontsize=8)
    fig.savefig(args.picture, dpi=150, bbox_inches="tight")
    print(f"picture: {args.picture}")


if __name__ == "__main__":
    main()
