"""Limit shapes by the variational principle: solver cost and accuracy against published values, one table.

Rows: the uniform n x n x n hexagon (against (9/2) ln 3 - 6 ln 2 per n^2, MacMahon's
formula in the limit), the q = exp(-gamma/n) hexagon (against the limit of
MacMahon's q-product, computed here by scipy quadrature), and the Aztec diamond
of order n (against (ln 2 / 2)(n + 1/2)^2, the continuum diamond its 2n(n+1)
cells fill). Columns: unknowns, Newton steps, seconds, the functional per
reference scale, its relative difference, and the largest distance of the
frozen boundary to the published curve (scaled units, points within 0.03 of
the outline left out; uniform cases only). Times are for one core of this
machine; compare ratios within a run.

Usage: python benchmarks/limit_shape_table.py [--large]   (--large adds n = 200 and gamma = 3 at n = 120)
"""
from __future__ import annotations

import argparse
import math
import time

from scipy import integrate

import frostline as fl
from frostline.analysis.curves import curve_distance
from frostline.toolkit.contours import distance_to_segments, mesh_boundary_segments


def q_limit(gamma: float) -> float:
    def f(b: float, a: float) -> float:
        return math.log(-math.expm1(-gamma * (a + b + 1))) - math.log(-math.expm1(-gamma * (a + b)))
    return integrate.dblquad(f, 0.0, 1.0, 0.0, 1.0, epsabs=1e-11, epsrel=1e-11)[0]


def arctic_distance(region, shape) -> float:
    outline = mesh_boundary_segments(shape.plane / shape.scale, shape.mesh)
    return curve_distance(shape.frozen_boundary, region.arctic_curve() / region.scale,
                          exclude=lambda p: distance_to_segments(p, outline) < 0.03)


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--large", action="store_true")
    args = p.parse_args()
    hexagon_limit = 4.5 * math.log(3) - 6 * math.log(2)
    rows = [("hexagon", n, 0.0) for n in (30, 60, 100)] + [("aztec", n, 0.0) for n in (50, 100)]
    rows += [("hexagon", 60, 1.0), ("hexagon", 60, 3.0)]
    if args.large:
        rows += [("hexagon", 200, 0.0), ("hexagon", 120, 3.0)]
    header = (f"{'case':>10} {'n':>5} {'gamma':>6} {'unknowns':>9} {'steps':>6} {'seconds':>8} {'value':>10} "
              f"{'reference':>10} {'rel. diff':>10} {'curve dist':>10}")
    print(header)
    print("-" * len(header))
    for kind, n, gamma in rows:
        if kind == "hexagon":
            region = fl.lozenge.hexagon_region(n, n, n, q=math.exp(-gamma / n))
            reference, norm = (q_limit(gamma) if gamma else hexagon_limit), n ** 2
        else:
            region = fl.domino.aztec_diamond(n)
            reference, norm = math.log(2) / 2, (n + 0.5) ** 2
        started = time.perf_counter()
        shape = region.limit_shape()
        seconds = time.perf_counter() - started
        value = shape.log_partition_function / norm
        distance = f"{arctic_distance(region, shape):10.4f}" if gamma == 0 else f"{'-':>10}"
        print(f"{kind:>10} {n:>5} {gamma:>6g} {shape.report.unknowns:>9} {shape.report.iterations:>6} "
              f"{seconds:>8.2f} {value:>10.6f} {reference:>10.6f} {value / reference - 1:>+10.2%} {distance}")


if __name__ == "__main__":
    main()
