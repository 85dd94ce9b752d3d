"""Exact domino counts of m x n rectangles: the resultant form against the real-arithmetic product.

Prints one table; compare ratios within a run (these machines are noisy).
The product (mpmath, as frostline computed it before) is timed only where it
takes under a minute; the estimate column is what ``count()`` checks against
its budget before starting.

Usage: python benchmarks/rectangle_counts.py [--large]
"""
from __future__ import annotations

import argparse
import time

import mpmath

from frostline.domino.rectangle_resultant import rectangle_count, resultant_seconds


def product(m: int, n: int) -> int:
    with mpmath.workdps(int(0.13 * m * n) + 30):
        cj = [4 * mpmath.cos(mpmath.pi * j / (m + 1)) ** 2 for j in range(1, (m + 1) // 2 + 1)]
        ck = [4 * mpmath.cos(mpmath.pi * k / (n + 1)) ** 2 for k in range(1, (n + 1) // 2 + 1)]
        value = mpmath.mpf(1)
        for x in cj:
            for y in ck:
                value *= x + y
        return int(mpmath.nint(value))


def timed(f, *args):
    start = time.perf_counter()
    value = f(*args)
    return value, time.perf_counter() - start


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--large", action="store_true", help="also 1500 x 1500 and 2000 x 2000 (minutes)")
    args = p.parse_args()
    sizes = [(100, 100), (200, 200), (400, 400), (1000, 1000), (100, 2000), (20, 20000), (2, 100000)]
    if args.large:
        sizes += [(1500, 1500), (2000, 2000)]
    header = f"{'m x n':>14} {'digits':>9} {'resultant s':>12} {'estimate s':>11} {'product s':>10} {'ratio':>7}"
    print(header)
    print("-" * len(header))
    for m, n in sizes:
        value, fast = timed(rectangle_count, m, n)
        digits = int(value.bit_length() * 0.30103) + 1
        slow = "-"
        ratio = "-"
        if m * n <= 200 * 200:  # the product takes under a minute only here
            reference, seconds = timed(product, m, n)
            assert reference == value, (m, n)
            slow, ratio = f"{seconds:.3f}", f"{seconds / fast:.0f}x"
        print(f"{f'{m} x {n}':>14} {digits:>9} {fast:>12.3f} {resultant_seconds(m, n):>11.3f} {slow:>10} {ratio:>7}")


if __name__ == "__main__":
    main()
