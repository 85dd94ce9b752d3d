"""Runs an ensemble into a store (for tests/test_ensemble.py, which kills this process mid-run)."""
import sys

import frostline as fl

store, size = sys.argv[1], int(sys.argv[2])
fl.ensemble(fl.lozenge.hexagon(14, 13, 12), size, seed=2026, store=store, workers=2)
print("finished")
