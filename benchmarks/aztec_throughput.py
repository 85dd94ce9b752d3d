"""Exact samples of the Aztec diamond: CFTP (fast corner-grid kernel, generic engine) and domino shuffling.

Prints one table per run; compare ratios within a run (these machines are noisy).
Rows: CFTP for n = 50, 100 (and 200 with --large, a few minutes); the generic
engine for n = 50 (same sample as the fast kernel); shuffling for
n = 200, 500, 1000, uniform and with two-periodic weights (a, b) = (1, 0.5).

Usage: python benchmarks/aztec_throughput.py [--large] [--seed 1]
"""
from __future__ import annotations

import argparse

import frostline as fl


def row(label: str, n: int, info) -> None:
    updates, start = info.report.get("site_updates", 0), info.report.get("start_time", 0)  # none for shuffling
    rate = f"{updates / info.seconds:10.3g}" if updates else f"{'-':>10}"
    print(f"{label:>22} {n:>6} {start:>8} {updates:>15,} {info.seconds:>10.3f} {rate}")


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--large", action="store_true", help="also CFTP at n = 200")
    p.add_argument("--seed", type=int, default=1)
    args = p.parse_args()
    header = f"{'sampler':>22} {'n':>6} {'T':>8} {'site updates':>15} {'s/sample':>10} {'updates/s':>10}"
    print(header)
    print("-" * len(header))
    for n in [50, 100] + ([200] if args.large else []):
        row("cftp (corner grid)", n, fl.domino.aztec_diamond(n).sample(seed=args.seed, method="cftp").info)
        if n == 50:
            row("cftp (generic engine)", n, fl.domino.aztec_diamond(n).sample(seed=args.seed, method="generic").info)
    for n in (200, 500, 1000):
        row("shuffling, uniform", n, fl.domino.aztec_diamond(n).sample(seed=args.seed, method="shuffling").info)
    for n in (200, 500):
        region = fl.domino.aztec_diamond(n, two_periodic_weights=(1.0, 0.5))
        row("shuffling, two-periodic", n, region.sample(seed=args.seed, method="shuffling").info)
    print("\nT: CFTP start time (sweeps); shuffling rows report the seconds of the compiled shuffle only.")


if __name__ == "__main__":
    main()
